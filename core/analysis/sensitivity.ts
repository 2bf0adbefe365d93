/**
 * Sensitivities of the natural frequencies to every design parameter, from the exact
 * mode shapes. The Rayleigh quotient λ = ω² = (∫EA u′² dx + Σ k u²) / (∫ρA u² dx + Σ m u²)
 * is stationary at a mode, so a parameter's first-order effect needs only the unchanged
 * shape (Rayleigh's principle; Lord Rayleigh, The Theory of Sound, from memory):
 *   dλ/dp = [∫ ∂(EA)/∂p u′² dx + Σ ∂k/∂p u² − λ (∫ ∂(ρA)/∂p u² dx + Σ ∂m/∂p u²)] / D,
 * D the denominator. For a segment's length L (its attachments keep their fractions),
 * stretching the coordinate gives dλ/dL = −(U_seg + λ T_seg) / (L D), with
 * U_seg = ∫seg EA u′² dx and T_seg = ∫seg ρA u² dx. Then df/dp = (dλ/dp) / (8π² f).
 * The finite-element discretisation plays no part, so these are the sensitivities of the
 * exact frequencies (the tests compare them with central differences of the exact solver).
 */
import { integrateOverMember, modeEnergies, type ModeEnergies } from '../exact/exact-mode-shape'
import { stationChain } from '../exact/reference'
import { exactAngularFrequencies, hasRigidBodyMode, type StationChain } from '../exact/wittrick-williams'
import type { Project, Section } from '../model/project'
import { materialOf } from '../model/geometry'
import { designParameters, type DesignParameter } from './design-parameters'

export interface Sensitivity {
  readonly mode: number
  readonly frequencyHz: number
  readonly parameter: string
  readonly label: string
  readonly value: number
  /** df/dp, Hz per SI unit of the parameter. */
  readonly derivative: number
  /** (p / f) df/dp: the % change of f per % change of p. */
  readonly relative: number
}

/** ∂A/∂(dimension) at fraction t along a segment. */
function areaDerivative(section: Section, dimension: string, t: number): number {
  switch (section.shape) {
    case 'solid':
      return (Math.PI / 2) * section.diameter
    case 'tube':
      return dimension === 'outerDiameter' ? (Math.PI / 2) * section.outerDiameter : -(Math.PI / 2) * section.innerDiameter
    case 'rectangle':
      return dimension === 'width' ? section.height : section.width
    case 'area':
      return 1
    case 'cone': {
      const d = section.startDiameter + (section.endDiameter - section.startDiameter) * t
      return (Math.PI / 2) * d * (dimension === 'startDiameter' ? 1 - t : t)
    }
  }
}

/** Sensitivities of the lowest `modes` exact frequencies (rigid-body modes skipped). */
export function frequencySensitivities(project: Project, modes: number, parameters: DesignParameter[] = designParameters(project, ['axial'])): Sensitivity[] {
  const chain = stationChain(project)
  const omegas = exactAngularFrequencies(chain, modes)
  const out: Sensitivity[] = []
  const rigid = hasRigidBodyMode(chain) ? 1 : 0
  omegas.forEach((omega, i) => {
    if (i < rigid || omega === 0) return
    const energies = modeEnergies(chain, omega)
    const f = omega / (2 * Math.PI)
    for (const p of parameters) {
      const dLambda = lambdaDerivative(project, chain, omega, energies, p)
      const derivative = dLambda / (8 * Math.PI * Math.PI * f)
      out.push({ mode: i + 1, frequencyHz: f, parameter: p.path, label: p.label, value: p.value, derivative, relative: (p.value / f) * derivative })
    }
  })
  return out
}

/** The station nearest to a position along the bar. */
function stationOf(chain: StationChain, at: number): number {
  let x = 0
  let best = 0
  let bestDistance = Math.abs(at)
  chain.members.forEach((m, i) => {
    x += m.length
    const distance = Math.abs(x - at)
    if (distance < bestDistance) {
      bestDistance = distance
      best = i + 1
    }
  })
  return best
}

function lambdaDerivative(project: Project, chain: StationChain, omega: number, e: ModeEnergies, p: DesignParameter): number {
  const lambda = omega * omega
  const { denominator } = e
  const target = p.target
  switch (target.kind) {
    case 'mass': {
      const u = e.shape.stationDisplacement[stationOf(chain, project.masses[target.index].at)]
      return (-lambda * u * u) / denominator
    }
    case 'stiffness': {
      const u = e.shape.stationDisplacement[stationOf(chain, project.springs[target.index].at)]
      return (u * u) / denominator
    }
    case 'youngsModulus':
    case 'density': {
      let sum = 0
      chain.members.forEach((member, i) => {
        const segment = project.segments[member.segment ?? 0]
        if (segment.material !== target.material) return
        // EA u′² and ρA u² are linear in E and ρ.
        const material = materialOf(project, segment)
        sum += target.kind === 'youngsModulus' ? e.strain[i] / material.youngsModulus : (-lambda * e.kinetic[i]) / material.density
      })
      return sum / denominator
    }
    case 'segmentLength': {
      let strain = 0
      let kinetic = 0
      chain.members.forEach((member, i) => {
        if (member.segment !== target.segment) return
        strain += e.strain[i]
        kinetic += e.kinetic[i]
      })
      return -(strain + lambda * kinetic) / (project.segments[target.segment].length * denominator)
    }
    case 'sectionDimension': {
      const segment = project.segments[target.segment]
      const { youngsModulus: E, density } = materialOf(project, segment)
      let sum = 0
      chain.members.forEach((member, i) => {
        if (member.segment !== target.segment) return
        const t0 = member.t0 ?? 0
        const t1 = member.t1 ?? 1
        sum += integrateOverMember(member, e.shape.members[i], omega, (x, u, n, stiffness) => {
          const t = t0 + ((t1 - t0) * x) / member.length
          const strainDensity = n / stiffness // u′ = N/(EA)
          return (E * strainDensity * strainDensity - lambda * density * u * u) * areaDerivative(segment.section, target.dimension, t)
        })
      })
      return sum / denominator
    }
    default:
      // Shear modulus, inertias about the axis or across it, rotational springs, preload: no part in axial motion.
      return 0
  }
}

/** Plain words for a sensitivity: "shortening segment 2 by 10 mm raises mode 1 by 4.1 Hz". */
export function describeSensitivity(s: Sensitivity, step: number, stepText: string, changeText: (hz: number) => string): string {
  const change = s.derivative * step
  const verb = step >= 0 ? 'increasing' : 'reducing'
  const effect = change >= 0 ? 'raises' : 'lowers'
  return `${verb} the ${s.label} by ${stepText} ${effect} mode ${s.mode} by ${changeText(Math.abs(change))}`
}
