/**
 * Who may call the main process: only the top frame of Rodwave's own window, showing a page
 * of the app bundle. Subframes, other windows and pages navigated elsewhere are refused.
 */
import { isAppUrl } from './app-origin'

/** The parts of an IPC event the check reads (Electron's IpcMainInvokeEvent has them). */
export interface IpcSenderInfo {
  readonly sender: unknown
  readonly senderFrame: { readonly url: string } | null
}

/** The parts of the main window the check compares against. */
export interface TrustedWindow {
  readonly webContents: { readonly mainFrame: unknown }
  isDestroyed(): boolean
}

export type SenderVerdict = { readonly trusted: true } | { readonly trusted: false; readonly reason: string }

export function checkSender(event: IpcSenderInfo, window: TrustedWindow | null): SenderVerdict {
  const frame = event.senderFrame
  if (frame === null || frame === undefined) return { trusted: false, reason: 'the sending frame is gone' }
  if (window === null || window.isDestroyed()) return { trusted: false, reason: 'Rodwave has no open window' }
  if (event.sender !== window.webContents) return { trusted: false, reason: 'the request came from another window' }
  if (frame !== window.webContents.mainFrame) return { trusted: false, reason: 'the request came from a subframe' }
  if (!isAppUrl(frame.url)) return { trusted: false, reason: 'the request came from a page outside Rodwave' }
  return { trusted: true }
}
