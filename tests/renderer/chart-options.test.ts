// @vitest-environment happy-dom
/**
 * The chart option builders shared with the report (core/charts). Checks against
 * independent facts: 1 rpm = 1/60 Hz (by definition of the minute); a uniform fixed–free
 * bar's first mode shape sin(πx/2L) (S. S. Rao, Mechanical Vibrations, longitudinal
 * vibration of bars, from memory); convergence orders 2 and 4 of 2- and 3-node elements
 * (T. J. R. Hughes, The Finite Element Method, eigenvalue chapter, from memory); and,
 * for the diagram, consistency with the resonance check of core/analysis/resonance.ts. The
 * label layout rule (this repository's own): every text of the interference diagram and the
 * response chart is a label of one series with ECharts' hideOverlap, and the builders keep
 * neighbours apart themselves (rows, or one label for a run of near neighbours).
 */
import { describe, expect, it } from 'vitest'
import { test as propertyTest, fc } from '@fast-check/vitest'
import type { LineSeriesOption, ScatterSeriesOption } from 'echarts'
import { analyseProject } from '../../core/analysis/modal-analysis'
import { convergenceStudy } from '../../core/analysis/convergence'
import { separationFromBand, statusOf, type ResonancePair } from '../../core/analysis/resonance'
import { readProjectDocument, readProjectText } from '../../core/model/project-schema'
import type { Project } from '../../core/model/project'
import {
  closeRuns,
  convergenceChartOption,
  excitationColour,
  INTERFERENCE_LABEL_GAP,
  interferenceChartInput,
  interferenceChartOption,
  interferenceConflictMarks,
  modeMarginBand,
  modeShapeChartData,
  modeShapeChartOption,
  observedOrderText,
  labelRows,
  LABEL_SERIES,
  pairSentence,
  RESPONSE_LABEL_GAP,
  responseChartOption,
} from '../../core/charts'
import { DEMO_TEXT } from './renderer-helpers'
import { LIGHT_CHART_PALETTE } from '../../core/charts/chart-palette'
import { resonancePairs } from '../../core/analysis/resonance'
import type { Excitation } from '../../core/model/project'

function project(doc: Record<string, unknown>): Project {
  const read = readProjectDocument({ format: 'rodwave', version: 1, ends: { start: 'fixed', end: 'free' }, ...doc })
  if (!read.ok) throw new Error(read.issues.map((i) => `${i.path}: ${i.message}`).join('\n'))
  return read.project
}

const UNIFORM = project({
  materials: [{ id: 'steel', youngsModulus: 200e9, density: 7850 }],
  segments: [{ length: 1, material: 'steel', section: { shape: 'solid', diameter: 0.02 } }],
  analysis: { elementOrder: 1, elementsPerSegment: 200, mass: 'consistent', modes: 3 },
  excitations: [{ label: 'Fan <1>', rpm: [70_000, 74_000], orders: [1] }, { label: 'Hum', hz: 1300 }],
  margin: 0.1,
})

function demo(): Project {
  const read = readProjectText(DEMO_TEXT)
  if (!read.ok) throw new Error('fixture')
  return read.project
}

const series = (option: ReturnType<typeof interferenceChartOption>) => option.series as (LineSeriesOption | ScatterSeriesOption)[]

describe('interference diagram', () => {
  it('draws each order as a line from the origin with slope order/60 Hz per rpm', () => {
    const analysis = analyseProject(demo())
    const option = interferenceChartOption(interferenceChartInput(analysis), { interactive: false, units: 'SI' })
    const line = series(option).find((s) => s.name === 'Condensate pump speed ×7') as LineSeriesOption
    const [[x0, y0], [x1, y1]] = line.data as number[][]
    expect([x0, y0]).toEqual([0, 0])
    expect(y1 / x1).toBeCloseTo(7 / 60, 12)
  })

  it('draws each natural frequency where the resonance check takes it: the exact value where known', () => {
    const analysis = analyseProject(demo())
    const option = interferenceChartOption(interferenceChartInput(analysis), { interactive: false, units: 'SI' })
    const modes = series(option).find((s) => s.name === 'Natural frequencies') as LineSeriesOption
    const first = (modes.markLine!.data as { yAxis: number }[])[0].yAxis
    expect(first).toBe(analysis.modes[0].referenceHz)
    expect(first).toBe(analysis.resonance.find((p) => p.mode === 1)!.frequencyHz)
  })

  it('marks exactly the pairs the resonance check calls conflicts, each inside its excitation band', () => {
    const analysis = analyseProject(demo())
    const input = interferenceChartInput(analysis)
    const marks = interferenceConflictMarks(input)
    const conflicts = analysis.resonance.filter((p) => p.status === 'conflict')
    expect(marks.map((m) => m.pair)).toEqual(conflicts)
    expect(conflicts.length).toBeGreaterThan(0)
    for (const mark of marks) {
      expect(mark.hz).toBeGreaterThanOrEqual(mark.pair.band.hz[0])
      expect(mark.hz).toBeLessThanOrEqual(mark.pair.band.hz[1])
      if (mark.rpm !== null) expect(mark.hz).toBeCloseTo((mark.rpm * mark.pair.band.order!) / 60, 9)
    }
    const scatter = series(interferenceChartOption(input, { interactive: true, units: 'SI' })).find((s) => s.name === 'Conflicts') as ScatterSeriesOption
    expect(scatter.data).toHaveLength(conflicts.length)
  })

  it('draws the margin band as exactly the excitation frequencies the resonance check flags', () => {
    const f = 106.36
    for (const margin of [0.1, 0.15, 0.25]) {
      const [lo, hi] = modeMarginBand(f, margin)
      const status = (e: number) => statusOf(separationFromBand(f, [e, e]), margin)
      expect(status(lo * (1 + 1e-9))).toBe('conflict')
      expect(status(lo * (1 - 1e-9))).toBe('clear')
      expect(status(hi * (1 - 1e-9))).toBe('conflict')
      expect(status(hi * (1 + 1e-9))).toBe('clear')
    }
  })

  it('has tooltips, zoom and animation for the app and none of them for the report', () => {
    const input = interferenceChartInput(analyseProject(UNIFORM))
    const app = interferenceChartOption(input, { interactive: true, units: 'SI' })
    const report = interferenceChartOption(input, { interactive: false, units: 'SI' })
    expect(app.tooltip).toBeDefined()
    expect(app.dataZoom).toBeDefined()
    expect(app.animation).toBe(true)
    expect(report.tooltip).toBeUndefined()
    expect(report.dataZoom).toBeUndefined()
    expect(report.animation).toBe(false)
  })

  it('escapes labels typed by the user in its tooltips', () => {
    const analysis = analyseProject(UNIFORM)
    const option = interferenceChartOption(interferenceChartInput(analysis), { interactive: true, units: 'SI' })
    const formatter = (option.tooltip as { formatter: (p: unknown) => string }).formatter
    expect(formatter({ seriesName: 'Fan <1> ×1', componentType: 'series' })).toBe('Fan &lt;1&gt; ×1')
  })
})

describe('warning sentences', () => {
  it('say which mode, how far, above or below which excitation', () => {
    const pair: ResonancePair = {
      mode: 1,
      motion: 'axial',
      plane: null,
      family: 'axial',
      frequencyHz: 113.8,
      band: { excitationIndex: 1, label: 'Motor twice line frequency', order: null, hz: [100, 100], excites: ['axial'] },
      separation: 0.138, // (113.8 − 100)/100; an invented pair: the sentence gives 3 significant figures, then 2
      status: 'conflict',
    }
    expect(pairSentence(pair)).toBe('Mode 1 at 114 Hz is 14 % above Motor twice line frequency (100 Hz)')
    expect(pairSentence({ ...pair, frequencyHz: 95, separation: -0.05 })).toBe('Mode 1 at 95 Hz is 5 % below Motor twice line frequency (100 Hz)')
    const band = { excitationIndex: 0, label: 'Pump', order: 2, hz: [98.6667, 99.6667] as const, excites: ['axial' as const] }
    expect(pairSentence({ ...pair, frequencyHz: 99, separation: 0, band })).toBe('Mode 1 at 99 Hz lies inside Pump ×2 (98.67–99.67 Hz, 2960–2990 rpm)')
  })
})

describe('mode shapes', () => {
  it('scales each mode to a peak of 1; a uniform fixed–free bar’s first mode is sin(πx/2L)', () => {
    const analysis = analyseProject(UNIFORM)
    const data = modeShapeChartData(analysis.families[0], [0])
    const curve = data.curves[0]
    expect(Math.max(...curve.displacement.map(Math.abs))).toBeCloseTo(1, 12)
    let worst = 0
    curve.x.forEach((x, i) => (worst = Math.max(worst, Math.abs(curve.displacement[i] - Math.sin((Math.PI * x) / 2)))))
    expect(worst, `largest deviation from sin(πx/2L): ${worst}`).toBeLessThan(1e-4)
    // Strain of the scaled shape: d/dx sin(πx/2L) = (π/2L) cos(πx/2L), largest at the fixed end.
    expect(curve.strain[0]).toBeCloseTo(Math.PI / 2, 2)
  })

  it('thins fine meshes but keeps every segment boundary', () => {
    const fine = project({
      materials: [{ id: 'steel', youngsModulus: 200e9, density: 7850 }],
      segments: [
        { length: 1, material: 'steel', section: { shape: 'solid', diameter: 0.02 } },
        { length: 0.5, material: 'steel', section: { shape: 'solid', diameter: 0.03 } },
      ],
      analysis: { elementOrder: 1, elementsPerSegment: 3000, mass: 'consistent', modes: 2 },
    })
    const curve = modeShapeChartData(analyseProject(fine).families[0], [0], 500).curves[0]
    expect(curve.x.length).toBeLessThanOrEqual(520)
    expect(curve.x).toContain(1)
    expect(curve.x.at(-1)).toBeCloseTo(1.5, 12)
  })

  it('gives stress per peak displacement in MPa/mm (SI) or psi/in (US)', () => {
    const data = modeShapeChartData(analyseProject(UNIFORM).families[0], [0])
    const si = modeShapeChartOption(data, { interactive: false, units: 'SI' })
    const us = modeShapeChartOption(data, { interactive: false, units: 'US' })
    const lower = (o: typeof si) => ((o.series as LineSeriesOption[]).filter((s) => s.yAxisIndex === 1 && s.name !== 'Segment boundaries')[0].data as number[][])[0][1]
    // σ = E ε: 200 GPa × (π/2) per m of peak displacement = 314.16 MPa/mm at the fixed end.
    expect(lower(si)).toBeCloseTo((200e9 * (Math.PI / 2) * 1e-3) / 1e6, -1)
    // 1 psi/in = 6894.757 Pa / 0.0254 m (NIST SP 811).
    expect(lower(us) / lower(si)).toBeCloseTo(1e6 / 1e-3 / (6894.757293168361 / 0.0254), 6)
  })
})

describe('convergence chart', () => {
  it('puts each line’s observed order in its legend: about 2 for 2-node and 4 for 3-node elements', () => {
    const study = convergenceStudy(UNIFORM, { modes: 2, densities: [2, 4, 8, 16], masses: ['consistent', 'lumped'] })
    const option = convergenceChartOption(study, { interactive: false, units: 'SI', mode: 1 })
    const names = (option.legend as { data: string[] }).data
    expect(names).toHaveLength(4)
    study.series.forEach((s, i) => {
      expect(names[i]).toContain(observedOrderText(s, 0))
      expect(s.observedOrder[0]).toBeCloseTo(s.elementOrder === 1 ? 2 : 4, 1)
    })
    // The error axis carries log10 |error|.
    const first = (option.series as LineSeriesOption[])[0].data as number[][]
    expect(10 ** first[0][1]).toBeCloseTo(Math.abs(study.series[0].points[0].errors[0]!), 12)
  })
})

type AnyLabelled = { name?: string; type?: string; label?: { show?: boolean }; endLabel?: { show?: boolean }; markLine?: { label?: { show?: boolean } }; markArea?: { label?: { show?: boolean } }; labelLayout?: unknown; data?: unknown }
interface LabelDatum {
  value: [number, number]
  label: { position: string; distance: number; color: string; formatter: () => string }
}
const labelsOf = (option: { series?: unknown }) => (option.series as AnyLabelled[]).find((x) => x.name === LABEL_SERIES)!.data as LabelDatum[]

/** No series shows text except the label series, which hides any label that would still overlap (hideOverlap). */
function expectOneLabelSeries(option: { series?: unknown }): void {
  for (const x of option.series as AnyLabelled[]) {
    if (x.name === LABEL_SERIES) {
      expect(x.labelLayout).toEqual({ hideOverlap: true })
      continue
    }
    expect(x.label?.show ?? false, `${x.name}: series label`).toBe(false)
    expect(x.endLabel?.show ?? false, `${x.name}: end label`).toBe(false)
    expect(x.markLine?.label?.show ?? false, `${x.name}: mark line label`).toBe(false)
    expect(x.markArea?.label?.show ?? false, `${x.name}: mark area label`).toBe(false)
  }
}

describe('chart labels never collide', () => {
  propertyTest.prop([fc.array(fc.integer({ min: 0, max: 1000 }).map((v) => v / 1000), { maxLength: 30 }), fc.double({ min: 0.01, max: 0.2, noNaN: true })], { seed: 16 })(
    'labelRows never puts two labels nearer than the gap in one row',
    (positions, gap) => {
      const rows = labelRows(positions, gap)
      for (let i = 0; i < positions.length; i++) {
        for (let j = i + 1; j < positions.length; j++) {
          if (rows[i] === rows[j]) expect(Math.abs(positions[i] - positions[j]), `labels ${i} and ${j} share row ${rows[i]}`).toBeGreaterThanOrEqual(gap)
        }
      }
      // Labels far apart all stay in the first row.
      if (positions.length > 0 && positions.every((p, i) => positions.every((q, j) => i === j || Math.abs(p - q) >= gap))) expect(new Set(rows)).toEqual(new Set([0]))
    },
  )

  it('closeRuns chains neighbours: each joins the run of the one just below it', () => {
    expect(closeRuns([0.1, 0.5, 0.53, 0.9], 0.05)).toEqual([[0], [1, 2], [3]])
    // 0.06 is within the gap of 0.04 (not of 0): one run, so no two labels end up nearer than the gap.
    expect(closeRuns([0, 0.04, 0.06], 0.05)).toEqual([[0, 1, 2]])
  })

  propertyTest.prop([fc.array(fc.integer({ min: 0, max: 1000 }).map((v) => v / 1000), { maxLength: 30 }), fc.double({ min: 0.01, max: 0.2, noNaN: true })], { seed: 17 })(
    'closeRuns gathers neighbours nearer than the gap, and leaves runs at least the gap apart',
    (unsorted, gap) => {
      const positions = [...unsorted].sort((a, b) => a - b)
      const runs = closeRuns(positions, gap)
      expect(runs.flat()).toEqual(positions.map((_, i) => i))
      for (const run of runs) for (let k = 1; k < run.length; k++) expect(positions[run[k]] - positions[run[k - 1]]).toBeLessThan(gap)
      for (let r = 1; r < runs.length; r++) expect(positions[runs[r][0]] - positions[runs[r - 1].at(-1)!]).toBeGreaterThanOrEqual(gap)
    },
  )

  it('interference diagram: every text is a label of one series, close modes share one label, equal orders one label', () => {
    const modes = [
      { mode: 1, motion: 'axial' as const, plane: null, family: 'axial' as const, frequencyHz: 100, rigidBody: false, referenceHz: 100 },
      { mode: 2, motion: 'axial' as const, plane: null, family: 'axial' as const, frequencyHz: 103, rigidBody: false, referenceHz: 103 },
      { mode: 3, motion: 'axial' as const, plane: null, family: 'axial' as const, frequencyHz: 300, rigidBody: false, referenceHz: 300 },
    ]
    const excitations: Excitation[] = [
      { label: 'Pump A', rpm: [2960, 2990], orders: [1, 2] },
      { label: 'Pump B', rpm: 1480, orders: [2] },
      { label: 'Hum', hz: 100 },
      { label: 'Hum 60', hz: 120 },
    ]
    const resonance = resonancePairs(modes, { excitations, margin: 0.1 })
    const option = interferenceChartOption({ modes, excitations, margin: 0.1, resonance }, { interactive: true, units: 'SI', hzMax: 500 })
    expectOneLabelSeries(option)
    const texts = labelsOf(option).map((l) => l.label.formatter())
    // Modes 1 and 2 are 3 Hz apart on a 500 Hz axis (less than the gap): one label for both.
    expect(texts).toContain('Modes 1, 2 · 100, 103 Hz')
    expect(texts).toContain('Mode 3 · 300 Hz')
    // 100 Hz and 120 Hz are 4 % of the axis apart: one label, a line each.
    expect(texts).toContain('Hum: 100 Hz\nHum 60: 120 Hz')
    // Order 2 of both pumps is one line and one label.
    expect(texts.filter((t) => t === '×2')).toHaveLength(1)
    // Labels of the natural frequencies stand at the right edge, at least the gap apart.
    const modeAnchors = labelsOf(option)
      .filter((l) => l.label.formatter().startsWith('Mode'))
      .map((l) => l.value[1])
      .sort((a, b) => a - b)
    for (let i = 1; i < modeAnchors.length; i++) expect(modeAnchors[i] - modeAnchors[i - 1]).toBeGreaterThanOrEqual(INTERFERENCE_LABEL_GAP * 500)
    // The conflict diamonds carry no text of their own.
    const conflicts = (option.series as AnyLabelled[]).find((x) => x.name === 'Conflicts')!
    expect(conflicts.label?.show).toBe(false)
  })

  it('response chart: every band is named by its excitation in the legend and labelled in its colour, near neighbours in different rows', () => {
    const excitations = [
      { label: 'Condensate pump', rpm: [2960, 2990] as [number, number], orders: [1, 2, 7] },
      { label: 'Motor hum', hz: 100 },
    ]
    const points = [5, 10, 100, 1000, 5200].map((f) => ({ frequencyHz: f, amplitude: 1e-8 }))
    const modes = [2660.8, 3130.5].map((f, i) => ({ mode: i + 4, frequencyHz: f, rigidBody: false }))
    const option = responseChartOption({ points, modes, excitations, staticFlexibility: 1e-8 }, { interactive: true, units: 'SI' })
    expectOneLabelSeries(option)
    const legend = (option.legend as { data: string[] }).data
    expect(legend).toEqual(['|u/F|', 'Condensate pump', 'Motor hum', 'Modes'])
    const labels = labelsOf(option)
    const named = (text: string) => labels.find((l) => l.label.formatter() === text)!
    for (const [text, excitation] of [['×1', 0], ['×2', 0], ['×7', 0], ['100 Hz', 1]] as const) {
      expect(named(text), text).toBeDefined()
      expect(named(text).label.color, text).toBe(excitationColour(LIGHT_CHART_PALETTE, excitation))
      const series = (option.series as (AnyLabelled & { itemStyle?: { color?: string } })[]).find((x) => x.name === excitations[excitation].label)!
      expect(series.itemStyle?.color).toBe(named(text).label.color)
    }
    // ×2 (98.7–99.7 Hz) and 100 Hz sit closer than the gap on the axis: different rows, so different distances from the top.
    const along = (f: number) => Math.log(f / 5) / Math.log(5200 / 5)
    expect(Math.abs(along(100) - along((2 * 2975) / 60))).toBeLessThan(RESPONSE_LABEL_GAP)
    expect(named('×2').label.distance).not.toBe(named('100 Hz').label.distance)
    // Modes 4 and 5, 0.024 of the axis apart, likewise.
    expect(Math.abs(along(3130.5) - along(2660.8))).toBeLessThan(RESPONSE_LABEL_GAP)
    expect(named('mode 4').label.distance).not.toBe(named('mode 5').label.distance)
  })
})

/**
 * Charts of the other motion families. A uniform round steel shaft, fixed (clamped) at x = 0 and
 * free at x = L, has closed-form modes: torsion θ₁ = sin(πx/2L) with surface shear stress
 * τ = G r θ′ (Rao, torsional vibration of shafts, from memory); bending (Euler–Bernoulli)
 * φ = cosh βx − cos βx − σ(sinh βx − sin βx), σ = (cosh βL + cos βL)/(sinh βL + sin βL),
 * 1 + cos βL cosh βL = 0 (Blevins, Formulas for Natural Frequency and Mode Shape, table 8-1,
 * from memory), surface bending stress E c w″.
 */
function shaft(doc: Record<string, unknown> = {}): Project {
  const read = readProjectDocument({
    format: 'rodwave',
    version: 2,
    motions: ['axial', 'torsion', 'bending'],
    materials: [{ id: 'steel', youngsModulus: 200e9, density: 7850, poissonRatio: 0.3 }],
    segments: [{ length: 1, material: 'steel', section: { shape: 'solid', diameter: 0.02 } }],
    ends: { start: { axial: 'fixed', torsion: 'fixed', bending: 'clamped' }, end: { axial: 'free', torsion: 'free', bending: 'free' } },
    analysis: { elementOrder: 2, elementsPerSegment: 200, mass: 'consistent', modes: 3 },
    excitations: [
      { label: 'Gear mesh', hz: 790, excites: ['torsion'] },
      { label: 'Fan', rpm: [900, 1000], orders: [1] },
    ],
    margin: 0.15,
    ...doc,
  })
  if (!read.ok) throw new Error(read.issues.map((i) => `${i.path}: ${i.message}`).join('\n'))
  return read.project
}

/** First root of 1 + cos x cosh x = 0, by bisection on [1, 2.5]. */
function clampedFreeBeta(): number {
  let a = 1
  let b = 2.5
  for (let i = 0; i < 200; i++) {
    const mid = 0.5 * (a + b)
    if (Math.sign(1 + Math.cos(mid) * Math.cosh(mid)) === Math.sign(1 + Math.cos(a) * Math.cosh(a))) a = mid
    else b = mid
  }
  return 0.5 * (a + b)
}

const lowerSeries = (option: ReturnType<typeof modeShapeChartOption>) =>
  (option.series as LineSeriesOption[]).filter((s) => s.yAxisIndex === 1 && s.name !== 'Segment boundaries')
const yAxisNames = (option: ReturnType<typeof modeShapeChartOption>) => (option.yAxis as { name: string }[]).map((a) => a.name)

describe('mode shapes per family', () => {
  const analysis = analyseProject(shaft())
  const family = (key: string) => analysis.families.find((f) => f.family.key === key)!

  it('torsion: twist sin(πx/2L) scaled to 1, shear stress G r π/(2L) per rad of peak twist at the fixed end, in MPa/rad', () => {
    const data = modeShapeChartData(family('torsion'), [0])
    expect(data.motion).toBe('torsion')
    const curve = data.curves[0]
    let worst = 0
    curve.x.forEach((x, i) => (worst = Math.max(worst, Math.abs(curve.displacement[i] - Math.sin((Math.PI * x) / 2)))))
    expect(worst, `largest deviation from sin(πx/2L): ${worst}`).toBeLessThan(1e-4)
    const option = modeShapeChartOption(data, { interactive: false, units: 'SI' })
    expect(yAxisNames(option)).toEqual(['Twist θ / θ_peak', 'Shear stress per peak θ (MPa/rad)'])
    const G = 200e9 / (2 * 1.3)
    const atRoot = (lowerSeries(option)[0].data as number[][])[0][1]
    // 3-node elements' strain at an element end is O(h²): within 1e-4 at 200 elements.
    expect(Math.abs(atRoot / ((G * 0.01 * (Math.PI / 2)) / 1e6) - 1)).toBeLessThan(1e-4)
    // 1 psi = 6894.757 Pa (NIST SP 811); the twist stays in rad.
    const us = modeShapeChartOption(data, { interactive: false, units: 'US' })
    expect(yAxisNames(us)[1]).toBe('Shear stress per peak θ (psi/rad)')
    expect((lowerSeries(us)[0].data as number[][])[0][1] / atRoot).toBeCloseTo(1e6 / 6894.757293168361, 6)
    const strain = modeShapeChartOption(data, { interactive: false, units: 'SI', lower: 'strain' })
    expect(yAxisNames(strain)[1]).toBe('Twist rate per peak θ ((rad/m)/rad)')
    expect((lowerSeries(strain)[0].data as number[][])[0][1]).toBeCloseTo(Math.PI / 2, 3)
  })

  it('bending: the clamped–free first mode scaled to a tip deflection of 1, root stress E c β²·2/φ(L) per m, slope 0 at the clamp', () => {
    const data = modeShapeChartData(family('bending'), [0])
    expect(data.motion).toBe('bending')
    const beta = clampedFreeBeta()
    const sigma = (Math.cosh(beta) + Math.cos(beta)) / (Math.sinh(beta) + Math.sin(beta))
    const phi = (x: number) => Math.cosh(beta * x) - Math.cos(beta * x) - sigma * (Math.sinh(beta * x) - Math.sin(beta * x))
    const curve = data.curves[0]
    let worst = 0
    curve.x.forEach((x, i) => (worst = Math.max(worst, Math.abs(curve.displacement[i] - phi(x) / phi(1)))))
    expect(worst, `largest deviation from φ(x)/φ(L): ${worst}`).toBeLessThan(1e-6)
    const option = modeShapeChartOption(data, { interactive: false, units: 'SI' })
    expect(yAxisNames(option)).toEqual(['Deflection w / w_peak', 'Bending stress per peak w (MPa/mm)'])
    // φ″(0) = 2β²: stress E c φ″(0)/φ(L) per m of tip deflection, shown per mm.
    const expected = (200e9 * 0.01 * ((2 * beta * beta) / phi(1)) * 1e-3) / 1e6
    const atRoot = (lowerSeries(option)[0].data as number[][])[0][1]
    expect(Math.abs(atRoot / expected - 1), `root stress ${atRoot} MPa/mm, expected ${expected}`).toBeLessThan(1e-3)
    const slope = modeShapeChartOption(data, { interactive: false, units: 'SI', lower: 'slope' })
    expect(yAxisNames(slope)[1]).toBe('Slope per peak w (rad/mm)')
    const slopes = lowerSeries(slope)[0].data as number[][]
    expect(slopes[0][1]).toBe(0)
    // φ′(L)/φ(L) per m at the tip, shown per mm.
    const dphi = beta * (Math.sinh(beta) + Math.sin(beta) - sigma * (Math.cosh(beta) - Math.cos(beta)))
    expect(Math.abs(slopes[slopes.length - 1][1] / ((dphi / phi(1)) * 1e-3) - 1)).toBeLessThan(1e-6)
  })

  it('keeps the axial chart as it was, and asks a family without a slope for its stress', () => {
    const axial = modeShapeChartOption(modeShapeChartData(family('axial'), [0]), { interactive: false, units: 'SI', lower: 'slope' })
    expect(yAxisNames(axial)).toEqual(['Displacement u / u_peak', 'Stress per peak u (MPa/mm)'])
  })
})

describe('interference diagram with several families', () => {
  const analysis = analyseProject(shaft({ analysis: { elementOrder: 2, elementsPerSegment: 40, mass: 'consistent', modes: 5 } }))
  const option = interferenceChartOption(interferenceChartInput(analysis), { interactive: true, units: 'SI' })
  const all = series(option)

  it('draws each family’s natural frequencies in its own line style, with a legend entry per family', () => {
    const names = ['Axial modes', 'Torsion modes', 'Bending modes']
    expect((option.legend as { data: string[] }).data).toEqual(names)
    const families = names.map((n) => all.find((s) => s.name === n) as LineSeriesOption)
    const types = families.map((s) => JSON.stringify(s.lineStyle?.type))
    expect(new Set(types).size).toBe(3)
    const symbols = families.map((s) => s.symbol)
    expect(new Set(symbols).size).toBe(3)
    // Each family's lines are its own modes' frequencies, where the resonance check takes them (the reference where known).
    families.forEach((s, k) => {
      const key = analysis.families[k].family.key
      const expected = analysis.modes.filter((m) => m.family === key && !m.rigidBody).map((m) => m.referenceHz ?? m.frequencyHz)
      const drawn = (s.markLine!.data as { yAxis: number }[]).map((d) => d.yAxis)
      expect(drawn).toEqual(expected.filter((f) => f <= (option.yAxis as { max: number }).max))
    })
  })

  it('marks each conflict in its family’s symbol; the torsion-only excitation conflicts only with torsion', () => {
    const marks = interferenceConflictMarks(interferenceChartInput(analysis))
    const torsion = all.find((s) => s.name === 'Conflicts · torsion') as ScatterSeriesOption
    const bending = all.find((s) => s.name === 'Conflicts · bending') as ScatterSeriesOption
    expect(torsion.symbol).toBe((all.find((s) => s.name === 'Torsion modes') as LineSeriesOption).symbol)
    expect(bending.symbol).toBe((all.find((s) => s.name === 'Bending modes') as LineSeriesOption).symbol)
    expect(torsion.symbol).not.toBe(bending.symbol)
    const conflicts = analysis.resonance.filter((p) => p.status === 'conflict')
    expect(marks.map((m) => m.pair)).toEqual(conflicts)
    expect((torsion.data as unknown[]).length).toBe(conflicts.filter((p) => p.family === 'torsion').length)
    expect((bending.data as unknown[]).length).toBe(conflicts.filter((p) => p.family === 'bending').length)
    // A uniform fixed–free shaft's first torsion mode, (1/4L)·√(G/ρ) = 782.6 Hz, is inside the gear mesh's 15 % margin…
    const t1 = Math.sqrt(200e9 / 2.6 / 7850) / 4
    expect(Math.abs((t1 - 790) / 790)).toBeLessThan(0.15)
    // …and so is the fifth bending mode, (βL)² = 14.1372² (Blevins, table 8-1, from memory): yet only torsion is paired with it.
    const b5 = (14.1372 ** 2 / (2 * Math.PI)) * Math.sqrt((200e9 * (Math.PI / 64) * 0.02 ** 4) / (7850 * (Math.PI / 4) * 0.02 ** 2))
    expect(Math.abs((b5 - 790) / 790)).toBeLessThan(0.15)
    const gear = marks.filter((m) => m.pair.band.label === 'Gear mesh')
    expect(gear.map((m) => m.pair.family)).toEqual(['torsion'])
    const formatter = (option.tooltip as { formatter: (p: unknown) => string }).formatter
    expect(formatter({ seriesName: 'Conflicts · torsion', componentType: 'series', dataIndex: 0 })).toContain('Conflict: torsion mode 1 and Gear mesh')
  })

  it('a single family keeps its one series, no legend and the plain mode labels', () => {
    const single = interferenceChartOption(interferenceChartInput(analyseProject(demo())), { interactive: false, units: 'SI' })
    expect(single.legend).toBeUndefined()
    expect(series(single).map((s) => s.name)).toContain('Natural frequencies')
    expect(series(single).map((s) => s.name)).toContain('Conflicts')
  })

  it('says the family in its sentences when asked', () => {
    const pair = analysis.resonance.find((p) => p.family === 'torsion' && p.status === 'conflict')!
    expect(pairSentence(pair, true)).toMatch(/^Torsion mode 1 at 783 Hz is 0\.94 % below Gear mesh \(790 Hz\)$/)
    expect(pairSentence(pair)).toMatch(/^Mode 1 at 783 Hz/)
  })
})

describe('convergence chart of a family', () => {
  it('names the family and its reference on the error axis; bending has Hermite elements only', () => {
    const project = shaft()
    const bending = convergenceStudy(project, { family: 'bending', modes: 1, densities: [2, 4, 8] })
    const option = convergenceChartOption(bending, { interactive: false, units: 'SI', mode: 1 })
    const against = bending.referenceMethod === 'extrapolated' ? '|f − f_ref| / f_ref' : '|f − f_exact| / f_exact'
    expect((option.yAxis as { name: string }).name).toBe(`${against}, bending mode 1`)
    expect((option.legend as { data: string[] }).data.map((n) => n.split(' · ')[0])).toEqual(['Hermite, consistent', 'Hermite, lumped', 'Hermite, mixed'])
    // Hermite cubics converge as h⁴ in frequency with consistent mass (Hughes, The Finite Element Method, eigenvalue chapter, from memory).
    expect(bending.series[0].observedOrder[0]).toBeCloseTo(4, 0)
    const torsion = convergenceStudy(project, { family: 'torsion', modes: 1, densities: [2, 4, 8], masses: ['consistent'] })
    expect((convergenceChartOption(torsion, { interactive: false, units: 'SI' }).yAxis as { name: string }).name).toContain('torsion mode 1')
  })
})
