/**
 * The window's security settings (Electron's security checklist, summarised in
 * /work/shared/design/ecosystem-notes.md) and the app protocol: CSP on every response,
 * nothing served from outside the renderer's folder.
 */
import { mkdtemp, mkdir, readFile, rm, writeFile } from 'node:fs/promises'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest'
import { APP_ENTRY_URL, APP_SCHEME_PRIVILEGES, CONTENT_SECURITY_POLICY, isAppUrl } from '../../electron/app-origin'
import { createAppProtocolHandler, resolveBundlePath } from '../../electron/app-protocol'
import { denyPermissions, guardWebContents, mainWindowOptions, pdfWindowOptions } from '../../electron/window-options'

vi.mock('electron', () => ({}))

/** The policy the task brief specifies, word for word. */
const REQUIRED_CSP =
  "default-src 'self'; script-src 'self'; style-src 'self' 'unsafe-inline'; img-src 'self' data: blob:; worker-src 'self' blob:; connect-src 'self'; object-src 'none'; base-uri 'none'; form-action 'none'; frame-ancestors 'none'"

describe('main window options', () => {
  const options = mainWindowOptions({ preloadPath: '/opt/rodwave/dist/electron/preload.cjs', darkBackground: false })
  const web = options.webPreferences!

  it('isolates and sandboxes the page, without Node, <webview> or relaxed web security', () => {
    expect(web.contextIsolation).toBe(true)
    expect(web.sandbox).toBe(true)
    expect(web.nodeIntegration).toBe(false)
    expect(web.nodeIntegrationInWorker).toBe(false)
    expect(web.nodeIntegrationInSubFrames).toBe(false)
    expect(web.webviewTag).toBe(false)
    expect(web.webSecurity).toBe(true)
    expect(web.allowRunningInsecureContent).toBe(false)
    expect(web.experimentalFeatures).toBe(false)
    expect(web).not.toHaveProperty('enableBlinkFeatures')
  })

  it('loads the given preload and nothing else into the page', () => {
    expect(web.preload).toBe('/opt/rodwave/dist/electron/preload.cjs')
    expect(options.show).toBe(false)
  })

  it('the hidden PDF window has no preload, no JavaScript and its own session', () => {
    const pdf = pdfWindowOptions().webPreferences!
    expect(pdf).not.toHaveProperty('preload')
    expect(pdf.javascript).toBe(false)
    expect(pdf.sandbox).toBe(true)
    expect(pdf.contextIsolation).toBe(true)
    expect(pdf.nodeIntegration).toBe(false)
    expect(pdf.partition).toBeTruthy()
    expect(pdf.partition).not.toMatch(/^persist:/)
    expect(pdfWindowOptions().show).toBe(false)
  })
})

/** A WebContents stand-in that records the listeners guardWebContents attaches. */
function fakeContents() {
  const listeners = new Map<string, (...args: unknown[]) => void>()
  let openHandler: ((details: { url: string }) => { action: string }) | null = null
  return {
    on: vi.fn((event: string, listener: (...args: unknown[]) => void) => listeners.set(event, listener)),
    setWindowOpenHandler: vi.fn((handler: (details: { url: string }) => { action: string }) => {
      openHandler = handler
    }),
    fire(event: string, url?: string) {
      const preventDefault = vi.fn()
      listeners.get(event)!({ preventDefault }, url)
      return preventDefault
    },
    open(url: string) {
      return openHandler!({ url })
    },
  }
}

describe('navigation, new windows and <webview>', () => {
  it('cancels navigation to an outside URL and lets the bundle navigate within itself', () => {
    const contents = fakeContents()
    guardWebContents(contents as never)
    expect(contents.fire('will-navigate', 'https://example.com/phish')).toHaveBeenCalledOnce()
    expect(contents.fire('will-navigate', 'file:///etc/passwd')).toHaveBeenCalledOnce()
    expect(contents.fire('will-navigate', 'rodwave-app://elsewhere/index.html')).toHaveBeenCalledOnce()
    expect(contents.fire('will-navigate', 'rodwave-app://bundle/index.html#modes')).not.toHaveBeenCalled()
    expect(contents.fire('will-redirect', 'http://127.0.0.1:8080/')).toHaveBeenCalledOnce()
  })

  it('denies every new window, whatever its URL', () => {
    const contents = fakeContents()
    guardWebContents(contents as never)
    expect(contents.open('https://example.com/')).toEqual({ action: 'deny' })
    expect(contents.open(APP_ENTRY_URL)).toEqual({ action: 'deny' })
  })

  it('never attaches a <webview>', () => {
    const contents = fakeContents()
    guardWebContents(contents as never)
    expect(contents.fire('will-attach-webview')).toHaveBeenCalledOnce()
  })
})

describe('permissions', () => {
  function fakeSession() {
    return {
      setPermissionRequestHandler: vi.fn(),
      setPermissionCheckHandler: vi.fn(),
      setDevicePermissionHandler: vi.fn(),
    }
  }

  it.each(['media', 'geolocation', 'notifications', 'openExternal', 'clipboard-read', 'fullscreen', 'midiSysex'])('refuses a request for %s', (permission) => {
    const session = fakeSession()
    denyPermissions(session as never)
    const handler = session.setPermissionRequestHandler.mock.calls[0]![0] as (contents: unknown, permission: string, callback: (granted: boolean) => void) => void
    const callback = vi.fn()
    handler({}, permission, callback)
    expect(callback).toHaveBeenCalledExactlyOnceWith(false)
  })

  it('answers permission checks with no, except clipboard writes from the app itself', () => {
    const session = fakeSession()
    denyPermissions(session as never)
    const check = session.setPermissionCheckHandler.mock.calls[0]![0] as (contents: unknown, permission: string, origin: string) => boolean
    expect(check(null, 'media', 'rodwave-app://bundle')).toBe(false)
    expect(check(null, 'clipboard-read', 'rodwave-app://bundle')).toBe(false)
    expect(check(null, 'clipboard-sanitized-write', 'https://example.com')).toBe(false)
    expect(check(null, 'clipboard-sanitized-write', 'rodwave-app://bundle')).toBe(true)
    const device = session.setDevicePermissionHandler.mock.calls[0]![0] as () => boolean
    expect(device()).toBe(false)
  })
})

describe('app origin', () => {
  it('accepts only the bundle host of the app scheme', () => {
    expect(isAppUrl('rodwave-app://bundle/index.html')).toBe(true)
    expect(isAppUrl('rodwave-app://bundle')).toBe(true)
    expect(isAppUrl('rodwave-app://other/index.html')).toBe(false)
    expect(isAppUrl('rodwave-app://user:pw@bundle/index.html')).toBe(false)
    expect(isAppUrl('https://bundle/index.html')).toBe(false)
    expect(isAppUrl('file:///index.html')).toBe(false)
    expect(isAppUrl('not a url')).toBe(false)
  })

  it('registers the scheme as standard and secure, without bypassing the CSP', () => {
    expect(APP_SCHEME_PRIVILEGES.standard).toBe(true)
    expect(APP_SCHEME_PRIVILEGES.secure).toBe(true)
    expect(APP_SCHEME_PRIVILEGES).not.toHaveProperty('bypassCSP')
  })
})

describe('app protocol handler', () => {
  let root: string
  let outside: string

  beforeAll(async () => {
    const base = await mkdtemp(join(tmpdir(), 'rodwave-protocol-'))
    root = join(base, 'dist', 'renderer')
    outside = join(base, 'secret.txt')
    await mkdir(join(root, 'assets'), { recursive: true })
    await writeFile(join(root, 'index.html'), '<!doctype html><title>Rodwave</title>')
    await writeFile(join(root, 'assets', 'app-1234.js'), 'export const ready = true')
    await writeFile(join(root, 'assets', 'style.css'), 'body{}')
    await writeFile(outside, 'must not be served')
  })
  afterAll(async () => {
    await rm(join(root, '..', '..'), { recursive: true, force: true })
  })

  const handler = () => createAppProtocolHandler({ rootDir: root, readFile: (path) => readFile(path) })

  it('uses exactly the required Content-Security-Policy', () => {
    expect(CONTENT_SECURITY_POLICY).toBe(REQUIRED_CSP)
  })

  it('serves index.html for the entry URL and for "/", with the CSP header and its content type', async () => {
    for (const url of [APP_ENTRY_URL, 'rodwave-app://bundle/']) {
      const response = await handler()({ url, method: 'GET' })
      expect(response.status).toBe(200)
      expect(response.headers.get('content-security-policy')).toBe(REQUIRED_CSP)
      expect(response.headers.get('content-type')).toBe('text/html; charset=utf-8')
      expect(response.headers.get('x-content-type-options')).toBe('nosniff')
      expect(await response.text()).toContain('<title>Rodwave</title>')
    }
  })

  it('serves module scripts as JavaScript and styles as CSS', async () => {
    const script = await handler()({ url: 'rodwave-app://bundle/assets/app-1234.js' })
    expect(script.headers.get('content-type')).toBe('text/javascript; charset=utf-8')
    expect(await script.text()).toBe('export const ready = true')
    const style = await handler()({ url: 'rodwave-app://bundle/assets/style.css' })
    expect(style.headers.get('content-type')).toBe('text/css; charset=utf-8')
  })

  it('answers 404 with the CSP header for a missing file', async () => {
    const response = await handler()({ url: 'rodwave-app://bundle/assets/missing.js' })
    expect(response.status).toBe(404)
    expect(response.headers.get('content-security-policy')).toBe(REQUIRED_CSP)
  })

  it.each([
    'rodwave-app://bundle/..%2f..%2fsecret.txt',
    'rodwave-app://bundle/assets/..%2F..%2F..%2Fsecret.txt',
    'rodwave-app://bundle/..%5c..%5csecret.txt',
    'rodwave-app://bundle/%2Fetc%2Fpasswd',
    'rodwave-app://bundle/C:%5CWindows%5Cwin.ini',
    'rodwave-app://bundle/index.html%00.png',
    'rodwave-app://elsewhere/index.html',
    'https://bundle/index.html',
  ])('refuses %s with 403 and reads nothing', async (url) => {
    const readSpy = vi.fn((path: string) => readFile(path))
    const response = await createAppProtocolHandler({ rootDir: root, readFile: readSpy })({ url })
    expect(response.status).toBe(403)
    expect(response.headers.get('content-security-policy')).toBe(REQUIRED_CSP)
    expect(readSpy).not.toHaveBeenCalled()
  })

  it('keeps dot segments the URL parser resolves inside the renderer folder', async () => {
    expect(resolveBundlePath(root, 'rodwave-app://bundle/../../secret.txt')).toBe(join(root, 'secret.txt'))
    expect(resolveBundlePath(root, 'rodwave-app://bundle/%2e%2e/%2e%2e/secret.txt')).toBe(join(root, 'secret.txt'))
    expect(resolveBundlePath(root, 'rodwave-app://bundle/a/../index.html')).toBe(join(root, 'index.html'))
    // So the file beside the folder is never reached: the request finds nothing inside it.
    const response = await handler()({ url: 'rodwave-app://bundle/%2e%2e/%2e%2e/secret.txt' })
    expect(response.status).toBe(404)
    expect(await response.text()).not.toContain('must not be served')
  })

  it('allows only GET and HEAD', async () => {
    expect((await handler()({ url: APP_ENTRY_URL, method: 'POST' })).status).toBe(405)
    const head = await handler()({ url: APP_ENTRY_URL, method: 'HEAD' })
    expect(head.status).toBe(200)
    expect(await head.text()).toBe('')
  })
})
