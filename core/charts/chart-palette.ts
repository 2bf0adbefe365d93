/**
 * Colours and type of Rodwave's charts, light and dark. Series colours are chosen to stay
 * apart for the common kinds of colour blindness (a blue–orange–green–purple family)
 * and to read on both backgrounds.
 */
export interface ChartPalette {
  readonly background: string
  readonly text: string
  readonly mutedText: string
  readonly axisLine: string
  readonly splitLine: string
  /** Colours of successive series (modes, mass matrices). */
  readonly series: readonly string[]
  readonly conflict: string
  readonly clear: string
  /** Fill of a natural frequency's margin band on the interference diagram. */
  readonly modeBand: string
  readonly modeLine: string
  /** Fill of an operating speed range. */
  readonly speedRange: string
  /** Fill of a fixed-frequency excitation band. */
  readonly frequencyBand: string
  readonly frequencyLine: string
  readonly boundaryLine: string
  readonly tooltipBackground: string
  readonly tooltipBorder: string
  readonly tooltipText: string
  readonly fontFamily: string
}

// No double quotes: ECharts' server-side SVG writes this inside a double-quoted style attribute.
const FONT = "system-ui, -apple-system, 'Segoe UI', Roboto, 'Helvetica Neue', Arial, sans-serif"

export const LIGHT_CHART_PALETTE: ChartPalette = {
  background: '#ffffff',
  text: '#1c232b',
  mutedText: '#56606c',
  axisLine: '#8a949f',
  splitLine: '#e3e7ec',
  series: ['#1d5fc4', '#d9730d', '#2b8a57', '#8a4fc4', '#c23b6a', '#2a8fa8', '#7a6a12', '#4a5563'],
  conflict: '#c62828',
  clear: '#2b7a4b',
  modeBand: 'rgba(29, 95, 196, 0.12)',
  modeLine: '#1d5fc4',
  speedRange: 'rgba(217, 115, 13, 0.14)',
  frequencyBand: 'rgba(138, 79, 196, 0.16)',
  frequencyLine: '#8a4fc4',
  boundaryLine: '#9aa4af',
  tooltipBackground: '#ffffff',
  tooltipBorder: '#c9d0d8',
  tooltipText: '#1c232b',
  fontFamily: FONT,
}

export const DARK_CHART_PALETTE: ChartPalette = {
  background: '#1b2128',
  text: '#e4e9ef',
  mutedText: '#9ba6b2',
  axisLine: '#6f7a86',
  splitLine: '#2c353f',
  series: ['#7eaaff', '#f5a35b', '#6fd19b', '#c3a0f5', '#f08bb0', '#6cc9de', '#d9c36a', '#b8c2cc'],
  conflict: '#ff6b6b',
  clear: '#6fd19b',
  modeBand: 'rgba(126, 170, 255, 0.16)',
  modeLine: '#7eaaff',
  speedRange: 'rgba(245, 163, 91, 0.16)',
  frequencyBand: 'rgba(195, 160, 245, 0.18)',
  frequencyLine: '#c3a0f5',
  boundaryLine: '#5d6873',
  tooltipBackground: '#242c35',
  tooltipBorder: '#3a4551',
  tooltipText: '#e4e9ef',
  fontFamily: FONT,
}
