/**
 * The command line end to end on examples/, in-process through runCli with an in-memory IO,
 * checking the output contract (README, "Command line") and the exit codes: 0 done, 1 invalid
 * input, 2 wrong usage, 3 conflict with --fail-on-conflict (4, a tuner target out of reach, in
 * design-commands.test.ts). The built command line as a real process: built-cli.test.ts.
 */
import { describe, expect, test } from 'vitest'
import { readFile } from 'node:fs/promises'
import { EXIT } from '../../bin/cli-common'
import { MODAL_SUMMARY_COLUMNS } from '../../core/analysis/modal-summary'
import { run } from './cli-harness'

const EXAMPLES = ['examples/condensate-pump-hanger.rodwave.json', 'examples/fan-housing-tie-rod.rodwave.json', 'examples/die-cushion-actuator-rod.rodwave.json']

describe('solve', () => {
  test.each(EXAMPLES)('%s: JSON with the contract fields, Sturm check passed', async (file) => {
    const r = await run(['solve', file])
    expect(r.code).toBe(0)
    const doc = JSON.parse(r.stdout)
    expect(Object.keys(doc)).toEqual(expect.arrayContaining(['title', 'totals', 'analysis', 'modes', 'reference', 'resonance', 'timing']))
    expect(Object.keys(doc.totals)).toEqual(['length', 'mass', 'elements', 'dofs'])
    expect(doc.reference.method).toBe('exact')
    const project = JSON.parse(await readFile(file, 'utf8'))
    expect(doc.modes.length).toBe(project.analysis.modes)
    for (const m of doc.modes) {
      expect(Object.keys(m)).toEqual(expect.arrayContaining(['mode', 'frequencyHz', 'rigidBody', 'referenceHz', 'errorVsReference', 'participationFactor', 'effectiveMass', 'effectiveMassFraction']))
      expect(Math.abs(m.errorVsReference)).toBeLessThan(1e-2)
    }
    for (let i = 1; i < doc.modes.length; i++) expect(doc.modes[i].frequencyHz).toBeGreaterThan(doc.modes[i - 1].frequencyHz)
    expect(doc.checks.sturmCount.passed).toBe(true)
    expect(doc.timing.assembleMs).toBeGreaterThanOrEqual(0)
    expect(doc.timing.solveMs).toBeGreaterThan(0)
  })

  test('--csv: a header and one row per mode', async () => {
    const r = await run(['solve', EXAMPLES[0], '--csv', '--modes', '4'])
    expect(r.code).toBe(0)
    const lines = r.stdout.trim().split(/\r\n/)
    expect(lines[0]).toBe(MODAL_SUMMARY_COLUMNS.join(','))
    expect(lines.length).toBe(5)
    expect(lines[1].split(',')[0]).toBe('1')
  })

  test('overrides change the analysis', async () => {
    const r = await run(['solve', EXAMPLES[0], '--order', '2', '--elements-per-segment', '12', '--mass', 'lumped', '--modes', '3'])
    const doc = JSON.parse(r.stdout)
    expect(doc.analysis).toEqual({ elementOrder: 2, elementsPerSegment: 12, mass: 'lumped', modes: 3 })
    // The turnbuckle sits mid-tube: its two halves get 6 elements each, 12 in all.
    expect(doc.totals.elements).toBe(3 * 12)
  })

  test('--fail-on-conflict exits 3 on the demo (mode 1 near twice line frequency)', async () => {
    const r = await run(['solve', EXAMPLES[0], '--fail-on-conflict'])
    expect(r.code).toBe(3)
    expect(r.stderr).toContain('inside the 15.0 % margin')
    const doc = JSON.parse(r.stdout)
    expect(doc.resonance.some((p: { status: string }) => p.status === 'conflict')).toBe(true)
  })

  test('--fail-on-conflict exits 0 when every pair is clear', async () => {
    const r = await run(['solve', EXAMPLES[1], '--fail-on-conflict'])
    expect(r.code).toBe(0)
  })
})

describe('converge', () => {
  test('text table with observed orders', async () => {
    const r = await run(['converge', EXAMPLES[2], '--modes', '2', '--order', '1', '--mass', 'consistent'])
    expect(r.code).toBe(0)
    expect(r.stdout).toContain('2-node elements, consistent mass')
    expect(r.stdout).toContain('observed order')
  })
  test('--json: every series with points and orders', async () => {
    const r = await run(['converge', EXAMPLES[1], '--modes', '2', '--json'])
    const study = JSON.parse(r.stdout)
    expect(study.series.length).toBe(6)
    for (const s of study.series) {
      expect(s.points.length).toBeGreaterThan(5)
      expect(s.observedOrder.length).toBe(2)
    }
  })
})

describe('bad input and usage', () => {
  const negative = JSON.stringify({
    format: 'rodwave',
    version: 1,
    materials: [{ id: 's', youngsModulus: 2e11, density: 7850 }],
    segments: [{ length: -1, material: 's', section: { shape: 'solid', diameter: 0.02 } }],
    ends: { start: 'fixed', end: 'free' },
  })
  test('a negative length exits 1 naming segments[0].length, without a stack trace', async () => {
    const r = await run(['solve', 'bad.json'], { 'bad.json': negative })
    expect(r.code).toBe(1)
    expect(r.stderr).toContain('segments[0].length: must be > 0')
    expect(r.stderr).not.toMatch(/\n\s+at /)
    expect(r.stdout).toBe('')
  })
  test('a missing file exits 1', async () => {
    const r = await run(['solve', 'no/such/file.json'])
    expect(r.code).toBe(1)
    expect(r.stderr).toContain('no such file')
  })
  test.each([
    [['solve'], 'needs exactly one project FILE'],
    [['explode', 'x.json'], 'unknown command "explode"'],
    [['solve', EXAMPLES[0], '--order', '3'], '--order must be a whole number from 1 to 2'],
    [['solve', EXAMPLES[0], '--mass', 'heavy'], '--mass must be consistent, lumped or mixed'],
    [['solve', EXAMPLES[0], '--modes', 'many'], '--modes must be a whole number'],
    [['solve', EXAMPLES[0], '--frobnicate'], "Unknown option '--frobnicate'"],
    [['solve', EXAMPLES[0], '--json', '--csv'], 'choose one of --json and --csv'],
  ])('%j exits 2', async (args, message) => {
    const r = await run(args)
    expect(r.code).toBe(2)
    expect(r.stderr).toContain(message)
  })
})

describe('timing: every phase of the solve', () => {
  test('each phase is a duration, and the total covers them all', async () => {
    const doc = JSON.parse((await run(['solve', EXAMPLES[0]])).stdout)
    const t = doc.timing
    expect(Object.keys(t)).toEqual(['readMs', 'validateMs', 'assembleMs', 'solveMs', 'referenceMs', 'resultsMs', 'checksMs', 'totalMs'])
    for (const [phase, ms] of Object.entries(t)) expect(ms, phase).toBeGreaterThanOrEqual(0)
    expect(t.solveMs).toBeGreaterThan(0)
    // The phases follow one another inside the total (which also holds argument parsing).
    const sum = t.readMs + t.validateMs + t.assembleMs + t.solveMs + t.referenceMs + t.resultsMs + t.checksMs
    expect(t.totalMs).toBeGreaterThanOrEqual(sum - 1e-9)
  })
})

describe('values echoed in messages are capped at 60 characters', () => {
  const long = 'A'.repeat(100_000)
  test.each([
    ['an unknown --mass', ['solve', EXAMPLES[0], '--mass', long], '--mass must be consistent, lumped or mixed (got "'],
    ['a --modes that is no number', ['solve', EXAMPLES[0], '--modes', long], '--modes must be a whole number from 1 to 200 (got "'],
    ['an unknown command', [long, 'x.json'], 'unknown command "'],
    ['an unknown option', ['solve', EXAMPLES[0], `--${long}`], "Unknown option '--"],
    ['a report path of the wrong kind', ['report', EXAMPLES[0], '--out', `${long}.txt`], '--out must end in .html, .htm or .pdf (got "…'],
  ])('%s', async (_, args, message) => {
    const r = await run(args)
    expect(r.code).toBe(EXIT.usage)
    expect(r.stderr).toContain(message)
    expect(r.stderr).toContain('…')
    // No run of the value longer than the cap survives, and the message stays short.
    expect(r.stderr).not.toMatch(/A{60}/)
    expect(r.stderr.split('\n')[0].length).toBeLessThan(500)
  })
  test('a long file name keeps its end (where the name is)', async () => {
    const path = `${'deep/'.repeat(50)}missing.rodwave.json`
    const r = await run(['solve', path])
    expect(r.code).toBe(EXIT.invalidInput)
    expect(r.stderr).toContain(`cannot read …${path.slice(-59)}: no such file`)
  })
  test('an inherited property name is not a command', async () => {
    const r = await run(['constructor', EXAMPLES[0]])
    expect(r.code).toBe(EXIT.usage)
    expect(r.stderr).toContain('unknown command "constructor"')
  })
})
