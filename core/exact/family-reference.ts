/**
 * The reference beside every finite-element frequency, per motion family:
 * - axial: exact (closed forms or transfer matrices, reference.ts);
 * - torsion and bending: exact where an exact solution exists, otherwise a Richardson
 *   estimate from two fine meshes (L. F. Richardson, Phil. Trans. R. Soc. A 210 (1911), from
 *   memory): f* = f₂ + (f₂ − f₁)/(2^p − 1) with f₁, f₂ on meshes of h and h/2 and p the
 *   elements' order of convergence in frequency (4 for 3-node bars and Hermite cubics, 2 for the
 *   Timoshenko element), labelled
 *   "extrapolated" so that nobody takes it for an exact value.
 */
import { analyseFamily } from '../analysis/modal-analysis'
import type { Family } from '../model/families'
import type { AnalysisSettings, Project } from '../model/project'
import { springMotion } from '../model/project'
import { exactReference } from './reference'
import { exactBeamAngularFrequencies } from './beam-frequencies'
import { beamStationChain, hasExactBending } from './beam-project'
import { torsionExactReference, type TorsionChainInput } from './torsion-chain'
import { materialOf, snapAttachments } from '../model/geometry'
import { polarMoment, shearModulus, torsionConstant } from '../model/section-properties'

export interface FamilyReference {
  readonly method: 'exact' | 'extrapolated' | null
  readonly formulation: string | null
  readonly frequenciesHz: number[]
}

/** The project as the axial analysis sees it: only axial springs. */
export function axialView(project: Project): Project {
  return project.springs.every((s) => springMotion(s) === 'axial') ? project : { ...project, springs: project.springs.filter((s) => springMotion(s) === 'axial') }
}

export function familyReference(project: Project, family: Family, settings: AnalysisSettings, count: number): FamilyReference {
  if (family.motion === 'axial') return exactReference(axialView(project), count)
  const exact = exactFamilyFrequencies(project, family, count)
  if (exact) return { method: 'exact', formulation: EXACT_FORMULATION[family.motion], frequenciesHz: exact }
  return extrapolatedReference(project, family, settings, count)
}

const EXACT_FORMULATION: Record<string, string> = {
  bending: 'exact Euler–Bernoulli segments with the axial force (transfer matrices, Wittrick–Williams count)',
  torsion: 'transfer matrices with the Wittrick–Williams count',
}

/** Exact frequencies (Hz) of a torsion or bending family where an exact solution exists, else null. */
function exactFamilyFrequencies(project: Project, family: Family, count: number): number[] | null {
  if (family.motion === 'torsion') return torsionExactReference(torsionInput(project), count).frequenciesHz
  if (family.motion === 'bending' && hasExactBending(project)) {
    return exactBeamAngularFrequencies(beamStationChain(project, family.plane ?? 'weak'), count).map((w) => w / (2 * Math.PI))
  }
  return null
}

/** Unknowns above which the two reference meshes are not refined further. */
const REFERENCE_UNKNOWNS = 200_000

/** Mesh densities of the two reference meshes: at least 4 × the analysis mesh (and 64 per segment), then twice that. */
function referenceDensities(project: Project, settings: AnalysisSettings, family: Family): [AnalysisSettings, AnalysisSettings] {
  const perNode = family.motion === 'bending' ? 2 : 2 /* 3-node elements: two nodes per element */
  const base = settings.maxElementLength !== undefined ? undefined : Math.max(64, 4 * (settings.elementsPerSegment ?? 40))
  const fine = (factor: number): AnalysisSettings => {
    const s: AnalysisSettings = { ...settings, mass: 'consistent', elementOrder: family.motion === 'bending' ? 1 : 2 }
    if (base !== undefined) {
      const limit = Math.max(2, Math.floor(REFERENCE_UNKNOWNS / (2 * perNode * project.segments.length)))
      s.elementsPerSegment = Math.min(base, limit) * factor
    } else {
      s.maxElementLength = (settings.maxElementLength as number) / (4 * factor)
    }
    return s
  }
  return [fine(1), fine(2)]
}

/**
 * A Richardson estimate from the family's finite-element frequencies on two fine meshes (consistent
 * mass). A mesh whose solve fails its own checks (Sturm count, convergence) gives no reference: the
 * pair is halved, down to the analysis mesh, until both pass; if none does, there is no reference,
 * and the formulation says why.
 */
export function extrapolatedReference(project: Project, family: Family, settings: AnalysisSettings, count: number): FamilyReference {
  let [coarse, fine] = referenceDensities(project, settings, family)
  const solve = (s: AnalysisSettings) => {
    const analysis = analyseFamily(project, family, { ...s, modes: count }, { withReference: false })
    return { frequenciesHz: analysis.modes.map((m) => m.frequencyHz), trusted: analysis.converged && analysis.sturm.passed }
  }
  let f2 = solve(fine)
  let f1 = solve(coarse)
  while (!(f1.trusted && f2.trusted)) {
    const next = halved(coarse, settings)
    if (!next) {
      return {
        method: null,
        formulation: `the solves on the reference meshes, down to ${describe(coarse)}, did not pass their own checks (Sturm count and convergence)`,
        frequenciesHz: [],
      }
    }
    fine = coarse
    f2 = f1
    coarse = next
    f1 = solve(coarse)
  }
  // Hermite cubics and 3-node bars converge as h⁴ in frequency; the Timoshenko element, whose
  // shear strain is constant along each element, as h² (observed, and so checked in the tests).
  const timoshenko = family.motion === 'bending' && settings.bendingTheory === 'timoshenko'
  const order = timoshenko ? 2 : 4
  const factor = 1 / (2 ** order - 1)
  const frequenciesHz = f2.frequenciesHz.map((f, i) => (f === 0 ? 0 : f + (f - (f1.frequenciesHz[i] ?? f)) * factor))
  const elements = family.motion === 'bending' ? (timoshenko ? 'Timoshenko' : 'Hermite cubic') : '3-node'
  return {
    method: 'extrapolated',
    formulation: `Richardson extrapolation (order ${order}) of ${elements} elements at ${describe(coarse)} and ${describe(fine)}`,
    frequenciesHz,
  }
}

/** The mesh half as fine as `s`, or null where that would be coarser than the analysis mesh. */
function halved(s: AnalysisSettings, analysis: AnalysisSettings): AnalysisSettings | null {
  if (s.elementsPerSegment !== undefined) {
    const half = s.elementsPerSegment / 2
    return Number.isInteger(half) && half >= (analysis.elementsPerSegment ?? 1) ? { ...s, elementsPerSegment: half } : null
  }
  const longer = (s.maxElementLength as number) * 2
  return longer <= (analysis.maxElementLength as number) * (1 + 1e-12) ? { ...s, maxElementLength: longer } : null
}

function describe(s: AnalysisSettings): string {
  return s.elementsPerSegment !== undefined ? `${s.elementsPerSegment} elements per segment` : `elements of at most ${Number((s.maxElementLength as number).toPrecision(3))} m`
}

/**
 * Frequencies for design searches (tuner, sweeps), where a reference per evaluation would cost
 * two fine solves: exact where an exact solution exists, otherwise the finite elements on the
 * analysis mesh.
 */
export function designFrequencies(project: Project, family: Family, settings: AnalysisSettings, count: number): number[] {
  if (family.motion === 'axial') return exactReference(axialView(project), count).frequenciesHz
  const exact = exactFamilyFrequencies(project, family, count)
  if (exact) return exact
  return analyseFamily(project, family, { ...settings, modes: count }, { withReference: false }).modes.map((m) => m.frequencyHz)
}

/** A project's torsion as the exact chain reads it: G, J and Ip of each segment, disks and torsional springs. */
export function torsionInput(given: Project): TorsionChainInput {
  const project = snapAttachments(given)
  return {
    segments: project.segments.map((segment) => {
      const material = materialOf(project, segment)
      const section = segment.section
      return {
        length: segment.length,
        shearModulus: shearModulus(material) as number,
        density: material.density,
        torsionConstant: torsionConstant(section, 0) as number,
        polarMoment: polarMoment(section, 0) as number,
        diameterRatio: section.shape === 'cone' ? section.endDiameter / section.startDiameter : 1,
      }
    }),
    disks: project.masses.filter((m) => (m.polarInertia ?? 0) > 0).map((m) => ({ at: m.at, polarInertia: m.polarInertia as number })),
    springs: project.springs.filter((s) => springMotion(s) === 'torsion').map((s) => ({ at: s.at, stiffness: s.stiffness })),
    ends: { start: project.ends.start.torsion, end: project.ends.end.torsion },
  }
}
