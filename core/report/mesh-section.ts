/**
 * Report section 3: the mesh solved; and how the frequencies of a family converge as it is
 * refined (in section 3 of a single-family report, in each family's section otherwise), with
 * Appendix A giving every mesh's figures.
 */
import type { ConvergencePoint, ConvergenceSeries, ConvergenceStudy } from '../analysis/convergence'
import type { ModalAnalysis } from '../analysis/modal-analysis'
import type { Family } from '../model/families'
import type { BendingTheory, ElementOrder, MassMatrixKind } from '../model/project'
import { escapeHtml, htmlTable, keyValueTable, type Cell } from './html'
import { formatFigure, formatFrequency, formatRelativeError, MISSING } from './number-format'
import { familyTitle, listWords } from './report-families'
import type { ConvergenceFigure } from './report-figures'
import type { ReportUnits } from './report-units'

export function elementOrderText(order: ElementOrder): string {
  return order === 1 ? '2-node elements (linear displacement)' : '3-node elements (quadratic displacement)'
}

/** Bending's elements: Hermite cubics (Euler–Bernoulli) or the 2-node Timoshenko element. */
export function bendingElementText(theory: BendingTheory | undefined): string {
  return theory === 'timoshenko'
    ? '2-node Timoshenko elements (deflection and section rotation at each node; shear deformation and rotary inertia)'
    : 'Hermite cubic elements (deflection and slope at each node; Euler–Bernoulli theory)'
}

export const MASS_MATRIX_TEXT: Record<MassMatrixKind, string> = {
  consistent: 'consistent',
  lumped: 'lumped (diagonal)',
  mixed: 'mixed (average of consistent and lumped)',
}

/** "2-node elements, consistent mass"; for bending "Hermite cubic elements, …" (or Timoshenko). */
export function seriesTitle(series: Pick<ConvergenceSeries, 'elementOrder' | 'mass'>, family?: Pick<Family, 'motion'>, theory?: BendingTheory): string {
  const elements = family?.motion === 'bending' ? (theory === 'timoshenko' ? 'Timoshenko' : 'Hermite cubic') : series.elementOrder === 1 ? '2-node' : '3-node'
  return `${elements} elements, ${series.mass} mass`
}

function densityText(analysis: ModalAnalysis, units: ReportUnits): string {
  const s = analysis.settings
  return s.elementsPerSegment !== undefined ? `${s.elementsPerSegment} elements per segment` : `elements no longer than ${units.withUnit('length', s.maxElementLength ?? 0)}`
}

function meshFacts(analysis: ModalAnalysis, units: ReportUnits): string {
  const s = analysis.settings
  if (analysis.families.length === 1 && analysis.families[0].family.motion === 'axial') {
    return keyValueTable([
      ['Elements', escapeHtml(elementOrderText(s.elementOrder))],
      ['Mesh density', `${escapeHtml(densityText(analysis, units))}, with a node at every segment boundary, point mass and spring`],
      ['Number of elements', String(analysis.totals.elements)],
      ['Unknowns (free nodal displacements)', String(analysis.totals.dofs)],
      ['Mass matrix', escapeHtml(MASS_MATRIX_TEXT[s.mass])],
      ['Modes computed', String(analysis.modes.length)],
      ['Total length', escapeHtml(units.withUnit('length', analysis.totals.length))],
      ['Total mass (bar and point masses)', escapeHtml(units.withUnit('mass', analysis.totals.mass))],
    ])
  }
  const bars = analysis.families.filter((f) => f.family.motion !== 'bending').map((f) => f.family.motion)
  const bends = analysis.families.some((f) => f.family.motion === 'bending')
  const elements = [
    ...(bars.length ? [`${listWords(bars)}: ${elementOrderText(s.elementOrder)}`] : []),
    ...(bends ? [`bending: ${bendingElementText(s.bendingTheory)}`] : []),
  ]
  const counts = [...new Set(analysis.families.map((f) => f.model.mesh.elementCount))]
  const elementCount =
    counts.length === 1 ? String(counts[0]) : analysis.families.map((f) => `${familyTitle(f.family)} ${f.model.mesh.elementCount}`).join(', ')
  const unknowns = analysis.families.map((f) => `${escapeHtml(familyTitle(f.family))} ${f.model.dofNodes.length}`).join(', ')
  const perFamily = [...new Set(analysis.families.map((f) => f.modes.length))]
  return keyValueTable([
    ['Elements', escapeHtml(elements.join('; '))],
    ['Mesh density', `${escapeHtml(densityText(analysis, units))}, with a node at every segment boundary, point mass and spring`],
    ['Number of elements', escapeHtml(elementCount)],
    ['Unknowns (free nodal values)', `${unknowns}${analysis.families.length > 1 ? `; ${analysis.totals.dofs} in all` : ''}`],
    ['Mass matrix', escapeHtml(MASS_MATRIX_TEXT[s.mass])],
    [
      'Modes computed',
      perFamily.length === 1 && analysis.families.length > 1 ? `${perFamily[0]} per family (per bending plane), ${analysis.modes.length} in all` : String(analysis.modes.length),
    ],
    ['Total length', escapeHtml(units.withUnit('length', analysis.totals.length))],
    ['Total mass (bar and point masses)', escapeHtml(units.withUnit('mass', analysis.totals.mass))],
  ])
}

/** Errors against the reference per mesh, or, without one, the frequencies and their Richardson limit. */
function seriesTable(study: ConvergenceStudy, series: ConvergenceSeries, withReference: boolean, theory: BendingTheory | undefined): string {
  const modes = study.modes
  const modeColumns = Array.from({ length: modes }, (_, m) => ({ header: withReference ? `Mode ${m + 1}` : `f${m + 1}`, unit: withReference ? undefined : 'Hz', numeric: true }))
  const cellOf = (p: ConvergencePoint, m: number) => (withReference ? formatRelativeError(p.errors[m] ?? null) : p.frequenciesHz[m] === undefined ? MISSING : formatFrequency(p.frequenciesHz[m]))
  const rows: Cell[][] = series.points.map((p) => [String(p.elementsPerSegment), String(p.dofs), ...Array.from({ length: modes }, (_, m) => cellOf(p, m))])
  const summary: Cell[] = withReference
    ? [{ html: 'Observed order' }, '', ...Array.from({ length: modes }, (_, m) => optionalFigure(series.observedOrder[m], (v) => formatFigure(v, 3)))]
    : [{ html: 'Richardson limit' }, '', ...Array.from({ length: modes }, (_, m) => optionalFigure(series.extrapolatedHz[m], formatFrequency))]
  rows.push(summary)
  return htmlTable([{ header: 'Elements per segment', numeric: true }, { header: 'Unknowns', numeric: true }, ...modeColumns], rows, {
    className: 'convergence',
    caption: seriesTitle(series, study.family, theory),
    rowClass: (i) => (i === series.points.length ? 'total' : undefined),
  })
}

function optionalFigure(value: number | null | undefined, format: (v: number) => string): string {
  return value === null || value === undefined ? MISSING : format(value)
}

/** Observed order of every series and mode, the table the convergence charts summarise. */
function observedOrderTable(study: ConvergenceStudy, theory: BendingTheory | undefined): string {
  const rows: Cell[][] = study.series.map((s) => [seriesTitle(s, study.family, theory), ...Array.from({ length: study.modes }, (_, m) => optionalFigure(s.observedOrder[m], (v) => formatFigure(v, 3)))])
  return htmlTable([{ header: 'Elements and mass matrix' }, ...Array.from({ length: study.modes }, (_, m) => ({ header: `Mode ${m + 1}`, numeric: true }))], rows, {
    className: 'observed-orders',
    caption: 'Observed order of convergence',
  })
}

function meshRangeText(study: ConvergenceStudy): string {
  const densities = study.series.flatMap((s) => s.points.map((p) => p.elementsPerSegment))
  if (densities.length === 0) return 'No mesh of the study was solved.'
  const what = study.family.motion === 'bending' ? 'Each mass matrix' : 'Each element type and mass matrix'
  return `${what} was solved on meshes from ${Math.min(...densities)} to ${Math.max(...densities)} elements per segment.`
}

/** Errors are shown where the study has a reference: exact, or extrapolated (and then said so). */
export function studyHasErrors(study: ConvergenceStudy): boolean {
  return study.referenceMethod !== null
}

export interface ConvergencePartOptions {
  /** The number of modes reported for the family. */
  readonly modesReported: number
  readonly charts: readonly ConvergenceFigure[]
  /** Figure numbers of the charts ("2a", "2b"). */
  readonly figureLabels: readonly string[]
  readonly bendingTheory?: BendingTheory
  /** Heading level and words: "Convergence as the mesh is refined". */
  readonly heading?: string
}

function referenceParagraph(study: ConvergenceStudy): string {
  const frequencies = study.referenceHz
    .slice(0, study.modes)
    .map((f, i) => `f<sub>${i + 1}</sub> = ${formatFrequency(f)} Hz`)
    .join(', ')
  const order =
    'The observed order p = log(e<sub>coarse</sub>/e<sub>fine</sub>) / log(h<sub>coarse</sub>/h<sub>fine</sub>) is taken from the finest pair of meshes whose order agrees with the next coarser pair’s (within 0.2), so that round-off on the finest meshes, where the error grows again, is not read as an order; where no two pairs agree, from the finest pair whose errors stand above round-off (10<sup>−12</sup>).'
  if (study.referenceMethod === 'exact') {
    return `<p>${meshRangeText(study)} Errors are (f − f<sub>exact</sub>) / f<sub>exact</sub> against the exact solution of the same ${study.family.motion === 'axial' ? 'bar' : 'part'}: ${frequencies}. ${order} Appendix A lists every error.</p>`
  }
  if (study.referenceMethod === 'extrapolated') {
    return `<p>${meshRangeText(study)} No exact solution is used for this family: errors are (f − f<sub>ref</sub>) / f<sub>ref</sub> against the extrapolated reference, a Richardson estimate from two fine meshes (${frequencies}). It is an estimate, not an exact value: where a mesh's error comes down to the reference's own, the error and the observed order stop meaning anything. ${order} Appendix A lists every error.</p>`
  }
  return '<p>No exact solution is known for this model: Appendix A gives the frequencies on each mesh and their Richardson extrapolation from the three finest meshes, f* = f<sub>1</sub> + (f<sub>1</sub> − f<sub>2</sub>)/(r<sup>p</sup> − 1).</p>'
}

function chartCaption(study: ConvergenceStudy, mode: number): string {
  const against = study.referenceMethod === 'extrapolated' ? 'against the extrapolated reference' : 'against the exact frequency'
  const lines =
    study.family.motion === 'bending'
      ? 'for each mass matrix (one element type in bending)'
      : 'for each element type (solid 2-node, dashed 3-node) and mass matrix'
  const which = study.family.motion === 'axial' ? `Mode ${mode}` : `${familyTitle(study.family)} mode ${mode}`
  return `${which}: |error| ${against} versus elements per segment, both on log scales, ${lines}; the legend gives the observed order, the slope of each line.`
}

export function convergencePart(study: ConvergenceStudy, options: ConvergencePartOptions): string {
  const withErrors = studyHasErrors(study)
  const figures = options.charts
    .map((chart, k) => `<figure class="chart convergence-chart" data-family="${study.family.key}">${chart.svg}<figcaption><b>Figure ${options.figureLabels[k]}.</b> ${chartCaption(study, chart.mode)}</figcaption></figure>`)
    .join('\n')
  const scope = study.modes < options.modesReported ? `<p class="note">The study covers the lowest ${study.modes} of the ${options.modesReported} modes reported.</p>` : ''
  return `<h3>${options.heading ?? 'Convergence as the mesh is refined'}</h3>
${referenceParagraph(study)}
${scope}
${withErrors ? observedOrderTable(study, options.bendingTheory) : ''}
${figures}`
}

/** Report section 3. With one family it holds that family's convergence study too, as in version 1. */
export function meshSection(analysis: ModalAnalysis, units: ReportUnits, single: { study: ConvergenceStudy | undefined; charts: readonly ConvergenceFigure[] } | null, familyLinks = ''): string {
  const convergence = single
    ? single.study
      ? convergencePart(single.study, {
          modesReported: analysis.modes.length,
          charts: single.charts,
          figureLabels: single.charts.map((_, k) => `2${single.charts.length > 1 ? String.fromCharCode(97 + k) : ''}`),
          bendingTheory: analysis.settings.bendingTheory,
        })
      : '<p>No convergence study is included in this report; the error against the exact solution in the modes table (section 4) shows the accuracy of this mesh.</p>'
    : `<p>Each family is solved on this mesh; its convergence study, where one is included, is in its own section (${familyLinks}).</p>`
  return `<section id="mesh">
<h2>3 Mesh and convergence</h2>
${meshFacts(analysis, units)}
${convergence}
</section>`
}

function studyTables(study: ConvergenceStudy, theory: BendingTheory | undefined): string {
  const withErrors = studyHasErrors(study)
  return study.series.map((s) => seriesTable(study, s, withErrors, theory)).join('\n')
}

function appendixIntro(withErrors: boolean): string {
  return `<p>${withErrors ? 'Relative error (f − f<sub>ref</sub>) / f<sub>ref</sub> of each mode on each mesh against the reference (exact, or extrapolated where so stated); the last row gives the observed order.' : 'Frequency of each mode on each mesh; the last row gives the Richardson extrapolation.'} “—” marks a mode the mesh is too coarse to have.</p>`
}

/** Appendix A: each convergence study mesh by mesh, one table per element type and mass matrix (per family when there are several). */
export function convergenceAppendix(studies: readonly ConvergenceStudy[], theory?: BendingTheory, severalFamilies = false): string {
  if (!studies.length) return ''
  if (!severalFamilies) {
    const study = studies[0]
    const withErrors = studyHasErrors(study)
    const intro =
      study.referenceMethod === 'exact' || !withErrors
        ? `<p>${withErrors ? 'Relative error (f − f<sub>exact</sub>) / f<sub>exact</sub> of each mode on each mesh; the last row gives the observed order.' : 'Frequency of each mode on each mesh; the last row gives the Richardson extrapolation.'} “—” marks a mode the mesh is too coarse to have.</p>`
        : appendixIntro(true)
    return `<section id="convergence-data" class="appendix">
<h2>Appendix A Convergence data</h2>
${intro}
${studyTables(study, theory)}
</section>`
  }
  const parts = studies.map(
    (study, k) => `<h3 id="convergence-data-${study.family.key}">A.${k + 1} ${escapeHtml(familyTitle(study.family))}${study.referenceMethod === 'extrapolated' ? ' (errors against the extrapolated reference)' : ''}</h3>
${studyTables(study, theory)}`,
  )
  return `<section id="convergence-data" class="appendix">
<h2>Appendix A Convergence data</h2>
${appendixIntro(studies.some(studyHasErrors))}
${parts.join('\n')}
</section>`
}
