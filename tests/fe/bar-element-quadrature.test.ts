/**
 * The 3-node bar element of a shaft whose J and Ip vary as a quartic along it (a solid cone in
 * torsion: J, Ip ∝ d⁴): its matrices against the energy integrals K_ab = (G/h)∫₀¹ J N_a′ N_b′ dt
 * and M_ab = ρh ∫₀¹ Ip N_a N_b dt (T. J. R. Hughes, The Finite Element Method, ch. 1, from memory)
 * integrated exactly here, term by term, with the quadratic Lagrange shapes in t = x/h:
 * N₀ = 2t² − 3t + 1, N₁ = 4t − 4t², N₂ = 2t² − t. The mass integrand is of degree 8, beyond
 * what a 4-point Gauss rule integrates exactly (degree 7: Abramowitz & Stegun, 25.4.29).
 * Lumped masses of a cone's elements: a 2-node bar lumps by row sums, ∫ρA N_a dx with
 * N₀ = 1 − t, N₁ = t; a Hermite beam's translations carry the element's mass ∫ρA dx (the
 * diagonal scaling of Hinton, Rock & Zienkiewicz, Earthq. Eng. Struct. Dyn. 4 (1976), from memory).
 */
import { describe, expect, test } from 'vitest'
import { barElementMatrices } from '../../core/fe/bar-element'
import { beamElementMatrices } from '../../core/fe/beam-element'

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

describe('lumped masses of a cone’s elements (area ∝ (1 + t)², a doubling diameter)', () => {
  const h = 0.2
  const rho = 7850
  const a0 = 1e-4
  const area = (t: number) => a0 * (1 + t) ** 2
  const square: Poly = [1, 2, 1]

  test('2-node bar: the row sums ∫ρA N_a dx = ρA₀h·11/12 and ρA₀h·17/12, to 1e-14', () => {
    const element = barElementMatrices(1, h, 200e9, rho, area, 'lumped')
    const expected = [integral01(times(square, [1, -1])), integral01(times(square, [0, 1]))].map((v) => rho * a0 * h * v)
    expect(expected[0] / (rho * a0 * h)).toBeCloseTo(11 / 12, 14)
    expected.forEach((m, i) => expect(Math.abs(element.mass[3 * i] - m), `M${i}${i}`).toBeLessThanOrEqual(1e-14 * m))
    expect(element.mass[1]).toBe(0)
    expect(element.mass[2]).toBe(0)
  })

  test('Hermite beam: the two translations carry ∫ρA dx = ρA₀h·7/3, to 1e-14; rotations stay positive', () => {
    const section = { bendingStiffness: () => 1e3, massPerLength: (t: number) => rho * area(t), rotaryInertiaPerLength: () => 0, shearStiffness: () => Infinity }
    const element = beamElementMatrices(h, section, 'euler-bernoulli', 'lumped')
    const total = rho * a0 * h * integral01(square)
    expect(Math.abs(element.mass[0] + element.mass[10] - total)).toBeLessThanOrEqual(1e-14 * total)
    expect(element.mass[5]).toBeGreaterThan(0)
    expect(element.mass[15]).toBeGreaterThan(0)
  })
})
