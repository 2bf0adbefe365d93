/**
 * The pivoted band solve (Gaussian elimination with partial pivoting, LAPACK gbtrf/gtsv scheme)
 * checked by its defining identity (K − σM) y = b on random pencils, including shifts at which
 * the unpivoted LDLᵀ meets a zero pivot.
 */
import { describe, expect, test } from 'vitest'
import { bandToDense, createBandMatrix } from '../../core/linalg/symmetric-band-matrix'
import { solveShiftedPivoted } from '../../core/linalg/pivoted-band-solve'
import { seededRandom } from '../../core/random'

function randomBand(n: number, b: 1 | 2, seed: number) {
  const r = seededRandom(seed)
  const k = createBandMatrix(n, b)
  const m = createBandMatrix(n, b)
  for (let d = 1; d <= b; d++) {
    for (let i = 0; i + d < n; i++) {
      k.offDiagonals[d - 1][i] = d === 1 ? -1 - r() : 0.3 * (r() - 0.5)
      m.offDiagonals[d - 1][i] = 0.2 * r()
    }
  }
  for (let i = 0; i < n; i++) {
    k.rowSums[i] = r() < 0.3 ? r() : 0
    m.rowSums[i] = 2 + r()
  }
  return { stiffness: k, mass: m }
}

function residual(pencil: ReturnType<typeof randomBand>, shift: number, y: Float64Array, rhs: Float64Array): number {
  const K = bandToDense(pencil.stiffness)
  const M = bandToDense(pencil.mass)
  let worst = 0
  for (let i = 0; i < y.length; i++) {
    let s = 0
    for (let j = 0; j < y.length; j++) s += (K[i][j] - shift * M[i][j]) * y[j]
    worst = Math.max(worst, Math.abs(s - rhs[i]))
  }
  return worst
}

describe('pivoted band solve satisfies (K − σM) y = b', () => {
  test.each([
    [1, 1],
    [2, 1],
    [3, 1],
    [40, 1],
    [5, 2],
    [41, 2],
  ] as const)('n = %i, half-bandwidth %i', (n, b) => {
    for (let seed = 1; seed <= 4; seed++) {
      const pencil = randomBand(n, b, 100 * n + seed)
      const r = seededRandom(seed)
      const shift = 0.5 + 2 * r()
      const rhs = Float64Array.from({ length: n }, () => r() - 0.5)
      const y = solveShiftedPivoted(pencil, shift, rhs, new Float64Array(n))
      expect(residual(pencil, shift, y, rhs)).toBeLessThan(1e-10)
    }
  })
  test('a shift that zeroes the first LDLᵀ pivot (A₀₀ = 0) is solved exactly', () => {
    // K = [[2, −1], [−1, 2]] as row sums 1, 1 and off-diagonal −1; M = I; σ = 2 makes A₀₀ = 0.
    const k = createBandMatrix(2, 1)
    const m = createBandMatrix(2, 1)
    k.offDiagonals[0][0] = -1
    k.rowSums.set([1, 1])
    m.rowSums.set([1, 1])
    const y = solveShiftedPivoted({ stiffness: k, mass: m }, 2, Float64Array.from([1, 2]), new Float64Array(2))
    // [[0, −1], [−1, 0]] y = [1, 2] → y = [−2, −1].
    expect(Array.from(y)).toEqual([-2, -1])
  })
})
