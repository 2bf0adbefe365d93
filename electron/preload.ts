/**
 * The preload: exposes exactly one object, `window.rodwave`, implementing the contract's
 * RodwaveBridge. The page never sees ipcRenderer, only these typed functions; events from
 * the main process are checked before they reach the page's listeners. Runs sandboxed,
 * so it is bundled to CommonJS with the contract's constants inlined.
 */
import { contextBridge, ipcRenderer, type IpcRendererEvent } from 'electron'
import { CHANNELS, type MenuCommand, type RodwaveBridge } from './ipc-contract'

const MENU_COMMANDS: ReadonlySet<string> = new Set<MenuCommand>([
  'new',
  'open',
  'save',
  'save-as',
  'export-csv',
  'export-report-html',
  'export-report-pdf',
  'undo',
  'redo',
  'cautions',
])

function subscribe<T>(channel: string, accept: (payload: unknown) => payload is T, listener: (payload: T) => void): () => void {
  // The page's listener gets the payload only, never the IPC event (which would expose the sender).
  const relay = (_event: IpcRendererEvent, payload: unknown) => {
    if (accept(payload)) listener(payload)
  }
  ipcRenderer.on(channel, relay)
  return () => {
    ipcRenderer.removeListener(channel, relay)
  }
}

const isMenuCommand = (payload: unknown): payload is MenuCommand => typeof payload === 'string' && MENU_COMMANDS.has(payload)
const isPath = (payload: unknown): payload is string => typeof payload === 'string' && payload.length > 0

const bridge: RodwaveBridge = {
  platform: 'electron',
  openProject: () => ipcRenderer.invoke(CHANNELS.openProject),
  openRecent: (path) => ipcRenderer.invoke(CHANNELS.openRecent, path),
  saveProject: (request) => ipcRenderer.invoke(CHANNELS.saveProject, request),
  exportFile: (request) => ipcRenderer.invoke(CHANNELS.exportFile, request),
  recentFiles: () => ipcRenderer.invoke(CHANNELS.recentFiles),
  demoProject: () => ipcRenderer.invoke(CHANNELS.demoProject),
  setDocumentState: (state) => ipcRenderer.invoke(CHANNELS.setDocumentState, state),
  saveRefused: () => ipcRenderer.invoke(CHANNELS.saveRefused),
  writeRecovery: (text) => ipcRenderer.invoke(CHANNELS.writeRecovery, text),
  readRecovery: () => ipcRenderer.invoke(CHANNELS.readRecovery),
  clearRecovery: () => ipcRenderer.invoke(CHANNELS.clearRecovery),
  settleRecovery: (id) => ipcRenderer.invoke(CHANNELS.settleRecovery, id),
  onMenuCommand: (listener) => subscribe(CHANNELS.menuCommand, isMenuCommand, listener),
  onOpenRecentRequest: (listener) => subscribe(CHANNELS.openRecentRequest, isPath, listener),
}

contextBridge.exposeInMainWorld('rodwave', bridge)
