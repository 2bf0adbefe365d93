/**
 * Sensitivities of every family's frequencies to the design parameters. Axial motion uses the
 * exact mode shapes (sensitivity.ts). Torsion and bending use the finite-element modes with
 * Rayleigh's principle: λ = φᵀKφ / φᵀMφ is stationary at a mode, so with the mode held fixed
 *   dλ/dp = φᵀ (∂K/∂p − λ ∂M/∂p) φ        (φᵀMφ = 1)
 * (Lord Rayleigh, The Theory of Sound, from memory; the derivative of the discrete eigenvalue
 * itself, e.g. R. L. Fox & M. P. Kapoor, AIAA J. 6 (1968), from memory). ∂K/∂p and ∂M/∂p act
 * through the assembly, so they are taken by a central difference of the assembled energies
 * with p ± 10⁻⁶p on the same mesh (the energies are smooth in p: the difference is exact to
 * about 10⁻¹⁰). A length change moves the mesh nodes with it; the unknowns keep their meaning.
 */
import { assembleFamily } from '../fe/assemble'
import { stiffnessForm } from '../linalg/shifted-ldlt'
import { quadraticForm } from '../linalg/symmetric-band-matrix'
import type { BendingPlane, FamilyKey } from '../model/families'
import type { Motion, Project } from '../model/project'
import { designParameters, withParameter, type DesignParameter } from './design-parameters'
import { analyseProject, type FamilyAnalysis } from './modal-analysis'
import { frequencySensitivities, type Sensitivity } from './sensitivity'

export interface FamilySensitivity extends Sensitivity {
  readonly motion: Motion
  readonly plane: BendingPlane | null
  readonly family: FamilyKey
}

/** Relative step of the central difference. */
const STEP = 1e-6

/** Finite-element sensitivities of one family's elastic modes. */
export function familySensitivities(analysis: FamilyAnalysis, parameters: DesignParameter[] = designParameters(analysis.project, [analysis.family.motion])): FamilySensitivity[] {
  const { project, family, settings, model } = analysis
  const assembly = {
    order: settings.elementOrder,
    elementsPerSegment: settings.elementsPerSegment,
    maxElementLength: settings.maxElementLength,
    mass: settings.mass,
    bendingTheory: settings.bendingTheory,
  }
  const elastic = analysis.modes.map((m, i) => ({ mode: m, vector: analysis.vectors[i] })).filter((e) => !e.mode.rigidBody)
  const out: FamilySensitivity[] = []
  for (const p of parameters) {
    const step = STEP * (Math.abs(p.value) > 0 ? Math.abs(p.value) : 1)
    const plus = assembleFamily(withParameter(project, p.target, p.value + step), family, assembly).pencil
    const minus = assembleFamily(withParameter(project, p.target, p.value - step), family, assembly).pencil
    if (plus.stiffness.order !== model.pencil.stiffness.order || minus.stiffness.order !== model.pencil.stiffness.order) {
      throw new RangeError(`changing ${p.label} changes the mesh; give the mesh as elementsPerSegment to take its sensitivity`)
    }
    for (const { mode, vector } of elastic) {
      const dK = stiffnessForm(plus, vector) - stiffnessForm(minus, vector)
      const dM = quadraticForm(plus.mass, vector) - quadraticForm(minus.mass, vector)
      const dLambda = (dK - mode.eigenvalue * dM) / (2 * step)
      const f = mode.frequencyHz
      const derivative = dLambda / (8 * Math.PI * Math.PI * f)
      out.push({
        mode: mode.mode,
        motion: family.motion,
        plane: family.plane,
        family: family.key,
        frequencyHz: f,
        parameter: p.path,
        label: p.label,
        value: p.value,
        derivative,
        relative: (p.value / f) * derivative,
      })
    }
  }
  return out
}

/**
 * Sensitivities of the lowest `modes` of every analysed family (or of `motions`): exact for
 * axial motion, finite-element for torsion and bending.
 */
export function designSensitivities(project: Project, modes: number, motions: readonly Motion[] = project.motions): FamilySensitivity[] {
  const out: FamilySensitivity[] = []
  if (motions.includes('axial') && project.motions.includes('axial')) {
    for (const s of frequencySensitivities(project, modes, designParameters(project, ['axial']))) out.push({ ...s, motion: 'axial', plane: null, family: 'axial' })
  }
  const others = motions.filter((m) => m !== 'axial' && project.motions.includes(m))
  if (others.length) {
    const analysis = analyseProject({ ...project, motions: others }, { modes }, { withReference: false })
    for (const f of analysis.families) out.push(...familySensitivities(f))
  }
  return out
}
