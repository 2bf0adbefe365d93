/** Text helpers shared by the chart builders and the scale drawing. */
import { formatFigure } from '../report/number-format'

/** A figure with `significant` digits as the report writes them (× 10ⁿ outside 10⁻³ … 10⁶), without trailing zeros. */
export function figure(value: number, significant = 4): string {
  const text = formatFigure(value, significant)
  return text.includes('.') && !text.includes('×') ? text.replace(/\.?0+$/, '') : text
}

/** A fraction as a signed percentage figure with fixed decimals: +6.4, −12.0; 0 inside a band. */
export function signedPercentFigure(fraction: number, decimals = 1): string {
  const value = 100 * fraction
  const text = Math.abs(value).toFixed(decimals)
  if (Number(text) === 0) return '0'
  return `${value < 0 ? '\u2212' : '+'}${text}`
}

/** The same with its unit: +6.4 %. */
export function signedPercent(fraction: number, decimals = 1): string {
  return `${signedPercentFigure(fraction, decimals)} %`
}

/** Escapes text placed in tooltip HTML (labels are typed by the user): the report's own escaping. */
export { escapeHtml } from '../report/html'
