/**
 * Worker thread of the scatter pool: solves shares of tolerance-scatter samples on request.
 * From the sources (tests, the benchmark) worker-bootstrap.mjs starts this file; from the built
 * command line the pool starts the entry file itself, which calls serveScatterJobs here.
 */
import { isMainThread, parentPort, workerData } from 'node:worker_threads'
import { analyseProject, type ModalAnalysis } from '../core/analysis/modal-analysis'
import { scatterFrequencies, type ScatterRun } from '../core/analysis/tolerance-scatter'
import type { Project } from '../core/model/project'

/** workerData.role of a thread the scatter pool started. */
export const SCATTER_WORKER_ROLE = 'rodwave-scatter-worker'

interface Job {
  readonly id: number
  readonly project: Project
  readonly run: ScatterRun
}

/** True in a worker thread that the scatter pool started. */
export function isScatterWorkerThread(): boolean {
  return !isMainThread && (workerData as { role?: unknown } | null)?.role === SCATTER_WORKER_ROLE
}

/** Answers the pool's jobs on this thread's port until the pool ends the thread. */
export function serveScatterJobs(): void {
  // The nominal solution is kept between jobs on the same project text: it starts every sample.
  let nominalKey = ''
  let nominal: ModalAnalysis | undefined
  parentPort?.on('message', (job: Job) => {
    try {
      const key = JSON.stringify([job.project, job.run.modes])
      if (key !== nominalKey) {
        nominal = analyseProject(job.project, job.run.modes ? { modes: job.run.modes } : {}, { withReference: false })
        nominalKey = key
      }
      const frequencies = scatterFrequencies(job.project, job.run, nominal)
      parentPort?.postMessage({ id: job.id, frequencies }, [frequencies.buffer as ArrayBuffer])
    } catch (error) {
      parentPort?.postMessage({ id: job.id, error: error instanceof Error ? error.message : String(error) })
    }
  })
}
