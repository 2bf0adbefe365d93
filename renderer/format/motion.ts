/**
 * Which motion a result covers, so that every verdict can say it ("clear in axial motion").
 * The engine computes axial modes only today; results of other families (torsion, bending) are
 * to carry their own `family`, which these helpers read from the data instead of assuming.
 */
import type { ResonanceStatus } from '../../core/analysis/resonance'

export type MotionFamily = 'axial' | 'torsional' | 'bending'

const MOTION_WORDS: Record<MotionFamily, string> = {
  axial: 'axial motion',
  torsional: 'torsional motion',
  bending: 'bending',
}

/** The family of results that carry none: the only one the engine computes today. */
export const DEFAULT_MOTION: MotionFamily = 'axial'

const isFamily = (value: unknown): value is MotionFamily => typeof value === 'string' && value in MOTION_WORDS

/** The family of a mode, pair or result set: its own `family` where it has one, else axial. */
export function motionOf(item: object | null | undefined): MotionFamily {
  const family = item ? (item as { family?: unknown }).family : undefined
  return isFamily(family) ? family : DEFAULT_MOTION
}

/** "axial motion", "torsional motion", "bending". */
export function motionWords(family: MotionFamily): string {
  return MOTION_WORDS[family]
}

/** The families present in a list (in the order met), in words: "axial motion", or "axial motion and bending". */
export function motionsText(items: readonly object[]): string {
  const families = [...new Set(items.map(motionOf))]
  const words = (families.length ? families : [DEFAULT_MOTION]).map(motionWords)
  return words.length === 1 ? words[0] : `${words.slice(0, -1).join(', ')} and ${words.at(-1)}`
}

/** A verdict in words: a clear one names the motion it covers ("clear in axial motion"); a conflict is a conflict. */
export function verdictText(status: ResonanceStatus, family: MotionFamily = DEFAULT_MOTION): string {
  return status === 'clear' ? `clear in ${motionWords(family)}` : 'conflict'
}
