/**
 * The windows' options and the guards on their contents, following Electron's security
 * checklist: isolated, sandboxed, no Node in the page, no <webview>, web security kept,
 * no navigation away from the bundle, no new windows, no permissions.
 */
import type { BrowserWindowConstructorOptions, Session, WebContents } from 'electron'
import { isAppUrl } from './app-origin'

export const PDF_EXPORT_PARTITION = 'rodwave-pdf-export'

/** The page settings every Rodwave window shares, in one place so that no window drifts from them. */
const LOCKED_DOWN = {
  contextIsolation: true,
  sandbox: true,
  nodeIntegration: false,
  nodeIntegrationInWorker: false,
  nodeIntegrationInSubFrames: false,
  webviewTag: false,
  webSecurity: true,
  allowRunningInsecureContent: false,
  experimentalFeatures: false,
  navigateOnDragDrop: false,
  spellcheck: false,
} as const satisfies NonNullable<BrowserWindowConstructorOptions['webPreferences']>

export interface MainWindowSettings {
  readonly preloadPath: string
  readonly iconPath?: string
  readonly darkBackground: boolean
}

export function mainWindowOptions(settings: MainWindowSettings): BrowserWindowConstructorOptions {
  return {
    width: 1360,
    height: 860,
    minWidth: 960,
    minHeight: 620,
    title: 'Rodwave',
    show: false,
    backgroundColor: settings.darkBackground ? '#1d2126' : '#f5f6f8',
    ...(settings.iconPath === undefined ? {} : { icon: settings.iconPath }),
    webPreferences: {
      preload: settings.preloadPath,
      ...LOCKED_DOWN,
      safeDialogs: true,
    },
  }
}

/** A hidden window that only lays out the static report for printing: no preload, no script. */
export function pdfWindowOptions(): BrowserWindowConstructorOptions {
  return {
    show: false,
    width: 1024,
    height: 1400,
    webPreferences: {
      partition: PDF_EXPORT_PARTITION,
      javascript: false,
      ...LOCKED_DOWN,
    },
  }
}

/** The third-party notices: a plain text page of the app's own bundle, no preload, no script, closed with its parent. */
export function noticesWindowOptions(parent?: BrowserWindowConstructorOptions['parent']): BrowserWindowConstructorOptions {
  return {
    width: 820,
    height: 680,
    title: 'Rodwave: third-party notices',
    ...(parent === undefined ? {} : { parent }),
    webPreferences: {
      javascript: false,
      ...LOCKED_DOWN,
    },
  }
}

type NavigationEvent = { preventDefault(): void }
type GuardedWebContents = Pick<WebContents, 'setWindowOpenHandler'> & {
  on(event: 'will-navigate' | 'will-redirect', listener: (event: NavigationEvent, url: string) => void): unknown
  on(event: 'will-attach-webview', listener: (event: NavigationEvent) => void): unknown
}

/**
 * Keeps a window on the app bundle: navigation elsewhere is cancelled (`allowedUrl` decides;
 * by default only the bundle's own URLs), new windows are denied and <webview> never attaches.
 * Links are never handed to the system browser: the page is not trusted to pick URLs.
 */
export function guardWebContents(contents: GuardedWebContents, allowedUrl: (url: string) => boolean = isAppUrl): void {
  contents.on('will-navigate', (event, url) => {
    if (!allowedUrl(url)) event.preventDefault()
  })
  contents.on('will-redirect', (event, url) => {
    if (!allowedUrl(url)) event.preventDefault()
  })
  contents.on('will-attach-webview', (event) => event.preventDefault())
  contents.setWindowOpenHandler(() => ({ action: 'deny' }))
}

type PermissionSession = Pick<Session, 'setPermissionRequestHandler' | 'setPermissionCheckHandler' | 'setDevicePermissionHandler'>

/**
 * Refuses every permission request (camera, microphone, notifications, geolocation, …)
 * and every permission check except writing to the clipboard from the app's own page,
 * which a "copy table" button needs.
 */
export function denyPermissions(session: PermissionSession): void {
  session.setPermissionRequestHandler((_contents, _permission, callback) => callback(false))
  session.setPermissionCheckHandler((_contents, permission, requestingOrigin) => permission === 'clipboard-sanitized-write' && isAppUrl(requestingOrigin))
  session.setDevicePermissionHandler(() => false)
}
