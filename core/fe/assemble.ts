/**
 * Global stiffness and mass of the bar (the pencil (K, M) of K φ = ω² M φ), assembled
 * element by element into the banded row-sum storage of linalg/symmetric-band-matrix.ts.
 * Point masses add to M's diagonal (their kinetic energy ½ m u̇²), grounded springs to
 * K's diagonal (strain energy ½ k u²). Fixed ends are removed last: their coupling to
 * the neighbouring unknowns moves into those unknowns' row sums, which is exactly how
 * a support grounds the bar.
 */
import { createBandMatrix, type SymmetricBandMatrix } from '../linalg/symmetric-band-matrix'
import type { BandPencil } from '../linalg/shifted-ldlt'
import type { MassMatrixKind, Project } from '../model/project'
import { materialOf, sectionArea, totalMass } from '../model/geometry'
import { barElementMatrices } from './bar-element'
import { buildMesh, type Mesh, type MeshDensity } from './mesh'

export interface AssembledModel {
  readonly mesh: Mesh
  /** K and M over the unknowns (nodes that are not fixed). */
  readonly pencil: BandPencil
  /** Node index of each unknown. */
  readonly dofNodes: Int32Array
  /**
   * b = (M_ff + M_fc)·1: the inertia load of a unit acceleration of every support (fixed ends
   * and springs moving together along the axis), per unknown. Null for a bar with no support.
   */
  readonly supportInfluence: Float64Array | null
  /** Bar plus point masses, kg. */
  readonly totalMass: number
}

export interface AssemblySettings extends MeshDensity {
  readonly mass: MassMatrixKind
}

export function assembleModel(project: Project, settings: AssemblySettings): AssembledModel {
  const mesh = buildMesh(project, settings)
  const nodes = mesh.x.length
  const bandwidth = settings.order
  const k = createBandMatrix(nodes, bandwidth)
  const m = createBandMatrix(nodes, bandwidth)
  const materials = project.segments.map((segment) => materialOf(project, segment))
  // Elements of equal length in a constant section share their matrices: compute once, reuse.
  let cached: { segment: number; length: number; matrices: ReturnType<typeof barElementMatrices> } | null = null
  for (const element of mesh.elements) {
    const segment = project.segments[element.segment]
    const material = materials[element.segment]
    const length = element.x1 - element.x0
    let matrices
    if (segment.section.shape === 'cone') {
      const { t0, t1 } = element
      matrices = barElementMatrices(settings.order, length, material.youngsModulus, material.density, (t) => sectionArea(segment.section, t0 + (t1 - t0) * t), settings.mass)
    } else if (cached && cached.segment === element.segment && Math.abs(cached.length - length) <= 1e-13 * length) {
      matrices = cached.matrices
    } else {
      matrices = barElementMatrices(settings.order, length, material.youngsModulus, material.density, { uniformArea: sectionArea(segment.section) }, settings.mass)
      cached = { segment: element.segment, length, matrices }
    }
    addElement(k, m, element.nodes, matrices.stiffness, matrices.mass)
  }
  project.masses.forEach((pm, i) => (m.rowSums[mesh.massNodes[i]] += pm.mass))
  project.springs.forEach((sp, i) => (k.rowSums[mesh.springNodes[i]] += sp.stiffness))
  const fixedStart = project.ends.start === 'fixed'
  const fixedEnd = project.ends.end === 'fixed'
  const hasSupport = fixedStart || fixedEnd || project.springs.length > 0
  const first = fixedStart ? 1 : 0
  const last = fixedEnd ? nodes - 2 : nodes - 1
  const supportFull = hasSupport ? Float64Array.from(m.rowSums) : null
  if (last < first) throw new RangeError('the model has no unknowns')
  const pencil = { stiffness: removeEnds(k, first, last), mass: removeEnds(m, first, last) }
  const dofNodes = new Int32Array(last - first + 1)
  for (let i = 0; i < dofNodes.length; i++) dofNodes[i] = first + i
  return {
    mesh,
    pencil,
    dofNodes,
    supportInfluence: supportFull ? supportFull.slice(first, last + 1) : null,
    totalMass: totalMass(project),
  }
}

/** Adds an element's dense matrices: off-diagonals into the band, row sums as ∑_b A_ab. */
function addElement(k: SymmetricBandMatrix, m: SymmetricBandMatrix, nodes: readonly number[], ke: Float64Array, me: Float64Array): void {
  const count = nodes.length
  for (let a = 0; a < count; a++) {
    let massRow = 0
    for (let b = 0; b < count; b++) {
      massRow += me[a * count + b]
      if (b <= a) continue
      const d = nodes[b] - nodes[a]
      const lo = nodes[a]
      k.offDiagonals[d - 1][lo] += ke[a * count + b]
      m.offDiagonals[d - 1][lo] += me[a * count + b]
    }
    // A stiffness row sums to zero exactly (the shape functions sum to 1, so their derivatives sum to 0).
    m.rowSums[nodes[a]] += massRow
  }
}

/** Keeps unknowns first..last; the couplings to removed end nodes leave the neighbours' row sums. */
function removeEnds(a: SymmetricBandMatrix, first: number, last: number): SymmetricBandMatrix {
  const n = a.order
  const b = a.halfBandwidth
  const rowSums = Float64Array.from(a.rowSums)
  for (let d = 1; d <= b; d++) {
    const band = a.offDiagonals[d - 1]
    for (let i = 0; i + d < n; i++) {
      const j = i + d
      const iKept = i >= first && i <= last
      const jKept = j >= first && j <= last
      if (iKept && !jKept) rowSums[i] -= band[i]
      if (jKept && !iKept) rowSums[j] -= band[i]
    }
  }
  const order = last - first + 1
  const out = createBandMatrix(order, b)
  out.rowSums.set(rowSums.subarray(first, last + 1))
  for (let d = 1; d <= b; d++) out.offDiagonals[d - 1].set(a.offDiagonals[d - 1].subarray(first, Math.min(last + 1, n)).subarray(0, order))
  // Entries coupling a kept unknown to a removed one beyond `last` must not survive in the band.
  for (let d = 1; d <= b; d++) for (let i = Math.max(0, order - d); i < order; i++) out.offDiagonals[d - 1][i] = 0
  return out
}
