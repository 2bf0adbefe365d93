/**
 * The modal summary report: one self-contained HTML document (inline CSS, charts as inline
 * SVG, no scripts, fonts, images or links to load) that prints as an A4 document. It runs
 * in the app and on the command line alike; both turn it into PDF with a browser engine.
 */
import type { ConvergenceStudy } from '../analysis/convergence'
import type { ModalAnalysis } from '../analysis/modal-analysis'
import { modelWarnings, type ModelWarning } from '../analysis/model-checks'
import { checksSection, sturmResultText } from './checks-section'
import { escapeHtml, keyValueTable } from './html'
import { convergenceAppendix, meshSection, seriesTitle } from './mesh-section'
import { materialsSection, modelSection } from './model-section'
import { modesSection } from './modes-section'
import { notesSection } from './notes-section'
import { figure } from '../charts/chart-text'
import { formatDateTime, formatFrequency, formatRelativeError, formatSignedPercent } from './number-format'
import { closestOverall, marginText, resonanceSection } from './resonance-section'
import { reportFigures } from './report-figures'
import { REPORT_CSS } from './report-style'
import { reportUnits, unitSystemName } from './report-units'

export interface ModalReportInput {
  readonly analysis: ModalAnalysis
  readonly convergence?: ConvergenceStudy
  readonly generatedAt: Date
  readonly appVersion: string
}

export const UNTITLED = 'Untitled part'

function verdict(analysis: ModalAnalysis, warnings: readonly ModelWarning[]): string {
  const { resonance, project } = analysis
  const conflicts = resonance.filter((p) => p.status === 'conflict')
  const closest = closestOverall(resonance)
  const lines: string[] = []
  if (project.excitations.length === 0) {
    lines.push('<b>Resonance:</b> no excitations entered; nothing was checked against the machines nearby.')
  } else if (resonance.length === 0) {
    lines.push('<b>Resonance:</b> no elastic mode was found, so no pair was checked.')
  } else if (conflicts.length === 0) {
    lines.push(`<b>Resonance:</b> <span class="status-clear">every mode is clear</span> of every excitation by at least the ${marginText(project.margin)} margin.`)
  } else {
    const modes = [...new Set(conflicts.map((p) => p.mode))]
    lines.push(
      `<b>Resonance:</b> <span class="status-conflict">${conflicts.length} conflict${conflicts.length === 1 ? '' : 's'}</span> inside the ${marginText(project.margin)} margin, mode${modes.length === 1 ? '' : 's'} ${modes.join(', ')}.`,
    )
  }
  if (closest) {
    const order = closest.band.order === null ? '' : ` ×${figure(closest.band.order, 6)}`
    lines.push(
      `<b>Closest pair:</b> mode ${closest.mode} at ${formatFrequency(closest.frequencyHz)} Hz against ${escapeHtml(closest.band.label)}${order}, separation ${formatSignedPercent(closest.separation)} %.`,
    )
  }
  lines.push(`<b>Sturm count:</b> ${escapeHtml(sturmResultText(analysis.families[0]))}`)
  if (warnings.length) {
    lines.push(`<b>Model checks:</b> <span class="status-conflict">${warnings.length} warning${warnings.length === 1 ? '' : 's'}</span> about the trust in these results; see section 6.`)
  }
  const errors = analysis.modes.map((m) => m.errorVsReference).filter((e): e is number => e !== null)
  if (errors.length) {
    const largest = errors.reduce((a, b) => (Math.abs(b) > Math.abs(a) ? b : a))
    lines.push(`<b>Accuracy:</b> largest relative error of a reported frequency against the exact solution ${formatRelativeError(largest)}.`)
  }
  lines.push('<b>Use:</b> an engineering aid. Verify on the real part and read the assumptions and cautions (section 7) before relying on these results.')
  const alarm = conflicts.length > 0 || warnings.length > 0 || !analysis.sturmPassed
  return `<div class="verdict${alarm ? ' has-conflict' : ''}">${lines.map((l) => `<p>${l}</p>`).join('\n')}</div>`
}

export function modalReportHtml(input: ModalReportInput): string {
  const { analysis, convergence, generatedAt, appVersion } = input
  const project = analysis.project
  const units = reportUnits(project.units)
  const title = project.title?.trim() || UNTITLED
  const figures = reportFigures(analysis, convergence)
  const warnings = modelWarnings(analysis)
  const s = analysis.settings
  const titleFacts = keyValueTable(
    [
      ['Generated', escapeHtml(formatDateTime(generatedAt))],
      ['Rodwave version', escapeHtml(appVersion)],
      ['Units', escapeHtml(unitSystemName(project.units))],
      ['Analysis', `${escapeHtml(seriesTitle({ elementOrder: s.elementOrder, mass: s.mass }))}, ${analysis.totals.elements} elements, ${analysis.totals.dofs} unknowns`],
    ],
    'facts title-facts',
  )
  return `<!DOCTYPE html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<meta name="generator" content="Rodwave ${escapeHtml(appVersion)}">
<title>${escapeHtml(title)} — axial modal summary</title>
<style>${REPORT_CSS}</style>
</head>
<body>
<main class="sheet">
<header class="title-block">
<p class="doc-kind">Axial modal summary</p>
<h1>${escapeHtml(title)}</h1>
${titleFacts}
${verdict(analysis, warnings)}
</header>
${modelSection(project, units, figures.barDrawing)}
${materialsSection(project, units)}
${meshSection(analysis, units, convergence, figures.convergence)}
${modesSection(analysis, units, figures.modeShapes, figures.modeShapeModes)}
${resonanceSection(analysis, figures.interference)}
${checksSection(analysis, warnings)}
${notesSection()}
${convergenceAppendix(convergence)}
<footer class="colophon">Generated by Rodwave ${escapeHtml(appVersion)} on ${escapeHtml(formatDateTime(generatedAt))}. Values are stored in SI units and shown in ${escapeHtml(unitSystemName(project.units))}.</footer>
</main>
</body>
</html>
`
}
