// Starts a TypeScript worker: registers tsx's loader in this thread, then imports the entry
// (the command line runs from TypeScript sources, and worker threads do not inherit loaders).
import { register } from 'tsx/esm/api'
import { workerData } from 'node:worker_threads'

register()
await import(workerData.entry)
