/**
 * Third-party notices generated at build time: every package whose code is in a bundle is
 * listed with its version, its declared licence and the full text of its licence and notice
 * files, and nothing else is. The packages in a bundle are read independently of the
 * plugin, from the bundle's source map (the bundler lists every source file it put in), and
 * the licence texts straight from node_modules.
 */
import { mkdir, mkdtemp, readdir, readFile, rm, stat, writeFile } from 'node:fs/promises'
import { tmpdir } from 'node:os'
import { dirname, join, resolve } from 'node:path'
import { fileURLToPath } from 'node:url'
import { build, createBuilder } from 'vite'
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest'
import { NOTICES_FILE, packageFolderOf, projectPackageResolver, thirdPartyNotices, virtualModulePackage } from '../../build/third-party-notices'

vi.mock('electron', () => ({}))

const root = fileURLToPath(new URL('../..', import.meta.url))

let folder: string
beforeAll(async () => {
  folder = await mkdtemp(join(tmpdir(), 'rodwave-notices-'))
})
afterAll(async () => {
  await rm(folder, { recursive: true, force: true })
})

/** Package folders named by a source map's sources (paths relative to the map's folder). */
async function packagesInSourceMap(mapPath: string): Promise<string[]> {
  const map = JSON.parse(await readFile(mapPath, 'utf8')) as { sources: string[]; sourceRoot?: string }
  const folders = new Set<string>()
  for (const source of map.sources) {
    const path = resolve(dirname(mapPath), map.sourceRoot ?? '', source).replace(/\\/g, '/')
    // Greedy: the package after the last node_modules (a package's own nested copy of another).
    const match = /^(.*\/node_modules\/(?:@[^/]+\/)?[^/]+)\//.exec(path)
    if (match) folders.add(match[1]!)
  }
  return [...folders].sort()
}

/** What the notices must hold for one package, read from its folder: the list line and each licence file in full. */
async function expectedEntry(packageFolder: string): Promise<{ line: string; texts: string[] }> {
  const manifest = JSON.parse(await readFile(join(packageFolder, 'package.json'), 'utf8')) as { name: string; version: string; license: string }
  const texts: string[] = []
  for (const name of await readdir(packageFolder)) {
    const path = join(packageFolder, name)
    if (/^(licen[cs]e|notice|copying)/i.test(name) && (await stat(path)).isFile()) texts.push((await readFile(path, 'utf8')).trimEnd())
    if (/^licen[cs]es$/i.test(name) && (await stat(path)).isDirectory()) {
      for (const inner of await readdir(path)) texts.push((await readFile(join(path, inner), 'utf8')).trimEnd())
    }
  }
  return { line: `  ${manifest.name} ${manifest.version} (${manifest.license})`, texts }
}

/** The package lines of a notices file (its list at the top). */
const listedPackages = (notices: string) => notices.split('\n').filter((line) => /^ {2}\S+ \S+ \(.+\)$/.test(line))

describe('which package a bundled module comes from', () => {
  it.each([
    ['/p/node_modules/zod/v4/core/util.js', '/p/node_modules/zod'],
    ['/p/node_modules/@vue/runtime-dom/dist/runtime-dom.esm-bundler.js', '/p/node_modules/@vue/runtime-dom'],
    ['/p/node_modules/zrender/node_modules/tslib/tslib.es6.js', '/p/node_modules/zrender/node_modules/tslib'],
    ['C:\\p\\node_modules\\echarts\\lib\\echarts.js', 'C:/p/node_modules/echarts'],
    ['/p/node_modules/vue-echarts/dist/index.js?commonjs-proxy', '/p/node_modules/vue-echarts'],
    ['/p/renderer/App.vue', null],
    ['\0vite/modulepreload-polyfill.js', null],
  ])('%j → %j', (id, folder) => {
    expect(packageFolderOf(id)).toBe(folder)
  })

  it('names the build tools whose helpers are copied into a bundle under virtual ids', () => {
    expect(virtualModulePackage('\0vite/modulepreload-polyfill.js')).toBe('vite')
    expect(virtualModulePackage('\0plugin-vue:export-helper')).toBe('@vitejs/plugin-vue')
    expect(virtualModulePackage('\0rolldown/runtime.js')).toBe('rolldown')
    expect(virtualModulePackage('/p/renderer/App.vue')).toBeNull()
  })
})

describe('the notices of a bundle', () => {
  it('list every package in it, Apache-2.0 NOTICE and bundled licences included, and a nested package at its own version', async () => {
    const notices = thirdPartyNotices({ heading: 'Test bundle', resolvePackage: projectPackageResolver(root) })
    const outDir = join(folder, 'bundle')
    await build({
      configFile: false,
      logLevel: 'silent',
      root,
      plugins: [notices.plugin],
      build: {
        outDir,
        emptyOutDir: true,
        minify: false,
        sourcemap: true,
        rollupOptions: { input: join(root, 'tests/electron/fixtures/notices-entry.js'), output: { entryFileNames: 'bundle.js' } },
      },
    })
    const text = await readFile(join(outDir, NOTICES_FILE), 'utf8')
    const folders = await packagesInSourceMap(join(outDir, 'bundle.js.map'))
    // The source map's own account of the bundle: the four packages, tslib from zrender's own node_modules.
    expect(folders.map((f) => f.slice(f.indexOf('node_modules/')))).toEqual(
      expect.arrayContaining(['node_modules/echarts', 'node_modules/zod', 'node_modules/zrender', 'node_modules/zrender/node_modules/tslib']),
    )
    const entries = await Promise.all(folders.map(expectedEntry))
    const extra = listedPackages(text).filter((line) => !entries.some((e) => e.line === line))
    // Beyond the source files, only the bundler's own helpers may be listed.
    expect(extra.every((line) => /^ {2}(rolldown|vite) /.test(line))).toBe(true)
    for (const entry of entries) {
      expect(listedPackages(text)).toContain(entry.line)
      for (const licence of entry.texts) expect(text).toContain(licence)
    }
    expect(text).toContain('  tslib 2.3.0 (0BSD)')
    expect(text).toContain('Apache ECharts\nCopyright 2017-')
  })

  it('stop the build when a bundled package has no licence file', async () => {
    const notices = thirdPartyNotices({ heading: 'Test', resolvePackage: () => null })
    const fakeRoot = join(folder, 'unlicensed')
    await mkdir(join(fakeRoot, 'node_modules', 'nolicence'), { recursive: true })
    await writeFile(join(fakeRoot, 'node_modules', 'nolicence', 'package.json'), JSON.stringify({ name: 'nolicence', version: '1.0.0', license: 'MIT', main: 'index.js' }))
    await writeFile(join(fakeRoot, 'node_modules', 'nolicence', 'index.js'), 'export function value(scope) {\n  return scope.location.href.length\n}\n')
    await writeFile(join(fakeRoot, 'entry.js'), "import { value } from 'nolicence'\nconsole.log(value(globalThis))\n")
    await expect(
      build({ configFile: false, logLevel: 'silent', root: fakeRoot, plugins: [notices.plugin], build: { outDir: join(fakeRoot, 'out'), write: false, rollupOptions: { input: join(fakeRoot, 'entry.js') } } }),
    ).rejects.toThrow(/nolicence .* is bundled but has no licence file/)
  })

  it('of the real desktop shell (main process and preload) list exactly what they bundle', async () => {
    const outDir = join(folder, 'electron')
    const builder = await createBuilder({
      configFile: join(root, 'electron', 'vite.config.ts'),
      logLevel: 'silent',
      environments: { main: { build: { outDir } }, preload: { build: { outDir } } },
    })
    await builder.buildApp()
    const text = await readFile(join(outDir, NOTICES_FILE), 'utf8')
    const folders = await packagesInSourceMap(join(outDir, 'main.cjs.map'))
    expect(folders.length).toBeGreaterThan(0)
    const entries = await Promise.all(folders.map(expectedEntry))
    expect(listedPackages(text).sort()).toEqual(entries.map((e) => e.line).sort())
    for (const entry of entries) for (const licence of entry.texts) expect(text).toContain(licence)
    // The preload bundles nothing third-party, so it writes no notices of its own.
    expect(await packagesInSourceMap(join(outDir, 'preload.cjs.map'))).toEqual([])
    expect(await readdir(outDir)).not.toContain('third-party-notices-preload.txt')
  })
})
