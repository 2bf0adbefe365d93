/**
 * Tolerance scatter: the file's tolerances are relative half-widths (±) of uniform scatter.
 * Each sample draws one factor per material (E, density), per segment length, per section
 * dimension, per point mass and per spring, independently, and solves the part (finite
 * elements on the project's mesh, started from the nominal modes). Per mode, the 5 %, 50 %
 * and 95 % sample quantiles (linear interpolation between order statistics, type 7 of
 * R. J. Hyndman & Y. Fan, Am. Stat. 50 (1996); from memory) turn the frequency into a band.
 *
 * Sample i always uses the same random stream (seeded from the seed and i), so any split of
 * the samples between workers gives the same result.
 */
import { seededRandom, type RandomSource } from '../random'
import type { Project, Tolerances } from '../model/project'
import { analyseProject, type ModalAnalysis } from './modal-analysis'
import { designParameters, withParameter } from './design-parameters'

export interface ScatterQuantiles {
  readonly mode: number
  readonly nominalHz: number
  readonly p05: number
  readonly p50: number
  readonly p95: number
}

/** A mixing of seed and sample index into a 32-bit seed (the finaliser of MurmurHash3, from memory). */
function sampleSeed(seed: number, index: number): number {
  let h = (seed ^ Math.imul(index + 1, 0x9e3779b1)) >>> 0
  h = Math.imul(h ^ (h >>> 16), 0x85ebca6b) >>> 0
  h = Math.imul(h ^ (h >>> 13), 0xc2b2ae35) >>> 0
  return (h ^ (h >>> 16)) >>> 0
}

const TOLERANCE_OF: Record<string, keyof Tolerances> = {
  youngsModulus: 'youngsModulus',
  density: 'density',
  segmentLength: 'length',
  sectionDimension: 'diameter',
  mass: 'mass',
  stiffness: 'stiffness',
}

/** One random draw of the project within its tolerances. */
export function scatterDraw(project: Project, tolerances: Tolerances, random: RandomSource): Project {
  let drawn = project
  for (const parameter of designParameters(project)) {
    const tolerance = tolerances[TOLERANCE_OF[parameter.target.kind]] ?? 0
    // Draw for every parameter, even with zero tolerance, so streams line up across settings.
    const u = 2 * random() - 1
    if (tolerance === 0) continue
    drawn = withParameter(drawn, parameter.target, parameter.value * (1 + tolerance * u))
  }
  drawn.segments.forEach((segment, i) => {
    if (segment.section.shape === 'tube' && !(segment.section.innerDiameter < segment.section.outerDiameter)) {
      throw new RangeError(`the diameter tolerance lets the bore of segment ${i + 1} reach its outer diameter; reduce tolerances.diameter`)
    }
  })
  return drawn
}

export interface ScatterRun {
  readonly seed: number
  /** First sample index and number of samples of this run (a worker's share). */
  readonly start: number
  readonly count: number
  readonly modes?: number
}

/** Frequencies of samples start … start + count − 1: row-major count × modes, Hz. */
export function scatterFrequencies(project: Project, run: ScatterRun, nominal?: ModalAnalysis): Float64Array {
  const tolerances = project.tolerances ?? {}
  const overrides = run.modes ? { modes: run.modes } : {}
  const base = nominal ?? analyseProject(project, overrides, { withReference: false })
  const modes = base.modes.length
  const out = new Float64Array(run.count * modes)
  for (let s = 0; s < run.count; s++) {
    const random = seededRandom(sampleSeed(run.seed, run.start + s))
    const drawn = scatterDraw(project, tolerances, random)
    const analysis = analyseProject(drawn, overrides, { withReference: false, warmStart: base })
    for (let m = 0; m < modes; m++) out[s * modes + m] = analysis.modes[m]?.frequencyHz ?? NaN
  }
  return out
}

/** Sample quantile, type 7: h = (n − 1)p, linear between the order statistics around h. */
export function sampleQuantile(sorted: ArrayLike<number>, p: number): number {
  const n = sorted.length
  if (n === 0) return NaN
  const h = (n - 1) * p
  const lo = Math.floor(h)
  const hi = Math.min(lo + 1, n - 1)
  return sorted[lo] + (h - lo) * (sorted[hi] - sorted[lo])
}

export function scatterQuantiles(frequencies: Float64Array, modes: number, nominalHz: number[]): ScatterQuantiles[] {
  const samples = frequencies.length / modes
  const out: ScatterQuantiles[] = []
  for (let m = 0; m < modes; m++) {
    const column = new Float64Array(samples)
    for (let s = 0; s < samples; s++) column[s] = frequencies[s * modes + m]
    column.sort()
    out.push({ mode: m + 1, nominalHz: nominalHz[m], p05: sampleQuantile(column, 0.05), p50: sampleQuantile(column, 0.5), p95: sampleQuantile(column, 0.95) })
  }
  return out
}
