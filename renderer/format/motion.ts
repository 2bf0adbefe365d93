/**
 * Which motion a result covers, so that every verdict can say it ("clear in axial motion",
 * "clear in bending (weak plane)"): read from the data's own `motion` and `plane`.
 */
import type { ResonanceStatus } from '../../core/analysis/resonance'
import type { Motion } from '../../core/model/project'
import type { BendingPlane } from '../../core/model/families'

export interface MotionOfResult {
  readonly motion: Motion
  readonly plane: BendingPlane | null
}

const MOTION_WORDS: Record<Motion, string> = {
  axial: 'axial motion',
  torsion: 'torsion',
  bending: 'bending',
}

const isMotion = (value: unknown): value is Motion => typeof value === 'string' && value in MOTION_WORDS

/** The motion of a mode, pair or result: its own `motion` (and `plane`); axial for results of version 1 that carry none. */
export function motionOf(item: object | null | undefined): MotionOfResult {
  const motion = item ? (item as { motion?: unknown }).motion : undefined
  const plane = item ? (item as { plane?: unknown }).plane : undefined
  return { motion: isMotion(motion) ? motion : 'axial', plane: plane === 'weak' || plane === 'strong' ? plane : null }
}

/** "axial motion", "torsion", "bending", "bending (weak plane)". */
export function motionWords(of: MotionOfResult): string {
  return of.plane ? `${MOTION_WORDS[of.motion]} (${of.plane} plane)` : MOTION_WORDS[of.motion]
}

/** The motions present in a list (in the order met), in words: "axial motion", or "axial motion and bending". */
export function motionsText(items: readonly object[]): string {
  const words = [...new Set(items.map((i) => motionWords(motionOf(i))))]
  if (words.length === 0) words.push(MOTION_WORDS.axial)
  return words.length === 1 ? words[0] : `${words.slice(0, -1).join(', ')} and ${words.at(-1)}`
}

/** A verdict in words: a clear one names the motion it covers ("clear in axial motion"); a conflict is a conflict. */
export function verdictText(status: ResonanceStatus, of: MotionOfResult = { motion: 'axial', plane: null }): string {
  return status === 'clear' ? `clear in ${motionWords(of)}` : 'conflict'
}

const FAMILY_TITLES: Record<Motion, string> = { axial: 'Axial', torsion: 'Torsion', bending: 'Bending' }

/** A family as a heading or a table cell: "Axial", "Torsion", "Bending", "Bending (weak plane)". */
export function familyTitle(of: MotionOfResult): string {
  return of.plane ? `${FAMILY_TITLES[of.motion]} (${of.plane} plane)` : FAMILY_TITLES[of.motion]
}

/** A short family name for tight cells: "axial", "torsion", "bending", "bending, weak". */
export function familyShort(of: MotionOfResult): string {
  return of.plane ? `${of.motion}, ${of.plane}` : of.motion
}

/** A mode named with its family: "axial mode 2", "bending mode 1 (weak plane)". */
export function modeName(item: object & { readonly mode: number }): string {
  const of = motionOf(item)
  return `${of.motion} mode ${item.mode}${of.plane ? ` (${of.plane} plane)` : ''}`
}

/**
 * A pair's plain-language sentence (core's pairSentence, "Mode 1 at 51.2 Hz is 2.6 % above …")
 * with the family in conflict named first: "Bending mode 1 at 51.2 Hz is 2.6 % above …".
 */
export function familyPairSentence(sentence: string, pair: object & { readonly mode: number }): string {
  const name = modeName(pair)
  return sentence.replace(/^Mode \d+/, name.charAt(0).toUpperCase() + name.slice(1))
}

/** A mode in a tight cell or a menu: "axial 2", "bending 1 (weak)". */
export function modeTag(item: object & { readonly mode: number }): string {
  const of = motionOf(item)
  return `${of.motion} ${item.mode}${of.plane ? ` (${of.plane})` : ''}`
}

/** A family key in words: "axial", "torsion", "bending", "bending (weak plane)". */
export function familyKeyWords(key: string): string {
  const [motion, plane] = key.split('-')
  return plane ? `${motion} (${plane} plane)` : motion
}
