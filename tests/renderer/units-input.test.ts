// @vitest-environment happy-dom
/**
 * Values typed in US customary units are stored as SI with the exact factors of NIST
 * Special Publication 811 (2008), appendix B: 1 in = 0.0254 m, 1 lb = 0.453 592 37 kg,
 * 1 lbf = 4.448 221 615 260 5 N, hence 1 psi = 6 894.757 293 168 Pa and
 * 1 lbf/in = 175.126 835 246 5 N/m. Shown values round-trip through the fields.
 */
import { describe, expect, it } from 'vitest'
import { test as propertyTest, fc } from '@fast-check/vitest'
import { mount } from '@vue/test-utils'
import { fieldValue, parseTyped, typedToSI } from '../../renderer/format/quantity'
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
    ['modulus', '1', LBF / IN ** 2],
    ['density', '1', LB / IN ** 3],
    ['stiffness', '1', LBF / IN],
    ['area', '1', 0.00064516], // 1 in² = 6.4516 cm² exactly
  ])('%s: %s typed is stored as %f SI', (kind, typed, expected) => {
    expectClose(typedToSI('US', kind, typed), expected, ULP, kind)
  })

  it('agrees with the rounded factors printed in NIST SP 811, table B.8', () => {
    // psi → Pa 6.894 757 E+03; lb/in³ → kg/m³ 2.767 990 E+04; lbf/in → N/m 1.751 268 E+02.
    // Seven significant digits: within half a unit of the last one.
    expectClose(typedToSI('US', 'modulus', '1'), 6.894757e3, 5e-7, 'psi')
    expectClose(typedToSI('US', 'density', '1'), 2.76799e4, 5e-7, 'lb/in³')
    expectClose(typedToSI('US', 'stiffness', '1'), 1.751268e2, 5e-7, 'lbf/in')
  })

  it('stores a typical steel modulus typed in psi as the SI value', () => {
    expectClose(typedToSI('US', 'modulus', '29e6'), (29e6 * LBF) / IN ** 2, ULP, '29e6 psi')
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
