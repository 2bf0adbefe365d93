/**
 * Sensitivities in words and display units. The expected Hz figures come from the closed form of
 * a uniform fixed–free bar, f₁ = c/(4L) with c = √(E/ρ) (S. S. Rao, Mechanical Vibrations,
 * longitudinal vibration of bars; docs/verification.md §1; from memory), whose derivatives are
 * df/dL = −f/L, df/dE = f/(2E), df/dρ = −f/(2ρ), and nothing for the diameter. Unit factors are
 * NIST SP 811's (1 in = 0.0254 m exactly). Steps are Rodwave's own rule (about 1 %, rounded to
 * 1, 2 or 5 × 10ⁿ in the unit shown), checked as behaviour.
 */
import { describe, expect, it } from 'vitest'
import { fc, test as propertyTest } from '@fast-check/vitest'
import { designParameters } from '../../core/analysis/design-parameters'
import { frequencySensitivities } from '../../core/analysis/sensitivity'
import { formatFigure } from '../../core/report/number-format'
import {
  derivativeText,
  derivativeUnit,
  rankedSensitivities,
  relativeText,
  roundStep,
  sensitivitySentence,
  sensitivityStep,
  stressPerForceUnit,
  stressPerForceValue,
} from '../../renderer/format/design-text'
import { makeProject, STEEL, uniformBar } from '../helpers'

const E = STEEL.youngsModulus
const RHO = STEEL.density

describe('steps of about 1 %', () => {
  it('rounds to the nearest of 1, 2 and 5 × 10ⁿ on a log scale', () => {
    const cases: [number, number][] = [
      [19, 20],
      [0.55, 0.5],
      [2, 2],
      [78.5, 100],
      [3.53, 5],
      [0.27, 0.2],
      [1.6, 2],
      [8.5, 10],
      [0.0024, 0.002],
      [3.1, 2],
      [3.2, 5],
    ]
    for (const [value, step] of cases) expect(roundStep(value), `roundStep(${value})`).toBe(step)
  })

  propertyTest.prop([fc.double({ min: 1e-9, max: 1e12, noNaN: true })], { seed: 20261201 })('is 1, 2 or 5 × 10ⁿ within a factor √2.5 of the value', (v) => {
    const step = roundStep(v)
    const mantissa = Number((step / 10 ** Math.floor(Math.log10(step) + 1e-12)).toPrecision(6))
    expect([1, 2, 5]).toContain(mantissa)
    expect(Math.abs(Math.log10(step / v))).toBeLessThanOrEqual(Math.log10(Math.sqrt(2.5)) + 1e-12)
  })

  it('takes segment lengths in mm or in, and other quantities in their display unit', () => {
    const bar = uniformBar({ length: 1.9, diameter: 0.024, extra: { masses: [{ at: 1.9, mass: 55 }] } })
    const of = (path: string) => designParameters(bar).find((p) => p.path === path)!
    expect(sensitivityStep(of('segments[0].length'), 'SI')).toMatchObject({ stepSI: 0.02, text: '20 mm' })
    // 1.9 m = 74.8 in; 1 % is 0.748 in, nearest 1 in (NIST SP 811: 1 in = 0.0254 m).
    expect(sensitivityStep(of('segments[0].length'), 'US')).toMatchObject({ stepSI: 0.0254, text: '1 in' })
    expect(sensitivityStep(of('segments[0].section.diameter'), 'SI')).toMatchObject({ text: '0.2 mm' })
    expect(sensitivityStep(of('masses[0].mass'), 'SI')).toMatchObject({ stepSI: 0.5, text: '0.5 kg' })
    expect(sensitivityStep(of('materials[0].youngsModulus'), 'SI')).toMatchObject({ stepSI: 2e9, text: '2 GPa' })
    expect(sensitivityStep(of('materials[0].density'), 'SI')).toMatchObject({ stepSI: 100, text: '100 kg/m³' })
  })
})

describe('sensitivities in words', () => {
  const L = 1
  const bar = uniformBar({ length: L, diameter: 0.02, extra: { analysis: { modes: 2 } } })
  const parameters = designParameters(bar)
  const sensitivities = frequencySensitivities(bar, 2)
  const f1 = Math.sqrt(E / RHO) / (4 * L)
  const sentence = (path: string, units: 'SI' | 'US' = 'SI') =>
    sensitivitySentence(
      sensitivities.find((s) => s.mode === 1 && s.parameter === path)!,
      parameters.find((p) => p.path === path)!,
      units,
    )

  it('says the step that raises the mode, by the closed form’s amount (f₁ = c/4L)', () => {
    // df/dL = −f/L: shortening by 10 mm raises f₁ by f₁ · 0.01.
    expect(sentence('segments[0].length')).toBe(`Shortening segment 1 by 10 mm raises mode 1 by ${formatFigure(f1 * 0.01, 2)} Hz`)
    // df/dE = f/(2E): 2 GPa more raises f₁ by f₁ · 2e9 / (2 · 200e9).
    expect(sentence('materials[0].youngsModulus')).toBe(`Increasing the Young's modulus of steel by 2 GPa raises mode 1 by ${formatFigure((f1 * 2e9) / (2 * E), 2)} Hz`)
    // df/dρ = −f/(2ρ): 100 kg/m³ less raises f₁ by f₁ · 100 / (2 · 7850).
    expect(sentence('materials[0].density')).toBe(`Reducing the density of steel by 100 kg/m³ raises mode 1 by ${formatFigure((f1 * 100) / (2 * RHO), 2)} Hz`)
    // In inches: 1 m = 39.37 in, 1 % of it 0.39 in, nearest 0.5 in = 0.0127 m (1 in = 0.0254 m).
    expect(sentence('segments[0].length', 'US')).toBe(`Shortening segment 1 by 0.5 in raises mode 1 by ${formatFigure((f1 * 0.0127) / L, 2)} Hz`)
  })

  it('says a parameter that does not move the mode leaves it unchanged (a uniform bar’s diameter)', () => {
    expect(sentence('segments[0].section.diameter')).toBe('Changing the diameter of segment 1 by 0.2 mm leaves mode 1 unchanged (to first order)')
  })

  it('takes mass off a mass that lowers the mode', () => {
    const loaded = makeProject({
      materials: [STEEL],
      segments: [{ length: 1, material: 'steel', section: { shape: 'solid', diameter: 0.02 } }],
      masses: [{ at: 1, mass: 2, label: 'clevis' }],
      analysis: { modes: 1 },
    })
    const s = frequencySensitivities(loaded, 1).find((x) => x.parameter === 'masses[0].mass')!
    expect(s.derivative).toBeLessThan(0)
    const text = sensitivitySentence(s, designParameters(loaded).find((p) => p.path === 'masses[0].mass')!, 'SI')
    expect(text).toBe(`Removing 0.02 kg from mass “clevis” raises mode 1 by ${formatFigure(Math.abs(s.derivative) * 0.02, 2)} Hz`)
  })

  it('gives df/dp per unit of the step and the relative sensitivity (−1 to length, ½ to E)', () => {
    const length = sensitivities.find((s) => s.mode === 1 && s.parameter === 'segments[0].length')!
    const lengthParameter = parameters.find((p) => p.path === 'segments[0].length')!
    // df/dL = −f/L per metre; per millimetre a thousandth of it.
    expect(derivativeText(length, lengthParameter, 'SI')).toBe(formatFigure(-f1 / L / 1000, 4))
    expect(derivativeUnit(lengthParameter, 'SI')).toBe('Hz/mm')
    expect(relativeText(length.relative)).toBe('\u22121.000')
    const modulus = sensitivities.find((s) => s.mode === 1 && s.parameter === 'materials[0].youngsModulus')!
    expect(relativeText(modulus.relative)).toBe('0.500')
  })

  it('ranks by the size of the relative sensitivity, one mode at a time', () => {
    const ranked = rankedSensitivities(sensitivities, 2)
    expect(ranked.every((s) => s.mode === 2)).toBe(true)
    expect(ranked[0].parameter).toBe('segments[0].length')
    expect(ranked[ranked.length - 1].parameter).toBe('segments[0].section.diameter')
    for (let i = 1; i < ranked.length; i++) expect(Math.abs(ranked[i - 1].relative)).toBeGreaterThanOrEqual(Math.abs(ranked[i].relative))
  })
})

describe('stress per unit force', () => {
  it('is MPa/N in SI and psi/lbf in US units: 1 Pa/N = 1 m⁻² = 0.0254² in⁻² (NIST SP 811)', () => {
    expect(stressPerForceUnit('SI')).toBe('MPa/N')
    expect(stressPerForceUnit('US')).toBe('psi/lbf')
    expect(stressPerForceValue(2.5e6, 'SI')).toBeCloseTo(2.5, 12)
    expect(stressPerForceValue(1, 'US')).toBeCloseTo(0.0254 ** 2, 15)
  })
})
