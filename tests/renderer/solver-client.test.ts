// @vitest-environment happy-dom
/**
 * The window's solver client over Web Workers, with a worker double that answers after a
 * set delay: a newer project replaces a solve that has run long, queued solves collapse to
 * the newest, a convergence study reports progress and Cancel stops its worker at once.
 */
import { afterEach, describe, expect, it } from 'vitest'
import { newProject } from '../../core/model/project-file'
import type { Project } from '../../core/model/project'
import type { SolverRequest, SolverResponse } from '../../renderer/solver/solver-protocol'
import { createWorkerSolverClient, SolverCancelled, SolverSuperseded, type SolverClient } from '../../renderer/solver/solver-client'

/** Answers each request after `delayMs` with the request's project title, progress first for studies. */
class DelayedWorker extends EventTarget {
  static created: DelayedWorker[] = []
  terminated = false
  readonly received: SolverRequest[] = []
  private timers: ReturnType<typeof setTimeout>[] = []

  constructor(private readonly delayMs: number) {
    super()
    DelayedWorker.created.push(this)
  }

  postMessage(request: SolverRequest): void {
    this.received.push(request)
    const reply = (message: SolverResponse) => this.dispatchEvent(new MessageEvent('message', { data: message }))
    if (request.kind === 'converge') {
      this.timers.push(setTimeout(() => reply({ id: request.id, type: 'progress', fraction: 0.5 }), this.delayMs / 2))
    }
    this.timers.push(
      setTimeout(() => {
        const title = 'project' in request ? request.project.title : ''
        reply({ id: request.id, type: 'done', result: { title } as never })
      }, this.delayMs),
    )
  }

  terminate(): void {
    this.terminated = true
    for (const t of this.timers) clearTimeout(t)
  }
}

const titled = (title: string): Project => ({ ...newProject(), title })
const wait = (ms: number) => new Promise((resolve) => setTimeout(resolve, ms))

describe('worker solver client', () => {
  let client: SolverClient | null = null
  afterEach(() => {
    client?.dispose()
    DelayedWorker.created = []
  })

  it('stops a solve that has run long when a newer project arrives', async () => {
    client = createWorkerSolverClient(() => new DelayedWorker(600) as unknown as Worker)
    const first = client.solve(titled('first'))
    await wait(300)
    const second = client.solve(titled('second'))
    await expect(first).rejects.toBeInstanceOf(SolverSuperseded)
    expect(DelayedWorker.created[0].terminated).toBe(true)
    expect(await second).toEqual({ title: 'second' })
  })

  it('lets a short solve finish and then solves only the newest of the waiting projects', async () => {
    client = createWorkerSolverClient(() => new DelayedWorker(120) as unknown as Worker)
    const first = client.solve(titled('first'))
    const second = client.solve(titled('second'))
    const third = client.solve(titled('third'))
    await expect(second).rejects.toBeInstanceOf(SolverSuperseded)
    expect(await first).toEqual({ title: 'first' })
    expect(await third).toEqual({ title: 'third' })
    const solver = DelayedWorker.created[0]
    expect(solver.terminated).toBe(false)
    expect(solver.received.map((r) => ('project' in r ? r.project.title : ''))).toEqual(['first', 'third'])
  })

  it('reports a study’s progress, and Cancel stops its worker at once', async () => {
    client = createWorkerSolverClient(() => new DelayedWorker(400) as unknown as Worker)
    const progress: number[] = []
    const job = client.converge(titled('study'), (f) => progress.push(f))
    await wait(250)
    expect(progress).toEqual([0.5])
    job.cancel()
    await expect(job.result).rejects.toBeInstanceOf(SolverCancelled)
    expect(DelayedWorker.created.at(-1)!.terminated).toBe(true)
  })

  it('never sends a reactive proxy: requests are plain copies', async () => {
    client = createWorkerSolverClient(() => new DelayedWorker(10) as unknown as Worker)
    const project = titled('plain')
    await client.solve(project)
    const sent = DelayedWorker.created[0].received[0]
    expect(sent.kind === 'solve' && sent.project).toEqual(project)
    expect(sent.kind === 'solve' && sent.project).not.toBe(project)
  })
})
