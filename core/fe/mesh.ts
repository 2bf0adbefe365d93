/**
 * The mesh: nodes along the bar with a node at every segment boundary, point mass
 * and spring; each segment (or the part of it between two attachments) divided into
 * equal elements of the chosen order.
 */
import type { ElementOrder, Project } from '../model/project'
import { SAME_POSITION, segmentBoundaries } from '../model/geometry'

export interface MeshElement {
  readonly segment: number
  /** Global node indices: start, (middle), end. */
  readonly nodes: readonly number[]
  readonly x0: number
  readonly x1: number
  /** Fractions along the segment at the element's ends (for tapered sections). */
  readonly t0: number
  readonly t1: number
}

export interface Mesh {
  readonly order: ElementOrder
  /** Node coordinates, increasing. */
  readonly x: Float64Array
  readonly elements: readonly MeshElement[]
  /** Node index at each segment boundary (segments.length + 1 entries). */
  readonly segmentBoundaryNodes: readonly number[]
  readonly massNodes: readonly number[]
  readonly springNodes: readonly number[]
}

export interface MeshDensity {
  readonly order: ElementOrder
  readonly elementsPerSegment?: number
  readonly maxElementLength?: number
}

/** Segment pieces between attachments, and the number of elements each gets (the mesher's own rule). */
function meshPlan(project: Pick<Project, 'segments' | 'masses' | 'springs'>, density: MeshDensity): { segment: number; from: number; to: number; count: number }[] {
  const bounds = segmentBoundaries(project.segments)
  const length = bounds[bounds.length - 1]
  const snap = SAME_POSITION * length
  const attachments = [...project.masses.map((m) => m.at), ...project.springs.map((s) => s.at)]
  const plan: { segment: number; from: number; to: number; count: number }[] = []
  for (let s = 0; s < project.segments.length; s++) {
    const a = bounds[s]
    const b = bounds[s + 1]
    const cuts = [a, ...attachments.filter((x) => x > a + snap && x < b - snap).sort((p, q) => p - q), b]
    for (let c = 0; c + 1 < cuts.length; c++) {
      const from = cuts[c]
      const to = cuts[c + 1]
      if (to - from <= snap) continue
      const count =
        density.maxElementLength !== undefined
          ? Math.max(1, Math.ceil((to - from) / density.maxElementLength - 1e-9))
          : Math.max(1, Math.round(((density.elementsPerSegment ?? 1) * (to - from)) / (b - a)))
      plan.push({ segment: s, from, to, count })
    }
  }
  return plan
}

/** Number of elements the mesher will make, without making them. */
export function countMeshElements(project: Pick<Project, 'segments' | 'masses' | 'springs'>, density: MeshDensity): number {
  let total = 0
  for (const piece of meshPlan(project, density)) total += piece.count
  return total
}

export function buildMesh(project: Pick<Project, 'segments' | 'masses' | 'springs'>, density: MeshDensity): Mesh {
  const bounds = segmentBoundaries(project.segments)
  const xs: number[] = [0]
  const elements: MeshElement[] = []
  const segmentBoundaryNodes = [0]
  const plan = meshPlan(project, density)
  for (let s = 0, piece = 0; s < project.segments.length; s++) {
    const a = bounds[s]
    const segmentLength = bounds[s + 1] - a
    for (; piece < plan.length && plan[piece].segment === s; piece++) {
      const { from, to, count } = plan[piece]
      for (let e = 0; e < count; e++) {
        const x0 = e === 0 ? from : from + ((to - from) * e) / count
        const x1 = e === count - 1 ? to : from + ((to - from) * (e + 1)) / count
        const start = xs.length - 1
        const nodes = [start]
        if (density.order === 2) {
          xs.push(0.5 * (x0 + x1))
          nodes.push(xs.length - 1)
        }
        xs.push(x1)
        nodes.push(xs.length - 1)
        elements.push({ segment: s, nodes, x0, x1, t0: (x0 - a) / segmentLength, t1: (x1 - a) / segmentLength })
      }
    }
    segmentBoundaryNodes.push(xs.length - 1)
  }
  const x = Float64Array.from(xs)
  const nodeAt = (position: number): number => nearestNode(x, position)
  return {
    order: density.order,
    x,
    elements,
    segmentBoundaryNodes,
    massNodes: project.masses.map((m) => nodeAt(m.at)),
    springNodes: project.springs.map((s) => nodeAt(s.at)),
  }
}

/** Index of the node nearest to a position (binary search on the sorted coordinates). */
export function nearestNode(x: Float64Array, position: number): number {
  let lo = 0
  let hi = x.length - 1
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1
    if (x[mid] <= position) lo = mid
    else hi = mid
  }
  return Math.abs(x[hi] - position) < Math.abs(x[lo] - position) ? hi : lo
}
