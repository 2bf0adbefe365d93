/**
 * The built window in Chromium, in browser mode (the browser bridge: uploads, downloads,
 * localStorage). Numbers the page shows are compared with what core computes for the same
 * project, to the digits shown: those are rendering checks (the screen shows what the engine
 * found), and say so; the demo project is a fixture for the interface, not a check of
 * correctness. Where a test checks a value itself, the value comes from a closed form or an
 * independent computation in the test, with its source beside it. Each test also asserts that
 * the page logged no error (a CSP violation or a failed request would show there).
 */
import { mkdir, readFile } from 'node:fs/promises'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { afterAll, afterEach, beforeAll, beforeEach, describe, expect, inject, it } from 'vitest'
import type { Browser, BrowserContext, Page } from 'playwright-core'
import {
  analyseProject,
  convergenceStudy,
  MODAL_SUMMARY_COLUMNS,
  modalSummaryCsv,
  readProjectText,
  scatterFrequencies,
  scatterQuantiles,
  tuneParameter,
  withParameter,
  type Project,
} from '../../core/index'
import { pairSentence } from '../../core/charts/interference-chart'
import { designSensitivities } from '../../core/analysis/family-sensitivity'
import { familyPairSentence } from '../../renderer/format/motion'
import { figure } from '../../core/charts/chart-text'
import { formatFigure } from '../../core/report/number-format'
import { rankedSensitivities } from '../../renderer/format/design-text'
import { responseTask } from '../../renderer/solver/design-tasks'
import { collectPageErrors, launchChromium, shownDigits, shownNumber } from './browser'
import { chainFrequencies, chainFromDocument } from '../chain-reference'

const DEMO_TEXT = await readFile(join(import.meta.dirname, '../../examples/cooling-water-pump-hanger.rodwave.json'), 'utf8')

function demo(): Project {
  const read = readProjectText(DEMO_TEXT)
  if (!read.ok) throw new Error('the demo fixture must be valid')
  return read.project
}

/** The lowest elastic frequency of every family core computes (the header's), rounded to the digits the page shows. */
function expectedShown(project: Project, shown: string): number {
  const f = Math.min(...analyseProject(project).modes.filter((m) => !m.rigidBody).map((m) => m.frequencyHz))
  return Number(f.toPrecision(shownDigits(shown)))
}

/** The demo's axial chain for the independent shooting method (tests/chain-reference.ts reads version 1 ends). */
function demoAxialChain() {
  const doc = JSON.parse(DEMO_TEXT)
  return chainFromDocument({ ...doc, ends: { start: doc.ends.start.axial, end: doc.ends.end.axial } })
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

async function openApp(viewport = { width: 1280, height: 800 }, colorScheme: 'light' | 'dark' = 'light', locale = 'en-US'): Promise<void> {
  context = await browser.newContext({ viewport, colorScheme, acceptDownloads: true, reducedMotion: 'reduce', locale })
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

  it('opens on the demo, solved in axial motion and bending: every frequency is the engine’s to the digits shown (a rendering check)', async () => {
    const shown = await firstFrequency()
    expect(shownDigits(shown)).toBe(5)
    expect(shownNumber(shown)).toBe(expectedShown(demo(), shown))
    const analysis = analyseProject(demo())
    expect(new Set(analysis.modes.map((m) => m.family))).toEqual(new Set(['axial', 'bending']))
    for (const m of analysis.modes) {
      const id = m.motion === 'axial' ? `mode-${m.mode}-hz` : `mode-${m.family}-${m.mode}-hz`
      const cell = (await page.textContent(`[data-testid="${id}"]`))!.trim()
      expect(shownNumber(cell), `${m.family} mode ${m.mode}`).toBe(Number(m.frequencyHz.toPrecision(shownDigits(cell))))
      expect((await page.textContent(`[data-testid="mode-${m.family}-${m.mode}-motion"]`))!.trim()).toBe(m.motion)
    }
    // The axial modes against an independent shooting method on the same part (tests/chain-reference.ts).
    const axial = chainFrequencies(demoAxialChain(), 2000, 0.5)
    const first = (await page.textContent('[data-testid="mode-1-hz"]'))!.trim()
    expect(shownNumber(first)).toBe(Number(axial[0].toPrecision(shownDigits(first))))
    // One conflict: the lowest bending mode against the pump's running speed.
    await expect.poll(() => page.locator('[data-testid="warnings-count"]').textContent()).toBe('1')
    await expect(page.locator('[data-testid="conflict-banner"]').textContent()).resolves.toContain('Bending mode 1')
    // The family filter shows one family's rows.
    await page.click('[data-testid="modes-family-bending"]')
    const families = await page.locator('[data-testid="modes-table"] tbody tr').evaluateAll((rows) => rows.map((r) => r.getAttribute('data-family')))
    expect(families).toEqual(analysis.modes.filter((m) => m.family === 'bending').map(() => 'bending'))
  })

  it('re-solves when a segment’s length changes, to the engine’s value for the changed part', async () => {
    await page.click('[data-testid="view-part"]')
    const before = await firstFrequency()
    await page.fill('[data-testid="segment-0-length"]', '0.4')
    const after = await frequencyAfterChange(before)
    // The project file's rule: attachments beyond the changed segment move with the bar's end.
    const changed = demo()
    changed.segments[0].length = 0.4
    changed.masses = changed.masses.map((m) => ({ ...m, at: m.at - 0.02 }))
    expect(shownNumber(after)).toBe(expectedShown(changed, after))
    // A shorter span bends stiffer (f ∝ 1/L² for a pinned beam): the lowest mode rises.
    expect(shownNumber(after)).toBeGreaterThan(shownNumber(before))
  })

  it('adds a mass as a draft that changes nothing until it is confirmed, then lowers the first frequency', async () => {
    await page.click('[data-testid="view-part"]')
    const before = await firstFrequency()
    await page.click('[data-testid="add-masses"]')
    await page.waitForSelector('[data-testid="masses-draft-0"]')
    // The draft's size field has the focus; typing in it changes nothing yet.
    await page.keyboard.type('10')
    // At mid-span, where the lowest (bending) mode moves most.
    await page.fill('[data-testid="masses-draft-0-at"]', '0.5')
    await page.waitForTimeout(600)
    expect(await page.locator('[data-testid="solving"]').count()).toBe(0)
    expect(await firstFrequency()).toBe(before)
    // Unsaved work all the same.
    expect(await page.locator('[data-testid="dirty-mark"]').count()).toBe(1)
    await page.click('[data-testid="masses-draft-0-confirm"]')
    const after = await frequencyAfterChange(before)
    expect(shownNumber(after)).toBeLessThan(shownNumber(before))
    const changed = demo()
    changed.masses.push({ at: 0.5, mass: 10, label: 'Mass 2' })
    expect(shownNumber(after)).toBe(expectedShown(changed, after))
    expect(await page.locator('[data-testid="masses-draft-0"]').count()).toBe(0)
  })

  it('discards a draft spring without touching the results', async () => {
    await page.click('[data-testid="view-part"]')
    const before = await firstFrequency()
    await page.click('[data-testid="add-springs"]')
    await page.fill('[data-testid="springs-draft-0-stiffness"]', '1e7')
    await page.waitForTimeout(600)
    expect(await firstFrequency()).toBe(before)
    await page.click('[data-testid="springs-draft-0-discard"]')
    expect(await page.locator('[data-testid="springs-table"]').count()).toBe(0)
    expect(await firstFrequency()).toBe(before)
  })

  it('reads a decimal comma where the browser’s locale writes one (de-DE)', async () => {
    await context.close()
    await openApp({ width: 1280, height: 800 }, 'light', 'de-DE')
    await page.click('[data-testid="view-part"]')
    // The field shows the locale's decimal mark, and takes it.
    expect(await page.inputValue('[data-testid="segment-0-length"]')).toBe('0,42')
    const before = await firstFrequency()
    await page.fill('[data-testid="segment-0-length"]', '0,4')
    const after = await frequencyAfterChange(before)
    const changed = demo()
    changed.segments[0].length = 0.4
    changed.masses = changed.masses.map((m) => ({ ...m, at: m.at - 0.02 }))
    expect(shownNumber(after)).toBe(expectedShown(changed, after))
    // A point before three digits could be a group separator here: refused with both readings, never guessed.
    await page.fill('[data-testid="segment-2-length"]', '1.500')
    await expect.poll(() => page.locator('[data-testid="segment-row-2"] .field-issue').textContent()).toBe('1.500 could mean 1500 or 1,5: write 1500, or 1,5')
    expect(await firstFrequency()).toBe(after)
  })

  it('converts what it shows when the units switch (1 in = 0.0254 m, 1 lb = 0.45359237 kg; NIST SP 811)', async () => {
    await page.click('[data-testid="view-part"]')
    expect(await page.inputValue('[data-testid="segment-0-length"]')).toBe('0.42')
    await page.click('[data-testid="units-us"]')
    // Fields at rest show six significant digits.
    expect(await page.inputValue('[data-testid="segment-0-length"]')).toBe(String(Number((0.42 / 0.0254).toPrecision(6))))
    expect(await page.inputValue('[data-testid="masses-0-mass"]')).toBe(String(Number((408 / 0.45359237).toPrecision(6))))
    // 4000 N / 4.4482216152605 N/lbf (NIST SP 811).
    expect(await page.inputValue('[data-testid="preload"]')).toBe(String(Number((4000 / 4.4482216152605).toPrecision(6))))
    await expect(page.locator('[data-testid="segments-table"] th').nth(1).textContent()).resolves.toContain('(in)')
    await expect(page.locator('[data-testid="bar-drawing"] text', { hasText: 'Overall' }).textContent()).resolves.toBe('Overall 39.37 in')
    await page.click('[data-testid="view-modes"]')
    await expect(page.locator('[data-testid="modes-table"] thead').textContent()).resolves.toContain('Effective mass (lbm)')
    // A modulus in the trade's form: 200 GPa is 29.0075 Msi (200e9 Pa / (6894.757 Pa/psi) / 10⁶), not 2.90075e7 psi.
    await page.click('[data-testid="view-part"]')
    await expect(page.locator('[data-testid="materials-table"] thead').textContent()).resolves.toContain('E (Msi)')
    expect(await page.inputValue('[aria-label="Material 1 Young\'s modulus"]')).toBe(String(Number((200e9 / (4.4482216152605 / 0.0254 ** 2) / 1e6).toPrecision(6))))
    // Typing in inches stores metres: 60 in = 1.524 m; the frequency follows.
    const before = await firstFrequency()
    await page.fill('[data-testid="segment-2-length"]', '15')
    const after = await frequencyAfterChange(before)
    const changed = demo()
    changed.segments[2].length = 15 * 0.0254
    changed.masses[0].at = 0.42 + 0.16 + 15 * 0.0254
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
    expect(download.suggestedFilename()).toBe('cooling-water-pump-hanger-modal-summary.csv')
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

  it('warns and marks a conflict on the interference diagram when an excitation is added, naming the family in conflict', async () => {
    await page.click('[data-testid="view-resonance"]')
    await page.click('[aria-label="Remove excitation 2"]')
    await page.click('[aria-label="Remove excitation 1"]')
    await expect.poll(() => page.getAttribute('[data-testid="diagram-conflicts"]', 'data-count')).toBe('0')
    await expect.poll(() => page.locator('[data-testid="conflict-banner"]').count()).toBe(0)
    // A machine running at 3000 rpm: 50 Hz, just below the lowest bending mode.
    await page.click('[data-testid="preset-running-1x"]')
    await page.fill('[data-testid="preset-speed-low"]', '3000')
    await page.keyboard.press('Enter')
    await expect.poll(() => page.getAttribute('[data-testid="diagram-conflicts"]', 'data-count'), { timeout: 15_000 }).toBe('1')
    const changed = demo()
    changed.excitations = [{ label: 'Running speed 1×', rpm: 3000, orders: [1] }]
    const conflict = analyseProject(changed).resonance.find((p) => p.status === 'conflict')!
    expect(conflict.motion).toBe('bending')
    // Rendering check: the page says the engine's pair in words, the family first.
    const sentence = familyPairSentence(pairSentence(conflict), conflict)
    expect(sentence.startsWith('Bending mode 1 at ')).toBe(true)
    await expect(page.locator('[data-testid="conflict-banner"]').textContent()).resolves.toContain(sentence)
    await page.click('[data-testid="warnings-button"]')
    await expect(page.locator('[data-testid="warnings-list"]').textContent()).resolves.toContain(sentence)
  })
})

/**
 * A uniform steel rod, made for these tests: pinned at both ends in bending under a tension P,
 * fixed–free in axial motion and torsion. Its frequencies have closed forms:
 * - bending, pinned–pinned under tension: ω² = (nπ/L)⁴ EI/ρA + (nπ/L)² P/ρA
 *   (S. S. Rao, Mechanical Vibrations, transverse vibration of beams with axial force, from memory);
 * - torsion, fixed–free: f = (2n − 1)/(4L) · √(G/ρ), G = E / (2(1 + ν)) (Rao, torsional vibration of shafts, from memory);
 * - axial, fixed–free: f = (2n − 1)/(4L) · √(E/ρ) (Rao, longitudinal vibration of bars, from memory).
 */
const ROD = { L: 1.2, d: 0.02, E: 200e9, rho: 7850, nu: 0.3, P: 5000 }
const rodArea = (Math.PI / 4) * ROD.d ** 2
const rodI = (Math.PI / 64) * ROD.d ** 4
const rodBendingHz = (n: number) => Math.sqrt((n * Math.PI / ROD.L) ** 4 * (ROD.E * rodI) / (ROD.rho * rodArea) + (n * Math.PI / ROD.L) ** 2 * ROD.P / (ROD.rho * rodArea)) / (2 * Math.PI)
const rodTorsionHz = (n: number) => ((2 * n - 1) / (4 * ROD.L)) * Math.sqrt(ROD.E / (2 * (1 + ROD.nu)) / ROD.rho)
const rodAxialHz = (n: number) => ((2 * n - 1) / (4 * ROD.L)) * Math.sqrt(ROD.E / ROD.rho)
/** A running speed 2.5 % below the first bending mode, and a torque pulsation 2 % below the first torsion mode that drives torsion only. */
const ROD_SPEED_RPM = Math.round(0.975 * rodBendingHz(1) * 60)
const ROD_TORQUE_HZ = Math.round(0.98 * rodTorsionHz(1))
const ROD_TEXT = JSON.stringify({
  format: 'rodwave',
  version: 2,
  title: 'Test rod, uniform',
  units: 'SI',
  motions: ['axial'],
  materials: [{ id: 'steel', youngsModulus: ROD.E, density: ROD.rho, poissonRatio: ROD.nu }],
  segments: [{ length: ROD.L, material: 'steel', section: { shape: 'solid', diameter: ROD.d } }],
  ends: { start: { axial: 'fixed', torsion: 'fixed', bending: 'pinned' }, end: { axial: 'free', torsion: 'free', bending: 'pinned' } },
  preload: ROD.P,
  masses: [],
  springs: [],
  analysis: { elementOrder: 2, elementsPerSegment: 40, mass: 'consistent', modes: 3 },
  excitations: [
    { label: 'Fan speed', rpm: ROD_SPEED_RPM, orders: [1] },
    { label: 'Torque pulsation', hz: ROD_TORQUE_HZ, excites: ['torsion'] },
  ],
  margin: 0.15,
  damping: 0.02,
})

describe('torsion and bending in a browser', () => {
  beforeEach(async () => {
    await openApp()
    await page.click('[data-testid="file-menu"]')
    const [chooser] = await Promise.all([page.waitForEvent('filechooser'), page.click('[data-testid="cmd-open"]')])
    await chooser.setFiles({ name: 'test-rod.rodwave.json', mimeType: 'application/json', buffer: Buffer.from(ROD_TEXT) })
    // The header names the part by its title.
    await expect.poll(() => page.textContent('[data-testid="document-name"]')).toContain('Test rod, uniform')
    await expect.poll(async () => shownNumber(await firstFrequency())).toBe(Number(rodAxialHz(1).toPrecision(5)))
  })
  afterEach(async () => {
    expect(errors, errors.join('\n')).toEqual([])
    await context?.close()
  })

  it('switches bending on: the bending modes match the closed form under tension, and the bending conflict is warned of by name', async () => {
    // Axial motion alone: clear (the axial modes sit far above the fan speed).
    expect(await page.locator('[data-testid="conflict-banner"]').count()).toBe(0)
    await page.click('[data-testid="view-part"]')
    await page.click('[data-testid="motion-bending"]')
    await expect.poll(() => page.locator('[data-testid="conflict-banner"]').count(), { timeout: 15_000 }).toBe(1)
    await page.click('[data-testid="view-modes"]')
    for (const n of [1, 2, 3]) {
      // The exact reference beside each mode, to the digits shown; the finite-element frequency within 1e-6 (Hermite cubics, 40 elements).
      const reference = (await page.textContent(`[data-testid="mode-bending-${n}-reference"]`))!.trim()
      expect(shownNumber(reference), `bending mode ${n} reference`).toBe(Number(rodBendingHz(n).toPrecision(shownDigits(reference))))
      const fe = shownNumber((await page.textContent(`[data-testid="mode-bending-${n}-hz"]`))!.trim())
      expect(Math.abs(fe - rodBendingHz(n)) / rodBendingHz(n), `bending mode ${n} FE`).toBeLessThan(1e-4)
    }
    // The banner and the warnings name the family in conflict, with the separation of the closed form.
    const fExc = ROD_SPEED_RPM / 60
    const separation = ((100 * (rodBendingHz(1) - fExc)) / fExc).toPrecision(2)
    const banner = (await page.textContent('[data-testid="conflict-banner"]'))!
    expect(banner).toContain('Bending mode 1 at')
    expect(banner).toContain(`is ${separation} % above Fan speed ×1`)
    await page.click('[data-testid="warnings-button"]')
    await expect(page.locator('[data-testid="warnings-list"]').textContent()).resolves.toContain(`Bending mode 1 at ${rodBendingHz(1).toPrecision(3)} Hz`)
    // Every clear verdict names its motion; the conflict is bending's.
    await page.click('[data-testid="view-resonance"]')
    const verdicts = (await page.locator('[data-testid="resonance-table"] .status').allTextContents()).map((v) => v.trim())
    expect(new Set(verdicts)).toEqual(new Set(['clear in axial motion', 'clear in bending', 'conflict']))
    const conflictRows = await page.locator('[data-testid="resonance-table"] tr.conflict [data-role="motion"]').allTextContents()
    expect(conflictRows.map((t) => t.trim())).toEqual(['bending'])
  })

  it('pairs an excitation that drives torsion only with the torsion modes only, against the closed form', async () => {
    await page.click('[data-testid="view-part"]')
    await page.click('[data-testid="motion-torsion"]')
    await page.click('[data-testid="motion-bending"]')
    await expect.poll(() => page.locator('[data-testid="conflict-banner"]').count(), { timeout: 15_000 }).toBe(1)
    await page.click('[data-testid="view-resonance"]')
    // Its Drives boxes: torsion only.
    expect(await page.isChecked('[data-testid="excitation-1-excites-torsion"]')).toBe(true)
    expect(await page.isChecked('[data-testid="excitation-1-excites-axial"]')).toBe(false)
    expect(await page.isChecked('[data-testid="excitation-1-excites-bending"]')).toBe(false)
    const rows = page.locator('[data-testid="resonance-table"] tbody tr', { hasText: 'Torque pulsation' })
    const motions = (await rows.locator('[data-role="motion"]').allTextContents()).map((t) => t.trim())
    // Three modes per family (analysis.modes), all torsion.
    expect(motions).toEqual(['torsion', 'torsion', 'torsion'])
    // The fan speed drives every family: nine pairs.
    expect(await page.locator('[data-testid="resonance-table"] tbody tr', { hasText: 'Fan speed' }).count()).toBe(9)
    // Torsion mode 1 against the torque pulsation, the separation from the closed form (f₁ = √(G/ρ)/4L).
    const first = rows.first()
    await expect(first.textContent()).resolves.toContain(`+${((100 * (rodTorsionHz(1) - ROD_TORQUE_HZ)) / ROD_TORQUE_HZ).toFixed(1)}`)
    await expect(first.locator('.status').textContent()).resolves.toBe('conflict')
    // A new excitation, narrowed to torsion on the page: paired with torsion only too.
    await page.click('[data-testid="preset-twice-line-50"]')
    await page.uncheck('[data-testid="excitation-2-excites-axial"]')
    await page.uncheck('[data-testid="excitation-2-excites-bending"]')
    const line = page.locator('[data-testid="resonance-table"] tbody tr', { hasText: 'Twice line frequency' })
    await expect.poll(async () => (await line.locator('[data-role="motion"]').allTextContents()).map((t) => t.trim()), { timeout: 15_000 }).toEqual(['torsion', 'torsion', 'torsion'])
  })

  it('refuses a compression past the buckling load beside the preload, and keeps the last valid results marked as such', async () => {
    await page.click('[data-testid="view-part"]')
    await page.click('[data-testid="motion-bending"]')
    await expect.poll(() => page.locator('[data-testid="critical-compression"]').count(), { timeout: 15_000 }).toBe(1)
    // Euler's load of a pinned–pinned strut, π²EI/L² (Rao, from memory; any strength-of-materials text).
    const euler = (Math.PI ** 2 * ROD.E * rodI) / ROD.L ** 2
    const shown = (await page.textContent('[data-testid="critical-compression"]'))!.replace(/\s*N$/, '').trim()
    expect(shownNumber(shown)).toBe(Number(euler.toPrecision(4)))
    const before = await firstFrequency()
    // 60 % of it: a warning, and the bending frequencies fall (ω² loses (π/L)²·|P|/ρA).
    await page.fill('[data-testid="preload"]', String(Math.round(-0.6 * euler)))
    await expect.poll(() => page.locator('[data-testid="buckling-warning"]').count(), { timeout: 15_000 }).toBe(1)
    await expect(page.locator('[data-testid="buckling-warning"]').textContent()).resolves.toContain('60 %')
    const compressed = await frequencyAfterChange(before)
    expect(shownNumber(compressed)).toBeLessThan(shownNumber(before))
    // Past it: the field says why, the results stay (marked as those of the last valid model).
    await page.fill('[data-testid="preload"]', String(Math.round(-1.2 * euler)))
    await expect.poll(() => page.locator('.preload-field .field-issue').first().textContent(), { timeout: 15_000 }).toContain('buckling load')
    await expect(page.locator('[data-testid="part-refusal"]').textContent()).resolves.toContain('preload')
    expect(await page.locator('.summary .status.note', { hasText: 'last valid model' }).count()).toBe(1)
    expect(await firstFrequency()).toBe(compressed)
  })
})

describe('design guidance in a browser', () => {
  beforeEach(async () => {
    await openApp()
  })
  afterEach(async () => {
    expect(errors, errors.join('\n')).toEqual([])
    await context?.close()
  })

  async function openDesign(): Promise<void> {
    await page.click('[data-testid="view-design"]')
    await page.waitForSelector('[data-testid="sensitivity-row-1"]', { timeout: 30_000 })
  }

  it('ranks what moves a mode of either family as the engine does (a rendering check), E by exactly ½ for axial mode 1', async () => {
    await openDesign()
    const rows = () => page.locator('[data-testid^="sensitivity-row-"]').evaluateAll((list) => list.map((r) => r.getAttribute('data-parameter')))
    const project = demo()
    const sensitivities = designSensitivities(project, project.analysis.modes)
    expect(await rows()).toEqual(rankedSensitivities(sensitivities, 1, 'axial').map((s) => s.parameter))
    // One material: scaling E scales every axial stiffness, so f ∝ √E and the relative sensitivity is exactly ½ (dimensional analysis).
    await expect(page.locator('[data-parameter="materials[0].youngsModulus"] td').nth(3).textContent()).resolves.toBe('0.500')
    // The pipe hangs on the free end: its mass is among the two largest effects (f ≈ √(k/m)/2π for a heavy end mass: −½).
    expect((await rows()).slice(0, 2)).toContain('masses[0].mass')
    await expect(page.locator('[data-testid="design-basis"]').textContent()).resolves.toContain('exact frequencies')
    await page.selectOption('[data-testid="sensitivity-mode"]', 'bending 1')
    await expect.poll(rows).toEqual(rankedSensitivities(sensitivities, 1, 'bending').map((s) => s.parameter))
    await expect(page.locator('[data-testid="sensitivity-basis"]').textContent()).resolves.toContain('finite-element')
    await expect(page.locator('[data-testid="sensitivity-row-1"]').textContent()).resolves.toContain('bending mode 1')
  })

  it('tunes the first segment’s length for separation in every family, applies it, clears the bending conflict, and undoes it', async () => {
    const before = await firstFrequency()
    await expect.poll(() => page.locator('[data-testid="conflict-banner"]').count()).toBe(1)
    await openDesign()
    await page.selectOption('[data-testid="tune-parameter"]', 'segments[0].length')
    await page.check('[data-testid="tune-goal-separation"]')
    await page.click('[data-testid="tune-run"]')
    await page.waitForSelector('[data-testid="tune-result"]', { timeout: 30_000 })
    const project = demo()
    const expected = tuneParameter(project, { parameter: 'segments[0].length', min: 0.7 * 0.42, max: 1.3 * 0.42, modes: project.analysis.modes })
    // Rendering checks: the proposal and the verdict are the engine's.
    await expect(page.locator('[data-testid="tune-value"]').textContent()).resolves.toBe(`${figure(expected.value, 6)} m`)
    expect(expected.minSeparation!).toBeGreaterThanOrEqual(project.margin)
    await expect(page.locator('[data-testid="tune-separation"] .status').textContent()).resolves.toBe('clear in axial motion and bending')
    // The page says when the best value lies on a bound of the range (a wider range might do better).
    const onBound = [0.7 * 0.42, 1.3 * 0.42].some((b) => Math.abs(expected.value - b) <= 1e-9 * b)
    expect(await page.locator('[data-testid="tune-at-bound"]').count()).toBe(onBound ? 1 : 0)
    await page.click('[data-testid="tune-accept"]')
    const after = await frequencyAfterChange(before)
    const tuned = withParameter(project, { kind: 'segmentLength', segment: 0 }, expected.value)
    expect(shownNumber(after)).toBe(expectedShown(tuned, after))
    await page.click('[data-testid="view-modes"]')
    const cell = (await page.textContent('[data-testid="mode-bending-1-hz"]'))!.trim()
    const bending1 = analyseProject(tuned).modes.find((m) => m.family === 'bending' && m.mode === 1)!.frequencyHz
    expect(shownNumber(cell)).toBe(Number(bending1.toPrecision(shownDigits(cell))))
    await expect.poll(() => page.locator('[data-testid="conflict-banner"]').count()).toBe(0)
    await page.keyboard.press('Control+z')
    expect(await frequencyAfterChange(after)).toBe(before)
    await expect.poll(() => page.locator('[data-testid="conflict-banner"]').count()).toBe(1)
  })

  it('runs a short scatter on the workers and shows the bands in its table, with the modes and on the diagram', async () => {
    await openDesign()
    await page.click('[data-testid="design-panel-scatter"]')
    await page.fill('[data-testid="scatter-samples"]', '500')
    await page.click('[data-testid="scatter-run"]')
    await page.waitForSelector('[data-testid="scatter-row-1"]', { timeout: 60_000 })
    const project = demo()
    const nominal = analyseProject(project, {}, { withReference: false }).modes
    const quantiles = scatterQuantiles(scatterFrequencies(project, { seed: 1, start: 0, count: 500, modes: project.analysis.modes }), nominal)
    // Every family's modes (a rendering check of the engine's quantiles): mode, motion, then the figures.
    expect(new Set(quantiles.map((q) => q.family))).toEqual(new Set(['axial', 'bending']))
    for (const q of quantiles) {
      const id = q.motion === 'axial' ? `scatter-row-${q.mode}` : `scatter-row-${q.family}-${q.mode}`
      const cells = (await page.locator(`[data-testid="${id}"] td`).allTextContents()).map((t) => t.trim())
      expect(cells[1], `${q.family} mode ${q.mode}`).toBe(q.motion)
      expect(cells.slice(2, 6), `${q.family} mode ${q.mode}`).toEqual([q.nominalHz, q.p05, q.p50, q.p95].map((f) => formatFigure(f, 5)))
    }
    await page.click('[data-testid="view-modes"]')
    await expect(page.locator('[data-testid="mode-1-band"]').textContent()).resolves.toBe(`${formatFigure(quantiles[0].p05, 5)} – ${formatFigure(quantiles[0].p95, 5)}`)
    await page.click('[data-testid="view-resonance"]')
    await page.waitForSelector('[data-testid="interference-diagram"] svg')
    await expect(page.locator('[data-testid="resonance-basis"]').textContent()).resolves.toContain('exact frequency')
    await page.check('[data-testid="resonance-check-with-bands"]')
    await expect.poll(() => page.locator('[data-testid="resonance-basis"]').textContent()).toContain('tolerance band')
    await expect(page.locator('[data-testid="conflict-banner"]').textContent()).resolves.toContain('tolerance band')
  })

  it('draws the forced response with every excitation band, and gives each band’s amplification', async () => {
    await openDesign()
    await page.click('[data-testid="design-panel-response"]')
    await page.waitForSelector('[data-testid="response-chart"] svg', { timeout: 30_000 })
    const project = demo()
    const texts = await page.locator('[data-testid="response-chart"] svg text').allTextContents()
    for (const label of ['×1', '×2', '×6', '100 Hz', 'mode 1']) expect(texts, label).toContain(label)
    const modes = analyseProject(project).modes
    const highest = (family: string) => Math.max(...modes.filter((m) => m.family === family).map((m) => m.frequencyHz))
    // Rendering checks: the amplification of each band is the engine's. Axial first: a force at the pipe's end.
    const axial = responseTask(project, { family: 'axial', forceAt: 1, responseAt: 1, fromHz: 0, toHz: 1.3 * highest('axial'), points: 400, axis: 'log' })
    expect(axial.bands).toHaveLength(4)
    for (const [i, band] of axial.bands.entries()) {
      await expect(page.locator(`[data-testid="response-amplification-${i + 1}"]`).textContent()).resolves.toBe(formatFigure(band.amplification!, 3))
    }
    // Bending: a side force at mid-span (both ends pinned), |w/F| in m/N, the bending stress per newton.
    await page.selectOption('[data-testid="response-family"]', 'bending')
    const bending = responseTask(project, { family: 'bending', forceAt: 0.5, responseAt: 0.5, fromHz: 0, toHz: 1.3 * highest('bending'), points: 400, axis: 'log' })
    await expect.poll(() => page.locator('[data-testid="response-amplification-1"]').textContent(), { timeout: 15_000 }).toBe(formatFigure(bending.bands[0].amplification!, 3))
    await expect(page.locator('[data-testid="response-table"] thead').textContent()).resolves.toContain('|w/F| (m/N)')
    await expect(page.locator('[data-testid="response-table"] thead').textContent()).resolves.toContain('per side force (MPa/N)')
  })
})

/** Every card whose content reaches past its right edge, or a table box that needs a sideways scroll, by how many px. */
async function overflowingCards(): Promise<string[]> {
  return page.evaluate(() => {
    const out: string[] = []
    for (const card of document.querySelectorAll<HTMLElement>('main .card')) {
      if (card.offsetParent === null) continue
      const name = card.querySelector('h2')?.textContent?.trim() ?? '(card)'
      const edge = card.getBoundingClientRect().right
      for (const el of card.querySelectorAll<HTMLElement>('*')) {
        const box = el.getBoundingClientRect()
        if (box.width > 0 && box.right > edge + 0.5) {
          out.push(`${name}: <${el.tagName.toLowerCase()} class="${el.className}"> ends ${Math.round(box.right - edge)} px past the card`)
          break
        }
      }
      for (const box of card.querySelectorAll<HTMLElement>('.table-scroll')) {
        if (box.scrollWidth > box.clientWidth + 1) out.push(`${name}: its table needs ${box.scrollWidth - box.clientWidth} px of sideways scrolling`)
      }
    }
    return out
  })
}

/** Pairs of visible texts of one chart whose boxes overlap (by more than half a pixel each way). */
async function collidingChartLabels(): Promise<string[]> {
  return page.evaluate(() => {
    const out: string[] = []
    document.querySelectorAll('.chart-frame svg').forEach((svg, chart) => {
      const texts = [...svg.querySelectorAll('text')]
        .filter((t) => (t.textContent ?? '').trim() !== '' && getComputedStyle(t).display !== 'none' && t.getAttribute('opacity') !== '0')
        .map((t) => ({ text: t.textContent!.trim(), box: t.getBoundingClientRect() }))
        .filter((t) => t.box.width > 0 && t.box.height > 0)
      for (let i = 0; i < texts.length; i++) {
        for (let j = i + 1; j < texts.length; j++) {
          const [a, b] = [texts[i].box, texts[j].box]
          const dx = Math.min(a.right, b.right) - Math.max(a.left, b.left)
          const dy = Math.min(a.bottom, b.bottom) - Math.max(a.top, b.top)
          if (dx > 0.5 && dy > 0.5) out.push(`chart ${chart + 1}: "${texts[i].text}" and "${texts[j].text}" overlap by ${dx.toFixed(1)}×${dy.toFixed(1)} px`)
        }
      }
    })
    return out
  })
}

/** Shows every view (the design view's three panels too), checking each as it settles. */
async function everyView(check: (where: string) => Promise<void>): Promise<void> {
  for (const view of ['part', 'modes', 'resonance', 'convergence'] as const) {
    await page.click(`[data-testid="view-${view}"]`)
    if (view === 'convergence') await page.waitForSelector('[data-testid="convergence-orders"]', { timeout: 60_000 })
    if (view !== 'part') await page.waitForSelector('.chart-frame svg', { timeout: 15_000 })
    await page.waitForTimeout(900)
    await check(view)
  }
  await page.click('[data-testid="view-design"]')
  await page.waitForSelector('[data-testid="sensitivity-row-1"]', { timeout: 30_000 })
  // With a proposal on screen: the tuner's table is the widest thing in that panel.
  await page.selectOption('[data-testid="tune-parameter"]', 'segments[0].length')
  await page.click('[data-testid="tune-run"]')
  await page.waitForSelector('[data-testid="tune-result"]', { timeout: 30_000 })
  await check('design: what moves each mode')
  // And when nothing in the range clears the conflict (a range too narrow): the message and its suggestions.
  await page.fill('[data-testid="tune-min"]', '0.415')
  await page.fill('[data-testid="tune-max"]', '0.425')
  await page.click('[data-testid="tune-run"]')
  await page.waitForSelector('[data-testid="tune-no-clear"]', { timeout: 30_000 })
  await check('design: a tuner range that cannot clear')
  await page.click('[data-testid="design-panel-scatter"]')
  await page.fill('[data-testid="scatter-samples"]', '300')
  await page.click('[data-testid="scatter-run"]')
  await page.waitForSelector('[data-testid="scatter-row-1"]', { timeout: 60_000 })
  await check('design: tolerance bands')
  await page.click('[data-testid="design-panel-response"]')
  await page.waitForSelector('[data-testid="response-chart"] svg', { timeout: 30_000 })
  await page.waitForTimeout(900)
  await check('design: forced response')
}

describe('layout and labels a practitioner reads', () => {
  afterEach(async () => {
    expect(errors, errors.join('\n')).toEqual([])
    await context?.close()
  })

  for (const size of [
    { width: 1280, height: 800 },
    { width: 1920, height: 1080 },
  ]) {
    it(`no card’s content overflows and no chart labels collide, on every view, at ${size.width}×${size.height}`, async () => {
      await openApp(size)
      // Every kind of row the part view can hold, with every family analysed (every column shows): a confirmed bending spring, a
      // draft mass, a draft spring; and the preset form open.
      await page.click('[data-testid="view-part"]')
      await page.click('[data-testid="motion-torsion"]')
      await page.click('[data-testid="add-springs"]')
      await page.fill('[data-testid="springs-draft-0-stiffness"]', '2e6')
      await page.click('[data-testid="springs-draft-0-confirm"]')
      await page.selectOption('[data-testid="springs-0-motion"]', 'bending')
      await page.fill('[data-testid="springs-0-rotationalStiffness"]', '500')
      await page.click('[data-testid="add-springs"]')
      await page.click('[data-testid="add-masses"]')
      // A second fixed frequency 20 Hz above the first: two conflicts of mode 1 side by side, where labels used to pile up.
      await page.click('[data-testid="view-resonance"]')
      await page.click('[data-testid="preset-twice-line-60"]')
      await page.click('[data-testid="preset-blade-pass"]')
      const problems: string[] = []
      await everyView(async (where) => {
        for (const p of await overflowingCards()) problems.push(`${where} — ${p}`)
        for (const p of await collidingChartLabels()) problems.push(`${where} — ${p}`)
      })
      // The same part in US units.
      await page.click('[data-testid="units-us"]')
      await page.click('[data-testid="view-part"]')
      await page.waitForTimeout(300)
      for (const p of await overflowingCards()) problems.push(`part, US units — ${p}`)
      expect(problems, problems.join('\n')).toEqual([])
    })
  }

  it('asks for the speed of a running-speed excitation instead of copying another’s', async () => {
    await openApp()
    await page.click('[data-testid="view-resonance"]')
    const rows = await page.locator('[data-testid^="excitation-row-"]').count()
    await page.click('[data-testid="preset-running-1x"]')
    await page.waitForSelector('[data-testid="preset-form"]')
    // Nothing is added until the speed is given.
    await page.click('[data-testid="preset-add"]')
    expect(await page.locator('[data-testid^="excitation-row-"]').count()).toBe(rows)
    await expect(page.locator('[data-testid="preset-form"] .field-issue').first().textContent()).resolves.toContain('is required')
    await page.fill('[data-testid="preset-speed-low"]', '1480')
    await page.keyboard.press('Enter')
    await expect.poll(() => page.locator('[data-testid^="excitation-row-"]').count()).toBe(rows + 1)
    expect(await page.inputValue(`[data-testid="excitation-${rows}-low"]`)).toBe('1480')
    expect(await page.inputValue(`[data-cell="${rows}:high"]`)).toBe("")
    // The check is the engine's for a single 1480 rpm speed (a 24.67 Hz band), not a 1480–2990 rpm range.
    const changed = demo()
    changed.excitations.push({ label: 'Running speed 1×', rpm: 1480, orders: [1] })
    const conflicts = analyseProject(changed).resonance.filter((p) => p.status === 'conflict').length
    await expect.poll(() => page.getAttribute('[data-testid="diagram-conflicts"]', 'data-count'), { timeout: 15_000 }).toBe(String(conflicts))
  })

  it('puts the caution under the modes and resonance tables, and says which motion each clear verdict covers', async () => {
    await openApp()
    for (const view of ['modes', 'resonance'] as const) {
      await page.click(`[data-testid="view-${view}"]`)
      await expect(page.locator(`[data-testid="active-${view}"] [data-testid="caution-line"]`).textContent()).resolves.toContain(
        'verify on the real part (for example an impact test) and defer to local codes and licensed engineering practice',
      )
    }
    const verdicts = await page.locator('[data-testid="resonance-table"] .status.clear').allTextContents()
    expect(verdicts.length).toBeGreaterThan(0)
    expect(new Set(verdicts.map((v) => v.trim()))).toEqual(new Set(['clear in axial motion', 'clear in bending']))
    // The cautions say what is still not modelled.
    await page.click('[data-testid="cautions-button"]')
    const cautions = (await page.textContent('[data-testid="cautions-not-modelled"]'))!
    for (const words of ['gyroscopic effects', 'bearings', 'rotor-dynamics analysis', 'Coupled bending and torsion', 'Initial curvature']) expect(cautions).toContain(words)
    await page.keyboard.press('Escape')
    // Which frequency each view uses is said where it is shown.
    await expect(page.locator('[data-testid="resonance-frequency-basis"]').textContent()).resolves.toContain('exact frequency')
    await page.click('[data-testid="view-modes"]')
    await expect(page.locator('[data-testid="modes-table"] thead').textContent()).resolves.toContain('FE frequency')
    await expect(page.locator('[data-testid="modes-basis"]').textContent()).resolves.toContain('Resonance view use the exact frequency')
  })

  it('closes the warnings panel with Escape, on another view and when a file is opened', async () => {
    await openApp()
    await page.click('[data-testid="warnings-button"]')
    await page.waitForSelector('[data-testid="warnings-panel"]')
    await page.keyboard.press('Escape')
    expect(await page.locator('[data-testid="warnings-panel"]').count()).toBe(0)
    await page.click('[data-testid="warnings-button"]')
    await page.click('[data-testid="view-part"]')
    expect(await page.locator('[data-testid="warnings-panel"]').count()).toBe(0)
    await page.click('[data-testid="warnings-button"]')
    await page.click('[data-testid="file-menu"]')
    const [chooser] = await Promise.all([page.waitForEvent('filechooser'), page.click('[data-testid="cmd-open"]')])
    await chooser.setFiles({ name: 'other.rodwave.json', mimeType: 'application/json', buffer: Buffer.from(DEMO_TEXT) })
    await expect.poll(() => page.locator('[data-testid="warnings-panel"]').count()).toBe(0)
  })
})

describe('screenshots of the main screens', () => {
  const SIZES = [
    { width: 1280, height: 800 },
    { width: 1920, height: 1080 },
  ]
  // A test run leaves the committed pictures alone; `npm run screenshots` refreshes them.
  const OUT = process.env.RODWAVE_SCREENSHOT_DIR ?? join(tmpdir(), 'rodwave-screenshots')
  beforeAll(() => mkdir(OUT, { recursive: true }))

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
        await page.click('[data-testid="view-design"]')
        await page.waitForSelector('[data-testid="sensitivity-row-1"]', { timeout: 30_000 })
        await page.selectOption('[data-testid="tune-parameter"]', 'segments[0].length')
        await page.click('[data-testid="tune-run"]')
        await page.waitForSelector('[data-testid="tune-result"]', { timeout: 30_000 })
        await page.mouse.move(0, 0)
        await page.screenshot({ path: join(OUT, `design-guide-${size.width}x${size.height}-${theme}.png`) })
        await page.click('[data-testid="design-panel-scatter"]')
        await page.fill('[data-testid="scatter-samples"]', '500')
        await page.click('[data-testid="scatter-run"]')
        await page.waitForSelector('[data-testid="scatter-row-1"]', { timeout: 60_000 })
        await page.mouse.move(0, 0)
        await page.screenshot({ path: join(OUT, `design-scatter-${size.width}x${size.height}-${theme}.png`) })
        await page.click('[data-testid="design-panel-response"]')
        await page.waitForSelector('[data-testid="response-chart"] svg', { timeout: 15_000 })
        await page.waitForTimeout(1200)
        await page.screenshot({ path: join(OUT, `design-response-${size.width}x${size.height}-${theme}.png`) })
        // The warnings drawer over the convergence view, as before the design view existed.
        await page.click('[data-testid="view-convergence"]')
        await page.click('[data-testid="warnings-button"]')
        await page.screenshot({ path: join(OUT, `warnings-${size.width}x${size.height}-${theme}.png`) })
      })
    }
  }
})
