/**
 * The modal summary report: one self-contained HTML document (inline CSS, charts as inline
 * SVG, no scripts, fonts, images or links to load) that prints as an A4 document. It runs
 * in the app and on the command line alike; both turn it into PDF with a browser engine.
 *
 * A part analysed in one motion family reads as the version 1 report did: 1 the part, 2
 * materials, 3 mesh and convergence, 4 modes, 5 resonance, 6 checks, 7 assumptions. With
 * several families, each family gets its own section after the mesh (its modes, mode shapes,
 * convergence, Sturm check and reference), followed by the resonance check, the checks and
 * the assumptions.
 */
import type { ConvergenceStudy } from '../analysis/convergence'
import type { FamilyAnalysis, ModalAnalysis } from '../analysis/modal-analysis'
import { modelWarnings, type ModelWarning } from '../analysis/model-checks'
import { hasTwoBendingPlanes } from '../model/section-properties'
import { checksSection, sturmResultText } from './checks-section'
import { familyFigureCount, familySection, familySectionTitle } from './family-section'
import { escapeHtml, keyValueTable } from './html'
import { bendingElementText, convergenceAppendix, meshSection, seriesTitle } from './mesh-section'
import { materialsSection, modelSection } from './model-section'
import { modesSection } from './modes-section'
import { notesSection, type NotesInput } from './notes-section'
import { figure } from '../charts/chart-text'
import { modeWords } from '../charts/chart-families'
import { formatDateTime, formatFrequency, formatPercent, formatRelativeError, formatSignedPercent } from './number-format'
import { closestOverall, familyVerdictLines, marginText, resonanceSection } from './resonance-section'
import { capitalise, familiesWords, familySectionId, familyTitle, listWords } from './report-families'
import { reportFigures, studyOf } from './report-figures'
import { reportCss } from './report-style'
import { reportUnits, unitSystemName } from './report-units'

export interface ModalReportInput {
  readonly analysis: ModalAnalysis
  /** Convergence studies of the analysed families, at most one per family (each names its family); a family without one is reported without. */
  readonly convergence?: readonly ConvergenceStudy[]
  readonly generatedAt: Date
  readonly appVersion: string
}

export const UNTITLED = 'Untitled part'

/** Where each part of the report is: section numbers. */
interface Layout {
  readonly several: boolean
  readonly familySection: (f: FamilyAnalysis) => number
  readonly resonance: number
  readonly checks: number
  readonly assumptions: number
}

function layoutOf(analysis: ModalAnalysis): Layout {
  const several = analysis.families.length > 1
  const count = several ? analysis.families.length : 1
  return {
    several,
    familySection: (f) => 4 + Math.max(0, analysis.families.indexOf(f)),
    resonance: 4 + count,
    checks: 5 + count,
    assumptions: 6 + count,
  }
}

/** "Axial modal summary"; "Axial, torsion and bending modal summary". */
export function documentKind(analysis: ModalAnalysis): string {
  const motions = [...new Set(analysis.families.map((f) => f.family.motion))]
  return `${capitalise(listWords(motions.length ? motions : ['axial']))} modal summary`
}

function resonanceLines(analysis: ModalAnalysis, layout: Layout): string[] {
  const { resonance, project } = analysis
  const conflicts = resonance.filter((p) => p.status === 'conflict')
  const margin = marginText(project.margin)
  const lines: string[] = []
  const family = analysis.families[0]?.family
  if (project.excitations.length === 0) {
    lines.push('<b>Resonance:</b> no excitations entered; nothing was checked against the machines nearby.')
    return lines
  }
  if (!layout.several) {
    const motion = family ? `${escapeHtml(family.motion)} ` : ''
    if (resonance.length === 0) lines.push('<b>Resonance:</b> no elastic mode was found, so no pair was checked.')
    else if (conflicts.length === 0) lines.push(`<b>Resonance:</b> <span class="status-clear">every ${motion}mode is clear</span> of every excitation by at least the ${margin} margin.`)
    else {
      const modes = [...new Set(conflicts.map((p) => p.mode))]
      lines.push(
        `<b>Resonance:</b> <span class="status-conflict">${conflicts.length} conflict${conflicts.length === 1 ? '' : 's'}</span> inside the ${margin} margin, ${motion}mode${modes.length === 1 ? '' : 's'} ${modes.join(', ')}.`,
      )
    }
    return lines
  }
  const byFamily = familyVerdictLines(analysis)
  const checked = analysis.families.filter((f) => byFamily.find((l) => l.key === f.family.key)?.status !== 'unchecked').map((f) => f.family)
  const unchecked = byFamily.filter((l) => l.status === 'unchecked')
  if (resonance.length === 0) {
    lines.push('<b>Resonance:</b> no excitation drives a motion with an elastic mode, so no pair was checked.')
  } else if (conflicts.length === 0) {
    lines.push(`<b>Resonance:</b> <span class="status-clear">every mode checked is clear</span> of every excitation that drives it by at least the ${margin} margin. Motions checked: ${escapeHtml(familiesWords(checked))}.`)
  } else {
    const groups = analysis.families
      .map((f) => {
        const modes = [...new Set(conflicts.filter((p) => p.family === f.family.key).map((p) => p.mode))]
        return modes.length ? `${escapeHtml(familyTitle(f.family).toLowerCase())} mode${modes.length === 1 ? '' : 's'} ${modes.join(', ')}` : ''
      })
      .filter(Boolean)
    lines.push(`<b>Resonance:</b> <span class="status-conflict">${conflicts.length} conflict${conflicts.length === 1 ? '' : 's'}</span> inside the ${margin} margin: ${groups.join('; ')}.`)
    for (const line of byFamily) if (line.status === 'conflict') lines.push(line.html)
    const clear = byFamily.filter((l) => l.status === 'clear').map((l) => familyTitle(analysis.families.find((f) => f.family.key === l.key)!.family).toLowerCase())
    if (clear.length) lines.push(`<b>Clear:</b> ${escapeHtml(listWords(clear))} — every pair outside the margin.`)
  }
  if (unchecked.length) {
    lines.push(
      `<b>Not checked:</b> ${escapeHtml(listWords(unchecked.map((l) => familyTitle(analysis.families.find((f) => f.family.key === l.key)!.family).toLowerCase())))} — no excitation drives ${unchecked.length === 1 ? 'it' : 'them'} (see the excitations' “Drives” column, section ${layout.resonance}).`,
    )
  }
  return lines
}

function sturmLine(analysis: ModalAnalysis, layout: Layout): string {
  if (!layout.several) return `<b>Sturm count:</b> ${escapeHtml(sturmResultText(analysis.families[0]))}`
  const failed = analysis.families.filter((f) => !f.sturm.passed)
  return failed.length
    ? `<b>Sturm count:</b> <span class="status-conflict">Failed for ${escapeHtml(listWords(failed.map((f) => familyTitle(f.family).toLowerCase())))}</span>: the counts do not confirm that every mode up to the last one reported was found. Do not rely on those results.`
    : `<b>Sturm count:</b> Passed for every family: no mode was missed in ${escapeHtml(familiesWords(analysis.families.map((f) => f.family)))}.`
}

function accuracyLines(analysis: ModalAnalysis, layout: Layout): string[] {
  const lines: string[] = []
  for (const method of ['exact', 'extrapolated'] as const) {
    const families = analysis.families.filter((f) => f.reference.method === method)
    const errors = families.flatMap((f) => f.modes.map((m) => m.errorVsReference)).filter((e): e is number => e !== null)
    if (!errors.length) continue
    const largest = errors.reduce((a, b) => (Math.abs(b) > Math.abs(a) ? b : a))
    const against = method === 'exact' ? 'the exact solution' : 'the extrapolated reference (a Richardson estimate from two fine meshes)'
    const which = layout.several ? ` (${escapeHtml(listWords(families.map((f) => familyTitle(f.family).toLowerCase())))})` : ''
    lines.push(`<b>Accuracy:</b> largest relative error of a reported frequency against ${against}${which} ${formatRelativeError(largest)}.`)
  }
  return lines
}

function verdict(analysis: ModalAnalysis, warnings: readonly ModelWarning[], layout: Layout): string {
  const { resonance } = analysis
  const conflicts = resonance.filter((p) => p.status === 'conflict')
  const closest = closestOverall(resonance)
  const lines = resonanceLines(analysis, layout)
  if (closest) {
    const order = closest.band.order === null ? '' : ` ×${figure(closest.band.order, 6)}`
    lines.push(
      `<b>Closest pair:</b> ${escapeHtml(modeWords(closest, layout.several || closest.motion !== 'axial'))} at ${formatFrequency(closest.frequencyHz)} Hz against ${escapeHtml(closest.band.label)}${order}, separation ${formatSignedPercent(closest.separation)} %.`,
    )
  }
  const motions = analysis.project.motions
  const left = (['axial', 'torsion', 'bending'] as const).filter((m) => !motions.includes(m))
  if (left.length) {
    const analysed = motions.map((m) => (m === 'axial' ? 'axial motion' : m))
    const leftWords = left.map((m) => (m === 'axial' ? 'axial motion' : m))
    lines.push(
      `<b>Scope:</b> ${escapeHtml(listWords(analysed))} only. ${escapeHtml(capitalise(listWords(leftWords)))} ${left.length === 1 ? 'was' : 'were'} not analysed, and this verdict does not cover ${left.length === 1 ? 'it' : 'them'}.`,
    )
  }
  lines.push(sturmLine(analysis, layout))
  const buckling = analysis.buckling
  if (buckling) {
    const near = buckling.ratio > 0.5
    lines.push(
      `<b>Buckling:</b> <span class="${near ? 'status-conflict' : 'status-clear'}">the compression is ${formatPercent(buckling.ratio)} % of the part's buckling load</span>${near ? ': near buckling the bending frequencies fall steeply' : ''}; see section 1.`,
    )
  }
  if (warnings.length) {
    lines.push(`<b>Model checks:</b> <span class="status-conflict">${warnings.length} warning${warnings.length === 1 ? '' : 's'}</span> about the trust in these results; see section ${layout.checks}.`)
  }
  lines.push(...accuracyLines(analysis, layout))
  lines.push(`<b>Use:</b> an engineering aid. Verify on the real part and read the assumptions and cautions (section ${layout.assumptions}) before relying on these results.`)
  const alarm = conflicts.length > 0 || warnings.length > 0 || !analysis.sturmPassed || (buckling !== null && buckling.ratio > 0.5)
  return `<div class="verdict${alarm ? ' has-conflict' : ''}">${lines.map((l) => `<p>${l}</p>`).join('\n')}</div>`
}

function analysisFact(analysis: ModalAnalysis, layout: Layout): string {
  const s = analysis.settings
  const series = seriesTitle({ elementOrder: s.elementOrder, mass: s.mass })
  if (!layout.several && analysis.families[0]?.family.motion !== 'bending') return `${escapeHtml(series)}, ${analysis.totals.elements} elements, ${analysis.totals.dofs} unknowns`
  const bending = analysis.families.some((f) => f.family.motion === 'bending')
  const bars = analysis.families.some((f) => f.family.motion !== 'bending')
  const elements = [bars ? series : '', bending ? `bending: ${bendingElementText(s.bendingTheory).replace(/ \(.*\)$/, '')}${bars ? '' : `, ${s.mass} mass`}` : ''].filter(Boolean).join('; ')
  return `${escapeHtml(elements)}, ${analysis.totals.elements} elements, ${analysis.totals.dofs} unknowns in all`
}

function notesInput(analysis: ModalAnalysis): NotesInput {
  const project = analysis.project
  return {
    motions: project.motions,
    ...(analysis.settings.bendingTheory ? { bendingTheory: analysis.settings.bendingTheory } : {}),
    twoPlanes: project.motions.includes('bending') && project.segments.some((s) => hasTwoBendingPlanes(s.section)),
  }
}

export function modalReportHtml(input: ModalReportInput): string {
  const { analysis, generatedAt, appVersion } = input
  const studies = (input.convergence ?? []).filter((s) => analysis.families.some((f) => f.family.key === s.family.key))
  const project = analysis.project
  const units = reportUnits(project.units)
  const title = project.title?.trim() || UNTITLED
  const figures = reportFigures(analysis, studies)
  const warnings = modelWarnings(analysis)
  const layout = layoutOf(analysis)
  const kind = documentKind(analysis)
  const titleFacts = keyValueTable(
    [
      ['Generated', escapeHtml(formatDateTime(generatedAt))],
      ['Rodwave version', escapeHtml(appVersion)],
      ['Units', escapeHtml(unitSystemName(project.units))],
      ...(layout.several || analysis.families[0]?.family.motion !== 'axial' ? [['Motions', escapeHtml(familiesWords(analysis.families.map((f) => f.family)))] as [string, string]] : []),
      ['Analysis', analysisFact(analysis, layout)],
    ],
    'facts title-facts',
  )
  let body: string
  if (!layout.several) {
    const first = figures.families[0]
    body = `${meshSection(analysis, units, { study: first?.study, charts: first?.convergence ?? [] })}
${modesSection(analysis, units, figures.modeShapes, figures.modeShapeModes)}
${resonanceSection(analysis, figures.interference)}
${checksSection(analysis, warnings)}
${notesSection(notesInput(analysis))}
${convergenceAppendix(first?.study ? [first.study] : [], analysis.settings.bendingTheory)}`
  } else {
    let figureNumber = 2
    const sections = analysis.families.map((family, i) => {
      const own = figures.families[i]
      const html = familySection(analysis, family, own, units, layout.familySection(family), figureNumber)
      figureNumber += familyFigureCount(own)
      return html
    })
    const links = analysis.families.map((f) => `<a href="#${familySectionId(f.family.key)}">${escapeHtml(familySectionTitle(f.family).toLowerCase())}, section ${layout.familySection(f)}</a>`).join('; ')
    body = `${meshSection(analysis, units, null, links)}
${sections.join('\n')}
${resonanceSection(analysis, figures.interference, layout.resonance, String(figureNumber))}
${checksSection(analysis, warnings, layout.checks, layout.familySection)}
${notesSection(notesInput(analysis), layout.assumptions)}
${convergenceAppendix(
  analysis.families.map((f) => studyOf(studies, f.family.key)).filter((s): s is ConvergenceStudy => s !== undefined),
  analysis.settings.bendingTheory,
  true,
)}`
  }
  return `<!DOCTYPE html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<meta name="generator" content="Rodwave ${escapeHtml(appVersion)}">
<title>${escapeHtml(title)} — ${escapeHtml(kind.toLowerCase())}</title>
<style>${reportCss(kind.toLowerCase())}</style>
</head>
<body>
<main class="sheet">
<header class="title-block">
<p class="doc-kind">${escapeHtml(kind)}</p>
<h1>${escapeHtml(title)}</h1>
${titleFacts}
${verdict(analysis, warnings, layout)}
</header>
${modelSection(analysis, units, figures.barDrawing)}
${materialsSection(project, units, analysis.settings.bendingTheory)}
${body}
<footer class="colophon">Generated by Rodwave ${escapeHtml(appVersion)} on ${escapeHtml(formatDateTime(generatedAt))}. Values are stored in SI units and shown in ${escapeHtml(unitSystemName(project.units))}.</footer>
</main>
</body>
</html>
`
}
