/**
 * The command line reads a project file by core's one rule for its bytes (the same as the
 * desktop app and the browser): a UTF-8 byte-order mark is accepted, invalid UTF-8 is
 * refused with the position of the first bad byte, never read with replacement characters.
 */
import { execFile } from 'node:child_process'
import { mkdtemp, readFile, rm, writeFile } from 'node:fs/promises'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { promisify } from 'node:util'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { decodeProjectBytes } from '../../core/model/project-bytes'

const run = (file: string) =>
  promisify(execFile)('node', ['--import', 'tsx', 'bin/rodwave.ts', 'solve', file, '--csv'], { cwd: process.cwd() }).then(
    (done) => ({ code: 0, stdout: done.stdout, stderr: done.stderr }),
    (failed: { code: number; stdout: string; stderr: string }) => ({ code: failed.code, stdout: failed.stdout, stderr: failed.stderr }),
  )

let folder: string
beforeAll(async () => {
  folder = await mkdtemp(join(tmpdir(), 'rodwave-encoding-'))
})
afterAll(async () => {
  await rm(folder, { recursive: true, force: true })
})

describe('rodwave solve and the bytes of its file', () => {
  it('reads a file that starts with a UTF-8 byte-order mark exactly as the same file without it', async () => {
    const demo = await readFile('examples/condensate-pump-hanger.rodwave.json')
    const plain = join(folder, 'plain.rodwave.json')
    const marked = join(folder, 'marked.rodwave.json')
    await writeFile(plain, demo)
    await writeFile(marked, Buffer.concat([Buffer.from([0xef, 0xbb, 0xbf]), demo]))
    const [withoutMark, withMark] = await Promise.all([run(plain), run(marked)])
    expect(withoutMark.code).toBe(0)
    expect(withMark).toEqual(withoutMark)
  })

  it('refuses invalid UTF-8 (a Latin-1 é) with exit code 1 and the rule’s message', async () => {
    const bytes = Buffer.from('{"format":"rodwave","title":"caf?"}', 'latin1')
    bytes[bytes.indexOf(0x3f)] = 0xe9
    const file = join(folder, 'latin1.rodwave.json')
    await writeFile(file, bytes)
    const decoded = decodeProjectBytes(bytes)
    if (decoded.ok) throw new Error('fixture: Latin-1 é must not be UTF-8')
    const result = await run(file)
    expect(result.code).toBe(1)
    expect(result.stdout).toBe('')
    expect(result.stderr).toBe(`rodwave: cannot read ${file}: it ${decoded.message}\n`)
    expect(result.stderr).not.toContain('\uFFFD')
  })
})
