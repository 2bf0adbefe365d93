/**
 * The built command line as a real process: `node bin/launch.mjs` (package.json's `rodwave`)
 * builds dist/cli/rodwave.mjs when it is missing or stale and runs it. Checks that the built file
 * gives what the sources give, that its scatter worker threads run from it, that `solve` never
 * loads the report and chart code while `report` does, and the process-level contract (exit
 * codes, no stack trace, timing of the start-up). No time is asserted: `npm run bench` measures it.
 */
import { afterAll, beforeAll, describe, expect, test } from 'vitest'
import { execFile } from 'node:child_process'
import { mkdtemp, readFile, rm, writeFile } from 'node:fs/promises'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { pathToFileURL } from 'node:url'
import { promisify } from 'node:util'
import { CAUTION, EXIT } from '../../bin/cli-common'
import { run } from './cli-harness'

const DEMO = 'examples/condensate-pump-hanger.rodwave.json'

interface Process {
  code: number
  stdout: string
  stderr: string
}

async function rodwave(args: string[], nodeArgs: string[] = [], env: NodeJS.ProcessEnv = {}): Promise<Process> {
  try {
    const { stdout, stderr } = await promisify(execFile)(process.execPath, [...nodeArgs, 'bin/launch.mjs', ...args], { env: { ...process.env, ...env }, maxBuffer: 64 * 1024 * 1024 })
    return { code: 0, stdout, stderr }
  } catch (error) {
    const e = error as { code?: number; stdout?: string; stderr?: string }
    if (typeof e.code !== 'number') throw error
    return { code: e.code, stdout: e.stdout ?? '', stderr: e.stderr ?? '' }
  }
}

let work: string

beforeAll(async () => {
  work = await mkdtemp(join(tmpdir(), 'rodwave-built-cli-'))
  // Builds the command line if the sources changed since the last build.
  const first = await rodwave(['--help'])
  expect(first.code, first.stderr).toBe(0)
}, 300_000)

afterAll(async () => {
  await rm(work, { recursive: true, force: true })
})

describe('the built command line', () => {
  test('solve --csv gives what the sources give', async () => {
    const built = await rodwave(['solve', DEMO, '--csv'])
    expect(built.code).toBe(EXIT.done)
    expect(built.stdout).toBe((await run(['solve', DEMO, '--csv'])).stdout)
  }, 60_000)

  test('solve --json reports the start-up of the process among its phases', async () => {
    const built = await rodwave(['solve', DEMO])
    const timing = JSON.parse(built.stdout).timing
    expect(Object.keys(timing)).toEqual(['startupMs', 'readMs', 'validateMs', 'assembleMs', 'solveMs', 'referenceMs', 'resultsMs', 'checksMs', 'totalMs'])
    const phases = Object.entries(timing).filter(([k]) => k !== 'totalMs')
    const sum = phases.reduce((s, [, ms]) => s + (ms as number), 0)
    expect(timing.startupMs).toBeGreaterThan(0)
    expect(timing.totalMs).toBeGreaterThanOrEqual(sum - 1e-9)
  }, 60_000)

  // Version 2 options through the real process: the same document as the sources give (timing
  // aside), and a wrong family name is a usage error naming the option.
  test('--motions and --bending-theory give what the sources give; a wrong --motions exits 2', async () => {
    const file = join(work, 'rod.rodwave.json')
    await writeFile(
      file,
      JSON.stringify({
        format: 'rodwave',
        version: 2,
        motions: ['axial'],
        materials: [{ id: 'steel', youngsModulus: 2e11, density: 7850, poissonRatio: 0.3 }],
        segments: [{ length: 0.4, material: 'steel', section: { shape: 'solid', diameter: 0.05 } }],
        ends: { start: { axial: 'fixed', torsion: 'fixed', bending: 'clamped' }, end: { axial: 'free', torsion: 'free', bending: 'free' } },
        analysis: { elementsPerSegment: 40, modes: 3 },
        excitations: [{ label: 'Gear mesh', hz: 2000, excites: ['torsion'] }],
      }),
    )
    const args = ['solve', file, '--motions', 'torsion,bending', '--bending-theory', 'timoshenko']
    const built = await rodwave(args)
    expect(built.code, built.stderr).toBe(EXIT.done)
    const { timing: _builtTiming, ...fromBuilt } = JSON.parse(built.stdout)
    const { timing: _sourceTiming, ...fromSources } = JSON.parse((await run(args)).stdout)
    expect(fromBuilt).toEqual(fromSources)
    expect(fromBuilt.motions).toEqual(['torsion', 'bending'])
    expect(fromBuilt.analysis.bendingTheory).toBe('timoshenko')
    for (const pair of fromBuilt.resonance) expect(pair.motion).toBe('torsion')
    const wrong = await rodwave(['solve', file, '--motions', 'axial,bend'])
    expect(wrong.code).toBe(EXIT.usage)
    expect(wrong.stderr).toContain('--motions takes axial, torsion and bending, comma-separated (got "bend")')
  }, 60_000)

  test('invalid input: exit 1, message on stderr, no stack trace', async () => {
    const built = await rodwave(['solve', 'package.json'])
    expect(built.code).toBe(EXIT.invalidInput)
    expect(built.stderr).toContain('format: must be "rodwave"')
    expect(built.stderr).not.toMatch(/\n\s+at /)
  }, 60_000)

  test('--help carries the caution and the exit codes', async () => {
    const built = await rodwave(['--help'])
    expect(built.stdout).toContain(CAUTION)
    expect(built.stdout).toContain('4 the target is out of reach')
  }, 60_000)

  test('scatter runs its worker threads from the built file, and gives the sources\' result', async () => {
    const args = ['scatter', DEMO, '--samples', '120', '--seed', '9', '--modes', '2', '--json']
    const built = await rodwave(args)
    expect(built.code, built.stderr).toBe(EXIT.done)
    expect(JSON.parse(built.stdout)).toEqual(JSON.parse((await run(args)).stdout))
  }, 120_000)

  // A module hook logs every file the process loads: solve must not touch the report chunk
  // (ECharts and the report), report must.
  test('solve loads no report or chart code; report loads it on demand and writes the report', async () => {
    const log = join(work, 'loaded.txt')
    const hooks = join(work, 'hooks.mjs')
    const register = join(work, 'register.mjs')
    await writeFile(hooks, `import { appendFileSync } from 'node:fs'\nexport async function load(url, context, next) {\n  if (url.startsWith('file:')) appendFileSync(${JSON.stringify(log)}, url + '\\n')\n  return next(url, context)\n}\n`)
    await writeFile(register, `import { register } from 'node:module'\nregister(${JSON.stringify(pathToFileURL(hooks).href)})\n`)
    const loaded = async () => (await readFile(log, 'utf8')).trim().split('\n')

    await writeFile(log, '')
    const solved = await rodwave(['solve', DEMO, '--csv'], ['--import', pathToFileURL(register).href])
    expect(solved.code, solved.stderr).toBe(EXIT.done)
    const solveFiles = await loaded()
    expect(solveFiles.some((u) => u.endsWith('/dist/cli/rodwave.mjs'))).toBe(true)
    expect(solveFiles.filter((u) => u.includes('/dist/cli/') && !u.endsWith('/rodwave.mjs'))).toEqual([])
    expect(solveFiles.filter((u) => /echarts|zrender|node_modules/.test(u))).toEqual([])
    // …nor carries it inside the entry file (ECharts names itself in its code; the report its table).
    const entry = await readFile('dist/cli/rodwave.mjs', 'utf8')
    expect(entry).not.toMatch(/echarts|zrender|Rodwave version/i)

    await writeFile(log, '')
    const out = join(work, 'report.html')
    const reported = await rodwave(['report', DEMO, '--out', out], ['--import', pathToFileURL(register).href])
    expect(reported.code, reported.stderr).toBe(EXIT.done)
    expect((await loaded()).some((u) => /\/dist\/cli\/report-command-[\w-]+\.mjs$/.test(u))).toBe(true)
    const html = await readFile(out, 'utf8')
    const { version } = JSON.parse(await readFile('package.json', 'utf8'))
    expect(html).toContain(`<meta name="generator" content="Rodwave ${version}">`)
    expect(html).toContain('<svg')
  }, 120_000)

  // The entry file holds the engine and zod: it must not need node_modules at run time.
  test('the built file needs nothing from node_modules', async () => {
    const entry = await readFile('dist/cli/rodwave.mjs', 'utf8')
    const imports = [...entry.matchAll(/\bfrom\s*["']([^"']+)["']|\bimport\(\s*["']([^"']+)["']\s*\)/g)].map((m) => m[1] ?? m[2])
    for (const specifier of imports) expect(specifier, specifier).toMatch(/^(node:|\.\/)/)
  })
})
