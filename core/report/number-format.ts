/**
 * How the report writes numbers: a fixed count of significant figures, thin-space
 * thousands groups, a true minus sign, and powers of ten (× 10ⁿ) outside 10⁻³ … 10⁶
 * instead of computer "e" notation.
 */

const SUPERSCRIPT: Record<string, string> = {
  '0': '⁰', '1': '¹', '2': '²', '3': '³', '4': '⁴', '5': '⁵', '6': '⁶', '7': '⁷', '8': '⁸', '9': '⁹', '-': '⁻',
}

export const MINUS = '\u2212'
const THIN_SPACE = '\u2009'
export const MISSING = '—'

function withMinus(text: string): string {
  return text.startsWith('-') ? MINUS + text.slice(1) : text
}

function groupThousands(text: string): string {
  const [whole, fraction] = text.split('.')
  const digits = whole.replace('-', '')
  if (digits.length < 5) return text
  const grouped = digits.replace(/\B(?=(\d{3})+(?!\d))/g, THIN_SPACE)
  return `${whole.startsWith('-') ? '-' : ''}${grouped}${fraction !== undefined ? `.${fraction}` : ''}`
}

/** m × 10ⁿ with `significant` figures in m. */
export function formatScientific(value: number, significant = 3): string {
  if (!Number.isFinite(value)) return MISSING
  if (value === 0) return '0'
  const [mantissa, exponent] = value.toExponential(significant - 1).split('e')
  const power = String(Number(exponent))
    .split('')
    .map((c) => SUPERSCRIPT[c])
    .join('')
  return `${withMinus(mantissa)} × 10${power}`
}

/** A figure rounded to `significant` significant digits (large whole numbers too: 123 457 → 123 500 with four). */
export function formatFigure(value: number, significant = 4): string {
  if (!Number.isFinite(value)) return MISSING
  if (value === 0) return '0'
  const magnitude = Math.abs(value)
  if (magnitude >= 1e6 || magnitude < 1e-3) return formatScientific(value, significant)
  // Round first so that e.g. 9.9996 with 4 figures becomes 10.00, not 10.000.
  const rounded = Number(value.toPrecision(significant))
  const exponent = Math.floor(Math.log10(Math.abs(rounded)))
  const decimals = Math.max(0, significant - 1 - exponent)
  return withMinus(groupThousands(rounded.toFixed(decimals)))
}

/** A fraction as a percentage with one decimal: 0.1234 → "12.3". */
export function formatPercent(fraction: number, decimals = 1): string {
  if (!Number.isFinite(fraction)) return MISSING
  return withMinus((100 * fraction).toFixed(decimals))
}

/** A signed fraction as a percentage, with an explicit sign: −0.052 → "−5.2", 0.31 → "+31.0". */
export function formatSignedPercent(fraction: number, decimals = 1): string {
  if (!Number.isFinite(fraction)) return MISSING
  const text = (100 * fraction).toFixed(decimals)
  if (Number(text) === 0) return (0).toFixed(decimals)
  return fraction > 0 ? `+${text}` : withMinus(text)
}

/** Natural frequencies in the tables: five significant figures, in Hz. */
export function formatFrequency(hz: number): string {
  return formatFigure(hz, 5)
}

/** Speeds in rpm: five significant figures. */
export function formatSpeed(rpm: number): string {
  return formatFigure(rpm, 5)
}

/** Relative errors: always as a power of ten, three figures. */
export function formatRelativeError(error: number | null): string {
  return error === null ? MISSING : formatScientific(error, 3)
}

/** A band [lo, hi] as "lo – hi", or a single value when lo = hi. */
export function formatRange(range: readonly [number, number], format: (v: number) => string): string {
  return range[0] === range[1] ? format(range[0]) : `${format(range[0])} – ${format(range[1])}`
}

const pad = (n: number) => String(n).padStart(2, '0')

/** Local date and time with the offset from UTC: 2026-12-01 14:05 (UTC+01:00). */
export function formatDateTime(date: Date): string {
  const offset = -date.getTimezoneOffset()
  const sign = offset >= 0 ? '+' : MINUS
  const hours = Math.floor(Math.abs(offset) / 60)
  const minutes = Math.abs(offset) % 60
  return `${date.getFullYear()}-${pad(date.getMonth() + 1)}-${pad(date.getDate())} ${pad(date.getHours())}:${pad(date.getMinutes())} (UTC${sign}${pad(hours)}:${pad(minutes)})`
}
