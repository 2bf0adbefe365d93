/**
 * Interference diagram: machine speed (rpm) across, frequency (Hz) up. Each order of a
 * speed excitation is a line from the origin (f = order · rpm / 60); each natural
 * frequency a horizontal line inside its margin band; operating speed ranges are shaded;
 * fixed-frequency excitations are horizontal bands. Where an order line passes through
 * a mode's band inside its speed range, or a fixed frequency lies in a mode's band, the
 * pair conflicts and is marked.
 *
 * Which pairs conflict is decided by core/analysis/resonance.ts (the resonance table's
 * own statuses); this file only places them. The band drawn around a natural frequency f
 * is the set of excitation frequencies e that resonance.ts calls a conflict,
 * |f − e| / e < margin, i.e. f/(1 + margin) < e < f/(1 − margin).
 *
 * With a tolerance scatter, each mode's 5–95 % band is drawn as well; where the check used
 * those bands (the pairs carry `modeBandHz`), the margin band is the set of excitations the
 * check calls a conflict with the band [a, b]: a/(1 + margin) < e < b/(1 − margin).
 *
 * With modes of several motion families (axial, torsion, bending), each family's natural
 * frequencies get their own line style and its conflicts their own symbol, with a legend entry
 * per family (chart-families.ts); a single family is drawn as before, without a legend.
 */
import type { EChartsOption, LineSeriesOption, ScatterSeriesOption } from 'echarts'
import type { ModalAnalysis } from '../analysis/modal-analysis'
import { bandName, excitationBands, modeKey, type ExcitationBand, type ResonancePair } from '../analysis/resonance'
import type { FamilyKey } from '../model/families'
import type { Excitation } from '../model/project'
import { hzToRpm, rpmToHz } from '../model/units'
import { axisStyle, baseOption, closeRuns, labelSeries, niceCeil, paletteOf, tooltipBase, type ChartBuildOptions, type ChartLabel } from './chart-common'
import { escapeHtml, figure, signedPercent } from './chart-text'
import { capitalise, FAMILY_MARKERS, familyShortTitle, familyTitleOfKey, modeWords } from './chart-families'

export interface InterferenceChartInput {
  /** With `referenceHz`, the exact frequency is drawn, as the resonance check uses it where known. */
  readonly modes: readonly { readonly mode: number; readonly family: FamilyKey; readonly frequencyHz: number; readonly rigidBody: boolean; readonly referenceHz?: number | null }[]
  readonly excitations: readonly Excitation[]
  readonly margin: number
  /** The resonance pairs of core/analysis/resonance.ts for these modes and excitations. */
  readonly resonance: readonly ResonancePair[]
  /** Tolerance bands of the modes (the 5 % and 95 % frequencies of a scatter of this part), drawn when given. */
  readonly scatter?: readonly { readonly mode: number; readonly family: FamilyKey; readonly p05: number; readonly p95: number }[]
}

export function interferenceChartInput(analysis: ModalAnalysis): InterferenceChartInput {
  return { modes: analysis.modes, excitations: analysis.project.excitations, margin: analysis.project.margin, resonance: analysis.resonance }
}

/** The frequency of a mode the resonance check rests on: the exact one where known (modal-analysis.ts). */
export function checkedFrequency(mode: InterferenceChartInput['modes'][number]): number {
  return mode.referenceHz ?? mode.frequencyHz
}

/** Excitation frequencies within the margin of a natural frequency: [f/(1 + margin), f/(1 − margin)]. */
export function modeMarginBand(frequencyHz: number, margin: number): [number, number] {
  return [frequencyHz / (1 + margin), frequencyHz / (1 - margin)]
}

/**
 * Excitation frequencies the check calls a conflict with a pair's mode: around its frequency, or
 * around its tolerance band where the check used one (separationBetweenBands in resonance.ts).
 */
export function pairMarginBand(pair: Pick<ResonancePair, 'frequencyHz' | 'modeBandHz'>, margin: number): [number, number] {
  return pair.modeBandHz ? [pair.modeBandHz[0] / (1 + margin), pair.modeBandHz[1] / (1 - margin)] : modeMarginBand(pair.frequencyHz, margin)
}

/** The point of an excitation band nearest a pair's mode (its frequency, or its tolerance band). */
function nearestExcitationHz(pair: ResonancePair): number {
  const [lo, hi] = pair.band.hz
  if (!pair.modeBandHz) return Math.min(Math.max(pair.frequencyHz, lo), hi)
  const [a, b] = pair.modeBandHz
  if (b < lo) return lo
  if (a > hi) return hi
  return Math.min(Math.max(pair.frequencyHz, Math.max(a, lo)), Math.min(b, hi))
}

export interface ConflictMark {
  readonly pair: ResonancePair
  /** Where the mark sits: the point of the excitation band nearest the natural frequency. */
  readonly rpm: number | null
  readonly hz: number
  /** For an order line: the stretch of speed (rpm) inside both the speed range and the mode's band. */
  readonly rpmSpan: readonly [number, number] | null
}

/** One mark per conflicting pair of the resonance check. */
export function interferenceConflictMarks(input: InterferenceChartInput): ConflictMark[] {
  const marks: ConflictMark[] = []
  for (const pair of input.resonance) {
    if (pair.status !== 'conflict') continue
    const [lo, hi] = pair.band.hz
    const nearestHz = nearestExcitationHz(pair)
    if (pair.band.order === null) {
      marks.push({ pair, rpm: null, hz: nearestHz, rpmSpan: null })
      continue
    }
    const order = pair.band.order
    const [bandLo, bandHi] = pairMarginBand(pair, input.margin)
    const spanLo = Math.max(hzToRpm(lo) / order, hzToRpm(bandLo) / order)
    const spanHi = Math.min(hzToRpm(hi) / order, hzToRpm(bandHi) / order)
    marks.push({ pair, rpm: hzToRpm(nearestHz) / order, hz: nearestHz, rpmSpan: [Math.min(spanLo, spanHi), Math.max(spanLo, spanHi)] })
  }
  return marks
}

export interface InterferenceExtent {
  readonly rpmMax: number
  readonly hzMax: number
  /** Elastic modes above hzMax, left off the diagram. */
  readonly modesAbove: number
}

/** Axis ends: a quarter beyond the fastest speed and the highest excitation, and at least the first elastic mode's band. */
export function interferenceExtent(input: InterferenceChartInput): InterferenceExtent {
  const bands = excitationBands(input.excitations)
  let rpmTop = 0
  let hzTop = 0
  for (const e of input.excitations) if ('rpm' in e) rpmTop = Math.max(rpmTop, Array.isArray(e.rpm) ? e.rpm[1] : e.rpm)
  for (const b of bands) hzTop = Math.max(hzTop, b.hz[1])
  const elastic = input.modes.filter((m) => !m.rigidBody)
  // The lowest elastic mode of any family (each family is sorted, the list as a whole is not).
  if (elastic.length) hzTop = Math.max(hzTop, modeMarginBand(Math.min(...elastic.map(checkedFrequency)), input.margin)[1])
  const hzMax = niceCeil(1.2 * (hzTop || 100))
  const rpmMax = niceCeil(rpmTop > 0 ? 1.25 * rpmTop : hzToRpm(hzMax))
  return { rpmMax, hzMax, modesAbove: elastic.filter((m) => checkedFrequency(m) > hzMax).length }
}

/** The families of the modes in the order they first appear (axial, torsion, bending …). */
export function interferenceFamilies(input: Pick<InterferenceChartInput, 'modes'>): FamilyKey[] {
  const keys: FamilyKey[] = []
  for (const m of input.modes) if (!keys.includes(m.family)) keys.push(m.family)
  return keys
}

/** The legend entry (and series name) of a family's natural frequencies: "Natural frequencies" for a lone family, else "Torsion modes". */
export function familySeriesName(key: FamilyKey, several: boolean): string {
  return several ? `${familyTitleOfKey(key)} modes` : 'Natural frequencies'
}

/** The series of a family's conflict marks: "Conflicts", or "Conflicts · torsion" beside other families. */
export function conflictSeriesName(key: FamilyKey, several: boolean): string {
  return several ? `Conflicts · ${familyTitleOfKey(key).toLowerCase()}` : 'Conflicts'
}

export interface InterferenceChartOptions extends ChartBuildOptions {
  /** Override the axis ends (default interferenceExtent). */
  readonly rpmMax?: number
  readonly hzMax?: number
}

export function interferenceChartOption(input: InterferenceChartInput, options: InterferenceChartOptions): EChartsOption {
  const palette = paletteOf(options)
  const axis = axisStyle(palette)
  const extent = interferenceExtent(input)
  const rpmMax = options.rpmMax ?? extent.rpmMax
  const hzMax = options.hzMax ?? extent.hzMax
  const marginText = `±${figure(100 * input.margin, 3)} %`
  const series: (LineSeriesOption | ScatterSeriesOption)[] = []

  // Natural frequencies: a line and its margin band each (around the tolerance band where the check used it), one series per family.
  // A chart without modes still carries its (empty) series.
  const found = interferenceFamilies(input)
  const families: FamilyKey[] = found.length ? found : ['axial']
  const several = families.length > 1
  const shownModes = input.modes.filter((m) => !m.rigidBody && checkedFrequency(m) <= hzMax)
  const checkedBands = new Map<string, readonly [number, number]>()
  for (const pair of input.resonance) if (pair.modeBandHz) checkedBands.set(modeKey(pair), pair.modeBandHz)
  const modeName = (m: InterferenceChartInput['modes'][number]) => (several ? `${familyShortTitle(m.family)} ${m.mode}` : `Mode ${m.mode}`)
  for (const key of families) {
    const marker = FAMILY_MARKERS[key]
    const modes = shownModes.filter((m) => m.family === key)
    series.push({
      type: 'line',
      name: familySeriesName(key, several),
      data: [],
      // The legend draws the family's line style and its conflict symbol.
      symbol: marker.symbol,
      symbolSize: 9,
      lineStyle: { color: palette.modeLine, width: 1.6, type: marker.lineType },
      itemStyle: { color: palette.modeLine },
      markArea: {
        silent: !options.interactive,
        itemStyle: { color: palette.modeBand },
        label: { show: false },
        data: modes.map((m) => {
          const modeBandHz = checkedBands.get(modeKey(m))
          const [lo, hi] = pairMarginBand({ frequencyHz: checkedFrequency(m), modeBandHz }, input.margin)
          return [{ yAxis: lo, name: `${several ? capitalise(modeWords(m, true)) : `Mode ${m.mode}`} margin band${modeBandHz ? ' around its tolerance band' : ''}` }, { yAxis: hi }]
        }),
      },
      markLine: {
        silent: !options.interactive,
        symbol: 'none',
        animation: false,
        lineStyle: { color: palette.modeLine, width: 1.6, type: marker.lineType },
        // Named by the chart's label series (labelsOfInterference), which keeps labels apart.
        label: { show: false },
        data: modes.map((m) => ({ yAxis: checkedFrequency(m), name: `${modeName(m)} · ${figure(checkedFrequency(m), 4)} Hz` })),
      },
    })
  }

  const modeSeriesNames = new Set(families.map((key) => familySeriesName(key, several)))

  // Tolerance bands: where 90 % of the scattered parts put each mode.
  if (input.scatter?.length) {
    const shownBands = input.scatter.filter((b) => shownModes.some((m) => modeKey(m) === modeKey(b)))
    series.push({
      type: 'line',
      name: 'Tolerance bands',
      data: [],
      markArea: {
        silent: !options.interactive,
        itemStyle: { color: palette.modeLine, opacity: 0.3 },
        label: { show: false },
        data: shownBands.map((b) => [{ yAxis: b.p05, name: `${several ? capitalise(modeWords(b, true)) : `Mode ${b.mode}`} tolerance band (5–95 %): ${figure(b.p05, 4)}–${figure(b.p95, 4)} Hz` }, { yAxis: b.p95 }]),
      },
    })
  }

  // Operating speed ranges (shaded) and single speeds (a vertical line).
  const speedAreas: [{ xAxis: number; name: string }, { xAxis: number }][] = []
  const speedLines: { xAxis: number; name: string }[] = []
  const frequencyAreas: [{ yAxis: number; name: string }, { yAxis: number }][] = []
  const frequencyLines: { yAxis: number; name: string }[] = []
  input.excitations.forEach((e, i) => {
    const label = e.label?.trim() || `Excitation ${i + 1}`
    if ('rpm' in e) {
      if (Array.isArray(e.rpm)) speedAreas.push([{ xAxis: e.rpm[0], name: `${label}: ${figure(e.rpm[0], 5)}–${figure(e.rpm[1], 5)} rpm` }, { xAxis: e.rpm[1] }])
      else speedLines.push({ xAxis: e.rpm, name: `${label}: ${figure(e.rpm, 5)} rpm` })
    } else if (Array.isArray(e.hz)) {
      frequencyAreas.push([{ yAxis: e.hz[0], name: `${label}: ${figure(e.hz[0], 4)}–${figure(e.hz[1], 4)} Hz` }, { yAxis: e.hz[1] }])
    } else {
      frequencyLines.push({ yAxis: e.hz, name: `${label}: ${figure(e.hz, 4)} Hz` })
    }
  })
  series.push({
    type: 'line',
    name: 'Operating speeds',
    data: [],
    markArea: { silent: !options.interactive, itemStyle: { color: palette.speedRange }, label: { show: false }, data: speedAreas },
    markLine: {
      silent: !options.interactive,
      symbol: 'none',
      animation: false,
      lineStyle: { color: palette.series[1], width: 1.2, type: 'dashed' },
      label: { show: false },
      data: speedLines,
    },
  })
  series.push({
    type: 'line',
    name: 'Fixed frequencies',
    data: [],
    markArea: { silent: !options.interactive, itemStyle: { color: palette.frequencyBand }, label: { show: false }, data: frequencyAreas },
    markLine: {
      silent: !options.interactive,
      symbol: 'none',
      animation: false,
      lineStyle: { color: palette.frequencyLine, width: 1.6, type: 'dashed' },
      label: { show: false },
      data: frequencyLines,
    },
  })

  // Order lines from the origin, one per band of each speed excitation.
  const orderBands = excitationBands(input.excitations).filter((b) => b.order !== null)
  orderBands.forEach((band, k) => {
    const order = band.order!
    const colour = palette.series[(k + 3) % palette.series.length]
    const end = Math.min(rpmMax, hzToRpm(hzMax) / order)
    series.push({
      type: 'line',
      name: bandName(band),
      data: [
        [0, 0],
        [end, rpmToHz(end * order)],
      ],
      showSymbol: false,
      silent: !options.interactive,
      lineStyle: { color: colour, width: 1.4 },
      itemStyle: { color: colour },
    })
  })

  // Conflicts: the stretch of each order line inside a mode's band and speed range, and a mark per pair.
  const marks = interferenceConflictMarks(input)
  marks.forEach((mark) => {
    if (!mark.rpmSpan || mark.pair.band.order === null) return
    const order = mark.pair.band.order
    const [a, b] = mark.rpmSpan
    series.push({
      type: 'line',
      name: 'Conflict stretch',
      data: [
        [a, rpmToHz(a * order)],
        [b, rpmToHz(b * order)],
      ],
      showSymbol: false,
      silent: true,
      lineStyle: { color: palette.conflict, width: 5, opacity: 0.75 },
      z: 4,
    })
  })
  const fixedMarkRpm = 0.03 * rpmMax
  // One series of marks per family, in that family's symbol.
  const marksBySeries = new Map<string, ConflictMark[]>()
  for (const key of families) {
    const own = marks.filter((m) => m.pair.family === key)
    if (!own.length && several) continue
    const name = conflictSeriesName(key, several)
    marksBySeries.set(name, own)
    series.push({
      type: 'scatter',
      name,
      symbol: FAMILY_MARKERS[key].symbol,
      symbolSize: 13,
      z: 5,
      itemStyle: { color: palette.conflict, borderColor: palette.background, borderWidth: 1.5 },
      // No text of its own: a mark sits on its mode's labelled line, on its excitation's labelled line or band.
      label: { show: false },
      data: own.map((m) => [m.rpm ?? fixedMarkRpm, m.hz]),
    })
  }
  series.push(labelSeries(interferenceLabels(input, shownModes, orderBands, { rpmMax, hzMax, palette }), palette))

  const conflictText = (mark: ConflictMark) => {
    const p = mark.pair
    const subject = capitalise(modeWords(p, several))
    const where =
      p.band.order === null
        ? `${figure(p.band.hz[0], 4)}${p.band.hz[1] !== p.band.hz[0] ? `–${figure(p.band.hz[1], 4)}` : ''} Hz`
        : `${figure(hzToRpm(p.band.hz[0]) / p.band.order, 5)}${p.band.hz[1] !== p.band.hz[0] ? `–${figure(hzToRpm(p.band.hz[1]) / p.band.order, 5)}` : ''} rpm × ${figure(p.band.order, 3)} = ${figure(p.band.hz[0], 4)}${p.band.hz[1] !== p.band.hz[0] ? `–${figure(p.band.hz[1], 4)}` : ''} Hz`
    return [
      `<b>Conflict: ${modeWords(p, several)} and ${escapeHtml(bandName(p.band))}</b>`,
      p.modeBandHz ? `${subject}: ${figure(p.frequencyHz, 4)} Hz, tolerance band ${figure(p.modeBandHz[0], 4)}–${figure(p.modeBandHz[1], 4)} Hz` : `${subject}: ${figure(p.frequencyHz, 4)} Hz`,
      `Excitation: ${escapeHtml(where)}`,
      `Separation ${signedPercent(p.separation)} (margin ${marginText})`,
    ].join('<br>')
  }

  const subtitle = extent.modesAbove > 0 && options.hzMax === undefined ? `${extent.modesAbove} higher mode${extent.modesAbove > 1 ? 's' : ''} above ${figure(hzMax, 4)} Hz not shown` : ''
  // A row for the family legend above the plot when there are several families.
  const legendTop = options.title ? 28 : 2
  const top = (options.title ? 44 : 20) + (several ? 22 : 0)
  return {
    ...baseOption(options),
    ...(several
      ? {
          legend: {
            top: legendTop,
            left: 68,
            itemWidth: 30,
            itemGap: 16,
            textStyle: { color: palette.text },
            inactiveColor: palette.axisLine,
            data: families.map((key) => familySeriesName(key, several)),
          },
        }
      : {}),
    ...(subtitle
      ? {
          graphic: [{ type: 'text', right: 24, top: top - 16, style: { text: subtitle, fill: palette.mutedText, fontSize: 11 } }],
        }
      : {}),
    grid: { left: 68, right: 56, top, bottom: options.interactive ? 84 : 52 },
    xAxis: {
      type: 'value',
      min: 0,
      max: rpmMax,
      name: 'Speed (rpm)',
      nameLocation: 'middle',
      nameGap: 28,
      ...axis,
      axisLabel: { ...axis.axisLabel, formatter: (v: number) => figure(v, 5) },
    },
    yAxis: {
      type: 'value',
      min: 0,
      max: hzMax,
      name: 'Frequency (Hz)',
      nameLocation: 'middle',
      nameGap: 48,
      ...axis,
      axisLabel: { ...axis.axisLabel, formatter: (v: number) => figure(v, 5) },
    },
    ...(options.interactive
      ? {
          tooltip: {
            ...tooltipBase(palette),
            trigger: 'item',
            formatter: (params: unknown) => {
              const p = params as { seriesName?: string; componentType?: string; name?: string; dataIndex?: number; value?: unknown }
              const conflictMarks = p.seriesName === undefined ? undefined : marksBySeries.get(p.seriesName)
              if (conflictMarks && p.componentType === 'series' && p.dataIndex !== undefined) return conflictText(conflictMarks[p.dataIndex])
              if (p.componentType === 'markArea' && p.seriesName !== undefined && modeSeriesNames.has(p.seriesName)) return `${escapeHtml(p.name ?? '')} (${marginText}): an excitation in this band conflicts`
              if (p.componentType === 'markArea' || p.componentType === 'markLine') return escapeHtml(p.name ?? '')
              return escapeHtml(p.seriesName ?? '')
            },
          },
          dataZoom: [
            { type: 'inside', xAxisIndex: 0, filterMode: 'none' },
            { type: 'inside', yAxisIndex: 0, filterMode: 'none' },
            {
              type: 'slider',
              xAxisIndex: 0,
              filterMode: 'none',
              height: 16,
              bottom: 8,
              showDetail: false,
              backgroundColor: 'transparent',
              borderColor: palette.splitLine,
              fillerColor: palette.modeBand,
              handleStyle: { color: palette.background, borderColor: palette.axisLine },
              moveHandleStyle: { color: palette.axisLine },
              dataBackground: { lineStyle: { color: palette.axisLine }, areaStyle: { color: palette.splitLine } },
            },
          ],
        }
      : {}),
    series,
  }
}

/** Labels closer than this fraction of an axis are gathered into one (about 15 px on the smallest plot, 250 px, of the app). */
export const INTERFERENCE_LABEL_GAP = 0.06
/** Widest a label of a fixed frequency may run (px), so that it stays clear of the natural frequencies' labels at the right. */
const FIXED_LABEL_WIDTH = 280

/**
 * The diagram's text, most important first, laid out so that labels stay apart: natural
 * frequencies at the right end above their lines, fixed frequencies at the left end below
 * theirs, order lines at their far end; neighbours closer than INTERFERENCE_LABEL_GAP of the
 * axis share one label. Equal orders of different excitations draw one line and one label.
 */
export function interferenceLabels(
  input: InterferenceChartInput,
  shownModes: InterferenceChartInput['modes'],
  orderBands: readonly ExcitationBand[],
  frame: { rpmMax: number; hzMax: number; palette: ReturnType<typeof paletteOf> },
): ChartLabel[] {
  const { rpmMax, hzMax, palette } = frame
  const labels: ChartLabel[] = []

  const modes = [...shownModes].sort((a, b) => checkedFrequency(a) - checkedFrequency(b))
  const several = new Set(modes.map((m) => m.family)).size > 1
  const name = (m: InterferenceChartInput['modes'][number]) => (several ? `${familyShortTitle(m.family)} ${m.mode}` : String(m.mode))
  for (const run of closeRuns(modes.map((m) => checkedFrequency(m) / hzMax), INTERFERENCE_LABEL_GAP)) {
    const members = run.map((i) => modes[i])
    const top = members.at(-1)!
    const text =
      members.length === 1
        ? `${several ? name(top) : `Mode ${top.mode}`} · ${figure(checkedFrequency(top), 4)} Hz`
        : `${several ? '' : 'Modes '}${members.map(name).join(', ')} · ${members.map((m) => figure(checkedFrequency(m), 4)).join(', ')} Hz`
    labels.push({ at: [rpmMax, checkedFrequency(top)], text, color: palette.modeLine, place: 'insideBottomRight', distance: 4 })
  }

  const fixed = input.excitations
    .map((e, i) => ({ e, name: e.label?.trim() || `Excitation ${i + 1}` }))
    .filter(({ e }) => 'hz' in e)
    .map(({ e, name }) => {
      const hz = (e as { hz: number | [number, number] }).hz
      const [lo, hi] = Array.isArray(hz) ? hz : [hz, hz]
      return { name, lo, hi, text: `${name}: ${lo === hi ? figure(lo, 4) : `${figure(lo, 4)}–${figure(hi, 4)}`} Hz` }
    })
    .filter((f) => f.lo <= hzMax)
    .sort((a, b) => a.lo - b.lo)
  for (const run of closeRuns(fixed.map((f) => f.lo / hzMax), INTERFERENCE_LABEL_GAP)) {
    const members = run.map((i) => fixed[i])
    labels.push({
      at: [0, members[0].lo],
      // One line each, in one label under the lowest line: they cannot overlap one another.
      text: members.map((f) => f.text).join('\n'),
      color: palette.frequencyLine,
      place: 'insideTopLeft',
      distance: 4,
      maxWidth: FIXED_LABEL_WIDTH,
    })
  }

  // One label per distinct order, at the end of its line: beyond the right edge, or under the top edge to the right of a steep line's end.
  const orders = [...new Map(orderBands.map((b, k) => [b.order!, k])).entries()].map(([order, k]) => {
    const end = Math.min(rpmMax, hzToRpm(hzMax) / order)
    return { order, colour: palette.series[(k + 3) % palette.series.length], end, atTop: end < rpmMax }
  })
  const right = orders.filter((o) => !o.atTop).sort((a, b) => a.order - b.order)
  for (const run of closeRuns(right.map((o) => rpmToHz(rpmMax * o.order) / hzMax), INTERFERENCE_LABEL_GAP)) {
    const members = run.map((i) => right[i])
    const top = members.at(-1)!
    labels.push({ at: [rpmMax, rpmToHz(rpmMax * top.order)], text: members.map((o) => `×${figure(o.order, 3)}`).join(', '), color: top.colour, place: 'right' })
  }
  const atTop = orders.filter((o) => o.atTop).sort((a, b) => a.end - b.end)
  for (const run of closeRuns(atTop.map((o) => o.end / rpmMax), INTERFERENCE_LABEL_GAP)) {
    const members = run.map((i) => atTop[i])
    const last = members.at(-1)!
    labels.push({ at: [last.end, hzMax], text: members.map((o) => `×${figure(o.order, 3)}`).join(', '), color: last.colour, place: 'insideTopLeft', distance: 4 })
  }
  return labels
}

/**
 * Plain-language line for a pair: "Mode 1 at 106 Hz is 6.4 % above Motor twice line frequency (100 Hz)";
 * for a pair checked on a tolerance band: "Mode 1, tolerance band 103.8–109.2 Hz, is 3.8 % above …".
 * With `withFamily` (a part analysed in several motions) the mode names its family:
 * "Torsion mode 1 at 783 Hz …", "Bending mode 1 (weak plane) at 14.1 Hz …".
 */
export function pairSentence(pair: ResonancePair, withFamily = false): string {
  const band: ExcitationBand = pair.band
  const [lo, hi] = band.hz
  const bandText =
    lo === hi ? `${figure(lo, 4)} Hz` : `${figure(lo, 4)}–${figure(hi, 4)} Hz`
  const speed =
    band.order === null ? '' : `, ${figure(hzToRpm(lo) / band.order, 5)}${lo === hi ? '' : `–${figure(hzToRpm(hi) / band.order, 5)}`} rpm`
  const name = capitalise(modeWords(pair, withFamily))
  const subject = pair.modeBandHz
    ? `${name}, tolerance band ${figure(pair.modeBandHz[0], 4)}–${figure(pair.modeBandHz[1], 4)} Hz,`
    : `${name} at ${figure(pair.frequencyHz, 3)} Hz`
  if (pair.separation === 0) return `${subject} ${pair.modeBandHz ? 'overlaps' : 'lies inside'} ${bandName(band)} (${bandText}${speed})`
  const direction = pair.separation > 0 ? 'above' : 'below'
  return `${subject} is ${figure(Math.abs(100 * pair.separation), 2)} % ${direction} ${bandName(band)} (${bandText}${speed})`
}
