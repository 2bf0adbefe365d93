/**
 * Numbers on screen. Tables show a fixed count of significant digits in the report's
 * style (core/report/number-format.ts) so the window and the filed report read alike;
 * input fields show a plain, editable form. Values are stored SI and converted at the
 * edge with core/model/units.ts.
 */
import { displayUnit, PSI, type QuantityKind, type Unit, type UnitSystem } from '../../core/model/units'
import { formatFigure, formatScientific } from '../../core/report/number-format'

/** Significant digits per kind of value, the same everywhere in the window. */
export const DIGITS = {
  frequency: 5,
  speed: 5,
  quantity: 4,
  percent: 3,
  error: 2,
} as const

/**
 * Units the window shows where the trade's usual form differs from core's: a US modulus in
 * Msi (10⁶ psi; steel about 29.0 Msi), not 2.9 × 10⁷ psi (common practice, no source).
 */
const SCREEN_UNITS: Partial<Record<UnitSystem, Partial<Record<QuantityKind, Unit>>>> = {
  US: { modulus: { symbol: 'Msi', toSI: 1e6 * PSI } },
}

/** The unit a quantity is shown and typed in on screen. */
export function screenUnit(units: UnitSystem, kind: QuantityKind): Unit {
  return SCREEN_UNITS[units]?.[kind] ?? displayUnit(units, kind)
}

/** SI value → the number shown on screen. */
export function toScreen(units: UnitSystem, kind: QuantityKind, valueSI: number): number {
  return valueSI / screenUnit(units, kind).toSI
}

/** Number typed on screen → SI. */
export function fromScreen(units: UnitSystem, kind: QuantityKind, value: number): number {
  return value * screenUnit(units, kind).toSI
}

/** The decimal separator of the browser's locale, and its digit-group separator. */
export interface NumberSeparators {
  readonly decimal: '.' | ','
  readonly group: string
}

/** The separators of a locale (the browser's by default), read from Intl.NumberFormat. */
export function localeSeparators(locale?: string | string[]): NumberSeparators {
  try {
    const parts = new Intl.NumberFormat(locale).formatToParts(1234567.5)
    const decimal = parts.find((p) => p.type === 'decimal')?.value
    const group = parts.find((p) => p.type === 'group')?.value ?? ''
    return { decimal: decimal === ',' ? ',' : '.', group }
  } catch {
    return { decimal: '.', group: ',' }
  }
}

/** The browser's separators, read once. */
export const BROWSER_SEPARATORS: NumberSeparators = localeSeparators()

const NUMBER_PATTERN = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/
/** Digits grouped in threes by `sep` with an optional fraction after `dec`: 1.500 or 1.500,25 (sep ".", dec ","). */
const grouped = (sep: string, dec: string) => new RegExp(`^[+-]?[1-9]\\d{0,2}(\\${sep}\\d{3})+(\\${dec}\\d*)?([eE][+-]?\\d+)?$`)

interface ReadNumber {
  /** undefined for empty, NaN for text that is not a number (or not one without doubt). */
  readonly value: number | undefined
  /** Why a number-like text was refused: a separator that could mean two things, or the other decimal mark. */
  readonly problem?: string
}

/**
 * Reads typed text. The locale's decimal mark is accepted (0,16 where the locale writes a decimal
 * comma), and a decimal point always; digit groups only where they cannot be read as a decimal
 * (1.234.567, 1.500,5; 1,234,567, 1,500.5). A single mark followed by three digits (1.500, 1,500)
 * is refused with both readings named, never guessed. Spaces (also thin and no-break),
 * apostrophes used as group marks, and a true minus sign are accepted.
 */
export function readNumber(text: string, separators: NumberSeparators = BROWSER_SEPARATORS): ReadNumber {
  const trimmed = text
    .trim()
    .replace(/[\s\u2009\u202f\u00a0'\u2019]/g, '')
    .replace(/\u2212/g, '-')
  if (trimmed === '') return { value: undefined }
  // One mark followed by exactly three digits (1.500, 1,500) reads as a group or as a decimal: never guessed.
  const twoReadings = (mark: string) => new RegExp(`^[+-]?[1-9]\\d{0,2}\\${mark}\\d{3}$`).test(trimmed)
  const ambiguous = (mark: string) => {
    const asGroups = trimmed.replace(mark, '')
    const asDecimal = String(Number(trimmed.replace(mark, '.'))).replace('.', separators.decimal)
    return { value: NaN, problem: `${trimmed} could mean ${asGroups} or ${asDecimal}: write ${asGroups}, or ${asDecimal}` }
  }
  if (!/\d/.test(trimmed)) return { value: NaN }
  const hasComma = trimmed.includes(',')
  const hasPoint = trimmed.includes('.')
  let normal = trimmed
  if (separators.decimal === ',') {
    if (hasComma && hasPoint) {
      if (!grouped('.', ',').test(trimmed)) return { value: NaN, problem: 'has both a point and a comma: write the decimal with a comma only, e.g. 1500,5' }
      normal = trimmed.replace(/\./g, '').replace(',', '.')
    } else if (hasComma) {
      if (trimmed.indexOf(',') !== trimmed.lastIndexOf(',')) return { value: NaN, problem: 'has more than one decimal comma' }
      normal = trimmed.replace(',', '.')
    } else if (hasPoint && twoReadings('.')) {
      return ambiguous('.')
    } else if (hasPoint && grouped('.', ',').test(trimmed)) {
      normal = trimmed.replace(/\./g, '')
    }
  } else if (hasComma) {
    if (twoReadings(',')) return ambiguous(',')
    if (hasPoint && !grouped(',', '.').test(trimmed)) return { value: NaN, problem: 'has both a comma and a point: write the decimal with a point only, e.g. 1500.5' }
    if (grouped(',', '.').test(trimmed)) normal = trimmed.replace(/,/g, '')
    else return { value: NaN, problem: `uses a comma: write the decimal with a point, e.g. ${trimmed.replace(/,/g, '.')}` }
  }
  return NUMBER_PATTERN.test(normal) ? { value: Number(normal) } : { value: NaN }
}

/**
 * Text typed in a field → number: undefined for an empty field, NaN for text that is not a
 * number (the validator then names the field, and typedProblem says why), else the value.
 */
export function parseTyped(text: string, separators: NumberSeparators = BROWSER_SEPARATORS): number | undefined {
  return readNumber(text, separators).value
}

/** Why typed text was refused, when a separator is the reason (else undefined). */
export function typedProblem(text: string, separators: NumberSeparators = BROWSER_SEPARATORS): string | undefined {
  return readNumber(text, separators).problem
}

/** Digits of a value written as text to be read back (enough to keep it), and of what a field shows (enough to read). */
export const ROUND_TRIP_DIGITS = 10
export const FIELD_DIGITS = 6

/**
 * A value as an input field shows it: `digits` significant digits at most, exponent form only
 * for very large or small values, with the locale's decimal mark (so a field always accepts
 * what it shows).
 */
export function fieldText(value: number | null | undefined, digits: number = ROUND_TRIP_DIGITS, separators: NumberSeparators = BROWSER_SEPARATORS): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return ''
  const rounded = Number(value.toPrecision(digits))
  const magnitude = Math.abs(rounded)
  let text = String(rounded)
  if (rounded !== 0 && (magnitude >= 1e7 || magnitude < 1e-4)) {
    const [mantissa, exponent] = rounded.toExponential().split('e')
    text = `${mantissa}e${Number(exponent)}`
  }
  return separators.decimal === ',' ? text.replace('.', ',') : text
}

/** SI value → the number a field shows in `units`. */
export function fieldValue(units: UnitSystem, kind: QuantityKind, valueSI: number | null | undefined, digits: number = ROUND_TRIP_DIGITS, separators: NumberSeparators = BROWSER_SEPARATORS): string {
  if (valueSI === null || valueSI === undefined || !Number.isFinite(valueSI)) return ''
  return fieldText(toScreen(units, kind, valueSI), digits, separators)
}

/** Text typed in `units` → SI (undefined for empty, NaN for not a number). */
export function typedToSI(units: UnitSystem, kind: QuantityKind, text: string, separators: NumberSeparators = BROWSER_SEPARATORS): number | undefined {
  const typed = parseTyped(text, separators)
  if (typed === undefined || Number.isNaN(typed)) return typed
  return fromScreen(units, kind, typed)
}

export function unitSymbol(units: UnitSystem, kind: QuantityKind): string {
  return screenUnit(units, kind).symbol
}

/** An SI value shown in `units` with `digits` significant digits (no unit). */
export function shown(units: UnitSystem, kind: QuantityKind, valueSI: number, digits: number = DIGITS.quantity): string {
  return formatFigure(toScreen(units, kind, valueSI), digits)
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
