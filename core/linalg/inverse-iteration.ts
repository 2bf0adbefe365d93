/**
 * Inverse-iteration steps y = (K − σM)⁻¹ M x, the kernel of the Rayleigh quotient
 * iteration in lowest-modes.ts (B. N. Parlett, The Symmetric Eigenvalue Problem,
 * ch. 4, from memory).
 *
 * For tridiagonal pencils a step is two sweeps over memory, and several modes (each
 * with its own shift) share them: the forward sweep factorises K − σ_b M as in
 * shifted-ldlt.ts, forms (M x_b)_p on the fly and runs the forward substitution; the
 * backward sweep runs the back substitution. Sharing the sweeps reads K and M once for
 * all modes, and the independent recurrences overlap in the processor.
 *
 * The backward sweep also accumulates yᵀKy and yᵀMy in the difference (energy) form,
 * so the Rayleigh quotient of y costs no extra pass.
 */
import { factorShifted, hasTinyInteriorPivot, pivotFloor, solveFactored, stiffnessForm, type BandPencil, type ShiftedFactorization } from './shifted-ldlt'
import { solveShiftedPivoted } from './pivoted-band-solve'
import { multiplyBand, quadraticForm } from './symmetric-band-matrix'
import { beamFormsApply, type BeamForms } from './beam-energy'

export interface InverseIterationStep {
  /** Sturm count at σ. */
  negativePivots: number
  /** xᵀMx of the input and yᵀMy of the output: ‖x‖_M / ‖y‖_M bounds |λ − σ| for some eigenvalue. */
  xMx: number
  yMy: number
  /** Rayleigh quotient of y. */
  rayleigh: number
  /** The entry of y largest in magnitude, with its sign (NaN when not tracked). */
  largest: number
  /** True when an interior LDLᵀ pivot nearly vanished and y came from the pivoted solve instead. */
  pivoted?: boolean
}

/**
 * An interior pivot smaller than this, relative to its row's couplings, makes LDLᵀ back
 * substitution unsafe. It only happens when a mesh node sits exactly on a node of the mode
 * (a leading block is then singular at σ = λ); accidental near-misses on fine meshes give ratios
 * around 1e-10 and leave the solution intact, while the pivoted solve would cost accuracy there.
 */
const TINY_INTERIOR_PIVOT = 1e-12

/**
 * Redoes a step with the pivoted band solve (pivoted-band-solve.ts): y = (K − σM)⁻¹ M x,
 * with the energies and largest entry of y. The Sturm count stays the LDLᵀ one (counts are
 * reliable even when a pivot is tiny).
 */
function pivotedStep(pencil: BandPencil, shift: number, x: Float64Array, y: Float64Array, negativePivots: number, scratch?: Float64Array): InverseIterationStep {
  const n = x.length
  // scratch (4n): M x, then the pivoted solve's three vectors.
  const work = scratch && scratch.length >= 4 * n ? scratch : new Float64Array(4 * n)
  const mx = work.subarray(0, n)
  multiplyBand(pencil.mass, x, mx)
  let xMx = 0
  for (let i = 0; i < n; i++) xMx += x[i] * mx[i]
  solveShiftedPivoted(pencil, shift, mx, y, work.subarray(n))
  let largest = 0
  for (let i = 0; i < n; i++) if (Math.abs(y[i]) > Math.abs(largest)) largest = y[i]
  const yMy = quadraticForm(pencil.mass, y)
  return { negativePivots, xMx, yMy, rayleigh: stiffnessForm(pencil, y) / yMy, largest, pivoted: true }
}

/**
 * Work storage of the tridiagonal sweeps, in one allocation (a typed array costs microseconds
 * to allocate and free, which dominates on small models solved thousands of times):
 * lw holds the forward sweep of up to four modes, saved a copy of up to four inputs for the
 * pivoted redo, pivot the pivoted solve's vectors, forward and backward the sweeps' per-lane results.
 */
export interface BlockWork {
  readonly width: number
  readonly lw: Float64Array
  readonly saved: Float64Array
  readonly pivot: Float64Array
  readonly forward: Float64Array
  readonly backward: Float64Array
}

/**
 * One set of block work kept from the last solve of a small model: a tolerance scatter or a
 * sweep solves the same size thousands of times, and zeroing fresh storage each time showed.
 */
let spareWork: { order: number; work: BlockWork } | null = null
const LARGEST_KEPT_ORDER = 1 << 14

/** Block work for this order: the one handed back by the last solve when it fits, else new. */
export function borrowBlockWork(order: number): BlockWork {
  if (spareWork && spareWork.order === order) {
    const { work } = spareWork
    spareWork = null
    return work
  }
  return allocateBlockWork(order)
}

/** Hands block work back for the next solve (kept only for small orders). */
export function returnBlockWork(order: number, work: BlockWork): void {
  if (order > 0 && order <= LARGEST_KEPT_ORDER) spareWork = { order, work }
}

export function allocateBlockWork(order: number): BlockWork {
  const storage = new Float64Array(16 * order + 24)
  return {
    width: 4,
    lw: storage.subarray(0, 8 * order),
    saved: storage.subarray(8 * order, 12 * order),
    pivot: storage.subarray(12 * order, 16 * order),
    forward: storage.subarray(16 * order, 16 * order + 12),
    backward: storage.subarray(16 * order + 12),
  }
}

/**
 * One step for every vector in `vectors` (x in, y out, in place), mode b at shifts[b].
 * Tridiagonal pencils only. Modes go four to a sweep (a group of two or three is padded by
 * repeating its last mode, which writes identical values twice); a single mode goes alone.
 */
export function blockInverseIterationStep(
  pencil: BandPencil,
  shifts: ArrayLike<number>,
  vectors: Float64Array[],
  work: BlockWork,
): InverseIterationStep[] {
  if (pencil.stiffness.halfBandwidth !== 1) throw new RangeError('block steps need a tridiagonal pencil')
  if (work.width < 4 || work.lw.length < 8 * pencil.stiffness.order) throw new RangeError('block work storage is too small')
  const out: InverseIterationStep[] = []
  let first = 0
  while (first < vectors.length) {
    const left = vectors.length - first
    if (left >= 2) {
      const lanes = [0, 1, 2, 3].map((b) => first + Math.min(b, left - 1))
      out.push(...sweepFour(pencil, lanes.map((i) => shifts[i]), lanes.map((i) => vectors[i]), Math.min(4, left), work))
      first += Math.min(4, left)
    } else {
      out.push(sweepOne(pencil, shifts[first], vectors[first], work))
      first++
    }
  }
  return out
}

/** Single-mode forward and backward sweeps; lw[2p] = l_p, lw[2p+1] = z_p / d_p. */
function sweepOne(pencil: BandPencil, shift: number, x: Float64Array, work: BlockWork): InverseIterationStep {
  const { stiffness: k, mass: m } = pencil
  const n = k.order
  const lw = work.lw
  const kOff = k.offDiagonals[0]
  const mOff = m.offDiagonals[0]
  const kRow = k.rowSums
  const mRow = m.rowSums
  const floor = pivotFloor(pencil, shift)
  let negative = 0
  let xMx = 0
  let rowSum = kRow[0] - shift * mRow[0]
  let z = 0
  let l = 0
  let moPrev = 0
  let offPrev = 0
  let unsafe = false
  for (let p = 0; p < n; p++) {
    const last = p === n - 1
    const ko = last ? 0 : kOff[p]
    const mo = last ? 0 : mOff[p]
    const xp = x[p]
    const xNext = last ? xp : x[p + 1]
    const xPrev = p === 0 ? xp : x[p - 1]
    const off = ko - shift * mo
    let pivot = rowSum - off
    if (!(Math.abs(pivot) >= floor)) pivot = -floor
    if (pivot < 0) negative++
    if (!last && Math.abs(pivot) < TINY_INTERIOR_PIVOT * (Math.abs(off) + Math.abs(offPrev))) unsafe = true
    offPrev = off
    // (M x)_p = r_p x_p + M_{p,p+1}(x_{p+1} − x_p) + M_{p−1,p}(x_{p−1} − x_p)
    const mx = mRow[p] * xp + mo * (xNext - xp) + moPrev * (xPrev - xp)
    xMx += xp * mx
    z = mx - l * z
    const inverse = 1 / pivot
    l = off * inverse
    lw[2 * p] = l
    lw[2 * p + 1] = z * inverse
    if (!last) rowSum = kRow[p + 1] - shift * mRow[p + 1] - l * rowSum
    moPrev = mo
  }
  if (unsafe) {
    const input = work.saved.subarray(0, n)
    input.set(x)
    return pivotedStep(pencil, shift, input, x, negative, work.pivot)
  }
  let yKy = 0
  let yMy = 0
  let largest = 0
  let yNext = 0
  for (let p = n - 1; p >= 0; p--) {
    const y = lw[2 * p + 1] - lw[2 * p] * yNext
    x[p] = y
    const ko = p === n - 1 ? 0 : kOff[p]
    const mo = p === n - 1 ? 0 : mOff[p]
    const diff = yNext - y
    yKy += kRow[p] * y * y - ko * diff * diff
    yMy += mRow[p] * y * y - mo * diff * diff
    if (Math.abs(y) > Math.abs(largest)) largest = y
    yNext = y
  }
  return { negativePivots: negative, xMx, yMy, rayleigh: yKy / yMy, largest }
}

/**
 * Four modes per sweep, written out lane by lane: the four recurrences are independent, so
 * their divisions overlap, and K and M are read once for all four. lw[8p + 2b] = l, lw[8p + 2b + 1] = z/d.
 * The two sweeps are separate small functions: a hot loop alone in its function stays in
 * optimised code, where a long function with cold paths after its loop kept falling back.
 */
function sweepFour(pencil: BandPencil, shifts: number[], xs: Float64Array[], used: number, work: BlockWork): InverseIterationStep[] {
  const { stiffness: k, mass: m } = pencil
  const n = k.order
  const lw = work.lw
  // forward: negative-pivot counts 0–3, xᵀMx 4–7, unsafe flags 8–11 (1 = an interior pivot nearly vanished).
  const forward = work.forward
  forwardFour(n, k.offDiagonals[0], m.offDiagonals[0], k.rowSums, m.rowSums, shifts[0], shifts[1], shifts[2], shifts[3], pivotFloor(pencil, shifts[0]), pivotFloor(pencil, shifts[1]), pivotFloor(pencil, shifts[2]), pivotFloor(pencil, shifts[3]), xs[0], xs[1], xs[2], xs[3], lw, forward)
  // Lanes whose LDLᵀ had a vanishing interior pivot are redone with the pivoted solve below,
  // from a copy of their input (padding lanes, which repeat the last used one, are not).
  let unsafeLanes = 0
  for (let b = 0; b < used; b++) {
    if (!forward[8 + b]) continue
    unsafeLanes |= 1 << b
    work.saved.subarray(b * n, (b + 1) * n).set(xs[b])
  }
  // backward: yᵀKy 0–3, yᵀMy 4–7, largest entry 8–11.
  const backward = work.backward
  backwardFour(n, k.offDiagonals[0], m.offDiagonals[0], k.rowSums, m.rowSums, xs[0], xs[1], xs[2], xs[3], lw, backward)
  const steps: InverseIterationStep[] = []
  for (let b = 0; b < used; b++) {
    const negativePivots = forward[b]
    if (unsafeLanes & (1 << b)) steps.push(pivotedStep(pencil, shifts[b], work.saved.subarray(b * n, (b + 1) * n), xs[b], negativePivots, work.pivot))
    else steps.push({ negativePivots, xMx: forward[4 + b], yMy: backward[4 + b], rayleigh: backward[b] / backward[4 + b], largest: backward[8 + b] })
  }
  return steps
}

function forwardFour(
  n: number,
  kOff: Float64Array,
  mOff: Float64Array,
  kRow: Float64Array,
  mRow: Float64Array,
  s0: number,
  s1: number,
  s2: number,
  s3: number,
  f0: number,
  f1: number,
  f2: number,
  f3: number,
  x0: Float64Array,
  x1: Float64Array,
  x2: Float64Array,
  x3: Float64Array,
  lw: Float64Array,
  out: Float64Array,
): void {
  const nf0 = -f0, nf1 = -f1, nf2 = -f2, nf3 = -f3 // prettier-ignore
  let r0 = kRow[0] - s0 * mRow[0]
  let r1 = kRow[0] - s1 * mRow[0]
  let r2 = kRow[0] - s2 * mRow[0]
  let r3 = kRow[0] - s3 * mRow[0]
  let z0 = 0, z1 = 0, z2 = 0, z3 = 0 // prettier-ignore
  let l0 = 0, l1 = 0, l2 = 0, l3 = 0 // prettier-ignore
  let n0 = 0, n1 = 0, n2 = 0, n3 = 0 // prettier-ignore
  let q0 = 0, q1 = 0, q2 = 0, q3 = 0 // prettier-ignore
  let o0 = 0, o1 = 0, o2 = 0, o3 = 0 // prettier-ignore
  let u0 = 0, u1 = 0, u2 = 0, u3 = 0 // prettier-ignore
  let moPrev = 0
  for (let p = 0; p < n; p++) {
    const last = p === n - 1
    const ko = last ? 0 : kOff[p]
    const mo = last ? 0 : mOff[p]
    const mr = mRow[p]
    const krNext = last ? 0 : kRow[p + 1]
    const mrNext = last ? 0 : mRow[p + 1]
    const pNext = last ? p : p + 1
    const pPrev = p === 0 ? p : p - 1
    const tiny = last ? 0 : TINY_INTERIOR_PIVOT
    const base = 8 * p
    {
      const xp = x0[p]
      const off = ko - s0 * mo
      let pivot = r0 - off
      if (!(Math.abs(pivot) >= f0)) pivot = nf0
      if (pivot < 0) n0++
      if (Math.abs(pivot) < tiny * (Math.abs(off) + Math.abs(o0))) u0 = 1
      o0 = off
      const mx = mr * xp + mo * (x0[pNext] - xp) + moPrev * (x0[pPrev] - xp)
      q0 += xp * mx
      z0 = mx - l0 * z0
      const inverse = 1 / pivot
      l0 = off * inverse
      lw[base] = l0
      lw[base + 1] = z0 * inverse
      r0 = krNext - s0 * mrNext - l0 * r0
    }
    {
      const xp = x1[p]
      const off = ko - s1 * mo
      let pivot = r1 - off
      if (!(Math.abs(pivot) >= f1)) pivot = nf1
      if (pivot < 0) n1++
      if (Math.abs(pivot) < tiny * (Math.abs(off) + Math.abs(o1))) u1 = 1
      o1 = off
      const mx = mr * xp + mo * (x1[pNext] - xp) + moPrev * (x1[pPrev] - xp)
      q1 += xp * mx
      z1 = mx - l1 * z1
      const inverse = 1 / pivot
      l1 = off * inverse
      lw[base + 2] = l1
      lw[base + 3] = z1 * inverse
      r1 = krNext - s1 * mrNext - l1 * r1
    }
    {
      const xp = x2[p]
      const off = ko - s2 * mo
      let pivot = r2 - off
      if (!(Math.abs(pivot) >= f2)) pivot = nf2
      if (pivot < 0) n2++
      if (Math.abs(pivot) < tiny * (Math.abs(off) + Math.abs(o2))) u2 = 1
      o2 = off
      const mx = mr * xp + mo * (x2[pNext] - xp) + moPrev * (x2[pPrev] - xp)
      q2 += xp * mx
      z2 = mx - l2 * z2
      const inverse = 1 / pivot
      l2 = off * inverse
      lw[base + 4] = l2
      lw[base + 5] = z2 * inverse
      r2 = krNext - s2 * mrNext - l2 * r2
    }
    {
      const xp = x3[p]
      const off = ko - s3 * mo
      let pivot = r3 - off
      if (!(Math.abs(pivot) >= f3)) pivot = nf3
      if (pivot < 0) n3++
      if (Math.abs(pivot) < tiny * (Math.abs(off) + Math.abs(o3))) u3 = 1
      o3 = off
      const mx = mr * xp + mo * (x3[pNext] - xp) + moPrev * (x3[pPrev] - xp)
      q3 += xp * mx
      z3 = mx - l3 * z3
      const inverse = 1 / pivot
      l3 = off * inverse
      lw[base + 6] = l3
      lw[base + 7] = z3 * inverse
      r3 = krNext - s3 * mrNext - l3 * r3
    }
    moPrev = mo
  }
  out[0] = n0
  out[1] = n1
  out[2] = n2
  out[3] = n3
  out[4] = q0
  out[5] = q1
  out[6] = q2
  out[7] = q3
  out[8] = u0
  out[9] = u1
  out[10] = u2
  out[11] = u3
}

function backwardFour(
  n: number,
  kOff: Float64Array,
  mOff: Float64Array,
  kRow: Float64Array,
  mRow: Float64Array,
  x0: Float64Array,
  x1: Float64Array,
  x2: Float64Array,
  x3: Float64Array,
  lw: Float64Array,
  out: Float64Array,
): void {
  let y0 = 0, y1 = 0, y2 = 0, y3 = 0 // prettier-ignore
  let k0 = 0, k1 = 0, k2 = 0, k3 = 0 // prettier-ignore
  let m0 = 0, m1 = 0, m2 = 0, m3 = 0 // prettier-ignore
  let g0 = 0, g1 = 0, g2 = 0, g3 = 0 // prettier-ignore
  for (let p = n - 1; p >= 0; p--) {
    const kr = kRow[p]
    const mr = mRow[p]
    const ko = p === n - 1 ? 0 : kOff[p]
    const mo = p === n - 1 ? 0 : mOff[p]
    const base = 8 * p
    let y = lw[base + 1] - lw[base] * y0
    let d = y0 - y
    k0 += kr * y * y - ko * d * d
    m0 += mr * y * y - mo * d * d
    if (Math.abs(y) > Math.abs(g0)) g0 = y
    y0 = y
    x0[p] = y
    y = lw[base + 3] - lw[base + 2] * y1
    d = y1 - y
    k1 += kr * y * y - ko * d * d
    m1 += mr * y * y - mo * d * d
    if (Math.abs(y) > Math.abs(g1)) g1 = y
    y1 = y
    x1[p] = y
    y = lw[base + 5] - lw[base + 4] * y2
    d = y2 - y
    k2 += kr * y * y - ko * d * d
    m2 += mr * y * y - mo * d * d
    if (Math.abs(y) > Math.abs(g2)) g2 = y
    y2 = y
    x2[p] = y
    y = lw[base + 7] - lw[base + 6] * y3
    d = y3 - y
    k3 += kr * y * y - ko * d * d
    m3 += mr * y * y - mo * d * d
    if (Math.abs(y) > Math.abs(g3)) g3 = y
    y3 = y
    x3[p] = y
  }
  out[0] = k0
  out[1] = k1
  out[2] = k2
  out[3] = k3
  out[4] = m0
  out[5] = m1
  out[6] = m2
  out[7] = m3
  out[8] = g0
  out[9] = g1
  out[10] = g2
  out[11] = g3
}

/** xᵀKx and xᵀMx of several vectors (difference form, as quadraticForm), four per sweep. */
export function blockEnergies(pencil: BandPencil, vectors: Float64Array[]): { xKx: number; xMx: number }[] {
  const { stiffness: k, mass: m } = pencil
  if (k.halfBandwidth !== 1 || pencil.beamForms) return vectors.map((x) => ({ xKx: stiffnessForm(pencil, x), xMx: quadraticForm(m, x) }))
  const out: { xKx: number; xMx: number }[] = []
  const energies = new Float64Array(8)
  for (let first = 0; first < vectors.length; first += 4) {
    const left = vectors.length - first
    const lane = (b: number) => vectors[first + Math.min(b, left - 1)]
    energiesFour(k.order, k.offDiagonals[0], m.offDiagonals[0], k.rowSums, m.rowSums, lane(0), lane(1), lane(2), lane(3), energies)
    for (let b = 0; b < Math.min(4, left); b++) out.push({ xKx: energies[b], xMx: energies[4 + b] })
  }
  return out
}

/** xᵀKx (out 0–3) and xᵀMx (out 4–7) of four vectors in one sweep; alone so that it stays optimised. */
function energiesFour(
  n: number,
  kOff: Float64Array,
  mOff: Float64Array,
  kRow: Float64Array,
  mRow: Float64Array,
  x0: Float64Array,
  x1: Float64Array,
  x2: Float64Array,
  x3: Float64Array,
  out: Float64Array,
): void {
  let k0 = 0, k1 = 0, k2 = 0, k3 = 0 // prettier-ignore
  let m0 = 0, m1 = 0, m2 = 0, m3 = 0 // prettier-ignore
  for (let p = 0; p + 1 < n; p++) {
    const kr = kRow[p]
    const mr = mRow[p]
    const ko = kOff[p]
    const mo = mOff[p]
    let v = x0[p]
    let d = x0[p + 1] - v
    k0 += kr * v * v - ko * d * d
    m0 += mr * v * v - mo * d * d
    v = x1[p]
    d = x1[p + 1] - v
    k1 += kr * v * v - ko * d * d
    m1 += mr * v * v - mo * d * d
    v = x2[p]
    d = x2[p + 1] - v
    k2 += kr * v * v - ko * d * d
    m2 += mr * v * v - mo * d * d
    v = x3[p]
    d = x3[p + 1] - v
    k3 += kr * v * v - ko * d * d
    m3 += mr * v * v - mo * d * d
  }
  const kr = kRow[n - 1]
  const mr = mRow[n - 1]
  const l0 = x0[n - 1], l1 = x1[n - 1], l2 = x2[n - 1], l3 = x3[n - 1] // prettier-ignore
  out[0] = k0 + kr * l0 * l0
  out[1] = k1 + kr * l1 * l1
  out[2] = k2 + kr * l2 * l2
  out[3] = k3 + kr * l3 * l3
  out[4] = m0 + mr * l0 * l0
  out[5] = m1 + mr * l1 * l1
  out[6] = m2 + mr * l2 * l2
  out[7] = m3 + mr * l3 * l3
}

/**
 * One step for a single vector of any bandwidth, in place: x is replaced by (K − σM)⁻¹ M x.
 * Tridiagonal pencils use the block sweeps (work width ≥ 1); wider bands factorise into f and
 * use scratch for M x.
 */
export function inverseIterationStepInPlace(
  pencil: BandPencil,
  shift: number,
  x: Float64Array,
  scratch: Float64Array,
  f: ShiftedFactorization,
  work: BlockWork,
): InverseIterationStep {
  const { stiffness: k, mass: m } = pencil
  if (k.halfBandwidth === 1) return blockInverseIterationStep(pencil, [shift], [x], work)[0]
  factorShifted(pencil, shift, f)
  if (k.halfBandwidth === 3 ? f.tinyInteriorPivot : hasTinyInteriorPivot(pencil, shift, f)) return pivotedStep(pencil, shift, x.slice(), x, f.negativePivots)
  multiplyBand(m, x, scratch)
  const xMx = dotProduct(x, scratch)
  solveFactored(f, scratch, x)
  if (pencil.beamForms) refineBeamSolve(pencil, shift, f, scratch, x)
  const yMy = quadraticForm(m, x)
  return { negativePivots: f.negativePivots, xMx, yMy, rayleigh: stiffnessForm(pencil, x) / yMy, largest: NaN }
}

/** Work vectors of refineBeamSolve, one set per order (allocated once). */
const refineWork = new Map<number, { kx: Float64Array; mx: Float64Array; r: Float64Array }>()

/**
 * One step of iterative refinement of y = (K − σM)⁻¹ b for a beam pencil: the residual
 * b − (K − σM)y with K y from the strain forms (beam-energy.ts), which round-off does not blur as
 * it blurs the assembled K, then y += (K − σM)⁻¹ r with the same factorisation. The factorisation
 * errs by about ε‖K‖/|λ − σ| along each mode, far below 1 for every mode but the one sought
 * (which the step amplifies anyway), so one step takes y to the strain forms' own accuracy
 * (N. J. Higham, Accuracy and Stability of Numerical Algorithms, ch. 12, from memory).
 */
function refineBeamSolve(pencil: BandPencil, shift: number, f: ShiftedFactorization, b: Float64Array, y: Float64Array): void {
  const n = y.length
  let work = refineWork.get(n)
  if (!work) {
    work = { kx: new Float64Array(n), mx: new Float64Array(n), r: new Float64Array(n) }
    if (refineWork.size > 8) refineWork.clear()
    refineWork.set(n, work)
  }
  const { kx, mx, r } = work
  beamFormsApply(pencil.beamForms as BeamForms, y, kx)
  multiplyBand(pencil.mass, y, mx)
  for (let i = 0; i < n; i++) r[i] = b[i] - kx[i] + shift * mx[i]
  solveFactored(f, r, r)
  for (let i = 0; i < n; i++) y[i] += r[i]
}

function dotProduct(a: Float64Array, b: Float64Array): number {
  let s = 0
  for (let i = 0; i < a.length; i++) s += a[i] * b[i]
  return s
}
