// @vitest-environment happy-dom
/**
 * The browser's bridge (the web build): recovery copies per page load in localStorage,
 * kept until the user answers the offer.
 */
import { describe, expect, it } from 'vitest'
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
