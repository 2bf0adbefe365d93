/** The recovery copy of unsaved work: write, read back, clear; written atomically. */
import { mkdtemp, readdir, rm } from 'node:fs/promises'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { createRecoveryStore, RECOVERY_FILE_NAME } from '../../electron/recovery'

vi.mock('electron', () => ({}))

let userData: string
beforeEach(async () => {
  userData = await mkdtemp(join(tmpdir(), 'rodwave-recovery-'))
})
afterEach(async () => {
  await rm(userData, { recursive: true, force: true })
})

describe('recovery copy', () => {
  it('reads null when nothing was autosaved', async () => {
    expect(await createRecoveryStore(userData).read()).toBeNull()
  })

  it('round-trips the text exactly, including non-ASCII characters', async () => {
    const text = JSON.stringify({ format: 'rodwave', version: 1, title: 'Zugstange Ø 24 mm — Pumpe' })
    await createRecoveryStore(userData).write(text)
    // A fresh store (as after a restart) reads the same text.
    expect(await createRecoveryStore(userData).read()).toBe(text)
  })

  it('replaces the previous copy and leaves only the recovery file behind', async () => {
    const recovery = createRecoveryStore(userData)
    await recovery.write('first')
    await recovery.write('second')
    expect(await recovery.read()).toBe('second')
    expect(await readdir(userData)).toEqual([RECOVERY_FILE_NAME])
  })

  it('clears the copy, and clearing twice is not an error', async () => {
    const recovery = createRecoveryStore(userData)
    await recovery.write('work')
    await recovery.clear()
    expect(await recovery.read()).toBeNull()
    await expect(recovery.clear()).resolves.toBeUndefined()
    expect(await readdir(userData)).toEqual([])
  })
})
