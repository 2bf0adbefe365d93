/**
 * The bridge for a plain browser (the web build and the browser tests): the same contract
 * as the desktop app's preload, with an upload for Open, a download for Save and Export,
 * the print dialog for PDF, recovery and recent files in localStorage, and the demo
 * project bundled into the page.
 */
import type { DocumentState, ExportRequest, ExportResult, MenuCommand, OpenResult, RecoveredWork, RodwaveBridge, SaveRequest, SaveResult } from './contract'
import { decodeProjectBytes, MAX_PROJECT_BYTES } from '../../core/model/project-bytes'
import demoDocument from '../../examples/cooling-water-pump-hanger.rodwave.json'

export const DEMO_NAME = 'cooling-water-pump-hanger.rodwave.json'
/** Each page load keeps its recovery copy under its own key, so an earlier load's copy waits for the user's answer. */
const RECOVERY_PREFIX = 'rodwave.recovery.'
/** The single recovery key of Rodwave 0.1, offered like any earlier copy. */
const LEGACY_RECOVERY_KEY = 'rodwave.recovery'
/** When each copy was written (ISO 8601), beside it. */
const RECOVERY_TIME_PREFIX = 'rodwave.recovery-at.'
const RECENT_KEY = 'rodwave.recent'
const RECENT_LIMIT = 8
/** Recent files keep their text in localStorage; larger ones are listed only while the page lives. */
const RECENT_TEXT_LIMIT = 1_000_000

const MIME: Record<ExportRequest['kind'] | 'project', string> = {
  project: 'application/json',
  csv: 'text/csv',
  html: 'text/html',
  pdf: 'text/html',
}

interface RecentEntry {
  readonly name: string
  readonly text: string
}

export interface BrowserBridgeOptions {
  /** Storage for recovery and recent files (default window.localStorage). */
  readonly storage?: Storage
}

export function createBrowserBridge(options: BrowserBridgeOptions = {}): RodwaveBridge {
  const storage = options.storage ?? window.localStorage
  const menuListeners = new Set<(command: MenuCommand) => void>()
  let session = newSessionId()
  /** Earlier copies offered to this page, by id → storage key: only these may be settled. */
  const offered = new Map<string, string>()

  const earlierCopies = (): RecoveredWork[] => {
    const copies: RecoveredWork[] = []
    for (let index = 0; index < storage.length; index++) {
      const key = storage.key(index)
      if (key === null) continue
      if (key === LEGACY_RECOVERY_KEY) {
        const text = storage.getItem(key)
        if (text !== null) copies.push({ id: 'legacy', text, savedAt: null })
      } else if (key.startsWith(RECOVERY_PREFIX) && key !== RECOVERY_PREFIX + session) {
        const id = key.slice(RECOVERY_PREFIX.length)
        const text = storage.getItem(key)
        if (text !== null) copies.push({ id, text, savedAt: storage.getItem(RECOVERY_TIME_PREFIX + id) })
      }
    }
    return copies.sort((a, b) => (b.savedAt ?? '').localeCompare(a.savedAt ?? ''))
  }

  const readRecent = (): RecentEntry[] => {
    try {
      const parsed: unknown = JSON.parse(storage.getItem(RECENT_KEY) ?? '[]')
      return Array.isArray(parsed) ? parsed.filter((e): e is RecentEntry => typeof e?.name === 'string' && typeof e?.text === 'string') : []
    } catch {
      return []
    }
  }
  const remember = (name: string, text: string) => {
    if (text.length > RECENT_TEXT_LIMIT) return
    const entries = [{ name, text }, ...readRecent().filter((e) => e.name !== name)].slice(0, RECENT_LIMIT)
    try {
      storage.setItem(RECENT_KEY, JSON.stringify(entries))
    } catch {
      // Storage full: the list simply does not grow.
    }
  }

  return {
    platform: 'browser',
    async openProject(): Promise<OpenResult> {
      const file = await pickFile('.json,.rodwave.json,application/json')
      if (!file) return { kind: 'cancelled' }
      // The size first: a file too large to be a project is never read into the page.
      if (file.size > MAX_PROJECT_BYTES) {
        return { kind: 'error', message: `Could not open "${file.name}": it is ${megabytes(file.size)}, and Rodwave opens project files up to ${megabytes(MAX_PROJECT_BYTES)}.` }
      }
      try {
        // The bytes go to the solver worker, which decodes, parses and validates them off the page's thread.
        const bytes = new Uint8Array(await file.arrayBuffer())
        if (bytes.byteLength <= RECENT_TEXT_LIMIT) {
          const decoded = decodeProjectBytes(bytes)
          if (decoded.ok) remember(file.name, decoded.text)
        }
        return { kind: 'opened', path: file.name, name: file.name, bytes }
      } catch (error) {
        return { kind: 'error', message: `Could not read ${file.name}: ${error instanceof Error ? error.message : String(error)}` }
      }
    },
    async openRecent(path: string): Promise<OpenResult> {
      const entry = readRecent().find((e) => e.name === path)
      if (!entry) return { kind: 'error', message: `${path} is no longer in this browser's recent files` }
      return { kind: 'opened', path: entry.name, name: entry.name, text: entry.text }
    },
    async saveProject(request: SaveRequest): Promise<SaveResult> {
      const name = ensureExtension(request.path ?? request.suggestedName, '.rodwave.json')
      download(name, request.text, MIME.project)
      remember(name, request.text)
      return { kind: 'saved', path: name, name }
    },
    async exportFile(request: ExportRequest): Promise<ExportResult> {
      if (request.kind === 'pdf') return printReport(request)
      const name = ensureExtension(request.suggestedName, `.${request.kind}`)
      download(name, request.content, MIME[request.kind])
      return { kind: 'saved', path: name, name }
    },
    async recentFiles(): Promise<string[]> {
      return readRecent().map((e) => e.name)
    },
    async demoProject() {
      return { name: DEMO_NAME, text: `${JSON.stringify(demoDocument, null, 2)}\n` }
    },
    async setDocumentState(state: DocumentState): Promise<void> {
      document.title = `${state.dirty ? '• ' : ''}${state.title || 'Untitled project'} — Rodwave`
    },
    async saveRefused(): Promise<void> {
      // No close waits on a save in a browser.
    },
    async writeRecovery(text: string): Promise<void> {
      storage.setItem(RECOVERY_PREFIX + session, text)
      storage.setItem(RECOVERY_TIME_PREFIX + session, new Date().toISOString())
    },
    async readRecovery(): Promise<RecoveredWork[]> {
      session = newSessionId()
      offered.clear()
      const copies = earlierCopies()
      for (const copy of copies) offered.set(copy.id, copy.id === 'legacy' ? LEGACY_RECOVERY_KEY : RECOVERY_PREFIX + copy.id)
      return copies
    },
    async clearRecovery(): Promise<void> {
      storage.removeItem(RECOVERY_PREFIX + session)
      storage.removeItem(RECOVERY_TIME_PREFIX + session)
    },
    async settleRecovery(id: string): Promise<void> {
      const key = offered.get(id)
      if (key === undefined) return
      storage.removeItem(key)
      storage.removeItem(RECOVERY_TIME_PREFIX + id)
      offered.delete(id)
    },
    onMenuCommand(listener: (command: MenuCommand) => void): () => void {
      // A browser has no application menu: the page's own buttons and keys are the menu.
      menuListeners.add(listener)
      return () => menuListeners.delete(listener)
    },
  }
}

function megabytes(bytes: number): string {
  return `${(bytes / (1024 * 1024)).toFixed(1)} MB`
}

function newSessionId(): string {
  const random = new Uint8Array(6)
  crypto.getRandomValues(random)
  return `${Date.now().toString(36)}-${Array.from(random, (byte) => byte.toString(16).padStart(2, '0')).join('')}`
}

function ensureExtension(name: string, extension: string): string {
  return name.toLowerCase().endsWith(extension) ? name : `${name.replace(/\.(rodwave\.)?json$/i, '')}${extension}`
}

/** Asks for one file with a transient file input; resolves null when the dialog is dismissed. */
function pickFile(accept: string): Promise<File | null> {
  return new Promise((resolve) => {
    const input = document.createElement('input')
    input.type = 'file'
    input.accept = accept
    input.style.display = 'none'
    const finish = (file: File | null) => {
      input.remove()
      resolve(file)
    }
    input.addEventListener('change', () => finish(input.files?.[0] ?? null), { once: true })
    input.addEventListener('cancel', () => finish(null), { once: true })
    document.body.append(input)
    input.click()
  })
}

function download(name: string, content: string, type: string): void {
  const url = URL.createObjectURL(new Blob([content], { type: `${type};charset=utf-8` }))
  const link = document.createElement('a')
  link.href = url
  link.download = name
  link.style.display = 'none'
  document.body.append(link)
  link.click()
  link.remove()
  // Give the browser time to start the download before the URL goes.
  setTimeout(() => URL.revokeObjectURL(url), 60_000)
}

/** PDF in a browser: the report opens in a new tab with the browser's print dialog, where the user saves it as PDF. */
function printReport(request: ExportRequest): ExportResult {
  const url = URL.createObjectURL(new Blob([request.content], { type: 'text/html;charset=utf-8' }))
  const view = window.open(url, '_blank')
  if (!view) {
    URL.revokeObjectURL(url)
    return { kind: 'error', message: 'The browser blocked the report window; allow pop-ups for this page, or export the report as HTML and print it.' }
  }
  view.addEventListener('load', () => view.print(), { once: true })
  setTimeout(() => URL.revokeObjectURL(url), 600_000)
  return { kind: 'print-dialog', name: request.suggestedName }
}
