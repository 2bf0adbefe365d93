/** The application menu: Rodwave's items, each sending its command to the window. */
import { describe, expect, it, vi } from 'vitest'
import type { MenuItemConstructorOptions } from 'electron'
import type { MenuCommand } from '../../electron/ipc-contract'
import { aboutText, applicationMenuTemplate } from '../../electron/menu'

vi.mock('electron', () => ({}))

function actions() {
  return { send: vi.fn<(command: MenuCommand) => void>(), openRecent: vi.fn<(path: string) => void>(), clearRecent: vi.fn<() => void>(), showAbout: vi.fn<() => void>() }
}

function submenu(template: MenuItemConstructorOptions[], label: string): MenuItemConstructorOptions[] {
  const menu = template.find((item) => item.label === label)
  expect(menu, `menu ${label}`).toBeDefined()
  return menu!.submenu as MenuItemConstructorOptions[]
}

function item(items: MenuItemConstructorOptions[], label: string): MenuItemConstructorOptions {
  const found = items.find((entry) => entry.label === label)
  expect(found, `item ${label}`).toBeDefined()
  return found!
}

const click = (entry: MenuItemConstructorOptions) => (entry.click as () => void)()

describe('application menu', () => {
  it('has File, Edit, View and Help, in that order, on Windows and Linux', () => {
    const template = applicationMenuTemplate({ platform: 'linux', isDevelopment: false, recentFiles: [] }, actions())
    expect(template.map((menu) => menu.label)).toEqual(['File', 'Edit', 'View', 'Help'])
  })

  it.each([
    ['New project', 'new'],
    ['Open…', 'open'],
    ['Save', 'save'],
    ['Save as…', 'save-as'],
    ['Export modal summary (CSV)…', 'export-csv'],
    ['Export report (HTML)…', 'export-report-html'],
    ['Export report (PDF)…', 'export-report-pdf'],
  ])('File › %s sends "%s" to the window', (label, command) => {
    const spy = actions()
    const file = submenu(applicationMenuTemplate({ platform: 'win32', isDevelopment: false, recentFiles: [] }, spy), 'File')
    click(item(file, label))
    expect(spy.send).toHaveBeenCalledExactlyOnceWith(command)
  })

  it('File ends with Quit (except on macOS, where it is in the app menu)', () => {
    const file = submenu(applicationMenuTemplate({ platform: 'linux', isDevelopment: false, recentFiles: [] }, actions()), 'File')
    expect(file.at(-1)).toMatchObject({ role: 'quit', label: 'Quit Rodwave' })
    const mac = applicationMenuTemplate({ platform: 'darwin', isDevelopment: false, recentFiles: [] }, actions())
    expect(submenu(mac, 'File').some((entry) => entry.role === 'quit')).toBe(false)
    expect(submenu(mac, 'Rodwave').some((entry) => entry.role === 'quit')).toBe(true)
  })

  it('Open recent lists the files, newest first, and asks the window to open the one chosen', () => {
    const spy = actions()
    const recent = ['/home/eng/b.rodwave.json', '/home/eng/a.rodwave.json']
    const file = submenu(applicationMenuTemplate({ platform: 'linux', isDevelopment: false, recentFiles: recent }, spy), 'File')
    const entries = item(file, 'Open recent').submenu as MenuItemConstructorOptions[]
    expect(entries[0]!.label).toContain('b.rodwave.json')
    expect(entries[1]!.label).toContain('a.rodwave.json')
    click(entries[1]!)
    expect(spy.openRecent).toHaveBeenCalledExactlyOnceWith('/home/eng/a.rodwave.json')
    click(item(entries, 'Clear recent projects'))
    expect(spy.clearRecent).toHaveBeenCalledOnce()
  })

  it('Open recent says so when the list is empty', () => {
    const file = submenu(applicationMenuTemplate({ platform: 'linux', isDevelopment: false, recentFiles: [] }, actions()), 'File')
    expect(item(file, 'Open recent').submenu).toEqual([{ label: 'No recent projects', enabled: false }])
  })

  it('Edit sends undo and redo to the window and keeps the clipboard roles', () => {
    const spy = actions()
    const edit = submenu(applicationMenuTemplate({ platform: 'linux', isDevelopment: false, recentFiles: [] }, spy), 'Edit')
    click(item(edit, 'Undo'))
    click(item(edit, 'Redo'))
    expect(spy.send.mock.calls).toEqual([['undo'], ['redo']])
    expect(edit.map((entry) => entry.role).filter(Boolean)).toEqual(['cut', 'copy', 'paste', 'delete', 'selectAll'])
  })

  it('View offers reload and developer tools only in development', () => {
    const roles = (isDevelopment: boolean) =>
      submenu(applicationMenuTemplate({ platform: 'linux', isDevelopment, recentFiles: [] }, actions()), 'View').map((entry) => entry.role)
    expect(roles(false)).not.toContain('reload')
    expect(roles(false)).not.toContain('toggleDevTools')
    expect(roles(true)).toContain('reload')
    expect(roles(false)).toEqual(expect.arrayContaining(['resetZoom', 'zoomIn', 'zoomOut', 'togglefullscreen']))
  })

  it('Help has Cautions and assumptions (sent to the window) and About Rodwave', () => {
    const spy = actions()
    const help = submenu(applicationMenuTemplate({ platform: 'linux', isDevelopment: false, recentFiles: [] }, spy), 'Help')
    click(item(help, 'Cautions and assumptions'))
    expect(spy.send).toHaveBeenCalledExactlyOnceWith('cautions')
    click(item(help, 'About Rodwave'))
    expect(spy.showAbout).toHaveBeenCalledOnce()
  })

  it('About Rodwave carries the version and the cautions', () => {
    const about = aboutText('0.1.0')
    expect(about.message).toBe('Rodwave 0.1.0')
    expect(about.detail).toMatch(/engineering aid/)
    expect(about.detail).toMatch(/impact test/)
    expect(about.detail).toMatch(/local codes and licensed engineering practice/)
  })
})
