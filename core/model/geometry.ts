/** Section areas, positions along the bar, masses: plain geometry of a project. */
import type { Material, Project, Section, Segment } from './project'
import { libraryMaterial } from './materials'

/** Cross-section area at fraction t ∈ [0, 1] along a segment (a cone's area is quadratic in t). */
export function sectionArea(section: Section, t = 0): number {
  switch (section.shape) {
    case 'solid':
      return (Math.PI / 4) * section.diameter ** 2
    case 'tube':
      return (Math.PI / 4) * (section.outerDiameter ** 2 - section.innerDiameter ** 2)
    case 'rectangle':
      return section.width * section.height
    case 'area':
      return section.area
    case 'cone': {
      const d = section.startDiameter + (section.endDiameter - section.startDiameter) * t
      return (Math.PI / 4) * d * d
    }
  }
}

/** ∫₀¹ A(t) dt: the mean area of a segment (for a cone, π/4 (d₀² + d₀d₁ + d₁²)/3). */
export function meanSectionArea(section: Section): number {
  if (section.shape !== 'cone') return sectionArea(section)
  const { startDiameter: a, endDiameter: b } = section
  return ((Math.PI / 4) * (a * a + a * b + b * b)) / 3
}

/** Outer size of a section for drawings: diameter, or the larger side; an equivalent diameter for `area`. */
export function sectionOuterSize(section: Section, t = 0): number {
  switch (section.shape) {
    case 'solid':
      return section.diameter
    case 'tube':
      return section.outerDiameter
    case 'rectangle':
      return Math.max(section.width, section.height)
    case 'area':
      return Math.sqrt((4 * section.area) / Math.PI)
    case 'cone':
      return section.startDiameter + (section.endDiameter - section.startDiameter) * t
  }
}

/** The material a segment names: the project's own first, then the built-in library. */
export function resolveMaterial(project: Pick<Project, 'materials'>, id: string): Material | undefined {
  const own = project.materials.find((m) => m.id === id)
  if (own) return own
  const lib = libraryMaterial(id)
  return lib ? { id: lib.id, name: lib.name, youngsModulus: lib.youngsModulus, density: lib.density, poissonRatio: lib.poissonRatio } : undefined
}

export function materialOf(project: Pick<Project, 'materials'>, segment: Segment): Material {
  const m = resolveMaterial(project, segment.material)
  if (!m) throw new RangeError(`unknown material "${segment.material}"`)
  return m
}

/**
 * Positions closer than this fraction of the bar's length are the same station (1 nm on a
 * 1 m bar): an attachment typed 1e-14 m from a boundary sits on it, instead of creating a
 * sliver element that would wreck the conditioning.
 */
export const SAME_POSITION = 1e-9

/**
 * Attachments (masses, springs) closer than this fraction of the part's length to a segment joint
 * or end, or to an attachment before them in the file, are taken there: 15 µm on a 1.5 m part, far
 * inside any drawing's tolerance. Left apart, they would make an element that much shorter than the
 * others, and the solver's round-off, which grows with the ratio, could then lose modes without
 * noticing it (a mass 1 µm past a joint once gave a second mode 54 % off). Segments keep their
 * lengths, however short.
 */
export const ATTACHMENT_SNAP = 1e-5

/** An attachment moved onto a joint, an end or another attachment by snapAttachments. */
export interface SnappedAttachment {
  /** Which list and index: "masses" or "springs", from 0. */
  readonly list: 'masses' | 'springs'
  readonly index: number
  readonly from: number
  readonly to: number
  /** What it was moved onto. */
  readonly onto: 'end' | 'joint' | 'attachment'
}

type Attached = Pick<Project, 'segments' | 'masses' | 'springs'>
const snappedCache = new WeakMap<object, { project: Attached; moves: SnappedAttachment[] }>()

function snapped(project: Attached): { project: Attached; moves: SnappedAttachment[] } {
  let hit = snappedCache.get(project)
  if (hit) return hit
  const bounds = segmentBoundaries(project.segments)
  const tolerance = ATTACHMENT_SNAP * bounds[bounds.length - 1]
  const kept: number[] = []
  const moves: SnappedAttachment[] = []
  const last = bounds.length - 1
  const place = (at: number, list: 'masses' | 'springs', index: number): number => {
    let to = at
    let onto: SnappedAttachment['onto'] = 'joint'
    let distance = tolerance
    bounds.forEach((b, i) => {
      if (Math.abs(b - at) <= distance) {
        to = b
        onto = i === 0 || i === last ? 'end' : 'joint'
        distance = Math.abs(b - at)
      }
    })
    if (to === at) {
      for (const k of kept) {
        if (Math.abs(k - at) <= tolerance) {
          to = k
          onto = 'attachment'
        }
      }
    }
    if (to === at) kept.push(at)
    else moves.push({ list, index, from: at, to, onto })
    return to
  }
  const masses = project.masses.map((m, i) => ({ ...m, at: place(m.at, 'masses', i) }))
  const springs = project.springs.map((sp, i) => ({ ...sp, at: place(sp.at, 'springs', i) }))
  hit = { project: moves.length ? { ...project, masses, springs } : project, moves }
  snappedCache.set(project, hit)
  // The snapped project is its own snap (the mesher is handed it again).
  if (hit.project !== project) snappedCache.set(hit.project, { project: hit.project, moves: [] })
  return hit
}

/** The project with its attachments snapped (see ATTACHMENT_SNAP); the project itself where none moves. */
export function snapAttachments<P extends Attached>(project: P): P {
  return snapped(project).project as P
}

/** The attachments snapAttachments moves, for the model's warnings. */
export function snappedAttachments(project: Attached): SnappedAttachment[] {
  return snapped(project).moves
}

/** x of every segment boundary, from 0 to the total length. */
export function segmentBoundaries(segments: readonly Segment[]): number[] {
  const xs = [0]
  for (const s of segments) xs.push(xs[xs.length - 1] + s.length)
  return xs
}

export function totalLength(segments: readonly Segment[]): number {
  let sum = 0
  for (const s of segments) sum += s.length
  return sum
}

/** Mass of the bar itself plus attached point masses, kg. */
export function totalMass(project: Project): number {
  let m = 0
  for (const s of project.segments) m += materialOf(project, s).density * meanSectionArea(s.section) * s.length
  for (const pm of project.masses) m += pm.mass
  return m
}
