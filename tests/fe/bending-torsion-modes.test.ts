/**
 * Bending and torsion by finite elements, against published closed forms and independent
 * computations made in the test. Sources (each beside its check as well):
 * - R. D. Blevins, Formulas for Natural Frequency and Mode Shape, the table of single-span
 *   beams: f = (βL)²/(2πL²)·√(EI/ρA) with cos βL cosh βL = −1 (clamped–free), = 1 (clamped–
 *   clamped, free–free), tan βL = tanh βL (clamped–pinned), sin βL = 0 (pinned–pinned)
 *   (from memory; the roots are found here by bisection on those equations);
 * - S. P. Timoshenko, D. H. Young & W. Weaver, Vibration Problems in Engineering, the beam
 *   with axial force: ω² = (nπ/L)⁴EI/ρA ± (nπ/L)²P/ρA for a pinned–pinned beam (from memory);
 *   and the Timoshenko beam's pinned–pinned frequency equation, derived in the test from its
 *   two equations of motion;
 * - S. S. Rao, Mechanical Vibrations, torsional vibration of shafts: f = (2n − 1)/(4L)·√(G/ρ)
 *   fixed–free, β tan β = J_shaft/J_disk with a tip disk (from memory);
 * - Euler buckling loads π²EI/L², π²EI/(4L²), 4π²EI/L², 2.0457π²EI/L² (clamped–pinned), e.g.
 *   S. P. Timoshenko & J. M. Gere, Theory of Elastic Stability (from memory; the clamped–pinned
 *   factor is the root of tan u = u, u² / π², found here by bisection).
 */
import { describe, expect, test } from 'vitest'
import { CholeskyDecomposition, EigenvalueDecomposition, Matrix, inverse } from 'ml-matrix'
import { AnalysisInputError, analyseFamily, analyseProject, effectiveSettings, modeShape, modeStrain } from '../../core/analysis/modal-analysis'
import { criticalCompression, finiteElementCriticalCompression } from '../../core/analysis/buckling'
import { assembleFamily } from '../../core/fe/assemble'
import { lowestModes } from '../../core/linalg/lowest-modes'
import { sturmCounts } from '../../core/linalg/shifted-ldlt'
import { bandToDense } from '../../core/linalg/symmetric-band-matrix'
import { familyOf } from '../../core/model/families'
import { readProjectDocument } from '../../core/model/project-schema'
import type { Project } from '../../core/model/project'
import { expectRelative } from '../helpers'

const E = 2e11
const RHO = 7850
const NU = 0.3
const G = E / (2 * (1 + NU))
const STEEL = { id: 'steel', youngsModulus: E, density: RHO, poissonRatio: NU }

function project(doc: Record<string, unknown>): Project {
  const read = readProjectDocument({ format: 'rodwave', version: 2, materials: [STEEL], ...doc })
  if (!read.ok) throw new Error(read.issues.map((i) => `${i.path}: ${i.message}`).join('\n'))
  return read.project
}

/** A uniform solid round beam of length L and diameter d with the given bending ends. */
function beam(start: string, end: string, options: { L?: number; d?: number; n?: number; modes?: number; mass?: string; preload?: number; theory?: string } = {}): Project {
  return project({
    motions: ['bending'],
    segments: [{ length: options.L ?? 1, material: 'steel', section: { shape: 'solid', diameter: options.d ?? 0.02 } }],
    ends: { start: { bending: start }, end: { bending: end } },
    ...(options.preload !== undefined ? { preload: options.preload } : {}),
    analysis: { elementsPerSegment: options.n ?? 200, modes: options.modes ?? 5, mass: options.mass ?? 'consistent', ...(options.theory ? { bendingTheory: options.theory } : {}) },
  })
}

function bendingFrequencies(p: Project): number[] {
  return analyseFamily(p, familyOf('bending'), effectiveSettings(p), { withReference: false }).modes.map((m) => m.frequencyHz)
}

/** Roots of f on (a, b) bracketed on a fine grid and refined by bisection to full precision. */
function roots(f: (x: number) => number, a: number, b: number, count: number): number[] {
  const out: number[] = []
  const steps = 20000
  let x0 = a
  let f0 = f(x0)
  for (let i = 1; i <= steps && out.length < count; i++) {
    const x1 = a + ((b - a) * i) / steps
    const f1 = f(x1)
    if (Number.isFinite(f0) && Number.isFinite(f1) && f0 * f1 < 0 && Math.abs(f0) + Math.abs(f1) < 1e6) {
      let lo = x0
      let hi = x1
      for (let k = 0; k < 200; k++) {
        const mid = 0.5 * (lo + hi)
        if (f(lo) * f(mid) <= 0) hi = mid
        else lo = mid
      }
      out.push(0.5 * (lo + hi))
    }
    x0 = x1
    f0 = f1
  }
  return out
}

const d = 0.02
const A = (Math.PI / 4) * d * d
const I = (Math.PI / 64) * d ** 4
const toHz = (betaL: number, L = 1) => ((betaL * betaL) / (2 * Math.PI * L * L)) * Math.sqrt((E * I) / (RHO * A))

// Blevins' frequency equations, scaled to stay finite (divided by cosh).
const EQUATIONS: Record<string, (x: number) => number> = {
  'clamped-free': (x) => Math.cos(x) + 1 / Math.cosh(x),
  'clamped-clamped': (x) => Math.cos(x) - 1 / Math.cosh(x),
  // tan βL = tanh βL, multiplied through by cos βL to stay finite.
  'clamped-pinned': (x) => Math.sin(x) - Math.cos(x) * Math.tanh(x),
  'pinned-pinned': (x) => Math.sin(x),
}

describe('Euler–Bernoulli beams against the βL roots of their frequency equations (Blevins, from memory)', () => {
  for (const [ends, equation] of Object.entries(EQUATIONS)) {
    test(`${ends}: 5 modes within 1e-8 at 400 Hermite elements, to 1e-10 extrapolated from 200 and 400`, () => {
      const [start, end] = ends.split('-')
      const betas = roots(equation, 0.5, 20, 5)
      expect(betas).toHaveLength(5)
      const coarse = bendingFrequencies(beam(start, end, { n: 200 }))
      const f = bendingFrequencies(beam(start, end, { n: 400 }))
      betas.forEach((b, i) => {
        expectRelative(f[i], toHz(b), 1e-8, `${ends} mode ${i + 1}`)
        // Hermite cubics converge as h⁴: Richardson's estimate removes that term.
        expectRelative(f[i] + (f[i] - coarse[i]) / 15, toHz(b), 1e-10, `${ends} mode ${i + 1} extrapolated`)
      })
    })
  }
  test('free–free: two rigid-body modes at 0, then the clamped–clamped roots (cos βL cosh βL = 1)', () => {
    const freeFree = beam('free', 'free', { modes: 6, n: 400 })
    const analysis = analyseFamily(freeFree, familyOf('bending'), effectiveSettings(freeFree), { withReference: false })
    expect(analysis.modes.slice(0, 2).map((m) => [m.rigidBody, m.frequencyHz])).toEqual([
      [true, 0],
      [true, 0],
    ])
    const betas = roots(EQUATIONS['clamped-clamped'], 0.5, 20, 4)
    betas.forEach((b, i) => expectRelative(analysis.modes[i + 2].frequencyHz, toHz(b), 2e-9, `free–free elastic mode ${i + 1}`))
  })
  test('pinned–free has one rigid-body mode (rotation about the pin); guided–free one (sliding)', () => {
    for (const [start, end] of [
      ['pinned', 'free'],
      ['guided', 'free'],
    ]) {
      const p = beam(start, end)
      const modes = analyseFamily(p, familyOf('bending'), effectiveSettings(p), { withReference: false }).modes
      expect(modes.filter((m) => m.rigidBody)).toHaveLength(1)
    }
  })
  test('Hermite elements converge as h⁴ (error ratio 16 per halving) from above with consistent mass', () => {
    const exact = toHz(roots(EQUATIONS['clamped-free'], 0.5, 20, 2)[1])
    const error = (n: number) => bendingFrequencies(beam('clamped', 'free', { n }))[1] / exact - 1
    const e1 = error(8)
    const e2 = error(16)
    expect(e1).toBeGreaterThan(0)
    expect(e2).toBeGreaterThan(0)
    const order = Math.log2(e1 / e2)
    expect(order, `observed order ${order}`).toBeGreaterThan(3.8)
    expect(order, `observed order ${order}`).toBeLessThan(4.2)
  })
  test('lumped (HRZ) mass gives lower frequencies than consistent mass on the same mesh', () => {
    const consistent = bendingFrequencies(beam('clamped', 'free', { n: 10 }))
    const lumped = bendingFrequencies(beam('clamped', 'free', { n: 10, mass: 'lumped' }))
    lumped.forEach((f, i) => expect(f, `mode ${i + 1}`).toBeLessThan(consistent[i]))
  })
  test('a rectangle bends in two planes: frequencies in the ratio of its sides (I ∝ b h³)', () => {
    const p = project({
      motions: ['bending'],
      segments: [{ length: 1, material: 'steel', section: { shape: 'rectangle', width: 0.04, height: 0.01 } }],
      ends: { start: { bending: 'clamped' }, end: { bending: 'free' } },
      analysis: { elementsPerSegment: 100, modes: 3 },
    })
    const a = analyseProject(p, {}, { withReference: false })
    expect(a.families.map((f) => f.family.key)).toEqual(['bending-weak', 'bending-strong'])
    const [weak, strong] = a.families
    weak.modes.forEach((m, i) => expectRelative(strong.modes[i].frequencyHz / m.frequencyHz, 0.04 / 0.01, 1e-12, `mode ${i + 1} ratio`))
  })
})

describe('a cantilever with a tip mass and its rotary inertia', () => {
  // w = A(cosh βx − cos βx) + B(sinh βx − sin βx) is clamped at 0; at the tip the moment balances the
  // mass's rotary inertia, EI w″ = Jω²w′, and the shear its inertia, EI w‴ = −Mω²w, with ω² = β⁴EI/ρA:
  // the 2 × 2 determinant of those two conditions vanishes at the natural frequencies (derived here;
  // with J = 0 it must agree with the published 1 + cos λ cosh λ + λ(M/m)(cos λ sinh λ − sin λ cosh λ) = 0,
  // Blevins, from memory, which the test checks first).
  const L = 1
  const m = RHO * A * L
  const M = 0.4 * m
  const J = 0.02 * m * L * L
  const determinant = (lambda: number, tipInertia: number) => {
    const b = lambda / L
    const C = Math.cosh(lambda), c = Math.cos(lambda), S = Math.sinh(lambda), s = Math.sin(lambda) // prettier-ignore
    const k = (b ** 4) / (RHO * A)
    const row1 = [b * b * (C + c) - tipInertia * k * b * (S + s), b * b * (S + s) - tipInertia * k * b * (C - c)]
    const row2 = [b ** 3 * (S - s) + M * k * (C - c), b ** 3 * (C + c) + M * k * (S - s)]
    return (row1[0] * row2[1] - row1[1] * row2[0]) / (C * C)
  }
  test('the determinant without rotary inertia has the published tip-mass roots', () => {
    const published = roots((x) => (1 + Math.cos(x) * Math.cosh(x) + x * (M / m) * (Math.cos(x) * Math.sinh(x) - Math.sin(x) * Math.cosh(x))) / Math.cosh(x), 0.3, 12, 3)
    const derived = roots((x) => determinant(x, 0), 0.3, 12, 3)
    derived.forEach((x, i) => expectRelative(x, published[i], 1e-12, `root ${i + 1}`))
  })
  test('finite elements with the mass and its transverse inertia meet the roots to 1e-9', () => {
    const lambdas = roots((x) => determinant(x, J), 0.3, 14, 4)
    const p = project({
      motions: ['bending'],
      segments: [{ length: L, material: 'steel', section: { shape: 'solid', diameter: d } }],
      ends: { start: { bending: 'clamped' }, end: { bending: 'free' } },
      masses: [{ at: L, mass: M, transverseInertia: J }],
      analysis: { elementsPerSegment: 400, modes: 4 },
    })
    const f = bendingFrequencies(p)
    lambdas.forEach((x, i) => expectRelative(f[i], toHz(x, L), 1e-8, `mode ${i + 1}`))
  })
})

describe('beam under a steady axial force (Timoshenko, Young & Weaver, from memory)', () => {
  const L = 1.2
  const exact = (n: number, P: number) => Math.sqrt((((n * Math.PI) / L) ** 4 * E * I + ((n * Math.PI) / L) ** 2 * P) / (RHO * A)) / (2 * Math.PI)
  for (const P of [5000, -5000]) {
    test(`pinned–pinned, P = ${P} N: ω² = (nπ/L)⁴EI/ρA ${P > 0 ? '+' : '−'} (nπ/L)²|P|/ρA to 2e-9`, () => {
      const f = bendingFrequencies(beam('pinned', 'pinned', { L, preload: P, n: 400 }))
      f.forEach((value, i) => expectRelative(value, exact(i + 1, P), 2e-9, `mode ${i + 1}`))
    })
  }
  test('the taut-string limit: a thin wire under tension rings at n/(2L)·√(P/ρA)', () => {
    const wire = 0.0005
    const area = (Math.PI / 4) * wire * wire
    const P = 200
    const EI = E * (Math.PI / 64) * wire ** 4
    const f = bendingFrequencies(beam('pinned', 'pinned', { L: 2, d: wire, preload: P, n: 100, modes: 3 }))
    f.forEach((value, i) => {
      // The bending stiffness adds (nπ/L)²EI/P to ω²/ω²_string, so half of it to f (2·10⁻⁵ at most here):
      // the frequency must exceed the string's by that much, to within 1 % of it.
      const bending = (((i + 1) * Math.PI) / 2) ** 2 * (EI / P)
      const string = ((i + 1) / 4) * Math.sqrt(P / (RHO * area))
      expect(bending).toBeLessThan(1e-4)
      expectRelative(value / string - 1, bending / 2, 0.01, `string mode ${i + 1}: excess over the string`)
    })
  })
})

describe('buckling (Euler loads, Timoshenko & Gere, from memory)', () => {
  const L = 1.5
  const euler = (Math.PI * Math.PI * E * I) / (L * L)
  const u = roots((x) => Math.tan(x) - x, 3.2, 4.6, 1)[0]
  const cases: [string, string, number][] = [
    ['pinned', 'pinned', 1],
    ['clamped', 'free', 0.25],
    ['clamped', 'clamped', 4],
    ['clamped', 'pinned', (u * u) / (Math.PI * Math.PI)],
  ]
  for (const [start, end, factor] of cases) {
    test(`${start}–${end}: critical compression ${factor.toFixed(4)}·π²EI/L², exact to 1e-12 and by finite elements to 1e-8`, () => {
      const p = beam(start, end, { L, n: 20 })
      expectRelative(criticalCompression(p, effectiveSettings(p)).load, factor * euler, 1e-12, 'critical load (exact route)')
      expectRelative(finiteElementCriticalCompression(p, effectiveSettings(p)).load, factor * euler, 1e-8, 'critical load (finite elements)')
    })
  }
  test('at 90 % of the buckling load a warning names it; at or beyond it the analysis refuses, naming the preload', () => {
    const near = analyseProject(beam('pinned', 'pinned', { L, preload: -0.9 * euler }), {}, { withReference: false })
    expect(near.warnings.map((w) => w.code)).toContain('buckling-proximity')
    expect(near.buckling?.ratio).toBeCloseTo(0.9, 8)
    expect(() => analyseProject(beam('pinned', 'pinned', { L, preload: -1.01 * euler }))).toThrow(AnalysisInputError)
    try {
      analyseProject(beam('pinned', 'pinned', { L, preload: -1.01 * euler }))
    } catch (error) {
      expect((error as AnalysisInputError).path).toBe('preload')
    }
    // A free rotation cannot carry any compression.
    expect(() => analyseProject(beam('pinned', 'free', { L, preload: -1 }))).toThrow(/buckl/)
  })
})

describe('Timoshenko beams: pinned–pinned against the frequency equation of its two equations of motion', () => {
  // κGA(w″ − ψ′) + ρAω²w = 0, EIψ″ + κGA(w′ − ψ) + ρIω²ψ = 0 with w = W sin kx, ψ = Ψ cos kx, k = nπ/L:
  // (ρAω² − κGAk²)(ρIω² − EIk² − κGA) − (κGAk)² = 0; the lower root is the flexural mode
  // (Timoshenko, Young & Weaver, from memory; derived here).
  const D = 0.05
  const L = 0.5
  const kappa = (6 * (1 + NU)) / (7 + 6 * NU) // Cowper's solid circle
  const exactFor = (n: number, length: number, diameter: number) => {
    const k = (n * Math.PI) / length
    const sectionArea = (Math.PI / 4) * diameter * diameter
    const sectionInertia = (Math.PI / 64) * diameter ** 4
    const kGA = kappa * G * sectionArea
    const a = RHO * sectionArea * RHO * sectionInertia
    const b = -(RHO * sectionArea * (E * sectionInertia * k * k + kGA) + RHO * sectionInertia * kGA * k * k)
    const c = kGA * k * k * (E * sectionInertia * k * k + kGA) - kGA * kGA * k * k
    // The lower root of aω⁴ + bω² + c as 2c/(−b + √(b² − 4ac)): the usual form cancels digits when
    // the shear mode lies far above the flexural one (a slender beam).
    return Math.sqrt((2 * c) / (-b + Math.sqrt(b * b - 4 * a * c))) / (2 * Math.PI)
  }
  const exact = (n: number) => exactFor(n, L, D)
  const at = (n: number) => bendingFrequencies(beam('pinned', 'pinned', { L, d: D, n, theory: 'timoshenko', modes: 4 }))
  test('converges as h² with consistent mass, and its Richardson estimate meets the equation to 1e-7', () => {
    const coarse = at(128)
    const fine = at(256)
    for (let i = 0; i < 4; i++) {
      const e1 = coarse[i] / exact(i + 1) - 1
      const e2 = fine[i] / exact(i + 1) - 1
      const order = Math.log2(e1 / e2)
      expect(order, `mode ${i + 1} order ${order}`).toBeGreaterThan(1.9)
      expect(order).toBeLessThan(2.1)
      expectRelative(fine[i] + (fine[i] - coarse[i]) / 3, exact(i + 1), 1e-7, `mode ${i + 1} extrapolated`)
    }
  })
  test('the bending strain of a mode is the rotation’s slope ψ′, not w″: peak ψ′/peak w = k² − ρω²/(κG) from the first equation', () => {
    // From κGA(w″ − ψ′) + ρAω²w = 0 with w = W sin kx, ψ = Ψ cos kx: Ψk = W(k² − ρω²/κG).
    const p = beam('pinned', 'pinned', { L, d: D, n: 400, theory: 'timoshenko', modes: 2 })
    const family = analyseFamily(p, familyOf('bending'), effectiveSettings(p), { withReference: false })
    for (const n of [1, 2]) {
      const k = (n * Math.PI) / L
      const omega = 2 * Math.PI * exact(n)
      const expected = k * k - (RHO * omega * omega) / (kappa * G)
      const strain = modeStrain(family, n - 1).strain
      const deflection = modeShape(family, n - 1).displacement
      const peak = (v: ArrayLike<number>) => Array.from(v).reduce((m, x) => Math.max(m, Math.abs(x)), 0)
      expectRelative(peak(strain) / peak(deflection), expected, 2e-4, `mode ${n}`)
      // Euler–Bernoulli's k² would be off by ρω²/(κGk²): several per cent for this stubby beam.
      expect(Math.abs(k * k / expected - 1)).toBeGreaterThan(0.01)
    }
  })
  test.each([6000, 20000])('a slender beam (1.3 m, d = 20 mm) on %i elements meets the equation to 1e-8', (elements) => {
    // The solver's coarse levels interpolate the deflection with Hermite cubics, so their rotation
    // is its slope and they carry no shear: however fine, they stay above this mesh's values by the
    // shear's share (2e-4 here) and must never be taken for them, as they once were on such meshes.
    const frequencies = bendingFrequencies(beam('pinned', 'pinned', { L: 1.3, d: 0.02, n: elements, theory: 'timoshenko', modes: 6 }))
    frequencies.forEach((f, i) => expectRelative(f, exactFor(i + 1, 1.3, 0.02), 1e-8, `mode ${i + 1}`))
  })
  test('shear and rotary inertia lower a stubby beam’s frequencies below Euler–Bernoulli', () => {
    const eb = bendingFrequencies(beam('pinned', 'pinned', { L, d: D, modes: 4 }))
    at(64).forEach((f, i) => expect(f).toBeLessThan(eb[i]))
  })
})

describe('torsion through the bar elements (Rao, from memory)', () => {
  const c = Math.sqrt(G / RHO)
  const shaft = (extra: Record<string, unknown> = {}, order = 2) =>
    project({
      motions: ['torsion'],
      segments: [{ length: 1, material: 'steel', section: { shape: 'solid', diameter: 0.03 } }],
      ends: { start: { torsion: 'fixed' }, end: { torsion: 'free' } },
      analysis: { elementOrder: order, elementsPerSegment: 200, modes: 4 },
      ...extra,
    })
  const torsionHz = (p: Project) => analyseFamily(p, familyOf('torsion'), effectiveSettings(p), { withReference: false }).modes.map((m) => m.frequencyHz)
  test('fixed–free shaft: f = (2n − 1)/(4L)·√(G/ρ) within 1e-8, to 1e-10 extrapolated (3-node elements, h⁴)', () => {
    const coarse = torsionHz(shaft({ analysis: { elementOrder: 2, elementsPerSegment: 100, modes: 4 } }))
    torsionHz(shaft()).forEach((f, i) => {
      expectRelative(f, ((2 * i + 1) / 4) * c, 1e-8, `mode ${i + 1}`)
      expectRelative(f + (f - coarse[i]) / 15, ((2 * i + 1) / 4) * c, 1e-10, `mode ${i + 1} extrapolated`)
    })
  })
  test('a tip disk: β tan β = J_shaft/J_disk, f = β c / (2πL)', () => {
    const Ip = (Math.PI / 32) * 0.03 ** 4
    const jShaft = RHO * Ip * 1
    const jDisk = 2 * jShaft
    const betas = roots((b) => b * Math.sin(b) - (jShaft / jDisk) * Math.cos(b), 1e-6, 12, 3)
    const f = torsionHz(shaft({ masses: [{ at: 1, mass: 1, polarInertia: jDisk }] }))
    betas.forEach((b, i) => expectRelative(f[i], (b * c) / (2 * Math.PI), 1e-9, `mode ${i + 1}`))
  })
  test('a rectangle twists with c = √(GJ/(ρIp)), J by Saint-Venant’s series, Ip = bh(b² + h²)/12', () => {
    const b = 0.04
    const h = 0.02
    // k₁(b/h = 2) = 0.2287 (Timoshenko & Goodier's table gives 0.229, from memory): checked by the series test.
    // The series falls as n⁻⁵: 10⁶ terms leave less than 1e-24.
    let sum = 0
    for (let n = 1; n < 2_000_000; n += 2) sum += Math.tanh((n * Math.PI * b) / (2 * h)) / n ** 5
    const J = ((1 - ((192 / Math.PI ** 5) * (h / b)) * sum) / 3) * b * h ** 3
    const Ip = (b * h * (b * b + h * h)) / 12
    const p = shaft({ segments: [{ length: 1, material: 'steel', section: { shape: 'rectangle', width: b, height: h } }] })
    torsionHz(p).forEach((f, i) => expectRelative(f, ((2 * i + 1) / 4) * Math.sqrt((G * J) / (RHO * Ip)), 1e-8, `mode ${i + 1}`))
  })
  test('effective polar inertia of a fixed–free shaft: 8/((2n − 1)²π²) of the shaft’s, as in axial motion', () => {
    const modes = analyseProject(shaft(), {}, { withReference: false }).modes
    modes.forEach((m, i) => expectRelative(m.effectiveMassFraction!, 8 / ((2 * i + 1) ** 2 * Math.PI ** 2), 1e-6, `mode ${i + 1}`))
  })
})

describe('bending effective mass (sideways support motion)', () => {
  test('clamped–free: mode n carries (∫φₙ)²/(L∫φₙ²) of the mass, from the closed-form shapes; the sum stays below 1', () => {
    const betas = roots(EQUATIONS['clamped-free'], 0.5, 12, 3)
    const modes = analyseProject(beam('clamped', 'free', { modes: 30 }), {}, { withReference: false }).modes
    betas.forEach((b, n) => {
      const sigma = (Math.cosh(b) + Math.cos(b)) / (Math.sinh(b) + Math.sin(b))
      const phi = (x: number) => Math.cosh(b * x) - Math.cos(b * x) - sigma * (Math.sinh(b * x) - Math.sin(b * x))
      let s1 = 0
      let s2 = 0
      const N = 20000
      for (let i = 0; i < N; i++) {
        const x = (i + 0.5) / N
        s1 += phi(x) / N
        s2 += (phi(x) * phi(x)) / N
      }
      expectRelative(modes[n].effectiveMassFraction!, (s1 * s1) / s2, 1e-6, `effective mass fraction of mode ${n + 1}`)
    })
    expect(modes.at(-1)!.cumulativeEffectiveMassFraction!).toBeGreaterThan(0.98)
    expect(modes.at(-1)!.cumulativeEffectiveMassFraction!).toBeLessThanOrEqual(1 + 1e-9)
  })
})

describe('the banded solver on the wider band (two unknowns per node)', () => {
  // A stepped beam with a mass (and its rotary inertia), a side spring and a rotational spring.
  const stepped = (n: number) =>
    project({
      motions: ['bending'],
      segments: [
        { length: 0.6, material: 'steel', section: { shape: 'solid', diameter: 0.03 } },
        { length: 0.4, material: 'steel', section: { shape: 'tube', outerDiameter: 0.04, innerDiameter: 0.02 } },
      ],
      ends: { start: { bending: 'clamped' }, end: { bending: 'free' } },
      masses: [{ at: 1, mass: 2, transverseInertia: 0.003 }],
      springs: [{ at: 0.6, motion: 'bending', stiffness: 5e5, rotationalStiffness: 2e3 }],
      analysis: { elementsPerSegment: n, modes: 8 },
    })
  // Small: a dense solver works on the assembled K, whose lowest eigenvalue loses digits as κ ∝ h⁻⁴
  // grows (at 10 elements per segment ml-matrix's λ₁ already differs by 1e-8 between two routes).
  test('agrees with a dense generalized solve (ml-matrix, Cholesky reduction) of the same pencil to 1e-10, and the Sturm counts match it', () => {
    const p = stepped(3)
    const model = assembleFamily(p, familyOf('bending'), { order: 1, elementsPerSegment: 3, mass: 'consistent' })
    const solved = lowestModes(model.pencil, { modes: 8, layout: model.layout! })
    const K = new Matrix(bandToDense(model.pencil.stiffness))
    const M = new Matrix(bandToDense(model.pencil.mass))
    // Symmetric reduction: M = LLᵀ, then the ordinary eigenproblem of L⁻¹KL⁻ᵀ.
    const Linv = inverse(new CholeskyDecomposition(M).lowerTriangularMatrix)
    const reduced = Linv.mmul(K).mmul(Linv.transpose())
    const symmetric = reduced.add(reduced.transpose()).mul(0.5)
    const dense = new EigenvalueDecomposition(symmetric, { assumeSymmetric: true }).realEigenvalues.sort((a, b) => a - b)
    for (let i = 0; i < 8; i++) expectRelative(solved.eigenvalues[i], dense[i], 1e-10, `λ${i + 1}`)
    const shifts = dense.slice(0, 9).map((v, i) => (i === 0 ? v / 2 : 0.5 * (dense[i - 1] + v)))
    expect(sturmCounts(model.pencil, shifts)).toEqual(shifts.map((_, i) => i))
    expect(solved.sturm.passed).toBe(true)
  })
  test('M-orthonormal modes with small residuals on a fine mesh (2,000 elements)', () => {
    const p = stepped(1000)
    const f = analyseFamily(p, familyOf('bending'), effectiveSettings(p), { withReference: false })
    expect(f.sturm.passed).toBe(true)
    expect(f.converged).toBe(true)
    const shape = modeShape(f, 0)
    expect(shape.rotation).not.toBeNull()
  })
  // Past a few thousand elements the assembled K's round-off (κ ∝ h⁻⁴) would swamp λ₁; the solver
  // takes its quotients from the strain forms and keeps modes that no longer change with the mesh.
  // At these meshes the Hermite discretisation error of the first five modes is below 1e-13
  // (O((βh)⁴)), so the finite-element values must meet the continuum's βL roots.
  test.each([
    ['clamped', 'free', [1.875104068711961, 4.694091132974175, 7.854757438237613, 10.99554073487547, 14.13716839104647]],
    ['clamped', 'clamped', [4.730040744862704, 7.853204624095838, 10.99560783800167, 14.13716549125746, 17.27875965739948]],
  ] as const)('a %s–%s beam of 20,000 elements keeps its first five frequencies within 1e-11 of the βL roots (Blevins, table 8-1, from memory)', (start, end, betaL) => {
    const d = 0.02
    const p = beam(start, end, { n: 20000, d })
    const model = assembleFamily(p, familyOf('bending'), { order: 1, elementsPerSegment: 20000, mass: 'consistent' })
    const solved = lowestModes(model.pencil, { modes: 5, layout: model.layout! })
    const area = (Math.PI * d * d) / 4
    const second = (Math.PI * d ** 4) / 64
    betaL.forEach((b, i) => expectRelative(Math.sqrt(solved.eigenvalues[i]), b * b * Math.sqrt((E * second) / (RHO * area)), 1e-11, `ω${i + 1}`))
    expect(solved.sturm.passed).toBe(true)
    expect(solved.converged).toBe(true)
  })
  test('a clamped–free beam of 100,000 elements keeps f₁ within 1e-12 of 1.875104²/(2π)·√(EI/ρA)/L² (Blevins, table 8-1, from memory)', () => {
    const d = 0.02
    const p = beam('clamped', 'free', { n: 100000, d, modes: 3 })
    const model = assembleFamily(p, familyOf('bending'), { order: 1, elementsPerSegment: 100000, mass: 'consistent' })
    const solved = lowestModes(model.pencil, { modes: 3, layout: model.layout! })
    const exact = 1.875104068711961 ** 2 * Math.sqrt((E * ((Math.PI * d ** 4) / 64)) / (RHO * ((Math.PI * d * d) / 4)))
    expectRelative(Math.sqrt(solved.eigenvalues[0]), exact, 1e-12, 'ω₁')
    expect(solved.sturm.passed).toBe(true)
    expect(solved.sturm.countedUnknowns).toBeLessThan(model.pencil.stiffness.order)
  })
  test('a mode skipped on purpose is caught by the Sturm check', () => {
    const p = stepped(50)
    const model = assembleFamily(p, familyOf('bending'), { order: 1, elementsPerSegment: 50, mass: 'consistent' })
    const solved = lowestModes(model.pencil, { modes: 4, layout: model.layout! })
    const values = Array.from(solved.eigenvalues)
    const shifts = [0.5 * (values[0] + values[2]), 1.5 * values[3]]
    // Claiming modes 1, 3, 4 (mode 2 missing): the count between "1" and "3" is 2, not 1.
    expect(sturmCounts(model.pencil, shifts)).toEqual([2, 4])
  })
})
