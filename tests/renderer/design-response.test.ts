/**
 * The forced-response task behind the design view, against a hand-checkable case: a uniform
 * fixed–free bar with a harmonic force F at its free end. With k = ω/c, u(x) = F sin(kx) /
 * (EA k cos(kL)), so the tip receptance is tan(kL)/(EA k), its static value L/(EA), and the axial
 * stress E u′ = F cos(kx)/(A cos(kL)) is largest at the fixed end (S. S. Rao, Mechanical
 * Vibrations, forced longitudinal vibration of bars; from memory). At f = f₁/2 (kL = π/4) the
 * amplification is tan(π/4)/(π/4) = 4/π and the stress per force √2/A. Damping is set tiny
 * (ζ = 10⁻⁴) so the undamped formulas hold; the model's own tolerances are stated per check.
 */
import { describe, expect, it } from 'vitest'
import { analyseProject } from '../../core/analysis/modal-analysis'
import { evaluateReceptance, pointWeights, receptanceModel } from '../../core/analysis/forced-response'
import { responseGrid, responseTask } from '../../renderer/solver/design-tasks'
import { defaultResponsePoint } from '../../renderer/stores/response-store'
import { expectRelative, STEEL, uniformBar } from '../helpers'

const E = STEEL.youngsModulus
const RHO = STEEL.density
const L = 1.2
const D = 0.02
const A = (Math.PI / 4) * D * D
const C = Math.sqrt(E / RHO)
const F1 = C / (4 * L)

describe('forced response at the excitation bands', () => {
  const bar = uniformBar({
    length: L,
    diameter: D,
    extra: {
      damping: 1e-4,
      analysis: { elementsPerSegment: 400, modes: 8 },
      excitations: [
        { label: 'half the first mode', hz: F1 / 2 },
        { label: 'around the first mode', hz: [0.9 * F1, 1.1 * F1] },
      ],
    },
  })
  const result = responseTask(bar, { forceAt: L, responseAt: L, fromHz: 0, toHz: 1.3 * 3 * F1, points: 200, axis: 'linear' })

  it('has the static tip receptance L/(EA) (2-node elements are exact at the nodes for a uniform bar under end load; 1e-9)', () => {
    expectRelative(result.staticFlexibility!, L / (E * A), 1e-9, 'static receptance')
  })

  it('amplifies 4/π at half the first frequency, tan(kL)/(kL) at kL = π/4 (1e-4: mesh, damping, truncation)', () => {
    const half = result.bands[0]
    expect(half.peakHz).toBe(F1 / 2)
    expectRelative(half.amplification!, 4 / Math.PI, 1e-4, 'amplification')
    expectRelative(half.peakAmplitude, ((4 / Math.PI) * L) / (E * A), 1e-4, '|u/F|')
  })

  it('finds the largest stress per force √2/A at the fixed end at kL = π/4 (1e-3)', () => {
    const half = result.bands[0]
    expectRelative(half.stressPerForce, Math.SQRT2 / A, 1e-3, 'stress per force')
    expect(half.stressAt).toBe(0)
  })

  it('gives over a band the largest |H| divided by |H(0)|, no less than a dense scan finds (within 1e-9)', () => {
    const around = result.bands[1]
    const analysis = analyseProject(bar, {}, { withReference: false }).families[0]
    const model = receptanceModel(analysis, pointWeights(analysis, L), pointWeights(analysis, L), bar.damping)
    let scan = 0
    for (let i = 0; i <= 20_000; i++) {
      const f = 0.9 * F1 + (0.2 * F1 * i) / 20_000
      const [re, im] = evaluateReceptance(model, 2 * Math.PI * f)
      scan = Math.max(scan, Math.hypot(re, im))
    }
    expect(around.peakAmplitude).toBeGreaterThanOrEqual(scan * (1 - 1e-9))
    const [re, im] = evaluateReceptance(model, 2 * Math.PI * around.peakHz)
    expectRelative(around.peakAmplitude, Math.hypot(re, im), 1e-12, '|H| at the reported frequency')
    expectRelative(around.amplification!, around.peakAmplitude / (L / (E * A)), 1e-9, 'amplification')
    // A resonance inside the band: the response far exceeds the static value.
    expect(around.amplification!).toBeGreaterThan(100)
  })

  it('takes the excitations of the project it is given, though the solved part is kept between calls: tan(kL)/(kL) at kL = π/8 (1e-4)', () => {
    // The same part as above (so the worker's kept solve is reused), another excitation.
    const quarter = { ...bar, excitations: [{ label: 'a quarter of the first mode', hz: F1 / 4 }] }
    const bands = responseTask(quarter, { forceAt: L, responseAt: L, fromHz: 0, toHz: 3 * F1, points: 50, axis: 'linear' }).bands
    expect(bands.map((b) => b.band.label)).toEqual(['a quarter of the first mode'])
    expectRelative(bands[0].amplification!, Math.tan(Math.PI / 8) / (Math.PI / 8), 1e-4, 'amplification')
  })

  it('samples the range evenly plus each mode and its half-power points', () => {
    const grid = responseGrid({ fromHz: 0, toHz: 1000, points: 11, axis: 'linear' }, [250], 0.02)
    expect(grid).toEqual([0, 100, 200, 245, 250, 255, 300, 400, 500, 600, 700, 800, 900, 1000])
    // A log axis cannot start at 0: three decades below the top.
    expect(responseGrid({ fromHz: 0, toHz: 1000, points: 4, axis: 'log' }, [], 0.02).map((f) => Number(f.toPrecision(12)))).toEqual([1, 10, 100, 1000])
  })
})

describe('a bar without support', () => {
  it('has no static value and so no amplification', () => {
    const free = uniformBar({ length: L, diameter: D, start: 'free', end: 'free', extra: { analysis: { modes: 4 }, excitations: [{ hz: 500 }] } })
    const result = responseTask(free, { forceAt: 0, responseAt: L, fromHz: 10, toHz: 5000, points: 50, axis: 'log' })
    expect(result.staticFlexibility).toBeNull()
    expect(result.bands[0].amplification).toBeNull()
    expect(result.bands[0].peakAmplitude).toBeGreaterThan(0)
  })

  it('puts the default points at the free end, or mid-span when both ends are fixed', () => {
    expect(defaultResponsePoint(uniformBar({ length: L }))).toBe(L)
    expect(defaultResponsePoint(uniformBar({ length: L, start: 'free', end: 'fixed' }))).toBe(0)
    expect(defaultResponsePoint(uniformBar({ length: L, start: 'fixed', end: 'fixed' }))).toBe(L / 2)
  })

  it('refuses points off the bar, naming them', () => {
    const bar = uniformBar({ length: L })
    expect(() => responseTask(bar, { forceAt: 2 * L, responseAt: L, fromHz: 0, toHz: 100, points: 10, axis: 'linear' })).toThrow(/force point/)
  })
})
