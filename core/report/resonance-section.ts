/** Report section 5: every excitation, the margin, every mode–excitation pair, the interference diagram. */
import type { ModalAnalysis } from '../analysis/modal-analysis'
import { excitationBands, excitationLabel, type ResonancePair } from '../analysis/resonance'
import { htmlTable, escapeHtml, type Cell } from './html'
import { figure } from '../charts/chart-text'
import { formatFrequency, formatPercent, formatRange, formatSignedPercent } from './number-format'

/** The pair nearest to resonance over the whole check (smallest |separation|), or null. */
export function closestOverall(pairs: readonly ResonancePair[]): ResonancePair | null {
  let best: ResonancePair | null = null
  for (const p of pairs) if (!best || Math.abs(p.separation) < Math.abs(best.separation)) best = p
  return best
}

export function marginText(margin: number): string {
  return `±${formatPercent(margin)} %`
}

function excitationsTable(analysis: ModalAnalysis): string {
  const allBands = excitationBands(analysis.project.excitations)
  const rows: Cell[][] = analysis.project.excitations.map((e, i) => {
    if ('rpm' in e) {
      const range: [number, number] = Array.isArray(e.rpm) ? [e.rpm[0], e.rpm[1]] : [e.rpm, e.rpm]
      const bands = allBands
        .filter((b) => b.excitationIndex === i)
        .map((b) => `×${figure(b.order ?? 1, 6)}: ${formatRange([b.hz[0], b.hz[1]], formatFrequency)}`)
        .join('; ')
      return [excitationLabel(e, i), 'running speed', formatRange(range, (v) => figure(v, 6)), e.orders.map((o) => figure(o, 6)).join(', '), bands]
    }
    const band: [number, number] = Array.isArray(e.hz) ? [e.hz[0], e.hz[1]] : [e.hz, e.hz]
    return [excitationLabel(e, i), 'fixed frequency', '', '', formatRange(band, formatFrequency)]
  })
  return htmlTable(
    [{ header: 'Excitation' }, { header: 'Kind' }, { header: 'Speed', unit: 'rpm' }, { header: 'Orders' }, { header: 'Excited band', unit: 'Hz' }],
    rows,
    { className: 'excitations' },
  )
}

function pairsTable(pairs: readonly ResonancePair[], closest: ResonancePair | null): string {
  const rows: Cell[][] = pairs.map((p) => [
    String(p.mode),
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

export function resonanceSection(analysis: ModalAnalysis, interferenceChart: string): string {
  const { project, resonance } = analysis
  const margin = marginText(project.margin)
  const closest = closestOverall(resonance)
  const conflicts = resonance.filter((p) => p.status === 'conflict').length
  const marginLine = `<p class="margin-statement">Required separation margin: <b>${margin}</b>. A pair is a <b>conflict</b> when |separation| &lt; ${formatPercent(project.margin)} %, where separation = (f<sub>mode</sub> − f<sub>exc</sub>) / f<sub>exc</sub> and f<sub>exc</sub> is the nearest point of the excited band (0 inside the band). Keeping modes 10–20 % away from excitation is common practice; the margin is the project's choice.</p>`
  if (project.excitations.length === 0) {
    return `<section id="resonance">
<h2>5 Resonance check</h2>
${marginLine}
<p>No excitations are entered in this project, so no mode was checked against the machines nearby.</p>
</section>`
  }
  const summary = closest
    ? `<p>${conflicts === 0 ? `All ${resonance.length} mode–excitation pairs are clear of the margin.` : `<span class="status-conflict">${conflicts} of ${resonance.length} mode–excitation pairs are inside the margin.</span>`} Closest pair (highlighted): mode ${closest.mode} at ${formatFrequency(closest.frequencyHz)} Hz and ${escapeHtml(closest.band.label)}${closest.band.order === null ? '' : ` ×${figure(closest.band.order, 6)}`}, separation ${formatSignedPercent(closest.separation)} %.</p>`
    : '<p>Every mode is a rigid-body mode, so no pair was checked.</p>'
  return `<section id="resonance">
<h2>5 Resonance check</h2>
<h3>Excitations from the machines nearby</h3>
${excitationsTable(analysis)}
${marginLine}
<figure class="chart interference-chart">${interferenceChart}<figcaption><b>Figure 4.</b> Interference diagram: frequency against machine speed. Each natural frequency is a horizontal line inside its margin band; each order of a running speed is a line from the origin; operating speed ranges are shaded and fixed-frequency excitations drawn across. ${conflicts === 0 ? 'No pair conflicts, so nothing is marked.' : 'Diamonds and heavy stretches mark the conflicting pairs of the table below.'}</figcaption></figure>
<h3>Every mode against every excitation</h3>
${summary}
${pairsTable(resonance, closest)}
</section>`
}
