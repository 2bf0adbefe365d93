/**
 * The report's figures: the scale drawing (core/drawing) and the charts, built by the same
 * option builders as the app's charts (core/charts, non-interactive) and rendered to SVG.
 */
import type { ConvergenceStudy } from '../analysis/convergence'
import type { ModalAnalysis } from '../analysis/modal-analysis'
import { convergenceChartOption, defaultConvergenceMode } from '../charts/convergence-chart'
import { interferenceChartInput, interferenceChartOption } from '../charts/interference-chart'
import { modeShapeChartData, modeShapeChartOption } from '../charts/mode-shape-chart'
import { barDrawingSvg } from '../drawing/bar-drawing'
import { renderChartSvg } from './chart-svg'

/** The mode-shape chart shows the lowest modes only: more lines could not be told apart. */
export const MODE_SHAPE_CHART_MODES = 6

export interface ConvergenceFigure {
  readonly mode: number
  readonly svg: string
}

export interface ReportFigures {
  readonly barDrawing: string
  readonly modeShapes: string
  /** Modes drawn in the mode-shape chart (1-based). */
  readonly modeShapeModes: number[]
  readonly interference: string
  /** One chart for the lowest elastic mode and one for the highest mode of the study. */
  readonly convergence: ConvergenceFigure[]
}

const CHART_WIDTH = 760
/** Wider, so that the legend of six modes stays on one line. */
const MODE_SHAPE_CHART_WIDTH = 880

export function reportFigures(analysis: ModalAnalysis, convergence: ConvergenceStudy | undefined): ReportFigures {
  const units = analysis.project.units
  const primary = analysis.families[0]
  const shown = primary.modes.slice(0, MODE_SHAPE_CHART_MODES).map((_, i) => i)
  const modeShapes = renderChartSvg(modeShapeChartOption(modeShapeChartData(primary, shown), { interactive: false, units }), { width: MODE_SHAPE_CHART_WIDTH, height: 540 })
  const convergenceFigures: ConvergenceFigure[] = []
  // Without an exact solution there is no error to plot; the tables then give the frequencies themselves.
  if (convergence && convergence.referenceMethod === 'exact') {
    const first = defaultConvergenceMode(convergence)
    const modes = convergence.modes > first ? [first, convergence.modes] : [first]
    for (const mode of modes) {
      convergenceFigures.push({ mode, svg: renderChartSvg(convergenceChartOption(convergence, { interactive: false, units, mode }), { width: CHART_WIDTH, height: 420 }) })
    }
  }
  return {
    barDrawing: barDrawingSvg(analysis.project, { width: CHART_WIDTH, height: 250, fontSize: 11 }),
    modeShapes,
    modeShapeModes: shown.map((i) => i + 1),
    interference: renderChartSvg(interferenceChartOption(interferenceChartInput(analysis), { interactive: false, units }), { width: CHART_WIDTH, height: 460 }),
    convergence: convergenceFigures,
  }
}
