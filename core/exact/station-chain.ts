/**
 * The station–member chain of a straight part for one motion family, from plain inputs:
 * stations at segment boundaries and attachments (positions closer than SAME_POSITION of the
 * length are one station), members between them. The same builder serves the axial family
 * (S = EA, I = ρA, point masses, springs in N/m) and torsion (S = GJ, I = ρIp, disks' polar
 * inertia, springs in N·m/rad).
 */
import { SAME_POSITION } from '../model/geometry'
import type { ExactMember, TaperPower } from './transfer-matrix'
import type { StationChain } from './wittrick-williams'

export interface ChainSegment {
  readonly length: number
  /** Stiffness at the segment's start: EA (N) or GJ (N·m²). */
  readonly startStiffness: number
  /** Inertia per length at the segment's start: ρA (kg/m) or ρIp (kg·m). */
  readonly startInertia: number
  /** d_end / d_start of a solid cone (stiffness and inertia ∝ d^taperPower); 1 for a prismatic segment. */
  readonly diameterRatio: number
  readonly taperPower: TaperPower
}

export interface ChainAttachment {
  /** Position along the part from its start, m. */
  readonly at: number
  /** Grounded stiffness: N/m or N·m/rad. */
  readonly stiffness: number
  /** Point inertia: kg or kg·m². */
  readonly inertia: number
}

export type ChainEnd = 'fixed' | 'free'

export function buildStationChain(
  segments: readonly ChainSegment[],
  attachments: readonly ChainAttachment[],
  ends: { readonly start: ChainEnd; readonly end: ChainEnd },
): StationChain {
  const bounds = [0]
  for (const s of segments) bounds.push(bounds[bounds.length - 1] + s.length)
  const length = bounds[bounds.length - 1]
  const snap = SAME_POSITION * length
  const positions = [...bounds, ...attachments.map((a) => a.at)].sort((a, b) => a - b)
  const stations: number[] = []
  for (const x of positions) if (stations.length === 0 || x - stations[stations.length - 1] > snap) stations.push(x)
  const members: ExactMember[] = []
  for (let i = 0; i + 1 < stations.length; i++) {
    const x0 = stations[i]
    const x1 = stations[i + 1]
    let s = 0
    while (s + 1 < segments.length && bounds[s + 1] <= x0 + snap) s++
    const segment = segments[s]
    const t0 = (x0 - bounds[s]) / segment.length
    const t1 = (x1 - bounds[s]) / segment.length
    const d0 = 1 + (segment.diameterRatio - 1) * t0
    const d1 = 1 + (segment.diameterRatio - 1) * t1
    const taper = segment.taperPower === 4 ? d0 ** 4 : d0 * d0
    members.push({
      length: x1 - x0,
      startStiffness: segment.startStiffness * taper,
      startInertia: segment.startInertia * taper,
      diameterRatio: segment.diameterRatio === 1 ? 1 : d1 / d0,
      taperPower: segment.taperPower,
      segment: s,
      t0,
      t1,
    })
  }
  const stationIndex = (x: number) => {
    let best = 0
    for (let i = 1; i < stations.length; i++) if (Math.abs(stations[i] - x) < Math.abs(stations[best] - x)) best = i
    return best
  }
  const stationStiffness = stations.map(() => 0)
  const stationMass = stations.map(() => 0)
  for (const a of attachments) {
    const s = stationIndex(a.at)
    stationStiffness[s] += a.stiffness
    stationMass[s] += a.inertia
  }
  return { members, stationStiffness, stationMass, fixedStart: ends.start === 'fixed', fixedEnd: ends.end === 'fixed' }
}
