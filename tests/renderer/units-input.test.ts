// @vitest-environment happy-dom
/**
 * Values typed in US customary units are stored as SI with the exact factors of NIST
 * Special Publication 811 (2008), appendix B: 1 in = 0.0254 m, 1 lb = 0.453 592 37 kg,
 * 1 lbf = 4.448 221 615 260 5 N, hence 1 psi = 6 894.757 293 168 Pa and
 * 1 lbf/in = 175.126 835 246 5 N/m. Shown values round-trip through the fields. A US modulus is
 * shown in Msi (10⁶ psi), the trade's usual form (common practice, no source). Decimal marks
 * follow the locale (Intl.NumberFormat, ECMA-402): a decimal comma where the locale writes one,
 * and a mark that could be a digit-group separator is never guessed.
 */
import { describe, expect, it } from 'vitest'
import { test as propertyTest, fc } from '@fast-check/vitest'
import { mount } from '@vue/test-utils'
import { BROWSER_SEPARATORS, fieldValue, localeSeparators, parseTyped, shown, typedProblem, typedToSI, unitSymbol } from '../../renderer/format/quantity'
import type { QuantityKind, UnitSystem } from '../../core/model/units'
import InputQuantity from '../../renderer/components/InputQuantity.vue'
import PartSegmentsTable from '../../renderer/components/PartSegmentsTable.vue'

/** |a − b| ≤ tolerance·|b|, with the numbers in the message. */
function expectClose(actual: number | undefined, expected: number, tolerance: number, what: string): void {
  expect(actual, what).toBeDefined()
  const error = Math.abs(actual! - expected) / Math.abs(expected)
  expect(error, `${what}: actual ${actual}, expected ${expected}, relative error ${error} > ${tolerance}`).toBeLessThanOrEqual(tolerance)
}

describe('typed values in US units (NIST SP 811, appendix B)', () => {
  const ULP = 4e-16
  // Exact by the definitions of the inch, the pound and the pound-force.
  const IN = 0.0254
  const LB = 0.45359237
  const LBF = 4.4482216152605
  it.each<[QuantityKind, string, number]>([
    ['length', '36', 0.9144], // 36 in = 1 yd = 0.9144 m exactly
    ['sectionDimension', '1', IN],
    ['mass', '1', LB],
    ['force', '1', LBF],
    ['modulus', '1', (1e6 * LBF) / IN ** 2], // 1 Msi = 10⁶ psi
    ['density', '1', LB / IN ** 3],
    ['stiffness', '1', LBF / IN],
    ['area', '1', 0.00064516], // 1 in² = 6.4516 cm² exactly
  ])('%s: %s typed is stored as %f SI', (kind, typed, expected) => {
    expectClose(typedToSI('US', kind, typed), expected, ULP, kind)
  })

  it('agrees with the rounded factors printed in NIST SP 811, table B.8', () => {
    // psi → Pa 6.894 757 E+03 (so 1 Msi = 6.894 757 E+09 Pa); lb/in³ → kg/m³ 2.767 990 E+04; lbf/in → N/m 1.751 268 E+02.
    // Seven significant digits: within half a unit of the last one.
    expectClose(typedToSI('US', 'modulus', '1'), 6.894757e9, 5e-7, 'Msi')
    expectClose(typedToSI('US', 'density', '1'), 2.76799e4, 5e-7, 'lb/in³')
    expectClose(typedToSI('US', 'stiffness', '1'), 1.751268e2, 5e-7, 'lbf/in')
  })

  it('shows and takes a US modulus in Msi: steel’s 200 GPa is 29.0 Msi, not 2.90075e7 psi', () => {
    expect(unitSymbol('US', 'modulus')).toBe('Msi')
    expectClose(typedToSI('US', 'modulus', '29'), (29e6 * LBF) / IN ** 2, ULP, '29 Msi')
    // 200 GPa / 6 894.757 Pa per psi = 29 007 547.6 psi.
    const msi = 200e9 / (LBF / IN ** 2) / 1e6
    expect(fieldValue('US', 'modulus', 200e9, 6)).toBe(String(Number(msi.toPrecision(6))))
    expect(fieldValue('US', 'modulus', 200e9, 6)).toBe('29.0075')
    expect(shown('US', 'modulus', 200e9)).toBe('29.01')
    // What the field shows, typed back, is what it showed.
    expectClose(typedToSI('US', 'modulus', fieldValue('US', 'modulus', 200e9)), 200e9, 6e-10, 'round trip')
    // SI keeps GPa.
    expect(unitSymbol('SI', 'modulus')).toBe('GPa')
  })

  propertyTest.prop([fc.double({ min: 1e-9, max: 1e12, noNaN: true }), fc.constantFrom<UnitSystem>('SI', 'US'), fc.constantFrom<QuantityKind>('length', 'sectionDimension', 'mass', 'modulus', 'density', 'stiffness', 'area')], {
    seed: 811,
  })('a shown value typed back gives the stored value to 10 significant digits', (valueSI, system, kind) => {
    const back = typedToSI(system, kind, fieldValue(system, kind, valueSI))
    expectClose(back, valueSI, 6e-10, `${kind} in ${system}`)
  })

  it('reads empty as missing and words as not a number', () => {
    expect(parseTyped('  ')).toBeUndefined()
    expect(parseTyped('abc')).toBeNaN()
    expect(parseTyped('1.5e3')).toBe(1500)
    expect(parseTyped('\u22122.5')).toBe(-2.5)
  })
})

describe('decimal marks of the locale (Intl.NumberFormat)', () => {
  const de = localeSeparators('de-DE')
  const en = localeSeparators('en-US')
  const fr = localeSeparators('fr-FR')

  it('finds the decimal mark of a locale: a comma in de-DE and fr-FR, a point in en-US', () => {
    expect(de.decimal).toBe(',')
    expect(fr.decimal).toBe(',')
    expect(en.decimal).toBe('.')
  })

  it('accepts a decimal comma where the locale writes one, and a point everywhere', () => {
    expect(parseTyped('0,16', de)).toBe(0.16)
    expect(parseTyped('0,16', fr)).toBe(0.16)
    expect(parseTyped('0.16', de)).toBe(0.16)
    expect(parseTyped('2,5e3', de)).toBe(2500)
    expect(parseTyped('\u22122,5', de)).toBe(-2.5)
    // fr-FR groups with a narrow no-break space.
    expect(parseTyped('1\u202f500,5', fr)).toBe(1500.5)
    expect(typedToSI('SI', 'sectionDimension', '24,5', de)).toBeCloseTo(0.0245, 15)
  })

  it('refuses a comma where the locale writes a point, saying to use the point', () => {
    expect(parseTyped('0,16', en)).toBeNaN()
    expect(typedProblem('0,16', en)).toContain('0.16')
  })

  it('never guesses a mark that could be a digit-group separator', () => {
    // One mark followed by exactly three digits reads two ways: refused, both readings named.
    expect(parseTyped('1.500', de)).toBeNaN()
    expect(typedProblem('1.500', de)).toBe('1.500 could mean 1500 or 1,5: write 1500, or 1,5')
    expect(parseTyped('1,500', en)).toBeNaN()
    expect(typedProblem('1,500', en)).toBe('1,500 could mean 1500 or 1.5: write 1500, or 1.5')
    // Groups that cannot be a decimal are read as groups.
    expect(parseTyped('1.234.567', de)).toBe(1234567)
    expect(parseTyped('1.500,25', de)).toBe(1500.25)
    expect(parseTyped('1,234,567', en)).toBe(1234567)
    expect(parseTyped('1,500.25', en)).toBe(1500.25)
    // Not three digits after the mark: a decimal.
    expect(parseTyped('1.5', de)).toBe(1.5)
    expect(parseTyped('0.125', de)).toBe(0.125)
    expect(parseTyped('1,5', de)).toBe(1.5)
    // Mixed up marks are refused with a reason.
    expect(parseTyped('1,500.5', de)).toBeNaN()
    expect(typedProblem('1,500.5', de)).toBeDefined()
    expect(parseTyped('1.500,5', en)).toBeNaN()
    expect(typedProblem('1.500,5', en)).toBeDefined()
  })

  propertyTest.prop([fc.double({ min: 1e-9, max: 1e12, noNaN: true }), fc.constantFrom('de-DE', 'fr-FR', 'en-US', 'de-CH'), fc.constantFrom<QuantityKind>('length', 'mass', 'modulus', 'stiffness')], {
    seed: 402,
  })('a field accepts what it shows, in every locale', (valueSI, locale, kind) => {
    const separators = localeSeparators(locale)
    const text = fieldValue('US', kind, valueSI, 10, separators)
    expect(typedProblem(text, separators), text).toBeUndefined()
    expectClose(typedToSI('US', kind, text, separators), valueSI, 6e-10, `${kind} in ${locale}: ${text}`)
  })
})

describe('InputQuantity', () => {
  it('emits the SI value of what is typed in inches and keeps the typed text while focused', async () => {
    const wrapper = mount(InputQuantity, { props: { modelValue: 1, kind: 'length', units: 'US', label: 'Length' } })
    const input = wrapper.get('input')
    // Six significant digits (1 m = 39.370 078 74 in), the same when the field takes focus.
    expect((input.element as HTMLInputElement).value).toBe('39.3701')
    await input.trigger('focus')
    expect((input.element as HTMLInputElement).value).toBe('39.3701')
    await input.setValue('36.')
    expect(wrapper.emitted('update')!.at(-1)).toEqual([36 * 0.0254])
    expect((input.element as HTMLInputElement).value).toBe('36.')
    expect(wrapper.text()).toContain('in')
  })

  it('shows the validator’s message for its field', () => {
    const wrapper = mount(InputQuantity, { props: { modelValue: -1, kind: 'length', units: 'SI', label: 'Length', issue: 'must be > 0' } })
    expect(wrapper.get('.field-issue').text()).toBe('must be > 0')
    expect(wrapper.get('input').attributes('aria-invalid')).toBe('true')
  })

  it('says why a number with an unclear mark was refused, beside the field', async () => {
    const wrapper = mount(InputQuantity, { props: { modelValue: 1, kind: 'length', units: 'SI', label: 'Length' } })
    await wrapper.get('input').trigger('focus')
    // The other notation's decimal mark before three digits reads two ways in the test machine's locale.
    const unclear = BROWSER_SEPARATORS.decimal === ',' ? '1.500' : '1,500'
    await wrapper.get('input').setValue(unclear)
    expect(wrapper.emitted('update')!.at(-1)![0]).toBeNaN()
    await wrapper.setProps({ modelValue: NaN, issue: 'must be a number' })
    expect(typedProblem(unclear)).toContain('could mean 1500')
    expect(wrapper.get('.field-issue').text()).toBe(typedProblem(unclear))
  })

  it('emits NaN for text that is not a number and undefined for an empty field', async () => {
    const wrapper = mount(InputQuantity, { props: { modelValue: 1, kind: 'length', units: 'SI', label: 'Length' } })
    await wrapper.get('input').trigger('focus')
    await wrapper.get('input').setValue('one')
    expect(wrapper.emitted('update')!.at(-1)![0]).toBeNaN()
    await wrapper.get('input').setValue('')
    expect(wrapper.emitted('update')!.at(-1)).toEqual([undefined])
  })
})

describe('the segments table in US units', () => {
  it('shows lengths in inches and sizes in inches, the stored values unchanged', () => {
    const segments = [{ length: 1.9, material: 'carbon-steel', section: { shape: 'solid' as const, diameter: 0.0254 } }]
    const wrapper = mount(PartSegmentsTable, {
      props: { segments, materials: [{ id: 'carbon-steel', name: 'Carbon steel', own: false }], units: 'US', selected: null, issueAt: () => undefined },
    })
    expect((wrapper.get('[data-testid="segment-0-length"]').element as HTMLInputElement).value).toBe(String(Number((1.9 / 0.0254).toPrecision(6))))
    expect((wrapper.get('[data-testid="segment-0-diameter"]').element as HTMLInputElement).value).toBe('1')
    expect(wrapper.text()).toContain('Length (in)')
    expect(segments[0].length).toBe(1.9)
  })

  it('moves down a column with Enter', async () => {
    const segments = [0.5, 0.7].map((length) => ({ length, material: 'carbon-steel', section: { shape: 'solid' as const, diameter: 0.02 } }))
    const wrapper = mount(PartSegmentsTable, {
      props: { segments, materials: [{ id: 'carbon-steel', name: 'Carbon steel', own: false }], units: 'SI', selected: null, issueAt: () => undefined },
      attachTo: document.body,
    })
    const first = wrapper.get('[data-testid="segment-0-length"]')
    ;(first.element as HTMLInputElement).focus()
    await first.trigger('keydown', { key: 'Enter' })
    expect(document.activeElement).toBe(wrapper.get('[data-testid="segment-1-length"]').element)
    wrapper.unmount()
  })
})
