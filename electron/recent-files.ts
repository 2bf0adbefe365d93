/**
 * The recent-files list: most recent first, at most ten, no duplicates, files that no
 * longer exist dropped. Stored as a small JSON document in the app's user-data folder.
 */
import { readFile, stat } from 'node:fs/promises'
import { resolve } from 'node:path'
import { z } from 'zod'
import { writeFileAtomic } from './atomic-write'

export const MAX_RECENT_FILES = 10

const storedRecentFiles = z.object({
  version: z.literal(1),
  files: z.array(z.string().min(1).max(4096)),
})

export interface RecentFilesStorage {
  /** The stored text, or null when there is none yet. */
  readonly read: () => Promise<string | null>
  readonly write: (text: string) => Promise<void>
  readonly exists: (path: string) => Promise<boolean>
}

export interface RecentFiles {
  /** The list with missing files dropped (and the drop persisted). */
  list(): Promise<string[]>
  /** Puts `path` first. */
  add(path: string): Promise<string[]>
  /** True when `path` is on the list (the only files Open recent may read). */
  has(path: string): Promise<boolean>
  clear(): Promise<void>
}

/** Same file, same key: absolute and normalised; case-folded where the file system ignores case. */
export function recentFileKey(path: string, platform: NodeJS.Platform = process.platform): string {
  const absolute = resolve(path)
  return platform === 'win32' || platform === 'darwin' ? absolute.toLowerCase() : absolute
}

/** Puts `path` first, removes its duplicates, keeps at most MAX_RECENT_FILES. */
export function withRecentFile(list: readonly string[], path: string, platform: NodeJS.Platform = process.platform): string[] {
  const key = recentFileKey(path, platform)
  return [resolve(path), ...list.filter((entry) => recentFileKey(entry, platform) !== key)].slice(0, MAX_RECENT_FILES)
}

export function createRecentFiles(storage: RecentFilesStorage, platform: NodeJS.Platform = process.platform): RecentFiles {
  let cache: string[] | null = null

  async function load(): Promise<string[]> {
    if (cache !== null) return cache
    const text = await storage.read().catch(() => null)
    let files: string[] = []
    if (text !== null) {
      try {
        const parsed = storedRecentFiles.safeParse(JSON.parse(text))
        // A damaged list is not worth an error: start a fresh one.
        if (parsed.success) files = parsed.data.files
      } catch {
        files = []
      }
    }
    cache = files.reduceRight<string[]>((list, path) => withRecentFile(list, path, platform), [])
    return cache
  }

  async function store(files: string[]): Promise<void> {
    cache = files
    await storage.write(JSON.stringify({ version: 1, files }, null, 2))
  }

  return {
    async list() {
      const files = await load()
      const present = await Promise.all(files.map((path) => storage.exists(path)))
      const kept = files.filter((_, index) => present[index])
      if (kept.length !== files.length) await store(kept)
      return [...kept]
    },
    async add(path) {
      const files = withRecentFile(await load(), path, platform)
      await store(files)
      return [...files]
    },
    async has(path) {
      const key = recentFileKey(path, platform)
      return (await load()).some((entry) => recentFileKey(entry, platform) === key)
    },
    async clear() {
      await store([])
    },
  }
}

/** The list kept in a JSON file (in the user-data folder), written atomically. */
export function recentFilesInFile(storePath: string): RecentFilesStorage {
  return {
    async read() {
      try {
        return await readFile(storePath, 'utf8')
      } catch (error) {
        if ((error as { code?: unknown }).code === 'ENOENT') return null
        throw error
      }
    },
    async write(text) {
      await writeFileAtomic(storePath, text)
    },
    async exists(path) {
      try {
        return (await stat(path)).isFile()
      } catch {
        return false
      }
    },
  }
}
