/**
 * Bending rows of `npm run bench` (also runnable alone: `npx tsx bench/bending-bench.ts [--quick]
 * [--million]`). Prints measured figures; asserts nothing about time.
 *
 * Model: a uniform clamped–free steel beam, Euler–Bernoulli theory, consistent mass, L = 1 m,
 * solid d = 20 mm (E = 200 GPa, ρ = 7850 kg/m³). Its closed form: f_n = (β_nL)²/(2πL²)·√(EI/(ρA)),
 * β_nL the roots of cos x cosh x = −1 (R. D. Blevins, Formulas for Natural Frequency and Mode
 * Shape, table 8-1), found here by bisection.
 *
 * Rodwave is timed in the form it ships in: the engine bundled and minified by Vite as the
 * command line is (bin/vite.config.ts), built into a temporary folder when the bench starts.
 * (Run from sources through tsx, the same code is slower: tsx keeps every function's name.)
 *
 * a. Warm solve of a 2,000-node model, 10 modes: assembly + solve, best and median of runs after
 *    a warm-up, as `solve --json` times them.
 * b. Rodwave against SciPy's eigsh (shift-invert about 0, which='LM', k = 10) on the same pencil:
 *    core's assembled K and M are written to a temporary file and bench/peer_scipy_bending.py
 *    loads and solves them. Both are timed on the solve alone (Rodwave: assembly + solve; SciPy:
 *    eigsh, its sparse matrices built before the clock starts); both frequencies are compared
 *    with the closed form. 10⁶ elements only with --million (or from solver-bench without --quick).
 *    SciPy gets RODWAVE_BENCH_SCIPY_TIMEOUT_S seconds per call (default 900); a call that has
 *    not returned by then is stopped and reported as such, with the ratio as a lower bound.
 */
import { execFileSync } from 'node:child_process'
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { dirname, join } from 'node:path'
import { fileURLToPath } from 'node:url'
import { pathToFileURL } from 'node:url'
import { build, mergeConfig, type UserConfig } from 'vite'
import type * as Engine from './bending-engine'
import type { Project } from '../core/model/project'
import type { SymmetricBandMatrix } from '../core/linalg/symmetric-band-matrix'

const here = dirname(fileURLToPath(import.meta.url))

/** The engine as it ships: bench/bending-engine.ts bundled and minified with the command line's own Vite settings. */
async function loadProductionEngine(): Promise<{ engine: typeof Engine; folder: string }> {
  const folder = mkdtempSync(join(tmpdir(), 'rodwave-bench-engine-'))
  const { default: commandLine } = await import('../bin/vite.config')
  await build(
    mergeConfig(commandLine as UserConfig, {
      configFile: false,
      build: { ssr: join(here, 'bending-engine.ts'), outDir: folder, rollupOptions: { output: { entryFileNames: 'engine.mjs' } } },
    }),
  )
  writeFileSync(
    join(folder, 'time.mjs'),
    "import { timeDocument } from './engine.mjs'\nconst { document, warmups, runs, withReference } = JSON.parse(process.argv[2])\nprocess.stdout.write(JSON.stringify(timeDocument(document, warmups, runs, withReference)))\n",
  )
  const engine = (await import(pathToFileURL(join(folder, 'engine.mjs')).href)) as typeof Engine
  return { engine, folder }
}

let engine: typeof Engine
let engineFolder = ''
const SCIPY_TIMEOUT_S = Number(process.env.RODWAVE_BENCH_SCIPY_TIMEOUT_S ?? 900)

const E = 200e9
const RHO = 7850
const LENGTH = 1
const DIAMETER = 0.02
const AREA = (Math.PI / 4) * DIAMETER ** 2
const INERTIA = (Math.PI / 64) * DIAMETER ** 4
const MODES = 10

function beamDocument(elements: number): Record<string, unknown> {
  return {
    format: 'rodwave',
    version: 2,
    motions: ['bending'],
    materials: [{ id: 'steel', youngsModulus: E, density: RHO, poissonRatio: 0.3 }],
    segments: [{ length: LENGTH, material: 'steel', section: { shape: 'solid', diameter: DIAMETER } }],
    ends: { start: { axial: 'fixed', torsion: 'fixed', bending: 'clamped' }, end: { axial: 'free', torsion: 'free', bending: 'free' } },
    analysis: { elementsPerSegment: elements, modes: MODES, mass: 'consistent', bendingTheory: 'euler-bernoulli' },
  }
}

function beam(elements: number): Project {
  const read = engine.readProjectDocument(beamDocument(elements))
  if (!read.ok) throw new Error(`the bending benchmark model is invalid: ${read.issues.map((i) => `${i.path}: ${i.message}`).join('; ')}`)
  return read.project
}

/** β_nL of the clamped–free beam: the root of cos x + 1/cosh x in ((n − 1)π, nπ), by bisection to the last bit. */
function betaL(n: number): number {
  const g = (x: number) => Math.cos(x) + 1 / Math.cosh(x)
  let lo = (n - 1) * Math.PI + 1e-9
  let hi = n * Math.PI
  const sLo = Math.sign(g(lo))
  for (let i = 0; i < 200 && hi - lo > 4e-16 * hi; i++) {
    const mid = 0.5 * (lo + hi)
    if (Math.sign(g(mid)) === sLo) lo = mid
    else hi = mid
  }
  return 0.5 * (lo + hi)
}

const betaScale = Math.sqrt((E * INERTIA) / (RHO * AREA))
const closedHz = Array.from({ length: MODES }, (_, i) => (betaL(i + 1) ** 2 / (2 * Math.PI * LENGTH ** 2)) * betaScale)
const maxError = (frequencies: readonly number[]) => Math.max(...frequencies.map((f, i) => Math.abs(f - closedHz[i]) / closedHz[i]))

function median(values: number[]): number {
  const s = [...values].sort((a, b) => a - b)
  const m = s.length >> 1
  return s.length % 2 ? s[m] : 0.5 * (s[m - 1] + s[m])
}

/** The q-quantile, nearest rank. */
function percentile(values: number[], q: number): number {
  const s = [...values].sort((a, b) => a - b)
  return s[Math.min(s.length - 1, Math.max(0, Math.ceil(q * s.length) - 1))]
}

const fmt = (ms: number) => (ms >= 1000 ? `${(ms / 1000).toFixed(2)} s` : `${ms.toFixed(ms < 10 ? 2 : 1)} ms`)

interface Timed {
  readonly bestMs: number
  readonly medianMs: number
  /** 10th, 25th, 75th and 90th percentiles of the runs. */
  readonly percentilesMs: { readonly p10: number; readonly p25: number; readonly p75: number; readonly p90: number }
  readonly runs: number
  readonly frequenciesHz: number[]
  readonly sturmPassed: boolean
  /** The fixed reference loop timed between the runs (bending-engine.ts), when asked for. */
  readonly reference?: { readonly bestMs: number; readonly medianMs: number }
}

/**
 * Times the bundled engine in a fresh Node process (bench/bending-engine.ts, timeDocument): the
 * bench's own process holds Vite and the compiler, whose heap slowed the same code by a third.
 */
function timeBeam(elements: number, warmups: number, runs: number, withReference = false): Timed {
  const out = execFileSync(process.execPath, [join(engineFolder, 'time.mjs'), JSON.stringify({ document: beamDocument(elements), warmups, runs, withReference })], {
    encoding: 'utf8',
    maxBuffer: 16 * 1024 * 1024,
  })
  const timed = JSON.parse(out) as { times: number[]; referenceTimes: number[]; frequenciesHz: number[]; sturmPassed: boolean }
  const reference = timed.referenceTimes.length ? { bestMs: Math.min(...timed.referenceTimes), medianMs: median(timed.referenceTimes) } : undefined
  return {
    bestMs: Math.min(...timed.times),
    medianMs: median(timed.times),
    percentilesMs: { p10: percentile(timed.times, 0.1), p25: percentile(timed.times, 0.25), p75: percentile(timed.times, 0.75), p90: percentile(timed.times, 0.9) },
    runs,
    frequenciesHz: timed.frequenciesHz,
    sturmPassed: timed.sturmPassed,
    ...(reference ? { reference } : {}),
  }
}

/** python3 with SciPy, or the reason there is none. */
function findPython(): { python: string } | { missing: string } {
  for (const python of ['/usr/bin/python3', 'python3']) {
    try {
      execFileSync(python, ['-c', 'import scipy.sparse.linalg, scipy.optimize'], { stdio: 'ignore' })
      return { python }
    } catch {
      // try the next
    }
  }
  return { missing: 'python3 with SciPy not found' }
}

/** K then M: each its diagonal and then its off-diagonals d = 1..b, n entries each. */
function writePencil(path: string, stiffness: SymmetricBandMatrix, mass: SymmetricBandMatrix): void {
  const n = stiffness.order
  const b = stiffness.halfBandwidth
  const out = new Float64Array(2 * (b + 1) * n)
  ;[stiffness, mass].forEach((a, which) => {
    const base = which * (b + 1) * n
    for (let i = 0; i < n; i++) out[base + i] = engine.diagonalEntry(a, i)
    for (let d = 1; d <= b; d++) out.set(a.offDiagonals[d - 1], base + d * n)
  })
  writeFileSync(path, out)
}

interface PeerRun {
  readonly eigsh_s: number
  readonly build_s: number
  readonly frequencies_hz?: number[]
  readonly errors?: number[]
  readonly failure?: string
  readonly timedOut?: boolean
}

export async function runBendingBench(say: (line?: string) => void, options: { quick: boolean; million: boolean }): Promise<Record<string, unknown>> {
  const results: Record<string, unknown> = {}
  const loaded = await loadProductionEngine()
  engine = loaded.engine
  engineFolder = loaded.folder
  say(`\n7. Bending: clamped–free Euler–Bernoulli beam (L = 1 m, d = 20 mm, steel), consistent mass, ${MODES} modes`)
  say(`closed form f1…f${MODES}: ${closedHz.map((f) => f.toPrecision(6)).join(', ')} Hz (β₁L = ${betaL(1).toFixed(6)}, Blevins table 8-1: 1.875104)`)

  // a. The interactive size.
  const interactive = timeBeam(1999, 20, options.quick ? 20 : 100, true)
  say(
    `7a. 2,000 nodes (1,999 elements, ${2 * 1999} unknowns), ${MODES} modes, assembly + solve, warm: best ${fmt(interactive.bestMs)}, median ${fmt(interactive.medianMs)} of ${interactive.runs} runs (10/25/75/90th percentiles ${[interactive.percentilesMs.p10, interactive.percentilesMs.p25, interactive.percentilesMs.p75, interactive.percentilesMs.p90].map(fmt).join(' / ')}); largest error of f1…f${MODES} against the closed form ${maxError(interactive.frequenciesHz).toExponential(1)}; Sturm check ${interactive.sturmPassed ? 'passed' : 'FAILED'}`,
  )
  if (interactive.reference) {
    say(
      `    machine check: a fixed loop of 8 million multiply-adds, timed after each of those runs, took best ${fmt(interactive.reference.bestMs)}, median ${fmt(interactive.reference.medianMs)} (median/best ${(interactive.reference.medianMs / interactive.reference.bestMs).toFixed(2)}; the solve's ${(interactive.medianMs / interactive.bestMs).toFixed(2)}): on shared cores the spread is the machine's as much as the solver's`,
    )
  }
  // The cores are shared and slow down in phases lasting seconds to minutes: a few short batches,
  // each in its own process and each with the loop's median beside it, show the solve at the
  // quietest moment as well as under load.
  const batches: { medianMs: number; bestMs: number; loopMedianMs: number }[] = []
  if (!options.quick) {
    for (let b = 0; b < 5; b++) {
      const batch = timeBeam(1999, 20, 20, true)
      batches.push({ medianMs: batch.medianMs, bestMs: batch.bestMs, loopMedianMs: batch.reference!.medianMs })
    }
    say(`    five batches of 20 runs, each in a fresh process: solve median (loop median) ${batches.map((b) => `${fmt(b.medianMs)} (${fmt(b.loopMedianMs)})`).join(', ')}`)
    const quietest = batches.reduce((q, b) => (b.loopMedianMs < q.loopMedianMs ? b : q))
    say(`    in the batch with the quietest loop: solve median ${fmt(quietest.medianMs)}`)
  }
  results.interactive = { nodes: 2000, elements: 1999, modes: MODES, ...interactive, maxError: maxError(interactive.frequenciesHz), batches }

  // b. Against SciPy on the same pencil.
  const python = findPython()
  const sizes = options.quick ? [1_000, 10_000] : options.million ? [1_000, 10_000, 100_000, 1_000_000] : [1_000, 10_000, 100_000]
  say(`7b. Rodwave against SciPy eigsh (shift-invert about 0, which='LM', k = ${MODES}) on the same K and M${'missing' in python ? ` — SciPy peer skipped: ${python.missing}` : ''}`)
  if (!options.million && !options.quick) say('    (10⁶ elements: run with --million)')
  say(`${'elements'.padStart(10)}${'unknowns'.padStart(11)}${'Rodwave'.padStart(11)}${'SciPy eigsh'.padStart(13)}${'ratio'.padStart(8)}${'max error f1…f10 (Rodwave)'.padStart(28)}${'(SciPy)'.padStart(10)}`)
  const rows: unknown[] = []
  const work = mkdtempSync(join(tmpdir(), 'rodwave-bending-bench-'))
  try {
    for (const elements of sizes) {
      const runs = elements >= 100_000 ? 1 : 7
      const rodwave = timeBeam(elements, 1, runs)
      let peer: PeerRun | null = null
      if ('python' in python) {
        const project = beam(elements)
        const model = engine.assembleFamily(project, engine.familyOf('bending'), { order: 1, elementsPerSegment: elements, mass: 'consistent', bendingTheory: 'euler-bernoulli' })
        const file = join(work, `pencil-${elements}.bin`)
        writePencil(file, model.pencil.stiffness, model.pencil.mass)
        try {
          const out = execFileSync(
            python.python,
            [join(here, 'peer_scipy_bending.py'), file, String(model.pencil.stiffness.order), String(model.pencil.stiffness.halfBandwidth), String(MODES), String(LENGTH), String(betaScale)],
            { encoding: 'utf8', maxBuffer: 16 * 1024 * 1024, timeout: SCIPY_TIMEOUT_S * 1000, killSignal: 'SIGKILL' },
          )
          peer = JSON.parse(out) as PeerRun
        } catch (error) {
          const timedOut = error instanceof Error && 'code' in error && (error as { code?: string }).code === 'ETIMEDOUT'
          peer = timedOut
            ? { eigsh_s: NaN, build_s: NaN, failure: `did not return within ${SCIPY_TIMEOUT_S} s (stopped)`, timedOut: true }
            : { eigsh_s: NaN, build_s: NaN, failure: error instanceof Error ? error.message.split('\n')[0] : String(error) }
        }
        rmSync(file, { force: true })
      }
      const peerMs = peer && !peer.failure ? 1000 * peer.eigsh_s : null
      const ratio = peerMs !== null ? peerMs / rodwave.medianMs : null
      // A stopped SciPy call ran at least the timeout: the ratio is then a lower bound.
      const ratioAtLeast = peer?.timedOut ? (1000 * SCIPY_TIMEOUT_S) / rodwave.medianMs : null
      const rodwaveError = maxError(rodwave.frequenciesHz)
      const peerError = peer?.errors ? Math.max(...peer.errors) : null
      say(
        `${elements.toLocaleString('en-US').padStart(10)}${(2 * elements).toLocaleString('en-US').padStart(11)}${fmt(rodwave.medianMs).padStart(11)}${(peerMs !== null ? fmt(peerMs) : peer?.timedOut ? `> ${SCIPY_TIMEOUT_S} s` : '—').padStart(13)}${(ratio !== null ? `${ratio.toPrecision(2)}×` : ratioAtLeast !== null ? `>${Math.floor(ratioAtLeast)}×` : '—').padStart(8)}${rodwaveError.toExponential(1).padStart(28)}${(peerError !== null ? peerError.toExponential(1) : '—').padStart(10)}`,
      )
      if (peer?.failure) say(`    SciPy at ${elements.toLocaleString('en-US')} elements: ${peer.failure}`)
      rows.push({ elements, unknowns: 2 * elements, rodwave: { ...rodwave, maxError: rodwaveError }, scipy: peer, speedup: ratio, speedupAtLeast: ratioAtLeast })
    }
  } finally {
    rmSync(work, { recursive: true, force: true })
    rmSync(loaded.folder, { recursive: true, force: true })
  }
  say(`Rodwave: the production bundle, median of 7 runs after a warm-up (one run from 10⁵ elements); SciPy: one eigsh call (its sparse LU included), matrices built beforehand, stopped after ${SCIPY_TIMEOUT_S} s.`)
  results.versusScipy = rows
  return results
}

// Run alone.
if (process.argv[1] && fileURLToPath(import.meta.url) === process.argv[1]) {
  const say = (line = '') => process.stdout.write(`${line}\n`)
  await runBendingBench(say, { quick: process.argv.includes('--quick'), million: process.argv.includes('--million') })
}
