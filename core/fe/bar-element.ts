/**
 * Element matrices of an axial bar element, from the energy functionals:
 *   strain energy  U = ½ ∫ EA (u′)² dx   →  K_ab = ∫ EA N_a′ N_b′ dx
 *   kinetic energy T = ½ ∫ ρA (u̇)² dx    →  M_ab = ∫ ρA N_a N_b dx
 * with u = Σ N_a u_a (Lagrange shape functions, 2 or 3 nodes). Integrals use 4-point
 * Gauss–Legendre quadrature, exact up to degree 7: the cone's area is quadratic in x,
 * so the quadratic element's mass integrand (degree 6) is still integrated exactly.
 * Stationarity of ∫(T − U + W)dt (Hamilton's principle) gives M ü + K u = f.
 *
 * Torsion of the same bar has the same functionals with the twist θ for u:
 * U = ½ ∫ GJ (θ′)² dx and T = ½ ∫ ρIp (θ̇)² dx, so the same element serves with G for E,
 * J for the stiffness's section property and Ip for the inertia's. A solid cone's J and Ip
 * are quartic in x: 5 points then keep every integrand (degree ≤ 8) exact.
 *
 * Lumped masses: row sums (∫ρA N_a dx) for 2-node elements; for 3-node elements the
 * diagonal scaled to the element mass (Hinton, Rock & Zienkiewicz, Earthq. Eng. Struct. Dyn.
 * 4 (1976), from memory), which keeps every nodal mass positive. Mixed = their average.
 */
import type { ElementOrder, MassMatrixKind } from '../model/project'
import { gaussLegendre, gaussLegendreRule, type QuadratureRule } from './gauss-legendre'

export interface ElementMatrices {
  /** Number of nodes: 2 or 3 (start, middle, end). */
  readonly nodes: number
  /** Dense symmetric matrices, row-major nodes × nodes. */
  readonly stiffness: Float64Array
  readonly mass: Float64Array
}

type Shapes = { rule: QuadratureRule; n: number[][]; dn: number[][] }

/** Shape functions N_a and derivatives dN_a/dξ at the Gauss points of a rule, per element order. */
function shapesAt(rule: QuadratureRule): Record<ElementOrder, Shapes> {
  return {
    1: {
      rule,
      n: rule.points.map((xi) => [(1 - xi) / 2, (1 + xi) / 2]),
      dn: rule.points.map(() => [-0.5, 0.5]),
    },
    2: {
      rule,
      n: rule.points.map((xi) => [(xi * (xi - 1)) / 2, 1 - xi * xi, (xi * (xi + 1)) / 2]),
      dn: rule.points.map((xi) => [xi - 0.5, -2 * xi, xi + 0.5]),
    },
  }
}
/** Computed once: 4 points for areas (quadratic in x), 5 for J and Ip of a cone (quartic). */
const SHAPES_4 = shapesAt(gaussLegendre(4))
const SHAPES_5 = shapesAt(gaussLegendreRule(5))

/** A section property along the element (t ∈ [0, 1]) or one value for all of it. */
export type ElementProperty = ((t: number) => number) | { uniformArea: number }

/**
 * K and M of one element of length h. `area(t)` gives the section area at fraction
 * t ∈ [0, 1] along the element; pass `uniformArea` instead when it is constant, which
 * gives the closed forms EA/h·[1 −1; −1 1], ρAh/6·[2 1; 1 2] (2-node) and
 * EA/3h·[7 −8 1; −8 16 −8; 1 −8 7], ρAh/30·[4 2 −1; 2 16 2; −1 2 4] (3-node) —
 * the same integrals, without quadrature. For torsion pass G, J as `area` and Ip as `inertia`
 * (by default the inertia's property is the stiffness's: the area of axial motion).
 */
export function barElementMatrices(
  order: ElementOrder,
  length: number,
  youngsModulus: number,
  density: number,
  area: ElementProperty,
  massKind: MassMatrixKind,
  inertia: ElementProperty = area,
): ElementMatrices {
  const nodes = order + 1
  const k = new Float64Array(nodes * nodes)
  const consistent = new Float64Array(nodes * nodes)
  if (typeof area !== 'function' && typeof inertia !== 'function') {
    const ea = (youngsModulus * area.uniformArea) / length
    const m = density * inertia.uniformArea * length
    const kUnit = order === 1 ? [1, -1, -1, 1] : [7 / 3, -8 / 3, 1 / 3, -8 / 3, 16 / 3, -8 / 3, 1 / 3, -8 / 3, 7 / 3]
    const mUnit = order === 1 ? [2 / 6, 1 / 6, 1 / 6, 2 / 6] : [4 / 30, 2 / 30, -1 / 30, 2 / 30, 16 / 30, 2 / 30, -1 / 30, 2 / 30, 4 / 30]
    for (let i = 0; i < kUnit.length; i++) {
      k[i] = ea * kUnit[i]
      consistent[i] = m * mUnit[i]
    }
  } else {
    const stiffnessAt = typeof area === 'function' ? area : () => area.uniformArea
    const inertiaAt = typeof inertia === 'function' ? inertia : () => inertia.uniformArea
    // The axial area needs 4 points; separate (torsion) properties are quartic on a cone.
    const { rule, n: shapeValues, dn: shapeDerivatives } = (inertia === area ? SHAPES_4 : SHAPES_5)[order]
    const jacobian = length / 2
    for (let g = 0; g < rule.points.length; g++) {
      const t = (rule.points[g] + 1) / 2
      const n = shapeValues[g]
      const dn = shapeDerivatives[g]
      const w = rule.weights[g] * jacobian
      const stiffnessWeight = (w * youngsModulus * stiffnessAt(t)) / (jacobian * jacobian)
      const massWeight = w * density * inertiaAt(t)
      for (let i = 0; i < nodes; i++) {
        for (let j = 0; j < nodes; j++) {
          k[i * nodes + j] += stiffnessWeight * dn[i] * dn[j]
          consistent[i * nodes + j] += massWeight * n[i] * n[j]
        }
      }
    }
  }
  if (massKind === 'consistent') return { nodes, stiffness: k, mass: consistent }
  const lumped = lumpedMass(order, consistent, nodes)
  if (massKind === 'lumped') return { nodes, stiffness: k, mass: lumped }
  const mixed = new Float64Array(nodes * nodes)
  for (let i = 0; i < mixed.length; i++) mixed[i] = 0.5 * (consistent[i] + lumped[i])
  return { nodes, stiffness: k, mass: mixed }
}

function lumpedMass(order: ElementOrder, consistent: Float64Array, nodes: number): Float64Array {
  const out = new Float64Array(nodes * nodes)
  if (order === 1) {
    for (let i = 0; i < nodes; i++) {
      let row = 0
      for (let j = 0; j < nodes; j++) row += consistent[i * nodes + j]
      out[i * nodes + i] = row
    }
    return out
  }
  let total = 0
  let diagonal = 0
  for (let i = 0; i < nodes; i++) {
    for (let j = 0; j < nodes; j++) total += consistent[i * nodes + j]
    diagonal += consistent[i * nodes + i]
  }
  for (let i = 0; i < nodes; i++) out[i * nodes + i] = (consistent[i * nodes + i] * total) / diagonal
  return out
}
