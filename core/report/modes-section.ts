/** Report section 4: the modes, with the exact reference, effective mass and the mode-shape chart. */
import type { ModalAnalysis } from '../analysis/modal-analysis'
import { hzToRpm } from '../model/units'
import { escapeHtml, htmlTable, type Cell } from './html'
import { formatFrequency, formatPercent, formatRelativeError, formatSpeed, MISSING } from './number-format'
import type { ReportUnits } from './report-units'

/** Effective mass of a mode that symmetry leaves unexcited is zero up to round-off; printing 10⁻²⁶ kg would suggest otherwise. */
const ROUND_OFF_FRACTION = 1e-9

function isRoundOff(fraction: number | null): boolean {
  return fraction !== null && Math.abs(fraction) < ROUND_OFF_FRACTION
}

function stressPerDisplacementUnit(units: ReportUnits): string {
  return `${units.symbol('stress')} per ${units.symbol('sectionDimension')}`
}

export function modesSection(analysis: ModalAnalysis, units: ReportUnits, modeShapeChart: string, chartModes: readonly number[]): string {
  const hasReference = analysis.families.some((f) => f.reference.method === 'exact')
  const hasEffectiveMass = analysis.modes.some((m) => m.effectiveMass !== null)
  const rows: Cell[][] = analysis.modes.map((m) => [
    { html: `${m.mode}${m.rigidBody ? ' <span class="tag">rigid body</span>' : ''}` },
    formatFrequency(m.frequencyHz),
    formatSpeed(hzToRpm(m.frequencyHz)),
    m.referenceHz === null ? MISSING : formatFrequency(m.referenceHz),
    formatRelativeError(m.errorVsReference),
    m.effectiveMass === null ? MISSING : isRoundOff(m.effectiveMassFraction) ? '≈ 0' : units.figure('mass', m.effectiveMass),
    m.effectiveMassFraction === null ? MISSING : formatPercent(m.effectiveMassFraction),
    m.cumulativeEffectiveMassFraction === null ? MISSING : formatPercent(m.cumulativeEffectiveMassFraction),
  ])
  const table = htmlTable(
    [
      { header: 'Mode', numeric: true },
      { header: 'Frequency', unit: 'Hz', numeric: true },
      { header: 'Speed', unit: 'rpm', numeric: true },
      { header: 'Exact', unit: 'Hz', numeric: true },
      { header: 'Error vs exact', numeric: true },
      { header: 'Effective mass', unit: units.symbol('mass'), numeric: true },
      { header: 'Effective mass', unit: '%', numeric: true },
      { header: 'Cumulative', unit: '%', numeric: true },
    ],
    rows,
    { className: 'modes' },
  )
  const notes: string[] = [
    'Frequency: the finite-element natural frequency; speed = 60 × frequency, the shaft speed that would excite the mode once per revolution.',
    hasReference
      ? 'Exact: the exact natural frequency of the same bar (section 6); error = (f − f<sub>exact</sub>) / f<sub>exact</sub>.'
      : 'No exact solution is known for this model, so the error column is empty; the convergence study (section 3) bounds the error instead.',
    hasEffectiveMass
      ? `Effective mass: the mass that takes part in each mode when all supports (fixed ends and springs) move together along the axis, and its share of the total ${units.withUnit('mass', analysis.totals.mass)}.`
      : 'Effective mass is not defined for this part: it has no support (no fixed end and no spring).',
  ]
  if (analysis.modes.some((m) => m.rigidBody)) notes.push('A rigid-body mode (the whole bar moving as one, at 0 Hz) appears because nothing holds the part axially.')
  return `<section id="modes">
<h2>4 Modes</h2>
${table}
<ul class="note">${notes.map((n) => `<li>${n}</li>`).join('')}</ul>
<figure class="chart mode-shape-chart">${modeShapeChart}<figcaption><b>Figure 3.</b> Mode shapes${chartModes.length < analysis.modes.length ? ` of modes ${chartModes[0]}–${chartModes[chartModes.length - 1]}` : ''}. Top: axial displacement along the bar, each mode scaled to a largest displacement of 1. Bottom: the axial stress that a vibration of unit peak displacement causes (${escapeHtml(stressPerDisplacementUnit(units))}); dashed lines mark the segment boundaries.</figcaption></figure>
</section>`
}
