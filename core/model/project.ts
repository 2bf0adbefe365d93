/**
 * The Rodwave project, file format version 1 (see README, "Project file").
 * Every stored number is SI: m, kg, s, N, Pa. `units` only chooses the display.
 */
import type { UnitSystem } from './units'

export const FORMAT_NAME = 'rodwave'
export const FORMAT_VERSION = 1

export type EndCondition = 'fixed' | 'free'
export type MassMatrixKind = 'consistent' | 'lumped' | 'mixed'
export type ElementOrder = 1 | 2

export interface Material {
  id: string
  name?: string
  youngsModulus: number
  density: number
}

export type Section =
  | { shape: 'solid'; diameter: number }
  | { shape: 'tube'; outerDiameter: number; innerDiameter: number }
  | { shape: 'rectangle'; width: number; height: number }
  | { shape: 'area'; area: number }
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
  label?: string
}

export interface GroundSpring {
  at: number
  stiffness: number
  label?: string
}

export interface AnalysisSettings {
  elementOrder: ElementOrder
  /** One of elementsPerSegment and maxElementLength sets the mesh density. */
  elementsPerSegment?: number
  maxElementLength?: number
  mass: MassMatrixKind
  modes: number
}

/** Single value or [min, max]. */
export type ValueOrRange = number | [number, number]

export type Excitation =
  | { label?: string; rpm: ValueOrRange; orders: number[] }
  | { label?: string; hz: ValueOrRange }

export interface Tolerances {
  youngsModulus?: number
  density?: number
  length?: number
  diameter?: number
  mass?: number
  stiffness?: number
}

export interface Project {
  format: typeof FORMAT_NAME
  version: typeof FORMAT_VERSION
  title?: string
  units: UnitSystem
  materials: Material[]
  segments: Segment[]
  ends: { start: EndCondition; end: EndCondition }
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

/** Upper limits that keep a solve within memory and time on a desktop machine. */
export const LIMITS = {
  /** Unknowns of the discrete model (nodes less fixed ends). */
  maxDegreesOfFreedom: 2_000_000,
  maxModes: 200,
  maxSegments: 1000,
  maxAttachments: 1000,
  maxExcitations: 200,
  maxOrdersPerExcitation: 100,
} as const
