/**
 * The buckling load of a part under a steady compression, with its bending supports: the least
 * P at which K_E − P·K_G (elastic minus geometric stiffness, from ½∫EI w″² dx and ½∫P w′² dx) is
 * singular. Exact for uniform Euler–Bernoulli segments (exact/beam-buckling.ts); otherwise finite elements (Hermite cubics converge as h⁴ in the load, as in frequency) on two
 * fine meshes with Richardson extrapolation; each load found by bisection on the Sturm count of
 * K_E − P·K_G (Sylvester's law of inertia: its negative pivots are the buckling loads below P).
 * A rotation the supports leave free makes any compression unstable (critical load 0); a free
 * translation stores no energy in either matrix and is held by a spring that changes no load.
 */
import { assembleFamily } from '../fe/assemble'
import { factorShifted, allocateFactorization } from '../linalg/shifted-ldlt'
import { createBandMatrix } from '../linalg/symmetric-band-matrix'
import { familyOf } from '../model/families'
import { materialOf, totalLength } from '../model/geometry'
import type { AnalysisSettings, Project } from '../model/project'
import { secondMoments } from '../model/section-properties'
import { freeRigidMotions } from '../fe/assemble'
import { beamCriticalCompression } from '../exact/beam-buckling'
import { beamStationChain, hasExactBending } from '../exact/beam-project'

export interface BucklingCheck {
  /** The compression applied, N (> 0). */
  readonly compression: number
  /** The least compression at which the part buckles, N. */
  readonly criticalCompression: number
  /** compression / criticalCompression. */
  readonly ratio: number
  readonly method: string
}

/** The check, when bending is analysed and the preload is a compression; null otherwise. */
export function checkBuckling(project: Project, settings: AnalysisSettings): BucklingCheck | null {
  const preload = project.preload ?? 0
  if (!(preload < 0) || !project.motions.includes('bending')) return null
  const compression = -preload
  const critical = criticalCompression(project, settings)
  return { compression, criticalCompression: critical.load, ratio: critical.load > 0 ? compression / critical.load : Infinity, method: critical.method }
}

export function criticalCompression(project: Project, settings: AnalysisSettings): { load: number; method: string } {
  const unloaded: Project = { ...project, preload: 0 }
  if (freeRigidMotions(unloaded).some((m) => m.b !== 0)) return { load: 0, method: 'a rotation the supports leave free' }
  if (hasExactBending(project)) return { load: beamCriticalCompression(beamStationChain(unloaded, 'weak')), method: 'exact, Euler–Bernoulli segments' }
  return finiteElementCriticalCompression(unloaded, settings)
}

/** The critical compression by finite elements on two meshes with Richardson extrapolation (any section, either theory). */
export function finiteElementCriticalCompression(project: Project, settings: AnalysisSettings): { load: number; method: string } {
  const unloaded: Project = { ...project, preload: 0 }
  if (freeRigidMotions(unloaded).some((m) => m.b !== 0)) return { load: 0, method: 'a rotation the supports leave free' }
  // 64 and 128 Hermite elements per segment: the h⁴ error is then far below 1e-8 after
  // extrapolation, while finer meshes would let round-off in the factorisation's inertia creep in.
  const base = 64
  const loadOn = (elementsPerSegment: number) => feCriticalLoad(unloaded, { ...settings, elementsPerSegment, maxElementLength: undefined })
  const coarse = loadOn(base)
  const fine = loadOn(2 * base)
  return { load: fine + (fine - coarse) / 15, method: `finite elements, Richardson-extrapolated from ${base} and ${2 * base} elements per segment` }
}

function feCriticalLoad(project: Project, settings: AnalysisSettings): number {
  const model = assembleFamily(project, familyOf('bending', 'weak'), {
    order: 1,
    elementsPerSegment: settings.elementsPerSegment,
    mass: 'consistent',
    bendingTheory: settings.bendingTheory,
  })
  const elastic = model.elasticStiffness!
  const geometric = model.geometricStiffness!
  const n = elastic.order
  // A free translation: hold the first deflection unknown with a spring as stiff as the part.
  let stiffness = elastic
  if (freeRigidMotions(project).length > 0) {
    stiffness = createBandMatrix(n, elastic.halfBandwidth)
    for (let d = 0; d < elastic.halfBandwidth; d++) stiffness.offDiagonals[d].set(elastic.offDiagonals[d])
    stiffness.rowSums.set(elastic.rowSums)
    const first = model.dofKinds![0] === 0 ? 0 : 1
    stiffness.rowSums[first] += Math.abs(elastic.rowSums[first]) + 1e-3 * scaleOf(elastic)
  }
  const pencil = { stiffness, mass: geometric }
  const f = allocateFactorization(n, stiffness.halfBandwidth)
  const unstable = (load: number) => factorShifted(pencil, load, f).negativePivots > 0
  // Bracket from the pinned–pinned Euler load of the weakest segment over the whole length.
  let low = 0
  let high = eulerEstimate(project)
  for (let i = 0; i < 200 && !unstable(high); i++) {
    low = high
    high *= 2
  }
  for (let i = 0; i < 200 && high - low > 1e-13 * high; i++) {
    const mid = 0.5 * (low + high)
    if (unstable(mid)) high = mid
    else low = mid
  }
  return 0.5 * (low + high)
}

function scaleOf(a: { rowSums: Float64Array; offDiagonals: Float64Array[] }): number {
  let m = 0
  for (const band of a.offDiagonals) for (const v of band) m = Math.max(m, Math.abs(v))
  return m
}

/** π²·min(EI)/L²: a load of the right order to start the search. */
function eulerEstimate(project: Project): number {
  let ei = Infinity
  for (const s of project.segments) {
    const i = secondMoments(s.section, 0.5)
    if (i) ei = Math.min(ei, materialOf(project, s).youngsModulus * i.weak)
  }
  const length = totalLength(project.segments)
  return ((Math.PI * Math.PI * ei) / (length * length)) * 0.25
}
