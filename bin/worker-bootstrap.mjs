// Starts a TypeScript worker from the sources (tests, the benchmark): registers tsx's loader in
// this thread, since worker threads do not inherit loaders, then serves the scatter jobs.
import { register } from 'tsx/esm/api'
import { workerData } from 'node:worker_threads'

register()
const worker = await import(workerData.entry)
worker.serveScatterJobs()
