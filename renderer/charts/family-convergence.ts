/**
 * The convergence chart of core (core/charts/convergence-chart.ts) for a study of any family:
 * bending has one element, the Hermite cubic, whose series core names by its order ("2-node");
 * and where no exact solution exists the errors are measured against the extrapolated reference,
 * which the axis then says.
 */
import type { EChartsOption } from 'echarts'
import type { ConvergenceSeries, ConvergenceStudy } from '../../core/analysis/convergence'
import { convergenceChartOption, convergenceSeriesLabel, type ConvergenceChartOptions } from '../../core/charts/convergence-chart'

/** A series in words: "2-node, consistent", or for bending "Hermite cubic, consistent" (Timoshenko: "Timoshenko, consistent"). */
export function familySeriesLabel(study: Pick<ConvergenceStudy, 'family'>, series: Pick<ConvergenceSeries, 'elementOrder' | 'mass'>, timoshenko = false): string {
  if (study.family.motion !== 'bending') return convergenceSeriesLabel(series)
  return `${timoshenko ? 'Timoshenko' : 'Hermite cubic'}, ${series.mass}`
}

export function familyConvergenceOption(study: ConvergenceStudy, options: ConvergenceChartOptions & { readonly timoshenko?: boolean }): EChartsOption {
  const option = convergenceChartOption(study, options)
  const bending = study.family.motion === 'bending'
  const rename = (name: string) => (bending ? name.replace(/^[23]-node/, options.timoshenko ? 'Timoshenko' : 'Hermite cubic') : name)
  const series = (option.series as { name?: string }[]).map((s) => ({ ...s, ...(s.name !== undefined ? { name: rename(s.name) } : {}) }))
  const legend = option.legend as { data?: string[] }
  const yAxis = option.yAxis as { name?: string }
  const extrapolated = study.referenceMethod === 'extrapolated'
  return {
    ...option,
    series: series as EChartsOption['series'],
    legend: { ...legend, data: (legend.data ?? []).map(rename) },
    yAxis: { ...yAxis, ...(extrapolated && yAxis.name ? { name: yAxis.name.replace(/f_exact/g, 'f_ref') } : {}) },
  }
}
