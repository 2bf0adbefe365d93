/**
 * Builds the main process and the preload to CommonJS in dist/electron/. They are two
 * separate builds (two Vite environments) because a sandboxed preload can require nothing
 * but `electron`: it must be one self-contained file, never sharing a chunk with main.
 */
import { readFileSync } from 'node:fs'
import { builtinModules } from 'node:module'
import { fileURLToPath } from 'node:url'
import { defineConfig, type BuildEnvironmentOptions } from 'vite'
// With its extension: Vite's native config loader (its future default) resolves no other way.
import { projectPackageResolver, thirdPartyNotices } from '../build/third-party-notices.ts'

const root = fileURLToPath(new URL('..', import.meta.url))
const outDir = fileURLToPath(new URL('../dist/electron', import.meta.url))
const { version } = JSON.parse(readFileSync(new URL('../package.json', import.meta.url), 'utf8')) as { version: string }
const external = ['electron', /^electron\//, /^node:/, ...builtinModules]
const shellHeading = `Rodwave ${version}: third-party notices of the desktop shell (Electron and Chromium, which run it, ship their own: LICENSE.electron.txt and LICENSES.chromium.html beside the app)`
// dist/electron/third-party-notices.txt from the main process's bundle; the preload's own file only if it ever bundles a package.
const mainNotices = thirdPartyNotices({ heading: `${shellHeading}, main process`, environment: 'main', resolvePackage: projectPackageResolver() })
const preloadNotices = thirdPartyNotices({
  heading: `${shellHeading}, preload`,
  environment: 'preload',
  fileName: 'third-party-notices-preload.txt',
  writeWhenEmpty: false,
  resolvePackage: projectPackageResolver(),
})

function commonJsBuild(entry: string, fileName: string, emptyOutDir: boolean): BuildEnvironmentOptions {
  return {
    outDir,
    emptyOutDir,
    target: 'node22',
    minify: false,
    sourcemap: true,
    copyPublicDir: false,
    reportCompressedSize: false,
    rollupOptions: {
      input: fileURLToPath(new URL(entry, import.meta.url)),
      external,
      output: { format: 'cjs', entryFileNames: fileName, codeSplitting: false, exports: 'auto' },
    },
  }
}

export default defineConfig({
  root,
  publicDir: false,
  logLevel: 'warn',
  plugins: [mainNotices.plugin, preloadNotices.plugin],
  environments: {
    // noExternal: zod and the rest are bundled in, so the packaged app needs no node_modules.
    main: { consumer: 'server', resolve: { noExternal: true }, build: commonJsBuild('./main.ts', 'main.cjs', true) },
    preload: { consumer: 'server', resolve: { noExternal: true }, build: commonJsBuild('./preload.ts', 'preload.cjs', false) },
  },
  builder: {
    async buildApp(builder) {
      // In order: main empties dist/electron, then the preload is added beside it.
      await builder.build(builder.environments.main)
      await builder.build(builder.environments.preload)
    },
  },
})
