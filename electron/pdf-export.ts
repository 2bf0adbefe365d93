/**
 * Report → PDF: the report's static HTML (with inline SVG charts) is laid out in a hidden,
 * sandboxed window with JavaScript off, printed with Chromium's PDF printer on A4, and the
 * window is destroyed. The page is loaded from a private temporary file because a data:
 * URL is capped at 2 MB by Chromium, and a report with charts can be larger.
 */
import { mkdtemp, rm, writeFile } from 'node:fs/promises'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { pathToFileURL } from 'node:url'
import type { BrowserWindowConstructorOptions, PrintToPDFOptions } from 'electron'
import { pdfWindowOptions } from './window-options'

const MILLIMETRES_PER_INCH = 25.4
/** printToPDF takes margins in inches. */
const PAGE_MARGIN_INCHES = 15 / MILLIMETRES_PER_INCH

export const PDF_PRINT_OPTIONS: PrintToPDFOptions = {
  pageSize: 'A4',
  printBackground: true,
  landscape: false,
  margins: { top: PAGE_MARGIN_INCHES, bottom: PAGE_MARGIN_INCHES, left: PAGE_MARGIN_INCHES, right: PAGE_MARGIN_INCHES },
}

const LOAD_TIMEOUT_MS = 60_000

type BeforeRequestListener = (details: { url: string }, callback: (response: { cancel: boolean }) => void) => void

/** What the exporter needs of a BrowserWindow. */
export interface PdfWindow {
  loadFile(path: string): Promise<void>
  readonly webContents: {
    printToPDF(options: PrintToPDFOptions): Promise<Uint8Array>
    readonly session: { readonly webRequest: { onBeforeRequest(listener: BeforeRequestListener): void } }
  }
  destroy(): void
  isDestroyed(): boolean
}

export interface PdfExportDeps {
  readonly createWindow: (options: BrowserWindowConstructorOptions) => PdfWindow
  /** Folder for the private temporary copy of the report; defaults to the system's. */
  readonly tempRoot?: string
}

/** Only the report itself and inline data may load: a report must never reach the network. */
function allowOnly(reportUrl: string): BeforeRequestListener {
  return (details, callback) => {
    const url = details.url
    callback({ cancel: !(url === reportUrl || url.startsWith('data:') || url.startsWith('blob:') || url === 'about:blank') })
  }
}

function withTimeout<T>(promise: Promise<T>, milliseconds: number, message: string): Promise<T> {
  let timer: ReturnType<typeof setTimeout> | undefined
  const timeout = new Promise<never>((_, reject) => {
    timer = setTimeout(() => reject(new Error(message)), milliseconds)
  })
  return Promise.race([promise, timeout]).finally(() => clearTimeout(timer))
}

/** The PDF session has one request filter at a time, so prints run one after another. */
let printQueue: Promise<unknown> = Promise.resolve()

export function renderReportPdf(html: string, deps: PdfExportDeps): Promise<Uint8Array> {
  const result = printQueue.catch(() => undefined).then(() => printOnce(html, deps))
  printQueue = result
  return result
}

async function printOnce(html: string, deps: PdfExportDeps): Promise<Uint8Array> {
  const folder = await mkdtemp(join(deps.tempRoot ?? tmpdir(), 'rodwave-pdf-'))
  const reportPath = join(folder, 'report.html')
  let window: PdfWindow | null = null
  try {
    await writeFile(reportPath, html, { encoding: 'utf8', mode: 0o600 })
    window = deps.createWindow(pdfWindowOptions())
    window.webContents.session.webRequest.onBeforeRequest(allowOnly(pathToFileURL(reportPath).href))
    await withTimeout(window.loadFile(reportPath), LOAD_TIMEOUT_MS, 'the report did not finish loading for printing')
    return await window.webContents.printToPDF(PDF_PRINT_OPTIONS)
  } finally {
    if (window !== null && !window.isDestroyed()) window.destroy()
    await rm(folder, { recursive: true, force: true })
  }
}
