/**
 * The recovery file: the renderer's autosave of unsaved work, kept in the user-data folder
 * so a crash or a power cut costs at most the last few edits. Written atomically.
 */
import { readFile, unlink } from 'node:fs/promises'
import { join } from 'node:path'
import { writeFileAtomic } from './atomic-write'

export const RECOVERY_FILE_NAME = 'unsaved-project.rodwave.json'

export interface RecoveryStore {
  write(text: string): Promise<void>
  /** The saved text, or null when there is nothing to recover. */
  read(): Promise<string | null>
  clear(): Promise<void>
}

function isMissing(error: unknown): boolean {
  return (error as { code?: unknown } | null)?.code === 'ENOENT'
}

export function createRecoveryStore(userDataDir: string): RecoveryStore {
  const path = join(userDataDir, RECOVERY_FILE_NAME)
  return {
    async write(text) {
      await writeFileAtomic(path, text)
    },
    async read() {
      try {
        return await readFile(path, 'utf8')
      } catch (error) {
        if (isMissing(error)) return null
        throw error
      }
    },
    async clear() {
      try {
        await unlink(path)
      } catch (error) {
        if (!isMissing(error)) throw error
      }
    },
  }
}
