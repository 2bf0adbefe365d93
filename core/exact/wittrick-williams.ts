/**
 * Exact natural frequencies of a station–member chain, with none missed: the
 * Wittrick–Williams count J(ω) = Σ J_member(ω) + s{D(ω)} of natural frequencies below ω,
 * where J_member counts each member's clamped–clamped frequencies below ω and s{D} is
 * the number of negative pivots of the assembled dynamic stiffness at the stations
 * (W. H. Wittrick & F. W. Williams, Q. J. Mech. Appl. Math. 24 (1971) 263–284, from memory).
 *
 * The pivots are not formed by eliminating D: a member's dynamic stiffness is of order S/L
 * while a soft spring or a near-rigid mode lives in the difference k − ω²m, so elimination
 * loses every digit of it (a free–free bar on a 1e-6 N/m spring came out 1.2e-3 low). Instead
 * the state (y, F) is carried from the start's boundary condition through the members (their
 * transfer matrices) and stations (F⁺ = F⁻ + (k − mω²) y): after eliminating every station
 * before s, the reduced stiffness at s is F⁺_s / y_s, so its pivot is
 *   F⁺_s/y_s + T₁₁/T₁₂ = y_{s+1} / (y_s T₁₂)      (member s from station s to s + 1),
 * and F⁺/y at a free end. Only signs are needed, and each comes from quantities the shooting
 * computes to full relative accuracy.
 * The n-th frequency is the point where J steps from n − 1 to n: bisection on J isolates it,
 * and the last digits come from the sign of the shooting function, which is smooth there.
 */
import { clampedMemberCount, memberTransferMatrix, type ExactMember } from './transfer-matrix'

export interface StationChain {
  /** Members between consecutive stations: members.length + 1 stations. */
  readonly members: readonly ExactMember[]
  /** Grounded stiffness at each station: N/m (axial) or N·m/rad (torsion). */
  readonly stationStiffness: readonly number[]
  /** Inertia at each station: a point mass in kg (axial) or a disk's polar inertia in kg·m² (torsion). */
  readonly stationMass: readonly number[]
  readonly fixedStart: boolean
  readonly fixedEnd: boolean
}

/**
 * J(ω) from one pass from start to end, or −1 when a pivot or a T₁₂ is exactly zero (ω sits
 * on a sub-chain's own frequency). The state is rescaled by a positive factor after every
 * member, which changes no sign.
 */
function countFromShooting(chain: StationChain, omega: number): number {
  const w2 = omega * omega
  const members = chain.members
  let y = chain.fixedStart ? 0 : 1
  let f = chain.fixedStart ? 1 : chain.stationStiffness[0] - w2 * chain.stationMass[0]
  let count = 0
  for (let i = 0; i < members.length; i++) {
    const member = members[i]
    const [t11, t12, t21, t22] = memberTransferMatrix(member, omega)
    const yNext = t11 * y + t12 * f
    const fNext = t21 * y + t22 * f + (chain.stationStiffness[i + 1] - w2 * chain.stationMass[i + 1]) * yNext
    count += clampedMemberCount(member, omega, t12)
    // Station i is an unknown unless it is a fixed start; its pivot is yNext/(y t12).
    if (!(i === 0 && chain.fixedStart)) {
      if (y === 0 || yNext === 0 || t12 === 0) return -1
      if (yNext < 0 !== y < 0 !== t12 < 0) count++
    }
    const scale = Math.abs(yNext) + Math.abs(fNext) / (member.startStiffness * (1 + omega))
    y = yNext / scale
    f = fNext / scale
  }
  if (!chain.fixedEnd) {
    // The free end is an unknown too; its pivot is F⁺/y.
    if (y === 0 || f === 0) return -1
    if (f < 0 !== y < 0) count++
  }
  return count
}

/** J(ω): the number of natural frequencies strictly below ω (ω > 0, rad/s). */
export function frequenciesBelow(chain: StationChain, omega: number): number {
  // J is continuous from the left, so a probe that lands exactly on a zero pivot (a member's
  // or a sub-chain's own frequency) is moved down by a few ulps.
  let probe = omega
  for (let attempt = 0; attempt < 8; attempt++) {
    const count = countFromShooting(chain, probe)
    if (count >= 0) return count
    probe = probe * (1 - 4 * Number.EPSILON)
  }
  throw new RangeError(`the frequency count cannot be evaluated at ω = ${omega} rad/s`)
}

/** A free–free chain without springs has a rigid-body mode at ω = 0. */
export function hasRigidBodyMode(chain: StationChain): boolean {
  return !chain.fixedStart && !chain.fixedEnd && chain.stationStiffness.every((k) => k === 0)
}

/**
 * Shooting function: the state (y, F) carried from the start's boundary condition through
 * every member and station; its value is the end's boundary quantity (F at a free end, y at
 * a fixed one), which vanishes exactly at the natural frequencies and changes sign through
 * each of them (they are simple: a second-order problem with separated end conditions).
 */
export function endResidual(chain: StationChain, omega: number): number {
  const w2 = omega * omega
  const members = chain.members
  let y = chain.fixedStart ? 0 : 1
  let f = chain.fixedStart ? 1 : chain.stationStiffness[0] - w2 * chain.stationMass[0]
  for (let i = 0; i < members.length; i++) {
    const member = members[i]
    const [t11, t12, t21, t22] = memberTransferMatrix(member, omega)
    const yNext = t11 * y + t12 * f
    const fNext = t21 * y + t22 * f + (chain.stationStiffness[i + 1] - w2 * chain.stationMass[i + 1]) * yNext
    // Positive rescaling keeps the state finite without changing any sign.
    const scale = Math.abs(yNext) + Math.abs(fNext) / (member.startStiffness * (1 + omega))
    y = scale > 0 ? yNext / scale : yNext
    f = scale > 0 ? fNext / scale : fNext
  }
  return chain.fixedEnd ? y : f
}

/** The lowest `count` natural frequencies in rad/s (0 first for a rigid-body mode). */
export function exactAngularFrequencies(chain: StationChain, count: number): number[] {
  const out: number[] = []
  let index = 1
  if (hasRigidBodyMode(chain)) {
    out.push(0)
    index++
  }
  let lo = 0
  let probe = initialProbe(chain)
  while (out.length < count) {
    let hi = Math.max(probe, lo * 1.5)
    for (let i = 0; i < 200 && frequenciesBelow(chain, hi) < index; i++) hi *= 2
    let a = lo
    // Isolate the index-th frequency alone in [a, hi] with the count…
    for (let i = 0; i < 300 && hi - a > 1e-6 * hi; i++) {
      const mid = 0.5 * (a + hi)
      if (frequenciesBelow(chain, mid) >= index) hi = mid
      else a = mid
    }
    // …then find it by the sign of the shooting function, which changes there and only there.
    const root = refineRoot(chain, a, hi) ?? countBisection(chain, a, hi, index)
    out.push(root)
    // Below the root, fewer than `index` frequencies: a valid lower end for the next search.
    lo = Math.min(a, root)
    probe = root * 1.2
    index++
  }
  return out
}

/** Bisection on the sign of the shooting function, when it changes sign over [a, b]. */
function refineRoot(chain: StationChain, a: number, b: number): number | null {
  let fa = endResidual(chain, a)
  const fb = endResidual(chain, b)
  if (!(fa * fb < 0)) return null
  let lo = a
  let hi = b
  for (let i = 0; i < 200 && hi - lo > 2e-16 * hi; i++) {
    const mid = 0.5 * (lo + hi)
    if (mid <= lo || mid >= hi) break
    const fm = endResidual(chain, mid)
    if (fm === 0) return mid
    if (fm * fa < 0) hi = mid
    else {
      lo = mid
      fa = fm
    }
  }
  return 0.5 * (lo + hi)
}

/** Fallback where the residual is exactly zero at an end of the bracket: bisection on the count alone. */
function countBisection(chain: StationChain, a: number, b: number, index: number): number {
  let lo = a
  let hi = b
  for (let i = 0; i < 300 && hi - lo > 2e-16 * hi; i++) {
    const mid = 0.5 * (lo + hi)
    if (mid <= lo || mid >= hi) break
    if (frequenciesBelow(chain, mid) >= index) hi = mid
    else lo = mid
  }
  return 0.5 * (lo + hi)
}

/** A frequency below the lowest mode's order of magnitude: the slowest member's first clamped frequency / 8. */
function initialProbe(chain: StationChain): number {
  let total = 0
  let slowest = Infinity
  for (const m of chain.members) {
    total += m.length
    slowest = Math.min(slowest, Math.sqrt(m.startStiffness / m.startInertia))
  }
  return (Math.PI * slowest) / total / 8
}
