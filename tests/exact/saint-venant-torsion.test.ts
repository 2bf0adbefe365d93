/**
 * Saint-Venant's torsion constant of a solid rectangle (core/model/saint-venant-torsion.ts):
 * - the coefficient k₁ (J = k₁ b h³, b ≥ h) against the published table of S. P. Timoshenko &
 *   J. N. Goodier, Theory of Elasticity, torsion of rectangular bars (from memory): b/h = 1:
 *   0.141, 1.2: 0.166, 1.5: 0.196, 2: 0.229, 2.5: 0.249, 3: 0.263, 4: 0.281, 5: 0.291,
 *   10: 0.312, ∞: 1/3 — given there to three decimals;
 * - against the plain series summed term by term here (10⁵ odd terms, smallest first);
 * - ζ(5), which the closed part of the sum uses, against its direct sum with the
 *   Euler–Maclaurin tail ∫_N^∞ x⁻⁵ dx + N⁻⁵/2 (common practice, no source);
 * - the thin strip: J → bh³/3, and J ≈ (bh³/3)(1 − 0.630 h/b) for long rectangles (W. C. Young
 *   & R. G. Budynas, Roark's Formulas for Stress and Strain, torsion of a thin rectangle, from
 *   memory), the 0.630 being (192/π⁵)(31/32)ζ(5);
 * - Roark's approximation J = a b³ [16/3 − 3.36 (b/a)(1 − b⁴/(12a⁴))] with half-sides a ≥ b
 *   (same book, solid rectangular section, from memory), within 0.2 %.
 */
import { describe, expect, test } from 'vitest'
import { rectangleTorsionConstant, saintVenantCoefficient } from '../../core/model/saint-venant-torsion'
import { expectRelative } from '../helpers'

/** The series as written, summed from the smallest term up. */
function plainSeriesCoefficient(aspect: number, oddTerms = 100_000): number {
  let sum = 0
  for (let i = oddTerms - 1; i >= 0; i--) {
    const n = 2 * i + 1
    sum += Math.tanh((n * Math.PI * aspect) / 2) / n ** 5
  }
  return (1 - ((192 / Math.PI ** 5) * sum) / aspect) / 3
}

describe('Saint-Venant torsion constant of a rectangle', () => {
  test.each([
    [1, 0.141],
    [1.2, 0.166],
    [1.5, 0.196],
    [2, 0.229],
    [2.5, 0.249],
    [3, 0.263],
    [4, 0.281],
    [5, 0.291],
    [10, 0.312],
  ])('b/h = %f: k₁ = %f as tabulated (to its three decimals)', (aspect, published) => {
    expect(Math.abs(saintVenantCoefficient(aspect) - published)).toBeLessThanOrEqual(0.0005 + 1e-12)
  })

  test('the coefficient against the plain series summed term by term, to 1e-15', () => {
    for (const aspect of [1, 1.07, 1.5, 2, 3.3, 7, 25, 1e3]) {
      expect(Math.abs(saintVenantCoefficient(aspect) - plainSeriesCoefficient(aspect)), `b/h = ${aspect}`).toBeLessThan(1e-15)
    }
  })

  test('ζ(5) = 1.0369277551433699… (the value the module uses, from memory) by direct summation with its Euler–Maclaurin tail', () => {
    const N = 10_000
    let sum = 0
    for (let n = N - 1; n >= 1; n--) sum += 1 / n ** 5
    sum += 1 / (4 * N ** 4) + 1 / (2 * N ** 5)
    expectRelative(sum, 1.03692775514337, 2e-16, 'ζ(5)')
  })

  test('square: J = 0.1406 a⁴ (Roark, from memory); either orientation gives the same J', () => {
    expect(Math.abs(rectangleTorsionConstant(0.02, 0.02) / 0.02 ** 4 - 0.1406)).toBeLessThan(5e-5)
    expect(rectangleTorsionConstant(0.05, 0.012)).toBe(rectangleTorsionConstant(0.012, 0.05))
  })

  test('thin strip: J/(bh³/3) → 1 − 0.630 h/b → 1', () => {
    const h = 0.001
    for (const aspect of [50, 1e3, 1e6]) {
      const b = aspect * h
      const ratio = rectangleTorsionConstant(b, h) / ((b * h ** 3) / 3)
      expectRelative(ratio, 1 - 0.6302 / aspect, 1e-4 / aspect, `b/h = ${aspect}`)
    }
    expectRelative(saintVenantCoefficient(1e12), 1 / 3, 1e-12, 'k₁(∞)')
  })

  test("Roark's approximation within 0.2 %", () => {
    for (const aspect of [1, 1.5, 2, 4, 10]) {
      const [a, bHalf] = [aspect / 2, 0.5]
      const roark = a * bHalf ** 3 * (16 / 3 - 3.36 * (bHalf / a) * (1 - bHalf ** 4 / (12 * a ** 4)))
      expectRelative(rectangleTorsionConstant(aspect, 1), roark, 2e-3, `b/h = ${aspect}`)
    }
  })

  test('bad sizes are refused with the dimension named', () => {
    expect(() => rectangleTorsionConstant(0, 0.01)).toThrow(/width must be a positive number/)
    expect(() => rectangleTorsionConstant(0.01, Number.NaN)).toThrow(/height must be a positive number/)
    expect(() => saintVenantCoefficient(0.5)).toThrow(/≥ 1/)
  })
})
