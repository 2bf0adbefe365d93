/**
 * Element matrices of an axial bar element, from the energy functionals:
 *   strain energy  U = ½ ∫ EA (u′)² dx   →  K_ab = ∫ EA N_a′ N_b′ dx
 *   kinetic energy T = ½ ∫ ρA (u̇)² dx    →  M_ab = ∫ ρA N_a N_b dx
 * with u = Σ N_a u_a (Lagrange shape functions, 2 or 3 nodes). Integrals use 4-point
 * Gauss–Legendre quadrature, exact up to degree 7: the cone's area is quadratic in x,
 * so the quadratic element's mass integrand (degree 6) is still integrated exactly.
 * Stationarity of ∫(T − U + W)dt (Hamilton's principle) gives M ü + K u = f.
 *
 * Lumped masses: row sums (∫ρA N_a dx) for 2-node elements; for 3-node elements the
 * diagonal scaled to the element mass (Hinton, Rock & Zienkiewicz, Earthq. Eng. Struct. Dyn.
 * 4 (1976), from memory), which keeps every nodal mass positive. Mixed = their average.
 */
import type { ElementOrder, MassMatrixKind } from '../model/project'
import { gaussLegendre } from './gauss-legendre'

export interface ElementMatrices {
  /** Number of nodes: 2 or 3 (start, middle, end). */
  readonly nodes: number
  /** Dense symmetric matrices, row-major nodes × nodes. */
  readonly stiffness: Float64Array
  readonly mass: Float64Array
}

/** Shape functions and their ξ-derivatives on [−1, 1]; nodes at ξ = −1, (0), 1. */
function shape(order: ElementOrder, xi: number): { n: number[]; dn: number[] } {
  if (order === 1) return { n: [(1 - xi) / 2, (1 + xi) / 2], dn: [-0.5, 0.5] }
  return {
    n: [(xi * (xi - 1)) / 2, 1 - xi * xi, (xi * (xi + 1)) / 2],
    dn: [xi - 0.5, -2 * xi, xi + 0.5],
  }
}

/**
 * K and M of one element of length h. `area(t)` gives the section area at fraction
 * t ∈ [0, 1] along the element.
 */
export function barElementMatrices(
  order: ElementOrder,
  length: number,
  youngsModulus: number,
  density: number,
  area: (t: number) => number,
  massKind: MassMatrixKind,
): ElementMatrices {
  const nodes = order + 1
  const rule = gaussLegendre(4)
  const k = new Float64Array(nodes * nodes)
  const consistent = new Float64Array(nodes * nodes)
  const jacobian = length / 2
  for (let g = 0; g < rule.points.length; g++) {
    const xi = rule.points[g]
    const a = area((xi + 1) / 2)
    const { n, dn } = shape(order, xi)
    const w = rule.weights[g] * jacobian
    for (let i = 0; i < nodes; i++) {
      for (let j = 0; j < nodes; j++) {
        k[i * nodes + j] += (w * youngsModulus * a * dn[i] * dn[j]) / (jacobian * jacobian)
        consistent[i * nodes + j] += w * density * a * n[i] * n[j]
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
