/**
 * Report section 6: the Sturm-count check (no mode missed) and the exact reference method.
 * The count of eigenvalues of K φ = λ M φ below a shift σ equals the number of negative
 * pivots of K − σM (Sylvester's law of inertia; B. N. Parlett, The Symmetric Eigenvalue
 * Problem, ch. 3, from memory).
 */
import type { FamilyAnalysis, ModalAnalysis } from '../analysis/modal-analysis'
import { backwardErrorLimit, type ModelWarning } from '../analysis/model-checks'
import { escapeHtml, htmlTable, type Cell } from './html'
import { formatFrequency, formatScientific } from './number-format'

function shiftHz(lambda: number): number {
  return Math.sqrt(Math.max(lambda, 0)) / (2 * Math.PI)
}

export function sturmResultText(analysis: FamilyAnalysis): string {
  const last = analysis.sturm.shifts[analysis.sturm.shifts.length - 1]
  return analysis.sturm.passed
    ? `Passed: no mode was missed. The discrete model has exactly ${analysis.modes.length} modes below ${formatFrequency(shiftHz(last ?? 0))} Hz, and each reported mode is the next one up.`
    : 'Failed: the counts below do not confirm that every mode up to the last one reported was found. Do not rely on these results; refine the mesh or report the case.'
}

export function checksSection(whole: ModalAnalysis, warnings: readonly ModelWarning[]): string {
  const analysis = whole.families[0]
  const { sturm, reference } = analysis
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
  const referenceText =
    reference.method === 'exact'
      ? `Exact solution of the same bar, ${escapeHtml(reference.formulation ?? 'exact')}. It solves the governing equation (EA u′)′ + ρAω² u = 0 of each piece in closed form (a solid taper through the horn equation) and joins the pieces, masses and springs by equilibrium and continuity, so its frequencies carry no discretisation error.`
      : 'No exact solution is available for this model; the convergence study gives the error estimate.'
  return `<section id="checks">
<h2>6 Checks</h2>
<h3>No mode missed (Sturm count)</h3>
<p class="sturm-result"><b class="${sturm.passed ? 'status-clear' : 'status-conflict'}">${escapeHtml(sturmResultText(analysis))}</b></p>
<p>The number of modes of the discrete model below a trial frequency equals the number of negative pivots in the factorisation of K − ω²M (Sylvester's law of inertia). It is counted at a frequency between each pair of consecutive modes and just above the last one reported; every count must equal the number of modes reported below it.</p>
${table}
<h3>Model checks</h3>
${
  warnings.length
    ? `<ul class="model-warnings">${warnings.map((w) => `<li class="status-conflict">${escapeHtml(w.message)}</li>`).join('\n')}</ul>`
    : `<p class="model-checks-passed">No warnings: every mode satisfies K φ = ω² M φ to a backward error below ${formatScientific(backwardErrorLimit(analysis.model.pencil.stiffness.order, analysis.model.pencil.stiffness.halfBandwidth), 1)} (the round-off level for its unknowns), the modes are mutually mass-orthogonal, and no spring, point mass, section or element size is extreme enough to make the equations ill-conditioned.</p>`
}
<h3>Reference method</h3>
<p class="reference-method">${referenceText}</p>
</section>`
}
