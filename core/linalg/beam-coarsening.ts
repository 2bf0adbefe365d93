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
  /** Up to four (coarse unknown, weight) pairs per fine unknown; index −1 where unused. */
  readonly columns: Int32Array
  readonly weights: Float64Array
}

/** Coarse nodes every `ratio`-th node, the first and last always kept (a short last interval merges into the previous). */
export function beamCoarsening(fine: BeamLayout, ratio: number): BeamCoarsening {
  const nodes = fine.x.length
  const picked: number[] = []
  for (let i = 0; i < nodes - 1; i += ratio) picked.push(i)
  if (picked.length > 1 && nodes - 1 - picked[picked.length - 1] < 2 && ratio >= 2) picked.pop()
  picked.push(nodes - 1)
  const cx = Float64Array.from(picked, (i) => fine.x[i])
  const coarse: BeamLayout = {
    x: cx,
    rotationScale: fine.rotationScale * ratio,
    startKept: fine.startKept,
    endKept: fine.endKept,
    rigidMotions: fine.rigidMotions,
  }
  const fineIndex = beamDofIndex(fine)
  const coarseIndex = beamDofIndex(coarse)
  const fineOrder = beamUnknowns(fine)
  const columns = new Int32Array(4 * fineOrder).fill(-1)
  const weights = new Float64Array(4 * fineOrder)
  const lf = fine.rotationScale
  const lc = coarse.rotationScale
  for (let I = 0; I + 1 < picked.length; I++) {
    const a = picked[I]
    const b = picked[I + 1]
    const xa = fine.x[a]
    const span = fine.x[b] - xa
    const last = I + 2 === picked.length
    for (let i = a; i < (last ? b + 1 : b); i++) {
      const t = (fine.x[i] - xa) / span
      const t2 = t * t
      const t3 = t2 * t
      for (let kind = 0; kind < 2; kind++) {
        const f = fineIndex[2 * i + kind]
        if (f < 0) continue
        let slot = 0
        for (let c = 0; c < 4; c++) {
          const source = coarseIndex[2 * I + c]
          // Hermite basis on [a, b]: w = h00 w_a + h10 H θ_a + h01 w_b + h11 H θ_b, with θ = S/ℓc;
          // s = ℓf θ = ℓf dw/dx = (ℓf/H) dw/dt.
          const w =
            kind === 0
              ? c === 0 ? 2 * t3 - 3 * t2 + 1 : c === 1 ? ((t3 - 2 * t2 + t) * span) / lc : c === 2 ? -2 * t3 + 3 * t2 : ((t3 - t2) * span) / lc
              : c === 0 ? ((6 * t2 - 6 * t) * lf) / span : c === 1 ? ((3 * t2 - 4 * t + 1) * lf) / lc : c === 2 ? ((-6 * t2 + 6 * t) * lf) / span : ((3 * t2 - 2 * t) * lf) / lc // prettier-ignore
          // Exact zeros (a coarse node's own value) are left out, as are removed coarse unknowns.
          if (source < 0 || Math.abs(w) < 1e-15) continue
          columns[4 * f + slot] = source
          weights[4 * f + slot] = w
          slot++
        }
      }
    }
  }
  return { fine, coarse, fineOrder, coarseOrder: beamUnknowns(coarse), columns, weights }
}

/** Pᵀ A P in banded row-sum storage (half-bandwidth 3: a coarse node couples only to its neighbours). */
function galerkinProduct(a: SymmetricBandMatrix, map: BeamCoarsening): SymmetricBandMatrix {
  const n = a.order
  const nc = map.coarseOrder
  const bc = Math.min(3, Math.max(1, nc - 1))
  const diagonal = new Float64Array(nc)
  const out = createBandMatrix(nc, bc)
  const { columns, weights } = map
  const add = (i: number, j: number, v: number): void => {
    // Every ordered fine pair (i, j) adds P_iI v P_jJ to C_IJ; only the upper triangle is stored.
    for (let p = 0; p < 4; p++) {
      const I = columns[4 * i + p]
      if (I < 0) break
      const wi = weights[4 * i + p] * v
      for (let q = 0; q < 4; q++) {
        const J = columns[4 * j + q]
        if (J < 0) break
        if (J === I) diagonal[I] += wi * weights[4 * j + q]
        else if (J > I) {
          if (J - I > bc) throw new RangeError('coarse coupling outside the band')
          out.offDiagonals[J - I - 1][I] += wi * weights[4 * j + q]
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
  for (let I = 0; I < nc; I++) {
    let sum = diagonal[I]
    for (let d = 1; d <= bc; d++) {
      if (I + d < nc) sum += out.offDiagonals[d - 1][I]
      if (I - d >= 0) sum += out.offDiagonals[d - 1][I - d]
    }
    out.rowSums[I] = sum
  }
  return out
}

/** Pᵀ M P alone (the mass has no cancellation to fear). */
export function coarsenBeamMass(mass: SymmetricBandMatrix, map: BeamCoarsening): SymmetricBandMatrix {
  return galerkinProduct(mass, map)
}

export function coarsenBeamPencil(pencil: BandPencil, map: BeamCoarsening): BandPencil {
  return { stiffness: galerkinProduct(pencil.stiffness, map), mass: galerkinProduct(pencil.mass, map) }
}

/** x_fine = P x_coarse: the coarse mode as a cubic Hermite curve through the fine nodes. */
export function prolongateBeam(map: BeamCoarsening, coarse: Float64Array, fine: Float64Array): Float64Array {
  const { columns, weights } = map
  for (let f = 0; f < map.fineOrder; f++) {
    let s = 0
    for (let p = 0; p < 4; p++) {
      const I = columns[4 * f + p]
      if (I < 0) break
      s += weights[4 * f + p] * coarse[I]
    }
    fine[f] = s
  }
  return fine
}

/** prolongateBeam of several vectors in one pass over P (P's storage is read once, not once per vector). */
export function prolongateBeamAll(map: BeamCoarsening, coarse: readonly Float64Array[]): Float64Array[] {
  const { columns, weights } = map
  const m = coarse.length
  const fine = coarse.map(() => new Float64Array(map.fineOrder))
  const sums = new Float64Array(m)
  for (let f = 0; f < map.fineOrder; f++) {
    sums.fill(0)
    for (let p = 0; p < 4; p++) {
      const I = columns[4 * f + p]
      if (I < 0) break
      const w = weights[4 * f + p]
      for (let j = 0; j < m; j++) sums[j] += w * coarse[j][I]
    }
    for (let j = 0; j < m; j++) fine[j][f] = sums[j]
  }
  return fine
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
