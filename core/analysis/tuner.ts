/**
 * The tuner: one design parameter within bounds, chosen either to put mode N on a target
 * frequency (a root of f_N(p) − target: bracketed on a grid, then Brent's method), or to
 * make the smallest separation from every excitation band as large as possible (the
 * objective scanned on a grid to bracket its best point, then Brent's minimisation of its
 * negative). Frequencies come from the exact piecewise solver, so the search is free of
 * discretisation error; the caller re-solves the tuned part to show its finite-element table.
 */
import { designFrequencies } from '../exact/family-reference'
import { analysedFamilies } from '../model/families'
import type { Motion, Project } from '../model/project'
import { brentMinimize } from '../optimize/brent-minimize'
import { brentRoot } from '../optimize/brent-root'
import { findParameter, withParameter, type DesignParameter } from './design-parameters'
import { excitationBands, separationFromBand } from './resonance'

export interface TuneRequest {
  /** JSON path of the parameter, e.g. "segments[0].length". */
  readonly parameter: string
  readonly min: number
  readonly max: number
  /** With targetHz: the mode (1-based) to place. */
  readonly mode?: number
  readonly targetHz?: number
  /** Modes considered for the separation objective (default: the project's analysis.modes), per family. */
  readonly modes?: number
  /** The family of `mode` and the families whose separation counts (default: every analysed family; mode N then of the first). */
  readonly motion?: Motion
}

export interface TunePoint {
  readonly value: number
  /** The considered families' frequencies, family after family (see `families`). */
  readonly frequenciesHz: number[]
  /** Smallest |separation| over every elastic mode and band; null without excitations. */
  readonly minSeparation: number | null
}

export interface TuneResult extends TunePoint {
  /** The family of each entry of frequenciesHz, and its mode number within the family. */
  readonly families: { readonly family: string; readonly mode: number }[]
  readonly parameter: string
  readonly label: string
  readonly goal: 'target' | 'separation'
  readonly before: TunePoint
  readonly evaluations: number
}

export class TuneError extends Error {}

/** The search ran and no value in the range puts the mode on the target. */
export class TargetOutOfReachError extends TuneError {}

/** The SI unit of each parameter kind, for messages (parameters are always SI). */
const SI_UNIT: Partial<Record<string, string>> = { length: 'm', sectionDimension: 'm', area: 'm²', modulus: 'Pa', density: 'kg/m³', mass: 'kg', stiffness: 'N/m' }

const GRID = 40

export function tuneParameter(project: Project, request: TuneRequest): TuneResult {
  const parameter = findParameter(project, request.parameter)
  if (!parameter) throw new TuneError(`"${request.parameter}" is not a parameter of this project (see the sensitivity command for the list)`)
  const { min, max } = request
  const boundsProblem = checkBounds(project, parameter, min, max)
  if (boundsProblem) throw new TuneError(boundsProblem)
  const modes = Math.max(request.modes ?? project.analysis.modes, request.mode ?? 1)
  const families = analysedFamilies(project).filter((f) => !request.motion || f.motion === request.motion)
  if (families.length === 0) throw new TuneError(`the project does not analyse ${request.motion ?? 'any motion'}`)
  const bands = excitationBands(project.excitations, project.motions).filter((b) => families.some((f) => b.excites.includes(f.motion)))
  const settings = { ...project.analysis, modes }
  const layout = families.flatMap((f) => Array.from({ length: modes }, (_, i) => ({ family: f.key, motion: f.motion, mode: i + 1 })))
  let evaluations = 0
  const frequencies = (value: number): number[] => {
    evaluations++
    const changed = withParameter(project, parameter.target, value)
    return families.flatMap((f) => {
      const fs = designFrequencies(changed, f, settings, modes)
      return layout.filter((l) => l.family === f.key).map((_, i) => fs[i] ?? NaN)
    })
  }
  const separation = (fs: number[]): number | null => {
    if (bands.length === 0) return null
    let worst = Infinity
    fs.forEach((f, i) => {
      if (f === 0 || !Number.isFinite(f)) return
      for (const band of bands) if (band.excites.includes(layout[i].motion)) worst = Math.min(worst, Math.abs(separationFromBand(f, band.hz)))
    })
    return worst
  }
  const point = (value: number): TunePoint => {
    const fs = frequencies(value)
    return { value, frequenciesHz: fs, minSeparation: separation(fs) }
  }
  const before = point(parameter.value)
  const grid = Array.from({ length: GRID + 1 }, (_, i) => min + ((max - min) * i) / GRID)

  if (request.targetHz !== undefined) {
    const mode = request.mode ?? 1
    const target = request.targetHz
    if (!(target > 0)) throw new TuneError('the target frequency must be > 0')
    // Mode N of the first considered family.
    const offset = (value: number) => frequencies(value)[mode - 1] - target
    const values = grid.map(offset)
    const i = values.findIndex((v, j) => j > 0 && Math.sign(v) !== Math.sign(values[j - 1]))
    if (i < 0) {
      const range = values.map((v) => v + target)
      const unit = SI_UNIT[parameter.quantity] ?? ''
      throw new TargetOutOfReachError(
        `no value of ${parameter.label} between ${min} and ${max} ${unit} puts mode ${mode} on ${target} Hz; over that range it moves between ${Math.min(...range).toPrecision(6)} and ${Math.max(...range).toPrecision(6)} Hz`.replace('  ', ' '),
      )
    }
    const value = brentRoot(offset, grid[i - 1], grid[i], 1e-13)
    return finish(parameter, 'target', point(value), before, evaluations, layout)
  }

  if (bands.length === 0) throw new TuneError('the project has no excitations to separate from; give --mode and --target instead')
  const objective = (value: number) => -(separation(frequencies(value)) ?? 0)
  const scores = grid.map(objective)
  let best = 0
  for (let i = 1; i < scores.length; i++) if (scores[i] < scores[best]) best = i
  const lo = grid[Math.max(best - 1, 0)]
  const hi = grid[Math.min(best + 1, GRID)]
  const refined = brentMinimize(objective, lo, hi, 1e-10)
  const value = refined.fx <= scores[best] ? refined.x : grid[best]
  return finish(parameter, 'separation', point(value), before, evaluations, layout)
}

/**
 * The range a parameter may be searched over. A tube's bore may close to 0 (a solid bar, a valid
 * part) and must stay below the outer diameter, which in turn must stay above the bore; every
 * other parameter (lengths, dimensions, moduli, densities, masses, stiffnesses) must stay > 0,
 * as the file format requires.
 */
function checkBounds(project: Project, parameter: DesignParameter, min: number, max: number): string | null {
  if (!(Number.isFinite(min) && Number.isFinite(max))) return 'the bounds must be finite numbers'
  const target = parameter.target
  const section = target.kind === 'sectionDimension' ? project.segments[target.segment].section : null
  if (section?.shape === 'tube' && target.kind === 'sectionDimension' && target.dimension === 'innerDiameter') {
    if (!(min >= 0 && max > min && max < section.outerDiameter)) {
      return `the bounds of a bore must satisfy 0 ≤ min < max < ${section.outerDiameter} m (its outer diameter; 0 is a solid bar)`
    }
    return null
  }
  if (!(min > 0 && max > min)) return 'the bounds must satisfy 0 < min < max'
  if (section?.shape === 'tube' && target.kind === 'sectionDimension' && target.dimension === 'outerDiameter' && !(min > section.innerDiameter)) {
    return `the outer diameter's lower bound must be above the bore, ${section.innerDiameter} m`
  }
  return null
}

function finish(parameter: DesignParameter, goal: 'target' | 'separation', at: TunePoint, before: TunePoint, evaluations: number, layout: { family: string; mode: number }[]): TuneResult {
  return { parameter: parameter.path, label: parameter.label, goal, ...at, families: layout.map(({ family, mode }) => ({ family, mode })), before, evaluations }
}
