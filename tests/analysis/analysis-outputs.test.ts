/**
 * What an analysis hands on — the `solve --json` document, the modal summary CSV and the
 * analysis's own warnings — checked against values computed here: a uniform fixed–free steel bar,
 * f_n = (2n − 1)c/4L exactly (docs/verification.md §1), effective mass 8/((2n − 1)²π²) of
 * m = ρAL (§4), 1 rpm = 1/60 Hz (§7), separation from a band by §8, measured from the exact
 * frequency; Euler's load π²EI/L² for a pinned–pinned column (S. P. Timoshenko & J. M. Gere,
 * Theory of Elastic Stability, from memory); slenderness: a bending half-wave shorter than 20 radii
 * of gyration is stubby (common practice, no source; the rule Rodwave states in its warning).
 */
import { describe, expect, test } from 'vitest'
import { analyseProject, familyAnalysis, withMotions } from '../../core/analysis/modal-analysis'
import { MODAL_SUMMARY_COLUMNS, modalSummaryCsv, solveDocument } from '../../core/analysis/modal-summary'
import { expectRelative, makeProject, STEEL } from '../helpers'

const E = STEEL.youngsModulus
const RHO = STEEL.density
const c = Math.sqrt(E / RHO)
const L = 1.1
const d = 0.025
const A = (Math.PI / 4) * d * d

describe('the solve document and the modal summary of a uniform bar', () => {
  const project = makeProject({
    title: 'Test bar',
    materials: [STEEL],
    segments: [{ length: L, material: 'steel', section: { shape: 'solid', diameter: d } }],
    excitations: [
      { label: 'fan', rpm: [1500, 1800], orders: [1, 2] },
      { label: 'line, twice', hz: 100 },
    ],
    analysis: { elementsPerSegment: 50, modes: 3, mass: 'consistent' },
    margin: 0.1,
  })
  const exact = (n: number) => ((2 * n - 1) * c) / (4 * L)

  test('document: title, settings, totals, references and effective masses from the closed forms', () => {
    const doc = solveDocument(analyseProject(project))
    expect(doc.title).toBe('Test bar')
    expect(doc.motions).toEqual(['axial'])
    expect(doc.analysis).toEqual({ elementOrder: 1, elementsPerSegment: 50, mass: 'consistent', modes: 3 })
    expect(doc.margin).toBe(0.1)
    expect(doc.preload).toBeUndefined()
    expectRelative(doc.totals.length, L, 1e-15, 'length')
    expectRelative(doc.totals.mass, RHO * A * L, 1e-12, 'mass')
    expect(doc.totals.elements).toBe(50)
    expect(doc.totals.dofs).toBe(50)
    expect(doc.reference.method).toBe('exact')
    expect(doc.reference.families.axial.length).toBe(3)
    expect(doc.reference.methods).toEqual({ axial: 'exact' })
    doc.modes.forEach((m, i) => {
      const n = i + 1
      expect([m.mode, m.motion, m.plane, m.rigidBody]).toEqual([n, 'axial', null, false])
      expectRelative(m.referenceHz!, exact(n), 1e-12, `reference ${n}`)
      expectRelative(m.frequencyHz, exact(n), 2e-3, `frequency ${n}`)
      expectRelative(m.errorVsReference!, (m.frequencyHz - exact(n)) / exact(n), 1e-9, `error ${n}`)
      expectRelative(m.effectiveMassFraction!, 8 / ((2 * n - 1) ** 2 * Math.PI ** 2), 2e-3, `effective mass fraction ${n}`)
      expectRelative(m.effectiveMass!, m.effectiveMassFraction! * RHO * A * L, 1e-9, `effective mass ${n}`)
    })
    expect(doc.checks.sturmCount.passed).toBe(true)
    expect(Object.keys(doc.checks.sturmCount.families)).toEqual(['axial'])
    expect(doc.warnings).toEqual([])
    expect(doc.buckling).toBeNull()
    for (const key of ['assembleMs', 'solveMs', 'referenceMs', 'checksMs'] as const) expect(doc.timing[key]).toBeGreaterThanOrEqual(0)
  })

  test('resonance rows: every mode against every band (rpm × order / 60), separation from the exact frequency (§8)', () => {
    const doc = solveDocument(analyseProject(project))
    const bands = [
      { name: 'fan', order: 1, hz: [25, 30] },
      { name: 'fan', order: 2, hz: [50, 60] },
      { name: 'line, twice', order: null, hz: [100, 100] },
    ]
    expect(doc.resonance.length).toBe(9)
    doc.resonance.forEach((row, k) => {
      const n = Math.floor(k / 3) + 1
      const band = bands[k % 3]
      expect([row.mode, row.excitation, row.order]).toEqual([n, band.name, band.order])
      expect(row.excitationHz).toEqual(band.hz)
      expectRelative(row.modeHz, exact(n), 1e-12, `row ${k}: mode frequency`)
      const separation = (exact(n) - band.hz[1]) / band.hz[1]
      expectRelative(row.separation, separation, 1e-12, `row ${k}: separation`)
      expect(row.status).toBe(Math.abs(separation) < 0.1 ? 'conflict' : 'clear')
    })
  })

  test('CSV: the columns, rpm = 60 f, percentages, the closest band named with its order, RFC 4180 quoting', () => {
    const analysis = analyseProject(project)
    const csv = modalSummaryCsv(analysis)
    expect(csv.endsWith('\r\n')).toBe(true)
    const lines = csv.trimEnd().split('\r\n')
    expect(lines[0]).toBe(MODAL_SUMMARY_COLUMNS.join(','))
    expect(lines.length).toBe(4)
    lines.slice(1).forEach((line, i) => {
      const n = i + 1
      const m = analysis.modes[i]
      // The closest band is the highest, 100 Hz: every mode lies far above all three.
      const cells = line.split(/,(?=(?:[^"]*"[^"]*")*[^"]*$)/)
      expect(cells[0]).toBe(String(n))
      expect(cells[1]).toBe('axial')
      expectRelative(Number(cells[2]), m.frequencyHz, 1e-9, 'frequency_hz')
      expectRelative(Number(cells[3]), 60 * m.frequencyHz, 1e-9, 'speed_rpm')
      expectRelative(Number(cells[4]), exact(n), 1e-9, 'reference_hz')
      expectRelative(Number(cells[6]), 100 * (8 / ((2 * n - 1) ** 2 * Math.PI ** 2)), 2e-3, 'effective_mass_percent')
      expect(cells[8]).toBe('"line, twice"')
      expectRelative(Number(cells[9]), 100 * ((exact(n) - 100) / 100), 1e-9, 'separation_percent')
      expect(cells[10]).toBe('clear')
      expect(cells[11]).toBe('')
    })
    const cumulative = lines.slice(1).map((line) => Number(line.split(',')[7]))
    expect(cumulative[2]).toBeGreaterThan(cumulative[1])
    expectRelative(cumulative[2], 100 * [1, 2, 3].reduce((s, n) => s + 8 / ((2 * n - 1) ** 2 * Math.PI ** 2), 0), 2e-3, 'cumulative percent')
  })

  test('a free–free bar: the rigid mode is named as such in the CSV and has no band', () => {
    const free = makeProject({ materials: [STEEL], segments: [{ length: L, material: 'steel', section: { shape: 'solid', diameter: d } }], ends: { start: 'free', end: 'free' }, analysis: { elementsPerSegment: 20, modes: 2 } })
    const lines = modalSummaryCsv(analyseProject(free)).trimEnd().split('\r\n')
    expect(lines[1].split(',')[8]).toBe('rigid-body mode')
    expect(lines[1].split(',')[2]).toBe('0')
    // No excitation at all: the elastic mode's band cells are empty.
    expect(lines[2].split(',').slice(8, 11)).toEqual(['', '', ''])
  })
})

describe('the solve document of a compressed column analysed in bending', () => {
  test('mesh by element length, the bending theory, the preload and the buckling check (Euler’s load)', () => {
    const D = 0.02
    const I = (Math.PI / 64) * D ** 4
    const project = makeProject({
      version: 2,
      motions: ['axial', 'bending'],
      materials: [{ ...STEEL, poissonRatio: 0.3 }],
      segments: [{ length: L, material: 'steel', section: { shape: 'solid', diameter: D } }],
      ends: { start: { axial: 'fixed', bending: 'pinned' }, end: { axial: 'free', bending: 'pinned' } },
      analysis: { maxElementLength: 0.05, modes: 2 },
      excitations: [{ label: 'say "hum"', hz: 50 }],
      preload: -300,
    })
    const analysis = analyseProject(project)
    const doc = solveDocument(analysis)
    expect(doc.analysis).toEqual({ elementOrder: 1, maxElementLength: 0.05, mass: 'consistent', modes: 2, bendingTheory: 'euler-bernoulli' })
    expect(doc.preload).toBe(-300)
    const euler = (Math.PI * Math.PI * E * I) / (L * L)
    expect(doc.buckling).not.toBeNull()
    expect(doc.buckling!.compression).toBe(300)
    expectRelative(doc.buckling!.criticalCompression, euler, 1e-12, 'critical compression')
    expectRelative(doc.buckling!.ratio, 300 / euler, 1e-12, 'ratio')
    expect(doc.buckling!.method).toBe('exact, Euler–Bernoulli segments')
    expect(Object.keys(doc.reference.families)).toEqual(['axial', 'bending'])
    expect(doc.checks.sturmCount.families.bending.passed).toBe(true)
    // A quote inside a label is doubled inside the quoted cell (RFC 4180).
    expect(modalSummaryCsv(analysis)).toContain(',"say ""hum""",')
  })
})

describe('the analysis’s own warnings', () => {
  const D = 0.02
  const I = (Math.PI / 64) * D ** 4
  const column = (doc: Record<string, unknown>) =>
    makeProject({
      version: 2,
      materials: [{ ...STEEL, poissonRatio: 0.3 }],
      segments: [{ length: L, material: 'steel', section: { shape: 'solid', diameter: D } }],
      ends: { start: { axial: 'fixed', bending: 'pinned' }, end: { axial: 'free', bending: 'pinned' } },
      analysis: { elementsPerSegment: 20, modes: 2 },
      ...doc,
    })
  const euler = (Math.PI * Math.PI * E * I) / (L * L)

  test('a compression above half the buckling load is named with its percentage and the load', () => {
    const analysis = analyseProject(column({ motions: ['bending'], preload: -0.6 * euler }))
    const [w] = analysis.warnings
    expect(w.code).toBe('buckling-proximity')
    const round = (v: number) => Number(v.toPrecision(4)).toLocaleString('en-US')
    expect(w.message).toBe(
      `The compression of ${round(0.6 * euler)} N is 60 % of the part's buckling load, ${round(euler)} N: near buckling the bending frequencies fall steeply and small changes in load or support move them a lot.`,
    )
    // At 0.4 of the load: no warning.
    expect(analyseProject(column({ motions: ['bending'], preload: -0.4 * euler })).warnings).toEqual([])
  })

  test('a compression without bending analysed is said to be unchecked', () => {
    const analysis = analyseProject(column({ motions: ['axial'], preload: -10 }))
    expect(analysis.warnings.map((w) => w.code)).toEqual(['compression-unchecked'])
    expect(analysis.buckling).toBeNull()
    expect(analyseProject(column({ motions: ['axial'], preload: 10 })).warnings).toEqual([])
  })

  test('an excitation driving only motions not analysed is named; one that also drives an analysed motion is not', () => {
    const analysis = analyseProject(
      column({
        motions: ['axial'],
        excitations: [
          { label: 'gear mesh', hz: 300, excites: ['torsion'] },
          { hz: 50, excites: ['torsion', 'bending'] },
          { hz: 70, excites: ['torsion', 'axial'] },
        ],
      }),
    )
    expect(analysis.warnings.map((w) => w.message)).toEqual([
      'Excitation 1 (“gear mesh”) drives only torsion, which is not analysed: it has not been checked against any mode.',
      'Excitation 2 drives only torsion and bending, which is not analysed: it has not been checked against any mode.',
    ])
  })

  test('stubby segments under Euler–Bernoulli theory: warned per plane-less family and mode, not under Timoshenko', () => {
    // A 0.2 m rod of 60 mm (radius of gyration d/4 = 15 mm): mode 1's half-wave ≈ L, 13 radii.
    const stubby = (theory?: string) =>
      makeProject({
        version: 2,
        motions: ['bending'],
        materials: [{ ...STEEL, poissonRatio: 0.3 }],
        segments: [{ length: 0.2, material: 'steel', section: { shape: 'solid', diameter: 0.06 } }],
        ends: { start: { bending: 'pinned' }, end: { bending: 'pinned' } },
        analysis: { elementsPerSegment: 20, modes: 2, ...(theory ? { bendingTheory: theory } : {}) },
      })
    const warnings = analyseProject(stubby()).warnings
    expect(warnings.length).toBe(1)
    expect(warnings[0].code).toBe('stubby-segment')
    // Pinned–pinned: the half-wave of mode 1 is the length, 0.2 m / 15 mm = 13 radii.
    expect(warnings[0].message.startsWith('Segment 1 is stubby for bending mode 1: half a wavelength there is only 13 radii of gyration.')).toBe(true)
    expect(analyseProject(stubby('timoshenko')).warnings).toEqual([])
    // A rectangle bends in two planes: the warning names the plane where the section is stubby.
    const bar = makeProject({
      version: 2,
      motions: ['bending'],
      materials: [{ ...STEEL, poissonRatio: 0.3 }],
      segments: [{ length: 0.2, material: 'steel', section: { shape: 'rectangle', width: 0.06, height: 0.012 } }],
      ends: { start: { bending: 'pinned' }, end: { bending: 'pinned' } },
      analysis: { elementsPerSegment: 20, modes: 1 },
    })
    const head = 'Segment 1 is stubby for bending mode 1 (strong plane)'
    expect(analyseProject(bar).warnings.map((w) => w.message.slice(0, head.length))).toEqual([head])
    // A slender rod (2 m of 20 mm: 400 radii per half-wave): no warning.
    expect(analyseProject(column({ motions: ['bending'] })).warnings).toEqual([])
  })

  test('families by key, and the motions an override asks for', () => {
    const both = column({ motions: ['axial', 'bending'] })
    const analysis = analyseProject(both)
    expect(familyAnalysis(analysis, 'bending')?.family.motion).toBe('bending')
    expect(familyAnalysis(analysis, 'torsion')).toBeUndefined()
    expect(withMotions(both, { motions: ['axial'] }).motions).toEqual(['axial'])
    expect(withMotions(both)).toBe(both)
    expect(analyseProject(both, { motions: ['axial'] }).families.map((f) => f.family.key)).toEqual(['axial'])
  })
})
