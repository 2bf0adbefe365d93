// @vitest-environment happy-dom
/**
 * The report of a part analysed in several motion families (file format version 2): a section
 * per family with its modes, mode shapes, convergence, Sturm check and reference; effective mass
 * in kg (axial, bending) and effective polar inertia in kg·m² (torsion); the resonance check
 * pairing an excitation only with the families it drives, and saying in words which family is in
 * conflict; the cautions of what is still not modelled.
 *
 * The part is a uniform round steel rod, clamped at one end and free at the other, so every
 * figure has a closed form (each named beside its check):
 * - axial: f_n = (2n − 1) c / (4L), c = √(E/ρ); effective mass fraction 8/((2n − 1)²π²)
 *   (longitudinal vibration of bars, S. S. Rao, Mechanical Vibrations, from memory);
 * - torsion: f_n = (2n − 1)/(4L) · √(G/ρ) with G = E/(2(1 + ν)); the same wave equation in the
 *   twist, so the effective polar inertia fraction is 8/((2n − 1)²π²) of ρI_pL (Rao, torsional
 *   vibration of shafts, from memory);
 * - bending (Euler–Bernoulli, clamped–free): f_n = (β_nL)²/(2πL²) · √(EI/ρA) with 1 + cos βL cosh βL = 0
 *   and mode shape φ = cosh βx − cos βx − σ(sinh βx − sin βx), σ = (cosh βL + cos βL)/(sinh βL + sin βL)
 *   (R. D. Blevins, Formulas for Natural Frequency and Mode Shape, table 8-1, from memory); the
 *   roots are found here by bisection and the effective mass (∫φ dx)²/(L∫φ² dx)·ρAL by quadrature.
 * Checks marked "rendering check" only confirm that the report shows what the analysis computed.
 */
import { describe, expect, test } from 'vitest'
import type { DOMParser as HappyDOMParser, Document, Element } from 'happy-dom'
import { analyseProject, type ModalAnalysis } from '../../core/analysis/modal-analysis'
import { convergenceStudy, type ConvergenceStudy } from '../../core/analysis/convergence'
import { readProjectDocument } from '../../core/model/project-schema'
import type { Project } from '../../core/model/project'
import { hzToRpm } from '../../core/model/units'
import { modalReportHtml } from '../../core/report/modal-report'
import { formatFrequency, formatSpeed } from '../../core/report/number-format'
import { expectRelative } from '../helpers'

const DOMParser = (globalThis as unknown as { DOMParser: typeof HappyDOMParser }).DOMParser

const E = 200e9
const RHO = 7850
const NU = 0.3
const L = 1
const D = 0.02
const MODES = 5
const GEAR_MESH_HZ = 790

function rod(extra: Record<string, unknown> = {}): Project {
  const read = readProjectDocument({
    format: 'rodwave',
    version: 2,
    title: 'Uniform test rod',
    units: 'SI',
    motions: ['axial', 'torsion', 'bending'],
    materials: [{ id: 'steel', youngsModulus: E, density: RHO, poissonRatio: NU }],
    segments: [{ length: L, material: 'steel', section: { shape: 'solid', diameter: D } }],
    ends: { start: { axial: 'fixed', torsion: 'fixed', bending: 'clamped' }, end: { axial: 'free', torsion: 'free', bending: 'free' } },
    analysis: { elementOrder: 2, elementsPerSegment: 40, mass: 'consistent', modes: MODES },
    excitations: [
      { label: 'Gear mesh', hz: GEAR_MESH_HZ, excites: ['torsion'] },
      { label: 'Fan', rpm: [900, 1000], orders: [1, 2] },
    ],
    margin: 0.15,
    ...extra,
  })
  if (!read.ok) throw new Error(read.issues.map((i) => `${i.path}: ${i.message}`).join('\n'))
  return read.project
}

// Closed forms (see the header).
const AREA = (Math.PI / 4) * D ** 2
const I = (Math.PI / 64) * D ** 4
const IP = (Math.PI / 32) * D ** 4
const G = E / (2 * (1 + NU))
const axialHz = (n: number) => ((2 * n - 1) * Math.sqrt(E / RHO)) / (4 * L)
const torsionHz = (n: number) => ((2 * n - 1) / (4 * L)) * Math.sqrt(G / RHO)
const waveFraction = (n: number) => 8 / ((2 * n - 1) ** 2 * Math.PI ** 2)

/** The n-th root of 1 + cos x cosh x = 0, by bisection around (2n − 1)π/2. */
function clampedFreeRoot(n: number): number {
  const f = (x: number) => 1 + Math.cos(x) * Math.cosh(x)
  let a = ((2 * n - 1) * Math.PI) / 2 - 0.5
  let b = a + 1
  const signA = Math.sign(f(a))
  for (let i = 0; i < 200 && b - a > 1e-15 * b; i++) {
    const mid = 0.5 * (a + b)
    if (Math.sign(f(mid)) === signA) a = mid
    else b = mid
  }
  return 0.5 * (a + b)
}
const bendingHz = (n: number) => (clampedFreeRoot(n) ** 2 / (2 * Math.PI * L * L)) * Math.sqrt((E * I) / (RHO * AREA))

/** (∫φ dx)² / (L ∫φ² dx) of the clamped–free mode shape, by Simpson's rule on 4000 intervals. */
function bendingEffectiveFraction(n: number): number {
  const beta = clampedFreeRoot(n) / L
  const bl = beta * L
  const sigma = (Math.cosh(bl) + Math.cos(bl)) / (Math.sinh(bl) + Math.sin(bl))
  const phi = (x: number) => Math.cosh(beta * x) - Math.cos(beta * x) - sigma * (Math.sinh(beta * x) - Math.sin(beta * x))
  const steps = 4000
  const h = L / steps
  let s1 = 0
  let s2 = 0
  for (let i = 0; i <= steps; i++) {
    const w = i === 0 || i === steps ? 1 : i % 2 === 1 ? 4 : 2
    const v = phi(i * h)
    s1 += w * v
    s2 += w * v * v
  }
  const integral = (s1 * h) / 3
  const squares = (s2 * h) / 3
  return (integral * integral) / (L * squares)
}

function parse(html: string): Document {
  return new DOMParser().parseFromString(html, 'text/html')
}

function cellTexts(row: Element): string[] {
  return [...row.querySelectorAll('td')].map((td) => (td.textContent ?? '').trim())
}

function headerTexts(table: Element): string[] {
  return [...table.querySelectorAll('thead th')].map((th) => (th.textContent ?? '').replace(/\s+/g, ' ').trim())
}

const SUPERSCRIPTS = '⁰¹²³⁴⁵⁶⁷⁸⁹'

/** A printed figure back to a number: thin-space groups, a true minus, "9.995 × 10⁻⁵". */
function number(text: string): number {
  const plain = text.replace(/\u2009/g, '').replace(/\u2212/g, '-')
  const power = /^(-?[\d.]+) × 10(⁻?)([⁰¹²³⁴⁵⁶⁷⁸⁹]+)$/.exec(plain)
  if (!power) return Number(plain)
  const exponent = Number([...power[3]].map((c) => SUPERSCRIPTS.indexOf(c)).join(''))
  return Number(power[1]) * 10 ** (power[2] ? -exponent : exponent)
}

/** Small studies (coarse meshes only) keep the test quick; the report shows whatever it is given. */
function studies(project: Project, analysis: ModalAnalysis): ConvergenceStudy[] {
  return analysis.families.map((f) => convergenceStudy(project, { family: f.family.key, modes: 2, densities: [2, 4, 8, 16] }))
}

describe('a rod analysed in axial motion, torsion and bending', () => {
  const project = rod()
  const analysis = analyseProject(project)
  const html = modalReportHtml({ analysis, convergence: studies(project, analysis), generatedAt: new Date(2026, 11, 1, 14, 5), appVersion: '9.8.7-test' })
  const doc = parse(html)
  const section = (key: string) => doc.querySelector(`section#family-${key}`)!

  test('one section per family, in order, each titled with its family', () => {
    const ids = [...doc.querySelectorAll('section.family')].map((s) => s.getAttribute('id'))
    expect(ids).toEqual(['family-axial', 'family-torsion', 'family-bending'])
    expect(section('axial').querySelector('h2')?.textContent).toBe('4 Axial modes')
    expect(section('torsion').querySelector('h2')?.textContent).toBe('5 Torsion modes')
    expect(section('bending').querySelector('h2')?.textContent).toBe('6 Bending modes')
    expect(doc.querySelector('section#resonance h2')?.textContent).toBe('7 Resonance check')
    expect(doc.querySelector('.doc-kind')?.textContent).toBe('Axial, torsion and bending modal summary')
  })

  test('axial rows: the exact reference against c/(4L) closed forms, effective mass 8/((2n − 1)²π²) in kg', () => {
    const table = section('axial').querySelector('table.modes')!
    expect(headerTexts(table)).toEqual(['Mode', 'Frequency (Hz)', 'Speed (rpm)', 'Exact (Hz)', 'Error vs exact', 'Effective mass (kg)', 'Effective mass (%)', 'Cumulative (%)'])
    const rows = [...table.querySelectorAll('tbody tr')].map(cellTexts)
    expect(rows.length).toBe(MODES)
    rows.forEach((cells, i) => {
      const n = i + 1
      // Printed with five significant figures: within 5e-5 of the closed form.
      expectRelative(number(cells[3]), axialHz(n), 5e-5, `axial f${n} reference printed`)
      expectRelative(number(cells[1]), axialHz(n), 1e-4, `axial f${n} on the file's mesh`)
      const barMass = RHO * AREA * L
      expectRelative(number(cells[5]), waveFraction(n) * barMass, 1e-3, `axial effective mass of mode ${n} (kg)`)
      expect(Math.abs(number(cells[6]) - 100 * waveFraction(n)), `axial mode ${n}: printed ${cells[6]} %`).toBeLessThanOrEqual(0.05 + 1e-9)
    })
  })

  test('torsion rows: the reference against (2n − 1)/(4L)·√(G/ρ), effective polar inertia in kg·m²', () => {
    const family = analysis.families.find((f) => f.family.key === 'torsion')!
    const table = section('torsion').querySelector('table.modes')!
    const headers = headerTexts(table)
    // Rendering check: the reference column is named after the family's method.
    expect(headers[3]).toBe(family.reference.method === 'exact' ? 'Exact (Hz)' : 'Extrapolated (Hz)')
    expect(headers[5]).toBe('Effective polar inertia (kg·m²)')
    expect(headers[6]).toBe('Effective polar inertia (%)')
    const rows = [...table.querySelectorAll('tbody tr')].map(cellTexts)
    expect(rows.length).toBe(MODES)
    rows.forEach((cells, i) => {
      const n = i + 1
      expectRelative(number(cells[3]), torsionHz(n), 5e-5, `torsion f${n} reference printed`)
      expectRelative(number(cells[1]), torsionHz(n), 1e-4, `torsion f${n} on the file's mesh`)
      expectRelative(number(cells[5]), waveFraction(n) * RHO * IP * L, 1e-3, `effective polar inertia of torsion mode ${n} (kg·m²)`)
      expect(Math.abs(number(cells[6]) - 100 * waveFraction(n)), `torsion mode ${n}: printed ${cells[6]} %`).toBeLessThanOrEqual(0.05 + 1e-9)
      // Rendering check of the speed column: 60 × the printed frequency's value.
      expect(cells[2]).toBe(formatSpeed(hzToRpm(family.modes[i].frequencyHz)))
    })
  })

  test('bending rows: the reference against (βL)²/(2πL²)·√(EI/ρA), effective mass for sideways support motion in kg', () => {
    const table = section('bending').querySelector('table.modes')!
    expect(headerTexts(table)[5]).toBe('Effective mass (kg)')
    const rows = [...table.querySelectorAll('tbody tr')].map(cellTexts)
    expect(rows.length).toBe(MODES)
    // The roots found here against the handbook's βL = 1.8751, 4.6941, 7.8548 (Blevins, table 8-1, from memory).
    expect(clampedFreeRoot(1)).toBeCloseTo(1.8751, 4)
    expect(clampedFreeRoot(2)).toBeCloseTo(4.6941, 4)
    expect(clampedFreeRoot(3)).toBeCloseTo(7.8548, 4)
    rows.forEach((cells, i) => {
      const n = i + 1
      expectRelative(number(cells[3]), bendingHz(n), 5e-5, `bending f${n} reference printed`)
      expectRelative(number(cells[1]), bendingHz(n), 2e-3, `bending f${n} on the file's mesh`)
      const fraction = bendingEffectiveFraction(n)
      expectRelative(number(cells[5]), fraction * RHO * AREA * L, 1e-3, `bending effective mass of mode ${n} (kg)`)
      expect(Math.abs(number(cells[6]) - 100 * fraction), `bending mode ${n}: printed ${cells[6]} %, expected ${100 * fraction}`).toBeLessThanOrEqual(0.05 + 1e-9)
    })
    // The first two fractions against the handbook values 61.3 % and 18.8 % (common practice, no single source; from memory).
    expect(100 * bendingEffectiveFraction(1)).toBeCloseTo(61.3, 1)
    expect(100 * bendingEffectiveFraction(2)).toBeCloseTo(18.8, 1)
  })

  test('each family names its reference method: exact, or extrapolated from two fine meshes (rendering check)', () => {
    for (const family of analysis.families) {
      const text = section(family.family.key).querySelector('.reference-method')?.textContent ?? ''
      if (family.reference.method === 'exact') expect(text).toMatch(/^Exact solution of the same/)
      else expect(text).toMatch(/^Extrapolated \(Richardson estimate from two fine meshes\)/)
      expect(section(family.family.key).querySelector('.family-facts')?.textContent).toContain(
        family.reference.method === 'exact' ? 'Reference: exact.' : 'Reference: extrapolated (Richardson estimate from two fine meshes).',
      )
    }
    expect(analysis.families.find((f) => f.family.key === 'axial')!.reference.method).toBe('exact')
  })

  test('each family section: its mode shapes with the family quantities, its convergence, its Sturm check', () => {
    const quantities: Record<string, string[]> = {
      axial: ['Displacement u / u_peak', 'Stress per peak u (MPa/mm)'],
      torsion: ['Twist θ / θ_peak', 'Shear stress per peak θ (MPa/rad)'],
      bending: ['Deflection w / w_peak', 'Bending stress per peak w (MPa/mm)'],
    }
    for (const [key, words] of Object.entries(quantities)) {
      const own = section(key)
      const shapes = own.querySelectorAll('figure.mode-shape-chart svg')
      expect(shapes.length, key).toBe(1)
      for (const w of words) expect(shapes[0].textContent, `${key}: ${w}`).toContain(w)
      expect(own.querySelectorAll('table.observed-orders').length, key).toBe(1)
      const charts = [...own.querySelectorAll('figure.convergence-chart svg')]
      expect(charts.length, key).toBe(2)
      expect(charts[0].textContent).toContain(`${key} mode 1`)
      expect(own.querySelector('.sturm-result')?.textContent, key).toMatch(/^Passed: no mode was missed/)
      expect(own.querySelectorAll('table.sturm tbody tr').length).toBe(analysis.families.find((f) => f.family.key === key)!.sturm.shifts.length)
    }
    // Hermite elements only in bending: one series per mass matrix, named as such.
    const bendingOrders = [...section('bending').querySelectorAll('table.observed-orders tbody tr')].map((r) => cellTexts(r)[0])
    expect(bendingOrders).toEqual(['Hermite cubic elements, consistent mass', 'Hermite cubic elements, lumped mass', 'Hermite cubic elements, mixed mass'])
    expect([...doc.querySelectorAll('#convergence-data h3')].map((h) => h.textContent?.replace(/ \(.*\)$/, ''))).toEqual(['A.1 Axial', 'A.2 Torsion', 'A.3 Bending'])
  })

  test('an excitation that names only torsion is paired only with torsion modes', () => {
    const table = doc.querySelector('table.pairs')!
    const headers = headerTexts(table)
    expect(headers.slice(0, 2)).toEqual(['Mode', 'Motion'])
    const rows = [...table.querySelectorAll('tbody tr')].map(cellTexts)
    const gear = rows.filter((r) => r[3] === 'Gear mesh')
    expect(gear.map((r) => r[1])).toEqual(Array(MODES).fill('torsion'))
    // Bending mode 5 lies within the margin of the gear mesh (closed form), so pairing it would have shown a conflict.
    expect(Math.abs((bendingHz(5) - GEAR_MESH_HZ) / GEAR_MESH_HZ)).toBeLessThan(0.15)
    expect(rows.filter((r) => r[1] === 'bending' && r[3] === 'Gear mesh')).toEqual([])
    // The fan (no `excites`) drives every family: each elastic mode with each of its two orders.
    expect(rows.filter((r) => r[3] === 'Fan').length).toBe(3 * MODES * 2)
    const drives = [...doc.querySelectorAll('table.excitations tbody tr')].map((r) => cellTexts(r)[5])
    expect(drives).toEqual(['torsion', 'axial, torsion and bending (every motion analysed)'])
    // The torsion conflict's separation against the closed form: (f₁ − 790)/790, printed with one decimal.
    const conflict = gear.find((r) => r[0] === '1')!
    expect(conflict[7]).toMatch(/^conflict/)
    expect(Math.abs(number(conflict[6]) - (100 * (torsionHz(1) - GEAR_MESH_HZ)) / GEAR_MESH_HZ)).toBeLessThanOrEqual(0.05 + 1e-9)
  })

  test('plain-language lines say which family is in conflict and which is clear', () => {
    const byFamily = Object.fromEntries([...doc.querySelectorAll('ul.family-verdicts li')].map((li) => [li.getAttribute('data-family'), li.textContent ?? '']))
    // Torsion mode 1 against the gear mesh; bending mode 1 against the fan's first order, (900–1000)/60 Hz.
    expect(byFamily.torsion).toMatch(/^Torsion is in conflict/)
    expect(byFamily.torsion).toContain(`Torsion mode 1 at ${torsionHz(1).toPrecision(3)} Hz is ${(100 * Math.abs(torsionHz(1) - GEAR_MESH_HZ) / GEAR_MESH_HZ).toPrecision(2)} % below Gear mesh (790 Hz)`)
    expect(byFamily.bending).toMatch(/^Bending is in conflict/)
    expect(byFamily.bending).toContain(`Bending mode 1 at ${bendingHz(1).toPrecision(3)} Hz is ${(100 * (15 - bendingHz(1)) / 15).toPrecision(2)} % below Fan ×1`)
    expect(byFamily.axial).toMatch(/^Axial is clear/)
    const verdict = doc.querySelector('.verdict')?.textContent ?? ''
    expect(verdict).toContain('inside the ±15.0 % margin: torsion mode 1; bending mode 1.')
    expect(verdict).toContain('Torsion is in conflict')
    expect(verdict).toContain('Clear: axial')
    expect(doc.querySelector('.verdict')?.classList.contains('has-conflict')).toBe(true)
  })

  test('the model section: ends per family, section constants, bending theory', () => {
    const ends = [...doc.querySelectorAll('table.ends tbody tr')].map(cellTexts)
    expect(ends).toEqual([
      ['Start, x = 0', 'fixed (no axial displacement)', 'fixed (no twist)', 'clamped (no deflection, no slope)'],
      ['End, x = 1.000 m', 'free', 'free', 'free'],
    ])
    const constants = cellTexts(doc.querySelector('table.section-constants tbody tr')!)
    // I = πd⁴/64, J = I_p = πd⁴/32 for a solid round section, in mm⁴.
    expectRelative(number(constants[1]), I * 1e12, 5e-4, 'I (mm⁴)')
    expectRelative(number(constants[2]), IP * 1e12, 5e-4, 'J (mm⁴)')
    expectRelative(number(constants[3]), IP * 1e12, 5e-4, 'I_p (mm⁴)')
    expect(doc.querySelector('#model')?.textContent).toContain('Euler–Bernoulli')
    const materials = cellTexts(doc.querySelector('table.materials tbody tr')!)
    // G = E / (2(1 + ν)) = 76.92 GPa.
    expectRelative(number(materials[5]), G / 1e9, 5e-4, 'G (GPa)')
  })

  test('assumptions and cautions say what is still not modelled, and keep the usual cautions', () => {
    const assumptions = doc.querySelector('ul.assumptions')?.textContent ?? ''
    for (const words of ['coupled bending–torsion of unsymmetric sections', 'initial curvature', 'gyroscopic effects and bearing dynamics', 'shear deformation and rotary inertia', 'Timoshenko theory']) {
      expect(assumptions).toContain(words)
    }
    const cautions = doc.querySelector('#cautions')?.textContent ?? ''
    for (const words of ['engineering aid', 'impact (tap) test', 'licensed engineering practice', 'rotor-dynamics analysis']) expect(cautions).toContain(words)
  })
})

describe('sections with two principal planes, a preload and the US units', () => {
  // A 30 × 10 mm steel bar: I = bh³/12 in the weak plane, hb³/12 in the strong one (any strength-of-materials text).
  const project = rod({
    units: 'US',
    motions: ['torsion', 'bending'],
    segments: [{ length: L, material: 'steel', section: { shape: 'rectangle', width: 0.03, height: 0.01 } }],
    ends: { start: { axial: 'fixed', torsion: 'fixed', bending: 'pinned' }, end: { axial: 'free', torsion: 'free', bending: 'pinned' } },
    preload: -500,
    analysis: { elementOrder: 2, elementsPerSegment: 40, mass: 'consistent', modes: 3 },
    excitations: [],
  })
  const analysis = analyseProject(project)
  const doc = parse(modalReportHtml({ analysis, generatedAt: new Date(2026, 11, 1, 14, 5), appVersion: 't' }))

  test('a section per plane, the pinned–pinned bending under compression against ω² = (nπ/L)⁴EI/ρA − (nπ/L)²P/ρA', () => {
    expect([...doc.querySelectorAll('section.family h2')].map((h) => h.textContent)).toEqual(['4 Torsion modes', '5 Bending modes (weak plane)', '6 Bending modes (strong plane)'])
    // Pinned–pinned beam with axial force (Blevins, table 8-1 and the string–beam combination, from memory).
    const area = 0.03 * 0.01
    const planes = { weak: (0.03 * 0.01 ** 3) / 12, strong: (0.01 * 0.03 ** 3) / 12 }
    for (const [plane, inertia] of Object.entries(planes)) {
      const rows = [...doc.querySelectorAll(`section#family-bending-${plane} table.modes tbody tr`)].map(cellTexts)
      expect(rows.length).toBe(3)
      rows.forEach((cells, i) => {
        const k = ((i + 1) * Math.PI) / L
        const omega2 = (k ** 4 * E * inertia) / (RHO * area) - (k * k * 500) / (RHO * area)
        expectRelative(number(cells[3]), Math.sqrt(omega2) / (2 * Math.PI), 5e-5, `${plane} plane f${i + 1} reference printed`)
      })
    }
  })

  test('the preload and the buckling check appear in the model section (rendering check of the ratio)', () => {
    const facts = doc.querySelector('#model')?.textContent ?? ''
    expect(facts).toContain('compression')
    // Euler load of the pinned–pinned bar in its weak plane, π²EI/L² (any strength-of-materials text).
    const euler = (Math.PI ** 2 * E * ((0.03 * 0.01 ** 3) / 12)) / L ** 2
    expect(analysis.buckling).not.toBeNull()
    expectRelative(analysis.buckling!.criticalCompression, euler, 1e-5, 'critical compression')
    expect(facts).toContain(`${(100 * (500 / euler)).toFixed(1)} % of the critical compression`)
    expect(doc.querySelector('ul.assumptions')?.textContent).toContain('Sections with two principal planes are taken as aligned along the part')
  })

  test('US units: effective polar inertia in lbm·in² (NIST SP 811: 1 lb = 0.45359237 kg, 1 in = 0.0254 m)', () => {
    const table = doc.querySelector('section#family-torsion table.modes')!
    expect(headerTexts(table)[5]).toBe('Effective polar inertia (lbm·in²)')
    const torsion = analysis.families.find((f) => f.family.key === 'torsion')!
    const cells = cellTexts(table.querySelector('tbody tr')!)
    expectRelative(number(cells[5]), torsion.modes[0].effectiveMass! / (0.45359237 * 0.0254 ** 2), 5e-4, 'effective polar inertia in lbm·in²')
    // Rendering check: the frequency column shows the analysis' value.
    expect(cells[1]).toBe(formatFrequency(torsion.modes[0].frequencyHz))
  })
})
