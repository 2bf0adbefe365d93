/**
 * The window's handle on the solver. With Web Workers (the app, the browser build) every
 * job runs off the interface thread: solves on one worker, where only the newest project
 * matters (older queued solves are dropped, a long one is stopped); each convergence study
 * on a worker of its own, so Cancel can stop it at once; reports and mass comparisons on a
 * third. Without workers (unit tests under happy-dom) the same tasks run in the page.
 */
import type { ConvergenceStudy, Project } from '../../core/index'
import type { SolverRequest, SolverResponse, SolverResults } from './solver-protocol'
import { compareMassesTask, convergenceTask, reportTask, solveTask, type MassComparison, type ReportTaskInput, type SolvedModel } from './solver-tasks'

/** A job that was replaced by a newer one before it finished (its result would be out of date). */
export class SolverSuperseded extends Error {
  constructor() {
    super('superseded by a newer solve')
    this.name = 'SolverSuperseded'
  }
}

export class SolverCancelled extends Error {
  constructor() {
    super('cancelled')
    this.name = 'SolverCancelled'
  }
}

export interface CancellableJob<T> {
  readonly result: Promise<T>
  cancel(): void
}

export interface SolverClient {
  solve(project: Project): Promise<SolvedModel>
  compareMasses(project: Project): Promise<MassComparison>
  converge(project: Project, onProgress: (fraction: number) => void): CancellableJob<ConvergenceStudy>
  report(input: ReportTaskInput): Promise<string>
  dispose(): void
}

/** A solve running longer than this is stopped when a newer project arrives; a shorter one is let finish. */
const SUPERSEDE_AFTER_MS = 250

type Payload<K extends SolverRequest['kind']> = Omit<Extract<SolverRequest, { kind: K }>, 'id'>

interface Pending {
  resolve(result: unknown): void
  reject(error: Error): void
  onProgress?: (fraction: number) => void
}

/** One worker and the jobs sent to it. */
class WorkerChannel {
  private worker: Worker | null = null
  private nextId = 1
  private readonly pending = new Map<number, Pending>()

  constructor(private readonly create: () => Worker) {}

  get busy(): boolean {
    return this.pending.size > 0
  }

  run<K extends SolverRequest['kind']>(payload: Payload<K>, onProgress?: (fraction: number) => void): Promise<SolverResults[K]> {
    const worker = this.ensure()
    const id = this.nextId++
    return new Promise<SolverResults[K]>((resolve, reject) => {
      this.pending.set(id, { resolve: resolve as (r: unknown) => void, reject, onProgress })
      // Projects come from the editor's store: send a plain copy, never a reactive proxy.
      worker.postMessage({ ...plainCopy(payload), id })
    })
  }

  /** Stops the worker; its jobs fail with `reason`. The next job starts a fresh worker. */
  stop(reason: Error): void {
    this.worker?.terminate()
    this.worker = null
    const jobs = [...this.pending.values()]
    this.pending.clear()
    for (const job of jobs) job.reject(reason)
  }

  private ensure(): Worker {
    if (this.worker) return this.worker
    const worker = this.create()
    worker.addEventListener('message', (event: MessageEvent<SolverResponse>) => {
      const message = event.data
      const job = this.pending.get(message.id)
      if (!job) return
      if (message.type === 'progress') {
        job.onProgress?.(message.fraction)
        return
      }
      this.pending.delete(message.id)
      if (message.type === 'done') job.resolve(message.result)
      else job.reject(new Error(message.message))
    })
    worker.addEventListener('error', (event) => {
      event.preventDefault()
      this.stop(new Error(`the solver stopped: ${event.message || 'unknown error'}`))
    })
    this.worker = worker
    return worker
  }
}

function plainCopy<T>(value: T): T {
  return JSON.parse(JSON.stringify(value)) as T
}

export function createWorkerSolverClient(createWorker: () => Worker): SolverClient {
  const solves = new WorkerChannel(createWorker)
  const side = new WorkerChannel(createWorker)
  const studies = new Set<WorkerChannel>()
  let running: { started: number } | null = null
  let queued: { project: Project; resolve(m: SolvedModel): void; reject(e: Error): void } | null = null

  const start = (project: Project): Promise<SolvedModel> => {
    const job = { started: performance.now() }
    running = job
    const result = solves.run<'solve'>({ kind: 'solve', project })
    const next = () => {
      if (running === job) running = null
      if (queued && !running) {
        const waiting = queued
        queued = null
        start(waiting.project).then(waiting.resolve, waiting.reject)
      }
    }
    result.then(next, next)
    return result
  }

  return {
    solve(project) {
      if (!running) return start(project)
      if (performance.now() - running.started > SUPERSEDE_AFTER_MS) {
        queued?.reject(new SolverSuperseded())
        queued = null
        running = null
        solves.stop(new SolverSuperseded())
        return start(project)
      }
      queued?.reject(new SolverSuperseded())
      return new Promise<SolvedModel>((resolve, reject) => {
        queued = { project, resolve, reject }
      })
    },
    compareMasses(project) {
      return side.run<'compare-masses'>({ kind: 'compare-masses', project })
    },
    converge(project, onProgress) {
      const channel = new WorkerChannel(createWorker)
      studies.add(channel)
      const result = channel.run<'converge'>({ kind: 'converge', project }, onProgress)
      const finish = () => {
        studies.delete(channel)
        channel.stop(new SolverCancelled())
      }
      result.then(finish, finish)
      return { result, cancel: () => channel.stop(new SolverCancelled()) }
    },
    report(input) {
      return side.run<'report'>({ kind: 'report', input })
    },
    dispose() {
      solves.stop(new SolverCancelled())
      side.stop(new SolverCancelled())
      for (const channel of studies) channel.stop(new SolverCancelled())
      studies.clear()
    },
  }
}

/** The same tasks in the page, for environments without Web Workers. */
export function createInlineSolverClient(): SolverClient {
  const later = <T>(work: () => T) => Promise.resolve().then(work)
  return {
    solve: (project) => later(() => solveTask(plainCopy(project))),
    compareMasses: (project) => later(() => compareMassesTask(plainCopy(project))),
    converge(project, onProgress) {
      let cancelled = false
      const result = later(() => {
        if (cancelled) throw new SolverCancelled()
        return convergenceTask(plainCopy(project), onProgress)
      })
      return {
        result,
        cancel: () => {
          cancelled = true
        },
      }
    },
    report: (input) => later(() => reportTask(plainCopy(input))),
    dispose() {},
  }
}

let client: SolverClient | null = null

export function useSolver(): SolverClient {
  client ??=
    typeof Worker === 'undefined'
      ? createInlineSolverClient()
      : createWorkerSolverClient(() => new Worker(new URL('./solver.worker.ts', import.meta.url), { type: 'module', name: 'rodwave-solver' }))
  return client
}

/** Replaces the solver (tests use the in-page one). */
export function setSolver(next: SolverClient | null): void {
  client?.dispose()
  client = next
}
