/**
 * Checks that a solved model deserves trust, in words an engineer can act on:
 * - each mode's normwise backward error η = ‖Kφ − λMφ‖ / ((‖K‖ + |λ|‖M‖)‖φ‖) (∞-norms): the
 *   smallest relative change of K and M for which (λ, φ) is an exact eigenpair (Higham &
 *   Higham, "Structured backward error and condition of generalized eigenvalue problems",
 *   SIAM J. Matrix Anal. Appl. 20 (1998), from memory), and the modes' M-orthogonality;
 * - extreme ratios that make the stiffness or mass matrix ill-conditioned: a spring far
 *   stiffer than the bar, a point mass far heavier than the bar, sections or materials
 *   that differ by many orders of magnitude along the bar.
 * A warning does not stop the analysis; the results stand with the warning beside them.
 */
import { bandInfinityNorm, type SymmetricBandMatrix } from '../linalg/symmetric-band-matrix'
import { materialOf, meanSectionArea, snappedAttachments } from '../model/geometry'
import { springMotion } from '../model/project'
import { familyName } from '../model/families'
import type { AnalysisWarning, FamilyAnalysis, ModalAnalysis } from './modal-analysis'

export interface ModelWarning {
  readonly code: 'residual' | 'orthogonality' | 'stiff-spring' | 'heavy-mass' | 'stiffness-range' | 'sliver-element' | 'attachment-moved' | 'sturm' | 'convergence' | AnalysisWarning['code']
  readonly message: string
}

/** Safety factor over the round-off estimate; LAPACK's test programs accept such ratios below 30 (LAPACK Users' Guide, installation and testing, from memory). */
const ROUND_OFF_FACTOR = 30

/** |φᵢᵀMφⱼ| above this, for mass-normalised modes, is reported. */
export const ORTHOGONALITY_LIMIT = 1e-6

/** Pairs of modes checked for orthogonality: the first this many modes. */
const ORTHOGONALITY_MODES = 60

/**
 * The backward error that round-off alone can leave, for a pencil of order n and half-bandwidth b.
 * Each entry of r = Kφ − λMφ (difference form) is a sum of at most 2b + 3 rounded terms, so even
 * an exact pair shows η up to about (2b + 3)ε; the Rayleigh quotient that gives λ is an n-term
 * sum, adding up to about nε; a backward-stable banded solve adds a small multiple of ε per row
 * (N. J. Higham, Accuracy and Stability of Numerical Algorithms, §3.1 and §3.5, from memory).
 * Hence η ≲ (n + 2b + 3)ε, times a safety factor of 30: a mode above it was not solved to
 * working accuracy. (In practice round-off grows like √n, well inside the bound.)
 */
export function backwardErrorLimit(order: number, halfBandwidth: number): number {
  return ROUND_OFF_FACTOR * (order + 2 * halfBandwidth + 3) * Number.EPSILON
}

export interface ModeChecks {
  /** η of every mode (∞-norms; ‖K‖, ‖M‖ bounded within a factor 2, see bandInfinityNorm). */
  readonly backwardErrors: number[]
  /** backwardErrorLimit for this model. */
  readonly limit: number
  /** Largest |φᵢᵀMφⱼ|, i ≠ j, over the first 60 modes, and its pair (1-based; null when every product is 0). */
  readonly worstProduct: number
  readonly worstPair: readonly [number, number] | null
}

/** Unknowns per block of the checks' sweep: the block's Mφ of the checked modes (60 × 8 KB) stays in cache. */
const BLOCK = 1024

/**
 * Backward errors and M-orthogonality in one sweep over the unknowns, block by block: per block,
 * Kφ and Mφ of every mode row by row (difference form, as multiplyBand), then the products
 * φⱼᵀ(Mφᵢ), j < i, four at a time. Each vector is read from memory about once, and the scratch
 * (one block of Mφ per checked mode, one more for the rest) is allocated once.
 */
export function modeChecks(analysis: FamilyAnalysis): ModeChecks {
  const { stiffness, mass } = analysis.model.pencil
  const n = stiffness.order
  const vectors = analysis.vectors
  const modes = vectors.length
  const checked = Math.min(modes, ORTHOGONALITY_MODES)
  const lambdas = analysis.modes.map((m) => m.eigenvalue)
  const residual = new Float64Array(modes)
  const largest = new Float64Array(modes)
  const products = new Float64Array(checked * checked)
  // Slot i < checked keeps mode i's Mφ for the products; the modes beyond share the last slot.
  const massBlock = new Float64Array((checked + 1) * BLOCK)
  const tridiagonal = stiffness.halfBandwidth === 1 && mass.halfBandwidth === 1
  for (let start = 0; start < n; start += BLOCK) {
    const end = Math.min(n, start + BLOCK)
    for (let i = 0; i < modes; i++) {
      const slot = Math.min(i, checked) * BLOCK
      const out = massBlock.subarray(slot, slot + (end - start))
      const block = tridiagonal
        ? tridiagonalRows(stiffness, mass, vectors[i], lambdas[i], start, end, out)
        : bandRows(stiffness, mass, vectors[i], lambdas[i], start, end, out)
      if (block.residual > residual[i]) residual[i] = block.residual
      if (block.largest > largest[i]) largest[i] = block.largest
    }
    for (let i = 1; i < checked; i++) accumulateProducts(vectors, i, massBlock.subarray(i * BLOCK, i * BLOCK + (end - start)), start, products, checked)
  }
  const kNorm = bandInfinityNorm(stiffness)
  const mNorm = bandInfinityNorm(mass)
  const backwardErrors = lambdas.map((lambda, i) => {
    const scale = (kNorm + Math.abs(lambda) * mNorm) * largest[i]
    return scale > 0 ? residual[i] / scale : residual[i] === 0 ? 0 : Infinity
  })
  let worstProduct = 0
  let worstPair: [number, number] | null = null
  for (let i = 1; i < checked; i++) {
    for (let j = 0; j < i; j++) {
      // A NaN product (a broken vector) counts as the worst possible.
      const p = Math.abs(products[i * checked + j])
      const size = Number.isNaN(p) ? Infinity : p
      if (size > worstProduct) {
        worstProduct = size
        worstPair = [j + 1, i + 1]
      }
    }
  }
  return { backwardErrors, limit: backwardErrorLimit(n, stiffness.halfBandwidth), worstProduct, worstPair }
}

/** products[i·count + j] += φⱼᵀy over [start, start + y.length) for every j < i, four modes per pass over y. */
function accumulateProducts(vectors: Float64Array[], i: number, y: Float64Array, start: number, products: Float64Array, count: number): void {
  const length = y.length
  let j = 0
  for (; j + 4 <= i; j += 4) {
    const a = vectors[j]
    const b = vectors[j + 1]
    const c = vectors[j + 2]
    const d = vectors[j + 3]
    let sa = 0
    let sb = 0
    let sc = 0
    let sd = 0
    for (let q = 0; q < length; q++) {
      const yq = y[q]
      const k = start + q
      sa += a[k] * yq
      sb += b[k] * yq
      sc += c[k] * yq
      sd += d[k] * yq
    }
    products[i * count + j] += sa
    products[i * count + j + 1] += sb
    products[i * count + j + 2] += sc
    products[i * count + j + 3] += sd
  }
  for (; j < i; j++) {
    const a = vectors[j]
    let s = 0
    for (let q = 0; q < length; q++) s += a[start + q] * y[q]
    products[i * count + j] += s
  }
}

interface BlockResult {
  /** max |(Kφ − λMφ)_q| over the block. */
  readonly residual: number
  /** max |φ_q| over the block. */
  readonly largest: number
}

/** Rows [start, end) of Kφ and Mφ for tridiagonal K and M, in multiplyBand's difference form; Mφ into out. */
function tridiagonalRows(k: SymmetricBandMatrix, m: SymmetricBandMatrix, phi: Float64Array, lambda: number, start: number, end: number, out: Float64Array): BlockResult {
  const n = phi.length
  const kr = k.rowSums
  const mr = m.rowSums
  const ko = k.offDiagonals[0]
  const mo = m.offDiagonals[0]
  let residual = 0
  let largest = 0
  // A[q−1][q]·(φ_q − φ_{q−1}) of K and M, carried from one row to the next.
  let kLeft = start > 0 ? ko[start - 1] * (phi[start] - phi[start - 1]) : 0
  let mLeft = start > 0 ? mo[start - 1] * (phi[start] - phi[start - 1]) : 0
  const last = Math.min(end, n - 1)
  for (let q = start; q < last; q++) {
    const x = phi[q]
    const right = phi[q + 1] - x
    const kRight = ko[q] * right
    const mRight = mo[q] * right
    const my = mr[q] * x - mLeft + mRight
    const r = Math.abs(kr[q] * x - kLeft + kRight - lambda * my)
    out[q - start] = my
    kLeft = kRight
    mLeft = mRight
    if (r > residual) residual = r
    const size = Math.abs(x)
    if (size > largest) largest = size
  }
  if (end === n) {
    const x = phi[n - 1]
    const my = mr[n - 1] * x - mLeft
    out[n - 1 - start] = my
    residual = Math.max(residual, Math.abs(kr[n - 1] * x - kLeft - lambda * my))
    largest = Math.max(largest, Math.abs(x))
  }
  return { residual, largest }
}

/** The same for any half-bandwidth. */
function bandRows(k: SymmetricBandMatrix, m: SymmetricBandMatrix, phi: Float64Array, lambda: number, start: number, end: number, out: Float64Array): BlockResult {
  const n = phi.length
  const b = k.halfBandwidth
  let residual = 0
  let largest = 0
  for (let q = start; q < end; q++) {
    const x = phi[q]
    let ky = k.rowSums[q] * x
    let my = m.rowSums[q] * x
    for (let d = 1; d <= b; d++) {
      const kBand = k.offDiagonals[d - 1]
      const mBand = m.offDiagonals[d - 1]
      if (q - d >= 0) {
        const left = x - phi[q - d]
        ky -= kBand[q - d] * left
        my -= mBand[q - d] * left
      }
      if (q + d < n) {
        const right = phi[q + d] - x
        ky += kBand[q] * right
        my += mBand[q] * right
      }
    }
    out[q - start] = my
    const r = Math.abs(ky - lambda * my)
    if (r > residual) residual = r
    const size = Math.abs(x)
    if (size > largest) largest = size
  }
  return { residual, largest }
}

/** Every warning of an analysis: each family's solver checks, the part's conditioning, and the analysis's own warnings. */
export function modelWarnings(analysis: ModalAnalysis): ModelWarning[] {
  const warnings: ModelWarning[] = []
  const several = analysis.families.length > 1
  for (const family of analysis.families) {
    const prefix = several ? `${capitalise(familyName(family.family))}: ` : ''
    for (const w of familyWarnings(family)) warnings.push({ code: w.code, message: prefix + w.message })
  }
  if (analysis.families[0]) warnings.push(...partWarnings(analysis.families[0]))
  warnings.push(...analysis.warnings)
  return warnings
}

function capitalise(text: string): string {
  return text.charAt(0).toUpperCase() + text.slice(1)
}

/** The solver's own checks of one family: Sturm count, convergence, backward errors, orthogonality. */
export function familyWarnings(analysis: FamilyAnalysis): ModelWarning[] {
  const warnings: ModelWarning[] = []
  if (!analysis.sturm.passed) {
    warnings.push({ code: 'sturm', message: 'The Sturm count could not confirm that no mode was missed below the highest one reported. Treat the list of modes as incomplete.' })
  }
  if (!analysis.converged) {
    warnings.push({ code: 'convergence', message: 'The eigen solver did not reach its tolerance for every mode: treat the frequencies as approximate and report the model to the Rodwave developers.' })
  }
  const checks = modeChecks(analysis)
  checks.backwardErrors.forEach((eta, i) => {
    if (!(eta <= checks.limit)) {
      warnings.push({
        code: 'residual',
        message: `Mode ${i + 1} satisfies K φ = ω² M φ only to a backward error of ${eta.toExponential(1)}, above the ${checks.limit.toExponential(1)} that round-off explains for ${analysis.model.pencil.stiffness.order} unknowns: the solver did not reach working accuracy, so its frequency may be inaccurate.`,
      })
    }
  })
  if (checks.worstPair && checks.worstProduct > ORTHOGONALITY_LIMIT) {
    const [a, b] = checks.worstPair
    warnings.push({ code: 'orthogonality', message: `Modes ${a} and ${b} are not mass-orthogonal (φᵀMφ = ${checks.worstProduct.toExponential(1)}): close frequencies or an ill-conditioned model.` })
  }
  return warnings
}

/** Extreme ratios in the part itself: springs, masses, sections and elements. */
function partWarnings(analysis: FamilyAnalysis): ModelWarning[] {
  const warnings: ModelWarning[] = []
  const { project } = analysis
  // Scale of the bar: its axial stiffness end to end (segments in series) and its own mass.
  let softest = Infinity
  let stiffest = 0
  let barMass = 0
  let flexibility = 0
  for (const s of project.segments) {
    const material = materialOf(project, s)
    const k = (material.youngsModulus * meanSectionArea(s.section)) / s.length
    softest = Math.min(softest, k)
    stiffest = Math.max(stiffest, k)
    flexibility += 1 / k
    barMass += material.density * meanSectionArea(s.section) * s.length
  }
  const barStiffness = 1 / flexibility
  project.springs.forEach((spring, i) => {
    if (springMotion(spring) !== 'axial') return
    const ratio = spring.stiffness / barStiffness
    if (ratio > 1e9) {
      warnings.push({
        code: 'stiff-spring',
        message: `Spring ${i + 1}${spring.label ? ` (“${spring.label}”)` : ''} is ${ratio.toExponential(1)} times stiffer than the bar. Model that support as a fixed end (or split the bar there) instead: so stiff a spring makes the equations ill-conditioned.`,
      })
    }
  })
  project.masses.forEach((mass, i) => {
    const ratio = mass.mass / barMass
    if (ratio > 1e7) {
      warnings.push({
        code: 'heavy-mass',
        message: `Point mass ${i + 1}${mass.label ? ` (“${mass.label}”)` : ''} is ${ratio.toExponential(1)} times the bar's mass: the bar's own modes are then ill-conditioned; check whether that end is better modelled as fixed.`,
      })
    }
  })
  for (const move of snappedAttachments(project)) {
    const item = move.list === 'masses' ? project.masses[move.index] : project.springs[move.index]
    const name = `${move.list === 'masses' ? 'Point mass' : 'Spring'} ${move.index + 1}${item.label ? ` (“${item.label}”)` : ''}`
    const onto = move.onto === 'end' ? 'the end' : move.onto === 'joint' ? 'the segment joint' : 'another attachment'
    warnings.push({
      code: 'attachment-moved',
      message: `${name} at ${+move.from.toPrecision(10)} m is analysed at ${+move.to.toPrecision(10)} m, ${onto} ${Math.abs(move.to - move.from).toExponential(1)} m away: attachments closer than 1/100,000 of the part's length to an end, a joint or another attachment are taken there, as an element that short would spoil the solution.`,
    })
  }
  let shortest = Infinity
  let longest = 0
  const { x, order, elementCount } = analysis.model.mesh
  for (let e = 0; e < elementCount; e++) {
    const length = x[order * (e + 1)] - x[order * e]
    shortest = Math.min(shortest, length)
    longest = Math.max(longest, length)
  }
  if (shortest < 1e-6 * longest) {
    warnings.push({
      code: 'sliver-element',
      message: `The shortest element is ${shortest.toExponential(2)} m, ${(shortest / longest).toExponential(1)} of the longest: two attachments, or an attachment and a segment end, lie almost on top of each other. Put them at the same position or move them apart.`,
    })
  }
  if (stiffest / softest > 1e8) {
    warnings.push({ code: 'stiffness-range', message: `The segments' axial stiffnesses EA/L span ${(stiffest / softest).toExponential(1)}: check the sections and materials for a unit slip.` })
  }
  return warnings
}
