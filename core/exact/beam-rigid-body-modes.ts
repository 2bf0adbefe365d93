/**
 * Rigid-body motions of a beam chain: the straight-line deflections w = a + b x that every
 * support leaves free (common practice, no source). A pinned or clamped end and a side spring
 * at a station hold w there (a + b xₛ = 0); a clamped or guided end and a rotational spring
 * hold the slope (b = 0). A steady axial force acts on a rotation through ½∫P w′² dx = ½ P b² L:
 * tension makes it elastic, compression unstable — either way it is no longer a zero-frequency
 * mode. The free motions are the null space of these conditions on (a, b), found by counting,
 * without round-off: two held stations at different x, or a held slope with any held station,
 * leave nothing free.
 */
import { checkBeamChain, type BeamChain } from './beam-chain'

export interface RigidMotions {
  /** w = constant is free. */
  readonly translation: boolean
  /** Some w = a + b x with b ≠ 0 is free (a rotation about a held station, or any). */
  readonly rotation: boolean
  /** Dimension of the free motions: 0, 1 or 2. */
  readonly count: number
}

/** The rigid motions the ends and springs leave free; `withAxialForce` also lets a non-zero P hold the slope. */
export function rigidMotionsLeftFree(chain: BeamChain, withAxialForce: boolean): RigidMotions {
  const last = chain.members.length
  const heldStations = new Set<number>()
  let slopeHeld = withAxialForce && chain.axialForce !== 0
  if (chain.start === 'pinned' || chain.start === 'clamped') heldStations.add(0)
  if (chain.end === 'pinned' || chain.end === 'clamped') heldStations.add(last)
  if (chain.start === 'clamped' || chain.start === 'guided' || chain.end === 'clamped' || chain.end === 'guided') slopeHeld = true
  chain.stationSideStiffness.forEach((k, s) => {
    if (k > 0) heldStations.add(s)
  })
  if (chain.stationRotationalStiffness.some((k) => k > 0)) slopeHeld = true
  const translation = heldStations.size === 0
  const rotation = !slopeHeld && heldStations.size <= 1
  const count = (translation ? 1 : 0) + (rotation ? 1 : 0)
  return { translation, rotation, count }
}

/** Number of zero-frequency (rigid-body) modes: 0, 1 or 2 — depends on ends, springs AND the axial force (tension makes a free rotation elastic). */
export function beamRigidBodyModes(chain: BeamChain): number {
  checkBeamChain(chain)
  return rigidMotionsLeftFree(chain, true).count
}
