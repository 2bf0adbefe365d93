/**
 * Solver benchmark (`npm run bench`): prints measured figures and writes them to
 * bench/results/. It asserts nothing about time; no test does.
 *
 * Model: uniform fixed–free steel bar, E = 200 GPa, ρ = 7850 kg/m³, A = 1e-4 m², L = 1 m,
 * the same pencil as the SciPy peer script (shift-invert eigsh on the consistent-mass
 * pencil, tridiagonal solver on the lumped one). Times are wall time inside the process for
 * assembly + solve, as `solve --json` reports them; each figure is the median of several
 * runs after a warm-up. With /usr/bin/python3 and SciPy present, the peer runs in the same
 * session and the ratio is printed. Options: --quick (smaller sizes, fewer runs).
 */
import { execFileSync } from 'node:child_process'
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs'
import { cpus, hostname, totalmem } from 'node:os'
import { dirname, join, resolve } from 'node:path'
import { fileURLToPath } from 'node:url'
import { analyseProject, type AnalysisOverrides } from '../core/analysis/modal-analysis'
import { readProjectText } from '../core/model/project-schema'
import type { Project } from '../core/model/project'
import { ScatterPool } from '../bin/parallel-scatter'

const here = dirname(fileURLToPath(import.meta.url))
const root = resolve(here, '..')
const quick = process.argv.includes('--quick')
const modelFile = join(here, 'uniform-steel-bar.rodwave.json')
const read = readProjectText(readFileSync(modelFile, 'utf8'))
if (!read.ok) throw new Error('the benchmark model is invalid')
const bar: Project = read.project

const E = 200e9
const RHO = 7850
const c = Math.sqrt(E / RHO)

/** f₁ of the discrete consistent-mass problem of N equal 2-node elements (check-values.md §3). */
function discreteF1(n: number): number {
  const h = 1 / n
  const theta = (Math.PI * h) / 2
  const half = Math.sin(theta / 2)
  return Math.sqrt(((6 * c * c) / (h * h)) * ((2 * half * half) / (2 + Math.cos(theta)))) / (2 * Math.PI)
}

function median(values: number[]): number {
  const s = [...values].sort((a, b) => a - b)
  const m = s.length >> 1
  return s.length % 2 ? s[m] : 0.5 * (s[m - 1] + s[m])
}

interface Timed {
  assembleMs: number
  solveMs: number
  totalMs: number
  f1: number
  sturmPassed: boolean
}

function timeSolve(overrides: AnalysisOverrides, runs: number): Timed {
  analyseProject(bar, overrides, { withReference: false }) // warm-up
  const samples: Timed[] = []
  for (let r = 0; r < runs; r++) {
    const a = analyseProject(bar, overrides, { withReference: false })
    samples.push({ assembleMs: a.timing.assembleMs, solveMs: a.timing.solveMs, totalMs: a.timing.assembleMs + a.timing.solveMs, f1: a.modes[0].frequencyHz, sturmPassed: a.sturmPassed })
  }
  const total = median(samples.map((s) => s.totalMs))
  const pick = samples.find((s) => s.totalMs === total) ?? samples[0]
  return { ...pick, assembleMs: median(samples.map((s) => s.assembleMs)), solveMs: median(samples.map((s) => s.solveMs)), totalMs: total }
}

function peerScript(): string | null {
  const candidates = [process.env.RODWAVE_PEER_SCRIPT, join(root, '..', 'shared', 'bench', 'peer_scipy.py')].filter(Boolean) as string[]
  const script = candidates.find((p) => existsSync(p))
  if (!script || !existsSync('/usr/bin/python3')) return null
  try {
    execFileSync('/usr/bin/python3', ['-c', 'import scipy'], { stdio: 'ignore' })
    return script
  } catch {
    return null
  }
}

function runPeer(script: string, n: number, k: number): { eigshS: number; tridiagonalS: number; f1: number } | null {
  try {
    const out = execFileSync('/usr/bin/python3', [script, String(n), String(k)], { encoding: 'utf8' })
    const get = (key: string) => Number(new RegExp(`${key}=([0-9.eE+-]+)`).exec(out)?.[1])
    return { eigshS: get('eigsh_consistent_s'), tridiagonalS: get('eigh_tridiagonal_lumped_s'), f1: get('f1') }
  } catch {
    return null
  }
}

const fmt = (ms: number) => (ms >= 1000 ? `${(ms / 1000).toFixed(2)} s` : `${ms.toFixed(ms < 10 ? 2 : 1)} ms`)
const results: Record<string, unknown> = {
  date: new Date().toISOString(),
  machine: { host: hostname(), cpus: cpus().length, cpu: cpus()[0]?.model, memoryGiB: +(totalmem() / 2 ** 30).toFixed(1), node: process.version },
}
const lines: string[] = []
const say = (line = '') => {
  lines.push(line)
  process.stdout.write(`${line}\n`)
}

say(`Rodwave solver benchmark — ${results.date}`)
say(`machine: ${cpus().length} × ${cpus()[0]?.model}, Node ${process.version}${quick ? ' (quick run)' : ''}`)

// 1. Headline: 20 modes, 2-node consistent, against SciPy in the same session.
const peer = peerScript()
const headlineSizes = quick ? [100_000] : [100_000, 1_000_000]
const headline: unknown[] = []
say('\n1. Lowest 20 modes, 2-node elements, consistent mass (assembly + solve; median of runs after a warm-up)')
say(`${'elements'.padStart(10)}${'Rodwave'.padStart(12)}${'SciPy eigsh'.padStart(14)}${'ratio'.padStart(8)}${'f1 error (Rodwave)'.padStart(20)}${'f1 error (SciPy)'.padStart(18)}`)
for (const n of headlineSizes) {
  const r = timeSolve({ elementsPerSegment: n, modes: 20, mass: 'consistent', elementOrder: 1 }, n >= 1_000_000 ? 3 : 7)
  const exact = discreteF1(n)
  const p = peer ? runPeer(peer, n, 20) : null
  const ratio = p ? (1000 * p.eigshS) / r.totalMs : null
  const errorOf = (f: number) => Math.abs(f - exact) / exact
  say(
    `${n.toLocaleString('en-US').padStart(10)}${fmt(r.totalMs).padStart(12)}${(p ? `${p.eigshS.toFixed(3)} s` : '—').padStart(14)}${(ratio ? `${ratio.toFixed(1)}×` : '—').padStart(8)}${errorOf(r.f1).toExponential(1).padStart(20)}${(p ? errorOf(p.f1).toExponential(1) : '—').padStart(18)}`,
  )
  headline.push({ elements: n, modes: 20, rodwaveMs: r.totalMs, assembleMs: r.assembleMs, solveMs: r.solveMs, f1: r.f1, f1Exact: exact, sturmPassed: r.sturmPassed, scipy: p, speedup: ratio })
}
results.headline = headline

// Peak memory of one cold 1M-element solve in a fresh process.
if (!quick) {
  const out = execFileSync(process.execPath, ['--import', 'tsx', join(here, 'solve-once.ts'), modelFile, '1000000', '20'], { encoding: 'utf8', cwd: root })
  const once = JSON.parse(out)
  results.peakMemory = once
  say(`peak memory of a cold 1,000,000-element, 20-mode solve in a fresh process: ${once.maxRssMiB.toFixed(0)} MiB (process total, Node itself included)`)
}

// 2. Element order and mass matrix at 100 000 elements.
say('\n2. Element order and mass matrix, 100,000 elements, 20 modes')
const variants: unknown[] = []
for (const [order, mass] of [
  [1, 'consistent'],
  [1, 'lumped'],
  [1, 'mixed'],
  [2, 'consistent'],
  [2, 'lumped'],
  [2, 'mixed'],
] as const) {
  const elements = order === 2 ? 50_000 : 100_000
  const r = timeSolve({ elementsPerSegment: elements, modes: 20, mass, elementOrder: order }, quick ? 3 : 5)
  say(`${`${order === 1 ? '2-node' : '3-node'} ${mass}`.padEnd(20)}${`${(elements * order).toLocaleString('en-US')} unknowns`.padStart(20)}${fmt(r.totalMs).padStart(12)}`)
  variants.push({ elementOrder: order, mass, elements, unknowns: elements * order, ms: r.totalMs })
}
results.variants = variants

// 3. Cost against n·k.
say('\n3. Cost against unknowns n and modes k (2-node consistent): time, and time / (n·k)')
const sizes = quick ? [1_000, 10_000, 100_000] : [1_000, 10_000, 100_000, 1_000_000]
const scaling: unknown[] = []
say(`${'n'.padStart(10)}${[5, 20, 50].map((k) => `k = ${k}`.padStart(24)).join('')}`)
for (const n of sizes) {
  const cells: string[] = []
  for (const k of [5, 20, 50]) {
    const runs = n >= 1_000_000 ? 1 : n >= 100_000 ? 3 : 9
    const r = timeSolve({ elementsPerSegment: n, modes: k, mass: 'consistent', elementOrder: 1 }, runs)
    const perNK = (1e6 * r.totalMs) / (n * k)
    cells.push(`${fmt(r.totalMs)} (${perNK.toFixed(0)} ns)`.padStart(24))
    scaling.push({ n, k, ms: r.totalMs, nsPerUnknownMode: perNK })
  }
  say(`${n.toLocaleString('en-US').padStart(10)}${cells.join('')}`)
}
results.scaling = scaling

// 4. Interactive model: 2 000 unknowns, 10 modes, solve + effective mass.
{
  const overrides = { elementsPerSegment: 2000, modes: 10 }
  for (let i = 0; i < 20; i++) analyseProject(bar, overrides, { withReference: false })
  const times: number[] = []
  for (let i = 0; i < 50; i++) {
    const a = analyseProject(bar, overrides, { withReference: false })
    times.push(a.timing.assembleMs + a.timing.solveMs)
  }
  say(`\n4. Interactive model, 2,000 unknowns, 10 modes, assembly + solve + effective mass, warm: median ${fmt(median(times))}`)
  results.interactive = { unknowns: 2000, modes: 10, medianMs: median(times) }
}

// 5. Throughput: 10 000 solves of a 200-element, 10-mode model on every core (tolerance scatter).
{
  const model: Project = { ...bar, analysis: { ...bar.analysis, elementsPerSegment: 200, modes: 10 }, tolerances: { youngsModulus: 0.03, density: 0.01, length: 0.002, diameter: 0.005 } }
  const pool = ScatterPool.start()
  const samples = quick ? 2000 : 10_000
  // Warm-up: the first runs load the workers and let the JIT compile the solve path.
  let t0 = performance.now()
  await pool.run(model, { seed: 1, samples, modes: 10 })
  const firstRunMs = performance.now() - t0
  await pool.run(model, { seed: 2, samples, modes: 10 })
  const times: number[] = []
  for (let r = 0; r < 5; r++) {
    t0 = performance.now()
    await pool.run(model, { seed: 3 + r, samples, modes: 10 })
    times.push(performance.now() - t0)
  }
  await pool.close()
  say(`\n5. Throughput: ${samples.toLocaleString('en-US')} solves of a 200-element, 10-mode model on ${pool.size} worker threads: median ${fmt(median(times))} (${((1000 * median(times)) / samples).toFixed(0)} µs per solve); first run after start ${fmt(firstRunMs)}`)
  results.throughput = { samples, workers: pool.size, medianMs: median(times), runsMs: times, firstRunMs }
}

mkdirSync(join(here, 'results'), { recursive: true })
const file = join(here, 'results', `bench-${new Date().toISOString().slice(0, 10)}${quick ? '-quick' : ''}.json`)
writeFileSync(file, `${JSON.stringify(results, null, 2)}\n`)
say(`\nwritten: ${file.slice(root.length + 1)}`)
