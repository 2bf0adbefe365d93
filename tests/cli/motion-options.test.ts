/**
 * The command line's version 2 options (README, "Command line"): --motions, --bending-theory and
 * --motion, end to end through runCli, with the values checked against closed forms computed
 * here (each with its source beside it) and the usage errors that name the option.
 *
 * Closed forms used:
 * - fixed–free bar and shaft: f_n = (2n − 1)/(4L)·c, c = √(E/ρ) axially and √(G/ρ) in torsion,
 *   G = E/(2(1 + ν)) (S. S. Rao, Mechanical Vibrations, longitudinal and torsional vibration of
 *   bars and shafts; from memory);
 * - clamped–free Euler–Bernoulli beam: f_n = (β_nL)²/(2πL²)·√(EI/(ρA)), β₁L = 1.875104,
 *   β₂L = 4.694091, β₃L = 7.854757 (R. D. Blevins, Formulas for Natural Frequency and Mode Shape,
 *   table 8-1), roots of cos βL cosh βL = −1 (checked below);
 * - pinned–pinned beam: Euler–Bernoulli f_n = (nπ/L)²√(EI/(ρA))/(2π); Timoshenko, with w = W sin kx,
 *   ψ = Ψ cos kx, k = nπ/L, in EIψ″ + κGA(w′ − ψ) = ρIψ̈ and κGA(w″ − ψ′) = ρAẅ, the determinant
 *   (ρAω² − κGAk²)(ρIω² − EIk² − κGA) − (κGAk)² = 0, whose smaller root is the bending frequency
 *   (S. P. Timoshenko, Phil. Mag. 41 (1921); the simply supported case, e.g. S. M. Han, H. Benaroya
 *   & T. Wei, J. Sound Vib. 225 (1999); from memory), with Cowper's shear coefficient of a solid
 *   circle κ = 6(1 + ν)/(7 + 6ν) (G. R. Cowper, J. Appl. Mech. 33 (1966); from memory);
 * - Euler buckling load of a clamped–free column π²EI/(4L²) (S. P. Timoshenko & J. M. Gere,
 *   Theory of Elastic Stability, ch. 2; from memory).
 */
import { describe, expect, test } from 'vitest'
import { EXIT } from '../../bin/cli-common'
import { expectRelative } from '../helpers'
import { run } from './cli-harness'

const E = 2e11
const RHO = 7850
const NU = 0.3
const G = E / (2 * (1 + NU))
const L = 1.2
const D = 0.03
const A = (Math.PI / 4) * D * D
const I = (Math.PI / 64) * D ** 4
const J = (Math.PI / 32) * D ** 4

const CLAMPED_FREE_BETA_L = [1.875104, 4.694091, 7.854757]

const axialHz = (n: number, length = L) => ((2 * n - 1) / (4 * length)) * Math.sqrt(E / RHO)
const torsionHz = (n: number, length = L) => ((2 * n - 1) / (4 * length)) * Math.sqrt(G / RHO)
const cantileverHz = (n: number, diameter = D) => {
  const area = (Math.PI / 4) * diameter ** 2
  const inertia = (Math.PI / 64) * diameter ** 4
  return (CLAMPED_FREE_BETA_L[n - 1] ** 2 / (2 * Math.PI * L * L)) * Math.sqrt((E * inertia) / (RHO * area))
}

/** A uniform round rod, fixed (clamped) at the start and free at the end in every family; the file analyses axial motion only. */
function rodText(extra: Record<string, unknown> = {}): string {
  return JSON.stringify({
    format: 'rodwave',
    version: 2,
    motions: ['axial'],
    materials: [{ id: 'steel', youngsModulus: E, density: RHO, poissonRatio: NU }],
    segments: [{ length: L, material: 'steel', section: { shape: 'solid', diameter: D } }],
    ends: { start: { axial: 'fixed', torsion: 'fixed', bending: 'clamped' }, end: { axial: 'free', torsion: 'free', bending: 'free' } },
    analysis: { elementsPerSegment: 80, modes: 3 },
    ...extra,
  })
}

const solveJson = async (args: string[], files: Record<string, string>) => {
  const r = await run(args, files)
  expect(r.code, r.stderr).toBe(EXIT.done)
  return JSON.parse(r.stdout)
}

test('the βL roots of the clamped–free beam satisfy cos βL cosh βL = −1 to their seven digits', () => {
  for (const b of CLAMPED_FREE_BETA_L) expect(Math.abs(Math.cos(b) * Math.cosh(b) + 1)).toBeLessThan(1e-6 * Math.cosh(b))
})

describe('--motions', () => {
  test('overrides the file: torsion and bending modes, each family numbered from 1 and checked against its closed form', async () => {
    const doc = await solveJson(['solve', 'rod.json', '--motions', 'torsion,bending'], { 'rod.json': rodText() })
    expect(doc.motions).toEqual(['torsion', 'bending'])
    expect(doc.modes.map((m: { motion: string; mode: number }) => `${m.motion} ${m.mode}`)).toEqual(['torsion 1', 'torsion 2', 'torsion 3', 'bending 1', 'bending 2', 'bending 3'])
    for (const m of doc.modes) {
      expect(m.plane).toBeNull()
      const closed = m.motion === 'torsion' ? torsionHz(m.mode) : cantileverHz(m.mode)
      // The exact reference to the closed form (βL has seven digits: f to about 1e-6); the finite elements to 1e-3.
      expectRelative(m.referenceHz, closed, m.motion === 'torsion' ? 1e-10 : 3e-6, `${m.motion} ${m.mode} reference`)
      expectRelative(m.frequencyHz, closed, 1e-3, `${m.motion} ${m.mode} finite elements`)
    }
    expect(Object.keys(doc.reference.families)).toEqual(['torsion', 'bending'])
    expect(doc.reference.methods).toEqual({ torsion: 'exact', bending: 'exact' })
    // No axial family: reference.frequenciesHz is the first family's.
    expect(doc.reference.frequenciesHz).toEqual(doc.reference.families.torsion)
  })

  test('the order given does not matter, and every family can be asked for', async () => {
    const doc = await solveJson(['solve', 'rod.json', '--motions', 'bending, axial,torsion'], { 'rod.json': rodText() })
    expect(doc.motions).toEqual(['axial', 'torsion', 'bending'])
    const axial = doc.modes.filter((m: { motion: string }) => m.motion === 'axial')
    axial.forEach((m: { mode: number; referenceHz: number }) => expectRelative(m.referenceHz, axialHz(m.mode), 1e-10, `axial ${m.mode}`))
    expect(doc.reference.frequenciesHz).toEqual(doc.reference.families.axial)
  })

  test.each([['axial,twist', '"twist"'], ['', '""'], ['axial,,bending', '""'], ['Torsion', '"Torsion"']])('--motions %j exits 2 and names the option and the bad name', async (value, named) => {
    const r = await run(['solve', 'rod.json', `--motions=${value}`], { 'rod.json': rodText() })
    expect(r.code).toBe(EXIT.usage)
    expect(r.stderr).toContain('--motions takes axial, torsion and bending')
    expect(r.stderr).toContain(named)
    expect(r.stdout).toBe('')
  })

  test('a family the file cannot feed is reported as invalid input (exit 1), by JSON path', async () => {
    // Torsion needs a shear modulus: no Poisson's ratio and no shear modulus in the material.
    const text = rodText({ materials: [{ id: 'steel', youngsModulus: E, density: RHO }] })
    const r = await run(['solve', 'rod.json', '--motions', 'torsion'], { 'rod.json': text })
    expect(r.code).toBe(EXIT.invalidInput)
    expect(r.stderr).toContain('with --motions torsion, rod.json is not a valid Rodwave project')
    expect(r.stderr).toMatch(/materials\[0\]/)
  })

  test('--csv: the motion column after mode names each row\'s family', async () => {
    const r = await run(['solve', 'rod.json', '--motions', 'axial,torsion', '--csv'], { 'rod.json': rodText() })
    expect(r.code).toBe(EXIT.done)
    const rows = r.stdout.trim().split('\r\n').map((line) => line.split(','))
    expect(rows[0].slice(0, 3)).toEqual(['mode', 'motion', 'frequency_hz'])
    expect(rows.slice(1).map((row) => `${row[1]} ${row[0]}`)).toEqual(['axial 1', 'axial 2', 'axial 3', 'torsion 1', 'torsion 2', 'torsion 3'])
    rows.slice(1, 4).forEach((row, i) => expectRelative(Number(row[2]), axialHz(i + 1), 1e-3, `axial ${i + 1} in the CSV`))
    rows.slice(4).forEach((row, i) => expectRelative(Number(row[2]), torsionHz(i + 1), 1e-3, `torsion ${i + 1} in the CSV`))
  })

  test('solve refuses --motion, pointing to --motions', async () => {
    const r = await run(['solve', 'rod.json', '--motion', 'torsion'], { 'rod.json': rodText() })
    expect(r.code).toBe(EXIT.usage)
    expect(r.stderr).toContain('choose them with --motions')
  })
})

describe('excitations drive only the families they name', () => {
  const f1 = torsionHz(1)
  const text = rodText({
    excitations: [
      { label: 'Gear mesh', hz: 1.03 * f1, excites: ['torsion'] },
      { label: 'Line', hz: 100 },
    ],
  })

  test('a torsion-only excitation is paired only with torsion modes; an unnamed one with every family', async () => {
    const doc = await solveJson(['solve', 'rod.json', '--motions', 'axial,torsion,bending'], { 'rod.json': text })
    const gear = doc.resonance.filter((p: { excitation: string }) => p.excitation === 'Gear mesh')
    expect(gear.map((p: { motion: string; mode: number }) => `${p.motion} ${p.mode}`)).toEqual(['torsion 1', 'torsion 2', 'torsion 3'])
    // separation = (f_mode − f_exc)/f_exc with the exact torsion frequency: (1 − 1.03)/1.03.
    expect(gear[0].separation).toBeCloseTo((f1 - 1.03 * f1) / (1.03 * f1), 9)
    expect(gear[0].status).toBe('conflict')
    for (const p of gear.slice(1)) expect(p.status).toBe('clear')
    const line = doc.resonance.filter((p: { excitation: string }) => p.excitation === 'Line')
    expect(new Set(line.map((p: { motion: string }) => p.motion))).toEqual(new Set(['axial', 'torsion', 'bending']))
    for (const p of doc.resonance) expect(Object.keys(p)).toContain('motion')
  })

  test('--fail-on-conflict exits 3 and names the conflicting mode with its family', async () => {
    const r = await run(['solve', 'rod.json', '--motions', 'axial,torsion', '--fail-on-conflict'], { 'rod.json': text })
    expect(r.code).toBe(EXIT.conflict)
    expect(r.stderr).toMatch(/^rodwave: conflict: torsion mode 1 \([\d.]+ Hz\) and Gear mesh \([\d.]+ Hz\): separation -2\.9 %$/m)
    expect(r.stderr).not.toMatch(/conflict: axial/)
  })

  test('without torsion analysed the gear mesh checks nothing, and solve says so', async () => {
    const r = await run(['solve', 'rod.json', '--motions', 'axial'], { 'rod.json': text })
    const doc = JSON.parse(r.stdout)
    expect(doc.resonance.filter((p: { excitation: string }) => p.excitation === 'Gear mesh')).toEqual([])
    expect(doc.warnings.map((w: { code: string }) => w.code)).toContain('excitation-unanalysed')
  })
})

describe('--bending-theory', () => {
  // A stubby pinned–pinned rod: L/D = 6.
  const length = 0.3
  const diameter = 0.05
  const area = (Math.PI / 4) * diameter ** 2
  const inertia = (Math.PI / 64) * diameter ** 4
  const kappa = (6 * (1 + NU)) / (7 + 6 * NU)
  const text = rodText({
    segments: [{ length, material: 'steel', section: { shape: 'solid', diameter } }],
    ends: { start: { axial: 'fixed', torsion: 'fixed', bending: 'pinned' }, end: { axial: 'free', torsion: 'free', bending: 'pinned' } },
  })
  const eulerHz = (n: number) => ((n * Math.PI) / length) ** 2 * Math.sqrt((E * inertia) / (RHO * area)) / (2 * Math.PI)
  function timoshenkoHz(n: number): number {
    const k = (n * Math.PI) / length
    const s = kappa * G * area
    // (ρA x − s k²)(ρI x − EI k² − s) − (s k)² = 0 in x = ω²: a x² + b x + c = 0.
    const a = RHO * area * RHO * inertia
    const b = -(RHO * area * (E * inertia * k * k + s) + s * k * k * RHO * inertia)
    const c = s * k * k * (E * inertia * k * k + s) - (s * k) ** 2
    const x = (-b - Math.sqrt(b * b - 4 * a * c)) / (2 * a)
    return Math.sqrt(x) / (2 * Math.PI)
  }

  test('timoshenko: the frequencies of Timoshenko\'s simply supported closed form, below Euler–Bernoulli\'s', async () => {
    const doc = await solveJson(['solve', 'rod.json', '--motions', 'bending', '--bending-theory', 'timoshenko'], { 'rod.json': text })
    expect(doc.analysis.bendingTheory).toBe('timoshenko')
    // No exact solution in Rodwave for Timoshenko theory: the reference is a Richardson estimate.
    expect(doc.reference.methods).toEqual({ bending: 'extrapolated' })
    for (const m of doc.modes) {
      const closed = timoshenkoHz(m.mode)
      expect(closed).toBeLessThan(0.97 * eulerHz(m.mode))
      expectRelative(m.referenceHz, closed, 1e-6, `Timoshenko mode ${m.mode}, Richardson reference`)
      expectRelative(m.frequencyHz, closed, 5e-4, `Timoshenko mode ${m.mode}, 80 elements`)
    }
    expect(doc.warnings.map((w: { code: string }) => w.code)).not.toContain('stubby-segment')
  })

  test('euler-bernoulli: (nπ/L)² frequencies, and the warning that the rod is stubby', async () => {
    const doc = await solveJson(['solve', 'rod.json', '--motions', 'bending', '--bending-theory', 'euler-bernoulli'], { 'rod.json': text })
    expect(doc.analysis.bendingTheory).toBe('euler-bernoulli')
    expect(doc.reference.methods).toEqual({ bending: 'exact' })
    for (const m of doc.modes) expectRelative(m.referenceHz, eulerHz(m.mode), 1e-10, `Euler–Bernoulli mode ${m.mode}`)
    const stubby = doc.warnings.filter((w: { code: string }) => w.code === 'stubby-segment')
    expect(stubby.length).toBeGreaterThan(0)
    expect(stubby[0].message).toContain('use Timoshenko theory')
  })

  test('a wrong theory exits 2 naming the option', async () => {
    const r = await run(['solve', 'rod.json', '--bending-theory', 'rayleigh'], { 'rod.json': text })
    expect(r.code).toBe(EXIT.usage)
    expect(r.stderr).toContain('--bending-theory must be euler-bernoulli or timoshenko (got "rayleigh")')
  })
})

test('warnings name buckling proximity: a compression of 60 % of the clamped–free Euler load', async () => {
  const critical = (Math.PI ** 2 * E * I) / (4 * L * L)
  const doc = await solveJson(['solve', 'rod.json', '--motions', 'bending'], { 'rod.json': rodText({ preload: -0.6 * critical }) })
  expect(doc.buckling.ratio).toBeCloseTo(0.6, 6)
  expectRelative(doc.buckling.criticalCompression, critical, 1e-6, 'buckling load')
  const proximity = doc.warnings.find((w: { code: string }) => w.code === 'buckling-proximity')
  expect(proximity.message).toContain('60 %')
})

describe('sensitivity --motion', () => {
  const text = rodText({ motions: ['axial', 'torsion', 'bending'] })
  type Row = { mode: number; motion: string; plane: string | null; parameter: string; relative: number }
  const sensitivities = async (args: string[], files: Record<string, string> = { 'rod.json': text }) => {
    const r = await run(['sensitivity', 'rod.json', '--json', '--modes', '2', ...args], files)
    expect(r.code, r.stderr).toBe(EXIT.done)
    return JSON.parse(r.stdout).sensitivities as Row[]
  }
  const relative = (rows: Row[], mode: number, parameter: string) => rows.find((s) => s.mode === mode && s.parameter === parameter)!.relative

  // Scaling laws of the closed forms above: torsion f ∝ √G/(L√ρ), independent of a solid shaft's
  // diameter, G ∝ E/(1 + ν); Euler–Bernoulli bending f ∝ d√E/(L²√ρ). The finite-element frequency
  // scales the same way (its stiffness ∝ E, its mass ∝ ρ, a uniform mesh scales with L).
  test('torsion: relative sensitivities ½ to E, −ν/(2(1 + ν)) to ν, −½ to ρ, −1 to L, 0 to the diameter', async () => {
    const rows = await sensitivities(['--motion', 'torsion'])
    expect(new Set(rows.map((s) => s.motion))).toEqual(new Set(['torsion']))
    for (const mode of [1, 2]) {
      expect(relative(rows, mode, 'materials[0].youngsModulus')).toBeCloseTo(0.5, 6)
      expect(relative(rows, mode, 'materials[0].poissonRatio')).toBeCloseTo(-NU / (2 * (1 + NU)), 6)
      expect(relative(rows, mode, 'materials[0].density')).toBeCloseTo(-0.5, 6)
      expect(relative(rows, mode, 'segments[0].length')).toBeCloseTo(-1, 6)
      expect(relative(rows, mode, 'segments[0].section.diameter')).toBeCloseTo(0, 6)
    }
  })

  test('bending: relative sensitivities ½ to E, −½ to ρ, −2 to L, 1 to the diameter; no Poisson\'s ratio in Euler–Bernoulli theory', async () => {
    const rows = await sensitivities(['--motion', 'bending'])
    expect(new Set(rows.map((s) => s.motion))).toEqual(new Set(['bending']))
    for (const mode of [1, 2]) {
      expect(relative(rows, mode, 'materials[0].youngsModulus')).toBeCloseTo(0.5, 6)
      expect(relative(rows, mode, 'materials[0].density')).toBeCloseTo(-0.5, 6)
      expect(relative(rows, mode, 'segments[0].length')).toBeCloseTo(-2, 6)
      expect(relative(rows, mode, 'segments[0].section.diameter')).toBeCloseTo(1, 6)
    }
    expect(rows.some((s) => s.parameter === 'materials[0].poissonRatio')).toBe(false)
  })

  test('every analysed family without --motion; inertias and rotational springs are offered where they act', async () => {
    const all = await sensitivities([])
    expect([...new Set(all.map((s) => s.motion))]).toEqual(['axial', 'torsion', 'bending'])
    const attached = rodText({
      motions: ['axial', 'torsion', 'bending'],
      masses: [{ at: L, mass: 2, polarInertia: 0.004, transverseInertia: 0.003 }],
      springs: [{ at: L, motion: 'bending', stiffness: 1e5, rotationalStiffness: 2e4 }],
    })
    const torsion = await sensitivities(['--motion', 'torsion'], { 'rod.json': attached })
    const bending = await sensitivities(['--motion', 'bending'], { 'rod.json': attached })
    expect(torsion.map((s) => s.parameter)).toContain('masses[0].polarInertia')
    expect(torsion.map((s) => s.parameter)).not.toContain('masses[0].transverseInertia')
    for (const path of ['masses[0].mass', 'masses[0].transverseInertia', 'springs[0].stiffness', 'springs[0].rotationalStiffness']) expect(bending.map((s) => s.parameter)).toContain(path)
    // More inertia lowers a frequency; a stiffer spring raises it (Rayleigh's quotient).
    expect(relative(torsion, 1, 'masses[0].polarInertia')).toBeLessThan(0)
    expect(relative(bending, 1, 'springs[0].rotationalStiffness')).toBeGreaterThan(0)
  })

  test('the text names each mode\'s family', async () => {
    const r = await run(['sensitivity', 'rod.json', '--modes', '1'], { 'rod.json': text })
    expect(r.code).toBe(EXIT.done)
    for (const heading of ['Axial mode 1,', 'Torsion mode 1,', 'Bending mode 1,']) expect(r.stdout).toContain(heading)
  })

  test.each([
    [['--motion', 'twist'], '--motion must be axial, torsion or bending'],
    [['--motion', 'bending-strong'], 'the section bends in one plane; use --motion bending'],
  ])('%j exits 2 naming --motion', async (args, message) => {
    const r = await run(['sensitivity', 'rod.json', ...args], { 'rod.json': text })
    expect(r.code).toBe(EXIT.usage)
    expect(r.stderr).toContain(message)
  })

  test('a family the project does not analyse exits 2, pointing to --motions', async () => {
    const r = await run(['sensitivity', 'rod.json', '--motion', 'torsion'], { 'rod.json': rodText() })
    expect(r.code).toBe(EXIT.usage)
    expect(r.stderr).toContain('--motion torsion: the project does not analyse torsion (it analyses axial); add it with --motions')
    // …which then works.
    expect((await run(['sensitivity', 'rod.json', '--motion', 'torsion', '--motions', 'torsion'], { 'rod.json': rodText() })).code).toBe(EXIT.done)
  })
})

describe('tune --motion', () => {
  const text = rodText({ motions: ['axial', 'torsion', 'bending'] })
  test('torsion: the length that puts torsion mode 1 on 600 Hz is √(G/ρ)/(4·600)', async () => {
    const r = await run(['tune', 'rod.json', '--motion', 'torsion', '--parameter', 'segments[0].length', '--min', '0.5', '--max', '2', '--mode', '1', '--target', '600', '--json'], { 'rod.json': text })
    expect(r.code, r.stderr).toBe(EXIT.done)
    const doc = JSON.parse(r.stdout)
    expectRelative(doc.value, Math.sqrt(G / RHO) / (4 * 600), 1e-8, 'tuned length')
    expect(new Set(doc.families.map((f: { family: string }) => f.family))).toEqual(new Set(['torsion']))
    expectRelative(doc.frequenciesHz[0], 600, 1e-10, 'tuned frequency')
  })

  test('bending: the diameter that puts bending mode 1 on 30 Hz is D·30/f₁(D) (f ∝ d)', async () => {
    const target = 30
    const r = await run(['tune', 'rod.json', '--motion', 'bending', '--parameter', 'segments[0].section.diameter', '--min', '0.005', '--max', '0.1', '--mode', '1', '--target', String(target), '--json'], { 'rod.json': text })
    expect(r.code, r.stderr).toBe(EXIT.done)
    const doc = JSON.parse(r.stdout)
    expectRelative(doc.value, (D * target) / cantileverHz(1), 3e-6, 'tuned diameter (βL to seven digits)')
    expectRelative(cantileverHz(1, doc.value), target, 3e-6, 'the closed form at the tuned diameter')
  })

  test('the text names the family of the target mode and of every row', async () => {
    const r = await run(['tune', 'rod.json', '--motion', 'torsion', '--parameter', 'segments[0].length', '--min', '0.5', '--max', '2', '--mode', '1', '--target', '600'], { 'rod.json': text })
    expect(r.stdout).toContain('for torsion mode 1 at 600 Hz')
    expect(r.stdout).toMatch(/^torsion +1 +\d/m)
  })

  test('a plane key exits 2: the tuner takes a motion', async () => {
    const r = await run(['tune', 'rod.json', '--motion', 'bending-weak', '--parameter', 'segments[0].length', '--min', '0.5', '--max', '2'], { 'rod.json': text })
    expect(r.code).toBe(EXIT.usage)
    expect(r.stderr).toContain('--motion')
  })
})

describe('scatter --motion', () => {
  // Only the length scatters, ±1 % uniform: torsion f ∝ 1/L, so the 5 % point of f sits at the
  // 95 % point of L, L(1 + 0.009), and the 95 % point at L(1 − 0.009). Sampling error of those
  // quantiles with 2000 samples: about 1e-4 (√(p(1 − p)/n) over the density; any statistics text).
  const text = rodText({
    motions: ['axial', 'torsion'],
    tolerances: { length: 0.01 },
    excitations: [
      { label: 'Gear mesh', hz: 1.03 * torsionHz(1), excites: ['torsion'] },
      { label: 'Pump', hz: 10_000, excites: ['axial'] },
    ],
  })
  test('torsion only: every band that of a torsion mode, as wide as 1/L makes it; checked only against what drives torsion', async () => {
    const r = await run(['scatter', 'rod.json', '--motion', 'torsion', '--samples', '2000', '--seed', '3', '--json'], { 'rod.json': text })
    expect(r.code, r.stderr).toBe(EXIT.done)
    const doc = JSON.parse(r.stdout)
    expect(doc.modes.map((q: { motion: string; mode: number }) => `${q.motion} ${q.mode}`)).toEqual(['torsion 1', 'torsion 2', 'torsion 3'])
    for (const q of doc.modes) {
      expectRelative(q.nominalHz, torsionHz(q.mode), 1e-3, `nominal torsion ${q.mode}`)
      expectRelative(q.p05, q.nominalHz / 1.009, 5e-4, `5 % point of torsion ${q.mode}`)
      expectRelative(q.p95, q.nominalHz / 0.991, 5e-4, `95 % point of torsion ${q.mode}`)
    }
    expect(doc.resonance.map((p: { excitation: string }) => p.excitation)).toEqual(['Gear mesh', 'Gear mesh', 'Gear mesh'])
    for (const p of doc.resonance) expect(p.motion).toBe('torsion')
    expect(doc.resonance[0].status).toBe('conflict')
  })

  test('every family without --motion: each family\'s columns of the samples stay its own', async () => {
    const r = await run(['scatter', 'rod.json', '--samples', '2000', '--seed', '4', '--modes', '2', '--json'], { 'rod.json': text })
    expect(r.code, r.stderr).toBe(EXIT.done)
    const doc = JSON.parse(r.stdout)
    expect(doc.modes.map((q: { motion: string; mode: number }) => `${q.motion} ${q.mode}`)).toEqual(['axial 1', 'axial 2', 'torsion 1', 'torsion 2'])
    for (const q of doc.modes) {
      const closed = q.motion === 'axial' ? axialHz(q.mode) : torsionHz(q.mode)
      expectRelative(q.nominalHz, closed, 1e-3, `nominal ${q.motion} ${q.mode}`)
      expectRelative(q.p05, q.nominalHz / 1.009, 5e-4, `5 % point of ${q.motion} ${q.mode}`)
      expectRelative(q.p95, q.nominalHz / 0.991, 5e-4, `95 % point of ${q.motion} ${q.mode}`)
    }
  })

  test('the text names the family of each band and each conflict', async () => {
    const r = await run(['scatter', 'rod.json', '--samples', '50', '--modes', '1'], { 'rod.json': text })
    expect(r.code).toBe(EXIT.done)
    expect(r.stdout).toMatch(/^axial +1 +\d/m)
    expect(r.stdout).toMatch(/^torsion +1 +Gear mesh +-?\d+\.\d % {2}conflict$/m)
    expect(r.stdout).toMatch(/^axial +1 +Pump +-?\d+\.\d % {2}clear$/m)
  })
})

describe('response --motion', () => {
  // A harmonic end load on a fixed–free member governed by the wave equation (the bar EA u″ = ρA ü,
  // the shaft GJ θ″ = ρJ θ̈): the solution a sin(kx) with the end condition gives (derived here)
  //   θ(L)/T = tan(kL)/(GJ k), k = ω√(ρ/G); static L/(GJ).
  const damped = { analysis: { elementsPerSegment: 400, modes: 12 }, damping: 0.001 }
  test('torsion: a torque, the twist per N·m against the closed form, in rad/(N·m)', async () => {
    const f1 = torsionHz(1)
    const text = rodText({ motions: ['axial', 'torsion'], ...damped, excitations: [{ label: 'below torsion 1', hz: [0.4 * f1, 0.5 * f1] }] })
    const args = ['response', 'rod.json', '--motion', 'torsion', '--force-at', String(L), '--response-at', String(L), '--from', '0', '--to', String(2 * f1), '--points', '20']
    const doc = JSON.parse((await run([...args, '--json'], { 'rod.json': text })).stdout)
    expect([doc.motion, doc.load, doc.units.receptance]).toEqual(['torsion', 'torque', 'rad/(N·m)'])
    expectRelative(doc.staticFlexibility, L / (G * J), 1e-9, 'static twist per torque L/(GJ)')
    const k = (2 * Math.PI * 0.5 * f1) / Math.sqrt(G / RHO)
    expectRelative(doc.bands[0].peakAmplitude, Math.tan(k * L) / (G * J * k), 1e-5, 'largest |θ/T| over the band')
    expectRelative(doc.bands[0].amplification, Math.tan(Math.PI / 4) / (Math.PI / 4), 1e-5, 'amplification tan(kL)/kL at kL = π/4')
    const textOut = (await run(args, { 'rod.json': text })).stdout
    expect(textOut).toContain('twist at 1.2 m per unit torque at 1.2 m (rad/(N·m))')
    expect(textOut).toContain('|θ/T| (rad/(N·m))')
    expect(textOut).toContain('largest shear stress/T (MPa/(N·m))')
  })

  // A tip side force on a clamped–free Euler–Bernoulli beam: w(L)/P = (sin βL cosh βL − cos βL sinh βL)
  // / (EI β³ (1 + cos βL cosh βL)), β⁴ = ρAω²/(EI) (R. E. D. Bishop & D. C. Johnson, The Mechanics of
  // Vibration, receptances of uniform beams; from memory). Its limit β → 0 is the static L³/(3EI)
  // (J. M. Gere, Mechanics of Materials, cantilever deflections; from memory), checked here too.
  test('bending: a side force, the deflection per newton against the cantilever\'s closed form, in m/N', async () => {
    const f1 = cantileverHz(1)
    const tipReceptance = (f: number) => {
      const beta = ((RHO * A * (2 * Math.PI * f) ** 2) / (E * I)) ** 0.25
      const b = beta * L
      return (Math.sin(b) * Math.cosh(b) - Math.cos(b) * Math.sinh(b)) / (E * I * beta ** 3 * (1 + Math.cos(b) * Math.cosh(b)))
    }
    expectRelative(tipReceptance(1e-3), L ** 3 / (3 * E * I), 1e-6, 'the closed form tends to L³/(3EI)')
    const text = rodText({ motions: ['axial', 'bending'], ...damped, analysis: { elementsPerSegment: 100, modes: 12 }, excitations: [{ label: 'below bending 1', hz: [0.4 * f1, 0.5 * f1] }] })
    const args = ['response', 'rod.json', '--motion', 'bending', '--force-at', String(L), '--response-at', String(L), '--from', '0', '--to', String(2 * f1), '--points', '20']
    const doc = JSON.parse((await run([...args, '--json'], { 'rod.json': text })).stdout)
    expect([doc.motion, doc.load, doc.units.receptance]).toEqual(['bending', 'side force', 'm/N'])
    // Cubic elements give the exact static deflection at the nodes; what is left is the round-off of
    // the static solve of a beam of 100 elements (condition number about 10⁸).
    expectRelative(doc.staticFlexibility, L ** 3 / (3 * E * I), 1e-7, 'static tip deflection per newton L³/(3EI)')
    expectRelative(doc.bands[0].peakHz, 0.5 * f1, 1e-6, 'the band\'s peak at its top, below mode 1')
    expectRelative(doc.bands[0].peakAmplitude, tipReceptance(0.5 * f1), 1e-4, 'largest |w/F| over the band')
    const textOut = (await run([...args, '--force', '3'], { 'rod.json': text })).stdout
    expect(textOut).toContain('Deflection at 1.2 m for a harmonic side force of 3 N at 1.2 m (bending modes)')
    expect(textOut).toContain('largest bending stress (MPa)')
  })

  test('without --motion the first analysed family (axial) takes the load, as in version 1', async () => {
    const text = rodText({ motions: ['axial', 'torsion'] })
    const doc = JSON.parse((await run(['response', 'rod.json', '--force-at', String(L), '--response-at', String(L), '--from', '0', '--to', '100', '--points', '2', '--json'], { 'rod.json': text })).stdout)
    expect([doc.motion, doc.load]).toEqual(['axial', 'force'])
    expectRelative(doc.staticFlexibility, L / (E * A), 1e-9, 'static L/(EA)')
  })

  test('a torque must be positive, in N·m', async () => {
    const r = await run(['response', 'rod.json', '--motions', 'torsion', '--force-at', '1', '--response-at', '1', '--from', '0', '--to', '10', '--points', '2', '--force=-1'], { 'rod.json': rodText() })
    expect(r.code).toBe(EXIT.usage)
    expect(r.stderr).toContain('--force must be a torque amplitude > 0, in N·m')
  })
})

test('converge --motion bending studies the bending modes against their exact reference', async () => {
  const r = await run(['converge', 'rod.json', '--motions', 'axial,bending', '--motion', 'bending', '--modes', '1', '--mass', 'consistent', '--json'], { 'rod.json': rodText() })
  expect(r.code, r.stderr).toBe(EXIT.done)
  const study = JSON.parse(r.stdout)
  expect(study.family.key).toBe('bending')
  expectRelative(study.referenceHz[0], cantileverHz(1), 3e-6, 'bending reference')
  const text = (await run(['converge', 'rod.json', '--motions', 'bending', '--modes', '1', '--mass', 'lumped'], { 'rod.json': rodText() })).stdout
  expect(text).toContain('Mesh convergence of the bending modes')
})

test('--help lists the version 2 options', async () => {
  const help = (await run(['--help'])).stdout
  for (const option of ['--motions LIST', '--bending-theory euler-bernoulli|timoshenko', '--motion FAMILY']) expect(help).toContain(option)
  for (const command of ['sensitivity', 'tune', 'scatter', 'response', 'converge']) expect((await run([command, '--help'])).stdout).toContain('--motion')
})
