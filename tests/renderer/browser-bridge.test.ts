// @vitest-environment happy-dom
/**
 * The browser's bridge (the web build): a file's size is checked before it is read and its
 * bytes go to the solver worker undecoded; a PDF export says that it opened the print
 * dialog; recovery copies per page load in localStorage, kept until the user answers the offer.
 */
import { afterEach, describe, expect, it, vi } from 'vitest'
import { MAX_PROJECT_BYTES } from '../../core/model/project-bytes'
import { createBrowserBridge } from '../../renderer/bridge/browser-bridge'

/** localStorage's interface over a Map (the Web Storage API: key(), length, getItem, setItem, removeItem). */
class MemoryStorage implements Storage {
  private readonly items = new Map<string, string>()
  get length(): number {
    return this.items.size
  }
  clear(): void {
    this.items.clear()
  }
  getItem(key: string): string | null {
    return this.items.get(key) ?? null
  }
  key(index: number): string | null {
    return [...this.items.keys()][index] ?? null
  }
  removeItem(key: string): void {
    this.items.delete(key)
  }
  setItem(key: string, value: string): void {
    this.items.set(key, value)
  }
}

describe('browser bridge: recovery copies', () => {
  it('keeps each page load’s copy apart: an earlier load’s copy survives the next load’s autosave and clear', async () => {
    const storage = new MemoryStorage()
    const crashed = createBrowserBridge({ storage })
    expect(await crashed.readRecovery()).toEqual([])
    await crashed.writeRecovery('work of the tab that crashed')

    const next = createBrowserBridge({ storage })
    const offered = await next.readRecovery()
    expect(offered.map((copy) => copy.text)).toEqual(['work of the tab that crashed'])
    expect(Number.isNaN(Date.parse(offered[0]!.savedAt!))).toBe(false)
    await next.writeRecovery('new edits')
    await next.clearRecovery()

    const third = createBrowserBridge({ storage })
    expect((await third.readRecovery()).map((copy) => copy.text)).toEqual(['work of the tab that crashed'])
  })

  it('removes an earlier copy once settled, and only copies it offered', async () => {
    const storage = new MemoryStorage()
    const first = createBrowserBridge({ storage })
    await first.readRecovery()
    await first.writeRecovery('copy A')
    const second = createBrowserBridge({ storage })
    const [copy] = await second.readRecovery()
    await second.settleRecovery('someone-else')
    await second.settleRecovery(copy!.id)
    expect(await createBrowserBridge({ storage }).readRecovery()).toEqual([])
    expect(storage.length).toBe(0)
  })

  it('offers the single key of earlier versions as an earlier copy', async () => {
    const storage = new MemoryStorage()
    storage.setItem('rodwave.recovery', 'from version 0.1')
    const bridge = createBrowserBridge({ storage })
    expect(await bridge.readRecovery()).toEqual([{ id: 'legacy', text: 'from version 0.1', savedAt: null }])
    await bridge.settleRecovery('legacy')
    expect(storage.getItem('rodwave.recovery')).toBeNull()
  })
})

/** A file as the file picker hands it over, recording whether the page read it. */
function pickedFile(name: string, size: number, content: Uint8Array = new Uint8Array(0)) {
  const read = { arrayBuffer: vi.fn(async () => content.slice().buffer), text: vi.fn(async () => new TextDecoder().decode(content)) }
  return { file: { name, size, ...read } as unknown as File, read }
}

/** The user picks `file` in the dialog the bridge opens (a transient file input). */
function userPicks(file: File): void {
  vi.spyOn(HTMLInputElement.prototype, 'click').mockImplementation(function (this: HTMLInputElement) {
    Object.defineProperty(this, 'files', { value: [file], configurable: true })
    this.dispatchEvent(new Event('change'))
  })
}

describe('browser bridge: opening a file', () => {
  afterEach(() => {
    vi.restoreAllMocks()
  })

  it('refuses a file over 20 MB from its size alone, without reading it', async () => {
    const { file, read } = pickedFile('huge.rodwave.json', MAX_PROJECT_BYTES + 1)
    userPicks(file)
    const result = await createBrowserBridge({ storage: new MemoryStorage() }).openProject()
    expect(result).toEqual({ kind: 'error', message: 'Could not open "huge.rodwave.json": it is 20.0 MB, and Rodwave opens project files up to 20.0 MB.' })
    expect(read.arrayBuffer).not.toHaveBeenCalled()
    expect(read.text).not.toHaveBeenCalled()
  })

  it('hands over the bytes undecoded (the worker decodes and parses them) and remembers a small file for Open recent', async () => {
    const text = '{"format":"rodwave","title":"Ø 24 rod"}'
    const bytes = new TextEncoder().encode(text)
    const { file, read } = pickedFile('rod.rodwave.json', bytes.byteLength, bytes)
    userPicks(file)
    const bridge = createBrowserBridge({ storage: new MemoryStorage() })
    const result = await bridge.openProject()
    expect(result).toEqual({ kind: 'opened', path: 'rod.rodwave.json', name: 'rod.rodwave.json', bytes })
    expect(read.text).not.toHaveBeenCalled()
    expect(await bridge.recentFiles()).toEqual(['rod.rodwave.json'])
    expect(await bridge.openRecent('rod.rodwave.json')).toEqual({ kind: 'opened', path: 'rod.rodwave.json', name: 'rod.rodwave.json', text })
  })
})

describe('browser bridge: report as PDF', () => {
  afterEach(() => {
    vi.restoreAllMocks()
  })

  it('says that it opened the print dialog, not that a PDF was exported', async () => {
    const view = { addEventListener: vi.fn(), print: vi.fn() }
    vi.spyOn(window, 'open').mockReturnValue(view as unknown as Window)
    const result = await createBrowserBridge({ storage: new MemoryStorage() }).exportFile({ kind: 'pdf', suggestedName: 'hanger-report.pdf', content: '<!doctype html><title>r</title>' })
    expect(result).toEqual({ kind: 'print-dialog', name: 'hanger-report.pdf' })
    expect(view.addEventListener).toHaveBeenCalledWith('load', expect.any(Function), { once: true })
  })
})
