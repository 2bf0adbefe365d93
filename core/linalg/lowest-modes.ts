/**
 * Lowest eigenpairs of a symmetric banded pencil (K, M), K positive semi-definite,
 * M positive definite, never forming a dense matrix.
 *
 * Method (multilevel Rayleigh quotient iteration with Sturm safeguards):
 * 1. Galerkin-coarsen the chain by 4 until it is small (galerkin-coarsening.ts);
 *    on the smallest level, find each mode by spectrum slicing (bisection on
 *    Sturm counts) followed by safeguarded Rayleigh quotient iteration.
 * 2. On each finer level, interpolate the coarse modes (cubic) and refine each one by
 *    Rayleigh quotient iteration (cubically convergent; B. N. Parlett, The Symmetric
 *    Eigenvalue Problem, ch. 4, from memory). Each step costs one banded LDLᵀ and one
 *    solve (inverse-iteration.ts), so a level costs O(n·k); on fine meshes one step
 *    per mode meets the tolerance.
 * 3. Check every level with Sturm counts (shifted-ldlt.ts) at the midpoints between
 *    consecutive eigenvalues and just above the last: the count below each midpoint
 *    must be its index. Any mode that fails (missed, duplicated, not converged) is
 *    found again by bisection on counts plus safeguarded Rayleigh quotient iteration.
 * A free–free chain (all stiffness row sums zero) has one rigid-body mode, λ = 0 with a
 * constant shape; it is set exactly and the elastic modes are kept M-orthogonal to it.
 * A beam (two unknowns per node, `layout`) is coarsened by Hermite interpolation instead
 * (beam-coarsening.ts), and its rigid-body motions are given by the layout. Its fine levels
 * start each mode at the coarse value, accept it after one step when the Kato–Temple bound
 * allows (or, below the level's top mode, when the start's remaining error is estimated far
 * below the tolerance: refineMode), and project onto all the level's modes with the strain-form
 * K (refineClusters);
 * modes that no longer change with the mesh keep the coarse level's values (settledPrefix), and so
 * does a level whose round-off lifts its quotients above the coarse values, their Galerkin upper
 * bounds, by more than the mesh could still gain (overshootsCoarse).
 */
import { seededRandom, type RandomSource } from '../random'
import { coarseningMap, coarsenPencil, interpolateSmooth } from './galerkin-coarsening'
import { beamCoarsening, coarsenBeamMass, coarsenBeamPencil, prolongateBeam, prolongateBeamAll, rigidMotionVectors, type BeamLayout } from './beam-coarsening'
import { assembleFromForms, beamFormsGram, coarsenBeamForms } from './beam-energy'
import {
  blockEnergies,
  borrowBlockWork,
  returnBlockWork,
  blockInverseIterationStep,
  inverseIterationStepInPlace,
  type BlockWork,
} from './inverse-iteration'
import {
  allocateFactorization,
  eigenvalueScale,
  factorShifted,
  pencilNorms,
  stiffnessForm,
  sturmCounts,
  type BandPencil,
  type ShiftedFactorization,
} from './shifted-ldlt'
import { bilinearForm, multiplyBand, quadraticForm } from './symmetric-band-matrix'
import { smallGeneralizedEigen } from './small-symmetric-eigen'

export interface LowestModesOptions {
  /** Number of modes wanted, rigid-body modes included. */
  readonly modes: number
  /** Seed of the random start vectors used when a mode has to be searched from scratch. */
  readonly seed?: number
  /** Relative residual bound at which a Rayleigh quotient iteration stops (default 1e-11). */
  readonly tolerance?: number
  /**
   * Modes of a nearby problem of the same size (a previous solve of a slightly changed part):
   * they start the iterations directly, skipping the coarse levels. The Sturm check still
   * decides what is accepted, so a poor start costs time, never correctness.
   */
  readonly warmStart?: { readonly vectors: readonly Float64Array[]; readonly rigidBodyModes: number }
  /** A beam's unknowns (deflection and scaled rotation per node); absent for a chain of one unknown per node. */
  readonly layout?: BeamLayout
}

export interface SturmCheck {
  /** Shifts between consecutive eigenvalues, then one just above the last. */
  readonly shifts: number[]
  /** Number of eigenvalues below each shift, from the inertia of K − σM. */
  readonly counts: number[]
  /** What the counts must be if no mode was missed: 1, 2, … (rigid-body modes included). */
  readonly expected: number[]
  readonly passed: boolean
  /**
   * Set when the counts were taken on a coarser level of a beam's hierarchy, because the finer
   * levels no longer changed the frequencies (see SETTLED): the unknowns of the level counted.
   */
  readonly countedUnknowns?: number
}

export interface LowestModes {
  /** λ = ω², ascending; rigid-body modes (λ = 0) first. */
  readonly eigenvalues: Float64Array
  /** Mode shapes, M-normalised (φᵀ M φ = 1), largest component positive. */
  readonly vectors: Float64Array[]
  readonly rigidBodyModes: number
  readonly sturm: SturmCheck
  /** Every mode's iteration met its tolerance and the values rise with the index. */
  readonly converged: boolean
  readonly statistics: { levels: number; factorizations: number; repairedModes: number; settledLevels: number }
}

interface Context {
  /** M-norm² and largest entry of vectors fresh from an iteration, so normalising takes one sweep. */
  readonly vectorInfo: WeakMap<Float64Array, { massNorm2: number; largest: number }>
  factorizations: number
  repairedModes: number
  levels: number
  settledLevels: number
  /**
   * Set when a mode was kept from a coarser level only because the finer one could not count it,
   * with a predicted change above the tolerance: the result then says it did not converge. (Kept
   * apart from each level's own flag, which decides whether the next level may build on it.)
   */
  uncountedChange: boolean
  readonly random: RandomSource
  readonly tolerance: number
}

interface LevelResult {
  /** Elastic eigenvalues and vectors, ascending. */
  readonly values: number[]
  readonly vectors: Float64Array[]
  /** An upper estimate of the next elastic eigenvalue, when known. */
  readonly nextEstimate: number | null
  readonly rigidBodyModes: number
  readonly rigidVectors: Float64Array[]
  readonly sturm: SturmCheck
  readonly converged: boolean
  /** Beam levels: the elastic values of the level below and the coarsening ratio to it (for settled levels). */
  readonly previousValues?: number[]
  readonly ratio?: number
}

/** Work storage of one level. */
interface Level {
  readonly pencil: BandPencil
  readonly order: number
  readonly context: Context
  /** M-orthonormal vectors every iterate is kept orthogonal to (rigid-body modes, settled modes), and M times each. */
  readonly locked: Float64Array[]
  /** How many of them are rigid-body modes (λ = 0). */
  readonly rigidCount: number
  readonly lockedM: Float64Array[]
  scratch: Float64Array
  block: BlockWork
  factorization: ShiftedFactorization | null
}

/** Bracket of the index-th eigenvalue (1-based, rigid modes counted): count(lower) < index ≤ count(upper). */
interface Bracket {
  lower: number
  upper: number
  readonly index: number
}

interface RefinedMode {
  value: number
  converged: boolean
  vector: Float64Array
  /** Accepted after one step on the strength of the Ritz step that follows (refineMode, verifyAndRepair). */
  awaitsRitz?: boolean
}

/**
 * A beam level is settled when refining it further would move every frequency by less than this
 * (relative): its eigenvalues then match the finer level's to well within what the finer level's
 * own round-off (growing like its κ ∝ h⁻⁴) would allow, so the finer level keeps the coarse modes,
 * interpolated, with its own Rayleigh quotients.
 */
const SETTLED = 1e-13

/** The coarse level of a beam: Galerkin mass, and the stiffness from the coarsened strain forms where the level has them. */
function coarsenBeamLevel(pencil: BandPencil, map: ReturnType<typeof beamCoarsening>): BandPencil {
  if (!pencil.beamForms) return coarsenBeamPencil(pencil, map)
  const beamForms = coarsenBeamForms(pencil.beamForms, map)
  return { stiffness: assembleFromForms(beamForms, map.coarseOrder), mass: coarsenBeamMass(pencil.mass, map), beamForms }
}

/**
 * How many of the lowest modes have settled on the coarse level. Hermite elements converge as
 * h⁴ (e(h) = Ch⁴), so from the change δ between the two coarser levels the change to this one is
 * δ(1 − r⁻⁴)/(r′⁴ − 1), r and r′ the coarsening ratios. A mode has settled when that change is
 * below SETTLED, or below what this level's round-off would cost it: refining a beam's mode of
 * eigenvalue λ on a level whose largest is λ_max leaves it about 1e-8·(ε λ_max/λ)² off (fitted to
 * uniform beams from 160 to 10 000 elements; the energy-form Rayleigh quotients keep it that
 * small), and a mode within the count's own noise (100 ε λ_max) cannot be refined at all.
 */
function settledPrefix(pencil: BandPencil, coarse: LevelResult, elastic: number, ratio: number, context: Context): number {
  const previous = coarse.previousValues
  const previousRatio = coarse.ratio
  if (!previous || !previousRatio || !coarse.sturm.passed || pencil.beamForms?.shearFlexible) return 0
  const largest = eigenvalueScale(pencil)
  let k = 0
  while (k < Math.min(elastic, coarse.values.length) && previous[k] !== undefined) {
    const value = coarse.values[k]
    const change = predictedChange(coarse, k, ratio)
    const noise = (Number.EPSILON * largest) / Math.abs(value)
    const roundOff = 1e-8 * noise * noise
    const countable = value > 2 * COUNT_NOISE * Number.EPSILON * largest
    // A coarse level that did not converge passes on only the modes this level cannot count at all:
    // refining those here, with still more round-off, would lose them (the result still reports
    // that the coarse level did not converge).
    const settled = coarse.converged && Math.abs(change) <= Math.max(SETTLED, roundOff) * Math.abs(value)
    if (!settled && countable) break
    // Kept whatever its predicted change, as this level cannot count it; but only a negligible
    // change counts as converged (near buckling λ₁ can lie far below the count's noise).
    if (!(Math.abs(change) <= Math.max(SETTLED, roundOff, context.tolerance) * Math.abs(value))) context.uncountedChange = true
    k++
  }
  return k
}

/** The change of coarse mode k from the coarse level to this one, from the h⁴ law (see settledPrefix); NaN without two coarser levels. */
function predictedChange(coarse: LevelResult, k: number, ratio: number): number {
  const previous = coarse.previousValues
  if (!previous || !coarse.ratio || previous[k] === undefined) return NaN
  return ((previous[k] - coarse.values[k]) * (1 - ratio ** -4)) / (coarse.ratio ** 4 - 1)
}

/**
 * Relative amount by which a refined beam level's eigenvalue may exceed the coarse level's before
 * the excess is taken for round-off: the coarse pencil is PᵀKP, PᵀMP, so in exact arithmetic no
 * eigenvalue of this level lies above the coarse one, and the energy-form quotients on both are
 * accurate to about 1e-15.
 */
const GALERKIN_OVERSHOOT = 1e-12

/**
 * Whether a refined beam level did worse than the coarse level it was refined from: some of its
 * values exceed the coarse ones (their Galerkin upper bounds) by more than GALERKIN_OVERSHOOT, the
 * round-off of its iterates (a point inertia on a fine mesh, whose row of M dwarfs the others, can
 * leave 1e-9), while the h⁴ law says refining moves every mode by less than that excess. The coarse
 * level's modes are then the better answer for this mesh, as for a settled level.
 */
function overshootsCoarse(values: readonly number[], from: number, coarse: LevelResult, elastic: number, ratio: number): boolean {
  if (!coarse.converged || !coarse.sturm.passed) return false
  let excess = 0
  for (let j = 0; j < values.length && from + j < coarse.values.length; j++) {
    excess = Math.max(excess, (values[j] - coarse.values[from + j]) / Math.abs(coarse.values[from + j]))
  }
  if (!(excess > GALERKIN_OVERSHOOT)) return false
  // A margin of 16: the coarse values must be clearly the better answer, not just about as good.
  for (let k = 0; k < elastic; k++) {
    const change = predictedChange(coarse, k, ratio)
    if (!(16 * Math.abs(change) <= excess * Math.abs(coarse.values[k]))) return false
  }
  return true
}

/** Sturm counts below COUNT_NOISE·ε·λ_max are decided by round-off in K's factorisation. */
const COUNT_NOISE = 100

/** A shift between the last settled mode and the first one to refine, above the counts' noise; null when there is none. */
function floorShift(pencil: BandPencil, lastSettled: number, nextCoarse: number | undefined): number | null {
  if (nextCoarse === undefined) return null
  const shift = Math.max(0.5 * (lastSettled + nextCoarse), COUNT_NOISE * Number.EPSILON * eigenvalueScale(pencil))
  return shift < 0.9 * nextCoarse && shift > lastSettled ? shift : null
}

/**
 * The first `count` coarse modes interpolated to this level, M-normalised, with the coarse level's
 * values: the Galerkin coarse pencil is (PᵀKP, PᵀMP), so the quotient of P v on this level is the
 * coarse quotient of v exactly, and evaluating it here would only add round-off (the vector's own
 * rounding, ε·|w| per node, costs the energy about ε²·N⁴ relative, 1e-8 at 10⁶ elements).
 */
function settledModes(level: Level, map: ReturnType<typeof beamCoarsening>, coarse: LevelResult, count: number): { values: number[]; vectors: Float64Array[] } {
  const { pencil } = level
  const values: number[] = []
  const vectors: Float64Array[] = []
  const interpolated = prolongateBeamAll(map, coarse.vectors.slice(0, count))
  for (let j = 0; j < count; j++) {
    const v = interpolated[j]
    values.push(coarse.values[j])
    normaliseAndOrient(pencil, v)
    vectors.push(v)
  }
  return { values, vectors }
}

/**
 * A settled level: the coarse modes interpolated (P keeps them M-orthonormal, the Galerkin
 * coarse pencil being PᵀKP, PᵀMP) with their Rayleigh quotients on this level. No factorisation of
 * this level's K is needed, or trusted: its Sturm counts would rest on pivots that round-off
 * decides. The check reported is the coarser level's, which says so.
 */
function settledLevel(level: Level, map: ReturnType<typeof beamCoarsening>, coarse: LevelResult, elastic: number, ratio: number): LevelResult {
  level.context.settledLevels++
  const { values, vectors } = settledModes(level, map, coarse, elastic)
  const sturm = { ...coarse.sturm, countedUnknowns: coarse.sturm.countedUnknowns ?? map.coarseOrder }
  return {
    values,
    vectors,
    nextEstimate: coarse.values[elastic] ?? coarse.nextEstimate,
    rigidBodyModes: level.rigidCount,
    rigidVectors: level.locked.slice(0, level.rigidCount),
    sturm,
    converged: coarse.converged,
    previousValues: coarse.values,
    ratio,
  }
}

/** Relative change of a Rayleigh quotient between two steps below which it has converged (energy-form pencils). */
const STALLED_QUOTIENT = 1e-13


/** Modes refined together in one pair of sweeps on tridiagonal levels. */
const BLOCK_WIDTH = 4

/**
 * Coarsening ratio of a level: 4 normally; 16 when even the coarse level is large enough to be
 * coarsened again, where cubic interpolation over 16 fine intervals still starts each mode well
 * enough for one step, and skipping a level saves its sweeps.
 */
function coarseningRatio(n: number, modes: number): number {
  return n >= 16 * 16 * minimumCoarseOrder(modes + 1) ? 16 : 4
}

/**
 * Coarsening ratio of a beam level: 4, or 16 when the level 16 times coarser would be the last one
 * (below 4 × minimumCoarseOrder, so solved by slicing) and still has room for the modes (at least
 * 3 × minimumCoarseOrder): the level in between, whose sweeps cost a quarter of this one's, is then
 * skipped. The last level has no coarser one, so no mode settles on it (settledPrefix) and the
 * settling of the finer levels keeps its ratio-4 steps.
 */
function beamCoarseningRatio(n: number, modes: number): number {
  const minimum = minimumCoarseOrder(modes + 1)
  return n >= 16 * 3 * minimum && n < 16 * 4 * minimum ? 16 : 4
}

/** Lowest modes of (K, M); see the file comment for the method. */
export function lowestModes(pencil: BandPencil, options: LowestModesOptions): LowestModes {
  const n = pencil.stiffness.order
  if (pencil.mass.order !== n || pencil.mass.halfBandwidth !== pencil.stiffness.halfBandwidth) {
    throw new RangeError('stiffness and mass must have the same order and bandwidth')
  }
  if (!Number.isInteger(options.modes) || options.modes < 1) throw new RangeError('modes must be a positive integer')
  const context: Context = {
    vectorInfo: new WeakMap(),
    factorizations: 0,
    repairedModes: 0,
    levels: 0,
    settledLevels: 0,
    uncountedChange: false,
    random: seededRandom(options.seed ?? 20261201),
    tolerance: options.tolerance ?? 1e-11,
  }
  const warm = options.warmStart
  const usable = warm && warm.vectors.length > warm.rigidBodyModes && warm.vectors.every((v) => v.length === n) ? warm : undefined
  const result = solveLevel(pencil, Math.min(options.modes, n), context, usable, options.layout)
  const eigenvalues = new Float64Array(result.rigidBodyModes + result.values.length)
  const vectors: Float64Array[] = [...result.rigidVectors]
  for (let i = 0; i < result.values.length; i++) {
    eigenvalues[result.rigidBodyModes + i] = result.values[i]
    vectors.push(result.vectors[i])
  }
  // Elastic modes were normalised on their level; the rigid-body mode is set normalised.
  return {
    eigenvalues,
    vectors,
    rigidBodyModes: result.rigidBodyModes,
    sturm: result.sturm,
    converged: result.converged && !context.uncountedChange,
    statistics: { levels: context.levels, factorizations: context.factorizations, repairedModes: context.repairedModes, settledLevels: context.settledLevels },
  }
}

/**
 * Sturm check of a claimed set of lowest eigenvalues: the counts at the midpoints
 * and at a shift just above the last must be 1, 2, …, m. The shift above the last
 * starts at `aboveLast` (or 1.5 × the last value) and is moved down towards the last
 * value while more than m eigenvalues lie below it. Exposed so that any result can be audited.
 */
export function checkLowestEigenvalues(pencil: BandPencil, eigenvalues: ArrayLike<number>, aboveLast?: number): SturmCheck {
  const values = Array.from(eigenvalues).sort((a, b) => a - b)
  const m = values.length
  const shifts: number[] = []
  const expected: number[] = []
  let zeros = 0
  // Rigid-body modes (λ = 0) have nothing below them; the first elastic midpoint counts them.
  while (zeros < m && values[zeros] === 0) zeros++
  for (let j = Math.max(zeros, 1); j < m; j++) {
    shifts.push(0.5 * (values[j - 1] + values[j]))
    expected.push(j)
  }
  if (m === 0) return { shifts, counts: [], expected, passed: true }
  const last = values[m - 1]
  const norms = pencilNorms(pencil)
  let top = aboveLast !== undefined && aboveLast > last ? aboveLast : last > 0 ? 1.5 * last : 1e-3 * (norms.stiffness / norms.mass)
  shifts.push(top)
  expected.push(m)
  const counts = sturmCounts(pencil, shifts)
  for (let i = 0; i < 40 && counts[counts.length - 1] > m; i++) {
    const previous = top
    top = last + 0.125 * (top - last)
    if (!(top > last) || top === previous) break
    shifts[shifts.length - 1] = top
    counts[counts.length - 1] = sturmCounts(pencil, [top])[0]
  }
  return { shifts, counts, expected, passed: counts.every((c, j) => c === expected[j]) }
}

function minimumCoarseOrder(modes: number): number {
  return Math.max(6 * modes, 32)
}

function hasRigidBodyMode(pencil: BandPencil): boolean {
  const r = pencil.stiffness.rowSums
  for (let i = 0; i < r.length; i++) if (r[i] !== 0) return false
  return true
}

function createLevel(pencil: BandPencil, context: Context, rigidVectors: Float64Array[]): Level {
  const n = pencil.stiffness.order
  const locked = [...rigidVectors]
  return {
    pencil,
    order: n,
    context,
    locked,
    rigidCount: rigidVectors.length,
    lockedM: locked.map((v) => multiplyBand(pencil.mass, v, new Float64Array(n))),
    scratch: new Float64Array(pencil.stiffness.halfBandwidth === 1 ? 0 : n),
    block: borrowBlockWork(pencil.stiffness.halfBandwidth === 1 ? n : 0),
    factorization: null,
  }
}

function factorizationOf(level: Level): ShiftedFactorization {
  if (!level.factorization) level.factorization = allocateFactorization(level.order, level.pencil.stiffness.halfBandwidth)
  return level.factorization
}

/** M-orthonormal rigid-body vectors of a level: the constant of a free chain, or a beam's free rigid motions. */
function rigidBodyVectors(pencil: BandPencil, layout: BeamLayout | undefined): Float64Array[] {
  const n = pencil.stiffness.order
  if (!layout) {
    if (!hasRigidBodyMode(pencil)) return []
    // M·1 = row sums of M, so 1ᵀM1 is their sum.
    let totalMass = 0
    for (const r of pencil.mass.rowSums) totalMass += r
    return [new Float64Array(n).fill(1 / Math.sqrt(totalMass))]
  }
  // Gram–Schmidt in the M inner product.
  const out: Float64Array[] = []
  for (const v of rigidMotionVectors(layout)) {
    for (const u of out) {
      const c = bilinearForm(pencil.mass, u, v)
      for (let i = 0; i < n; i++) v[i] -= c * u[i]
    }
    const norm = Math.sqrt(quadraticForm(pencil.mass, v))
    for (let i = 0; i < n; i++) v[i] /= norm
    out.push(v)
  }
  return out
}

function solveLevel(pencil: BandPencil, modes: number, context: Context, warm?: LowestModesOptions['warmStart'], layout?: BeamLayout): LevelResult {
  context.levels++
  const n = pencil.stiffness.order
  const rigidVectors = rigidBodyVectors(pencil, layout)
  const rigidBodyModes = rigidVectors.length
  const total = Math.min(modes, n)
  const elastic = total - rigidBodyModes
  if (elastic <= 0) {
    const sturm = checkLowestEigenvalues(pencil, new Array<number>(rigidBodyModes).fill(0))
    return { values: [], vectors: [], nextEstimate: null, rigidBodyModes, rigidVectors, sturm, converged: true }
  }
  const level = createLevel(pencil, context, rigidVectors)
  let found: RefinedMode[]
  let nextEstimate: number | null = null
  // Beam levels refined from a coarser one: its values and the ratio, for the next level's settling test.
  let previousValues: number[] | undefined
  let levelRatio: number | undefined
  // A beam level refined from a coarser one: that level and the map, in case this one does worse (overshootsCoarse).
  let beamCoarse: { map: ReturnType<typeof beamCoarsening>; coarse: LevelResult; ratio: number } | null = null
  // Beam levels whose lowest modes settled on the coarser level: those modes, and the counted floor above them.
  let settledAbove: { modes: { values: number[]; vectors: Float64Array[] }; floor: { shift: number; count: number }; converged: boolean } | null = null
  if (warm) {
    const guesses = warm.vectors.slice(warm.rigidBodyModes)
    const count = Math.min(elastic, guesses.length)
    // One allocation for all the copies: small models are warm-started thousands of times.
    const storage = new Float64Array(count * n)
    found = refineStarts(level, count, (j) => {
      const start = storage.subarray(j * n, (j + 1) * n)
      start.set(guesses[j])
      return start
    })
  } else if (layout && n >= 4 * minimumCoarseOrder(total + 1)) {
    // Beams coarsen by 4 (by 16 onto the last level, beamCoarseningRatio): a fine level that can no
    // longer count its lowest modes keeps them from the level below (settledPrefix), whose
    // discretisation error must be small.
    const ratio = beamCoarseningRatio(n, total)
    const map = beamCoarsening(layout, ratio)
    const coarsePencil = coarsenBeamLevel(pencil, map)
    const coarse = solveLevel(coarsePencil, total + 1, context, undefined, map.coarse)
    const settledCount = pencil.beamForms ? settledPrefix(pencil, coarse, elastic, ratio, context) : 0
    if (settledCount === elastic) {
      returnBlockWork(0, level.block)
      return settledLevel(level, map, coarse, elastic, ratio)
    }
    if (settledCount > 0) {
      // The settled modes are kept as found (interpolated, with this level's quotients) and locked,
      // so that the others are refined orthogonal to them and counted above them.
      const keptOnly = settledModes(level, map, coarse, settledCount)
      const shift = floorShift(pencil, keptOnly.values[settledCount - 1], coarse.values[settledCount])
      const below = rigidBodyModes + settledCount
      if (shift !== null && sturmCounts(pencil, [shift])[0] === below) {
        for (const v of keptOnly.vectors) {
          level.locked.push(v)
          level.lockedM.push(multiplyBand(pencil.mass, v, new Float64Array(n)))
        }
        settledAbove = { modes: keptOnly, floor: { shift, count: below }, converged: coarse.converged }
      }
    }
    const skip = settledAbove ? settledCount : 0
    const refined = Math.min(elastic, coarse.vectors.length) - skip
    found = refineStarts(level, refined, (j) => prolongateBeam(map, coarse.vectors[skip + j], new Float64Array(n)), coarseStarts(coarse.values, skip, refined))
    nextEstimate = coarse.values.length > elastic ? coarse.values[elastic] : null
    previousValues = coarse.values
    levelRatio = ratio
    if (pencil.beamForms && !pencil.beamForms.shearFlexible) beamCoarse = { map, coarse, ratio }
  } else if (n >= 4 * minimumCoarseOrder(total + 1)) {
    const map = coarseningMap(n, coarseningRatio(n, total))
    const coarse = solveLevel(coarsenPencil(pencil, map), total + 1, context)
    found = refineStarts(level, Math.min(elastic, coarse.vectors.length), (j) => interpolateSmooth(map, coarse.vectors[j], new Float64Array(n)))
    nextEstimate = coarse.values.length > elastic ? coarse.values[elastic] : null
  } else {
    found = []
    const slicer = new SpectrumSlicer(level, rigidBodyModes)
    for (let j = 1; j <= elastic; j++) {
      // Isolated and within 25 %: the bracket keeps the iteration on its mode, and a narrower one
      // costs more bisection counts than the Rayleigh quotient steps it saves.
      const bracket = slicer.isolate(rigidBodyModes + j, 0.25)
      const start = 0.5 * (bracket.lower + bracket.upper)
      found.push(refineMode(level, randomVector(n, context.random), start, bracket, nearbyVectors(found, start)))
    }
    if (total < n) nextEstimate = slicer.isolate(total + 1, 1).upper
  }
  found.sort((a, b) => a.value - b.value)
  const kept = settledAbove ? settledAbove.modes.values.length : 0
  // Checked before the repairs too, which on such a level would spend their bisections in vain.
  if (beamCoarse && overshootsCoarse(found.map((m) => m.value), kept, beamCoarse.coarse, elastic, beamCoarse.ratio)) {
    returnBlockWork(0, level.block)
    return settledLevel(level, beamCoarse.map, beamCoarse.coarse, elastic, beamCoarse.ratio)
  }
  const checked = settledAbove
    ? verifyAndRepair(level, found, rigidBodyModes + kept, elastic - kept, nextEstimate, settledAbove.floor)
    : verifyAndRepair(level, found, rigidBodyModes, elastic, nextEstimate)
  returnBlockWork(pencil.stiffness.halfBandwidth === 1 ? n : 0, level.block)
  // Unit mass norm on every level, so that starts interpolated from it stay far from overflow.
  for (const v of checked.vectors) normaliseAndOrient(pencil, v, context.vectorInfo.get(v))
  const values = settledAbove ? [...settledAbove.modes.values, ...checked.values] : checked.values
  const vectors = settledAbove ? [...settledAbove.modes.vectors, ...checked.vectors] : checked.vectors
  if (beamCoarse && overshootsCoarse(values, 0, beamCoarse.coarse, elastic, beamCoarse.ratio)) return settledLevel(level, beamCoarse.map, beamCoarse.coarse, elastic, beamCoarse.ratio)
  if (settledAbove) context.settledLevels++
  const converged = checked.converged && (!settledAbove || settledAbove.converged)
  return { ...checked, values, vectors, converged, nextEstimate, rigidBodyModes, rigidVectors, ...(previousValues ? { previousValues, ratio: levelRatio } : {}) }
}

/**
 * Refinement of start vectors (interpolated coarse modes, or a previous solution's modes).
 * On tridiagonal levels without a rigid mode, modes go through the block sweeps four at a
 * time: their Rayleigh quotients in one sweep, then inverse-iteration steps with each mode at
 * its own quotient (up to three passes). A mode the passes do not settle continues alone.
 */
function refineStarts(level: Level, count: number, makeStart: (index: number) => Float64Array, coarse?: CoarseStarts): RefinedMode[] {
  const { pencil, context } = level
  const found: RefinedMode[] = []
  const blockable = pencil.stiffness.halfBandwidth === 1 && level.locked.length === 0
  for (let first = 0; first < count; first += BLOCK_WIDTH) {
    const starts = Array.from({ length: Math.min(BLOCK_WIDTH, count - first) }, (_, b) => makeStart(first + b))
    const shifts = coarse ? starts.map((_, b) => coarse.values[first + b]) : blockEnergies(pencil, starts).map((e) => e.xKx / e.xMx)
    if (!blockable) {
      // A mode may lean on the Ritz step only with a found mode above it (see refineMode).
      starts.forEach((x, b) => found.push(refineMode(level, x, shifts[b], null, nearbyVectors(found, shifts[b]), true, coarse?.separations[first + b] ?? 0, first + b < count - 1)))
      continue
    }
    const results: (RefinedMode | null)[] = starts.map(() => null)
    let active = starts.map((_, b) => b)
    for (let pass = 0; pass < 3 && active.length > 0; pass++) {
      const steps = blockInverseIterationStep(
        pencil,
        active.map((b) => shifts[b]),
        active.map((b) => starts[b]),
        level.block,
      )
      context.factorizations += active.length
      const still: number[] = []
      steps.forEach((step, i) => {
        const b = active[i]
        const bound = Math.sqrt(step.xMx / step.yMy)
        if (bound <= context.tolerance * Math.abs(shifts[b]) && Number.isFinite(step.rayleigh)) {
          context.vectorInfo.set(starts[b], { massNorm2: step.yMy, largest: step.largest })
          results[b] = { value: step.rayleigh, converged: true, vector: starts[b] }
        } else {
          shifts[b] = step.rayleigh
          // Inverse iteration can grow a vector by 1e25 a step on small-valued pencils: keep it finite.
          if (!(step.yMy < 1e100 && step.yMy > 1e-100) && step.yMy > 0 && Number.isFinite(step.yMy)) scaleVector(starts[b], 1 / Math.sqrt(step.yMy))
          still.push(b)
        }
      })
      active = still
    }
    results.forEach((r, b) => found.push(r ?? refineMode(level, starts[b], shifts[b], null, nearbyVectors(found, shifts[b]), true)))
  }
  return found
}

/**
 * Starts interpolated from a beam's Galerkin coarse level: their quotients on this level are the
 * coarse values (the coarse pencil is PᵀKP, PᵀMP), and each value's distance to its neighbours
 * bounds, with a margin, how far the mode is from the others here (for Kato–Temple, refineMode).
 */
interface CoarseStarts {
  readonly values: readonly number[]
  readonly separations: readonly number[]
}

/**
 * Half the distance from coarse value j to the nearest other one (0 below the first: K is
 * positive semi-definite), for values[from … from + count − 1]; 0 where the next value is unknown.
 * Coarse values bound this level's from above and lie close to them, so half the coarse gap is a
 * safe lower bound of the gap here.
 */
function coarseStarts(values: readonly number[], from: number, count: number): CoarseStarts {
  const starts: number[] = []
  const separations: number[] = []
  for (let j = from; j < from + count; j++) {
    const below = j > 0 ? values[j - 1] : 0
    const above = values[j + 1]
    starts.push(values[j])
    separations.push(above === undefined ? 0 : 0.5 * Math.min(values[j] - below, above - values[j]))
  }
  return { values: starts, separations }
}

/** Already-found modes whose eigenvalues lie within 1 % of λ: kept orthogonal to avoid converging twice to one mode. */
function nearbyVectors(found: RefinedMode[], lambda: number): Float64Array[] {
  return found.filter((f) => Math.abs(f.value - lambda) <= 1e-2 * Math.abs(lambda)).map((f) => f.vector)
}

function scaleVector(v: Float64Array, s: number): void {
  for (let i = 0; i < v.length; i++) v[i] *= s
}

function randomVector(n: number, random: RandomSource): Float64Array {
  const x = new Float64Array(n)
  for (let i = 0; i < n; i++) x[i] = random() - 0.5
  return x
}

function dot(a: Float64Array, b: Float64Array): number {
  let s = 0
  for (let i = 0; i < a.length; i++) s += a[i] * b[i]
  return s
}

/** y ← y − Σ (vᵢᵀ M y)/(vᵢᵀ M vᵢ) vᵢ; massVectors[i] = M vᵢ, computed on first use when missing. */
function orthogonalise(level: Level, y: Float64Array, vectors: Float64Array[], massVectors: Float64Array[]): void {
  for (let i = 0; i < vectors.length; i++) {
    const v = vectors[i]
    if (!massVectors[i]) massVectors[i] = multiplyBand(level.pencil.mass, v, new Float64Array(level.order))
    const mv = massVectors[i]
    const c = dot(mv, y) / dot(mv, v)
    for (let j = 0; j < y.length; j++) y[j] -= c * v[j]
  }
}

function splitBracket(lower: number, upper: number): number {
  if (lower > 0 && upper > 4 * lower) return Math.sqrt(lower * upper)
  return 0.5 * (lower + upper)
}

/**
 * Safeguarded Rayleigh quotient iteration, in place: x ← (K − σM)⁻¹ M x, σ ← ρ(x).
 * ‖x‖_M / ‖y‖_M bounds |λ − σ| for some eigenvalue λ: it is exactly the M⁻¹-norm residual
 * of y/‖y‖_M at σ. With a bracket, every factorisation's Sturm count also tightens it, and a
 * quotient that leaves it is replaced by bisection. Iterates are not normalised (only
 * ratios matter). `near` are found modes (and the level's locked ones) kept M-orthogonal.
 * `startIsQuotient`: the start value is x's own Rayleigh quotient (not a bracket's midpoint).
 */
function refineMode(
  level: Level,
  x: Float64Array,
  startValue: number,
  bracket: Bracket | null,
  near: Float64Array[],
  startIsQuotient = false,
  separation = 0,
  foundAbove = false,
): RefinedMode {
  const { pencil, context } = level
  const tol = context.tolerance
  const keep = [...level.locked, ...near]
  const keepM = [...level.lockedM]
  if (keep.length && level.scratch.length === 0) level.scratch = new Float64Array(level.order)
  if (keep.length) orthogonalise(level, x, keep, keepM)
  let sigma = startValue
  let value = startValue
  let converged = false
  let previousBound = Infinity
  // The start's own Rayleigh quotient counts as the first of the quotients compared below.
  let previousRho = startIsQuotient ? startValue : NaN
  let massNorm2 = NaN
  let largest = NaN
  const quotients: number[] = []
  const maxIterations = bracket ? 80 : 10
  // A beam's quotient comes from its energy form, accurate where the bracket's Sturm counts (from
  // the assembled K) are blurred by about COUNT_NOISE·ε·λ_max: the bracket is trusted to that.
  const slack = pencil.beamForms ? COUNT_NOISE * Number.EPSILON * eigenvalueScale(pencil) : 0
  for (let iteration = 0; iteration < maxIterations; iteration++) {
    const step = inverseIterationStepInPlace(pencil, sigma, x, level.scratch, factorizationOf(level), level.block)
    context.factorizations++
    let shiftIsAbove = false
    if (bracket) {
      if (step.negativePivots >= bracket.index) {
        bracket.upper = Math.min(bracket.upper, sigma)
        shiftIsAbove = true
      } else bracket.lower = Math.max(bracket.lower, sigma)
    }
    // Kato–Temple: when no other eigenvalue lies within `separation` of the step's quotient ρₛ, the
    // eigenvalue nearest it is within r²/separation, r² = xᵀMx/yᵀMy − (ρₛ − σ)² the squared M⁻¹-norm
    // residual of y at ρₛ (as (K − σM)y = Mx; T. Kato, J. Phys. Soc. Japan 4 (1949), from memory).
    // Then ρₛ is the value, and orthogonalising y to locked modes can only lower its error.
    // On fine meshes that residual is often the factorisation's round-off (about ε‖K‖ along this
    // mode), which further steps do not remove; they only confirm the quotient. A heuristic then
    // takes the mode after its first step from a Galerkin start (σ its quotient): the start's error
    // in the modes above it, Σ e_j²(λ_j − λ) ≈ σ − ρₛ, shrinks in the step by δ/(λ_j − σ),
    // δ² = xᵀMx/yᵀMy, so (σ − ρₛ)δ²/separation² estimates what is left of it; that must lie two
    // orders below STALLED_QUOTIENT. The round-off's share of the neighbours is left to the Ritz
    // step over all modes found (refineClusters, run on beams by verifyAndRepair, which goes on with
    // the mode if that step cannot be made), so only a mode with a found mode above it qualifies.
    // Checked by measurement, not proved: 27 beams against the two-step acceptance agree to 1e-14
    // up to 2,000 elements and to 1e-11 at 20,000.
    if (!bracket && separation > 0 && pencil.beamForms && step.yMy > 0 && Number.isFinite(step.rayleigh)) {
      const residual2 = step.xMx / step.yMy - (step.rayleigh - sigma) ** 2
      const settled = residual2 <= STALLED_QUOTIENT * Math.abs(step.rayleigh) * separation
      const beyond = (Math.abs(sigma - step.rayleigh) * (step.xMx / step.yMy)) / (separation * separation)
      const awaitsRitz = !settled && foundAbove && iteration === 0 && startIsQuotient && beyond <= 0.01 * STALLED_QUOTIENT * Math.abs(step.rayleigh)
      if (settled || awaitsRitz) {
        if (keep.length) orthogonalise(level, x, keep, keepM)
        if (awaitsRitz) return { value: step.rayleigh, converged: true, vector: x, awaitsRitz }
        value = step.rayleigh
        converged = true
        largest = NaN
        break
      }
    }
    let rho = step.rayleigh
    massNorm2 = step.yMy
    largest = step.largest
    if (keep.length) {
      orthogonalise(level, x, keep, keepM)
      massNorm2 = quadraticForm(pencil.mass, x)
      rho = stiffnessForm(pencil, x) / massNorm2
      largest = NaN
    }
    if (!(massNorm2 > 0 && Number.isFinite(massNorm2) && Number.isFinite(rho))) break
    const bound = Math.sqrt(step.xMx / massNorm2)
    value = rho
    if (massNorm2 > 1e200 || massNorm2 < 1e-200) {
      const s = 1 / Math.sqrt(massNorm2)
      for (let i = 0; i < x.length; i++) x[i] *= s
      massNorm2 = 1
      largest *= s
    }
    // Is the eigenvalue within the bound of σ the one we look for? With a bracket it must be.
    const identified = !bracket || (shiftIsAbove ? sigma - bound >= bracket.lower - slack : sigma + bound <= bracket.upper + slack)
    const scale = Math.abs(sigma) + pencilNorms(pencil).stiffness * 1e-300
    // With an energy form the bound rests on the assembled K, which round-off blurs by about ε‖K‖:
    // only the quotient's own settling (below) says a beam's mode has converged.
    if (identified && !pencil.beamForms && bound <= tol * scale) {
      converged = true
      break
    }
    // Round-off floor: the bound stopped shrinking at a level already far below any use.
    if (identified && !pencil.beamForms && iteration >= 2 && bound > 0.1 * previousBound && bound <= 1e-9 * scale) {
      converged = true
      break
    }
    // With an energy form the quotient is accurate where the bound, which rests on the assembled
    // K, stalls at its round-off (about ε‖K‖): a quotient that no longer moves has converged.
    const inBracket = !bracket || (rho > bracket.lower - slack && rho < bracket.upper + slack)
    if (identified && inBracket && pencil.beamForms && Math.abs(rho - previousRho) <= STALLED_QUOTIENT * Math.abs(rho)) {
      converged = true
      break
    }
    // Round-off can also hold a beam's iteration in a cycle: the same few quotients over and over,
    // each repeated to a few ε (a converging iteration never repeats itself). The cycle's spread is
    // then the accuracy this level allows; its least quotient, the one least lifted by round-off, is kept.
    quotients.push(rho)
    if (identified && inBracket && pencil.beamForms) {
      const least = quotientCycleMinimum(quotients)
      if (least !== null) {
        value = least
        converged = true
        break
      }
    }
    previousRho = rho
    previousBound = bound
    if (!inBracket) sigma = splitBracket(bracket!.lower, bracket!.upper)
    else sigma = rho
  }
  if (Number.isFinite(largest) && Number.isFinite(massNorm2)) context.vectorInfo.set(x, { massNorm2, largest })
  return { value, converged, vector: x }
}

/** Spread (relative) above which a repeating cycle of quotients is not accepted as converged. */
const CYCLE_SPREAD = 1e-9

/**
 * The least quotient of a cycle the last quotients have entered: for a period p of 2 to 4, the
 * last 2p quotients repeat with that period to 8ε, and spread by at most CYCLE_SPREAD. Null if none.
 */
function quotientCycleMinimum(quotients: readonly number[]): number | null {
  const n = quotients.length
  for (let period = 2; period <= 4; period++) {
    if (n < 2 * period) break
    let repeats = true
    let least = Infinity
    let most = -Infinity
    for (let j = n - period; j < n; j++) {
      const q = quotients[j]
      if (!(Math.abs(q - quotients[j - period]) <= 8 * Number.EPSILON * Math.abs(q))) repeats = false
      least = Math.min(least, q)
      most = Math.max(most, q)
    }
    if (repeats && most - least <= CYCLE_SPREAD * Math.abs(most)) return least
  }
  return null
}

/** Bisection on Sturm counts with every sample kept, so brackets are shared between modes. */
class SpectrumSlicer {
  private readonly shifts: number[] = [0]
  private readonly counts: number[]

  constructor(
    private readonly level: Level,
    rigidBodyModes: number,
  ) {
    // K is positive semi-definite: nothing lies below 0; rigid modes sit at 0 itself.
    this.counts = [rigidBodyModes]
  }

  count(shift: number): number {
    // A beam's count needs no stored factorisation (sturmCounts runs the count-only sweep there).
    const { pencil } = this.level
    const count = pencil.stiffness.halfBandwidth === 3 ? sturmCounts(pencil, [shift])[0] : factorShifted(pencil, shift, factorizationOf(this.level)).negativePivots
    this.level.context.factorizations++
    let i = 0
    while (i < this.shifts.length && this.shifts[i] < shift) i++
    this.shifts.splice(i, 0, shift)
    this.counts.splice(i, 0, count)
    return count
  }

  /** Tightest bracket of the index-th eigenvalue among the samples taken so far. */
  private bracket(index: number): Bracket {
    let lower = 0
    let upper = Infinity
    for (let i = 0; i < this.shifts.length; i++) {
      if (this.counts[i] < index) lower = Math.max(lower, this.shifts[i])
      else upper = Math.min(upper, this.shifts[i])
    }
    return { lower, upper, index }
  }

  private countAt(shift: number): number {
    const i = this.shifts.indexOf(shift)
    return i >= 0 ? this.counts[i] : this.count(shift)
  }

  /** Narrows until the bracket holds only the index-th eigenvalue and is relatively narrow. */
  isolate(index: number, relativeWidth: number): Bracket {
    let b = this.bracket(index)
    if (!Number.isFinite(b.upper)) {
      const norms = pencilNorms(this.level.pencil)
      let shift = Math.max(b.lower * 2, norms.stiffness / norms.mass)
      for (let i = 0; i < 2100 && this.count(shift) < index; i++) shift *= 2
      b = this.bracket(index)
      if (!Number.isFinite(b.upper)) throw new RangeError(`no upper bound found for eigenvalue ${index}`)
    }
    for (let i = 0; i < 200; i++) {
      const isolated = this.countAt(b.lower) === index - 1 && this.countAt(b.upper) === index
      if (isolated && b.upper - b.lower <= relativeWidth * b.upper) return b
      const mid = splitBracket(b.lower, b.upper)
      if (mid <= b.lower || mid >= b.upper) return b
      this.count(mid)
      b = this.bracket(index)
    }
    return b
  }
}

/**
 * Sturm check of one level's modes (sorted), and a fresh search for every index the
 * check cannot vouch for. Returns the elastic modes sorted, with the final check.
 */
function verifyAndRepair(
  level: Level,
  modes: RefinedMode[],
  rigidBodyModes: number,
  elastic: number,
  nextEstimate: number | null,
  floor: { readonly shift: number; readonly count: number } = { shift: 0, count: rigidBodyModes },
): { values: number[]; vectors: Float64Array[]; sturm: SturmCheck; converged: boolean } {
  const { pencil, context } = level
  const target = rigidBodyModes + elastic
  const m = modes.length
  const values = modes.map((f) => f.value)
  // Interval boundaries: 0 (or, above settled modes, a shift counted below the first found one),
  // midpoints between found values, and a point above the last.
  const bounds: number[] = [floor.shift]
  for (let i = 0; i + 1 < m; i++) bounds.push(0.5 * (values[i] + values[i + 1]))
  let top = 0
  if (m > 0) {
    const last = values[m - 1]
    top = nextEstimate !== null && nextEstimate > last ? 0.5 * (last + nextEstimate) : last * 1.5
    bounds.push(top)
  }
  const counts = [floor.count, ...sturmCounts(pencil, bounds.slice(1))]
  // Pull the top shift down towards the last value until nothing extra lies below it.
  for (let i = 0; i < 40 && m > 0 && counts[m] > target; i++) {
    top = values[m - 1] + 0.125 * (top - values[m - 1])
    if (!(top > values[m - 1])) break
    bounds[m] = top
    counts[m] = sturmCounts(pencil, [top])[0]
  }
  const accepted = new Map<number, RefinedMode>()
  const redo: { index: number; start: Float64Array | null }[] = []
  for (let i = 1; i <= m; i++) {
    const first = Math.max(counts[i - 1] + 1, rigidBodyModes + 1)
    const last = Math.min(counts[i], target)
    const onlyOne = counts[i] - counts[i - 1] === 1
    // The value must lie clearly inside its interval: two iterations that converged to the
    // same eigenvalue put a midpoint on top of it, and then the interval proves nothing.
    const margin = 1e-9 * Math.abs(values[i - 1])
    const inside = values[i - 1] - bounds[i - 1] > margin && bounds[i] - values[i - 1] > margin
    for (let index = first; index <= last; index++) {
      if (onlyOne && inside && modes[i - 1].converged) accepted.set(index, modes[i - 1])
      else redo.push({ index, start: index === first ? modes[i - 1].vector : null })
    }
  }
  // Indices above the top shift (modes lost as duplicates): search above it.
  const highest = m > 0 ? counts[m] : rigidBodyModes
  for (let index = Math.max(highest + 1, rigidBodyModes + 1); index <= target; index++) redo.push({ index, start: null })
  if (redo.length > 0) {
    const slicer = new SpectrumSlicer(level, level.rigidCount)
    for (let i = floor.shift > 0 ? 0 : 1; i < bounds.length; i++) slicer.count(bounds[i])
    for (const job of redo) {
      context.repairedModes++
      const bracket = slicer.isolate(job.index, 0.02)
      const x = job.start ? job.start.slice() : randomVector(level.order, context.random)
      const start = 0.5 * (bracket.lower + bracket.upper)
      const near = [...accepted.values()].filter((f) => Math.abs(f.value - start) <= 1e-2 * start).map((f) => f.vector)
      accepted.set(job.index, refineMode(level, x, start, bracket, near))
    }
  }
  const indices = [...accepted.keys()].sort((a, b) => a - b)
  const finalValues = indices.map((i) => accepted.get(i)!.value)
  const finalVectors = indices.map((i) => accepted.get(i)!.vector)
  const ordered = finalValues.every((v, j) => j === 0 || v > finalValues[j - 1])
  if (!refineClusters(level, finalValues, finalVectors)) {
    // Modes taken after one step on the strength of the Ritz step (refineMode) go on alone without it.
    indices.forEach((index, j) => {
      const mode = accepted.get(index)!
      if (!mode.awaitsRitz) return
      const near = finalVectors.filter((_, k) => k !== j && Math.abs(finalValues[k] - mode.value) <= 1e-2 * Math.abs(mode.value))
      const again = refineMode(level, mode.vector, mode.value, null, near, true)
      finalValues[j] = again.value
      if (!again.converged) mode.converged = false
    })
  }
  const converged = ordered && indices.every((i) => accepted.get(i)!.converged)
  // The counts already taken still vouch for the modes when nothing was redone and the Ritz values
  // stayed strictly inside the intervals counted.
  const reusable = redo.length === 0 && m === elastic && finalValues.every((v, i) => v > bounds[i] && v < bounds[i + 1])
  const sturm = reusable
    ? sturmCheckFromCounts(bounds, counts, rigidBodyModes, floor.shift > 0)
    : floor.shift > 0
      ? checkAboveFloor(pencil, floor.shift, rigidBodyModes, finalValues, top)
      : checkLowestEigenvalues(pencil, [...new Array<number>(rigidBodyModes).fill(0), ...finalValues], top)
  return { values: finalValues, vectors: finalVectors, sturm, converged }
}

/** Consecutive eigenvalues closer than this (relative) are refined together. */
const CLUSTER_GAP = 1e-4

/**
 * Rayleigh–Ritz within each cluster of close eigenvalues. Inverse iteration pins down the
 * cluster's invariant subspace far better than its individual vectors (their angle errors
 * grow as 1/gap); the small projected problem separates them again, with residuals at round-off.
 * Returns whether a beam level's modes were projected together (false for one mode, for a
 * projection that failed, and for pencils without strain forms, whose modes never wait for it).
 */
function refineClusters(level: Level, values: number[], vectors: Float64Array[]): boolean {
  const { pencil, context } = level
  // A beam's factorisations carry round-off of about ε‖K‖, which leaves each iterate a little of
  // its neighbours (the quotient a little high); the projection onto all the modes found, with the
  // energy form's accurate K, removes that: one cluster of every mode.
  const whole = !!pencil.beamForms
  let projected = whole && values.length > 1
  let first = 0
  while (first < values.length) {
    let last = first
    while (last + 1 < values.length && (whole || values[last + 1] - values[last] <= CLUSTER_GAP * Math.abs(values[last + 1]))) last++
    if (last > first) {
      const members = vectors.slice(first, last + 1)
      const stiffnessGram = pencil.beamForms ? beamFormsGram(pencil.beamForms, members) : members.map((u) => members.map((v) => stiffnessForm(pencil, u, v)))
      let ritz: ReturnType<typeof smallGeneralizedEigen>
      try {
        ritz = smallGeneralizedEigen(stiffnessGram, symmetricMassGram(level, members))
      } catch {
        // Dependent vectors (the same mode found twice) cannot be separated by projection;
        // the Sturm check that follows judges them.
        projected = false
        first = last + 1
        continue
      }
      const largest = combineInPlace(members, ritz.vectors)
      // The Ritz vectors are unit in the mass Gram (xᵀ G x = 1), so M-normalised up to its round-off.
      members.forEach((v, j) => {
        values[first + j] = ritz.values[j]
        context.vectorInfo.set(v, { massNorm2: 1, largest: largest[j] })
      })
    }
    first = last + 1
  }
  return projected
}

/** G_ij = v_iᵀ M v_j, each pair once (G is symmetric by construction). */
function symmetricMassGram(level: Level, vectors: readonly Float64Array[]): number[][] {
  const m = vectors.length
  const gram = Array.from({ length: m }, () => new Array<number>(m).fill(0))
  const product = level.scratch.length === level.order ? level.scratch : new Float64Array(level.order)
  for (let j = 0; j < m; j++) {
    multiplyBand(level.pencil.mass, vectors[j], product)
    for (let i = 0; i <= j; i++) {
      const g = dot(vectors[i], product)
      gram[i][j] = g
      gram[j][i] = g
    }
  }
  return gram
}

/** Rows per block of combineInPlace: the block's old values of ten vectors (20 KB) stay in the L1 cache. */
const COMBINE_BLOCK = 256
let combineScratch = new Float64Array(0)

/**
 * vectors[j] ← Σ_c coefficients[j][c] · vectors[c] for all j at once, block of rows by block of
 * rows: the block's old values are copied aside, then each new vector's block is summed from
 * them three sources per sweep, so no vector is allocated and the inner loops are plain
 * multiply-adds over cached rows. Returns each new vector's entry largest in magnitude, with its sign.
 */
function combineInPlace(vectors: Float64Array[], coefficients: readonly ArrayLike<number>[]): Float64Array {
  const m = vectors.length
  const n = vectors[0].length
  if (combineScratch.length < m * COMBINE_BLOCK) combineScratch = new Float64Array(m * COMBINE_BLOCK)
  const old = combineScratch
  const largest = new Float64Array(m)
  for (let start = 0; start < n; start += COMBINE_BLOCK) {
    const length = Math.min(COMBINE_BLOCK, n - start)
    for (let c = 0; c < m; c++) {
      const v = vectors[c]
      const at = c * COMBINE_BLOCK
      for (let i = 0; i < length; i++) old[at + i] = v[start + i]
    }
    for (let j = 0; j < m; j++) {
      const row = coefficients[j]
      const out = vectors[j]
      // The first sweep writes (one, two or three sources), the later ones add three at a time.
      const first = Math.min(3, m)
      const a = row[0], b = first > 1 ? row[1] : 0, d = first > 2 ? row[2] : 0 // prettier-ignore
      const o1 = first > 1 ? COMBINE_BLOCK : 0, o2 = first > 2 ? 2 * COMBINE_BLOCK : 0 // prettier-ignore
      for (let i = 0; i < length; i++) out[start + i] = a * old[i] + b * old[o1 + i] + d * old[o2 + i]
      let c = first
      for (; c + 2 < m; c += 3) {
        const p = row[c], q = row[c + 1], r = row[c + 2] // prettier-ignore
        const o = c * COMBINE_BLOCK
        for (let i = 0; i < length; i++) out[start + i] += p * old[o + i] + q * old[o + COMBINE_BLOCK + i] + r * old[o + 2 * COMBINE_BLOCK + i]
      }
      for (; c < m; c++) {
        const p = row[c]
        const o = c * COMBINE_BLOCK
        for (let i = 0; i < length; i++) out[start + i] += p * old[o + i]
      }
      let big = largest[j]
      for (let i = 0; i < length; i++) if (Math.abs(out[start + i]) > Math.abs(big)) big = out[start + i]
      largest[j] = big
    }
  }
  return largest
}

/**
 * The Sturm check of modes found above settled ones: the count at the floor shift must be the
 * number of modes below it (rigid and settled), then one more at each midpoint and above the last.
 */
function checkAboveFloor(pencil: BandPencil, floorShift: number, below: number, values: number[], top: number): SturmCheck {
  const shifts = [floorShift]
  for (let i = 0; i + 1 < values.length; i++) shifts.push(0.5 * (values[i] + values[i + 1]))
  if (values.length) shifts.push(top > values[values.length - 1] ? top : 1.5 * values[values.length - 1])
  const expected = shifts.map((_, i) => below + i)
  const counts = sturmCounts(pencil, shifts)
  return { shifts, counts, expected, passed: counts.every((c, i) => c === expected[i]) }
}

/**
 * The check already made on the accepted modes: counts at the midpoints and the top shift, and at
 * the floor shift when modes below it were settled (`withFloor`; bounds[0] = 0 otherwise, not counted).
 */
function sturmCheckFromCounts(bounds: number[], counts: number[], below: number, withFloor: boolean): SturmCheck {
  const first = withFloor ? 0 : 1
  const shifts = bounds.slice(first)
  const measured = counts.slice(first)
  const expected = shifts.map((_, i) => below + i + (withFloor ? 0 : 1))
  return { shifts, counts: measured, expected, passed: measured.every((c, i) => c === expected[i]) }
}

/** Scales to φᵀMφ = 1 and makes the largest component positive, so shapes are repeatable. */
function normaliseAndOrient(pencil: BandPencil, v: Float64Array, known?: { massNorm2: number; largest: number }): void {
  if (known) {
    const s = (known.largest < 0 ? -1 : 1) / Math.sqrt(known.massNorm2)
    if (s !== 1) for (let i = 0; i < v.length; i++) v[i] *= s
    return
  }
  const s = 1 / Math.sqrt(quadraticForm(pencil.mass, v))
  let big = 0
  for (let i = 0; i < v.length; i++) {
    const x = v[i] * s
    v[i] = x
    if (Math.abs(x) > Math.abs(big)) big = x
  }
  if (big < 0) for (let i = 0; i < v.length; i++) v[i] = -v[i]
}
