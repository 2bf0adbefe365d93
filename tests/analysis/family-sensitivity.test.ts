/**
 * Finite-element sensitivities of torsion and bending frequencies (family-sensitivity.ts) against
 * closed forms (S. S. Rao, Mechanical Vibrations, continuous systems; R. D. Blevins, Formulas for
 * Natural Frequency and Mode Shape; both from memory — docs/verification.md §1, §2):
 * - a uniform shaft, fixed–free: f_n = (2n − 1)/(4L)·√(G/ρ), G = E/(2(1 + ν)): relative
 *   sensitivities −1 to L, +½ to E, −½ to ρ, −½·ν/(1 + ν) to ν, 0 to the diameter (J and I_p
 *   both ∝ d⁴); on a uniform mesh the discrete eigenvalues scale the same way (K ∝ GJ/h,
 *   M ∝ ρI_p h), so these hold for the finite elements too;
 * - a shaft with a disk J_d at its free end: λ tan λ = ρI_pL/J_d; with a torsional spring k_t
 *   there instead: tan λ = −λ GJ/(k_t L) (the tip mass and tip spring of §2 with GJ for EA and
 *   ρI_p for ρA); the test differentiates these roots (bisection, central differences);
 * - a pinned–pinned beam: ω_n² = [(nπ/L)⁴ EI + P (nπ/L)²]/(ρA) with a tension P (Blevins, beams
 *   with axial load, from memory): relative sensitivities −2 to L, +1 to d (round, P = 0),
 *   +½ to E, −½ to ρ, and dω²/dP = (nπ/L)²/(ρA).
 */
import { describe, expect, test } from 'vitest'
import { analyseProject } from '../../core/analysis/modal-analysis'
import { designSensitivities, familySensitivities } from '../../core/analysis/family-sensitivity'
import type { FamilySensitivity } from '../../core/analysis/family-sensitivity'
import { expectRelative, makeProject, STEEL } from '../helpers'

const E = STEEL.youngsModulus
const RHO = STEEL.density
const NU = 0.3
const G = E / (2 * (1 + NU))

function part(doc: Record<string, unknown>) {
  return makeProject({ version: 2, materials: [{ ...STEEL, poissonRatio: NU }], ...doc })
}

function pick(list: FamilySensitivity[], mode: number, parameter: string): FamilySensitivity {
  const found = list.find((s) => s.mode === mode && s.parameter === parameter)
  if (!found) throw new Error(`no sensitivity of mode ${mode} to ${parameter}; have ${[...new Set(list.map((s) => s.parameter))].join(', ')}`)
  return found
}

/** The root of g on [lo, hi] by bisection (g changes sign once there). */
function bisect(g: (x: number) => number, lo: number, hi: number): number {
  let a = lo
  let b = hi
  for (let i = 0; i < 200; i++) {
    const mid = 0.5 * (a + b)
    if (Math.sign(g(mid)) === Math.sign(g(a))) a = mid
    else b = mid
  }
  return 0.5 * (a + b)
}

describe('torsion of a uniform shaft', () => {
  const L = 0.9
  const d = 0.04
  const shaft = part({
    motions: ['torsion'],
    segments: [{ length: L, material: 'steel', section: { shape: 'solid', diameter: d } }],
    ends: { start: { torsion: 'fixed' }, end: { torsion: 'free' } },
    analysis: { elementsPerSegment: 30, modes: 3 },
  })

  test('relative sensitivities −1, +½, −½, −½ν/(1 + ν), 0 for modes 1–3, to 1e-7', () => {
    const s = designSensitivities(shaft, 3)
    for (const mode of [1, 2, 3]) {
      expectRelative(pick(s, mode, 'segments[0].length').relative, -1, 1e-7, `mode ${mode} length`)
      expectRelative(pick(s, mode, 'materials[0].youngsModulus').relative, 0.5, 1e-7, `mode ${mode} E`)
      expectRelative(pick(s, mode, 'materials[0].density').relative, -0.5, 1e-7, `mode ${mode} ρ`)
      expectRelative(pick(s, mode, 'materials[0].poissonRatio').relative, (-0.5 * NU) / (1 + NU), 1e-6, `mode ${mode} ν`)
      expect(Math.abs(pick(s, mode, 'segments[0].section.diameter').relative), `mode ${mode} diameter`).toBeLessThan(1e-7)
    }
    // Each entry says what it is: the family, its motion, the frequency and the derivative in SI units.
    const first = pick(s, 1, 'segments[0].length')
    expect([first.motion, first.family, first.plane]).toEqual(['torsion', 'torsion', null])
    const f1 = (1 / (4 * L)) * Math.sqrt(G / RHO)
    expectRelative(first.frequencyHz, f1, 1e-3, 'f₁ on 30 elements')
    expectRelative(first.derivative, -first.frequencyHz / L, 1e-7, 'df/dL = −f/L')
    expect(first.value).toBe(L)
    expect(first.label).toBe('length of segment 1')
  })

  test('a given shear modulus: +½ to G, and E no longer acts', () => {
    const withG = makeProject({
      version: 2,
      motions: ['torsion'],
      materials: [{ ...STEEL, shearModulus: 79e9 }],
      segments: [{ length: L, material: 'steel', section: { shape: 'solid', diameter: d } }],
      ends: { start: { torsion: 'fixed' }, end: { torsion: 'free' } },
      analysis: { elementsPerSegment: 30, modes: 2 },
    })
    const s = designSensitivities(withG, 2)
    expectRelative(pick(s, 2, 'materials[0].shearModulus').relative, 0.5, 1e-7, 'G')
    expect(Math.abs(pick(s, 2, 'materials[0].youngsModulus').relative)).toBeLessThan(1e-7)
  })

  test('a disk at the free end: df/dJ_d against the root of λ tan λ = ρI_pL/J_d, to 1e-4', () => {
    const Ip = (Math.PI / 32) * d ** 4
    const shaftInertia = RHO * Ip * L
    const disk = 0.7 * shaftInertia
    const project = part({
      motions: ['torsion'],
      segments: [{ length: L, material: 'steel', section: { shape: 'solid', diameter: d } }],
      ends: { start: { torsion: 'fixed' }, end: { torsion: 'free' } },
      masses: [{ at: L, mass: 1, polarInertia: disk }],
      analysis: { elementsPerSegment: 200, modes: 2 },
    })
    const cT = Math.sqrt(G / RHO)
    const f1 = (J: number) => (bisect((x) => x * Math.tan(x) - shaftInertia / J, 1e-9, Math.PI / 2 - 1e-12) * cT) / (2 * Math.PI * L)
    const step = 1e-4 * disk
    const expected = (f1(disk + step) - f1(disk - step)) / (2 * step)
    const s = designSensitivities(project, 2)
    expectRelative(pick(s, 1, 'masses[0].polarInertia').derivative, expected, 1e-4, 'df₁/dJ_d')
  })

  test('a torsional spring at the free end: df/dk_t against the root of tan λ = −λGJ/(k_t L), to 1e-4', () => {
    const J = (Math.PI / 32) * d ** 4
    const kt = 0.8 * ((G * J) / L)
    const project = part({
      motions: ['torsion'],
      segments: [{ length: L, material: 'steel', section: { shape: 'solid', diameter: d } }],
      ends: { start: { torsion: 'fixed' }, end: { torsion: 'free' } },
      springs: [{ at: L, stiffness: kt, motion: 'torsion', label: 'coupling' }],
      analysis: { elementsPerSegment: 200, modes: 2 },
    })
    const cT = Math.sqrt(G / RHO)
    const f1 = (k: number) => (bisect((x) => (k * L) / (G * J) * Math.sin(x) + x * Math.cos(x), Math.PI / 2, Math.PI) * cT) / (2 * Math.PI * L)
    const step = 1e-4 * kt
    const expected = (f1(kt + step) - f1(kt - step)) / (2 * step)
    const s = designSensitivities(project, 2)
    const spring = pick(s, 1, 'springs[0].stiffness')
    expectRelative(spring.derivative, expected, 1e-4, 'df₁/dk_t')
    expect(spring.label).toBe('stiffness of spring “coupling”')
  })

  test('a mesh set by element length moves with a length change: refused with the parameter named', () => {
    const project = part({
      motions: ['torsion'],
      segments: [{ length: 1, material: 'steel', section: { shape: 'solid', diameter: d } }],
      ends: { start: { torsion: 'fixed' }, end: { torsion: 'free' } },
      analysis: { maxElementLength: 0.1, modes: 2 },
    })
    expect(() => designSensitivities(project, 2)).toThrow(/changing length of segment 1 changes the mesh/)
  })
})

describe('bending of a pinned–pinned beam', () => {
  const L = 1.6
  const d = 0.03
  const A = (Math.PI / 4) * d * d
  const I = (Math.PI / 64) * d ** 4
  const beam = (preload?: number) =>
    part({
      motions: ['axial', 'bending'],
      segments: [{ length: L, material: 'steel', section: { shape: 'solid', diameter: d } }],
      ends: { start: { axial: 'fixed', bending: 'pinned' }, end: { axial: 'free', bending: 'pinned' } },
      analysis: { elementsPerSegment: 80, modes: 2 },
      ...(preload === undefined ? {} : { preload }),
    })

  test('relative sensitivities −2 to L, +1 to d, +½ to E, −½ to ρ (modes 1 and 2), to 1e-7', () => {
    const s = designSensitivities(beam(), 2, ['bending'])
    expect(s.every((x) => x.motion === 'bending' && x.family === 'bending')).toBe(true)
    for (const mode of [1, 2]) {
      expectRelative(pick(s, mode, 'segments[0].length').relative, -2, 1e-7, `mode ${mode} L`)
      expectRelative(pick(s, mode, 'segments[0].section.diameter').relative, 1, 1e-7, `mode ${mode} d`)
      expectRelative(pick(s, mode, 'materials[0].youngsModulus').relative, 0.5, 1e-7, `mode ${mode} E`)
      expectRelative(pick(s, mode, 'materials[0].density').relative, -0.5, 1e-7, `mode ${mode} ρ`)
    }
  })

  test('tension: dω²/dP = (nπ/L)²/(ρA), so df/dP = (nπ/L)²/(ρA)/(8π²f), to 1e-4', () => {
    const P = 2e4
    const s = designSensitivities(beam(P), 2, ['bending'])
    for (const mode of [1, 2]) {
      const q = (mode * Math.PI) / L
      const f = Math.sqrt((q ** 4 * E * I + P * q * q) / (RHO * A)) / (2 * Math.PI)
      const entry = pick(s, mode, 'preload')
      expectRelative(entry.frequencyHz, f, 1e-4, `mode ${mode} frequency`)
      expectRelative(entry.derivative, (q * q) / (RHO * A) / (8 * Math.PI * Math.PI * f), 1e-4, `mode ${mode} df/dP`)
      expectRelative(entry.relative, (P / entry.frequencyHz) * entry.derivative, 1e-12, `mode ${mode} relative`)
    }
  })

  test('axial and bending together: the axial entries come from the exact solver, the bending ones from the elements', () => {
    const s = designSensitivities(beam(), 2)
    const axial = s.filter((x) => x.family === 'axial')
    const bending = s.filter((x) => x.family === 'bending')
    expect(axial.length).toBeGreaterThan(0)
    expect(bending.length).toBeGreaterThan(0)
    // Axial: f = (2n − 1)c/(4L) exactly (§1), so −1 to the length to round-off.
    expectRelative(pick(axial, 1, 'segments[0].length').relative, -1, 1e-10, 'axial L')
    expectRelative(pick(axial, 1, 'segments[0].length').frequencyHz, Math.sqrt(E / RHO) / (4 * L), 1e-12, 'axial f₁ exact')
    // Only the motions asked for.
    expect(designSensitivities(beam(), 2, ['axial']).every((x) => x.family === 'axial')).toBe(true)
  })

  test('familySensitivities skips rigid-body modes and takes the parameters it is given', () => {
    const free = part({
      motions: ['bending'],
      segments: [{ length: L, material: 'steel', section: { shape: 'solid', diameter: d } }],
      ends: { start: { bending: 'free' }, end: { bending: 'free' } },
      analysis: { elementsPerSegment: 40, modes: 4 },
    })
    const analysis = analyseProject(free, {}, { withReference: false }).families[0]
    const rigid = analysis.modes.filter((m) => m.rigidBody).length
    expect(rigid).toBe(2)
    const s = familySensitivities(analysis)
    const modes = [...new Set(s.map((x) => x.mode))]
    expect(modes).toEqual(analysis.modes.filter((m) => !m.rigidBody).map((m) => m.mode))
    // Free–free: f ∝ d/L² as for any uniform beam: −2 to L on the elastic modes.
    for (const mode of modes) expectRelative(pick(s, mode, 'segments[0].length').relative, -2, 1e-6, `mode ${mode} L`)
    const onlyDensity = familySensitivities(analysis, [])
    expect(onlyDensity).toEqual([])
  })
})
