/**
 * Renders assets/rodwave-icon.svg to the PNG sizes the installers use
 * (assets/icons/<n>x<n>.png), with the system's Chromium, offline.
 * Run: npx tsx build/render-icon.ts
 */
import { mkdir, readFile } from 'node:fs/promises'
import { fileURLToPath } from 'node:url'
import { chromium } from 'playwright-core'

const SIZES = [512, 256] as const
const svgPath = fileURLToPath(new URL('../assets/rodwave-icon.svg', import.meta.url))
const iconsDir = fileURLToPath(new URL('../assets/icons/', import.meta.url))

async function main(): Promise<void> {
  const svg = await readFile(svgPath, 'utf8')
  await mkdir(iconsDir, { recursive: true })
  const browser = await chromium.launch({
    executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
    args: ['--headless', '--no-sandbox', '--disable-gpu', '--disable-background-networking', '--disable-component-update', '--no-first-run'],
  })
  try {
    for (const size of SIZES) {
      const page = await browser.newPage({ viewport: { width: size, height: size }, deviceScaleFactor: 1 })
      const sized = svg.replace(/width="512" height="512"/, `width="${size}" height="${size}"`)
      await page.setContent(`<!doctype html><html><body style="margin:0;background:transparent">${sized}</body></html>`)
      const out = `${iconsDir}${size}x${size}.png`
      await page.locator('svg').screenshot({ path: out, omitBackground: true })
      await page.close()
      process.stdout.write(`wrote ${out}\n`)
    }
  } finally {
    await browser.close()
  }
}

main().catch((error: unknown) => {
  process.stderr.write(`render-icon: ${error instanceof Error ? error.message : String(error)}\n`)
  process.exitCode = 1
})
