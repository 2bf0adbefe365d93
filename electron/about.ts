/**
 * About Rodwave: version, purpose, the cautions, and the third-party notices. The notices are
 * the file the build writes beside the window (build/third-party-notices.ts), shown in a
 * window of their own: served by the app's own scheme, no preload, no script.
 */
import type { MessageBoxOptions } from 'electron'
import { APP_HOST, APP_SCHEME } from './app-origin'
import { aboutText } from './menu'

/** build/third-party-notices.ts writes this file into dist/renderer, which the app scheme serves. */
export const THIRD_PARTY_NOTICES_URL = `${APP_SCHEME}://${APP_HOST}/third-party-notices.txt`

const BUTTONS = ['Close', 'Third-party notices'] as const

export interface AboutDeps {
  readonly showMessageBox: (options: MessageBoxOptions) => Promise<{ response: number }>
  /** Opens (or brings forward) the window showing THIRD_PARTY_NOTICES_URL. */
  readonly showNotices: () => void
}

export async function showAbout(version: string, deps: AboutDeps): Promise<void> {
  const { message, detail } = aboutText(version)
  const { response } = await deps.showMessageBox({
    type: 'info',
    title: 'About Rodwave',
    buttons: [...BUTTONS],
    defaultId: 0,
    cancelId: 0,
    noLink: true,
    message,
    detail: `${detail}\n\nRodwave is MIT-licensed and includes third-party software under its own licences: see Third-party notices.`,
  })
  if (BUTTONS[response] === 'Third-party notices') deps.showNotices()
}
