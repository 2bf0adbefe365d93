/**
 * Atomic save: new content in place, the previous file kept as .bak, never a partial
 * target, including when the saving process is killed (SIGKILL) in the middle.
 */
import { spawn } from 'node:child_process'
import { createHash } from 'node:crypto'
import { chmod, mkdtemp, readdir, readFile, rm, stat, symlink, writeFile } from 'node:fs/promises'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { fileURLToPath } from 'node:url'
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { backupPathFor, writeFileAtomic } from '../../electron/atomic-write'

vi.mock('electron', () => ({}))

const repoRoot = fileURLToPath(new URL('../..', import.meta.url))
const crashFixture = fileURLToPath(new URL('./fixtures/atomic-save-crash.ts', import.meta.url))

let folder: string
beforeEach(async () => {
  folder = await mkdtemp(join(tmpdir(), 'rodwave-atomic-'))
})
afterEach(async () => {
  await rm(folder, { recursive: true, force: true })
})

const sha256 = (bytes: Uint8Array) => createHash('sha256').update(bytes).digest('hex')
const tempFilesIn = async (dir: string) => (await readdir(dir)).filter((name) => name.endsWith('.rodwave-tmp'))

describe('writeFileAtomic', () => {
  it('creates a new file with exactly the given text and leaves no temporary file', async () => {
    const target = join(folder, 'new.rodwave.json')
    await writeFileAtomic(target, '{"format":"rodwave"}', { keepBackup: true })
    expect(await readFile(target, 'utf8')).toBe('{"format":"rodwave"}')
    expect(await tempFilesIn(folder)).toEqual([])
    // Nothing was replaced, so there is nothing to back up.
    await expect(stat(backupPathFor(target))).rejects.toMatchObject({ code: 'ENOENT' })
  })

  it('replaces an existing file and keeps the previous content as <name>.bak', async () => {
    const target = join(folder, 'pump.rodwave.json')
    await writeFile(target, 'first version')
    await writeFileAtomic(target, 'second version', { keepBackup: true })
    expect(await readFile(target, 'utf8')).toBe('second version')
    expect(await readFile(`${target}.bak`, 'utf8')).toBe('first version')
    await writeFileAtomic(target, 'third version', { keepBackup: true })
    expect(await readFile(target, 'utf8')).toBe('third version')
    expect(await readFile(`${target}.bak`, 'utf8')).toBe('second version')
    expect(await tempFilesIn(folder)).toEqual([])
  })

  it('keeps the permissions of the file it replaces', async () => {
    const target = join(folder, 'private.rodwave.json')
    await writeFile(target, 'old')
    await chmod(target, 0o600)
    await writeFileAtomic(target, 'new')
    expect((await stat(target)).mode & 0o777).toBe(0o600)
  })

  it('writes through a symbolic link to the real file, keeping the link', async () => {
    const real = join(folder, 'real.rodwave.json')
    const link = join(folder, 'link.rodwave.json')
    await writeFile(real, 'old')
    await symlink(real, link)
    const written = await writeFileAtomic(link, 'new')
    expect(written).toBe(real)
    expect(await readFile(real, 'utf8')).toBe('new')
    expect((await stat(link)).isFile()).toBe(true)
    expect(await readFile(link, 'utf8')).toBe('new')
  })

  it('leaves the target untouched and removes its temporary file when the write fails before the rename', async () => {
    const target = join(folder, 'keep.rodwave.json')
    await writeFile(target, 'precious')
    await expect(
      writeFileAtomic(target, 'replacement', {
        keepBackup: true,
        hooks: {
          tempReady: () => {
            throw Object.assign(new Error('disk full'), { code: 'ENOSPC' })
          },
        },
      }),
    ).rejects.toThrow('disk full')
    expect(await readFile(target, 'utf8')).toBe('precious')
    expect(await tempFilesIn(folder)).toEqual([])
  })

  it('rejects when the folder does not exist, creating nothing', async () => {
    const target = join(folder, 'missing-folder', 'x.rodwave.json')
    await expect(writeFileAtomic(target, 'text')).rejects.toMatchObject({ code: 'ENOENT' })
    expect(await readdir(folder)).toEqual([])
  })

  it('serialises concurrent saves of one file: the result is one complete payload', async () => {
    const target = join(folder, 'busy.rodwave.json')
    const payloads = Array.from({ length: 8 }, (_, index) => String(index).repeat(300_000 + index))
    await Promise.all(payloads.map((text) => writeFileAtomic(target, text, { keepBackup: true })))
    const final = await readFile(target, 'utf8')
    expect(payloads).toContain(final)
    expect(await tempFilesIn(folder)).toEqual([])
  })

  it('after a save, removes temporary files left by a process that no longer runs, and keeps those of a live one', async () => {
    const target = join(folder, 'stale.rodwave.json')
    const deadPid = await new Promise<number>((done, fail) => {
      const child = spawn(process.execPath, ['-e', ''], { stdio: 'ignore' })
      child.on('error', fail)
      child.on('exit', () => done(child.pid!))
    })
    const deadTemp = join(folder, `.stale.rodwave.json.${deadPid}-abcdef.rodwave-tmp`)
    const liveTemp = join(folder, `.stale.rodwave.json.${process.ppid}-123456.rodwave-tmp`)
    await writeFile(deadTemp, 'partial')
    await writeFile(liveTemp, 'in progress elsewhere')
    await writeFileAtomic(target, 'content')
    expect(await tempFilesIn(folder)).toEqual([`.stale.rodwave.json.${process.ppid}-123456.rodwave-tmp`])
  })
})

describe('atomic save killed in the middle (SIGKILL)', () => {
  const PAYLOAD_BYTES = 48 * 1024 * 1024

  /** Runs the fixture until it pauses at `moment`, checks the temporary file, then kills it. */
  async function killDuringSave(target: string, moment: 'mid-temp' | 'before-rename'): Promise<{ tempPath: string; tempSize: number; signal: string | null }> {
    const child = spawn(process.execPath, ['--import', 'tsx', crashFixture, target, moment, String(PAYLOAD_BYTES)], {
      cwd: repoRoot,
      stdio: ['ignore', 'pipe', 'pipe'],
    })
    let stderr = ''
    child.stderr.on('data', (chunk: Buffer) => {
      stderr += chunk.toString()
    })
    const tempPath = await new Promise<string>((done, fail) => {
      let stdout = ''
      child.stdout.on('data', (chunk: Buffer) => {
        stdout += chunk.toString()
        const match = /PAUSED (.+)\n/.exec(stdout)
        if (match) done(match[1]!)
        if (stdout.includes('FINISHED')) fail(new Error('the save finished before it could be interrupted'))
      })
      child.on('exit', (code) => fail(new Error(`the fixture exited (${code}) before pausing: ${stderr}`)))
    })
    const tempSize = (await stat(tempPath)).size
    const exited = new Promise<string | null>((done) => child.on('exit', (_code, signal) => done(signal)))
    child.kill('SIGKILL')
    return { tempPath, tempSize, signal: await exited }
  }

  it.each(['mid-temp', 'before-rename'] as const)('killed at %s: the original file is byte-identical and no half-written target exists', async (moment) => {
    const target = join(folder, 'hanger.rodwave.json')
    const original = await readFile(join(repoRoot, 'examples', 'condensate-pump-hanger.rodwave.json'))
    await writeFile(target, original)

    const { tempPath, tempSize, signal } = await killDuringSave(target, moment)

    expect(signal).toBe('SIGKILL')
    // The kill really came mid-save: the temporary file holds part (mid-temp) or all (before-rename) of the payload.
    if (moment === 'mid-temp') {
      expect(tempSize).toBeGreaterThan(0)
      expect(tempSize).toBeLessThan(PAYLOAD_BYTES)
    } else {
      expect(tempSize).toBe(PAYLOAD_BYTES)
    }
    const after = await readFile(target)
    expect(after.byteLength).toBe(original.byteLength)
    expect(sha256(after)).toBe(sha256(original))
    // The only other file is the killed save's temporary file, under its own hidden name.
    const names = (await readdir(folder)).sort()
    expect(names).toEqual(['hanger.rodwave.json', tempPath.slice(folder.length + 1)].sort())

    // The next save completes normally and clears the dead process's leftover.
    await writeFileAtomic(target, 'after the crash', { keepBackup: true })
    expect(await readFile(target, 'utf8')).toBe('after the crash')
    expect(sha256(await readFile(`${target}.bak`))).toBe(sha256(original))
    expect(await tempFilesIn(folder)).toEqual([])
  })
})
