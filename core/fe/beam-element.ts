/**
 * Element matrices of a bending element, from the energy functionals (Hamilton's principle,
 * as for the bar): with deflection w(x) and section rotation ψ(x),
 *   strain energy   U = ½ ∫ EI ψ′² dx + ½ ∫ κGA (w′ − ψ)² dx
 *   preload's work  ½ ∫ P w′² dx   (steady axial force P, tension positive: geometric stiffness)
 *   kinetic energy  T = ½ ∫ ρA ẇ² dx + ½ ∫ ρI ψ̇² dx.
 * Euler–Bernoulli theory is the limit ψ = w′ (no shear deformation) without the rotary term:
 * Hermite cubic w, U = ½ ∫ EI w″² dx, T = ½ ∫ ρA ẇ² dx (e.g. J. S. Przemieniecki, Theory of
 * Matrix Structural Analysis, ch. 5 and 11, from memory).
 * Timoshenko theory uses the interdependent interpolation of A. Friedman & Z. Kosmatka,
 * "An improved two-node Timoshenko beam finite element", Comput. Struct. 47 (1993) 473–481
 * (from memory): w cubic and ψ quadratic, tied by Φ = 12EI/(κGAh²) so that the shear strain is
 * constant along the element; it reduces to the Hermite element as Φ → 0 and is free of locking.
 * Unknowns per element: [w_a, θ_a, w_b, θ_b] (θ the rotation: w′ or ψ).
 * Integrals use 5-point Gauss–Legendre quadrature (exact to degree 9): every integrand is a
 * polynomial of degree ≤ 8 even on a cone, whose I is quartic and A quadratic in x.
 * Lumped mass: the diagonal of the consistent matrix scaled to the element's mass (Hinton, Rock
 * & Zienkiewicz, Earthq. Eng. Struct. Dyn. 4 (1976), from memory), which gives ρAh/2 and ρAh³/78
 * for a uniform Euler–Bernoulli element; mixed: the average of the two.
 */
import type { BendingTheory, MassMatrixKind } from '../model/project'
import { gaussLegendreRule } from './gauss-legendre'

/** Section properties along an element, t ∈ [0, 1] from its start. */
export interface BeamElementSection {
  /** EI, N·m². */
  readonly bendingStiffness: (t: number) => number
  /** ρA, kg/m. */
  readonly massPerLength: (t: number) => number
  /** ρI, kg·m (Timoshenko's rotary inertia). */
  readonly rotaryInertiaPerLength: (t: number) => number
  /** κGA, N (Timoshenko's shear stiffness); Infinity for Euler–Bernoulli. */
  readonly shearStiffness: (t: number) => number
}

export interface BeamElementMatrices {
  /** 4 × 4 row-major over [w_a, θ_a, w_b, θ_b]. */
  readonly elastic: Float64Array
  /** Geometric stiffness per newton of tension, ∫ N_w′ N_w′ dx. */
  readonly geometric: Float64Array
  readonly mass: Float64Array
  /** Φ = 12EI/(κGAh²) of the interpolation (0 for Euler–Bernoulli): beamShapes(t, h, Φ) recovers the fields. */
  readonly shearParameter: number
}

const RULE = gaussLegendreRule(5)

/**
 * Shape functions at t for an element of length h and shear parameter Φ: values of w, its
 * x-derivative, ψ and its x-derivative, per unknown. Φ = 0 gives the Hermite cubic (ψ = w′).
 */
export function beamShapes(t: number, h: number, phi: number): { w: number[]; dw: number[]; psi: number[]; dpsi: number[] } {
  const mu = 1 / (1 + phi)
  const t2 = t * t
  const t3 = t2 * t
  const w = [
    mu * (2 * t3 - 3 * t2 - phi * t + 1 + phi),
    mu * h * (t3 - (2 + phi / 2) * t2 + (1 + phi / 2) * t),
    -mu * (2 * t3 - 3 * t2 - phi * t),
    mu * h * (t3 - (1 - phi / 2) * t2 - (phi / 2) * t),
  ]
  // d/dx = (1/h) d/dt
  const dw = [
    (mu * (6 * t2 - 6 * t - phi)) / h,
    mu * (3 * t2 - (4 + phi) * t + 1 + phi / 2),
    (-mu * (6 * t2 - 6 * t - phi)) / h,
    mu * (3 * t2 - (2 - phi) * t - phi / 2),
  ]
  const psi = [(6 * mu * (t2 - t)) / h, mu * (3 * t2 - (4 + phi) * t + 1 + phi), (-6 * mu * (t2 - t)) / h, mu * (3 * t2 - (2 - phi) * t)]
  const dpsi = [(6 * mu * (2 * t - 1)) / (h * h), (mu * (6 * t - (4 + phi))) / h, (-6 * mu * (2 * t - 1)) / (h * h), (mu * (6 * t - (2 - phi))) / h]
  return { w, dw, psi, dpsi }
}

/** Element matrices of length h for the chosen theory and mass matrix. */
export function beamElementMatrices(length: number, section: BeamElementSection, theory: BendingTheory, massKind: MassMatrixKind): BeamElementMatrices {
  const h = length
  const timoshenko = theory === 'timoshenko'
  // Φ of the element's middle ties the interpolation; the integrals below use the local properties.
  const phi = timoshenko ? (12 * section.bendingStiffness(0.5)) / (section.shearStiffness(0.5) * h * h) : 0
  const elastic = new Float64Array(16)
  const geometric = new Float64Array(16)
  const consistent = new Float64Array(16)
  for (let g = 0; g < RULE.points.length; g++) {
    const t = (RULE.points[g] + 1) / 2
    const weight = (RULE.weights[g] * h) / 2
    const s = beamShapes(t, h, phi)
    const ei = section.bendingStiffness(t) * weight
    const rhoA = section.massPerLength(t) * weight
    const shear = timoshenko ? section.shearStiffness(t) * weight : 0
    const rhoI = timoshenko ? section.rotaryInertiaPerLength(t) * weight : 0
    for (let a = 0; a < 4; a++) {
      for (let b = 0; b < 4; b++) {
        const i = 4 * a + b
        // Euler–Bernoulli: ψ = w′, so ψ′ = w″ and the shear strain vanishes.
        elastic[i] += ei * s.dpsi[a] * s.dpsi[b]
        if (timoshenko) elastic[i] += shear * (s.dw[a] - s.psi[a]) * (s.dw[b] - s.psi[b])
        geometric[i] += weight * s.dw[a] * s.dw[b]
        consistent[i] += rhoA * s.w[a] * s.w[b] + rhoI * s.psi[a] * s.psi[b]
      }
    }
  }
  if (massKind === 'consistent') return { elastic, geometric, mass: consistent, shearParameter: phi }
  const lumped = lumpedBeamMass(consistent, section, h)
  if (massKind === 'lumped') return { elastic, geometric, mass: lumped, shearParameter: phi }
  const mixed = new Float64Array(16)
  for (let i = 0; i < 16; i++) mixed[i] = 0.5 * (consistent[i] + lumped[i])
  return { elastic, geometric, mass: mixed, shearParameter: phi }
}

/** Diagonal of the consistent mass, scaled so that the translations carry the element's mass. */
function lumpedBeamMass(consistent: Float64Array, section: BeamElementSection, h: number): Float64Array {
  let elementMass = 0
  for (let g = 0; g < RULE.points.length; g++) elementMass += ((RULE.weights[g] * h) / 2) * section.massPerLength((RULE.points[g] + 1) / 2)
  const scale = elementMass / (consistent[0] + consistent[10])
  const out = new Float64Array(16)
  for (let a = 0; a < 4; a++) out[5 * a] = consistent[5 * a] * scale
  return out
}
