/**
 * The report's figures: the scale drawing (core/drawing) and the charts, built by the same
 * option builders as the app's charts (core/charts, non-interactive) and rendered to SVG —
 * per motion family its mode shapes and, where a convergence study of it is given, the
 * convergence of its lowest elastic and highest studied mode; one interference diagram.
 */
import type { ConvergenceStudy } from '../analysis/convergence'
import type { FamilyAnalysis, ModalAnalysis } from '../analysis/modal-analysis'
import { convergenceChartOption, defaultConvergenceMode } from '../charts/convergence-chart'
import { interferenceChartInput, interferenceChartOption } from '../charts/interference-chart'
import { modeShapeChartData, modeShapeChartOption } from '../charts/mode-shape-chart'
import { barDrawingSvg } from '../drawing/bar-drawing'
import type { FamilyKey } from '../model/families'
import { renderChartSvg } from './chart-svg'

/** The mode-shape chart shows the lowest modes only: more lines could not be told apart. */
export const MODE_SHAPE_CHART_MODES = 6

export interface ConvergenceFigure {
  readonly mode: number
  readonly svg: string
}

export interface FamilyFigures {
  readonly key: FamilyKey
  readonly modeShapes: string
  /** Modes drawn in the mode-shape chart (1-based). */
  readonly modeShapeModes: number[]
  /** The family's study, when one was given. */
  readonly study: ConvergenceStudy | undefined
  /** One chart for the lowest elastic mode and one for the highest mode of the study. */
  readonly convergence: ConvergenceFigure[]
}

export interface ReportFigures {
  readonly barDrawing: string
  readonly interference: string
  /** In the order of analysis.families. */
  readonly families: FamilyFigures[]
  /** The first family's, as in version 1. */
  readonly modeShapes: string
  readonly modeShapeModes: number[]
  readonly convergence: ConvergenceFigure[]
}

const CHART_WIDTH = 760
/** Wider, so that the legend of six modes stays on one line. */
const MODE_SHAPE_CHART_WIDTH = 880

/** The study of a family among those given (by its family key), if any. */
export function studyOf(studies: readonly ConvergenceStudy[], key: FamilyKey): ConvergenceStudy | undefined {
  return studies.find((s) => s.family.key === key)
}

function familyFigures(family: FamilyAnalysis, study: ConvergenceStudy | undefined, units: ModalAnalysis['project']['units']): FamilyFigures {
  const shown = family.modes.slice(0, MODE_SHAPE_CHART_MODES).map((_, i) => i)
  const modeShapes = renderChartSvg(modeShapeChartOption(modeShapeChartData(family, shown), { interactive: false, units }), { width: MODE_SHAPE_CHART_WIDTH, height: 540 })
  const convergence: ConvergenceFigure[] = []
  // Without a reference there is no error to plot; the tables then give the frequencies themselves.
  if (study && study.referenceMethod !== null) {
    const first = defaultConvergenceMode(study)
    const modes = study.modes > first ? [first, study.modes] : [first]
    for (const mode of modes) convergence.push({ mode, svg: renderChartSvg(convergenceChartOption(study, { interactive: false, units, mode }), { width: CHART_WIDTH, height: 420 }) })
  }
  return { key: family.family.key, modeShapes, modeShapeModes: shown.map((i) => i + 1), study, convergence }
}

export function reportFigures(analysis: ModalAnalysis, studies: readonly ConvergenceStudy[] = []): ReportFigures {
  const units = analysis.project.units
  const families = analysis.families.map((f) => familyFigures(f, studyOf(studies, f.family.key), units))
  const first = families[0]
  return {
    barDrawing: barDrawingSvg(analysis.project, { width: CHART_WIDTH, height: 250, fontSize: 11 }),
    interference: renderChartSvg(interferenceChartOption(interferenceChartInput(analysis), { interactive: false, units }), { width: CHART_WIDTH, height: 460 }),
    families,
    modeShapes: first?.modeShapes ?? '',
    modeShapeModes: first?.modeShapeModes ?? [],
    convergence: first?.convergence ?? [],
  }
}
