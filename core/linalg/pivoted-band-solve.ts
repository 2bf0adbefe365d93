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

export function solveShiftedPivoted(pencil: BandPencil, shift: number, rhs: Float64Array, out: Float64Array): Float64Array {
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
