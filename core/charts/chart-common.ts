/**
 * What every chart builder shares: the options they take and the parts of an ECharts
 * option that look the same on every chart (text, axes, tooltip). Builders return plain
 * option objects; ECharts' types are imported as types only, so nothing here loads ECharts.
 */
import type { TooltipComponentOption, XAXisComponentOption, YAXisComponentOption } from 'echarts'
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
