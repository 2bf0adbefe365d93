/**
 * The main job: a project → the modes of every motion family it asks for (axial, torsion,
 * bending in one or two planes), each mode with its reference beside it (exact, or a Richardson
 * estimate where no exact solution exists), effective mass for support motion of its kind, and
 * the resonance check of every family against the excitations that drive it.
 */
import { nowMs } from '../clock'
import { familyReference, type FamilyReference } from '../exact/family-reference'
import { assembleFamily, type AssembledModel } from '../fe/assemble'
import { beamShapes } from '../fe/beam-element'
import { lowestModes, type SturmCheck } from '../linalg/lowest-modes'
import { analysedFamilies, type BendingPlane, type Family, type FamilyKey } from '../model/families'
import { materialOf, sectionArea, totalLength, totalMass } from '../model/geometry'
import type { AnalysisSettings, ElementOrder, MassMatrixKind, Motion, Project, BendingTheory } from '../model/project'
import { extremeFibre, secondMoments, shearModulus, torsionConstant, torsionRadius } from '../model/section-properties'
import { saintVenantShearStressFactor } from '../model/saint-venant-torsion'
import { checkBuckling, type BucklingCheck } from './buckling'
import { resonancePairs, type ResonancePair } from './resonance'

/** Command-line or screen overrides of the file's `analysis` (and `motions`). */
export interface AnalysisOverrides {
  elementOrder?: ElementOrder
  elementsPerSegment?: number
  maxElementLength?: number
  mass?: MassMatrixKind
  modes?: number
  bendingTheory?: BendingTheory
  motions?: Motion[]
}

export interface ModeResult {
  /** Numbered within its family from 1. */
  readonly mode: number
  readonly motion: Motion
  /** The bending plane of a section with two ("weak", "strong"); null otherwise. */
  readonly plane: BendingPlane | null
  readonly family: FamilyKey
  /** λ = ω² (rad²/s²). */
  readonly eigenvalue: number
  readonly frequencyHz: number
  readonly rigidBody: boolean
  readonly referenceHz: number | null
  /** (f − f_ref) / f_ref. */
  readonly errorVsReference: number | null
  /** Γ = φᵀ M r for support motion r of the family's kind (φ mass-normalised). */
  readonly participationFactor: number | null
  /** Γ²: kg (axial, bending) or kg·m² (torsion: effective polar inertia). */
  readonly effectiveMass: number | null
  readonly effectiveMassFraction: number | null
  readonly cumulativeEffectiveMassFraction: number | null
}

/** One family's analysis: its model, modes and mode shapes. */
export interface FamilyAnalysis {
  readonly family: Family
  readonly project: Project
  readonly settings: AnalysisSettings
  readonly model: AssembledModel
  readonly modes: ModeResult[]
  /** Mode shapes over the unknowns (model.dofNodes), mass-normalised. */
  readonly vectors: Float64Array[]
  readonly reference: FamilyReference
  readonly sturm: SturmCheck
  /** Every mode's iteration met its tolerance (see linalg/lowest-modes.ts). */
  readonly converged: boolean
  readonly timing: { assembleMs: number; solveMs: number; referenceMs: number }
}

export interface AnalysisWarning {
  readonly code: 'buckling-proximity' | 'stubby-segment' | 'excitation-unanalysed' | 'compression-unchecked'
  readonly message: string
}

export interface ModalAnalysis {
  readonly project: Project
  readonly settings: AnalysisSettings
  readonly families: FamilyAnalysis[]
  /** Every family's modes, family by family, each sorted by frequency. */
  readonly modes: ModeResult[]
  readonly totals: { length: number; mass: number; elements: number; dofs: number }
  /** Every family's Sturm check passed. */
  readonly sturmPassed: boolean
  readonly converged: boolean
  readonly resonance: ResonancePair[]
  /** The buckling load of the part where a compression is applied and bending analysed. */
  readonly buckling: BucklingCheck | null
  /** Warnings of the analysis itself (buckling proximity, stubby segments); see also model-checks.ts. */
  readonly warnings: AnalysisWarning[]
  readonly timing: { assembleMs: number; solveMs: number; referenceMs: number; checksMs: number }
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
  const theory = overrides.bendingTheory ?? base.bendingTheory
  if (theory !== undefined) settings.bendingTheory = theory
  return settings
}

/** The project with the overrides' motions, when given. */
export function withMotions(project: Project, overrides: AnalysisOverrides = {}): Project {
  return overrides.motions ? { ...project, motions: overrides.motions } : project
}

export interface AnalyseOptions {
  /** Skip the references (tolerance scatter and sweeps do not need them). */
  readonly withReference?: boolean
  /** A previous analysis of a slightly different part on the same mesh: its modes start the solver. */
  readonly warmStart?: ModalAnalysis
  /**
   * Residual bound at which a mode's iteration stops (default 1e-11, see lowest-modes.ts). The
   * frequency is then accurate to about its square, so 1e-6 suffices where only frequencies are
   * wanted (tolerance scatter) and saves an iteration per mode.
   */
  readonly tolerance?: number
  /** Only these families (default: every analysed one). */
  readonly families?: readonly FamilyKey[]
}

/** A problem with the input that only the analysis finds (a compression past the buckling load), named by its JSON path. */
export class AnalysisInputError extends Error {
  constructor(
    readonly path: string,
    message: string,
  ) {
    super(`${path}: ${message}`)
  }
}

/** Solves one family of a validated project. */
export function analyseFamily(project: Project, family: Family, settings: AnalysisSettings, options: AnalyseOptions = {}): FamilyAnalysis {
  const t0 = nowMs()
  const model = assembleFamily(project, family, {
    order: settings.elementOrder,
    elementsPerSegment: settings.elementsPerSegment,
    maxElementLength: settings.maxElementLength,
    mass: settings.mass,
    bendingTheory: settings.bendingTheory,
  })
  const t1 = nowMs()
  const previous = options.warmStart?.families.find((f) => f.family.key === family.key)
  const warm =
    previous && previous.model.dofNodes.length === model.dofNodes.length
      ? { vectors: previous.vectors, rigidBodyModes: previous.modes.filter((m) => m.rigidBody).length }
      : undefined
  const solution = lowestModes(model.pencil, {
    modes: settings.modes,
    ...(model.layout ? { layout: model.layout } : {}),
    ...(warm ? { warmStart: warm } : {}),
    ...(options.tolerance !== undefined ? { tolerance: options.tolerance } : {}),
  })
  const t2 = nowMs()
  const count = solution.eigenvalues.length
  const reference: FamilyReference =
    options.withReference === false ? { method: null, formulation: null, frequenciesHz: [] } : familyReference(project, family, settings, count)
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
      motion: family.motion,
      plane: family.plane,
      family: family.key,
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
    family,
    project,
    settings,
    model,
    modes,
    vectors: solution.vectors,
    reference,
    sturm: solution.sturm,
    converged: solution.converged,
    timing: { assembleMs: t1 - t0, solveMs: t2 - t1, referenceMs: t3 - t2 },
  }
}

/** Solves a validated project: every family it asks for. Throws AnalysisInputError for a compression the part cannot carry. */
export function analyseProject(project: Project, overrides: AnalysisOverrides = {}, options: AnalyseOptions = {}): ModalAnalysis {
  const analysed = withMotions(project, overrides)
  const settings = effectiveSettings(analysed, overrides)
  const warnings: AnalysisWarning[] = []
  const tChecks = nowMs()
  const buckling = checkBuckling(analysed, settings)
  if (buckling && buckling.ratio >= 1) {
    throw new AnalysisInputError(
      'preload',
      `a compression of ${round(buckling.compression)} N is at or beyond the buckling load of the part on its bending supports, ${round(buckling.criticalCompression)} N (${buckling.method}): the part would buckle. Reduce the compression or add support.`,
    )
  }
  if (buckling && buckling.ratio > 0.5) {
    warnings.push({
      code: 'buckling-proximity',
      message: `The compression of ${round(buckling.compression)} N is ${Math.round(100 * buckling.ratio)} % of the part's buckling load, ${round(buckling.criticalCompression)} N: near buckling the bending frequencies fall steeply and small changes in load or support move them a lot.`,
    })
  }
  if ((analysed.preload ?? 0) < 0 && !analysed.motions.includes('bending')) {
    warnings.push({
      code: 'compression-unchecked',
      message: 'The part carries a compression, but bending is not analysed: Rodwave has not checked it against buckling. Analyse bending (with its supports) to check it.',
    })
  }
  const checksMs = nowMs() - tChecks
  const wanted = analysedFamilies(analysed).filter((f) => !options.families || options.families.includes(f.key))
  const families = wanted.map((family) => analyseFamily(analysed, family, settings, options))
  const modes = families.flatMap((f) => f.modes)
  warnings.push(...stubbySegmentWarnings(analysed, families))
  analysed.excitations.forEach((e, i) => {
    const unanalysed = (e.excites ?? []).filter((m) => !analysed.motions.includes(m))
    if (e.excites && unanalysed.length === e.excites.length) {
      warnings.push({
        code: 'excitation-unanalysed',
        message: `Excitation ${i + 1}${e.label ? ` (“${e.label}”)` : ''} drives only ${unanalysed.join(' and ')}, which is not analysed: it has not been checked against any mode.`,
      })
    }
  })
  const first = families[0]
  const sum = (pick: (f: FamilyAnalysis) => number) => families.reduce((s, f) => s + pick(f), 0)
  return {
    project: analysed,
    settings,
    families,
    modes,
    totals: {
      length: totalLength(analysed.segments),
      mass: totalMass(analysed),
      elements: first ? first.model.mesh.elementCount : 0,
      dofs: sum((f) => f.model.dofNodes.length),
    },
    sturmPassed: families.every((f) => f.sturm.passed),
    converged: families.every((f) => f.converged),
    // The decision rests on the best frequency Rodwave has: the reference where it exists.
    resonance: resonancePairs(
      modes.map((m) => ({ ...m, frequencyHz: m.referenceHz ?? m.frequencyHz })),
      analysed,
    ),
    buckling,
    warnings,
    timing: {
      assembleMs: sum((f) => f.timing.assembleMs),
      solveMs: sum((f) => f.timing.solveMs),
      referenceMs: sum((f) => f.timing.referenceMs),
      checksMs,
    },
  }
}

function round(value: number): string {
  return Number(value.toPrecision(4)).toLocaleString('en-US')
}

/** The family of an analysis by key, or undefined. */
export function familyAnalysis(analysis: ModalAnalysis, key: FamilyKey): FamilyAnalysis | undefined {
  return analysis.families.find((f) => f.family.key === key)
}

/**
 * Bending modes whose half-wavelength in a segment is shorter than 20 radii of gyration there:
 * shear deformation and rotary inertia then lower the frequency noticeably, so the choice of
 * theory matters (common practice, no source: slenderness below about 10–20 per half-wave).
 * Only said under Euler–Bernoulli theory, which leaves both out.
 */
function stubbySegmentWarnings(project: Project, families: FamilyAnalysis[]): AnalysisWarning[] {
  if ((project.analysis.bendingTheory ?? 'euler-bernoulli') === 'timoshenko') return []
  const out: AnalysisWarning[] = []
  for (const f of families) {
    if (f.family.motion !== 'bending') continue
    project.segments.forEach((segment, i) => {
      const material = materialOf(project, segment)
      const area = sectionArea(segment.section, 0.5)
      const inertia = secondMoments(segment.section, 0.5)?.[f.family.plane ?? 'weak']
      if (!inertia) return
      const gyration = Math.sqrt(inertia / area)
      for (const m of f.modes) {
        if (m.rigidBody) continue
        const omega = 2 * Math.PI * (m.referenceHz ?? m.frequencyHz)
        const wavenumber = ((material.density * area * omega * omega) / (material.youngsModulus * inertia)) ** 0.25
        const halfWave = Math.PI / wavenumber
        if (halfWave / gyration < 20 && halfWave < 2 * segment.length) {
          out.push({
            code: 'stubby-segment',
            message: `Segment ${i + 1} is stubby for bending mode ${m.mode}${f.family.plane ? ` (${f.family.plane} plane)` : ''}: half a wavelength there is only ${Math.round(halfWave / gyration)} radii of gyration. Euler–Bernoulli theory leaves out shear deformation and rotary inertia and overestimates such a frequency; use Timoshenko theory.`,
          })
          break
        }
      }
    })
  }
  return out
}

/** Nodal values of a mode: axial displacement, twist (rad) or deflection; for bending also the rotation (rad). */
export function modeShape(analysis: FamilyAnalysis, modeIndex: number): { x: Float64Array; displacement: Float64Array; rotation: Float64Array | null } {
  return nodalField(analysis.model, analysis.vectors[modeIndex])
}

/** A vector over a family's unknowns as nodal values (held ones 0); bending's rotation unknowns unscaled to radians. */
export function nodalField(model: AssembledModel, phi: Float64Array): { x: Float64Array; displacement: Float64Array; rotation: Float64Array | null } {
  const { mesh, dofNodes, dofKinds, rotationScale } = model
  const displacement = new Float64Array(mesh.x.length)
  const rotation = dofKinds ? new Float64Array(mesh.x.length) : null
  for (let j = 0; j < dofNodes.length; j++) {
    if (dofKinds && dofKinds[j] === 1) (rotation as Float64Array)[dofNodes[j]] = phi[j] / rotationScale
    else displacement[dofNodes[j]] = phi[j]
  }
  return { x: mesh.x, displacement, rotation }
}

/**
 * Strain and stress of a mode at both ends of every element (two points per element, so jumps at
 * section changes show): axial strain du/dx and stress E·du/dx; the twist rate dθ/dx and the
 * largest shear stress on the section (G r θ′ on round sections, Saint-Venant's factor on a
 * rectangle); the curvature and the bending stress at the surface E c κ (κ = w″, or ψ′ in
 * Timoshenko theory). A stress that needs a dimension the section does not give (the `area`
 * shape) is NaN.
 */
export function modeStrain(analysis: FamilyAnalysis, modeIndex: number): { x: Float64Array; strain: Float64Array; stress: Float64Array } {
  return fieldStrain(analysis, analysis.vectors[modeIndex])
}

/** modeStrain of any vector over the family's unknowns (a mode, a static or forced response). */
export function fieldStrain(analysis: Pick<FamilyAnalysis, 'model' | 'project' | 'family'>, vector: Float64Array): { x: Float64Array; strain: Float64Array; stress: Float64Array } {
  const { mesh } = analysis.model
  const { project } = analysis
  const { displacement, rotation } = nodalField(analysis.model, vector)
  const count = mesh.elementCount
  const x = new Float64Array(2 * count)
  const strain = new Float64Array(2 * count)
  const stress = new Float64Array(2 * count)
  const motion = analysis.family.motion
  const materials = project.segments.map((s) => materialOf(project, s))
  for (let e = 0; e < count; e++) {
    const segmentIndex = mesh.elementSegment[e]
    const segment = project.segments[segmentIndex]
    const material = materials[segmentIndex]
    const segmentStart = mesh.segmentStart[segmentIndex]
    const order = motion === 'bending' ? 1 : mesh.order
    const first = order * e
    const x0 = mesh.x[first]
    const x1 = mesh.x[first + order]
    const h = x1 - x0
    let start: number
    let end: number
    if (motion === 'bending') {
      // Curvature ψ′ at the element's ends from the element's own interpolation (Hermite cubic,
      // or the Timoshenko element's with its Φ; with Φ = 0 ψ′ is the cubic's w″).
      const r = rotation as Float64Array
      const q = [displacement[e], r[e], displacement[e + 1], r[e + 1]]
      const phi = analysis.model.elementShearParameter?.[e] ?? 0
      const curvature = (t: number) => beamShapes(t, h, phi).dpsi.reduce((sum, n, i) => sum + n * q[i], 0)
      start = curvature(0)
      end = curvature(1)
    } else if (order === 1) {
      start = end = (displacement[first + 1] - displacement[first]) / h
    } else {
      // Quadratic shape functions: du/dx at ξ = −1 and ξ = 1 (dN/dξ = ξ − ½, −2ξ, ξ + ½; dx = h/2 dξ).
      const u0 = displacement[first]
      const u1 = displacement[first + 1]
      const u2 = displacement[first + 2]
      start = ((-1.5 * u0 + 2 * u1 - 0.5 * u2) * 2) / h
      end = ((0.5 * u0 - 2 * u1 + 1.5 * u2) * 2) / h
    }
    const stressPerStrain = (t: number): number => {
      if (motion === 'axial') return material.youngsModulus
      if (motion === 'torsion') {
        const G = shearModulus(material) ?? NaN
        const radius = torsionRadius(segment.section, t)
        if (radius !== undefined) return G * radius
        if (segment.section.shape === 'rectangle') return G * Math.min(segment.section.width, segment.section.height) * saintVenantShearStressFactor(segment.section.width, segment.section.height)
        return NaN
      }
      const c = extremeFibre(segment.section, analysis.family.plane ?? 'weak', t)
      return c === undefined ? NaN : material.youngsModulus * c
    }
    const t0 = (x0 - segmentStart) / segment.length
    const t1 = (x1 - segmentStart) / segment.length
    x[2 * e] = x0
    x[2 * e + 1] = x1
    strain[2 * e] = start
    strain[2 * e + 1] = end
    stress[2 * e] = stressPerStrain(t0) * start
    stress[2 * e + 1] = stressPerStrain(t1) * end
  }
  return { x, strain, stress }
}

/** Section area at a position along the bar (for drawings and stress per force). */
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

/** J at a position along the bar (torsion), m⁴; undefined where the section does not give it. */
export function torsionConstantAlongBar(project: Project, x: number): number | undefined {
  let start = 0
  for (const s of project.segments) {
    if (x <= start + s.length || s === project.segments[project.segments.length - 1]) {
      return torsionConstant(s.section, Math.min(Math.max((x - start) / s.length, 0), 1))
    }
    start += s.length
  }
  return undefined
}
