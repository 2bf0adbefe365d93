/**
 * Atomic file replacement: the target is at every instant either its previous content or
 * the complete new content, never a mix. Steps: write a temporary file in the same folder,
 * fsync it, optionally keep the previous file as `<name>.bak` (copied to its own temporary
 * file, fsynced, renamed), rename the temporary file over the target (atomic on POSIX file
 * systems and on NTFS), then fsync the folder so the renames themselves survive a power cut
 * where the platform allows it.
 */
import { randomBytes } from 'node:crypto'
import { constants as fsConstants } from 'node:fs'
import { copyFile, open, readdir, realpath, rename, stat, unlink } from 'node:fs/promises'
import { basename, dirname, join } from 'node:path'

/** Test seams to stop the write at a chosen moment (the crash test kills the process there). */
export interface AtomicWriteHooks {
  /** After each chunk of the temporary file is written (before it is synced). */
  readonly chunkWritten?: (info: { tempPath: string; bytesWritten: number; totalBytes: number }) => Promise<void> | void
  /** After the temporary file is complete and synced, before the backup and the rename. */
  readonly tempReady?: (info: { tempPath: string }) => Promise<void> | void
}

export interface AtomicWriteOptions {
  /** Keep the file being replaced as `<target>.bak` (itself replaced atomically). */
  readonly keepBackup?: boolean
  readonly hooks?: AtomicWriteHooks
}

const CHUNK_BYTES = 1 << 20
const TEMP_SUFFIX = '.rodwave-tmp'
const RENAME_RETRY_CODES = new Set(['EPERM', 'EACCES', 'EBUSY'])
/** The write in progress per real target path. */
const inFlight = new Map<string, Promise<void>>()

/** `.name.<pid>-<random>.rodwave-tmp`: hidden, and recognisable for clean-up after a crash. */
function tempPathFor(target: string): string {
  return join(dirname(target), `.${basename(target)}.${process.pid}-${randomBytes(6).toString('hex')}${TEMP_SUFFIX}`)
}

export function backupPathFor(target: string): string {
  return `${target}.bak`
}

function errorCode(error: unknown): string | undefined {
  const code = (error as { code?: unknown } | null)?.code
  return typeof code === 'string' ? code : undefined
}

/** Follows a symbolic link so the real file is replaced, not the link. */
async function resolveTarget(target: string): Promise<string> {
  try {
    return await realpath(target)
  } catch (error) {
    if (errorCode(error) === 'ENOENT') return target
    throw error
  }
}

async function existingMode(path: string): Promise<number | undefined> {
  try {
    return (await stat(path)).mode & 0o7777
  } catch (error) {
    if (errorCode(error) === 'ENOENT') return undefined
    throw error
  }
}

async function writeAndSync(path: string, data: Uint8Array, mode: number | undefined, hooks: AtomicWriteHooks | undefined): Promise<void> {
  const handle = await open(path, fsConstants.O_WRONLY | fsConstants.O_CREAT | fsConstants.O_EXCL, 0o666)
  try {
    // The replacement keeps the permissions of the file it replaces (open's mode is masked by umask).
    if (mode !== undefined) await handle.chmod(mode)
    let offset = 0
    while (offset < data.byteLength) {
      const end = Math.min(offset + CHUNK_BYTES, data.byteLength)
      const { bytesWritten } = await handle.write(data, offset, end - offset)
      offset += bytesWritten
      await hooks?.chunkWritten?.({ tempPath: path, bytesWritten: offset, totalBytes: data.byteLength })
    }
    await handle.sync()
  } finally {
    await handle.close()
  }
}

/** Windows refuses a rename while another program (an indexer, a virus scanner) holds the file; retry briefly. */
async function renameWithRetry(from: string, to: string): Promise<void> {
  for (let attempt = 0; ; attempt += 1) {
    try {
      await rename(from, to)
      return
    } catch (error) {
      const code = errorCode(error)
      if (attempt >= 5 || code === undefined || !RENAME_RETRY_CODES.has(code)) throw error
      await new Promise((done) => setTimeout(done, 20 * 2 ** attempt))
    }
  }
}

/** Makes the rename durable; folders cannot be opened for fsync on Windows, which is fine there. */
async function syncFolder(folder: string): Promise<void> {
  let handle
  try {
    handle = await open(folder, 'r')
    await handle.sync()
  } catch (error) {
    const code = errorCode(error)
    if (code !== 'EISDIR' && code !== 'EPERM' && code !== 'EINVAL' && code !== 'EACCES' && code !== 'EBADF') throw error
  } finally {
    await handle?.close()
  }
}

async function removeQuietly(path: string): Promise<void> {
  try {
    await unlink(path)
  } catch {
    // Already gone, or not ours to remove: nothing to do.
  }
}

function isLiveProcess(pid: number): boolean {
  try {
    process.kill(pid, 0)
    return true
  } catch (error) {
    return errorCode(error) === 'EPERM'
  }
}

/**
 * Removes temporary files that an interrupted save of the same target (or of its backup)
 * left behind: ours (saves are serialised per target, so none is in flight) and those of
 * processes that no longer run.
 */
async function removeStaleTemps(target: string): Promise<void> {
  const prefix = `.${basename(target)}.`
  let names: string[]
  try {
    names = await readdir(dirname(target))
  } catch {
    return
  }
  const stale = names.filter((name) => {
    if (!name.startsWith(prefix) || !name.endsWith(TEMP_SUFFIX)) return false
    const pid = Number(/\.(\d+)-[0-9a-f]+\.rodwave-tmp$/.exec(name)?.[1])
    return Number.isInteger(pid) && (pid === process.pid || !isLiveProcess(pid))
  })
  await Promise.all(stale.map((name) => removeQuietly(join(dirname(target), name))))
}

/** Flushes a file's content to the disk, so a rename that follows never exposes an empty file after a power cut. */
async function syncFile(path: string): Promise<void> {
  const handle = await open(path, 'r+')
  try {
    await handle.sync()
  } finally {
    await handle.close()
  }
}

/**
 * Copies the current target to `<target>.bak` through its own temporary file, flushed to the
 * disk like the target's, so the backup is never partial or empty either.
 */
async function keepBackupOf(target: string): Promise<void> {
  const backup = backupPathFor(target)
  const temp = tempPathFor(backup)
  try {
    await copyFile(target, temp, fsConstants.COPYFILE_EXCL)
    await syncFile(temp)
    await renameWithRetry(temp, backup)
  } catch (error) {
    await removeQuietly(temp)
    throw error
  }
}

/**
 * Replaces `target` with `data` atomically; returns the path actually written (the real
 * file when `target` is a symbolic link). On failure the target is untouched and the
 * temporary file is removed.
 */
export async function writeFileAtomic(target: string, data: string | Uint8Array, options: AtomicWriteOptions = {}): Promise<string> {
  const realTarget = await resolveTarget(target)
  // One write per target at a time, so a second save never races the first one's rename.
  const previous = inFlight.get(realTarget) ?? Promise.resolve()
  const current = previous.catch(() => undefined).then(() => replaceFile(realTarget, data, options))
  const settled = current.then(
    () => undefined,
    () => undefined,
  )
  inFlight.set(realTarget, settled)
  try {
    await current
  } finally {
    if (inFlight.get(realTarget) === settled) inFlight.delete(realTarget)
  }
  return realTarget
}

async function replaceFile(realTarget: string, data: string | Uint8Array, options: AtomicWriteOptions): Promise<void> {
  const bytes = typeof data === 'string' ? new TextEncoder().encode(data) : data
  const previousMode = await existingMode(realTarget)
  const temp = tempPathFor(realTarget)
  try {
    await writeAndSync(temp, bytes, previousMode, options.hooks)
    await options.hooks?.tempReady?.({ tempPath: temp })
    if (options.keepBackup === true && previousMode !== undefined) await keepBackupOf(realTarget)
    await renameWithRetry(temp, realTarget)
  } catch (error) {
    await removeQuietly(temp)
    throw error
  }
  await syncFolder(dirname(realTarget))
  await removeStaleTemps(realTarget)
}
