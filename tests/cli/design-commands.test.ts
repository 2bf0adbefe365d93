/** The design-guidance commands end to end: output contract (README, "Command line"), exit codes, and values against closed forms. */
import { describe, expect, test } from 'vitest'
import { readFile } from 'node:fs/promises'
import { CAUTION, EXIT } from '../../bin/cli-common'
import { expectRelative } from '../helpers'
import { chainFrequencies, chainFromDocument } from '../chain-reference'
import { projectText, run } from './cli-harness'

const DEMO = 'examples/condensate-pump-hanger.rodwave.json'
const E = 200e9
const RHO = 7850
/** Bar wave speed √(E/ρ) (Rao, Mechanical Vibrations, longitudinal vibration of bars). */
const C = Math.sqrt(E / RHO)

/** The root of g on [a, b] by bisection, to the last bit (an independent root finder for the checks below). */
function bisect(g: (x: number) => number, a: number, b: number): number {
  let lo = a
  let hi = b
  const sLo = Math.sign(g(lo))
  for (let i = 0; i < 200 && hi - lo > 1e-15 * Math.abs(hi); i++) {
    const mid = 0.5 * (lo + hi)
    if (Math.sign(g(mid)) === sLo) lo = mid
    else hi = mid
  }
  return 0.5 * (lo + hi)
}

describe('sensitivity', () => {
  test('--json lists every parameter for every mode', async () => {
    const r = await run(['sensitivity', DEMO, '--json', '--modes', '2'])
    expect(r.code).toBe(0)
    const { sensitivities } = JSON.parse(r.stdout)
    const paths = new Set(sensitivities.map((s: { parameter: string }) => s.parameter))
    expect(paths).toEqual(new Set(['segments[0].length', 'segments[0].section.area', 'segments[1].length', 'segments[1].section.outerDiameter', 'segments[1].section.innerDiameter', 'segments[2].length', 'segments[2].section.diameter', 'materials[0].youngsModulus', 'materials[0].density', 'masses[0].mass', 'masses[1].mass']))
    expect(sensitivities.length).toBe(2 * paths.size)
    for (const s of sensitivities) {
      expect(Object.keys(s)).toEqual(['mode', 'motion', 'plane', 'parameter', 'value', 'derivative', 'relative'])
      expect([s.motion, s.plane]).toEqual(['axial', null])
    }
    // f ∝ √E for a single-material bar: relative sensitivity ½ (Rao, Mechanical Vibrations: f ∝ c = √(E/ρ); from memory).
    expect(sensitivities.find((s: { parameter: string }) => s.parameter === 'materials[0].youngsModulus').relative).toBeCloseTo(0.5, 10)
  })
})

describe('tune', () => {
  test('--json with a target', async () => {
    const r = await run(['tune', DEMO, '--parameter', 'segments[0].length', '--min', '0.5', '--max', '2.5', '--mode', '1', '--target', '130', '--json'])
    expect(r.code).toBe(0)
    const doc = JSON.parse(r.stdout)
    expect(doc.parameter).toBe('segments[0].length')
    expect(doc.frequenciesHz[0]).toBeCloseTo(130, 8)
    expect(doc.value).toBeGreaterThan(0.5)
    expect(doc.value).toBeLessThan(1.9)
  })
  test('separation goal clears the demo conflict', async () => {
    const r = await run(['tune', DEMO, '--parameter', 'masses[1].mass', '--min', '10', '--max', '80', '--json'])
    const doc = JSON.parse(r.stdout)
    expect(doc.minSeparation).toBeGreaterThan(0.15)
    expect(doc.before.minSeparation).toBeLessThan(0.15)
  })

  // A fixed–free tube with a tip mass M: ω L/c = λ with λ tan λ = m_bar/M (Rao, Mechanical
  // Vibrations, longitudinal vibration of a bar with a mass at its end; Blevins, Formulas for
  // Natural Frequency and Mode Shape; from memory). Choosing M = the bar's mass at a 20 mm bore,
  // the target f = λ(1) c/(2πL) must be reached at that bore, from a range that starts at 0 (a solid bar).
  test('a bore tuned from --min 0 (a solid bar) lands where the tip-mass closed form puts it', async () => {
    const outer = 0.04
    const bore = 0.02
    const length = 1
    const tipMass = RHO * (Math.PI / 4) * (outer ** 2 - bore ** 2) * length
    const lambda = bisect((x) => x * Math.tan(x) - 1, 0.1, 1.5)
    expectRelative(lambda, 0.860334, 1e-6, 'λ₁ of λ tan λ = 1 (Rao, Blevins: 0.860334)')
    const target = (lambda * C) / (2 * Math.PI * length)
    const file = projectText({
      segments: [{ length, material: 'steel', section: { shape: 'tube', outerDiameter: outer, innerDiameter: 0.03 } }],
      masses: [{ at: length, mass: tipMass }],
    })
    const r = await run(['tune', 'tube.json', '--parameter', 'segments[0].section.innerDiameter', '--min', '0', '--max', '0.035', '--mode', '1', '--target', String(target), '--json'], { 'tube.json': file })
    expect(r.stderr).toBe('')
    expect(r.code).toBe(EXIT.done)
    expectRelative(JSON.parse(r.stdout).value, bore, 1e-8, 'tuned bore')
  })

  test.each([
    [['tune', DEMO, '--min', '1', '--max', '2'], '--parameter is required'],
    [['tune', DEMO, '--parameter', 'segments[9].length', '--min', '1', '--max', '2'], 'is not a parameter of this project'],
    [['tune', DEMO, '--parameter', 'segments[0].length', '--min', '2', '--max', '1'], '0 < min < max'],
    [['tune', DEMO, '--parameter', 'segments[0].length', '--min', '0', '--max', '1'], '0 < min < max'],
    [['tune', DEMO, '--parameter', 'segments[1].section.innerDiameter', '--min=-0.001', '--max', '0.03'], '0 ≤ min < max < 0.044 m'],
    [['tune', DEMO, '--parameter', 'segments[1].section.innerDiameter', '--min', '0', '--max', '0.044'], '0 ≤ min < max < 0.044 m'],
    [['tune', DEMO, '--parameter', 'segments[1].section.outerDiameter', '--min', '0.02', '--max', '0.05'], 'above the bore, 0.027 m'],
    [['tune', DEMO, '--parameter', 'segments[0].length', '--min', '1', '--max', '2', '--mode', '1'], '--mode needs --target'],
  ])('%j exits 2', async (args, message) => {
    const r = await run(args as string[])
    expect(r.code).toBe(EXIT.usage)
    expect(r.stderr).toContain(message)
  })

  test('a target no value in the range reaches exits 4 (not 2, wrong usage), saying how far the range goes', async () => {
    const r = await run(['tune', DEMO, '--parameter', 'segments[0].length', '--min', '1.5', '--max', '2.5', '--mode', '1', '--target', '5000', '--json'])
    expect(r.code).toBe(EXIT.targetOutOfReach)
    expect(EXIT.targetOutOfReach).toBe(4)
    expect(r.stdout).toBe('')
    expect(r.stderr).toMatch(/no value of length of segment 1 between 1\.5 and 2\.5 m puts mode 1 on 5000 Hz; over that range it moves between [\d.]+ and [\d.]+ Hz/)
  })

  test('an unknown parameter path is echoed at most 60 characters long', async () => {
    const path = `segments[0].${'x'.repeat(5000)}`
    const r = await run(['tune', DEMO, '--parameter', path, '--min', '1', '--max', '2'])
    expect(r.code).toBe(EXIT.usage)
    expect(r.stderr).toContain(`"${path.slice(0, 59)}…" is not a parameter`)
    expect(r.stderr).not.toMatch(/x{60}/)
    expect(r.stderr.length).toBeLessThan(1000)
  })
})

describe('scatter', () => {
  test('--json gives ordered quantiles per mode, repeatable with the seed', async () => {
    const args = ['scatter', DEMO, '--samples', '400', '--seed', '5', '--modes', '2', '--json']
    const a = JSON.parse((await run(args)).stdout)
    const b = JSON.parse((await run(args)).stdout)
    expect(a).toEqual(b)
    expect(a.samples).toBe(400)
    for (const m of a.modes) {
      expect(m.p05).toBeLessThan(m.p50)
      expect(m.p50).toBeLessThan(m.p95)
      expect(Math.abs(m.p50 - m.nominalHz) / m.nominalHz).toBeLessThan(0.01)
    }
  })

  // The check with tolerances: a mode conflicts when any part of its 5–95 % band lies within the
  // margin of an excitation band (separation between the nearest points of the two bands). The
  // excitation bands are rebuilt here from the file: rpm × order / 60 (common practice, no source).
  test('--json checks every mode band against every excitation band and the margin', async () => {
    const project = JSON.parse(await readFile(DEMO, 'utf8'))
    const r = await run(['scatter', DEMO, '--samples', '300', '--seed', '2', '--modes', '3', '--json'])
    expect(r.code).toBe(EXIT.done)
    const doc = JSON.parse(r.stdout)
    expect(doc.margin).toBe(project.margin)
    const excitations: [string, number | null, number, number][] = []
    for (const e of project.excitations) {
      if ('rpm' in e) for (const order of e.orders) excitations.push([e.label, order, (e.rpm[0] * order) / 60, (e.rpm[1] * order) / 60])
      else excitations.push([e.label, null, e.hz, e.hz])
    }
    expect(doc.resonance.length).toBe(3 * excitations.length)
    for (const pair of doc.resonance) {
      const q = doc.modes[pair.mode - 1]
      expect(pair.modeBandHz).toEqual([q.p05, q.p95])
      const [label, order, lo, hi] = excitations.find(([l, o]) => l === pair.excitation && o === pair.order)!
      expect([label, order]).toEqual([pair.excitation, pair.order])
      expectRelative(pair.excitationHz[0], lo, 1e-12, 'band low')
      expectRelative(pair.excitationHz[1], hi, 1e-12, 'band high')
      const separation = q.p95 < lo ? (q.p95 - lo) / lo : q.p05 > hi ? (q.p05 - hi) / hi : 0
      expect(pair.separation).toBeCloseTo(separation, 12)
      expect(pair.status).toBe(Math.abs(separation) < project.margin ? 'conflict' : 'clear')
    }
    // Mode 1 of the demo (about 106 Hz) sits within 15 % of twice line frequency, band or not.
    expect(doc.resonance.some((p: { mode: number; status: string }) => p.mode === 1 && p.status === 'conflict')).toBe(true)
  })

  test('--fail-on-conflict exits 3 when a band conflicts; the text names the check and ends with the caution', async () => {
    const r = await run(['scatter', DEMO, '--samples', '100', '--modes', '2', '--fail-on-conflict'])
    expect(r.code).toBe(EXIT.conflict)
    expect(r.stdout).toContain('Resonance check with the 5–95 % bands, margin 15.0 %')
    expect(r.stdout).toMatch(/^axial {6}1 {2}Motor twice line frequency +\d+\.\d % {2}conflict$/m)
    expect(r.stdout.trimEnd().endsWith(CAUTION)).toBe(true)
    expect(r.stderr).toContain('inside the 15.0 % margin with the tolerance bands')
  })

  test('a project without tolerances exits 1', async () => {
    const r = await run(['scatter', 'examples/fan-housing-tie-rod.rodwave.json', '--samples', '100'])
    expect(r.code).toBe(1)
    expect(r.stderr).toContain('no tolerances')
  })
})

describe('response', () => {
  test('--json points with amplitude and phase; the grid holds the evenly spaced points and every mode in range', async () => {
    const r = await run(['response', DEMO, '--force-at', '2.91', '--response-at', '2.91', '--from', '1', '--to', '300', '--points', '30', '--json'])
    expect(r.code).toBe(0)
    const doc = JSON.parse(r.stdout)
    expect(doc.axis).toBe('linear')
    expect(Object.keys(doc.points[0])).toEqual(['frequencyHz', 'amplitude', 'phaseDeg'])
    const frequencies: number[] = doc.points.map((p: { frequencyHz: number }) => p.frequencyHz)
    for (let i = 0; i < 30; i++) expect(frequencies.some((f) => Math.abs(f - (1 + (299 * i) / 29)) < 1e-12)).toBe(true)
    for (let i = 1; i < frequencies.length; i++) expect(frequencies[i]).toBeGreaterThan(frequencies[i - 1])
    const solved = JSON.parse((await run(['solve', DEMO])).stdout)
    const inRange = solved.modes.filter((m: { frequencyHz: number }) => m.frequencyHz > 1 && m.frequencyHz < 300)
    expect(inRange.length).toBe(1)
    for (const m of inRange) {
      expect(frequencies).toContainEqual(m.frequencyHz)
      expect(frequencies).toContainEqual(m.frequencyHz * (1 - doc.damping))
      expect(frequencies).toContainEqual(m.frequencyHz * (1 + doc.damping))
    }
    expect(frequencies.length).toBe(30 + 3 * inRange.length)
    const peak = doc.points.reduce((a: { amplitude: number }, b: { amplitude: number }) => (b.amplitude > a.amplitude ? b : a))
    // The peak sits on the first mode (the grid includes each mode): the first mode computed
    // independently (tests/chain-reference.ts), to the finite elements' accuracy.
    const f1 = chainFrequencies(chainFromDocument(JSON.parse(await readFile(DEMO, 'utf8'))), 200, 0.5)[0]
    expect(Math.abs(peak.frequencyHz - f1)).toBeLessThan(1e-3 * f1)
  })

  test('--log-spaced: evenly spaced on a logarithmic axis; from 0 it starts three decades below the top', async () => {
    const args = ['response', DEMO, '--force-at', '2.91', '--response-at', '1', '--to', '10000', '--points', '5', '--log-spaced', '--json']
    const doc = JSON.parse((await run([...args, '--from', '1'])).stdout)
    expect(doc.axis).toBe('log')
    const frequencies: number[] = doc.points.map((p: { frequencyHz: number }) => p.frequencyHz)
    for (const f of [1, 10, 100, 1000, 10000]) expect(frequencies.some((g) => Math.abs(g - f) <= 1e-12 * f)).toBe(true)
    const fromZero = JSON.parse((await run([...args, '--from', '0'])).stdout)
    expect(fromZero.points[0].frequencyHz).toBeCloseTo(10, 12)
    const text = (await run([...args.filter((a) => a !== '--json'), '--from', '0'])).stdout
    expect(text).toContain('A logarithmic axis cannot start at 0 Hz: it starts at 10.0 Hz.')
  })

  // A uniform bar fixed at x = 0, harmonic force F at the free end x = L, no damping: the wave
  // equation's solution u = a sin(kx), k = ω/c, with EA u′(L) = F gives (derived here)
  //   u(L)/F = tan(kL)/(EA k),  static L/(EA),  stress E u′(x) largest at x = 0: F/(A cos kL).
  // With ζ = 0.001 and 400 elements the modal solution should agree to about 1e-5 (the stress, read
  // from the first element's constant strain, to 5e-5).
  describe('amplification and stress at each band, against the continuous bar', () => {
    const L = 1
    const d = 0.02
    const A = (Math.PI / 4) * d * d
    const f1 = C / (4 * L)
    const force = 250
    const file = projectText({
      segments: [{ length: L, material: 'steel', section: { shape: 'solid', diameter: d } }],
      analysis: { elementsPerSegment: 400, modes: 12 },
      damping: 0.001,
      excitations: [
        { label: 'band below mode 1', hz: [0.4 * f1, 0.5 * f1] },
        { label: 'single frequency', hz: 0.25 * f1 },
      ],
    })
    const receptance = (f: number) => {
      const k = (2 * Math.PI * f) / C
      return Math.tan(k * L) / (E * A * k)
    }

    test('per unit force and for --force 250 N', async () => {
      const args = ['response', 'bar.json', '--force-at', String(L), '--response-at', String(L), '--from', '0', '--to', String(2 * f1), '--points', '50', '--json']
      const unit = JSON.parse((await run(args, { 'bar.json': file })).stdout)
      expect(unit.force).toBeNull()
      expectRelative(unit.staticFlexibility, L / (E * A), 1e-9, 'static flexibility L/(EA)')
      const [band, single] = unit.bands
      expect([band.excitation, single.excitation]).toEqual(['band below mode 1', 'single frequency'])
      // |H| rises towards mode 1, so over [0.4, 0.5]·f1 it is largest at 0.5·f1.
      expectRelative(band.peakHz, 0.5 * f1, 1e-6, 'peak frequency of the band')
      expectRelative(band.peakAmplitude, receptance(0.5 * f1), 1e-5, 'largest |u/F| over the band')
      expectRelative(band.amplification, Math.tan(Math.PI / 4) / (Math.PI / 4), 1e-5, 'amplification tan(kL)/kL at kL = π/4')
      expectRelative(single.amplification, Math.tan(Math.PI / 8) / (Math.PI / 8), 1e-5, 'amplification at kL = π/8')
      expectRelative(band.stressPerForce, 1 / (A * Math.cos(Math.PI / 4)), 5e-5, 'largest stress per newton 1/(A cos kL)')
      expect(band.stressAt).toBeLessThan(L / 400 + 1e-12)

      const loaded = JSON.parse((await run([...args, '--force', String(force)], { 'bar.json': file })).stdout)
      expect(loaded.force).toBe(force)
      expectRelative(loaded.bands[0].peakDisplacement, force * receptance(0.5 * f1), 1e-5, 'largest |u| for 250 N')
      expectRelative(loaded.bands[0].peakStress, force / (A * Math.cos(Math.PI / 4)), 5e-5, 'largest stress for 250 N')
      loaded.points.forEach((p: { amplitude: number; displacement: number }) => expect(p.displacement).toBe(p.amplitude * force))
    })

    test('text: the band table with the amplification, in the project units, and the caution', async () => {
      const r = await run(['response', 'bar.json', '--force-at', '1', '--response-at', '1', '--from', '0', '--to', '3000', '--points', '4', '--force', '250'], { 'bar.json': file })
      expect(r.code).toBe(0)
      expect(r.stdout).toContain('Displacement at 1 m for a harmonic force of 250 N at 1 m')
      expect(r.stdout).toContain('At each excitation band that drives the axial modes (force amplitude 250 N):')
      const row = r.stdout.split('\n').find((l) => l.startsWith('band below mode 1'))!
      // × static at kL = π/4: 4/π = 1.27 to three digits.
      expect(row.split(/\s+/)).toContain('1.27')
      expect(r.stdout.trimEnd().endsWith(CAUTION)).toBe(true)
    })
  })

  test.each([
    [['--force-at', '5', '--response-at', '1', '--from', '1', '--to', '2', '--points', '3'], '--force-at must lie on the bar'],
    [['--force-at', '1', '--response-at', '1', '--from', '2', '--to', '2', '--points', '3'], '0 ≤ from < to'],
    [['--force-at', '1', '--response-at', '1', '--from', '1', '--to', '2', '--points', '3', '--force=-5'], '--force must be a force amplitude > 0'],
  ])('%j exits 2', async (args, message) => {
    const r = await run(['response', DEMO, ...args])
    expect(r.code).toBe(EXIT.usage)
    expect(r.stderr).toContain(message)
  })
})

describe('the caution line', () => {
  test.each([
    [['sensitivity', DEMO, '--modes', '1']],
    [['tune', DEMO, '--parameter', 'masses[1].mass', '--min', '10', '--max', '80']],
    [['scatter', DEMO, '--samples', '50', '--modes', '1']],
    [['response', DEMO, '--force-at', '2.91', '--response-at', '2.91', '--from', '1', '--to', '300', '--points', '5']],
    [['converge', DEMO, '--modes', '1', '--order', '1', '--mass', 'lumped']],
  ])('%j: the text output ends with it', async (args) => {
    const r = await run(args)
    expect(r.stdout.trimEnd().split('\n').at(-1)).toBe(CAUTION)
  })
  test('the JSON and CSV outputs stay machine-readable, without it', async () => {
    for (const args of [['solve', DEMO], ['solve', DEMO, '--csv'], ['sensitivity', DEMO, '--json', '--modes', '1'], ['converge', DEMO, '--csv', '--modes', '1', '--order', '1', '--mass', 'lumped']]) {
      expect((await run(args)).stdout).not.toContain('engineering aid')
    }
  })
  test('--help, and every command\'s --help, carry it', async () => {
    expect((await run(['--help'])).stdout).toContain(CAUTION)
    for (const command of ['solve', 'converge', 'report', 'sensitivity', 'tune', 'scatter', 'response']) {
      const r = await run([command, '--help'])
      expect(r.code).toBe(0)
      expect(r.stdout).toContain(CAUTION)
    }
  })
  test('it says what the trade says: an engineering aid, verify on the real part, defer to local codes and licensed practice', () => {
    expect(CAUTION).toMatch(/engineering aid/)
    expect(CAUTION).toMatch(/verify .* on the real part/)
    expect(CAUTION).toMatch(/defer to local codes and licensed engineering practice/)
    expect(CAUTION.includes('\n')).toBe(false)
  })
})
