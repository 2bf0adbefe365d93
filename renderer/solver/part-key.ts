/**
 * What a design-guidance result depends on, as text to compare: the part itself (the motions
 * analysed, materials, segments, ends, preload, attachments, mesh and mode count), without the
 * excitations, margin, damping, title or display units. A result keyed so stays valid while only
 * those change.
 */
import type { Project } from '../../core/model/project'

export function partKey(project: Project): string {
  const { motions, materials, segments, ends, preload, masses, springs, analysis } = project
  return JSON.stringify({ motions, materials, segments, ends, preload: preload ?? 0, masses, springs, analysis })
}

/** The part and its tolerances: what a tolerance scatter depends on. */
export function scatterKey(project: Project): string {
  return JSON.stringify([partKey(project), project.tolerances ?? {}])
}
