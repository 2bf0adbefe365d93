/**
 * Forced response: the receptance |u/F| (displacement at one point per unit harmonic force at
 * another) against frequency, on a logarithmic amplitude axis and a logarithmic or linear
 * frequency axis. Every excitation band is shaded (a single frequency is a line) in its
 * excitation's colour and named in the legend, every mode the response is built from is marked,
 * and the static value |H(0)| is drawn as a reference where the bar has one (a bar without
 * support has none). Band labels run along the top and mode labels along the foot, in as many
 * rows as it takes to keep neighbours apart (labelRows).
 */
import type { EChartsOption, LineSeriesOption } from 'echarts'
import { bandName, excitationBands, excitationLabel } from '../analysis/resonance'
import type { Excitation } from '../model/project'
import { displayUnit, hzToRpm, toDisplay } from '../model/units'
import { formatScientific } from '../report/number-format'
import { axisStyle, baseOption, labelRows, labelSeries, paletteOf, tooltipBase, type ChartBuildOptions, type ChartLabel } from './chart-common'
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

/** Labels nearer than this fraction of the frequency axis go to different rows (about 55 px on the app's 1100 px plot; a label is 15–40 px wide). */
export const RESPONSE_LABEL_GAP = 0.05
/** Height of a row of labels, px. */
const LABEL_ROW = 14

/** The colour of excitation `index`: the palette's series after the curve's own colour. */
export function excitationColour(palette: ReturnType<typeof paletteOf>, index: number): string {
  return palette.series[1 + (index % (palette.series.length - 1))]
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
  /** Where a frequency sits along the axis, 0 at its start and 1 at its end. */
  const along = (f: number) => (log ? Math.log(f / fMin) / Math.log(fMax / fMin) : (f - fMin) / (fMax - fMin))
  // The amplitude axis spans whole decades, so that labels can sit on its ends.
  const amplitudes = points.map((p) => toShown(p.amplitude)).concat(input.staticFlexibility !== null ? [toShown(input.staticFlexibility)] : [])
  const yMin = amplitudes.length ? 10 ** Math.floor(Math.log10(Math.min(...amplitudes))) : 1e-12
  const yMax = amplitudes.length ? 10 ** Math.ceil(Math.log10(Math.max(...amplitudes)) + 1e-9) : 1
  const bands = excitationBands(input.excitations)
    .filter((b) => b.hz[1] >= fMin && b.hz[0] <= fMax)
    .sort((a, b) => a.hz[0] - b.hz[0])
  const bandText = (lo: number, hi: number) => (lo === hi ? `${figure(lo, 4)} Hz` : `${figure(lo, 4)}–${figure(hi, 4)} Hz`)
  const shortName = (b: (typeof bands)[number]) => (b.order === null ? bandText(b.hz[0], b.hz[1]) : `×${figure(b.order, 3)}`)
  const centre = (b: (typeof bands)[number]) => Math.min(Math.max((b.hz[0] + b.hz[1]) / 2, fMin), fMax)
  const shownModes = input.modes.filter((m) => !m.rigidBody && inRange(m.frequencyHz))

  // One series per excitation: its legend entry names it, its colour marks its bands and their labels.
  const excitationSeries: LineSeriesOption[] = input.excitations.flatMap((e, index) => {
    const own = bands.filter((b) => b.excitationIndex === index)
    if (!own.length) return []
    const colour = excitationColour(palette, index)
    return [
      {
        type: 'line' as const,
        name: excitationLabel(e, index),
        data: [],
        itemStyle: { color: colour },
        lineStyle: { color: colour },
        markArea: {
          silent: true,
          itemStyle: { color: colour, opacity: 0.16, borderColor: colour, borderWidth: 1 },
          label: { show: false },
          data: own.filter((b) => b.hz[1] > b.hz[0]).map((b) => [{ xAxis: Math.max(b.hz[0], fMin), name: `${bandName(b)}: ${bandText(b.hz[0], b.hz[1])}` }, { xAxis: Math.min(b.hz[1], fMax) }]),
        },
        markLine: {
          silent: true,
          symbol: 'none',
          animation: false,
          lineStyle: { color: colour, type: 'solid' as const, width: 1.6 },
          label: { show: false },
          data: own.filter((b) => b.hz[1] === b.hz[0]).map((b) => ({ xAxis: b.hz[0], name: `${bandName(b)}: ${bandText(b.hz[0], b.hz[1])}` })),
        },
      },
    ]
  })

  // Band labels hang from the top edge, mode labels stand on the foot, each in rows that keep neighbours apart.
  const labels: ChartLabel[] = []
  const bandRows = labelRows(bands.map((b) => along(centre(b))), RESPONSE_LABEL_GAP)
  bands.forEach((b, k) =>
    labels.push({ at: [centre(b), yMax], text: shortName(b), color: excitationColour(palette, b.excitationIndex), place: 'bottom', distance: 4 + LABEL_ROW * bandRows[k], fontSize: 10 }),
  )
  const modeRows = labelRows(shownModes.map((m) => along(m.frequencyHz)), RESPONSE_LABEL_GAP)
  shownModes.forEach((m, k) => labels.push({ at: [m.frequencyHz, yMin], text: `mode ${m.mode}`, color: palette.mutedText, place: 'top', distance: 4 + LABEL_ROW * modeRows[k], fontSize: 10 }))
  if (input.staticFlexibility !== null) labels.push({ at: [fMin, toShown(input.staticFlexibility)], text: 'static', color: palette.mutedText, place: 'insideBottomLeft', distance: 3 })

  const series: (LineSeriesOption | ReturnType<typeof labelSeries>)[] = [
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
              label: { show: false },
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
    ...excitationSeries,
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
        label: { show: false },
        data: shownModes.map((m) => ({ xAxis: m.frequencyHz, name: `Mode ${m.mode}` })),
      },
    },
    labelSeries(labels, palette),
  ]

  const top = options.title ? 62 : 40
  return {
    ...baseOption(options),
    legend: {
      type: options.interactive ? 'scroll' : 'plain',
      top: options.title ? 28 : 4,
      left: 'center',
      textStyle: { color: palette.text },
      inactiveColor: palette.axisLine,
      data: ['|u/F|', ...excitationSeries.map((x) => x.name as string), 'Modes'],
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
      min: yMin,
      max: yMax,
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
