/**
 * Exact mode shapes of a station–member chain at a natural frequency, and the energy
 * integrals of each member: the state (u, N) is carried from the start's boundary
 * condition through members (transfer-matrix.ts) and stations, and inside a member
 * u(x), N(x) come from the transfer matrix of the member's first x metres. The integrals
 * ∫ EA u′² dx = ∫ N²/(EA) dx and ∫ ρA u² dx use Gauss–Legendre rules on pieces short
 * enough (k·h ≤ ½) that the smooth trigonometric integrands are integrated to round-off.
 */
import { gaussLegendreRule } from '../fe/gauss-legendre'
import { memberTransferMatrix, waveSpeed, type ExactMember } from './transfer-matrix'
import type { StationChain } from './wittrick-williams'

export interface MemberState {
  /** State at the member's start (just after the station's jump). */
  readonly u0: number
  readonly n0: number
}

export interface ExactModeShape {
  readonly omega: number
  /** Displacement at each station. */
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

/** Area at x along a member (solid cone: diameter linear in x). */
export function memberArea(member: ExactMember, x: number): number {
  const r = 1 + (member.diameterRatio - 1) * (x / member.length)
  return member.startArea * r * r
}

/** u and N at x along a member, from its start state. */
export function memberStateAt(member: ExactMember, start: MemberState, omega: number, x: number): { u: number; n: number } {
  if (x === 0) return { u: start.u0, n: start.n0 }
  const [t11, t12, t21, t22] = memberTransferMatrix(memberPart(member, x), omega)
  return { u: t11 * start.u0 + t12 * start.n0, n: t21 * start.u0 + t22 * start.n0 }
}

/**
 * ∫ w(x) f(u, N, A) dx over a member by composite Gauss–Legendre, where the integrand is
 * given as a function of the local state; w is folded into `integrand`.
 */
export function integrateOverMember(
  member: ExactMember,
  start: MemberState,
  omega: number,
  integrand: (x: number, u: number, n: number, area: number) => number,
): number {
  const k = omega / waveSpeed(member)
  const pieces = Math.max(1, Math.ceil((k * member.length) / 0.5))
  const rule = gaussLegendreRule(10)
  const h = member.length / pieces
  let sum = 0
  for (let p = 0; p < pieces; p++) {
    for (let g = 0; g < rule.points.length; g++) {
      const x = h * (p + (rule.points[g] + 1) / 2)
      const { u, n } = memberStateAt(member, start, omega, x)
      sum += (rule.weights[g] * h * integrand(x, u, n, memberArea(member, x))) / 2
    }
  }
  return sum
}
