/**
 * The mesh: nodes along the bar with a node at every segment boundary, point mass
 * and spring; each segment (or the part of it between two attachments) divided into
 * equal elements of the chosen order.
 */
import type { ElementOrder, Project } from '../model/project'
import { SAME_POSITION, segmentBoundaries, snapAttachments } from '../model/geometry'
import { intervalHolding } from '../sorted-search'

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

/**
 * Nodes are numbered along the bar; element e spans nodes order·e … order·(e + 1) (its middle
 * node between them for 3-node elements), so an element is its index: the mesh stores typed
 * arrays, not an object per element, which keeps a million-element mesh cheap.
 */
export interface Mesh {
  readonly order: ElementOrder
  /** Node coordinates, increasing. */
  readonly x: Float64Array
  readonly elementCount: number
  /** Segment of each element. */
  readonly elementSegment: Int32Array
  /**
   * Runs of equal elements: each piece of a segment between attachments is divided into
   * `count` elements of exactly `length` = (to − from)/count (node coordinates differ from it in
   * the last bits), starting at element `firstElement`.
   */
  readonly pieces: readonly MeshPiece[]
  /** x of each segment boundary. */
  readonly segmentStart: readonly number[]
  /** The elements as objects, built on first use (drawings, small meshes). */
  readonly elements: readonly MeshElement[]
  /** Node index at each segment boundary (segments.length + 1 entries). */
  readonly segmentBoundaryNodes: readonly number[]
  readonly massNodes: readonly number[]
  readonly springNodes: readonly number[]
}

export interface MeshPiece {
  readonly segment: number
  readonly firstElement: number
  readonly count: number
  readonly length: number
}

export interface MeshDensity {
  readonly order: ElementOrder
  readonly elementsPerSegment?: number
  readonly maxElementLength?: number
}

/** Segment pieces between attachments, and the number of elements each gets (the mesher's own rule). */
function meshPlan(given: Pick<Project, 'segments' | 'masses' | 'springs'>, density: MeshDensity): { segment: number; from: number; to: number; count: number }[] {
  const project = snapAttachments(given)
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

export function buildMesh(given: Pick<Project, 'segments' | 'masses' | 'springs'>, density: MeshDensity): Mesh {
  const project = snapAttachments(given)
  const bounds = segmentBoundaries(project.segments)
  const plan = meshPlan(project, density)
  const order = density.order
  let elementCount = 0
  for (const piece of plan) elementCount += piece.count
  const x = new Float64Array(elementCount * order + 1)
  const elementSegment = new Int32Array(elementCount)
  const pieces: MeshPiece[] = []
  const segmentBoundaryNodes = [0]
  let e = 0
  for (let s = 0, p = 0; s < project.segments.length; s++) {
    for (; p < plan.length && plan[p].segment === s; p++) {
      const { from, to, count } = plan[p]
      pieces.push({ segment: s, firstElement: e, count, length: (to - from) / count })
      elementSegment.fill(s, e, e + count)
      fillNodes(x, order, order * e, from, to, count)
      e += count
    }
    segmentBoundaryNodes.push(order * e)
  }
  const nodeAt = (position: number): number => nearestNode(x, position)
  let elements: MeshElement[] | null = null
  return {
    order,
    x,
    elementCount,
    elementSegment,
    pieces,
    segmentStart: bounds,
    get elements(): readonly MeshElement[] {
      if (!elements) {
        elements = Array.from({ length: elementCount }, (_, i) => {
          const s = elementSegment[i]
          const x0 = x[order * i]
          const x1 = x[order * (i + 1)]
          const segmentLength = bounds[s + 1] - bounds[s]
          return {
            segment: s,
            nodes: order === 1 ? [i, i + 1] : [2 * i, 2 * i + 1, 2 * i + 2],
            x0,
            x1,
            t0: (x0 - bounds[s]) / segmentLength,
            t1: (x1 - bounds[s]) / segmentLength,
          }
        })
      }
      return elements
    },
    segmentBoundaryNodes,
    massNodes: project.masses.map((m) => nodeAt(m.at)),
    springNodes: project.springs.map((sp) => nodeAt(sp.at)),
  }
}

/** Node coordinates of `count` equal elements from `from` to `to`, starting at node `firstNode`. */
function fillNodes(x: Float64Array, order: number, firstNode: number, from: number, to: number, count: number): void {
  const span = to - from
  const nodes = order * count
  for (let j = 0; j < nodes; j++) x[firstNode + j] = from + (span * j) / nodes
  x[firstNode + nodes] = to
}

/** The element holding a position (binary search over element ends). */
export function elementAt(mesh: Mesh, position: number): number {
  const { x, order, elementCount } = mesh
  let lo = 0
  let hi = elementCount - 1
  while (lo < hi) {
    const mid = (lo + hi) >> 1
    if (x[order * (mid + 1)] < position) lo = mid + 1
    else hi = mid
  }
  return lo
}

/** Index of the node nearest to a position (binary search on the sorted coordinates). */
export function nearestNode(x: Float64Array, position: number): number {
  const lo = intervalHolding(x, position)
  const hi = lo + 1
  return Math.abs(x[hi] - position) < Math.abs(x[lo] - position) ? hi : lo
}
