/**
 * Small HTML building blocks for the report: escaping and tables. Every string that
 * can come from the user (titles, labels, material names) goes through escapeHtml.
 */

const ESCAPES: Record<string, string> = { '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' }

/** Text → HTML text or attribute value, safe in either place. */
export function escapeHtml(text: string): string {
  return text.replace(/[&<>"']/g, (c) => ESCAPES[c])
}

/** A cell: plain text (escaped here) or markup already built from escaped parts. */
export type Cell = string | { readonly html: string; readonly className?: string }

export interface TableColumn {
  /** Header text (escaped here); the unit, if any, follows in a smaller span. */
  readonly header: string
  readonly unit?: string
  /** Right-aligned figures. */
  readonly numeric?: boolean
}

export interface TableOptions {
  readonly className?: string
  readonly caption?: string
  /** Class of each body row (e.g. to highlight one), by row index. */
  readonly rowClass?: (index: number) => string | undefined
}

function cellHtml(cell: Cell, numeric: boolean | undefined): string {
  const classes: string[] = []
  if (numeric) classes.push('num')
  const content = typeof cell === 'string' ? escapeHtml(cell) : cell.html
  if (typeof cell !== 'string' && cell.className) classes.push(cell.className)
  return `<td${classes.length ? ` class="${classes.join(' ')}"` : ''}>${content}</td>`
}

export function htmlTable(columns: readonly TableColumn[], rows: readonly (readonly Cell[])[], options: TableOptions = {}): string {
  const head = columns
    .map((c) => `<th${c.numeric ? ' class="num"' : ''}>${escapeHtml(c.header)}${c.unit ? ` <span class="unit">(${escapeHtml(c.unit)})</span>` : ''}</th>`)
    .join('')
  const body = rows
    .map((row, i) => {
      const rowClass = options.rowClass?.(i)
      return `<tr${rowClass ? ` class="${rowClass}"` : ''}>${row.map((cell, j) => cellHtml(cell, columns[j]?.numeric)).join('')}</tr>`
    })
    .join('\n')
  const caption = options.caption ? `<caption>${escapeHtml(options.caption)}</caption>` : ''
  return `<table${options.className ? ` class="${options.className}"` : ''}>${caption}<thead><tr>${head}</tr></thead>\n<tbody>\n${body}\n</tbody></table>`
}

/** A two-column table of labelled values (label escaped, value markup). */
export function keyValueTable(entries: readonly (readonly [string, string])[], className = 'facts'): string {
  const rows = entries.map(([label, valueHtml]) => `<tr><th scope="row">${escapeHtml(label)}</th><td>${valueHtml}</td></tr>`).join('\n')
  return `<table class="${className}"><tbody>\n${rows}\n</tbody></table>`
}
