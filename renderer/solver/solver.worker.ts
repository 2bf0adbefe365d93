/** The solver worker: runs the window's heavy work off the interface thread. */
import type { SolverRequest, SolverResponse } from './solver-protocol'
import { compareMassesTask, convergenceTask, readProjectTask, reportTask, solveTask } from './solver-tasks'
import { tuneParameter } from '../../core/analysis/tuner'
import { responseTask, scatterShareTask, sensitivityTask } from './design-tasks'

// A dedicated worker's global scope; typed here because the renderer compiles against the DOM library.
const scope = self as unknown as {
  postMessage(message: SolverResponse, transfer?: Transferable[]): void
  addEventListener(type: 'message', listener: (event: MessageEvent<SolverRequest>) => void): void
}

scope.addEventListener('message', (event) => {
  const request = event.data
  const done = (result: Extract<SolverResponse, { type: 'done' }>['result'], transfer: Transferable[] = []) =>
    scope.postMessage({ id: request.id, type: 'done', result }, transfer)
  const progress = (fraction: number) => scope.postMessage({ id: request.id, type: 'progress', fraction })
  try {
    switch (request.kind) {
      case 'solve':
        done(solveTask(request.project))
        break
      case 'compare-masses':
        done(compareMassesTask(request.project, request.family))
        break
      case 'converge':
        done(convergenceTask(request.project, progress, request.family))
        break
      case 'report':
        done(reportTask(request.input))
        break
      case 'sensitivities':
        done(sensitivityTask(request.project))
        break
      case 'tune':
        done(tuneParameter(request.project, request.request))
        break
      case 'scatter-share': {
        const share = scatterShareTask(request.project, request.run, progress)
        // The samples' frequencies move to the window instead of being copied.
        done(share, [share.frequencies.buffer as ArrayBuffer])
        break
      }
      case 'response':
        done(responseTask(request.project, request.request))
        break
      case 'read-project':
        done(readProjectTask(request.source))
        break
    }
  } catch (error) {
    scope.postMessage({ id: request.id, type: 'failed', message: error instanceof Error ? error.message : String(error) })
  }
})
