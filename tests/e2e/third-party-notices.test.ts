/**
 * The window's third-party notices, as built by `npm run build:renderer` and served beside
 * it (the desktop app's About box shows the same file): the runtime packages the window is
 * made of, named in README's licence table (Vue's runtime, Pinia, ECharts with ZRender and
 * tslib, vue-echarts, zod), each with its licence text in full and ECharts' NOTICE; and none
 * of the tools that only build or test it.
 */
import { readdir, readFile } from 'node:fs/promises'
import { join } from 'node:path'
import { describe, expect, inject, it } from 'vitest'

const root = join(import.meta.dirname, '..', '..')

/** A package's licence and notice files, read from node_modules. */
async function licenceTexts(folder: string): Promise<string[]> {
  const entries = await readdir(folder, { withFileTypes: true })
  const names = entries.filter((entry) => entry.isFile() && /^(licen[cs]e|notice)/i.test(entry.name)).map((entry) => entry.name)
  return Promise.all(names.map(async (name) => (await readFile(join(folder, name), 'utf8')).trimEnd()))
}

describe('third-party notices of the window', () => {
  it('list the window’s runtime packages, each with its licence in full, and are served beside it', async () => {
    const served = await fetch(new URL('third-party-notices.txt', inject('baseUrl')))
    expect(served.status).toBe(200)
    const notices = await served.text()
    expect(notices).toBe(await readFile(join(root, 'dist', 'renderer', 'third-party-notices.txt'), 'utf8'))

    const runtime = ['@vue/runtime-dom', '@vue/runtime-core', '@vue/reactivity', '@vue/shared', 'pinia', 'echarts', 'zrender', 'vue-echarts', 'zod']
    for (const name of runtime) {
      const folder = join(root, 'node_modules', name)
      const manifest = JSON.parse(await readFile(join(folder, 'package.json'), 'utf8')) as { version: string; license: string }
      expect(notices).toContain(`  ${name} ${manifest.version} (${manifest.license})\n`)
      for (const text of await licenceTexts(folder)) expect(notices).toContain(text)
    }
    // ECharts' NOTICE (Apache-2.0, section 4(d)) and tslib, which ZRender bundles at its own version.
    expect(notices).toContain('Apache ECharts\nCopyright 2017-')
    const tslib = JSON.parse(await readFile(join(root, 'node_modules', 'zrender', 'node_modules', 'tslib', 'package.json'), 'utf8')) as { version: string }
    expect(notices).toContain(`  tslib ${tslib.version} (0BSD)\n`)

    for (const tool of ['vitest', 'playwright-core', 'electron', 'ml-matrix', 'fast-check', 'typescript', 'happy-dom']) {
      expect(notices).not.toMatch(new RegExp(`^ {2}${tool} `, 'm'))
    }
  })
})
