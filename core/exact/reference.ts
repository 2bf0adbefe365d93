/**
 * The exact reference shown beside every finite-element frequency: a closed form where the
 * model is a textbook case (closed-form.ts), otherwise the exact piecewise solution
 * (transfer-matrix.ts, wittrick-williams.ts). Both are exact, so `method` is "exact";
 * `formulation` says which. A model outside both would get method null.
 */
import type { Project } from '../model/project'
import { SAME_POSITION, materialOf, sectionArea, snapAttachments, totalLength } from '../model/geometry'
import { tipMassRoots, tipSpringRoots, uniformBarFrequencies } from './closed-form'
import { buildStationChain, type ChainSegment } from './station-chain'
import { exactAngularFrequencies, type StationChain } from './wittrick-williams'

export interface ExactReference {
  readonly method: 'exact' | null
  readonly formulation: string | null
  readonly frequenciesHz: number[]
}

/** The axial chain of a project: S = EA, I = ρA, point masses and springs at their stations. */
export function stationChain(project: Project): StationChain {
  const segments: ChainSegment[] = project.segments.map((segment) => {
    const material = materialOf(project, segment)
    const area = sectionArea(segment.section, 0)
    const section = segment.section
    return {
      length: segment.length,
      startStiffness: material.youngsModulus * area,
      startInertia: material.density * area,
      diameterRatio: section.shape === 'cone' ? section.endDiameter / section.startDiameter : 1,
      taperPower: 2,
    }
  })
  const attachments = [
    ...project.masses.map((m) => ({ at: m.at, stiffness: 0, inertia: m.mass })),
    ...project.springs.map((s) => ({ at: s.at, stiffness: s.stiffness, inertia: 0 })),
  ]
  return buildStationChain(segments, attachments, { start: project.ends.start.axial, end: project.ends.end.axial })
}

/** The lowest `count` frequencies of a chain by transfer matrices and the Wittrick–Williams count, Hz. */
export function chainReference(chain: StationChain, count: number): ExactReference {
  const omegas = exactAngularFrequencies(chain, count)
  return { method: 'exact', formulation: 'transfer matrices with the Wittrick–Williams count', frequenciesHz: omegas.map((w) => w / (2 * Math.PI)) }
}

/** Lowest `count` exact natural frequencies, Hz. */
export function exactReference(given: Project, count: number): ExactReference {
  const project = snapAttachments(given)
  const closed = closedFormReference(project, count)
  if (closed) return closed
  return chainReference(stationChain(project), count)
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
