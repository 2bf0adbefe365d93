/**
 * Mode shapes of one motion family along the bar, in the family's own quantities: axial
 * displacement with axial stress or strain; twist with the largest shear stress or the twist
 * rate; deflection with the bending stress at the surface, the curvature or the slope. Each
 * mode is scaled to a largest displacement (twist, deflection) of 1, and the lower plot reads
 * per unit of that peak: the stress a vibration of 1 mm (1 in; for torsion 1 rad) peak amplitude
 * would cause. Built on core's chart parts (core/charts/chart-common.ts), as core's axial chart is.
 */
import type { EChartsOption, LineSeriesOption } from 'echarts'
import type { Motion } from '../../core/model/project'
import { displayUnit, toDisplay, type UnitSystem } from '../../core/model/units'
import { axisStyle, baseOption, paletteOf, tooltipBase, type ChartBuildOptions } from '../../core/charts/chart-common'
import { escapeHtml, figure } from '../../core/charts/chart-text'
import { effectiveLower, upperQuantityName, type ModeShapeLower } from '../../core/charts/mode-shape-chart'
import type { FamilyShapeCurve } from '../solver/solver-tasks'

/** What the lower plot shows: the stress, the strain-like quantity (strain, twist rate, curvature), or (bending) the slope. */
export type ShapeLower = ModeShapeLower

export interface FamilyShapeData {
  readonly motion: Motion
  readonly length: number
  readonly segmentBoundaries: readonly number[]
  /** Each with the name the legend gives it ("Bending 1 · 51.15 Hz"). */
  readonly curves: readonly (FamilyShapeCurve & { readonly name: string })[]
}

/** The lower plots a family offers, in order, with the words of their buttons. */
export function lowerChoices(motion: Motion): { readonly value: ShapeLower; readonly title: string }[] {
  if (motion === 'torsion') return [{ value: 'stress', title: 'shear stress' }, { value: 'strain', title: 'twist rate' }]
  if (motion === 'bending') return [{ value: 'stress', title: 'bending stress' }, { value: 'strain', title: 'curvature' }, { value: 'slope', title: 'slope' }]
  return [{ value: 'stress', title: 'stress' }, { value: 'strain', title: 'strain' }]
}

/**
 * The lower plot's title and unit, and the factor from the SI value (per metre of peak
 * displacement, per radian of peak twist) to the number shown.
 */
export function lowerQuantityOf(motion: Motion, lower: ShapeLower, units: UnitSystem): { name: string; unit: string; factor: number } {
  const stress = displayUnit(units, 'stress')
  const length = displayUnit(units, 'length')
  if (motion === 'torsion') {
    // Per radian of peak twist: Pa/rad → stress unit per rad; the twist rate θ′/θ_peak in 1/m → 1/(length unit).
    // Short names: ECharts shrinks the plot to keep a long axis title inside the chart.
    if (lower === 'strain') return { name: 'Twist rate θ′ per peak θ', unit: `1/${length.symbol}`, factor: length.toSI }
    return { name: 'τ max per peak θ', unit: `${stress.symbol}/rad`, factor: 1 / stress.toSI }
  }
  const per = displayUnit(units, 'sectionDimension')
  const peak = motion === 'bending' ? 'w' : 'u'
  if (lower === 'slope') return { name: `Slope per peak ${peak}`, unit: `rad/${per.symbol}`, factor: per.toSI }
  if (lower === 'strain') {
    if (motion === 'bending') return { name: `κ per peak ${peak}`, unit: `1/(${length.symbol}·${per.symbol})`, factor: per.toSI * length.toSI }
    return { name: `Strain per peak ${peak}`, unit: `µε/${per.symbol}`, factor: per.toSI * 1e6 }
  }
  return { name: motion === 'bending' ? `Surface σ per peak ${peak}` : `Stress per peak ${peak}`, unit: `${stress.symbol}/${per.symbol}`, factor: per.toSI / stress.toSI }
}

export interface FamilyShapeChartOptions extends ChartBuildOptions {
  readonly lower: ShapeLower
}

export function familyShapeChartOption(data: FamilyShapeData, options: FamilyShapeChartOptions): EChartsOption {
  const palette = paletteOf(options)
  const lowerKind = effectiveLower(options.lower, data.motion)
  const lower = lowerQuantityOf(data.motion, lowerKind, options.units)
  const lengthUnit = displayUnit(options.units, 'length')
  const toLength = (x: number) => toDisplay(options.units, 'length', x)
  const axis = axisStyle(palette)
  const colour = (i: number) => palette.series[i % palette.series.length]
  const boundaryLines = data.segmentBoundaries.slice(1, -1).map((x) => ({ xAxis: toLength(x) }))
  const boundarySeries = (gridIndex: number): LineSeriesOption => ({
    type: 'line',
    name: 'Segment boundaries',
    xAxisIndex: gridIndex,
    yAxisIndex: gridIndex,
    data: [],
    silent: true,
    markLine: {
      silent: true,
      symbol: 'none',
      animation: false,
      label: { show: false },
      lineStyle: { color: palette.boundaryLine, type: 'dashed', width: 1 },
      data: boundaryLines,
    },
  })
  const series: LineSeriesOption[] = [boundarySeries(0), boundarySeries(1)]
  data.curves.forEach((curve, i) => {
    series.push({
      type: 'line',
      name: curve.name,
      xAxisIndex: 0,
      yAxisIndex: 0,
      showSymbol: false,
      lineStyle: { width: 2, color: colour(i) },
      itemStyle: { color: colour(i) },
      data: curve.x.map((x, j) => [toLength(x), curve.displacement[j]]),
    })
    const points: [number, number][] =
      lowerKind === 'slope'
        ? curve.x.map((x, j) => [toLength(x), (curve.rotation?.[j] ?? NaN) * lower.factor])
        : curve.strainX.map((x, j) => [toLength(x), (lowerKind === 'strain' ? curve.strain[j] : curve.stress[j]) * lower.factor])
    series.push({
      type: 'line',
      name: curve.name,
      xAxisIndex: 1,
      yAxisIndex: 1,
      showSymbol: false,
      // A stress the section cannot give (an `area` section without its sizes) is a gap, not a zero.
      connectNulls: false,
      lineStyle: { width: 1.6, color: colour(i) },
      itemStyle: { color: colour(i) },
      data: points.map(([x, y]) => [x, Number.isFinite(y) ? y : null]) as LineSeriesOption['data'],
    })
  })
  const xAxis = (gridIndex: number, showName: boolean) => ({
    type: 'value' as const,
    gridIndex,
    min: 0,
    max: toLength(data.length),
    name: showName ? `Position from the start (${lengthUnit.symbol})` : '',
    nameLocation: 'middle' as const,
    nameGap: 26,
    ...axis,
    axisLabel: { ...axis.axisLabel, formatter: (v: number) => figure(v, 4) },
    splitLine: { show: false },
  })
  return {
    ...baseOption(options),
    legend: {
      top: 6,
      left: 'center',
      type: options.interactive ? 'scroll' : 'plain',
      textStyle: { color: palette.text },
      inactiveColor: palette.axisLine,
      data: data.curves.map((c) => c.name),
    },
    grid: [
      { left: 72, right: 24, top: 40, height: '34%' },
      { left: 72, right: 24, top: '60%', bottom: 44 },
    ],
    xAxis: [xAxis(0, false), xAxis(1, true)],
    yAxis: [
      {
        type: 'value',
        gridIndex: 0,
        name: upperQuantityName(data.motion),
        nameLocation: 'middle',
        nameGap: 40,
        min: -1,
        max: 1,
        interval: 0.5,
        ...axis,
        axisLabel: { ...axis.axisLabel, formatter: (v: number) => figure(v, 2) },
      },
      {
        type: 'value',
        gridIndex: 1,
        name: `${lower.name} (${lower.unit})`,
        nameLocation: 'middle',
        nameGap: 52,
        ...axis,
        axisLabel: { ...axis.axisLabel, formatter: (v: number) => figure(v, 3) },
      },
    ],
    ...(options.interactive
      ? {
          tooltip: {
            ...tooltipBase(palette),
            trigger: 'axis',
            axisPointer: { type: 'line', lineStyle: { color: palette.axisLine } },
            formatter: (params: unknown) => axisTooltip(params, lengthUnit.symbol),
          },
          dataZoom: [{ type: 'inside', xAxisIndex: [0, 1], filterMode: 'none' }],
        }
      : {}),
    series,
  }
}

interface AxisTooltipItem {
  seriesName?: string
  marker?: unknown
  value?: unknown
}

function axisTooltip(params: unknown, lengthSymbol: string): string {
  const items = (Array.isArray(params) ? params : [params]) as AxisTooltipItem[]
  const first = items.find((p) => Array.isArray(p.value))
  if (!first) return ''
  const x = (first.value as number[])[0]
  const lines = [`x = ${figure(x, 4)} ${escapeHtml(lengthSymbol)}`]
  for (const p of items) {
    if (!Array.isArray(p.value) || p.seriesName === 'Segment boundaries') continue
    const y = (p.value as (number | null)[])[1]
    lines.push(`${typeof p.marker === 'string' ? p.marker : ''}${escapeHtml(p.seriesName ?? '')}: ${y === null ? '—' : figure(y, 4)}`)
  }
  return lines.join('<br>')
}
