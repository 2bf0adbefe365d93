/**
 * What the window's file requests do: open (dialog, recent list), save (atomic, with a
 * backup), export (CSV, HTML, PDF) and the demo project. Electron's dialogs and the PDF
 * printer come in as parameters, so all of this runs in tests without Electron.
 *
 * The window is not trusted to name files: it may read a file only when the user chose it
 * in a dialog or it is on the recent list, and write over one only when the user chose it
 * in this session or it is on the recent list; anything else goes through a save dialog.
 */
import { readFile, stat } from 'node:fs/promises'
import { basename, dirname, join } from 'node:path'
import type { OpenDialogOptions, SaveDialogOptions } from 'electron'
import { decodeProjectBytes } from '../core/model/project-bytes'
import { writeFileAtomic } from './atomic-write'
import type { ExportKind, ExportRequest, SaveRequest, SaveResult, TextOpenResult } from './ipc-contract'
import { MAX_PROJECT_BYTES, formatMegabytes } from './ipc-validation'
import { recentFileKey, type RecentFiles } from './recent-files'

export const PROJECT_EXTENSION = '.rodwave.json'

export interface FileDialogs {
  showOpenDialog(options: OpenDialogOptions): Promise<{ canceled: boolean; filePaths: string[] }>
  showSaveDialog(options: SaveDialogOptions): Promise<{ canceled: boolean; filePath?: string }>
}

export interface FileHandlerDeps {
  readonly dialogs: FileDialogs
  readonly recentFiles: RecentFiles
  /** Lays out the report HTML and prints it to PDF bytes. */
  readonly renderPdf: (html: string) => Promise<Uint8Array>
  /** The bundled example opened at start-up. */
  readonly demoProjectPath: string
  /** Where dialogs open before the user has picked a folder (the Documents folder). */
  readonly defaultFolder: string
  /** Called after the recent list changed (the menu lists it). */
  readonly recentFilesChanged?: (files: string[]) => void
  readonly platform?: NodeJS.Platform
}

export interface FileHandlers {
  openProject(): Promise<TextOpenResult>
  openRecent(path: string): Promise<TextOpenResult>
  saveProject(request: SaveRequest): Promise<SaveResult>
  exportFile(request: ExportRequest): Promise<SaveResult>
  demoProject(): Promise<{ name: string; text: string }>
}

const PROJECT_FILTERS = [
  { name: 'Rodwave project', extensions: ['rodwave.json', 'json'] },
  { name: 'All files', extensions: ['*'] },
]

const EXPORT_FORMATS: Readonly<Record<ExportKind, { extension: string; filter: { name: string; extensions: string[] }; title: string }>> = {
  csv: { extension: '.csv', filter: { name: 'Modal summary (CSV)', extensions: ['csv'] }, title: 'Export the modal summary' },
  html: { extension: '.html', filter: { name: 'Report (HTML)', extensions: ['html', 'htm'] }, title: 'Export the report as HTML' },
  pdf: { extension: '.pdf', filter: { name: 'Report (PDF)', extensions: ['pdf'] }, title: 'Export the report as PDF' },
}

/** A spreadsheet reads UTF-8 CSV correctly only when the file starts with a byte-order mark (common practice, no source). */
const UTF8_BOM = '\uFEFF'

function errorCode(error: unknown): string | undefined {
  const code = (error as { code?: unknown } | null)?.code
  return typeof code === 'string' ? code : undefined
}

/** A sentence about a file-system failure, without internals. */
export function describeFileError(error: unknown, action: string, path: string): string {
  const name = `"${basename(path)}"`
  switch (errorCode(error)) {
    case 'ENOENT':
      return `Could not ${action} ${name}: the file or its folder no longer exists.`
    case 'EACCES':
    case 'EPERM':
      return `Could not ${action} ${name}: permission denied.`
    case 'EISDIR':
      return `Could not ${action} ${name}: it is a folder, not a file.`
    case 'ENOSPC':
      return `Could not ${action} ${name}: the disk is full. The previous file is unchanged.`
    case 'EROFS':
      return `Could not ${action} ${name}: the disk is read-only.`
    case 'EBUSY':
      return `Could not ${action} ${name}: another program is using it.`
    default:
      return `Could not ${action} ${name}: ${error instanceof Error ? error.message : String(error)}`
  }
}

/** A file name the user's file system accepts, from whatever the window suggested. */
export function safeFileName(suggested: string, fallback = 'Untitled project'): string {
  const cleaned = suggested
    .replace(/[\p{Cc}<>:"/\\|?*]+/gu, ' ')
    .replace(/\s+/g, ' ')
    .replace(/^[.\s]+|[.\s]+$/g, '')
  return cleaned === '' ? fallback : cleaned.slice(0, 200)
}

function withExtension(name: string, extension: string, accepted: readonly string[] = [extension]): string {
  const lower = name.toLowerCase()
  return accepted.some((ending) => lower.endsWith(ending)) ? name : `${name}${extension}`
}

/** Reads a project file as text: at most 20 MB, by the one rule for a project file's bytes (core/model/project-bytes). */
export async function readProjectText(path: string): Promise<TextOpenResult> {
  const name = basename(path)
  try {
    const info = await stat(path)
    if (!info.isFile()) return { kind: 'error', message: `Could not open "${name}": it is not a file.` }
    const tooLarge = (size: number): TextOpenResult => ({
      kind: 'error',
      message: `Could not open "${name}": it is ${formatMegabytes(size)}, and Rodwave opens project files up to ${formatMegabytes(MAX_PROJECT_BYTES)}.`,
    })
    if (info.size > MAX_PROJECT_BYTES) return tooLarge(info.size)
    const bytes = await readFile(path)
    if (bytes.byteLength > MAX_PROJECT_BYTES) return tooLarge(bytes.byteLength)
    const decoded = decodeProjectBytes(bytes)
    if (!decoded.ok) return { kind: 'error', message: `Could not open "${name}": it ${decoded.message}.` }
    return { kind: 'opened', path, name, text: decoded.text }
  } catch (error) {
    return { kind: 'error', message: describeFileError(error, 'open', path) }
  }
}

export function createFileHandlers(deps: FileHandlerDeps): FileHandlers {
  const platform = deps.platform ?? process.platform
  /** Files the user picked in a dialog during this session (keys as in the recent list). */
  const chosenByUser = new Set<string>()
  let lastFolder: string | null = null

  const key = (path: string) => recentFileKey(path, platform)

  async function remember(path: string): Promise<void> {
    chosenByUser.add(key(path))
    lastFolder = dirname(path)
    const files = await deps.recentFiles.add(path)
    deps.recentFilesChanged?.(files)
  }

  async function mayWrite(path: string): Promise<boolean> {
    return chosenByUser.has(key(path)) || (await deps.recentFiles.has(path))
  }

  function dialogFolder(): string {
    return lastFolder ?? deps.defaultFolder
  }

  async function askWhereToSave(options: SaveDialogOptions): Promise<string | null> {
    const answer = await deps.dialogs.showSaveDialog(options)
    return answer.canceled || answer.filePath === undefined || answer.filePath === '' ? null : answer.filePath
  }

  async function openChosen(path: string): Promise<TextOpenResult> {
    const result = await readProjectText(path)
    if (result.kind === 'opened') await remember(path)
    return result
  }

  return {
    async openProject() {
      const answer = await deps.dialogs.showOpenDialog({
        title: 'Open a Rodwave project',
        defaultPath: dialogFolder(),
        properties: ['openFile'],
        filters: PROJECT_FILTERS,
      })
      const path = answer.filePaths[0]
      if (answer.canceled || path === undefined) return { kind: 'cancelled' }
      return openChosen(path)
    },

    async openRecent(path) {
      if (!(await deps.recentFiles.has(path))) {
        return { kind: 'error', message: `Could not open "${basename(path)}": it is not on the recent-files list. Use Open… to choose it.` }
      }
      const result = await openChosen(path)
      // A file that has gone away leaves the list (list() drops missing files).
      if (result.kind === 'error') deps.recentFilesChanged?.(await deps.recentFiles.list())
      return result
    },

    async saveProject(request) {
      let path = request.path
      if (path === null || !(await mayWrite(path))) {
        const suggested = path ?? join(dialogFolder(), withExtension(safeFileName(request.suggestedName), PROJECT_EXTENSION, [PROJECT_EXTENSION, '.json']))
        const chosen = await askWhereToSave({
          title: 'Save the Rodwave project',
          defaultPath: suggested,
          filters: PROJECT_FILTERS.slice(0, 1),
          properties: ['createDirectory', 'showOverwriteConfirmation'],
        })
        if (chosen === null) return { kind: 'cancelled' }
        path = withExtension(chosen, PROJECT_EXTENSION, [PROJECT_EXTENSION, '.json'])
      }
      try {
        await writeFileAtomic(path, request.text, { keepBackup: true })
      } catch (error) {
        return { kind: 'error', message: describeFileError(error, 'save', path) }
      }
      await remember(path)
      return { kind: 'saved', path, name: basename(path) }
    },

    async exportFile(request) {
      const format = EXPORT_FORMATS[request.kind]
      const chosen = await askWhereToSave({
        title: format.title,
        defaultPath: join(dialogFolder(), withExtension(safeFileName(request.suggestedName, 'Rodwave export'), format.extension)),
        filters: [format.filter],
        properties: ['createDirectory', 'showOverwriteConfirmation'],
      })
      if (chosen === null) return { kind: 'cancelled' }
      const path = withExtension(chosen, format.extension, [format.extension, ...format.filter.extensions.map((extension) => `.${extension}`)])
      let data: string | Uint8Array
      try {
        if (request.kind === 'pdf') data = await deps.renderPdf(request.content)
        else if (request.kind === 'csv') data = request.content.startsWith(UTF8_BOM) ? request.content : UTF8_BOM + request.content
        else data = request.content
      } catch (error) {
        return { kind: 'error', message: `Could not make the PDF: ${error instanceof Error ? error.message : String(error)}.` }
      }
      try {
        await writeFileAtomic(path, data)
      } catch (error) {
        return { kind: 'error', message: describeFileError(error, 'export', path) }
      }
      lastFolder = dirname(path)
      return { kind: 'saved', path, name: basename(path) }
    },

    async demoProject() {
      const result = await readProjectText(deps.demoProjectPath)
      if (result.kind !== 'opened') {
        throw new Error(`The demo project is missing from this installation. ${result.kind === 'error' ? result.message : ''}`.trim())
      }
      return { name: result.name, text: result.text }
    },
  }
}
