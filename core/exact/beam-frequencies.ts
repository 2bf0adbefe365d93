/**
 * Exact natural frequencies of a beam chain, none missed: the n-th frequency is where the
 * Wittrick–Williams count J(ω) (beam-wittrick-williams.ts) steps from n − 1 to n. Bisection on J
 * isolates it (J(a) = n − 1, J(b) = n: one simple root in (a, b)); then, with the pieces held
 * fixed over [a, b], Brent's method on the end's boundary determinant, which changes sign
 * exactly there, takes it to a few ulps (optimize/brent-root.ts). Roots closer together than the
 * count can separate (a few ulps) are returned as one value, repeated as often as the count
 * steps within 1e-12 of it.
 * Zero-frequency rigid-body modes come first (beam-rigid-body-modes.ts); a compression at or
 * above the buckling load is refused (beam-buckling.ts).
 */
import { checkBeamChain, type BeamChain } from './beam-chain'
import { brentRoot } from '../optimize/brent-root'
import { beamCriticalCompression } from './beam-buckling'
import { beamRigidBodyModes } from './beam-rigid-body-modes'
import { beamPieces, beamSweep } from './beam-wittrick-williams'

const MAX_STEPS = 4000
/** Roots within this relative distance are one repeated root. */
const CLUSTER_WIDTH = 1e-12

/** Lowest `count` natural angular frequencies (rad/s) ascending, rigid-body zeros first. Throws a RangeError with a clear message if the part is unstable (compression at/above its buckling load). */
export function exactBeamAngularFrequencies(chain: BeamChain, count: number): number[] {
  checkBeamChain(chain)
  if (!(Number.isInteger(count) && count >= 0)) throw new RangeError(`count must be a whole number ≥ 0; got ${count}`)
  if (chain.axialForce < 0) {
    const critical = beamCriticalCompression(chain)
    if (-chain.axialForce >= critical) {
      throw new RangeError(
        `axialForce: a compression of ${formatNewtons(-chain.axialForce)} is at or above the buckling load of the part with these supports, ` +
          `${formatNewtons(critical)}${critical === 0 ? ' (a rotation the supports leave free is unstable under any compression)' : ''}; ` +
          'the part has no natural frequencies there',
      )
    }
  }
  const rigid = beamRigidBodyModes(chain)
  const out: number[] = []
  for (let i = 0; i < Math.min(rigid, count); i++) out.push(0)
  const countBelow = (omega: number) => beamSweep(chain, omega, beamPieces(chain, omega)).count
  // Points where J has been evaluated (never at a root, where the count is not defined): J(lower)
  // ≤ index − 1; J(upper) ≥ index. J(0⁺) is the rigid-body count, but ω = 0 is never a bracket end.
  let lower: Probe = { omega: 0, count: rigid }
  let upper = null as Probe | null
  let index = rigid + 1
  while (index <= count) {
    if (upper === null || upper.count < index) {
      let b = lower.omega > 0 ? lower.omega * 1.5 : lowestScale(chain)
      let jb = countBelow(b)
      for (let step = 0; jb < index; step++) {
        if (step > MAX_STEPS) throw new RangeError(`exact beam reference: natural frequency ${index} not found below ${b} rad/s`)
        lower = { omega: b, count: jb }
        b *= 2
        jb = countBelow(b)
      }
      upper = { omega: b, count: jb }
    }
    const bracket = isolate(lower, upper, index, countBelow)
    if (bracket.isolated) {
      out.push(refine(chain, bracket.lower, bracket.upper, index, countBelow))
      // The next search starts from the evaluated point just found above this root.
      lower = bracket.upper
      upper = null
      index++
      continue
    }
    // Roots closer than the count can separate (a repeated root): one value for each, as many as
    // the count says lie within CLUSTER_WIDTH of it (beyond the few ulps where counts are unsure).
    const centre = 0.5 * (bracket.lower.omega + bracket.upper.omega)
    const above = { omega: centre * (1 + CLUSTER_WIDTH), count: countBelow(centre * (1 + CLUSTER_WIDTH)) }
    const last = Math.min(count, Math.max(index, above.count))
    for (; index <= last; index++) out.push(centre)
    lower = above
    upper = null
  }
  return out
}

interface Probe {
  readonly omega: number
  readonly count: number
}

/**
 * Shrinks [lower, upper] until J(lower) = index − 1 and J(upper) = index with lower > 0
 * (isolated), or until it is a few ulps wide around a cluster of roots (not isolated).
 */
function isolate(lower0: Probe, upper0: Probe, index: number, countBelow: (omega: number) => number): { lower: Probe; upper: Probe; isolated: boolean } {
  let lower = lower0
  let upper = upper0
  for (let step = 0; !(lower.omega > 0 && lower.count === index - 1 && upper.count === index); step++) {
    const a = lower.omega
    const b = upper.omega
    if (b - a <= 4 * Number.EPSILON * b || step > MAX_STEPS) return { lower, upper, isolated: false }
    const mid = a === 0 ? b / 16 : b > 4 * a ? Math.sqrt(a * b) : 0.5 * (a + b)
    const probe = { omega: mid, count: countBelow(mid) }
    if (probe.count >= index) upper = probe
    else lower = probe
  }
  return { lower, upper, isolated: true }
}

/** The one simple root in (lower, upper): Brent on the end's boundary determinant with the pieces held fixed. */
function refine(chain: BeamChain, lower: Probe, upper: Probe, index: number, countBelow: (omega: number) => number): number {
  const pieces = beamPieces(chain, upper.omega)
  const residual = (omega: number) => beamSweep(chain, omega, pieces).residual
  const fa = residual(lower.omega)
  const fb = residual(upper.omega)
  if (fa * fb <= 0) return brentRoot(residual, lower.omega, upper.omega, 0, 300, { fa, fb })
  // Not expected (one simple root lies between); fall back to the count alone.
  return countBisection(lower.omega, upper.omega, index, countBelow)
}

function countBisection(a0: number, b0: number, index: number, countBelow: (omega: number) => number): number {
  let a = a0
  let b = b0
  for (let i = 0; i < 200; i++) {
    const mid = 0.5 * (a + b)
    if (mid <= a || mid >= b) break
    if (countBelow(mid) >= index) b = mid
    else a = mid
  }
  return 0.5 * (a + b)
}

/** A frequency of the order of the part's lowest bending frequency: √(EI/ρA)/L² with the softest member and the whole length. */
function lowestScale(chain: BeamChain): number {
  let length = 0
  let slowest = Infinity
  for (const m of chain.members) {
    length += m.length
    slowest = Math.min(slowest, Math.sqrt(m.bendingStiffness / m.massPerLength))
  }
  return slowest / (length * length)
}

function formatNewtons(value: number): string {
  return `${Number(value.toPrecision(6))} N`
}
