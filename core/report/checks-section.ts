/**
 * The checks of trust in the results: per family, the Sturm-count check (no mode missed) and the
 * reference method; for the whole part, the model checks. With one family they all make report
 * section 6, as in version 1; with several, each family's section carries its own Sturm check
 * and reference, and the checks section gives the overview and the model checks.
 * The count of eigenvalues of K φ = λ M φ below a shift σ equals the number of negative
 * pivots of K − σM (Sylvester's law of inertia; B. N. Parlett, The Symmetric Eigenvalue
 * Problem, ch. 3, from memory).
 */
import type { FamilyAnalysis, ModalAnalysis } from '../analysis/modal-analysis'
import { backwardErrorLimit, type ModelWarning } from '../analysis/model-checks'
import { escapeHtml, htmlTable, type Cell } from './html'
import { formatFrequency, formatScientific } from './number-format'
import { familySectionId, familyTitle, governingEquation, referenceMethodWords } from './report-families'

function shiftHz(lambda: number): number {
  return Math.sqrt(Math.max(lambda, 0)) / (2 * Math.PI)
}

export function sturmResultText(analysis: FamilyAnalysis): string {
  const last = analysis.sturm.shifts[analysis.sturm.shifts.length - 1]
  const counted = analysis.sturm.countedUnknowns
  const where =
    counted !== undefined && counted < analysis.model.pencil.stiffness.order
      ? ` (counted on the solver's coarser model of ${counted.toLocaleString('en-US')} unknowns, whose frequencies the finer mesh no longer changes; the full model's own counts would rest on round-off)`
      : ''
  return analysis.sturm.passed
    ? `Passed: no mode was missed. The discrete model has exactly ${analysis.modes.length} modes below ${formatFrequency(shiftHz(last ?? 0))} Hz${where}, and each reported mode is the next one up.`
    : 'Failed: the counts below do not confirm that every mode up to the last one reported was found. Do not rely on these results; refine the mesh or report the case.'
}

/** The Sturm check of one family: its result, how it works, and the counts. */
export function sturmPart(analysis: FamilyAnalysis): string {
  const { sturm } = analysis
  const rows: Cell[][] = sturm.shifts.map((shift, i) => [
    formatFrequency(shiftHz(shift)),
    String(sturm.counts[i]),
    String(sturm.expected[i]),
    { html: sturm.counts[i] === sturm.expected[i] ? '<span class="status-clear">agrees</span>' : '<span class="status-conflict">differs</span>' },
  ])
  const table = htmlTable(
    [{ header: 'Shift', unit: 'Hz', numeric: true }, { header: 'Modes below, counted', numeric: true }, { header: 'Modes below, expected', numeric: true }, { header: '' }],
    rows,
    { className: 'sturm' },
  )
  return `<h3>No mode missed (Sturm count)</h3>
<p class="sturm-result"><b class="${sturm.passed ? 'status-clear' : 'status-conflict'}">${escapeHtml(sturmResultText(analysis))}</b></p>
<p>The number of modes of the discrete model below a trial frequency equals the number of negative pivots in the factorisation of K − ω²M (Sylvester's law of inertia). It is counted at a frequency between each pair of consecutive modes and just above the last one reported; every count must equal the number of modes reported below it.</p>
${table}`
}

/** What the family's reference is and how it was found (HTML). */
export function referenceText(analysis: FamilyAnalysis): string {
  const { reference } = analysis
  const motion = analysis.family.motion
  if (reference.method === 'exact') {
    return motion === 'axial'
      ? `Exact solution of the same bar, ${escapeHtml(reference.formulation ?? 'exact')}. It solves the governing equation (EA u′)′ + ρAω² u = 0 of each piece in closed form (a solid taper through the horn equation) and joins the pieces, masses and springs by equilibrium and continuity, so its frequencies carry no discretisation error.`
      : `Exact solution of the same part, ${escapeHtml(reference.formulation ?? 'exact')}. It solves the governing equation ${governingEquation(motion)} of each piece in closed form and joins the pieces, masses and springs by equilibrium and continuity, so its frequencies carry no discretisation error.`
  }
  if (reference.method === 'extrapolated') {
    return `Extrapolated (Richardson estimate from two fine meshes): ${escapeHtml(reference.formulation ?? 'two fine meshes')}. No exact solution is used for this family. The estimate f* = f<sub>2</sub> + (f<sub>2</sub> − f<sub>1</sub>)/(2<sup>p</sup> − 1) from meshes of size h and h/2 removes the leading discretisation error of order p, so it is far closer to the true frequency than the analysis mesh; it is still an estimate, not an exact value.`
  }
  if (reference.formulation) return `No exact solution is available for this model, and no extrapolated one: ${escapeHtml(reference.formulation)}. The convergence study gives the error estimate.`
  return 'No exact solution is available for this model; the convergence study gives the error estimate.'
}

export function referencePart(analysis: FamilyAnalysis): string {
  return `<h3>Reference method</h3>
<p class="reference-method">${referenceText(analysis)}</p>`
}

function modelChecksPart(whole: ModalAnalysis, warnings: readonly ModelWarning[]): string {
  if (warnings.length) return `<ul class="model-warnings">${warnings.map((w) => `<li class="status-conflict">${escapeHtml(w.message)}</li>`).join('\n')}</ul>`
  const limits = whole.families.map((f) => backwardErrorLimit(f.model.pencil.stiffness.order, f.model.pencil.stiffness.halfBandwidth))
  const lowest = Math.min(...limits)
  const highest = Math.max(...limits)
  const bound = lowest === highest ? formatScientific(highest, 1) : `${formatScientific(lowest, 1)} to ${formatScientific(highest, 1)}, by family`
  return whole.families.length > 1
    ? `<p class="model-checks-passed">No warnings: every mode of every family satisfies K φ = ω² M φ to a backward error below the round-off level for its unknowns (${bound}), the modes of each family are mutually mass-orthogonal, and no spring, point mass, section or element size is extreme enough to make the equations ill-conditioned.</p>`
    : `<p class="model-checks-passed">No warnings: every mode satisfies K φ = ω² M φ to a backward error below ${bound} (the round-off level for its unknowns), the modes are mutually mass-orthogonal, and no spring, point mass, section or element size is extreme enough to make the equations ill-conditioned.</p>`
}

/** One row per family: its modes, unknowns, Sturm count and reference method. */
function familiesOverview(whole: ModalAnalysis, sectionOf: (f: FamilyAnalysis) => number): string {
  const rows: Cell[][] = whole.families.map((f) => [
    { html: `${escapeHtml(familyTitle(f.family))} <span class="note">(section <a href="#${familySectionId(f.family.key)}">${sectionOf(f)}</a>)</span>` },
    String(f.modes.length),
    String(f.model.dofNodes.length),
    { html: f.sturm.passed ? '<span class="status-clear">passed</span>' : '<span class="status-conflict">failed</span>' },
    referenceMethodWords(f.reference.method),
  ])
  return htmlTable(
    [{ header: 'Family' }, { header: 'Modes', numeric: true }, { header: 'Unknowns', numeric: true }, { header: 'Sturm count' }, { header: 'Reference' }],
    rows,
    { className: 'family-checks' },
  )
}

/** The checks section: section 6 of a single-family report; with several families, an overview beside the model checks. */
export function checksSection(whole: ModalAnalysis, warnings: readonly ModelWarning[], number = 6, sectionOf?: (f: FamilyAnalysis) => number): string {
  if (whole.families.length === 1 || !sectionOf) {
    const analysis = whole.families[0]
    return `<section id="checks">
<h2>${number} Checks</h2>
${sturmPart(analysis)}
<h3>Model checks</h3>
${modelChecksPart(whole, warnings)}
${referencePart(analysis)}
</section>`
  }
  return `<section id="checks">
<h2>${number} Checks</h2>
<h3>Every family</h3>
<p>Each family's section gives its Sturm counts and its reference method in full.</p>
${familiesOverview(whole, sectionOf)}
<h3>Model checks</h3>
${modelChecksPart(whole, warnings)}
</section>`
}
