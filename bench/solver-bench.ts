/**
 * Solver benchmark (`npm run bench`): prints measured figures and writes them to
 * bench/results/. It asserts nothing about time; no test does.
 *
 * Model: uniform fixed–free steel bar, E = 200 GPa, ρ = 7850 kg/m³, A = 1e-4 m², L = 1 m,
 * the same pencil as the SciPy peer script bench/peer_scipy.py (shift-invert eigsh on the
 * consistent-mass pencil; LAPACK's tridiagonal eigensolver, through eigh_tridiagonal, on the
 * lumped one). Warm figures are wall time inside the process for assembly + solve, as
 * `solve --json` reports them, each the median of several runs after a warm-up. Cold figures
 * are whole processes, start to exit: the built command line (`node bin/launch.mjs solve …`)
 * against `python3 bench/peer_scipy.py …` (Python's start and the NumPy/SciPy import included).
 * With /usr/bin/python3 and SciPy present, the peer runs in the same session and the ratio is
 * printed. Options: --quick (smaller sizes, fewer runs), --cold (only the whole-process figures),
 * --bending (only the bending rows, bench/bending-bench.ts), --million (bending at 10⁶ elements too).
 */
import { execFileSync, spawnSync } from 'node:child_process'
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs'
import { cpus, hostname, loadavg, tmpdir, totalmem } from 'node:os'
import { dirname, join, resolve } from 'node:path'
import { fileURLToPath } from 'node:url'
import { analyseProject, type AnalysisOverrides } from '../core/analysis/modal-analysis'
import { readProjectText } from '../core/model/project-schema'
import type { Project } from '../core/model/project'
import { ScatterPool } from '../bin/parallel-scatter'
import { runBendingBench } from './bending-bench'

const here = dirname(fileURLToPath(import.meta.url))
const root = resolve(here, '..')
const quick = process.argv.includes('--quick')
const coldOnly = process.argv.includes('--cold')
const bendingOnly = process.argv.includes('--bending')
const million = process.argv.includes('--million')
const modelFile = join(here, 'uniform-steel-bar.rodwave.json')
const read = readProjectText(readFileSync(modelFile, 'utf8'))
if (!read.ok) throw new Error('the benchmark model is invalid')
const bar: Project = read.project

const E = 200e9
const RHO = 7850
const c = Math.sqrt(E / RHO)

/** f₁ of the discrete consistent-mass problem of N equal 2-node elements (docs/verification.md §3). */
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
  const script = process.env.RODWAVE_PEER_SCRIPT ?? join(here, 'peer_scipy.py')
  if (!existsSync(script) || !existsSync('/usr/bin/python3')) return null
  try {
    execFileSync('/usr/bin/python3', ['-c', 'import scipy'], { stdio: 'ignore' })
    return script
  } catch {
    return null
  }
}

interface PeerRun {
  importS: number
  eigshS?: number
  tridiagonalS?: number
  f1Consistent?: number
  f1Lumped?: number
  /** The whole Python process, start to exit, s. */
  processS: number
}

function runPeer(script: string, n: number, k: number, which: 'consistent' | 'lumped' | 'both' = 'both'): PeerRun | null {
  const t0 = performance.now()
  const result = spawnSync('/usr/bin/python3', [script, String(n), String(k), which], { encoding: 'utf8' })
  const processS = (performance.now() - t0) / 1000
  if (result.status !== 0) return null
  try {
    const out = JSON.parse(result.stdout)
    return { importS: out.import_s, eigshS: out.eigsh_consistent_s, tridiagonalS: out.eigh_tridiagonal_lumped_s, f1Consistent: out.f1_consistent, f1Lumped: out.f1_lumped, processS }
  } catch {
    return null
  }
}

/** f₁ of the discrete lumped-mass problem of N equal 2-node elements, half a mass at the free end: ω = (2c/h) sin(πh/4L) (derived from the chain's modes sin(iθ), θ = π/2N). */
function discreteLumpedF1(n: number): number {
  const h = 1 / n
  return ((2 * c) / h) * Math.sin((Math.PI * h) / 4) / (2 * Math.PI)
}

const TIME = '/usr/bin/time'
const cpuFile = join(tmpdir(), `rodwave-bench-cpu-${process.pid}.txt`)

/** Runs a process to its end: wall time, and (where /usr/bin/time exists) its CPU time, user + system, ms. */
function timedSpawn(command: string, args: string[], capture: boolean): { wallMs: number; cpuMs: number | null; status: number | null; stdout: string; stderr: string } {
  const withTime = existsSync(TIME)
  const t0 = performance.now()
  const result = withTime
    ? spawnSync(TIME, ['-o', cpuFile, '-f', '%U %S', command, ...args], { encoding: 'utf8', cwd: root, maxBuffer: 256 * 1024 * 1024, stdio: capture ? 'pipe' : 'ignore' })
    : spawnSync(command, args, { encoding: 'utf8', cwd: root, maxBuffer: 256 * 1024 * 1024, stdio: capture ? 'pipe' : 'ignore' })
  const wallMs = performance.now() - t0
  let cpuMs: number | null = null
  if (withTime) {
    const [user, system] = readFileSync(cpuFile, 'utf8').trim().split('\n').at(-1)!.split(' ').map(Number)
    cpuMs = Number.isFinite(user + system) ? 1000 * (user + system) : null
  }
  return { wallMs, cpuMs, status: result.status, stdout: result.stdout ?? '', stderr: result.stderr ?? '' }
}

/** One whole `rodwave` process (the built command line), start to exit, with its own timing. */
function coldRodwave(args: string[]): { wallMs: number; cpuMs: number | null; timing: Record<string, number> | null } {
  const result = timedSpawn(process.execPath, [join(root, 'bin', 'launch.mjs'), ...args], true)
  if (result.status !== 0 && result.status !== 3) throw new Error(`rodwave ${args.join(' ')} exited ${result.status}: ${result.stderr}`)
  let timing: Record<string, number> | null
  try {
    timing = JSON.parse(result.stdout).timing ?? null
  } catch {
    timing = null
  }
  return { wallMs: result.wallMs, cpuMs: result.cpuMs, timing }
}

/** Median wall and CPU time of `runs` whole processes of a command, ms. */
function coldProcess(command: string, args: string[], runs: number): { wallMs: number; cpuMs: number | null } {
  const samples = Array.from({ length: runs }, () => timedSpawn(command, args, false))
  const cpu = samples.map((x) => x.cpuMs)
  return { wallMs: median(samples.map((x) => x.wallMs)), cpuMs: cpu.every((x) => x !== null) ? median(cpu as number[]) : null }
}

const withCpu = (t: { wallMs: number; cpuMs: number | null }) => `${fmt(t.wallMs)}${t.cpuMs !== null ? ` (CPU ${fmt(t.cpuMs)})` : ''}`

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

const peer = peerScript()

if (!coldOnly && !bendingOnly) {
  // 1. Headline: 20 modes, 2-node consistent, against SciPy in the same session.
  const headlineSizes = quick ? [100_000] : [100_000, 1_000_000]
  const headline: unknown[] = []
  say('\n1. Lowest 20 modes, 2-node elements, consistent mass (assembly + solve; median of runs after a warm-up)')
  say(`${'elements'.padStart(10)}${'Rodwave'.padStart(12)}${'SciPy eigsh'.padStart(14)}${'ratio'.padStart(8)}${'f1 error (Rodwave)'.padStart(20)}${'f1 error (SciPy)'.padStart(18)}`)
  for (const n of headlineSizes) {
    const r = timeSolve({ elementsPerSegment: n, modes: 20, mass: 'consistent', elementOrder: 1 }, n >= 1_000_000 ? 3 : 7)
    const exact = discreteF1(n)
    const p = peer ? runPeer(peer, n, 20, 'consistent') : null
    const ratio = p?.eigshS ? (1000 * p.eigshS) / r.totalMs : null
    const errorOf = (f: number) => Math.abs(f - exact) / exact
    say(
      `${n.toLocaleString('en-US').padStart(10)}${fmt(r.totalMs).padStart(12)}${(p?.eigshS ? `${p.eigshS.toFixed(3)} s` : '—').padStart(14)}${(ratio ? `${ratio.toFixed(1)}×` : '—').padStart(8)}${errorOf(r.f1).toExponential(1).padStart(20)}${(p?.f1Consistent ? errorOf(p.f1Consistent).toExponential(1) : '—').padStart(18)}`,
    )
    headline.push({ elements: n, modes: 20, rodwaveMs: r.totalMs, assembleMs: r.assembleMs, solveMs: r.solveMs, f1: r.f1, f1Exact: exact, sturmPassed: r.sturmPassed, scipy: p, speedup: ratio })
  }
  results.headline = headline

  // 1b. Lumped mass against LAPACK's tridiagonal eigensolver (SciPy's eigh_tridiagonal: bisection + inverse iteration for the lowest 20).
  const lumped: unknown[] = []
  say('\n1b. Lowest 20 modes, 2-node elements, lumped mass, against LAPACK\'s tridiagonal solver (eigh_tridiagonal: ?stebz + ?stein)')
  say(`${'elements'.padStart(10)}${'Rodwave'.padStart(12)}${'LAPACK'.padStart(14)}${'ratio'.padStart(8)}${'f1 error (Rodwave)'.padStart(20)}${'f1 error (LAPACK)'.padStart(19)}`)
  for (const n of headlineSizes) {
    const r = timeSolve({ elementsPerSegment: n, modes: 20, mass: 'lumped', elementOrder: 1 }, n >= 1_000_000 ? 3 : 7)
    const exact = discreteLumpedF1(n)
    const p = peer ? runPeer(peer, n, 20, 'lumped') : null
    const ratio = p?.tridiagonalS ? (1000 * p.tridiagonalS) / r.totalMs : null
    const errorOf = (f: number) => Math.abs(f - exact) / exact
    say(
      `${n.toLocaleString('en-US').padStart(10)}${fmt(r.totalMs).padStart(12)}${(p?.tridiagonalS ? `${p.tridiagonalS.toFixed(3)} s` : '—').padStart(14)}${(ratio ? `${ratio.toFixed(1)}×` : '—').padStart(8)}${errorOf(r.f1).toExponential(1).padStart(20)}${(p?.f1Lumped ? errorOf(p.f1Lumped).toExponential(1) : '—').padStart(19)}`,
    )
    lumped.push({ elements: n, modes: 20, rodwaveMs: r.totalMs, f1: r.f1, f1Exact: exact, sturmPassed: r.sturmPassed, lapack: p, speedup: ratio })
  }
  results.lumped = lumped

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
}

// 6. Whole processes, cold: what a user waits for at the command line.
if (!bendingOnly) {
  // Build the command line first if needed (not timed).
  coldRodwave(['--help'])
  const runs = quick ? 5 : 11
  say(`\n6. Whole processes, cold (start to exit; median of ${runs} runs unless stated; CPU = user + system time of the process)`)
  say(`load average when this section began: ${loadavg().map((l) => l.toFixed(1)).join(', ')} (on ${cpus().length} cores)`)
  const nodeFloor = coldProcess(process.execPath, ['-e', '0'], runs)
  say(`empty Node process (the floor): ${withCpu(nodeFloor)}`)
  const small: { label: string; args: string[] }[] = [
    { label: 'demo part (examples/condensate-pump-hanger, 120 elements, 6 modes)', args: ['solve', 'examples/condensate-pump-hanger.rodwave.json'] },
    { label: 'bar, 200 elements, 10 modes', args: ['solve', modelFile, '--elements-per-segment', '200', '--modes', '10'] },
  ]
  const cold: Record<string, unknown>[] = []
  for (const { label, args } of small) {
    const samples = Array.from({ length: runs }, () => coldRodwave(args))
    const cpu = samples.map((x) => x.cpuMs)
    const wall = { wallMs: median(samples.map((x) => x.wallMs)), cpuMs: cpu.every((x) => x !== null) ? median(cpu as number[]) : null }
    const phases: Record<string, number> = {}
    for (const key of Object.keys(samples[0].timing ?? {})) phases[key] = median(samples.map((x) => x.timing?.[key] ?? NaN))
    say(`rodwave solve, ${label}: ${withCpu(wall)}`)
    say(`  its timing (medians): ${Object.entries(phases).map(([k, v]) => `${k.replace(/Ms$/, '')} ${fmt(v)}`).join(', ')}`)
    cold.push({ label, args, ...wall, runsMs: samples.map((x) => x.wallMs), timing: phases })
  }
  const fromSources = coldProcess(process.execPath, ['--import', 'tsx', join(root, 'bin', 'rodwave.ts'), ...small[0].args], quick ? 3 : 5)
  say(`the same demo solve run from the TypeScript sources through tsx, as before the build: ${withCpu(fromSources)}`)
  const viaNpm = coldProcess('npm', ['run', '--silent', 'rodwave', '--', ...small[0].args], quick ? 3 : 5)
  say(`the same demo solve through npm run --silent rodwave (npm's own start included): ${withCpu(viaNpm)}`)
  results.cold = { loadAverage: loadavg(), nodeFloor, small: cold, fromSources, viaNpm }

  const peerFloor = peer ? coldProcess('/usr/bin/python3', ['-c', 'import numpy, scipy.sparse.linalg, scipy.linalg'], runs) : null
  if (peerFloor !== null) say(`Python process importing NumPy and SciPy, nothing solved (the peer's floor): ${withCpu(peerFloor)}`)
  say(`${'elements, 20 modes'.padStart(20)}${'mass'.padStart(12)}${'rodwave solve'.padStart(15)}${'SciPy script'.padStart(14)}${'ratio'.padStart(8)}`)
  const large: unknown[] = []
  for (const n of quick ? [100_000] : [100_000, 1_000_000]) {
    for (const mass of ['consistent', 'lumped'] as const) {
      const r = n >= 1_000_000 ? 1 : 3
      const rodwave = median(Array.from({ length: r }, () => coldRodwave(['solve', modelFile, '--elements-per-segment', String(n), '--modes', '20', '--mass', mass]).wallMs))
      const peerRuns = peer ? Array.from({ length: r }, () => runPeer(peer, n, 20, mass)) : []
      const peerMs = peerRuns.length && peerRuns.every(Boolean) ? 1000 * median(peerRuns.map((p) => p!.processS)) : null
      say(`${n.toLocaleString('en-US').padStart(20)}${mass.padStart(12)}${fmt(rodwave).padStart(15)}${(peerMs ? fmt(peerMs) : '—').padStart(14)}${(peerMs ? `${(peerMs / rodwave).toFixed(1)}×` : '—').padStart(8)}`)
      large.push({ elements: n, modes: 20, mass, rodwaveMs: rodwave, peerMs, runs: r })
    }
  }
  results.coldLarge = { peerFloor, runs: large }
  say(`load average when this section ended: ${loadavg().map((l) => l.toFixed(1)).join(', ')}`)
}

// 7. Bending: the interactive size, and SciPy's eigsh on the same pencil.
if (!coldOnly) results.bending = await runBendingBench(say, { quick, million })

mkdirSync(join(here, 'results'), { recursive: true })
// Date and time in the name: a second run on the same day keeps the first.
const stamp = new Date().toISOString().slice(0, 16).replace('T', '-').replace(':', '')
const file = join(here, 'results', `bench-${stamp}${quick ? '-quick' : ''}${coldOnly ? '-cold' : ''}${bendingOnly ? '-bending' : ''}.json`)
writeFileSync(file, `${JSON.stringify(results, null, 2)}\n`)
say(`\nwritten: ${file.slice(root.length + 1)}`)
