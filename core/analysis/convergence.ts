/**
 * Mesh convergence: frequencies against mesh density for each mass matrix and element
 * order, the error against the exact reference, and the observed order of convergence
 * p = log(e_coarse / e_fine) / log(h_coarse / h_fine) between successive meshes.
 * Richardson extrapolation from the three finest meshes, f* = f₁ + (f₁ − f₂)/(r^p − 1)
 * with p from the same three (L. F. Richardson, Phil. Trans. R. Soc. A 210 (1911);
 * any numerical-analysis text, from memory), estimates the limit where no exact
 * solution is known and serves as a check where one is.
 */
import type { ElementOrder, MassMatrixKind, Project } from '../model/project'
import { familyReference } from '../exact/family-reference'
import { analysedFamilies, type Family, type FamilyKey } from '../model/families'
import { analyseFamily, effectiveSettings } from './modal-analysis'

export interface ConvergencePoint {
  readonly elementsPerSegment: number
  readonly dofs: number
  readonly frequenciesHz: number[]
  /** (f − f_ref)/f_ref per mode, null without a reference. */
  readonly errors: (number | null)[]
}

export interface ConvergenceSeries {
  readonly elementOrder: ElementOrder
  readonly mass: MassMatrixKind
  readonly points: ConvergencePoint[]
  /** Observed order per mode from the finest pair of meshes in the asymptotic range (above round-off, agreeing with the next coarser pair). */
  readonly observedOrder: (number | null)[]
  /** Richardson estimate of the limit per mode from the three finest meshes. */
  readonly extrapolatedHz: (number | null)[]
}

export interface ConvergenceStudy {
  /** The family studied. */
  readonly family: Family
  readonly modes: number
  readonly referenceHz: number[]
  readonly referenceMethod: 'exact' | 'extrapolated' | null
  readonly series: ConvergenceSeries[]
}

export interface ConvergenceOptions {
  readonly modes?: number
  /** Mesh densities, elements per segment (default 1, 2, 4, … 1024). */
  readonly densities?: readonly number[]
  readonly orders?: readonly ElementOrder[]
  readonly masses?: readonly MassMatrixKind[]
  /** Meshes with more unknowns than this are skipped (default 200 000). */
  readonly maxDofs?: number
  /** Called after each solve with the fraction done; return false to stop early. */
  readonly onProgress?: (fraction: number) => boolean | void
  /** The family studied (default: the project's first). Bending has one element (Hermite cubics), so `orders` does not apply to it. */
  readonly family?: FamilyKey
}

/** Relative errors below this are round-off, not discretisation error. */
const ROUND_OFF = 1e-12

export const DEFAULT_DENSITIES = [1, 2, 4, 8, 16, 32, 64, 128, 256, 512, 1024]

export function convergenceStudy(project: Project, options: ConvergenceOptions = {}): ConvergenceStudy {
  const modes = options.modes ?? project.analysis.modes
  const densities = options.densities ?? DEFAULT_DENSITIES
  const families = analysedFamilies(project)
  const family = families.find((f) => f.key === options.family) ?? families[0]
  if (!family) throw new RangeError(`the project does not analyse ${options.family ?? 'any motion'}`)
  const bending = family.motion === 'bending'
  const orders: readonly ElementOrder[] = bending ? [1] : (options.orders ?? [1, 2])
  const masses = options.masses ?? ['consistent', 'lumped', 'mixed']
  const maxDofs = options.maxDofs ?? 200_000
  const reference = familyReference(project, family, effectiveSettings(project, { modes }), modes)
  const series: ConvergenceSeries[] = []
  const total = orders.length * masses.length * densities.length
  let done = 0
  let stopped = false
  for (const elementOrder of orders) {
    for (const mass of masses) {
      const points: ConvergencePoint[] = []
      for (const elementsPerSegment of densities) {
        done++
        if (stopped) continue
        const estimate = (project.segments.length * elementsPerSegment + project.masses.length + project.springs.length) * (bending ? 2 : elementOrder)
        if (estimate > maxDofs) continue
        const settings = effectiveSettings(project, { elementOrder, mass, elementsPerSegment, modes })
        const analysis = analyseFamily(project, family, settings, { withReference: false })
        const frequenciesHz = analysis.modes.map((m) => m.frequencyHz)
        const errors = frequenciesHz.map((f, i) => {
          const ref = reference.frequenciesHz[i]
          if (ref === undefined || reference.method === null) return null
          return ref === 0 ? (f === 0 ? 0 : null) : (f - ref) / ref
        })
        points.push({ elementsPerSegment, dofs: analysis.model.dofNodes.length, frequenciesHz, errors })
        if (options.onProgress?.(done / total) === false) stopped = true
      }
      series.push({ elementOrder, mass, points, observedOrder: observedOrders(points, modes), extrapolatedHz: richardson(points, modes) })
    }
  }
  return { family, modes, referenceHz: reference.frequenciesHz, referenceMethod: reference.method, series }
}

/** Two successive pairs of meshes whose orders differ by no more than this are in the asymptotic range. */
const ORDER_AGREEMENT = 0.2

/**
 * The order from the finest pair of meshes in the asymptotic range: both errors above round-off
 * and the order agreeing with the next coarser pair's. Round-off that grows as the mesh refines
 * (Hermite cubic stiffness scales as 1/h³) bends the error curve back up or flattens it; those
 * pairs disagree with their coarser neighbour and are passed over. Without two agreeing pairs,
 * the finest pair above round-off.
 */
function observedOrders(points: ConvergencePoint[], modes: number): (number | null)[] {
  const out: (number | null)[] = []
  for (let m = 0; m < modes; m++) {
    // Local order of each pair (points i − 1, i); null where an error is missing or round-off.
    const local: (number | null)[] = [null]
    for (let i = 1; i < points.length; i++) {
      const coarse = points[i - 1].errors[m]
      const fine = points[i].errors[m]
      const usable = typeof coarse === 'number' && typeof fine === 'number' && Math.abs(fine) >= ROUND_OFF && Math.abs(coarse) >= ROUND_OFF
      local.push(usable ? Math.log(Math.abs(coarse) / Math.abs(fine)) / Math.log(points[i].elementsPerSegment / points[i - 1].elementsPerSegment) : null)
    }
    let order: number | null = null
    for (let i = local.length - 1; i >= 2 && order === null; i--) {
      const [p, q] = [local[i], local[i - 1]]
      if (p !== null && q !== null && Math.abs(p - q) <= ORDER_AGREEMENT) order = p
    }
    for (let i = local.length - 1; i >= 1 && order === null; i--) order = local[i]
    out.push(order)
  }
  return out
}

function richardson(points: ConvergencePoint[], modes: number): (number | null)[] {
  const out: (number | null)[] = []
  const n = points.length
  for (let m = 0; m < modes; m++) {
    if (n < 3) {
      out.push(null)
      continue
    }
    const f3 = points[n - 3].frequenciesHz[m]
    const f2 = points[n - 2].frequenciesHz[m]
    const f1 = points[n - 1].frequenciesHz[m]
    const r = points[n - 1].elementsPerSegment / points[n - 2].elementsPerSegment
    const d21 = f2 - f1
    const d32 = f3 - f2
    if (f1 === undefined || !(Math.abs(d21) > 0) || !(Math.abs(d32) > 0) || d21 * d32 < 0) {
      out.push(f1 ?? null)
      continue
    }
    const p = Math.log(d32 / d21) / Math.log(r)
    out.push(f1 + (f1 - f2) / (r ** p - 1))
  }
  return out
}
