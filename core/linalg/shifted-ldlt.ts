/**
 * LDLᵀ factorisation of the shifted pencil A = K − σM, banded, without pivoting,
 * and the inertia it gives (Sylvester's law of inertia: the number of negative
 * pivots is the number of eigenvalues of (K, M) below σ, the Sturm count;
 * B. N. Parlett, The Symmetric Eigenvalue Problem, ch. 3, from memory).
 *
 * The elimination carries row sums instead of diagonals (see symmetric-band-matrix.ts):
 * eliminating pivot p updates every remaining row sum as r_a ← r_a − l_ap r_p and
 * recovers each pivot as D_p = r_p − Σ_{j>p} A_pj. For a stiffness matrix at σ = 0
 * every term is then positive and nothing cancels.
 */
import { bandInfinityNorm, bandRowNorms, bilinearForm, quadraticForm, type SymmetricBandMatrix } from './symmetric-band-matrix'
import { beamFormsEnergy, type BeamForms } from './beam-energy'

export interface BandPencil {
  readonly stiffness: SymmetricBandMatrix
  readonly mass: SymmetricBandMatrix
  /**
   * A beam's K in strain form (beam-energy.ts): xᵀKx summed element by element from small
   * strains, where the assembled K would subtract nearly equal numbers. Rayleigh quotients use it.
   */
  readonly beamForms?: BeamForms
}

/** xᵀKy (xᵀKx without y) in the pencil's most accurate form. */
export function stiffnessForm(pencil: BandPencil, x: Float64Array, y?: Float64Array): number {
  if (pencil.beamForms) return beamFormsEnergy(pencil.beamForms, x, y)
  return y ? bilinearForm(pencil.stiffness, x, y) : quadraticForm(pencil.stiffness, x)
}

/** Pivots and multipliers: multipliers[d - 1][p] = L[p + d][p]. */
export interface ShiftedFactorization {
  readonly order: number
  readonly halfBandwidth: number
  shift: number
  readonly pivots: Float64Array
  readonly multipliers: Float64Array[]
  /** Number of negative pivots = number of eigenvalues strictly below the shift. */
  negativePivots: number
  /** Half-bandwidth 3 only: whether the factorisation met a tiny interior pivot (see hasTinyInteriorPivot). */
  tinyInteriorPivot: boolean
  /** Working copies for bandwidth > 1. */
  readonly workBand: Float64Array[]
  readonly workRowSums: Float64Array
}

export function allocateFactorization(order: number, halfBandwidth: number): ShiftedFactorization {
  const multipliers: Float64Array[] = []
  const workBand: Float64Array[] = []
  for (let d = 1; d <= halfBandwidth; d++) {
    multipliers.push(new Float64Array(order))
    if (halfBandwidth > 1) workBand.push(new Float64Array(order))
  }
  return {
    order,
    halfBandwidth,
    shift: NaN,
    pivots: new Float64Array(order),
    multipliers,
    negativePivots: 0,
    tinyInteriorPivot: false,
    workBand,
    workRowSums: new Float64Array(halfBandwidth > 1 ? order : 0),
  }
}

/**
 * Smallest pivot magnitude accepted: an exactly singular shift (σ on an eigenvalue,
 * or σ = 0 for a free–free bar) gets a tiny negative pivot instead of a division by zero,
 * as LAPACK's bisection does with its "pivmin".
 */
export function pivotFloor(pencil: BandPencil, shift: number): number {
  const norms = pencilNorms(pencil)
  return 1e-300 + 1e-30 * (norms.stiffness + Math.abs(shift) * norms.mass)
}

const normCache = new WeakMap<BandPencil, { stiffness: number; mass: number }>()

const scaleCache = new WeakMap<BandPencil, number>()

/**
 * ‖K‖∞ / ‖M‖∞ with each row of M capped at twice the largest row of the same unknown at the
 * neighbouring nodes (a beam has two unknowns per node): about the mesh's largest eigenvalue, the
 * scale of its round-off (ε·λ_max). A point mass or rotary inertia adds to one node's diagonal; it
 * lowers the modes there, not the mesh's highest ones, yet a rotary inertia on a fine mesh can make
 * its row of M 10⁹ times the others, so without the cap the scale, and every threshold set by it,
 * would shrink as much. On a mesh without point features no row exceeds the cap and the ratio is
 * ‖K‖∞ / ‖M‖∞ itself.
 */
export function eigenvalueScale(pencil: BandPencil): number {
  let scale = scaleCache.get(pencil)
  if (scale === undefined) {
    const mass = pencil.mass
    const stride = pencil.beamForms ? 2 : 1
    const rows = bandRowNorms(mass)
    let largest = 0
    for (let i = 0; i < rows.length; i++) {
      const before = i - stride >= 0 ? rows[i - stride] : 0
      const after = i + stride < rows.length ? rows[i + stride] : 0
      const neighbours = Math.max(before, after)
      const row = neighbours > 0 ? Math.min(rows[i], 2 * neighbours) : rows[i]
      if (row > largest) largest = row
    }
    scale = pencilNorms(pencil).stiffness / largest
    scaleCache.set(pencil, scale)
  }
  return scale
}

/** ‖K‖∞ and ‖M‖∞, computed once per pencil. */
export function pencilNorms(pencil: BandPencil): { stiffness: number; mass: number } {
  let norms = normCache.get(pencil)
  if (!norms) {
    norms = { stiffness: bandInfinityNorm(pencil.stiffness), mass: bandInfinityNorm(pencil.mass) }
    normCache.set(pencil, norms)
  }
  return norms
}

/** Factorises K − σM into f (allocated with allocateFactorization). */
export function factorShifted(pencil: BandPencil, shift: number, f: ShiftedFactorization): ShiftedFactorization {
  const { stiffness: k } = pencil
  if (k.order !== f.order || k.halfBandwidth !== f.halfBandwidth) throw new RangeError('factorisation storage does not fit the pencil')
  f.shift = shift
  f.negativePivots = k.halfBandwidth === 1 ? factorTridiagonal(pencil, shift, f) : k.halfBandwidth === 3 ? factorBandThree(pencil, shift, f) : factorBanded(pencil, shift, f)
  return f
}

/**
 * Whether some pivot before the last is tiny next to the couplings of its row: then back
 * substitution with this factorisation is unsafe (see pivoted-band-solve.ts).
 */
export function hasTinyInteriorPivot(pencil: BandPencil, shift: number, f: ShiftedFactorization): boolean {
  const n = f.order
  const b = f.halfBandwidth
  for (let p = 0; p + 1 < n; p++) {
    let couplings = 0
    for (let d = 1; d <= b; d++) {
      if (p + d < n) couplings += Math.abs(pencil.stiffness.offDiagonals[d - 1][p] - shift * pencil.mass.offDiagonals[d - 1][p])
      if (p - d >= 0) couplings += Math.abs(pencil.stiffness.offDiagonals[d - 1][p - d] - shift * pencil.mass.offDiagonals[d - 1][p - d])
    }
    if (Math.abs(f.pivots[p]) < 1e-12 * couplings) return true
  }
  return false
}

function factorTridiagonal(pencil: BandPencil, shift: number, f: ShiftedFactorization): number {
  const n = f.order
  const kOff = pencil.stiffness.offDiagonals[0]
  const mOff = pencil.mass.offDiagonals[0]
  const kRow = pencil.stiffness.rowSums
  const mRow = pencil.mass.rowSums
  const pivots = f.pivots
  const mult = f.multipliers[0]
  const floor = pivotFloor(pencil, shift)
  let negative = 0
  let rowSum = kRow[0] - shift * mRow[0]
  for (let p = 0; p < n - 1; p++) {
    const off = kOff[p] - shift * mOff[p]
    let pivot = rowSum - off
    if (!(Math.abs(pivot) >= floor)) pivot = -floor
    if (pivot < 0) negative++
    const l = off / pivot
    pivots[p] = pivot
    mult[p] = l
    rowSum = kRow[p + 1] - shift * mRow[p + 1] - l * rowSum
  }
  let last = rowSum
  if (!(Math.abs(last) >= floor)) last = -floor
  if (last < 0) negative++
  pivots[n - 1] = last
  mult[n - 1] = 0
  return negative
}

function factorBanded(pencil: BandPencil, shift: number, f: ShiftedFactorization): number {
  const n = f.order
  const b = f.halfBandwidth
  const u = f.workBand
  const r = f.workRowSums
  const kRow = pencil.stiffness.rowSums
  const mRow = pencil.mass.rowSums
  for (let i = 0; i < n; i++) r[i] = kRow[i] - shift * mRow[i]
  for (let d = 0; d < b; d++) {
    const kd = pencil.stiffness.offDiagonals[d]
    const md = pencil.mass.offDiagonals[d]
    const ud = u[d]
    for (let i = 0; i < n; i++) ud[i] = kd[i] - shift * md[i]
  }
  const pivots = f.pivots
  const floor = pivotFloor(pencil, shift)
  let negative = 0
  for (let p = 0; p < n; p++) {
    let pivot = r[p]
    for (let d = 1; d <= b && p + d < n; d++) pivot -= u[d - 1][p]
    if (!(Math.abs(pivot) >= floor)) pivot = -floor
    if (pivot < 0) negative++
    pivots[p] = pivot
    for (let d = 1; d <= b; d++) {
      const a = p + d
      if (a >= n) {
        f.multipliers[d - 1][p] = 0
        continue
      }
      const l = u[d - 1][p] / pivot
      f.multipliers[d - 1][p] = l
      r[a] -= l * r[p]
      for (let e = d + 1; e <= b && p + e < n; e++) u[e - d - 1][a] -= l * u[e - 1][p]
    }
  }
  return negative
}

/**
 * Per row of K and of M, the sum of |off-diagonal entries| (left and right of the diagonal), for
 * the tiny-pivot test of factorBandThree: |K_ij − σM_ij| ≤ |K_ij| + |σ||M_ij| bounds the shifted
 * couplings without forming them in the sweep. Computed once per pencil.
 */
const couplingCache = new WeakMap<BandPencil, { stiffness: Float64Array; mass: Float64Array }>()

function rowCouplings(pencil: BandPencil): { stiffness: Float64Array; mass: Float64Array } {
  let sums = couplingCache.get(pencil)
  if (!sums) {
    const of = (a: SymmetricBandMatrix): Float64Array => {
      const n = a.order
      const out = new Float64Array(n)
      for (let d = 1; d <= a.halfBandwidth; d++) {
        const band = a.offDiagonals[d - 1]
        for (let i = 0; i + d < n; i++) {
          const v = Math.abs(band[i])
          out[i] += v
          out[i + d] += v
        }
      }
      return out
    }
    sums = { stiffness: of(pencil.stiffness), mass: of(pencil.mass) }
    couplingCache.set(pencil, sums)
  }
  return sums
}

/**
 * The elimination of factorBanded written out for half-bandwidth 3 (a beam's two unknowns per
 * node), with the rows it updates held in local variables: pivot p changes only rows p + 1 …
 * p + 3. Without `f` only the Sturm count is wanted and nothing is written; with it, a pivot
 * below 1e-12 of its row's couplings (bounded through rowCouplings) is flagged in the same sweep
 * (f.tinyInteriorPivot; see hasTinyInteriorPivot). Rows entering the window are read without
 * bounds tests until the window reaches the end (band entries past the end are 0).
 */
function factorBandThree(pencil: BandPencil, shift: number, f: ShiftedFactorization | null): number {
  const { stiffness: k, mass: m } = pencil
  const n = k.order
  const store = f !== null
  const k1 = k.offDiagonals[0], k2 = k.offDiagonals[1], k3 = k.offDiagonals[2] // prettier-ignore
  const m1 = m.offDiagonals[0], m2 = m.offDiagonals[1], m3 = m.offDiagonals[2] // prettier-ignore
  const kr = k.rowSums
  const mr = m.rowSums
  // Without f the stores below are never reached; the arrays only keep the types monomorphic.
  const pivots = f ? f.pivots : kr
  const l1s = f ? f.multipliers[0] : kr, l2s = f ? f.multipliers[1] : kr, l3s = f ? f.multipliers[2] : kr // prettier-ignore
  const couplings = store ? rowCouplings(pencil) : null
  const ck = couplings ? couplings.stiffness : kr
  const cm = couplings ? couplings.mass : kr
  const absShift = Math.abs(shift)
  const floor = pivotFloor(pencil, shift)
  let tiny = false
  const at = (kb: Float64Array, mb: Float64Array, i: number) => (i < n ? kb[i] - shift * mb[i] : 0)
  // Row p's row sum and upper entries, then rows p + 1 … p + 3 as far as they are updated.
  let r0 = at(kr, mr, 0), r1 = at(kr, mr, 1), r2 = at(kr, mr, 2), r3 = at(kr, mr, 3) // prettier-ignore
  let a01 = at(k1, m1, 0), a02 = at(k2, m2, 0), a03 = at(k3, m3, 0) // prettier-ignore
  let a12 = at(k1, m1, 1), a13 = at(k2, m2, 1) // prettier-ignore
  let a23 = at(k1, m1, 2)
  let negative = 0
  const bulk = n - 4
  for (let p = 0; p < n; p++) {
    let pivot = r0 - a01 - a02 - a03
    if (!(Math.abs(pivot) >= floor)) pivot = -floor
    if (pivot < 0) negative++
    const l1 = a01 / pivot
    const l2 = a02 / pivot
    const l3 = a03 / pivot
    if (store) {
      pivots[p] = pivot
      l1s[p] = l1
      l2s[p] = l2
      l3s[p] = l3
      if (Math.abs(pivot) < 1e-12 * (ck[p] + absShift * cm[p]) && p + 1 < n) tiny = true
    }
    // Eliminate, and slide the window down by one row.
    const eliminated = r0
    r0 = r1 - l1 * eliminated
    a01 = a12 - l1 * a02
    a02 = a13 - l1 * a03
    r1 = r2 - l2 * eliminated
    a12 = a23 - l2 * a03
    r2 = r3 - l3 * eliminated
    if (p < bulk) {
      a03 = k3[p + 1] - shift * m3[p + 1]
      a13 = k2[p + 2] - shift * m2[p + 2]
      a23 = k1[p + 3] - shift * m1[p + 3]
      r3 = kr[p + 4] - shift * mr[p + 4]
    } else {
      a03 = 0
      a13 = 0
      a23 = 0
      r3 = 0
    }
  }
  if (f) f.tinyInteriorPivot = tiny
  return negative
}

/**
 * Sturm counts at two shifts in one sweep for half-bandwidth 3: factorBandThree's elimination for
 * both, interleaved, so that the two recurrences (each limited by its division) overlap in the
 * processor and K and M are read once.
 */
function countBandThreePair(pencil: BandPencil, s: number, t: number): [number, number] {
  const { stiffness: k, mass: m } = pencil
  const n = k.order
  const k1 = k.offDiagonals[0], k2 = k.offDiagonals[1], k3 = k.offDiagonals[2] // prettier-ignore
  const m1 = m.offDiagonals[0], m2 = m.offDiagonals[1], m3 = m.offDiagonals[2] // prettier-ignore
  const kr = k.rowSums
  const mr = m.rowSums
  const floorS = pivotFloor(pencil, s)
  const floorT = pivotFloor(pencil, t)
  const at = (kb: Float64Array, mb: Float64Array, i: number, shift: number) => (i < n ? kb[i] - shift * mb[i] : 0)
  // Lane S and lane T: the window of factorBandThree each.
  let r0 = at(kr, mr, 0, s), r1 = at(kr, mr, 1, s), r2 = at(kr, mr, 2, s), r3 = at(kr, mr, 3, s) // prettier-ignore
  let a01 = at(k1, m1, 0, s), a02 = at(k2, m2, 0, s), a03 = at(k3, m3, 0, s), a12 = at(k1, m1, 1, s), a13 = at(k2, m2, 1, s), a23 = at(k1, m1, 2, s) // prettier-ignore
  let q0 = at(kr, mr, 0, t), q1 = at(kr, mr, 1, t), q2 = at(kr, mr, 2, t), q3 = at(kr, mr, 3, t) // prettier-ignore
  let b01 = at(k1, m1, 0, t), b02 = at(k2, m2, 0, t), b03 = at(k3, m3, 0, t), b12 = at(k1, m1, 1, t), b13 = at(k2, m2, 1, t), b23 = at(k1, m1, 2, t) // prettier-ignore
  let negativeS = 0
  let negativeT = 0
  const bulk = n - 4
  for (let p = 0; p < n; p++) {
    let pivotS = r0 - a01 - a02 - a03
    let pivotT = q0 - b01 - b02 - b03
    if (!(Math.abs(pivotS) >= floorS)) pivotS = -floorS
    if (!(Math.abs(pivotT) >= floorT)) pivotT = -floorT
    if (pivotS < 0) negativeS++
    if (pivotT < 0) negativeT++
    const l1 = a01 / pivotS, l2 = a02 / pivotS, l3 = a03 / pivotS // prettier-ignore
    const h1 = b01 / pivotT, h2 = b02 / pivotT, h3 = b03 / pivotT // prettier-ignore
    const eliminatedS = r0
    const eliminatedT = q0
    r0 = r1 - l1 * eliminatedS
    a01 = a12 - l1 * a02
    a02 = a13 - l1 * a03
    r1 = r2 - l2 * eliminatedS
    a12 = a23 - l2 * a03
    r2 = r3 - l3 * eliminatedS
    q0 = q1 - h1 * eliminatedT
    b01 = b12 - h1 * b02
    b02 = b13 - h1 * b03
    q1 = q2 - h2 * eliminatedT
    b12 = b23 - h2 * b03
    q2 = q3 - h3 * eliminatedT
    if (p < bulk) {
      const k3n = k3[p + 1], m3n = m3[p + 1], k2n = k2[p + 2], m2n = m2[p + 2], k1n = k1[p + 3], m1n = m1[p + 3], krn = kr[p + 4], mrn = mr[p + 4] // prettier-ignore
      a03 = k3n - s * m3n
      a13 = k2n - s * m2n
      a23 = k1n - s * m1n
      r3 = krn - s * mrn
      b03 = k3n - t * m3n
      b13 = k2n - t * m2n
      b23 = k1n - t * m1n
      q3 = krn - t * mrn
    } else {
      a03 = 0
      a13 = 0
      a23 = 0
      r3 = 0
      b03 = 0
      b13 = 0
      b23 = 0
      q3 = 0
    }
  }
  return [negativeS, negativeT]
}

/** Solves (K − σM) x = y with a factorisation from factorShifted; x may alias y. */
export function solveFactored(f: ShiftedFactorization, y: Float64Array, x: Float64Array): Float64Array {
  const n = f.order
  const b = f.halfBandwidth
  const pivots = f.pivots
  if (x !== y) x.set(y)
  if (b === 1) {
    const l = f.multipliers[0]
    for (let p = 0; p < n - 1; p++) x[p + 1] -= l[p] * x[p]
    x[n - 1] /= pivots[n - 1]
    for (let p = n - 2; p >= 0; p--) x[p] = x[p] / pivots[p] - l[p] * x[p + 1]
    return x
  }
  if (b === 3) return solveBandThree(f, x)
  for (let p = 0; p < n; p++) {
    const xp = x[p]
    for (let d = 1; d <= b && p + d < n; d++) x[p + d] -= f.multipliers[d - 1][p] * xp
  }
  for (let p = n - 1; p >= 0; p--) {
    let s = x[p] / pivots[p]
    for (let d = 1; d <= b && p + d < n; d++) s -= f.multipliers[d - 1][p] * x[p + d]
    x[p] = s
  }
  return x
}

/** solveFactored for half-bandwidth 3, the sweeps' recent values in local variables (multipliers past the end are 0). */
function solveBandThree(f: ShiftedFactorization, x: Float64Array): Float64Array {
  const n = f.order
  const pivots = f.pivots
  const l1 = f.multipliers[0], l2 = f.multipliers[1], l3 = f.multipliers[2] // prettier-ignore
  // Forward: z_p = x_p − l1[p−1] z_{p−1} − l2[p−2] z_{p−2} − l3[p−3] z_{p−3}.
  let z1 = 0, z2 = 0, z3 = 0 // prettier-ignore
  for (let p = 0; p < n; p++) {
    let z = x[p]
    if (p >= 1) z -= l1[p - 1] * z1
    if (p >= 2) z -= l2[p - 2] * z2
    if (p >= 3) z -= l3[p - 3] * z3
    x[p] = z
    z3 = z2
    z2 = z1
    z1 = z
  }
  // Backward: y_p = z_p / D_p − l1[p] y_{p+1} − l2[p] y_{p+2} − l3[p] y_{p+3}.
  let y1 = 0, y2 = 0, y3 = 0 // prettier-ignore
  for (let p = n - 1; p >= 0; p--) {
    const y = x[p] / pivots[p] - l1[p] * y1 - l2[p] * y2 - l3[p] * y3
    x[p] = y
    y3 = y2
    y2 = y1
    y1 = y
  }
  return x
}

/**
 * Sturm counts at several shifts: counts[s] = number of eigenvalues of (K, M) strictly
 * below shifts[s]. Tridiagonal pencils take the shifts eight per sweep, written out lane by
 * lane so that the independent recurrences (each limited by its division) overlap in the
 * processor; the sweep is alone in its function so that it stays in optimised code.
 */
export function sturmCounts(pencil: BandPencil, shifts: ArrayLike<number>): number[] {
  const s = shifts.length
  if (s === 0) return []
  const out: number[] = []
  if (pencil.stiffness.halfBandwidth === 3) {
    let i = 0
    for (; i + 1 < s; i += 2) out.push(...countBandThreePair(pencil, shifts[i], shifts[i + 1]))
    if (i < s) out.push(factorBandThree(pencil, shifts[i], null))
    return out
  }
  if (pencil.stiffness.halfBandwidth !== 1) {
    const f = allocateFactorization(pencil.stiffness.order, pencil.stiffness.halfBandwidth)
    for (let i = 0; i < s; i++) out.push(factorShifted(pencil, shifts[i], f).negativePivots)
    return out
  }
  const { stiffness: k, mass: m } = pencil
  const counts = new Float64Array(8)
  for (let first = 0; first < s; first += 8) {
    const left = s - first
    // Unused lanes repeat the last shift of the group.
    const lane = Array.from({ length: 8 }, (_, b) => shifts[first + Math.min(b, left - 1)])
    const floor = lane.map((x) => pivotFloor(pencil, x))
    countEight(k.order, k.offDiagonals[0], m.offDiagonals[0], k.rowSums, m.rowSums, lane[0], lane[1], lane[2], lane[3], lane[4], lane[5], lane[6], lane[7], floor[0], floor[1], floor[2], floor[3], floor[4], floor[5], floor[6], floor[7], counts)
    for (let b = 0; b < Math.min(8, left); b++) out.push(counts[b])
  }
  return out
}

function countEight(
  n: number,
  kOff: Float64Array,
  mOff: Float64Array,
  kRow: Float64Array,
  mRow: Float64Array,
  s0: number,
  s1: number,
  s2: number,
  s3: number,
  s4: number,
  s5: number,
  s6: number,
  s7: number,
  f0: number,
  f1: number,
  f2: number,
  f3: number,
  f4: number,
  f5: number,
  f6: number,
  f7: number,
  out: Float64Array,
): void {
  const nf0 = -f0
  const nf1 = -f1
  const nf2 = -f2
  const nf3 = -f3
  const nf4 = -f4
  const nf5 = -f5
  const nf6 = -f6
  const nf7 = -f7
  let r0 = kRow[0] - s0 * mRow[0]
  let r1 = kRow[0] - s1 * mRow[0]
  let r2 = kRow[0] - s2 * mRow[0]
  let r3 = kRow[0] - s3 * mRow[0]
  let r4 = kRow[0] - s4 * mRow[0]
  let r5 = kRow[0] - s5 * mRow[0]
  let r6 = kRow[0] - s6 * mRow[0]
  let r7 = kRow[0] - s7 * mRow[0]
  let n0 = 0
  let n1 = 0
  let n2 = 0
  let n3 = 0
  let n4 = 0
  let n5 = 0
  let n6 = 0
  let n7 = 0
  let off: number
  let pivot: number
  for (let p = 0; p < n; p++) {
    const last = p === n - 1
    const ko = last ? 0 : kOff[p]
    const mo = last ? 0 : mOff[p]
    const kr = last ? 0 : kRow[p + 1]
    const mr = last ? 0 : mRow[p + 1]
    off = ko - s0 * mo
    pivot = r0 - off
    if (!(Math.abs(pivot) >= f0)) pivot = nf0
    if (pivot < 0) n0++
    r0 = kr - s0 * mr - (off / pivot) * r0
    off = ko - s1 * mo
    pivot = r1 - off
    if (!(Math.abs(pivot) >= f1)) pivot = nf1
    if (pivot < 0) n1++
    r1 = kr - s1 * mr - (off / pivot) * r1
    off = ko - s2 * mo
    pivot = r2 - off
    if (!(Math.abs(pivot) >= f2)) pivot = nf2
    if (pivot < 0) n2++
    r2 = kr - s2 * mr - (off / pivot) * r2
    off = ko - s3 * mo
    pivot = r3 - off
    if (!(Math.abs(pivot) >= f3)) pivot = nf3
    if (pivot < 0) n3++
    r3 = kr - s3 * mr - (off / pivot) * r3
    off = ko - s4 * mo
    pivot = r4 - off
    if (!(Math.abs(pivot) >= f4)) pivot = nf4
    if (pivot < 0) n4++
    r4 = kr - s4 * mr - (off / pivot) * r4
    off = ko - s5 * mo
    pivot = r5 - off
    if (!(Math.abs(pivot) >= f5)) pivot = nf5
    if (pivot < 0) n5++
    r5 = kr - s5 * mr - (off / pivot) * r5
    off = ko - s6 * mo
    pivot = r6 - off
    if (!(Math.abs(pivot) >= f6)) pivot = nf6
    if (pivot < 0) n6++
    r6 = kr - s6 * mr - (off / pivot) * r6
    off = ko - s7 * mo
    pivot = r7 - off
    if (!(Math.abs(pivot) >= f7)) pivot = nf7
    if (pivot < 0) n7++
    r7 = kr - s7 * mr - (off / pivot) * r7
  }
  out[0] = n0
  out[1] = n1
  out[2] = n2
  out[3] = n3
  out[4] = n4
  out[5] = n5
  out[6] = n6
  out[7] = n7
}
