/**
 * Resonance check: every natural frequency against every excitation band.
 * A speed excitation (rpm, single or range) with orders gives one band per order,
 * [rpm_min·order, rpm_max·order]/60 Hz; a frequency excitation gives its own band.
 * separation = (f_mode − f_exc)/f_exc with f_exc the nearest point of the band (0 inside);
 * a pair conflicts when |separation| < margin. Keeping modes 10–20 % away from excitation
 * is common practice (no single source); Rodwave's default margin is 15 %.
 */
import type { Excitation, Motion, Project } from '../model/project'
import { excitedMotions } from '../model/project'
import type { BendingPlane, FamilyKey } from '../model/families'
import { RPM } from '../model/units'

export interface ExcitationBand {
  /** Index in project.excitations. */
  readonly excitationIndex: number
  readonly label: string
  /** Multiple of running speed, or null for a frequency excitation. */
  readonly order: number | null
  readonly hz: readonly [number, number]
  /** The families this band drives (the excitation's `excites`, or every analysed family). */
  readonly excites: readonly Motion[]
}

export type ResonanceStatus = 'clear' | 'conflict'

export interface ResonancePair {
  readonly mode: number
  readonly motion: Motion
  readonly plane: BendingPlane | null
  readonly family: FamilyKey
  /** The mode's frequency the separation was computed from (the exact one where known). */
  readonly frequencyHz: number
  readonly band: ExcitationBand
  readonly separation: number
  readonly status: ResonanceStatus
  /** When the check used the mode's tolerance band: its 5 % and 95 % frequencies. */
  readonly modeBandHz?: readonly [number, number]
}

export function excitationLabel(excitation: Excitation, index: number): string {
  return excitation.label?.trim() || `Excitation ${index + 1}`
}

function asRange(v: number | [number, number]): [number, number] {
  return Array.isArray(v) ? [v[0], v[1]] : [v, v]
}

/** Every excitation band; `analysed` (default: every motion) limits what each band drives. */
export function excitationBands(excitations: readonly Excitation[], analysed: readonly Motion[] = ['axial', 'torsion', 'bending']): ExcitationBand[] {
  const bands: ExcitationBand[] = []
  excitations.forEach((e, i) => {
    const label = excitationLabel(e, i)
    const excites = excitedMotions(e, analysed)
    if ('rpm' in e) {
      const [lo, hi] = asRange(e.rpm)
      for (const order of e.orders) bands.push({ excitationIndex: i, label, order, hz: [lo * order * RPM, hi * order * RPM], excites })
    } else {
      bands.push({ excitationIndex: i, label, order: null, hz: asRange(e.hz), excites })
    }
  })
  return bands
}

/** Signed separation of a frequency from a band: negative below it, positive above, 0 inside. */
export function separationFromBand(frequencyHz: number, band: readonly [number, number]): number {
  const [lo, hi] = band
  if (frequencyHz < lo) return (frequencyHz - lo) / lo
  if (frequencyHz > hi) return (frequencyHz - hi) / hi
  return 0
}

/**
 * Separation of a frequency band (e.g. a mode's 5–95 % tolerance scatter) from an excitation
 * band: the nearest points of the two, 0 when they overlap.
 */
export function separationBetweenBands(mode: readonly [number, number], band: readonly [number, number]): number {
  const [a, b] = mode
  const [lo, hi] = band
  if (b < lo) return (b - lo) / lo
  if (a > hi) return (a - hi) / hi
  return 0
}

export function statusOf(separation: number, margin: number): ResonanceStatus {
  return Math.abs(separation) < margin ? 'conflict' : 'clear'
}

/** What the check needs of a mode. */
export interface CheckedMode {
  readonly mode: number
  readonly motion: Motion
  readonly plane: BendingPlane | null
  readonly family: FamilyKey
  readonly frequencyHz: number
  readonly rigidBody: boolean
}

/** The key of a mode across families: "bending-weak 2". */
export function modeKey(m: Pick<CheckedMode, 'family' | 'mode'>): string {
  return `${m.family} ${m.mode}`
}

/**
 * Every (elastic mode, band) pair whose band drives the mode's family, mode by mode in the order
 * of the bands. With `scatter` (per mode key, the 5 % and 95 % frequencies of the tolerance
 * scatter) the check uses each mode's band instead of its nominal frequency, as a check with
 * tolerances must.
 */
export function resonancePairs(
  modes: readonly CheckedMode[],
  project: Pick<Project, 'excitations' | 'margin'> & { readonly motions?: readonly Motion[] },
  scatter?: ReadonlyMap<string, readonly [number, number]>,
): ResonancePair[] {
  const bands = excitationBands(project.excitations, project.motions)
  const pairs: ResonancePair[] = []
  for (const m of modes) {
    if (m.rigidBody) continue
    const spread = scatter?.get(modeKey(m))
    for (const band of bands) {
      if (!band.excites.includes(m.motion)) continue
      const separation = spread ? separationBetweenBands(spread, band.hz) : separationFromBand(m.frequencyHz, band.hz)
      pairs.push({
        mode: m.mode,
        motion: m.motion,
        plane: m.plane,
        family: m.family,
        frequencyHz: m.frequencyHz,
        band,
        separation,
        status: statusOf(separation, project.margin),
        ...(spread ? { modeBandHz: spread } : {}),
      })
    }
  }
  return pairs
}

/** The pair of a mode closest to resonance (smallest |separation|), or null when no band drives it. */
export function closestPair(pairs: readonly ResonancePair[], mode: Pick<CheckedMode, 'family' | 'mode'>): ResonancePair | null {
  let best: ResonancePair | null = null
  for (const p of pairs) if (p.family === mode.family && p.mode === mode.mode && (!best || Math.abs(p.separation) < Math.abs(best.separation))) best = p
  return best
}

export function bandName(band: ExcitationBand): string {
  return band.order === null ? band.label : `${band.label} ×${band.order}`
}
