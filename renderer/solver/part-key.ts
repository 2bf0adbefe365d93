/**
 * What a design-guidance result depends on, as text to compare: the part itself (materials,
 * segments, ends, attachments, mesh and mode count), without the excitations, margin, damping,
 * title or display units. A result keyed so stays valid while only those change.
 */
import type { Project } from '../../core/model/project'

export function partKey(project: Project): string {
  const { materials, segments, ends, masses, springs, analysis } = project
  return JSON.stringify({ materials, segments, ends, masses, springs, analysis })
}

/** The part and its tolerances: what a tolerance scatter depends on. */
export function scatterKey(project: Project): string {
  return JSON.stringify([partKey(project), project.tolerances ?? {}])
}
