/**
 * The tests' own shooting solver (tests/chain-reference.ts), which gives expected values for the
 * demo part elsewhere, checked against closed forms (docs/verification.md §1, §2, §5):
 * f_n = (2n−1)c/(4L) fixed–free and nc/(2L) fixed–fixed; λ tan λ = m/M for a tip mass (roots
 * re-computed with mpmath); tan(kL₁)·tan(kL₂) = A₁/A₂ for two segments of one material,
 * fixed–free, and the jump condition of an interior mass (both derived in docs/verification.md §5).
 */
import { describe, expect, test } from 'vitest'
import { chainFrequencies, chainFromDocument } from '../chain-reference'
import { expectRelative, STEEL } from '../helpers'

const c = Math.sqrt(STEEL.youngsModulus / STEEL.density)
const materials = [STEEL]
const rod = (length: number, diameter: number) => ({ length, material: 'steel', section: { shape: 'solid', diameter } })

describe('the chain reference against closed forms', () => {
  test('uniform bar: (2n−1)c/(4L) fixed–free, nc/(2L) fixed–fixed, to 1e-12', () => {
    const L = 1.3
    const free = chainFrequencies(chainFromDocument({ materials, segments: [rod(L, 0.02)], ends: { start: 'fixed', end: 'free' } }), 6000, 10)
    expect(free).toHaveLength(3) // 970.7, 2912.0, 4853.7 Hz below 6 kHz
    free.forEach((f, i) => expectRelative(f, ((2 * i + 1) * c) / (4 * L), 1e-12, `fixed–free f${i + 1}`))
    const fixed = chainFrequencies(chainFromDocument({ materials, segments: [rod(L, 0.02)], ends: { start: 'fixed', end: 'fixed' } }), 6000, 10)
    expect(fixed).toHaveLength(3)
    fixed.forEach((f, i) => expectRelative(f, ((i + 1) * c) / (2 * L), 1e-12, `fixed–fixed f${i + 1}`))
  })

  test('tip mass, m/M = 1: λ = 0.860334, 3.425618, 6.437298 (ω = λc/L)', () => {
    const L = 1
    const d = 0.02
    const barMass = STEEL.density * (Math.PI / 4) * d * d * L
    const chain = chainFromDocument({ materials, segments: [rod(L, d)], ends: { start: 'fixed', end: 'free' }, masses: [{ at: L, mass: barMass }] })
    const found = chainFrequencies(chain, 5500, 5)
    expect(found).toHaveLength(3)
    ;[0.860334, 3.425618, 6.437298].forEach((lambda, i) => expectRelative((2 * Math.PI * found[i] * L) / c, lambda, 1e-6, `λ${i + 1}`))
  })

  test('two segments of one material, fixed–free: tan(kL₁)·tan(kL₂) = A₁/A₂', () => {
    const [L1, L2, d1, d2] = [0.7, 0.45, 0.03, 0.018]
    const ratio = (d1 / d2) ** 2
    const found = chainFrequencies(chainFromDocument({ materials, segments: [rod(L1, d1), rod(L2, d2)], ends: { start: 'fixed', end: 'free' } }), 8000, 5)
    expect(found.length).toBeGreaterThanOrEqual(3)
    // tan(kL₁)tan(kL₂) − A₁/A₂ written without poles: sin kL₁ sin kL₂ − (A₁/A₂) cos kL₁ cos kL₂ changes sign at each root.
    const g = (hz: number) => {
      const k = (2 * Math.PI * hz) / c
      return Math.sin(k * L1) * Math.sin(k * L2) - ratio * Math.cos(k * L1) * Math.cos(k * L2)
    }
    found.forEach((f, i) => expect(Math.sign(g(f * (1 - 1e-12))) * Math.sign(g(f * (1 + 1e-12))), `f${i + 1} = ${f}`).toBe(-1))
  })

  test('an interior mass M at x = a, fixed–free: EAk[sin ka · sin k(L−a)/cos k(L−a) − cos ka] + ω²M sin ka = 0', () => {
    const [L, a, d, M] = [1.5, 0.55, 0.02, 3]
    const EA = STEEL.youngsModulus * (Math.PI / 4) * d * d
    const found = chainFrequencies(chainFromDocument({ materials, segments: [rod(L, d)], ends: { start: 'fixed', end: 'free' }, masses: [{ at: a, mass: M }] }), 5000, 5)
    expect(found.length).toBeGreaterThanOrEqual(2)
    // u = sin kx before the mass, B cos k(L − x) after it (free end); times cos k(L−a) to clear the pole.
    const g = (hz: number) => {
      const w = 2 * Math.PI * hz
      const k = w / c
      return EA * k * (Math.sin(k * a) * Math.sin(k * (L - a)) - Math.cos(k * a) * Math.cos(k * (L - a))) + w * w * M * Math.sin(k * a) * Math.cos(k * (L - a))
    }
    found.forEach((f, i) => expect(Math.sign(g(f * (1 - 1e-12))) * Math.sign(g(f * (1 + 1e-12))), `f${i + 1} = ${f}`).toBe(-1))
  })
})
