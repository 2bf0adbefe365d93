/** Chromium for the browser tests: Debian's build, headless, no network services, no sandbox (containers). */
import { chromium, type Browser, type Page } from 'playwright-core'

export const CHROMIUM_ARGS = ['--headless', '--no-sandbox', '--disable-gpu', '--disable-background-networking', '--disable-component-update', '--no-first-run']

export function launchChromium(): Promise<Browser> {
  return chromium.launch({ executablePath: '/usr/bin/chromium', args: CHROMIUM_ARGS })
}

/** Console errors, failed requests and uncaught exceptions of a page, for a test to assert none. */
export function collectPageErrors(page: Page): string[] {
  const errors: string[] = []
  page.on('console', (message) => {
    if (message.type() === 'error') errors.push(`console: ${message.text()}`)
  })
  page.on('pageerror', (error) => errors.push(`uncaught: ${error.message}`))
  page.on('requestfailed', (request) => errors.push(`request failed: ${request.url()} ${request.failure()?.errorText ?? ''}`))
  page.on('response', (response) => {
    if (response.status() >= 400) errors.push(`HTTP ${response.status()}: ${response.url()}`)
  })
  return errors
}

/** Significant digits of a number as shown ("106.36" → 5, "6 381.4" → 5). */
export function shownDigits(text: string): number {
  const digits = text.replace(/[^0-9]/g, '').replace(/^0+/, '')
  return digits.length
}

/** The number a table shows, thin spaces and true minus signs read back. */
export function shownNumber(text: string): number {
  return Number(text.replace(/[\s\u2009\u202f]/g, '').replace('\u2212', '-'))
}
