/**
 * Exact vibration of one straight member in a motion family governed by a second-order
 * equation: axial (u, N = EA u′) or torsion (θ, T = GJ θ′). Writing S(x) for the stiffness
 * (EA or GJ) and I(x) for the inertia per length (ρA or ρIp), every family solves
 *   (S y′)′ + ω² I y = 0,   F = S y′,
 * with S = S₀ s^p, I = I₀ s^p, s = 1 + a x (a solid cone: diameter linear in x; s ≡ 1 for a
 * prismatic member). The wave speed c = √(S₀/I₀) is constant; k = ω/c, θ = kL, β = aL,
 * σ = 1 + β = d_end/d_start.
 *
 * p = 2 (axial cone, A ∝ d²): y = w/s turns the equation into w″ + k²w = 0 (the Webster horn
 *   equation; L. E. Kinsler et al., Fundamentals of Acoustics, horns, from memory).
 * p = 4 (torsion of a solid cone, J = Ip ∝ d⁴): in the apex coordinate r = x + 1/a the
 *   equation is θ″ + (4/r)θ′ + k²θ = 0, and θ = z/r turns it into the spherical Bessel
 *   equation of order 1, so θ = j₁(kr)/r, y₁(kr)/r with j₁(z) = sin z/z² − cos z/z,
 *   y₁(z) = −cos z/z² − sin z/z (M. Abramowitz & I. A. Stegun, Handbook of Mathematical
 *   Functions, §10.1, from memory). Re-combined about x = 0 these are
 *   y = [C(s cos kx − (a/k) sin kx) + D((a/k) cos kx + s sin kx)]/s³.
 *
 * The transfer matrix carries (y, F) from x = 0 to x = L. Its entries are written with
 *   sinc θ = sin θ/θ,  h(θ) = j₁(θ)/θ = (sin θ − θ cos θ)/θ³,  m(θ) = j₂(θ)/θ²,
 * evaluated by their series for small θ, so that every entry keeps its relative accuracy as
 * ω → 0: T₂₁ = −ω² × (inertia) there, the term a near-rigid mode turns on. (Written the
 * plain way, T₂₁ is a difference of O(S₀a²L) terms and loses everything below ε/θ².)
 *   p = 2: T₁₁ = (cos θ + β sinc θ)/σ          T₁₂ = L sinc θ/(S₀σ)
 *          T₂₁ = −S₀k²L (σ sinc θ + β² h)        T₂₂ = cos θ − βθ² h
 *   p = 4: T₁₁ = (σ cos θ + β(2 + 3β) sinc θ + 3β³ h)/σ³
 *          T₁₂ = L (σ sinc θ + β² h)/(S₀σ³)
 *          T₂₁ = −S₀k²L (σ² sinc θ + 3β²σ h + 3β⁴ m)
 *          T₂₂ = sinc θ − σ²θ² h − β³θ² m
 * det T = 1 (the equation is self-adjoint), and the member's dynamic stiffness (end forces
 * from end displacements) is D = (1/T₁₂) [[T₁₁, −1], [−1, T₂₂]]. The member's frequencies
 * with both ends held are the zeros of T₁₂: kL = nπ for p = 2, and for p = 4 the roots of
 * tan θ = β²θ / (σθ² + β²), one in each [nπ, nπ + π/2), n ≥ 1.
 */

/** Power of the diameter that stiffness and inertia follow along a solid cone. */
export type TaperPower = 2 | 4

export interface ExactMember {
  readonly length: number
  /** S₀: stiffness at the start, EA (N) or GJ (N·m²). */
  readonly startStiffness: number
  /** I₀: inertia per length at the start, ρA (kg/m) or ρIp (kg·m). */
  readonly startInertia: number
  /** 1 for a prismatic member; d_end / d_start for a solid cone. */
  readonly diameterRatio: number
  /** 2: axial (A ∝ d²); 4: torsion (J, Ip ∝ d⁴). Irrelevant when diameterRatio is 1. */
  readonly taperPower: TaperPower
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

export type TransferMatrix = [number, number, number, number]

export function waveSpeed(member: ExactMember): number {
  return Math.sqrt(member.startStiffness / member.startInertia)
}

/** s(x)^p: stiffness and inertia at x relative to the start. */
export function taperFactor(member: ExactMember, x: number): number {
  const s = 1 + (member.diameterRatio - 1) * (x / member.length)
  return member.taperPower === 4 ? s * s * s * s : s * s
}

/** Stiffness S(x) (EA or GJ) at x along a member. */
export function memberStiffnessAt(member: ExactMember, x: number): number {
  return member.startStiffness * taperFactor(member, x)
}

/** Inertia per length I(x) (ρA or ρIp) at x along a member. */
export function memberInertiaAt(member: ExactMember, x: number): number {
  return member.startInertia * taperFactor(member, x)
}

/** sin θ / θ. */
export function sinc(theta: number): number {
  // No cancellation here (sin θ keeps its relative accuracy as θ → 0): only 0/0 needs care.
  return theta === 0 ? 1 : Math.sin(theta) / theta
}

/**
 * Coefficients of j_n(θ)/θⁿ = Σ c_k θ^{2k}, c_k = (−½)^k / (k! (2n + 2k + 1)!!)
 * (Abramowitz & Stegun 10.1.2, from memory), as many as the ranges below need for round-off.
 */
function besselSeriesCoefficients(order: 1 | 2, terms: number): number[] {
  const out = [order === 1 ? 1 / 3 : 1 / 15]
  for (let k = 1; k < terms; k++) out.push((out[k - 1] * -0.5) / (k * (2 * order + 2 * k + 1)))
  return out
}
const H_SERIES = besselSeriesCoefficients(1, 9) // |θ| < 1: the next term is below 4e-19
const M_SERIES = besselSeriesCoefficients(2, 13) // |θ| < 2: the next term is below 1e-23

function evenSeries(coefficients: readonly number[], theta: number): number {
  const t2 = theta * theta
  let sum = coefficients[coefficients.length - 1]
  for (let k = coefficients.length - 2; k >= 0; k--) sum = sum * t2 + coefficients[k]
  return sum
}

/** h(θ) = j₁(θ)/θ = (sin θ − θ cos θ)/θ³; 1/3 at θ = 0. The closed form loses ~3ε/θ², so the series below 1. */
export function besselRatio1(theta: number): number {
  if (Math.abs(theta) < 1) return evenSeries(H_SERIES, theta)
  return (Math.sin(theta) - theta * Math.cos(theta)) / (theta * theta * theta)
}

/** m(θ) = j₂(θ)/θ² = ((3 − θ²) sin θ − 3θ cos θ)/θ⁵; 1/15 at θ = 0. The closed form loses ~45ε/θ⁴, so the series below 2. */
export function besselRatio2(theta: number): number {
  if (Math.abs(theta) < 2) return evenSeries(M_SERIES, theta)
  const t2 = theta * theta
  return ((3 - t2) * Math.sin(theta) - 3 * theta * Math.cos(theta)) / (t2 * t2 * theta)
}

/** Transfer matrix [T11, T12, T21, T22] from (y, F) at x = 0 to x = L. */
export function memberTransferMatrix(member: ExactMember, omega: number): TransferMatrix {
  const { length: L, startStiffness: S0 } = member
  const k = omega / waveSpeed(member)
  const theta = k * L
  const c = Math.cos(theta)
  const sn = sinc(theta)
  const beta = member.diameterRatio - 1
  if (beta === 0) return [c, (L * sn) / S0, -S0 * k * k * L * sn, c]
  const sigma = member.diameterRatio
  const h = besselRatio1(theta)
  const t2 = theta * theta
  if (member.taperPower === 2) {
    return [(c + beta * sn) / sigma, (L * sn) / (S0 * sigma), -S0 * k * k * L * (sigma * sn + beta * beta * h), c - beta * t2 * h]
  }
  const m = besselRatio2(theta)
  const sigma3 = sigma * sigma * sigma
  const b2 = beta * beta
  return [
    (sigma * c + beta * (2 + 3 * beta) * sn + 3 * b2 * beta * h) / sigma3,
    (L * (sigma * sn + b2 * h)) / (S0 * sigma3),
    -S0 * k * k * L * (sigma * sigma * sn + 3 * b2 * sigma * h + 3 * b2 * b2 * m),
    sn - sigma * sigma * t2 * h - b2 * beta * t2 * m,
  ]
}

export function memberDynamicStiffness(member: ExactMember, omega: number): MemberStiffness {
  const [T11, T12, , T22] = memberTransferMatrix(member, omega)
  return { d11: T11 / T12, d12: -1 / T12, d22: T22 / T12 }
}

/**
 * The member's frequencies with both ends held that lie strictly below ω, given its T₁₂(ω).
 * The n-th zero of T₁₂ lies in [nπ, nπ + π/2) (p = 2: at nπ), so on the branch
 * (nπ − π/2, nπ + π/2] that holds θ the count is n − 1, plus one once θ is past that zero:
 * there the sign of T₁₂ is (−1)ⁿ. Taking the sign from the same T₁₂ that the pivots use keeps
 * the Wittrick–Williams sum consistent where T₁₂ rounds to the wrong side of a zero.
 */
export function clampedMemberCount(member: ExactMember, omega: number, t12 = memberTransferMatrix(member, omega)[1]): number {
  const theta = (omega * member.length) / waveSpeed(member)
  const branch = Math.round(theta / Math.PI)
  if (branch === 0) return 0
  const past = branch % 2 === 0 ? t12 > 0 : t12 < 0
  return branch - 1 + (past ? 1 : 0)
}
