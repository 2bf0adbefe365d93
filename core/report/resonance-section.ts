/**
 * Report section 5 (later with several families): every excitation and the motions it drives,
 * the margin, every mode–excitation pair (each pairs an excitation only with the families it
 * drives), the interference diagram, and per family a plain-language verdict.
 */
import type { FamilyAnalysis, ModalAnalysis } from '../analysis/modal-analysis'
import { excitationBands, excitationLabel, type ResonancePair } from '../analysis/resonance'
import { FAMILY_MARKERS, modeWords } from '../charts/chart-families'
import { pairSentence } from '../charts/interference-chart'
import { familyName, type FamilyKey } from '../model/families'
import { excitedMotions, type Excitation, type Motion } from '../model/project'
import { htmlTable, escapeHtml, type Cell } from './html'
import { figure } from '../charts/chart-text'
import { formatFrequency, formatPercent, formatRange, formatSignedPercent } from './number-format'
import { familyTitle, listWords } from './report-families'

/** The pair nearest to resonance over the whole check (smallest |separation|), or null. */
export function closestOverall(pairs: readonly ResonancePair[]): ResonancePair | null {
  let best: ResonancePair | null = null
  for (const p of pairs) if (!best || Math.abs(p.separation) < Math.abs(best.separation)) best = p
  return best
}

export function marginText(margin: number): string {
  return `±${formatPercent(margin)} %`
}

/** What an excitation drives, in words: the analysed motions it names, or every one. */
function drivesText(excitation: Excitation, analysed: readonly Motion[]): Cell {
  const driven = excitedMotions(excitation, analysed)
  const named = excitation.excites?.length ? excitation.excites : null
  if (!driven.length) return { html: `<span class="status-conflict">nothing analysed</span> (names ${escapeHtml(listWords(named ?? []))})` }
  return named ? listWords(driven) : `${listWords(driven)} (every motion analysed)`
}

/** Whether the tables name motions: several families, or a file that says what its excitations drive. */
export function namesMotions(analysis: ModalAnalysis): boolean {
  return analysis.families.length > 1 || analysis.project.excitations.some((e) => e.excites?.length) || analysis.families.some((f) => f.family.motion !== 'axial')
}

function excitationsTable(analysis: ModalAnalysis): string {
  const allBands = excitationBands(analysis.project.excitations)
  const drives = namesMotions(analysis)
  const rows: Cell[][] = analysis.project.excitations.map((e, i): Cell[] => {
    const driven: Cell[] = drives ? [drivesText(e, analysis.project.motions)] : []
    if ('rpm' in e) {
      const range: [number, number] = Array.isArray(e.rpm) ? [e.rpm[0], e.rpm[1]] : [e.rpm, e.rpm]
      const bands = allBands
        .filter((b) => b.excitationIndex === i)
        .map((b) => `×${figure(b.order ?? 1, 6)}: ${formatRange([b.hz[0], b.hz[1]], formatFrequency)}`)
        .join('; ')
      return [excitationLabel(e, i), 'running speed', formatRange(range, (v) => figure(v, 6)), e.orders.map((o) => figure(o, 6)).join(', '), bands, ...driven]
    }
    const band: [number, number] = Array.isArray(e.hz) ? [e.hz[0], e.hz[1]] : [e.hz, e.hz]
    return [excitationLabel(e, i), 'fixed frequency', '', '', formatRange(band, formatFrequency), ...driven]
  })
  return htmlTable(
    [
      { header: 'Excitation' },
      { header: 'Kind' },
      { header: 'Speed', unit: 'rpm' },
      { header: 'Orders' },
      { header: 'Excited band', unit: 'Hz' },
      ...(drives ? [{ header: 'Drives' }] : []),
    ],
    rows,
    { className: 'excitations' },
  )
}

function pairsTable(pairs: readonly ResonancePair[], closest: ResonancePair | null, withMotion: boolean): string {
  const rows: Cell[][] = pairs.map((p) => [
    String(p.mode),
    ...(withMotion ? [familyName(p)] : []),
    formatFrequency(p.frequencyHz),
    p.band.label,
    p.band.order === null ? '' : `×${figure(p.band.order, 6)}`,
    formatRange([p.band.hz[0], p.band.hz[1]], formatFrequency),
    formatSignedPercent(p.separation),
    {
      html: `<span class="status-${p.status}">${p.status}</span>${p === closest ? ' <span class="tag">closest</span>' : ''}`,
    },
  ])
  return htmlTable(
    [
      { header: 'Mode', numeric: true },
      ...(withMotion ? [{ header: 'Motion' }] : []),
      { header: 'Frequency', unit: 'Hz', numeric: true },
      { header: 'Excitation' },
      { header: 'Order' },
      { header: 'Band', unit: 'Hz', numeric: true },
      { header: 'Separation', unit: '%', numeric: true },
      { header: 'Status' },
    ],
    rows,
    { className: 'pairs', rowClass: (i) => (pairs[i] === closest ? 'closest' : pairs[i].status === 'conflict' ? 'conflict' : undefined) },
  )
}

/** The resonance check of one family: its pairs, conflicts and closest pair. */
export interface FamilyResonance {
  readonly family: FamilyAnalysis['family']
  readonly pairs: ResonancePair[]
  readonly conflicts: ResonancePair[]
  readonly closest: ResonancePair | null
}

export function familyResonance(analysis: ModalAnalysis): FamilyResonance[] {
  return analysis.families.map((f) => {
    const pairs = analysis.resonance.filter((p) => p.family === f.family.key)
    const conflicts = pairs.filter((p) => p.status === 'conflict')
    return { family: f.family, pairs, conflicts, closest: closestOverall(pairs) }
  })
}

/** One plain-language line per family: in conflict (which pair is worst), clear, or not driven by any excitation. */
export function familyVerdictLines(analysis: ModalAnalysis): { key: FamilyKey; status: 'conflict' | 'clear' | 'unchecked'; html: string }[] {
  const margin = marginText(analysis.project.margin)
  return familyResonance(analysis).map(({ family, pairs, conflicts, closest }) => {
    const name = escapeHtml(familyTitle(family))
    const elastic = analysis.families.find((f) => f.family.key === family.key)?.modes.some((m) => !m.rigidBody) ?? false
    if (!pairs.length) {
      const why = elastic ? `no excitation drives ${escapeHtml(family.motion)}` : 'it has no elastic mode'
      return { key: family.key, status: 'unchecked' as const, html: `<b>${name}:</b> not checked — ${why}.` }
    }
    const sentence = closest ? ` ${escapeHtml(pairSentence(closest, true))}.` : ''
    if (conflicts.length) {
      return {
        key: family.key,
        status: 'conflict' as const,
        html: `<b>${name}</b> is <span class="status-conflict">in conflict</span>: ${conflicts.length} of ${pairs.length} pair${pairs.length === 1 ? '' : 's'} inside the ${margin} margin.${conflicts.length > 1 ? ' Closest:' : ''}${sentence}`,
      }
    }
    return {
      key: family.key,
      status: 'clear' as const,
      html: `<b>${name}</b> is <span class="status-clear">clear</span>: all ${pairs.length} pair${pairs.length === 1 ? '' : 's'} outside the margin. Closest:${sentence}`,
    }
  })
}

const LINE_WORDS: Record<FamilyKey, string> = { axial: 'solid lines', torsion: 'dashed lines', bending: 'dotted lines', 'bending-weak': 'dotted lines', 'bending-strong': 'dash-dotted lines' }
const SYMBOL_WORDS: Record<(typeof FAMILY_MARKERS)[FamilyKey]['symbol'], string> = { diamond: 'diamonds', triangle: 'triangles', rect: 'squares', circle: 'circles' }

function familyMarkersText(analysis: ModalAnalysis): string {
  const parts = analysis.families.map((f) => `${familyName(f.family)} ${LINE_WORDS[f.family.key]} and ${SYMBOL_WORDS[FAMILY_MARKERS[f.family.key].symbol]}`)
  return ` Each motion family has its own line style and conflict symbol (legend above the plot): ${escapeHtml(listWords(parts))}.`
}

export function resonanceSection(analysis: ModalAnalysis, interferenceChart: string, number = 5, figureLabel = '4'): string {
  const { project, resonance } = analysis
  const several = analysis.families.length > 1
  const margin = marginText(project.margin)
  const closest = closestOverall(resonance)
  const conflicts = resonance.filter((p) => p.status === 'conflict').length
  const checkedFrom = several ? ' Where a family has a reference frequency (exact or extrapolated), f<sub>mode</sub> is that reference.' : ''
  const marginLine = `<p class="margin-statement">Required separation margin: <b>${margin}</b>. A pair is a <b>conflict</b> when |separation| &lt; ${formatPercent(project.margin)} %, where separation = (f<sub>mode</sub> − f<sub>exc</sub>) / f<sub>exc</sub> and f<sub>exc</sub> is the nearest point of the excited band (0 inside the band). Keeping modes 10–20 % away from excitation is common practice; the margin is the project's choice.${checkedFrom}</p>`
  if (project.excitations.length === 0) {
    return `<section id="resonance">
<h2>${number} Resonance check</h2>
${marginLine}
<p>No excitations are entered in this project, so no mode was checked against the machines nearby.</p>
</section>`
  }
  const closestMode = closest ? escapeHtml(modeWords(closest, several || closest.motion !== 'axial')) : ''
  const summary = closest
    ? `<p>${conflicts === 0 ? `All ${resonance.length} mode–excitation pairs are clear of the margin.` : `<span class="status-conflict">${conflicts} of ${resonance.length} mode–excitation pairs are inside the margin.</span>`} Closest pair (highlighted): ${closestMode} at ${formatFrequency(closest.frequencyHz)} Hz and ${escapeHtml(closest.band.label)}${closest.band.order === null ? '' : ` ×${figure(closest.band.order, 6)}`}, separation ${formatSignedPercent(closest.separation)} %.</p>`
    : '<p>Every mode is a rigid-body mode, so no pair was checked.</p>'
  const byFamily = several || analysis.families[0]?.family.motion !== 'axial' || project.excitations.some((e) => e.excites?.length)
    ? `<h3>By motion</h3>
<ul class="family-verdicts">${familyVerdictLines(analysis)
        .map((l) => `<li class="family-verdict-${l.status}" data-family="${l.key}">${l.html}</li>`)
        .join('\n')}</ul>
`
    : ''
  const pairsHeading = several ? 'Every mode against every excitation that drives its motion' : 'Every mode against every excitation'
  return `<section id="resonance">
<h2>${number} Resonance check</h2>
<h3>Excitations from the machines nearby</h3>
${excitationsTable(analysis)}
${marginLine}
<figure class="chart interference-chart">${interferenceChart}<figcaption><b>Figure ${figureLabel}.</b> Interference diagram: frequency against machine speed. Each natural frequency is a horizontal line inside its margin band; each order of a running speed is a line from the origin; operating speed ranges are shaded and fixed-frequency excitations drawn across. ${conflicts === 0 ? 'No pair conflicts, so nothing is marked.' : `${several ? 'Symbols' : 'Diamonds'} and heavy stretches mark the conflicting pairs of the table below.`}${several ? familyMarkersText(analysis) : ''}</figcaption></figure>
${byFamily}<h3>${pairsHeading}</h3>
${summary}
${pairsTable(resonance, closest, several)}
</section>`
}
