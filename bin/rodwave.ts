#!/usr/bin/env node
/**
 * Entry point of the command line: binds runCli to the real file system and streams. Built into
 * dist/cli/rodwave.mjs (bin/vite.config.ts); the scatter pool's worker threads start this same
 * file, and in them it serves scatter jobs instead.
 */
import { readFile, stat, writeFile } from 'node:fs/promises'
import { MAX_FILE_CHARACTERS } from '../core/model/project-schema'
import { decodeProjectBytes } from '../core/model/project-bytes'
import { runCli } from './cli'
import { isScatterWorkerThread, serveScatterJobs } from './scatter-worker'

// Node's start and loading Rodwave: what the process spent before this line.
const startupMs = performance.now()

/** Reads a project file, refusing one too large to be a project before loading it into memory. */
async function readProjectFile(path: string): Promise<string> {
  const info = await stat(path)
  if (info.isDirectory()) throw Object.assign(new Error('it is a folder'), { code: 'EISDIR' })
  if (info.size > 4 * MAX_FILE_CHARACTERS) {
    throw Object.assign(new Error(`it is ${(info.size / 1e6).toFixed(0)} MB; a project file may have at most ${MAX_FILE_CHARACTERS / 1e6} million characters`), { code: 'EFBIG' })
  }
  // The one rule for a project file's bytes (core/model/project-bytes): UTF-8, byte-order mark allowed.
  const decoded = decodeProjectBytes(await readFile(path))
  if (!decoded.ok) throw new Error(`it ${decoded.message}`)
  return decoded.text
}

if (isScatterWorkerThread()) serveScatterJobs()
else main()

function main(): void {
  runCli(
    process.argv.slice(2),
    {
      readFile: readProjectFile,
      writeFile: (path, data) => writeFile(path, data),
      stdout: (text) => process.stdout.write(text),
      stderr: (text) => process.stderr.write(text),
    },
    { startupMs },
  ).then(
    (code) => {
      process.exitCode = code
    },
    (error: unknown) => {
      // A fault of Rodwave itself, not of the input: say so plainly, without a stack trace.
      process.stderr.write(`rodwave: internal error: ${error instanceof Error ? error.message : String(error)}\n`)
      process.exitCode = 70
    },
  )
}
