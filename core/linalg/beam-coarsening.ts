/**
 * Galerkin coarsening of a beam pencil (two unknowns per node: deflection w and the rotation
 * scaled by a length, s = ℓθ): K_c = Pᵀ K P, M_c = Pᵀ M P, where P interpolates every r-th node's
 * (w, θ) by cubic Hermite polynomials in x. On a uniform mesh the coarse pencil is then exactly
 * the Hermite model of the coarse mesh (its space is nested in the fine one), and on any mesh P
 * reproduces every cubic in x — the rigid-body motions w = a + bx among them — so a rigid
 * motion of the fine level is one of every coarse level too. The coarse pencil is a
 * Rayleigh–Ritz restriction: its eigenvalues bound the fine ones from above, and its modes,
 * interpolated back by P, start the fine level (the multilevel idea of A. Brandt,
 * S. McCormick & J. Ruge, SIAM J. Sci. Stat. Comput. 4 (1983), from memory; Hermite
 * interpolation e.g. in Press et al., Numerical Recipes, from memory).
 */
import { createBandMatrix, diagonalEntry, type SymmetricBandMatrix } from './symmetric-band-matrix'
import type { BandPencil } from './shifted-ldlt'
import { intervalHolding } from '../sorted-search'

/** The unknowns of a beam level: nodes in order, each with w and s = ℓθ unless an end condition removes it. */
export interface BeamLayout {
  /** Node coordinates, increasing (m). */
  readonly x: Float64Array
  /** Rotation unknowns are θ × rotationScale (m). */
  readonly rotationScale: number
  /** Whether the first node's [w, θ] and the last node's are unknowns. */
  readonly startKept: readonly [boolean, boolean]
  readonly endKept: readonly [boolean, boolean]
  /** Rigid-body motions w = a + b·x, θ = b the supports leave free (0, 1 or 2). */
  readonly rigidMotions: readonly { readonly a: number; readonly b: number }[]
  /**
   * Nodes every coarser level keeps, increasing (segment joints, point masses, springs): a point
   * feature inside a coarse interval would be seen through the interpolation, and the coarse
   * level would no longer be the finite-element model of its own mesh, whose eigenvalues converge
   * as h⁴ (what settling a mode on a coarse level rests on). The ends are always kept.
   */
  readonly anchors?: Int32Array
}

/** Unknown index of node i's deflection (kind 0) or rotation (kind 1), −1 where removed. */
export function beamDofIndex(layout: BeamLayout): Int32Array {
  const nodes = layout.x.length
  const index = new Int32Array(2 * nodes)
  let next = 0
  for (let i = 0; i < nodes; i++) {
    for (let kind = 0; kind < 2; kind++) {
      const kept = i === 0 ? layout.startKept[kind] : i === nodes - 1 ? layout.endKept[kind] : true
      index[2 * i + kind] = kept ? next++ : -1
    }
  }
  return index
}

export function beamUnknowns(layout: BeamLayout): number {
  const nodes = layout.x.length
  return 2 * nodes - [...layout.startKept, ...layout.endKept].filter((k) => !k).length
}

export interface BeamCoarsening {
  readonly fine: BeamLayout
  readonly coarse: BeamLayout
  readonly fineOrder: number
  readonly coarseOrder: number
  /** The fine node of each coarse node. */
  readonly picked: Int32Array
  /** beamDofIndex of the fine and of the coarse layout. */
  readonly fineIndex: Int32Array
  readonly coarseIndex: Int32Array
}

/**
 * Coarse nodes every `ratio`-th node from each anchor to the next (the ends and the layout's
 * anchors always kept; a run's short last interval merges into the one before it).
 */
export function beamCoarsening(fine: BeamLayout, ratio: number): BeamCoarsening {
  const nodes = fine.x.length
  const stops = [0, ...Array.from(fine.anchors ?? []).filter((i) => i > 0 && i < nodes - 1), nodes - 1]
  const picks: number[] = []
  const coarseAnchors: number[] = []
  for (let run = 0; run + 1 < stops.length; run++) {
    const from = stops[run]
    const to = stops[run + 1]
    if (to <= from) continue
    if (run > 0) coarseAnchors.push(picks.length)
    const first = picks.length
    for (let i = from; i < to; i += ratio) picks.push(i)
    if (picks.length - first > 1 && to - picks[picks.length - 1] < 2 && ratio >= 2) picks.pop()
  }
  picks.push(nodes - 1)
  const picked = Int32Array.from(picks)
  const coarse: BeamLayout = {
    x: Float64Array.from(picks, (i) => fine.x[i]),
    rotationScale: fine.rotationScale * ratio,
    startKept: fine.startKept,
    endKept: fine.endKept,
    rigidMotions: fine.rigidMotions,
    ...(fine.anchors ? { anchors: Int32Array.from(coarseAnchors) } : {}),
  }
  return { fine, coarse, fineOrder: beamUnknowns(fine), coarseOrder: beamUnknowns(coarse), picked, fineIndex: beamDofIndex(fine), coarseIndex: beamDofIndex(coarse) }
}

/**
 * The rows of P at a fine node a fraction t along a coarse interval of length `span`: the node's
 * w (out[0…3]) and s (out[4…7]) per coarse [W_A, S_A, W_B, S_B]. Hermite basis on the interval:
 * w = h00 W_A + h10 H θ_A + h01 W_B + h11 H θ_B with θ = S/ℓc, and s = ℓf dw/dx = (ℓf/H) dw/dt.
 * At t = 0 and t = 1 the rows are exactly the coarse node's own unknowns.
 */
export function hermiteRows(t: number, span: number, fineScale: number, coarseScale: number, out: Float64Array): Float64Array {
  const t2 = t * t
  const t3 = t2 * t
  const slopeToCoarse = span / coarseScale
  const fineOverSpan = fineScale / span
  const fineOverCoarse = fineScale / coarseScale
  out[0] = 2 * t3 - 3 * t2 + 1
  out[1] = (t3 - 2 * t2 + t) * slopeToCoarse
  out[2] = -2 * t3 + 3 * t2
  out[3] = (t3 - t2) * slopeToCoarse
  out[4] = (6 * t2 - 6 * t) * fineOverSpan
  out[5] = (3 * t2 - 4 * t + 1) * fineOverCoarse
  out[6] = (-6 * t2 + 6 * t) * fineOverSpan
  out[7] = (3 * t2 - 2 * t) * fineOverCoarse
  return out
}

/** The nonzero entries of P's row for one fine unknown: (coarse unknown, weight) pairs. */
export function prolongationRow(map: BeamCoarsening, fineUnknown: number): { coarse: number; weight: number }[] {
  const { fine, picked, fineIndex, coarseIndex } = map
  // Only the end nodes can lack unknowns, so the node is within one of (f + removed at start)/2.
  const removedAtStart = (fine.startKept[0] ? 0 : 1) + (fine.startKept[1] ? 0 : 1)
  let node = -1
  let kind = 0
  const guess = (fineUnknown + removedAtStart) >> 1
  for (let k = Math.max(0, guess - 1); k <= Math.min(fine.x.length - 1, guess + 1) && node < 0; k++) {
    for (let which = 0; which < 2; which++) {
      if (fineIndex[2 * k + which] === fineUnknown) {
        node = k
        kind = which
      }
    }
  }
  if (node < 0) throw new RangeError(`fine unknown ${fineUnknown} is not in the layout`)
  // The coarse interval holding the node (the last one for the last node).
  const lo = intervalHolding(picked, node)
  const a = picked[lo]
  const b = picked[lo + 1]
  const span = fine.x[b] - fine.x[a]
  const rows = hermiteRows(node === b ? 1 : (fine.x[node] - fine.x[a]) / span, span, fine.rotationScale, map.coarse.rotationScale, new Float64Array(8))
  const out: { coarse: number; weight: number }[] = []
  for (let c = 0; c < 4; c++) {
    const source = coarseIndex[2 * lo + c]
    const weight = rows[4 * kind + c]
    if (source >= 0 && weight !== 0) out.push({ coarse: source, weight })
  }
  return out
}

/** Pᵀ A P in banded row-sum storage, any fine band (the coarse one has half-bandwidth 3); entry by entry through prolongationRow. */
function galerkinProduct(a: SymmetricBandMatrix, map: BeamCoarsening): SymmetricBandMatrix {
  const n = a.order
  const nc = map.coarseOrder
  const bc = Math.min(3, Math.max(1, nc - 1))
  const rows = Array.from({ length: n }, (_, i) => prolongationRow(map, i))
  const diagonal = new Float64Array(nc)
  const out = createBandMatrix(nc, bc)
  const add = (i: number, j: number, v: number): void => {
    // Every ordered fine pair (i, j) adds P_iI v P_jJ to C_IJ; only the upper triangle is stored.
    for (const { coarse: I, weight: wi } of rows[i]) {
      for (const { coarse: J, weight: wj } of rows[j]) {
        if (J === I) diagonal[I] += wi * v * wj
        else if (J > I) {
          if (J - I > bc) throw new RangeError('coarse coupling outside the band')
          out.offDiagonals[J - I - 1][I] += wi * v * wj
        }
      }
    }
  }
  for (let i = 0; i < n; i++) add(i, i, diagonalEntry(a, i))
  for (let d = 1; d <= a.halfBandwidth; d++) {
    const band = a.offDiagonals[d - 1]
    for (let i = 0; i + d < n; i++) {
      const v = band[i]
      if (v === 0) continue
      add(i, i + d, v)
      add(i + d, i, v)
    }
  }
  finishRowSums(out, diagonal)
  return out
}

/** Row sums of a band matrix whose off-diagonals are filled, from its diagonal. */
function finishRowSums(out: SymmetricBandMatrix, diagonal: Float64Array): void {
  const nc = out.order
  const bc = out.halfBandwidth
  for (let I = 0; I < nc; I++) {
    let sum = diagonal[I]
    for (let d = 1; d <= bc; d++) {
      if (I + d < nc) sum += out.offDiagonals[d - 1][I]
      if (I - d >= 0) sum += out.offDiagonals[d - 1][I - d]
    }
    out.rowSums[I] = sum
  }
}

/**
 * Pᵀ M P of a beam's mass (the mass has no cancellation to fear), element by element: M is the sum
 * of each node's 2 × 2 block and each element's 2 × 2 coupling block between its two nodes (a
 * Hermite mass couples nothing farther; point masses sit on the diagonal), and within a coarse
 * interval P maps both nodes through the interval's Hermite rows, so every block adds
 * RᵢᵀBRⱼ to the interval's 4 × 4 coarse block. Entries of M between nodes two apart must be 0.
 */
export function coarsenBeamMass(mass: SymmetricBandMatrix, map: BeamCoarsening): SymmetricBandMatrix {
  if (mass.halfBandwidth !== 3) return galerkinProduct(mass, map)
  const { fine, picked, fineIndex, coarseIndex } = map
  const x = fine.x
  const n = mass.order
  const b1 = mass.offDiagonals[0], b2 = mass.offDiagonals[1], b3 = mass.offDiagonals[2] // prettier-ignore
  const diagonal = Float64Array.from({ length: n }, (_, i) => diagonalEntry(mass, i))
  // M_ij (0 where either unknown is removed), i and j at most 3 apart.
  const entry = (i: number, j: number): number => {
    if (i < 0 || j < 0) return 0
    if (i === j) return diagonal[i]
    const lo = i < j ? i : j
    const d = i < j ? j - i : i - j
    return d === 1 ? b1[lo] : d === 2 ? b2[lo] : b3[lo]
  }
  const nc = map.coarseOrder
  const out = createBandMatrix(nc, Math.min(3, Math.max(1, nc - 1)))
  const coarseDiagonal = new Float64Array(nc)
  // The interval's coarse block, upper triangle: block[4p + q], p ≤ q.
  const block = new Float64Array(16)
  let left = new Float64Array(8)
  let right = new Float64Array(8)
  const u = new Float64Array(4)
  const v = new Float64Array(4)
  const fs = fine.rotationScale
  const cs = map.coarse.rotationScale
  const intervals = picked.length - 1
  for (let I = 0; I < intervals; I++) {
    const a = picked[I]
    const b = picked[I + 1]
    const last = I + 1 === intervals
    const span = x[b] - x[a]
    block.fill(0)
    hermiteRows(0, span, fs, cs, left)
    for (let k = a; k <= b; k++) {
      const iw = fineIndex[2 * k]
      const is = fineIndex[2 * k + 1]
      const next = k < b
      // Node k with all its own and its right neighbour's unknowns: entries read straight from the bands.
      const interior = next && iw >= 0 && is === iw + 1 && fineIndex[2 * k + 2] === iw + 2 && fineIndex[2 * k + 3] === iw + 3
      // Node k's own block belongs to the interval on its right (the last node's to the last interval).
      if (next || last) {
        const dww = interior ? diagonal[iw] : entry(iw, iw)
        const dws = interior ? b1[iw] : entry(iw, is)
        const dss = interior ? diagonal[iw + 1] : entry(is, is)
        for (let q = 0; q < 4; q++) {
          u[q] = dww * left[q] + dws * left[4 + q]
          v[q] = dws * left[q] + dss * left[4 + q]
        }
        for (let p = 0; p < 4; p++) for (let q = p; q < 4; q++) block[4 * p + q] += left[p] * u[q] + left[4 + p] * v[q]
      }
      if (!next) break
      hermiteRows(k + 1 === b ? 1 : (x[k + 1] - x[a]) / span, span, fs, cs, right)
      // The element's coupling block X (rows: node k's w, s; columns: node k + 1's w, s): Rₖᵀ X Rₖ₊₁ plus its transpose.
      const jw = fineIndex[2 * k + 2]
      const js = fineIndex[2 * k + 3]
      const xww = interior ? b2[iw] : entry(iw, jw)
      const xws = interior ? b3[iw] : entry(iw, js)
      const xsw = interior ? b1[iw + 1] : entry(is, jw)
      const xss = interior ? b2[iw + 1] : entry(is, js)
      for (let q = 0; q < 4; q++) {
        u[q] = xww * right[q] + xws * right[4 + q]
        v[q] = xsw * right[q] + xss * right[4 + q]
      }
      for (let p = 0; p < 4; p++) {
        for (let q = p; q < 4; q++) block[4 * p + q] += left[p] * u[q] + left[4 + p] * v[q] + left[q] * u[p] + left[4 + q] * v[p]
      }
      const swap = left
      left = right
      right = swap
    }
    for (let p = 0; p < 4; p++) {
      const i = coarseIndex[2 * I + p]
      if (i < 0) continue
      for (let q = p; q < 4; q++) {
        const j = coarseIndex[2 * I + q]
        if (j < 0) continue
        if (i === j) coarseDiagonal[i] += block[4 * p + q]
        else out.offDiagonals[j - i - 1][i] += block[4 * p + q]
      }
    }
  }
  finishRowSums(out, coarseDiagonal)
  return out
}

/** Pᵀ K P and Pᵀ M P entry by entry (pencils without strain forms). */
export function coarsenBeamPencil(pencil: BandPencil, map: BeamCoarsening): BandPencil {
  return { stiffness: galerkinProduct(pencil.stiffness, map), mass: galerkinProduct(pencil.mass, map) }
}

/** x_fine = P x_coarse: the coarse mode as a cubic Hermite curve through the fine nodes, interval by interval. */
export function prolongateBeam(map: BeamCoarsening, coarse: Float64Array, fine: Float64Array): Float64Array {
  const { picked, fineIndex, coarseIndex } = map
  const x = map.fine.x
  const fs = map.fine.rotationScale
  const cs = map.coarse.rotationScale
  const intervals = picked.length - 1
  const value = (i: number) => (i >= 0 ? coarse[i] : 0)
  for (let I = 0; I < intervals; I++) {
    const a = picked[I]
    const b = picked[I + 1]
    const xa = x[a]
    const span = x[b] - xa
    const wA = value(coarseIndex[2 * I]), sA = value(coarseIndex[2 * I + 1]), wB = value(coarseIndex[2 * I + 2]), sB = value(coarseIndex[2 * I + 3]) // prettier-ignore
    // The Hermite rows of hermiteRows, applied to the interval's four values.
    const slopeA = sA * (span / cs)
    const slopeB = sB * (span / cs)
    const fineOverSpan = fs / span
    const fineOverCoarse = fs / cs
    const end = I + 1 === intervals ? b : b - 1
    for (let k = a; k <= end; k++) {
      const t = k === b ? 1 : (x[k] - xa) / span
      const t2 = t * t
      const t3 = t2 * t
      const iw = fineIndex[2 * k]
      const is = fineIndex[2 * k + 1]
      if (iw >= 0) fine[iw] = (2 * t3 - 3 * t2 + 1) * wA + (t3 - 2 * t2 + t) * slopeA + (-2 * t3 + 3 * t2) * wB + (t3 - t2) * slopeB
      if (is >= 0) fine[is] = (6 * t2 - 6 * t) * fineOverSpan * (wA - wB) + ((3 * t2 - 4 * t + 1) * sA + (3 * t2 - 2 * t) * sB) * fineOverCoarse
    }
  }
  return fine
}

/** prolongateBeam of several vectors. */
export function prolongateBeamAll(map: BeamCoarsening, coarse: readonly Float64Array[]): Float64Array[] {
  return coarse.map((c) => prolongateBeam(map, c, new Float64Array(map.fineOrder)))
}

/** The level's rigid-body motions as vectors over its unknowns (not yet normalised). */
export function rigidMotionVectors(layout: BeamLayout): Float64Array[] {
  const index = beamDofIndex(layout)
  const n = beamUnknowns(layout)
  return layout.rigidMotions.map(({ a, b }) => {
    const v = new Float64Array(n)
    for (let i = 0; i < layout.x.length; i++) {
      const w = index[2 * i]
      const s = index[2 * i + 1]
      if (w >= 0) v[w] = a + b * layout.x[i]
      if (s >= 0) v[s] = b * layout.rotationScale
    }
    return v
  })
}
