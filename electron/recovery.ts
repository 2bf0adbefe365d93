/**
 * Recovery copies: the window's autosave of unsaved work, kept in the user-data folder so a
 * crash or a power cut costs at most the last few edits. Written atomically.
 *
 * Each session (one load of the window) writes a file of its own under `recovery/`, so the
 * copy an earlier session left is never overwritten by the next session's autosave, nor
 * removed by its "Don't save": it stays until the user has answered the offer to restore
 * it (settle). The operations of one store run one after another, so clearing a copy waits
 * for an autosave still being written instead of racing its rename (which would bring the
 * cleared file back).
 */
import { randomBytes } from 'node:crypto'
import { mkdir, readdir, readFile, stat, unlink } from 'node:fs/promises'
import { join } from 'node:path'
import { writeFileAtomic } from './atomic-write'
import type { RecoveredWork } from './ipc-contract'

export const RECOVERY_FOLDER = 'recovery'
/** The single recovery file of Rodwave 0.1, offered like any earlier session's copy. */
export const LEGACY_RECOVERY_FILE_NAME = 'unsaved-project.rodwave.json'
export const LEGACY_RECOVERY_ID = 'legacy'
const SUFFIX = '.rodwave.json'
/** Session ids: time (base 36) and randomness, so names sort by age and never collide. */
export const RECOVERY_ID_PATTERN = /^(?:legacy|[0-9a-z]{1,12}-[0-9a-f]{12})$/
/** At most this many earlier copies are offered at once (newest first); the rest wait for the next start. */
export const MAX_OFFERED_COPIES = 5

export interface RecoveryStore {
  /**
   * Starts a session (the window has loaded): its autosaves go to a new file. Returns the
   * copies that earlier sessions left and the user has not decided on, newest first.
   */
  startSession(): Promise<RecoveredWork[]>
  /** Writes this session's copy. */
  write(text: string): Promise<void>
  /** Removes this session's copy (the work was saved, or the user chose not to keep it). */
  clear(): Promise<void>
  /** The user restored or discarded an earlier session's copy: it goes. Unknown ids are ignored. */
  settle(id: string): Promise<void>
}

function isMissing(error: unknown): boolean {
  return (error as { code?: unknown } | null)?.code === 'ENOENT'
}

async function removeIfPresent(path: string): Promise<void> {
  try {
    await unlink(path)
  } catch (error) {
    if (!isMissing(error)) throw error
  }
}

function newSessionId(): string {
  return `${Date.now().toString(36)}-${randomBytes(6).toString('hex')}`
}

export function createRecoveryStore(userDataDir: string): RecoveryStore {
  const folder = join(userDataDir, RECOVERY_FOLDER)
  const legacyPath = join(userDataDir, LEGACY_RECOVERY_FILE_NAME)
  let session = newSessionId()
  /** Earlier copies offered in this session, by id: only these may be settled. */
  const offered = new Map<string, string>()
  let queue: Promise<unknown> = Promise.resolve()

  const sessionPath = () => join(folder, `${session}${SUFFIX}`)

  /** Runs operations one at a time, in the order they were asked for. */
  function serial<T>(operation: () => Promise<T>): Promise<T> {
    const result = queue.then(operation, operation)
    queue = result.catch(() => undefined)
    return result
  }

  async function earlierCopies(): Promise<{ id: string; path: string }[]> {
    let names: string[] = []
    try {
      names = await readdir(folder)
    } catch (error) {
      if (!isMissing(error)) throw error
    }
    const copies = names
      .filter((name) => name.endsWith(SUFFIX))
      .map((name) => ({ id: name.slice(0, -SUFFIX.length), path: join(folder, name) }))
      .filter((copy) => RECOVERY_ID_PATTERN.test(copy.id) && copy.id !== session && copy.id !== LEGACY_RECOVERY_ID)
    copies.push({ id: LEGACY_RECOVERY_ID, path: legacyPath })
    return copies
  }

  async function readCopy(copy: { id: string; path: string }): Promise<RecoveredWork | null> {
    try {
      const [text, info] = await Promise.all([readFile(copy.path, 'utf8'), stat(copy.path)])
      return { id: copy.id, text, savedAt: info.mtime.toISOString() }
    } catch (error) {
      if (isMissing(error)) return null
      throw error
    }
  }

  return {
    startSession() {
      return serial(async () => {
        session = newSessionId()
        offered.clear()
        const found = (await Promise.all((await earlierCopies()).map(readCopy))).filter((copy): copy is RecoveredWork => copy !== null)
        found.sort((a, b) => (b.savedAt ?? '').localeCompare(a.savedAt ?? ''))
        const offer = found.slice(0, MAX_OFFERED_COPIES)
        for (const copy of offer) offered.set(copy.id, copy.id === LEGACY_RECOVERY_ID ? legacyPath : join(folder, `${copy.id}${SUFFIX}`))
        return offer
      })
    },
    write(text) {
      return serial(async () => {
        await mkdir(folder, { recursive: true })
        await writeFileAtomic(sessionPath(), text)
      })
    },
    clear() {
      return serial(() => removeIfPresent(sessionPath()))
    },
    settle(id) {
      return serial(async () => {
        const path = offered.get(id)
        if (path === undefined) return
        await removeIfPresent(path)
        offered.delete(id)
      })
    },
  }
}
