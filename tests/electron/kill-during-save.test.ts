/**
 * Saving survives being killed at any moment: a child process saves a project over and
 * over as the app does (atomic write with a backup, then the recovery copy) and is killed
 * with SIGKILL after a random delay, many times over, each new process carrying on from
 * what is on disk. After every kill:
 *   - the project file is a complete project, the last confirmed save or the one in flight;
 *   - the backup is one save behind it (or, when the kill fell between the backup's rename
 *     and the target's, the same save as the target: the save in flight is then lost whole);
 *   - every recovery copy is a complete project, and the newest is at least the last one
 *     confirmed.
 * Bounded: a fixed number of kills; the child is bundled to plain JavaScript once, so each
 * process starts in a fraction of a second. The delays come from a seeded generator; where
 * in a save each kill lands depends on the machine, and the test reports how many landed
 * inside a save.
 */
import { spawn } from 'node:child_process'
import { mkdir, mkdtemp, readdir, readFile, rm, writeFile } from 'node:fs/promises'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { fileURLToPath } from 'node:url'
import { build } from 'vite'
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest'
import { readProjectText } from '../../core/model/project-schema'
import { seededRandom } from '../../core/random'
import { writeFileAtomic } from '../../electron/atomic-write'

vi.mock('electron', () => ({}))

const repoRoot = fileURLToPath(new URL('../..', import.meta.url))
const fixture = fileURLToPath(new URL('./fixtures/save-loop.ts', import.meta.url))
const demoPath = join(repoRoot, 'examples', 'condensate-pump-hanger.rodwave.json')
const KILLS = 30
/** Random delay after the child is ready, before the kill (ms). */
const MAX_DELAY_MS = 40

let folder: string
let bundled: string
beforeAll(async () => {
  folder = await mkdtemp(join(tmpdir(), 'rodwave-kills-'))
  const outDir = join(folder, 'fixture')
  await build({
    configFile: false,
    logLevel: 'silent',
    root: repoRoot,
    build: { ssr: fixture, outDir, emptyOutDir: true, minify: false, target: 'node20', rollupOptions: { output: { format: 'es', entryFileNames: 'save-loop.mjs' } } },
  })
  bundled = join(outDir, 'save-loop.mjs')
})
afterAll(async () => {
  await rm(folder, { recursive: true, force: true })
})

/** The revision a complete project file carries in its title; fails the test on a partial or invalid file. */
function revisionOf(text: string, what: string): number {
  const read = readProjectText(text)
  expect(read.ok, `${what} is not a complete project (${text.length} characters)`).toBe(true)
  if (!read.ok) return -1
  const match = /^Kill test (?:saved|draft) (\d+)$/.exec(read.project.title ?? '')
  expect(match, `${what} has an unexpected title: ${read.project.title}`).not.toBeNull()
  return Number(match![1])
}

interface Round {
  readonly lines: string[]
  readonly stderr: string
  readonly signal: NodeJS.Signals | null
}

/** Starts the saving child, kills it `delay` ms after it is ready, and returns what it said. */
function runAndKill(delay: number): Promise<Round> {
  return new Promise((done, fail) => {
    const child = spawn(process.execPath, [bundled, folder, demoPath], { cwd: repoRoot, stdio: ['ignore', 'pipe', 'pipe'] })
    let stdout = ''
    let stderr = ''
    let killing = false
    child.stdout.on('data', (chunk: Buffer) => {
      stdout += chunk.toString()
      if (!killing && stdout.includes('READY')) {
        killing = true
        setTimeout(() => child.kill('SIGKILL'), delay)
      }
    })
    child.stderr.on('data', (chunk: Buffer) => {
      stderr += chunk.toString()
    })
    child.on('error', fail)
    child.on('close', (_code, signal) => done({ lines: stdout.split('\n').filter(Boolean), stderr, signal }))
  })
}

const last = (lines: string[], word: string): number | null => {
  const found = lines.filter((line) => line.startsWith(`${word} `)).at(-1)
  return found === undefined ? null : Number(found.split(' ')[1])
}

describe('saving killed at random moments, many times over', () => {
  it(`keeps the project, its backup and the recovery copy complete through ${KILLS} kills`, async () => {
    const target = join(folder, 'part.rodwave.json')
    const demo = JSON.parse(await readFile(demoPath, 'utf8')) as object
    await writeFile(target, `${JSON.stringify({ ...demo, title: 'Kill test saved 0' }, null, 2)}\n`)
    await mkdir(join(folder, 'user-data'))
    const random = seededRandom(20261202)
    let confirmedSave = 0
    let confirmedRecovery = -1
    let killsInsideSave = 0
    let backupEqualsTarget = 0

    for (let round = 0; round < KILLS; round++) {
      const { lines, stderr, signal } = await runAndKill(Math.floor(random() * MAX_DELAY_MS))
      expect(stderr).toBe('')
      expect(signal).toBe('SIGKILL')
      const begun = last(lines, 'BEGIN')
      const saved = last(lines, 'SAVED') ?? confirmedSave
      confirmedSave = Math.max(confirmedSave, saved)
      confirmedRecovery = Math.max(confirmedRecovery, last(lines, 'RECOVERY') ?? -1)
      const inFlight = begun !== null && begun > saved ? begun : null
      if (inFlight !== null) killsInsideSave++

      const onDisk = revisionOf(await readFile(target, 'utf8'), `after kill ${round + 1}, the project file`)
      expect([confirmedSave, inFlight].filter((r) => r !== null)).toContain(onDisk)
      // A save can complete before the kill yet after its last report: the next process carries on from the disk.
      confirmedSave = onDisk

      if (onDisk >= 1) {
        const backup = revisionOf(await readFile(`${target}.bak`, 'utf8'), `after kill ${round + 1}, the backup`)
        expect([onDisk - 1, onDisk]).toContain(backup)
        if (backup === onDisk) backupEqualsTarget++
      }

      const copies = (await readdir(join(folder, 'user-data', 'recovery')).catch(() => [] as string[])).filter((name) => name.endsWith('.rodwave.json'))
      const recovered = await Promise.all(copies.map(async (name) => revisionOf(await readFile(join(folder, 'user-data', 'recovery', name), 'utf8'), `recovery copy ${name}`)))
      if (confirmedRecovery >= 0) expect(Math.max(...recovered)).toBeGreaterThanOrEqual(confirmedRecovery)
      confirmedRecovery = Math.max(confirmedRecovery, ...recovered)
    }

    console.info(
      `${KILLS} kills: ${killsInsideSave} inside a save of the project file, ${backupEqualsTarget} between the backup's rename and the target's; ` +
        `last confirmed save ${confirmedSave}`,
    )
    // The loop saves back to back, so kills land inside saves; were none to, the test would prove nothing.
    expect(killsInsideSave).toBeGreaterThan(0)
    expect(confirmedSave).toBeGreaterThan(0)

    // The next ordinary save clears what the killed processes left behind.
    await writeFileAtomic(target, `${JSON.stringify({ ...demo, title: 'Kill test saved 999999' }, null, 2)}\n`, { keepBackup: true })
    expect((await readdir(folder)).filter((name) => name.endsWith('.rodwave-tmp'))).toEqual([])
  }, 180_000)
})
