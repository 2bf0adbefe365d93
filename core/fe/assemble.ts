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
  const order = settings.order
  for (const piece of mesh.pieces) {
    const segment = project.segments[piece.segment]
    const material = materials[piece.segment]
    if (segment.section.shape === 'cone') {
      // A tapered section: each element has its own matrices.
      const start = mesh.segmentStart[piece.segment]
      const segmentLength = segment.length
      for (let e = piece.firstElement; e < piece.firstElement + piece.count; e++) {
        const t0 = (mesh.x[order * e] - start) / segmentLength
        const t1 = (mesh.x[order * (e + 1)] - start) / segmentLength
        const matrices = barElementMatrices(order, piece.length, material.youngsModulus, material.density, (t) => sectionArea(segment.section, t0 + (t1 - t0) * t), settings.mass)
        addElements(k, m, order, e, 1, matrices.stiffness, matrices.mass)
      }
    } else {
      // Equal elements of a constant section share their matrices.
      const matrices = barElementMatrices(order, piece.length, material.youngsModulus, material.density, { uniformArea: sectionArea(segment.section) }, settings.mass)
      addElements(k, m, order, piece.firstElement, piece.count, matrices.stiffness, matrices.mass)
    }
  }
  project.masses.forEach((pm, i) => (m.rowSums[mesh.massNodes[i]] += pm.mass))
  project.springs.forEach((sp, i) => (k.rowSums[mesh.springNodes[i]] += sp.stiffness))
  const fixedStart = project.ends.start === 'fixed'
  const fixedEnd = project.ends.end === 'fixed'
  const hasSupport = fixedStart || fixedEnd || project.springs.length > 0
  const first = fixedStart ? 1 : 0
  const last = fixedEnd ? nodes - 2 : nodes - 1
  if (last < first) throw new RangeError('the model has no unknowns')
  // The support influence is M's full row sums (couplings to the supports included), taken
  // before the fixed ends are removed.
  const supportInfluence = hasSupport ? m.rowSums.slice(first, last + 1) : null
  const pencil = { stiffness: removeEnds(k, first, last), mass: removeEnds(m, first, last) }
  const dofNodes = new Int32Array(last - first + 1)
  for (let i = 0; i < dofNodes.length; i++) dofNodes[i] = first + i
  return {
    mesh,
    pencil,
    dofNodes,
    supportInfluence,
    totalMass: totalMass(project),
  }
}

/**
 * Adds `count` identical elements, the first at element index `firstElement`: off-diagonals into
 * the band, row sums as Σ_b A_ab. A stiffness row sums to zero exactly (the shape functions sum
 * to 1, so their derivatives sum to 0), so only the mass adds to row sums.
 */
function addElements(k: SymmetricBandMatrix, m: SymmetricBandMatrix, order: number, firstElement: number, count: number, ke: Float64Array, me: Float64Array): void {
  const kOff1 = k.offDiagonals[0]
  const mOff1 = m.offDiagonals[0]
  const mRow = m.rowSums
  if (order === 1) {
    const k01 = ke[1]
    const m01 = me[1]
    const row0 = me[0] + me[1]
    const row1 = me[2] + me[3]
    for (let e = firstElement; e < firstElement + count; e++) {
      kOff1[e] += k01
      mOff1[e] += m01
      mRow[e] += row0
      mRow[e + 1] += row1
    }
    return
  }
  const kOff2 = k.offDiagonals[1]
  const mOff2 = m.offDiagonals[1]
  // 3 × 3 row-major over the nodes 2e (start), 2e + 1 (middle), 2e + 2 (end).
  const row0 = me[0] + me[1] + me[2]
  const row1 = me[3] + me[4] + me[5]
  const row2 = me[6] + me[7] + me[8]
  for (let e = firstElement; e < firstElement + count; e++) {
    const first = 2 * e
    kOff1[first] += ke[1]
    kOff1[first + 1] += ke[5]
    kOff2[first] += ke[2]
    mOff1[first] += me[1]
    mOff1[first + 1] += me[5]
    mOff2[first] += me[2]
    mRow[first] += row0
    mRow[first + 1] += row1
    mRow[first + 2] += row2
  }
}

/**
 * Keeps unknowns first..last (first is 0 or 1, last is n − 1 or n − 2: only end nodes are
 * fixed); the couplings to a removed end node leave its kept neighbours' row sums. Works in
 * place and returns views of the kept part: no copy of the arrays.
 */
function removeEnds(a: SymmetricBandMatrix, first: number, last: number): SymmetricBandMatrix {
  const n = a.order
  const b = a.halfBandwidth
  const order = last - first + 1
  for (let d = 1; d <= b; d++) {
    const band = a.offDiagonals[d - 1]
    // Removed start node 0 couples to node d; removed end node n − 1 to node n − 1 − d.
    if (first === 1 && d >= first && d <= last) a.rowSums[d] -= band[0]
    if (last === n - 2 && n - 1 - d >= first && n - 1 - d <= last) a.rowSums[n - 1 - d] -= band[n - 1 - d]
    // Entries coupling a kept unknown to a removed one beyond `last` must not survive in the band.
    for (let i = Math.max(first, last + 1 - d); i <= last; i++) band[i] = 0
  }
  return {
    order,
    halfBandwidth: b,
    offDiagonals: a.offDiagonals.map((band) => band.subarray(first, first + order)),
    rowSums: a.rowSums.subarray(first, last + 1),
  }
}
