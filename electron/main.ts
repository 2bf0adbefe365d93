/**
 * Rodwave's main process: app lifecycle, the one window, the application menu and the IPC
 * handlers. Everything with logic lives in the modules it imports; this file only wires
 * them to Electron.
 */
import { access, readFile } from 'node:fs/promises'
import { join } from 'node:path'
import { BrowserWindow, Menu, app, dialog, ipcMain, nativeTheme, protocol, session } from 'electron'
import { APP_ENTRY_URL, APP_SCHEME, APP_SCHEME_PRIVILEGES } from './app-origin'
import { demoProjectPath, rendererRoot, RECENT_FILES_FILE, windowIconPath, type AppLocation } from './app-paths'
import { createAppProtocolHandler } from './app-protocol'
import { createCloseGuard, type CloseGuard, type UnsavedAnswer } from './close-guard'
import { createFileHandlers } from './file-handlers'
import { CHANNELS, type MenuCommand } from './ipc-contract'
import { registerIpcHandlers } from './ipc-handlers'
import { showAbout, THIRD_PARTY_NOTICES_URL } from './about'
import { applicationMenuTemplate } from './menu'
import { renderReportPdf } from './pdf-export'
import { createRecentFiles, recentFilesInFile } from './recent-files'
import { createRecoveryStore } from './recovery'
import { denyPermissions, guardWebContents, mainWindowOptions, noticesWindowOptions, PDF_EXPORT_PARTITION } from './window-options'

// Before the app is ready: the app scheme's privileges, sandbox for every renderer, a stable user-data folder name.
protocol.registerSchemesAsPrivileged([{ scheme: APP_SCHEME, privileges: APP_SCHEME_PRIVILEGES }])
app.enableSandbox()
app.setName('Rodwave')

const location: AppLocation = { isPackaged: app.isPackaged, appPath: app.getAppPath(), resourcesPath: process.resourcesPath }
const userData = app.getPath('userData')
const recentFiles = createRecentFiles(recentFilesInFile(join(userData, RECENT_FILES_FILE)))
const recovery = createRecoveryStore(userData)

let mainWindow: BrowserWindow | null = null
let noticesWindow: BrowserWindow | null = null
let closeGuard: CloseGuard | null = null
let quitting = false

function sendToWindow(channel: string, payload: unknown): void {
  if (mainWindow === null || mainWindow.isDestroyed()) {
    createMainWindow()
    return
  }
  mainWindow.webContents.send(channel, payload)
}

async function refreshMenu(files?: string[]): Promise<void> {
  const template = applicationMenuTemplate(
    { platform: process.platform, isDevelopment: !app.isPackaged, recentFiles: files ?? (await recentFiles.list()) },
    {
      send: (command: MenuCommand) => sendToWindow(CHANNELS.menuCommand, command),
      openRecent: (path) => sendToWindow(CHANNELS.openRecentRequest, path),
      clearRecent: () => void recentFiles.clear().then(() => refreshMenu([])),
      showAbout: () => void showAbout(app.getVersion(), { showMessageBox: (options) => dialog.showMessageBox(options), showNotices: showThirdPartyNotices }),
    },
  )
  Menu.setApplicationMenu(Menu.buildFromTemplate(template))
}

/** The third-party notices in a window of their own (one at a time), closed with the main window. */
function showThirdPartyNotices(): void {
  if (noticesWindow !== null && !noticesWindow.isDestroyed()) {
    noticesWindow.focus()
    return
  }
  const window = new BrowserWindow(noticesWindowOptions(mainWindow ?? undefined))
  noticesWindow = window
  window.on('page-title-updated', (event) => event.preventDefault())
  window.on('closed', () => {
    if (noticesWindow === window) noticesWindow = null
  })
  void window.loadURL(THIRD_PARTY_NOTICES_URL)
}

const files = createFileHandlers({
  dialogs: {
    showOpenDialog: (options) => (mainWindow === null ? dialog.showOpenDialog(options) : dialog.showOpenDialog(mainWindow, options)),
    showSaveDialog: (options) => (mainWindow === null ? dialog.showSaveDialog(options) : dialog.showSaveDialog(mainWindow, options)),
  },
  recentFiles,
  renderPdf: (html) => renderReportPdf(html, { createWindow: (options) => new BrowserWindow(options) }),
  demoProjectPath: demoProjectPath(location),
  defaultFolder: app.getPath('documents'),
  recentFilesChanged: (list) => void refreshMenu(list),
})

function createCloseGuardFor(window: BrowserWindow): CloseGuard {
  return createCloseGuard({
    askAboutUnsaved: async (title) => {
      const answers: UnsavedAnswer[] = ['save', 'discard', 'cancel']
      const { response } = await dialog.showMessageBox(window, {
        type: 'warning',
        buttons: ['Save', "Don't save", 'Cancel'],
        defaultId: 0,
        cancelId: 2,
        noLink: true,
        message: `Save the changes to “${title.trim() || 'Untitled project'}” before closing?`,
        detail: 'Changes you do not save are lost.',
      })
      return answers[response] ?? 'cancel'
    },
    requestSave: () => window.webContents.send(CHANNELS.menuCommand, 'save' satisfies MenuCommand),
    closeWindow: () => window.close(),
    showTitle: (title, dirty) => {
      window.setTitle(title)
      if (process.platform === 'darwin') window.setDocumentEdited(dirty)
    },
    discardRecovery: () => recovery.clear(),
    closeAbandoned: () => {
      quitting = false
    },
  })
}

function createMainWindow(): void {
  const window = new BrowserWindow(
    mainWindowOptions({
      preloadPath: join(__dirname, 'preload.cjs'),
      ...(process.platform === 'linux' ? { iconPath: windowIconPath(location) } : {}),
      darkBackground: nativeTheme.shouldUseDarkColors,
    }),
  )
  mainWindow = window
  closeGuard = createCloseGuardFor(window)
  const guard = closeGuard

  window.once('ready-to-show', () => window.show())
  // The frame shows the document's title, set from the document state, not the page's <title>.
  window.on('page-title-updated', (event) => event.preventDefault())
  window.on('close', (event) => guard.closeRequested(event))
  window.on('closed', () => {
    if (mainWindow === window) {
      mainWindow = null
      closeGuard = null
    }
  })
  window.webContents.on('render-process-gone', (_event, details) => {
    if (details.reason === 'clean-exit' || window.isDestroyed()) return
    // The work is in the autosaved recovery copy, which the reloaded window offers.
    guard.documentChanged({ dirty: false, title: guard.state.title })
    void dialog
      .showMessageBox(window, {
        type: 'error',
        buttons: ['Reload'],
        message: 'The Rodwave window stopped unexpectedly.',
        detail: `Reason: ${details.reason}. The window reloads and offers the last autosaved copy of your work.`,
      })
      .then(() => {
        if (!window.isDestroyed()) window.webContents.reload()
      })
  })
  void window.loadURL(APP_ENTRY_URL)
}

registerIpcHandlers({
  ipcMain,
  trustedWindow: () => mainWindow,
  services: {
    files,
    recentFiles,
    recovery,
    closeGuard: {
      documentChanged: (state) => closeGuard?.documentChanged(state),
      saveStarted: () => closeGuard?.saveStarted(),
      saveFinished: (result) => closeGuard?.saveFinished(result),
      saveRefused: () => closeGuard?.saveRefused(),
    },
  },
  log: (message) => console.error(`[rodwave] ${message}`),
})

// Every web page Rodwave creates (the window, the hidden PDF printer) stays where it was put.
app.on('web-contents-created', (_event, contents) => guardWebContents(contents))

app.on('second-instance', () => {
  if (mainWindow === null) return
  if (mainWindow.isMinimized()) mainWindow.restore()
  mainWindow.focus()
})

app.on('before-quit', () => {
  quitting = true
})

app.on('window-all-closed', () => {
  if (process.platform !== 'darwin' || quitting) app.quit()
})

app.on('activate', () => {
  if (mainWindow === null && app.isReady()) createMainWindow()
})

async function start(): Promise<void> {
  await app.whenReady()
  if (process.platform === 'win32') app.setAppUserModelId('org.rodwave.desktop')
  const root = rendererRoot(location)
  try {
    await access(join(root, 'index.html'))
  } catch {
    dialog.showErrorBox('Rodwave cannot start', `The window's files are missing (${root}). Build them with "npm run build".`)
    app.quit()
    return
  }
  protocol.handle(APP_SCHEME, createAppProtocolHandler({ rootDir: root, readFile: (path) => readFile(path) }))
  denyPermissions(session.defaultSession)
  denyPermissions(session.fromPartition(PDF_EXPORT_PARTITION))
  await refreshMenu()
  createMainWindow()
}

if (app.requestSingleInstanceLock()) {
  void start()
} else {
  app.quit()
}
