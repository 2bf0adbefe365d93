/**
 * The built window in Chromium, in browser mode (the browser bridge: uploads, downloads,
 * localStorage). Every number the page shows is compared with what core computes for the
 * same project, to the digits shown; the demo project is a fixture for the interface, not
 * a check of correctness. Each test also asserts that the page logged no error (a CSP
 * violation or a failed request would show there).
 */
import { readFile } from 'node:fs/promises'
import { join } from 'node:path'
import { afterAll, afterEach, beforeAll, beforeEach, describe, expect, inject, it } from 'vitest'
import type { Browser, BrowserContext, Page } from 'playwright-core'
import { analyseProject, convergenceStudy, MODAL_SUMMARY_COLUMNS, modalSummaryCsv, readProjectText, type Project } from '../../core/index'
import { pairSentence } from '../../core/charts/interference-chart'
import { collectPageErrors, launchChromium, shownDigits, shownNumber } from './browser'

const DEMO_TEXT = await readFile(join(import.meta.dirname, '../../examples/condensate-pump-hanger.rodwave.json'), 'utf8')

function demo(): Project {
  const read = readProjectText(DEMO_TEXT)
  if (!read.ok) throw new Error('the demo fixture must be valid')
  return read.project
}

/** The first elastic frequency core computes, rounded to the digits the page shows. */
function expectedShown(project: Project, shown: string): number {
  const f = analyseProject(project).modes.find((m) => !m.rigidBody)!.frequencyHz
  return Number(f.toPrecision(shownDigits(shown)))
}

let browser: Browser
let context: BrowserContext
let page: Page
let errors: string[]

beforeAll(async () => {
  browser = await launchChromium()
})
afterAll(async () => {
  await browser?.close()
})

async function openApp(viewport = { width: 1280, height: 800 }, colorScheme: 'light' | 'dark' = 'light'): Promise<void> {
  context = await browser.newContext({ viewport, colorScheme, acceptDownloads: true, reducedMotion: 'reduce' })
  page = await context.newPage()
  errors = collectPageErrors(page)
  await page.goto(inject('baseUrl'))
  await page.waitForSelector('[data-testid="first-frequency"]', { timeout: 30_000 })
}

async function firstFrequency(): Promise<string> {
  return (await page.textContent('[data-testid="first-frequency"]'))!.trim()
}

/** Waits for the solver to settle on a first frequency other than `before`. */
async function frequencyAfterChange(before: string): Promise<string> {
  await expect.poll(firstFrequency, { timeout: 15_000 }).not.toBe(before)
  await expect.poll(() => page.locator('[data-testid="solving"]').count(), { timeout: 15_000 }).toBe(0)
  return firstFrequency()
}

describe('the window in a browser', () => {
  beforeEach(async () => {
    await openApp()
  })
  afterEach(async () => {
    expect(errors, errors.join('\n')).toEqual([])
    await context?.close()
  })

  it('opens on the demo, solved: the frequencies are the engine’s to the digits shown', async () => {
    const shown = await firstFrequency()
    expect(shownDigits(shown)).toBe(5)
    expect(shownNumber(shown)).toBe(expectedShown(demo(), shown))
    const analysis = analyseProject(demo())
    for (const m of analysis.modes) {
      const cell = (await page.textContent(`[data-testid="mode-${m.mode}-hz"]`))!.trim()
      expect(shownNumber(cell), `mode ${m.mode}`).toBe(Number(m.frequencyHz.toPrecision(shownDigits(cell))))
    }
    await expect.poll(() => page.locator('[data-testid="warnings-count"]').textContent()).toBe('2')
  })

  it('re-solves when a segment’s length changes, to the engine’s value for the changed part', async () => {
    await page.click('[data-testid="view-part"]')
    const before = await firstFrequency()
    await page.fill('[data-testid="segment-0-length"]', '1.7')
    const after = await frequencyAfterChange(before)
    // The project file's rule: attachments beyond the changed segment move with the bar's end.
    const changed = demo()
    changed.segments[0].length = 1.7
    changed.masses = changed.masses.map((m) => ({ ...m, at: m.at - 0.2 }))
    expect(shownNumber(after)).toBe(expectedShown(changed, after))
    expect(shownNumber(after)).toBeGreaterThan(shownNumber(before))
  })

  it('lowers the first frequency when a mass is added', async () => {
    await page.click('[data-testid="view-part"]')
    const before = await firstFrequency()
    await page.click('[data-testid="add-masses"]')
    // A new mass comes at the free end with 1 kg; make it 10 kg.
    const withOneKilogram = await frequencyAfterChange(before)
    await page.fill('[data-testid="masses-2-mass"]', '10')
    const after = await frequencyAfterChange(withOneKilogram)
    expect(shownNumber(withOneKilogram)).toBeLessThan(shownNumber(before))
    expect(shownNumber(after)).toBeLessThan(shownNumber(withOneKilogram))
    const changed = demo()
    changed.masses.push({ at: 2.91, mass: 10, label: 'Mass 3' })
    expect(shownNumber(after)).toBe(expectedShown(changed, after))
  })

  it('converts what it shows when the units switch (1 in = 0.0254 m, 1 lb = 0.45359237 kg; NIST SP 811)', async () => {
    await page.click('[data-testid="view-part"]')
    expect(await page.inputValue('[data-testid="segment-0-length"]')).toBe('1.9')
    await page.click('[data-testid="units-us"]')
    // Fields at rest show six significant digits.
    expect(await page.inputValue('[data-testid="segment-0-length"]')).toBe(String(Number((1.9 / 0.0254).toPrecision(6))))
    expect(await page.inputValue('[data-testid="masses-1-mass"]')).toBe(String(Number((55 / 0.45359237).toPrecision(6))))
    await expect(page.locator('[data-testid="segments-table"] th').nth(1).textContent()).resolves.toContain('(in)')
    await expect(page.locator('[data-testid="bar-drawing"] text', { hasText: 'Overall' }).textContent()).resolves.toBe('Overall 114.6 in')
    await page.click('[data-testid="view-modes"]')
    await expect(page.locator('[data-testid="modes-table"] thead').textContent()).resolves.toContain('Effective mass (lbm)')
    // Typing in inches stores metres: 60 in = 1.524 m; the frequency follows.
    await page.click('[data-testid="view-part"]')
    const before = await firstFrequency()
    await page.fill('[data-testid="segment-2-length"]', '30')
    const after = await frequencyAfterChange(before)
    const changed = demo()
    changed.segments[2].length = 30 * 0.0254
    changed.masses[1].at = 1.9 + 0.16 + 30 * 0.0254
    expect(shownNumber(after)).toBe(expectedShown(changed, after))
  })

  it('refuses an invalid file with its problems (path: message) and keeps the model', async () => {
    const before = await firstFrequency()
    const name = await page.textContent('[data-testid="document-name"]')
    const bad = JSON.parse(DEMO_TEXT)
    bad.segments[0].length = -2
    bad.analysis.mass = 'heavy'
    bad.segments[1].section.innerDiameter = 0.05
    const text = JSON.stringify(bad)
    await page.click('[data-testid="file-menu"]')
    const [chooser] = await Promise.all([page.waitForEvent('filechooser'), page.click('[data-testid="cmd-open"]')])
    await chooser.setFiles({ name: 'bad.rodwave.json', mimeType: 'application/json', buffer: Buffer.from(text) })
    await page.waitForSelector('[data-testid="refused-issues"]')
    const read = readProjectText(text)
    if (read.ok) throw new Error('the bad file must be refused by core')
    const lines = (await page.locator('[data-testid="refused-issues"] li').allTextContents()).map((l) => l.trim())
    expect(lines).toEqual(read.issues.map((i) => `${i.path}: ${i.message}`))
    expect(lines.length).toBeGreaterThanOrEqual(3)
    await page.click('[data-testid="refused-file"] footer button')
    expect(await firstFrequency()).toBe(before)
    expect(await page.textContent('[data-testid="document-name"]')).toBe(name)
  })

  it('downloads the modal summary (CSV) with one row per mode', async () => {
    await page.click('[data-testid="file-menu"]')
    const [download] = await Promise.all([page.waitForEvent('download'), page.click('[data-testid="cmd-export-csv"]')])
    expect(download.suggestedFilename()).toBe('condensate-pump-hanger-modal-summary.csv')
    const csv = await readFile((await download.path())!, 'utf8')
    const rows = csv.trim().split('\r\n')
    const analysis = analyseProject(demo())
    expect(rows[0]).toBe(MODAL_SUMMARY_COLUMNS.join(','))
    expect(rows).toHaveLength(1 + analysis.modes.length)
    expect(csv).toBe(modalSummaryCsv(analysis))
  })

  it('shows the convergence study’s progress, cancels it, and reruns it to the engine’s observed orders', async () => {
    await page.click('[data-testid="view-convergence"]')
    await page.waitForSelector('[role="progressbar"]')
    await page.click('[data-testid="cancel-study"]')
    await page.waitForSelector('[data-testid="run-study"]')
    expect((await page.textContent('[data-testid="run-study"]'))!.trim()).toBe('Run the study')
    expect(await page.locator('[data-testid="convergence-orders"]').count()).toBe(0)
    await page.click('[data-testid="run-study"]')
    await page.waitForSelector('[data-testid="convergence-orders"]', { timeout: 60_000 })
    const study = convergenceStudy(demo())
    const shown = await page.locator('[data-testid="convergence-orders"] tbody tr td:nth-child(2)').allTextContents()
    expect(shown.slice(0, study.series.length).map((t) => t.trim())).toEqual(study.series.map((s) => s.observedOrder[0]!.toFixed(2)))
  })

  it('warns and marks a conflict on the interference diagram when an excitation is added', async () => {
    await page.click('[data-testid="view-resonance"]')
    await page.click('[aria-label="Remove excitation 2"]')
    await page.click('[aria-label="Remove excitation 1"]')
    await expect.poll(() => page.getAttribute('[data-testid="diagram-conflicts"]', 'data-count')).toBe('0')
    await expect.poll(() => page.locator('[data-testid="conflict-banner"]').count()).toBe(0)
    await page.click('[data-testid="preset-twice-line-60"]')
    await expect.poll(() => page.getAttribute('[data-testid="diagram-conflicts"]', 'data-count'), { timeout: 15_000 }).toBe('1')
    await expect.poll(() => page.locator('[data-testid="interference-diagram"] svg text', { hasText: /^mode 1$/ }).count()).toBe(1)
    const changed = demo()
    changed.excitations = [{ label: 'Twice line frequency (60 Hz supply)', hz: 120 }]
    const conflict = analyseProject(changed).resonance.find((p) => p.status === 'conflict')!
    const sentence = pairSentence(conflict)
    expect(sentence).toBe('Mode 1 at 106 Hz is 11 % below Twice line frequency (60 Hz supply) (120 Hz)')
    await expect(page.locator('[data-testid="conflict-banner"]').textContent()).resolves.toContain(sentence)
    await page.click('[data-testid="warnings-button"]')
    await expect(page.locator('[data-testid="warnings-list"]').textContent()).resolves.toContain(sentence)
  })
})

describe('screenshots of the main screens', () => {
  const SIZES = [
    { width: 1280, height: 800 },
    { width: 1920, height: 1080 },
  ]
  const OUT = join(import.meta.dirname, '../../assets/screenshots')

  afterEach(async () => {
    expect(errors, errors.join('\n')).toEqual([])
    await context?.close()
  })

  for (const theme of ['light', 'dark'] as const) {
    for (const size of SIZES) {
      it(`${size.width}×${size.height}, ${theme}`, async () => {
        await openApp(size, theme)
        for (const view of ['modes', 'part', 'resonance', 'convergence'] as const) {
          await page.click(`[data-testid="view-${view}"]`)
          if (view === 'convergence') await page.waitForSelector('[data-testid="convergence-orders"]', { timeout: 60_000 })
          if (view === 'modes' || view === 'resonance' || view === 'convergence') await page.waitForSelector('.chart-frame svg', { timeout: 15_000 })
          // Let chart entry animations finish.
          await page.waitForTimeout(1200)
          await page.screenshot({ path: join(OUT, `${view}-${size.width}x${size.height}-${theme}.png`) })
        }
        await page.click('[data-testid="warnings-button"]')
        await page.screenshot({ path: join(OUT, `warnings-${size.width}x${size.height}-${theme}.png`) })
      })
    }
  }
})
