/**
 * IPC: one handler per contract channel and no other; every call from a foreign sender or
 * with bad arguments is refused with a clear message before any service runs.
 */
import { beforeEach, describe, expect, it, vi } from 'vitest'
import { CHANNELS } from '../../electron/ipc-contract'
import { INVOKE_CHANNELS, registerIpcHandlers, type ShellServices } from '../../electron/ipc-handlers'
import { MAX_PROJECT_BYTES, MAX_TITLE_LENGTH } from '../../electron/ipc-validation'
import type { IpcSenderInfo } from '../../electron/sender-check'

vi.mock('electron', () => ({}))

type Listener = (event: IpcSenderInfo, ...args: unknown[]) => Promise<unknown>

const APP_URL = 'rodwave-app://bundle/index.html'

function setup() {
  const handlers = new Map<string, Listener>()
  const ipcMain = { handle: vi.fn((channel: string, listener: Listener) => handlers.set(channel, listener)) }
  const mainFrame = { url: APP_URL }
  const webContents = { mainFrame }
  const window = { webContents, isDestroyed: () => false }
  const services = {
    files: {
      openProject: vi.fn(async () => ({ kind: 'cancelled' as const })),
      openRecent: vi.fn(async (path: string) => ({ kind: 'opened' as const, path, name: 'x.rodwave.json', text: '{}' })),
      saveProject: vi.fn(async () => ({ kind: 'saved' as const, path: '/p/x.rodwave.json', name: 'x.rodwave.json' })),
      exportFile: vi.fn(async () => ({ kind: 'saved' as const, path: '/p/x.csv', name: 'x.csv' })),
      demoProject: vi.fn(async () => ({ name: 'demo.rodwave.json', text: '{}' })),
    },
    recentFiles: { list: vi.fn(async () => ['/p/x.rodwave.json']), add: vi.fn(), has: vi.fn(), clear: vi.fn() },
    recovery: {
      write: vi.fn(async () => undefined),
      startSession: vi.fn(async () => [{ id: 'mhx1-0123456789ab', text: 'autosaved', savedAt: null }]),
      clear: vi.fn(async () => undefined),
      settle: vi.fn(async () => undefined),
    },
    closeGuard: { documentChanged: vi.fn(), saveStarted: vi.fn(), saveFinished: vi.fn(), saveRefused: vi.fn() },
  } satisfies ShellServices
  const log = vi.fn()
  const registered = registerIpcHandlers({ ipcMain, trustedWindow: () => window, services, log })
  const trusted: IpcSenderInfo = { sender: webContents, senderFrame: mainFrame }
  const call = (channel: string, event: IpcSenderInfo, ...args: unknown[]) => handlers.get(channel)!(event, ...args)
  const serviceCalls = () =>
    [...Object.values(services.files), ...Object.values(services.recentFiles), ...Object.values(services.recovery), ...Object.values(services.closeGuard)].reduce(
      (sum, mock) => sum + mock.mock.calls.length,
      0,
    )
  return { handlers, ipcMain, registered, services, trusted, call, webContents, mainFrame, serviceCalls, log }
}

/** Every channel with a valid argument, so each refusal below is due to the one thing changed. */
const VALID_ARGUMENTS: Record<string, unknown[]> = {
  [CHANNELS.openProject]: [],
  [CHANNELS.openRecent]: ['/home/eng/hanger.rodwave.json'],
  [CHANNELS.saveProject]: [{ path: null, suggestedName: 'Hanger', text: '{}' }],
  [CHANNELS.exportFile]: [{ kind: 'csv', suggestedName: 'Hanger', content: 'mode,Hz\n1,100\n' }],
  [CHANNELS.recentFiles]: [],
  [CHANNELS.demoProject]: [],
  [CHANNELS.setDocumentState]: [{ dirty: true, title: 'Hanger' }],
  [CHANNELS.writeRecovery]: ['{}'],
  [CHANNELS.readRecovery]: [],
  [CHANNELS.clearRecovery]: [],
  [CHANNELS.settleRecovery]: ['mhx1-0123456789ab'],
  [CHANNELS.saveRefused]: [],
}

const RESULT_CHANNELS = new Set<string>([CHANNELS.openProject, CHANNELS.openRecent, CHANNELS.saveProject, CHANNELS.exportFile])

/** A refusal as the window sees it: an `error` result, or a rejection; returns the message. */
async function refusalMessage(channel: string, outcome: Promise<unknown>): Promise<string> {
  if (RESULT_CHANNELS.has(channel)) {
    const result = (await outcome) as { kind: string; message: string }
    expect(result.kind).toBe('error')
    return result.message
  }
  const error = await outcome.then(
    () => {
      throw new Error(`${channel} was not refused`)
    },
    (reason: unknown) => reason as Error,
  )
  return error.message
}

describe('registration', () => {
  it('registers exactly the invoke channels of the contract', () => {
    const { registered, ipcMain } = setup()
    const expected = Object.values(CHANNELS).filter((channel) => channel !== CHANNELS.menuCommand && channel !== CHANNELS.openRecentRequest)
    expect([...registered].sort()).toEqual([...expected].sort())
    expect([...INVOKE_CHANNELS].sort()).toEqual([...expected].sort())
    expect(ipcMain.handle.mock.calls.map(([channel]) => channel).sort()).toEqual([...expected].sort())
  })

  it('handles no event channel and no unknown channel', () => {
    const { handlers } = setup()
    expect(handlers.has(CHANNELS.menuCommand)).toBe(false)
    expect(handlers.has(CHANNELS.openRecentRequest)).toBe(false)
    expect(handlers.has('rodwave:read-any-file')).toBe(false)
    expect([...handlers.keys()].every((channel) => channel.startsWith('rodwave:'))).toBe(true)
  })

  it('passes a trusted, valid call through to its service', async () => {
    const { call, trusted, services } = setup()
    expect(await call(CHANNELS.recentFiles, trusted)).toEqual(['/p/x.rodwave.json'])
    expect(await call(CHANNELS.readRecovery, trusted)).toEqual([{ id: 'mhx1-0123456789ab', text: 'autosaved', savedAt: null }])
    await call(CHANNELS.settleRecovery, trusted, 'mhx1-0123456789ab')
    expect(services.recovery.settle).toHaveBeenCalledWith('mhx1-0123456789ab')
    await call(CHANNELS.openRecent, trusted, '/home/eng/hanger.rodwave.json')
    expect(services.files.openRecent).toHaveBeenCalledWith('/home/eng/hanger.rodwave.json')
    await call(CHANNELS.setDocumentState, trusted, { dirty: true, title: 'Hanger' })
    expect(services.closeGuard.documentChanged).toHaveBeenCalledWith({ dirty: true, title: 'Hanger' })
  })

  it('tells the close guard when the window refuses a save', async () => {
    const { call, trusted, services } = setup()
    await call(CHANNELS.saveRefused, trusted)
    expect(services.closeGuard.saveRefused).toHaveBeenCalledOnce()
  })

  it('shortens a title too long for the frame instead of refusing the state, so the unsaved mark always arrives', async () => {
    const { call, trusted, services } = setup()
    const title = 'Hanger rod '.repeat(60)
    await call(CHANNELS.setDocumentState, trusted, { dirty: true, title })
    expect(services.closeGuard.documentChanged).toHaveBeenCalledOnce()
    const state = services.closeGuard.documentChanged.mock.calls[0]![0] as { dirty: boolean; title: string }
    expect(state.dirty).toBe(true)
    expect(state.title).toHaveLength(MAX_TITLE_LENGTH)
    expect(state.title).toBe(`${title.slice(0, MAX_TITLE_LENGTH - 1)}…`)
  })

  it('tells the close guard when a save starts and how it ended', async () => {
    const { call, trusted, services } = setup()
    await call(CHANNELS.saveProject, trusted, { path: null, suggestedName: 'Hanger', text: '{}' })
    expect(services.closeGuard.saveStarted).toHaveBeenCalledOnce()
    expect(services.closeGuard.saveFinished).toHaveBeenCalledWith({ kind: 'saved', path: '/p/x.rodwave.json', name: 'x.rodwave.json' })
  })
})

describe('foreign senders', () => {
  let context: ReturnType<typeof setup>
  beforeEach(() => {
    context = setup()
  })

  const foreign: Record<string, (c: ReturnType<typeof setup>) => IpcSenderInfo> = {
    'a frame that is gone': (c) => ({ sender: c.webContents, senderFrame: null }),
    'a page from another origin': (c) => ({ sender: c.webContents, senderFrame: Object.assign(c.mainFrame, { url: 'https://example.com/' }) }),
    'a file:// page': (c) => ({ sender: c.webContents, senderFrame: Object.assign(c.mainFrame, { url: 'file:///tmp/index.html' }) }),
    'a subframe of the app window': (c) => ({ sender: c.webContents, senderFrame: { url: APP_URL } }),
    'another window': () => ({ sender: { mainFrame: { url: APP_URL } }, senderFrame: { url: APP_URL } }),
  }

  for (const [who, makeEvent] of Object.entries(foreign)) {
    it(`refuses every channel when called from ${who}`, async () => {
      for (const channel of INVOKE_CHANNELS) {
        const message = await refusalMessage(channel, context.call(channel, makeEvent(context), ...VALID_ARGUMENTS[channel]!))
        expect(message).toMatch(/was refused: the (sending frame is gone|request came from)/)
      }
      expect(context.serviceCalls()).toBe(0)
    })
  }

  it('refuses everything when there is no window', async () => {
    const handlers = new Map<string, Listener>()
    const { services } = setup()
    registerIpcHandlers({ ipcMain: { handle: (channel, listener) => handlers.set(channel, listener) }, trustedWindow: () => null, services })
    const result = await handlers.get(CHANNELS.openProject)!({ sender: {}, senderFrame: { url: APP_URL } })
    expect(result).toEqual({ kind: 'error', message: 'Open project was refused: Rodwave has no open window.' })
  })
})

describe('bad arguments', () => {
  const oversized = 'x'.repeat(MAX_PROJECT_BYTES + 1)
  const cases: [string, string, unknown[], RegExp][] = [
    ['save with a number as text', CHANNELS.saveProject, [{ path: null, suggestedName: 'a', text: 42 }], /text: .*expected string/i],
    ['save with a path that is not a string', CHANNELS.saveProject, [{ path: 7, suggestedName: 'a', text: '{}' }], /path: /],
    ['save with a relative path', CHANNELS.saveProject, [{ path: 'relative/x.json', suggestedName: 'a', text: '{}' }], /path: must be an absolute path/],
    ['save with more than 20 MB of text', CHANNELS.saveProject, [{ path: null, suggestedName: 'a', text: oversized }], /text: must be at most 20\.0 MB/],
    ['save without a request', CHANNELS.saveProject, [], /request: /],
    ['open recent with a number', CHANNELS.openRecent, [12], /request: .*expected string/i],
    ['open recent with an object', CHANNELS.openRecent, [{ path: '/x' }], /request: .*expected string/i],
    ['open recent with a NUL in the path', CHANNELS.openRecent, ['/tmp/a\0b'], /must not contain a NUL character/],
    ['open recent with an overlong path', CHANNELS.openRecent, [`/${'a'.repeat(5000)}`], /must be at most 4096 characters/],
    ['export of an unknown kind', CHANNELS.exportFile, [{ kind: 'docx', suggestedName: 'a', content: '' }], /kind: /],
    ['document state with a string flag', CHANNELS.setDocumentState, [{ dirty: 'yes', title: 'a' }], /dirty: /],
    ['recovery text that is not a string', CHANNELS.writeRecovery, [{ text: '{}' }], /request: /],
    ['recovery text over 20 MB', CHANNELS.writeRecovery, [oversized], /must be at most 20\.0 MB/],
    ['a recovery id that is a path', CHANNELS.settleRecovery, ['../../.bashrc'], /request: must name a recovery copy/],
    ['an argument to a request that takes none', CHANNELS.recentFiles, ['/etc'], /this request takes no argument/],
    ['two arguments', CHANNELS.openRecent, ['/a.json', '/b.json'], /at most one argument, got 2/],
  ]

  it.each(cases)('refuses %s, naming the field, and calls no service', async (_what, channel, args, message) => {
    const context = setup()
    const text = await refusalMessage(channel, context.call(channel, context.trusted, ...args))
    expect(text).toMatch(/was refused/)
    expect(text).toMatch(message)
    expect(context.serviceCalls()).toBe(0)
  })
})

describe('failures inside a service', () => {
  it('answer with a short message, never a stack trace', async () => {
    const context = setup()
    context.services.recovery.startSession.mockRejectedValueOnce(Object.assign(new Error('EACCES: permission denied, open /home/eng/.config/Rodwave/unsaved'), { code: 'EACCES' }))
    const message = await refusalMessage(CHANNELS.readRecovery, context.call(CHANNELS.readRecovery, context.trusted))
    expect(message).toBe('Read recovery copy failed: EACCES: permission denied, open /home/eng/.config/Rodwave/unsaved')
    expect(message).not.toMatch(/\n\s+at /)
    // The full error, stack included, goes to the main process log.
    expect(context.log.mock.calls.at(-1)![0]).toMatch(/\n\s+at /)
  })

  it('turn into an error result where the channel has one', async () => {
    const context = setup()
    context.services.files.saveProject.mockRejectedValueOnce(new Error('unexpected'))
    const result = await context.call(CHANNELS.saveProject, context.trusted, { path: null, suggestedName: 'a', text: '{}' })
    expect(result).toEqual({ kind: 'error', message: 'Save project failed: unexpected' })
    expect(context.services.closeGuard.saveFinished).toHaveBeenCalledWith(expect.objectContaining({ kind: 'error' }))
  })
})
