/**
 * `npm run web`: Rodwave in the browser, with no download beyond npm's: serves the built
 * window (dist/renderer, built by the script just before) on a local port and prints its
 * address. The same app as the desktop one, with uploads and downloads for files.
 *   serve-web.ts [--port N] [--root DIR]
 * --port defaults to 4780 (a free port is taken when it is busy); --root serves another build.
 */
import { existsSync } from 'node:fs'
import { join } from 'node:path'
import { fileURLToPath } from 'node:url'
import { parseArgs } from 'node:util'
import { startStaticServer, type StaticServer } from './static-server'

const DEFAULT_PORT = 4780

const { values } = parseArgs({ options: { port: { type: 'string' }, root: { type: 'string' } } })
const root = values.root ?? fileURLToPath(new URL('../dist/renderer', import.meta.url))
const port = values.port === undefined ? DEFAULT_PORT : Number(values.port)

if (!Number.isInteger(port) || port < 0 || port > 65535) {
  process.stderr.write(`rodwave web: --port must be a port number (0 to 65535), not "${values.port}"\n`)
  process.exit(2)
}
if (!existsSync(join(root, 'index.html'))) {
  process.stderr.write(`rodwave web: ${root} holds no built window; build it with "npm run build:renderer" (npm run web does)\n`)
  process.exit(1)
}

let server: StaticServer
try {
  server = await startStaticServer(root, { port })
} catch (error) {
  if ((error as { code?: unknown }).code !== 'EADDRINUSE') throw error
  process.stdout.write(`Port ${port} is in use; taking a free one.\n`)
  server = await startStaticServer(root)
}

process.stdout.write(`Rodwave runs in your browser at ${server.url}\nOpen that address; press Ctrl+C here to stop.\n`)
// Nothing to flush: a signal simply ends the server (a browser's open connection would keep close() waiting).
for (const signal of ['SIGINT', 'SIGTERM'] as const) process.on(signal, () => process.exit(0))
