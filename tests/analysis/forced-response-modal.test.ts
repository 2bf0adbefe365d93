/**
 * Forced response against the modal expansion of the continuous part, computed in the test from
 * the exact mode shapes (docs/verification.md §1, §11; S. S. Rao, Mechanical Vibrations,
 * continuous systems, forced vibration by mode superposition, from memory):
 *   H(x, y; ω) = Σ φ_n(x) φ_n(y) / (ω_n² − ω² + 2iζ ω_n ω),
 * with mass-normalised φ_n. Fixed–free bar: φ_n = √(2/m) sin((2n − 1)πx/2L),
 * ω_n = (2n − 1)πc/2L; its static flexibility Σ φ_n(x)φ_n(y)/ω_n² = min(x, y)/EA (a unit force
 * at x stretches the bar up to x only; derived here). The test sums the series in its
 * mode-acceleration form (static part exact, the rest converging as n⁻⁴) to 4000 terms.
 * Free–free bar: a rigid mode φ₀ = 1/√m, then √(2/m) cos(nπx/L), ω_n = nπc/L (§1).
 * Beams: a simply supported beam under a point load F at a deflects a²b²F/(3EIL) there and
 * FL³/(48EI) at mid-span for a = L/2 (J. M. Gere & S. P. Timoshenko, Mechanics of Materials,
 * table of beam deflections, from memory).
 */
import { describe, expect, test } from 'vitest'
import { analyseProject } from '../../core/analysis/modal-analysis'
import { evaluateReceptance, forcedResponse, peakStressPerForce, pointWeights, receptanceModel } from '../../core/analysis/forced-response'
import { expectRelative, makeProject, STEEL, uniformBar } from '../helpers'

const E = STEEL.youngsModulus
const RHO = STEEL.density
const c = Math.sqrt(E / RHO)

interface Bar {
  L: number
  A: number
  m: number
}

/**
 * Fixed–free receptance u(y)/F(x) from the exact modes (see the header), as [real, imaginary]:
 * the static part exact, the dynamic part of the first `terms` modes (all 4000 by default; as many
 * as the finite elements keep when the two are compared, so that only the discretisation differs).
 */
function fixedFreeSeries(bar: Bar, x: number, y: number, omega: number, zeta: number, terms = 4000): [number, number] {
  let re = Math.min(x, y) / (E * bar.A)
  let im = 0
  for (let n = 1; n <= terms; n++) {
    const k = ((2 * n - 1) * Math.PI) / (2 * bar.L)
    const wn = k * c
    const product = (2 / bar.m) * Math.sin(k * x) * Math.sin(k * y)
    const a = wn * wn - omega * omega
    const b = 2 * zeta * wn * omega
    const d = a * a + b * b
    re += (product * a) / d - product / (wn * wn)
    im -= (product * b) / d
  }
  return [re, im]
}

describe('fixed–free bar: receptance against the exact modal expansion', () => {
  const d = 0.02
  const L = 1.2
  const A = (Math.PI / 4) * d * d
  const bar = { L, A, m: RHO * A * L }
  const f1 = c / (4 * L)
  const zeta = 0.03
  const project = uniformBar({ length: L, diameter: d, extra: { damping: zeta } })
  const settings = { elementOrder: 1 as const, elementsPerSegment: 1200, mass: 'consistent' as const, modes: 12 }

  test('the test series itself: undamped tip receptance tan(kL)/(EAk) (§11) to 1e-9', () => {
    for (const omega of [0.3, 0.7, 1.4, 2.6].map((r) => r * 2 * Math.PI * f1)) {
      const k = omega / c
      expectRelative(fixedFreeSeries(bar, L, L, omega, 0)[0], Math.tan(k * L) / (E * A * k), 1e-9, `ω = ${omega}`)
    }
  })

  test('tip and interior points, below, between and above the first modes: the expansion over the same modes to 1e-4', () => {
    const analysis = analyseProject(project, settings, { withReference: false }).families[0]
    const cases = [
      { x: L, y: L },
      { x: 0.4137, y: L },
      { x: L, y: 0.7311 },
      { x: 0.2519, y: 0.9043 },
    ]
    for (const { x, y } of cases) {
      const fromHz = 0.25 * f1
      const toHz = 4.4 * f1
      const points = 9
      const r = forcedResponse(analysis, { forceAt: x, responseAt: y, fromHz, toHz, points })
      expect(r.points.map((p) => p.frequencyHz)).toEqual(Array.from({ length: points }, (_, i) => fromHz + ((toHz - fromHz) * i) / (points - 1)))
      for (const p of r.points) {
        const [re, im] = fixedFreeSeries(bar, x, y, 2 * Math.PI * p.frequencyHz, zeta, settings.modes)
        const size = Math.hypot(re, im)
        const what = `x ${x}, y ${y}, ${p.frequencyHz.toFixed(1)} Hz`
        expect(Math.abs(p.real - re), `${what}: real ${p.real}, expected ${re}`).toBeLessThanOrEqual(1e-4 * size)
        expect(Math.abs(p.imaginary - im), `${what}: imaginary ${p.imaginary}, expected ${im}`).toBeLessThanOrEqual(1e-4 * size)
        expectRelative(p.amplitude, size, 1e-4, `${what}: amplitude`)
        const phase = (Math.atan2(im, re) * 180) / Math.PI
        expect(Math.abs(p.phaseDeg - phase), `${what}: phase ${p.phaseDeg}°, expected ${phase}°`).toBeLessThan(0.01)
      }
    }
  })

  test('static value min(x, y)/EA exactly (mode-acceleration correction), and the phase lags past resonance', () => {
    const analysis = analyseProject(project, { ...settings, modes: 3 }, { withReference: false }).families[0]
    const model = receptanceModel(analysis, pointWeights(analysis, 0.6), pointWeights(analysis, L), zeta)
    expectRelative(evaluateReceptance(model, 0)[0], 0.6 / (E * A), 1e-10, 'H(0)')
    expect(evaluateReceptance(model, 0)[1]).toBe(0)
    expectRelative(model.staticFlexibility!, 0.6 / (E * A), 1e-10, 'static flexibility')
    // Below f₁ in phase with the force, at f₁ a quarter period behind, above it half a period.
    const phase = (hz: number) => forcedResponse(analysis, { forceAt: L, responseAt: L, fromHz: hz, toHz: hz, points: 1 }).points[0].phaseDeg
    expect(phase(0.5 * f1)).toBeLessThanOrEqual(0)
    expect(phase(0.5 * f1)).toBeGreaterThan(-3)
    expect(Math.abs(phase(f1) + 90)).toBeLessThan(3)
    expect(phase(1.5 * f1)).toBeGreaterThan(-180)
    expect(phase(1.5 * f1)).toBeLessThan(-170)
  })

  test('one frequency asked: the point is at fromHz', () => {
    const analysis = analyseProject(project, { ...settings, modes: 3 }, { withReference: false }).families[0]
    const r = forcedResponse(analysis, { forceAt: L, responseAt: L, fromHz: 0.8 * f1, toHz: 3 * f1, points: 1 })
    expect(r.points.length).toBe(1)
    expect(r.points[0].frequencyHz).toBe(0.8 * f1)
  })

  test('damping defaults to the project’s and scales the resonant peak as 1/ζ', () => {
    const analysis = analyseProject(project, { ...settings, modes: 3 }, { withReference: false }).families[0]
    const at = { forceAt: L, responseAt: L, fromHz: f1, toHz: f1, points: 1 }
    const own = forcedResponse(analysis, at)
    expect(own.model.damping).toBe(zeta)
    const doubled = forcedResponse(analysis, { ...at, damping: 2 * zeta })
    // Peak ≈ φ₁(L)²/(2ζω₁²) = 1/(mζω₁²) (§11); the other modes add a real part of order ζ⁰ only.
    const w1 = 2 * Math.PI * f1
    expectRelative(-own.points[0].imaginary, 1 / (bar.m * zeta * w1 * w1), 1e-3, 'peak at ζ')
    expectRelative(-doubled.points[0].imaginary, 1 / (bar.m * 2 * zeta * w1 * w1), 1e-3, 'peak at 2ζ')
  })

  test('3-node elements: the same receptance at points inside elements, to 1e-6', () => {
    const analysis = analyseProject(project, { elementOrder: 2, elementsPerSegment: 150, mass: 'consistent', modes: 12 }, { withReference: false }).families[0]
    for (const [x, y] of [
      [0.3333, 1.0071],
      [1.1927, 0.0617],
    ]) {
      const r = forcedResponse(analysis, { forceAt: x, responseAt: y, fromHz: 0.6 * f1, toHz: 2.2 * f1, points: 5 })
      for (const p of r.points) {
        const [re, im] = fixedFreeSeries(bar, x, y, 2 * Math.PI * p.frequencyHz, zeta, 12)
        const size = Math.hypot(re, im)
        expect(Math.hypot(p.real - re, p.imaginary - im), `x ${x}, y ${y}, ${p.frequencyHz} Hz: (${p.real}, ${p.imaginary}) against (${re}, ${im})`).toBeLessThanOrEqual(1e-6 * size)
      }
    }
  })

  test('the peak stress per newton: F/A statically, F/(A cos kL) at the fixed end below f₁ (§11)', () => {
    const analysis = analyseProject(project, { ...settings, modes: 10 }, { withReference: false }).families[0]
    const h = L / settings.elementsPerSegment
    const still = peakStressPerForce(analysis, L, 0, 0)
    expectRelative(still.stress, 1 / A, 1e-9, 'static stress per newton')
    for (const ratio of [0.5, 0.8]) {
      const hz = ratio * f1
      const k = (2 * Math.PI * hz) / c
      const peak = peakStressPerForce(analysis, L, hz, 0)
      // The 2-node element's strain is the mean over the element nearest the fixed end: cos(kh/2)-close.
      expectRelative(peak.stress, 1 / (A * Math.cos(k * L)), 1e-4, `stress per newton at ${ratio} f₁`)
      expect(peak.at, `peak at ${peak.at} m`).toBeLessThanOrEqual(h)
    }
    // At resonance the peak is set by damping alone and scales as 1/ζ.
    const light = peakStressPerForce(analysis, L, f1, 0.01).stress
    const heavy = peakStressPerForce(analysis, L, f1, 0.02).stress
    expectRelative(light / heavy, 2, 1e-2, 'peak stress ratio for ζ halved')
    // The project's damping is the default.
    expectRelative(peakStressPerForce(analysis, L, f1).stress, peakStressPerForce(analysis, L, f1, zeta).stress, 1e-12, 'default damping')
  })
})

describe('free–free bar: rigid-body mode, no static flexibility', () => {
  const d = 0.03
  const L = 0.9
  const A = (Math.PI / 4) * d * d
  const m = RHO * A * L
  const project = uniformBar({ length: L, diameter: d, start: 'free', end: 'free', extra: { damping: 0.02 } })
  const modes = 14

  /** The same series as the test above, over the same number of modes as the finite elements (no static part exists). */
  function freeFreeSeries(x: number, y: number, omega: number, zeta: number): [number, number] {
    let re = -1 / (m * omega * omega)
    let im = 0
    for (let n = 1; n < modes; n++) {
      const k = (n * Math.PI) / L
      const wn = k * c
      const product = (2 / m) * Math.cos(k * x) * Math.cos(k * y)
      const a = wn * wn - omega * omega
      const b = 2 * zeta * wn * omega
      re += (product * a) / (a * a + b * b)
      im -= (product * b) / (a * a + b * b)
    }
    return [re, im]
  }

  test('the finite elements (3-node, fine) match the truncated exact expansion to 1e-6', () => {
    const analysis = analyseProject(project, { elementOrder: 2, elementsPerSegment: 300, mass: 'consistent', modes }, { withReference: false }).families[0]
    expect(analysis.modes[0].rigidBody).toBe(true)
    const f1 = c / (2 * L)
    const r = forcedResponse(analysis, { forceAt: 0, responseAt: L, fromHz: 0.3 * f1, toHz: 2.7 * f1, points: 7 })
    expect(r.model.residual).toBeNull()
    expect(r.model.staticFlexibility).toBeNull()
    for (const p of r.points) {
      const [re, im] = freeFreeSeries(0, L, 2 * Math.PI * p.frequencyHz, 0.02)
      const size = Math.hypot(re, im)
      expect(Math.hypot(p.real - re, p.imaginary - im), `${p.frequencyHz} Hz: (${p.real}, ${p.imaginary}) against (${re}, ${im})`).toBeLessThanOrEqual(1e-6 * size)
    }
    // At ω = 0 a rigid body has no finite receptance: the rigid term is left out rather than divided by zero.
    const [re0] = evaluateReceptance(r.model, 0)
    expect(Number.isFinite(re0)).toBe(true)
  })

  test('peak stress per newton of a free–free bar at rest: finite', () => {
    const analysis = analyseProject(project, { elementOrder: 2, elementsPerSegment: 200, mass: 'consistent', modes }, { withReference: false }).families[0]
    // At ω = 0 the rigid term is left out (no finite response) and no static part is added:
    // what remains is the elastic modes' quasi-static part, finite and non-zero.
    const still = peakStressPerForce(analysis, 0, 0, 0).stress
    expect(Number.isFinite(still) && still > 0, `stress ${still}`).toBe(true)
  })
})

describe('bending: Hermite interpolation of the load and read-out', () => {
  const D = 0.025
  const L = 1.1
  const I = (Math.PI / 64) * D ** 4
  const project = makeProject({
    version: 2,
    motions: ['bending'],
    materials: [STEEL],
    segments: [{ length: L, material: 'steel', section: { shape: 'solid', diameter: D } }],
    ends: { start: { bending: 'pinned' }, end: { bending: 'pinned' } },
  })

  test('static deflection under a point load: a²b²/(3EIL) at the load and L³/(48EI) at mid-span', () => {
    for (const elements of [40, 41]) {
      const analysis = analyseProject(project, { elementsPerSegment: elements, modes: 6 }, { withReference: false }).families[0]
      const middle = forcedResponse(analysis, { forceAt: L / 2, responseAt: L / 2, fromHz: 0, toHz: 0, points: 1 }).points[0]
      expectRelative(middle.real, L ** 3 / (48 * E * I), 1e-5, `${elements} elements: mid-span`)
      const a = 0.3719
      const b = L - a
      const atLoad = forcedResponse(analysis, { forceAt: a, responseAt: a, fromHz: 0, toHz: 0, points: 1 }).points[0]
      expectRelative(atLoad.real, (a * a * b * b) / (3 * E * I * L), 1e-5, `${elements} elements: under the load`)
      // Reciprocity and the deflection elsewhere (Gere & Timoshenko: x ≤ a, Fbx(L² − b² − x²)/(6EIL)).
      const x = 0.1302
      const elsewhere = forcedResponse(analysis, { forceAt: a, responseAt: x, fromHz: 0, toHz: 0, points: 1 }).points[0]
      expectRelative(elsewhere.real, (b * x * (L * L - b * b - x * x)) / (6 * E * I * L), 1e-5, `${elements} elements: at ${x} m`)
    }
  })

  test('the weights of a point load sum to one on the deflections and carry the rotation terms', () => {
    const analysis = analyseProject(project, { elementsPerSegment: 10, modes: 4 }, { withReference: false }).families[0]
    const { dofKinds, rotationScale } = analysis.model
    const h = L / 10
    const x = 0.25 * h + 3 * h // a quarter into element 4
    const w = pointWeights(analysis, x)
    let deflection = 0
    let rotation = 0
    w.forEach((value, j) => {
      if (dofKinds![j] === 0) deflection += value
      else rotation += value * rotationScale
    })
    // Hermite cubics at t = ¼: N₁ + N₃ = 1; N₂ + N₄ = h(2t³ − 3t² + t) = h·t(2t − 1)(t − 1) (derived from the cubics).
    const t = 0.25
    expectRelative(deflection, 1, 1e-12, 'Σ deflection weights')
    expectRelative(rotation, h * t * (2 * t - 1) * (t - 1), 1e-12, 'Σ rotation weights × ℓ')
  })
})
