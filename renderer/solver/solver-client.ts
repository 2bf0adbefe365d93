/**
 * The window's handle on the solver. With Web Workers (the app, the browser build) every
 * job runs off the interface thread: solves on one worker, where only the newest project
 * matters (older queued solves are dropped, a long one is stopped); each convergence study,
 * tuner search and share of a tolerance scatter on a worker of its own, so Cancel can stop it
 * at once; reports, mass comparisons, sensitivities and forced responses on a third. Without
 * workers (unit tests under happy-dom) the same tasks run in the page.
 */
import type { ConvergenceStudy, Project, TuneRequest, TuneResult } from '../../core/index'
import { tuneParameter } from '../../core/analysis/tuner'
import type { SolverRequest, SolverResponse, SolverResults } from './solver-protocol'
import type { ProjectReadResult } from '../../core/model/project-schema'
import {
  compareMassesTask,
  convergenceTask,
  readProjectTask,
  reportTask,
  solveTask,
  type MassComparison,
  type ProjectSource,
  type ReportTaskInput,
  type SolveOutcome,
} from './solver-tasks'
import type { FamilyKey } from '../../core/model/families'
import {
  responseTask,
  scatterShareTask,
  sensitivityTask,
  type ResponseResult,
  type ResponseTaskRequest,
  type NominalMode,
  type ScatterShare,
  type SensitivityTable,
} from './design-tasks'
import { joinShares, scatterShares } from './scatter-shares'

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

export interface ScatterRequest {
  readonly seed: number
  readonly samples: number
  readonly modes: number
  /** How many workers share the samples (the in-page client runs the shares one after another). */
  readonly workers: number
}

/** A whole tolerance scatter: every sample's frequencies in sample order. */
export interface ScatterOutcome {
  /** Row-major samples × modes, Hz. */
  readonly frequencies: Float64Array
  readonly nominal: NominalMode[]
  readonly modes: number
  readonly samples: number
  readonly seed: number
  readonly workers: number
}

export interface SolverClient {
  /** The project's modes, or the refusal of a part the analysis cannot solve (a compression past the buckling load). */
  solve(project: Project): Promise<SolveOutcome>
  compareMasses(project: Project, family?: FamilyKey): Promise<MassComparison>
  converge(project: Project, onProgress: (fraction: number) => void, family?: FamilyKey): CancellableJob<ConvergenceStudy>
  report(input: ReportTaskInput): Promise<string>
  sensitivities(project: Project): Promise<SensitivityTable>
  tune(project: Project, request: TuneRequest): CancellableJob<TuneResult>
  scatter(project: Project, request: ScatterRequest, onProgress: (fraction: number) => void): CancellableJob<ScatterOutcome>
  response(project: Project, request: ResponseTaskRequest): Promise<ResponseResult>
  /** Decodes, parses and validates a project file off the interface thread. */
  readProject(source: ProjectSource): Promise<ProjectReadResult>
  dispose(): void
}

function scatterOutcome(parts: readonly ScatterShare[], request: ScatterRequest): ScatterOutcome {
  return {
    frequencies: joinShares(parts.map((p) => p.frequencies)),
    nominal: parts[0]?.nominal ?? [],
    modes: parts[0]?.modes ?? request.modes,
    samples: request.samples,
    seed: request.seed,
    workers: parts.length,
  }
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

  /** `transfer`: the payload is already plain data; these buffers move to the worker instead of being copied. */
  run<K extends SolverRequest['kind']>(payload: Payload<K>, onProgress?: (fraction: number) => void, transfer?: Transferable[]): Promise<SolverResults[K]> {
    const worker = this.ensure()
    const id = this.nextId++
    return new Promise<SolverResults[K]>((resolve, reject) => {
      this.pending.set(id, { resolve: resolve as (r: unknown) => void, reject, onProgress })
      // Projects come from the editor's store: send a plain copy, never a reactive proxy.
      if (transfer) worker.postMessage({ ...payload, id }, transfer)
      else worker.postMessage({ ...plainCopy(payload), id })
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
  // A job on a worker of its own: Cancel stops that worker at once; it is let go when the job ends.
  const dedicated = <K extends SolverRequest['kind']>(payload: Payload<K>, onProgress?: (fraction: number) => void): CancellableJob<SolverResults[K]> => {
    const channel = new WorkerChannel(createWorker)
    studies.add(channel)
    const result = channel.run<K>(payload, onProgress)
    const finish = () => {
      studies.delete(channel)
      channel.stop(new SolverCancelled())
    }
    result.then(finish, finish)
    return { result, cancel: () => channel.stop(new SolverCancelled()) }
  }
  let running: { started: number } | null = null
  let queued: { project: Project; resolve(m: SolveOutcome): void; reject(e: Error): void } | null = null

  const start = (project: Project): Promise<SolveOutcome> => {
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
      return new Promise<SolveOutcome>((resolve, reject) => {
        queued = { project, resolve, reject }
      })
    },
    compareMasses(project, family) {
      return side.run<'compare-masses'>({ kind: 'compare-masses', project, ...(family ? { family } : {}) })
    },
    converge(project, onProgress, family) {
      return dedicated<'converge'>({ kind: 'converge', project, ...(family ? { family } : {}) }, onProgress)
    },
    report(input) {
      return side.run<'report'>({ kind: 'report', input })
    },
    sensitivities(project) {
      return side.run<'sensitivities'>({ kind: 'sensitivities', project })
    },
    tune(project, request) {
      return dedicated<'tune'>({ kind: 'tune', project, request })
    },
    scatter(project, request, onProgress) {
      const shares = scatterShares(request.samples, request.workers)
      const done = shares.map(() => 0)
      const jobs = shares.map((share, i) =>
        dedicated<'scatter-share'>({ kind: 'scatter-share', project, run: { seed: request.seed, start: share.start, count: share.count, modes: request.modes } }, (fraction) => {
          done[i] = fraction * share.count
          onProgress(done.reduce((a, b) => a + b, 0) / request.samples)
        }),
      )
      const cancel = () => jobs.forEach((job) => job.cancel())
      const result = Promise.all(jobs.map((job) => job.result)).then((parts) => scatterOutcome(parts, request))
      // One share failing stops the others: the scatter is incomplete without it.
      result.catch(cancel)
      return { result, cancel }
    },
    response(project, request) {
      return side.run<'response'>({ kind: 'response', project, request })
    },
    readProject(source) {
      // Sent as it is (no copy through JSON on this thread); a file's bytes move to the worker.
      return side.run<'read-project'>({ kind: 'read-project', source }, undefined, 'bytes' in source ? [source.bytes.buffer as ArrayBuffer] : [])
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
  // Cancel before the job starts stops it; once started it runs to the end (the page has no thread to stop).
  const cancellableLater = <T>(work: () => T): CancellableJob<T> => {
    let cancelled = false
    const result = later(() => {
      if (cancelled) throw new SolverCancelled()
      return work()
    })
    return {
      result,
      cancel: () => {
        cancelled = true
      },
    }
  }
  return {
    solve: (project) => later(() => solveTask(plainCopy(project))),
    compareMasses: (project, family) => later(() => compareMassesTask(plainCopy(project), family)),
    converge: (project, onProgress, family) => cancellableLater(() => convergenceTask(plainCopy(project), onProgress, family)),
    report: (input) => later(() => reportTask(plainCopy(input))),
    sensitivities: (project) => later(() => sensitivityTask(plainCopy(project))),
    tune: (project, request) => cancellableLater(() => tuneParameter(plainCopy(project), request)),
    scatter(project, request, onProgress) {
      let cancelled = false
      const copy = plainCopy(project)
      // The same shares as the workers would get, solved one after another.
      const solveShares = async () => {
        const parts: ScatterShare[] = []
        let done = 0
        for (const share of scatterShares(request.samples, request.workers)) {
          await Promise.resolve()
          if (cancelled) throw new SolverCancelled()
          const shareRun = { seed: request.seed, start: share.start, count: share.count, modes: request.modes }
          parts.push(scatterShareTask(copy, shareRun, (fraction) => onProgress((done + fraction * share.count) / request.samples)))
          done += share.count
        }
        return scatterOutcome(parts, request)
      }
      return {
        result: solveShares(),
        cancel: () => {
          cancelled = true
        },
      }
    },
    response: (project, request) => later(() => responseTask(plainCopy(project), request)),
    readProject: (source) => later(() => readProjectTask(source)),
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
