/**
 * A uniform mesh of 3-node elements, like the 2-node one, has its eigenvalues in closed form
 * (docs/verification.md §3, derived for this file). Condensing the middle node out of the
 * element's dynamic stiffness D = K − ω²M leaves a 2-node chain [a b; b a], whose waves
 * u_j = sin(jθ) satisfy a + b cos θ = 0, i.e. with Ω = ω²h²/c² (h the 3-node element's length)
 *   (D₁₁ + D₁₃ cos θ)·D₂₂ − D₁₂²·(1 + cos θ) = 0,    D = K̂ − Ω M̂,
 * K̂ = ⅓[7 −8 1; −8 16 −8; 1 −8 7], M̂ = 1/30 [4 2 −1; 2 16 2; −1 2 4] (consistent),
 * diag(1/6, 4/6, 1/6) (lumped: the diagonal scaled to the element mass, Hinton, Rock &
 * Zienkiewicz 1976, from memory) or their average (mixed). It is quadratic in Ω: the smaller
 * root is the acoustic branch (the bar's modes), the larger the optical one. The ends give θ
 * as for 2-node meshes: θ = (2n−1)πh/(2L) fixed–free, nπh/L fixed–fixed.
 * Expanding the smaller root, Ω = θ²(1 + aθ⁴ + O(θ⁶)) with a = 1/720 (consistent), −1/1440
 * (lumped), 1/2880 (mixed): all three converge as O(h⁴), lumped from below, the others from above,
 * with ω_h/ω − 1 ≈ aθ⁴/2.
 */
import { describe, expect, test } from 'vitest'
import { CholeskyDecomposition, EigenvalueDecomposition, Matrix, solve } from 'ml-matrix'
import { analyseProject } from '../../core/analysis/modal-analysis'
import { expectRelative, STEEL, uniformBar } from '../helpers'

type Mass = 'consistent' | 'lumped' | 'mixed'

const c = Math.sqrt(STEEL.youngsModulus / STEEL.density)
const STIFFNESS = [[7, -8, 1], [-8, 16, -8], [1, -8, 7]].map((r) => r.map((v) => v / 3))
const CONSISTENT = [[4, 2, -1], [2, 16, 2], [-1, 2, 4]].map((r) => r.map((v) => v / 30))
const LUMPED = [[1 / 6, 0, 0], [0, 4 / 6, 0], [0, 0, 1 / 6]]
const unitMass = (mass: Mass): number[][] =>
  mass === 'consistent' ? CONSISTENT : mass === 'lumped' ? LUMPED : CONSISTENT.map((r, i) => r.map((v, j) => 0.5 * (v + LUMPED[i][j])))

/** Leading coefficient a of Ω/θ² − 1 = aθ⁴ + … (series of the smaller root, derived for this file). */
const SERIES: Record<Mass, number> = { consistent: 1 / 720, lumped: -1 / 1440, mixed: 1 / 2880 }

/** Both roots Ω (acoustic, optical) of the condensed relation at θ; 1 − cos θ as 2 sin²(θ/2). */
function threeNodeDispersion(mass: Mass, theta: number): [number, number] {
  const k = STIFFNESS
  const m = unitMass(mass)
  const cos = Math.cos(theta)
  const half = Math.sin(theta / 2)
  // f(Ω) = AΩ² + BΩ + C; at Ω = 0 it is (k₁₁ + k₁₃ cos θ)k₂₂ − k₁₂²(1 + cos θ) = (16/3)(1 − cos θ) for these K̂.
  const A = (m[0][0] + m[0][2] * cos) * m[1][1] - m[0][1] * m[0][1] * (1 + cos)
  const B = -((m[0][0] + m[0][2] * cos) * k[1][1] + (k[0][0] + k[0][2] * cos) * m[1][1]) + 2 * k[0][1] * m[0][1] * (1 + cos)
  const C = (16 / 3) * 2 * half * half
  const root = Math.sqrt(B * B - 4 * A * C)
  return [(2 * C) / (-B + root), (-B + root) / (2 * A)]
}

/** Dense generalized eigenvalues (ml-matrix: Cholesky reduction, symmetric eigen decomposition), ascending. */
function denseEigenvalues(K: Matrix, M: Matrix): number[] {
  const L = new CholeskyDecomposition(M).lowerTriangularMatrix
  const Linv = solve(L, Matrix.eye(L.rows))
  const C = Linv.mmul(K).mmul(Linv.transpose())
  return new EigenvalueDecomposition(C.add(C.transpose()).div(2), { assumeSymmetric: true }).realEigenvalues.sort((a, b) => a - b)
}

describe('the 3-node dispersion relation itself', () => {
  test.each(['consistent', 'lumped', 'mixed'] as const)('%s mass: both branches are the eigenvalues of a dense fixed–free mesh of 6 elements to 1e-10', (mass) => {
    const N = 6
    const n = 2 * N // node 0 fixed
    const K = Matrix.zeros(n, n)
    const M = Matrix.zeros(n, n)
    const m = unitMass(mass)
    for (let e = 0; e < N; e++) {
      for (let a = 0; a < 3; a++) {
        for (let b = 0; b < 3; b++) {
          const ia = 2 * e + a - 1
          const ib = 2 * e + b - 1
          if (ia < 0 || ib < 0) continue
          K.set(ia, ib, K.get(ia, ib) + STIFFNESS[a][b])
          M.set(ia, ib, M.get(ia, ib) + m[a][b])
        }
      }
    }
    const dense = denseEigenvalues(K, M)
    const relation = Array.from({ length: N }, (_, i) => threeNodeDispersion(mass, ((2 * i + 1) * Math.PI) / (2 * N)))
      .flat()
      .sort((a, b) => a - b)
    relation.forEach((omega, i) => expectRelative(omega, dense[i], 1e-10, `Ω${i + 1}`))
  })

  test.each(['consistent', 'lumped', 'mixed'] as const)('%s mass: the series coefficient of the smaller root', (mass) => {
    // (Ω/θ² − 1)/θ⁴ → a as θ → 0; at θ = 0.02 the next term changes it by O(θ²) = 4e-4 relative.
    const theta = 0.02
    const [omega] = threeNodeDispersion(mass, theta)
    expectRelative((omega / (theta * theta) - 1) / theta ** 4, SERIES[mass], 2e-3, `${mass} a`)
  })
})

describe('Rodwave’s 3-node elements reproduce the relation to 1e-12', () => {
  const cases = [
    { ends: ['fixed', 'free'], N: 10 },
    { ends: ['fixed', 'fixed'], N: 10 },
    { ends: ['fixed', 'free'], N: 250 },
    { ends: ['fixed', 'fixed'], N: 101 },
  ] as const
  for (const { ends, N } of cases) {
    for (const mass of ['consistent', 'lumped', 'mixed'] as const) {
      test(`${ends.join('–')}, ${N} elements, ${mass} mass`, () => {
        const L = 1.3
        const h = L / N
        const modes = 8
        const analysis = analyseProject(uniformBar({ length: L, start: ends[0], end: ends[1] }), { elementOrder: 2, elementsPerSegment: N, mass, modes }, { withReference: false })
        expect(analysis.modes).toHaveLength(modes)
        analysis.modes.forEach((m, i) => {
          const n = i + 1
          const theta = ends[1] === 'fixed' ? (n * Math.PI * h) / L : ((2 * n - 1) * Math.PI * h) / (2 * L)
          const [omega] = threeNodeDispersion(mass, theta)
          expectRelative(2 * Math.PI * m.frequencyHz, (c / h) * Math.sqrt(omega), 1e-12, `ω${n}`)
        })
      })
    }
  }
})

describe('3-node accuracy against the exact bar', () => {
  test.each(['consistent', 'lumped', 'mixed'] as const)('%s mass: error ≈ aθ⁴/2 (within 1 %) with its sign, and order 4 between 16 and 32 elements', (mass) => {
    const L = 1
    const exact = c / (4 * L) // fixed–free f₁ (docs/verification.md §1)
    const error = (N: number) => {
      const f = analyseProject(uniformBar({ length: L }), { elementOrder: 2, elementsPerSegment: N, mass, modes: 1 }, { withReference: false }).modes[0].frequencyHz
      return f / exact - 1
    }
    const coarse = error(16)
    const fine = error(32)
    const theta = Math.PI / (2 * 32)
    expectRelative(fine, (SERIES[mass] * theta ** 4) / 2, 1e-2, `${mass}: error at 32 elements`)
    const order = Math.log(coarse / fine) / Math.log(2)
    expect(Math.abs(order - 4), `${mass}: observed order ${order}, expected 4 ± 0.05`).toBeLessThanOrEqual(0.05)
  })
})
