// @vitest-environment happy-dom
/**
 * What the tuner says when no value in its range clears a conflict. Checked on a uniform
 * fixed–free steel bar, whose axial frequencies are f_n = (2n − 1) c / 4L with c = √(E/ρ)
 * (S. S. Rao, Mechanical Vibrations, longitudinal vibration of bars, from memory): f ∝ √E / (L √ρ),
 * so the relative sensitivities are exactly +½ for E, −½ for ρ, −1 for L and 0 for the diameter.
 * The frequency sits inside a wide fixed-frequency band, so no E within ±5 % can clear it.
 */
import { beforeEach, describe, expect, it } from 'vitest'
import { mount } from '@vue/test-utils'
import { frequencySensitivities } from '../../core/analysis/sensitivity'
import { designParameters } from '../../core/analysis/design-parameters'
import { separationFromBand, statusOf } from '../../core/analysis/resonance'
import { tuneParameter } from '../../core/analysis/tuner'
import { clearingChange, suggestedRange, tuneAdvice } from '../../renderer/format/tuner-advice'
import { useProjectStore } from '../../renderer/stores/project-store'
import { useSensitivityStore } from '../../renderer/stores/sensitivity-store'
import { useTunerStore } from '../../renderer/stores/tuner-store'
import DesignTuner from '../../renderer/components/DesignTuner.vue'
import { makeProject, STEEL } from '../helpers'
import { freshApp, settle } from './renderer-helpers'

const MARGIN = 0.1
const BAND: [number, number] = [1150, 1400]
const part = makeProject({
  materials: [STEEL],
  segments: [{ length: 1, material: 'steel', section: { shape: 'solid', diameter: 0.02 } }],
  analysis: { modes: 2 },
  excitations: [{ label: 'Wide band', hz: BAND }],
  margin: MARGIN,
})
/** f₁ = c/4L, c = √(E/ρ). */
const F1 = Math.sqrt(STEEL.youngsModulus / STEEL.density) / 4
const E = STEEL.youngsModulus
const RANGE: [number, number] = [0.95 * E, 1.05 * E]

describe('clearing change', () => {
  it('moves a frequency exactly onto the edge the resonance check draws, the shorter way', () => {
    const change = clearingChange(F1, BAND, MARGIN)
    // Down to 1150 × 0.9 = 1035 Hz is nearer than up to 1400 × 1.1 = 1540 Hz.
    expect(F1 * (1 + change)).toBeCloseTo(BAND[0] * (1 - MARGIN), 9)
    expect(statusOf(separationFromBand(F1 * (1 + change) * (1 - 1e-9), BAND), MARGIN)).toBe('clear')
    expect(statusOf(separationFromBand(F1 * (1 + change) * (1 + 1e-9), BAND), MARGIN)).toBe('conflict')
    // A frequency just under the band is moved up when that is nearer.
    expect(clearingChange(1500, BAND, MARGIN)).toBeCloseTo((1400 * 1.1) / 1500 - 1, 12)
  })
})

describe('tuner advice on a uniform bar inside a wide band', () => {
  const result = tuneParameter(part, { parameter: 'materials[0].youngsModulus', min: RANGE[0], max: RANGE[1] })
  const parameters = designParameters(part)
  const sensitivities = frequencySensitivities(part, 2, parameters)
  const advice = tuneAdvice({ result, bounds: RANGE, excitations: part.excitations, margin: MARGIN, sensitivities: { parameters, sensitivities } })
  const needed = clearingChange(F1, BAND, MARGIN)

  it('says that no value in the range clears the conflict, nor separates further', () => {
    // √1.05 moves f₁ by 2.5 % at most: it stays inside the band (separation 0).
    expect(result.before.minSeparation).toBe(0)
    expect(result.minSeparation).toBe(0)
    expect(advice.clears).toBe(false)
    expect(advice.improves).toBe(false)
    expect(advice.conflict?.mode).toBe(1)
    expect(advice.conflict?.band.label).toBe('Wide band')
  })

  it('suggests the parameter with the largest effect: the length (sensitivity −1), by −Δ/(−1)', () => {
    expect(advice.other?.parameter.path).toBe('segments[0].length')
    expect(advice.other!.change).toBeCloseTo(needed / -1, 6)
    // The diameter does not move an axial frequency of a uniform bar: never suggested.
    expect(advice.other?.parameter.path).not.toContain('diameter')
  })

  it('suggests widening E beyond the lower bound, by Δ/½', () => {
    expect(advice.widen?.bound).toBe('lower')
    expect(advice.widen!.change).toBeCloseTo(needed / 0.5, 6)
    expect(advice.widen!.target).toBeLessThan(RANGE[0])
  })

  it('offers a range to search that does clear the conflict', () => {
    const [min, max] = suggestedRange(advice.other!)
    const found = tuneParameter(part, { parameter: 'segments[0].length', min, max })
    expect(found.minSeparation!).toBeGreaterThanOrEqual(MARGIN)
    // Closed form: clear once c/4L ≤ 1035 Hz, L ≥ c/(4 × 1035).
    expect(max).toBeGreaterThan((4 * F1) / (4 * BAND[0] * (1 - MARGIN)))
  })
})

describe('the tuner panel', () => {
  beforeEach(() => {
    freshApp()
    useProjectStore().load(part, { path: null, name: 'bar' })
  })

  it('offers no Apply for a change that separates no further, says why, and searches what would clear it', async () => {
    const tuner = useTunerStore()
    await useSensitivityStore().refresh()
    tuner.choose('materials[0].youngsModulus')
    tuner.setBound('min', RANGE[0])
    tuner.setBound('max', RANGE[1])
    tuner.goal = 'separation'
    await tuner.run()
    const wrapper = mount(DesignTuner, { attachTo: document.body })
    await settle()
    expect(wrapper.get('[data-testid="tune-no-clear"]').text()).toContain('clears the conflict')
    expect(wrapper.get('[data-testid="tune-no-clear"]').text()).toContain('No value of the Young\'s modulus of steel between')
    expect(wrapper.find('[data-testid="tune-accept"]').exists()).toBe(false)
    expect(wrapper.find('[data-testid="tune-nothing-to-apply"]').exists()).toBe(true)
    expect(wrapper.get('[data-testid="tune-suggest-other"]').text()).toContain('length of segment 1')
    await wrapper.get('[data-testid="tune-search-other"]').trigger('click')
    for (let i = 0; i < 20 && tuner.running; i++) await settle()
    expect(tuner.result?.parameter).toBe('segments[0].length')
    expect(tuner.result!.minSeparation!).toBeGreaterThanOrEqual(MARGIN)
    await settle()
    expect(wrapper.find('[data-testid="tune-no-clear"]').exists()).toBe(false)
    expect(wrapper.get('[data-testid="tune-accept"]').text()).toBe('Apply to the part')
    wrapper.unmount()
  })
})
