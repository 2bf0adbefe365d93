/**
 * Forced response: the receptance |u/F| (displacement at one point per unit harmonic force at
 * another) against frequency, on a logarithmic amplitude axis and a logarithmic or linear
 * frequency axis. Every excitation band is shaded (a single frequency is a line), every mode
 * the response is built from is marked, and the static value |H(0)| is drawn as a reference
 * where the bar has one (a bar without support has none).
 */
import type { EChartsOption, LineSeriesOption } from 'echarts'
import { bandName, excitationBands } from '../analysis/resonance'
import type { Excitation } from '../model/project'
import { displayUnit, hzToRpm, toDisplay } from '../model/units'
import { formatScientific } from '../report/number-format'
import { axisStyle, baseOption, paletteOf, tooltipBase, type ChartBuildOptions } from './chart-common'
import { escapeHtml, figure } from './chart-text'

export interface ResponseChartInput {
  /** |u/F| in m/N at each frequency, ascending. */
  readonly points: readonly { readonly frequencyHz: number; readonly amplitude: number }[]
  readonly modes: readonly { readonly mode: number; readonly frequencyHz: number; readonly rigidBody: boolean }[]
  readonly excitations: readonly Excitation[]
  /** |H(0)|, m/N; null for a bar without support. */
  readonly staticFlexibility: number | null
}

export type ResponseFrequencyAxis = 'log' | 'linear'

export interface ResponseChartOptions extends ChartBuildOptions {
  /** Default logarithmic: the modes of a bar spread over decades. */
  readonly frequencyAxis?: ResponseFrequencyAxis
}

/** "1 × 10⁻⁸": the labels of a logarithmic axis. */
function powerOfTen(v: number): string {
  return formatScientific(v, 1)
}

export function responseChartOption(input: ResponseChartInput, options: ResponseChartOptions): EChartsOption {
  const palette = paletteOf(options)
  const axis = axisStyle(palette)
  const log = (options.frequencyAxis ?? 'log') === 'log'
  const unit = displayUnit(options.units, 'receptance')
  const toShown = (metresPerNewton: number) => toDisplay(options.units, 'receptance', metresPerNewton)
  // A log axis shows neither 0 Hz nor a zero amplitude.
  const points = input.points.filter((p) => p.amplitude > 0 && Number.isFinite(p.amplitude) && (!log || p.frequencyHz > 0))
  const fMin = points[0]?.frequencyHz ?? 0
  const fMax = points[points.length - 1]?.frequencyHz ?? 1
  const inRange = (f: number) => f >= fMin && f <= fMax
  // In frequency order, so that neighbouring bands' labels can alternate between two rows.
  const bands = excitationBands(input.excitations)
    .filter((b) => b.hz[1] >= fMin && b.hz[0] <= fMax)
    .sort((a, b) => a.hz[0] - b.hz[0])
  const bandText = (lo: number, hi: number) => (lo === hi ? `${figure(lo, 4)} Hz` : `${figure(lo, 4)}–${figure(hi, 4)} Hz`)
  const shortName = (b: (typeof bands)[number]) => (b.order === null ? bandText(b.hz[0], b.hz[1]) : `×${figure(b.order, 3)}`)
  // A range is labelled inside the plot's top, a single frequency just above it (a line's inside labels turn with the line).
  const bandLabel = (k: number, text: string) => ({ show: true, distance: 3 + 13 * (k % 2), color: palette.frequencyLine, fontSize: 10, formatter: () => text })

  const series: LineSeriesOption[] = [
    {
      type: 'line',
      name: '|u/F|',
      data: points.map((p) => [p.frequencyHz, toShown(p.amplitude)]),
      showSymbol: false,
      lineStyle: { width: 1.8, color: palette.series[0] },
      itemStyle: { color: palette.series[0] },
      z: 3,
      ...(input.staticFlexibility !== null
        ? {
            markLine: {
              silent: true,
              symbol: 'none',
              animation: false,
              lineStyle: { color: palette.mutedText, type: 'dotted', width: 1.2 },
              label: { show: true, position: 'insideStartTop', color: palette.mutedText, fontSize: 11, formatter: () => 'static' },
              // A line between two points: ECharts does not place a bare numeric yAxis level on a log axis.
              data: [
                [
                  { coord: [fMin, toShown(input.staticFlexibility)] },
                  { coord: [fMax, toShown(input.staticFlexibility)] },
                ],
              ],
            },
          }
        : {}),
    },
    {
      type: 'line',
      name: 'Excitation bands',
      data: [],
      itemStyle: { color: palette.frequencyLine },
      markArea: {
        silent: true,
        itemStyle: { color: palette.frequencyBand, borderColor: palette.frequencyLine, borderWidth: 1 },
        data: bands
          .map((b, k) => ({ b, k }))
          .filter(({ b }) => b.hz[1] > b.hz[0])
          .map(({ b, k }) => [{ xAxis: Math.max(b.hz[0], fMin), name: `${bandName(b)}: ${bandText(b.hz[0], b.hz[1])}`, label: { ...bandLabel(k, shortName(b)), position: 'insideTop' as const } }, { xAxis: Math.min(b.hz[1], fMax) }]),
      },
      markLine: {
        silent: true,
        symbol: 'none',
        animation: false,
        lineStyle: { color: palette.frequencyLine, type: 'solid', width: 1.6 },
        data: bands
          .map((b, k) => ({ b, k }))
          .filter(({ b }) => b.hz[1] === b.hz[0])
          .map(({ b, k }) => ({ xAxis: b.hz[0], name: `${bandName(b)}: ${bandText(b.hz[0], b.hz[1])}`, label: { ...bandLabel(k, shortName(b)), position: 'end' as const } })),
      },
    },
    {
      type: 'line',
      name: 'Modes',
      data: [],
      itemStyle: { color: palette.boundaryLine },
      markLine: {
        silent: true,
        symbol: 'none',
        animation: false,
        lineStyle: { color: palette.boundaryLine, type: 'dashed', width: 1 },
        // Along the line, at its foot: clear of the band labels at the top and of the axis labels below.
        label: { show: true, position: 'insideStartTop', color: palette.mutedText, fontSize: 10 },
        data: input.modes
          .filter((m) => !m.rigidBody && inRange(m.frequencyHz))
          .map((m) => ({ xAxis: m.frequencyHz, name: `Mode ${m.mode}`, label: { formatter: () => `mode ${m.mode}` } })),
      },
    },
  ]

  const top = options.title ? 62 : 40
  return {
    ...baseOption(options),
    legend: {
      top: options.title ? 28 : 4,
      left: 'center',
      textStyle: { color: palette.text },
      inactiveColor: palette.axisLine,
      data: ['|u/F|', 'Excitation bands', 'Modes'],
    },
    grid: { left: 84, right: 28, top: top + 14, bottom: 46 },
    xAxis: {
      type: log ? 'log' : 'value',
      ...(log ? { logBase: 10 } : {}),
      min: fMin,
      max: fMax,
      name: 'Frequency (Hz)',
      nameLocation: 'middle',
      nameGap: 28,
      ...axis,
      // The ends of a log axis fall between decades: their labels would crowd the round ones.
      axisLabel: { ...axis.axisLabel, formatter: (v: number) => figure(v, 4), showMinLabel: !log, showMaxLabel: !log },
    },
    yAxis: {
      type: 'log',
      logBase: 10,
      name: `|u/F| (${unit.symbol})`,
      nameLocation: 'middle',
      nameGap: 66,
      ...axis,
      axisLabel: { ...axis.axisLabel, formatter: (v: number) => powerOfTen(v) },
    },
    ...(options.interactive
      ? {
          tooltip: {
            ...tooltipBase(palette),
            trigger: 'axis',
            axisPointer: { type: 'line', lineStyle: { color: palette.axisLine } },
            formatter: (params: unknown) => {
              const items = (Array.isArray(params) ? params : [params]) as { seriesName?: string; value?: unknown }[]
              const curve = items.find((p) => p.seriesName === '|u/F|' && Array.isArray(p.value))
              if (!curve) return ''
              const [f, amplitude] = curve.value as number[]
              const lines = [`${figure(f, 5)} Hz · ${figure(hzToRpm(f), 5)} rpm`, `|u/F| ${formatScientific(amplitude, 3)} ${escapeHtml(unit.symbol)}`]
              for (const b of bands) if (f >= b.hz[0] && f <= b.hz[1]) lines.push(`in ${escapeHtml(bandName(b))}`)
              return lines.join('<br>')
            },
          },
          dataZoom: [{ type: 'inside', xAxisIndex: 0, filterMode: 'none' }],
        }
      : {}),
    series,
  }
}
