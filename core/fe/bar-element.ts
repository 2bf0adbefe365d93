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

/** Shape functions N_a and derivatives dN_a/dξ at the 4 Gauss points, per element order (computed once). */
const GAUSS = gaussLegendre(4)
const SHAPES: Record<ElementOrder, { n: number[][]; dn: number[][] }> = {
  1: {
    n: GAUSS.points.map((xi) => [(1 - xi) / 2, (1 + xi) / 2]),
    dn: GAUSS.points.map(() => [-0.5, 0.5]),
  },
  2: {
    n: GAUSS.points.map((xi) => [(xi * (xi - 1)) / 2, 1 - xi * xi, (xi * (xi + 1)) / 2]),
    dn: GAUSS.points.map((xi) => [xi - 0.5, -2 * xi, xi + 0.5]),
  },
}

/**
 * K and M of one element of length h. `area(t)` gives the section area at fraction
 * t ∈ [0, 1] along the element; pass `uniformArea` instead when it is constant, which
 * gives the closed forms EA/h·[1 −1; −1 1], ρAh/6·[2 1; 1 2] (2-node) and
 * EA/3h·[7 −8 1; −8 16 −8; 1 −8 7], ρAh/30·[4 2 −1; 2 16 2; −1 2 4] (3-node) —
 * the same integrals, without quadrature.
 */
export function barElementMatrices(
  order: ElementOrder,
  length: number,
  youngsModulus: number,
  density: number,
  area: ((t: number) => number) | { uniformArea: number },
  massKind: MassMatrixKind,
): ElementMatrices {
  const nodes = order + 1
  const k = new Float64Array(nodes * nodes)
  const consistent = new Float64Array(nodes * nodes)
  if (typeof area !== 'function') {
    const ea = (youngsModulus * area.uniformArea) / length
    const m = density * area.uniformArea * length
    const kUnit = order === 1 ? [1, -1, -1, 1] : [7 / 3, -8 / 3, 1 / 3, -8 / 3, 16 / 3, -8 / 3, 1 / 3, -8 / 3, 7 / 3]
    const mUnit = order === 1 ? [2 / 6, 1 / 6, 1 / 6, 2 / 6] : [4 / 30, 2 / 30, -1 / 30, 2 / 30, 16 / 30, 2 / 30, -1 / 30, 2 / 30, 4 / 30]
    for (let i = 0; i < kUnit.length; i++) {
      k[i] = ea * kUnit[i]
      consistent[i] = m * mUnit[i]
    }
  } else {
    const { n: shapeValues, dn: shapeDerivatives } = SHAPES[order]
    const jacobian = length / 2
    for (let g = 0; g < GAUSS.points.length; g++) {
      const a = area((GAUSS.points[g] + 1) / 2)
      const n = shapeValues[g]
      const dn = shapeDerivatives[g]
      const w = GAUSS.weights[g] * jacobian
      const stiffnessWeight = (w * youngsModulus * a) / (jacobian * jacobian)
      const massWeight = w * density * a
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
