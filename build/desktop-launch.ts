/**
 * What `npm start` does after the build: runs the desktop app in Electron. Electron's npm
 * package fetches its binary (about 100 MB, from GitHub) the first time it is run; without
 * a network that fetch ends in a bare "TypeError: fetch failed" and a stack trace. Here the
 * fetch runs first with its output captured, and a failure is told in plain words, naming
 * the network and offering the browser mode, which needs no download.
 */
import { spawn, spawnSync } from 'node:child_process'
import { existsSync, readFileSync } from 'node:fs'
import { createRequire } from 'node:module'
import { dirname, join } from 'node:path'

export interface LaunchDeps {
  /** The Electron binary, when it is installed. */
  readonly findElectron: () => string | null
  /** Fetches and unpacks the Electron binary; its output is captured, never shown raw. */
  readonly downloadElectron: () => { readonly ok: boolean; readonly output: string }
  /** Runs Electron with the given arguments; resolves with its exit code. */
  readonly runElectron: (binary: string, args: readonly string[]) => Promise<number>
  readonly print: (text: string) => void
}

/** Errors of a download that never reached its server (Node's fetch and DNS, OS socket errors). */
const NETWORK_FAILURE = /fetch failed|ENOTFOUND|EAI_AGAIN|ECONNREFUSED|ECONNRESET|ETIMEDOUT|ENETUNREACH|EHOSTUNREACH|getaddrinfo|socket hang up|UND_ERR_CONNECT/i

/** The first line of an error's output that is not a stack frame, shortened. */
function firstMessageLine(output: string): string {
  const line = output
    .split(/\r?\n/)
    .map((text) => text.trim())
    .find((text) => text !== '' && !text.startsWith('at ') && !text.startsWith('Downloading'))
  if (line === undefined) return 'no reason given'
  return line.length > 200 ? `${line.slice(0, 199)}…` : line
}

/** What the user reads when Electron could not be fetched: the cause in words, and what to do. */
export function downloadFailureMessage(output: string): string {
  const cause = NETWORK_FAILURE.test(output)
    ? 'the network could not be reached (Electron is downloaded from github.com the first time)'
    : `its download failed (${firstMessageLine(output)})`
  return [
    `Rodwave cannot start the desktop app: Electron, the window it runs in, is not installed yet and ${cause}.`,
    '',
    'Connect to the internet and run "npm start" again, or use the same app in your browser, which needs no download:',
    '',
    '  npm run web',
    '',
  ].join('\n')
}

export async function startDesktop(deps: LaunchDeps, args: readonly string[] = ['.']): Promise<number> {
  let binary = deps.findElectron()
  if (binary === null) {
    deps.print('Downloading Electron, the window Rodwave runs in (once, about 100 MB)…\n')
    const download = deps.downloadElectron()
    binary = download.ok ? deps.findElectron() : null
    if (binary === null) {
      deps.print(downloadFailureMessage(download.output))
      return 1
    }
  }
  return deps.runElectron(binary, args)
}

/** Electron's executable inside its package, as the package itself finds it (node_modules/electron/index.js). */
function platformExecutable(): string {
  if (process.platform === 'darwin') return 'Electron.app/Contents/MacOS/Electron'
  return process.platform === 'win32' ? 'electron.exe' : 'electron'
}

/** The real dependencies: Electron's npm package in node_modules, this process's terminal. */
export function nodeLaunchDeps(): LaunchDeps {
  const electronDir = dirname(createRequire(import.meta.url).resolve('electron/package.json'))
  return {
    findElectron() {
      const pathFile = join(electronDir, 'path.txt')
      const executable = existsSync(pathFile) ? readFileSync(pathFile, 'utf8') : platformExecutable()
      const full = join(process.env.ELECTRON_OVERRIDE_DIST_PATH || join(electronDir, 'dist'), executable)
      return existsSync(full) ? full : null
    },
    downloadElectron() {
      const result = spawnSync(process.execPath, [join(electronDir, 'install.js')], { encoding: 'utf8' })
      return { ok: result.status === 0, output: `${result.stdout ?? ''}\n${result.stderr ?? ''}\n${result.error?.message ?? ''}` }
    },
    runElectron(binary, args) {
      return new Promise((done) => {
        const child = spawn(binary, [...args], { stdio: 'inherit', windowsHide: false })
        for (const signal of ['SIGINT', 'SIGTERM'] as const) process.on(signal, () => child.kill(signal))
        child.on('error', (error) => {
          process.stderr.write(`Rodwave could not run Electron (${binary}): ${error.message}\n`)
          done(1)
        })
        child.on('close', (code) => done(code ?? 1))
      })
    },
    print: (text) => process.stderr.write(text),
  }
}
