/**
 * The preload exposes one object, window.rodwave, implementing the bridge of the contract;
 * never ipcRenderer itself. Electron is mocked: contextBridge records what is exposed.
 */
import { beforeAll, describe, expect, it, vi } from 'vitest'
import { CHANNELS, type RodwaveBridge } from '../../electron/ipc-contract'

const electron = vi.hoisted(() => {
  const listeners = new Map<string, Set<(event: unknown, payload: unknown) => void>>()
  return {
    listeners,
    exposeInMainWorld: vi.fn(),
    ipcRenderer: {
      invoke: vi.fn(async (...args: unknown[]) => ({ echoed: args })),
      on: vi.fn((channel: string, listener: (event: unknown, payload: unknown) => void) => {
        if (!listeners.has(channel)) listeners.set(channel, new Set())
        listeners.get(channel)!.add(listener)
      }),
      removeListener: vi.fn((channel: string, listener: (event: unknown, payload: unknown) => void) => {
        listeners.get(channel)?.delete(listener)
      }),
    },
    emit(channel: string, payload: unknown) {
      for (const listener of listeners.get(channel) ?? []) listener({ sender: 'ipc-event' }, payload)
    },
  }
})

vi.mock('electron', () => ({ contextBridge: { exposeInMainWorld: electron.exposeInMainWorld }, ipcRenderer: electron.ipcRenderer }))

let bridge: RodwaveBridge
beforeAll(async () => {
  await import('../../electron/preload')
  bridge = electron.exposeInMainWorld.mock.calls[0]![1] as RodwaveBridge
})

describe('preload', () => {
  it('exposes exactly one object, as "rodwave"', () => {
    expect(electron.exposeInMainWorld).toHaveBeenCalledOnce()
    expect(electron.exposeInMainWorld.mock.calls[0]![0]).toBe('rodwave')
  })

  it('exposes the bridge methods and nothing else, and never ipcRenderer', () => {
    expect(Object.keys(bridge).sort()).toEqual(
      [
        'platform',
        'openProject',
        'openRecent',
        'saveProject',
        'exportFile',
        'recentFiles',
        'demoProject',
        'setDocumentState',
        'saveRefused',
        'writeRecovery',
        'readRecovery',
        'clearRecovery',
        'settleRecovery',
        'onMenuCommand',
        'onOpenRecentRequest',
      ].sort(),
    )
    expect(bridge.platform).toBe('electron')
    expect(Object.values(bridge)).not.toContain(electron.ipcRenderer)
    expect(Object.values(bridge)).not.toContain(electron.ipcRenderer.invoke)
  })

  it.each([
    ['openProject', [], CHANNELS.openProject],
    ['openRecent', ['/home/eng/a.rodwave.json'], CHANNELS.openRecent],
    ['saveProject', [{ path: null, suggestedName: 'a', text: '{}' }], CHANNELS.saveProject],
    ['exportFile', [{ kind: 'csv', suggestedName: 'a', content: 'x' }], CHANNELS.exportFile],
    ['recentFiles', [], CHANNELS.recentFiles],
    ['demoProject', [], CHANNELS.demoProject],
    ['setDocumentState', [{ dirty: true, title: 'a' }], CHANNELS.setDocumentState],
    ['saveRefused', [], CHANNELS.saveRefused],
    ['writeRecovery', ['{}'], CHANNELS.writeRecovery],
    ['readRecovery', [], CHANNELS.readRecovery],
    ['clearRecovery', [], CHANNELS.clearRecovery],
    ['settleRecovery', ['mhx1-0123456789ab'], CHANNELS.settleRecovery],
  ] as const)('%s invokes its own channel with its argument', async (method, args, channel) => {
    electron.ipcRenderer.invoke.mockClear()
    const call = bridge[method] as (...a: unknown[]) => Promise<unknown>
    await expect(call(...args)).resolves.toEqual({ echoed: [channel, ...args] })
    expect(electron.ipcRenderer.invoke).toHaveBeenCalledExactlyOnceWith(channel, ...args)
  })

  it('passes known menu commands to the listener without the IPC event, ignores unknown ones, and unsubscribes', () => {
    const listener = vi.fn()
    const unsubscribe = bridge.onMenuCommand(listener)
    electron.emit(CHANNELS.menuCommand, 'save')
    electron.emit(CHANNELS.menuCommand, 'format-disk')
    electron.emit(CHANNELS.menuCommand, { command: 'save' })
    expect(listener.mock.calls).toEqual([['save']])
    unsubscribe()
    electron.emit(CHANNELS.menuCommand, 'open')
    expect(listener).toHaveBeenCalledOnce()
  })

  it('passes Open recent choices (paths) to the listener', () => {
    const listener = vi.fn()
    const unsubscribe = bridge.onOpenRecentRequest!(listener)
    electron.emit(CHANNELS.openRecentRequest, '/home/eng/a.rodwave.json')
    electron.emit(CHANNELS.openRecentRequest, 12)
    expect(listener.mock.calls).toEqual([['/home/eng/a.rodwave.json']])
    unsubscribe()
  })
})
