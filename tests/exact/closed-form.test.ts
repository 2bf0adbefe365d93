/**
 * Closed forms of docs/verification.md §1–2 (Rao, Mechanical Vibrations, continuous systems;
 * Blevins, Formulas for Natural Frequency and Mode Shape; from memory; roots re-computed
 * with mpmath when the list was made), and the exact piecewise solver against them.
 */
import { describe, expect, test } from 'vitest'
import { tipMassRoots, tipSpringRoots, uniformBarFrequencies } from '../../core/exact/closed-form'
import { stationChain } from '../../core/exact/reference'
import { exactAngularFrequencies } from '../../core/exact/wittrick-williams'
import { expectRelative, uniformBar } from '../helpers'

describe('uniform bar (docs/verification.md §1)', () => {
  test('steel 1 m fixed–free: c = 5047.545 m/s, f1 = 1261.886 Hz, f2 = 3785.658 Hz', () => {
    const c = Math.sqrt(200e9 / 7850)
    expectRelative(c, 5047.545, 1e-6, 'c')
    const [f1, f2] = uniformBarFrequencies('fixed', 'free', c, 1, 2)
    expectRelative(f1, 1261.886, 1e-6, 'f1')
    expectRelative(f2, 3785.658, 1e-6, 'f2')
  })
  test('fixed–fixed n c/2L, free–free 0 then n c/2L', () => {
    expect(uniformBarFrequencies('fixed', 'fixed', 1000, 2, 3)).toEqual([250, 500, 750])
    expect(uniformBarFrequencies('free', 'free', 1000, 2, 3)).toEqual([0, 250, 500])
    expect(uniformBarFrequencies('free', 'fixed', 1000, 2, 2)).toEqual([125, 375])
  })
})

describe('tip mass and tip spring (docs/verification.md §2)', () => {
  test.each([
    [1, [0.860334, 3.425618, 6.437298]],
    [0.5, [0.653271, 3.29231]],
    [2, [1.076874, 3.643597]],
  ])('λ tan λ = %f', (ratio, expected) => {
    const roots = tipMassRoots(ratio, expected.length)
    expected.forEach((e, i) => expectRelative(roots[i], e, 1e-6, `λ${i + 1}`))
  })
  test('tan λ = −λ EA/(kL), kL/EA = 1', () => {
    const roots = tipSpringRoots(1, 3)
    ;[2.028758, 4.91318, 7.978666].forEach((e, i) => expectRelative(roots[i], e, 1e-6, `λ${i + 1}`))
  })
})

describe('exact piecewise solver (transfer matrices, Wittrick–Williams) against the closed forms', () => {
  const L = 1.7
  const d = 0.025
  const area = (Math.PI / 4) * d * d
  const c = Math.sqrt(200e9 / 7850)
  const barMass = 7850 * area * L
  test.each([
    ['fixed', 'free'],
    ['fixed', 'fixed'],
    ['free', 'free'],
    ['free', 'fixed'],
  ] as const)('uniform %s–%s bar, 10 modes to 1e-12', (start, end) => {
    const project = uniformBar({ length: L, diameter: d, start, end })
    const exact = exactAngularFrequencies(stationChain(project), 10).map((w) => w / (2 * Math.PI))
    uniformBarFrequencies(start, end, c, L, 10).forEach((f, i) => {
      if (f === 0) expect(exact[i]).toBe(0)
      else expectRelative(exact[i], f, 1e-12, `f${i + 1}`)
    })
  })
  test.each([0.5, 1, 2])('tip mass with m/M = %f, 6 modes to 1e-12', (ratio) => {
    const project = uniformBar({ length: L, diameter: d, extra: { masses: [{ at: L, mass: barMass / ratio }] } })
    const exact = exactAngularFrequencies(stationChain(project), 6)
    tipMassRoots(ratio, 6).forEach((lambda, i) => expectRelative(exact[i], (lambda * c) / L, 1e-12, `ω${i + 1}`))
  })
  test.each([0.3, 1, 8])('tip spring with kL/EA = %f, 6 modes to 1e-12', (ratio) => {
    const k = (ratio * 200e9 * area) / L
    const project = uniformBar({ length: L, diameter: d, extra: { springs: [{ at: L, stiffness: k }] } })
    const exact = exactAngularFrequencies(stationChain(project), 6)
    tipSpringRoots(ratio, 6).forEach((lambda, i) => expectRelative(exact[i], (lambda * c) / L, 1e-12, `ω${i + 1}`))
  })
  test('a bar cut into identical stations and members changes nothing', () => {
    // A mass of 1e-12 kg (the smallest a file may hold) forces an extra station a third of the
    // way along: the frequencies move by ~1e-12/(bar mass ≈ 0.65 kg), far below the tolerance.
    const plain = uniformBar({ length: L, diameter: d })
    const cut = uniformBar({ length: L, diameter: d, extra: { masses: [{ at: L / 3, mass: 1e-12 }] } })
    const a = exactAngularFrequencies(stationChain(plain), 8)
    const b = exactAngularFrequencies(stationChain(cut), 8)
    a.forEach((w, i) => expectRelative(b[i], w, 1e-10, `ω${i + 1}`))
  })
})
