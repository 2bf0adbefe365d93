/**
 * The modes of a family: the table (frequency, speed, reference, error, effective mass of the
 * family's kind) and the mode-shape figure. With one family they make report section 4, as in
 * version 1; with several, each family's section (family-section.ts) starts with them.
 */
import type { FamilyAnalysis, ModalAnalysis } from '../analysis/modal-analysis'
import { lowerQuantity } from '../charts/mode-shape-chart'
import { hzToRpm } from '../model/units'
import { escapeHtml, htmlTable, type Cell } from './html'
import { formatFrequency, formatPercent, formatRelativeError, formatSpeed, MISSING } from './number-format'
import { effectiveMassWords, referenceHeader } from './report-families'
import type { ReportUnits } from './report-units'

/** Effective mass of a mode that symmetry leaves unexcited is zero up to round-off; printing 10⁻²⁶ kg would suggest otherwise. */
const ROUND_OFF_FRACTION = 1e-9

function isRoundOff(fraction: number | null): boolean {
  return fraction !== null && Math.abs(fraction) < ROUND_OFF_FRACTION
}

export function familyModesTable(family: FamilyAnalysis, units: ReportUnits): string {
  const effective = effectiveMassWords(family.family.motion)
  const reference = referenceHeader(family.reference.method)
  const rows: Cell[][] = family.modes.map((m) => [
    { html: `${m.mode}${m.rigidBody ? ' <span class="tag">rigid body</span>' : ''}` },
    formatFrequency(m.frequencyHz),
    formatSpeed(hzToRpm(m.frequencyHz)),
    m.referenceHz === null ? MISSING : formatFrequency(m.referenceHz),
    formatRelativeError(m.errorVsReference),
    m.effectiveMass === null ? MISSING : isRoundOff(m.effectiveMassFraction) ? '≈ 0' : units.figure(effective.kind, m.effectiveMass),
    m.effectiveMassFraction === null ? MISSING : formatPercent(m.effectiveMassFraction),
    m.cumulativeEffectiveMassFraction === null ? MISSING : formatPercent(m.cumulativeEffectiveMassFraction),
  ])
  return htmlTable(
    [
      { header: 'Mode', numeric: true },
      { header: 'Frequency', unit: 'Hz', numeric: true },
      { header: 'Speed', unit: 'rpm', numeric: true },
      { header: reference, unit: 'Hz', numeric: true },
      { header: `Error vs ${reference.toLowerCase()}`, numeric: true },
      { header: effective.header, unit: units.symbol(effective.kind), numeric: true },
      { header: effective.header, unit: '%', numeric: true },
      { header: 'Cumulative', unit: '%', numeric: true },
    ],
    rows,
    { className: 'modes' },
  )
}

/** Where the notes send the reader: the section with the reference method and the one with the convergence study. */
export interface ModesNoteLinks {
  readonly reference: string
  readonly convergence: string
}

function effectiveMassNote(family: FamilyAnalysis, units: ReportUnits): string {
  const total = family.model.totalMass
  const hasEffectiveMass = family.modes.some((m) => m.effectiveMass !== null)
  switch (family.family.motion) {
    case 'torsion':
      return hasEffectiveMass
        ? `Effective polar inertia: the polar mass moment of inertia that takes part in each mode when all supports (fixed ends and torsional springs) turn together about the axis, and its share of the total ${units.withUnit('massInertia', total)} (bar and point masses).`
        : 'Effective polar inertia is not defined for this family: nothing holds the part against twist (no fixed end and no torsional spring).'
    case 'bending':
      return hasEffectiveMass
        ? `Effective mass: the mass that takes part in each mode when all supports (held ends and side springs) move together sideways, across the axis, and its share of the total ${units.withUnit('mass', total)}.`
        : 'Effective mass is not defined for this family: nothing holds the part sideways (no support against deflection and no side spring).'
    default:
      return hasEffectiveMass
        ? `Effective mass: the mass that takes part in each mode when all supports (fixed ends and springs) move together along the axis, and its share of the total ${units.withUnit('mass', total)}.`
        : 'Effective mass is not defined for this part: it has no support (no fixed end and no spring).'
  }
}

function rigidBodyNote(family: FamilyAnalysis): string {
  switch (family.family.motion) {
    case 'torsion':
      return 'A rigid-body mode (the whole part turning as one, at 0 Hz) appears because nothing holds the part against twist.'
    case 'bending':
      return 'Rigid-body modes (the whole part moving or rocking sideways as one, at 0 Hz) appear because the supports leave such a motion free.'
    default:
      return 'A rigid-body mode (the whole bar moving as one, at 0 Hz) appears because nothing holds the part axially.'
  }
}

export function familyModesNotes(family: FamilyAnalysis, units: ReportUnits, links: ModesNoteLinks): string {
  const method = family.reference.method
  const notes: string[] = [
    'Frequency: the finite-element natural frequency; speed = 60 × frequency, the shaft speed that would excite the mode once per revolution.',
    method === 'exact'
      ? `Exact: the exact natural frequency of the same ${family.family.motion === 'axial' ? 'bar' : 'part'} (${links.reference}); error = (f − f<sub>exact</sub>) / f<sub>exact</sub>.`
      : method === 'extrapolated'
        ? `Extrapolated: no exact solution is used for this family, so the reference is a Richardson estimate from two fine meshes (${links.reference}) — an estimate, not an exact value; error = (f − f<sub>ref</sub>) / f<sub>ref</sub>.`
        : `No exact solution is known for this model, so the error column is empty; the convergence study (${links.convergence}) bounds the error instead.`,
    effectiveMassNote(family, units),
  ]
  if (family.modes.some((m) => m.rigidBody)) notes.push(rigidBodyNote(family))
  return `<ul class="note">${notes.map((n) => `<li>${n}</li>`).join('')}</ul>`
}

/** Segments whose section gives no surface to measure a stress from (the `area` shape) in torsion or bending. */
function segmentsWithoutStress(family: FamilyAnalysis): number[] {
  if (family.family.motion === 'axial') return []
  return family.project.segments.flatMap((s, i) => (s.section.shape === 'area' ? [i + 1] : []))
}

/** The figure caption's account of what the two plots show, per family. */
function shapeCaption(family: FamilyAnalysis, units: ReportUnits): string {
  const lower = lowerQuantity('stress', units.system, family.family.motion)
  const perUnit = escapeHtml(lower.unit.replace('/', ' per '))
  const plane = family.family.plane ? ` in the ${family.family.plane} plane` : ''
  let text: string
  switch (family.family.motion) {
    case 'torsion':
      text = `Top: twist (rotation about the axis) along the part, each mode scaled to a largest twist of 1. Bottom: the largest shear stress on the section that a vibration of unit peak twist causes (${perUnit})`
      break
    case 'bending':
      text = `Top: deflection across the axis${plane}, each mode scaled to a largest deflection of 1. Bottom: the bending stress at the surface that a vibration of unit peak deflection causes (${perUnit})`
      break
    default:
      text = `Top: axial displacement along the bar, each mode scaled to a largest displacement of 1. Bottom: the axial stress that a vibration of unit peak displacement causes (${perUnit})`
  }
  const missing = segmentsWithoutStress(family)
  const gap = missing.length
    ? ` No stress is drawn along segment${missing.length > 1 ? 's' : ''} ${missing.join(', ')}: a section given by its area alone has no surface to measure it at.`
    : ''
  return `${text}; dashed lines mark the segment boundaries.${gap}`
}

export function modeShapeFigure(family: FamilyAnalysis, units: ReportUnits, figureLabel: string, chart: string, chartModes: readonly number[]): string {
  const range = chartModes.length < family.modes.length ? ` of modes ${chartModes[0]}–${chartModes[chartModes.length - 1]}` : ''
  return `<figure class="chart mode-shape-chart" data-family="${family.family.key}">${chart}<figcaption><b>Figure ${figureLabel}.</b> Mode shapes${range}. ${shapeCaption(family, units)}</figcaption></figure>`
}

/** Report section 4 of a single-family report (the version 1 layout). */
export function modesSection(analysis: ModalAnalysis, units: ReportUnits, modeShapeChart: string, chartModes: readonly number[]): string {
  const family = analysis.families[0]
  return `<section id="modes">
<h2>4 Modes</h2>
${familyModesTable(family, units)}
${familyModesNotes(family, units, { reference: 'section 6', convergence: 'section 3' })}
${modeShapeFigure(family, units, '3', modeShapeChart, chartModes)}
</section>`
}
