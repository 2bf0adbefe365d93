/**
 * A corpus of malformed project files, each refused by `solve` with exit code 1, the offending
 * field's JSON path in the message and no stack trace, and the command never hangs or throws.
 * The cases follow the hardening brief: not JSON, empty, wrong types, non-finite numbers,
 * out-of-range values, unknown shapes or ends, dangling material ids, a bore bigger than the
 * outside, attachments off the bar, inverted ranges, a mesh too large for memory, an oversize
 * file, deep nesting, prototype-pollution keys.
 */
import { describe, expect, test } from 'vitest'
import { execFile } from 'node:child_process'
import { mkdtemp, writeFile, rm } from 'node:fs/promises'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { promisify } from 'node:util'
import { runCli } from '../../bin/cli'

const valid = () => ({
  format: 'rodwave',
  version: 1,
  materials: [{ id: 'st', youngsModulus: 2e11, density: 7850 }],
  segments: [
    { length: 1, material: 'st', section: { shape: 'solid', diameter: 0.02 } },
    { length: 0.5, material: 'st', section: { shape: 'tube', outerDiameter: 0.03, innerDiameter: 0.01 } },
  ],
  ends: { start: 'fixed', end: 'free' },
  masses: [{ at: 1.5, mass: 2 }],
  excitations: [{ label: 'pump', rpm: [1450, 1490], orders: [1, 2] }],
})

function mutated(change: (d: Record<string, any>) => void): string { // eslint-disable-line @typescript-eslint/no-explicit-any
  const d = valid() as Record<string, any> // eslint-disable-line @typescript-eslint/no-explicit-any
  change(d)
  return JSON.stringify(d)
}

export const CORPUS: [string, string, string][] = [
  // Only the analysis finds this one: a 1 m pinned–pinned steel rod of 20 mm has Euler's load
  // π²EI/L² = 15,503 N, printed to four significant figures (Timoshenko & Gere, from memory; EI = 200e9·π·0.02⁴/64).
  [
    'compression past the buckling load',
    JSON.stringify({
      format: 'rodwave',
      version: 2,
      motions: ['bending'],
      materials: [{ id: 'st', youngsModulus: 2e11, density: 7850 }],
      segments: [{ length: 1, material: 'st', section: { shape: 'solid', diameter: 0.02 } }],
      ends: { start: { bending: 'pinned' }, end: { bending: 'pinned' } },
      preload: -16000,
    }),
    'preload: a compression of 16,000 N is at or beyond the buckling load of the part on its bending supports, 15,500 N',
  ],
  ['not JSON', 'segments: [ { length: 1 } ]', '(file): is not valid JSON'],
  ['empty', '', '(file): is empty'],
  ['only whitespace', '   \n\t ', '(file): is empty'],
  ['a JSON array', '[1, 2, 3]', '(file): must be a JSON object'],
  ['a JSON string', '"rodwave"', '(file): must be a JSON object'],
  ['another format', mutated((d) => (d.format = 'other')), 'format: must be "rodwave"'],
  ['a newer version', mutated((d) => (d.version = 7)), 'version: this file is format version 7'],
  ['length as text', mutated((d) => (d.segments[0].length = '1 m')), 'segments[0].length: must be a number'],
  ['length null', mutated((d) => (d.segments[0].length = null)), 'segments[0].length: must be a number'],
  ['negative length', mutated((d) => (d.segments[0].length = -1)), 'segments[0].length: must be > 0'],
  ['non-finite number (1e999)', JSON.stringify(valid()).replace('"length":1,', '"length":1e999,'), 'segments[0].length: must be a finite number'],
  ['absurdly large diameter', mutated((d) => (d.segments[0].section.diameter = 1e308)), 'segments[0].section.diameter: must be at most 100 m'],
  ['absurdly small modulus', mutated((d) => (d.materials[0].youngsModulus = 1e-300)), 'materials[0].youngsModulus: must be at least 1000 Pa'],
  ['unknown shape', mutated((d) => (d.segments[0].section = { shape: 'hexagon', across: 0.02 })), 'segments[0].section.shape: must be one of'],
  ['unknown end condition', mutated((d) => (d.ends.start = 'pinned')), 'ends.start: must be "fixed" or "free" (the axial condition), or an object with axial, torsion and bending conditions'],
  ['dangling material id', mutated((d) => (d.segments[1].material = 'steel-x')), 'segments[1].material: "steel-x" is neither in materials nor in the built-in library'],
  ['bore bigger than the outside', mutated((d) => (d.segments[1].section.innerDiameter = 0.04)), 'segments[1].section.innerDiameter: must be smaller than outerDiameter'],
  ['mass off the bar', mutated((d) => (d.masses[0].at = 2)), 'masses[0].at: must lie on the bar'],
  ['negative position', mutated((d) => (d.masses[0].at = -0.1)), 'masses[0].at: must be ≥ 0'],
  ['inverted speed range', mutated((d) => (d.excitations[0].rpm = [1490, 1450])), 'excitations[0].rpm: the first value (minimum) must not exceed the second (maximum)'],
  ['orders missing', mutated((d) => delete d.excitations[0].orders), 'excitations[0].orders: is required'],
  ['mesh too large for memory', mutated((d) => (d.analysis = { elementsPerSegment: 1_500_000 })), 'analysis.elementsPerSegment: gives a mesh of about'],
  ['far too fine an element length', mutated((d) => (d.analysis = { maxElementLength: 1e-7 })), 'analysis.maxElementLength: gives a mesh of about'],
  ['too many modes', mutated((d) => (d.analysis = { modes: 5000 })), 'analysis.modes: must be ≤ 200'],
  ['unknown field', mutated((d) => (d.segments[0].colour = 'red')), 'segments[0].colour: is not a field of a Rodwave project'],
  ['__proto__ key', JSON.stringify(valid()).replace('{"format"', '{"__proto__":{"polluted":1},"format"'), '__proto__: is not a field of a Rodwave project'],
  ['constructor key', JSON.stringify(valid()).replace('"ends":', '"constructor":{"prototype":{"polluted":1}},"ends":'), 'constructor: is not a field of a Rodwave project'],
  ['deeply nested JSON', `{"format":"rodwave","version":1,"segments":${'['.repeat(50_000)}${']'.repeat(50_000)}}`, 'segments'],
  ['oversize file (25 million characters)', `{"format":"rodwave","version":1,"title":"${'x'.repeat(25_000_000)}"}`, '(file): is 25.0 million characters'],
  ['no segments', mutated((d) => (d.segments = [])), 'segments: must have at least one segment'],
  ['one element between two fixed ends', mutated((d) => {
    d.ends.end = 'fixed'
    d.segments = [d.segments[0]]
    d.masses = []
    d.analysis = { elementsPerSegment: 1 }
  }), 'analysis.elementsPerSegment: leaves no node free to move between the two fixed ends'],
]

async function solve(text: string) {
  let stdout = ''
  let stderr = ''
  const code = await runCli(['solve', 'bad.rodwave.json'], {
    readFile: async () => text,
    writeFile: async () => {},
    stdout: (t) => (stdout += t),
    stderr: (t) => (stderr += t),
  })
  return { code, stdout, stderr }
}

describe('malformed files are refused with exit 1, the field named, no stack trace', () => {
  test.each(CORPUS)('%s', async (_, text, expected) => {
    const r = await solve(text)
    expect(r.code).toBe(1)
    expect(r.stdout).toBe('')
    expect(r.stderr).toContain(expected)
    expect(r.stderr).not.toMatch(/\n\s+at |Error:|TypeError|RangeError/)
    expect(({} as Record<string, unknown>).polluted).toBeUndefined()
  })
})

describe('as a real process', () => {
  test('a file of 120 MB is refused from its size, without being read', async () => {
    const folder = await mkdtemp(join(tmpdir(), 'rodwave-big-'))
    try {
      const file = join(folder, 'huge.rodwave.json')
      await writeFile(file, Buffer.alloc(120_000_000, 32))
      const error = (await promisify(execFile)('node', ['--import', 'tsx', 'bin/rodwave.ts', 'solve', file]).catch((e) => e)) as { code: number; stderr: string }
      expect(error.code).toBe(1)
      expect(error.stderr).toContain('120 MB; a project file may have at most 20 million characters')
    } finally {
      await rm(folder, { recursive: true, force: true })
    }
  })
})
