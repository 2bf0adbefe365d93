/**
 * Identities and independent checks of the member transfer matrices (axial p = 2, torsion
 * p = 4, prismatic and solid-cone members):
 * - det T = 1 (a self-adjoint second-order equation: the Wronskian is constant; common
 *   practice, no source), and the dynamic stiffness against the transfer relation and its
 *   static limit;
 * - a member split in two: T(L) = T(L − x part) · T(x part) (the state is carried through);
 * - T against RK4 integration of (S y′)′ + ω² I y = 0 (tests/exact/independent.ts);
 * - ω → 0: T₁₂ → ∫ dx/S (static flexibility) and T₂₁ → −ω² ∫ I dx (the rigid member's
 *   inertia force), to full relative accuracy, with the integrals in closed form here;
 * - the special functions against their closed forms j₁(θ) = sin θ/θ² − cos θ/θ,
 *   j₂(θ) = (3/θ² − 1) sin θ/θ − 3 cos θ/θ² (M. Abramowitz & I. A. Stegun, Handbook of
 *   Mathematical Functions, 10.1.11–12, from memory);
 * - the count of a member's clamped–clamped frequencies against the sign changes of the RK4
 *   shooting function from a held start to a held end.
 */
import { describe, expect, test } from 'vitest'
import {
  besselRatio1,
  besselRatio2,
  clampedMemberCount,
  memberDynamicStiffness,
  memberTransferMatrix,
  sinc,
  type ExactMember,
  type TaperPower,
} from '../../core/exact/transfer-matrix'
import { expectRelative } from '../helpers'
import { bisect, integratePiece, scanRoots, shootRk4 } from './independent'

const S0 = 3.7e4 // N·m² (a 25 mm steel shaft's GJ is ~3e4)
const I0 = 3.1e-4 // kg·m
const LENGTH = 0.85
const C = Math.sqrt(S0 / I0)

function member(power: TaperPower, ratio: number, length = LENGTH): ExactMember {
  return { length, startStiffness: S0, startInertia: I0, diameterRatio: ratio, taperPower: power }
}
const omegaAt = (theta: number, length = LENGTH) => (theta * C) / length

const POWERS: TaperPower[] = [2, 4]
const RATIOS = [0.25, 0.7, 1, 1.6, 3]
const THETAS = [1e-7, 0.3, 1.9, 2.1, 7, 31]

describe('transfer matrix identities', () => {
  test.each(POWERS)('p = %i: det T = 1', (power) => {
    for (const ratio of RATIOS) {
      for (const theta of THETAS) {
        const [t11, t12, t21, t22] = memberTransferMatrix(member(power, ratio), omegaAt(theta))
        const scale = Math.abs(t11 * t22) + Math.abs(t12 * t21)
        expect(Math.abs(t11 * t22 - t12 * t21 - 1), `ratio ${ratio}, θ ${theta}`).toBeLessThan(1e-13 * Math.max(1, scale))
      }
    }
  })

  test.each(POWERS)('p = %i: splitting a member anywhere changes nothing', (power) => {
    for (const ratio of RATIOS) {
      for (const theta of [0.01, 2, 13]) {
        const omega = omegaAt(theta)
        const whole = memberTransferMatrix(member(power, ratio), omega)
        const x = 0.37 * LENGTH
        const s = 1 + ((ratio - 1) * x) / LENGTH
        const first = memberTransferMatrix({ ...member(power, ratio), length: x, diameterRatio: s }, omega)
        const factor = s ** power
        const second = memberTransferMatrix({ length: LENGTH - x, startStiffness: S0 * factor, startInertia: I0 * factor, diameterRatio: ratio / s, taperPower: power }, omega)
        const [a11, a12, a21, a22] = first
        const [b11, b12, b21, b22] = second
        const product = [b11 * a11 + b12 * a21, b11 * a12 + b12 * a22, b21 * a11 + b22 * a21, b21 * a12 + b22 * a22]
        // Compare dimensionless entries: T₁₂ in units of L/S₀, T₂₁ of S₀/L.
        const units = [1, LENGTH / S0, S0 / LENGTH, 1]
        product.forEach((p, i) => expect(Math.abs(p - whole[i]) / units[i], `ratio ${ratio}, θ ${theta}, entry ${i}`).toBeLessThan(1e-12 * Math.max(1, Math.abs(whole[i]) / units[i])))
      }
    }
  })
})

describe('dynamic stiffness', () => {
  test.each(POWERS)('p = %i: end forces of the member for given end displacements; the static limit', (power) => {
    for (const ratio of RATIOS) {
      for (const theta of [1e-8, 0.9, 5.5]) {
        const omega = omegaAt(theta)
        const m = member(power, ratio)
        const d = memberDynamicStiffness(m, omega)
        const [t11, t12, t21, t22] = memberTransferMatrix(m, omega)
        // End displacements u₀ = 1, u_L = 0.4: N₀ from the transfer relation, then N(L).
        const [u0, uL] = [1, 0.4]
        const n0 = (uL - t11 * u0) / t12
        const nL = t21 * u0 + t22 * n0
        // Forces applied at the ends: −N at the start, +N at the end (common practice, no source).
        const scale = Math.abs(d.d11) + Math.abs(d.d12)
        expect(Math.abs(d.d11 * u0 + d.d12 * uL + n0) / scale, `ratio ${ratio}, θ ${theta}, start`).toBeLessThan(1e-12)
        expect(Math.abs(d.d12 * u0 + d.d22 * uL - nL) / scale, `ratio ${ratio}, θ ${theta}, end`).toBeLessThan(1e-12)
        if (theta === 1e-8) {
          // Static: a spring of stiffness 1/∫dx/S between the ends.
          const beta = ratio - 1
          const flexibility = beta === 0 ? LENGTH / S0 : (LENGTH * (1 - ratio ** (1 - power))) / ((power - 1) * beta * S0)
          expectRelative(d.d11, 1 / flexibility, 1e-13, `ratio ${ratio}: d11`)
          expectRelative(d.d22, 1 / flexibility, 1e-13, `ratio ${ratio}: d22`)
          expectRelative(d.d12, -1 / flexibility, 1e-13, `ratio ${ratio}: d12`)
        }
      }
    }
  })
})

describe('transfer matrix against RK4 integration of the member equation', () => {
  test.each(POWERS)('p = %i: every entry to 1e-10', (power) => {
    for (const ratio of [0.3, 1, 2.2]) {
      for (const theta of [0.5, 4, 11]) {
        const omega = omegaAt(theta)
        const exact = memberTransferMatrix(member(power, ratio), omega)
        const piece = { length: LENGTH, stiffness: S0, inertia: I0, ratio, power }
        const solve = (y0: number, f0: number) => {
          const coarse = integratePiece(piece, omega, y0, f0, 2000)
          const fine = integratePiece(piece, omega, y0, f0, 4000)
          return fine.map((v, i) => v + (v - coarse[i]) / 15)
        }
        const [t11, t21] = solve(1, 0)
        const [t12, t22] = solve(0, 1)
        const units = [1, LENGTH / S0, S0 / LENGTH, 1]
        ;[t11, t12, t21, t22].forEach((v, i) =>
          expect(Math.abs(v - exact[i]) / units[i], `ratio ${ratio}, θ ${theta}, entry ${i}: RK4 ${v}, exact ${exact[i]}`).toBeLessThan(1e-10),
        )
      }
    }
  })
})

describe('near ω = 0 every entry keeps its relative accuracy', () => {
  test.each(POWERS)('p = %i: T₁₂ → ∫dx/S, T₂₁ → −ω²∫I dx to 1e-14', (power) => {
    for (const ratio of [0.2, 0.9, 1, 1.1, 4]) {
      const beta = ratio - 1
      // ∫₀ᴸ (1 + βx/L)^q dx = L (σ^{q+1} − 1)/((q + 1)β), L at β = 0.
      const integral = (q: number) => (beta === 0 ? LENGTH : (LENGTH * (ratio ** (q + 1) - 1)) / ((q + 1) * beta))
      for (const theta of [1e-9, 1e-6, 1e-4]) {
        const omega = omegaAt(theta)
        const [, t12, t21] = memberTransferMatrix(member(power, ratio), omega)
        // Next terms are O(θ²) relative.
        expectRelative(t12, integral(-power) / S0, 1e-14 + theta * theta, `ratio ${ratio}, θ ${theta}: T12`)
        expectRelative(t21, -omega * omega * I0 * integral(power), 1e-14 + theta * theta, `ratio ${ratio}, θ ${theta}: T21`)
      }
    }
  })
})

describe('special functions', () => {
  test('sinc, j₁(θ)/θ and j₂(θ)/θ² against their closed forms, and their limits at 0', () => {
    const j1 = (t: number) => Math.sin(t) / (t * t) - Math.cos(t) / t
    const j2 = (t: number) => (3 / (t * t) - 1) * (Math.sin(t) / t) - (3 * Math.cos(t)) / (t * t)
    for (const t of [0.7, 1.3, 1.99, 2.01, 3, 9, 40]) {
      expectRelative(sinc(t), Math.sin(t) / t, 1e-15, `sinc ${t}`)
      // The closed forms cancel as θ → 0 (about 2/θ² and 15/θ⁴ digits' worth): tolerances follow.
      expect(Math.abs(besselRatio1(t) - j1(t) / t), `h ${t}`).toBeLessThan(1e-15 * (1 + 2 / (t * t)))
      expect(Math.abs(besselRatio2(t) - j2(t) / (t * t)), `m ${t}`).toBeLessThan(1e-15 * (1 + 40 / t ** 4))
    }
    expect(sinc(0)).toBe(1)
    expectRelative(sinc(1e-6), 1 - 1e-12 / 6, 1e-16, 'sinc(1e-6)')
    expect(besselRatio1(0)).toBe(1 / 3)
    expect(besselRatio2(0)).toBe(1 / 15)
    // Taylor: j₁(θ)/θ = 1/3 − θ²/30 + θ⁴/840 − …, j₂(θ)/θ² = 1/15 − θ²/210 + θ⁴/7560 − …
    expectRelative(besselRatio1(1e-3), 1 / 3 - 1e-6 / 30 + 1e-12 / 840, 1e-15, 'h(1e-3)')
    expectRelative(besselRatio2(1e-3), 1 / 15 - 1e-6 / 210 + 1e-12 / 7560, 1e-15, 'm(1e-3)')
  })
})

describe("a member's clamped–clamped count", () => {
  test.each([
    [2, 0.35],
    [2, 2.5],
    [4, 1],
    [4, 0.35],
    [4, 2.5],
    [4, 6],
  ] as const)('p = %i, ratio %f: counts the sign changes of the held–held shooting function', (power, ratio) => {
    const m = member(power, ratio)
    const chain = { pieces: [{ length: LENGTH, stiffness: S0, inertia: I0, ratio, power }], springs: [0, 0], masses: [0, 0], fixedStart: true, fixedEnd: true }
    const g = (w: number) => shootRk4(chain, w, 400)
    const top = omegaAt(12 * Math.PI)
    const roots = scanRoots(g, top, 2400).map(([a, b]) => bisect(g, a, b))
    expect(roots.length).toBeGreaterThanOrEqual(11)
    // Between the roots, and just either side of each (1e-6 relative: RK4 at 400 steps is good to ~1e-8 here).
    const probes = [...roots.map((r) => r * (1 - 1e-6)), ...roots.map((r) => r * (1 + 1e-6)), ...roots.slice(1).map((r, i) => 0.5 * (r + roots[i]))]
    for (const w of probes) {
      const below = roots.filter((r) => r < w).length
      expect(clampedMemberCount(m, w), `ω = ${w}`).toBe(below)
    }
    if (power === 4 && ratio !== 1) {
      // The roots obey tan θ = β²θ / (σθ² + β²), θ = kL, β = σ − 1 (derived in transfer-matrix.ts),
      // one in each [nπ, nπ + π/2).
      const beta = ratio - 1
      roots.slice(0, 10).forEach((r, i) => {
        const n = i + 1
        const theta = bisect((t) => Math.sin(t) * (ratio * t * t + beta * beta) - beta * beta * t * Math.cos(t), n * Math.PI, (n + 0.5) * Math.PI)
        // The RK4 root refined with 1500 and 3000 steps, Richardson-extrapolated.
        const [lo, hi] = [r * (1 - 1e-5), r * (1 + 1e-5)]
        const coarse = bisect((w) => shootRk4(chain, w, 1500), lo, hi)
        const fine = bisect((w) => shootRk4(chain, w, 3000), lo, hi)
        expectRelative(fine + (fine - coarse) / 15, omegaAt(theta), 1e-10, `clamped root ${n}`)
      })
    }
  })
})
