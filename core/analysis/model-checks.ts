/**
 * Checks that a solved model deserves trust, in words an engineer can act on:
 * - each mode's residual ‖Kφ − λMφ‖ / ‖Kφ‖ (M-normalised φ; ‖Mφ‖ for a rigid mode) and its
 *   M-orthogonality to the others, recomputed in the energy (difference) form;
 * - extreme ratios that make the stiffness or mass matrix ill-conditioned: a spring far
 *   stiffer than the bar, a point mass far heavier than the bar, sections or materials
 *   that differ by many orders of magnitude along the bar.
 * A warning does not stop the analysis; the results stand with the warning beside them.
 */
import { bilinearForm, multiplyBand } from '../linalg/symmetric-band-matrix'
import { materialOf, meanSectionArea } from '../model/geometry'
import { springMotion } from '../model/project'
import { familyName } from '../model/families'
import type { AnalysisWarning, FamilyAnalysis, ModalAnalysis } from './modal-analysis'

export interface ModelWarning {
  readonly code: 'residual' | 'orthogonality' | 'stiff-spring' | 'heavy-mass' | 'stiffness-range' | 'sliver-element' | 'sturm' | 'convergence' | AnalysisWarning['code']
  readonly message: string
}

/** Residuals above this (relative) are reported. */
export const RESIDUAL_LIMIT = 1e-8

function norm(v: Float64Array): number {
  let s = 0
  for (const x of v) s += x * x
  return Math.sqrt(s)
}

/** Relative residual of every mode, as the solver's own check. */
export function modeResiduals(analysis: FamilyAnalysis): number[] {
  const { pencil } = analysis.model
  const n = pencil.stiffness.order
  const kphi = new Float64Array(n)
  const mphi = new Float64Array(n)
  return analysis.vectors.map((phi, i) => {
    const lambda = analysis.modes[i].eigenvalue
    multiplyBand(pencil.stiffness, phi, kphi)
    multiplyBand(pencil.mass, phi, mphi)
    const r = new Float64Array(n)
    for (let j = 0; j < n; j++) r[j] = kphi[j] - lambda * mphi[j]
    return norm(r) / (analysis.modes[i].rigidBody ? norm(mphi) : norm(kphi))
  })
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

/** The solver's own checks of one family: Sturm count, convergence, residuals, orthogonality. */
export function familyWarnings(analysis: FamilyAnalysis): ModelWarning[] {
  const warnings: ModelWarning[] = []
  if (!analysis.sturm.passed) {
    warnings.push({ code: 'sturm', message: 'The Sturm count could not confirm that no mode was missed below the highest one reported. Treat the list of modes as incomplete.' })
  }
  if (!analysis.converged) {
    warnings.push({ code: 'convergence', message: 'The eigen solver did not reach its tolerance for every mode: treat the frequencies as approximate and report the model to the Rodwave developers.' })
  }
  const residuals = modeResiduals(analysis)
  residuals.forEach((r, i) => {
    if (!(r <= RESIDUAL_LIMIT)) {
      warnings.push({
        code: 'residual',
        message: `Mode ${i + 1} satisfies its equation only to a relative residual of ${r.toExponential(1)} (Rodwave expects below ${RESIDUAL_LIMIT}): the model is ill-conditioned; its frequency may be inaccurate.`,
      })
    }
  })
  const { pencil } = analysis.model
  let worstProduct = 0
  let worstPair = [0, 0]
  const count = Math.min(analysis.vectors.length, 60)
  for (let i = 0; i < count; i++) {
    for (let j = 0; j < i; j++) {
      const p = Math.abs(bilinearForm(pencil.mass, analysis.vectors[i], analysis.vectors[j]))
      if (p > worstProduct) {
        worstProduct = p
        worstPair = [j + 1, i + 1]
      }
    }
  }
  if (worstProduct > 1e-6) {
    warnings.push({ code: 'orthogonality', message: `Modes ${worstPair[0]} and ${worstPair[1]} are not mass-orthogonal (φᵀMφ = ${worstProduct.toExponential(1)}): close frequencies or an ill-conditioned model.` })
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
