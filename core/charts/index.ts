/**
 * ECharts option builders shared by the app and the report: plain functions returning
 * plain option objects (no ECharts at run time, no DOM). Pass `interactive: true` in the
 * app (tooltips, zoom, animation) and `interactive: false` for a static report rendered
 * with ECharts' server-side SVG renderer.
 */
export * from './chart-common'
export * from './chart-palette'
export { figure, signedPercent, signedPercentFigure, escapeHtml } from './chart-text'
export * from './mode-shape-chart'
export * from './convergence-chart'
export * from './interference-chart'
export * from './response-chart'
