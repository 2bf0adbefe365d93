/**
 * The chart builders the design view adds or extends (core/charts, shared with the report):
 * the forced-response chart, and the interference diagram with tolerance bands. Checked for
 * consistency with the resonance check of core/analysis/resonance.ts (the margin band drawn
 * around a tolerance band is the set of excitations separationBetweenBands calls a conflict)
 * and against exact unit factors (NIST SP 811: 1 in = 0.0254 m, 1 lbf = 4.4482216152605 N).
 */
import { describe, expect, it } from 'vitest'
import type { LineSeriesOption, ScatterSeriesOption } from 'echarts'
import { resonancePairs, separationBetweenBands, statusOf, type ResonancePair } from '../../core/analysis/resonance'
import { interferenceChartOption, interferenceConflictMarks, pairMarginBand, pairSentence, responseChartOption } from '../../core/charts'
import type { Excitation } from '../../core/model/project'

type AnySeries = LineSeriesOption | ScatterSeriesOption

describe('forced-response chart', () => {
  const points = [
    { frequencyHz: 0, amplitude: 2e-8 },
    { frequencyHz: 10, amplitude: 2.1e-8 },
    { frequencyHz: 100, amplitude: 5e-7 },
    { frequencyHz: 400, amplitude: 0 },
    { frequencyHz: 1000, amplitude: 3e-9 },
  ]
  const excitations: Excitation[] = [
    { label: 'Pump', rpm: [2960, 2990], orders: [1, 2] },
    { label: 'Hum', hz: 100 },
    { label: 'Far away', hz: 50_000 },
  ]
  const modes = [
    { mode: 1, frequencyHz: 106, rigidBody: false },
    { mode: 2, frequencyHz: 750, rigidBody: false },
    { mode: 3, frequencyHz: 4000, rigidBody: false },
  ]
  const option = (units: 'SI' | 'US', frequencyAxis: 'log' | 'linear' = 'log') =>
    responseChartOption({ points, modes, excitations, staticFlexibility: 2e-8 }, { interactive: false, units, frequencyAxis })
  const seriesOf = (o: ReturnType<typeof option>) => o.series as LineSeriesOption[]

  it('draws |u/F| on log axes, leaving out what a log axis cannot show', () => {
    const o = option('SI')
    const curve = seriesOf(o).find((s) => s.name === '|u/F|')!
    expect((curve.data as number[][]).map((p) => p[0])).toEqual([10, 100, 1000])
    expect((o.xAxis as { type: string }).type).toBe('log')
    expect((o.yAxis as { type: string; name: string }).type).toBe('log')
    expect((o.yAxis as { name: string }).name).toBe('|u/F| (m/N)')
    // A linear axis keeps 0 Hz.
    expect((seriesOf(option('SI', 'linear')).find((s) => s.name === '|u/F|')!.data as number[][])[0]).toEqual([0, 2e-8])
  })

  it('shades every excitation band in range in its excitation’s series, draws a single frequency as a line and marks the modes in range', () => {
    const s = seriesOf(option('SI'))
    const pump = s.find((x) => x.name === 'Pump')!
    const areas = pump.markArea!.data as [{ xAxis: number }, { xAxis: number }][]
    expect(areas.map(([a, b]) => [a.xAxis, b.xAxis])).toEqual([
      [2960 / 60, 2990 / 60],
      [(2 * 2960) / 60, (2 * 2990) / 60],
    ])
    expect((s.find((x) => x.name === 'Hum')!.markLine!.data as { xAxis: number }[]).map((l) => l.xAxis)).toEqual([100])
    // A band beyond the plotted range has no series and no legend entry.
    expect(s.find((x) => x.name === 'Far away')).toBeUndefined()
    const marked = (s.find((x) => x.name === 'Modes')!.markLine!.data as { xAxis: number }[]).map((l) => l.xAxis)
    expect(marked).toEqual([106, 750])
  })

  it('draws the static value as a reference, in the chosen units (in/lbf = 0.0254/4.4482216152605 m/N)', () => {
    const perInchPound = 0.0254 / 4.4482216152605
    const curve = seriesOf(option('US')).find((x) => x.name === '|u/F|')!
    expect((curve.data as number[][])[0][1]).toBeCloseTo(2.1e-8 / perInchPound, 20)
    const level = (curve.markLine!.data as [{ coord: number[] }, { coord: number[] }][])[0]
    expect(level[0].coord[1]).toBeCloseTo(2e-8 / perInchPound, 20)
    expect(level[1].coord[1]).toBe(level[0].coord[1])
    const unsupported = responseChartOption({ points, modes, excitations, staticFlexibility: null }, { interactive: false, units: 'SI' })
    expect(seriesOf(unsupported).find((x) => x.name === '|u/F|')!.markLine).toBeUndefined()
  })
})

describe('interference diagram with tolerance bands', () => {
  const excitations: Excitation[] = [{ label: 'Line', hz: 100 }]
  const margin = 0.1
  const modes = [
    { mode: 1, motion: 'axial' as const, plane: null, family: 'axial' as const, frequencyHz: 112, rigidBody: false, referenceHz: 112 },
    { mode: 2, motion: 'axial' as const, plane: null, family: 'axial' as const, frequencyHz: 300, rigidBody: false, referenceHz: 300 },
  ]
  const bands = new Map<string, readonly [number, number]>([
    ['axial 1', [106, 118]],
    ['axial 2', [290, 310]],
  ])
  const scatter = [...bands].map(([key, [p05, p95]]) => ({ mode: Number(key.split(' ')[1]), family: 'axial' as const, p05, p95 }))
  const banded = resonancePairs(modes, { excitations, margin }, bands)
  const nominal = resonancePairs(modes, { excitations, margin })
  const series = (pairs: ResonancePair[], hzMax = 400) =>
    interferenceChartOption({ modes, excitations, margin, resonance: pairs, scatter }, { interactive: false, units: 'SI', hzMax }).series as AnySeries[]

  it('changes a pair’s status when its band reaches into the margin', () => {
    // 112 Hz is 12 % above 100 Hz: clear at 10 %; its band starts at 106 Hz, 6 % above: a conflict.
    expect(nominal[0].status).toBe('clear')
    expect(banded[0].status).toBe('conflict')
    expect(banded[0].separation).toBe(separationBetweenBands([106, 118], [100, 100]))
    expect(statusOf(banded[0].separation, margin)).toBe('conflict')
  })

  it('draws every tolerance band, and the margin band around it where the check used it', () => {
    const s = series(banded)
    const tolerance = s.find((x) => x.name === 'Tolerance bands') as LineSeriesOption
    expect((tolerance.markArea!.data as [{ yAxis: number }, { yAxis: number }][]).map(([a, b]) => [a.yAxis, b.yAxis])).toEqual([
      [106, 118],
      [290, 310],
    ])
    // A mode above the diagram's top is left off with its band.
    const lower = series(banded, 200).find((x) => x.name === 'Tolerance bands') as LineSeriesOption
    expect(lower.markArea!.data).toHaveLength(1)
    const margins = ((s.find((x) => x.name === 'Natural frequencies') as LineSeriesOption).markArea!.data as [{ yAxis: number }, { yAxis: number }][]).map(([a, b]) => [a.yAxis, b.yAxis])
    expect(margins[0][0]).toBeCloseTo(106 / 1.1, 12)
    expect(margins[0][1]).toBeCloseTo(118 / 0.9, 12)
    // Just inside the drawn band conflicts, just outside is clear: the band is the check's own.
    for (const [edge, inside] of [
      [margins[0][0] * 1.0001, true],
      [margins[0][0] * 0.9999, false],
      [margins[0][1] * 0.9999, true],
      [margins[0][1] * 1.0001, false],
    ] as const) {
      expect(statusOf(separationBetweenBands([106, 118], [edge, edge]), margin), `excitation at ${edge}`).toBe(inside ? 'conflict' : 'clear')
    }
    // On the nominal basis the margin band is around the frequency itself.
    const nominalMargins = ((series(nominal).find((x) => x.name === 'Natural frequencies') as LineSeriesOption).markArea!.data as [{ yAxis: number }, { yAxis: number }][])[0]
    expect(nominalMargins[0].yAxis).toBeCloseTo(112 / 1.1, 12)
    expect(pairMarginBand(nominal[0], margin)).toEqual([112 / 1.1, 112 / 0.9])
  })

  it('marks each conflict of the band check where the excitation meets the band', () => {
    const marks = interferenceConflictMarks({ modes, excitations, margin, resonance: banded, scatter })
    expect(marks).toHaveLength(banded.filter((p) => p.status === 'conflict').length)
    expect(marks[0].hz).toBe(100)
  })

  it('says a banded pair with its band', () => {
    expect(pairSentence(banded[0])).toBe('Mode 1, tolerance band 106–118 Hz, is 6 % above Line (100 Hz)')
    expect(pairSentence({ ...banded[0], modeBandHz: [95, 118], separation: 0 })).toBe('Mode 1, tolerance band 95–118 Hz, overlaps Line (100 Hz)')
  })
})
