/**
 * The main job: a project → its axial modes, each with the exact reference beside it,
 * effective mass for support motion along the axis, and the resonance check.
 */
import { nowMs } from '../clock'
import { exactReference, type ExactReference } from '../exact/reference'
import { assembleModel, type AssembledModel } from '../fe/assemble'
import { lowestModes, type SturmCheck } from '../linalg/lowest-modes'
import { materialOf, sectionArea, totalLength } from '../model/geometry'
import type { AnalysisSettings, ElementOrder, MassMatrixKind, Project } from '../model/project'
import { resonancePairs, type ResonancePair } from './resonance'

/** Command-line or screen overrides of the file's `analysis`. */
export interface AnalysisOverrides {
  elementOrder?: ElementOrder
  elementsPerSegment?: number
  maxElementLength?: number
  mass?: MassMatrixKind
  modes?: number
}

export interface ModeResult {
  readonly mode: number
  /** λ = ω² (rad²/s²). */
  readonly eigenvalue: number
  readonly frequencyHz: number
  readonly rigidBody: boolean
  readonly referenceHz: number | null
  /** (f − f_ref) / f_ref. */
  readonly errorVsReference: number | null
  /** Γ = φᵀ M r for support motion r along the axis (φ mass-normalised). */
  readonly participationFactor: number | null
  /** Γ², kg. */
  readonly effectiveMass: number | null
  readonly effectiveMassFraction: number | null
  readonly cumulativeEffectiveMassFraction: number | null
}

export interface ModalAnalysis {
  readonly project: Project
  readonly settings: AnalysisSettings
  readonly model: AssembledModel
  readonly modes: ModeResult[]
  /** Mode shapes over the unknowns (model.dofNodes), mass-normalised. */
  readonly vectors: Float64Array[]
  readonly reference: ExactReference
  readonly totals: { length: number; mass: number; elements: number; dofs: number }
  readonly sturm: SturmCheck
  /** Every mode's iteration met its tolerance (see linalg/lowest-modes.ts). */
  readonly converged: boolean
  readonly resonance: ResonancePair[]
  readonly timing: { assembleMs: number; solveMs: number; referenceMs: number }
}

export function effectiveSettings(project: Project, overrides: AnalysisOverrides = {}): AnalysisSettings {
  const base = project.analysis
  const settings: AnalysisSettings = {
    elementOrder: overrides.elementOrder ?? base.elementOrder,
    mass: overrides.mass ?? base.mass,
    modes: overrides.modes ?? base.modes,
  }
  if (overrides.elementsPerSegment !== undefined) settings.elementsPerSegment = overrides.elementsPerSegment
  else if (overrides.maxElementLength !== undefined) settings.maxElementLength = overrides.maxElementLength
  else if (base.maxElementLength !== undefined) settings.maxElementLength = base.maxElementLength
  else settings.elementsPerSegment = base.elementsPerSegment ?? 40
  return settings
}

export interface AnalyseOptions {
  /** Skip the exact reference (tolerance scatter and sweeps do not need it). */
  readonly withReference?: boolean
  /** A previous analysis of a slightly different part on the same mesh: its modes start the solver. */
  readonly warmStart?: ModalAnalysis
  /**
   * Residual bound at which a mode's iteration stops (default 1e-11, see lowest-modes.ts). The
   * frequency is then accurate to about its square, so 1e-6 suffices where only frequencies are
   * wanted (tolerance scatter) and saves an iteration per mode.
   */
  readonly tolerance?: number
}

/** Solves a validated project. */
export function analyseProject(project: Project, overrides: AnalysisOverrides = {}, options: AnalyseOptions = {}): ModalAnalysis {
  const settings = effectiveSettings(project, overrides)
  const t0 = nowMs()
  const model = assembleModel(project, {
    order: settings.elementOrder,
    elementsPerSegment: settings.elementsPerSegment,
    maxElementLength: settings.maxElementLength,
    mass: settings.mass,
  })
  const t1 = nowMs()
  const previous = options.warmStart
  const warm =
    previous && previous.model.dofNodes.length === model.dofNodes.length
      ? { vectors: previous.vectors, rigidBodyModes: previous.modes.filter((m) => m.rigidBody).length }
      : undefined
  const solution = lowestModes(model.pencil, {
    modes: settings.modes,
    ...(warm ? { warmStart: warm } : {}),
    ...(options.tolerance !== undefined ? { tolerance: options.tolerance } : {}),
  })
  const t2 = nowMs()
  const count = solution.eigenvalues.length
  const reference: ExactReference =
    options.withReference === false ? { method: null, formulation: null, frequenciesHz: [] } : exactReference(project, count)
  const t3 = nowMs()
  const influence = model.supportInfluence
  const modes: ModeResult[] = []
  let cumulative = 0
  for (let i = 0; i < count; i++) {
    const lambda = solution.eigenvalues[i]
    const rigidBody = i < solution.rigidBodyModes
    const frequencyHz = rigidBody ? 0 : Math.sqrt(Math.max(lambda, 0)) / (2 * Math.PI)
    const referenceHz = reference.frequenciesHz[i] ?? null
    const errorVsReference = referenceHz === null ? null : referenceHz === 0 ? (frequencyHz === 0 ? 0 : null) : (frequencyHz - referenceHz) / referenceHz
    let participationFactor: number | null = null
    let effectiveMass: number | null = null
    let effectiveMassFraction: number | null = null
    let cumulativeFraction: number | null = null
    if (influence) {
      const phi = solution.vectors[i]
      let gamma = 0
      for (let j = 0; j < phi.length; j++) gamma += phi[j] * influence[j]
      participationFactor = gamma
      effectiveMass = gamma * gamma
      effectiveMassFraction = effectiveMass / model.totalMass
      cumulative += effectiveMassFraction
      cumulativeFraction = cumulative
    }
    modes.push({
      mode: i + 1,
      eigenvalue: lambda,
      frequencyHz,
      rigidBody,
      referenceHz,
      errorVsReference,
      participationFactor,
      effectiveMass,
      effectiveMassFraction,
      cumulativeEffectiveMassFraction: cumulativeFraction,
    })
  }
  return {
    project,
    settings,
    model,
    modes,
    vectors: solution.vectors,
    reference,
    totals: {
      length: totalLength(project.segments),
      mass: model.totalMass,
      elements: model.mesh.elementCount,
      dofs: model.dofNodes.length,
    },
    sturm: solution.sturm,
    converged: solution.converged,
    // The decision rests on the best frequency Rodwave has: the exact one where it exists.
    resonance: resonancePairs(
      modes.map((m) => ({ ...m, frequencyHz: m.referenceHz ?? m.frequencyHz })),
      project,
    ),
    timing: { assembleMs: t1 - t0, solveMs: t2 - t1, referenceMs: t3 - t2 },
  }
}

/** Axial displacement of a mode at every node (0 at fixed ends), with the node positions. */
export function modeShape(analysis: ModalAnalysis, modeIndex: number): { x: Float64Array; displacement: Float64Array } {
  const { mesh, dofNodes } = analysis.model
  const displacement = new Float64Array(mesh.x.length)
  const phi = analysis.vectors[modeIndex]
  for (let j = 0; j < dofNodes.length; j++) displacement[dofNodes[j]] = phi[j]
  return { x: mesh.x, displacement }
}

/**
 * Axial strain du/dx and stress E·du/dx of a mode, at both ends of every element
 * (two points per element, so jumps at section changes show): x, strain, stress.
 */
export function modeStrain(analysis: ModalAnalysis, modeIndex: number): { x: Float64Array; strain: Float64Array; stress: Float64Array } {
  const { mesh } = analysis.model
  const { displacement } = modeShape(analysis, modeIndex)
  const count = mesh.elementCount
  const order = mesh.order
  const x = new Float64Array(2 * count)
  const strain = new Float64Array(2 * count)
  const stress = new Float64Array(2 * count)
  const moduli = analysis.project.segments.map((s) => materialOf(analysis.project, s).youngsModulus)
  for (let e = 0; e < count; e++) {
    const first = order * e
    const x0 = mesh.x[first]
    const x1 = mesh.x[first + order]
    const h = x1 - x0
    const E = moduli[mesh.elementSegment[e]]
    let start: number
    let end: number
    if (order === 1) {
      start = end = (displacement[first + 1] - displacement[first]) / h
    } else {
      // Quadratic shape functions: du/dx at ξ = −1 and ξ = 1 (dN/dξ = ξ − ½, −2ξ, ξ + ½; dx = h/2 dξ).
      const u0 = displacement[first]
      const u1 = displacement[first + 1]
      const u2 = displacement[first + 2]
      start = ((-1.5 * u0 + 2 * u1 - 0.5 * u2) * 2) / h
      end = ((0.5 * u0 - 2 * u1 + 1.5 * u2) * 2) / h
    }
    x[2 * e] = x0
    x[2 * e + 1] = x1
    strain[2 * e] = start
    strain[2 * e + 1] = end
    stress[2 * e] = E * start
    stress[2 * e + 1] = E * end
  }
  return { x, strain, stress }
}

/** Section area at each node position (for drawings and stress per force). */
export function areaAlongBar(project: Project, x: number): number {
  let start = 0
  for (const s of project.segments) {
    if (x <= start + s.length || s === project.segments[project.segments.length - 1]) {
      return sectionArea(s.section, Math.min(Math.max((x - start) / s.length, 0), 1))
    }
    start += s.length
  }
  return NaN
}
