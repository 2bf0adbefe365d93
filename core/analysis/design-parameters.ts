/**
 * The parameters an engineer can change to move a natural frequency, named by their JSON
 * path in the project file: segment lengths and section dimensions (and the constants an
 * `area` section gives), each material's Young's modulus and density (and, where torsion or
 * shear deformation is analysed, its shear modulus or Poisson's ratio), point masses and their
 * inertias, spring stiffnesses, and the preload. Only parameters that act on an analysed
 * motion are listed. A built-in library material has no entry in the file; its path is
 * `library["id"].youngsModulus`, and changing it adds a project material of that id
 * (project materials take precedence).
 *
 * When a segment's length changes, attachments beyond it move with the bar's end and
 * attachments inside it keep their fraction of the segment (project-file format rule).
 */
import { resolveMaterial, segmentBoundaries } from '../model/geometry'
import { springMotion, type Material, type Motion, type Project, type Section } from '../model/project'
import type { QuantityKind } from '../model/units'

export type ParameterTarget =
  | { readonly kind: 'segmentLength'; readonly segment: number }
  | { readonly kind: 'sectionDimension'; readonly segment: number; readonly dimension: string }
  | { readonly kind: 'youngsModulus'; readonly material: string }
  | { readonly kind: 'density'; readonly material: string }
  | { readonly kind: 'poissonRatio'; readonly material: string }
  | { readonly kind: 'shearModulus'; readonly material: string }
  | { readonly kind: 'mass'; readonly index: number }
  | { readonly kind: 'polarInertia'; readonly index: number }
  | { readonly kind: 'transverseInertia'; readonly index: number }
  | { readonly kind: 'stiffness'; readonly index: number }
  | { readonly kind: 'rotationalStiffness'; readonly index: number }
  | { readonly kind: 'preload' }

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
  secondMoment: 'second moment',
  secondMomentStrong: 'strong-axis second moment',
  torsionConstant: 'torsion constant',
  polarMoment: 'polar moment',
}

/** The constants an `area` section may give, and the motion each serves. */
const AREA_CONSTANTS: [string, Motion][] = [
  ['secondMoment', 'bending'],
  ['secondMomentStrong', 'bending'],
  ['torsionConstant', 'torsion'],
  ['polarMoment', 'torsion'],
]

export function sectionDimensions(section: Section, motions: readonly Motion[] = ['axial', 'torsion', 'bending']): string[] {
  // A solid tube (bore 0) has no bore to change.
  const own = SECTION_DIMENSIONS[section.shape].filter((d) => !(section.shape === 'tube' && d === 'innerDiameter' && section.innerDiameter === 0))
  if (section.shape !== 'area') return own
  const given = AREA_CONSTANTS.filter(([key, motion]) => motions.includes(motion) && (section as Record<string, unknown>)[key] !== undefined).map(([key]) => key)
  // The area itself acts on axial motion and bending.
  return [...(motions.includes('axial') || motions.includes('bending') ? own : []), ...given]
}

function materialPath(project: Project, id: string): string {
  const index = project.materials.findIndex((m) => m.id === id)
  return index >= 0 ? `materials[${index}]` : `library[${JSON.stringify(id)}]`
}

const SECTION_QUANTITY: Record<string, QuantityKind> = {
  area: 'area',
  secondMoment: 'secondMoment',
  secondMomentStrong: 'secondMoment',
  torsionConstant: 'secondMoment',
  polarMoment: 'secondMoment',
}

/** Every parameter of the project that acts on one of `motions` (default: the project's), in file order. */
export function designParameters(project: Project, motions: readonly Motion[] = project.motions): DesignParameter[] {
  const out: DesignParameter[] = []
  const has = (m: Motion) => motions.includes(m)
  project.segments.forEach((segment, i) => {
    out.push({ path: `segments[${i}].length`, label: `length of segment ${i + 1}`, quantity: 'length', value: segment.length, target: { kind: 'segmentLength', segment: i } })
    for (const dimension of sectionDimensions(segment.section, motions)) {
      out.push({
        path: `segments[${i}].section.${dimension}`,
        label: `${DIMENSION_WORDS[dimension]} of segment ${i + 1}`,
        quantity: SECTION_QUANTITY[dimension] ?? 'sectionDimension',
        value: (segment.section as unknown as Record<string, number>)[dimension],
        target: { kind: 'sectionDimension', segment: i, dimension },
      })
    }
  })
  const used = [...new Set(project.segments.map((s) => s.material))]
  const shear = has('torsion') || (has('bending') && project.analysis.bendingTheory === 'timoshenko')
  for (const id of used) {
    const material = resolveMaterial(project, id) as Material
    const path = materialPath(project, id)
    const name = material.name ?? id
    out.push({ path: `${path}.youngsModulus`, label: `Young's modulus of ${name}`, quantity: 'modulus', value: material.youngsModulus, target: { kind: 'youngsModulus', material: id } })
    out.push({ path: `${path}.density`, label: `density of ${name}`, quantity: 'density', value: material.density, target: { kind: 'density', material: id } })
    if (shear && material.shearModulus !== undefined) {
      out.push({ path: `${path}.shearModulus`, label: `shear modulus of ${name}`, quantity: 'modulus', value: material.shearModulus, target: { kind: 'shearModulus', material: id } })
    } else if (shear && material.poissonRatio !== undefined) {
      out.push({ path: `${path}.poissonRatio`, label: `Poisson's ratio of ${name}`, quantity: 'ratio', value: material.poissonRatio, target: { kind: 'poissonRatio', material: id } })
    }
  }
  const name = (m: { label?: string }, i: number) => (m.label ? `“${m.label}”` : String(i + 1))
  project.masses.forEach((m, i) => {
    if (has('axial') || has('bending')) out.push({ path: `masses[${i}].mass`, label: `mass ${name(m, i)}`, quantity: 'mass', value: m.mass, target: { kind: 'mass', index: i } })
    if (has('torsion') && (m.polarInertia ?? 0) > 0) {
      out.push({ path: `masses[${i}].polarInertia`, label: `polar inertia of mass ${name(m, i)}`, quantity: 'massInertia', value: m.polarInertia as number, target: { kind: 'polarInertia', index: i } })
    }
    if (has('bending') && (m.transverseInertia ?? 0) > 0) {
      out.push({
        path: `masses[${i}].transverseInertia`,
        label: `transverse inertia of mass ${name(m, i)}`,
        quantity: 'massInertia',
        value: m.transverseInertia as number,
        target: { kind: 'transverseInertia', index: i },
      })
    }
  })
  project.springs.forEach((s, i) => {
    const motion = springMotion(s)
    if (!has(motion)) return
    if (s.stiffness > 0) {
      out.push({
        path: `springs[${i}].stiffness`,
        label: `stiffness of spring ${name(s, i)}`,
        quantity: motion === 'torsion' ? 'rotationalStiffness' : 'stiffness',
        value: s.stiffness,
        target: { kind: 'stiffness', index: i },
      })
    }
    if (motion === 'bending' && (s.rotationalStiffness ?? 0) > 0) {
      out.push({
        path: `springs[${i}].rotationalStiffness`,
        label: `rotational stiffness of spring ${name(s, i)}`,
        quantity: 'rotationalStiffness',
        value: s.rotationalStiffness as number,
        target: { kind: 'rotationalStiffness', index: i },
      })
    }
  })
  if (has('bending') && (project.preload ?? 0) !== 0) {
    out.push({ path: 'preload', label: 'preload', quantity: 'force', value: project.preload as number, target: { kind: 'preload' } })
  }
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
    case 'poissonRatio':
    case 'shearModulus':
      return withMaterialValue(project, target.material, target.kind, value)
    case 'mass':
    case 'polarInertia':
    case 'transverseInertia': {
      const field = target.kind
      return { ...project, masses: project.masses.map((m, i) => (i === target.index ? { ...m, [field]: value } : m)) }
    }
    case 'stiffness':
    case 'rotationalStiffness': {
      const field = target.kind
      return { ...project, springs: project.springs.map((s, i) => (i === target.index ? { ...s, [field]: value } : s)) }
    }
    case 'preload':
      return { ...project, preload: value }
  }
}

function withMaterialValue(project: Project, id: string, field: 'youngsModulus' | 'density' | 'poissonRatio' | 'shearModulus', value: number): Project {
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
