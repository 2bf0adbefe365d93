/**
 * Design guidance against closed forms and independent computations:
 * - a uniform bar's f ∝ c/L = √(E/ρ)/L gives relative sensitivities −1 to length, +½ to E,
 *   −½ to density, 0 to a solid section's diameter (docs/verification.md §1);
 * - on stepped, loaded models, the analytic sensitivities against central differences of the
 *   exact piecewise solver (an independent route: re-solving perturbed parts);
 * - the tuner against L = c/(4f) for a fixed–free bar (docs/verification.md §1), and its
 *   separation goal against optima in closed form (§10);
 * - scatter quantiles against the analytic quantiles of f ∝ √E for a tolerance on E alone:
 *   with E = E₀(1 + t(2U − 1)), U uniform, the q-quantile is f₀ √(1 + t(2q − 1)) (§12);
 * - the receptance's static limit L/(EA) at the tip of a uniform fixed–free bar, and its peak
 *   near f₁, ≈ φ₁(L)² / (2ζω₁²) with φ₁(L)² = 2/m for mass-normalised modes (Rao, Mechanical
 *   Vibrations, continuous systems and forced response, from memory; §11).
 */
import { describe, expect, test } from 'vitest'
import { designParameters, withParameter, withSegmentLength } from '../../core/analysis/design-parameters'
import { frequencySensitivities } from '../../core/analysis/sensitivity'
import { tuneParameter } from '../../core/analysis/tuner'
import { scatterDraw, scatterFrequencies, scatterQuantiles } from '../../core/analysis/tolerance-scatter'
import { seededRandom } from '../../core/random'
import { analyseProject } from '../../core/analysis/modal-analysis'
import { forcedResponse } from '../../core/analysis/forced-response'
import { exactReference } from '../../core/exact/reference'
import { expectRelative, makeProject, uniformBar } from '../helpers'

const E = 200e9
const RHO = 7850

describe('sensitivities', () => {
  test('uniform bar: −1 to length, +½ to E, −½ to density, 0 to diameter', () => {
    const project = uniformBar({ length: 1.3 })
    const s = frequencySensitivities(project, 3)
    for (const mode of [1, 2, 3]) {
      const of = (path: string) => s.find((x) => x.mode === mode && x.parameter === path)!.relative
      expectRelative(of('segments[0].length'), -1, 1e-10, `mode ${mode} length`)
      expectRelative(of('materials[0].youngsModulus'), 0.5, 1e-10, `mode ${mode} E`)
      expectRelative(of('materials[0].density'), -0.5, 1e-10, `mode ${mode} density`)
      expect(Math.abs(of('segments[0].section.diameter')), `mode ${mode} diameter`).toBeLessThan(1e-10)
    }
  })

  const stepped = makeProject({
    materials: [
      { id: 'st', youngsModulus: 205e9, density: 7850 },
      { id: 'al', youngsModulus: 69e9, density: 2700 },
    ],
    segments: [
      { length: 0.9, material: 'st', section: { shape: 'tube', outerDiameter: 0.05, innerDiameter: 0.03 } },
      { length: 0.4, material: 'st', section: { shape: 'cone', startDiameter: 0.05, endDiameter: 0.028 } },
      { length: 1.1, material: 'al', section: { shape: 'rectangle', width: 0.04, height: 0.015 } },
      { length: 0.3, material: 'titanium-6al-4v', section: { shape: 'area', area: 5e-4 } },
    ],
    masses: [
      { at: 1.8, mass: 2.5 },
      { at: 2.7, mass: 6 },
    ],
    springs: [{ at: 0.5, stiffness: 8e7 }],
  })

  test('stepped, loaded model: every sensitivity matches central differences of the exact solver to 1e-6', () => {
    const modes = 4
    const s = frequencySensitivities(stepped, modes)
    const parameters = designParameters(stepped)
    expect(parameters.map((p) => p.path)).toEqual(
      expect.arrayContaining(['segments[1].section.startDiameter', 'library["titanium-6al-4v"].youngsModulus', 'masses[1].mass', 'springs[0].stiffness']),
    )
    for (const p of parameters) {
      const h = 1e-5 * p.value
      const up = exactReference(withParameter(stepped, p.target, p.value + h), modes).frequenciesHz
      const down = exactReference(withParameter(stepped, p.target, p.value - h), modes).frequenciesHz
      for (let m = 0; m < modes; m++) {
        const analytic = s.find((x) => x.mode === m + 1 && x.parameter === p.path)!
        const central = ((up[m] - down[m]) / (2 * h)) * (p.value / analytic.frequencyHz)
        expect(Math.abs(analytic.relative - central), `${p.path}, mode ${m + 1}: analytic ${analytic.relative}, differences ${central}`).toBeLessThan(1e-6)
      }
    }
  })

  test('a length change moves attachments by the file-format rule', () => {
    const moved = withSegmentLength(stepped, 2, 1.21) // segment 3 spans 1.3 … 2.4 m, +0.11 m
    expect(moved.masses[0].at).toBeCloseTo(1.3 + (0.5 / 1.1) * 1.21, 12) // inside: keeps its fraction
    expect(moved.masses[1].at).toBeCloseTo(2.81, 12) // beyond: moves with the end
    expect(moved.springs[0].at).toBe(0.5) // before: stays
  })
})

describe('tuner', () => {
  test('places mode 1 of a fixed–free bar at 1000 Hz with L = c/(4f) to 1e-9', () => {
    const c = Math.sqrt(E / RHO)
    const result = tuneParameter(uniformBar(), { parameter: 'segments[0].length', min: 0.5, max: 3, mode: 1, targetHz: 1000 })
    expectRelative(result.value, c / 4000, 1e-9, 'length')
    expectRelative(result.frequenciesHz[0], 1000, 1e-9, 'f1')
  })
  test('places mode 2 on a target (fixed–free: f2 = 3c/4L)', () => {
    const c = Math.sqrt(E / RHO)
    const result = tuneParameter(uniformBar(), { parameter: 'segments[0].length', min: 0.5, max: 5, mode: 2, targetHz: 2500 })
    expectRelative(result.value, (3 * c) / (4 * 2500), 1e-9, 'length')
  })
  test('an unreachable target is refused with the range it can reach', () => {
    expect(() => tuneParameter(uniformBar(), { parameter: 'segments[0].length', min: 0.5, max: 1, mode: 1, targetHz: 100 })).toThrow(/moves between/)
  })
})

/**
 * The separation goal against optima known in closed form (docs/verification.md §10). On a
 * fixed–free uniform bar f₁ = c/(4L), f₂ = 3f₁ (§1); with f₁ between two excitations the
 * smallest separation min((f − F₁)/F₁, (F₂ − f)/F₂) is largest where the two are equal,
 * f* = 2F₁F₂/(F₁ + F₂), where it is (F₂ − F₁)/(F₁ + F₂); with one excitation F between f₁
 * and f₂ = 3f₁, (F − f₁)/F = (3f₁ − F)/F gives f₁* = F/2 and a separation of ½. Each range
 * puts the optimum at a different fraction of the tuner's grid step, so that a search that
 * looks on one side of the best grid point only misses it.
 */
describe('tuner: separation optimum between grid points', () => {
  const c = Math.sqrt(E / RHO)
  const bar = (excitations: unknown[], modes: number) => uniformBar({ extra: { excitations, analysis: { modes } } })

  const betweenTwo = { lo: 900, hi: 1400 }
  const bestBetweenTwo = (2 * betweenTwo.lo * betweenTwo.hi) / (betweenTwo.lo + betweenTwo.hi)
  test.each([
    [0.8, 1.7],
    [1.0, 1.3],
    [0.9, 1.6],
    [1.1, 1.5],
    [0.76, 1.2],
  ])('length in [%f, %f] m, f₁ between 900 and 1400 Hz: L* = c/(4f*) with f* their harmonic mean', (min, max) => {
    const project = bar([{ label: 'low', hz: betweenTwo.lo }, { label: 'high', hz: betweenTwo.hi }], 1)
    const result = tuneParameter(project, { parameter: 'segments[0].length', min, max })
    expectRelative(result.value, c / (4 * bestBetweenTwo), 1e-8, 'length')
    expectRelative(result.minSeparation as number, (betweenTwo.hi - betweenTwo.lo) / (betweenTwo.hi + betweenTwo.lo), 1e-8, 'separation')
  })

  test.each([
    [1.0, 1.5],
    [0.95, 1.9],
    [1.2, 1.4],
    [1.05, 2.2],
  ])('length in [%f, %f] m, 2000 Hz between f₁ and f₂ = 3f₁: L* = c/(2F), separation ½', (min, max) => {
    const project = bar([{ label: 'mesh', hz: 2000 }], 2)
    const result = tuneParameter(project, { parameter: 'segments[0].length', min, max })
    expectRelative(result.value, c / (2 * 2000), 1e-8, 'length')
    expectRelative(result.minSeparation as number, 0.5, 1e-8, 'separation')
  })

  test.each([
    [0.8e11, 2.0e11],
    [1.0e11, 1.5e11],
    [0.5e11, 3.0e11],
    [1.2e11, 1.31e11],
  ])('E in [%f, %f] Pa between the bands 700–760 and 1500–1650 Hz: E* = ρ(4Lf*)² with f* = 2·760·1500/(760 + 1500)', (min, max) => {
    const project = bar([{ label: 'low band', hz: [700, 760] }, { label: 'high band', hz: [1500, 1650] }], 1)
    const best = (2 * 760 * 1500) / (760 + 1500)
    const result = tuneParameter(project, { parameter: 'materials[0].youngsModulus', min, max })
    expectRelative(result.value, RHO * (4 * 1 * best) ** 2, 1e-8, 'E')
    expectRelative(result.minSeparation as number, (1500 - 760) / (1500 + 760), 1e-8, 'separation')
  })

  test('tip mass against λ tan λ = m/M (Rao), optimum found here by scan and golden section', () => {
    // Fixed–free bar with a tip mass M: ω = λc/L with λ tan λ = m/M, m = ρAL (docs/verification.md §2).
    const L = 2
    const d = 0.024
    const m = RHO * (Math.PI / 4) * d * d * L
    const excitations = [
      { label: 'pump', rpm: [2960, 2990], orders: [1, 2, 7] },
      { label: 'line', hz: 100 },
    ]
    const project = makeProject({
      materials: [{ id: 'st', youngsModulus: E, density: RHO }],
      segments: [{ length: L, material: 'st', section: { shape: 'solid', diameter: d } }],
      masses: [{ at: L, mass: 40 }],
      excitations,
      analysis: { modes: 3 },
    })
    const bands = [1, 2, 7].map((order) => [(2960 * order) / 60, (2990 * order) / 60]).concat([[100, 100]])
    const separation = (f: number, [lo, hi]: number[]) => (f < lo ? (lo - f) / lo : f > hi ? (f - hi) / hi : 0)
    const objective = (M: number) => {
      let worst = Infinity
      for (let n = 1; n <= 3; n++) {
        // λ sin λ − (m/M) cos λ changes sign once on ((n−1)π, (n−1)π + π/2); bisection to the last bit.
        let lo = (n - 1) * Math.PI
        let hi = lo + Math.PI / 2
        const g = (x: number) => x * Math.sin(x) - (m / M) * Math.cos(x)
        for (let i = 0; i < 200 && hi - lo > 1e-15 * hi; i++) {
          const mid = 0.5 * (lo + hi)
          if (Math.sign(g(mid)) === Math.sign(g(lo))) lo = mid
          else hi = mid
        }
        const f = (0.5 * (lo + hi) * c) / (2 * Math.PI * L)
        for (const band of bands) worst = Math.min(worst, separation(f, band))
      }
      return worst
    }
    // Scan 2000 steps of the range, then golden section on the two steps around the best point.
    const [min, max] = [5, 120]
    let best = min
    for (let i = 0; i <= 2000; i++) {
      const M = min + ((max - min) * i) / 2000
      if (objective(M) > objective(best)) best = M
    }
    const step = (max - min) / 2000
    let a = Math.max(min, best - step)
    let b = Math.min(max, best + step)
    const golden = (Math.sqrt(5) - 1) / 2
    while (b - a > 1e-12 * b) {
      const x1 = b - golden * (b - a)
      const x2 = a + golden * (b - a)
      if (objective(x1) >= objective(x2)) b = x2
      else a = x1
    }
    const optimum = 0.5 * (a + b)
    const result = tuneParameter(project, { parameter: 'masses[0].mass', min, max })
    expectRelative(result.value, optimum, 1e-7, 'tip mass')
    expectRelative(result.minSeparation as number, objective(optimum), 1e-9, 'separation')
  })
})

describe('tolerance scatter', () => {
  test('quantiles of f under a ±5 % tolerance on E alone match f₀√(1 + t(2q − 1)) within 0.1 % (20 000 samples)', () => {
    const t = 0.05
    const project = uniformBar({ extra: { tolerances: { youngsModulus: t }, analysis: { elementsPerSegment: 20, modes: 2 } } })
    const samples = 20_000
    const frequencies = scatterFrequencies(project, { seed: 42, start: 0, count: samples, modes: 2 })
    const nominalModes = analyseProject(project, {}, { withReference: false }).modes
    const nominal = nominalModes.map((m) => m.frequencyHz)
    const quantiles = scatterQuantiles(frequencies, nominalModes)
    quantiles.forEach((q, m) => {
      const analytic = (p: number) => nominal[m] * Math.sqrt(1 + t * (2 * p - 1))
      expectRelative(q.p05, analytic(0.05), 1e-3, `mode ${m + 1} p05`)
      expectRelative(q.p50, analytic(0.5), 1e-3, `mode ${m + 1} p50`)
      expectRelative(q.p95, analytic(0.95), 1e-3, `mode ${m + 1} p95`)
    })
  })
  test('a draw moves attachments as the file-format rule does for each length change in turn', () => {
    const project = makeProject({
      materials: [{ id: 'st', youngsModulus: 2e11, density: 7850 }],
      segments: [
        { length: 1, material: 'st', section: { shape: 'solid', diameter: 0.02 } },
        { length: 0.5, material: 'st', section: { shape: 'solid', diameter: 0.03 } },
        { length: 0.8, material: 'st', section: { shape: 'solid', diameter: 0.02 } },
      ],
      masses: [
        { at: 0.4, mass: 1 },
        { at: 1.5, mass: 1 },
        { at: 2.0, mass: 1 },
      ],
      springs: [{ at: 2.3, stiffness: 1e6 }],
    })
    const drawn = scatterDraw(project, { length: 0.1 }, seededRandom(3))
    let sequential = project
    drawn.segments.forEach((s, i) => (sequential = withSegmentLength(sequential, i, s.length)))
    drawn.masses.forEach((m, i) => expect(m.at).toBeCloseTo(sequential.masses[i].at, 12))
    expect(drawn.springs[0].at).toBeCloseTo(sequential.springs[0].at, 12)
  })
  test('a sample does not depend on how the samples are split', () => {
    const project = uniformBar({ extra: { tolerances: { youngsModulus: 0.03, length: 0.01, diameter: 0.01 }, analysis: { elementsPerSegment: 10, modes: 3 } } })
    const all = scatterFrequencies(project, { seed: 9, start: 0, count: 30, modes: 3 })
    const part = scatterFrequencies(project, { seed: 9, start: 17, count: 5, modes: 3 })
    expect(Array.from(part)).toEqual(Array.from(all.slice(17 * 3, 22 * 3)))
  })
})

describe('forced response', () => {
  const d = 0.02
  const A = (Math.PI / 4) * d * d
  const L = 1.5
  const project = uniformBar({ length: L, diameter: d, extra: { damping: 0.02, analysis: { modes: 8 } } })
  const analysis = analyseProject(project).families[0]
  test('static limit at the tip is L/(EA)', () => {
    const r = forcedResponse(analysis, { forceAt: L, responseAt: L, fromHz: 0, toHz: 0, points: 1 })
    expectRelative(r.points[0].amplitude, L / (E * A), 1e-10, 'static receptance')
    expect(Math.abs(r.points[0].phaseDeg)).toBeLessThan(1e-9)
  })
  test('the peak near f₁ is φ₁(L)²/(2ζω₁²) with φ₁(L)² = 2/m, within 5 %', () => {
    const f1 = analysis.modes[0].frequencyHz
    const r = forcedResponse(analysis, { forceAt: L, responseAt: L, fromHz: f1, toHz: f1, points: 1 })
    const m = RHO * A * L
    const w1 = 2 * Math.PI * f1
    expectRelative(r.points[0].amplitude, 2 / m / (2 * 0.02 * w1 * w1), 0.05, 'peak receptance')
    expect(r.points[0].phaseDeg).toBeLessThan(-85)
  })
  test('reciprocity: u(a)/F(b) = u(b)/F(a)', () => {
    const ab = forcedResponse(analysis, { forceAt: 0.4, responseAt: 1.1, fromHz: 100, toHz: 3000, points: 7 })
    const ba = forcedResponse(analysis, { forceAt: 1.1, responseAt: 0.4, fromHz: 100, toHz: 3000, points: 7 })
    ab.points.forEach((p, i) => expectRelative(p.amplitude, ba.points[i].amplitude, 1e-10, `point ${i}`))
  })
})
