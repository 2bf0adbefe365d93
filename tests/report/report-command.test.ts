/**
 * `rodwave report` end to end on the examples, in-process through runCli, writing into a
 * temporary folder: the HTML report, the PDF printed by the installed Chromium (checked by
 * rendering its first page with pdftoppm from poppler-utils), the HTML fallback without a
 * browser engine, the exit codes of the command-line contract (README, "Command line").
 */
import { afterAll, afterEach, beforeAll, describe, expect, test, vi } from 'vitest'
import { execFile } from 'node:child_process'
import { mkdir, mkdtemp, readdir, readFile, rm, stat, writeFile } from 'node:fs/promises'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { promisify } from 'node:util'
import { runCli } from '../../bin/cli'
import { findBrowserEngine } from '../../bin/report-command'

interface Run {
  code: number
  stdout: string
  stderr: string
}

async function run(args: string[]): Promise<Run> {
  let stdout = ''
  let stderr = ''
  const code = await runCli(args, {
    readFile: (path) => readFile(path, 'utf8'),
    writeFile: (path, data) => writeFile(path, data),
    stdout: (t) => (stdout += t),
    stderr: (t) => (stderr += t),
  })
  return { code, stdout, stderr }
}

const EXAMPLES = ['examples/condensate-pump-hanger.rodwave.json', 'examples/fan-housing-tie-rod.rodwave.json', 'examples/die-cushion-actuator-rod.rodwave.json']
const PNG_SIGNATURE = [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]

let folder: string
beforeAll(async () => {
  folder = await mkdtemp(join(tmpdir(), 'rodwave-report-test-'))
})
afterAll(async () => {
  await rm(folder, { recursive: true, force: true })
})
afterEach(() => {
  vi.unstubAllEnvs()
})

async function titleOf(file: string): Promise<string> {
  return (JSON.parse(await readFile(file, 'utf8')) as { title: string }).title
}

describe('report --out x.html', () => {
  test.each(EXAMPLES)('%s: one self-contained HTML file, written whole', async (file) => {
    const dir = await mkdtemp(join(folder, 'html-'))
    const out = join(dir, 'report.html')
    const r = await run(['report', file, '--out', out])
    expect(r.code, r.stderr).toBe(0)
    expect(r.stdout.trim()).toBe(out)
    const html = await readFile(out, 'utf8')
    expect(html.startsWith('<!DOCTYPE html>')).toBe(true)
    expect(html.trimEnd().endsWith('</html>')).toBe(true)
    expect(html).toContain((await titleOf(file)).replace(/&/g, '&amp;'))
    expect(html).toContain('<svg')
    expect(html).not.toMatch(/<script|<link/i)
    // Written through a temporary file and a rename: nothing else is left in the folder.
    expect(await readdir(dir)).toEqual(['report.html'])
  })

  test('the report includes the convergence study', async () => {
    const out = join(folder, 'with-study.html')
    const r = await run(['report', EXAMPLES[0], '--out', out, '--modes', '3'])
    expect(r.code, r.stderr).toBe(0)
    const html = await readFile(out, 'utf8')
    expect(html.match(/<table class="convergence">/g)?.length).toBe(6)
    expect(html).toContain('convergence-chart')
  })

  test('a version 2 file: a section per family, a convergence study of each (a rendering check of the structure)', async () => {
    const out = join(folder, 'families.html')
    const r = await run(['report', 'tests/report/fixtures/three-family-rod.rodwave.json', '--out', out])
    expect(r.code, r.stderr).toBe(0)
    const html = await readFile(out, 'utf8')
    for (const key of ['axial', 'torsion', 'bending']) expect(html).toContain(`<section id="family-${key}" class="family"`)
    // Axial and torsion: 2 element orders × 3 mass matrices; bending: Hermite elements × 3 mass matrices.
    expect(html.match(/<table class="convergence">/g)?.length).toBe(6 + 6 + 3)
    expect(html.match(/<figure class="chart convergence-chart"/g)?.length).toBe(6)
  })

  test('overrides reach the analysis', async () => {
    const out = join(folder, 'overrides.html')
    const r = await run(['report', EXAMPLES[0], '--out', out, '--order', '2', '--mass', 'lumped', '--modes', '3', '--elements-per-segment', '10'])
    expect(r.code, r.stderr).toBe(0)
    const html = await readFile(out, 'utf8')
    expect(html).toContain('3-node elements, lumped mass')
    expect(html.match(/<table class="modes">[\s\S]*?<\/table>/)?.[0].match(/<tr>/g)?.length).toBe(1 + 3)
  })

  test('--fail-on-conflict writes the report, then exits 3 (the demo has a conflict)', async () => {
    const out = join(folder, 'conflict.html')
    const r = await run(['report', EXAMPLES[0], '--out', out, '--fail-on-conflict'])
    expect(r.code).toBe(3)
    expect(r.stderr).toContain('inside the 15.0 % margin')
    expect((await stat(out)).size).toBeGreaterThan(10_000)
  })

  test('replacing an existing report leaves the new one whole', async () => {
    const dir = await mkdtemp(join(folder, 'replace-'))
    const out = join(dir, 'r.html')
    await writeFile(out, 'old content')
    const r = await run(['report', EXAMPLES[1], '--out', out])
    expect(r.code, r.stderr).toBe(0)
    expect((await readFile(out, 'utf8')).startsWith('<!DOCTYPE html>')).toBe(true)
    expect(await readdir(dir)).toEqual(['r.html'])
  })
})

describe('report --out x.pdf', () => {
  test('the installed Chromium is found', async () => {
    const engine = await findBrowserEngine({})
    expect(engine).toEqual({ found: true, path: '/usr/bin/chromium' })
  })

  test.each(EXAMPLES)('%s: a PDF whose first page renders to a PNG', async (file) => {
    const dir = await mkdtemp(join(folder, 'pdf-'))
    const out = join(dir, 'report.pdf')
    const r = await run(['report', file, '--out', out])
    expect(r.code, r.stderr).toBe(0)
    expect(r.stdout.trim()).toBe(out)
    const pdf = await readFile(out)
    expect(pdf.subarray(0, 5).toString('latin1')).toBe('%PDF-')
    expect(await readdir(dir)).toEqual(['report.pdf'])
    await promisify(execFile)('pdftoppm', ['-png', '-r', '50', '-f', '1', '-l', '1', out, join(dir, 'page')])
    const pages = (await readdir(dir)).filter((n) => n.endsWith('.png'))
    expect(pages.length).toBe(1)
    const png = await readFile(join(dir, pages[0]))
    expect([...png.subarray(0, 8)]).toEqual(PNG_SIGNATURE)
    expect(png.length).toBeGreaterThan(2000)
  })

  test('without a browser engine: the HTML next to the requested path, a note on stderr, exit 0', async () => {
    vi.stubEnv('CHROME_PATH', join(folder, 'no-such-browser'))
    const dir = await mkdtemp(join(folder, 'fallback-'))
    const r = await run(['report', EXAMPLES[2], '--out', join(dir, 'rod.pdf')])
    expect(r.code).toBe(0)
    expect(r.stderr).toContain('no browser engine')
    expect(r.stderr).toContain('CHROME_PATH')
    expect(r.stderr).toContain(join(dir, 'rod.html'))
    expect(await readdir(dir)).toEqual(['rod.html'])
    expect((await readFile(join(dir, 'rod.html'), 'utf8')).startsWith('<!DOCTYPE html>')).toBe(true)
  })

  test('CHROME_PATH is used when set', async () => {
    vi.stubEnv('CHROME_PATH', '/usr/bin/chromium')
    expect(await findBrowserEngine()).toEqual({ found: true, path: '/usr/bin/chromium' })
    expect(await findBrowserEngine({ CHROME_PATH: '/bin/sh-not-here' })).toMatchObject({ found: false })
  })
})

describe('usage and bad input', () => {
  test.each([
    [['report', EXAMPLES[0]], 'report needs --out PATH'],
    [['report', EXAMPLES[0], '--out', 'r.txt'], '--out must end in .html, .htm or .pdf'],
    [['report', EXAMPLES[0], '--out', 'r'], '--out must end in .html, .htm or .pdf'],
    [['report', EXAMPLES[0], '--out', 'r.html', '--json'], '--json and --csv do not apply'],
    [['report', EXAMPLES[0], '--out', 'r.html', '--order', '5'], '--order must be a whole number from 1 to 2'],
  ])('%j exits 2', async (args, message) => {
    const r = await run(args)
    expect(r.code).toBe(2)
    expect(r.stderr).toContain(message)
  })

  test('an invalid project exits 1 naming the field, and writes nothing', async () => {
    const dir = await mkdtemp(join(folder, 'invalid-'))
    const bad = join(dir, 'bad.rodwave.json')
    const project = JSON.parse(await readFile(EXAMPLES[0], 'utf8'))
    project.segments[1].section.innerDiameter = 0.05
    await writeFile(bad, JSON.stringify(project))
    const r = await run(['report', bad, '--out', join(dir, 'r.html')])
    expect(r.code).toBe(1)
    expect(r.stderr).toContain('segments[1].section')
    expect(await readdir(dir)).toEqual(['bad.rodwave.json'])
  })

  test('a folder that does not exist exits 1 with the reason', async () => {
    const out = join(folder, 'missing-folder', 'r.html')
    const r = await run(['report', EXAMPLES[0], '--out', out])
    expect(r.code).toBe(1)
    expect(r.stderr).toContain(`cannot write ${out}: the folder does not exist`)
  })

  test('an existing report survives a failed write', async () => {
    const dir = await mkdtemp(join(folder, 'survive-'))
    // The target is a folder: the rename over it fails, and the folder's content is untouched.
    const out = join(dir, 'r.html')
    await mkdir(out)
    await writeFile(join(out, 'keep.txt'), 'kept')
    const r = await run(['report', EXAMPLES[0], '--out', out])
    expect(r.code).toBe(1)
    expect(await readFile(join(out, 'keep.txt'), 'utf8')).toBe('kept')
    expect((await readdir(dir)).sort()).toEqual(['r.html'])
  })
})
