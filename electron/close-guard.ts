/**
 * The document's state in the window frame, and the guard that keeps unsaved work from
 * being closed away.
 *
 * Design of "Save" in the close prompt: the main process cannot save by itself (the model
 * lives in the window), so it cancels the close, sends the window the ordinary 'save'
 * command, and closes only when that very save succeeds AND the window then reports a clean
 * document. If the user cancels the save dialog, the save fails, or the window does not
 * start (or finish reporting) the save in time, the close is simply dropped and the window
 * stays open with the work in it. The deadline covers the parts that need no user
 * (starting the save, reporting clean), never the save dialog itself; so a later, unrelated
 * save can never close the window by surprise. When the window refuses the save (the part
 * has problems it must not be saved with) it says so and the close ends at once; and a close
 * click while the guard waits on the window asks again rather than being dropped.
 */
import type { DocumentState, SaveResult } from './ipc-contract'

export type UnsavedAnswer = 'save' | 'discard' | 'cancel'

/** How long the window has to start the requested save, and to report clean after it. */
export const SAVE_HANDSHAKE_TIMEOUT_MS = 15_000

export interface CloseGuardDeps {
  /** Asks Save / Don't save / Cancel about the document `title`. */
  readonly askAboutUnsaved: (title: string) => Promise<UnsavedAnswer>
  /** Sends the window the 'save' menu command. */
  readonly requestSave: () => void
  /** Closes the window for real (the guard lets that close through). */
  readonly closeWindow: () => void
  /** Shows the title in the window frame. */
  readonly showTitle: (title: string, dirty: boolean) => void
  /** After "Don't save": the autosaved copy of the discarded work is removed. */
  readonly discardRecovery: () => Promise<void>
  /** The close did not happen (cancelled, save failed or timed out): a pending quit stops too. */
  readonly closeAbandoned?: () => void
}

export interface CloseGuard {
  readonly state: DocumentState
  /** The window reported its document state. */
  documentChanged(state: DocumentState): void
  /** The window's 'close' event. */
  closeRequested(event: { preventDefault(): void }): void
  /** The window called saveProject. */
  saveStarted(): void
  /** saveProject finished with this result. */
  saveFinished(result: SaveResult): void
  /** The window refused to start a save (the part has problems): a close waiting on it ends. */
  saveRefused(): void
}

/** "Hanger rod H-3 — Rodwave", with a leading "•" while there are unsaved changes. */
export function windowTitle(state: DocumentState): string {
  const title = state.title.replace(/[\p{Cc}\s]+/gu, ' ').trim() || 'Untitled project'
  return `${state.dirty ? '• ' : ''}${title} — Rodwave`
}

type Phase = 'idle' | 'asking' | 'awaiting-save-start' | 'saving' | 'awaiting-clean'

export function createCloseGuard(deps: CloseGuardDeps): CloseGuard {
  let state: DocumentState = { dirty: false, title: '' }
  let phase: Phase = 'idle'
  let closeAllowed = false
  let timer: ReturnType<typeof setTimeout> | undefined

  function stopTimer(): void {
    if (timer !== undefined) clearTimeout(timer)
    timer = undefined
  }

  function abandon(): void {
    stopTimer()
    phase = 'idle'
    deps.closeAbandoned?.()
  }

  function startTimer(): void {
    stopTimer()
    timer = setTimeout(abandon, SAVE_HANDSHAKE_TIMEOUT_MS)
  }

  function closeNow(): void {
    stopTimer()
    phase = 'idle'
    closeAllowed = true
    deps.closeWindow()
  }

  async function ask(): Promise<void> {
    phase = 'asking'
    let answer: UnsavedAnswer
    try {
      answer = await deps.askAboutUnsaved(state.title)
    } catch {
      answer = 'cancel'
    }
    if (answer === 'cancel') {
      abandon()
    } else if (answer === 'discard') {
      await deps.discardRecovery().catch(() => undefined)
      closeNow()
    } else {
      phase = 'awaiting-save-start'
      startTimer()
      deps.requestSave()
    }
  }

  return {
    get state() {
      return state
    },
    documentChanged(next) {
      state = { dirty: next.dirty, title: next.title }
      deps.showTitle(windowTitle(state), state.dirty)
      if (phase === 'awaiting-clean' && !state.dirty) closeNow()
    },
    closeRequested(event) {
      if (closeAllowed || !state.dirty) return
      event.preventDefault()
      // While the question or the save dialog is open the click is theirs; while the guard
      // only waits on the window, the user is asked again.
      if (phase === 'asking' || phase === 'saving') return
      if (phase !== 'idle') stopTimer()
      void ask()
    },
    saveRefused() {
      if (phase === 'awaiting-save-start') abandon()
    },
    saveStarted() {
      if (phase !== 'awaiting-save-start') return
      stopTimer()
      phase = 'saving'
    },
    saveFinished(result) {
      if (phase !== 'saving') return
      if (result.kind !== 'saved') {
        abandon()
        return
      }
      if (!state.dirty) {
        closeNow()
        return
      }
      phase = 'awaiting-clean'
      startTimer()
    },
  }
}
