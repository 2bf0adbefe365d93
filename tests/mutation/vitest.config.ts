// The unit tests of the engine that `npm run test:mutation` (Stryker, stryker.config.json) runs
// against each mutant of core/: no command-line processes, Electron, renderer or browser tests,
// which are slow or spawn processes and do not exercise the mutated folders any further.
import { defineConfig } from 'vitest/config'

const root = decodeURIComponent(new URL('../..', import.meta.url).pathname).replace(/^\/([A-Za-z]:)/, '$1')

export default defineConfig({
  root,
  test: {
    include: [
      'tests/exact/**/*.test.ts',
      'tests/fe/**/*.test.ts',
      'tests/linalg/**/*.test.ts',
      'tests/analysis/**/*.test.ts',
      'tests/model/**/*.test.ts',
      'tests/properties/**/*.test.ts',
    ],
    setupFiles: ['tests/mutation/skip-in-mutation-runs.ts'],
    environment: 'node',
    testTimeout: 60_000,
    pool: 'threads',
    // Test files share their workers' modules from one mutant run to the next: Stryker switches
    // mutants at run time (its instrumented code reads the active mutant), so nothing needs a
    // fresh import, and skipping the re-import makes each mutant run about three times faster.
    isolate: false,
  },
})
