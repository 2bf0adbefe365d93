/**
 * The half-bandwidth-3 kernels (a beam's two unknowns per node) against dense computations made
 * with ml-matrix on random matrices: the one-sweep products y = Ax and xᵀAx, and the Sturm counts
 * taken two shifts per sweep. Sources: Sylvester's law of inertia — the number of eigenvalues of
 * (K, M) below σ equals the number of negative eigenvalues of K − σM (e.g. B. N. Parlett, The
 * Symmetric Eigenvalue Problem, ch. 3; from memory); the products are identities.
 */
import { describe, expect, test } from 'vitest'
import { EigenvalueDecomposition, Matrix } from 'ml-matrix'
import { bandToDense, bilinearForm, createBandMatrix, multiplyBand, quadraticForm, type SymmetricBandMatrix } from '../../core/linalg/symmetric-band-matrix'
import { allocateFactorization, factorShifted, sturmCounts, type BandPencil } from '../../core/linalg/shifted-ldlt'
import { seededRandom } from '../../core/random'

/** A random symmetric matrix of half-bandwidth 3 in row-sum storage, plus `diagonalBoost` on the diagonal. */
function randomBandThree(n: number, seed: number, diagonalBoost: number): SymmetricBandMatrix {
  const random = seededRandom(seed)
  const a = createBandMatrix(n, 3)
  const diagonal = Array.from({ length: n }, () => diagonalBoost + random() - 0.5)
  for (let d = 1; d <= 3; d++) for (let i = 0; i + d < n; i++) a.offDiagonals[d - 1][i] = random() - 0.5
  for (let i = 0; i < n; i++) {
    let sum = diagonal[i]
    for (let d = 1; d <= 3; d++) {
      if (i + d < n) sum += a.offDiagonals[d - 1][i]
      if (i - d >= 0) sum += a.offDiagonals[d - 1][i - d]
    }
    a.rowSums[i] = sum
  }
  return a
}

function randomVector(n: number, seed: number): Float64Array {
  const random = seededRandom(seed)
  return Float64Array.from({ length: n }, () => random() - 0.5)
}

const ORDERS = [4, 5, 6, 7, 9, 40]

describe('half-bandwidth 3 products (identities, checked densely)', () => {
  for (const n of ORDERS) {
    test(`order ${n}: A x, xᵀ A x and xᵀ A y match the dense products`, () => {
      const a = randomBandThree(n, 100 + n, 0)
      const dense = new Matrix(bandToDense(a))
      const x = randomVector(n, 200 + n)
      const y = randomVector(n, 300 + n)
      const product = multiplyBand(a, x, new Float64Array(n))
      const expected = dense.mmul(Matrix.columnVector(Array.from(x))).getColumn(0)
      const scale = Math.max(...expected.map(Math.abs))
      expected.forEach((v, i) => expect(Math.abs(product[i] - v)).toBeLessThan(1e-14 * Math.max(scale, 1)))
      const xAx = expected.reduce((s, v, i) => s + v * x[i], 0)
      expect(Math.abs(quadraticForm(a, x) - xAx)).toBeLessThan(1e-13)
      const xAy = dense.mmul(Matrix.columnVector(Array.from(y))).getColumn(0).reduce((s, v, i) => s + v * x[i], 0)
      expect(Math.abs(bilinearForm(a, x, y) - xAy)).toBeLessThan(1e-13)
    })
  }
})

describe('Sturm counts on the wider band, two shifts per sweep (Sylvester inertia, checked densely)', () => {
  for (const n of [5, 8, 33]) {
    test(`order ${n}: every count equals the number of negative eigenvalues of K − σM`, () => {
      const pencil: BandPencil = { stiffness: randomBandThree(n, 400 + n, 2), mass: randomBandThree(n, 500 + n, 4) }
      const k = new Matrix(bandToDense(pencil.stiffness))
      const m = new Matrix(bandToDense(pencil.mass))
      // Shifts across the spectrum, an odd number so that the last one goes alone.
      const shifts = Array.from({ length: 11 }, (_, i) => -0.4 + 0.21 * i)
      const counts = sturmCounts(pencil, shifts)
      const f = allocateFactorization(n, 3)
      shifts.forEach((shift, i) => {
        const eigen = new EigenvalueDecomposition(k.clone().sub(m.clone().mul(shift)), { assumeSymmetric: true })
        const negative = eigen.realEigenvalues.filter((v) => v < 0).length
        expect(counts[i], `count at σ = ${shift}`).toBe(negative)
        expect(factorShifted(pencil, shift, f).negativePivots, `factorisation at σ = ${shift}`).toBe(negative)
      })
      // The counts must have passed through every value somewhere: the shifts span eigenvalues.
      expect(new Set(counts).size).toBeGreaterThan(2)
    })
  }
})
