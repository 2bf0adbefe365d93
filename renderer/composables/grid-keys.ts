/**
 * Spreadsheet keys for the editor's tables: Enter moves to the same column of the next
 * row, Shift+Enter to the row above (Tab and Shift+Tab move along the row as usual).
 * Cells carry data-cell="row:column"; a row without that column falls back to its first cell.
 */
export function moveOnEnter(event: KeyboardEvent): void {
  if (event.key !== 'Enter' || event.altKey || event.ctrlKey || event.metaKey) return
  const target = event.target as HTMLElement | null
  const cell = target?.dataset.cell
  const table = target?.closest('table')
  if (!cell || !table) return
  const [row, column] = cell.split(':')
  const next = Number(row) + (event.shiftKey ? -1 : 1)
  const sameColumn = table.querySelector<HTMLElement>(`[data-cell="${next}:${column}"]`)
  const firstOfRow = table.querySelector<HTMLElement>(`[data-cell^="${next}:"]`)
  const destination = sameColumn ?? firstOfRow
  if (!destination) return
  event.preventDefault()
  destination.focus()
  if (destination instanceof HTMLInputElement) destination.select()
}
