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
import type { Material, Motion, Project, Section, Tolerances } from '../model/project'
import { resolveMaterial, segmentBoundaries } from '../model/geometry'
import { analyseProject, type ModalAnalysis, type ModeResult } from './modal-analysis'
import type { BendingPlane, FamilyKey } from '../model/families'
import { designParameters } from './design-parameters'

export interface ScatterQuantiles {
  /** Numbered within its family, as the modes are. */
  readonly mode: number
  readonly motion: Motion
  readonly plane: BendingPlane | null
  readonly family: FamilyKey
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
  // Version 2: a given shear modulus scatters as a modulus, inertias as masses, rotational springs as springs.
  poissonRatio: 'poissonRatio',
  shearModulus: 'youngsModulus',
  polarInertia: 'mass',
  transverseInertia: 'mass',
  rotationalStiffness: 'stiffness',
}

/** One random draw of the project within its tolerances. */
export function scatterDraw(project: Project, tolerances: Tolerances, random: RandomSource, parameters = designParameters(project)): Project {
  // One factor per parameter, in the parameters' order (drawn even for a zero tolerance, so
  // that streams line up whichever tolerances are set).
  const factors = parameters.map((parameter) => {
    const u = 2 * random() - 1
    const tolerance = tolerances[TOLERANCE_OF[parameter.target.kind]] ?? 0
    return 1 + tolerance * u
  })
  const lengths = project.segments.map((s) => s.length)
  const sections = project.segments.map((s) => ({ ...s.section }) as Record<string, number | string>)
  const materialValues = new Map<string, Partial<Record<'youngsModulus' | 'density' | 'poissonRatio' | 'shearModulus', number>>>()
  const masses = project.masses.map((m) => ({ ...m }))
  const springs = project.springs.map((s) => ({ ...s }))
  let preload = project.preload
  parameters.forEach((parameter, i) => {
    const target = parameter.target
    const value = parameter.value * factors[i]
    switch (target.kind) {
      case 'segmentLength':
        lengths[target.segment] = value
        break
      case 'sectionDimension':
        sections[target.segment][target.dimension] = value
        break
      case 'youngsModulus':
      case 'density':
      case 'poissonRatio':
      case 'shearModulus':
        materialValues.set(target.material, { ...materialValues.get(target.material), [target.kind]: value })
        break
      case 'mass':
      case 'polarInertia':
      case 'transverseInertia':
        masses[target.index][target.kind] = value
        break
      case 'stiffness':
      case 'rotationalStiffness':
        springs[target.index][target.kind] = value
        break
      case 'preload':
        preload = value
        break
    }
  })
  // Attachments keep their fraction of the segment they sit in; later segments move with the
  // change of the ones before (the file format's rule, applied to every length at once).
  const oldBounds = segmentBoundaries(project.segments)
  const newBounds = [0]
  for (const l of lengths) newBounds.push(newBounds[newBounds.length - 1] + l)
  const move = (at: number): number => {
    let s = 0
    while (s + 1 < lengths.length && at > oldBounds[s + 1]) s++
    const fraction = (at - oldBounds[s]) / (oldBounds[s + 1] - oldBounds[s])
    return newBounds[s] + fraction * lengths[s]
  }
  const materials = project.materials.map((m) => (materialValues.has(m.id) ? { ...m, ...materialValues.get(m.id) } : m))
  for (const [id, values] of materialValues) {
    if (!materials.some((m) => m.id === id)) {
      const library = resolveMaterial({ materials: [] }, id) as Material
      materials.push({ ...library, ...values })
    }
  }
  const drawn: Project = {
    ...project,
    materials,
    // Fresh literals of one shape, rather than spreads of the parsed file's objects: a solve per
    // sample then always sees the same object layouts and stays in optimised code.
    segments: project.segments.map((s, i) => ({ length: lengths[i], material: s.material, section: sections[i] as unknown as Section })),
    masses: masses.map((m) => ({ ...m, at: move(m.at) })),
    springs: springs.map((sp) => ({ ...sp, at: move(sp.at) })),
    ...(preload !== undefined ? { preload } : {}),
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
  const parameters = designParameters(project)
  for (let s = 0; s < run.count; s++) {
    const random = seededRandom(sampleSeed(run.seed, run.start + s))
    const drawn = scatterDraw(project, tolerances, random, parameters)
    // Only frequencies are kept: a residual bound of 1e-6 leaves them accurate to ~1e-12.
    const analysis = analyseProject(drawn, overrides, { withReference: false, warmStart: base, tolerance: 1e-6 })
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

/** Quantiles per mode of frequencies laid out as scatterFrequencies does, for the nominal analysis's modes (all families, in order). */
export function scatterQuantiles(frequencies: Float64Array, nominal: readonly Pick<ModeResult, 'mode' | 'motion' | 'plane' | 'family' | 'frequencyHz'>[]): ScatterQuantiles[] {
  const modes = nominal.length
  const samples = frequencies.length / modes
  const out: ScatterQuantiles[] = []
  for (let m = 0; m < modes; m++) {
    const column = new Float64Array(samples)
    for (let s = 0; s < samples; s++) column[s] = frequencies[s * modes + m]
    column.sort()
    const { mode, motion, plane, family, frequencyHz } = nominal[m]
    out.push({ mode, motion, plane, family, nominalHz: frequencyHz, p05: sampleQuantile(column, 0.05), p50: sampleQuantile(column, 0.5), p95: sampleQuantile(column, 0.95) })
  }
  return out
}
