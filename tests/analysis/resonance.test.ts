/**
 * The resonance check on cases worked by hand. separation = (f − f_exc)/f_exc with f_exc the
 * nearest point of the excitation band (0 inside); conflict when |separation| < margin.
 * Keeping 10–20 % away from excitation is common practice, no single source.
 */
import { describe, expect, test } from 'vitest'
import { excitationBands, resonancePairs, separationFromBand, statusOf, closestPair } from '../../core/analysis/resonance'
import { analyseProject } from '../../core/analysis/modal-analysis'
import { modalSummaryCsv, MODAL_SUMMARY_COLUMNS, solveDocument } from '../../core/analysis/modal-summary'
import { makeProject, uniformBar } from '../helpers'

/** Modes of axial motion, as the analysis labels them. */
const AXIAL = { motion: 'axial', plane: null, family: 'axial' } as const

describe('bands', () => {
  test('a speed range with orders: [rpm_min·n, rpm_max·n]/60', () => {
    // 1450–1490 rpm: ×1 → 24.1667–24.8333 Hz; ×2 → 48.3333–49.6667 Hz; ×7 → 169.1667–173.8333 Hz.
    const bands = excitationBands([{ label: 'Pump', rpm: [1450, 1490], orders: [1, 2, 7] }])
    expect(bands.map((b) => b.order)).toEqual([1, 2, 7])
    expect(bands[0].hz[0]).toBeCloseTo(1450 / 60, 12)
    expect(bands[0].hz[1]).toBeCloseTo(1490 / 60, 12)
    expect(bands[2].hz[0]).toBeCloseTo((1450 * 7) / 60, 12)
    expect(bands[2].hz[1]).toBeCloseTo((1490 * 7) / 60, 12)
  })
  test('a single speed is a band of zero width; a frequency excitation has no order', () => {
    const [speed, line] = excitationBands([{ rpm: 3000, orders: [2] }, { label: 'Line', hz: 100 }])
    expect(speed.hz).toEqual([100, 100])
    expect(speed.label).toBe('Excitation 1')
    expect(line).toEqual({ excitationIndex: 1, label: 'Line', order: null, hz: [100, 100], excites: ['axial', 'torsion', 'bending'] })
  })
})

describe('separation and status', () => {
  test('above, below and inside a band', () => {
    // 115 Hz against 100 Hz: (115 − 100)/100 = +0.15.
    expect(separationFromBand(115, [100, 100])).toBeCloseTo(0.15, 14)
    // 85 Hz against 100–110 Hz: nearest point 100, (85 − 100)/100 = −0.15.
    expect(separationFromBand(85, [100, 110])).toBeCloseTo(-0.15, 14)
    // 121 Hz against 100–110 Hz: nearest point 110, (121 − 110)/110 = +0.1.
    expect(separationFromBand(121, [100, 110])).toBeCloseTo(0.1, 14)
    // 105 Hz inside 100–110 Hz: 0.
    expect(separationFromBand(105, [100, 110])).toBe(0)
  })
  test('exactly at the margin is clear; just inside is a conflict', () => {
    // |separation| < margin is a conflict, so 0.15 against a 15 % margin is clear.
    expect(statusOf(0.15, 0.15)).toBe('clear')
    expect(statusOf(-0.15, 0.15)).toBe('clear')
    expect(statusOf(0.1499999, 0.15)).toBe('conflict')
    expect(statusOf(0, 0.15)).toBe('conflict')
  })
  test('hz and rpm excitations give the same separation for the same frequency', () => {
    const modes = [{ ...AXIAL, mode: 1, frequencyHz: 56, rigidBody: false }]
    const byRpm = resonancePairs(modes, { excitations: [{ rpm: 3000, orders: [1] }], margin: 0.15 })
    const byHz = resonancePairs(modes, { excitations: [{ hz: 50 }], margin: 0.15 })
    // (56 − 50)/50 = 0.12 → conflict at 15 %.
    expect(byRpm[0].separation).toBeCloseTo(0.12, 14)
    expect(byHz[0].separation).toBeCloseTo(0.12, 14)
    expect(byRpm[0].status).toBe('conflict')
  })
  test('every elastic mode meets every band; rigid-body modes are skipped; the closest pair is found', () => {
    const modes = [
      { ...AXIAL, mode: 1, frequencyHz: 0, rigidBody: true },
      { ...AXIAL, mode: 2, frequencyHz: 300, rigidBody: false },
      { ...AXIAL, mode: 3, frequencyHz: 900, rigidBody: false },
    ]
    const pairs = resonancePairs(modes, { excitations: [{ rpm: [2900, 3000], orders: [1, 6] }, { hz: 120 }], margin: 0.1 })
    expect(pairs.length).toBe(2 * 3)
    // Mode 3 against ×6 at 290–300 Hz: nearest 300, (900 − 300)/300 = 2; against 120 Hz: 6.5; against ×1 (48.3–50 Hz): 17.
    const closest = closestPair(pairs, { family: 'axial', mode: 2 })!
    // Mode 2 against ×6: 300 Hz lies inside 290–300 Hz → 0.
    expect(closest.separation).toBe(0)
    expect(closest.band.order).toBe(6)
    expect(closestPair(pairs, { family: 'axial', mode: 3 })!.separation).toBeCloseTo(2, 12)
  })
})

describe('on a solved part', () => {
  test('the check uses the exact frequency, reports it as modeHz, and the CSV has a row per mode', () => {
    // Uniform steel bar, 1 m, fixed–free: f1 = c/4L = 1261.886 Hz (docs/verification.md §1).
    const project = uniformBar({ extra: { excitations: [{ label: 'Gear mesh', rpm: [3000, 3200], orders: [24] }], margin: 0.15, analysis: { modes: 3 } } })
    const analysis = analyseProject(project)
    const doc = solveDocument(analysis)
    const first = doc.resonance.find((r) => r.mode === 1)!
    expect(first.modeHz).toBeCloseTo(Math.sqrt(200e9 / 7850) / 4, 9)
    // 24 × 3000–3200 rpm = 1200–1280 Hz: 1261.9 Hz lies inside → separation 0, conflict.
    expect(first.separation).toBe(0)
    expect(first.status).toBe('conflict')
    const csv = modalSummaryCsv(analysis).trim().split('\r\n')
    expect(csv[0].split(',')).toEqual([...MODAL_SUMMARY_COLUMNS])
    expect(csv.length).toBe(1 + analysis.modes.length)
    const row = csv[1].split(',')
    expect(row[MODAL_SUMMARY_COLUMNS.indexOf('closest_excitation')]).toBe('Gear mesh ×24')
    expect(row[MODAL_SUMMARY_COLUMNS.indexOf('status')]).toBe('conflict')
    expect(Number(row[MODAL_SUMMARY_COLUMNS.indexOf('speed_rpm')])).toBeCloseTo(60 * analysis.modes[0].frequencyHz, 4)
  })
  test('CSV quotes labels with commas and quotes (RFC 4180)', () => {
    const project = makeProject({
      materials: [{ id: 's', youngsModulus: 2e11, density: 7850 }],
      segments: [{ length: 1, material: 's', section: { shape: 'solid', diameter: 0.02 } }],
      excitations: [{ label: 'Fan "A", outboard', hz: 1200 }],
      analysis: { modes: 1 },
    })
    const csv = modalSummaryCsv(analyseProject(project))
    expect(csv).toContain('"Fan ""A"", outboard"')
  })
})

describe('with tolerance bands', () => {
  test('a mode band overlapping the excitation is a conflict; otherwise the nearest points count', () => {
    // Mode band 95–105 Hz against 110 Hz: nearest points 105 and 110, (105 − 110)/110 = −0.04545.
    const modes = [{ ...AXIAL, mode: 1, frequencyHz: 100, rigidBody: false }]
    const project = { excitations: [{ hz: 110 }, { hz: 102 }], margin: 0.05 }
    const pairs = resonancePairs(modes, project, new Map([['axial 1', [95, 105] as [number, number]]]))
    expect(pairs[0].separation).toBeCloseTo(-5 / 110, 14)
    expect(pairs[0].status).toBe('conflict')
    // 102 Hz lies inside 95–105 Hz: separation 0.
    expect(pairs[1].separation).toBe(0)
    expect(pairs[1].modeBandHz).toEqual([95, 105])
    // Without the band the nominal 100 Hz is (100 − 110)/110 = −0.0909 away: clear at 5 %.
    expect(resonancePairs(modes, project)[0].status).toBe('clear')
  })
})
