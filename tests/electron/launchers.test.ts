/**
 * The two ways to start Rodwave from the source tree: `npm start` (the desktop app, whose
 * Electron binary is fetched the first time) says plainly when that fetch fails and offers
 * the browser mode; `npm run web` serves the built window on a local port and prints its
 * address. Electron itself is never run.
 */
import { spawn } from 'node:child_process'
import { mkdir, mkdtemp, rm, writeFile } from 'node:fs/promises'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { fileURLToPath } from 'node:url'
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest'
import { downloadFailureMessage, startDesktop, type LaunchDeps } from '../../build/desktop-launch'

vi.mock('electron', () => ({}))

const repoRoot = fileURLToPath(new URL('../..', import.meta.url))

/** What Electron's installer printed on a machine without a network (its own output, as seen on this project's build machine). */
const FETCH_FAILED_OUTPUT = `TypeError: fetch failed
    at node:internal/deps/undici/undici:14976:13
    at process.processTicksAndRejections (node:internal/process/task_queues:95:5)
    at async FetchDownloader.download (file:///work/node_modules/@electron/get/dist/FetchDownloader.js:46:30)
    at async downloadArtifact (file:///work/node_modules/@electron/get/dist/index.js:154:12)
`

let folder: string
beforeAll(async () => {
  folder = await mkdtemp(join(tmpdir(), 'rodwave-launch-'))
})
afterAll(async () => {
  await rm(folder, { recursive: true, force: true })
})

function run(args: string[], env: Record<string, string> = {}): { child: ReturnType<typeof spawn>; done: Promise<{ code: number | null; stdout: string; stderr: string }> } {
  const child = spawn(process.execPath, ['--import', 'tsx', ...args], { cwd: repoRoot, env: { ...process.env, ...env }, stdio: ['ignore', 'pipe', 'pipe'] })
  let stdout = ''
  let stderr = ''
  child.stdout!.on('data', (chunk: Buffer) => (stdout += chunk.toString()))
  child.stderr!.on('data', (chunk: Buffer) => (stderr += chunk.toString()))
  const done = new Promise<{ code: number | null; stdout: string; stderr: string }>((resolve) => child.on('close', (code) => resolve({ code, stdout, stderr })))
  return { child, done }
}

describe('npm start when Electron cannot be fetched', () => {
  it('names the network and offers the browser mode, without a stack trace', () => {
    const message = downloadFailureMessage(FETCH_FAILED_OUTPUT)
    expect(message).toContain('the network could not be reached')
    expect(message).toContain('npm run web')
    expect(message).not.toMatch(/TypeError|^\s+at /m)
  })

  it('gives another failure’s first line in words, and still offers the browser mode', () => {
    const message = downloadFailureMessage('Error: Generated checksum for "electron-v45.3.4-linux-x64.zip" did not match expected checksum.\n    at validateArtifact (x.js:1:1)\n')
    expect(message).toContain('its download failed (Error: Generated checksum for "electron-v45.3.4-linux-x64.zip" did not match expected checksum.)')
    expect(message).not.toContain('the network')
    expect(message).toContain('npm run web')
  })

  it('fetches Electron only when it is missing, and runs it only when it is there', async () => {
    const deps = (installed: boolean, fetched: boolean) => {
      let present = installed
      return {
        findElectron: vi.fn(() => (present ? '/opt/electron/electron' : null)),
        downloadElectron: vi.fn(() => {
          present = fetched
          return { ok: fetched, output: fetched ? '' : FETCH_FAILED_OUTPUT }
        }),
        runElectron: vi.fn(async () => 0),
        print: vi.fn(),
      } satisfies LaunchDeps
    }
    const ready = deps(true, false)
    expect(await startDesktop(ready)).toBe(0)
    expect(ready.downloadElectron).not.toHaveBeenCalled()
    expect(ready.runElectron).toHaveBeenCalledWith('/opt/electron/electron', ['.'])

    const firstRun = deps(false, true)
    expect(await startDesktop(firstRun)).toBe(0)
    expect(firstRun.runElectron).toHaveBeenCalledOnce()

    const offline = deps(false, false)
    expect(await startDesktop(offline)).toBe(1)
    expect(offline.runElectron).not.toHaveBeenCalled()
    expect(offline.print).toHaveBeenLastCalledWith(downloadFailureMessage(FETCH_FAILED_OUTPUT))
  })

  it('end to end: the real launcher and Electron’s real installer, pointed at a server that refuses connections', async () => {
    // An empty folder for the binary, an empty download cache and a mirror on a closed local port:
    // the installer's fetch fails exactly as without a network, and nothing is downloaded or run.
    const { done } = run(['build/start-desktop.ts'], {
      ELECTRON_OVERRIDE_DIST_PATH: join(folder, 'no-electron'),
      electron_config_cache: join(folder, 'cache'),
      ELECTRON_MIRROR: 'http://127.0.0.1:9/',
    })
    const { code, stdout, stderr } = await done
    expect(code).toBe(1)
    expect(stdout).toBe('')
    expect(stderr).toContain('the network could not be reached')
    expect(stderr).toContain('npm run web')
    expect(stderr).not.toMatch(/TypeError|^\s+at /m)
  })
})

describe('npm run web', () => {
  it('serves the built window on a local port and prints its address', async () => {
    const root = join(folder, 'renderer')
    await rm(root, { recursive: true, force: true })
    await mkdir(root)
    await writeFile(join(root, 'index.html'), '<!doctype html><title>Rodwave</title>')
    await writeFile(join(root, 'third-party-notices.txt'), 'notices')
    const { child, done } = run(['build/serve-web.ts', '--root', root, '--port', '0'])
    try {
      const address = await new Promise<string>((resolve, reject) => {
        let seen = ''
        child.stdout!.on('data', (chunk: Buffer) => {
          seen += chunk.toString()
          const match = /Rodwave runs in your browser at (http:\/\/127\.0\.0\.1:\d+\/)\n/.exec(seen)
          if (match) resolve(match[1]!)
        })
        child.on('close', () => reject(new Error(`the server ended: ${seen}`)))
      })
      const page = await fetch(address)
      expect(page.status).toBe(200)
      expect(await page.text()).toBe('<!doctype html><title>Rodwave</title>')
      const notices = await fetch(new URL('third-party-notices.txt', address))
      expect(notices.headers.get('content-type')).toBe('text/plain; charset=utf-8')
    } finally {
      child.kill('SIGTERM')
      await done
    }
  })

  it('says how to build the window when there is none', async () => {
    const { code, stderr } = await run(['build/serve-web.ts', '--root', join(folder, 'nothing-here'), '--port', '0']).done
    expect(code).toBe(1)
    expect(stderr).toContain('holds no built window; build it with "npm run build:renderer"')
  })
})
