/**
 * Mesh convergence on log–log axes: |relative frequency error| of one mode against the
 * mesh density (elements per segment, or unknowns) for every mass matrix and element
 * order of a convergence study of one motion family, measured against the family's reference
 * (exact, or a Richardson estimate from two fine meshes, named as such). The legend gives
 * each line's observed order of convergence (the negative slope on these axes). The error
 * axis carries log10 |error| on a value axis (labelled in powers of ten) so each decade is ticked.
 */
import type { EChartsOption, LineSeriesOption } from 'echarts'
import type { ConvergenceSeries, ConvergenceStudy } from '../analysis/convergence'
import type { Family } from '../model/families'
import type { ElementOrder, MassMatrixKind } from '../model/project'
import { axisStyle, baseOption, paletteOf, tooltipBase, type ChartBuildOptions } from './chart-common'
import { escapeHtml, figure } from './chart-text'
import { modeWords } from './chart-families'

export type ConvergenceAxis = 'elements' | 'unknowns'

export interface ConvergenceChartOptions extends ChartBuildOptions {
  /** Mode number (1-based) to plot; default the first elastic mode with a non-zero reference. */
  readonly mode?: number
  /** Mesh density on the horizontal axis (default elements per segment). */
  readonly xAxis?: ConvergenceAxis
}

/** Errors below this are round-off and would only bend the log axis. */
const SMALLEST_SHOWN_ERROR = 1e-14

const MASS_NAMES: Record<MassMatrixKind, string> = { consistent: 'consistent', lumped: 'lumped', mixed: 'mixed' }
const ORDER_NAMES: Record<ElementOrder, string> = { 1: '2-node', 2: '3-node' }

/** "2-node, lumped"; a bending study has Hermite cubic elements only: "Hermite, lumped". */
export function convergenceSeriesLabel(series: Pick<ConvergenceSeries, 'elementOrder' | 'mass'>, family?: Pick<Family, 'motion'>): string {
  return `${family?.motion === 'bending' ? 'Hermite' : ORDER_NAMES[series.elementOrder]}, ${MASS_NAMES[series.mass]}`
}

/** The mode a chart of a study shows, in words with its family: "axial mode 1", "bending mode 2 (weak plane)". */
export function convergenceModeWords(study: Pick<ConvergenceStudy, 'family'>, modeNumber: number): string {
  return modeWords({ mode: modeNumber, family: study.family.key }, true)
}

/** "order 2.00", or "order —" where the errors reached round-off before two meshes could show it. */
export function observedOrderText(series: ConvergenceSeries, modeIndex: number): string {
  const p = series.observedOrder[modeIndex]
  return p === null || p === undefined ? 'order —' : `order ${p.toFixed(2)}`
}

/** The mode a convergence chart shows by default: the first with a non-zero exact reference. */
export function defaultConvergenceMode(study: ConvergenceStudy): number {
  const index = study.referenceHz.findIndex((f) => f > 0)
  return index < 0 ? 1 : index + 1
}

export function convergenceChartOption(study: ConvergenceStudy, options: ConvergenceChartOptions): EChartsOption {
  const palette = paletteOf(options)
  const axis = axisStyle(palette)
  const modeNumber = options.mode ?? defaultConvergenceMode(study)
  const modeIndex = modeNumber - 1
  const byUnknowns = options.xAxis === 'unknowns'
  const massColour: Record<MassMatrixKind, string> = { consistent: palette.series[0], lumped: palette.series[1], mixed: palette.series[2] }
  const reference = study.referenceHz[modeIndex]
  const names: string[] = []
  const series: LineSeriesOption[] = study.series.map((s) => {
    const name = `${convergenceSeriesLabel(s, study.family)} · ${observedOrderText(s, modeIndex)}`
    names.push(name)
    const data = s.points
      .map((p) => ({ x: byUnknowns ? p.dofs : p.elementsPerSegment, error: p.errors[modeIndex] }))
      .filter((p): p is { x: number; error: number } => p.error !== null && p.error !== undefined && Math.abs(p.error) >= SMALLEST_SHOWN_ERROR)
      // The error axis is a value axis of log10 |error|, so every decade gets its tick.
      .map((p) => [p.x, Math.log10(Math.abs(p.error))])
    return {
      type: 'line',
      name,
      data,
      showSymbol: true,
      symbol: s.elementOrder === 1 ? 'circle' : 'triangle',
      symbolSize: 6,
      lineStyle: { width: 1.8, color: massColour[s.mass], type: s.elementOrder === 1 ? 'solid' : 'dashed' },
      itemStyle: { color: massColour[s.mass] },
    }
  })
  const hasReference = study.referenceMethod !== null && reference !== undefined && reference > 0
  const densities = study.series.flatMap((s) => s.points.map((p) => (byUnknowns ? p.dofs : p.elementsPerSegment)))
  // Whole decades on the error axis, one tick each.
  const shownExponents = series.flatMap((s) => (s.data as number[][]).map((p) => p[1]))
  const lowDecade = shownExponents.length ? Math.floor(Math.min(...shownExponents)) : -12
  const highDecade = shownExponents.length ? Math.ceil(Math.max(...shownExponents)) : 0
  const decades = Math.max(1, highDecade - lowDecade)
  const top = options.title ? 40 : 16
  const errorName = study.referenceMethod === 'extrapolated' ? '|f − f_ref| / f_ref' : '|f − f_exact| / f_exact'
  return {
    ...baseOption(options),
    // Room for the legend: two rows for six series (two element types), one for three (bending's Hermite elements only).
    grid: { left: 76, right: 24, top, bottom: names.length > 3 ? 132 : 108 },
    legend: {
      bottom: 6,
      left: 'center',
      orient: 'horizontal',
      itemGap: 14,
      textStyle: { color: palette.text },
      inactiveColor: palette.axisLine,
      data: names,
    },
    xAxis: {
      type: 'log',
      logBase: 10,
      name: byUnknowns ? 'Unknowns of the mesh' : 'Elements per segment',
      ...(densities.length ? { min: Math.min(...densities), max: Math.max(...densities) } : {}),
      nameLocation: 'middle',
      nameGap: 28,
      ...axis,
      axisLabel: { ...axis.axisLabel, formatter: (v: number) => figure(v, 3) },
      splitLine: { show: true, lineStyle: { color: palette.splitLine } },
    },
    yAxis: {
      type: 'value',
      name: `${errorName}, ${convergenceModeWords(study, modeNumber)}`,
      nameLocation: 'middle',
      nameGap: 60,
      min: lowDecade,
      max: lowDecade + decades,
      interval: Math.max(1, Math.ceil(decades / 8)),
      ...axis,
      axisLabel: { ...axis.axisLabel, formatter: (v: number) => figure(10 ** v, 1) },
    },
    ...(hasReference
      ? {}
      : {
          graphic: {
            type: 'text',
            left: 'center',
            top: 'middle',
            style: { text: 'No exact reference for this model: errors cannot be shown', fill: palette.mutedText, fontSize: 13 },
          },
        }),
    ...(options.interactive
      ? {
          tooltip: {
            ...tooltipBase(palette),
            trigger: 'item',
            formatter: (params: unknown) => {
              const p = params as { seriesName?: string; value?: number[]; marker?: string }
              if (!p.value) return ''
              const density = byUnknowns ? `${figure(p.value[0], 6)} unknowns` : `${figure(p.value[0], 6)} elements per segment`
              const against = study.referenceMethod === 'extrapolated' ? 'against the extrapolated reference' : 'against the exact frequency'
              return `${p.marker ?? ''}${escapeHtml(p.seriesName ?? '')}<br>${density}<br>relative error ${figure(10 ** p.value[1], 3)} ${against}`
            },
          },
          dataZoom: [
            { type: 'inside', xAxisIndex: 0, filterMode: 'none' },
            { type: 'inside', yAxisIndex: 0, filterMode: 'none' },
          ],
        }
      : {}),
    series,
  }
}
