/** Serves the built renderer for the browser tests and tells them where. */
import { existsSync } from 'node:fs'
import { join } from 'node:path'
import type { TestProject } from 'vitest/node'
import { startStaticServer } from '../../build/static-server'

declare module 'vitest' {
  export interface ProvidedContext {
    baseUrl: string
  }
}

export default async function setup(project: TestProject): Promise<() => Promise<void>> {
  const root = join(project.config.root, 'dist', 'renderer')
  if (!existsSync(join(root, 'index.html'))) {
    throw new Error(`${root}/index.html is missing: build the window first (npm run build:renderer, or npm run test:e2e which does both)`)
  }
  const server = await startStaticServer(root)
  project.provide('baseUrl', server.url)
  return () => server.close()
}
