/** The bridge the window uses: the desktop app's preload object when there is one, else the browser's own. */
import type { RodwaveBridge } from './contract'
import { createBrowserBridge } from './browser-bridge'

declare global {
  interface Window {
    rodwave?: RodwaveBridge
  }
}

let current: RodwaveBridge | null = null

export function useBridge(): RodwaveBridge {
  current ??= window.rodwave ?? createBrowserBridge()
  return current
}

/** Replaces the bridge (tests give the stores an in-memory one). */
export function setBridge(bridge: RodwaveBridge | null): void {
  current = bridge
}
