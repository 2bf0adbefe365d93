/**
 * The 3-node bar element of a shaft whose J and Ip vary as a quartic along it (a solid cone in
 * torsion: J, Ip ∝ d⁴): its matrices against the energy integrals K_ab = (G/h)∫₀¹ J N_a′ N_b′ dt
 * and M_ab = ρh ∫₀¹ Ip N_a N_b dt (T. J. R. Hughes, The Finite Element Method, ch. 1, from memory)
 * integrated exactly here, term by term, with the quadratic Lagrange shapes in t = x/h:
 * N₀ = 2t² − 3t + 1, N₁ = 4t − 4t², N₂ = 2t² − t. The mass integrand is of degree 8, beyond
 * what a 4-point Gauss rule integrates exactly (degree 7: Abramowitz & Stegun, 25.4.29).
 */
import { describe, expect, test } from 'vitest'
import { barElementMatrices } from '../../core/fe/bar-element'

type Poly = number[] // coefficients of t⁰, t¹, …

const times = (a: Poly, b: Poly): Poly => {
  const out = new Array(a.length + b.length - 1).fill(0)
  a.forEach((x, i) => b.forEach((y, j) => (out[i + j] += x * y)))
  return out
}
const integral01 = (p: Poly) => p.reduce((sum, c, k) => sum + c / (k + 1), 0)

describe('3-node bar element with quartic J and Ip', () => {
  test('stiffness and mass equal the exact integrals to 1e-13 (round-off; a 4-point rule misses the mass by ~4e-4)', () => {
    const h = 0.3
    const G = 80e9
    const rho = 7850
    const j0 = 2e-8
    const ip0 = 3e-8
    // (1 + t)⁴ = 1 + 4t + 6t² + 4t³ + t⁴: a cone doubling its diameter over the element.
    const quartic: Poly = [1, 4, 6, 4, 1]
    const J = (t: number) => j0 * (1 + t) ** 4
    const Ip = (t: number) => ip0 * (1 + t) ** 4
    const shapes: Poly[] = [
      [1, -3, 2],
      [0, 4, -4],
      [0, -1, 2],
    ]
    const slopes: Poly[] = [
      [-3, 4],
      [4, -8],
      [-1, 4],
    ]
    const element = barElementMatrices(2, h, G, rho, J, 'consistent', Ip)
    expect(element.nodes).toBe(3)
    for (let a = 0; a < 3; a++) {
      for (let b = 0; b < 3; b++) {
        const k = ((G * j0) / h) * integral01(times(quartic, times(slopes[a], slopes[b])))
        const m = rho * ip0 * h * integral01(times(quartic, times(shapes[a], shapes[b])))
        expect(Math.abs(element.stiffness[3 * a + b] - k), `K${a}${b}`).toBeLessThanOrEqual(1e-13 * Math.abs(k))
        expect(Math.abs(element.mass[3 * a + b] - m), `M${a}${b}`).toBeLessThanOrEqual(1e-13 * Math.abs(m))
      }
    }
  })
})
