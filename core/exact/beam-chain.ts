/**
 * The plain-number description of a straight part in bending for the exact reference: uniform
 * Euler–Bernoulli members between stations, a steady axial force, point masses, rotary
 * inertias and springs to ground at the stations, and the two end conditions. The public
 * functions check it once (checkBeamChain) and name the field that is wrong.
 */

/** A uniform Euler–Bernoulli member between two consecutive stations. */
export interface BeamMember {
  readonly length: number // m
  readonly bendingStiffness: number // EI, N·m²
  readonly massPerLength: number // ρA, kg/m
}

/** clamped: w = 0 and w′ = 0; pinned: w = 0 (moment free); guided: w′ = 0 (shear free); free: nothing. */
export type BeamEndCondition = 'clamped' | 'pinned' | 'guided' | 'free'

export interface BeamChain {
  /** members.length + 1 stations, from x = 0. */
  readonly members: readonly BeamMember[]
  /** Steady axial force in every member, N, tension positive (geometric stiffness from ½∫P w′² dx). */
  readonly axialForce: number
  /** Per station (members.length + 1 entries each). */
  readonly stationMass: readonly number[] // kg, moves with w
  readonly stationRotaryInertia: readonly number[] // kg·m², about a transverse axis, moves with w′
  readonly stationSideStiffness: readonly number[] // N/m to ground against w
  readonly stationRotationalStiffness: readonly number[] // N·m/rad to ground against w′
  readonly start: BeamEndCondition
  readonly end: BeamEndCondition
}

const END_CONDITIONS: readonly string[] = ['clamped', 'pinned', 'guided', 'free']

const STATION_FIELDS = [
  ['stationMass', 'kg'],
  ['stationRotaryInertia', 'kg·m²'],
  ['stationSideStiffness', 'N/m'],
  ['stationRotationalStiffness', 'N·m/rad'],
] as const

/** Throws a RangeError naming the first field that is not a valid beam chain. */
export function checkBeamChain(chain: BeamChain): void {
  if (!Array.isArray(chain.members) || chain.members.length === 0) {
    throw new RangeError('members: a beam chain needs at least one member')
  }
  chain.members.forEach((member, i) => {
    positive(member.length, `members[${i}].length`, 'm')
    positive(member.bendingStiffness, `members[${i}].bendingStiffness`, 'N·m²')
    positive(member.massPerLength, `members[${i}].massPerLength`, 'kg/m')
  })
  if (!Number.isFinite(chain.axialForce)) throw new RangeError(`axialForce must be a finite number (N, tension positive); got ${chain.axialForce}`)
  const stations = chain.members.length + 1
  for (const [field, unit] of STATION_FIELDS) {
    const values = chain[field]
    if (!Array.isArray(values) || values.length !== stations) {
      throw new RangeError(`${field} must have one entry per station (${stations} for ${chain.members.length} members); got ${Array.isArray(values) ? values.length : typeof values}`)
    }
    values.forEach((v, s) => {
      if (!(Number.isFinite(v) && v >= 0)) throw new RangeError(`${field}[${s}] must be a finite number ≥ 0 (${unit}); got ${v}`)
    })
  }
  for (const side of ['start', 'end'] as const) {
    if (!END_CONDITIONS.includes(chain[side])) throw new RangeError(`${side} must be one of ${END_CONDITIONS.join(', ')}; got ${String(chain[side])}`)
  }
}

function positive(value: number, field: string, unit: string): void {
  if (!(Number.isFinite(value) && value > 0)) throw new RangeError(`${field} must be a positive finite number (${unit}); got ${value}`)
}

/** x of each station from the start, m. */
export function stationPositions(chain: BeamChain): number[] {
  const x = [0]
  for (const member of chain.members) x.push(x[x.length - 1] + member.length)
  return x
}
