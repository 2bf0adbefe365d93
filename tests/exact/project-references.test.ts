/**
 * The reference of every family read from a project file, end to end:
 * - bending: the project turned into stations and members (beam-project.ts) against a chain this
 *   test builds by hand from the same description, solved by the tests' own dense Hermite-cubic
 *   model with Richardson extrapolation (tests/exact/beam-test-helpers.ts; G. Strang & G. Fix,
 *   An Analysis of the Finite Element Method, ch. 6, from memory);
 * - bending without an exact solution (a cone, even one of constant diameter): the extrapolated
 *   reference, which for a cylinder must still give the pinned–pinned closed form
 *   (nπ/L)²√(EI/ρA)/2π (R. D. Blevins, Formulas for Natural Frequency and Mode Shape, from memory);
 * - axial: springs of other motions play no part — a fixed–free bar with an axial tip spring keeps
 *   the root of tan λ = −λEA/(kL) (docs/verification.md §2) whatever torsional spring sits beside it;
 * - torsion: the exact chain refuses disks and springs off the shaft, naming the field.
 */
import { describe, expect, test } from 'vitest'
import { familyReference, designFrequencies, extrapolatedReference } from '../../core/exact/family-reference'
import { torsionExactReference, TorsionInputError } from '../../core/exact/torsion-chain'
import { analysedFamilies } from '../../core/model/families'
import { effectiveSettings } from '../../core/analysis/modal-analysis'
import type { Project } from '../../core/model/project'
import { beamChain, bisect, hermiteFrequencies, richardsonH4H6 } from './beam-test-helpers'
import { expectRelative, makeProject, STEEL } from '../helpers'

const E = STEEL.youngsModulus
const RHO = STEEL.density

function part(doc: Record<string, unknown>): Project {
  return makeProject({ version: 2, materials: [{ ...STEEL, poissonRatio: 0.3 }], ...doc })
}

function familyOf(project: Project, key: string) {
  const family = analysedFamilies(project).find((f) => f.key === key)
  if (!family) throw new Error(`no family ${key}`)
  return family
}

describe('bending: the project’s stations and members', () => {
  // Clamped–free: a solid rod 0.6 m, then a 40 × 25 mm bar 0.5 m (weak plane: the 25 mm side);
  // a mass with rotary inertia at 0.35 m, a side spring with a rotational stiffness at the joint
  // (0.6 m), a rotational-only spring at 0.9 m, an axial spring at 0.2 m (no part in bending),
  // and a tension of 3 kN.
  const d = 0.03
  const w = 0.04
  const t = 0.025
  const project = part({
    motions: ['bending'],
    segments: [
      { length: 0.6, material: 'steel', section: { shape: 'solid', diameter: d } },
      { length: 0.5, material: 'steel', section: { shape: 'rectangle', width: w, height: t } },
    ],
    masses: [{ at: 0.35, mass: 1.2, transverseInertia: 4e-3 }],
    springs: [
      { at: 0.6, stiffness: 3e5, rotationalStiffness: 2e3, motion: 'bending' },
      { at: 0.9, stiffness: 0, rotationalStiffness: 5e3, motion: 'bending' },
      { at: 0.2, stiffness: 1e9 },
    ],
    ends: { start: { bending: 'clamped' }, end: { bending: 'free' } },
    preload: 3000,
  })
  const rodEI = (E * Math.PI * d ** 4) / 64
  const rodRhoA = (RHO * Math.PI * d * d) / 4
  const barRhoA = RHO * w * t
  const member = (length: number, bendingStiffness: number, massPerLength: number) => ({ length, bendingStiffness, massPerLength })
  // Stations at 0, 0.35, 0.6, 0.9, 1.1 (the axial spring's 0.2 is not one).
  const chainOf = (barEI: number) =>
    beamChain({
      members: [member(0.35, rodEI, rodRhoA), member(0.25, rodEI, rodRhoA), member(0.3, barEI, barRhoA), member(0.2, barEI, barRhoA)],
      start: 'clamped',
      end: 'free',
      axialForce: 3000,
      stationMass: { 1: 1.2 },
      stationRotaryInertia: { 1: 4e-3 },
      stationSideStiffness: { 2: 3e5 },
      stationRotationalStiffness: { 2: 2e3, 3: 5e3 },
    })
  const extrapolated = (barEI: number) => {
    const chain = chainOf(barEI)
    const levels = [4, 8, 16].map((n) => hermiteFrequencies(chain, n))
    return levels[0].map((_, i) => richardsonH4H6(levels[0][i], levels[1][i], levels[2][i]) / (2 * Math.PI))
  }

  for (const [plane, barEI] of [
    ['weak', (E * w * t ** 3) / 12],
    ['strong', (E * t * w ** 3) / 12],
  ] as const) {
    test(`${plane} plane: 5 modes to 1e-8 against the hand-built chain`, () => {
      const key = `bending-${plane}`
      const reference = familyReference(project, familyOf(project, key), effectiveSettings(project), 5)
      expect(reference.method).toBe('exact')
      expect(reference.formulation).toMatch(/Euler–Bernoulli/)
      const expected = extrapolated(barEI)
      reference.frequenciesHz.forEach((f, i) => expectRelative(f, expected[i], 1e-8, `${key} mode ${i + 1}`))
      // Design searches take the same exact values.
      expect(designFrequencies(project, familyOf(project, key), effectiveSettings(project), 5)).toEqual(reference.frequenciesHz)
    })
  }
})

describe('bending without an exact solution: the extrapolated reference', () => {
  const L = 1.2
  const d = 0.025
  const I = (Math.PI / 64) * d ** 4
  const A = (Math.PI / 4) * d * d
  const closedForm = (n: number) => (((n * Math.PI) / L) ** 2 * Math.sqrt((E * I) / (RHO * A))) / (2 * Math.PI)
  const cylinderAsCone = (analysis: Record<string, unknown>) =>
    part({
      motions: ['bending'],
      segments: [{ length: L, material: 'steel', section: { shape: 'cone', startDiameter: d, endDiameter: d } }],
      ends: { start: { bending: 'pinned' }, end: { bending: 'pinned' } },
      analysis,
    })

  test('elements per segment: Hermite cubics on max(64, 4 × the mesh) and twice that, order 4, the pinned–pinned closed form to 1e-9', () => {
    const project = cylinderAsCone({ elementsPerSegment: 20, modes: 3 })
    const reference = familyReference(project, familyOf(project, 'bending'), effectiveSettings(project), 3)
    expect(reference.method).toBe('extrapolated')
    expect(reference.formulation).toBe('Richardson extrapolation (order 4) of Hermite cubic elements at 80 elements per segment and 160 elements per segment')
    reference.frequenciesHz.forEach((f, i) => expectRelative(f, closedForm(i + 1), 1e-9, `mode ${i + 1}`))
    const coarse = cylinderAsCone({ elementsPerSegment: 4, modes: 1 })
    expect(familyReference(coarse, familyOf(coarse, 'bending'), effectiveSettings(coarse), 1).formulation).toContain('at 64 elements per segment and 128 elements per segment')
  })

  test('design searches without an exact solution take the analysis mesh itself: 3 modes within its h⁴ error of the closed form', () => {
    const project = cylinderAsCone({ elementsPerSegment: 20, modes: 3 })
    const design = designFrequencies(project, familyOf(project, 'bending'), effectiveSettings(project), 3)
    expect(design.length).toBe(3)
    // Hermite cubics converge as h⁴ in frequency (Strang & Fix, An Analysis of the Finite Element
    // Method, ch. 6, from memory), so mode n's error grows as n⁴ on one mesh; measured 4.2e-7,
    // 6.7e-6 and 3.4e-5 for n = 1, 2, 3: bounded by 1e-4, mode 3's error 81 (= 3⁴) times mode 1's
    // within 10 %, and none below the exact value (Rayleigh–Ritz with a consistent mass bounds
    // from above: Rayleigh, The Theory of Sound, §88).
    const errors = design.map((f, i) => f / closedForm(i + 1) - 1)
    errors.forEach((e, i) => {
      expect(e, `mode ${i + 1}`).toBeLessThan(1e-4)
      expect(e, `mode ${i + 1}`).toBeGreaterThan(0)
    })
    expect(errors[2] / errors[0]).toBeGreaterThan(81 * 0.9)
    expect(errors[2] / errors[0]).toBeLessThan(81 * 1.1)
  })

  test('largest element length: a quarter and an eighth of it', () => {
    const project = cylinderAsCone({ maxElementLength: 0.06, modes: 2 })
    const reference = extrapolatedReference(project, familyOf(project, 'bending'), effectiveSettings(project), 2)
    expect(reference.formulation).toBe('Richardson extrapolation (order 4) of Hermite cubic elements at elements of at most 0.015 m and elements of at most 0.0075 m')
    reference.frequenciesHz.forEach((f, i) => expectRelative(f, closedForm(i + 1), 1e-9, `mode ${i + 1}`))
  })

  test('Timoshenko theory: order 2, named as such', () => {
    const project = part({
      motions: ['bending'],
      segments: [{ length: L, material: 'steel', section: { shape: 'solid', diameter: d } }],
      ends: { start: { bending: 'pinned' }, end: { bending: 'pinned' } },
      analysis: { elementsPerSegment: 16, modes: 2, bendingTheory: 'timoshenko' },
    })
    const reference = familyReference(project, familyOf(project, 'bending'), effectiveSettings(project), 2)
    expect(reference.method).toBe('extrapolated')
    expect(reference.formulation).toBe('Richardson extrapolation (order 2) of Timoshenko elements at 64 elements per segment and 128 elements per segment')
    // A slender rod (L/d = 48): shear and rotary inertia lower f₁ by well under 1 % (and never raise it).
    const ratio = reference.frequenciesHz[0] / closedForm(1)
    expect(ratio).toBeLessThan(1)
    expect(ratio).toBeGreaterThan(0.99)
  })
})

describe('axial: only axial springs', () => {
  test('an axial tip spring beside a very stiff torsional one: the root of tan λ = −λEA/(kL) (§2)', () => {
    const L = 1
    const d = 0.02
    const EA = (E * Math.PI * d * d) / 4
    const k = (1.3 * EA) / L
    const project = part({
      motions: ['axial', 'torsion'],
      segments: [{ length: L, material: 'steel', section: { shape: 'solid', diameter: d } }],
      springs: [
        { at: L, stiffness: k },
        { at: L, stiffness: 1e12, motion: 'torsion' },
      ],
      ends: { start: { axial: 'fixed', torsion: 'fixed' }, end: { axial: 'free', torsion: 'free' } },
    })
    const c = Math.sqrt(E / RHO)
    const roots = [1, 2].map((n) => bisect((x) => ((k * L) / EA) * Math.sin(x) + x * Math.cos(x), (n - 0.5) * Math.PI, n * Math.PI))
    const reference = familyReference(project, familyOf(project, 'axial'), effectiveSettings(project), 2)
    reference.frequenciesHz.forEach((f, i) => expectRelative(f, (roots[i] * c) / (2 * Math.PI * L), 1e-12, `mode ${i + 1}`))
    expect(reference.formulation).toMatch(/tip spring/)
  })
})

describe('torsion: attachments must lie on the shaft', () => {
  const shaft = { length: 1, shearModulus: 80e9, density: 7850, torsionConstant: 1e-8, polarMoment: 1e-8, diameterRatio: 1 }
  const input = (extra: Record<string, unknown>) => ({ segments: [shaft], disks: [], springs: [], ends: { start: 'fixed' as const, end: 'free' as const }, ...extra })
  test('a disk beyond the end, a spring before the start, a zero inertia: refused by field', () => {
    expect(() => torsionExactReference(input({ disks: [{ at: 1.5, polarInertia: 1 }] }), 1)).toThrow(TorsionInputError)
    expect(() => torsionExactReference(input({ disks: [{ at: 1.5, polarInertia: 1 }] }), 1)).toThrow('disks[0].at must lie on the shaft, between 0 and 1 m, got 1.5')
    expect(() => torsionExactReference(input({ springs: [{ at: -0.1, stiffness: 1 }] }), 1)).toThrow('springs[0].at must lie on the shaft')
    expect(() => torsionExactReference(input({ disks: [{ at: 0.5, polarInertia: 0 }] }), 1)).toThrow('disks[0].polarInertia must be a positive number (kg·m²), got 0')
    expect(() => torsionExactReference(input({ springs: [{ at: 0.5, stiffness: Number.NaN }] }), 1)).toThrow('springs[0].stiffness must be a positive number (N·m/rad), got NaN')
  })
  test('at both ends of the shaft is on it: a disk at 0 and at L are accepted', () => {
    const f = torsionExactReference(input({ disks: [{ at: 0, polarInertia: 1e-3 }, { at: 1, polarInertia: 1e-3 }] }), 1).frequenciesHz[0]
    // Tip disk J_d on a fixed–free shaft: λ tan λ = ρI_pL/J_d (the torsional twin of §2); the disk at the fixed end does nothing.
    const lambda = bisect((x) => x * Math.tan(x) - (7850 * 1e-8 * 1) / 1e-3, 1e-9, Math.PI / 2 - 1e-12)
    expectRelative(f, (lambda * Math.sqrt(80e9 / 7850)) / (2 * Math.PI), 1e-12, 'f₁ with a tip disk')
  })
  test('a disk at the end of a shaft of several segments, at the length as written (2.2 m), though 0.6 + 0.9 + 0.4 + 0.3 sums a rounding below it', () => {
    expect(0.6 + 0.9 + 0.4 + 0.3).toBeLessThan(2.2)
    const segments = [0.6, 0.9, 0.4, 0.3].map((length) => ({ ...shaft, length }))
    const f = torsionExactReference(input({ segments, disks: [{ at: 2.2, polarInertia: 1e-3 }], springs: [] }), 1).frequenciesHz[0]
    // The same tip disk equation with L = 2.2 m (the segments are alike).
    const lambda = bisect((x) => x * Math.tan(x) - (7850 * 1e-8 * 2.2) / 1e-3, 1e-9, Math.PI / 2 - 1e-12)
    expectRelative(f, (lambda * Math.sqrt(80e9 / 7850)) / (2 * 2.2 * Math.PI), 1e-12, 'f₁ with a tip disk')
  })
})
