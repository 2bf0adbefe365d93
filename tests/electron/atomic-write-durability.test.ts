/**
 * Durability of an atomic save: every file is flushed to the disk (fsync) before it is
 * renamed into place, the backup copy included, and the folder is flushed after the
 * renames, so that after a power cut neither the project nor its `.bak` can be an empty or
 * partial file. The order of the file-system calls is recorded through a wrapped
 * node:fs/promises (the real calls still run, in a temporary folder).
 */
import { mkdtemp, readFile, rm, writeFile } from 'node:fs/promises'
import { tmpdir } from 'node:os'
import { basename, join } from 'node:path'
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'

vi.mock('electron', () => ({}))

const calls = vi.hoisted(() => [] as string[])

vi.mock('node:fs/promises', async (importOriginal) => {
  const actual = await importOriginal<typeof import('node:fs/promises')>()
  return {
    ...actual,
    open: async (...args: Parameters<typeof actual.open>) => {
      const handle = await actual.open(...args)
      const path = String(args[0])
      const sync = handle.sync.bind(handle)
      handle.sync = async () => {
        calls.push(`sync ${basename(path)}`)
        return sync()
      }
      return handle
    },
    rename: async (from: string, to: string) => {
      calls.push(`rename ${basename(from)} -> ${basename(to)}`)
      return actual.rename(from, to)
    },
    copyFile: async (...args: Parameters<typeof actual.copyFile>) => {
      calls.push(`copy ${basename(String(args[0]))} -> ${basename(String(args[1]))}`)
      return actual.copyFile(...args)
    },
  }
})

const { writeFileAtomic } = await import('../../electron/atomic-write')

let folder: string
beforeEach(async () => {
  folder = await mkdtemp(join(tmpdir(), 'rodwave-durable-'))
  calls.length = 0
})
afterEach(async () => {
  await rm(folder, { recursive: true, force: true })
})

/** The index of the first recorded call matching `pattern`; fails the test when there is none. */
function indexOf(pattern: RegExp): number {
  const index = calls.findIndex((call) => pattern.test(call))
  expect(index, `no call matches ${pattern} in:\n${calls.join('\n')}`).toBeGreaterThanOrEqual(0)
  return index
}

describe('an atomic save with a backup flushes before it renames', () => {
  it('syncs the new content, then the backup copy, each before its rename, then the folder', async () => {
    const target = join(folder, 'hanger.rodwave.json')
    await writeFile(target, 'save 1')
    calls.length = 0
    await writeFileAtomic(target, 'save 2', { keepBackup: true })
    expect(await readFile(target, 'utf8')).toBe('save 2')
    expect(await readFile(`${target}.bak`, 'utf8')).toBe('save 1')

    const tempName = /^\.hanger\.rodwave\.json\.\d+-[0-9a-f]+\.rodwave-tmp$/
    const backupTempName = /^\.hanger\.rodwave\.json\.bak\.\d+-[0-9a-f]+\.rodwave-tmp$/
    const syncTemp = indexOf(new RegExp(`^sync ${tempName.source.slice(1, -1)}$`))
    const renameTemp = indexOf(new RegExp(`^rename ${tempName.source.slice(1, -1)} -> hanger\\.rodwave\\.json$`))
    const copyBackup = indexOf(new RegExp(`^copy hanger\\.rodwave\\.json -> ${backupTempName.source.slice(1, -1)}$`))
    const syncBackup = indexOf(new RegExp(`^sync ${backupTempName.source.slice(1, -1)}$`))
    const renameBackup = indexOf(new RegExp(`^rename ${backupTempName.source.slice(1, -1)} -> hanger\\.rodwave\\.json\\.bak$`))
    const syncFolder = calls.lastIndexOf(`sync ${basename(folder)}`)

    expect(syncTemp).toBeLessThan(renameTemp)
    expect(copyBackup).toBeLessThan(syncBackup)
    expect(syncBackup).toBeLessThan(renameBackup)
    // The backup is in place before the target is replaced, and the folder is flushed after both renames.
    expect(renameBackup).toBeLessThan(renameTemp)
    expect(syncFolder).toBeGreaterThan(renameTemp)
  })
})
