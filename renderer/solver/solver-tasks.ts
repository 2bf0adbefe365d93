/**
 * The work the solver does for the window, as plain functions over core: used by the
 * worker (solver.worker.ts) and, where no worker exists (unit tests), in the page itself.
 * Every result is structured-clone safe: numbers, strings, arrays and plain objects.
 */
import {
  AnalysisInputError,
  analyseProject,
  convergenceStudy,
  modalSummaryCsv,
  type AnalysisSettings,
  type ConvergenceStudy,
  type FamilyAnalysis,
  type MassMatrixKind,
  type ModeResult,
  type Project,
  type ResonancePair,
} from '../../core/index'
import { modelWarnings, type ModelWarning } from '../../core/analysis/model-checks'
import { criticalCompression } from '../../core/analysis/buckling'
import { modeShape, type AnalysisWarning } from '../../core/analysis/modal-analysis'
import { modeShapeChartData, type ModeShapeChartData } from '../../core/charts/mode-shape-chart'
import { modalReportHtml } from '../../core/report/modal-report'
import { familyReference, type FamilyReference } from '../../core/exact/family-reference'
import type { BendingPlane, FamilyKey } from '../../core/model/families'
import { decodeProjectBytes } from '../../core/model/project-bytes'
import { readProjectText, type ProjectReadResult } from '../../core/model/project-schema'

/** A mode shape for the charts and the animation: core's chart data, with the slope along the bar for bending. */
export interface FamilyShapeCurve {
  readonly mode: number
  readonly frequencyHz: number
  readonly rigidBody: boolean
  readonly x: number[]
  /** Axial displacement, twist or deflection, scaled to a largest magnitude of 1 (largest excursion positive). */
  readonly displacement: number[]
  /** Bending only: the slope dw/dx at the same nodes, per unit of peak deflection (1/m); null otherwise. */
  readonly rotation: number[] | null
  readonly strainX: number[]
  /** Axial strain, twist rate or curvature per unit of peak displacement (1/m, or 1/m per rad of peak twist). */
  readonly strain: number[]
  /** Axial stress, largest shear stress, or bending stress at the surface, per unit of peak displacement (Pa/m, Pa/rad for torsion). */
  readonly stress: number[]
}

/** One family's results beside the others: its reference, its mode shapes and its checks. */
export interface SolvedFamily {
  readonly key: FamilyKey
  readonly motion: ModeResult['motion']
  readonly plane: BendingPlane | null
  readonly reference: FamilyReference
  readonly sturmPassed: boolean
  /** Unknowns of this family's model. */
  readonly dofs: number
  readonly shapes: { readonly length: number; readonly segmentBoundaries: number[]; readonly curves: FamilyShapeCurve[] }
}

/** The buckling check of a part whose bending is analysed: the compression it carries (if any) against the least that buckles it. */
export interface BucklingView {
  /** The compression applied, N (0 for a tension or no preload). */
  readonly compression: number
  /** The least compression that buckles the part on its bending supports, N (0 when a support leaves a rotation free). */
  readonly criticalCompression: number
  readonly method: string
}

export interface SolvedModel {
  /** The project these results belong to, as solved. */
  readonly project: Project
  readonly settings: AnalysisSettings
  /** Every family's modes, family after family (axial, torsion, bending), each sorted by frequency. */
  readonly modes: ModeResult[]
  readonly resonance: ResonancePair[]
  readonly families: SolvedFamily[]
  readonly totals: { length: number; mass: number; elements: number; dofs: number }
  readonly sturmPassed: boolean
  readonly solveMs: number
  /** The modal summary table (CSV), ready to export. */
  readonly summaryCsv: string
  /** Checks of trust in the results (residuals, conditioning, Sturm count) and the analysis's own warnings, in words. */
  readonly modelWarnings: ModelWarning[]
  /** Warnings of the analysis itself (buckling proximity, stubby segments, excitations of families not analysed). */
  readonly analysisWarnings: AnalysisWarning[]
  readonly buckling: BucklingView | null
}

/** A part the analysis refuses (a compression at or past the buckling load), named by its JSON path. */
export interface SolveRefusal {
  readonly path: string
  readonly message: string
}

export type SolveOutcome = { readonly ok: true; readonly model: SolvedModel } | { readonly ok: false; readonly refusal: SolveRefusal }

/** Mode shapes of a family for the charts: core's chart data, and for bending the slope at the same nodes. */
export function familyShapes(analysis: FamilyAnalysis): SolvedFamily['shapes'] {
  const data: ModeShapeChartData = modeShapeChartData(analysis)
  const nodeOf = new Map<number, number>()
  analysis.model.mesh.x.forEach((x, i) => nodeOf.set(x, i))
  const curves = data.curves.map((curve, index): FamilyShapeCurve => {
    let rotation: number[] | null = null
    if (analysis.family.motion === 'bending') {
      const shape = modeShape(analysis, index)
      let peak = 0
      for (const v of shape.displacement) if (Math.abs(v) > Math.abs(peak)) peak = v
      const scale = peak === 0 ? 1 : 1 / peak
      rotation = curve.x.map((x) => (shape.rotation?.[nodeOf.get(x) ?? 0] ?? 0) * scale)
    }
    return { ...curve, rotation }
  })
  return { length: data.length, segmentBoundaries: data.segmentBoundaries, curves }
}

function bucklingView(analysis: ReturnType<typeof analyseProject>): BucklingView | null {
  if (!analysis.project.motions.includes('bending')) return null
  if (analysis.buckling) return { compression: analysis.buckling.compression, criticalCompression: analysis.buckling.criticalCompression, method: analysis.buckling.method }
  const critical = criticalCompression(analysis.project, analysis.settings)
  return { compression: 0, criticalCompression: critical.load, method: critical.method }
}

export function solveTask(project: Project): SolveOutcome {
  let analysis: ReturnType<typeof analyseProject>
  try {
    analysis = analyseProject(project)
  } catch (error) {
    if (error instanceof AnalysisInputError) return { ok: false, refusal: { path: error.path, message: error.message.slice(error.path.length + 2) } }
    throw error
  }
  return {
    ok: true,
    model: {
      project,
      settings: analysis.settings,
      modes: analysis.modes,
      resonance: analysis.resonance,
      families: analysis.families.map((f) => ({
        key: f.family.key,
        motion: f.family.motion,
        plane: f.family.plane,
        reference: f.reference,
        sturmPassed: f.sturm.passed,
        dofs: f.model.dofNodes.length,
        shapes: familyShapes(f),
      })),
      totals: analysis.totals,
      sturmPassed: analysis.sturmPassed,
      solveMs: analysis.timing.assembleMs + analysis.timing.solveMs + analysis.timing.referenceMs,
      summaryCsv: modalSummaryCsv(analysis),
      modelWarnings: modelWarnings(analysis),
      analysisWarnings: analysis.warnings,
      buckling: bucklingView(analysis),
    },
  }
}

export interface MassComparisonRow {
  readonly mass: MassMatrixKind
  readonly frequenciesHz: number[]
  readonly errors: (number | null)[]
}

/** The three mass matrices on the project's own mesh for one family, against its reference. */
export interface MassComparison {
  readonly family: FamilyKey
  readonly settings: AnalysisSettings
  readonly referenceHz: number[]
  /** How the reference was found: exactly, or by Richardson extrapolation of two fine meshes. */
  readonly referenceMethod: 'exact' | 'extrapolated' | null
  readonly rows: MassComparisonRow[]
}

export function compareMassesTask(project: Project, familyKey?: FamilyKey): MassComparison {
  const kinds: MassMatrixKind[] = ['consistent', 'lumped', 'mixed']
  let settings: AnalysisSettings = project.analysis
  let reference: FamilyReference | null = null
  let key: FamilyKey = familyKey ?? 'axial'
  const rows = kinds.map((mass) => {
    const analysis = analyseProject(project, { mass }, { withReference: false, ...(familyKey ? { families: [familyKey] } : {}) })
    const family = analysis.families[0]
    key = family.family.key
    settings = { ...analysis.settings, mass: project.analysis.mass }
    reference ??= familyReference(project, family.family, { ...analysis.settings, mass: project.analysis.mass }, project.analysis.modes)
    const frequenciesHz = family.modes.map((m) => m.frequencyHz)
    const errors = frequenciesHz.map((f, i) => {
      const ref = reference!.frequenciesHz[i]
      if (ref === undefined || reference!.method === null) return null
      return ref === 0 ? (f === 0 ? 0 : null) : (f - ref) / ref
    })
    return { mass, frequenciesHz, errors }
  })
  const r = reference as FamilyReference | null
  return { family: key, settings, referenceHz: r?.frequenciesHz ?? [], referenceMethod: r?.method ?? null, rows }
}

/** Convergence of every mass matrix and element order for one family; `onProgress` gets the fraction done. */
export function convergenceTask(project: Project, onProgress: (fraction: number) => void, family?: FamilyKey): ConvergenceStudy {
  return convergenceStudy(project, { onProgress: (fraction) => onProgress(fraction), ...(family ? { family } : {}) })
}

export interface ReportTaskInput {
  readonly project: Project
  /** A study of this same project, when the window has one. */
  readonly convergence: ConvergenceStudy | null
  /** ISO 8601 time of the export. */
  readonly generatedAt: string
  readonly appVersion: string
}

/** The report's self-contained HTML (also the source of the PDF). */
export function reportTask(input: ReportTaskInput): string {
  return modalReportHtml({
    analysis: analyseProject(input.project),
    ...(input.convergence ? { convergence: [input.convergence] } : {}),
    generatedAt: new Date(input.generatedAt),
    appVersion: input.appVersion,
  })
}

/** A project file as the window has it: its bytes (a browser upload) or its text (the desktop app reads and decodes it). */
export type ProjectSource = { readonly bytes: Uint8Array } | { readonly text: string }

/**
 * Reads a project file off the interface thread: decodes its bytes by core's one rule
 * (UTF-8, byte-order mark allowed), parses and validates it. A file that cannot be decoded
 * is refused like any other problem of the whole file.
 */
export function readProjectTask(source: ProjectSource): ProjectReadResult {
  if ('text' in source) return readProjectText(source.text)
  const decoded = decodeProjectBytes(source.bytes)
  if (!decoded.ok) return { ok: false, issues: [{ path: '(file)', message: decoded.message }] }
  return readProjectText(decoded.text)
}
