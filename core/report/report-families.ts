/**
 * The words and units the report uses for each motion family: its name, the quantities of its
 * mode shapes, its effective mass (kg for support motion along the axis or sideways, kg·m² of
 * effective polar inertia for support rotation about the axis), its reference method.
 */
import type { FamilyAnalysis } from '../analysis/modal-analysis'
import type { Family, FamilyKey } from '../model/families'
import { familyName } from '../model/families'
import type { BendingEndCondition, EndCondition, Motion, Project } from '../model/project'
import type { QuantityKind } from '../model/units'
import { capitalise } from '../charts/chart-families'

export { capitalise }

/** "Axial", "Torsion", "Bending (weak plane)". */
export function familyTitle(family: Pick<Family, 'motion' | 'plane'>): string {
  return capitalise(familyName(family))
}

/** The id of a family's section in the report: "family-bending-weak". */
export function familySectionId(key: FamilyKey): string {
  return `family-${key}`
}

/** Words for a list: "a", "a and b", "a, b and c". */
export function listWords(items: readonly string[]): string {
  if (items.length <= 1) return items.join('')
  return `${items.slice(0, -1).join(', ')} and ${items[items.length - 1]}`
}

/**
 * The families of an analysis in words: "axial", "torsion and bending (weak and strong planes)".
 */
export function familiesWords(families: readonly Pick<Family, 'motion' | 'plane'>[]): string {
  const words: string[] = []
  for (const motion of ['axial', 'torsion', 'bending'] as const) {
    const own = families.filter((f) => f.motion === motion)
    if (!own.length) continue
    const planes = own.map((f) => f.plane).filter((p): p is NonNullable<typeof p> => p !== null)
    words.push(planes.length ? `${motion} (${listWords(planes)} plane${planes.length > 1 ? 's' : ''})` : motion)
  }
  return listWords(words)
}

/** How a family's effective mass is named and measured. */
export interface EffectiveMassWords {
  readonly header: string
  readonly kind: QuantityKind
}

export function effectiveMassWords(motion: Motion): EffectiveMassWords {
  return motion === 'torsion' ? { header: 'Effective polar inertia', kind: 'massInertia' } : { header: 'Effective mass', kind: 'mass' }
}

/** The reference column's name: "Exact", or "Extrapolated" for a Richardson estimate. */
export function referenceHeader(method: FamilyAnalysis['reference']['method']): string {
  return method === 'extrapolated' ? 'Extrapolated' : 'Exact'
}

/** The reference method of a family in words, for tables and the verdict. */
export function referenceMethodWords(method: FamilyAnalysis['reference']['method']): string {
  if (method === 'exact') return 'exact'
  if (method === 'extrapolated') return 'extrapolated (Richardson estimate from two fine meshes)'
  return 'none'
}

const AXIAL_END: Record<EndCondition, string> = { fixed: 'fixed (no axial displacement)', free: 'free' }
const TORSION_END: Record<EndCondition, string> = { fixed: 'fixed (no twist)', free: 'free' }
const BENDING_END: Record<BendingEndCondition, string> = {
  clamped: 'clamped (no deflection, no slope)',
  pinned: 'pinned (no deflection, free slope)',
  guided: 'guided (no slope, free to slide sideways)',
  free: 'free',
}

/** An end's condition in a family, in words. */
export function endWords(project: Project, which: 'start' | 'end', motion: Motion): string {
  const end = project.ends[which]
  if (motion === 'torsion') return TORSION_END[end.torsion]
  if (motion === 'bending') return BENDING_END[end.bending]
  return AXIAL_END[end.axial]
}

/** The governing equation a family's exact reference solves, for the checks text. */
export function governingEquation(motion: Motion): string {
  if (motion === 'torsion') return '(GJ θ′)′ + ρI<sub>p</sub>ω² θ = 0'
  if (motion === 'bending') return '(EI w″)″ − (P w′)′ = ρAω² w'
  return '(EA u′)′ + ρAω² u = 0'
}
