/** The window title and the close guard: unsaved work is never closed away silently. */
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { createCloseGuard, SAVE_HANDSHAKE_TIMEOUT_MS, windowTitle, type UnsavedAnswer } from '../../electron/close-guard'

vi.mock('electron', () => ({}))

function setup(answer: UnsavedAnswer) {
  const deps = {
    askAboutUnsaved: vi.fn(async (_title: string): Promise<UnsavedAnswer> => answer),
    requestSave: vi.fn(),
    closeWindow: vi.fn(),
    showTitle: vi.fn(),
    discardRecovery: vi.fn(async () => undefined),
    closeAbandoned: vi.fn(),
  }
  const guard = createCloseGuard(deps)
  const close = () => {
    const event = { preventDefault: vi.fn() }
    guard.closeRequested(event)
    return event.preventDefault
  }
  return { guard, deps, close }
}

const settle = () => new Promise((done) => setImmediate(done))

describe('window title', () => {
  it('shows the title with " — Rodwave", and a bullet while there are unsaved changes', () => {
    expect(windowTitle({ dirty: false, title: 'Hanger rod H-3' })).toBe('Hanger rod H-3 — Rodwave')
    expect(windowTitle({ dirty: true, title: 'Hanger rod H-3' })).toBe('• Hanger rod H-3 — Rodwave')
  })

  it('names an untitled project and flattens line breaks', () => {
    expect(windowTitle({ dirty: false, title: '   ' })).toBe('Untitled project — Rodwave')
    expect(windowTitle({ dirty: false, title: 'Rod\nA\tB' })).toBe('Rod A B — Rodwave')
  })

  it('is updated from every document state report', () => {
    const { guard, deps } = setup('cancel')
    guard.documentChanged({ dirty: true, title: 'Tie rod' })
    expect(deps.showTitle).toHaveBeenLastCalledWith('• Tie rod — Rodwave', true)
  })
})

describe('closing', () => {
  it('closes a clean document without asking', () => {
    const { guard, deps, close } = setup('cancel')
    guard.documentChanged({ dirty: false, title: 'Tie rod' })
    expect(close()).not.toHaveBeenCalled()
    expect(deps.askAboutUnsaved).not.toHaveBeenCalled()
  })

  it('Cancel keeps the window open', async () => {
    const { guard, deps, close } = setup('cancel')
    guard.documentChanged({ dirty: true, title: 'Tie rod' })
    expect(close()).toHaveBeenCalledOnce()
    await settle()
    expect(deps.askAboutUnsaved).toHaveBeenCalledWith('Tie rod')
    expect(deps.closeWindow).not.toHaveBeenCalled()
    expect(deps.closeAbandoned).toHaveBeenCalledOnce()
  })

  it("Don't save discards the recovery copy and closes", async () => {
    const { guard, deps, close } = setup('discard')
    guard.documentChanged({ dirty: true, title: 'Tie rod' })
    close()
    await settle()
    expect(deps.discardRecovery).toHaveBeenCalledOnce()
    expect(deps.closeWindow).toHaveBeenCalledOnce()
    // The close that follows goes through.
    expect(close()).not.toHaveBeenCalled()
  })

  it('Save asks the window to save and closes once that save succeeded and the window reports clean', async () => {
    const { guard, deps, close } = setup('save')
    guard.documentChanged({ dirty: true, title: 'Tie rod' })
    close()
    await settle()
    expect(deps.requestSave).toHaveBeenCalledOnce()
    expect(deps.closeWindow).not.toHaveBeenCalled()
    guard.saveStarted()
    guard.saveFinished({ kind: 'saved', path: '/p/tie.rodwave.json', name: 'tie.rodwave.json' })
    expect(deps.closeWindow).not.toHaveBeenCalled()
    guard.documentChanged({ dirty: false, title: 'Tie rod' })
    expect(deps.closeWindow).toHaveBeenCalledOnce()
  })

  it('Save followed by a cancelled save dialog keeps the window open, and a later save does not close it', async () => {
    const { guard, deps, close } = setup('save')
    guard.documentChanged({ dirty: true, title: 'Tie rod' })
    close()
    await settle()
    guard.saveStarted()
    guard.saveFinished({ kind: 'cancelled' })
    expect(deps.closeAbandoned).toHaveBeenCalledOnce()
    // Later the user saves on purpose: the window stays.
    guard.saveStarted()
    guard.saveFinished({ kind: 'saved', path: '/p/t.rodwave.json', name: 't.rodwave.json' })
    guard.documentChanged({ dirty: false, title: 'Tie rod' })
    expect(deps.closeWindow).not.toHaveBeenCalled()
  })

  it('a failed save keeps the window open', async () => {
    const { guard, deps, close } = setup('save')
    guard.documentChanged({ dirty: true, title: 'Tie rod' })
    close()
    await settle()
    guard.saveStarted()
    guard.saveFinished({ kind: 'error', message: 'disk full' })
    guard.documentChanged({ dirty: false, title: 'Tie rod' })
    expect(deps.closeWindow).not.toHaveBeenCalled()
  })

  it('asks only once while the question is open', async () => {
    const { guard, deps, close } = setup('cancel')
    guard.documentChanged({ dirty: true, title: 'Tie rod' })
    close()
    close()
    await settle()
    expect(deps.askAboutUnsaved).toHaveBeenCalledOnce()
  })
})

describe('closing when the window does not answer', () => {
  beforeEach(() => {
    vi.useFakeTimers()
  })
  afterEach(() => {
    vi.useRealTimers()
  })

  it('drops the close if the window never starts the requested save', async () => {
    const { guard, deps, close } = setup('save')
    guard.documentChanged({ dirty: true, title: 'Tie rod' })
    close()
    await vi.advanceTimersByTimeAsync(0)
    expect(deps.requestSave).toHaveBeenCalledOnce()
    await vi.advanceTimersByTimeAsync(SAVE_HANDSHAKE_TIMEOUT_MS + 1)
    expect(deps.closeAbandoned).toHaveBeenCalledOnce()
    // A save much later is an ordinary save, not a close.
    guard.saveStarted()
    guard.saveFinished({ kind: 'saved', path: '/p/t.rodwave.json', name: 't.rodwave.json' })
    guard.documentChanged({ dirty: false, title: 'Tie rod' })
    expect(deps.closeWindow).not.toHaveBeenCalled()
  })

  it('a Save the window refuses (the part has problems) ends the close at once: the next close click asks again', async () => {
    const { guard, deps, close } = setup('save')
    guard.documentChanged({ dirty: true, title: 'Tie rod' })
    close()
    await vi.advanceTimersByTimeAsync(0)
    expect(deps.requestSave).toHaveBeenCalledOnce()
    guard.saveRefused()
    expect(deps.closeAbandoned).toHaveBeenCalledOnce()
    // No waiting out the handshake deadline: a close click a moment later is answered.
    await vi.advanceTimersByTimeAsync(1000)
    expect(close()).toHaveBeenCalledOnce()
    await vi.advanceTimersByTimeAsync(0)
    expect(deps.askAboutUnsaved).toHaveBeenCalledTimes(2)
    // The first close's deadline passing later changes nothing.
    await vi.advanceTimersByTimeAsync(SAVE_HANDSHAKE_TIMEOUT_MS)
    expect(deps.closeWindow).not.toHaveBeenCalled()
  })

  it('a close click while the window has not started the requested save asks again instead of being dropped', async () => {
    const { guard, deps, close } = setup('discard')
    guard.documentChanged({ dirty: true, title: 'Tie rod' })
    deps.askAboutUnsaved.mockResolvedValueOnce('save')
    close()
    await vi.advanceTimersByTimeAsync(0)
    expect(deps.requestSave).toHaveBeenCalledOnce()
    await vi.advanceTimersByTimeAsync(2000)
    expect(close()).toHaveBeenCalledOnce()
    await vi.advanceTimersByTimeAsync(0)
    expect(deps.askAboutUnsaved).toHaveBeenCalledTimes(2)
    expect(deps.closeWindow).toHaveBeenCalledOnce()
  })

  it('a refusal that comes without a close in progress changes nothing', async () => {
    const { guard, deps } = setup('save')
    guard.documentChanged({ dirty: true, title: 'Tie rod' })
    guard.saveRefused()
    expect(deps.closeAbandoned).not.toHaveBeenCalled()
  })

  it('waits for the user in the save dialog as long as it takes', async () => {
    const { guard, deps, close } = setup('save')
    guard.documentChanged({ dirty: true, title: 'Tie rod' })
    close()
    await vi.advanceTimersByTimeAsync(0)
    guard.saveStarted()
    await vi.advanceTimersByTimeAsync(10 * SAVE_HANDSHAKE_TIMEOUT_MS)
    guard.saveFinished({ kind: 'saved', path: '/p/t.rodwave.json', name: 't.rodwave.json' })
    guard.documentChanged({ dirty: false, title: 'Tie rod' })
    expect(deps.closeAbandoned).not.toHaveBeenCalled()
    expect(deps.closeWindow).toHaveBeenCalledOnce()
  })
})
