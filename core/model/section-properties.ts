/**
 * Section constants beyond the area, for torsion and bending, at fraction t ∈ [0, 1] along a
 * segment (a cone's diameter varies linearly):
 * - second moments of area I about the two principal axes: πd⁴/64 for round sections,
 *   bh³/12 and hb³/12 for a rectangle; for the `area` shape as the file gives them;
 * - Saint-Venant's torsion constant J (stiffness GJ): πd⁴/32 for round sections (exact,
 *   no warping), the series of saint-venant-torsion.ts for a rectangle, given for `area`;
 * - the polar second moment Ip (rotary inertia ρIp): πd⁴/32 for round sections,
 *   bh(b² + h²)/12 for a rectangle; for `area` as given, else I_weak + I_strong
 *   (the perpendicular-axis theorem);
 * - Cowper's shear coefficients for Timoshenko beams (G. R. Cowper, "The shear coefficient in
 *   Timoshenko's beam theory", J. Appl. Mech. 33 (1966) 335–340, from memory).
 * A property the file does not give is `undefined`; the file reader names it when a family needs it.
 */
import type { Material, Section } from './project'
import { rectangleTorsionConstant } from './saint-venant-torsion'

function roundDiameter(section: Section, t: number): number | null {
  if (section.shape === 'solid') return section.diameter
  if (section.shape === 'cone') return section.startDiameter + (section.endDiameter - section.startDiameter) * t
  return null
}

/** Principal second moments of area (weak ≤ strong), m⁴. */
export function secondMoments(section: Section, t = 0): { weak: number; strong: number } | undefined {
  const d = roundDiameter(section, t)
  if (d !== null) {
    const i = (Math.PI / 64) * d ** 4
    return { weak: i, strong: i }
  }
  switch (section.shape) {
    case 'tube': {
      const i = (Math.PI / 64) * (section.outerDiameter ** 4 - section.innerDiameter ** 4)
      return { weak: i, strong: i }
    }
    case 'rectangle': {
      const a = (section.width * section.height ** 3) / 12
      const b = (section.height * section.width ** 3) / 12
      return { weak: Math.min(a, b), strong: Math.max(a, b) }
    }
    case 'area': {
      if (section.secondMoment === undefined) return undefined
      const strong = section.secondMomentStrong ?? section.secondMoment
      return { weak: Math.min(section.secondMoment, strong), strong: Math.max(section.secondMoment, strong) }
    }
    default:
      return undefined
  }
}

/** Whether the section bends differently in its two principal planes. */
export function hasTwoBendingPlanes(section: Section): boolean {
  const i = secondMoments(section)
  return i !== undefined && i.strong > i.weak * (1 + 1e-12)
}

/** Saint-Venant torsion constant J, m⁴. */
export function torsionConstant(section: Section, t = 0): number | undefined {
  const d = roundDiameter(section, t)
  if (d !== null) return (Math.PI / 32) * d ** 4
  switch (section.shape) {
    case 'tube':
      return (Math.PI / 32) * (section.outerDiameter ** 4 - section.innerDiameter ** 4)
    case 'rectangle':
      return rectangleTorsionConstant(section.width, section.height)
    case 'area':
      return section.torsionConstant
    default:
      return undefined
  }
}

/** Polar second moment of area Ip about the axis, m⁴. */
export function polarMoment(section: Section, t = 0): number | undefined {
  const d = roundDiameter(section, t)
  if (d !== null) return (Math.PI / 32) * d ** 4
  switch (section.shape) {
    case 'tube':
      return (Math.PI / 32) * (section.outerDiameter ** 4 - section.innerDiameter ** 4)
    case 'rectangle':
      return (section.width * section.height * (section.width ** 2 + section.height ** 2)) / 12
    case 'area': {
      if (section.polarMoment !== undefined) return section.polarMoment
      const i = secondMoments(section)
      return i ? i.weak + i.strong : undefined
    }
    default:
      return undefined
  }
}

/** Shear modulus G, Pa: given, or E / (2(1 + ν)); undefined when neither is known. */
export function shearModulus(material: Pick<Material, 'youngsModulus' | 'poissonRatio' | 'shearModulus'>): number | undefined {
  if (material.shearModulus !== undefined) return material.shearModulus
  if (material.poissonRatio !== undefined) return material.youngsModulus / (2 * (1 + material.poissonRatio))
  return undefined
}

/**
 * Timoshenko shear coefficient κ (shear stiffness κGA) by Cowper's formulas: solid circle
 * 6(1 + ν)/(7 + 6ν); hollow circle with m = d_i/d_o: 6(1 + ν)(1 + m²)² / [(7 + 6ν)(1 + m²)² + (20 + 12ν)m²];
 * rectangle 10(1 + ν)/(12 + 11ν). For a section given only by its area Rodwave takes 5/6, the
 * rectangle's value at ν = 0 (common practice, no source) and says so in the report.
 */
export function shearCoefficient(section: Section, poissonRatio: number): number {
  const nu = poissonRatio
  switch (section.shape) {
    case 'solid':
    case 'cone':
      return (6 * (1 + nu)) / (7 + 6 * nu)
    case 'tube': {
      const m = section.innerDiameter / section.outerDiameter
      const q = (1 + m * m) ** 2
      return (6 * (1 + nu) * q) / ((7 + 6 * nu) * q + (20 + 12 * nu) * m * m)
    }
    case 'rectangle':
      return (10 * (1 + nu)) / (12 + 11 * nu)
    case 'area':
      return 5 / 6
  }
}

/** Poisson's ratio implied by a material, for shear coefficients (0.3 when only G is given and E, G disagree with any ν in range). */
export function poissonRatioOf(material: Pick<Material, 'youngsModulus' | 'poissonRatio' | 'shearModulus'>): number | undefined {
  if (material.poissonRatio !== undefined) return material.poissonRatio
  if (material.shearModulus !== undefined) {
    const nu = material.youngsModulus / (2 * material.shearModulus) - 1
    return nu > -1 && nu < 0.5 ? nu : undefined
  }
  return undefined
}

/** Largest distance from the neutral axis to the surface in the given plane (bending stress = M c / I), m. */
export function extremeFibre(section: Section, plane: 'weak' | 'strong', t = 0): number | undefined {
  const d = roundDiameter(section, t)
  if (d !== null) return d / 2
  switch (section.shape) {
    case 'tube':
      return section.outerDiameter / 2
    case 'rectangle': {
      // Bending about the weak axis strains the thin direction.
      const thin = Math.min(section.width, section.height)
      const wide = Math.max(section.width, section.height)
      return (plane === 'weak' ? thin : wide) / 2
    }
    default:
      return undefined
  }
}

/** Radius to the outer surface for torsional shear stress τ = T r / J on round sections, m. */
export function torsionRadius(section: Section, t = 0): number | undefined {
  const d = roundDiameter(section, t)
  if (d !== null) return d / 2
  if (section.shape === 'tube') return section.outerDiameter / 2
  return undefined
}
