/**
 * Builds the main process and the preload to CommonJS in dist/electron/. They are two
 * separate builds (two Vite environments) because a sandboxed preload can require nothing
 * but `electron`: it must be one self-contained file, never sharing a chunk with main.
 */
import { builtinModules } from 'node:module'
import { fileURLToPath } from 'node:url'
import { defineConfig, type BuildEnvironmentOptions } from 'vite'

const root = fileURLToPath(new URL('..', import.meta.url))
const outDir = fileURLToPath(new URL('../dist/electron', import.meta.url))
const external = ['electron', /^electron\//, /^node:/, ...builtinModules]

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
