/**
 * A small static file server for the built renderer (module scripts and workers do not load
 * from file://): `npm run web` and the browser tests. Local only (127.0.0.1).
 */
import { createServer, type Server } from 'node:http'
import { readFile, stat } from 'node:fs/promises'
import { extname, join, normalize, resolve, sep } from 'node:path'

const TYPES: Record<string, string> = {
  '.html': 'text/html; charset=utf-8',
  '.js': 'text/javascript; charset=utf-8',
  '.mjs': 'text/javascript; charset=utf-8',
  '.css': 'text/css; charset=utf-8',
  '.json': 'application/json; charset=utf-8',
  '.svg': 'image/svg+xml',
  '.png': 'image/png',
  '.map': 'application/json; charset=utf-8',
  '.txt': 'text/plain; charset=utf-8',
  '.woff2': 'font/woff2',
}

export interface StaticServer {
  readonly url: string
  close(): Promise<void>
}

export interface StaticServerOptions {
  /** The port to listen on; 0 (the default) takes a free one. */
  readonly port?: number
}

/** Serves `root` on 127.0.0.1 (on a free port unless one is given); paths outside it are refused. */
export async function startStaticServer(root: string, options: StaticServerOptions = {}): Promise<StaticServer> {
  const base = resolve(root)
  const server: Server = createServer(async (request, response) => {
    try {
      const pathname = decodeURIComponent(new URL(request.url ?? '/', 'http://localhost').pathname)
      const file = normalize(join(base, pathname === '/' ? 'index.html' : pathname))
      if (file !== base && !file.startsWith(base + sep)) {
        response.writeHead(403).end()
        return
      }
      const info = await stat(file)
      if (!info.isFile()) throw new Error('not a file')
      const body = await readFile(file)
      response.writeHead(200, { 'Content-Type': TYPES[extname(file)] ?? 'application/octet-stream', 'Cache-Control': 'no-store' })
      response.end(body)
    } catch {
      response.writeHead(404, { 'Content-Type': 'text/plain' }).end('not found')
    }
  })
  await new Promise<void>((done, fail) => {
    server.once('error', fail)
    server.listen(options.port ?? 0, '127.0.0.1', () => {
      server.off('error', fail)
      done()
    })
  })
  const address = server.address()
  if (address === null || typeof address === 'string') throw new Error('the server has no port')
  return {
    url: `http://127.0.0.1:${address.port}/`,
    close: () => new Promise<void>((done, fail) => server.close((error) => (error ? fail(error) : done()))),
  }
}
