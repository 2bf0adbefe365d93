/**
 * Global stiffness and mass of one motion family (the pencil (K, M) of K φ = ω² M φ),
 * assembled element by element into the banded row-sum storage of
 * linalg/symmetric-band-matrix.ts.
 *
 * Axial motion and torsion share the bar element (bar-element.ts): EA and ρA, or GJ and ρIp.
 * Point masses (or disks' polar inertia) add to M's diagonal (kinetic energy ½ m u̇²), grounded
 * springs of the family to K's diagonal (strain energy ½ k u²). Fixed ends are removed last:
 * their coupling to the neighbouring unknowns moves into those unknowns' row sums, which is
 * exactly how a support grounds the bar.
 *
 * Bending uses the beam element (beam-element.ts) with two unknowns per node: the deflection w
 * and the rotation scaled by a length, s = ℓθ (ℓ the mean element length), so that every entry
 * of K and M has the same units and scale; the preload adds its geometric stiffness. End
 * conditions remove unknowns of the end nodes (pinned: w; guided: θ; clamped: both).
 */
import { createBandMatrix, type SymmetricBandMatrix } from '../linalg/symmetric-band-matrix'
import type { BandPencil } from '../linalg/shifted-ldlt'
import { beamDofIndex, beamUnknowns, type BeamLayout } from '../linalg/beam-coarsening'
import { elementForm, FORM_SIZE, type BeamForms } from '../linalg/beam-energy'
import type { BendingEndCondition, MassMatrixKind, Motion, Project, Section } from '../model/project'
import { springMotion } from '../model/project'
import { materialOf, sectionArea, totalLength, totalMass } from '../model/geometry'
import { familyOf, type BendingPlane, type Family } from '../model/families'
import { polarMoment, poissonRatioOf, secondMoments, shearCoefficient, shearModulus, torsionConstant } from '../model/section-properties'
import { barElementMatrices, type ElementProperty } from './bar-element'
import { beamElementMatrices, type BeamElementMatrices, type BeamElementSection } from './beam-element'
import { buildMesh, type Mesh, type MeshDensity } from './mesh'

export interface AssembledModel {
  readonly family: Family
  readonly mesh: Mesh
  /** K and M over the unknowns (nodes, or node deflections and rotations, that are not held). */
  readonly pencil: BandPencil
  /** Node index of each unknown. */
  readonly dofNodes: Int32Array
  /** Bending only: 0 for a deflection unknown, 1 for a rotation unknown (rotation × rotationScale). */
  readonly dofKinds: Uint8Array | null
  /** Bending only: the length ℓ that rotation unknowns are scaled by (s = ℓθ), m. */
  readonly rotationScale: number
  /** Bending only: the solver's view of the unknowns (coarsening, rigid-body motions). */
  readonly layout: BeamLayout | null
  /** Bending only: K without the preload's part, and the geometric stiffness per newton of tension. */
  readonly elasticStiffness: SymmetricBandMatrix | null
  readonly geometricStiffness: SymmetricBandMatrix | null
  /** Bending only: each element's Φ = 12EI/(κGAh²) (0 under Euler–Bernoulli), for the curvature ψ′ of its fields. */
  readonly elementShearParameter: Float64Array | null
  /**
   * b = (M_ff + M_fc)·r: the inertia load of a unit acceleration of every support (fixed ends
   * and the family's springs moving together: along the axis, about it, or sideways), per
   * unknown. Null for a part with no such support.
   */
  readonly supportInfluence: Float64Array | null
  /** What the modes' effective masses add up to: bar plus point masses (kg), or the polar inertia (kg·m²) in torsion. */
  readonly totalMass: number
}

export interface AssemblySettings extends MeshDensity {
  readonly mass: MassMatrixKind
  /** Bending theory (default Euler–Bernoulli). */
  readonly bendingTheory?: 'euler-bernoulli' | 'timoshenko'
}

/** The axial model (the version 1 analysis). */
export function assembleModel(project: Project, settings: AssemblySettings): AssembledModel {
  return assembleFamily(project, familyOf('axial'), settings)
}

export function assembleFamily(project: Project, family: Family, settings: AssemblySettings): AssembledModel {
  if (family.motion === 'bending') return assembleBending(project, family.plane ?? 'weak', settings)
  return assembleBar(project, family.motion, settings)
}

/** Section properties of axial motion or torsion along a segment. */
function barProperties(section: Section, motion: Motion): { stiffness: (t: number) => number; inertia: (t: number) => number } {
  if (motion === 'axial') {
    const area = (t: number) => sectionArea(section, t)
    return { stiffness: area, inertia: area }
  }
  return { stiffness: (t) => torsionConstant(section, t) as number, inertia: (t) => polarMoment(section, t) as number }
}

function assembleBar(project: Project, motion: Exclude<Motion, 'bending'>, settings: AssemblySettings): AssembledModel {
  const mesh = buildMesh(project, settings)
  const nodes = mesh.x.length
  const order = settings.order
  const k = createBandMatrix(nodes, order)
  const m = createBandMatrix(nodes, order)
  const materials = project.segments.map((segment) => materialOf(project, segment))
  for (const piece of mesh.pieces) {
    const segment = project.segments[piece.segment]
    const material = materials[piece.segment]
    const modulus = motion === 'axial' ? material.youngsModulus : (shearModulus(material) as number)
    const { stiffness, inertia } = barProperties(segment.section, motion)
    if (segment.section.shape === 'cone') {
      // A tapered section: each element has its own matrices.
      const start = mesh.segmentStart[piece.segment]
      const segmentLength = segment.length
      for (let e = piece.firstElement; e < piece.firstElement + piece.count; e++) {
        const t0 = (mesh.x[order * e] - start) / segmentLength
        const t1 = (mesh.x[order * (e + 1)] - start) / segmentLength
        const along = (f: (t: number) => number): ElementProperty => (t) => f(t0 + (t1 - t0) * t)
        const stiffnessAlong = along(stiffness)
        const matrices = barElementMatrices(order, piece.length, modulus, material.density, stiffnessAlong, settings.mass, motion === 'axial' ? stiffnessAlong : along(inertia))
        addElements(k, m, order, e, 1, matrices.stiffness, matrices.mass)
      }
    } else {
      // Equal elements of a constant section share their matrices.
      const matrices = barElementMatrices(order, piece.length, modulus, material.density, { uniformArea: stiffness(0) }, settings.mass, { uniformArea: inertia(0) })
      addElements(k, m, order, piece.firstElement, piece.count, matrices.stiffness, matrices.mass)
    }
  }
  project.masses.forEach((pm, i) => {
    const inertia = motion === 'axial' ? pm.mass : (pm.polarInertia ?? 0)
    if (inertia > 0) m.rowSums[mesh.massNodes[i]] += inertia
  })
  let springs = 0
  project.springs.forEach((sp, i) => {
    if (springMotion(sp) !== motion) return
    k.rowSums[mesh.springNodes[i]] += sp.stiffness
    springs++
  })
  const fixedStart = project.ends.start[motion] === 'fixed'
  const fixedEnd = project.ends.end[motion] === 'fixed'
  const hasSupport = fixedStart || fixedEnd || springs > 0
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
    family: familyOf(motion),
    mesh,
    pencil,
    dofNodes,
    dofKinds: null,
    rotationScale: 1,
    layout: null,
    elasticStiffness: null,
    elementShearParameter: null,
    geometricStiffness: null,
    supportInfluence,
    totalMass: motion === 'axial' ? totalMass(project) : totalPolarInertia(project),
  }
}

/** ∫ρIp dx of the bar plus every disk's polar inertia, kg·m². */
export function totalPolarInertia(project: Project): number {
  let sum = 0
  for (const s of project.segments) {
    const density = materialOf(project, s).density
    if (s.section.shape === 'cone') {
      // Ip ∝ d⁴ with d linear: the mean of d⁴ over the segment is (a⁵ − b⁵)/(5(a − b)).
      const { startDiameter: a, endDiameter: b } = s.section
      const meanFourth = a === b ? a ** 4 : (a ** 5 - b ** 5) / (5 * (a - b))
      sum += density * (Math.PI / 32) * meanFourth * s.length
    } else sum += density * (polarMoment(s.section) as number) * s.length
  }
  for (const pm of project.masses) sum += pm.polarInertia ?? 0
  return sum
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

/** Which of an end node's [deflection, rotation] stay unknowns under a bending end condition. */
export function keptAtEnd(condition: BendingEndCondition): [boolean, boolean] {
  return [condition === 'free' || condition === 'guided', condition === 'free' || condition === 'pinned']
}

/** Properties of a segment in bending, in one principal plane. */
function beamSection(project: Project, segmentIndex: number, plane: BendingPlane, theory: 'euler-bernoulli' | 'timoshenko'): BeamElementSection & { uniform: boolean } {
  const segment = project.segments[segmentIndex]
  const material = materialOf(project, segment)
  const section = segment.section
  const E = material.youngsModulus
  const rho = material.density
  const inertia = (t: number) => (secondMoments(section, t) as { weak: number; strong: number })[plane]
  let shear = (_t: number) => Infinity
  if (theory === 'timoshenko') {
    const G = shearModulus(material) as number
    const kappa = shearCoefficient(section, poissonRatioOf(material) ?? 0.3)
    shear = (t) => kappa * G * sectionArea(section, t)
  }
  return {
    uniform: section.shape !== 'cone',
    bendingStiffness: (t) => E * inertia(t),
    massPerLength: (t) => rho * sectionArea(section, t),
    rotaryInertiaPerLength: (t) => rho * inertia(t),
    shearStiffness: shear,
  }
}

/**
 * Rigid-body motions w = a + b x that the bending supports leave free: each held deflection
 * (pinned or clamped end, sideways spring) asks a + b x = 0 there, each held slope (clamped or
 * guided end, rotational spring) b = 0, and a preload makes a rotation store energy ½ P ∫ b² dx.
 * Returns a basis of what is left (0–2 motions).
 */
export function freeRigidMotions(project: Project): { a: number; b: number }[] {
  const rows: [number, number][] = []
  const length = totalLength(project.segments)
  const holdsDeflection = (c: BendingEndCondition) => c === 'pinned' || c === 'clamped'
  const holdsSlope = (c: BendingEndCondition) => c === 'guided' || c === 'clamped'
  if (holdsDeflection(project.ends.start.bending)) rows.push([1, 0])
  if (holdsDeflection(project.ends.end.bending)) rows.push([1, length])
  if (holdsSlope(project.ends.start.bending) || holdsSlope(project.ends.end.bending)) rows.push([0, 1])
  for (const sp of project.springs) {
    if (springMotion(sp) !== 'bending') continue
    if (sp.stiffness > 0) rows.push([1, sp.at])
    if ((sp.rotationalStiffness ?? 0) > 0) rows.push([0, 1])
  }
  if ((project.preload ?? 0) !== 0) rows.push([0, 1])
  // Rank of the rows: 0, 1 or 2 (positions compared relative to the part's length).
  const independent = (p: [number, number], q: [number, number]) => Math.abs(p[0] * q[1] - p[1] * q[0]) > 1e-9 * Math.max(1, length)
  if (rows.length === 0) return [{ a: 1, b: 0 }, { a: -length / 2, b: 1 }]
  const first = rows[0]
  if (rows.some((r) => independent(first, r))) return []
  // One condition p·a + q·b = 0: the motion (a, b) ∝ (−q, p).
  const [p, q] = first
  return [p === 0 ? { a: 1, b: 0 } : { a: -q / p, b: 1 }]
}

function assembleBending(project: Project, plane: BendingPlane, settings: AssemblySettings): AssembledModel {
  const theory = settings.bendingTheory ?? 'euler-bernoulli'
  const mesh = buildMesh(project, { order: 1, elementsPerSegment: settings.elementsPerSegment, maxElementLength: settings.maxElementLength })
  const nodes = mesh.x.length
  const scale = totalLength(project.segments) / mesh.elementCount
  const layout: BeamLayout = {
    x: mesh.x,
    rotationScale: scale,
    startKept: keptAtEnd(project.ends.start.bending),
    endKept: keptAtEnd(project.ends.end.bending),
    rigidMotions: freeRigidMotions(project),
    // Every piece boundary: segment joints and the nodes of point masses and springs.
    anchors: Int32Array.from(mesh.pieces.slice(1), (piece) => piece.firstElement),
  }
  const index = beamDofIndex(layout)
  const n = beamUnknowns(layout)
  if (n < 1) throw new RangeError('the model has no unknowns')
  const elastic = createBandMatrix(n, Math.min(3, Math.max(1, n - 1)))
  const geometric = createBandMatrix(n, elastic.halfBandwidth)
  const mass = createBandMatrix(n, elastic.halfBandwidth)
  const influence = new Float64Array(n)
  // Unknowns are [w, ℓθ]: element entries scale by 1/ℓ per rotation index.
  const d = [1, 1 / scale, 1, 1 / scale]
  const dofs = new Int32Array(4)
  // Adds a scaled element matrix at dofs (removed unknowns skipped).
  const add = (a: SymmetricBandMatrix, matrix: Float64Array): void => {
    for (let p = 0; p < 4; p++) {
      const i = dofs[p]
      if (i < 0) continue
      let row = 0
      for (let q = 0; q < 4; q++) {
        const j = dofs[q]
        if (j < 0) continue
        const v = matrix[4 * p + q]
        row += v
        if (j > i) a.offDiagonals[j - i - 1][i] += v
      }
      a.rowSums[i] += row
    }
  }
  // The energy form of K (see stiffnessEnergy below): per element an index into `forms`, whose
  // entries are the scaled element's 2 × 2 elastic block and 3 × 3 geometric block.
  const formOfElement = new Int32Array(mesh.elementCount)
  const elementShearParameter = new Float64Array(mesh.elementCount)
  const forms: number[] = []
  for (const piece of mesh.pieces) {
    const section = beamSection(project, piece.segment, plane, theory)
    const start = mesh.segmentStart[piece.segment]
    const segmentLength = project.segments[piece.segment].length
    let shared: ScaledBeamElement | null = null
    for (let e = piece.firstElement; e < piece.firstElement + piece.count; e++) {
      let element: ScaledBeamElement | null = shared
      if (!element) {
        const t0 = (mesh.x[e] - start) / segmentLength
        const t1 = (mesh.x[e + 1] - start) / segmentLength
        const along = (f: (t: number) => number) => (t: number) => f(t0 + (t1 - t0) * t)
        const matrices = beamElementMatrices(
          piece.length,
          section.uniform
            ? section
            : {
                bendingStiffness: along(section.bendingStiffness),
                massPerLength: along(section.massPerLength),
                rotaryInertiaPerLength: along(section.rotaryInertiaPerLength),
                shearStiffness: along(section.shearStiffness),
              },
          theory,
          settings.mass,
        )
        element = scaledBeamElement(matrices, d)
        if (section.uniform) shared = element
        forms.push(...elementForm(element.elastic, element.geometric))
      }
      formOfElement[e] = forms.length / FORM_SIZE - 1
      elementShearParameter[e] = element.shearParameter
      dofs[0] = index[2 * e]
      dofs[1] = index[2 * e + 1]
      dofs[2] = index[2 * e + 2]
      dofs[3] = index[2 * e + 3]
      const first = dofs[0]
      if (first >= 0 && dofs[1] === first + 1 && dofs[2] === first + 2 && dofs[3] === first + 3) {
        // An interior element: its four unknowns are consecutive.
        addConsecutive(elastic, element.elastic, element.elasticRows, first)
        addConsecutive(geometric, element.geometric, element.geometricRows, first)
        addConsecutive(mass, element.mass, element.massRows, first)
        for (let p = 0; p < 4; p++) influence[first + p] += element.influence[p]
      } else {
        add(elastic, element.elastic)
        add(geometric, element.geometric)
        add(mass, element.mass)
        // Sideways support motion: every deflection, held ones included, moves by 1.
        for (let p = 0; p < 4; p++) if (dofs[p] >= 0) influence[dofs[p]] += element.influence[p]
      }
    }
  }
  project.masses.forEach((pm, i) => {
    const node = mesh.massNodes[i]
    const w = index[2 * node]
    const s = index[2 * node + 1]
    if (w >= 0) {
      mass.rowSums[w] += pm.mass
      influence[w] += pm.mass
    }
    if (s >= 0 && (pm.transverseInertia ?? 0) > 0) mass.rowSums[s] += (pm.transverseInertia as number) / (scale * scale)
  })
  let lateralSupport = project.ends.start.bending === 'pinned' || project.ends.start.bending === 'clamped' || project.ends.end.bending === 'pinned' || project.ends.end.bending === 'clamped'
  project.springs.forEach((sp, i) => {
    if (springMotion(sp) !== 'bending') return
    const node = mesh.springNodes[i]
    const w = index[2 * node]
    const s = index[2 * node + 1]
    if (w >= 0 && sp.stiffness > 0) {
      elastic.rowSums[w] += sp.stiffness
      lateralSupport = true
    }
    if (s >= 0 && (sp.rotationalStiffness ?? 0) > 0) elastic.rowSums[s] += (sp.rotationalStiffness as number) / (scale * scale)
  })
  const preload = project.preload ?? 0
  // Without preload K is the elastic matrix itself (nothing writes to either afterwards).
  const stiffness = preload === 0 ? elastic : createBandMatrix(n, elastic.halfBandwidth)
  if (preload !== 0) {
    for (let b = 0; b < elastic.halfBandwidth; b++) {
      const out = stiffness.offDiagonals[b]
      const e = elastic.offDiagonals[b]
      const g = geometric.offDiagonals[b]
      for (let i = 0; i < n; i++) out[i] = e[i] + preload * g[i]
    }
    for (let i = 0; i < n; i++) stiffness.rowSums[i] = elastic.rowSums[i] + preload * geometric.rowSums[i]
  }
  const dofNodes = new Int32Array(n)
  const dofKinds = new Uint8Array(n)
  for (let node = 0; node < nodes; node++) {
    for (let kind = 0; kind < 2; kind++) {
      const j = index[2 * node + kind]
      if (j < 0) continue
      dofNodes[j] = node
      dofKinds[j] = kind
    }
  }
  const grounded: number[] = []
  project.springs.forEach((sp, i) => {
    if (springMotion(sp) !== 'bending') return
    const node = mesh.springNodes[i]
    if (index[2 * node] >= 0 && sp.stiffness > 0) grounded.push(index[2 * node], sp.stiffness)
    if (index[2 * node + 1] >= 0 && (sp.rotationalStiffness ?? 0) > 0) grounded.push(index[2 * node + 1], (sp.rotationalStiffness as number) / (scale * scale))
  })
  const springCount = grounded.length / 2
  const beamForms: BeamForms = {
    layout,
    index,
    forms: Float64Array.from(forms),
    formOfInterval: formOfElement,
    preload,
    shearFlexible: theory === 'timoshenko',
    groundedStiffness: Float64Array.from({ length: springCount }, (_, g) => grounded[2 * g + 1]),
    groundedIndex: Int32Array.from({ length: 4 * springCount }, (_, p) => (p % 4 === 0 ? grounded[(p / 4) * 2] : -1)),
    groundedWeight: Float64Array.from({ length: 4 * springCount }, (_, p) => (p % 4 === 0 ? 1 : 0)),
  }
  return {
    family: familyOf('bending', plane),
    mesh,
    pencil: { stiffness, mass, beamForms },
    dofNodes,
    dofKinds,
    rotationScale: scale,
    layout,
    elasticStiffness: elastic,
    elementShearParameter,
    geometricStiffness: geometric,
    supportInfluence: lateralSupport ? influence : null,
    totalMass: totalMass(project),
  }
}


/** An element's matrices in the scaled unknowns [w, ℓθ], with their row sums, ready to add. */
interface ScaledBeamElement {
  readonly elastic: Float64Array
  readonly geometric: Float64Array
  readonly mass: Float64Array
  readonly elasticRows: Float64Array
  readonly geometricRows: Float64Array
  readonly massRows: Float64Array
  /** Per unknown, Σ over the element's deflections of its mass entries: M·(sideways unit motion). */
  readonly influence: Float64Array
  readonly shearParameter: number
}

function scaledBeamElement(matrices: BeamElementMatrices, d: number[]): ScaledBeamElement {
  const elastic = scaled(matrices.elastic, d)
  const geometric = scaled(matrices.geometric, d)
  const mass = scaled(matrices.mass, d)
  const rows = (a: Float64Array) => Float64Array.from({ length: 4 }, (_, p) => a[4 * p] + a[4 * p + 1] + a[4 * p + 2] + a[4 * p + 3])
  return {
    elastic,
    geometric,
    mass,
    elasticRows: rows(elastic),
    geometricRows: rows(geometric),
    massRows: rows(mass),
    influence: Float64Array.from({ length: 4 }, (_, p) => mass[4 * p] + mass[4 * p + 2]),
    shearParameter: matrices.shearParameter,
  }
}

/** Adds a 4 × 4 element matrix whose unknowns are first … first + 3 straight into the bands. */
function addConsecutive(a: SymmetricBandMatrix, matrix: Float64Array, rowSums: Float64Array, first: number): void {
  const r = a.rowSums
  const b1 = a.offDiagonals[0], b2 = a.offDiagonals[1], b3 = a.offDiagonals[2] // prettier-ignore
  r[first] += rowSums[0]
  r[first + 1] += rowSums[1]
  r[first + 2] += rowSums[2]
  r[first + 3] += rowSums[3]
  b1[first] += matrix[1]
  b1[first + 1] += matrix[6]
  b1[first + 2] += matrix[11]
  b2[first] += matrix[2]
  b2[first + 1] += matrix[7]
  b3[first] += matrix[3]
}

/** D A D for a 4 × 4 row-major A and diagonal scaling d. */
function scaled(a: Float64Array, d: number[]): Float64Array {
  const out = new Float64Array(16)
  for (let p = 0; p < 4; p++) for (let q = 0; q < 4; q++) out[4 * p + q] = a[4 * p + q] * d[p] * d[q]
  return out
}
