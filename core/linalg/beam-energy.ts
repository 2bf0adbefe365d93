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
import { beamDofIndex, type BeamCoarsening, type BeamLayout } from './beam-coarsening'

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
  const cx = coarse.x
  const lf = fine.layout.rotationScale
  const lc = coarse.rotationScale
  const intervals = cx.length - 1
  const forms = new Float64Array(FORM_SIZE * intervals)
  // Fine node of each coarse node (coarse nodes are fine nodes).
  let fineNode = 0
  for (let I = 0; I < intervals; I++) {
    while (fx[fineNode] < cx[I]) fineNode++
    const a = fineNode
    let b = a
    while (fx[b] < cx[I + 1]) b++
    const span = cx[I + 1] - cx[I]
    // Hermite rows over the coarse interval's [W_A, S_A, W_B, S_B], at fine node i: w and s.
    const rows = (i: number): [number[], number[]] => {
      const t = (fx[i] - cx[I]) / span
      const t2 = t * t
      const t3 = t2 * t
      return [
        [2 * t3 - 3 * t2 + 1, ((t3 - 2 * t2 + t) * span) / lc, -2 * t3 + 3 * t2, ((t3 - t2) * span) / lc],
        [((6 * t2 - 6 * t) * lf) / span, ((3 * t2 - 4 * t + 1) * lf) / lc, ((-6 * t2 + 6 * t) * lf) / span, ((3 * t2 - 2 * t) * lf) / lc],
      ]
    }
    const out = FORM_SIZE * I
    let [wa, sa] = rows(a)
    for (let e = a; e < b; e++) {
      const [wb, sb] = rows(e + 1)
      const h = fx[e + 1] - fx[e]
      const f = FORM_SIZE * fine.formOfInterval[e]
      const S = fine.forms
      // Strains of the fine element per coarse unknown W_B (column 2) and S_B (column 3): the
      // coarse form is the coarse element's energy with W_A = S_A = 0.
      for (let c = 2; c < 4; c++) {
        const d1c = wb[c] - wa[c] - (h * sa[c]) / lf
        const d2c = sb[c] - sa[c]
        for (let r = c; r < 4; r++) {
          const d1r = wb[r] - wa[r] - (h * sa[r]) / lf
          const d2r = sb[r] - sa[r]
          const v = S[f] * d1c * d1r + S[f + 1] * (d1c * d2r + d2c * d1r) + S[f + 2] * d2c * d2r
          // (2,2) → 0, (2,3) → 1, (3,3) → 2
          forms[out + c + r - 4] += v
        }
      }
      // Geometric: fine (s_a, Δw, s_b) per coarse S_A, W_B, S_B (columns 1, 2, 3), with W_A = 0.
      const g = (c: number) => [sa[c], wb[c] - wa[c], sb[c]]
      const slot = [3, 4, 5, 6, 7, 8]
      let k = 0
      for (let c = 1; c < 4; c++) {
        for (let r = c; r < 4; r++) {
          const gc = g(c)
          const gr = g(r)
          let v = 0
          v += S[f + 3] * gc[0] * gr[0] + S[f + 6] * gc[1] * gr[1] + S[f + 8] * gc[2] * gr[2]
          v += S[f + 4] * (gc[0] * gr[1] + gc[1] * gr[0]) + S[f + 5] * (gc[0] * gr[2] + gc[2] * gr[0]) + S[f + 7] * (gc[1] * gr[2] + gc[2] * gr[1])
          forms[out + slot[k++]] += v
        }
      }
      wa = wb
      sa = sb
    }
    fineNode = b
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
      for (let q = 4 * f; q < 4 * f + 4; q++) {
        const c = map.columns[q]
        if (c < 0) break
        combined.set(c, (combined.get(c) ?? 0) + fine.groundedWeight[p] * map.weights[q])
      }
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
    index: beamDofIndex(coarse),
    forms,
    formOfInterval: Int32Array.from({ length: intervals }, (_, i) => i),
    preload: fine.preload,
    groundedStiffness: fine.groundedStiffness,
    groundedIndex,
    groundedWeight,
  }
}
