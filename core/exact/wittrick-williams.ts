/**
 * Exact natural frequencies of a station–member chain, with none missed: the
 * Wittrick–Williams count J(ω) = Σ J_member(ω) + s{D(ω)} of natural frequencies below ω,
 * where J_member counts each member's clamped–clamped frequencies below ω and s{D} is
 * the number of negative pivots of the assembled dynamic stiffness at the stations
 * (W. H. Wittrick & F. W. Williams, Q. J. Mech. Appl. Math. 24 (1971) 263–284, from memory).
 * The n-th frequency is the point where J steps from n − 1 to n. Bisection on J isolates it;
 * close to a root the pivots cancel (their signs are unreliable within ~√ε of it), so the last
 * digits come from the sign of the shooting function below, which is smooth there.
 */
import { clampedMemberCount, memberDynamicStiffness, memberTransferMatrix, type ExactMember } from './transfer-matrix'

export interface StationChain {
  /** Members between consecutive stations: members.length + 1 stations. */
  readonly members: readonly ExactMember[]
  /** Grounded stiffness (N/m) and point mass (kg) at each station. */
  readonly stationStiffness: readonly number[]
  readonly stationMass: readonly number[]
  readonly fixedStart: boolean
  readonly fixedEnd: boolean
}

/** J(ω): the number of natural frequencies strictly below ω (ω > 0, rad/s). */
export function frequenciesBelow(chain: StationChain, omega: number): number {
  const stations = chain.members.length + 1
  let count = 0
  for (const member of chain.members) count += clampedMemberCount(member, omega)
  const diagonal = new Float64Array(stations)
  const off = new Float64Array(stations)
  for (let s = 0; s < stations; s++) diagonal[s] = chain.stationStiffness[s] - omega * omega * chain.stationMass[s]
  chain.members.forEach((member, i) => {
    const d = memberDynamicStiffness(member, omega)
    diagonal[i] += d.d11
    diagonal[i + 1] += d.d22
    off[i] = d.d12
  })
  const first = chain.fixedStart ? 1 : 0
  const last = chain.fixedEnd ? stations - 2 : stations - 1
  let previousPivot = 0
  let previousOff = 0
  for (let s = first; s <= last; s++) {
    let pivot = diagonal[s] - (s > first ? (previousOff * previousOff) / previousPivot : 0)
    if (pivot === 0 || !Number.isFinite(pivot)) pivot = -Number.MIN_VALUE
    if (pivot < 0) count++
    previousPivot = pivot
    previousOff = off[s]
  }
  return count
}

/** A free–free chain without springs has a rigid-body mode at ω = 0. */
export function hasRigidBodyMode(chain: StationChain): boolean {
  return !chain.fixedStart && !chain.fixedEnd && chain.stationStiffness.every((k) => k === 0)
}

/**
 * Shooting function: the state (u, N) carried from the start through every member
 * (transfer matrices) and station (N⁺ = N⁻ + (k − mω²)u), started from the start's boundary
 * condition; its value is the end's boundary quantity (N at a free end, u at a fixed one),
 * which vanishes exactly at the natural frequencies and changes sign through each of them.
 */
export function endResidual(chain: StationChain, omega: number): number {
  const w2 = omega * omega
  let u = chain.fixedStart ? 0 : 1
  let n = chain.fixedStart ? 1 : (chain.stationStiffness[0] - w2 * chain.stationMass[0]) * u
  chain.members.forEach((member, i) => {
    const [t11, t12, t21, t22] = memberTransferMatrix(member, omega)
    const uNext = t11 * u + t12 * n
    const nNext = t21 * u + t22 * n + (chain.stationStiffness[i + 1] - w2 * chain.stationMass[i + 1]) * uNext
    // Positive rescaling keeps the state finite without changing any sign.
    const scale = Math.abs(uNext) + Math.abs(nNext) / (member.youngsModulus * member.startArea * (1 + omega))
    u = scale > 0 ? uNext / scale : uNext
    n = scale > 0 ? nNext / scale : nNext
  })
  return chain.fixedEnd ? u : n
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
    // Isolate with the count, stopping well before the pivots' round-off zone.
    for (let i = 0; i < 300 && hi - a > 1e-6 * hi; i++) {
      const mid = 0.5 * (a + hi)
      if (frequenciesBelow(chain, mid) >= index) hi = mid
      else a = mid
    }
    // Counts are unreliable within ~1e-8 of a root, so an end may sit on the wrong side of it:
    // widen by a margin larger than that zone before looking for the sign change.
    const root = refineRoot(chain, a, hi) ?? refineRoot(chain, a * (1 - 4e-6), hi * (1 + 4e-6)) ?? countBisection(chain, a, hi, index)
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

/** Fallback: bisection on the count alone (good to about √ε relative). */
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
    slowest = Math.min(slowest, Math.sqrt(m.youngsModulus / m.density))
  }
  return (Math.PI * slowest) / total / 8
}
