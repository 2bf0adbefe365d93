/**
 * Report → PDF: the hidden window prints A4 with backgrounds, the report cannot reach the
 * network, the window and its temporary copy of the report are gone afterwards, and the
 * bytes are written atomically by the export handler.
 */
import { mkdir, mkdtemp, readdir, readFile, rm } from 'node:fs/promises'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { pathToFileURL } from 'node:url'
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import type { BrowserWindowConstructorOptions, PrintToPDFOptions } from 'electron'
import { createFileHandlers } from '../../electron/file-handlers'
import { PDF_PRINT_OPTIONS, renderReportPdf, type PdfWindow } from '../../electron/pdf-export'
import { createRecentFiles, recentFilesInFile } from '../../electron/recent-files'

vi.mock('electron', () => ({}))

let folder: string
let tempRoot: string
beforeEach(async () => {
  folder = await mkdtemp(join(tmpdir(), 'rodwave-pdf-test-'))
  tempRoot = join(folder, 'tmp')
  await mkdir(tempRoot)
})
afterEach(async () => {
  await rm(folder, { recursive: true, force: true })
})

type Listener = (details: { url: string }, callback: (response: { cancel: boolean }) => void) => void

/** A BrowserWindow stand-in that records what the exporter does with it. */
function fakePdfWindow(pdf: Uint8Array, options: { printFails?: boolean; events?: string[]; slowLoad?: boolean } = {}) {
  const record = {
    options: null as BrowserWindowConstructorOptions | null,
    loadedPath: null as string | null,
    loadedHtml: null as string | null,
    printOptions: null as PrintToPDFOptions | null,
    requestFilter: null as Listener | null,
    destroyed: false,
  }
  const createWindow = (windowOptions: BrowserWindowConstructorOptions): PdfWindow => {
    record.options = windowOptions
    return {
      async loadFile(path) {
        record.loadedPath = path
        record.loadedHtml = await readFile(path, 'utf8')
        options.events?.push(`load ${record.loadedHtml}`)
        // A slow layout leaves room for a second print to start, were prints not queued.
        if (options.slowLoad) await new Promise((done) => setTimeout(done, 50))
      },
      webContents: {
        async printToPDF(printOptions) {
          record.printOptions = printOptions
          if (options.printFails) throw new Error('printing failed')
          return pdf
        },
        session: {
          webRequest: {
            onBeforeRequest(listener) {
              record.requestFilter = listener
            },
          },
        },
      },
      destroy() {
        record.destroyed = true
        options.events?.push('destroy')
      },
      isDestroyed() {
        return record.destroyed
      },
    }
  }
  return { record, createWindow }
}

const REPORT = '<!doctype html><html><body><h1>Modal summary</h1><svg viewBox="0 0 10 10"><path d="M0 0L10 10"/></svg></body></html>'

describe('renderReportPdf', () => {
  it('prints the report on A4 with backgrounds and 15 mm margins, returning the printer’s bytes', async () => {
    const pdf = new TextEncoder().encode('%PDF-1.7')
    const { record, createWindow } = fakePdfWindow(pdf)
    const bytes = await renderReportPdf(REPORT, { createWindow, tempRoot })
    expect(bytes).toBe(pdf)
    expect(record.printOptions).toEqual(PDF_PRINT_OPTIONS)
    expect(record.printOptions!.pageSize).toBe('A4')
    expect(record.printOptions!.printBackground).toBe(true)
    // printToPDF takes inches: 15 mm / 25.4 mm per inch.
    expect(record.printOptions!.margins!.top).toBeCloseTo(15 / 25.4, 12)
    expect(record.printOptions!.margins!.left).toBeCloseTo(15 / 25.4, 12)
  })

  it('loads exactly the given HTML into a hidden, sandboxed window without preload or JavaScript', async () => {
    const { record, createWindow } = fakePdfWindow(new Uint8Array([1]))
    await renderReportPdf(REPORT, { createWindow, tempRoot })
    expect(record.loadedHtml).toBe(REPORT)
    expect(record.options!.show).toBe(false)
    expect(record.options!.webPreferences!.javascript).toBe(false)
    expect(record.options!.webPreferences!.sandbox).toBe(true)
    expect(record.options!.webPreferences).not.toHaveProperty('preload')
  })

  it('lets the report load only itself and inline data, never the network', async () => {
    const { record, createWindow } = fakePdfWindow(new Uint8Array([1]))
    await renderReportPdf(REPORT, { createWindow, tempRoot })
    const decide = (url: string) => {
      let cancel: boolean | null = null
      record.requestFilter!({ url }, (response) => {
        cancel = response.cancel
      })
      return cancel
    }
    expect(decide(pathToFileURL(record.loadedPath!).href)).toBe(false)
    expect(decide('data:image/png;base64,AAAA')).toBe(false)
    expect(decide('https://example.com/tracker.png')).toBe(true)
    expect(decide('file:///etc/passwd')).toBe(true)
  })

  it('destroys the window and removes the temporary report, also when printing fails', async () => {
    const ok = fakePdfWindow(new Uint8Array([1]))
    await renderReportPdf(REPORT, { createWindow: ok.createWindow, tempRoot })
    expect(ok.record.destroyed).toBe(true)
    expect(await readdir(tempRoot)).toEqual([])

    const failing = fakePdfWindow(new Uint8Array([1]), { printFails: true })
    await expect(renderReportPdf(REPORT, { createWindow: failing.createWindow, tempRoot })).rejects.toThrow('printing failed')
    expect(failing.record.destroyed).toBe(true)
    expect(await readdir(tempRoot)).toEqual([])
  })

  it('prints one report at a time, each with its own HTML', async () => {
    const events: string[] = []
    const first = fakePdfWindow(new Uint8Array([1]), { events, slowLoad: true })
    const second = fakePdfWindow(new Uint8Array([2]), { events })
    const results = await Promise.all([
      renderReportPdf('<h1>First</h1>', { createWindow: first.createWindow, tempRoot }),
      renderReportPdf('<h1>Second</h1>', { createWindow: second.createWindow, tempRoot }),
    ])
    expect(results.map((bytes) => bytes[0])).toEqual([1, 2])
    // The second report is loaded only after the first window is gone.
    expect(events).toEqual(['load <h1>First</h1>', 'destroy', 'load <h1>Second</h1>', 'destroy'])
    expect(await readdir(tempRoot)).toEqual([])
  })
})

describe('PDF export end to end (mocked window)', () => {
  it('writes the printed bytes to the chosen file atomically, leaving no temporary file', async () => {
    const pdf = new TextEncoder().encode('%PDF-1.7\n% Rodwave report\n%%EOF\n')
    const { record, createWindow } = fakePdfWindow(pdf)
    const out = join(folder, 'out')
    await mkdir(out)
    await mkdir(join(folder, 'user-data'))
    const handlers = createFileHandlers({
      dialogs: {
        showOpenDialog: async () => ({ canceled: true, filePaths: [] }),
        showSaveDialog: async () => ({ canceled: false, filePath: join(out, 'HR-7 report.pdf') }),
      },
      recentFiles: createRecentFiles(recentFilesInFile(join(folder, 'user-data', 'recent.json'))),
      renderPdf: (html) => renderReportPdf(html, { createWindow, tempRoot }),
      demoProjectPath: join(folder, 'none.json'),
      defaultFolder: out,
    })
    const result = await handlers.exportFile({ kind: 'pdf', suggestedName: 'HR-7 report', content: REPORT })
    expect(result).toEqual({ kind: 'saved', path: join(out, 'HR-7 report.pdf'), name: 'HR-7 report.pdf' })
    expect(record.printOptions!.pageSize).toBe('A4')
    expect(new Uint8Array(await readFile(join(out, 'HR-7 report.pdf')))).toEqual(pdf)
    expect(await readdir(out)).toEqual(['HR-7 report.pdf'])
  })
})
