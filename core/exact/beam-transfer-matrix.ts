/**
 * Exact transfer matrix of a uniform Euler–Bernoulli member with a steady axial force P
 * (tension positive) at angular frequency ω. The member equation EI w'''' − P w'' − ρA ω² w = 0
 * (solutions A cosh αx + B sinh αx + C cos βx + D sin βx, α² and −β² the roots of
 * EI r⁴ − P r² − ρA ω² = 0) is written as the first-order system y′ = G y for the state
 *   y = (w, θ = w′, f_w = P w′ − EI w''', f_θ = EI w''),
 * where (f_w, f_θ) are the forces conjugate to (w, θ) at a cut, read off the boundary terms of
 * ½∫EI w''² dx + ½∫P w′² dx − ½ω²∫ρA w² dx:
 *   w′ = θ,  θ′ = f_θ/EI,  f_w′ = −ρA ω² w,  f_θ′ = P θ − f_w.
 * G is Hamiltonian, so T = exp(Gℓ) is symplectic and every stiffness formed from it is symmetric
 * (e.g. A. Y. T. Leung, Dynamic Stiffness and Substructures, Springer 1993, from memory).
 *
 * T is summed as the Taylor series of the exponential (C. Moler & C. Van Loan, Nineteen dubious
 * ways to compute the exponential of a matrix, SIAM Review 20 (1978), from memory) on pieces
 * short enough that the series converges fast and without cancellation: in the piece's own
 * units λ⁴ = ρAω²ℓ⁴/EI ≤ 16 and |p| = |P|ℓ²/EI ≤ 4, so every eigenvalue of Gℓ is below 2.6 in
 * modulus and after 34 terms the remainder is below 1e-18 of each entry. Unlike the four closed-form
 * functions, which merge as ω → 0 or P → 0, the series is exact there; and an entry that
 * vanishes for a rigid motion (the force a translation or rotation needs) is a sum of terms that
 * each carry ω² or P, so it keeps its digits however small it is — near-rigid modes stay accurate.
 *
 * The same limits make each piece's clamped–clamped fundamental frequency lie far above ω, so
 * its Wittrick–Williams count J₀ is 0: by the Rayleigh quotient with the clamped–clamped
 * buckling bound ∫w′² ≤ (ℓ/2π)²∫w''², ω₁² ≥ (1 − |P|ℓ²/(4π²EI))·EI(4.7300/ℓ)⁴/ρA under
 * compression and ≥ EI(4.7300/ℓ)⁴/ρA under tension (4.7300 < 4.730041, the clamped–clamped βℓ;
 * R. D. Blevins, Formulas for Natural Frequency and Mode Shape, beams, from memory); likewise
 * the piece's clamped–clamped buckling load 4π²EI/ℓ² lies above |P|.
 */
import type { BeamMember } from './beam-chain'

/** State order in every 4×4 matrix here (row-major): w, θ, f_w, f_θ. */
export const W = 0
export const THETA = 1
export const FW = 2
export const FTHETA = 3

const LAMBDA_MAX = 2
const P_MAX = 4
const TAYLOR_TERMS = 34
const CLAMPED_BETA_L_LOWER = 4.73

/**
 * Pieces a member is cut into at ω: the fewest with λ⁴ ≤ 16 and |p| ≤ 4 per piece, which also
 * puts each piece's clamped–clamped fundamental (lower bound above) above ω, with ω₁² ≥ 5ω².
 */
export function piecesPerMember(member: BeamMember, axialForce: number, omega: number): number {
  const { length: L, bendingStiffness: EI, massPerLength: m } = member
  const lambda = L * Math.sqrt(Math.sqrt((m * omega * omega) / EI))
  const p = (Math.abs(axialForce) * L * L) / EI
  let n = Math.max(1, Math.ceil(lambda / LAMBDA_MAX), Math.ceil(Math.sqrt(p / P_MAX)))
  // The guarantee J₀ = 0, checked with the lower bound itself (it always holds at these limits).
  for (;;) {
    const l = L / n
    const factor = axialForce < 0 ? 1 - (p / (n * n)) / (4 * Math.PI * Math.PI) : 1
    const lowerBound = (factor * EI * (CLAMPED_BETA_L_LOWER / l) ** 4) / m
    if (factor > 0 && omega * omega <= 0.2 * lowerBound) return n
    n++
  }
}

/** exp(Gℓ) of one piece in its own units (w, ℓθ, f_w ℓ³/EI, f_θ ℓ²/EI), row-major. */
export function beamPieceTransferScaled(lambda4: number, p: number): Float64Array {
  const sum = new Float64Array(16)
  const term = new Float64Array(16)
  for (let i = 0; i < 4; i++) {
    sum[i * 5] = 1
    term[i * 5] = 1
  }
  const next = new Float64Array(16)
  for (let k = 1; k <= TAYLOR_TERMS; k++) {
    // next = G·term / k, with G's rows: w′ = θ, θ′ = f_θ, f_w′ = −λ⁴ w, f_θ′ = p θ − f_w.
    for (let j = 0; j < 4; j++) {
      next[j] = term[4 + j] / k
      next[4 + j] = term[12 + j] / k
      next[8 + j] = (-lambda4 * term[j]) / k
      next[12 + j] = (p * term[4 + j] - term[8 + j]) / k
    }
    for (let i = 0; i < 16; i++) {
      term[i] = next[i]
      sum[i] += next[i]
    }
  }
  return sum
}

/** Transfer matrix of a piece of length ℓ in physical units (m, rad, N, N·m), row-major. */
export function beamPieceTransfer(length: number, bendingStiffness: number, massPerLength: number, axialForce: number, omega: number): Float64Array {
  const l = length
  const EI = bendingStiffness
  const scaled = beamPieceTransferScaled((massPerLength * omega * omega * l ** 4) / EI, (axialForce * l * l) / EI)
  const s = [1, l, l ** 3 / EI, (l * l) / EI]
  const out = new Float64Array(16)
  for (let i = 0; i < 4; i++) for (let j = 0; j < 4; j++) out[i * 4 + j] = (scaled[i * 4 + j] * s[j]) / s[i]
  return out
}

/** Transfer matrix of a whole member (its pieces multiplied), physical units, row-major. */
export function beamMemberTransfer(member: BeamMember, axialForce: number, omega: number): Float64Array {
  const n = piecesPerMember(member, axialForce, omega)
  const piece = beamPieceTransfer(member.length / n, member.bendingStiffness, member.massPerLength, axialForce, omega)
  let total = piece
  for (let i = 1; i < n; i++) total = multiply4(piece, total)
  return total
}

/**
 * The member's exact dynamic stiffness (end forces from end displacements w₁, θ₁, w₂, θ₂),
 * from its transfer matrix: with d = (w, θ), f = (f_w, f_θ), d₂ = T₁₁d₁ + T₁₂f₁, f₂ = T₂₁d₁ + T₂₂f₁
 * and end forces (−f₁, f₂),
 *   K = [[T₁₂⁻¹T₁₁, −T₁₂⁻¹], [T₂₁ − T₂₂T₁₂⁻¹T₁₁ = −T₁₂⁻ᵀ, T₂₂T₁₂⁻¹]].
 * Finite below the member's first clamped–clamped frequency and away from the later ones; for
 * members up to a few hundred in αℓ (the transfer matrix grows like cosh αℓ). The counting
 * and root finding never use it: it is the member form of the same solution, for checks.
 */
export function beamMemberDynamicStiffness(member: BeamMember, axialForce: number, omega: number): number[][] {
  const T = beamMemberTransfer(member, axialForce, omega)
  const t = (i: number, j: number) => T[i * 4 + j]
  const T11 = [
    [t(0, 0), t(0, 1)],
    [t(1, 0), t(1, 1)],
  ]
  const T12 = [
    [t(0, 2), t(0, 3)],
    [t(1, 2), t(1, 3)],
  ]
  const T22 = [
    [t(2, 2), t(2, 3)],
    [t(3, 2), t(3, 3)],
  ]
  const inv12 = inverse2(T12)
  const k11 = mul2(inv12, T11)
  const k12 = scale2(inv12, -1)
  const k22 = mul2(T22, inv12)
  // T₂₁ − T₂₂T₁₂⁻¹T₁₁ = −T₁₂⁻ᵀ (T symplectic): the transpose, without the cancellation of the long form.
  const k21 = [
    [k12[0][0], k12[1][0]],
    [k12[0][1], k12[1][1]],
  ]
  return [
    [k11[0][0], k11[0][1], k12[0][0], k12[0][1]],
    [k11[1][0], k11[1][1], k12[1][0], k12[1][1]],
    [k21[0][0], k21[0][1], k22[0][0], k22[0][1]],
    [k21[1][0], k21[1][1], k22[1][0], k22[1][1]],
  ]
}

function multiply4(a: Float64Array, b: Float64Array): Float64Array {
  const out = new Float64Array(16)
  for (let i = 0; i < 4; i++)
    for (let j = 0; j < 4; j++) {
      let s = 0
      for (let k = 0; k < 4; k++) s += a[i * 4 + k] * b[k * 4 + j]
      out[i * 4 + j] = s
    }
  return out
}

function inverse2(a: number[][]): number[][] {
  const det = a[0][0] * a[1][1] - a[0][1] * a[1][0]
  return [
    [a[1][1] / det, -a[0][1] / det],
    [-a[1][0] / det, a[0][0] / det],
  ]
}

function mul2(a: number[][], b: number[][]): number[][] {
  return [
    [a[0][0] * b[0][0] + a[0][1] * b[1][0], a[0][0] * b[0][1] + a[0][1] * b[1][1]],
    [a[1][0] * b[0][0] + a[1][1] * b[1][0], a[1][0] * b[0][1] + a[1][1] * b[1][1]],
  ]
}

function scale2(a: number[][], s: number): number[][] {
  return a.map((row) => row.map((v) => v * s))
}
