// Browser tests of the built window (dist/renderer): Debian's Chromium driven by playwright-core,
// the build served over HTTP by global-setup.ts. `npm run test:e2e` builds first.
import { defineConfig } from 'vitest/config'

const root = decodeURIComponent(new URL('../..', import.meta.url).pathname).replace(/^\/([A-Za-z]:)/, '$1')

export default defineConfig({
  root,
  test: {
    include: ['tests/e2e/**/*.test.ts'],
    environment: 'node',
    globalSetup: ['tests/e2e/global-setup.ts'],
    testTimeout: 180_000,
    hookTimeout: 120_000,
    pool: 'forks',
    fileParallelism: false,
  },
})
