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

  test('the frequency count of a free–free bar at ω = 0 is refused with ω named; just above 0 it counts the rigid mode', () => {
    const chain = stationChain(uniformBar({ length: 1, start: 'free', end: 'free' }))
    expect(() => frequenciesBelow(chain, 0)).toThrow(new RangeError('the frequency count cannot be evaluated at ω = 0 rad/s'))
    // Between 0 and the first elastic mode, ω₁ = πc/L (c ≈ 5048 m/s for steel): one mode below.
    expect(frequenciesBelow(chain, 1)).toBe(1)
    expect(frequenciesBelow(chain, 2 * Math.PI * 5048 * 0.5 * 1.01)).toBe(2)
  })
})
