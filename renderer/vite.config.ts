// Build of the window: root renderer/, relative asset paths (the app serves it from its own
// scheme, tests from a static server), module workers, output in dist/renderer.
import { defineConfig } from 'vite'
import vue from '@vitejs/plugin-vue'

// This folder as a path, without Node's url module (the renderer's lint forbids Node imports).
const here = decodeURIComponent(new URL('.', import.meta.url).pathname).replace(/^\/([A-Za-z]:)/, '$1')

export default defineConfig({
  root: here,
  base: './',
  plugins: [vue()],
  worker: { format: 'es' },
  build: {
    outDir: '../dist/renderer',
    emptyOutDir: true,
    target: 'es2022',
    // ECharts and the engine make one large chunk; the app loads from disk, not a network.
    chunkSizeWarningLimit: 2000,
  },
})
