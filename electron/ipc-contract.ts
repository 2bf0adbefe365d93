/**
 * The one contract between the window and the main process: every IPC channel with its
 * request and response types, and the bridge object the preload exposes as
 * `window.rodwave`. The renderer imports this file with `import type` only; in a plain
 * browser it gets a browser implementation of the same bridge (downloads and uploads
 * instead of file dialogs).
 */

/**
 * Result of asking for a project file: its content unparsed, as text (the desktop app reads
 * and decodes the file in the main process) or as bytes (a browser upload, decoded with the
 * parse in the solver worker, off the page's thread).
 */
export type OpenResult =
  | { readonly kind: 'opened'; readonly path: string; readonly name: string; readonly text: string }
  | { readonly kind: 'opened'; readonly path: string; readonly name: string; readonly bytes: Uint8Array }
  | { readonly kind: 'cancelled' }
  | { readonly kind: 'error'; readonly message: string }

/** What the desktop app's main process answers: a file is always sent as text. */
export type TextOpenResult = Exclude<OpenResult, { readonly bytes: Uint8Array }>

export type SaveResult =
  | { readonly kind: 'saved'; readonly path: string; readonly name: string }
  | { readonly kind: 'cancelled' }
  | { readonly kind: 'error'; readonly message: string }

/** An export's outcome. A browser cannot write a PDF itself: it opens the report with the print dialog instead. */
export type ExportResult = SaveResult | { readonly kind: 'print-dialog'; readonly name: string }

export interface SaveRequest {
  /** Where to save; null asks for a place (Save As). */
  readonly path: string | null
  readonly suggestedName: string
  /** The complete project file text. */
  readonly text: string
}

export type ExportKind = 'csv' | 'html' | 'pdf'

export interface ExportRequest {
  readonly kind: ExportKind
  readonly suggestedName: string
  /** CSV text, or the report's self-contained HTML (also the source of the PDF). */
  readonly content: string
}

/** Commands from the application menu, forwarded to the window. */
export type MenuCommand = 'new' | 'open' | 'save' | 'save-as' | 'export-csv' | 'export-report-html' | 'export-report-pdf' | 'undo' | 'redo' | 'cautions'

/** Unsaved work an earlier session left (see electron/recovery.ts). */
export interface RecoveredWork {
  /** Names the copy for settleRecovery. */
  readonly id: string
  readonly text: string
  /** When it was last written (ISO 8601), if known. */
  readonly savedAt: string | null
}

export interface DocumentState {
  readonly dirty: boolean
  readonly title: string
}

/** Channel names, with the request and response of each (invoke) or the payload (events). */
export const CHANNELS = {
  openProject: 'rodwave:open-project',
  openRecent: 'rodwave:open-recent',
  saveProject: 'rodwave:save-project',
  exportFile: 'rodwave:export-file',
  recentFiles: 'rodwave:recent-files',
  demoProject: 'rodwave:demo-project',
  setDocumentState: 'rodwave:set-document-state',
  writeRecovery: 'rodwave:write-recovery',
  readRecovery: 'rodwave:read-recovery',
  clearRecovery: 'rodwave:clear-recovery',
  settleRecovery: 'rodwave:settle-recovery',
  saveRefused: 'rodwave:save-refused',
  menuCommand: 'rodwave:menu-command',
  /** Added by the shell (event, main → window): a file chosen under File › Open recent.
   *  The window asks about unsaved changes as for Open, then calls openRecent(path). */
  openRecentRequest: 'rodwave:open-recent-request',
} as const

export interface ChannelTypes {
  [CHANNELS.openProject]: { request: void; response: OpenResult }
  [CHANNELS.openRecent]: { request: string; response: OpenResult }
  [CHANNELS.saveProject]: { request: SaveRequest; response: SaveResult }
  [CHANNELS.exportFile]: { request: ExportRequest; response: SaveResult }
  [CHANNELS.recentFiles]: { request: void; response: string[] }
  [CHANNELS.demoProject]: { request: void; response: { name: string; text: string } }
  [CHANNELS.setDocumentState]: { request: DocumentState; response: void }
  [CHANNELS.writeRecovery]: { request: string; response: void }
  [CHANNELS.readRecovery]: { request: void; response: RecoveredWork[] }
  [CHANNELS.clearRecovery]: { request: void; response: void }
  [CHANNELS.settleRecovery]: { request: string; response: void }
  [CHANNELS.saveRefused]: { request: void; response: void }
}

/** What the preload exposes as window.rodwave (and the browser build provides itself). */
export interface RodwaveBridge {
  readonly platform: 'electron' | 'browser'
  openProject(): Promise<OpenResult>
  openRecent(path: string): Promise<OpenResult>
  saveProject(request: SaveRequest): Promise<SaveResult>
  exportFile(request: ExportRequest): Promise<ExportResult>
  recentFiles(): Promise<string[]>
  demoProject(): Promise<{ name: string; text: string }>
  setDocumentState(state: DocumentState): Promise<void>
  /** The window did not start a save it was asked for (the part has problems): a close waiting on it ends. */
  saveRefused(): Promise<void>
  /** Writes this session's recovery copy (the autosave of unsaved work). */
  writeRecovery(text: string): Promise<void>
  /**
   * Called once when the window starts: begins this session's recovery copy (a file of its
   * own) and returns the copies earlier sessions left that the user has not decided on yet,
   * newest first. They stay until settleRecovery.
   */
  readRecovery(): Promise<RecoveredWork[]>
  /** Removes this session's recovery copy. */
  clearRecovery(): Promise<void>
  /** The user restored or discarded the earlier copy `id`: it is removed. */
  settleRecovery(id: string): Promise<void>
  /** Subscribes to menu commands; returns the unsubscribe function. */
  onMenuCommand(listener: (command: MenuCommand) => void): () => void
  /** Added by the shell, optional (the browser build has no application menu): subscribes
   *  to File › Open recent choices; returns the unsubscribe function. */
  onOpenRecentRequest?(listener: (path: string) => void): () => void
}
