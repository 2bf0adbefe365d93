/**
 * The response chart of core (core/charts/response-chart.ts) for any family: core draws |u/F| in
 * the receptance unit (m/N, in/lbf); a bending response is |w/F| in the same unit, a torsional one
 * |θ/T| in rad/(N·m) or rad/(lbf·in). For torsion the amplitudes are handed to core in the
 * receptance unit's scale, so that core's conversion leaves the torsional figure on screen, and
 * the curve's name, the axis title and the tooltip are given the family's own words.
 */
import type { EChartsOption } from 'echarts'
import { responseChartOption, type ResponseChartInput, type ResponseChartOptions } from '../../core/charts/response-chart'
import { escapeHtml, figure } from '../../core/charts/chart-text'
import { formatScientific } from '../../core/report/number-format'
import { displayUnit, hzToRpm } from '../../core/model/units'
import type { Motion } from '../../core/model/project'
import { responseWords } from '../format/design-text'

const CORE_CURVE = '|u/F|'

export function familyResponseOption(input: ResponseChartInput, options: ResponseChartOptions, motion: Motion): EChartsOption {
  if (motion === 'axial') return responseChartOption(input, options)
  const words = responseWords(motion, options.units)
  // SI → shown: core divides by the receptance unit's toSI; hand it (shown value) × that toSI.
  const receptanceToSI = displayUnit(options.units, 'receptance').toSI
  const handed = (si: number) => (motion === 'torsion' ? si * words.ratioFactor * receptanceToSI : si)
  const option = responseChartOption(
    {
      ...input,
      points: input.points.map((p) => ({ frequencyHz: p.frequencyHz, amplitude: handed(p.amplitude) })),
      staticFlexibility: input.staticFlexibility === null ? null : handed(input.staticFlexibility),
    },
    options,
  )
  const rename = (name: unknown) => (name === CORE_CURVE ? words.ratio : name)
  const series = (option.series as { name?: string }[]).map((s) => ({ ...s, name: rename(s.name) }))
  const legend = option.legend as { data?: string[] }
  const yAxis = option.yAxis as { name?: string }
  const tooltip = option.tooltip as Record<string, unknown> | undefined
  return {
    ...option,
    series: series as EChartsOption['series'],
    legend: { ...legend, data: (legend.data ?? []).map((n) => rename(n) as string) },
    yAxis: { ...yAxis, name: `${words.ratio} (${words.ratioUnit})` },
    ...(tooltip
      ? {
          tooltip: {
            ...tooltip,
            formatter: (params: unknown) => {
              const items = (Array.isArray(params) ? params : [params]) as { seriesName?: string; value?: unknown }[]
              const curve = items.find((p) => p.seriesName === words.ratio && Array.isArray(p.value))
              if (!curve) return ''
              const [f, amplitude] = curve.value as number[]
              return [`${figure(f, 5)} Hz · ${figure(hzToRpm(f), 5)} rpm`, `${escapeHtml(words.ratio)} ${formatScientific(amplitude, 3)} ${escapeHtml(words.ratioUnit)}`].join('<br>')
            },
          },
        }
      : {}),
  }
}
