/**
 * Open, save, export and the demo project, with the dialogs and the PDF printer mocked and
 * the real file system in a temporary folder.
 */
import { mkdir, mkdtemp, readdir, readFile, rm, writeFile } from 'node:fs/promises'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { fileURLToPath } from 'node:url'
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import type { OpenDialogOptions, SaveDialogOptions } from 'electron'
import { createFileHandlers, readProjectText, safeFileName, type FileDialogs } from '../../electron/file-handlers'
import { MAX_PROJECT_BYTES } from '../../electron/ipc-validation'
import { decodeProjectBytes } from '../../core/model/project-bytes'
import { createRecentFiles, recentFilesInFile } from '../../electron/recent-files'

vi.mock('electron', () => ({}))

const demoPath = fileURLToPath(new URL('../../examples/condensate-pump-hanger.rodwave.json', import.meta.url))

let folder: string
beforeEach(async () => {
  folder = await mkdtemp(join(tmpdir(), 'rodwave-files-'))
  await mkdir(join(folder, 'user-data'))
})
afterEach(async () => {
  await rm(folder, { recursive: true, force: true })
})

function makeHandlers(overrides: { open?: string[] | null; save?: string | null; renderPdf?: (html: string) => Promise<Uint8Array> } = {}) {
  const dialogs = {
    showOpenDialog: vi.fn(async (_options: OpenDialogOptions) => (overrides.open === null || overrides.open === undefined ? { canceled: true, filePaths: [] } : { canceled: false, filePaths: overrides.open })),
    showSaveDialog: vi.fn(async (_options: SaveDialogOptions) => (overrides.save === null || overrides.save === undefined ? { canceled: true } : { canceled: false, filePath: overrides.save })),
  } satisfies FileDialogs
  const recentFiles = createRecentFiles(recentFilesInFile(join(folder, 'user-data', 'recent-projects.json')))
  const recentFilesChanged = vi.fn()
  const renderPdf = vi.fn(overrides.renderPdf ?? (async () => new Uint8Array([0x25, 0x50, 0x44, 0x46])))
  const handlers = createFileHandlers({ dialogs, recentFiles, renderPdf, demoProjectPath: demoPath, defaultFolder: folder, recentFilesChanged })
  return { handlers, dialogs, recentFiles, recentFilesChanged, renderPdf }
}

describe('open', () => {
  it('reads the chosen file as text and adds it to the recent list', async () => {
    const path = join(folder, 'hanger.rodwave.json')
    await writeFile(path, '{"format":"rodwave","title":"Ø 24 rod"}')
    const { handlers, dialogs, recentFiles, recentFilesChanged } = makeHandlers({ open: [path] })
    expect(await handlers.openProject()).toEqual({ kind: 'opened', path, name: 'hanger.rodwave.json', text: '{"format":"rodwave","title":"Ø 24 rod"}' })
    const options = dialogs.showOpenDialog.mock.calls[0]![0]
    expect(options.filters![0]!.extensions).toEqual(['rodwave.json', 'json'])
    expect(options.properties).toEqual(['openFile'])
    expect(await recentFiles.list()).toEqual([path])
    expect(recentFilesChanged).toHaveBeenCalledWith([path])
  })

  it('reports a cancelled dialog as cancelled', async () => {
    expect(await makeHandlers({ open: null }).handlers.openProject()).toEqual({ kind: 'cancelled' })
  })

  it('refuses a file over 20 MB with a message giving its size and the limit', async () => {
    const path = join(folder, 'huge.rodwave.json')
    await writeFile(path, Buffer.alloc(MAX_PROJECT_BYTES + 1024, 0x20))
    const result = await makeHandlers({ open: [path] }).handlers.openProject()
    expect(result).toEqual({ kind: 'error', message: 'Could not open "huge.rodwave.json": it is 20.0 MB, and Rodwave opens project files up to 20.0 MB.' })
  })

  it('refuses a file that is not UTF-8 text', async () => {
    const path = join(folder, 'binary.json')
    await writeFile(path, Buffer.from([0x7b, 0xff, 0xfe, 0x00, 0x7d]))
    const result = await readProjectText(path)
    expect(result).toEqual({
      kind: 'error',
      message: 'Could not open "binary.json": it is not UTF-8 text (byte 2, line 1 does not start a valid UTF-8 character); save it as UTF-8 and open it again.',
    })
  })

  it('applies core’s one rule for a project file’s bytes (the same as the command line and the browser)', async () => {
    const path = join(folder, 'latin1.rodwave.json')
    const bytes = Buffer.from('{"title":"caf?"}', 'latin1')
    bytes[bytes.indexOf(0x3f)] = 0xe9
    await writeFile(path, bytes)
    const expected = decodeProjectBytes(bytes)
    if (expected.ok) throw new Error('fixture: Latin-1 é must not be UTF-8')
    expect(await readProjectText(path)).toEqual({ kind: 'error', message: `Could not open "latin1.rodwave.json": it ${expected.message}.` })
  })

  it('removes a UTF-8 byte-order mark', async () => {
    const path = join(folder, 'bom.rodwave.json')
    await writeFile(path, '\uFEFF{"format":"rodwave"}')
    expect(await readProjectText(path)).toMatchObject({ kind: 'opened', text: '{"format":"rodwave"}' })
  })

  it('explains a missing file and a folder', async () => {
    expect(await readProjectText(join(folder, 'gone.json'))).toEqual({ kind: 'error', message: 'Could not open "gone.json": the file or its folder no longer exists.' })
    expect(await readProjectText(folder)).toMatchObject({ kind: 'error', message: expect.stringMatching(/it is not a file/) })
  })
})

describe('open recent', () => {
  it('opens a file on the recent list', async () => {
    const path = join(folder, 'a.rodwave.json')
    await writeFile(path, '{}')
    const { handlers, recentFiles } = makeHandlers()
    await recentFiles.add(path)
    expect(await handlers.openRecent(path)).toMatchObject({ kind: 'opened', path, text: '{}' })
  })

  it('refuses a path that is not on the list, without reading it', async () => {
    const secret = join(folder, 'not-opened-before.json')
    await writeFile(secret, 'secret')
    const result = await makeHandlers().handlers.openRecent(secret)
    expect(result).toEqual({ kind: 'error', message: 'Could not open "not-opened-before.json": it is not on the recent-files list. Use Open… to choose it.' })
  })

  it('reports a recent file that has disappeared and drops it from the list', async () => {
    const path = join(folder, 'moved.rodwave.json')
    await writeFile(path, '{}')
    const { handlers, recentFiles, recentFilesChanged } = makeHandlers()
    await recentFiles.add(path)
    await rm(path)
    expect(await handlers.openRecent(path)).toMatchObject({ kind: 'error', message: expect.stringMatching(/no longer exists/) })
    expect(recentFilesChanged).toHaveBeenLastCalledWith([])
  })
})

describe('save', () => {
  it('asks where to save when there is no path, adds the extension, and writes the text', async () => {
    const chosen = join(folder, 'Hanger HR-7')
    const { handlers, dialogs, recentFiles } = makeHandlers({ save: chosen })
    const result = await handlers.saveProject({ path: null, suggestedName: 'Hanger HR-7', text: '{"v":1}' })
    expect(result).toEqual({ kind: 'saved', path: `${chosen}.rodwave.json`, name: 'Hanger HR-7.rodwave.json' })
    expect(await readFile(`${chosen}.rodwave.json`, 'utf8')).toBe('{"v":1}')
    const options = dialogs.showSaveDialog.mock.calls[0]![0]
    expect(options.defaultPath).toBe(join(folder, 'Hanger HR-7.rodwave.json'))
    expect(await recentFiles.list()).toEqual([`${chosen}.rodwave.json`])
  })

  it('saves again to a file chosen before without asking, keeping the previous version as .bak', async () => {
    const target = join(folder, 'pump.rodwave.json')
    const { handlers, dialogs } = makeHandlers({ save: target })
    await handlers.saveProject({ path: null, suggestedName: 'pump', text: 'version 1' })
    await handlers.saveProject({ path: target, suggestedName: 'pump', text: 'version 2' })
    expect(dialogs.showSaveDialog).toHaveBeenCalledOnce()
    expect(await readFile(target, 'utf8')).toBe('version 2')
    expect(await readFile(`${target}.bak`, 'utf8')).toBe('version 1')
    expect((await readdir(folder)).sort()).toEqual(['pump.rodwave.json', 'pump.rodwave.json.bak', 'user-data'])
  })

  it('asks before writing to a path the user never chose, suggesting that path', async () => {
    const elsewhere = join(folder, 'elsewhere.rodwave.json')
    await writeFile(elsewhere, 'someone else’s file')
    const { handlers, dialogs } = makeHandlers({ save: null })
    expect(await handlers.saveProject({ path: elsewhere, suggestedName: 'x', text: 'overwrite?' })).toEqual({ kind: 'cancelled' })
    expect(dialogs.showSaveDialog.mock.calls[0]![0].defaultPath).toBe(elsewhere)
    expect(await readFile(elsewhere, 'utf8')).toBe('someone else’s file')
  })

  it('reports a failed write with the file name and leaves the old file as it was', async () => {
    const target = join(folder, 'no-such-folder', 'x.rodwave.json')
    const result = await makeHandlers({ save: target }).handlers.saveProject({ path: null, suggestedName: 'x', text: '{}' })
    expect(result).toEqual({ kind: 'error', message: 'Could not save "x.rodwave.json": the file or its folder no longer exists.' })
  })
})

describe('export', () => {
  it('writes CSV with a UTF-8 byte-order mark so spreadsheets read the units correctly', async () => {
    const { handlers } = makeHandlers({ save: join(folder, 'modes') })
    const result = await handlers.exportFile({ kind: 'csv', suggestedName: 'modes', content: 'mode,f [Hz]\n1,42.5\n' })
    expect(result).toEqual({ kind: 'saved', path: join(folder, 'modes.csv'), name: 'modes.csv' })
    expect(await readFile(join(folder, 'modes.csv'), 'utf8')).toBe('\uFEFFmode,f [Hz]\n1,42.5\n')
  })

  it('writes the HTML report unchanged', async () => {
    const html = '<!doctype html><h1>Report</h1><svg></svg>'
    const { handlers } = makeHandlers({ save: join(folder, 'report.html') })
    await handlers.exportFile({ kind: 'html', suggestedName: 'report', content: html })
    expect(await readFile(join(folder, 'report.html'), 'utf8')).toBe(html)
  })

  it('renders the PDF from the report HTML and writes its bytes', async () => {
    const pdfBytes = new TextEncoder().encode('%PDF-1.7 test bytes')
    const { handlers, renderPdf } = makeHandlers({ save: join(folder, 'report.pdf'), renderPdf: async () => pdfBytes })
    const result = await handlers.exportFile({ kind: 'pdf', suggestedName: 'report', content: '<h1>Report</h1>' })
    expect(renderPdf).toHaveBeenCalledExactlyOnceWith('<h1>Report</h1>')
    expect(result).toMatchObject({ kind: 'saved', name: 'report.pdf' })
    expect(new Uint8Array(await readFile(join(folder, 'report.pdf')))).toEqual(pdfBytes)
  })

  it('reports a PDF that could not be made, writing nothing', async () => {
    const { handlers } = makeHandlers({ save: join(folder, 'report.pdf'), renderPdf: async () => Promise.reject(new Error('the report did not finish loading for printing')) })
    const result = await handlers.exportFile({ kind: 'pdf', suggestedName: 'report', content: '<h1>Report</h1>' })
    expect(result).toEqual({ kind: 'error', message: 'Could not make the PDF: the report did not finish loading for printing.' })
    expect(await readdir(folder)).toEqual(['user-data'])
  })

  it('exports go through a dialog every time and do not enter the recent list', async () => {
    const { handlers, dialogs, recentFiles } = makeHandlers({ save: null })
    expect(await handlers.exportFile({ kind: 'csv', suggestedName: 'modes', content: 'a' })).toEqual({ kind: 'cancelled' })
    expect(dialogs.showSaveDialog).toHaveBeenCalledOnce()
    expect(await recentFiles.list()).toEqual([])
  })
})

describe('demo project', () => {
  it('returns the bundled example, byte for byte', async () => {
    const demo = await makeHandlers().handlers.demoProject()
    expect(demo).toEqual({ name: 'condensate-pump-hanger.rodwave.json', text: await readFile(demoPath, 'utf8') })
  })
})

describe('file names', () => {
  it('removes characters file systems refuse and never returns an empty name', () => {
    expect(safeFileName('Rod 3/4" <A>: pump?')).toBe('Rod 3 4 A pump')
    expect(safeFileName('  ...  ')).toBe('Untitled project')
    expect(safeFileName('..\\..\\evil')).toBe('evil')
  })
})
