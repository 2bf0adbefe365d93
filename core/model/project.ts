/**
 * The Rodwave project, file format version 2 (see README, "Project file"): a straight part
 * analysed in axial motion, torsion and bending. A version 1 file (axial only) is read as
 * version 2 with `motions: ["axial"]`. Every stored number is SI: m, kg, s, N, Pa.
 * `units` only chooses the display.
 */
import type { UnitSystem } from './units'

export const FORMAT_NAME = 'rodwave'
export const FORMAT_VERSION = 2

/** The three ways a straight part vibrates. */
export type Motion = 'axial' | 'torsion' | 'bending'
/** In the order Rodwave reports them. */
export const MOTIONS: readonly Motion[] = ['axial', 'torsion', 'bending']

/** Axial and torsional end condition: the displacement (or twist) held, or free. */
export type EndCondition = 'fixed' | 'free'
/**
 * Bending end condition: clamped (no deflection, no slope), pinned (no deflection),
 * guided (no slope, free to slide sideways) or free.
 */
export type BendingEndCondition = 'clamped' | 'pinned' | 'guided' | 'free'
export const BENDING_END_CONDITIONS: readonly BendingEndCondition[] = ['clamped', 'pinned', 'guided', 'free']

/** One end of the part, per motion family. */
export interface PartEnd {
  axial: EndCondition
  torsion: EndCondition
  bending: BendingEndCondition
}

export type MassMatrixKind = 'consistent' | 'lumped' | 'mixed'
export type ElementOrder = 1 | 2
export type BendingTheory = 'euler-bernoulli' | 'timoshenko'

export interface Material {
  id: string
  name?: string
  youngsModulus: number
  density: number
  /** For torsion: G = E / (2(1 + ν)), unless shearModulus is given. */
  poissonRatio?: number
  shearModulus?: number
}

export type Section =
  | { shape: 'solid'; diameter: number }
  | { shape: 'tube'; outerDiameter: number; innerDiameter: number }
  | { shape: 'rectangle'; width: number; height: number }
  | {
      shape: 'area'
      area: number
      /** Second moment of area for bending, m⁴ (the weak axis when secondMomentStrong is given). */
      secondMoment?: number
      /** The larger principal second moment, m⁴: the section then bends in two planes. */
      secondMomentStrong?: number
      /** Saint-Venant torsion constant J, m⁴ (torsional stiffness GJ). */
      torsionConstant?: number
      /** Polar second moment Ip, m⁴ (rotary inertia per length ρIp). */
      polarMoment?: number
    }
  | { shape: 'cone'; startDiameter: number; endDiameter: number }

export type SectionShape = Section['shape']

export interface Segment {
  length: number
  material: string
  section: Section
}

export interface PointMass {
  at: number
  mass: number
  /** Rotary inertia about the part's axis (a disk in torsion), kg·m². */
  polarInertia?: number
  /** Rotary inertia about a transverse axis through the point (bending), kg·m². */
  transverseInertia?: number
  label?: string
}

export interface GroundSpring {
  at: number
  /** The family the spring acts in; axial when absent (version 1). */
  motion?: Motion
  /** N/m (axial, bending: sideways) or N·m/rad (torsion). For bending it may be 0 when rotationalStiffness is given. */
  stiffness: number
  /** Bending only: N·m/rad against the slope. */
  rotationalStiffness?: number
  label?: string
}

export interface AnalysisSettings {
  elementOrder: ElementOrder
  /** One of elementsPerSegment and maxElementLength sets the mesh density. */
  elementsPerSegment?: number
  maxElementLength?: number
  mass: MassMatrixKind
  /** Modes reported per family (per bending plane). */
  modes: number
  bendingTheory?: BendingTheory
}

/** Single value or [min, max]. */
export type ValueOrRange = number | [number, number]

export type Excitation =
  | { label?: string; rpm: ValueOrRange; orders: number[]; excites?: Motion[] }
  | { label?: string; hz: ValueOrRange; excites?: Motion[] }

export interface Tolerances {
  youngsModulus?: number
  density?: number
  length?: number
  diameter?: number
  mass?: number
  stiffness?: number
  poissonRatio?: number
}

export interface Project {
  format: typeof FORMAT_NAME
  version: typeof FORMAT_VERSION
  title?: string
  units: UnitSystem
  /** The families analysed, a non-empty subset of MOTIONS. */
  motions: Motion[]
  materials: Material[]
  segments: Segment[]
  ends: { start: PartEnd; end: PartEnd }
  /** Steady axial force, N, tension positive (bending's geometric stiffness). */
  preload?: number
  masses: PointMass[]
  springs: GroundSpring[]
  analysis: AnalysisSettings
  excitations: Excitation[]
  margin: number
  damping: number
  tolerances?: Tolerances
}

export const DEFAULT_ANALYSIS: AnalysisSettings = { elementOrder: 1, elementsPerSegment: 40, mass: 'consistent', modes: 8 }
export const DEFAULT_MARGIN = 0.15
export const DEFAULT_DAMPING = 0.02

/** A version 1 end (a plain string) as a version 2 end: the axial condition, every other family free. */
export function partEnd(axial: EndCondition, torsion: EndCondition = 'free', bending: BendingEndCondition = 'free'): PartEnd {
  return { axial, torsion, bending }
}

/** Which families a spring acts in (axial when not said). */
export function springMotion(spring: Pick<GroundSpring, 'motion'>): Motion {
  return spring.motion ?? 'axial'
}

/** The families an excitation drives: those it names, or every analysed family. */
export function excitedMotions(excitation: Pick<Excitation, 'excites'>, analysed: readonly Motion[]): Motion[] {
  const named = excitation.excites
  return named && named.length ? analysed.filter((m) => named.includes(m)) : [...analysed]
}

/** Upper limits that keep a solve within memory and time on a desktop machine. */
export const LIMITS = {
  /** Unknowns of the discrete model (nodes less fixed ends; two per node in bending). */
  maxDegreesOfFreedom: 2_000_000,
  maxModes: 200,
  /**
   * Unknowns × modes: the mode shapes alone take 8 bytes per product (800 MB at the limit);
   * 2 million unknowns × 200 modes took 3.6 GB and 7 minutes.
   */
  maxUnknownsTimesModes: 100_000_000,
  maxSegments: 1000,
  maxAttachments: 1000,
  maxExcitations: 200,
  maxOrdersPerExcitation: 100,
  /** Longest id, label or title kept; longer text is refused. */
  maxIdLength: 100,
  maxLabelLength: 200,
} as const
