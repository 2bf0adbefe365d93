/**
 * `exactReference` end to end, on every route it takes, each checked against published values
 * or an independent computation in the test (never against the program's own output):
 * - closed forms of a uniform bar, c = √(E/ρ): fixed–free f_n = (2n − 1)c/(4L), fixed–fixed
 *   n c/(2L), free–free 0 then n c/(2L) (S. S. Rao, Mechanical Vibrations, longitudinal
 *   vibration of bars, from memory);
 * - a fixed–free bar with a tip mass M: λ tan λ = m/M, m = ρAL (Rao, same section, from
 *   memory; λ₁ = 0.6533, 0.8603, 1.0769, 1.3138 for m/M = 0.5, 1, 2, 5 as tabulated there,
 *   from memory), and with a tip spring k: tan λ = −λ EA/(kL) (R. D. Blevins, Formulas for
 *   Natural Frequency and Mode Shape, axial bars, from memory; for kL/EA = 1 the roots of
 *   tan λ = −λ, 2.0288, 4.9132, 7.9787, from memory); every root also re-derived by bisection
 *   on the frequency equation here;
 * - the transfer-matrix route (stepped, cone, springs, masses) against the roots of the global
 *   collocation determinant (tests/exact/independent.ts), and a fixed–free cone against its
 *   own frequency equation: in the apex coordinate r (d ∝ r) u = sin(k(r − r₀))/r, and
 *   u′(r₁) = 0 gives tan kL = k r₁ (derived here from the Webster horn solution; L. E. Kinsler
 *   et al., Fundamentals of Acoustics, horns, from memory).
 */
import { describe, expect, test } from 'vitest'
import { exactReference } from '../../core/exact/reference'
import type { Project } from '../../core/model/project'
import { expectRelative, makeProject, uniformBar } from '../helpers'
import { bisect, globalDeterminant, scanRoots, type AxialPiece } from './independent'

const E = 200e9
const RHO = 7850
const C = Math.sqrt(E / RHO)
const L = 1.3
const D = 0.025
const AREA = (Math.PI / 4) * D * D
const BAR_MASS = RHO * AREA * L
const MODES = 6

/** The n-th root (n ≥ 1) of λ tan λ = r, in ((n − 1)π, (n − ½)π). */
function tipMassRoot(r: number, n: number): number {
  return bisect((x) => x * Math.sin(x) - r * Math.cos(x), (n - 1) * Math.PI, (n - 0.5) * Math.PI)
}
/** The n-th root of tan λ = −λ/r, in ((n − ½)π, nπ). */
function tipSpringRoot(r: number, n: number): number {
  return bisect((x) => r * Math.sin(x) + x * Math.cos(x), (n - 0.5) * Math.PI, n * Math.PI)
}

describe('closed-form route: uniform bars', () => {
  test.each([
    ['fixed', 'free', (n: number) => ((2 * n - 1) * C) / (4 * L)],
    ['free', 'fixed', (n: number) => ((2 * n - 1) * C) / (4 * L)],
    ['fixed', 'fixed', (n: number) => (n * C) / (2 * L)],
    ['free', 'free', (n: number) => ((n - 1) * C) / (2 * L)],
  ] as const)('%s–%s', (start, end, formula) => {
    const reference = exactReference(uniformBar({ length: L, diameter: D, start, end }), MODES)
    expect(reference.method).toBe('exact')
    expect(reference.formulation).toBe(`closed form, uniform ${start}–${end} bar`)
    reference.frequenciesHz.forEach((f, i) => (formula(i + 1) === 0 ? expect(f).toBe(0) : expectRelative(f, formula(i + 1), 1e-13, `f${i + 1}`)))
  })
  test('steel, 1 m, fixed–free: f₁ = c/4L = 1261.886 Hz (c = √(200 GPa / 7850 kg/m³) = 5047.545 m/s)', () => {
    expectRelative(exactReference(uniformBar({ length: 1, start: 'fixed', end: 'free' }), 1).frequenciesHz[0], 1261.886, 1e-6, 'f1')
  })
})

describe('closed-form route: tip mass, λ tan λ = m/M', () => {
  test.each([
    [0.5, 0.6533],
    [2, 1.0769],
    [5, 1.3138],
  ])('m/M = %f: λ₁ = %f as published, all modes against the frequency equation', (ratio, published) => {
    for (const [start, end, at] of [
      ['fixed', 'free', L],
      ['free', 'fixed', 0],
    ] as const) {
      const project = uniformBar({ length: L, diameter: D, start, end, extra: { masses: [{ at, mass: BAR_MASS / ratio }] } })
      const reference = exactReference(project, MODES)
      expect(reference.formulation).toMatch(/tip mass/)
      const lambdas = reference.frequenciesHz.map((f) => (2 * Math.PI * f * L) / C)
      expect(Math.abs(lambdas[0] - published), `λ₁ ${lambdas[0]} against ${published}`).toBeLessThan(5e-5)
      lambdas.forEach((lambda, i) => expectRelative(lambda, tipMassRoot(ratio, i + 1), 1e-12, `${start}–${end} λ${i + 1}`))
    }
  })
})

describe('closed-form route: tip spring, tan λ = −λ EA/(kL)', () => {
  test('kL/EA = 1: λ = 2.0288, 4.9132, 7.9787 as published', () => {
    const k = (E * AREA) / L
    const reference = exactReference(uniformBar({ length: L, diameter: D, extra: { springs: [{ at: L, stiffness: k }] } }), 3)
    expect(reference.formulation).toMatch(/tip spring/)
    ;[2.0288, 4.9132, 7.9787].forEach((published, i) => {
      const lambda = (2 * Math.PI * reference.frequenciesHz[i] * L) / C
      expect(Math.abs(lambda - published), `λ${i + 1} ${lambda} against ${published}`).toBeLessThan(5e-5)
    })
  })
  test.each([0.3, 2.5, 40])('kL/EA = %f, both orientations, against the frequency equation', (ratio) => {
    const k = (ratio * E * AREA) / L
    for (const [start, end, at] of [
      ['fixed', 'free', L],
      ['free', 'fixed', 0],
    ] as const) {
      const reference = exactReference(uniformBar({ length: L, diameter: D, start, end, extra: { springs: [{ at, stiffness: k }] } }), MODES)
      expect(reference.formulation).toMatch(/tip spring/)
      reference.frequenciesHz.forEach((f, i) => expectRelative((2 * Math.PI * f * L) / C, tipSpringRoot(ratio, i + 1), 1e-12, `${start}–${end} λ${i + 1}`))
    }
  })
})

describe('transfer-matrix route', () => {
  const materials = [
    { id: 'steel', youngsModulus: 205e9, density: 7850 },
    { id: 'alu', youngsModulus: 69e9, density: 2700 },
  ]
  const solid = (d: number) => (Math.PI / 4) * d * d
  // Each case: the project, and the same part written out as pieces between stations with
  // the grounded stiffness and point mass at each station, for the collocation determinant.
  const cases: [string, Project, AxialPiece[], number[], number[]][] = [
    [
      'stepped, two materials, fixed–free',
      makeProject({
        materials,
        segments: [
          { length: 0.9, material: 'steel', section: { shape: 'solid', diameter: 0.05 } },
          { length: 1.4, material: 'alu', section: { shape: 'solid', diameter: 0.032 } },
        ],
      }),
      [
        { length: 0.9, youngsModulus: 205e9, density: 7850, area: solid(0.05), ratio: 1 },
        { length: 1.4, youngsModulus: 69e9, density: 2700, area: solid(0.032), ratio: 1 },
      ],
      [0, 0, 0],
      [0, 0, 0],
    ],
    [
      'tube, tapering cone, rectangle, fixed–fixed',
      makeProject({
        materials,
        segments: [
          { length: 0.5, material: 'steel', section: { shape: 'tube', outerDiameter: 0.06, innerDiameter: 0.045 } },
          { length: 0.3, material: 'steel', section: { shape: 'cone', startDiameter: 0.06, endDiameter: 0.025 } },
          { length: 0.8, material: 'alu', section: { shape: 'rectangle', width: 0.03, height: 0.012 } },
        ],
        ends: { start: 'fixed', end: 'fixed' },
      }),
      [
        { length: 0.5, youngsModulus: 205e9, density: 7850, area: solid(0.06) - solid(0.045), ratio: 1 },
        { length: 0.3, youngsModulus: 205e9, density: 7850, area: solid(0.06), ratio: 0.025 / 0.06 },
        { length: 0.8, youngsModulus: 69e9, density: 2700, area: 0.03 * 0.012, ratio: 1 },
      ],
      [0, 0, 0, 0],
      [0, 0, 0, 0],
    ],
    [
      'expanding cone with an interior spring and a tip mass',
      makeProject({
        materials,
        segments: [{ length: 1.1, material: 'steel', section: { shape: 'cone', startDiameter: 0.02, endDiameter: 0.07 } }],
        springs: [{ at: 0.55, stiffness: 2e8 }],
        masses: [{ at: 1.1, mass: 7.5 }],
      }),
      [
        { length: 0.55, youngsModulus: 205e9, density: 7850, area: solid(0.02), ratio: 0.045 / 0.02 },
        { length: 0.55, youngsModulus: 205e9, density: 7850, area: solid(0.045), ratio: 0.07 / 0.045 },
      ],
      [0, 2e8, 0],
      [0, 0, 7.5],
    ],
    [
      'free–free with masses (rigid-body mode first)',
      makeProject({
        materials,
        segments: [
          { length: 1.0, material: 'steel', section: { shape: 'solid', diameter: 0.04 } },
          { length: 0.5, material: 'alu', section: { shape: 'area', area: 9e-4 } },
        ],
        ends: { start: 'free', end: 'free' },
        masses: [
          { at: 0.4, mass: 1.5 },
          { at: 1.5, mass: 0.8 },
        ],
      }),
      [
        { length: 0.4, youngsModulus: 205e9, density: 7850, area: solid(0.04), ratio: 1 },
        { length: 0.6, youngsModulus: 205e9, density: 7850, area: solid(0.04), ratio: 1 },
        { length: 0.5, youngsModulus: 69e9, density: 2700, area: 9e-4, ratio: 1 },
      ],
      [0, 0, 0, 0],
      [0, 1.5, 0, 0.8],
    ],
    [
      'uniform fixed–free bar with a mass at the tip and a spring (two attachments: not a closed form)',
      uniformBar({ length: L, diameter: D, extra: { masses: [{ at: L, mass: 0.9 }], springs: [{ at: L / 3, stiffness: 5e7 }] } }),
      [
        { length: L / 3, youngsModulus: E, density: RHO, area: AREA, ratio: 1 },
        { length: (2 * L) / 3, youngsModulus: E, density: RHO, area: AREA, ratio: 1 },
      ],
      [0, 5e7, 0],
      [0, 0, 0.9],
    ],
  ]

  test.each(cases)('%s: against the roots of the collocation determinant to 1e-10', (_, project, pieces, springs, masses) => {
    const reference = exactReference(project, MODES)
    expect(reference.formulation).toBe('transfer matrices with the Wittrick–Williams count')
    const fixedStart = project.ends.start.axial === 'fixed'
    const fixedEnd = project.ends.end.axial === 'fixed'
    const det = (w: number) => globalDeterminant(pieces, springs, masses, fixedStart, fixedEnd, w)
    const top = 2 * Math.PI * reference.frequenciesHz[MODES - 1] * 1.05
    const roots = scanRoots(det, top, 4000).map(([a, b]) => bisect(det, a, b) / (2 * Math.PI))
    const elastic = reference.frequenciesHz.filter((f) => f > 0)
    if (!fixedStart && !fixedEnd && springs.every((k) => k === 0)) expect(reference.frequenciesHz[0]).toBe(0)
    expect(roots.length).toBe(elastic.length)
    elastic.forEach((f, i) => expectRelative(f, roots[i], 1e-10, `f${i + 1}`))
  })

  test.each([
    [0.02, 0.07],
    [0.06, 0.015],
  ])('fixed–free cone %f → %f m: tan kL = k r₁ (apex coordinate)', (d0, d1) => {
    const length = 0.8
    const project = makeProject({ materials, segments: [{ length, material: 'steel', section: { shape: 'cone', startDiameter: d0, endDiameter: d1 } }] })
    const reference = exactReference(project, MODES)
    // Transfer matrices solve the bar's equation without discretisation: an exact method.
    expect(reference.method).toBe('exact')
    expect(reference.formulation).toMatch(/transfer matrices/)
    const c = Math.sqrt(205e9 / 7850)
    const r1 = (d1 * length) / (d1 - d0)
    // k r₁ cos kL − sin kL = 0, one root per branch of tan.
    const g = (k: number) => k * r1 * Math.cos(k * length) - Math.sin(k * length)
    const roots = scanRoots(g, (2 * Math.PI * reference.frequenciesHz[MODES - 1] * 1.05) / c, 3000).map(([a, b]) => (bisect(g, a, b) * c) / (2 * Math.PI))
    reference.frequenciesHz.forEach((f, i) => expectRelative(f, roots[i], 1e-11, `f${i + 1}`))
  })
})

describe('one attachment away from the free end: not a closed-form case', () => {
  // Fixed at 0, free at L, a point mass M or a grounded spring K at a: u = A sin kx before a,
  // B cos k(L − x) after it; continuity at a and the jump EA[u′] = −ω²M u (or K u) give, derived
  // here, cos kL − (kM/ρA) sin ka cos k(L − a) = 0 for the mass and
  // cos kL + (K/(EA k)) sin ka cos k(L − a) = 0 for the spring. At a = L they reduce to
  // λ tan λ = m/M and tan λ = −λ EA/(KL) above (Rao, Blevins, as cited at the top of this file).
  const a = 0.45 * L
  const rootsOf = (g: (k: number) => number) =>
    scanRoots(g, ((MODES + 1) * Math.PI) / L, 4000)
      .map(([lo, hi]) => bisect(g, lo, hi))
      .slice(0, MODES)
  test('a mass of the bar’s own mass at 0.45 L: the chain route, each frequency a root of the equation', () => {
    const M = BAR_MASS
    const reference = exactReference(uniformBar({ length: L, diameter: D, extra: { masses: [{ at: a, mass: M }] } }), MODES)
    // Transfer matrices solve the bar's equation without discretisation: an exact method.
    expect(reference.method).toBe('exact')
    expect(reference.formulation).toMatch(/transfer matrices/)
    const roots = rootsOf((k) => Math.cos(k * L) - ((k * M) / (RHO * AREA)) * Math.sin(k * a) * Math.cos(k * (L - a)))
    expect(roots.length).toBe(MODES)
    reference.frequenciesHz.forEach((f, i) => expectRelative((2 * Math.PI * f) / C, roots[i], 1e-11, `k${i + 1}`))
  })
  test('a spring of EA/L at 0.45 L: the chain route, each frequency a root of the equation', () => {
    const K = (E * AREA) / L
    const reference = exactReference(uniformBar({ length: L, diameter: D, extra: { springs: [{ at: a, stiffness: K }] } }), MODES)
    // Transfer matrices solve the bar's equation without discretisation: an exact method.
    expect(reference.method).toBe('exact')
    expect(reference.formulation).toMatch(/transfer matrices/)
    const roots = rootsOf((k) => Math.cos(k * L) + (K / (E * AREA * k)) * Math.sin(k * a) * Math.cos(k * (L - a)))
    expect(roots.length).toBe(MODES)
    reference.frequenciesHz.forEach((f, i) => expectRelative((2 * Math.PI * f) / C, roots[i], 1e-11, `k${i + 1}`))
  })
  test('on a 10 m bar, an attachment 5 nm from the free end sits on it (within SAME_POSITION·L = 10 nm, core/model/geometry.ts): the tip closed form', () => {
    const long = 10
    const mass = uniformBar({ length: long, diameter: D, extra: { masses: [{ at: long - 5e-9, mass: 2 }] } })
    expect(exactReference(mass, 2)).toMatchObject({ method: 'exact', formulation: expect.stringMatching(/tip mass/) })
    const spring = uniformBar({ length: long, diameter: D, extra: { springs: [{ at: long - 5e-9, stiffness: 1e6 }] } })
    expect(exactReference(spring, 2)).toMatchObject({ method: 'exact', formulation: expect.stringMatching(/tip spring/) })
  })
})
