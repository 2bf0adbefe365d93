/**
 * Where the window's pages come from: a privileged custom scheme serving the built renderer,
 * so the app never runs from file:// and every IPC sender can be checked against one origin.
 */

export const APP_SCHEME = 'rodwave-app'
export const APP_HOST = 'bundle'
export const APP_ENTRY_URL = `${APP_SCHEME}://${APP_HOST}/index.html`

/** The policy the protocol handler sends with every response (the renderer may repeat it as a meta tag). */
export const CONTENT_SECURITY_POLICY = [
  "default-src 'self'",
  "script-src 'self'",
  "style-src 'self' 'unsafe-inline'",
  "img-src 'self' data: blob:",
  "worker-src 'self' blob:",
  "connect-src 'self'",
  "object-src 'none'",
  "base-uri 'none'",
  "form-action 'none'",
  "frame-ancestors 'none'",
].join('; ')

/**
 * Privileges of the app scheme, registered before the app is ready. `standard` and `secure`
 * give it a real origin and secure context (module scripts, workers); CSP is NOT bypassed.
 */
export const APP_SCHEME_PRIVILEGES = {
  standard: true,
  secure: true,
  supportFetchAPI: true,
  corsEnabled: true,
  codeCache: true,
} as const

/**
 * True when `raw` is a URL of the app's own bundle. Compares scheme and host rather than
 * `URL.origin`, which WHATWG parsing reports as "null" for non-special schemes.
 */
export function isAppUrl(raw: string): boolean {
  let url: URL
  try {
    url = new URL(raw)
  } catch {
    return false
  }
  return url.protocol === `${APP_SCHEME}:` && url.host === APP_HOST && url.username === '' && url.password === ''
}
