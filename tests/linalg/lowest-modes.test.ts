/**
 * The banded eigen solver against an independent dense solver (ml-matrix: Cholesky
 * reduction of M, then the symmetric eigen decomposition), on random pencils with a
 * fixed seed; and the identities every solution must satisfy: residual, M-orthonormality,
 * Sturm counts.
 */
import { describe, expect, test } from 'vitest'
import { CholeskyDecomposition, EigenvalueDecomposition, Matrix, solve } from 'ml-matrix'
import { createBandMatrix, bandToDense, multiplyBand, bilinearForm, type SymmetricBandMatrix } from '../../core/linalg/symmetric-band-matrix'
import { checkLowestEigenvalues, lowestModes } from '../../core/linalg/lowest-modes'
import { sturmCounts, type BandPencil } from '../../core/linalg/shifted-ldlt'
import { seededRandom } from '../../core/random'
import { expectRelative } from '../helpers'

/** Dense generalized eigenvalues of (K, M), ascending: an independent library computation. */
function denseEigenvalues(pencil: BandPencil): number[] {
  const K = new Matrix(bandToDense(pencil.stiffness))
  const M = new Matrix(bandToDense(pencil.mass))
  const L = new CholeskyDecomposition(M).lowerTriangularMatrix
  const Linv = solve(L, Matrix.eye(L.rows))
  const C = Linv.mmul(K).mmul(Linv.transpose())
  const symmetric = C.add(C.transpose()).div(2)
  return new EigenvalueDecomposition(symmetric, { assumeSymmetric: true }).realEigenvalues.sort((a, b) => a - b)
}

/**
 * A random chain assembled like a bar: element stiffness and consistent mass of 2-node
 * (bandwidth 1) or 3-node (bandwidth 2) elements with random stiffness and mass spread
 * over three decades, random grounding springs and point masses. K is positive
 * semi-definite and M positive definite by construction, as for a real bar.
 */
function randomPencil(elements: number, bandwidth: 1 | 2, seed: number, grounded: boolean): BandPencil {
  const random = seededRandom(seed)
  const n = bandwidth * elements + 1
  const k = createBandMatrix(n, bandwidth)
  const m = createBandMatrix(n, bandwidth)
  // Element matrices in node order start, (middle), end; stiffness rows sum to zero.
  const ke = bandwidth === 1 ? [[1, -1], [-1, 1]] : [[7 / 3, -8 / 3, 1 / 3], [-8 / 3, 16 / 3, -8 / 3], [1 / 3, -8 / 3, 7 / 3]]
  const me = bandwidth === 1 ? [[2 / 6, 1 / 6], [1 / 6, 2 / 6]] : [[4 / 30, 2 / 30, -1 / 30], [2 / 30, 16 / 30, 2 / 30], [-1 / 30, 2 / 30, 4 / 30]]
  for (let e = 0; e < elements; e++) {
    const stiffness = 10 ** (3 * random())
    const mass = 10 ** random()
    const first = bandwidth * e
    for (let a = 0; a <= bandwidth; a++) {
      let massRow = 0
      for (let b = 0; b <= bandwidth; b++) {
        massRow += mass * me[a][b]
        if (b > a) {
          k.offDiagonals[b - a - 1][first + a] += stiffness * ke[a][b]
          m.offDiagonals[b - a - 1][first + a] += mass * me[a][b]
        }
      }
      m.rowSums[first + a] += massRow
    }
  }
  for (let i = 0; i < n; i++) {
    if (random() < 0.05) m.rowSums[i] += 10 * random()
    if (grounded && (i === 0 || random() < 0.05)) k.rowSums[i] += 10 ** (3 * random())
  }
  return { stiffness: k, mass: m }
}

function norm(v: Float64Array): number {
  let s = 0
  for (const x of v) s += x * x
  return Math.sqrt(s)
}

/** ‖Kφ − λMφ‖ / ‖Kφ‖ (for λ = 0, relative to ‖Mφ‖). */
function relativeResidual(pencil: BandPencil, lambda: number, phi: Float64Array): number {
  const n = phi.length
  const kphi = multiplyBand(pencil.stiffness, phi, new Float64Array(n))
  const mphi = multiplyBand(pencil.mass, phi, new Float64Array(n))
  const r = kphi.map((v, i) => v - lambda * mphi[i])
  return norm(r) / (lambda === 0 ? norm(mphi) : norm(kphi))
}

function expectValidModes(pencil: BandPencil, eigenvalues: Float64Array, vectors: Float64Array[], label: string): void {
  vectors.forEach((phi, i) => {
    const residual = relativeResidual(pencil, eigenvalues[i], phi)
    expect(residual, `${label} mode ${i + 1}: residual ${residual.toExponential(2)} > 1e-10`).toBeLessThanOrEqual(1e-10)
    for (let j = 0; j <= i; j++) {
      const product = bilinearForm(pencil.mass, phi, vectors[j])
      const expected = i === j ? 1 : 0
      expect(Math.abs(product - expected), `${label} φ${i + 1}ᵀMφ${j + 1} = ${product}, expected ${expected} (tolerance 1e-10)`).toBeLessThanOrEqual(1e-10)
    }
  })
}

describe('banded solver against the dense ml-matrix solver (random pencils, fixed seeds)', () => {
  const cases: [number, 1 | 2, boolean, number][] = [
    [12, 1, true, 4],
    [40, 1, true, 10],
    [48, 2, true, 12],
    [150, 1, false, 8],
    [32, 2, false, 20],
    [140, 2, true, 6],
    [260, 1, true, 15],
  ]
  test.each(cases)('%i elements, bandwidth %i, grounded %s, %i modes', (n, bandwidth, grounded, k) => {
    for (let seed = 1; seed <= 3; seed++) {
      const pencil = randomPencil(n, bandwidth, 1000 * n + seed, grounded)
      const dense = denseEigenvalues(pencil)
      const result = lowestModes(pencil, { modes: k })
      expect(result.eigenvalues.length).toBe(k)
      expect(result.rigidBodyModes).toBe(grounded ? 0 : 1)
      expect(result.sturm.passed).toBe(true)
      for (let i = 0; i < k; i++) {
        // The rigid mode is exactly 0 here; the dense solver returns round-off around 0.
        if (i < result.rigidBodyModes) expect(Math.abs(dense[i])).toBeLessThan(1e-9 * dense[dense.length - 1])
        else expectRelative(result.eigenvalues[i], dense[i], 1e-9, `seed ${seed} λ${i + 1}`)
      }
      expectValidModes(pencil, result.eigenvalues, result.vectors, `seed ${seed}`)
    }
  })
})

describe('Sturm counts', () => {
  test('count below each shift equals the number of dense eigenvalues below it', () => {
    const pencil = randomPencil(40, 2, 77, true)
    const dense = denseEigenvalues(pencil)
    const shifts = [dense[0] * 0.5, (dense[3] + dense[4]) / 2, (dense[20] + dense[21]) / 2, dense[80] * 2]
    const counts = sturmCounts(pencil, shifts)
    expect(counts).toEqual(shifts.map((s) => dense.filter((l) => l < s).length))
  })

  test('the check catches a deliberately skipped mode', () => {
    const pencil = randomPencil(200, 1, 5, true)
    const result = lowestModes(pencil, { modes: 8 })
    expect(checkLowestEigenvalues(pencil, result.eigenvalues).passed).toBe(true)
    const skipped = [...result.eigenvalues.slice(0, 3), ...result.eigenvalues.slice(4)]
    const check = checkLowestEigenvalues(pencil, skipped)
    expect(check.passed).toBe(false)
    // Past the gap every count is one more than claimed.
    const firstBad = check.counts.findIndex((c, i) => c !== check.expected[i])
    expect(firstBad).toBeGreaterThanOrEqual(2)
    expect(check.counts[firstBad]).toBe(check.expected[firstBad] + 1)
  })

  test('the check catches a value that is not the next eigenvalue', () => {
    const pencil = randomPencil(100, 2, 6, true)
    const result = lowestModes(pencil, { modes: 5 })
    const wrong = Array.from(result.eigenvalues)
    wrong[4] = result.eigenvalues[4] * 1.9 // beyond the fifth and sixth eigenvalues
    const dense = denseEigenvalues(pencil)
    expect(dense[5]).toBeLessThan(wrong[4])
    expect(checkLowestEigenvalues(pencil, wrong).passed).toBe(false)
  })
})

describe('structure', () => {
  test('free–free chain: one rigid-body mode, λ = 0, constant shape', () => {
    const pencil = randomPencil(60, 1, 9, false)
    const result = lowestModes(pencil, { modes: 4 })
    expect(result.rigidBodyModes).toBe(1)
    expect(result.eigenvalues[0]).toBe(0)
    const rigid = result.vectors[0]
    for (const v of rigid) expectRelative(v, rigid[0], 1e-14, 'rigid shape')
    expectValidModes(pencil, result.eigenvalues, result.vectors, 'free-free')
  })

  test('asking for more modes than unknowns returns all of them', () => {
    const pencil = randomPencil(7, 1, 3, true)
    const result = lowestModes(pencil, { modes: 20 })
    expect(result.eigenvalues.length).toBe(pencil.stiffness.order)
    const dense = denseEigenvalues(pencil)
    dense.forEach((l, i) => expectRelative(result.eigenvalues[i], l, 1e-10, `λ${i + 1}`))
  })

  test('a tight cluster (two weakly coupled identical halves) gives distinct, orthogonal modes', () => {
    // Two identical fixed–fixed chains of 50 unknowns joined by a very soft link.
    const n = 100
    const k: SymmetricBandMatrix = createBandMatrix(n, 1)
    const m: SymmetricBandMatrix = createBandMatrix(n, 1)
    for (let i = 0; i + 1 < n; i++) {
      k.offDiagonals[0][i] = i === 49 ? -1e-9 : -1
      m.offDiagonals[0][i] = 0
    }
    for (let i = 0; i < n; i++) m.rowSums[i] = 1
    k.rowSums[0] = 1
    k.rowSums[n - 1] = 1
    const pencil = { stiffness: k, mass: m }
    const result = lowestModes(pencil, { modes: 6 })
    expect(result.sturm.passed).toBe(true)
    const dense = denseEigenvalues(pencil)
    for (let i = 0; i < 6; i++) expectRelative(result.eigenvalues[i], dense[i], 1e-9, `λ${i + 1}`)
    expectValidModes(pencil, result.eigenvalues, result.vectors, 'cluster')
  })

  test('results repeat exactly for the same input', () => {
    const pencil = randomPencil(3000, 1, 11, true)
    const a = lowestModes(pencil, { modes: 6 })
    const b = lowestModes(pencil, { modes: 6 })
    expect(Array.from(a.eigenvalues)).toEqual(Array.from(b.eigenvalues))
    expect(Array.from(a.vectors[5])).toEqual(Array.from(b.vectors[5]))
  })

  test.each([1000, 100_000])('%i-element uniform fixed–free chain: the mode shapes are the discrete sinusoids to 1e-10', (n) => {
    // Eigenvectors of a uniform chain of 2-node consistent-mass elements, fixed at node 0 and
    // free at node n: φ_j(node i) ∝ sin(θ_j i), θ_j = (2j − 1)π/(2n), the modes behind the
    // discrete dispersion relation (Hughes, The Finite Element Method, from memory). Some modes
    // have nodes exactly on mesh nodes (2n/(2j − 1) whole), the hardest case for the solver.
    const k = createBandMatrix(n, 1)
    const m = createBandMatrix(n, 1)
    for (let i = 0; i + 1 < n; i++) {
      k.offDiagonals[0][i] = -1
      m.offDiagonals[0][i] = 1 / 6
    }
    for (let i = 0; i < n; i++) m.rowSums[i] = 1
    k.rowSums[0] = 1
    m.rowSums[0] = 5 / 6
    m.rowSums[n - 1] = 1 / 2
    const result = lowestModes({ stiffness: k, mass: m }, { modes: 20 })
    expect(result.sturm.passed).toBe(true)
    result.vectors.forEach((v, j) => {
      const theta = ((2 * j + 1) * Math.PI) / (2 * n)
      const scale = v[n - 1] / Math.sin(theta * n)
      let error = 0
      for (let i = 0; i < n; i++) error = Math.max(error, Math.abs(v[i] - scale * Math.sin(theta * (i + 1))))
      expect(error / Math.abs(scale), `mode ${j + 1}`).toBeLessThan(1e-10)
    })
  })

  test('multilevel path agrees with the dense solver', () => {
    const pencil = randomPencil(300, 1, 21, true)
    const dense = denseEigenvalues(pencil)
    const result = lowestModes(pencil, { modes: 4 })
    expect(result.statistics.levels).toBeGreaterThan(1)
    for (let i = 0; i < 4; i++) expectRelative(result.eigenvalues[i], dense[i], 1e-9, `λ${i + 1}`)
    expectValidModes(pencil, result.eigenvalues, result.vectors, 'multilevel')
  })
})
