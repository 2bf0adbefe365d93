/**
 * Steady-state receptance of one motion family with modal damping: a harmonic force (axial),
 * torque (torsion) or side force (bending) F e^{iωt} at x gives a displacement, twist or
 * deflection H(ω) F e^{iωt} at y, by modal superposition over the computed modes
 * with a residual (static) correction for the modes left out:
 *   H(ω) = Σ φ_i(x) φ_i(y) / (ω_i² − ω² + 2iζ ω_i ω)  +  [G(x, y) − Σ φ_i(x) φ_i(y) / ω_i²],
 * where G = vᵀ K⁻¹ w is the static flexibility (w the load vector of a unit force at x,
 * v the interpolation at y). The bracket is the truncated modes' static part, so H(0) = G
 * exactly (the "mode-acceleration" correction; e.g. R. R. Craig & A. J. Kurdila,
 * Fundamentals of Structural Dynamics, ch. on mode superposition, from memory).
 * A family free to move as a rigid body has no static flexibility: its rigid-body modes enter as 1/(−ω²)
 * and no correction is made. Mode shapes φ are mass-normalised.
 */
import { allocateFactorization, factorShifted, solveFactored } from '../linalg/shifted-ldlt'
import { fieldStrain, type FamilyAnalysis } from './modal-analysis'
import { elementAt } from '../fe/mesh'

export interface ResponseRequest {
  /** Where the force acts and where the displacement is read, m from the start. */
  readonly forceAt: number
  readonly responseAt: number
  readonly fromHz: number
  readonly toHz: number
  readonly points: number
  /** Modal damping ratio ζ (default: the project's damping). */
  readonly damping?: number
}

export interface ResponsePoint {
  readonly frequencyHz: number
  /** |u/F|, m/N. */
  readonly amplitude: number
  /** Phase of u behind F, degrees (0 static, −90 at an undamped-like resonance). */
  readonly phaseDeg: number
  readonly real: number
  readonly imaginary: number
}

/**
 * Interpolation weights of the field at x over the unknowns (shape functions of the element
 * holding x): the load vector of a unit force there, and the read-out of the displacement.
 * Bending uses the Hermite cubic of the deflection (the rotation unknowns are scaled by ℓ).
 */
export function pointWeights(analysis: Pick<FamilyAnalysis, 'model'>, x: number): Float64Array {
  const { mesh, dofNodes, dofKinds, rotationScale } = analysis.model
  const weights = new Float64Array(dofNodes.length)
  if (dofKinds) {
    const index = new Map<number, number>()
    for (let j = 0; j < dofNodes.length; j++) index.set(2 * dofNodes[j] + dofKinds[j], j)
    const e = elementAt({ ...mesh, order: 1 }, x)
    const x0 = mesh.x[e]
    const h = mesh.x[e + 1] - x0
    const t = Math.min(1, Math.max(0, (x - x0) / h))
    const t2 = t * t
    const t3 = t2 * t
    const n = [2 * t3 - 3 * t2 + 1, ((t3 - 2 * t2 + t) * h) / rotationScale, -2 * t3 + 3 * t2, ((t3 - t2) * h) / rotationScale]
    n.forEach((value, a) => {
      const dof = index.get(2 * e + a)
      if (dof !== undefined) weights[dof] += value
    })
    return weights
  }
  const dofOfNode = new Map<number, number>()
  dofNodes.forEach((node, dof) => dofOfNode.set(node, dof))
  const e = elementAt(mesh, x)
  const first = mesh.order * e
  const x0 = mesh.x[first]
  const x1 = mesh.x[first + mesh.order]
  const xi = Math.min(1, Math.max(-1, (2 * (x - x0)) / (x1 - x0) - 1))
  const n = mesh.order === 1 ? [(1 - xi) / 2, (1 + xi) / 2] : [(xi * (xi - 1)) / 2, 1 - xi * xi, (xi * (xi + 1)) / 2]
  n.forEach((value, a) => {
    const dof = dofOfNode.get(first + a)
    if (dof !== undefined) weights[dof] += value
  })
  return weights
}

/** A family free to move as a rigid body has no static flexibility. */
function hasRigidBodyModes(analysis: FamilyAnalysis): boolean {
  return analysis.modes.some((m) => m.rigidBody)
}

function dot(a: Float64Array, b: Float64Array): number {
  let s = 0
  for (let i = 0; i < a.length; i++) s += a[i] * b[i]
  return s
}

export interface ReceptanceModel {
  /** Σ over modes: ω_i², (vᵀφ_i)(wᵀφ_i), rigid flag. */
  readonly terms: { omega2: number; product: number; rigid: boolean }[]
  /** G − Σ product/ω_i², or null for a bar with no support. */
  readonly residual: number | null
  readonly staticFlexibility: number | null
  readonly damping: number
}

/** The pieces of H(ω) between two given load and read-out vectors over the unknowns. */
export function receptanceModel(analysis: FamilyAnalysis, load: Float64Array, readout: Float64Array, damping: number): ReceptanceModel {
  const terms = analysis.modes.map((m, i) => ({ omega2: m.eigenvalue, product: dot(readout, analysis.vectors[i]) * dot(load, analysis.vectors[i]), rigid: m.rigidBody }))
  if (hasRigidBodyModes(analysis)) return { terms, residual: null, staticFlexibility: null, damping }
  const pencil = analysis.model.pencil
  const f = factorShifted(pencil, 0, allocateFactorization(pencil.stiffness.order, pencil.stiffness.halfBandwidth))
  const staticDisplacement = solveFactored(f, load, new Float64Array(load.length))
  const staticFlexibility = dot(readout, staticDisplacement)
  let modal = 0
  for (const t of terms) if (!t.rigid) modal += t.product / t.omega2
  return { terms, residual: staticFlexibility - modal, staticFlexibility, damping }
}

/** H(ω) from a receptance model: [real, imaginary]. */
export function evaluateReceptance(model: ReceptanceModel, omega: number): [number, number] {
  let re = model.residual ?? 0
  let im = 0
  const zeta = model.damping
  for (const t of model.terms) {
    if (t.rigid) {
      if (omega > 0) re -= t.product / (omega * omega)
      continue
    }
    const omegaI = Math.sqrt(t.omega2)
    const a = t.omega2 - omega * omega
    const b = 2 * zeta * omegaI * omega
    const denominator = a * a + b * b
    re += (t.product * a) / denominator
    im -= (t.product * b) / denominator
  }
  return [re, im]
}

/** Receptance u(y)/F(x) on an evenly spaced frequency grid. */
export function forcedResponse(analysis: FamilyAnalysis, request: ResponseRequest): { points: ResponsePoint[]; model: ReceptanceModel } {
  const damping = request.damping ?? analysis.project.damping
  const model = receptanceModel(analysis, pointWeights(analysis, request.forceAt), pointWeights(analysis, request.responseAt), damping)
  const points: ResponsePoint[] = []
  for (let i = 0; i < request.points; i++) {
    const frequencyHz = request.points === 1 ? request.fromHz : request.fromHz + ((request.toHz - request.fromHz) * i) / (request.points - 1)
    const [real, imaginary] = evaluateReceptance(model, 2 * Math.PI * frequencyHz)
    points.push({ frequencyHz, amplitude: Math.hypot(real, imaginary), phaseDeg: (Math.atan2(imaginary, real) * 180) / Math.PI, real, imaginary })
  }
  return { points, model }
}

/**
 * Largest stress amplitude along the part per unit force (or torque) at x, at one frequency:
 * the complex response shape u = Σ φ_i (φ_iᵀw)/(…) + K⁻¹w − Σ φ_i (φ_iᵀw)/ω_i², turned into
 * stress element by element as the mode shapes are (modeStrain): axial stress, shear stress of
 * torsion, bending stress at the surface. Pa per N (per N·m for torsion).
 */
export function peakStressPerForce(analysis: FamilyAnalysis, forceAt: number, frequencyHz: number, damping = analysis.project.damping): { stress: number; at: number } {
  const load = pointWeights(analysis, forceAt)
  const n = load.length
  const re = new Float64Array(n)
  const im = new Float64Array(n)
  const omega = 2 * Math.PI * frequencyHz
  const statics = !hasRigidBodyModes(analysis)
  analysis.modes.forEach((m, i) => {
    const phi = analysis.vectors[i]
    const participation = dot(phi, load)
    let cr: number
    let ci: number
    if (m.rigidBody) {
      cr = omega > 0 ? -participation / (omega * omega) : 0
      ci = 0
    } else {
      const a = m.eigenvalue - omega * omega
      const b = 2 * damping * Math.sqrt(m.eigenvalue) * omega
      const d = a * a + b * b
      cr = (participation * a) / d - (statics ? participation / m.eigenvalue : 0)
      ci = (-participation * b) / d
    }
    for (let j = 0; j < n; j++) {
      re[j] += cr * phi[j]
      im[j] += ci * phi[j]
    }
  })
  if (statics) {
    const pencil = analysis.model.pencil
    const f = factorShifted(pencil, 0, allocateFactorization(pencil.stiffness.order, pencil.stiffness.halfBandwidth))
    const displacement = solveFactored(f, load, new Float64Array(n))
    for (let j = 0; j < n; j++) re[j] += displacement[j]
  }
  const real = fieldStrain(analysis, re)
  const imaginary = fieldStrain(analysis, im)
  let best = { stress: 0, at: 0 }
  for (let k = 0; k < real.x.length; k++) {
    const stress = Math.hypot(real.stress[k], imaginary.stress[k])
    if (stress > best.stress) best = { stress, at: real.x[k] }
  }
  return best
}
