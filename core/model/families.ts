/**
 * The motion families of a project as Rodwave analyses and reports them: axial, torsion, and
 * bending — in two principal planes ("weak", "strong") when a section of the part has two
 * different principal second moments (the planes are taken as aligned along the part).
 */
import type { Motion, Project } from './project'
import { MOTIONS } from './project'
import { hasTwoBendingPlanes } from './section-properties'

export type BendingPlane = 'weak' | 'strong'
/** The key of a family in reports: "axial", "torsion", "bending", or "bending-weak"/"bending-strong". */
export type FamilyKey = 'axial' | 'torsion' | 'bending' | 'bending-weak' | 'bending-strong'

export interface Family {
  readonly key: FamilyKey
  readonly motion: Motion
  readonly plane: BendingPlane | null
}

export function familyOf(motion: Motion, plane: BendingPlane | null = null): Family {
  const key: FamilyKey = motion === 'bending' && plane ? `bending-${plane}` : motion
  return { key, motion, plane: motion === 'bending' ? plane : null }
}

/** Whether the part bends in two principal planes (some section has two different second moments). */
export function bendsInTwoPlanes(project: Pick<Project, 'segments'>): boolean {
  return project.segments.some((s) => hasTwoBendingPlanes(s.section))
}

/** The families a project asks for, in the order they are reported. */
export function analysedFamilies(project: Pick<Project, 'motions' | 'segments'>): Family[] {
  const out: Family[] = []
  for (const motion of MOTIONS) {
    if (!project.motions.includes(motion)) continue
    if (motion === 'bending' && bendsInTwoPlanes(project)) out.push(familyOf('bending', 'weak'), familyOf('bending', 'strong'))
    else out.push(familyOf(motion))
  }
  return out
}

/** Words for a family: "axial", "torsion", "bending", "bending (weak plane)". */
export function familyName(family: Pick<Family, 'motion' | 'plane'>): string {
  return family.plane ? `${family.motion} (${family.plane} plane)` : family.motion
}
