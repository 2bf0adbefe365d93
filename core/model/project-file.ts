/**
 * Writing a project file: a Project → JSON text in the version-2 layout, every number
 * in SI, keys in the documented order, two-space indentation. Reading is in project-schema.ts.
 */
import { FORMAT_NAME, FORMAT_VERSION, partEnd, type Project } from './project'

export function writeProjectText(project: Project): string {
  const doc: Record<string, unknown> = {
    format: FORMAT_NAME,
    version: FORMAT_VERSION,
    ...(project.title !== undefined ? { title: project.title } : {}),
    units: project.units,
    motions: project.motions,
    materials: project.materials,
    segments: project.segments,
    ends: project.ends,
    ...(project.preload !== undefined ? { preload: project.preload } : {}),
    masses: project.masses,
    springs: project.springs,
    analysis: project.analysis,
    excitations: project.excitations,
    margin: project.margin,
    damping: project.damping,
    ...(project.tolerances ? { tolerances: project.tolerances } : {}),
  }
  return `${JSON.stringify(doc, null, 2)}\n`
}

/** A plain starting point for "New": one steel bar, fixed (clamped) at the start, free at the end. */
export function newProject(): Project {
  return {
    format: FORMAT_NAME,
    version: FORMAT_VERSION,
    title: 'New part',
    units: 'SI',
    motions: ['axial'],
    materials: [],
    segments: [{ length: 1, material: 'carbon-steel', section: { shape: 'solid', diameter: 0.025 } }],
    ends: { start: partEnd('fixed', 'fixed', 'clamped'), end: partEnd('free') },
    masses: [],
    springs: [],
    analysis: { elementOrder: 1, elementsPerSegment: 40, mass: 'consistent', modes: 6 },
    excitations: [],
    margin: 0.15,
    damping: 0.02,
  }
}
