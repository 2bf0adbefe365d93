/**
 * Mode shapes along the part, per motion family: the family's displacement (top) and its
 * stress or strain (bottom) for the chosen modes, with the segment boundaries marked —
 * - axial: displacement u, axial stress E u′ or strain u′;
 * - torsion: twist θ, the largest shear stress on the section or the twist rate θ′;
 * - bending: deflection w, the bending stress at the surface E c w″ or the curvature w″
 *   (or the slope w′).
 *
 * Mass-normalised shapes have no physical amplitude, so each mode is scaled to a largest
 * displacement (twist, deflection) of 1, largest excursion positive; its strain and stress are
 * scaled by the same factor and read as "per unit of peak displacement": the stress a vibration
 * of 1 mm (or 1 in, or 1 rad of twist) peak amplitude would cause, which is what an engineer can use.
 */
import type { EChartsOption, LineSeriesOption } from 'echarts'
import { modeShape, modeStrain, type FamilyAnalysis } from '../analysis/modal-analysis'
import type { BendingPlane } from '../model/families'
import { segmentBoundaries, totalLength } from '../model/geometry'
import type { Motion } from '../model/project'
import { displayUnit, toDisplay, type UnitSystem } from '../model/units'
import { axisStyle, baseOption, paletteOf, tooltipBase, type ChartBuildOptions } from './chart-common'
import { escapeHtml, figure } from './chart-text'

export interface ModeShapeCurve {
  readonly mode: number
  readonly frequencyHz: number
  readonly rigidBody: boolean
  /** Node positions, m. */
  readonly x: number[]
  /** Displacement (axial u, twist θ or deflection w) scaled to a largest magnitude of 1, the largest excursion positive. */
  readonly displacement: number[]
  /** Positions of the strain samples, m: both ends of every element, so jumps at steps show. */
  readonly strainX: number[]
  /**
   * Strain per unit of peak displacement: axial strain per m (1/m), twist rate per rad of peak
   * twist (1/m), curvature per m of peak deflection (1/m²).
   */
  readonly strain: number[]
  /** Stress per unit of peak displacement: Pa/m (axial, bending at the surface) or Pa/rad (torsion's shear); NaN where the section gives no dimension. */
  readonly stress: number[]
  /** Bending only: the slope w′ at the nodes per m of peak deflection (rad/m). */
  readonly slope?: number[]
}

export interface ModeShapeChartData {
  /** The family the modes belong to (axial when absent). */
  readonly motion?: Motion
  readonly plane?: BendingPlane | null
  /** Bar length, m. */
  readonly length: number
  /** x of every segment boundary, m. */
  readonly segmentBoundaries: number[]
  readonly curves: ModeShapeCurve[]
}

/**
 * Chart data of the chosen modes of one family (0-based indices; all modes by default). Meshes
 * finer than `maxPoints` nodes are thinned evenly, always keeping the nodes at segment boundaries
 * and attachments, so a chart of a million-unknown model stays light.
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
  const curves = indices.map((index): ModeShapeCurve => {
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
    const rotation = shape.rotation
    return {
      mode: mode.mode,
      frequencyHz: mode.frequencyHz,
      rigidBody: mode.rigidBody,
      x: keepNodes.map((n) => shape.x[n]),
      displacement: keepNodes.map((n) => shape.displacement[n] * scale),
      strainX,
      strain: strainValues,
      stress: stressValues,
      ...(rotation ? { slope: keepNodes.map((n) => rotation[n] * scale) } : {}),
    }
  })
  return {
    motion: analysis.family.motion,
    plane: analysis.family.plane,
    length: totalLength(analysis.project.segments),
    segmentBoundaries: segmentBoundaries(analysis.project.segments),
    curves,
  }
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

/** What the lower plot shows: stress, strain (twist rate, curvature), or for bending the slope. */
export type ModeShapeLower = 'stress' | 'strain' | 'slope'

export interface ModeShapeChartOptions extends ChartBuildOptions {
  /** What the lower plot shows (default stress; the slope only for bending, stress otherwise). */
  readonly lower?: ModeShapeLower
}

/** The name of a family's displacement on the upper axis: "Displacement u / u_peak", "Twist θ / θ_peak", "Deflection w / w_peak". */
export function upperQuantityName(motion: Motion = 'axial'): string {
  if (motion === 'torsion') return 'Twist θ / θ_peak'
  if (motion === 'bending') return 'Deflection w / w_peak'
  return 'Displacement u / u_peak'
}

/** The lower plot a family can show: the slope is bending's only. */
export function effectiveLower(lower: ModeShapeLower | undefined, motion: Motion = 'axial'): ModeShapeLower {
  return lower === 'slope' && motion !== 'bending' ? 'stress' : (lower ?? 'stress')
}

/**
 * Axis title, unit and the factor from SI to the shown unit of the lower plot, per family:
 * stress per unit of peak displacement (per mm or in; per rad of twist), axial strain in µε per
 * mm or in, twist rate in (rad/m) per rad, curvature in (1/m) per mm, slope in rad per mm.
 */
export function lowerQuantity(lower: ModeShapeLower, units: UnitSystem, motion: Motion = 'axial'): { name: string; unit: string; factor: number } {
  const per = displayUnit(units, 'sectionDimension')
  const length = displayUnit(units, 'length')
  const stress = displayUnit(units, 'stress')
  const angle = displayUnit(units, 'angle')
  const shown = effectiveLower(lower, motion)
  if (motion === 'torsion') {
    // Pa per rad of peak twist → (stress unit) per (angle unit); (rad/m) per rad → (rad per length unit) per rad.
    if (shown === 'stress') return { name: 'Shear stress per peak θ', unit: `${stress.symbol}/${angle.symbol}`, factor: angle.toSI / stress.toSI }
    return { name: 'Twist rate per peak θ', unit: `(${angle.symbol}/${length.symbol})/${angle.symbol}`, factor: length.toSI }
  }
  if (motion === 'bending') {
    if (shown === 'stress') return { name: 'Bending stress per peak w', unit: `${stress.symbol}/${per.symbol}`, factor: per.toSI / stress.toSI }
    if (shown === 'slope') return { name: 'Slope per peak w', unit: `${angle.symbol}/${per.symbol}`, factor: per.toSI / angle.toSI }
    return { name: 'Curvature per peak w', unit: `(1/${length.symbol})/${per.symbol}`, factor: length.toSI * per.toSI }
  }
  if (shown === 'stress') {
    // (Pa per m of peak displacement) → (stress unit per `per` unit of peak displacement)
    return { name: 'Stress per peak u', unit: `${stress.symbol}/${per.symbol}`, factor: per.toSI / stress.toSI }
  }
  return { name: 'Strain per peak u', unit: `µε/${per.symbol}`, factor: per.toSI * 1e6 }
}

export function modeCurveName(curve: Pick<ModeShapeCurve, 'mode' | 'frequencyHz' | 'rigidBody'>): string {
  return curve.rigidBody ? `Mode ${curve.mode} · rigid body` : `Mode ${curve.mode} · ${figure(curve.frequencyHz, 4)} Hz`
}

/** The lower plot's samples of a curve: element ends for stress and strain, nodes for the slope. */
function lowerSamples(curve: ModeShapeCurve, lower: ModeShapeLower): { x: number[]; values: number[] } {
  if (lower === 'slope' && curve.slope) return { x: curve.x, values: curve.slope }
  return { x: curve.strainX, values: lower === 'strain' ? curve.strain : curve.stress }
}

export function modeShapeChartOption(data: ModeShapeChartData, options: ModeShapeChartOptions): EChartsOption {
  const palette = paletteOf(options)
  const motion = data.motion ?? 'axial'
  const shownLower = effectiveLower(options.lower, motion)
  const lower = lowerQuantity(shownLower, options.units, motion)
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
    const samples = lowerSamples(curve, shownLower)
    series.push({
      type: 'line',
      name,
      xAxisIndex: 1,
      yAxisIndex: 1,
      showSymbol: false,
      lineStyle: { width: 1.6, color: colour(i) },
      itemStyle: { color: colour(i) },
      // A NaN value (a stress where the section gives no dimension) leaves a gap in the line.
      data: samples.x.map((x, j) => [toLength(x), samples.values[j] * lower.factor]),
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
        name: upperQuantityName(motion),
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
