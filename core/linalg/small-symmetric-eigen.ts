/**
 * Eigen decomposition of a small symmetric generalized problem A x = λ B x (B positive
 * definite), for Rayleigh–Ritz on a handful of vectors: Cholesky B = LLᵀ, then the cyclic
 * Jacobi method on C = L⁻¹ A L⁻ᵀ (G. H. Golub & C. F. Van Loan, Matrix Computations,
 * §8.5, from memory), then x = L⁻ᵀ y. Matrices are arrays of rows; sizes are tiny.
 */
export function smallGeneralizedEigen(a: number[][], b: number[][]): { values: number[]; vectors: number[][] } {
  const l = cholesky(b)
  // C = L⁻¹ A L⁻ᵀ, by forward substitution on columns then rows.
  const y = a.map((row) => forwardSolve(l, row))
  const c = transpose(y).map((col) => forwardSolve(l, col))
  const { values, vectors } = jacobi(c)
  // x = L⁻ᵀ y for each eigenvector y (columns of `vectors`).
  const x = transpose(vectors).map((v) => backSolveTransposed(l, v))
  const order = values.map((_, i) => i).sort((p, q) => values[p] - values[q])
  return { values: order.map((i) => values[i]), vectors: order.map((i) => x[i]) }
}

function transpose(m: number[][]): number[][] {
  return m[0].map((_, j) => m.map((row) => row[j]))
}

function cholesky(b: number[][]): number[][] {
  const n = b.length
  const l = b.map(() => new Array<number>(n).fill(0))
  for (let j = 0; j < n; j++) {
    let d = b[j][j]
    for (let k = 0; k < j; k++) d -= l[j][k] * l[j][k]
    if (!(d > 0)) throw new RangeError('Rayleigh–Ritz: the mass Gram matrix is not positive definite')
    l[j][j] = Math.sqrt(d)
    for (let i = j + 1; i < n; i++) {
      let s = b[i][j]
      for (let k = 0; k < j; k++) s -= l[i][k] * l[j][k]
      l[i][j] = s / l[j][j]
    }
  }
  return l
}

function forwardSolve(l: number[][], rhs: number[]): number[] {
  const x = [...rhs]
  for (let i = 0; i < x.length; i++) {
    for (let k = 0; k < i; k++) x[i] -= l[i][k] * x[k]
    x[i] /= l[i][i]
  }
  return x
}

function backSolveTransposed(l: number[][], rhs: number[]): number[] {
  const x = [...rhs]
  for (let i = x.length - 1; i >= 0; i--) {
    for (let k = i + 1; k < x.length; k++) x[i] -= l[k][i] * x[k]
    x[i] /= l[i][i]
  }
  return x
}

/** Cyclic Jacobi: returns eigenvalues and the matrix whose columns are eigenvectors. */
function jacobi(input: number[][]): { values: number[]; vectors: number[][] } {
  const n = input.length
  const a = input.map((row) => [...row])
  const v: number[][] = input.map((_, i) => input.map((__, j) => (i === j ? 1 : 0)))
  for (let sweep = 0; sweep < 100; sweep++) {
    let off = 0
    let scale = 0
    for (let i = 0; i < n; i++) {
      scale += a[i][i] * a[i][i]
      for (let j = i + 1; j < n; j++) off += a[i][j] * a[i][j]
    }
    if (off <= 1e-32 * scale || off === 0) break
    for (let p = 0; p < n; p++) {
      for (let q = p + 1; q < n; q++) {
        if (a[p][q] === 0) continue
        const theta = (a[q][q] - a[p][p]) / (2 * a[p][q])
        const t = Math.sign(theta || 1) / (Math.abs(theta) + Math.sqrt(theta * theta + 1))
        const c = 1 / Math.sqrt(t * t + 1)
        const s = t * c
        for (let k = 0; k < n; k++) {
          const akp = a[k][p]
          const akq = a[k][q]
          a[k][p] = c * akp - s * akq
          a[k][q] = s * akp + c * akq
        }
        for (let k = 0; k < n; k++) {
          const apk = a[p][k]
          const aqk = a[q][k]
          a[p][k] = c * apk - s * aqk
          a[q][k] = s * apk + c * aqk
        }
        for (let k = 0; k < n; k++) {
          const vkp = v[k][p]
          const vkq = v[k][q]
          v[k][p] = c * vkp - s * vkq
          v[k][q] = s * vkp + c * vkq
        }
      }
    }
  }
  return { values: a.map((row, i) => row[i]), vectors: v }
}
