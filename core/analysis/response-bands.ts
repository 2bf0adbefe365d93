/**
 * The forced response as the engineer reads it: the receptance on a frequency grid (evenly
 * spaced on a linear or a logarithmic axis, with every mode and its half-power points added so
 * that no peak falls between samples), and at each excitation band the largest receptance, its
 * amplification over the static value and the largest axial stress along the bar. Over core's
 * receptance (forced-response.ts); the app's design view and the command line show the same.
 */
import { brentMinimize } from '../optimize/brent-minimize'
import { evaluateReceptance, peakStressPerForce, type ReceptanceModel } from './forced-response'
import type { FamilyAnalysis } from './modal-analysis'
import { excitationBands, type ExcitationBand } from './resonance'

export type FrequencyAxis = 'linear' | 'log'

/** A logarithmic axis asked to start at 0 Hz starts this many decades below the top of the range. */
export const LOG_DECADES = 3
/** Samples of |H| across an excitation band before the largest is refined. */
const BAND_SAMPLES = 200
/** Frequencies across a band at which the stress along the bar is evaluated (plus the modes inside it and the peak of |H|). */
const BAND_STRESS_SAMPLES = 17

export interface GridRequest {
  readonly fromHz: number
  readonly toHz: number
  readonly points: number
  readonly axis: FrequencyAxis
}

/** The first frequency of the grid: `fromHz`, or on a log axis from 0, LOG_DECADES below `toHz`. */
export function gridStartHz(request: Pick<GridRequest, 'fromHz' | 'toHz' | 'axis'>): number {
  return request.axis === 'log' && !(request.fromHz > 0) ? request.toHz / 10 ** LOG_DECADES : request.fromHz
}

/**
 * The frequency grid: `points` frequencies evenly spaced on the chosen axis, plus each mode's
 * frequency and its half-power points f(1 ± ζ) inside the range, so no peak falls between samples.
 */
export function responseGrid(request: GridRequest, modeHz: readonly number[], damping: number): number[] {
  const { toHz, points, axis } = request
  const fromHz = gridStartHz(request)
  const grid: number[] = []
  for (let i = 0; i < points; i++) {
    const t = points === 1 ? 0 : i / (points - 1)
    grid.push(axis === 'log' ? fromHz * (toHz / fromHz) ** t : fromHz + (toHz - fromHz) * t)
  }
  for (const f of modeHz) for (const g of [f * (1 - damping), f, f * (1 + damping)]) if (g > fromHz && g < toHz) grid.push(g)
  grid.sort((a, b) => a - b)
  return grid.filter((f, i) => i === 0 || f !== grid[i - 1])
}

export function amplitudeAt(model: ReceptanceModel, frequencyHz: number): number {
  const [re, im] = evaluateReceptance(model, 2 * Math.PI * frequencyHz)
  return Math.hypot(re, im)
}

/** The largest |H| over a band: a scan (with the modes inside it) refined by Brent's method around the best sample. */
export function bandPeak(model: ReceptanceModel, band: readonly [number, number], modeHz: readonly number[]): { hz: number; amplitude: number } {
  const [lo, hi] = band
  if (!(hi > lo)) return { hz: lo, amplitude: amplitudeAt(model, lo) }
  const step = (hi - lo) / BAND_SAMPLES
  const candidates = Array.from({ length: BAND_SAMPLES + 1 }, (_, i) => lo + step * i)
  for (const f of modeHz) if (f > lo && f < hi) candidates.push(f)
  let best = { hz: lo, amplitude: -Infinity }
  for (const hz of candidates) {
    const amplitude = amplitudeAt(model, hz)
    if (amplitude > best.amplitude) best = { hz, amplitude }
  }
  const refined = brentMinimize((f) => -amplitudeAt(model, f), Math.max(lo, best.hz - step), Math.min(hi, best.hz + step), 1e-10)
  return -refined.fx > best.amplitude ? { hz: refined.x, amplitude: -refined.fx } : best
}

export interface BandResponse {
  readonly band: ExcitationBand
  /** Largest |u/F| over the band, m/N, and where in the band. */
  readonly peakAmplitude: number
  readonly peakHz: number
  /** peakAmplitude / |H(0)|; null for a bar without support (no static value). */
  readonly amplification: number | null
  /** Largest axial stress amplitude along the bar per newton over the band, Pa/N; where along the bar (m) and at what frequency. */
  readonly stressPerForce: number
  readonly stressAt: number
  readonly stressHz: number
}

/** Per excitation band that drives the family: the peak receptance, its amplification and the largest stress per unit force (torque) at `forceAt`. */
export function bandResponses(analysis: FamilyAnalysis, model: ReceptanceModel, forceAt: number): BandResponse[] {
  const elasticHz = analysis.modes.filter((m) => !m.rigidBody).map((m) => m.frequencyHz)
  const staticFlexibility = model.staticFlexibility === null ? null : Math.abs(model.staticFlexibility)
  const bands = excitationBands(analysis.project.excitations, analysis.project.motions).filter((b) => b.excites.includes(analysis.family.motion))
  return bands.map((band): BandResponse => {
    const peak = bandPeak(model, band.hz, elasticHz)
    const [lo, hi] = band.hz
    const stressHz = [peak.hz, ...elasticHz.filter((f) => f > lo && f < hi)]
    if (hi > lo) for (let i = 0; i < BAND_STRESS_SAMPLES; i++) stressHz.push(lo + ((hi - lo) * i) / (BAND_STRESS_SAMPLES - 1))
    let stress = { stress: -Infinity, at: 0, hz: lo }
    for (const hz of stressHz) {
      const s = peakStressPerForce(analysis, forceAt, hz, model.damping)
      if (s.stress > stress.stress) stress = { ...s, hz }
    }
    return {
      band,
      peakAmplitude: peak.amplitude,
      peakHz: peak.hz,
      amplification: staticFlexibility ? peak.amplitude / staticFlexibility : null,
      stressPerForce: stress.stress,
      stressAt: stress.at,
      stressHz: stress.hz,
    }
  })
}
