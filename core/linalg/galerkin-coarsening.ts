/**
 * Galerkin coarsening of a chain-structured pencil: K_c = Pᵀ K P, M_c = Pᵀ M P,
 * where P interpolates linearly (by index) between every `ratio`-th unknown.
 * The coarse pencil is a Rayleigh–Ritz restriction, so its eigenvalues are upper
 * bounds of the fine ones (Poincaré separation) and its low modes, interpolated
 * back, are close to the fine modes: the starting guesses of the multilevel
 * eigen solver (the idea of A. Brandt, S. McCormick & J. Ruge, "Multigrid methods
 * for differential eigenproblems", SIAM J. Sci. Stat. Comput. 4 (1983), from memory).
 *
 * P keeps the first and last unknown as coarse nodes, so it is a partition of
 * unity (P·1 = 1): coarse row sums are Pᵀ r exactly, and a free–free chain stays
 * free–free on every level.
 */
import { createBandMatrix, diagonalEntry, type SymmetricBandMatrix } from './symmetric-band-matrix'
import type { BandPencil } from './shifted-ldlt'

export interface CoarseningMap {
  readonly fineOrder: number
  /** fineIndexOfCoarse[I] = index of coarse node I among the fine unknowns (increasing, first 0, last n−1). */
  readonly fineIndexOfCoarse: Int32Array
}

export function coarseningMap(fineOrder: number, ratio: number): CoarseningMap {
  const idx: number[] = []
  for (let i = 0; i < fineOrder - 1; i += ratio) idx.push(i)
  const last = fineOrder - 1
  // Merge a short last interval into the previous one so that spacing stays ≥ 2 where possible.
  if (idx.length > 1 && last - idx[idx.length - 1] < 2 && ratio >= 2) idx.pop()
  idx.push(last)
  return { fineOrder, fineIndexOfCoarse: Int32Array.from(idx) }
}

/** x_fine = P x_coarse. */
export function prolongate(map: CoarseningMap, coarse: Float64Array, fine: Float64Array): Float64Array {
  const c = map.fineIndexOfCoarse
  for (let I = 0; I + 1 < c.length; I++) {
    const a = c[I]
    const b = c[I + 1]
    const va = coarse[I]
    const vb = coarse[I + 1]
    const span = b - a
    for (let i = a; i < b; i++) fine[i] = va + ((vb - va) * (i - a)) / span
  }
  fine[c[c.length - 1]] = coarse[c.length - 1]
  return fine
}

/**
 * Tridiagonal fast path: with linear P every fine pair (i, i+1) lies inside one coarse
 * interval [c_I, c_{I+1}], so each interval sums its own entries into C_{I,I+1}.
 */
function coarseTridiagonal(a: SymmetricBandMatrix, map: CoarseningMap): SymmetricBandMatrix {
  const c = map.fineIndexOfCoarse
  const nc = c.length
  const out = createBandMatrix(nc, 1)
  const off = a.offDiagonals[0]
  const r = a.rowSums
  const coarseOff = out.offDiagonals[0]
  const coarseRow = out.rowSums
  for (let I = 0; I + 1 < nc; I++) {
    const start = c[I]
    const end = c[I + 1]
    const span = end - start
    let sum = 0
    let rowLeft = 0
    let rowRight = 0
    for (let i = start; i < end; i++) {
      const t = (i - start) / span
      const tNext = (i + 1 - start) / span
      const v = off[i]
      // Pair (i, i+1): Q_iI K_{i,i+1} Q_{i+1,I+1} + Q_{i+1,I} K_{i+1,i} Q_{i,I+1}.
      sum += v * ((1 - t) * tNext + (1 - tNext) * t)
      if (i > start) {
        // Diagonal of an interior fine node, recovered from its row sum.
        const diagonal = r[i] - v - off[i - 1]
        sum += diagonal * (1 - t) * t
      }
      rowLeft += (1 - t) * r[i]
      if (i > start) rowRight += t * r[i]
    }
    coarseOff[I] = sum
    coarseRow[I] += rowLeft
    coarseRow[I + 1] += rowRight
  }
  coarseRow[nc - 1] += r[c[nc - 1]]
  return out
}

function coarseMatrix(a: SymmetricBandMatrix, map: CoarseningMap): SymmetricBandMatrix {
  if (a.halfBandwidth === 1) return coarseTridiagonal(a, map)
  const c = map.fineIndexOfCoarse
  const nc = c.length
  const n = a.order
  const b = a.halfBandwidth
  // Interpolation weights of each fine unknown: left coarse node and weight of the right one.
  const left = new Int32Array(n)
  const wRight = new Float64Array(n)
  let minSpacing = Infinity
  for (let I = 0; I + 1 < nc; I++) {
    const span = c[I + 1] - c[I]
    minSpacing = Math.min(minSpacing, span)
    for (let i = c[I]; i < c[I + 1]; i++) {
      left[i] = I
      wRight[i] = (i - c[I]) / span
    }
  }
  left[n - 1] = nc - 1
  wRight[n - 1] = 0
  // Coarse nodes I and I+m couple when a fine entry within the band links their supports.
  let bc = 1
  if (Number.isFinite(minSpacing)) while (bc + 1 < nc && (bc - 1) * minSpacing + 2 <= b) bc++
  const out = createBandMatrix(nc, Math.min(bc, Math.max(1, nc - 1)))
  const add = (I: number, J: number, v: number): void => {
    if (I === J || v === 0) return
    const d = Math.abs(I - J)
    if (d > out.halfBandwidth) throw new RangeError('coarse coupling outside the band')
    out.offDiagonals[d - 1][Math.min(I, J)] += v
  }
  // C_IJ = Σ P_iI A_ij P_jJ. An unordered fine pair {i, j} feeds every coarse pair (I of i, J of j);
  // a diagonal entry feeds each unordered coarse pair once, hence the half.
  const spread = (i: number, j: number, v: number): void => {
    const factor = i === j ? 0.5 : 1
    const Ii = left[i]
    const Ij = left[j]
    const wi1 = wRight[i]
    const wj1 = wRight[j]
    const wi0 = 1 - wi1
    const wj0 = 1 - wj1
    add(Ii, Ij, factor * v * wi0 * wj0)
    if (wj1 !== 0) add(Ii, Ij + 1, factor * v * wi0 * wj1)
    if (wi1 !== 0) add(Ii + 1, Ij, factor * v * wi1 * wj0)
    if (wi1 !== 0 && wj1 !== 0) add(Ii + 1, Ij + 1, factor * v * wi1 * wj1)
  }
  for (let i = 0; i < n; i++) spread(i, i, diagonalEntry(a, i))
  for (let d = 1; d <= b; d++) {
    const band = a.offDiagonals[d - 1]
    for (let i = 0; i + d < n; i++) if (band[i] !== 0) spread(i, i + d, band[i])
  }
  // Row sums of PᵀAP are Pᵀ(A·P·1) = Pᵀ r, since P·1 = 1.
  const r = a.rowSums
  for (let i = 0; i < n; i++) {
    const I = left[i]
    const w1 = wRight[i]
    out.rowSums[I] += (1 - w1) * r[i]
    if (w1 !== 0) out.rowSums[I + 1] += w1 * r[i]
  }
  return out
}

export function coarsenPencil(pencil: BandPencil, map: CoarseningMap): BandPencil {
  return { stiffness: coarseMatrix(pencil.stiffness, map), mass: coarseMatrix(pencil.mass, map) }
}

/**
 * Cubic (4-point Lagrange, by index) interpolation of a coarse vector: a better
 * start for the fine level than P x. Linear interpolation leaves kinks at the coarse
 * nodes whose strain energy spoils the Rayleigh quotient at O(h); cubic
 * interpolation removes them to O(h³), so on fine meshes one Rayleigh quotient step
 * already meets the tolerance. Near the ends the stencil is one-sided.
 */
export function interpolateSmooth(map: CoarseningMap, coarse: Float64Array, fine: Float64Array): Float64Array {
  if (map.fineIndexOfCoarse.length < 4) return prolongate(map, coarse, fine)
  return interpolateCubic(map, coarse, fine)
}

const RATIO_FOUR_WEIGHTS = cubicWeights(-4, 0, 4, 8, 0, 4)

/**
 * The bulk of the interpolation for the coarsening ratio the solver uses, unrolled; alone in
 * its function so that the hot loop stays in optimised code.
 */
function interpolateUniformRatioFour(c: Int32Array, coarse: Float64Array, fine: Float64Array, from: number, to: number): void {
  const w = RATIO_FOUR_WEIGHTS
  const w0 = w[0], w1 = w[1], w2 = w[2], w3 = w[3], w4 = w[4], w5 = w[5] // prettier-ignore
  const w6 = w[6], w7 = w[7], w8 = w[8], w9 = w[9], w10 = w[10], w11 = w[11] // prettier-ignore
  for (let I = from; I < to; I++) {
    const a = c[I]
    const v0 = coarse[I - 1]
    const v1 = coarse[I]
    const v2 = coarse[I + 1]
    const v3 = coarse[I + 2]
    fine[a] = v1
    fine[a + 1] = w0 * v0 + w1 * v1 + w2 * v2 + w3 * v3
    fine[a + 2] = w4 * v0 + w5 * v1 + w6 * v2 + w7 * v3
    fine[a + 3] = w8 * v0 + w9 * v1 + w10 * v2 + w11 * v3
  }
}

/** Evenly spaced intervals of any spacing, with one set of weights (see interpolateUniformRatioFour). */
function interpolateUniform(c: Int32Array, coarse: Float64Array, fine: Float64Array, from: number, to: number, weights: Float64Array): void {
  const inner = weights.length / 4
  for (let I = from; I < to; I++) {
    const a = c[I]
    const v0 = coarse[I - 1]
    const v1 = coarse[I]
    const v2 = coarse[I + 1]
    const v3 = coarse[I + 2]
    fine[a] = v1
    for (let j = 0, w = 0; j < inner; j++, w += 4) fine[a + 1 + j] = weights[w] * v0 + weights[w + 1] * v1 + weights[w + 2] * v2 + weights[w + 3] * v3
  }
}

/** Lagrange weights of the 4-point stencil t0..t3 at the points a+1..b−1, four per point. */
function cubicWeights(t0: number, t1: number, t2: number, t3: number, a: number, b: number): Float64Array {
  const weights = new Float64Array(4 * Math.max(b - a - 1, 0))
  for (let i = a + 1; i < b; i++) {
    const d0 = i - t0
    const d1 = i - t1
    const d2 = i - t2
    const d3 = i - t3
    const w = 4 * (i - a - 1)
    weights[w] = (d1 * d2 * d3) / ((t0 - t1) * (t0 - t2) * (t0 - t3))
    weights[w + 1] = (d0 * d2 * d3) / ((t1 - t0) * (t1 - t2) * (t1 - t3))
    weights[w + 2] = (d0 * d1 * d3) / ((t2 - t0) * (t2 - t1) * (t2 - t3))
    weights[w + 3] = (d0 * d1 * d2) / ((t3 - t0) * (t3 - t1) * (t3 - t2))
  }
  return weights
}

function interpolateCubic(map: CoarseningMap, coarse: Float64Array, fine: Float64Array): Float64Array {
  const c = map.fineIndexOfCoarse
  const nc = c.length
  const n = map.fineOrder
  // Intervals I whose stencil I−1..I+2 is evenly spaced share one set of weights (the bulk of the work).
  const spacing = c[2] - c[1]
  let uniformEnd = 1
  while (uniformEnd + 2 < nc && c[uniformEnd + 2] - c[uniformEnd + 1] === spacing && c[uniformEnd] - c[uniformEnd - 1] === spacing) {
    uniformEnd++
  }
  const general = (I: number): void => {
    const first = Math.min(Math.max(I - 1, 0), nc - 4)
    const a = c[I]
    const b = c[I + 1]
    const weights = cubicWeights(c[first], c[first + 1], c[first + 2], c[first + 3], a, b)
    const v0 = coarse[first]
    const v1 = coarse[first + 1]
    const v2 = coarse[first + 2]
    const v3 = coarse[first + 3]
    fine[a] = coarse[I]
    for (let i = a + 1, w = 0; i < b; i++, w += 4) {
      fine[i] = weights[w] * v0 + weights[w + 1] * v1 + weights[w + 2] * v2 + weights[w + 3] * v3
    }
  }
  general(0)
  if (spacing === 4) interpolateUniformRatioFour(c, coarse, fine, 1, uniformEnd)
  else interpolateUniform(c, coarse, fine, 1, uniformEnd, cubicWeights(-spacing, 0, spacing, 2 * spacing, 0, spacing))
  for (let I = Math.max(uniformEnd, 1); I + 1 < nc; I++) general(I)
  fine[n - 1] = coarse[nc - 1]
  return fine
}
