/**
 * What to say about a tuner's separation search: whether the best value clears every excitation
 * by the margin, whether it separates further than the part as it is, and, when no value in the
 * range clears the conflict, what would: the same parameter over a wider range, or the parameter
 * with the largest effect on the mode in conflict. Both come from first-order sensitivities of the
 * exact frequencies (Rayleigh's principle, see core/analysis/sensitivity.ts): Δf/f ≈ s · Δp/p with
 * s = (p/f) df/dp, so the change that moves f by a fraction Δ is Δp/p ≈ Δ/s. They are estimates
 * for one pair, to be checked by a search over the range they suggest.
 */
import { excitationBands, separationFromBand, type ExcitationBand } from '../../core/analysis/resonance'
import type { DesignParameter } from '../../core/analysis/design-parameters'
import type { Sensitivity } from '../../core/analysis/sensitivity'
import type { TuneResult } from '../../core/analysis/tuner'
import type { Excitation, Motion } from '../../core/model/project'

/** The mode–band pair that sets the smallest separation. */
export interface ClosestPair {
  readonly mode: number
  /** The mode's family key and motion, when the frequencies come family by family (a tuner's result). */
  readonly family?: string
  readonly motion?: Motion
  readonly plane?: 'weak' | 'strong' | null
  readonly frequencyHz: number
  readonly band: ExcitationBand
  readonly separation: number
}

/** Where each of a tuner's frequencies belongs: its family key and its mode number within the family. */
export type FrequencyLayout = readonly { readonly family: string; readonly mode: number }[]

/** A family key's motion and plane: "bending-weak" → bending, weak. */
export function familyOfKey(key: string): { motion: Motion; plane: 'weak' | 'strong' | null } {
  const [motion, plane] = key.split('-')
  return { motion: motion as Motion, plane: plane === 'weak' || plane === 'strong' ? plane : null }
}

/**
 * The pair with the smallest |separation| among elastic modes (f > 0) and the bands; null without
 * bands. With a layout, mode numbers and families come from it and a band is paired only with the
 * families it drives (as the resonance check pairs them).
 */
export function closestPairAt(frequenciesHz: readonly number[], bands: readonly ExcitationBand[], layout?: FrequencyLayout): ClosestPair | null {
  let best: ClosestPair | null = null
  frequenciesHz.forEach((f, i) => {
    if (!(f > 0)) return
    const place = layout?.[i]
    const family = place ? familyOfKey(place.family) : null
    for (const band of bands) {
      if (family && !band.excites.includes(family.motion)) continue
      const separation = separationFromBand(f, band.hz)
      if (!best || Math.abs(separation) < Math.abs(best.separation)) {
        best = place && family ? { mode: place.mode, family: place.family, motion: family.motion, plane: family.plane, frequencyHz: f, band, separation } : { mode: i + 1, frequencyHz: f, band, separation }
      }
    }
  })
  return best
}

/**
 * The relative change of a frequency that takes it just clear of a band by the margin, the
 * shorter way: up to hi·(1 + margin) or down to lo·(1 − margin) (resonance.ts: a pair is clear
 * when |separation| ≥ margin).
 */
export function clearingChange(frequencyHz: number, band: readonly [number, number], margin: number): number {
  const up = (band[1] * (1 + margin)) / frequencyHz - 1
  const down = (band[0] * (1 - margin)) / frequencyHz - 1
  return Math.abs(down) < Math.abs(up) && band[0] * (1 - margin) > 0 ? down : up
}

/** A parameter change a suggestion names: from its value now to about `target` (SI), a relative change `change`. */
export interface SuggestedChange {
  readonly parameter: DesignParameter
  readonly change: number
  readonly target: number
}

export interface TuneAdvice {
  /** The best value clears every band by the margin. */
  readonly clears: boolean
  /** The best value separates further than the part as it is. */
  readonly improves: boolean
  /** The pair that sets the smallest separation at the best value. */
  readonly closest: ClosestPair | null
  /** The pair in conflict in the part as it is, that the suggestions aim to clear. */
  readonly conflict: ClosestPair | null
  /** The same parameter, beyond the range searched. */
  readonly widen: (SuggestedChange & { readonly bound: 'lower' | 'upper' }) | null
  /** The parameter with the largest effect on the mode in conflict, other than the one searched. */
  readonly other: SuggestedChange | null
}

/** A change that would leave less than this fraction of a value (or make it negative) is not offered. */
const SMALLEST_REMAINING = 0.1
/** Relative sensitivities below this move nothing (round-off). */
const NO_EFFECT = 1e-6
/** Separations closer than this are the same (the search's own resolution). */
const SAME_SEPARATION = 1e-9

export interface TuneAdviceInput {
  readonly result: TuneResult
  /** The range searched (SI). */
  readonly bounds: readonly [number, number]
  readonly excitations: readonly Excitation[]
  readonly margin: number
  /** Sensitivities of the part as it is, if current (of every family; matched by family where they say theirs). */
  readonly sensitivities?: { readonly parameters: readonly DesignParameter[]; readonly sensitivities: readonly (Sensitivity & { readonly family?: string })[] } | null
  /** The families analysed: a band drives those its excitation names among them (every one by default). */
  readonly motions?: readonly Motion[]
}

export function tuneAdvice(input: TuneAdviceInput): TuneAdvice {
  const { result, margin } = input
  const bands = excitationBands(input.excitations, input.motions)
  // A result of core's tuner says where each frequency belongs; older results (one family) do not.
  const layout: FrequencyLayout | undefined = (result as { families?: FrequencyLayout }).families
  const closest = closestPairAt(result.frequenciesHz, bands, layout)
  const clears = result.minSeparation !== null && result.minSeparation >= margin
  const improves = result.minSeparation !== null && result.before.minSeparation !== null && result.minSeparation > result.before.minSeparation + SAME_SEPARATION
  const conflict = closestPairAt(result.before.frequenciesHz, bands, layout)
  if (clears || !conflict || Math.abs(conflict.separation) >= margin || !input.sensitivities) return { clears, improves, closest, conflict, widen: null, other: null }

  const needed = clearingChange(conflict.frequencyHz, conflict.band.hz, margin)
  const suggestion = (parameter: DesignParameter | undefined): SuggestedChange | null => {
    if (!parameter) return null
    const s = input.sensitivities!.sensitivities.find((x) => x.mode === conflict.mode && x.parameter === parameter.path && (conflict.family === undefined || x.family === undefined || x.family === conflict.family))
    if (!s || !(Math.abs(s.relative) > NO_EFFECT)) return null
    const change = needed / s.relative
    if (!(1 + change >= SMALLEST_REMAINING) || !Number.isFinite(change)) return null
    return { parameter, change, target: parameter.value * (1 + change) }
  }

  const own = suggestion(input.sensitivities.parameters.find((p) => p.path === result.parameter))
  const [min, max] = input.bounds
  const widen = own && (own.target < min || own.target > max) ? { ...own, bound: own.target < min ? ('lower' as const) : ('upper' as const) } : null

  let other: SuggestedChange | null = null
  for (const parameter of input.sensitivities.parameters) {
    if (parameter.path === result.parameter) continue
    const candidate = suggestion(parameter)
    if (candidate && (!other || Math.abs(candidate.change) < Math.abs(other.change))) other = candidate
  }
  return { clears, improves, closest, conflict, widen, other }
}

/** A range to search around a suggested value: from the value now to a little beyond the estimate (first order falls short on large changes). */
export function suggestedRange(change: SuggestedChange): [number, number] {
  const now = change.parameter.value
  const beyond = now * (1 + 1.5 * change.change)
  const far = change.change > 0 ? beyond : Math.max(beyond, now * (SMALLEST_REMAINING / 2))
  return change.change > 0 ? [now, far] : [far, now]
}
