/**
 * Tolerance scatter on every core: a pool of worker threads, each solving a contiguous share
 * of the samples. Each sample's random stream depends only on the seed and its index
 * (tolerance-scatter.ts), so the result does not depend on the number of workers.
 */
import { Worker } from 'node:worker_threads'
import { availableParallelism } from 'node:os'
import type { Project } from '../core/model/project'

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
    const entry = new URL('./scatter-worker.ts', import.meta.url).href
    // The command line runs from TypeScript sources: the bootstrap registers the loader in each thread.
    const workers = Array.from({ length: Math.max(1, size) }, () => new Worker(new URL('./worker-bootstrap.mjs', import.meta.url), { workerData: { entry } }))
    return new ScatterPool(workers)
  }

  get size(): number {
    return this.workers.length
  }

  /** Frequencies of all samples, row-major samples × modes. */
  async run(project: Project, options: { seed: number; samples: number; modes: number }): Promise<Float64Array> {
    const shares = Math.min(this.workers.length, options.samples)
    const share = Math.ceil(options.samples / shares)
    const parts = await Promise.all(
      Array.from({ length: shares }, (_, w) => {
        const start = w * share
        const count = Math.max(0, Math.min(share, options.samples - start))
        return this.request(this.workers[w], { project, run: { seed: options.seed, start, count, modes: options.modes } })
      }),
    )
    const out = new Float64Array(options.samples * options.modes)
    let offset = 0
    for (const part of parts) {
      out.set(part, offset)
      offset += part.length
    }
    return out
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
