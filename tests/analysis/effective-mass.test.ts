/**
 * Effective modal mass for support motion along the axis (docs/verification.md §4, derived from
 * the mode shapes of §1; from memory): fixed–free m_eff,n/m = 8/((2n−1)²π²) →
 * 0.810569, 0.090063, 0.032423; fixed–fixed (both ends moving together) 8/(n²π²) for odd n
 * and 0 for even n. With lumped masses the sum over all modes is an identity:
 * Σ Γ² = 1ᵀ M_ff 1 = the mass not sitting on a support node.
 */
import { describe, expect, test } from 'vitest'
import { analyseProject } from '../../core/analysis/modal-analysis'
import { expectRelative, uniformBar } from '../helpers'

describe('effective mass of a uniform bar', () => {
  test('fixed–free: 0.810569, 0.090063, 0.032423', () => {
    const a = analyseProject(uniformBar(), { elementOrder: 2, elementsPerSegment: 200, mass: 'consistent', modes: 3 })
    // The listed values are rounded to six decimals; the formula is checked to 1e-8.
    ;[0.810569, 0.090063, 0.032423].forEach((e, i) => {
      const actual = a.modes[i].effectiveMassFraction as number
      expect(Math.abs(actual - e), `mode ${i + 1}: ${actual} vs listed ${e}`).toBeLessThanOrEqual(5e-7)
      expectRelative(actual, 8 / ((2 * i + 1) ** 2 * Math.PI ** 2), 1e-8, `mode ${i + 1}`)
    })
    const sum = [1, 3, 5].reduce((s, k) => s + 8 / (k * k * Math.PI ** 2), 0)
    expectRelative(a.modes[2].cumulativeEffectiveMassFraction as number, sum, 1e-8, 'running sum')
  })
  test('fixed–free at the default mesh (2-node, 40 elements): first fraction 0.810569 to 1e-4', () => {
    const a = analyseProject(uniformBar(), {})
    expectRelative(a.modes[0].effectiveMassFraction as number, 8 / Math.PI ** 2, 1e-4, 'mode 1')
  })
  test('fixed–fixed: 8/(n²π²) for odd n, 0 for even n', () => {
    const a = analyseProject(uniformBar({ end: 'fixed' }), { elementOrder: 2, elementsPerSegment: 200, modes: 4 })
    a.modes.forEach((m, i) => {
      const n = i + 1
      if (n % 2 === 0) expect(m.effectiveMassFraction as number).toBeLessThan(1e-20)
      else expectRelative(m.effectiveMassFraction as number, 8 / (n * n * Math.PI ** 2), 1e-7, `mode ${n}`) // discretisation error ~1e-8
    })
  })
  test('lumped mass, all modes: the fractions sum to 1 − 1/(2N)', () => {
    const N = 60
    const a = analyseProject(uniformBar(), { elementOrder: 1, elementsPerSegment: N, mass: 'lumped', modes: N })
    expect(a.modes.length).toBe(N)
    expectRelative(a.modes[N - 1].cumulativeEffectiveMassFraction as number, 1 - 1 / (2 * N), 1e-12, 'sum')
  })
  test('a bar with no support has no effective mass; its first mode is rigid', () => {
    const a = analyseProject(uniformBar({ start: 'free', end: 'free' }), { modes: 3 })
    expect(a.modes[0].rigidBody).toBe(true)
    expect(a.modes[0].frequencyHz).toBe(0)
    for (const m of a.modes) expect(m.effectiveMass).toBeNull()
  })
})
