/**
 * electron/main.ts wired to a mocked Electron: the scheme, the sandbox, the window's
 * options, the protocol handler, the IPC channels, the permission handlers, the title and
 * the close guard, as the real app would set them up.
 */
import { mkdir, mkdtemp, rm, writeFile } from 'node:fs/promises'
import { tmpdir } from 'node:os'
import { isAbsolute, join } from 'node:path'
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest'
import { CHANNELS } from '../../electron/ipc-contract'
import { INVOKE_CHANNELS } from '../../electron/ipc-handlers'

type Listener = (...args: unknown[]) => unknown

const mock = vi.hoisted(() => {
  const appListeners = new Map<string, Listener>()
  const windows: FakeWindow[] = []
  let appPath = ''

  class FakeEmitter {
    listeners = new Map<string, Listener[]>()
    on(event: string, listener: Listener) {
      this.listeners.set(event, [...(this.listeners.get(event) ?? []), listener])
      return this
    }
    once(event: string, listener: Listener) {
      return this.on(event, listener)
    }
    emit(event: string, ...args: unknown[]) {
      for (const listener of this.listeners.get(event) ?? []) listener(...args)
    }
  }

  class FakeWebContents extends FakeEmitter {
    mainFrame = { url: 'rodwave-app://bundle/index.html' }
    send = vi.fn()
    setWindowOpenHandler = vi.fn()
    reload = vi.fn()
    session = { webRequest: { onBeforeRequest: vi.fn() } }
  }

  class FakeWindow extends FakeEmitter {
    webContents = new FakeWebContents()
    destroyed = false
    constructor(public options: Record<string, unknown>) {
      super()
      windows.push(this)
    }
    loadURL = vi.fn(async () => undefined)
    setTitle = vi.fn()
    setDocumentEdited = vi.fn()
    show = vi.fn()
    close = vi.fn()
    isDestroyed() {
      return this.destroyed
    }
    isMinimized() {
      return false
    }
    restore = vi.fn()
    focus = vi.fn()
  }

  const fakeSession = () => ({ setPermissionRequestHandler: vi.fn(), setPermissionCheckHandler: vi.fn(), setDevicePermissionHandler: vi.fn() })
  const sessions = { defaultSession: fakeSession(), partitions: new Map<string, ReturnType<typeof fakeSession>>() }

  return {
    appListeners,
    windows,
    sessions,
    setAppPath: (path: string) => {
      appPath = path
    },
    electron: {
      app: {
        isPackaged: false,
        enableSandbox: vi.fn(),
        setName: vi.fn(),
        getAppPath: () => appPath,
        getPath: (name: string) => `${appPath}/${name}`,
        getVersion: () => '0.1.0',
        whenReady: vi.fn(async () => undefined),
        isReady: () => true,
        on: vi.fn((event: string, listener: Listener) => appListeners.set(event, listener)),
        quit: vi.fn(),
        requestSingleInstanceLock: vi.fn(() => true),
        setAppUserModelId: vi.fn(),
      },
      BrowserWindow: FakeWindow,
      Menu: { buildFromTemplate: vi.fn((template: unknown) => ({ template })), setApplicationMenu: vi.fn() },
      dialog: {
        showMessageBox: vi.fn(async () => ({ response: 2 })),
        showOpenDialog: vi.fn(),
        showSaveDialog: vi.fn(),
        showErrorBox: vi.fn(),
      },
      ipcMain: { handle: vi.fn() },
      nativeTheme: { shouldUseDarkColors: false },
      protocol: { registerSchemesAsPrivileged: vi.fn(), handle: vi.fn() },
      session: {
        defaultSession: sessions.defaultSession,
        fromPartition: vi.fn((name: string) => {
          if (!sessions.partitions.has(name)) sessions.partitions.set(name, fakeSession())
          return sessions.partitions.get(name)!
        }),
      },
    },
  }
})

vi.mock('electron', () => mock.electron)

const { app, protocol, ipcMain, Menu, dialog } = mock.electron
let appRoot: string

beforeAll(async () => {
  appRoot = await mkdtemp(join(tmpdir(), 'rodwave-main-'))
  await mkdir(join(appRoot, 'dist', 'renderer'), { recursive: true })
  await mkdir(join(appRoot, 'userData'))
  await writeFile(join(appRoot, 'dist', 'renderer', 'index.html'), '<!doctype html><title>Rodwave</title>')
  mock.setAppPath(appRoot)
  await import('../../electron/main')
  await vi.waitFor(() => expect(mock.windows).toHaveLength(1))
})

afterAll(async () => {
  await rm(appRoot, { recursive: true, force: true })
})

const window = () => mock.windows[0]!

describe('start-up', () => {
  it('registers the app scheme as privileged (standard, secure, CSP not bypassed) and sandboxes every renderer', () => {
    expect(protocol.registerSchemesAsPrivileged).toHaveBeenCalledOnce()
    const [schemes] = protocol.registerSchemesAsPrivileged.mock.calls[0]! as unknown as [{ scheme: string; privileges: Record<string, boolean> }[]]
    expect(schemes).toHaveLength(1)
    expect(schemes[0]!.scheme).toBe('rodwave-app')
    expect(schemes[0]!.privileges).toMatchObject({ standard: true, secure: true })
    expect(schemes[0]!.privileges.bypassCSP).toBeUndefined()
    expect(app.enableSandbox).toHaveBeenCalledOnce()
  })

  it('opens one window with the secure web preferences and the bundled preload', () => {
    const web = window().options.webPreferences as Record<string, unknown>
    expect(web).toMatchObject({ contextIsolation: true, sandbox: true, nodeIntegration: false, webviewTag: false, webSecurity: true })
    expect(isAbsolute(web.preload as string)).toBe(true)
    expect(web.preload as string).toMatch(/[/\\]preload\.cjs$/)
  })

  it('loads the renderer through the app scheme, not file://', () => {
    expect(window().loadURL).toHaveBeenCalledExactlyOnceWith('rodwave-app://bundle/index.html')
  })

  it('serves dist/renderer through the scheme with the CSP header, refusing traversal', async () => {
    expect(protocol.handle).toHaveBeenCalledOnce()
    const [scheme, handler] = protocol.handle.mock.calls[0]! as unknown as [string, (request: { url: string; method: string }) => Promise<Response>]
    expect(scheme).toBe('rodwave-app')
    const page = await handler({ url: 'rodwave-app://bundle/index.html', method: 'GET' })
    expect(page.status).toBe(200)
    expect(page.headers.get('content-security-policy')).toMatch(/^default-src 'self'; script-src 'self';/)
    expect(await page.text()).toContain('<title>Rodwave</title>')
    expect((await handler({ url: 'rodwave-app://bundle/..%2F..%2Fetc%2Fpasswd', method: 'GET' })).status).toBe(403)
  })

  it('registers the contract’s invoke channels and no other', () => {
    const channels = ipcMain.handle.mock.calls.map((call) => (call as unknown as [string])[0]).sort()
    expect(channels).toEqual([...INVOKE_CHANNELS].sort())
  })

  it('denies permissions in the default session and in the PDF session', () => {
    const callback = vi.fn()
    const request = mock.sessions.defaultSession.setPermissionRequestHandler.mock.calls[0]![0] as Listener
    request({}, 'media', callback)
    expect(callback).toHaveBeenCalledWith(false)
    expect(mock.sessions.partitions.size).toBe(1)
    expect([...mock.sessions.partitions.values()][0]!.setPermissionRequestHandler).toHaveBeenCalledOnce()
  })

  it('guards every web contents created (navigation and new windows)', () => {
    const created = mock.appListeners.get('web-contents-created')!
    const contents = { on: vi.fn(), setWindowOpenHandler: vi.fn() }
    created({}, contents)
    expect(contents.on.mock.calls.map(([event]) => event)).toEqual(expect.arrayContaining(['will-navigate', 'will-attach-webview']))
    const openHandler = contents.setWindowOpenHandler.mock.calls[0]![0] as () => unknown
    expect(openHandler()).toEqual({ action: 'deny' })
  })

  it('installs the application menu', () => {
    expect(Menu.setApplicationMenu).toHaveBeenCalled()
    const template = (Menu.buildFromTemplate.mock.calls.at(-1)![0] as { label?: string }[]).map((menu) => menu.label)
    expect(template).toEqual(expect.arrayContaining(['File', 'Edit', 'View', 'Help']))
  })
})

describe('document state and closing', () => {
  const handler = (channel: string) => ipcMain.handle.mock.calls.find((call) => (call as unknown as [string])[0] === channel)![1] as unknown as Listener
  const fromWindow = () => ({ sender: window().webContents, senderFrame: window().webContents.mainFrame })

  it('keeps the page from setting the frame title', () => {
    const event = { preventDefault: vi.fn() }
    window().emit('page-title-updated', event)
    expect(event.preventDefault).toHaveBeenCalledOnce()
  })

  it('shows the document title with the unsaved-changes bullet', async () => {
    await handler(CHANNELS.setDocumentState)(fromWindow(), { dirty: true, title: 'Hanger HR-7' })
    expect(window().setTitle).toHaveBeenLastCalledWith('• Hanger HR-7 — Rodwave')
  })

  it('asks Save / Don’t save / Cancel before closing unsaved work, and Cancel keeps it open', async () => {
    const event = { preventDefault: vi.fn() }
    window().emit('close', event)
    expect(event.preventDefault).toHaveBeenCalledOnce()
    await vi.waitFor(() => expect(dialog.showMessageBox).toHaveBeenCalled())
    const options = dialog.showMessageBox.mock.calls.at(-1)!.at(-1) as unknown as { buttons: string[]; cancelId: number; message: string }
    expect(options.buttons).toEqual(['Save', "Don't save", 'Cancel'])
    expect(options.cancelId).toBe(2)
    expect(options.message).toContain('Hanger HR-7')
    await new Promise((done) => setImmediate(done))
    expect(window().close).not.toHaveBeenCalled()
  })

  it('refuses the same call from a subframe, logging why', async () => {
    const log = vi.spyOn(console, 'error').mockImplementation(() => undefined)
    await expect(handler(CHANNELS.setDocumentState)({ sender: window().webContents, senderFrame: { url: 'rodwave-app://bundle/index.html' } }, { dirty: false, title: 'x' })).rejects.toThrow(
      /subframe/,
    )
    expect(log).toHaveBeenCalledWith('[rodwave] rodwave:set-document-state: Document state was refused: the request came from a subframe.')
    log.mockRestore()
  })
})

describe('About Rodwave and the third-party notices', () => {
  type MenuItem = { label?: string; submenu?: MenuItem[]; click?: () => void }
  const aboutItem = () => {
    const template = Menu.buildFromTemplate.mock.calls.at(-1)![0] as MenuItem[]
    return template.flatMap((menu) => menu.submenu ?? []).find((item) => item.label === 'About Rodwave')!
  }

  it('offers the notices from the About box and shows them in a window without script, closed with the main window', async () => {
    dialog.showMessageBox.mockResolvedValueOnce({ response: 1 })
    const before = mock.windows.length
    aboutItem().click!()
    await vi.waitFor(() => expect(mock.windows).toHaveLength(before + 1))
    const options = dialog.showMessageBox.mock.calls.at(-1)!.at(-1) as unknown as { buttons: string[]; detail: string }
    expect(options.buttons).toEqual(['Close', 'Third-party notices'])
    expect(options.detail).toContain('Verify them on the real part')
    expect(options.detail).toContain('see Third-party notices')
    const notices = mock.windows.at(-1)!
    expect(notices.options.parent).toBe(window())
    expect(notices.options.webPreferences).toMatchObject({ javascript: false, sandbox: true, contextIsolation: true, nodeIntegration: false })
    expect((notices.options.webPreferences as { preload?: string }).preload).toBeUndefined()
    expect(notices.loadURL).toHaveBeenCalledExactlyOnceWith('rodwave-app://bundle/third-party-notices.txt')

    // A second click brings the same window forward.
    dialog.showMessageBox.mockResolvedValueOnce({ response: 1 })
    aboutItem().click!()
    await vi.waitFor(() => expect(notices.focus).toHaveBeenCalled())
    expect(mock.windows).toHaveLength(before + 1)
  })

  it('serves the notices file the build writes beside the window, as plain text', async () => {
    await writeFile(join(appRoot, 'dist', 'renderer', 'third-party-notices.txt'), 'zod 4.6.7 (MIT)\n')
    const [, handler] = protocol.handle.mock.calls[0]! as unknown as [string, (request: { url: string; method: string }) => Promise<Response>]
    const response = await handler({ url: 'rodwave-app://bundle/third-party-notices.txt', method: 'GET' })
    expect(response.status).toBe(200)
    expect(response.headers.get('content-type')).toBe('text/plain; charset=utf-8')
    expect(await response.text()).toBe('zod 4.6.7 (MIT)\n')
  })

  it('closes the dialog without opening anything on Close', async () => {
    dialog.showMessageBox.mockResolvedValueOnce({ response: 0 })
    const before = mock.windows.length
    aboutItem().click!()
    await new Promise((done) => setImmediate(done))
    expect(mock.windows).toHaveLength(before)
  })
})
