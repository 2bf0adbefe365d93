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
import { pointWeights, receptanceModel } from '../../core/analysis/forced-response'
import { amplitudeAt, bandResponses, responseGrid, type BandResponse, type FrequencyAxis } from '../../core/analysis/response-bands'
import { totalLength } from '../../core/model/geometry'
import type { Motion, Project } from '../../core/model/project'
import type { FamilyKey } from '../../core/model/families'
import { partKey } from './part-key'

// The grid and its axis are core's (core/analysis/response-bands.ts); the window imports them from here.
export { responseGrid, type FrequencyAxis }

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

/** Per excitation band that drives the family: core's band response (core/analysis/response-bands.ts). */
export type ResponseBandRow = BandResponse

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
  // The cached analysis may carry an earlier project's excitations (the key leaves them out): the bands are this project's.
  const bands = bandResponses({ ...analysis, project }, model, request.forceAt)
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
