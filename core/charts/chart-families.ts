/**
 * How the charts tell the motion families apart: a name, and on the interference diagram a
 * line style for each family's natural frequencies and a symbol for its conflicts (shape, not
 * colour alone, so the difference survives print in grey and colour blindness).
 */
import { familyName, familyOf, type Family, type FamilyKey } from '../model/families'

/** The family of a key: "bending-weak" → bending in the weak plane. */
export function familyOfKey(key: FamilyKey): Family {
  if (key === 'bending-weak') return familyOf('bending', 'weak')
  if (key === 'bending-strong') return familyOf('bending', 'strong')
  return familyOf(key)
}

export function capitalise(text: string): string {
  return text.charAt(0).toUpperCase() + text.slice(1)
}

/** "Axial", "Torsion", "Bending", "Bending (weak plane)". */
export function familyTitleOfKey(key: FamilyKey): string {
  return capitalise(familyName(familyOfKey(key)))
}

/** Short words for labels on a crowded chart: "Axial", "Torsion", "Bending", "Bending weak". */
export function familyShortTitle(key: FamilyKey): string {
  const family = familyOfKey(key)
  return capitalise(family.plane ? `${family.motion} ${family.plane}` : family.motion)
}

/** "mode 2", or with the family "torsion mode 2" / "bending mode 2 (weak plane)". */
export function modeWords(mode: { readonly mode: number; readonly family: FamilyKey }, withFamily: boolean): string {
  if (!withFamily) return `mode ${mode.mode}`
  const family = familyOfKey(mode.family)
  return `${family.motion} mode ${mode.mode}${family.plane ? ` (${family.plane} plane)` : ''}`
}

export interface FamilyMarker {
  /** ECharts symbol of the family's conflict marks and legend entry. */
  readonly symbol: 'diamond' | 'triangle' | 'rect' | 'circle'
  /** Line style of the family's natural frequencies: solid, dashed or a dash pattern (px). */
  readonly lineType: 'solid' | 'dashed' | number[]
}

export const FAMILY_MARKERS: Readonly<Record<FamilyKey, FamilyMarker>> = {
  axial: { symbol: 'diamond', lineType: 'solid' },
  torsion: { symbol: 'triangle', lineType: 'dashed' },
  bending: { symbol: 'rect', lineType: [2, 3] },
  'bending-weak': { symbol: 'rect', lineType: [2, 3] },
  'bending-strong': { symbol: 'circle', lineType: [9, 3, 2, 3] },
}
