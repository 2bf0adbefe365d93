/**
 * The lowest buckling load of a beam chain under a compressive axial force Q, by the same
 * Wittrick–Williams count on the static problem (ω = 0, P = −Q): the number of buckling loads
 * below Q is s{K(Q)} + Σ J₀, with each member cut into pieces whose clamped–clamped buckling
 * load 4π²EI/ℓ² lies above Q so that J₀ = 0 (W. H. Wittrick & F. W. Williams, Q. J. Mech. Appl.
 * Math. 24 (1971) 263–284, from memory: the count holds for any parameter on which the member
 * stiffnesses depend monotonically, the load as well as the frequency). Bisection on that count
 * isolates the load, Brent's method on the end's boundary determinant refines it.
 *
 * Rigid motions: a free rotation is unstable under any compression (the load is 0). A free
 * translation carries neither strain nor ½∫P w′² energy, so holding w at the start leaves
 * every buckling load as it was (the constraint's reaction vanishes on a buckling mode, since
 * the translation is a null vector of both the elastic and the geometric stiffness); with it
 * held the elastic stiffness is positive definite and the count starts from 0 at Q = 0.
 * Masses and inertias play no part. An upper bound: a clamped–clamped buckling shape on any
 * one member, zero elsewhere, is admissible for every support, so Q₁ ≤ minᵢ 4π²EIᵢ/ℓᵢ².
 */
import { checkBeamChain, type BeamChain } from './beam-chain'
import { brentRoot } from '../optimize/brent-root'
import { rigidMotionsLeftFree } from './beam-rigid-body-modes'
import { beamPieces, beamSweep } from './beam-wittrick-williams'

/** The compressive axial force magnitude (N) at which the part, with these supports, buckles (lowest critical load). 0 when a rigid-body motion left free by the supports is unstable under any compression (e.g. a free rotation); Infinity never for a supported part. Masses and inertias play no part. */
export function beamCriticalCompression(chain: BeamChain): number {
  checkBeamChain(chain)
  const free = rigidMotionsLeftFree(chain, false)
  if (free.rotation) return 0
  // A free translation (then the start is free or guided): hold w at the start.
  const start = free.translation ? (chain.start === 'free' ? 'pinned' : 'clamped') : chain.start
  const held: BeamChain = { ...chain, start }
  const at = (q: number): BeamChain => ({ ...held, axialForce: -q })
  const countBelow = (q: number) => beamSweep(at(q), 0, beamPieces(at(q), 0)).count

  let upper = Infinity
  for (const m of chain.members) upper = Math.min(upper, (4 * Math.PI * Math.PI * m.bendingStiffness) / (m.length * m.length))
  let a = 0
  let b = upper * (1 + 1e-6)
  let ja = 0
  let jb = countBelow(b)
  if (jb < 1) throw new RangeError(`exact beam reference: no buckling load found below the bound ${b} N (internal error)`)
  for (let step = 0; !(ja === 0 && jb === 1); step++) {
    if (b - a <= 4 * Number.EPSILON * b || step > 4000) return 0.5 * (a + b)
    const mid = a === 0 ? b / 16 : b > 4 * a ? Math.sqrt(a * b) : 0.5 * (a + b)
    const jm = countBelow(mid)
    if (jm >= 1) {
      b = mid
      jb = jm
    } else {
      a = mid
      ja = jm
    }
  }
  const pieces = beamPieces(at(b), 0)
  const residual = (q: number) => beamSweep(at(q), 0, pieces).residual
  const fa = residual(a)
  const fb = residual(b)
  if (fa * fb <= 0) return brentRoot(residual, a, b, 0, 300, { fa, fb })
  for (let i = 0; i < 200; i++) {
    const mid = 0.5 * (a + b)
    if (mid <= a || mid >= b) break
    if (countBelow(mid) >= 1) b = mid
    else a = mid
  }
  return 0.5 * (a + b)
}
