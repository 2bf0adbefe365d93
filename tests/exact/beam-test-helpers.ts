/**
 * Helpers for the exact beam reference's tests: chains of uniform members, roots of a published
 * frequency equation by scanning for sign changes and bisecting (independent of the routine under
 * test), and an independent dense Hermite-cubic finite-element model built from the energy
 * functionals by Gauss–Legendre quadrature and solved with ml-matrix.
 */
import { CholeskyDecomposition, EigenvalueDecomposition, Matrix, inverse } from 'ml-matrix'
import type { BeamChain, BeamEndCondition, BeamMember } from '../../core/exact/beam-chain'

export interface ChainOptions {
  readonly members: readonly BeamMember[]
  readonly start: BeamEndCondition
  readonly end: BeamEndCondition
  readonly axialForce?: number
  /** Per-station values; missing entries are 0. */
  readonly stationMass?: Record<number, number>
  readonly stationRotaryInertia?: Record<number, number>
  readonly stationSideStiffness?: Record<number, number>
  readonly stationRotationalStiffness?: Record<number, number>
}

export function beamChain(options: ChainOptions): BeamChain {
  const stations = options.members.length + 1
  const fill = (values?: Record<number, number>) => Array.from({ length: stations }, (_, s) => values?.[s] ?? 0)
  return {
    members: options.members,
    axialForce: options.axialForce ?? 0,
    stationMass: fill(options.stationMass),
    stationRotaryInertia: fill(options.stationRotaryInertia),
    stationSideStiffness: fill(options.stationSideStiffness),
    stationRotationalStiffness: fill(options.stationRotationalStiffness),
    start: options.start,
    end: options.end,
  }
}

/** A uniform beam of length L cut at the given fractions of its length into members (stations without attachments). */
export function uniformMembers(length: number, bendingStiffness: number, massPerLength: number, cuts: readonly number[] = []): BeamMember[] {
  const points = [0, ...cuts, 1]
  const members: BeamMember[] = []
  for (let i = 0; i + 1 < points.length; i++) members.push({ length: (points[i + 1] - points[i]) * length, bendingStiffness, massPerLength })
  return members
}

/** The same chain seen from the other end. */
export function reversed(chain: BeamChain): BeamChain {
  return {
    ...chain,
    members: [...chain.members].reverse(),
    stationMass: [...chain.stationMass].reverse(),
    stationRotaryInertia: [...chain.stationRotaryInertia].reverse(),
    stationSideStiffness: [...chain.stationSideStiffness].reverse(),
    stationRotationalStiffness: [...chain.stationRotationalStiffness].reverse(),
    start: chain.end,
    end: chain.start,
  }
}

/** Bisection to full precision on a bracket where g changes sign. */
export function bisect(g: (x: number) => number, lo0: number, hi0: number): number {
  let lo = lo0
  let hi = hi0
  let glo = g(lo)
  for (let i = 0; i < 200; i++) {
    const mid = 0.5 * (lo + hi)
    if (mid <= lo || mid >= hi) break
    const gm = g(mid)
    if (gm === 0) return mid
    if (gm * glo < 0) hi = mid
    else {
      lo = mid
      glo = gm
    }
  }
  return 0.5 * (lo + hi)
}

/** The first `count` roots of g above `from`, found by scanning with `step` for sign changes. */
export function equationRoots(g: (x: number) => number, count: number, from = 0.05, step = 0.01): number[] {
  const roots: number[] = []
  let x = from
  let gx = g(x)
  while (roots.length < count) {
    const next = x + step
    const gn = g(next)
    if (gx === 0) roots.push(x)
    else if (gx * gn < 0) roots.push(bisect(g, x, next))
    x = next
    gx = gn
    if (x > 1e4) throw new Error('equationRoots: not enough roots found')
  }
  return roots
}

// ---------------------------------------------------------------- Hermite-cubic finite elements

const GAUSS4 = {
  points: [-0.8611363115940526, -0.3399810435848563, 0.3399810435848563, 0.8611363115940526],
  weights: [0.3478548451374538, 0.6521451548625461, 0.6521451548625461, 0.3478548451374538],
}

/**
 * Element matrices of a Hermite-cubic beam element from the energy functionals
 * ½∫EI w''² dx, ½∫ρA w² dx, ½∫w′² dx (the geometric matrix, per newton of tension), by 4-point
 * Gauss–Legendre quadrature (exact for these polynomials of degree ≤ 6).
 */
export function hermiteElement(length: number, bendingStiffness: number, massPerLength: number): { k: number[][]; m: number[][]; g: number[][] } {
  const l = length
  const k = zeros(4)
  const m = zeros(4)
  const g = zeros(4)
  for (let q = 0; q < 4; q++) {
    const xi = 0.5 * (1 + GAUSS4.points[q])
    const weight = 0.5 * GAUSS4.weights[q] * l
    const n = [1 - 3 * xi ** 2 + 2 * xi ** 3, l * (xi - 2 * xi ** 2 + xi ** 3), 3 * xi ** 2 - 2 * xi ** 3, l * (-(xi ** 2) + xi ** 3)]
    const d1 = [(-6 * xi + 6 * xi ** 2) / l, 1 - 4 * xi + 3 * xi ** 2, (6 * xi - 6 * xi ** 2) / l, -2 * xi + 3 * xi ** 2]
    const d2 = [(-6 + 12 * xi) / l ** 2, (-4 + 6 * xi) / l, (6 - 12 * xi) / l ** 2, (-2 + 6 * xi) / l]
    for (let i = 0; i < 4; i++)
      for (let j = 0; j < 4; j++) {
        k[i][j] += weight * bendingStiffness * (d2[i] * d2[j])
        m[i][j] += weight * massPerLength * (n[i] * n[j])
        g[i][j] += weight * (d1[i] * d1[j])
      }
  }
  return { k, m, g }
}

function zeros(n: number): number[][] {
  return Array.from({ length: n }, () => new Array<number>(n).fill(0))
}

interface Assembled {
  readonly stiffness: Matrix // elastic + springs (no axial force)
  readonly geometric: Matrix // per newton of tension
  readonly mass: Matrix
  /** Indices of the unknowns kept (the ends' held ones removed), in the full list w₀, θ₀, w₁, θ₁, … */
  readonly keep: number[]
  readonly size: number
}

/** Assemble with `perMember` equal elements in every member; ends applied by removing unknowns. */
export function assembleHermite(chain: BeamChain, perMember: number): Assembled {
  const nodes = chain.members.length * perMember + 1
  const size = 2 * nodes
  const k = zeros(size)
  const g = zeros(size)
  const m = zeros(size)
  chain.members.forEach((member, i) => {
    const e = hermiteElement(member.length / perMember, member.bendingStiffness, member.massPerLength)
    for (let j = 0; j < perMember; j++) {
      const base = 2 * (i * perMember + j)
      for (let a = 0; a < 4; a++)
        for (let b = 0; b < 4; b++) {
          k[base + a][base + b] += e.k[a][b]
          g[base + a][base + b] += e.g[a][b]
          m[base + a][base + b] += e.m[a][b]
        }
    }
  })
  for (let s = 0; s <= chain.members.length; s++) {
    const node = s * perMember
    k[2 * node][2 * node] += chain.stationSideStiffness[s]
    k[2 * node + 1][2 * node + 1] += chain.stationRotationalStiffness[s]
    m[2 * node][2 * node] += chain.stationMass[s]
    m[2 * node + 1][2 * node + 1] += chain.stationRotaryInertia[s]
  }
  const removed = new Set<number>()
  const hold = (condition: BeamEndCondition, node: number) => {
    if (condition === 'clamped' || condition === 'pinned') removed.add(2 * node)
    if (condition === 'clamped' || condition === 'guided') removed.add(2 * node + 1)
  }
  hold(chain.start, 0)
  hold(chain.end, nodes - 1)
  const keep = Array.from({ length: size }, (_, i) => i).filter((i) => !removed.has(i))
  const pick = (a: number[][]) => new Matrix(keep.map((r) => keep.map((c) => a[r][c])))
  return { stiffness: pick(k), geometric: pick(g), mass: pick(m), keep, size }
}

/** Eigenpairs of the symmetric pencil (A, B), B positive definite, ascending (dense, ml-matrix); vectors in the original unknowns. */
export function pencilEigenpairs(a: Matrix, b: Matrix): { values: number[]; vectors: number[][] } {
  const lower = new CholeskyDecomposition(b).lowerTriangularMatrix
  const lowerInverse = inverse(lower)
  const reduced = lowerInverse.mmul(a).mmul(lowerInverse.transpose())
  const symmetric = reduced.add(reduced.transpose()).mul(0.5)
  const evd = new EigenvalueDecomposition(symmetric, { assumeSymmetric: true })
  const values = evd.realEigenvalues
  const vectors = lowerInverse.transpose().mmul(evd.eigenvectorMatrix)
  const order = values.map((_, i) => i).sort((i, j) => values[i] - values[j])
  return { values: order.map((i) => values[i]), vectors: order.map((i) => vectors.getColumn(i)) }
}

export function pencilEigenvalues(a: Matrix, b: Matrix): number[] {
  return pencilEigenpairs(a, b).values
}

/**
 * The energies of a finite-element deflection, element by element from the curvature, slope and
 * deflection at the Gauss points (not as vᵀKv from assembled numbers, whose cancellation costs a
 * smooth mode about (element length × wavenumber)⁻⁴ of its digits).
 */
function hermiteEnergies(chain: BeamChain, perMember: number, full: number[]): { bending: number; slope: number; kinetic: number; springs: number } {
  let bending = 0
  let slope = 0
  let kinetic = 0
  let springs = 0
  chain.members.forEach((member, i) => {
    const l = member.length / perMember
    for (let j = 0; j < perMember; j++) {
      const base = 2 * (i * perMember + j)
      const v = [full[base], full[base + 1], full[base + 2], full[base + 3]]
      for (let q = 0; q < 4; q++) {
        const xi = 0.5 * (1 + GAUSS4.points[q])
        const weight = 0.5 * GAUSS4.weights[q] * l
        const w = (1 - 3 * xi ** 2 + 2 * xi ** 3) * v[0] + l * (xi - 2 * xi ** 2 + xi ** 3) * v[1] + (3 * xi ** 2 - 2 * xi ** 3) * v[2] + l * (-(xi ** 2) + xi ** 3) * v[3]
        const w1 = ((-6 * xi + 6 * xi ** 2) / l) * v[0] + (1 - 4 * xi + 3 * xi ** 2) * v[1] + ((6 * xi - 6 * xi ** 2) / l) * v[2] + (-2 * xi + 3 * xi ** 2) * v[3]
        const w2 = ((-6 + 12 * xi) / l ** 2) * v[0] + ((-4 + 6 * xi) / l) * v[1] + ((6 - 12 * xi) / l ** 2) * v[2] + ((-2 + 6 * xi) / l) * v[3]
        bending += weight * member.bendingStiffness * w2 * w2
        slope += weight * w1 * w1
        kinetic += weight * member.massPerLength * w * w
      }
    }
  })
  for (let s = 0; s <= chain.members.length; s++) {
    const node = 2 * s * perMember
    springs += chain.stationSideStiffness[s] * full[node] ** 2 + chain.stationRotationalStiffness[s] * full[node + 1] ** 2
    kinetic += chain.stationMass[s] * full[node] ** 2 + chain.stationRotaryInertia[s] * full[node + 1] ** 2
  }
  return { bending, slope, kinetic, springs }
}

function expand(assembled: Assembled, vector: number[]): number[] {
  const full = new Array<number>(assembled.size).fill(0)
  assembled.keep.forEach((index, i) => (full[index] = vector[i]))
  return full
}

/**
 * Natural angular frequencies of the Hermite model, ascending: the dense solve's eigenvectors of
 * (K + P·K_G, M), each frequency then taken as its Rayleigh quotient from the element energies
 * (exact for an exact eigenvector; second order in the vector's round-off).
 */
export function hermiteFrequencies(chain: BeamChain, perMember: number): number[] {
  const assembled = assembleHermite(chain, perMember)
  const total = assembled.stiffness.clone().add(assembled.geometric.clone().mul(chain.axialForce))
  const { vectors } = pencilEigenpairs(total, assembled.mass)
  return vectors.map((vector) => {
    const e = hermiteEnergies(chain, perMember, expand(assembled, vector))
    return Math.sqrt(Math.max((e.bending + chain.axialForce * e.slope + e.springs) / e.kinetic, 0))
  })
}

/** Lowest buckling load Q of the Hermite model (K v = Q K_G v; needs a supported part), as the Rayleigh quotient of the dense solve's mode. */
export function hermiteBucklingLoad(chain: BeamChain, perMember: number): number {
  const assembled = assembleHermite(chain, perMember)
  const { vectors } = pencilEigenpairs(assembled.geometric, assembled.stiffness)
  const e = hermiteEnergies(chain, perMember, expand(assembled, vectors[vectors.length - 1]))
  return (e.bending + e.springs) / e.slope
}

/**
 * Richardson extrapolation of values converging as c₄h⁴ + c₆h⁶ (Hermite cubics: frequency
 * and buckling-load errors are O(h⁴); G. Strang & G. Fix, An Analysis of the Finite Element
 * Method, ch. 6, from memory) from meshes h, h/2, h/4.
 */
export function richardsonH4H6(coarse: number, middle: number, fine: number): number {
  const r1 = middle + (middle - coarse) / 15
  const r2 = fine + (fine - middle) / 15
  return r2 + (r2 - r1) / 63
}
