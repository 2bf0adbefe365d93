/** The solver worker: runs the window's heavy work off the interface thread. */
import type { SolverRequest, SolverResponse } from './solver-protocol'
import { compareMassesTask, convergenceTask, reportTask, solveTask } from './solver-tasks'

// A dedicated worker's global scope; typed here because the renderer compiles against the DOM library.
const scope = self as unknown as {
  postMessage(message: SolverResponse): void
  addEventListener(type: 'message', listener: (event: MessageEvent<SolverRequest>) => void): void
}

scope.addEventListener('message', (event) => {
  const request = event.data
  try {
    switch (request.kind) {
      case 'solve':
        scope.postMessage({ id: request.id, type: 'done', result: solveTask(request.project) })
        break
      case 'compare-masses':
        scope.postMessage({ id: request.id, type: 'done', result: compareMassesTask(request.project) })
        break
      case 'converge':
        scope.postMessage({
          id: request.id,
          type: 'done',
          result: convergenceTask(request.project, (fraction) => scope.postMessage({ id: request.id, type: 'progress', fraction })),
        })
        break
      case 'report':
        scope.postMessage({ id: request.id, type: 'done', result: reportTask(request.input) })
        break
    }
  } catch (error) {
    scope.postMessage({ id: request.id, type: 'failed', message: error instanceof Error ? error.message : String(error) })
  }
})
