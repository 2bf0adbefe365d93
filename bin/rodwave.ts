#!/usr/bin/env node
/** Entry point of the command line: binds runCli to the real file system and streams. */
import { readFile, writeFile } from 'node:fs/promises'
import { runCli } from './cli'

runCli(process.argv.slice(2), {
  readFile: (path) => readFile(path, 'utf8'),
  writeFile: (path, data) => writeFile(path, data),
  stdout: (text) => process.stdout.write(text),
  stderr: (text) => process.stderr.write(text),
}).then(
  (code) => {
    process.exitCode = code
  },
  (error: unknown) => {
    // A fault of Rodwave itself, not of the input: say so plainly, without a stack trace.
    process.stderr.write(`rodwave: internal error: ${error instanceof Error ? error.message : String(error)}\n`)
    process.exitCode = 70
  },
)
