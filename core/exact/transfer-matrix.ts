/**
 * Exact axial vibration of a piecewise model: uniform and solid-cone members between
 * stations (segment boundaries and attachments), point masses and grounded springs at
 * stations, fixed or free ends.
 *
 * Each member relates the state (u, N = EA u′) at its ends by a 2×2 transfer matrix T(ω).
 * Uniform member, k = ω/c: u = C cos kx + D sin kx. Solid cone, A = A₀(1 + a x)²: with
 * u = w/(1 + a x), (A u′)′ + k²A u = 0 becomes w″ + k²w = 0 (the Webster horn equation;
 * L. E. Kinsler et al., Fundamentals of Acoustics, horns, from memory), so
 * u = (C cos kx + D sin kx)/(1 + a x), and N = E A₀ ((1 + a x) w′ − a w).
 * det T = 1, and the member's dynamic stiffness (end forces from end displacements) is
 *   D = (1/T₁₂) [[T₁₁, −1], [−1, T₂₂]].
 */

export interface ExactMember {
  readonly length: number
  readonly youngsModulus: number
  readonly density: number
  /** Area at the start; for a cone also the diameter ratio start→end. */
  readonly startArea: number
  /** 1 for a uniform member; d_end / d_start for a solid cone. */
  readonly diameterRatio: number
  /** The project segment the member belongs to, and the member's ends as fractions of it. */
  readonly segment?: number
  readonly t0?: number
  readonly t1?: number
}

export interface MemberStiffness {
  readonly d11: number
  readonly d12: number
  readonly d22: number
}

export function waveSpeed(member: ExactMember): number {
  return Math.sqrt(member.youngsModulus / member.density)
}

/** Transfer matrix [[T11, T12], [T21, T22]] from (u, N) at x = 0 to x = L. */
export function memberTransferMatrix(member: ExactMember, omega: number): [number, number, number, number] {
  const { length: L, youngsModulus: E, startArea: A0, diameterRatio } = member
  const k = omega / waveSpeed(member)
  const a = (diameterRatio - 1) / L
  const sL = 1 + a * L
  const kL = k * L
  const c = Math.cos(kL)
  // sin(kL)/k, continuous at k = 0.
  const sinOverK = Math.abs(kL) < 1e-8 ? L * (1 - (kL * kL) / 6) : Math.sin(kL) / k
  const kSin = k * Math.sin(kL)
  const EA0 = E * A0
  // w = C cos kx + D sin kx with C = u0, D = (N0/EA0 + a u0)/k; w(L), w'(L) per unit u0 and N0.
  // From u0 (N0 = 0): C = 1, D = a/k.   From N0 (u0 = 0): C = 0, D = 1/(EA0 k).
  const wL_u = c + a * sinOverK
  const dwL_u = -kSin + a * c
  const wL_N = sinOverK / EA0
  const dwL_N = c / EA0
  const T11 = wL_u / sL
  const T12 = wL_N / sL
  const T21 = EA0 * (sL * dwL_u - a * wL_u)
  const T22 = EA0 * (sL * dwL_N - a * wL_N)
  return [T11, T12, T21, T22]
}

export function memberDynamicStiffness(member: ExactMember, omega: number): MemberStiffness {
  const [T11, T12, , T22] = memberTransferMatrix(member, omega)
  return { d11: T11 / T12, d12: -1 / T12, d22: T22 / T12 }
}

/** Natural frequencies of the member with both ends fixed that lie strictly below ω (sin kL = 0). */
export function clampedMemberCount(member: ExactMember, omega: number): number {
  const x = (omega * member.length) / (Math.PI * waveSpeed(member))
  return x > 0 ? Math.ceil(x) - 1 : 0
}
