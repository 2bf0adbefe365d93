// Setup file of the mutation run only (tests/mutation/vitest.config.ts): skips the few tests
// that take over a minute under Stryker's instrumentation and would be re-run for every mutant
// they cover. Each has a smaller twin that still runs (named beside it); `npm test` runs them all.
import { beforeEach } from 'vitest'

const SKIPPED_IN_MUTATION_RUNS: readonly RegExp[] = [
  // tests/analysis/model-checks.test.ts: the 100,000-element case of the same test still runs.
  /uniform fixed–free bar, 1,000,000 elements/,
]

beforeEach((context) => {
  if (SKIPPED_IN_MUTATION_RUNS.some((pattern) => pattern.test(context.task.name))) context.skip()
})
