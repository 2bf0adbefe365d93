/**
 * The parameters an engineer can change to move a natural frequency, named by their JSON
 * path in the project file: segment lengths and section dimensions, each material's
 * Young's modulus and density, point masses and spring stiffnesses. A built-in library
 * material has no entry in the file; its path is `library["id"].youngsModulus`, and
 * changing it adds a project material of that id (project materials take precedence).
 *
 * When a segment's length changes, attachments beyond it move with the bar's end and
 * attachments inside it keep their fraction of the segment (project-file format rule).
 */
import { resolveMaterial, segmentBoundaries } from '../model/geometry'
import type { Material, Project, Section } from '../model/project'
import type { QuantityKind } from '../model/units'

export type ParameterTarget =
  | { readonly kind: 'segmentLength'; readonly segment: number }
  | { readonly kind: 'sectionDimension'; readonly segment: number; readonly dimension: string }
  | { readonly kind: 'youngsModulus'; readonly material: string }
  | { readonly kind: 'density'; readonly material: string }
  | { readonly kind: 'mass'; readonly index: number }
  | { readonly kind: 'stiffness'; readonly index: number }

export interface DesignParameter {
  /** JSON path in the project file, e.g. "segments[0].length". */
  readonly path: string
  /** Plain words for tables: "length of segment 1". */
  readonly label: string
  readonly quantity: QuantityKind
  readonly value: number
  readonly target: ParameterTarget
}

const SECTION_DIMENSIONS: Record<Section['shape'], string[]> = {
  solid: ['diameter'],
  tube: ['outerDiameter', 'innerDiameter'],
  rectangle: ['width', 'height'],
  area: ['area'],
  cone: ['startDiameter', 'endDiameter'],
}

const DIMENSION_WORDS: Record<string, string> = {
  diameter: 'diameter',
  outerDiameter: 'outer diameter',
  innerDiameter: 'bore',
  width: 'width',
  height: 'height',
  area: 'area',
  startDiameter: 'start diameter',
  endDiameter: 'end diameter',
}

export function sectionDimensions(section: Section): string[] {
  // A solid tube (bore 0) has no bore to change.
  return SECTION_DIMENSIONS[section.shape].filter((d) => !(section.shape === 'tube' && d === 'innerDiameter' && section.innerDiameter === 0))
}

function materialPath(project: Project, id: string): string {
  const index = project.materials.findIndex((m) => m.id === id)
  return index >= 0 ? `materials[${index}]` : `library[${JSON.stringify(id)}]`
}

/** Every parameter of the project, in file order. */
export function designParameters(project: Project): DesignParameter[] {
  const out: DesignParameter[] = []
  project.segments.forEach((segment, i) => {
    out.push({ path: `segments[${i}].length`, label: `length of segment ${i + 1}`, quantity: 'length', value: segment.length, target: { kind: 'segmentLength', segment: i } })
    for (const dimension of sectionDimensions(segment.section)) {
      out.push({
        path: `segments[${i}].section.${dimension}`,
        label: `${DIMENSION_WORDS[dimension]} of segment ${i + 1}`,
        quantity: dimension === 'area' ? 'area' : 'sectionDimension',
        value: (segment.section as unknown as Record<string, number>)[dimension],
        target: { kind: 'sectionDimension', segment: i, dimension },
      })
    }
  })
  const used = [...new Set(project.segments.map((s) => s.material))]
  for (const id of used) {
    const material = resolveMaterial(project, id) as Material
    const path = materialPath(project, id)
    const name = material.name ?? id
    out.push({ path: `${path}.youngsModulus`, label: `Young's modulus of ${name}`, quantity: 'modulus', value: material.youngsModulus, target: { kind: 'youngsModulus', material: id } })
    out.push({ path: `${path}.density`, label: `density of ${name}`, quantity: 'density', value: material.density, target: { kind: 'density', material: id } })
  }
  project.masses.forEach((m, i) =>
    out.push({ path: `masses[${i}].mass`, label: `mass ${m.label ? `“${m.label}”` : i + 1}`, quantity: 'mass', value: m.mass, target: { kind: 'mass', index: i } }),
  )
  project.springs.forEach((s, i) =>
    out.push({
      path: `springs[${i}].stiffness`,
      label: `stiffness of spring ${s.label ? `“${s.label}”` : i + 1}`,
      quantity: 'stiffness',
      value: s.stiffness,
      target: { kind: 'stiffness', index: i },
    }),
  )
  return out
}

export function findParameter(project: Project, path: string): DesignParameter | undefined {
  return designParameters(project).find((p) => p.path === path)
}

/** A copy of the project with one parameter set to a new value. */
export function withParameter(project: Project, target: ParameterTarget, value: number): Project {
  switch (target.kind) {
    case 'segmentLength':
      return withSegmentLength(project, target.segment, value)
    case 'sectionDimension':
      return {
        ...project,
        segments: project.segments.map((s, i) => (i === target.segment ? { ...s, section: { ...s.section, [target.dimension]: value } as Section } : s)),
      }
    case 'youngsModulus':
    case 'density':
      return withMaterialValue(project, target.material, target.kind, value)
    case 'mass':
      return { ...project, masses: project.masses.map((m, i) => (i === target.index ? { ...m, mass: value } : m)) }
    case 'stiffness':
      return { ...project, springs: project.springs.map((s, i) => (i === target.index ? { ...s, stiffness: value } : s)) }
  }
}

function withMaterialValue(project: Project, id: string, field: 'youngsModulus' | 'density', value: number): Project {
  const index = project.materials.findIndex((m) => m.id === id)
  if (index >= 0) return { ...project, materials: project.materials.map((m, i) => (i === index ? { ...m, [field]: value } : m)) }
  const library = resolveMaterial({ materials: [] }, id) as Material
  return { ...project, materials: [...project.materials, { ...library, [field]: value }] }
}

/** Changes one segment's length, moving attachments by the file format's rule. */
export function withSegmentLength(project: Project, segment: number, length: number): Project {
  const bounds = segmentBoundaries(project.segments)
  const start = bounds[segment]
  const oldLength = project.segments[segment].length
  const end = bounds[segment + 1]
  const move = (at: number): number => {
    if (at > end) return at + (length - oldLength)
    if (at > start) return start + ((at - start) / oldLength) * length
    return at
  }
  return {
    ...project,
    segments: project.segments.map((s, i) => (i === segment ? { ...s, length } : s)),
    masses: project.masses.map((m) => ({ ...m, at: move(m.at) })),
    springs: project.springs.map((s) => ({ ...s, at: move(s.at) })),
  }
}
