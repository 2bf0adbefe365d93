/**
 * Numbers on screen. Tables show a fixed count of significant digits in the report's
 * style (core/report/number-format.ts) so the window and the filed report read alike;
 * input fields show a plain, editable form. Values are stored SI and converted at the
 * edge with core/model/units.ts.
 */
import { displayUnit, fromDisplay, toDisplay, type QuantityKind, type UnitSystem } from '../../core/model/units'
import { formatFigure, formatScientific } from '../../core/report/number-format'

/** Significant digits per kind of value, the same everywhere in the window. */
export const DIGITS = {
  frequency: 5,
  speed: 5,
  quantity: 4,
  percent: 3,
  error: 2,
} as const

const NUMBER_PATTERN = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/

/**
 * Text typed in a field → number: undefined for an empty field, NaN for text that is
 * not a number (the validator then names the field), else the value.
 */
export function parseTyped(text: string): number | undefined {
  const trimmed = text.trim().replace(/[\s\u2009\u202f]/g, '').replace(/\u2212/g, '-')
  if (trimmed === '') return undefined
  return NUMBER_PATTERN.test(trimmed) ? Number(trimmed) : NaN
}

/** Digits of a value written as text to be read back (enough to keep it), and of what a field shows (enough to read). */
export const ROUND_TRIP_DIGITS = 10
export const FIELD_DIGITS = 6

/** A value as an input field shows it: `digits` significant digits at most, exponent form only for very large or small values. */
export function fieldText(value: number | null | undefined, digits: number = ROUND_TRIP_DIGITS): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return ''
  const rounded = Number(value.toPrecision(digits))
  const magnitude = Math.abs(rounded)
  if (rounded !== 0 && (magnitude >= 1e7 || magnitude < 1e-4)) {
    const [mantissa, exponent] = rounded.toExponential().split('e')
    return `${mantissa}e${Number(exponent)}`
  }
  return String(rounded)
}

/** SI value → the number a field shows in `units`. */
export function fieldValue(units: UnitSystem, kind: QuantityKind, valueSI: number | null | undefined, digits: number = ROUND_TRIP_DIGITS): string {
  if (valueSI === null || valueSI === undefined || !Number.isFinite(valueSI)) return ''
  return fieldText(toDisplay(units, kind, valueSI), digits)
}

/** Text typed in `units` → SI (undefined for empty, NaN for not a number). */
export function typedToSI(units: UnitSystem, kind: QuantityKind, text: string): number | undefined {
  const typed = parseTyped(text)
  if (typed === undefined || Number.isNaN(typed)) return typed
  return fromDisplay(units, kind, typed)
}

export function unitSymbol(units: UnitSystem, kind: QuantityKind): string {
  return displayUnit(units, kind).symbol
}

/** An SI value shown in `units` with `digits` significant digits (no unit). */
export function shown(units: UnitSystem, kind: QuantityKind, valueSI: number, digits: number = DIGITS.quantity): string {
  return formatFigure(toDisplay(units, kind, valueSI), digits)
}

export function figureText(value: number | null | undefined, digits: number = DIGITS.quantity): string {
  if (value === null || value === undefined) return '—'
  return formatFigure(value, digits)
}

/** A fraction as a percentage figure: 0.0635 → "6.36". */
export function percentText(fraction: number | null | undefined, digits: number = DIGITS.percent): string {
  if (fraction === null || fraction === undefined) return '—'
  return formatFigure(100 * fraction, digits)
}

/** A signed relative error: +3.96 × 10⁻⁸. */
export function relativeErrorText(error: number | null | undefined): string {
  if (error === null || error === undefined) return '—'
  if (error === 0) return '0'
  const text = formatScientific(error, DIGITS.error + 1)
  return error > 0 ? `+${text}` : text
}

/** A signed separation in percent with one decimal: +6.4, −12.0 (0 inside a band). */
export { signedPercentFigure as separationText } from '../../core/charts/chart-text'
