/**
 * Exact mode shapes of a station–member chain at a natural frequency, and the energy
 * integrals of each member: the state (y, F) is carried from the start's boundary
 * condition through members (transfer-matrix.ts) and stations, and inside a member
 * y(x), F(x) come from the transfer matrix of the member's first x metres. The integrals
 * ∫ S y′² dx = ∫ F²/S dx and ∫ I y² dx (S = EA or GJ, I = ρA or ρIp) use Gauss–Legendre
 * rules on pieces short enough (k·h ≤ ½, and a cone's s varying by at most half) that the
 * smooth integrands are integrated to round-off.
 */
import { gaussLegendreRule } from '../fe/gauss-legendre'
import { memberInertiaAt, memberStiffnessAt, memberTransferMatrix, waveSpeed, type ExactMember } from './transfer-matrix'
import type { StationChain } from './wittrick-williams'

export interface MemberState {
  /** State at the member's start (just after the station's jump): displacement or twist, and force or torque. */
  readonly u0: number
  readonly n0: number
}

export interface ExactModeShape {
  readonly omega: number
  /** Displacement (or twist) at each station. */
  readonly stationDisplacement: number[]
  readonly members: MemberState[]
}

/** The mode shape at ω (a natural frequency of the chain), up to a factor. */
export function exactModeShape(chain: StationChain, omega: number): ExactModeShape {
  const w2 = omega * omega
  let u = chain.fixedStart ? 0 : 1
  let n = chain.fixedStart ? 1 : (chain.stationStiffness[0] - w2 * chain.stationMass[0]) * u
  const stationDisplacement = [u]
  const members: MemberState[] = []
  chain.members.forEach((member, i) => {
    members.push({ u0: u, n0: n })
    const [t11, t12, t21, t22] = memberTransferMatrix(member, omega)
    const uNext = t11 * u + t12 * n
    n = t21 * u + t22 * n + (chain.stationStiffness[i + 1] - w2 * chain.stationMass[i + 1]) * uNext
    u = uNext
    stationDisplacement.push(u)
  })
  return { omega, stationDisplacement, members }
}

/** The first x metres of a member, as a member of its own. */
function memberPart(member: ExactMember, x: number): ExactMember {
  const ratioAtX = 1 + (member.diameterRatio - 1) * (x / member.length)
  return { ...member, length: x, diameterRatio: ratioAtX }
}

/** y and F at x along a member, from its start state. */
export function memberStateAt(member: ExactMember, start: MemberState, omega: number, x: number): { u: number; n: number } {
  if (x === 0) return { u: start.u0, n: start.n0 }
  const [t11, t12, t21, t22] = memberTransferMatrix(memberPart(member, x), omega)
  return { u: t11 * start.u0 + t12 * start.n0, n: t21 * start.u0 + t22 * start.n0 }
}

/**
 * ∫ f(x, y, F, S, I) dx over a member by composite Gauss–Legendre, where S and I are the
 * member's stiffness and inertia per length at x.
 */
export function integrateOverMember(
  member: ExactMember,
  start: MemberState,
  omega: number,
  integrand: (x: number, u: number, n: number, stiffness: number, inertia: number) => number,
): number {
  const k = omega / waveSpeed(member)
  // A cone's integrands carry powers of 1/s, s = 1 + βx/L, singular at the apex beyond the
  // small end: pieces whose change of s is at most half of s keep that pole far outside each
  // piece's Bernstein ellipse, so the 10-point rule still converges to round-off.
  const beta = Math.abs(member.diameterRatio - 1)
  const taperPieces = Math.ceil((2 * beta) / Math.min(1, member.diameterRatio))
  const pieces = Math.max(1, Math.ceil((k * member.length) / 0.5), taperPieces)
  const rule = gaussLegendreRule(10)
  const h = member.length / pieces
  let sum = 0
  for (let p = 0; p < pieces; p++) {
    for (let g = 0; g < rule.points.length; g++) {
      const x = h * (p + (rule.points[g] + 1) / 2)
      const { u, n } = memberStateAt(member, start, omega, x)
      sum += (rule.weights[g] * h * integrand(x, u, n, memberStiffnessAt(member, x), memberInertiaAt(member, x))) / 2
    }
  }
  return sum
}

export interface ModeEnergies {
  readonly shape: ExactModeShape
  /** Per member: ∫ S y′² dx (twice the strain energy) and ∫ I y² dx (twice the kinetic energy over ω²). */
  readonly strain: number[]
  readonly kinetic: number[]
  /** ∫ I y² dx over the members plus Σ m y² over the stations: the Rayleigh quotient's denominator. */
  readonly denominator: number
}

/** The energy integrals of the mode at ω, for Rayleigh's quotient and its derivatives. */
export function modeEnergies(chain: StationChain, omega: number): ModeEnergies {
  const shape = exactModeShape(chain, omega)
  const strain: number[] = []
  const kinetic: number[] = []
  let denominator = 0
  chain.members.forEach((member, i) => {
    const start = shape.members[i]
    strain.push(integrateOverMember(member, start, omega, (_x, _u, n, stiffness) => (n * n) / stiffness))
    kinetic.push(integrateOverMember(member, start, omega, (_x, u, _n, _stiffness, inertia) => inertia * u * u))
    denominator += kinetic[i]
  })
  shape.stationDisplacement.forEach((u, s) => (denominator += chain.stationMass[s] * u * u))
  return { shape, strain, kinetic, denominator }
}
