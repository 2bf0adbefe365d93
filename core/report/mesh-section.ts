/** Report section 3: the mesh solved, and how the frequencies converge as it is refined. */
import type { ConvergencePoint, ConvergenceSeries, ConvergenceStudy } from '../analysis/convergence'
import type { ModalAnalysis } from '../analysis/modal-analysis'
import type { ElementOrder, MassMatrixKind } from '../model/project'
import { escapeHtml, htmlTable, keyValueTable, type Cell } from './html'
import { formatFigure, formatFrequency, formatRelativeError, MISSING } from './number-format'
import type { ConvergenceFigure } from './report-figures'
import type { ReportUnits } from './report-units'

export function elementOrderText(order: ElementOrder): string {
  return order === 1 ? '2-node elements (linear displacement)' : '3-node elements (quadratic displacement)'
}

export const MASS_MATRIX_TEXT: Record<MassMatrixKind, string> = {
  consistent: 'consistent',
  lumped: 'lumped (diagonal)',
  mixed: 'mixed (average of consistent and lumped)',
}

export function seriesTitle(series: Pick<ConvergenceSeries, 'elementOrder' | 'mass'>): string {
  return `${series.elementOrder === 1 ? '2-node' : '3-node'} elements, ${series.mass} mass`
}

function meshFacts(analysis: ModalAnalysis, units: ReportUnits): string {
  const s = analysis.settings
  const density =
    s.elementsPerSegment !== undefined
      ? `${s.elementsPerSegment} elements per segment`
      : `elements no longer than ${units.withUnit('length', s.maxElementLength ?? 0)}`
  return keyValueTable([
    ['Elements', escapeHtml(elementOrderText(s.elementOrder))],
    ['Mesh density', `${escapeHtml(density)}, with a node at every segment boundary, point mass and spring`],
    ['Number of elements', String(analysis.totals.elements)],
    ['Unknowns (free nodal displacements)', String(analysis.totals.dofs)],
    ['Mass matrix', escapeHtml(MASS_MATRIX_TEXT[s.mass])],
    ['Modes computed', String(analysis.modes.length)],
    ['Total length', escapeHtml(units.withUnit('length', analysis.totals.length))],
    ['Total mass (bar and point masses)', escapeHtml(units.withUnit('mass', analysis.totals.mass))],
  ])
}

/** Errors against the exact solution per mesh, or, without one, the frequencies and their Richardson limit. */
function seriesTable(series: ConvergenceSeries, modes: number, withReference: boolean): string {
  const modeColumns = Array.from({ length: modes }, (_, m) => ({ header: withReference ? `Mode ${m + 1}` : `f${m + 1}`, unit: withReference ? undefined : 'Hz', numeric: true }))
  const cellOf = (p: ConvergencePoint, m: number) => (withReference ? formatRelativeError(p.errors[m] ?? null) : p.frequenciesHz[m] === undefined ? MISSING : formatFrequency(p.frequenciesHz[m]))
  const rows: Cell[][] = series.points.map((p) => [String(p.elementsPerSegment), String(p.dofs), ...Array.from({ length: modes }, (_, m) => cellOf(p, m))])
  const summary: Cell[] = withReference
    ? [{ html: 'Observed order' }, '', ...Array.from({ length: modes }, (_, m) => optionalFigure(series.observedOrder[m], (v) => formatFigure(v, 3)))]
    : [{ html: 'Richardson limit' }, '', ...Array.from({ length: modes }, (_, m) => optionalFigure(series.extrapolatedHz[m], formatFrequency))]
  rows.push(summary)
  return htmlTable([{ header: 'Elements per segment', numeric: true }, { header: 'Unknowns', numeric: true }, ...modeColumns], rows, {
    className: 'convergence',
    caption: seriesTitle(series),
    rowClass: (i) => (i === series.points.length ? 'total' : undefined),
  })
}

function optionalFigure(value: number | null | undefined, format: (v: number) => string): string {
  return value === null || value === undefined ? MISSING : format(value)
}

/** Observed order of every series and mode, the table the convergence charts summarise. */
function observedOrderTable(study: ConvergenceStudy): string {
  const rows: Cell[][] = study.series.map((s) => [seriesTitle(s), ...Array.from({ length: study.modes }, (_, m) => optionalFigure(s.observedOrder[m], (v) => formatFigure(v, 3)))])
  return htmlTable([{ header: 'Elements and mass matrix' }, ...Array.from({ length: study.modes }, (_, m) => ({ header: `Mode ${m + 1}`, numeric: true }))], rows, {
    className: 'observed-orders',
    caption: 'Observed order of convergence',
  })
}

function meshRangeText(study: ConvergenceStudy): string {
  const densities = study.series.flatMap((s) => s.points.map((p) => p.elementsPerSegment))
  if (densities.length === 0) return 'No mesh of the study was solved.'
  return `Each element type and mass matrix was solved on meshes from ${Math.min(...densities)} to ${Math.max(...densities)} elements per segment.`
}

function convergencePart(study: ConvergenceStudy, modesReported: number, charts: readonly ConvergenceFigure[]): string {
  const withReference = study.referenceMethod === 'exact'
  const reference = withReference
    ? `<p>${meshRangeText(study)} Errors are (f − f<sub>exact</sub>) / f<sub>exact</sub> against the exact solution of the same bar: ${study.referenceHz
        .slice(0, study.modes)
        .map((f, i) => `f<sub>${i + 1}</sub> = ${formatFrequency(f)} Hz`)
        .join(', ')}. The observed order p = log(e<sub>coarse</sub>/e<sub>fine</sub>) / log(h<sub>coarse</sub>/h<sub>fine</sub>) is taken from the finest pair of meshes whose errors stand above round-off (10<sup>−12</sup>). Appendix A lists every error.</p>`
    : '<p>No exact solution is known for this model: Appendix A gives the frequencies on each mesh and their Richardson extrapolation from the three finest meshes, f* = f<sub>1</sub> + (f<sub>1</sub> − f<sub>2</sub>)/(r<sup>p</sup> − 1).</p>'
  const figures = charts
    .map(
      (chart, k) =>
        `<figure class="chart convergence-chart">${chart.svg}<figcaption><b>Figure 2${charts.length > 1 ? String.fromCharCode(97 + k) : ''}.</b> Mode ${chart.mode}: |error| against the exact frequency versus elements per segment, both on log scales, for each element type (solid 2-node, dashed 3-node) and mass matrix; the legend gives the observed order, the slope of each line.</figcaption></figure>`,
    )
    .join('\n')
  const scope = study.modes < modesReported ? `<p class="note">The study covers the lowest ${study.modes} of the ${modesReported} modes reported.</p>` : ''
  return `<h3>Convergence as the mesh is refined</h3>
${reference}
${scope}
${withReference ? observedOrderTable(study) : ''}
${figures}`
}

export function meshSection(analysis: ModalAnalysis, units: ReportUnits, convergence: ConvergenceStudy | undefined, convergenceCharts: readonly ConvergenceFigure[]): string {
  return `<section id="mesh">
<h2>3 Mesh and convergence</h2>
${meshFacts(analysis, units)}
${convergence ? convergencePart(convergence, analysis.modes.length, convergenceCharts) : '<p>No convergence study is included in this report; the error against the exact solution in the modes table (section 4) shows the accuracy of this mesh.</p>'}
</section>`
}

/** Appendix A: the convergence study mesh by mesh, one table per element type and mass matrix. */
export function convergenceAppendix(study: ConvergenceStudy | undefined): string {
  if (!study) return ''
  const withReference = study.referenceMethod === 'exact'
  const tables = study.series.map((s) => seriesTable(s, study.modes, withReference)).join('\n')
  return `<section id="convergence-data" class="appendix">
<h2>Appendix A Convergence data</h2>
<p>${withReference ? 'Relative error (f − f<sub>exact</sub>) / f<sub>exact</sub> of each mode on each mesh; the last row gives the observed order.' : 'Frequency of each mode on each mesh; the last row gives the Richardson extrapolation.'} “—” marks a mode the mesh is too coarse to have.</p>
${tables}
</section>`
}
