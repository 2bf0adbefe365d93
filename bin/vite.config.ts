/**
 * Builds the command line into dist/cli/rodwave.mjs: one ES module for Node with the engine and
 * zod bundled in, so a call starts without compiling TypeScript. The report and its chart
 * renderer are loaded only by `report` (a dynamic import, so they land in a chunk of their
 * own beside the entry). The scatter worker threads run the same entry file.
 */
import { fileURLToPath } from 'node:url'
import { defineConfig } from 'vite'

const root = fileURLToPath(new URL('..', import.meta.url))

export default defineConfig({
  root,
  publicDir: false,
  logLevel: 'warn',
  ssr: { noExternal: true, target: 'node' },
  build: {
    ssr: fileURLToPath(new URL('./rodwave.ts', import.meta.url)),
    outDir: fileURLToPath(new URL('../dist/cli', import.meta.url)),
    emptyOutDir: true,
    target: 'node20',
    minify: true,
    sourcemap: false,
    copyPublicDir: false,
    reportCompressedSize: false,
    rollupOptions: {
      output: { format: 'es', entryFileNames: 'rodwave.mjs', chunkFileNames: '[name]-[hash].mjs' },
    },
  },
})
