/**
 * The window's keys: Ctrl+Z undo, Ctrl+Y or Ctrl+Shift+Z redo, Ctrl+S save, Ctrl+Shift+S
 * save as, Ctrl+O open, Ctrl+N new (Cmd on macOS). They work inside fields too, so undo
 * is the project's undo everywhere. The desktop menu sends the same commands; the file
 * store runs a command once when both arrive.
 */
import type { MenuCommand } from '../bridge/contract'

export function commandForKey(event: Pick<KeyboardEvent, 'key' | 'ctrlKey' | 'metaKey' | 'shiftKey' | 'altKey'>): MenuCommand | null {
  if (!(event.ctrlKey || event.metaKey) || event.altKey) return null
  const key = event.key.toLowerCase()
  if (key === 'z') return event.shiftKey ? 'redo' : 'undo'
  if (key === 'y' && !event.shiftKey) return 'redo'
  if (key === 's') return event.shiftKey ? 'save-as' : 'save'
  if (key === 'o' && !event.shiftKey) return 'open'
  if (key === 'n' && !event.shiftKey) return 'new'
  return null
}

/** Listens on the window; returns the function that stops listening. */
export function installShortcuts(run: (command: MenuCommand) => void): () => void {
  const onKey = (event: KeyboardEvent) => {
    const command = commandForKey(event)
    if (!command) return
    event.preventDefault()
    run(command)
  }
  window.addEventListener('keydown', onKey)
  return () => window.removeEventListener('keydown', onKey)
}
