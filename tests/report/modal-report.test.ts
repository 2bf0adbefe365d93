// @vitest-environment happy-dom
/**
 * The modal summary report as a document: parsed back with the DOM parser, it must carry the
 * title, every mode, every excitation, the margin, the Sturm result, the assumptions and the
 * cautions; keep every user string as text; load nothing from anywhere; and embed its charts
 * as well-formed SVG. Numbers are checked against closed forms named beside each check.
 */
import { describe, expect, test } from 'vitest'
import type { DOMParser as HappyDOMParser, Document, Element } from 'happy-dom'
import { readFileSync } from 'node:fs'
import { analyseProject, type ModalAnalysis } from '../../core/analysis/modal-analysis'
import { convergenceStudy, type ConvergenceStudy } from '../../core/analysis/convergence'
import { readProjectText } from '../../core/model/project-schema'
import type { Project } from '../../core/model/project'
import { hzToRpm } from '../../core/model/units'
import { libraryMaterial } from '../../core/model/materials'
import { modalReportHtml } from '../../core/report/modal-report'
import { formatFrequency, formatSpeed, formatPercent } from '../../core/report/number-format'
import { reportAssumptions, reportCautions } from '../../core/report/notes-section'
import { excitationLabel } from '../../core/analysis/resonance'
import { modelWarnings } from '../../core/analysis/model-checks'
import { expectRelative, makeProject, STEEL, uniformBar } from '../helpers'
import { chainFrequencies, chainFromDocument } from '../chain-reference'
import { RPM } from '../../core/model/units'

/** The environment's DOMParser (happy-dom), typed from happy-dom since the Node test build has no DOM library. */
const DOMParser = (globalThis as unknown as { DOMParser: typeof HappyDOMParser }).DOMParser

const EXAMPLES = ['examples/condensate-pump-hanger.rodwave.json', 'examples/fan-housing-tie-rod.rodwave.json', 'examples/die-cushion-actuator-rod.rodwave.json']
const GENERATED = new Date(2026, 11, 1, 14, 5)

function loadExample(path: string): Project {
  const read = readProjectText(readFileSync(path, 'utf8'))
  if (!read.ok) throw new Error(`${path} is not valid`)
  return read.project
}

/** A small study (coarse meshes only) keeps the test quick; the report shows whatever it is given. */
function smallStudy(project: Project, modes = 3): ConvergenceStudy {
  return convergenceStudy(project, { modes, densities: [1, 2, 4, 8, 16] })
}

function render(analysis: ModalAnalysis, convergence?: ConvergenceStudy): { html: string; doc: Document } {
  const html = modalReportHtml({ analysis, convergence: convergence ? [convergence] : undefined, generatedAt: GENERATED, appVersion: '9.8.7-test' })
  return { html, doc: new DOMParser().parseFromString(html, 'text/html') }
}

function cellTexts(row: Element): string[] {
  return [...row.querySelectorAll('td')].map((td) => (td.textContent ?? '').trim())
}

function headerTexts(table: Element): string[] {
  return [...table.querySelectorAll('thead th')].map((th) => (th.textContent ?? '').replace(/\s+/g, ' ').trim())
}

/** The raw <svg>…</svg> strings of the document (ECharts and the drawing never nest them). */
function rawSvgs(html: string): string[] {
  return html.match(/<svg[\s\S]*?<\/svg>/g) ?? []
}

describe.each(EXAMPLES)('%s', (file) => {
  const project = loadExample(file)
  const analysis = analyseProject(project)
  const study = smallStudy(project)
  const { html, doc } = render(analysis, study)

  test('title block: title, date and time, version, unit system', () => {
    expect(doc.querySelector('h1')?.textContent).toBe(project.title)
    expect(doc.title).toContain(project.title)
    const facts = doc.querySelector('header .title-facts')?.textContent ?? ''
    expect(facts).toContain('2026-12-01 14:05')
    expect(facts).toContain('9.8.7-test')
    expect(facts).toContain(project.units === 'SI' ? 'SI' : 'US customary')
  })

  test('every mode with its frequency in Hz and rpm, as the table formats it', () => {
    const table = doc.querySelector('table.modes')!
    const headers = headerTexts(table)
    expect(headers[1]).toBe('Frequency (Hz)')
    expect(headers[2]).toBe('Speed (rpm)')
    const rows = [...table.querySelectorAll('tbody tr')]
    expect(rows.length).toBe(analysis.modes.length)
    analysis.modes.forEach((m, i) => {
      const cells = cellTexts(rows[i])
      expect(cells[0]).toContain(String(m.mode))
      expect(cells[1]).toBe(formatFrequency(m.frequencyHz))
      expect(cells[2]).toBe(formatSpeed(hzToRpm(m.frequencyHz)))
      // The printed figure is the solver's value to five significant figures (thin spaces group thousands).
      expectRelative(Number(cells[1].replace(/\u2009/g, '')), m.frequencyHz, 5e-5, `mode ${m.mode} printed frequency`)
    })
  })

  test('every excitation, the margin, every pair and the closest one', () => {
    const excitations = doc.querySelector('table.excitations')!
    const labels = [...excitations.querySelectorAll('tbody tr')].map((r) => cellTexts(r)[0])
    expect(labels).toEqual(project.excitations.map((e, i) => excitationLabel(e, i)))
    const margin = doc.querySelector('.margin-statement')?.textContent ?? ''
    expect(margin).toContain(`±${formatPercent(project.margin)} %`)
    const pairs = [...doc.querySelectorAll('table.pairs tbody tr')]
    expect(pairs.length).toBe(analysis.resonance.length)
    const closest = doc.querySelectorAll('table.pairs tr.closest')
    expect(closest.length).toBe(1)
    const smallest = Math.min(...analysis.resonance.map((p) => Math.abs(p.separation)))
    const index = pairs.indexOf(closest[0])
    expect(Math.abs(analysis.resonance[index].separation)).toBe(smallest)
    const conflicts = pairs.filter((r) => cellTexts(r)[6].startsWith('conflict')).length
    expect(conflicts).toBe(analysis.resonance.filter((p) => p.status === 'conflict').length)
  })

  test('Sturm result, model checks, reference method, assumptions and cautions', () => {
    expect(doc.querySelector('.sturm-result')?.textContent).toContain('Passed: no mode was missed')
    const warnings = modelWarnings(analysis)
    expect([...doc.querySelectorAll('ul.model-warnings li')].map((li) => li.textContent)).toEqual(warnings.map((w) => w.message))
    expect(doc.querySelector('.model-checks-passed') !== null).toBe(warnings.length === 0)
    expect(doc.querySelectorAll('table.sturm tbody tr').length).toBe(analysis.families[0].sturm.shifts.length)
    expect(doc.querySelector('.reference-method')?.textContent).toContain(analysis.families[0].reference.formulation!)
    // A rendering check: the lists the report module gives for an axial-only project, as written.
    const assumptions = [...doc.querySelectorAll('ul.assumptions li')].map((li) => li.textContent)
    expect(assumptions).toEqual(reportAssumptions({ motions: ['axial'] }))
    const cautions = doc.querySelector('#cautions')?.textContent ?? ''
    for (const c of reportCautions({ motions: ['axial'] })) expect(cautions).toContain(c)
    expect(cautions).toMatch(/engineering aid/)
    expect(cautions).toMatch(/impact/)
    expect(cautions).toMatch(/licensed engineering practice/)
  })

  test('the model: one row per segment with units in the headers, materials with their source', () => {
    const segments = doc.querySelector('table.segments')!
    const headers = headerTexts(segments)
    const length = project.units === 'SI' ? 'm' : 'in'
    expect(headers).toContain(`Length (${length})`)
    expect(headers).toContain(`Mass (${project.units === 'SI' ? 'kg' : 'lbm'})`)
    expect(headers).toContain(`Area (${project.units === 'SI' ? 'mm²' : 'in²'})`)
    expect(segments.querySelectorAll('tbody tr').length).toBe(project.segments.length + 1)
    const materials = [...doc.querySelectorAll('table.materials tbody tr')].map(cellTexts)
    for (const m of project.materials) {
      const row = materials.find((r) => r[0] === m.id)!
      expect(row[1]).toBe(m.name)
      expect(row[5]).toBe('defined in the project')
    }
    expect(doc.querySelectorAll('table.masses tbody tr').length).toBe(project.masses.length)
  })

  test('the mesh and its convergence: one table per mass matrix and element order, with observed orders', () => {
    const facts = doc.querySelector('#mesh .facts')?.textContent ?? ''
    expect(facts).toContain(String(analysis.totals.dofs))
    expect(facts).toContain(String(analysis.totals.elements))
    const orders = [...doc.querySelectorAll('#mesh table.observed-orders tbody tr')].map(cellTexts)
    expect(orders.length).toBe(study.series.length)
    orders.forEach((cells, k) => {
      const order = study.series[k].observedOrder[0]
      if (order === null) expect(cells[1]).toBe('—')
      else expect(Math.abs(Number(cells[1]) - order), `${cells[0]}: printed ${cells[1]}, order ${order}`).toBeLessThanOrEqual(0.005 * Math.max(1, Math.abs(order)))
    })
    const tables = [...doc.querySelectorAll('#convergence-data table.convergence')]
    expect(tables.length).toBe(study.series.length)
    tables.forEach((t, k) => {
      expect(t.querySelectorAll('tbody tr').length).toBe(study.series[k].points.length + 1)
      expect(t.querySelector('tbody tr:last-child')?.textContent).toContain('Observed order')
    })
  })

  test('charts and drawing inline as well-formed SVG', () => {
    const expected: Record<string, number> = {
      'figure.bar-drawing': 1,
      'figure.mode-shape-chart': 1,
      'figure.interference-chart': 1,
      // The lowest elastic mode and the highest mode of the study.
      'figure.convergence-chart': 2,
    }
    for (const [selector, count] of Object.entries(expected)) {
      const figures = [...doc.querySelectorAll(selector)]
      expect(figures.length, selector).toBe(count)
      for (const figure of figures) expect(figure.querySelectorAll('svg').length, selector).toBe(1)
    }
    const svgs = rawSvgs(html)
    expect(svgs.length).toBe(5)
    for (const svg of svgs) {
      const parsed = new DOMParser().parseFromString(svg, 'image/svg+xml')
      expect(parsed.getElementsByTagName('parsererror').length, svg.slice(0, 200)).toBe(0)
      expect(parsed.documentElement.tagName.toLowerCase()).toBe('svg')
      // Something is drawn: paths, lines or polygons, not an empty frame.
      expect(parsed.querySelectorAll('path, line, polygon, polyline, rect').length).toBeGreaterThan(5)
    }
    // The legends name the modes and the study's series.
    const modeChart = doc.querySelector('figure.mode-shape-chart svg')?.textContent ?? ''
    for (const m of analysis.modes.slice(0, 6)) expect(modeChart).toContain(`Mode ${m.mode}`)
    expect(doc.querySelector('figure.convergence-chart svg')?.textContent).toContain('3-node, lumped')
  })

  test('self-contained: no script, no stylesheet link, nothing fetched from a network', () => {
    expect(doc.querySelectorAll('script').length).toBe(0)
    expect(doc.querySelectorAll('link').length).toBe(0)
    expect(doc.querySelectorAll('img, iframe, object, embed, video, audio').length).toBe(0)
    for (const element of doc.querySelectorAll('*')) {
      for (const name of ['src', 'href', 'xlink:href', 'srcset', 'poster', 'data']) {
        const value = element.getAttribute(name)
        if (value !== null) expect(value, `${element.tagName} ${name}`).not.toMatch(/^\s*(https?:|\/\/)/i)
      }
      const style = element.getAttribute('style')
      if (style) expect(style).not.toMatch(/url\(/i)
    }
    const css = [...doc.querySelectorAll('style')].map((s) => s.textContent).join('\n')
    expect(css).toContain('@page')
    expect(css).toMatch(/size:\s*A4/)
    expect(css).not.toMatch(/url\(|@import|@font-face/i)
    expect(html).not.toMatch(/\b(src|href)\s*=\s*["']?\s*(https?:|\/\/)/i)
    expect(html).not.toMatch(/url\(\s*["']?\s*(https?:|\/\/)/i)
  })
})

describe('a version 1 file reads as before: the condensate-pump demo as it was, kept as a fixture', () => {
  const FIXTURE = 'tests/report/fixtures/condensate-pump-hanger-v1.rodwave.json'
  const text = readFileSync(FIXTURE, 'utf8')
  const project = loadExample(FIXTURE)
  const analysis = analyseProject(project)
  const { doc } = render(analysis, smallStudy(project))
  // The demo's frequencies from the tests' own shooting solver over (u, EA u′), without core/ (tests/chain-reference.ts).
  const expected = chainFrequencies(chainFromDocument(JSON.parse(text)), 4500, 0.5)

  test('the same sections as version 1, in the same order', () => {
    expect(JSON.parse(text).version).toBe(1)
    expect([...doc.querySelectorAll('h2')].map((h) => h.textContent)).toEqual([
      '1 The part as modelled',
      '2 Materials',
      '3 Mesh and convergence',
      '4 Modes',
      '5 Resonance check',
      '6 Checks',
      '7 Assumptions',
      'Cautions',
      'Appendix A Convergence data',
    ])
    expect(doc.querySelector('.doc-kind')?.textContent).toBe('Axial modal summary')
    expect(doc.querySelectorAll('section.family').length).toBe(0)
  })

  test('its exact frequencies, printed to five figures, against the independent shooting solver', () => {
    const rows = [...doc.querySelectorAll('table.modes tbody tr')].map(cellTexts)
    expect(rows.length).toBe(project.analysis.modes)
    expect(expected.length).toBeGreaterThanOrEqual(rows.length)
    rows.forEach((cells, i) => expectRelative(Number(cells[3].replace(/\u2009/g, '')), expected[i], 5e-5, `demo mode ${i + 1} exact frequency printed`))
  })

  test('its conflicts: mode 1 against the motor at 100 Hz and the pump ×2, separations from the independent f₁', () => {
    const rows = [...doc.querySelectorAll('table.pairs tbody tr')].map(cellTexts).filter((r) => r[6].startsWith('conflict'))
    expect(rows.map((r) => [r[0], r[2], r[3]])).toEqual([
      ['1', 'Condensate pump speed', '×2'],
      ['1', 'Motor twice line frequency', ''],
    ])
    const f1 = expected[0]
    // Separation from the nearest point of the band: (f − f_exc)/f_exc, the pump's ×2 band 2 × 2990 rpm / 60 at its top.
    const pumpTop = 2 * 2990 * RPM
    expect(Math.abs(Number(rows[0][5].replace('+', '')) - (100 * (f1 - pumpTop)) / pumpTop)).toBeLessThanOrEqual(0.05 + 1e-9)
    expect(Math.abs(Number(rows[1][5].replace('+', '')) - (100 * (f1 - 100)) / 100)).toBeLessThanOrEqual(0.05 + 1e-9)
    const verdict = doc.querySelector('.verdict')?.textContent ?? ''
    expect(verdict).toContain('2 conflicts inside the ±15.0 % margin, axial mode 1.')
    expect(verdict).toContain('axial motion only')
  })
})

describe('user strings stay text', () => {
  const hostile = '<script>alert("x")</script> & <img src=x onerror=alert(1)>'
  const project = makeProject({
    title: `Rod ${hostile}`,
    materials: [{ ...STEEL, name: `Steel ${hostile}` }],
    segments: [{ length: 1, material: 'steel', section: { shape: 'solid', diameter: 0.02 } }],
    masses: [{ at: 1, mass: 1, label: `Nut ${hostile}` }],
    springs: [{ at: 0.5, stiffness: 1e6, label: `Guide ${hostile}` }],
    excitations: [{ label: `Pump ${hostile}`, rpm: [1450, 1490], orders: [1, 2] }],
  })
  const { html, doc } = render(analyseProject(project), smallStudy(project, 2))

  test('no element is created from them and their text reads back unchanged', () => {
    expect(doc.querySelectorAll('script').length).toBe(0)
    expect(doc.querySelectorAll('img').length).toBe(0)
    expect(html).not.toContain('<script')
    expect(html).not.toContain('<img')
    expect(doc.querySelector('h1')?.textContent).toBe(`Rod ${hostile}`)
    expect(doc.title).toContain(`Rod ${hostile}`)
    const text = doc.body.textContent ?? ''
    for (const s of [`Steel ${hostile}`, `Nut ${hostile}`, `Guide ${hostile}`, `Pump ${hostile}`]) expect(text).toContain(s)
    // Inside the SVGs too (the drawing's title, the chart legends): escaped, so the SVGs still parse.
    for (const svg of rawSvgs(html)) expect(new DOMParser().parseFromString(svg, 'image/svg+xml').getElementsByTagName('parsererror').length).toBe(0)
  })
})

describe('numbers against closed forms', () => {
  test('uniform fixed–free steel bar: f1 = c/(4L), effective mass of mode 1 = 8/π² of the bar', () => {
    // f_n = (2n − 1) c / (4L), c = √(E/ρ); modal effective mass fraction 8/((2n − 1)²π²)
    // (any vibration text on the longitudinal vibration of bars, e.g. S. S. Rao, Mechanical Vibrations, from memory).
    const L = 1.2
    const project = uniformBar({ length: L, diameter: 0.03 })
    const { doc } = render(analyseProject(project, { elementOrder: 2, elementsPerSegment: 200, modes: 3 }))
    const c = Math.sqrt(STEEL.youngsModulus / STEEL.density)
    const rows = [...doc.querySelectorAll('table.modes tbody tr')].map(cellTexts)
    rows.forEach((cells, i) => {
      const n = i + 1
      expectRelative(Number(cells[1].replace(/\u2009/g, '')), ((2 * n - 1) * c) / (4 * L), 5e-5, `f${n} printed`)
      // Printed with one decimal: within half a unit of the last place.
      const percent = (100 * 8) / ((2 * n - 1) ** 2 * Math.PI ** 2)
      expect(Math.abs(Number(cells[6]) - percent), `effective mass of mode ${n}: printed ${cells[6]} %, expected ${percent} %, tolerance 0.05`).toBeLessThanOrEqual(0.05 + 1e-9)
    })
  })

  test('uniform fixed–fixed bar: the even modes take no effective mass, mode 1 takes 8/π²', () => {
    // Support motion of a fixed–fixed bar excites only the modes symmetric about the middle: effective
    // mass fraction 8/(n²π²) for odd n, 0 for even n (longitudinal vibration of bars, e.g. S. S. Rao,
    // Mechanical Vibrations, from memory). The even modes' round-off must not print as a mass.
    const project = uniformBar({ length: 2, start: 'fixed', end: 'fixed' })
    const { doc } = render(analyseProject(project, { elementOrder: 2, elementsPerSegment: 200, modes: 4 }))
    const rows = [...doc.querySelectorAll('table.modes tbody tr')].map(cellTexts)
    rows.forEach((cells, i) => {
      const n = i + 1
      if (n % 2 === 0) {
        expect(cells[5], `mode ${n} effective mass`).toBe('≈ 0')
        expect(cells[6]).toBe('0.0')
      } else {
        const percent = (100 * 8) / (n * n * Math.PI ** 2)
        expect(Math.abs(Number(cells[6]) - percent), `mode ${n}: printed ${cells[6]} %, expected ${percent} %, tolerance 0.05`).toBeLessThanOrEqual(0.05 + 1e-9)
      }
    })
  })

  test('US units: a 10 in bar shows 10.00 in and its mass in lbm (NIST SP 811: 1 in = 0.0254 m, 1 lb = 0.45359237 kg)', () => {
    const project = makeProject({
      units: 'US',
      materials: [STEEL],
      segments: [{ length: 0.254, material: 'steel', section: { shape: 'solid', diameter: 0.0254 } }],
    })
    const { doc } = render(analyseProject(project, { modes: 2 }))
    const cells = cellTexts(doc.querySelector('table.segments tbody tr')!)
    expect(cells[2]).toBe('10.00')
    expect(cells[3]).toContain('⌀ 1.000')
    // Mass = ρ A L = 7850 · π/4 · 0.0254² · 0.254 kg, in lbm.
    const massLbm = (STEEL.density * (Math.PI / 4) * 0.0254 ** 2 * 0.254) / 0.45359237
    expectRelative(Number(cells[6]), massLbm, 5e-4, 'segment mass in lbm')
  })
})

describe('special cases', () => {
  test('a built-in material is listed with the library source text', () => {
    const project = makeProject({
      materials: [],
      segments: [{ length: 0.5, material: 'aluminium-6061-t6', section: { shape: 'tube', outerDiameter: 0.03, innerDiameter: 0.02 } }],
    })
    const { doc } = render(analyseProject(project, { modes: 2 }))
    const rows = [...doc.querySelectorAll('table.materials tbody tr')].map(cellTexts)
    const library = libraryMaterial('aluminium-6061-t6')!
    expect(rows).toEqual([[library.id, library.name, '68.90', '2700', '1', `built-in library: ${library.source}`]])
  })

  test('a free–free bar: the rigid-body mode is marked and has no pairs; no convergence study is stated', () => {
    const project = uniformBar({ start: 'free', end: 'free', extra: { excitations: [{ label: 'Fan', hz: 50 }] } })
    const analysis = analyseProject(project, { modes: 3 })
    const { doc } = render(analysis)
    const first = doc.querySelector('table.modes tbody tr')!
    expect(first.querySelector('.tag')?.textContent).toBe('rigid body')
    expect(cellTexts(first)[1]).toBe('0')
    expect(doc.querySelectorAll('table.modes .tag').length).toBe(1)
    expect([...doc.querySelectorAll('table.pairs tbody tr')].map((r) => cellTexts(r)[0])).not.toContain('1')
    expect(doc.querySelector('#mesh')?.textContent).toContain('No convergence study')
    expect(doc.querySelector('figure.convergence-chart')).toBeNull()
  })

  test('no excitations: the margin is still stated and the report says nothing was checked', () => {
    const project = uniformBar({ extra: { margin: 0.2 } })
    const { doc } = render(analyseProject(project, { modes: 2 }))
    expect(doc.querySelector('.margin-statement')?.textContent).toContain('±20.0 %')
    expect(doc.querySelector('#resonance')?.textContent).toContain('No excitations')
    expect(doc.querySelector('.verdict')?.textContent).toContain('no excitations entered')
  })

  test('a study without an exact solution: frequencies and their Richardson limit, no error chart', () => {
    const project = uniformBar({ length: 1.5 })
    const study = smallStudy(project, 2)
    // The engine always finds an exact solution today; the report must still read right without one.
    const withoutReference: ConvergenceStudy = {
      ...study,
      referenceMethod: null,
      referenceHz: [],
      series: study.series.map((s) => ({ ...s, observedOrder: s.observedOrder.map(() => null), points: s.points.map((p) => ({ ...p, errors: p.errors.map(() => null) })) })),
    }
    const { doc } = render(analyseProject(project, { modes: 2 }), withoutReference)
    expect(doc.querySelector('figure.convergence-chart')).toBeNull()
    const table = doc.querySelector('table.convergence')!
    expect(headerTexts(table).slice(2)).toEqual(['f1 (Hz)', 'f2 (Hz)'])
    const rows = [...table.querySelectorAll('tbody tr')].map(cellTexts)
    const finest = study.series[0].points[study.series[0].points.length - 1]
    expect(rows[rows.length - 2][2]).toBe(formatFrequency(finest.frequenciesHz[0]))
    expect(rows[rows.length - 1][0]).toBe('Richardson limit')
    expect(rows[rows.length - 1][2]).toBe(formatFrequency(study.series[0].extrapolatedHz[0]!))
  })

  test('a failed Sturm count is reported as failed, in the summary and in the checks', () => {
    const analysis = analyseProject(uniformBar(), { modes: 3 })
    const family = analysis.families[0]
    const failed: ModalAnalysis = { ...analysis, sturmPassed: false, families: [{ ...family, sturm: { ...family.sturm, counts: [1, 1, 3], passed: false } }] }
    const { doc } = render(failed)
    expect(doc.querySelector('.sturm-result')?.textContent).toMatch(/^Failed/)
    expect(doc.querySelector('.verdict')?.textContent).toContain('Failed')
    expect([...doc.querySelectorAll('table.sturm tbody tr')].map((r) => cellTexts(r)[3])).toEqual(['agrees', 'differs', 'agrees'])
  })

  test('a model-check warning is shown in the summary and in the checks, its label escaped', () => {
    // A spring some 10¹⁰ times stiffer than the bar end to end (EA/L ≈ 6.3 × 10⁷ N/m here).
    const label = '<b>anchor</b>'
    const project = uniformBar({ extra: { springs: [{ at: 0.5, stiffness: 1e18, label }] } })
    const analysis = analyseProject(project, { modes: 2 })
    const warnings = modelWarnings(analysis)
    expect(warnings.map((w) => w.code)).toContain('stiff-spring')
    const { doc } = render(analysis)
    const items = [...doc.querySelectorAll('ul.model-warnings li')]
    expect(items.map((li) => li.textContent)).toEqual(warnings.map((w) => w.message))
    expect(items.some((li) => li.textContent?.includes(label))).toBe(true)
    expect(doc.querySelectorAll('ul.model-warnings b').length).toBe(0)
    expect(doc.querySelector('.verdict')?.textContent).toContain(`${warnings.length} warning`)
    expect(doc.querySelector('.verdict')?.classList.contains('has-conflict')).toBe(true)
  })

  test('an untitled project gets a plain heading', () => {
    const { doc } = render(analyseProject(uniformBar(), { modes: 1 }))
    expect(doc.querySelector('h1')?.textContent).toBe('Untitled part')
  })
})
