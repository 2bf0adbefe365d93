/**
 * A project's bending in one principal plane as the exact reference sees it (beam-chain.ts):
 * stations at every segment boundary, point mass and bending spring; uniform Euler–Bernoulli
 * members between them. Only parts whose segments are all of constant section have one; a
 * cone, or Timoshenko theory, has none (the reference is then extrapolated, family-reference.ts).
 */
import type { BendingPlane } from '../model/families'
import { SAME_POSITION, materialOf, sectionArea, segmentBoundaries, snapAttachments } from '../model/geometry'
import { springMotion, type Project } from '../model/project'
import { secondMoments } from '../model/section-properties'
import type { BeamChain, BeamMember } from './beam-chain'

/** Whether bending of the project has an exact reference. */
export function hasExactBending(project: Project): boolean {
  return (project.analysis.bendingTheory ?? 'euler-bernoulli') === 'euler-bernoulli' && project.segments.every((s) => s.section.shape !== 'cone')
}

/** The chain of one bending plane (call only where hasExactBending). */
export function beamStationChain(given: Project, plane: BendingPlane): BeamChain {
  const project = snapAttachments(given)
  const bounds = segmentBoundaries(project.segments)
  const length = bounds[bounds.length - 1]
  const snap = SAME_POSITION * length
  const springs = project.springs.filter((s) => springMotion(s) === 'bending')
  const positions = [...bounds, ...project.masses.map((m) => m.at), ...springs.map((s) => s.at)].sort((a, b) => a - b)
  const stations: number[] = []
  for (const x of positions) if (stations.length === 0 || x - stations[stations.length - 1] > snap) stations.push(x)
  const members: BeamMember[] = []
  for (let i = 0; i + 1 < stations.length; i++) {
    let s = 0
    while (s + 1 < project.segments.length && bounds[s + 1] <= stations[i] + snap) s++
    const segment = project.segments[s]
    const material = materialOf(project, segment)
    const inertia = (secondMoments(segment.section) as { weak: number; strong: number })[plane]
    members.push({ length: stations[i + 1] - stations[i], bendingStiffness: material.youngsModulus * inertia, massPerLength: material.density * sectionArea(segment.section) })
  }
  const nearest = (x: number) => {
    let best = 0
    for (let i = 1; i < stations.length; i++) if (Math.abs(stations[i] - x) < Math.abs(stations[best] - x)) best = i
    return best
  }
  const zeros = () => stations.map(() => 0)
  const stationMass = zeros()
  const stationRotaryInertia = zeros()
  const stationSideStiffness = zeros()
  const stationRotationalStiffness = zeros()
  for (const m of project.masses) {
    stationMass[nearest(m.at)] += m.mass
    stationRotaryInertia[nearest(m.at)] += m.transverseInertia ?? 0
  }
  for (const sp of springs) {
    stationSideStiffness[nearest(sp.at)] += sp.stiffness
    stationRotationalStiffness[nearest(sp.at)] += sp.rotationalStiffness ?? 0
  }
  return {
    members,
    axialForce: project.preload ?? 0,
    stationMass,
    stationRotaryInertia,
    stationSideStiffness,
    stationRotationalStiffness,
    start: project.ends.start.bending,
    end: project.ends.end.bending,
  }
}
