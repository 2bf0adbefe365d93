/** The design-guidance commands end to end: output contract (README, "Command line") and exit codes. */
import { describe, expect, test } from 'vitest'
import { readFile } from 'node:fs/promises'
import { runCli } from '../../bin/cli'
import { chainFrequencies, chainFromDocument } from '../chain-reference'

async function run(args: string[], files: Record<string, string> = {}) {
  let stdout = ''
  let stderr = ''
  const code = await runCli(args, {
    readFile: async (path) => (path in files ? files[path] : readFile(path, 'utf8')),
    writeFile: async () => {},
    stdout: (t) => (stdout += t),
    stderr: (t) => (stderr += t),
  })
  return { code, stdout, stderr }
}

const DEMO = 'examples/condensate-pump-hanger.rodwave.json'

describe('sensitivity', () => {
  test('--json lists every parameter for every mode', async () => {
    const r = await run(['sensitivity', DEMO, '--json', '--modes', '2'])
    expect(r.code).toBe(0)
    const { sensitivities } = JSON.parse(r.stdout)
    const paths = new Set(sensitivities.map((s: { parameter: string }) => s.parameter))
    expect(paths).toEqual(new Set(['segments[0].length', 'segments[0].section.area', 'segments[1].length', 'segments[1].section.outerDiameter', 'segments[1].section.innerDiameter', 'segments[2].length', 'segments[2].section.diameter', 'materials[0].youngsModulus', 'materials[0].density', 'masses[0].mass', 'masses[1].mass']))
    expect(sensitivities.length).toBe(2 * paths.size)
    for (const s of sensitivities) expect(Object.keys(s)).toEqual(['mode', 'parameter', 'value', 'derivative', 'relative'])
    // f ∝ √E for a single-material bar: relative sensitivity ½ (check-values.md §1).
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
  test.each([
    [['tune', DEMO, '--min', '1', '--max', '2'], '--parameter is required'],
    [['tune', DEMO, '--parameter', 'segments[9].length', '--min', '1', '--max', '2'], 'is not a parameter of this project'],
    [['tune', DEMO, '--parameter', 'segments[0].length', '--min', '2', '--max', '1'], '0 < min < max'],
    [['tune', DEMO, '--parameter', 'segments[0].length', '--min', '1', '--max', '2', '--mode', '1'], '--mode needs --target'],
  ])('%j exits 2', async (args, message) => {
    const r = await run(args as string[])
    expect(r.code).toBe(2)
    expect(r.stderr).toContain(message)
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
  test('a project without tolerances exits 1', async () => {
    const r = await run(['scatter', 'examples/fan-housing-tie-rod.rodwave.json', '--samples', '100'])
    expect(r.code).toBe(1)
    expect(r.stderr).toContain('no tolerances')
  })
})

describe('response', () => {
  test('--json points with amplitude and phase', async () => {
    const r = await run(['response', DEMO, '--force-at', '2.91', '--response-at', '2.91', '--from', '1', '--to', '300', '--points', '30', '--json'])
    expect(r.code).toBe(0)
    const doc = JSON.parse(r.stdout)
    expect(doc.points.length).toBe(30)
    expect(Object.keys(doc.points[0])).toEqual(['frequencyHz', 'amplitude', 'phaseDeg'])
    const peak = doc.points.reduce((a: { amplitude: number }, b: { amplitude: number }) => (b.amplitude > a.amplitude ? b : a))
    // The first mode, computed independently (tests/chain-reference.ts), within one grid step.
    const f1 = chainFrequencies(chainFromDocument(JSON.parse(await readFile(DEMO, 'utf8'))), 200, 0.5)[0]
    expect(Math.abs(peak.frequencyHz - f1)).toBeLessThan(300 / 29)
  })
  test('a force off the bar is a usage error', async () => {
    const r = await run(['response', DEMO, '--force-at', '5', '--response-at', '1', '--from', '1', '--to', '2', '--points', '3'])
    expect(r.code).toBe(2)
    expect(r.stderr).toContain('--force-at must lie on the bar')
  })
})
