/** Recent projects: most recent first, no duplicates, at most ten, missing files dropped, persisted. */
import { mkdir, mkdtemp, readFile, rm, unlink, writeFile } from 'node:fs/promises'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { createRecentFiles, MAX_RECENT_FILES, recentFileKey, recentFilesInFile, withRecentFile } from '../../electron/recent-files'

vi.mock('electron', () => ({}))

let folder: string
let store: string
beforeEach(async () => {
  folder = await mkdtemp(join(tmpdir(), 'rodwave-recent-'))
  store = join(folder, 'user-data', 'recent-projects.json')
  await mkdir(join(folder, 'user-data'))
})
afterEach(async () => {
  await rm(folder, { recursive: true, force: true })
})

async function projectFiles(count: number): Promise<string[]> {
  const paths = Array.from({ length: count }, (_, index) => join(folder, `project-${index}.rodwave.json`))
  await Promise.all(paths.map((path) => writeFile(path, '{}')))
  return paths
}

describe('recent projects list', () => {
  it('puts the latest first and moves a reopened file to the front without duplicating it', async () => {
    const [a, b, c] = await projectFiles(3)
    const recent = createRecentFiles(recentFilesInFile(store))
    await recent.add(a!)
    await recent.add(b!)
    await recent.add(c!)
    expect(await recent.list()).toEqual([c, b, a])
    await recent.add(a!)
    expect(await recent.list()).toEqual([a, c, b])
  })

  it('keeps at most ten, dropping the oldest', async () => {
    const paths = await projectFiles(13)
    const recent = createRecentFiles(recentFilesInFile(store))
    for (const path of paths) await recent.add(path)
    const list = await recent.list()
    expect(list).toHaveLength(MAX_RECENT_FILES)
    expect(list).toEqual(paths.slice(3).reverse())
  })

  it('drops files that no longer exist, and remembers that', async () => {
    const [a, b, c] = await projectFiles(3)
    const recent = createRecentFiles(recentFilesInFile(store))
    for (const path of [a!, b!, c!]) await recent.add(path)
    await unlink(b!)
    expect(await recent.list()).toEqual([c, a])
    const stored = JSON.parse(await readFile(store, 'utf8')) as { files: string[] }
    expect(stored.files).toEqual([c, a])
  })

  it('survives a restart: a new instance reads the same list from the file', async () => {
    const [a, b] = await projectFiles(2)
    await createRecentFiles(recentFilesInFile(store)).add(a!)
    await createRecentFiles(recentFilesInFile(store)).add(b!)
    const reopened = createRecentFiles(recentFilesInFile(store))
    expect(await reopened.list()).toEqual([b, a])
    expect(await reopened.has(a!)).toBe(true)
    expect(await reopened.has(join(folder, 'never-opened.json'))).toBe(false)
  })

  it('starts empty from a damaged or foreign file instead of failing', async () => {
    await writeFile(store, '{ this is not json')
    expect(await createRecentFiles(recentFilesInFile(store)).list()).toEqual([])
    await writeFile(store, JSON.stringify({ version: 1, files: [42] }))
    expect(await createRecentFiles(recentFilesInFile(store)).list()).toEqual([])
  })

  it('removes duplicates found in the stored file, keeping the most recent position', async () => {
    const [a, b] = await projectFiles(2)
    await writeFile(store, JSON.stringify({ version: 1, files: [a, b, a] }))
    expect(await createRecentFiles(recentFilesInFile(store)).list()).toEqual([a, b])
  })

  it('clears the list', async () => {
    const [a] = await projectFiles(1)
    const recent = createRecentFiles(recentFilesInFile(store))
    await recent.add(a!)
    await recent.clear()
    expect(await createRecentFiles(recentFilesInFile(store)).list()).toEqual([])
  })
})

describe('same file, same entry', () => {
  it('treats paths that differ only in letter case as one file on Windows and macOS, not on Linux', () => {
    expect(recentFileKey('/Users/Eng/Pump.rodwave.json', 'darwin')).toBe(recentFileKey('/users/eng/pump.rodwave.json', 'darwin'))
    expect(recentFileKey('/home/eng/Pump.rodwave.json', 'linux')).not.toBe(recentFileKey('/home/eng/pump.rodwave.json', 'linux'))
    expect(withRecentFile(['/Users/Eng/Pump.rodwave.json'], '/users/eng/pump.rodwave.json', 'darwin')).toEqual(['/users/eng/pump.rodwave.json'])
  })

  it('normalises the path before comparing', () => {
    expect(withRecentFile(['/home/eng/a.rodwave.json'], '/home/eng/./x/../a.rodwave.json', 'linux')).toEqual(['/home/eng/a.rodwave.json'])
  })
})
