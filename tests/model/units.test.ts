/** Unit factors against NIST Special Publication 811, appendix B (exact by definition). */
import { describe, expect, test } from 'vitest'
import { fc, test as propertyTest } from '@fast-check/vitest'
import { fromDisplay, hzToRpm, rpmToHz, toDisplay, type QuantityKind } from '../../core/model/units'

describe('NIST SP 811 factors', () => {
  test.each([
    ['length', 0.0254],
    ['mass', 0.45359237],
    ['force', 4.4482216152605],
    ['area', 0.00064516],
  ] as [QuantityKind, number][])('1 US %s = %f SI, exact by definition', (kind, si) => {
    expect(Math.abs(fromDisplay('US', kind, 1) - si) / si).toBeLessThan(1e-15)
  })
  test.each([
    ['modulus', 6.894757e3],
    ['density', 2.767990e4],
    ['stiffness', 1.751268e2],
  ] as [QuantityKind, number][])('1 US %s = %f SI, to the seven digits SP 811 prints', (kind, si) => {
    expect(Math.abs(fromDisplay('US', kind, 1) - si) / si).toBeLessThan(1e-6)
  })
  test('1 psi = 6894.757293 Pa and 1 lb/in³ = 27679.9047 kg/m³ (to the digits NIST lists)', () => {
    expect(fromDisplay('US', 'stress', 1)).toBeCloseTo(6894.757293, 6)
    expect(fromDisplay('US', 'density', 1)).toBeCloseTo(27679.9047, 4)
  })
  test('SI display units: mm, GPa, rpm', () => {
    expect(toDisplay('SI', 'sectionDimension', 0.024)).toBeCloseTo(24, 12)
    expect(toDisplay('SI', 'modulus', 2e11)).toBe(200)
    expect(hzToRpm(25)).toBe(1500)
    expect(rpmToHz(1500)).toBe(25)
  })
})

describe('round trips', () => {
  const kinds: QuantityKind[] = ['length', 'sectionDimension', 'area', 'force', 'modulus', 'stress', 'density', 'mass', 'stiffness', 'frequency', 'speed']
  propertyTest.prop([fc.constantFrom(...kinds), fc.constantFrom('SI' as const, 'US' as const), fc.double({ min: 1e-9, max: 1e12, noNaN: true })])(
    'fromDisplay(toDisplay(x)) = x to 4 ulp',
    (kind, system, x) => {
      const back = fromDisplay(system, kind, toDisplay(system, kind, x))
      expect(Math.abs(back - x)).toBeLessThanOrEqual(4 * Number.EPSILON * x)
    },
  )
})
