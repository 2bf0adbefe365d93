/**
 * Symmetric banded matrix stored by its off-diagonals and its row sums.
 *
 * Layout, for half-bandwidth b and order n:
 *   offDiagonals[d - 1][i] = A[i][i + d]   for d = 1..b, i = 0..n-d-1  (entries i >= n-d are 0)
 *   rowSums[i]             = Σ_j A[i][j]
 * The diagonal is not stored: A[i][i] = rowSums[i] − Σ_{j≠i} A[i][j].
 *
 * Why row sums instead of a diagonal: a bar's stiffness matrix has zero row sums
 * except where the bar is tied to ground. Storing the diagonal would hide that
 * grounding inside a sum that cancels against its neighbours, and on fine meshes
 * the lowest eigenvalues would lose most of their digits (relative error grows
 * like n^1.5 ε). Kept explicitly, the row sums let the factorisation and the
 * energy products below work without that cancellation (the idea of the
 * Grassmann–Taksar–Heyman elimination, Oper. Res. 33 (1985), from memory).
 */
export interface SymmetricBandMatrix {
  readonly order: number
  readonly halfBandwidth: number
  readonly offDiagonals: Float64Array[]
  readonly rowSums: Float64Array
}

export function createBandMatrix(order: number, halfBandwidth: number): SymmetricBandMatrix {
  // One allocation, viewed as the bands and the row sums.
  const storage = new Float64Array((halfBandwidth + 1) * order)
  const offDiagonals: Float64Array[] = []
  for (let d = 1; d <= halfBandwidth; d++) offDiagonals.push(storage.subarray((d - 1) * order, d * order))
  return { order, halfBandwidth, offDiagonals, rowSums: storage.subarray(halfBandwidth * order) }
}

/** A[i][i], recovered from the row sum. */
export function diagonalEntry(a: SymmetricBandMatrix, i: number): number {
  let s = a.rowSums[i]
  for (let d = 1; d <= a.halfBandwidth; d++) {
    const band = a.offDiagonals[d - 1]
    if (i + d < a.order) s -= band[i]
    if (i - d >= 0) s -= band[i - d]
  }
  return s
}

/** Adds v to A[i][j] and A[j][i] for i ≠ j, keeping row sums in step. */
export function addOffDiagonal(a: SymmetricBandMatrix, i: number, j: number, v: number): void {
  const lo = Math.min(i, j)
  const d = Math.abs(i - j)
  if (d === 0 || d > a.halfBandwidth) throw new RangeError(`entry (${i}, ${j}) is outside the band`)
  a.offDiagonals[d - 1][lo] += v
}

/**
 * y = A x, in the "energy" form (A x)_i = r_i x_i + Σ_{j≠i} A_ij (x_j − x_i).
 * For smooth x the differences carry the information; forming A_ii x_i + Σ A_ij x_j
 * would subtract nearly equal numbers.
 */
export function multiplyBand(a: SymmetricBandMatrix, x: Float64Array, y: Float64Array): Float64Array {
  const n = a.order
  if (a.halfBandwidth === 3 && n > 3) return multiplyBandThree(a, x, y)
  const r = a.rowSums
  for (let i = 0; i < n; i++) y[i] = r[i] * x[i]
  for (let d = 1; d <= a.halfBandwidth; d++) {
    const band = a.offDiagonals[d - 1]
    for (let i = 0; i + d < n; i++) {
      const v = band[i]
      if (v === 0) continue
      const diff = x[i + d] - x[i]
      y[i] += v * diff
      y[i + d] -= v * diff
    }
  }
  return y
}

/**
 * multiplyBand for half-bandwidth 3 (a beam's pencil) in one sweep: row i's terms to the right
 * are added at once, and what its couplings owe rows i + 1 … i + 3 is carried in local variables.
 */
function multiplyBandThree(a: SymmetricBandMatrix, x: Float64Array, y: Float64Array): Float64Array {
  const n = a.order
  const r = a.rowSums
  const b1 = a.offDiagonals[0], b2 = a.offDiagonals[1], b3 = a.offDiagonals[2] // prettier-ignore
  // carry1…carry3: the sums already owed to rows i + 1, i + 2, i + 3 by rows above them.
  let carry1 = 0, carry2 = 0, carry3 = 0 // prettier-ignore
  let i = 0
  for (; i + 3 < n; i++) {
    const xi = x[i]
    const d1 = x[i + 1] - xi
    const d2 = x[i + 2] - xi
    const d3 = x[i + 3] - xi
    const t1 = b1[i] * d1
    const t2 = b2[i] * d2
    const t3 = b3[i] * d3
    y[i] = carry1 + r[i] * xi + t1 + t2 + t3
    carry1 = carry2 - t1
    carry2 = carry3 - t2
    carry3 = -t3
  }
  // The last three rows: couplings past the end are absent.
  for (; i < n; i++) {
    const xi = x[i]
    let sum = carry1 + r[i] * xi
    let t1 = 0, t2 = 0 // prettier-ignore
    if (i + 1 < n) {
      t1 = b1[i] * (x[i + 1] - xi)
      sum += t1
    }
    if (i + 2 < n) {
      t2 = b2[i] * (x[i + 2] - xi)
      sum += t2
    }
    y[i] = sum
    carry1 = carry2 - t1
    carry2 = carry3 - t2
    carry3 = 0
  }
  return y
}

/** xᵀ A x = Σ r_i x_i² − Σ_{i<j} A_ij (x_j − x_i)²: the discrete energy, without cancellation for smooth x. */
export function quadraticForm(a: SymmetricBandMatrix, x: Float64Array): number {
  const n = a.order
  if (a.halfBandwidth === 3 && n > 3) return quadraticFormThree(a, x)
  const r = a.rowSums
  let s = 0
  for (let i = 0; i < n; i++) s += r[i] * x[i] * x[i]
  for (let d = 1; d <= a.halfBandwidth; d++) {
    const band = a.offDiagonals[d - 1]
    for (let i = 0; i + d < n; i++) {
      const diff = x[i + d] - x[i]
      s -= band[i] * diff * diff
    }
  }
  return s
}

/** quadraticForm for half-bandwidth 3 in one sweep over the rows. */
function quadraticFormThree(a: SymmetricBandMatrix, x: Float64Array): number {
  const n = a.order
  const r = a.rowSums
  const b1 = a.offDiagonals[0], b2 = a.offDiagonals[1], b3 = a.offDiagonals[2] // prettier-ignore
  let s = 0
  let i = 0
  for (; i + 3 < n; i++) {
    const xi = x[i]
    const d1 = x[i + 1] - xi
    const d2 = x[i + 2] - xi
    const d3 = x[i + 3] - xi
    s += r[i] * xi * xi - b1[i] * d1 * d1 - b2[i] * d2 * d2 - b3[i] * d3 * d3
  }
  for (; i < n; i++) {
    const xi = x[i]
    s += r[i] * xi * xi
    if (i + 1 < n) s -= b1[i] * (x[i + 1] - xi) ** 2
    if (i + 2 < n) s -= b2[i] * (x[i + 2] - xi) ** 2
  }
  return s
}

/** xᵀKx and xᵀMx of a pencil in one sweep (same difference form as quadraticForm). */
export function pencilEnergies(
  stiffness: SymmetricBandMatrix,
  mass: SymmetricBandMatrix,
  x: Float64Array,
): { xKx: number; xMx: number } {
  if (stiffness.halfBandwidth !== 1 || mass.halfBandwidth !== 1) {
    return { xKx: quadraticForm(stiffness, x), xMx: quadraticForm(mass, x) }
  }
  const n = stiffness.order
  const kr = stiffness.rowSums
  const mr = mass.rowSums
  const ko = stiffness.offDiagonals[0]
  const mo = mass.offDiagonals[0]
  let xKx = 0
  let xMx = 0
  for (let i = 0; i + 1 < n; i++) {
    const xi = x[i]
    const diff = x[i + 1] - xi
    xKx += kr[i] * xi * xi - ko[i] * diff * diff
    xMx += mr[i] * xi * xi - mo[i] * diff * diff
  }
  const last = x[n - 1]
  return { xKx: xKx + kr[n - 1] * last * last, xMx: xMx + mr[n - 1] * last * last }
}

/** Bilinear form xᵀ A y in the same difference form. */
export function bilinearForm(a: SymmetricBandMatrix, x: Float64Array, y: Float64Array): number {
  const n = a.order
  const r = a.rowSums
  let s = 0
  for (let i = 0; i < n; i++) s += r[i] * x[i] * y[i]
  for (let d = 1; d <= a.halfBandwidth; d++) {
    const band = a.offDiagonals[d - 1]
    for (let i = 0; i + d < n; i++) s -= band[i] * (x[i + d] - x[i]) * (y[i + d] - y[i])
  }
  return s
}

/**
 * An upper bound of the ∞-norm within a factor 2, max_i (|r_i| + 2 Σ_{j≠i} |A_ij|),
 * since |A_ii| ≤ |r_i| + Σ_{j≠i} |A_ij|. Used only to scale tolerances.
 */
export function bandInfinityNorm(a: SymmetricBandMatrix): number {
  const rows = bandRowNorms(a)
  let m = 0
  for (let i = 0; i < rows.length; i++) if (rows[i] > m) m = rows[i]
  return m
}

/** Each row's bound |r_i| + 2 Σ_{j≠i} |A_ij| of its 1-norm (see bandInfinityNorm). */
export function bandRowNorms(a: SymmetricBandMatrix): Float64Array {
  const n = a.order
  const rows = new Float64Array(n)
  for (let i = 0; i < n; i++) {
    let s = Math.abs(a.rowSums[i])
    for (let d = 1; d <= a.halfBandwidth; d++) {
      const band = a.offDiagonals[d - 1]
      if (i + d < n) s += 2 * Math.abs(band[i])
      if (i - d >= 0) s += 2 * Math.abs(band[i - d])
    }
    rows[i] = s
  }
  return rows
}

/** Dense copy, for tests and small cross-checks only. */
export function bandToDense(a: SymmetricBandMatrix): number[][] {
  const n = a.order
  const out: number[][] = []
  for (let i = 0; i < n; i++) out.push(new Array<number>(n).fill(0))
  for (let i = 0; i < n; i++) out[i][i] = diagonalEntry(a, i)
  for (let d = 1; d <= a.halfBandwidth; d++) {
    const band = a.offDiagonals[d - 1]
    for (let i = 0; i + d < n; i++) {
      out[i][i + d] = band[i]
      out[i + d][i] = band[i]
    }
  }
  return out
}
