#!/usr/bin/env node
// The `rodwave` command (package.json "bin", and `npm run rodwave`): runs the built command line,
// dist/cli/rodwave.mjs, building it first when it is missing or older than its sources (bin/,
// core/, package.json, package-lock.json). Checking takes a few milliseconds; building, a few
// seconds, once after each change.
import module from 'node:module'
import { existsSync, readdirSync, renameSync, rmSync, statSync } from 'node:fs'
import { dirname, join } from 'node:path'
import process from 'node:process'
import { fileURLToPath, pathToFileURL } from 'node:url'

const root = dirname(dirname(fileURLToPath(import.meta.url)))
const outDir = join(root, 'dist', 'cli')
const bundle = join(outDir, 'rodwave.mjs')
const SOURCES = ['bin', 'core', 'package.json', 'package-lock.json']

/** The newest modification time among the sources the bundle is built from, ms. */
function newestSource() {
  let newest = 0
  for (const source of SOURCES) {
    const path = join(root, source)
    if (!existsSync(path)) continue
    const info = statSync(path)
    if (!info.isDirectory()) {
      newest = Math.max(newest, info.mtimeMs)
      continue
    }
    for (const entry of readdirSync(path, { recursive: true, withFileTypes: true })) {
      if (entry.isFile()) newest = Math.max(newest, statSync(join(entry.parentPath ?? entry.path, entry.name)).mtimeMs)
    }
  }
  return newest
}

function isCurrent() {
  return existsSync(bundle) && statSync(bundle).mtimeMs >= newestSource()
}

/** Builds into a folder of its own, then swaps it in, so a run in parallel never sees half a build. */
async function build() {
  let vite
  try {
    vite = await import('vite')
  } catch {
    process.stderr.write(`rodwave: ${bundle} is missing or out of date and cannot be built here (Vite is not installed): run npm install, then npm run build:cli\n`)
    process.exit(70)
  }
  process.stderr.write('rodwave: building the command line into dist/cli/ (once after each change)…\n')
  const staging = join(root, 'dist', `cli.building-${process.pid}`)
  await vite.build({ configFile: join(root, 'bin', 'vite.config.ts'), logLevel: 'warn', build: { outDir: staging, emptyOutDir: true } })
  const previous = join(root, 'dist', `cli.previous-${process.pid}`)
  if (existsSync(outDir)) renameSync(outDir, previous)
  renameSync(staging, outDir)
  rmSync(previous, { recursive: true, force: true })
}

if (!isCurrent()) await build()
// Node 22.1 and later keep the compiled bundle between runs (a no-op on Node 20).
module.enableCompileCache?.()
await import(pathToFileURL(bundle).href)
