// Mutation testing of the engine (Stryker with its Vitest runner), run on demand with
// `npm run test:mutation`; not part of `npm test` or CI (a full run takes hours on 2 cores).
// Reports and the incremental file go to reports/ (git-ignored). See DEVELOPERS.md.
/** @type {import('@stryker-mutator/api/core').PartialStrykerOptions} */
export default {
  testRunner: 'vitest',
  // Only the engine's unit tests: no processes, Electron, renderer or browser.
  vitest: { configFile: 'tests/mutation/vitest.config.ts' },
  mutate: [
    'core/exact/**/*.ts',
    'core/fe/**/*.ts',
    'core/analysis/**/*.ts',
    // re-exports only
    '!core/exact/beam-exact.ts',
  ],
  coverageAnalysis: 'perTest',
  // Mutants run only when a module loads (tables, constants) would need every test re-run with
  // a fresh environment (minutes each): they are reported as ignored instead.
  ignoreStatic: true,
  // Later runs re-test only the mutants whose code or covering tests changed.
  incremental: true,
  incrementalFile: 'reports/mutation/stryker-incremental.json',
  tempDirName: 'reports/stryker-tmp',
  ignorePatterns: ['dist', 'release', 'coverage', 'test-results', 'assets', 'bench/results', 'renderer', 'electron', 'reports'],
  // The machine is shared: two test processes at most.
  concurrency: 2,
  timeoutFactor: 2,
  timeoutMS: 10_000,
  // event-recorder writes each result as it comes (reports/mutation/events), for long runs.
  reporters: ['clear-text', 'progress-append-only', 'html', 'json', 'event-recorder'],
  eventReporter: { baseDir: 'reports/mutation/events' },
  htmlReporter: { fileName: 'reports/mutation/mutation.html' },
  jsonReporter: { fileName: 'reports/mutation/mutation.json' },
  thresholds: { high: 90, low: 80, break: null },
}
