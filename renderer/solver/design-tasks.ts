/**
 * The design-guidance work the solver does for the window (sensitivities, a share of a
 * tolerance scatter, the forced response; the tuner is core's tuneParameter as it is), as plain
 * functions over core: run by the worker and, where no worker exists, in the page. Results are
 * structured-clone safe.
 */
import { analyseProject, type FamilyAnalysis, type ModeResult } from '../../core/analysis/modal-analysis'
import { designParameters, type DesignParameter } from '../../core/analysis/design-parameters'
import { designSensitivities, type FamilySensitivity } from '../../core/analysis/family-sensitivity'
import { scatterFrequencies } from '../../core/analysis/tolerance-scatter'
import { evaluateReceptance, peakStressPerForce, pointWeights, receptanceModel, type ReceptanceModel } from '../../core/analysis/forced-response'
import { excitationBands, type ExcitationBand } from '../../core/analysis/resonance'
import { brentMinimize } from '../../core/optimize/brent-minimize'
import { totalLength } from '../../core/model/geometry'
import type { Motion, Project } from '../../core/model/project'
import type { FamilyKey } from '../../core/model/families'
import { partKey } from './part-key'

export interface SensitivityTable {
  readonly parameters: DesignParameter[]
  /**
   * The frequencies the sensitivities belong to (elastic modes only), family by family: exact for
   * axial motion, the finite-element ones for torsion and bending.
   */
  readonly modes: Pick<FamilySensitivity, 'mode' | 'motion' | 'plane' | 'family' | 'frequencyHz'>[]
  readonly sensitivities: FamilySensitivity[]
}

/**
 * Sensitivities of every analysed family's reported modes to every parameter: from the exact
 * mode shapes for axial motion, by Rayleigh's principle on the finite-element modes for torsion
 * and bending (core/analysis/family-sensitivity.ts).
 */
export function sensitivityTask(project: Project): SensitivityTable {
  const parameters = designParameters(project)
  const sensitivities = designSensitivities(project, project.analysis.modes)
  const modes = [...new Map(sensitivities.map((s) => [`${s.family} ${s.mode}`, { mode: s.mode, motion: s.motion, plane: s.plane, family: s.family, frequencyHz: s.frequencyHz }])).values()]
  return { parameters, modes, sensitivities }
}

/** One worker's share of a scatter: samples start … start + count − 1. */
export interface ScatterShareRun {
  readonly seed: number
  readonly start: number
  readonly count: number
  readonly modes: number
}

export type NominalMode = Pick<ModeResult, 'mode' | 'motion' | 'plane' | 'family' | 'frequencyHz'>

export interface ScatterShare {
  /** Row-major count × modes, Hz. */
  readonly frequencies: Float64Array
  /** The nominal part's modes (finite-element frequencies on the same mesh), every family in order. */
  readonly nominal: NominalMode[]
  readonly modes: number
}

/** Samples solved between two progress reports. */
const SCATTER_CHUNK = 25

/**
 * A share of the samples, solved in chunks so progress can be reported. Sample i depends only on
 * the seed and i (tolerance-scatter.ts), so chunks and shares join into the same result.
 */
export function scatterShareTask(project: Project, run: ScatterShareRun, onProgress?: (fraction: number) => void): ScatterShare {
  const nominal = analyseProject(project, { modes: run.modes }, { withReference: false })
  const modes = nominal.modes.length
  const frequencies = new Float64Array(run.count * modes)
  for (let done = 0; done < run.count; done += SCATTER_CHUNK) {
    const count = Math.min(SCATTER_CHUNK, run.count - done)
    frequencies.set(scatterFrequencies(project, { seed: run.seed, start: run.start + done, count, modes: run.modes }, nominal), done * modes)
    onProgress?.((done + count) / run.count)
  }
  return { frequencies, nominal: nominal.modes.map(({ mode, motion, plane, family, frequencyHz }) => ({ mode, motion, plane, family, frequencyHz })), modes }
}

export type FrequencyAxis = 'linear' | 'log'

export interface ResponseTaskRequest {
  /** The family whose response is computed (default: the project's first): a force along the axis, a torque, or a side force. */
  readonly family?: FamilyKey
  /** Where the force (torque) acts and where the displacement (twist, deflection) is read, m from the start. */
  readonly forceAt: number
  readonly responseAt: number
  readonly fromHz: number
  readonly toHz: number
  readonly points: number
  readonly axis: FrequencyAxis
}

export interface ResponseBandRow {
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

export interface ResponsePoint {
  readonly frequencyHz: number
  /** |u/F|, m/N. */
  readonly amplitude: number
}

export interface ResponseResult {
  readonly request: ResponseTaskRequest
  /** The family computed, and its motion (which says force or torque, displacement or twist). */
  readonly family: FamilyKey
  readonly motion: Motion
  readonly damping: number
  /** First frequency of the grid (a log axis cannot start at 0). */
  readonly firstHz: number
  readonly points: ResponsePoint[]
  /** |H(0)| = G, m/N; null for a bar without support. */
  readonly staticFlexibility: number | null
  /** The finite-element modes the response is built from. */
  readonly modes: { readonly mode: number; readonly frequencyHz: number; readonly rigidBody: boolean }[]
  readonly bands: ResponseBandRow[]
}

// A log axis from 0 starts this far below the top of the range.
const LOG_DECADES = 3
/** Samples of |H| across an excitation band before the largest is refined. */
const BAND_SAMPLES = 200
/** Frequencies across a band at which the stress along the bar is evaluated (plus the modes inside it and the peak of |H|). */
const BAND_STRESS_SAMPLES = 17

/**
 * The frequency grid: `points` frequencies evenly spaced on the chosen axis, plus each mode's
 * frequency and its half-power points f(1 ± ζ) inside the range, so no peak falls between samples.
 */
export function responseGrid(request: Pick<ResponseTaskRequest, 'fromHz' | 'toHz' | 'points' | 'axis'>, modeHz: readonly number[], damping: number): number[] {
  const { toHz, points, axis } = request
  const fromHz = axis === 'log' && !(request.fromHz > 0) ? toHz / 10 ** LOG_DECADES : request.fromHz
  const grid: number[] = []
  for (let i = 0; i < points; i++) {
    const t = points === 1 ? 0 : i / (points - 1)
    grid.push(axis === 'log' ? fromHz * (toHz / fromHz) ** t : fromHz + (toHz - fromHz) * t)
  }
  for (const f of modeHz) for (const g of [f * (1 - damping), f, f * (1 + damping)]) if (g > fromHz && g < toHz) grid.push(g)
  grid.sort((a, b) => a - b)
  return grid.filter((f, i) => i === 0 || f !== grid[i - 1])
}

function amplitudeAt(model: ReceptanceModel, frequencyHz: number): number {
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

// The worker keeps the last solved part and family: changing the range, the points or the damping needs no new solve.
let cached: { key: string; analysis: FamilyAnalysis } | null = null

function analysisOf(project: Project, family?: FamilyKey): FamilyAnalysis {
  const key = JSON.stringify([partKey(project), project.preload ?? 0, project.motions, family ?? null])
  if (cached?.key !== key) {
    const analysis = analyseProject(project, {}, { withReference: false, ...(family ? { families: [family] } : {}) })
    const found = analysis.families[0]
    if (!found) throw new RangeError(`the part does not analyse ${family ?? 'any motion'}`)
    cached = { key, analysis: found }
  }
  return cached.analysis
}

/** Receptance u(responseAt)/F(forceAt) over the range, and per excitation band its amplification and largest stress. */
export function responseTask(project: Project, request: ResponseTaskRequest): ResponseResult {
  const length = totalLength(project.segments)
  for (const [name, x] of [
    ['force point', request.forceAt],
    ['response point', request.responseAt],
  ] as const) {
    if (!(x >= 0 && x <= length)) throw new RangeError(`the ${name} must lie on the bar, between 0 and its length`)
  }
  if (!(request.fromHz >= 0 && request.toHz > request.fromHz)) throw new RangeError('the frequency range must satisfy 0 ≤ from < to')
  const analysis = analysisOf(project, request.family)
  const motion = analysis.family.motion
  const damping = project.damping
  const model = receptanceModel(analysis, pointWeights(analysis, request.forceAt), pointWeights(analysis, request.responseAt), damping)
  const elasticHz = analysis.modes.filter((m) => !m.rigidBody).map((m) => m.frequencyHz)
  const grid = responseGrid(request, elasticHz, damping)
  const points = grid.map((frequencyHz) => ({ frequencyHz, amplitude: amplitudeAt(model, frequencyHz) }))
  const staticFlexibility = model.staticFlexibility === null ? null : Math.abs(model.staticFlexibility)
  // Only the excitations that drive this family.
  const bands = excitationBands(project.excitations, project.motions).filter((b) => b.excites.includes(motion)).map((band): ResponseBandRow => {
    const peak = bandPeak(model, band.hz, elasticHz)
    const [lo, hi] = band.hz
    const stressHz = [peak.hz, ...elasticHz.filter((f) => f > lo && f < hi)]
    if (hi > lo) for (let i = 0; i < BAND_STRESS_SAMPLES; i++) stressHz.push(lo + ((hi - lo) * i) / (BAND_STRESS_SAMPLES - 1))
    let stress = { stress: -Infinity, at: 0, hz: lo }
    for (const hz of stressHz) {
      const s = peakStressPerForce(analysis, request.forceAt, hz, damping)
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
  return {
    request,
    family: analysis.family.key,
    motion,
    damping,
    firstHz: grid[0],
    points,
    staticFlexibility,
    modes: analysis.modes.map((m) => ({ mode: m.mode, frequencyHz: m.frequencyHz, rigidBody: m.rigidBody })),
    bands,
  }
}
