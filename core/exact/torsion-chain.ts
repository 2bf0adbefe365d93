/**
 * Torsion of a straight shaft through the same exact machinery as the axial family: the twist
 * θ and torque T = GJ θ′ play the parts of u and N = EA u′ (transfer-matrix.ts), with
 * stiffness S = GJ and inertia per length I = ρIp. J (Saint-Venant's torsion constant) and Ip
 * (the polar second moment of area) are separate inputs: they are equal for round sections
 * only (a rectangle's Ip = bh(b² + h²)/12 exceeds its J). A solid cone — or any section scaled
 * uniformly along the segment — has J and Ip ∝ d⁴ (taper power 4). Disks add their polar
 * inertia (kg·m²) and torsional springs their stiffness (N·m/rad) at their stations.
 */
import { chainReference, type ExactReference } from './reference'
import { buildStationChain, type ChainEnd } from './station-chain'
import type { StationChain } from './wittrick-williams'

export interface TorsionSegment {
  /** m */
  readonly length: number
  /** G, Pa */
  readonly shearModulus: number
  /** ρ, kg/m³ */
  readonly density: number
  /** Saint-Venant's torsion constant J at the segment's start, m⁴. */
  readonly torsionConstant: number
  /** Polar second moment of area Ip at the segment's start, m⁴. */
  readonly polarMoment: number
  /** d_end / d_start of a solid cone; 1 for a prismatic segment. */
  readonly diameterRatio: number
}

export interface TorsionDisk {
  /** Position from the shaft's start, m. */
  readonly at: number
  /** Polar mass moment of inertia, kg·m². */
  readonly polarInertia: number
}

export interface TorsionSpring {
  /** Position from the shaft's start, m. */
  readonly at: number
  /** Torsional stiffness to ground, N·m/rad. */
  readonly stiffness: number
}

export interface TorsionChainInput {
  readonly segments: readonly TorsionSegment[]
  readonly disks: readonly TorsionDisk[]
  readonly springs: readonly TorsionSpring[]
  readonly ends: { readonly start: ChainEnd; readonly end: ChainEnd }
}

export class TorsionInputError extends Error {}

function requirePositive(value: number, field: string, unit: string): void {
  if (!(typeof value === 'number' && Number.isFinite(value) && value > 0)) {
    throw new TorsionInputError(`${field} must be a positive number (${unit}), got ${String(value).slice(0, 60)}`)
  }
}

/**
 * `item` is the attachment's path (disks[0]), `name` its value's field. The end is matched as the
 * project file's check matches it, to 1e-12 of the length: a sum of segment lengths such as
 * 0.6 + 0.9 + 0.4 + 0.3 comes out a rounding below the 2.2 a user writes for a disk at the end.
 */
function requireAttachment(at: number, value: number, length: number, item: string, name: string, unit: string, allowZero: boolean): void {
  if (!(typeof at === 'number' && Number.isFinite(at) && at >= 0 && at <= length * (1 + 1e-12))) {
    throw new TorsionInputError(`${item}.at must lie on the shaft, between 0 and ${+length.toPrecision(12)} m, got ${String(at).slice(0, 60)}`)
  }
  if (!(typeof value === 'number' && Number.isFinite(value) && (allowZero ? value >= 0 : value > 0))) {
    throw new TorsionInputError(`${item}.${name} must be a ${allowZero ? 'non-negative' : 'positive'} number (${unit}), got ${String(value).slice(0, 60)}`)
  }
}

/** The torsion chain of a shaft: members with S = GJ, I = ρIp; disks and torsional springs at their stations. */
export function torsionStationChain(input: TorsionChainInput): StationChain {
  if (input.segments.length === 0) throw new TorsionInputError('segments: a shaft needs at least one segment')
  let length = 0
  input.segments.forEach((s, i) => {
    requirePositive(s.length, `segments[${i}].length`, 'm')
    requirePositive(s.shearModulus, `segments[${i}].shearModulus`, 'Pa')
    requirePositive(s.density, `segments[${i}].density`, 'kg/m³')
    requirePositive(s.torsionConstant, `segments[${i}].torsionConstant`, 'm⁴')
    requirePositive(s.polarMoment, `segments[${i}].polarMoment`, 'm⁴')
    requirePositive(s.diameterRatio, `segments[${i}].diameterRatio`, 'd_end/d_start, 1 for a prismatic segment')
    length += s.length
  })
  input.disks.forEach((d, i) => requireAttachment(d.at, d.polarInertia, length, `disks[${i}]`, 'polarInertia', 'kg·m²', false))
  input.springs.forEach((s, i) => requireAttachment(s.at, s.stiffness, length, `springs[${i}]`, 'stiffness', 'N·m/rad', false))
  for (const end of ['start', 'end'] as const) {
    if (input.ends[end] !== 'fixed' && input.ends[end] !== 'free') throw new TorsionInputError(`ends.${end} must be "fixed" or "free" for torsion`)
  }
  return buildStationChain(
    input.segments.map((s) => ({
      length: s.length,
      startStiffness: s.shearModulus * s.torsionConstant,
      startInertia: s.density * s.polarMoment,
      diameterRatio: s.diameterRatio,
      taperPower: 4,
    })),
    [...input.disks.map((d) => ({ at: d.at, stiffness: 0, inertia: d.polarInertia })), ...input.springs.map((s) => ({ at: s.at, stiffness: s.stiffness, inertia: 0 }))],
    input.ends,
  )
}

/** The lowest `count` exact torsional natural frequencies, Hz (0 first for a free–free shaft without springs). */
export function torsionExactReference(input: TorsionChainInput, count: number): ExactReference {
  return chainReference(torsionStationChain(input), count)
}
