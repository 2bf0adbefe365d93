/**
 * (K − σM) y = b by banded Gaussian elimination with partial pivoting (the scheme of
 * LAPACK's gbtrf/gbtrs: lower bandwidth b, upper bandwidth 2b after row interchanges;
 * G. H. Golub & C. F. Van Loan, Matrix Computations, §4.3, from memory).
 *
 * Why it exists beside the LDLᵀ of shifted-ldlt.ts: when a mesh node sits exactly on a node
 * of the mode being refined, some leading block of K − σM is singular at σ = λ, so an
 * interior LDLᵀ pivot vanishes as σ → λ; back substitution then subtracts huge, nearly
 * equal numbers and the solution is ruined there. Row interchanges keep every multiplier
 * ≤ 1. The inverse-iteration kernels call this only for such steps; the rest of the time
 * the row-sum LDLᵀ keeps its accuracy on very fine meshes.
 */
import { diagonalEntry } from './symmetric-band-matrix'
import type { BandPencil } from './shifted-ldlt'

/** `work` (tridiagonal pencils, optional): at least 3n entries of scratch, saving their allocation. */
export function solveShiftedPivoted(pencil: BandPencil, shift: number, rhs: Float64Array, out: Float64Array, work?: Float64Array): Float64Array {
  if (pencil.stiffness.halfBandwidth === 1) return solveTridiagonalPivoted(pencil, shift, rhs, out, work)
  const { stiffness: k, mass: m } = pencil
  const n = k.order
  const b = k.halfBandwidth
  const width = 3 * b + 1
  // band[i * width + (j − i + b)] = A[i][j] for j − i ∈ [−b, 2b] (the upper 2b hold fill-in).
  const band = new Float64Array(n * width)
  const at = (i: number, j: number) => i * width + (j - i + b)
  for (let i = 0; i < n; i++) band[at(i, i)] = diagonalEntry(k, i) - shift * diagonalEntry(m, i)
  for (let d = 1; d <= b; d++) {
    const kd = k.offDiagonals[d - 1]
    const md = m.offDiagonals[d - 1]
    for (let i = 0; i + d < n; i++) {
      const v = kd[i] - shift * md[i]
      band[at(i, i + d)] = v
      band[at(i + d, i)] = v
    }
  }
  if (out !== rhs) out.set(rhs)
  const y = out
  // A pivot that vanishes exactly (σ on an eigenvalue to the last digit) is replaced by
  // ε·‖A‖, as inverse iteration does in LAPACK's stein: the solution stays finite and
  // points along the eigenvector.
  let scale = 0
  for (let i = 0; i < band.length; i++) scale = Math.max(scale, Math.abs(band[i]))
  const zeroPivot = Number.EPSILON * scale || Number.MIN_VALUE
  for (let col = 0; col < n; col++) {
    // Pivot: the largest entry of column col among rows col … col + b.
    let pivotRow = col
    let best = Math.abs(band[at(col, col)])
    for (let r = col + 1; r <= Math.min(col + b, n - 1); r++) {
      const v = Math.abs(band[at(r, col)])
      if (v > best) {
        best = v
        pivotRow = r
      }
    }
    const last = Math.min(col + 2 * b, n - 1)
    if (pivotRow !== col) {
      // Columns col … col + 2b lie inside both rows' stored windows.
      for (let j = col; j <= last; j++) {
        const a = at(col, j)
        const p = at(pivotRow, j)
        const t = band[a]
        band[a] = band[p]
        band[p] = t
      }
      const t = y[col]
      y[col] = y[pivotRow]
      y[pivotRow] = t
    }
    let pivot = band[at(col, col)]
    if (Math.abs(pivot) < zeroPivot) pivot = band[at(col, col)] = pivot < 0 ? -zeroPivot : zeroPivot
    for (let r = col + 1; r <= Math.min(col + b, n - 1); r++) {
      const factor = band[at(r, col)] / pivot
      if (factor === 0) continue
      band[at(r, col)] = 0
      for (let j = col + 1; j <= last; j++) band[at(r, j)] -= factor * band[at(col, j)]
      y[r] -= factor * y[col]
    }
  }
  for (let i = n - 1; i >= 0; i--) {
    let s = y[i]
    for (let j = i + 1; j <= Math.min(i + 2 * b, n - 1); j++) s -= band[at(i, j)] * y[j]
    y[i] = s / band[at(i, i)]
  }
  return y
}

/**
 * The tridiagonal case in three vectors, as LAPACK's gtsv does it: row i and i + 1 are
 * interchanged when the subdiagonal entry is the larger, which brings in one second
 * superdiagonal entry (kept in the freed subdiagonal slot).
 */
function solveTridiagonalPivoted(pencil: BandPencil, shift: number, rhs: Float64Array, out: Float64Array, work?: Float64Array): Float64Array {
  const { stiffness: k, mass: m } = pencil
  const n = k.order
  const kOff = k.offDiagonals[0]
  const mOff = m.offDiagonals[0]
  const storage = work && work.length >= 3 * n ? work : new Float64Array(3 * n)
  const d = storage.subarray(0, n)
  const du = storage.subarray(n, 2 * n)
  const dl = storage.subarray(2 * n, 3 * n)
  const kRow = k.rowSums
  const mRow = m.rowSums
  let scale = 0
  let previous = 0
  for (let i = 0; i < n; i++) {
    const off = i + 1 < n ? kOff[i] - shift * mOff[i] : 0
    // Diagonal from the row sum: A_ii = r_i − A_{i,i−1} − A_{i,i+1}.
    d[i] = kRow[i] - shift * mRow[i] - previous - off
    du[i] = dl[i] = off
    previous = off
    scale = Math.max(scale, Math.abs(d[i]), Math.abs(off))
  }
  // A pivot that vanishes exactly becomes ε·‖A‖ (see solveShiftedPivoted).
  const zeroPivot = Number.EPSILON * scale || Number.MIN_VALUE
  if (out !== rhs) out.set(rhs)
  const b = out
  for (let i = 0; i + 1 < n; i++) {
    if (Math.abs(d[i]) >= Math.abs(dl[i])) {
      if (Math.abs(d[i]) < zeroPivot) d[i] = d[i] < 0 ? -zeroPivot : zeroPivot
      const factor = dl[i] / d[i]
      d[i + 1] -= factor * du[i]
      b[i + 1] -= factor * b[i]
      dl[i] = 0
    } else {
      const factor = d[i] / dl[i]
      d[i] = dl[i]
      const t = d[i + 1]
      d[i + 1] = du[i] - factor * t
      if (i + 2 < n) {
        dl[i] = du[i + 1]
        du[i + 1] = -factor * dl[i]
      } else dl[i] = 0
      du[i] = t
      const bi = b[i]
      b[i] = b[i + 1]
      b[i + 1] = bi - factor * b[i + 1]
    }
  }
  if (Math.abs(d[n - 1]) < zeroPivot) d[n - 1] = d[n - 1] < 0 ? -zeroPivot : zeroPivot
  b[n - 1] /= d[n - 1]
  if (n > 1) b[n - 2] = (b[n - 2] - du[n - 2] * b[n - 1]) / d[n - 2]
  for (let i = n - 3; i >= 0; i--) b[i] = (b[i] - du[i] * b[i + 1] - dl[i] * b[i + 2]) / d[i]
  return b
}
