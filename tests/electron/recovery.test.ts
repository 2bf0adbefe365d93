/**
 * Recovery copies of unsaved work: one file per session, written atomically; an earlier
 * session's copy survives the next session's autosaves and its "Don't save" until the user
 * has decided on it; clearing waits for an autosave still being written.
 */
import { mkdtemp, readdir, rm, utimes, writeFile } from 'node:fs/promises'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { createRecoveryStore, LEGACY_RECOVERY_FILE_NAME, LEGACY_RECOVERY_ID, RECOVERY_FOLDER, RECOVERY_ID_PATTERN } from '../../electron/recovery'

vi.mock('electron', () => ({}))

let userData: string
beforeEach(async () => {
  userData = await mkdtemp(join(tmpdir(), 'rodwave-recovery-'))
})
afterEach(async () => {
  await rm(userData, { recursive: true, force: true })
})

/** A fresh store as after a restart of the app, with its session started. */
async function restart() {
  const store = createRecoveryStore(userData)
  const offered = await store.startSession()
  return { store, offered }
}

const texts = (offered: { text: string }[]) => offered.map((copy) => copy.text)
const known = new Set<string>()
const filesIn = async (folder: string) => (await readdir(folder).catch(() => [] as string[])).sort()

describe('recovery copies', () => {
  it('offers nothing when nothing was autosaved', async () => {
    expect((await restart()).offered).toEqual([])
  })

  it('offers the copy a session left at the next start, exactly, with its id and time', async () => {
    const text = JSON.stringify({ format: 'rodwave', version: 1, title: 'Zugstange Ø 24 mm — Pumpe' })
    const first = await restart()
    await first.store.write(text)
    const { offered } = await restart()
    expect(offered).toHaveLength(1)
    expect(offered[0]!.text).toBe(text)
    expect(offered[0]!.id).toMatch(RECOVERY_ID_PATTERN)
    expect(Number.isNaN(Date.parse(offered[0]!.savedAt!))).toBe(false)
  })

  it('keeps one file per session: a session’s later writes replace only its own copy', async () => {
    const { store } = await restart()
    await store.write('first')
    await store.write('second')
    const files = await filesIn(join(userData, RECOVERY_FOLDER))
    expect(files).toHaveLength(1)
    expect(texts((await restart()).offered)).toEqual(['second'])
  })

  it('keeps an earlier session’s copy while the next session autosaves and then says "Don’t save"', async () => {
    const crashed = await restart()
    await crashed.store.write('work of the session that crashed')
    const next = await restart()
    expect(texts(next.offered)).toEqual(['work of the session that crashed'])
    // The user does not answer the offer, edits, autosave runs, then closes with "Don't save".
    await next.store.write('new edits')
    await next.store.write('more edits')
    await next.store.clear()
    expect(texts((await restart()).offered)).toEqual(['work of the session that crashed'])
  })

  it('removes an earlier copy once the user has decided on it, and only that one', async () => {
    const a = await restart()
    await a.store.write('copy A')
    const b = await restart()
    await b.store.write('copy B')
    const c = await restart()
    expect(texts(c.offered)).toEqual(expect.arrayContaining(['copy A', 'copy B']))
    const copyA = c.offered.find((copy) => copy.text === 'copy A')!
    await c.store.settle(copyA.id)
    expect(texts((await restart()).offered)).toEqual(['copy B'])
  })

  it('settles only copies it offered: its own session and unknown ids are left alone', async () => {
    const a = await restart()
    await a.store.write('mine')
    await a.store.settle('zzz-000000000000')
    const ownId = (await filesIn(join(userData, RECOVERY_FOLDER)))[0]!.replace('.rodwave.json', '')
    await a.store.settle(ownId)
    expect(texts((await restart()).offered)).toEqual(['mine'])
  })

  it('offers the single recovery file of earlier versions as an earlier copy', async () => {
    await writeFile(join(userData, LEGACY_RECOVERY_FILE_NAME), 'from version 0.1')
    const { store, offered } = await restart()
    expect(offered).toEqual([expect.objectContaining({ id: LEGACY_RECOVERY_ID, text: 'from version 0.1' })])
    await store.write('new session')
    expect(texts((await restart()).offered)).toEqual(expect.arrayContaining(['from version 0.1', 'new session']))
    const again = await restart()
    await again.store.settle(LEGACY_RECOVERY_ID)
    expect(await filesIn(userData)).toEqual([RECOVERY_FOLDER])
  })

  it('a window reloaded after a crash is offered its own earlier load’s copy', async () => {
    const store = createRecoveryStore(userData)
    await store.startSession()
    await store.write('before the renderer crashed')
    // The same main process, the window reloaded: a new session begins.
    expect(texts(await store.startSession())).toEqual(['before the renderer crashed'])
  })

  it('offers the newest copy first', async () => {
    for (const [text, time] of [
      ['older', new Date('2026-11-30T08:00:00Z')],
      ['newest', new Date('2026-12-01T08:00:00Z')],
      ['oldest', new Date('2026-11-01T08:00:00Z')],
    ] as const) {
      const { store } = await restart()
      await store.write(text)
      const [name] = (await filesIn(join(userData, RECOVERY_FOLDER))).filter((file) => !known.has(file))
      known.add(name!)
      await utimes(join(userData, RECOVERY_FOLDER, name!), time, time)
    }
    expect(texts((await restart()).offered)).toEqual(['newest', 'older', 'oldest'])
  })

  it('clearing twice is not an error and leaves no file', async () => {
    const { store } = await restart()
    await store.write('work')
    await store.clear()
    await expect(store.clear()).resolves.toBeUndefined()
    expect(await filesIn(join(userData, RECOVERY_FOLDER))).toEqual([])
  })

  it('a clear asked for while an autosave is being written waits for it: the copy does not come back', async () => {
    const { store } = await restart()
    // Large enough that the write is still in progress when the clear is asked for.
    const autosave = store.write('x'.repeat(8 * 1024 * 1024))
    const cleared = store.clear()
    await Promise.all([autosave, cleared])
    expect(await filesIn(join(userData, RECOVERY_FOLDER))).toEqual([])
    expect((await restart()).offered).toEqual([])
  })
})
