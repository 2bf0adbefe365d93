/**
 * Opening large files in the browser: an 18 MB project is decoded, parsed and validated in
 * the solver worker, never on the page's thread (the page's own JSON.parse is watched and
 * never sees more than a small string); a file over the 20 MB limit is refused from its size.
 */
import { mkdtemp, readFile, rm, writeFile } from 'node:fs/promises'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import type { Browser, Page } from 'playwright-core'
import { MAX_PROJECT_BYTES } from '../../core/model/project-bytes'
import { collectPageErrors, launchChromium } from './browser'

const DEMO = JSON.parse(await readFile(join(import.meta.dirname, '../../examples/condensate-pump-hanger.rodwave.json'), 'utf8')) as object

let browser: Browser
let folder: string
beforeAll(async () => {
  browser = await launchChromium()
  folder = await mkdtemp(join(tmpdir(), 'rodwave-large-'))
})
afterAll(async () => {
  await browser?.close()
  await rm(folder, { recursive: true, force: true })
})

/** Opens the app with the page's JSON.parse watched: the longest text it was given is kept in window.__longestParse. */
async function openWatchedApp(): Promise<{ page: Page; errors: string[] }> {
  const context = await browser.newContext({ viewport: { width: 1280, height: 800 } })
  await context.addInitScript(() => {
    const parse = JSON.parse
    const watched = window as unknown as { __longestParse: number }
    watched.__longestParse = 0
    JSON.parse = function (text: string, reviver?: (this: unknown, key: string, value: unknown) => unknown) {
      watched.__longestParse = Math.max(watched.__longestParse, String(text).length)
      return parse(text, reviver)
    } as typeof JSON.parse
  })
  const page = await context.newPage()
  const errors = collectPageErrors(page)
  await page.goto(inject('baseUrl'))
  await page.waitForSelector('[data-testid="first-frequency"]', { timeout: 30_000 })
  return { page, errors }
}

/** Picks a file in the page's Open dialog (from disk: large buffers do not go through the protocol). */
async function upload(page: Page, name: string, buffer: Buffer): Promise<void> {
  const path = join(folder, name)
  await writeFile(path, buffer)
  await page.click('[data-testid="file-menu"]')
  const [chooser] = await Promise.all([page.waitForEvent('filechooser'), page.click('[data-testid="cmd-open"]')])
  await chooser.setFiles(path)
}

describe('large files in the browser', () => {
  it('opens an 18 MB project, reading it in the worker: the page never parses the file', async () => {
    const { page, errors } = await openWatchedApp()
    const text = JSON.stringify({ ...DEMO, title: 'Hanger from a large file' }, null, 2)
    // Valid JSON padded with whitespace to 18 MB (JSON allows whitespace between tokens, RFC 8259 section 2).
    const buffer = Buffer.from(`${text}${' '.repeat(18_000_000 - text.length)}\n`)
    expect(buffer.byteLength).toBeGreaterThan(18_000_000)
    await upload(page, 'large.rodwave.json', buffer)
    await expect.poll(() => page.textContent('[data-testid="document-name"]'), { timeout: 60_000 }).toBe('Hanger from a large file')
    const longest = await page.evaluate(() => (window as unknown as { __longestParse: number }).__longestParse)
    expect(longest).toBeLessThan(1_000_000)
    expect(errors).toEqual([])
    await page.context().close()
  })

  it('refuses a file over 20 MB from its size, with the limit in the message', async () => {
    const { page, errors } = await openWatchedApp()
    const before = await page.textContent('[data-testid="document-name"]')
    await upload(page, 'huge.rodwave.json', Buffer.alloc(MAX_PROJECT_BYTES + 1, 0x20))
    await expect
      .poll(() => page.textContent('[data-testid="notice"]'), { timeout: 30_000 })
      .toContain('Could not open "huge.rodwave.json": it is 20.0 MB, and Rodwave opens project files up to 20.0 MB.')
    expect(await page.textContent('[data-testid="document-name"]')).toBe(before)
    expect(errors).toEqual([])
    await page.context().close()
  })
})
