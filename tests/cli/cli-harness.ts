/** Runs the command line in-process with an in-memory IO: files from a map, else from disk. */
import { readFile } from 'node:fs/promises'
import { runCli } from '../../bin/cli'

export interface Run {
  code: number
  stdout: string
  stderr: string
}

export async function run(args: string[], files: Record<string, string> = {}): Promise<Run> {
  let stdout = ''
  let stderr = ''
  const code = await runCli(args, {
    readFile: async (path) => (path in files ? files[path] : readFile(path, 'utf8')),
    writeFile: async () => {},
    stdout: (t) => (stdout += t),
    stderr: (t) => (stderr += t),
  })
  return { code, stdout, stderr }
}

/** A project file's text from a partial document, with format, version and a steel material filled in. */
export function projectText(doc: Record<string, unknown>): string {
  return JSON.stringify({
    format: 'rodwave',
    version: 1,
    materials: [{ id: 'steel', youngsModulus: 200e9, density: 7850 }],
    ends: { start: 'fixed', end: 'free' },
    ...doc,
  })
}
