/**
 * Packaging configuration, checked by electron-builder's own loader and schema validator
 * (app-builder-lib, installed with electron-builder), plus the files it points at.
 */
import { readFileSync } from 'node:fs'
import { readFile, stat } from 'node:fs/promises'
import { join } from 'node:path'
import { fileURLToPath } from 'node:url'
import { describe, expect, it, vi } from 'vitest'
import { DEMO_PROJECT_FILE } from '../../electron/app-paths'
import { NOTICES_FILE } from '../../build/third-party-notices'

vi.mock('electron', () => ({}))

const root = fileURLToPath(new URL('../..', import.meta.url))
const configPath = join(root, 'build', 'electron-builder.yml')

interface FileSet {
  from: string
  to: string
  filter: string[]
}

async function loadConfig() {
  const { getConfig, validateConfiguration } = await import('app-builder-lib/out/util/config/config.js')
  const { DebugLogger, log } = await import('builder-util')
  // Keep electron-builder's "loaded configuration" line out of the test output.
  const info = vi.spyOn(log, 'info').mockImplementation(() => undefined)
  try {
    const config = await getConfig(root, configPath, null)
    await validateConfiguration(config, new DebugLogger(false))
    return config
  } finally {
    info.mockRestore()
  }
}

/** Width and height from a PNG's IHDR chunk (PNG specification, ISO/IEC 15948, section 11.2.2). */
async function pngSize(path: string): Promise<{ width: number; height: number }> {
  const bytes = await readFile(path)
  expect(bytes.subarray(0, 8)).toEqual(Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]))
  expect(bytes.subarray(12, 16).toString('latin1')).toBe('IHDR')
  return { width: bytes.readUInt32BE(16), height: bytes.readUInt32BE(20) }
}

describe('electron-builder configuration', () => {
  it('passes electron-builder’s own schema validation', async () => {
    await expect(loadConfig()).resolves.toBeTruthy()
  })

  it('names the app and packs only the build output and package.json', async () => {
    const config = await loadConfig()
    expect(config.productName).toBe('Rodwave')
    expect(config.appId).toMatch(/^[a-z]+(\.[a-z0-9-]+)+$/)
    // The loader merges plain patterns into file sets; read their filters back.
    const patterns = (config.files as { filter?: string[] }[]).flatMap((set) => set.filter ?? [])
    expect(patterns).toEqual(expect.arrayContaining(['dist/**', 'package.json']))
    expect(patterns.filter((pattern) => !pattern.startsWith('!'))).toEqual(['dist/**', 'package.json'])
    expect(config.asar).toBe(true)
  })

  it('packs the third-party notices the build writes beside the window and the desktop shell', async () => {
    const config = await loadConfig()
    const patterns = (config.files as { filter?: string[] }[]).flatMap((set) => set.filter ?? [])
    const { minimatch } = await import('minimatch')
    for (const file of [`dist/renderer/${NOTICES_FILE}`, `dist/electron/${NOTICES_FILE}`]) {
      const included = patterns.some((pattern) => !pattern.startsWith('!') && minimatch(file, pattern))
      const excluded = patterns.some((pattern) => pattern.startsWith('!') && minimatch(file, pattern.slice(1)))
      expect({ file, packed: included && !excluded }).toEqual({ file, packed: true })
    }
  })

  it('ships the demo project as an extra resource under examples/', async () => {
    const config = await loadConfig()
    const examples = (config.extraResources as FileSet[]).find((set) => set.from === 'examples')!
    expect(examples.to).toBe('examples')
    expect((await stat(join(root, 'examples', DEMO_PROJECT_FILE))).isFile()).toBe(true)
  })

  it('sets the security fuses', async () => {
    const config = await loadConfig()
    expect(config.electronFuses).toMatchObject({
      runAsNode: false,
      enableNodeOptionsEnvironmentVariable: false,
      enableNodeCliInspectArguments: false,
      onlyLoadAppFromAsar: true,
      enableEmbeddedAsarIntegrityValidation: true,
    })
  })

  it('builds AppImage and deb on Linux, NSIS on Windows, dmg on macOS', async () => {
    const config = await loadConfig()
    expect(config.linux?.target).toEqual(['AppImage', 'deb'])
    expect(config.win?.target).toEqual(['nsis'])
    expect(config.mac?.target).toEqual(['dmg'])
  })

  it('points at icons that exist, square, at least as large as each platform needs', async () => {
    const config = await loadConfig()
    expect(await pngSize(join(root, config.mac!.icon as string))).toEqual({ width: 512, height: 512 })
    expect(await pngSize(join(root, config.win!.icon as string))).toEqual({ width: 256, height: 256 })
    const linuxIcons = join(root, config.linux!.icon as string)
    expect(await pngSize(join(linuxIcons, '512x512.png'))).toEqual({ width: 512, height: 512 })
    expect(await pngSize(join(linuxIcons, '256x256.png'))).toEqual({ width: 256, height: 256 })
  })

  it('keeps the icon’s source as an SVG', async () => {
    const svg = await readFile(join(root, 'assets', 'rodwave-icon.svg'), 'utf8')
    expect(svg).toMatch(/^<svg xmlns="http:\/\/www\.w3\.org\/2000\/svg"[^>]*viewBox="0 0 512 512"/)
  })
})

describe('what the packages are made of', () => {
  const pkg = JSON.parse(readFileSync(join(root, 'package.json'), 'utf8')) as {
    name: string
    homepage?: string
    author?: { name?: string; email?: string }
    desktopName?: string
    dependencies?: Record<string, string>
  }

  it('passes the deb target’s own metadata check (homepage, author with an e-mail)', async () => {
    const { default: FpmTarget } = await import('app-builder-lib/out/targets/FpmTarget.js')
    const { AppInfo } = await import('app-builder-lib/out/appInfo.js')
    // What FpmTarget reads of its packager, built from the real package.json.
    const appInfo = { info: { metadata: pkg, repositoryInfo: Promise.resolve(null) }, notNullDevMetadata: pkg }
    const packager = {
      info: { metadata: pkg },
      appInfo: { computePackageUrl: () => AppInfo.prototype.computePackageUrl.call(appInfo), linuxPackageName: 'rodwave' },
    }
    // A private method of electron-builder's deb/rpm target: the check `npm run dist` runs first.
    const check = (FpmTarget.prototype as unknown as { computeFpmMetaInfoOptions(this: unknown): Promise<unknown> }).computeFpmMetaInfoOptions
    const meta = await check.call({ packager, options: {} })
    expect(meta).toMatchObject({ maintainer: 'Rodwave contributors <team@rodwave.dev>', url: 'https://rodwave.dev' })
  })

  it('names the desktop entry after desktopName, which is the app id Electron gives the window', async () => {
    const config = await loadConfig()
    const { LinuxTargetHelper } = await import('app-builder-lib/out/targets/LinuxTargetHelper.js')
    const helper = { packager: { platformSpecificBuildOptions: config.linux, info: { metadata: pkg }, executableName: config.linux?.executableName } }
    expect(pkg.desktopName).toBe('rodwave.desktop')
    expect(LinuxTargetHelper.prototype.getDesktopFileName.call(helper)).toBe('rodwave')
  })

  it('copies no node_modules into the app archive: every runtime package is bundled into dist/', async () => {
    const { getCollectorByPackageManager, PM } = await import('app-builder-lib/out/node-module-collector/index.js')
    const { TmpDir } = await import('builder-util')
    const temp = new TmpDir('rodwave-packaging-test')
    try {
      // The collector electron-builder itself uses to pick the production node_modules it copies (the traversal variant: no npm run).
      const { nodeModules } = await getCollectorByPackageManager(PM.TRAVERSAL, root, temp).getNodeModules({ packageName: pkg.name })
      expect(nodeModules.map((module) => module.name)).toEqual([])
    } finally {
      await temp.cleanup()
    }
    expect(pkg.dependencies ?? {}).toEqual({})
  })
})
