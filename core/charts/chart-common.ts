/**
 * What every chart builder shares: the options they take and the parts of an ECharts
 * option that look the same on every chart (text, axes, tooltip). Builders return plain
 * option objects; ECharts' types are imported as types only, so nothing here loads ECharts.
 */
import type { ScatterSeriesOption, TooltipComponentOption, XAXisComponentOption, YAXisComponentOption } from 'echarts'
import type { UnitSystem } from '../model/units'
import { LIGHT_CHART_PALETTE, type ChartPalette } from './chart-palette'

export interface ChartBuildOptions {
  /** Tooltips, zoom and animation for the app (true); none of them for a static report (false). */
  readonly interactive: boolean
  /** Display units of lengths and stresses (frequencies are always Hz and rpm). */
  readonly units: UnitSystem
  /** Colours; LIGHT_CHART_PALETTE by default. */
  readonly palette?: ChartPalette
  /** A title drawn in the chart (the app names its panels itself and leaves this out). */
  readonly title?: string
}

export function paletteOf(options: ChartBuildOptions): ChartPalette {
  return options.palette ?? LIGHT_CHART_PALETTE
}

/** Top-level settings common to every chart. */
export function baseOption(options: ChartBuildOptions) {
  const palette = paletteOf(options)
  return {
    backgroundColor: palette.background,
    animation: options.interactive,
    textStyle: { color: palette.text, fontFamily: palette.fontFamily, fontSize: 12 },
    ...(options.title ? { title: { text: options.title, left: 8, top: 4, textStyle: { color: palette.text, fontSize: 14, fontWeight: 600 as const } } } : {}),
  }
}

export function tooltipBase(palette: ChartPalette): TooltipComponentOption {
  return {
    backgroundColor: palette.tooltipBackground,
    borderColor: palette.tooltipBorder,
    textStyle: { color: palette.tooltipText, fontSize: 12, fontFamily: palette.fontFamily },
    confine: true,
  }
}

type AxisStyle = Pick<XAXisComponentOption & YAXisComponentOption, 'nameTextStyle' | 'axisLine' | 'axisLabel' | 'splitLine' | 'axisTick'>

export function axisStyle(palette: ChartPalette): AxisStyle {
  return {
    nameTextStyle: { color: palette.mutedText, fontSize: 12 },
    axisLine: { show: true, lineStyle: { color: palette.axisLine } },
    axisTick: { show: true, lineStyle: { color: palette.axisLine } },
    axisLabel: { color: palette.mutedText, fontSize: 11 },
    splitLine: { show: true, lineStyle: { color: palette.splitLine } },
  }
}

/** The smallest of 1, 1.2, 1.5, 2, 2.5, 3, 4, 5, 6, 8 × 10ⁿ not below v (for axis ends). */
export function niceCeil(v: number): number {
  if (!(v > 0)) return 1
  const power = 10 ** Math.floor(Math.log10(v))
  for (const step of [1, 1.2, 1.5, 2, 2.5, 3, 4, 5, 6, 8, 10]) if (step * power >= v * (1 - 1e-12)) return step * power
  return 10 * power
}

/** The name of the series that carries a chart's text labels (no legend entry, no tooltip). */
export const LABEL_SERIES = 'Labels'

/** Where a label's text sits from its anchor point (ECharts' label positions). */
export type LabelPlace = 'left' | 'right' | 'top' | 'bottom' | 'insideTopLeft' | 'insideTopRight' | 'insideBottomLeft' | 'insideBottomRight'

export interface ChartLabel {
  /** The anchor, in data coordinates. */
  readonly at: readonly [number, number]
  readonly text: string
  readonly color: string
  readonly place: LabelPlace
  /** Gap between the anchor and the text, px. */
  readonly distance?: number
  readonly fontSize?: number
  /** Widest the text may get, px; longer text ends in an ellipsis. */
  readonly maxWidth?: number
}

/**
 * A chart's labels as one series of invisible anchors, most important first. The builders place
 * labels apart themselves (labelRows, and grouping of near neighbours); as a last resort ECharts'
 * label layout hides a label that would still overlap one before it (hideOverlap), so two labels
 * never print over each other.
 */
export function labelSeries(labels: readonly ChartLabel[], palette: ChartPalette): ScatterSeriesOption {
  return {
    type: 'scatter',
    name: LABEL_SERIES,
    silent: true,
    symbolSize: 0,
    clip: false,
    z: 6,
    animation: false,
    tooltip: { show: false },
    labelLayout: { hideOverlap: true },
    data: labels.map((l) => ({
      value: [l.at[0], l.at[1]],
      label: {
        show: true,
        position: l.place,
        distance: l.distance ?? 5,
        color: l.color,
        fontSize: l.fontSize ?? 11,
        lineHeight: Math.round((l.fontSize ?? 11) * 1.35),
        // A halo of the background keeps the text legible where lines cross it.
        textBorderColor: palette.background,
        textBorderWidth: 2,
        ...(l.maxWidth ? { width: l.maxWidth, overflow: 'truncate' as const } : {}),
        // A function, not a template string: a user's label may contain ECharts' {…} syntax.
        formatter: () => l.text,
      },
    })),
  }
}

/**
 * Rows for labels along one axis so that neighbours never share a row: positions are fractions of
 * the axis (0…1), and a label goes to the lowest row whose last label is at least `gap` away.
 * Returns each label's row, in the order given.
 */
export function labelRows(positions: readonly number[], gap: number): number[] {
  const order = positions.map((p, i) => ({ p, i })).sort((a, b) => a.p - b.p)
  const rowEnds: number[] = []
  const rows = new Array<number>(positions.length)
  for (const { p, i } of order) {
    let row = rowEnds.findIndex((end) => p - end >= gap)
    if (row < 0) row = rowEnds.push(p) - 1
    else rowEnds[row] = p
    rows[i] = row
  }
  return rows
}

/**
 * Neighbours closer than `gap` (in axis fractions) gathered into runs, so that each run can carry
 * one label: [[0], [1, 2], [3]] for positions 0.1, 0.5, 0.53, 0.9 and gap 0.05. Positions must be
 * ascending.
 */
export function closeRuns(positions: readonly number[], gap: number): number[][] {
  const runs: number[][] = []
  positions.forEach((p, i) => {
    const last = runs.at(-1)
    if (last && p - positions[last.at(-1)!] < gap) last.push(i)
    else runs.push([i])
  })
  return runs
}
