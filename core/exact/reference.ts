/**
 * The exact reference shown beside every finite-element frequency: a closed form where the
 * model is a textbook case (closed-form.ts), otherwise the exact piecewise solution
 * (transfer-matrix.ts, wittrick-williams.ts). Both are exact, so `method` is "exact";
 * `formulation` says which. A model outside both would get method null.
 */
import type { Project } from '../model/project'
import { SAME_POSITION, materialOf, sectionArea, segmentBoundaries, totalLength } from '../model/geometry'
import { tipMassRoots, tipSpringRoots, uniformBarFrequencies } from './closed-form'
import type { ExactMember } from './transfer-matrix'
import { exactAngularFrequencies, type StationChain } from './wittrick-williams'

export interface ExactReference {
  readonly method: 'exact' | null
  readonly formulation: string | null
  readonly frequenciesHz: number[]
}

/** Stations at segment boundaries and attachments; members between them. */
export function stationChain(project: Project): StationChain {
  const bounds = segmentBoundaries(project.segments)
  const length = bounds[bounds.length - 1]
  const snap = SAME_POSITION * length
  const positions = [...bounds, ...project.masses.map((m) => m.at), ...project.springs.map((s) => s.at)].sort((a, b) => a - b)
  const stations: number[] = []
  for (const x of positions) if (stations.length === 0 || x - stations[stations.length - 1] > snap) stations.push(x)
  const members: ExactMember[] = []
  for (let i = 0; i + 1 < stations.length; i++) {
    const x0 = stations[i]
    const x1 = stations[i + 1]
    let s = 0
    while (s + 1 < project.segments.length && bounds[s + 1] <= x0 + snap) s++
    const segment = project.segments[s]
    const material = materialOf(project, segment)
    const segmentLength = segment.length
    const t0 = (x0 - bounds[s]) / segmentLength
    const t1 = (x1 - bounds[s]) / segmentLength
    const section = segment.section
    const diameterRatio =
      section.shape === 'cone'
        ? (section.startDiameter + (section.endDiameter - section.startDiameter) * t1) /
          (section.startDiameter + (section.endDiameter - section.startDiameter) * t0)
        : 1
    members.push({
      length: x1 - x0,
      youngsModulus: material.youngsModulus,
      density: material.density,
      startArea: sectionArea(section, t0),
      diameterRatio,
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
  for (const sp of project.springs) stationStiffness[stationIndex(sp.at)] += sp.stiffness
  for (const pm of project.masses) stationMass[stationIndex(pm.at)] += pm.mass
  return { members, stationStiffness, stationMass, fixedStart: project.ends.start.axial === 'fixed', fixedEnd: project.ends.end.axial === 'fixed' }
}

/** Lowest `count` exact natural frequencies, Hz. */
export function exactReference(project: Project, count: number): ExactReference {
  const closed = closedFormReference(project, count)
  if (closed) return closed
  const omegas = exactAngularFrequencies(stationChain(project), count)
  return { method: 'exact', formulation: 'transfer matrices with the Wittrick–Williams count', frequenciesHz: omegas.map((w) => w / (2 * Math.PI)) }
}

/** A single uniform segment, bare or with one tip mass or tip spring at the free end of a fixed–free bar. */
function closedFormReference(project: Project, count: number): ExactReference | null {
  if (project.segments.length !== 1) return null
  const segment = project.segments[0]
  if (segment.section.shape === 'cone') return null
  const material = materialOf(project, segment)
  const c = Math.sqrt(material.youngsModulus / material.density)
  const L = totalLength(project.segments)
  const start = project.ends.start.axial
  const end = project.ends.end.axial
  const attachments = project.masses.length + project.springs.length
  if (attachments === 0) {
    return {
      method: 'exact',
      formulation: `closed form, uniform ${start}–${end} bar`,
      frequenciesHz: uniformBarFrequencies(start, end, c, L, count),
    }
  }
  if (attachments !== 1 || start === end) return null
  const freeEndAt = end === 'free' ? L : 0
  const area = sectionArea(segment.section)
  const toHz = (roots: number[]) => roots.map((lambda) => (lambda * c) / (2 * Math.PI * L))
  if (project.masses.length === 1 && Math.abs(project.masses[0].at - freeEndAt) <= SAME_POSITION * L) {
    const ratio = (material.density * area * L) / project.masses[0].mass
    return { method: 'exact', formulation: 'closed form, fixed–free bar with a tip mass (λ tan λ = m/M)', frequenciesHz: toHz(tipMassRoots(ratio, count)) }
  }
  if (project.springs.length === 1 && Math.abs(project.springs[0].at - freeEndAt) <= SAME_POSITION * L) {
    const ratio = (project.springs[0].stiffness * L) / (material.youngsModulus * area)
    return { method: 'exact', formulation: 'closed form, fixed–free bar with a tip spring (tan λ = −λ EA/kL)', frequenciesHz: toHz(tipSpringRoots(ratio, count)) }
  }
  return null
}
