/**
 * One long job at a time with a Cancel (a convergence study, a tuner search, a tolerance scatter):
 * starting another stops the one running, and only the newest job's outcome lands. A cancelled
 * job leaves no failure behind; any other error is kept as a message for the screen.
 */
import { ref } from 'vue'
import { SolverCancelled, type CancellableJob } from '../solver/solver-client'

export function useCancellableJob<T>() {
  const running = ref(false)
  const failure = ref<string | null>(null)
  let job: CancellableJob<T> | null = null

  /** `start` gets a test for whether its job is still the newest (for progress reports); `land` gets the result if it is. */
  async function run(start: (isNewest: () => boolean) => CancellableJob<T>, land: (result: T) => void): Promise<void> {
    cancel()
    failure.value = null
    running.value = true
    const thisJob: CancellableJob<T> = start(() => job === thisJob)
    job = thisJob
    try {
      const result = await thisJob.result
      if (job === thisJob) land(result)
    } catch (error) {
      if (job === thisJob && !(error instanceof SolverCancelled)) failure.value = error instanceof Error ? error.message : String(error)
    } finally {
      if (job === thisJob) {
        job = null
        running.value = false
      }
    }
  }

  function cancel(): void {
    if (!job) return
    const stopping = job
    job = null
    running.value = false
    stopping.cancel()
  }

  return { running, failure, run, cancel }
}
