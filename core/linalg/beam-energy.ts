/**
 * A beam's stiffness kept in strain form, beside its assembled matrix. For a smooth vector the
 * assembled K of a fine beam mesh sums entries of size EI/h³ into an energy of size λ₁·xᵀMx, and
 * the Rayleigh quotient loses about κ(K)·ε, which is the whole of it past a few thousand
 * elements. Element by element the energy is a sum of positive terms in small strains instead:
 * an element's stiffness annihilates the rigid motions (w = a + bx, θ = b), so its energy is that
 * of q − w_a·(translation) − θ_a·(rotation), a 2 × 2 form in
 *   d₁ = (w_b − w_a) − h θ_a   and   d₂ = θ_b − θ_a,
 * computed from differences of nearby values. The geometric stiffness annihilates translation
 * only: a 3 × 3 form in (θ_a, w_b − w_a, θ_b). Springs add k (Σ p_j x_j)².
 * All in the scaled unknowns s = ℓθ (see beam-coarsening.ts). The Galerkin coarse level
 * (Pᵀ K P) keeps the same structure, because P reproduces the rigid motions on every interval,
 * so its forms follow from the fine ones exactly (coarsenBeamForms).
 */
import { hermiteRows, prolongationRow, type BeamCoarsening, type BeamLayout } from './beam-coarsening'
import { createBandMatrix, type SymmetricBandMatrix } from './symmetric-band-matrix'

export interface BeamForms {
  readonly layout: BeamLayout
  /** beamDofIndex(layout). */
  readonly index: Int32Array
  /** Per form: the elastic 2 × 2 (3 entries) and the geometric 3 × 3 per newton of tension (6 entries). */
  readonly forms: Float64Array
  /** The form of each interval between consecutive nodes. */
  readonly formOfInterval: Int32Array
  /** Steady axial force, N (tension positive). */
  readonly preload: number
  /**
   * Timoshenko elements: the rotation is a field of its own, which the Hermite coarse levels (their
   * rotation the slope of the deflection) cannot follow, so a coarse level's values stay above this
   * mesh's by the shear's share however fine both are, and are never taken for them.
   */
  readonly shearFlexible: boolean
  /** Grounded terms k (Σ_p weight_p x[index_p])², up to four (index, weight) pairs each (index −1 unused). */
  readonly groundedStiffness: Float64Array
  readonly groundedIndex: Int32Array
  readonly groundedWeight: Float64Array
}

export const FORM_SIZE = 9

/** The strain form of an element matrix (4 × 4 row-major over the scaled [w_a, s_a, w_b, s_b]). */
export function elementForm(elastic: ArrayLike<number>, geometric: ArrayLike<number>): number[] {
  const k = (a: number, b: number) => elastic[4 * a + b]
  const g = (a: number, b: number) => geometric[4 * a + b]
  return [k(2, 2), k(2, 3), k(3, 3), g(1, 1), g(1, 2), g(1, 3), g(2, 2), g(2, 3), g(3, 3)]
}

/** xᵀKy (xᵀKx without y) from the forms. */
export function beamFormsEnergy(data: BeamForms, x: Float64Array, y: Float64Array = x): number {
  const { layout, index, forms, formOfInterval, preload } = data
  const xs = layout.x
  const scale = layout.rotationScale
  const at = (v: Float64Array, i: number) => (i >= 0 ? v[i] : 0)
  let sum = 0
  for (let e = 0; e + 1 < xs.length; e++) {
    const h = xs[e + 1] - xs[e]
    const f = FORM_SIZE * formOfInterval[e]
    const ia = 2 * e
    const wa = at(x, index[ia]), sa = at(x, index[ia + 1]), wb = at(x, index[ia + 2]), sb = at(x, index[ia + 3]) // prettier-ignore
    const va = at(y, index[ia]), ta = at(y, index[ia + 1]), vb = at(y, index[ia + 2]), tb = at(y, index[ia + 3]) // prettier-ignore
    const dx = wb - wa
    const dy = vb - va
    const x1 = dx - (h * sa) / scale
    const x2 = sb - sa
    const y1 = dy - (h * ta) / scale
    const y2 = tb - ta
    sum += forms[f] * x1 * y1 + forms[f + 1] * (x1 * y2 + x2 * y1) + forms[f + 2] * x2 * y2
    if (preload !== 0) {
      sum +=
        preload *
        (forms[f + 3] * sa * ta +
          forms[f + 4] * (sa * dy + dx * ta) +
          forms[f + 5] * (sa * tb + sb * ta) +
          forms[f + 6] * dx * dy +
          forms[f + 7] * (dx * tb + sb * dy) +
          forms[f + 8] * sb * tb)
    }
  }
  const { groundedStiffness, groundedIndex, groundedWeight } = data
  for (let g = 0; g < groundedStiffness.length; g++) {
    let px = 0
    let py = 0
    for (let p = 4 * g; p < 4 * g + 4; p++) {
      const i = groundedIndex[p]
      if (i < 0) continue
      px += groundedWeight[p] * x[i]
      py += groundedWeight[p] * y[i]
    }
    sum += groundedStiffness[g] * px * py
  }
  return sum
}

/**
 * The forms of the Galerkin coarse level: per coarse interval, the fine elements' forms carried
 * through the Hermite interpolation (P restricted to the interval), then read back as a form;
 * grounded terms through P's rows.
 */
export function coarsenBeamForms(fine: BeamForms, map: BeamCoarsening): BeamForms {
  const coarse = map.coarse
  const fx = fine.layout.x
  const lf = fine.layout.rotationScale
  const lc = coarse.rotationScale
  const { picked } = map
  const intervals = picked.length - 1
  const forms = new Float64Array(FORM_SIZE * intervals)
  const S = fine.forms
  const withPreload = fine.preload !== 0
  // Hermite rows (hermiteRows) at the current element's two nodes over the coarse [W_A, S_A, W_B, S_B].
  let left = new Float64Array(8)
  let right = new Float64Array(8)
  // Per coarse unknown c: the fine element's strains d₁, d₂ and geometric (s_a, Δw, s_b).
  const d1 = new Float64Array(4)
  const d2 = new Float64Array(4)
  const g1 = new Float64Array(4)
  const g2 = new Float64Array(4)
  const g3 = new Float64Array(4)
  for (let I = 0; I < intervals; I++) {
    const a = picked[I]
    const b = picked[I + 1]
    const span = fx[b] - fx[a]
    const out = FORM_SIZE * I
    hermiteRows(0, span, lf, lc, left)
    for (let e = a; e < b; e++) {
      hermiteRows(e + 1 === b ? 1 : (fx[e + 1] - fx[a]) / span, span, lf, lc, right)
      const h = fx[e + 1] - fx[e]
      const f = FORM_SIZE * fine.formOfInterval[e]
      const hOverScale = h / lf
      for (let c = 0; c < 4; c++) {
        const dw = right[c] - left[c]
        d1[c] = dw - hOverScale * left[4 + c]
        d2[c] = right[4 + c] - left[4 + c]
        g1[c] = left[4 + c]
        g2[c] = dw
        g3[c] = right[4 + c]
      }
      // The coarse form is the coarse element's energy with W_A = S_A = 0: elastic entries over
      // (W_B, S_B), geometric over (S_A, W_B, S_B).
      const k11 = S[f], k12 = S[f + 1], k22 = S[f + 2] // prettier-ignore
      const elastic = (c: number, r: number) => k11 * d1[c] * d1[r] + k12 * (d1[c] * d2[r] + d2[c] * d1[r]) + k22 * d2[c] * d2[r]
      forms[out] += elastic(2, 2)
      forms[out + 1] += elastic(2, 3)
      forms[out + 2] += elastic(3, 3)
      if (withPreload) {
        const p11 = S[f + 3], p12 = S[f + 4], p13 = S[f + 5], p22 = S[f + 6], p23 = S[f + 7], p33 = S[f + 8] // prettier-ignore
        const geometric = (c: number, r: number) =>
          p11 * g1[c] * g1[r] + p22 * g2[c] * g2[r] + p33 * g3[c] * g3[r] + p12 * (g1[c] * g2[r] + g2[c] * g1[r]) + p13 * (g1[c] * g3[r] + g3[c] * g1[r]) + p23 * (g2[c] * g3[r] + g3[c] * g2[r])
        forms[out + 3] += geometric(1, 1)
        forms[out + 4] += geometric(1, 2)
        forms[out + 5] += geometric(1, 3)
        forms[out + 6] += geometric(2, 2)
        forms[out + 7] += geometric(2, 3)
        forms[out + 8] += geometric(3, 3)
      }
      const swap = left
      left = right
      right = swap
    }
  }
  // Grounded terms: each fine (index, weight) pair spreads over that fine unknown's P row.
  const count = fine.groundedStiffness.length
  const groundedIndex = new Int32Array(4 * count).fill(-1)
  const groundedWeight = new Float64Array(4 * count)
  for (let gIndex = 0; gIndex < count; gIndex++) {
    const combined = new Map<number, number>()
    for (let p = 4 * gIndex; p < 4 * gIndex + 4; p++) {
      const f = fine.groundedIndex[p]
      if (f < 0) continue
      for (const { coarse: c, weight } of prolongationRow(map, f)) combined.set(c, (combined.get(c) ?? 0) + fine.groundedWeight[p] * weight)
    }
    let slot = 4 * gIndex
    for (const [c, w] of combined) {
      if (slot >= 4 * gIndex + 4) throw new RangeError('a grounded term spreads over more than four coarse unknowns')
      groundedIndex[slot] = c
      groundedWeight[slot] = w
      slot++
    }
  }
  return {
    layout: coarse,
    index: map.coarseIndex,
    forms,
    formOfInterval: Int32Array.from({ length: intervals }, (_, i) => i),
    preload: fine.preload,
    shearFlexible: fine.shearFlexible,
    groundedStiffness: fine.groundedStiffness,
    groundedIndex,
    groundedWeight,
  }
}

/**
 * out = K x from the forms: each element's strains, its forces (the 2 × 2 and 3 × 3 forms applied
 * to them), spread back to the element's unknowns (the transpose of the strain map); grounded
 * terms k p (pᵀx). The forces come from small strains, so for smooth x the sum is accurate where
 * the assembled K would cancel (used to refine solves, inverse-iteration.ts).
 */
export function beamFormsApply(data: BeamForms, x: Float64Array, out: Float64Array): Float64Array {
  const { layout, index, forms, formOfInterval, preload } = data
  const xs = layout.x
  const scale = layout.rotationScale
  out.fill(0)
  const at = (i: number) => (i >= 0 ? x[i] : 0)
  const add = (i: number, v: number) => {
    if (i >= 0) out[i] += v
  }
  for (let e = 0; e + 1 < xs.length; e++) {
    const h = xs[e + 1] - xs[e]
    const f = FORM_SIZE * formOfInterval[e]
    const ia = 2 * e
    const iwa = index[ia], isa = index[ia + 1], iwb = index[ia + 2], isb = index[ia + 3] // prettier-ignore
    const sa = at(isa)
    const sb = at(isb)
    const dw = at(iwb) - at(iwa)
    const d1 = dw - (h * sa) / scale
    const d2 = sb - sa
    const g1 = forms[f] * d1 + forms[f + 1] * d2
    const g2 = forms[f + 1] * d1 + forms[f + 2] * d2
    add(iwb, g1)
    add(iwa, -g1)
    add(isa, (-h / scale) * g1 - g2)
    add(isb, g2)
    if (preload !== 0) {
      const v1 = forms[f + 3] * sa + forms[f + 4] * dw + forms[f + 5] * sb
      const v2 = forms[f + 4] * sa + forms[f + 6] * dw + forms[f + 7] * sb
      const v3 = forms[f + 5] * sa + forms[f + 7] * dw + forms[f + 8] * sb
      add(isa, preload * v1)
      add(iwb, preload * v2)
      add(iwa, -preload * v2)
      add(isb, preload * v3)
    }
  }
  const { groundedStiffness, groundedIndex, groundedWeight } = data
  for (let g = 0; g < groundedStiffness.length; g++) {
    let p = 0
    for (let q = 4 * g; q < 4 * g + 4; q++) if (groundedIndex[q] >= 0) p += groundedWeight[q] * x[groundedIndex[q]]
    const force = groundedStiffness[g] * p
    for (let q = 4 * g; q < 4 * g + 4; q++) if (groundedIndex[q] >= 0) out[groundedIndex[q]] += groundedWeight[q] * force
  }
  return out
}

/**
 * The stiffness K of the level described by the forms, assembled from them (element by element,
 * K_e = Rᵀ S R + P Qᵀ G Q with R and Q the strain maps, plus the grounded terms), in banded
 * row-sum storage. A Galerkin product PᵀKP formed from the fine level's assembled K would sum
 * entries of size EI/h³ into ones of size EI/H³: r³ times the relative round-off on each
 * coarsening by r. From the forms, each coarse entry is made at its own scale.
 */
export function assembleFromForms(data: BeamForms, order: number): SymmetricBandMatrix {
  const { layout, index, forms, formOfInterval, preload } = data
  const xs = layout.x
  const scale = layout.rotationScale
  const out = createBandMatrix(order, Math.min(3, Math.max(1, order - 1)))
  const element = new Float64Array(16)
  const dofs = new Int32Array(4)
  const addMatrix = (): void => {
    for (let p = 0; p < 4; p++) {
      const i = dofs[p]
      if (i < 0) continue
      let row = 0
      for (let q = 0; q < 4; q++) {
        const j = dofs[q]
        if (j < 0) continue
        const v = element[4 * p + q]
        row += v
        if (j > i) out.offDiagonals[j - i - 1][i] += v
      }
      out.rowSums[i] += row
    }
  }
  for (let e = 0; e + 1 < xs.length; e++) {
    const h = xs[e + 1] - xs[e]
    const f = FORM_SIZE * formOfInterval[e]
    // Strain rows over [w_a, s_a, w_b, s_b]: d1 = w_b − w_a − (h/ℓ) s_a, d2 = s_b − s_a.
    const r1 = [-1, -h / scale, 1, 0]
    const r2 = [0, -1, 0, 1]
    // Geometric rows: (s_a, w_b − w_a, s_b).
    const q1 = [0, 1, 0, 0]
    const q2 = [-1, 0, 1, 0]
    const q3 = [0, 0, 0, 1]
    const S = [forms[f], forms[f + 1], forms[f + 2]]
    const g = [forms[f + 3], forms[f + 4], forms[f + 5], forms[f + 6], forms[f + 7], forms[f + 8]]
    for (let a = 0; a < 4; a++) {
      for (let b = 0; b < 4; b++) {
        let v = S[0] * r1[a] * r1[b] + S[1] * (r1[a] * r2[b] + r2[a] * r1[b]) + S[2] * r2[a] * r2[b]
        if (preload !== 0) {
          v +=
            preload *
            (g[0] * q1[a] * q1[b] +
              g[1] * (q1[a] * q2[b] + q2[a] * q1[b]) +
              g[2] * (q1[a] * q3[b] + q3[a] * q1[b]) +
              g[3] * q2[a] * q2[b] +
              g[4] * (q2[a] * q3[b] + q3[a] * q2[b]) +
              g[5] * q3[a] * q3[b])
        }
        element[4 * a + b] = v
      }
    }
    for (let k = 0; k < 4; k++) dofs[k] = index[2 * e + k]
    addMatrix()
  }
  const { groundedStiffness, groundedIndex, groundedWeight } = data
  for (let t = 0; t < groundedStiffness.length; t++) {
    for (let p = 4 * t; p < 4 * t + 4; p++) {
      const i = groundedIndex[p]
      if (i < 0) continue
      let row = 0
      for (let q = 4 * t; q < 4 * t + 4; q++) {
        const j = groundedIndex[q]
        if (j < 0) continue
        const v = groundedStiffness[t] * groundedWeight[p] * groundedWeight[q]
        row += v
        if (j > i) out.offDiagonals[j - i - 1][i] += v
      }
      out.rowSums[i] += row
    }
  }
  return out
}

/**
 * The matrix G_ij = v_iᵀ K v_j of a few vectors from the forms, in one pass over the elements
 * (the same sums as beamFormsEnergy, each element's strains taken once per vector).
 */
export function beamFormsGram(data: BeamForms, vectors: readonly Float64Array[]): number[][] {
  const { layout, index, forms, formOfInterval, preload } = data
  const xs = layout.x
  const scale = layout.rotationScale
  const m = vectors.length
  const gram = new Float64Array(m * m)
  // Per vector: d₁, d₂ (elastic strains), then s_a, Δw, s_b (geometric) when there is a preload.
  const width = preload !== 0 ? 5 : 2
  const strains = new Float64Array(width * m)
  for (let e = 0; e + 1 < xs.length; e++) {
    const hOverScale = (xs[e + 1] - xs[e]) / scale
    const f = FORM_SIZE * formOfInterval[e]
    const ia = 2 * e
    const iwa = index[ia], isa = index[ia + 1], iwb = index[ia + 2], isb = index[ia + 3] // prettier-ignore
    for (let j = 0; j < m; j++) {
      const v = vectors[j]
      const sa = isa >= 0 ? v[isa] : 0
      const sb = isb >= 0 ? v[isb] : 0
      const dw = (iwb >= 0 ? v[iwb] : 0) - (iwa >= 0 ? v[iwa] : 0)
      const at = width * j
      strains[at] = dw - hOverScale * sa
      strains[at + 1] = sb - sa
      if (width === 5) {
        strains[at + 2] = sa
        strains[at + 3] = dw
        strains[at + 4] = sb
      }
    }
    const k11 = forms[f], k12 = forms[f + 1], k22 = forms[f + 2] // prettier-ignore
    for (let i = 0; i < m; i++) {
      const x1 = strains[width * i], x2 = strains[width * i + 1] // prettier-ignore
      // The form applied to vector i's strains, then dotted with each vector j ≥ i.
      const g1 = k11 * x1 + k12 * x2
      const g2 = k12 * x1 + k22 * x2
      const row = i * m
      if (width === 2) {
        for (let j = i; j < m; j++) gram[row + j] += g1 * strains[2 * j] + g2 * strains[2 * j + 1]
        continue
      }
      const sa = strains[5 * i + 2], dw = strains[5 * i + 3], sb = strains[5 * i + 4] // prettier-ignore
      const p1 = preload * (forms[f + 3] * sa + forms[f + 4] * dw + forms[f + 5] * sb)
      const p2 = preload * (forms[f + 4] * sa + forms[f + 6] * dw + forms[f + 7] * sb)
      const p3 = preload * (forms[f + 5] * sa + forms[f + 7] * dw + forms[f + 8] * sb)
      for (let j = i; j < m; j++) {
        gram[row + j] += g1 * strains[5 * j] + g2 * strains[5 * j + 1] + p1 * strains[5 * j + 2] + p2 * strains[5 * j + 3] + p3 * strains[5 * j + 4]
      }
    }
  }
  const { groundedStiffness, groundedIndex, groundedWeight } = data
  const projections = new Float64Array(m)
  for (let g = 0; g < groundedStiffness.length; g++) {
    for (let j = 0; j < m; j++) {
      let p = 0
      for (let q = 4 * g; q < 4 * g + 4; q++) if (groundedIndex[q] >= 0) p += groundedWeight[q] * vectors[j][groundedIndex[q]]
      projections[j] = p
    }
    for (let i = 0; i < m; i++) for (let j = i; j < m; j++) gram[i * m + j] += groundedStiffness[g] * projections[i] * projections[j]
  }
  const out: number[][] = []
  for (let i = 0; i < m; i++) {
    const row: number[] = []
    for (let j = 0; j < m; j++) row.push(i <= j ? gram[i * m + j] : gram[j * m + i])
    out.push(row)
  }
  return out
}
