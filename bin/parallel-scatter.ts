/**
 * Tolerance scatter on every core: a pool of worker threads sharing the samples out in chunks.
 * Each sample's random stream depends only on the seed and its index (tolerance-scatter.ts),
 * so the result does not depend on the number of workers or on who solved which chunk.
 */
import { Worker } from 'node:worker_threads'
import { availableParallelism } from 'node:os'
import type { Project } from '../core/model/project'
import { SCATTER_WORKER_ROLE } from './scatter-worker'

interface Reply {
  readonly id: number
  readonly frequencies?: Float64Array
  readonly error?: string
}

export class ScatterPool {
  private nextId = 0
  private readonly pending = new Map<number, { resolve: (f: Float64Array) => void; reject: (e: Error) => void }>()

  private constructor(private readonly workers: Worker[]) {
    for (const worker of workers) {
      worker.on('message', (reply: Reply) => {
        const waiting = this.pending.get(reply.id)
        if (!waiting) return
        this.pending.delete(reply.id)
        if (reply.error !== undefined || !reply.frequencies) waiting.reject(new RangeError(reply.error ?? 'no result'))
        else waiting.resolve(reply.frequencies)
      })
      worker.on('error', (error) => {
        for (const waiting of this.pending.values()) waiting.reject(error)
        this.pending.clear()
      })
    }
  }

  /** Starts `size` worker threads (default: one per core). */
  static start(size = availableParallelism()): ScatterPool {
    const count = Math.max(1, size)
    const here = import.meta.url
    // Built (dist/cli/rodwave.mjs): each thread runs the command line's own file, which serves the
    // jobs when it sees its role. From the TypeScript sources (tests, the benchmark) a bootstrap
    // registers the TypeScript loader in the thread first.
    const fromSources = here.endsWith('.ts')
    const workers = Array.from({ length: count }, () =>
      fromSources
        ? new Worker(new URL('./worker-bootstrap.mjs', here), { workerData: { entry: new URL('./scatter-worker.ts', here).href, role: SCATTER_WORKER_ROLE } })
        : new Worker(new URL(here), { workerData: { role: SCATTER_WORKER_ROLE } }),
    )
    return new ScatterPool(workers)
  }

  get size(): number {
    return this.workers.length
  }

  /**
   * Frequencies of all samples, row-major: one row per sample, one column per mode of every
   * analysed family (modes per family × families, as scatterFrequencies lays them out). The
   * samples go out in chunks, each worker taking the next when it finishes one, so a worker
   * slowed by anything else on the machine does not hold the others up at the end.
   */
  async run(project: Project, options: { seed: number; samples: number; modes: number }): Promise<Float64Array> {
    const { samples, modes } = options
    // The row width is known from the first answer (it counts every family's modes).
    let out: Float64Array | null = null
    let width = 0
    const chunk = Math.max(25, Math.ceil(samples / (this.workers.length * 8)))
    let next = 0
    const drain = async (worker: Worker): Promise<void> => {
      while (next < samples) {
        const start = next
        const count = Math.min(chunk, samples - start)
        next += count
        const part = await this.request(worker, { project, run: { seed: options.seed, start, count, modes } })
        if (!out) {
          width = part.length / count
          out = new Float64Array(samples * width)
        }
        out.set(part, start * width)
      }
    }
    await Promise.all(this.workers.map(drain))
    return out ?? new Float64Array(0)
  }

  private request(worker: Worker, job: { project: Project; run: { seed: number; start: number; count: number; modes: number } }): Promise<Float64Array> {
    const id = this.nextId++
    return new Promise((resolve, reject) => {
      this.pending.set(id, { resolve, reject })
      worker.postMessage({ id, ...job })
    })
  }

  async close(): Promise<void> {
    await Promise.all(this.workers.map((w) => w.terminate()))
  }
}
