/**
 * Mode shapes along the bar: axial displacement (top) and axial stress or strain
 * (bottom) of the chosen modes, with the segment boundaries marked.
 *
 * Mass-normalised shapes have no physical amplitude, so each mode is scaled to a largest
 * displacement of 1 (largest excursion positive); its strain and stress are scaled by
 * the same factor and read as "per unit of peak displacement": the stress a vibration
 * of 1 mm peak amplitude (or 1 in) would cause, which is what an engineer can use.
 */
import type { EChartsOption, LineSeriesOption } from 'echarts'
import { modeShape, modeStrain, type FamilyAnalysis } from '../analysis/modal-analysis'
import { segmentBoundaries, totalLength } from '../model/geometry'
import { displayUnit, toDisplay, type UnitSystem } from '../model/units'
import { axisStyle, baseOption, paletteOf, tooltipBase, type ChartBuildOptions } from './chart-common'
import { escapeHtml, figure } from './chart-text'

export interface ModeShapeCurve {
  readonly mode: number
  readonly frequencyHz: number
  readonly rigidBody: boolean
  /** Node positions, m. */
  readonly x: number[]
  /** Displacement scaled to a largest magnitude of 1, the largest excursion positive. */
  readonly displacement: number[]
  /** Positions of the strain samples, m: both ends of every element, so jumps at steps show. */
  readonly strainX: number[]
  /** Strain per metre of peak displacement, 1/m. */
  readonly strain: number[]
  /** Stress per metre of peak displacement, Pa/m. */
  readonly stress: number[]
}

export interface ModeShapeChartData {
  /** Bar length, m. */
  readonly length: number
  /** x of every segment boundary, m. */
  readonly segmentBoundaries: number[]
  readonly curves: ModeShapeCurve[]
}

/**
 * Chart data of the chosen modes (0-based indices; all modes by default). Meshes finer than
 * `maxPoints` nodes are thinned evenly, always keeping the nodes at segment boundaries and
 * attachments, so a chart of a million-unknown model stays light.
 */
export function modeShapeChartData(analysis: FamilyAnalysis, modeIndices?: readonly number[], maxPoints = 2000): ModeShapeChartData {
  const indices = modeIndices ?? analysis.modes.map((_, i) => i)
  const mesh = analysis.model.mesh
  const nodeCount = mesh.x.length
  const keepNodes = thinned(nodeCount, maxPoints, [...mesh.segmentBoundaryNodes, ...mesh.massNodes, ...mesh.springNodes])
  const elementCount = mesh.elementCount
  const boundaryElements: number[] = []
  for (let i = 0; i < elementCount; i++) {
    if (i === 0 || mesh.elementSegment[i - 1] !== mesh.elementSegment[i]) boundaryElements.push(i - 1, i)
  }
  const keepElements = thinned(elementCount, Math.max(2, Math.floor(maxPoints / 2)), boundaryElements.filter((i) => i >= 0))
  const curves = indices.map((index) => {
    const mode = analysis.modes[index]
    const shape = modeShape(analysis, index)
    const strain = modeStrain(analysis, index)
    let peak = 0
    for (let j = 0; j < shape.displacement.length; j++) if (Math.abs(shape.displacement[j]) > Math.abs(peak)) peak = shape.displacement[j]
    const scale = peak === 0 ? 1 : 1 / peak
    const strainX: number[] = []
    const strainValues: number[] = []
    const stressValues: number[] = []
    for (const e of keepElements) {
      for (const k of [2 * e, 2 * e + 1]) {
        strainX.push(strain.x[k])
        strainValues.push(strain.strain[k] * scale)
        stressValues.push(strain.stress[k] * scale)
      }
    }
    return {
      mode: mode.mode,
      frequencyHz: mode.frequencyHz,
      rigidBody: mode.rigidBody,
      x: keepNodes.map((n) => shape.x[n]),
      displacement: keepNodes.map((n) => shape.displacement[n] * scale),
      strainX,
      strain: strainValues,
      stress: stressValues,
    }
  })
  return { length: totalLength(analysis.project.segments), segmentBoundaries: segmentBoundaries(analysis.project.segments), curves }
}

/** Indices 0 … count−1, every k-th of them where there are more than `limit`, plus the ones that must stay. */
function thinned(count: number, limit: number, mustKeep: readonly number[]): number[] {
  if (count <= limit) return Array.from({ length: count }, (_, i) => i)
  const step = Math.ceil(count / limit)
  const keep = new Set<number>(mustKeep.filter((i) => i >= 0 && i < count))
  for (let i = 0; i < count; i += step) keep.add(i)
  keep.add(count - 1)
  return [...keep].sort((a, b) => a - b)
}

export type ModeShapeLower = 'stress' | 'strain'

export interface ModeShapeChartOptions extends ChartBuildOptions {
  /** What the lower plot shows (default stress). */
  readonly lower?: ModeShapeLower
}

/** Axis titles and the factor from SI to the shown unit of the lower plot. */
export function lowerQuantity(lower: ModeShapeLower, units: UnitSystem): { name: string; unit: string; factor: number } {
  const per = displayUnit(units, 'sectionDimension')
  if (lower === 'stress') {
    const stress = displayUnit(units, 'stress')
    // (Pa per m of peak displacement) → (stress unit per `per` unit of peak displacement)
    return { name: 'Stress per peak u', unit: `${stress.symbol}/${per.symbol}`, factor: per.toSI / stress.toSI }
  }
  return { name: 'Strain per peak u', unit: `µε/${per.symbol}`, factor: per.toSI * 1e6 }
}

export function modeCurveName(curve: Pick<ModeShapeCurve, 'mode' | 'frequencyHz' | 'rigidBody'>): string {
  return curve.rigidBody ? `Mode ${curve.mode} · rigid body` : `Mode ${curve.mode} · ${figure(curve.frequencyHz, 4)} Hz`
}

export function modeShapeChartOption(data: ModeShapeChartData, options: ModeShapeChartOptions): EChartsOption {
  const palette = paletteOf(options)
  const lower = lowerQuantity(options.lower ?? 'stress', options.units)
  const lengthUnit = displayUnit(options.units, 'length')
  const toLength = (x: number) => toDisplay(options.units, 'length', x)
  const axis = axisStyle(palette)
  const top = options.title ? 64 : 40
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
    const name = modeCurveName(curve)
    series.push({
      type: 'line',
      name,
      xAxisIndex: 0,
      yAxisIndex: 0,
      showSymbol: false,
      lineStyle: { width: 2, color: colour(i) },
      itemStyle: { color: colour(i) },
      data: curve.x.map((x, j) => [toLength(x), curve.displacement[j]]),
    })
    const values = options.lower === 'strain' ? curve.strain : curve.stress
    series.push({
      type: 'line',
      name,
      xAxisIndex: 1,
      yAxisIndex: 1,
      showSymbol: false,
      lineStyle: { width: 1.6, color: colour(i) },
      itemStyle: { color: colour(i) },
      data: curve.strainX.map((x, j) => [toLength(x), values[j] * lower.factor]),
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
      top: options.title ? 30 : 6,
      left: 'center',
      type: options.interactive ? 'scroll' : 'plain',
      textStyle: { color: palette.text },
      inactiveColor: palette.axisLine,
      data: data.curves.map((c) => modeCurveName(c)),
    },
    grid: [
      { left: 72, right: 24, top, height: '34%' },
      { left: 72, right: 24, top: '60%', bottom: 44 },
    ],
    xAxis: [xAxis(0, false), xAxis(1, true)],
    yAxis: [
      {
        type: 'value',
        gridIndex: 0,
        name: 'Displacement u / u_peak',
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
    lines.push(`${typeof p.marker === 'string' ? p.marker : ''}${escapeHtml(p.seriesName ?? '')}: ${figure((p.value as number[])[1], 4)}`)
  }
  return lines.join('<br>')
}
