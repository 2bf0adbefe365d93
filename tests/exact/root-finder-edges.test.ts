/**
 * What the exact solver's root finders do outside the cases they serve: inputs that have no root
 * where the closed form expects one are refused with the branch named, and a frequency count asked
 * at ω = 0 of a free–free bar (where every pivot of the count vanishes: the rigid-body mode sits
 * exactly there) is refused with the frequency named instead of returning a wrong count.
 * Roots of λ tan λ = m/M lie one in each ((n − 1)π, (n − ½)π) only for m/M > 0 (S. S. Rao,
 * Mechanical Vibrations, bar with a tip mass, from memory; docs/verification.md §2).
 */
import { describe, expect, test } from 'vitest'
import { tipMassRoots } from '../../core/exact/closed-form'
import { stationChain } from '../../core/exact/reference'
import { frequenciesBelow } from '../../core/exact/wittrick-williams'
import { uniformBar } from '../helpers'

describe('root finders outside their cases', () => {
  test('a negative mass ratio has no root on the first branch: refused, naming it', () => {
    expect(() => tipMassRoots(-1, 1)).toThrow(new RangeError('no root on branch 1'))
  })

  test('a zero mass ratio (infinitely heavy tip) has no root inside (0, π/2): refused, naming the branch', () => {
    // λ tan λ > 0 on the whole open interval (0, π/2), so λ tan λ = 0 has its only root there at
    // the end λ = 0 itself, which the branch excludes (elementary property of tan, no source needed).
    expect(() => tipMassRoots(0, 1)).toThrow(new RangeError('no root on branch 1'))
  })

  test('a very heavy tip mass (m/M = 1e-40): λ₁ = √(m/M), the spring–mass limit, to 1e-12', () => {
    // The bar acts as a massless spring EA/L carrying M: ω² = EA/(L M), so λ² = ω²L²/c² = ρAL/M
    // = m/M (Blevins, Formulas for Natural Frequency and Mode Shape, spring–mass system, from
    // memory); the next term of λ tan λ = λ² + λ⁴/3 + … changes λ by (m/M)/6 ≈ 1e-41, nothing.
    expect(tipMassRoots(1e-40, 1)[0] / 1e-20).toBeCloseTo(1, 12)
    // The second root sits just above π: λ tan λ = r with λ = π + ε gives ε ≈ r/π (Taylor of tan).
    expect(tipMassRoots(1e-40, 2)[1]).toBeCloseTo(Math.PI, 14)
  })

  test('the frequency count of a free–free bar at ω = 0 is refused with ω named; just above 0 it counts the rigid mode', () => {
    const chain = stationChain(uniformBar({ length: 1, start: 'free', end: 'free' }))
    expect(() => frequenciesBelow(chain, 0)).toThrow(new RangeError('the frequency count cannot be evaluated at ω = 0 rad/s'))
    // Between 0 and the first elastic mode, ω₁ = πc/L (c ≈ 5048 m/s for steel): one mode below.
    expect(frequenciesBelow(chain, 1)).toBe(1)
    expect(frequenciesBelow(chain, 2 * Math.PI * 5048 * 0.5 * 1.01)).toBe(2)
  })
})
