/**
 * The application menu. Items that act on the document send a menu command to the window
 * (the window owns the model and asks about unsaved changes itself); the rest are Electron
 * roles. The template is plain data, so tests read it without Electron.
 */
import { basename } from 'node:path'
import type { MenuItemConstructorOptions } from 'electron'
import type { MenuCommand } from './ipc-contract'

export interface MenuActions {
  /** Forwards a command to the window. */
  readonly send: (command: MenuCommand) => void
  /** Asks the window to open a file of the recent list. */
  readonly openRecent: (path: string) => void
  readonly clearRecent: () => void
  readonly showAbout: () => void
}

export interface MenuSettings {
  readonly platform: NodeJS.Platform
  /** Reload and developer tools are offered only when running from the source tree. */
  readonly isDevelopment: boolean
  readonly recentFiles: readonly string[]
}

function command(label: string, name: MenuCommand, actions: MenuActions, accelerator?: string): MenuItemConstructorOptions {
  return { label, click: () => actions.send(name), ...(accelerator === undefined ? {} : { accelerator }) }
}

function recentSubmenu(files: readonly string[], actions: MenuActions): MenuItemConstructorOptions[] {
  if (files.length === 0) return [{ label: 'No recent projects', enabled: false }]
  return [
    // The full path is the label's tooltip substitute: two projects often share a file name.
    ...files.map((path, index): MenuItemConstructorOptions => ({
      label: `${index + 1}  ${basename(path)} — ${path}`,
      click: () => actions.openRecent(path),
    })),
    { type: 'separator' },
    { label: 'Clear recent projects', click: () => actions.clearRecent() },
  ]
}

export function applicationMenuTemplate(settings: MenuSettings, actions: MenuActions): MenuItemConstructorOptions[] {
  const isMac = settings.platform === 'darwin'
  const about: MenuItemConstructorOptions = { label: 'About Rodwave', click: () => actions.showAbout() }

  const fileMenu: MenuItemConstructorOptions = {
    label: 'File',
    submenu: [
      command('New project', 'new', actions, 'CmdOrCtrl+N'),
      command('Open…', 'open', actions, 'CmdOrCtrl+O'),
      { label: 'Open recent', submenu: recentSubmenu(settings.recentFiles, actions) },
      { type: 'separator' },
      command('Save', 'save', actions, 'CmdOrCtrl+S'),
      command('Save as…', 'save-as', actions, 'Shift+CmdOrCtrl+S'),
      { type: 'separator' },
      command('Export modal summary (CSV)…', 'export-csv', actions),
      command('Export report (HTML)…', 'export-report-html', actions),
      command('Export report (PDF)…', 'export-report-pdf', actions),
      ...(isMac ? [] : [{ type: 'separator' } as const, { label: 'Quit Rodwave', role: 'quit', accelerator: 'CmdOrCtrl+Q' } as const]),
    ],
  }

  const editMenu: MenuItemConstructorOptions = {
    label: 'Edit',
    submenu: [
      // Undo and redo act on the model's edit history, which the window keeps.
      command('Undo', 'undo', actions, 'CmdOrCtrl+Z'),
      command('Redo', 'redo', actions, isMac ? 'Shift+CmdOrCtrl+Z' : 'CmdOrCtrl+Y'),
      { type: 'separator' },
      { role: 'cut' },
      { role: 'copy' },
      { role: 'paste' },
      { role: 'delete' },
      { type: 'separator' },
      { role: 'selectAll' },
    ],
  }

  const viewMenu: MenuItemConstructorOptions = {
    label: 'View',
    submenu: [
      ...(settings.isDevelopment ? [{ role: 'reload' } as const, { role: 'toggleDevTools' } as const, { type: 'separator' } as const] : []),
      { role: 'resetZoom' },
      { role: 'zoomIn' },
      { role: 'zoomOut' },
      { type: 'separator' },
      { role: 'togglefullscreen' },
    ],
  }

  const helpMenu: MenuItemConstructorOptions = {
    label: 'Help',
    role: 'help',
    submenu: [command('Cautions and assumptions', 'cautions', actions), ...(isMac ? [] : [{ type: 'separator' } as const, about])],
  }

  const macAppMenu: MenuItemConstructorOptions = {
    label: 'Rodwave',
    submenu: [about, { type: 'separator' }, { role: 'services' }, { type: 'separator' }, { role: 'hide' }, { role: 'hideOthers' }, { role: 'unhide' }, { type: 'separator' }, { role: 'quit', label: 'Quit Rodwave' }],
  }

  return [...(isMac ? [macAppMenu] : []), fileMenu, editMenu, viewMenu, ...(isMac ? [{ role: 'windowMenu' } as const] : []), helpMenu]
}

/** What About Rodwave says, cautions included. */
export function aboutText(version: string): { message: string; detail: string } {
  return {
    message: `Rodwave ${version}`,
    detail: [
      'Axial natural frequencies and resonance check of rods, shafts and ties.',
      '',
      'Results are an engineering aid. Verify them on the real part (for example by an impact test) and defer to local codes and licensed engineering practice.',
    ].join('\n'),
  }
}
