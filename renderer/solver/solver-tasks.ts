/**
 * The work the solver does for the window, as plain functions over core: used by the
 * worker (solver.worker.ts) and, where no worker exists (unit tests), in the page itself.
 * Every result is structured-clone safe: numbers, strings, arrays and plain objects.
 */
import {
  analyseProject,
  convergenceStudy,
  exactReference,
  modalSummaryCsv,
  type AnalysisSettings,
  type ConvergenceStudy,
  type MassMatrixKind,
  type ModeResult,
  type Project,
  type ResonancePair,
} from '../../core/index'
import { modelWarnings, type ModelWarning } from '../../core/analysis/model-checks'
import { modeShapeChartData, type ModeShapeChartData } from '../../core/charts/mode-shape-chart'
import { modalReportHtml } from '../../core/report/modal-report'
import type { FamilyReference } from '../../core/exact/family-reference'
import { decodeProjectBytes } from '../../core/model/project-bytes'
import { readProjectText, type ProjectReadResult } from '../../core/model/project-schema'

export interface SolvedModel {
  /** The project these results belong to, as solved. */
  readonly project: Project
  readonly settings: AnalysisSettings
  readonly modes: ModeResult[]
  readonly resonance: ResonancePair[]
  readonly reference: FamilyReference
  readonly totals: { length: number; mass: number; elements: number; dofs: number }
  readonly sturmPassed: boolean
  readonly solveMs: number
  /** Mode shapes of every mode, thinned for charts. */
  readonly shapes: ModeShapeChartData
  /** The modal summary table (CSV), ready to export. */
  readonly summaryCsv: string
  /** Checks of trust in the results (residuals, conditioning, Sturm count), in words. */
  readonly modelWarnings: ModelWarning[]
}

export function solveTask(project: Project): SolvedModel {
  const analysis = analyseProject(project)
  return {
    project,
    settings: analysis.settings,
    modes: analysis.modes,
    resonance: analysis.resonance,
    reference: analysis.families[0].reference,
    totals: analysis.totals,
    sturmPassed: analysis.sturmPassed,
    solveMs: analysis.timing.assembleMs + analysis.timing.solveMs + analysis.timing.referenceMs,
    shapes: modeShapeChartData(analysis.families[0]),
    summaryCsv: modalSummaryCsv(analysis),
    modelWarnings: modelWarnings(analysis),
  }
}

export interface MassComparisonRow {
  readonly mass: MassMatrixKind
  readonly frequenciesHz: number[]
  readonly errors: (number | null)[]
}

/** The three mass matrices on the project's own mesh, against the exact reference. */
export interface MassComparison {
  readonly settings: AnalysisSettings
  readonly referenceHz: number[]
  readonly rows: MassComparisonRow[]
}

export function compareMassesTask(project: Project): MassComparison {
  const reference = exactReference(project, project.analysis.modes)
  const kinds: MassMatrixKind[] = ['consistent', 'lumped', 'mixed']
  let settings: AnalysisSettings = project.analysis
  const rows = kinds.map((mass) => {
    const analysis = analyseProject(project, { mass }, { withReference: false })
    settings = { ...analysis.settings, mass: project.analysis.mass }
    const frequenciesHz = analysis.modes.map((m) => m.frequencyHz)
    const errors = frequenciesHz.map((f, i) => {
      const ref = reference.frequenciesHz[i]
      if (ref === undefined || reference.method === null) return null
      return ref === 0 ? (f === 0 ? 0 : null) : (f - ref) / ref
    })
    return { mass, frequenciesHz, errors }
  })
  return { settings, referenceHz: reference.frequenciesHz, rows }
}

/** Convergence of every mass matrix and element order; `onProgress` gets the fraction done. */
export function convergenceTask(project: Project, onProgress: (fraction: number) => void): ConvergenceStudy {
  return convergenceStudy(project, { onProgress: (fraction) => onProgress(fraction) })
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
