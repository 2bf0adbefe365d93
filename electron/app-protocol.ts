/**
 * The handler behind `rodwave-app://bundle/…`: serves files of the built renderer
 * (dist/renderer) with the Content-Security-Policy header, and nothing outside that folder.
 */
import { extname, isAbsolute, relative, resolve, sep } from 'node:path'
import { APP_HOST, APP_SCHEME, CONTENT_SECURITY_POLICY } from './app-origin'

const CONTENT_TYPES: Readonly<Record<string, string>> = {
  '.html': 'text/html; charset=utf-8',
  '.js': 'text/javascript; charset=utf-8',
  '.mjs': 'text/javascript; charset=utf-8',
  '.css': 'text/css; charset=utf-8',
  '.json': 'application/json; charset=utf-8',
  '.map': 'application/json; charset=utf-8',
  '.svg': 'image/svg+xml',
  '.png': 'image/png',
  '.jpg': 'image/jpeg',
  '.jpeg': 'image/jpeg',
  '.gif': 'image/gif',
  '.webp': 'image/webp',
  '.ico': 'image/x-icon',
  '.woff': 'font/woff',
  '.woff2': 'font/woff2',
  '.ttf': 'font/ttf',
  '.wasm': 'application/wasm',
  '.txt': 'text/plain; charset=utf-8',
}

export interface AppProtocolOptions {
  /** Absolute path of the built renderer (the folder holding index.html). */
  readonly rootDir: string
  /** Reads a whole file; rejects with an errno-style error (`code`) when it cannot. */
  readonly readFile: (path: string) => Promise<Uint8Array>
}

/** What the handler needs of a request (Electron passes a fetch-style Request). */
export interface AppProtocolRequest {
  readonly url: string
  readonly method?: string
}

export type AppProtocolHandler = (request: AppProtocolRequest) => Promise<Response>

/** Headers sent with every response, errors included. */
export function securityHeaders(contentType: string): Record<string, string> {
  return {
    'Content-Type': contentType,
    'Content-Security-Policy': CONTENT_SECURITY_POLICY,
    'X-Content-Type-Options': 'nosniff',
    'Cache-Control': 'no-cache',
  }
}

function plain(status: number, message: string): Response {
  return new Response(message, { status, headers: securityHeaders('text/plain; charset=utf-8') })
}

/**
 * Maps a request URL to a file inside rootDir, or null when the URL is not the app's
 * or would leave the folder (`..`, encoded separators, absolute or NUL-carrying paths).
 */
export function resolveBundlePath(rootDir: string, rawUrl: string): string | null {
  let url: URL
  try {
    url = new URL(rawUrl)
  } catch {
    return null
  }
  if (url.protocol !== `${APP_SCHEME}:` || url.host !== APP_HOST) return null
  // Encoded separators never occur in a built bundle's URLs; they only serve to smuggle a path.
  if (/%2f|%5c/i.test(url.pathname)) return null
  let pathname: string
  try {
    pathname = decodeURIComponent(url.pathname)
  } catch {
    return null
  }
  if (pathname.includes('\0')) return null
  // Refuse any dot-dot segment outright, with either separator.
  if (pathname.split(/[/\\]+/).some((segment) => segment === '..')) return null
  const relativePath = pathname.replace(/^[/\\]+/, '') || 'index.html'
  if (isAbsolute(relativePath) || /^[a-zA-Z]:/.test(relativePath)) return null
  const root = resolve(rootDir)
  const target = resolve(root, relativePath)
  const fromRoot = relative(root, target)
  if (fromRoot === '' || fromRoot.startsWith('..') || isAbsolute(fromRoot)) return null
  if (!target.startsWith(root + sep)) return null
  return target
}

export function createAppProtocolHandler(options: AppProtocolOptions): AppProtocolHandler {
  return async (request) => {
    const method = (request.method ?? 'GET').toUpperCase()
    if (method !== 'GET' && method !== 'HEAD') return plain(405, 'Method not allowed')
    const filePath = resolveBundlePath(options.rootDir, request.url)
    if (filePath === null) return plain(403, 'Forbidden')
    let body: Uint8Array
    try {
      body = await options.readFile(filePath)
    } catch (error) {
      const code = (error as { code?: unknown }).code
      return code === 'ENOENT' || code === 'ENOTDIR' || code === 'EISDIR' ? plain(404, 'Not found') : plain(500, 'Could not read the file')
    }
    const contentType = CONTENT_TYPES[extname(filePath).toLowerCase()] ?? 'application/octet-stream'
    return new Response(method === 'HEAD' ? null : (body as Uint8Array<ArrayBuffer>), { status: 200, headers: securityHeaders(contentType) })
  }
}
