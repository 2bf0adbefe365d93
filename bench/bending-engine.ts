/**
 * The parts of the engine the bending benchmark uses, bundled by it as the command line is
 * bundled (bench/bending-bench.ts), and the timing loop it runs in a fresh process.
 */
import { analyseProject } from '../core/analysis/modal-analysis'
import { readProjectDocument } from '../core/model/project-schema'

export { assembleFamily } from '../core/fe/assemble'
export { familyOf } from '../core/model/families'
export { readProjectDocument } from '../core/model/project-schema'
export { diagonalEntry } from '../core/linalg/symmetric-band-matrix'

/**
 * A fixed amount of arithmetic (8 million multiply-adds over a 32 KB array), timed between the
 * analyses: on shared cores its own spread shows how much of the analyses' spread is the machine's.
 */
function referenceLoop(): number {
  const data = new Float64Array(4000)
  for (let i = 0; i < data.length; i++) data[i] = Math.sin(i)
  const start = performance.now()
  let sum = 0
  for (let k = 0; k < 2000; k++) for (let i = 0; i < 4000; i++) sum += data[i] * data[(i + k) % 4000]
  const ms = performance.now() - start
  return Number.isFinite(sum) ? ms : NaN
}

/**
 * Assembly + solve times (ms) of `runs` analyses after `warmups` untimed ones, as `solve --json`
 * times them, and (when asked) the reference loop's time after each analysis.
 */
export function timeDocument(
  document: unknown,
  warmups: number,
  runs: number,
  withReference = false,
): { times: number[]; referenceTimes: number[]; frequenciesHz: number[]; sturmPassed: boolean } {
  const read = readProjectDocument(document)
  if (!read.ok) throw new Error(read.issues.map((i) => `${i.path}: ${i.message}`).join('; '))
  for (let i = 0; i < warmups; i++) analyseProject(read.project, {}, { withReference: false })
  const times: number[] = []
  const referenceTimes: number[] = []
  let last = analyseProject(read.project, {}, { withReference: false })
  times.push(last.timing.assembleMs + last.timing.solveMs)
  for (let r = 1; r < runs; r++) {
    if (withReference) referenceTimes.push(referenceLoop())
    last = analyseProject(read.project, {}, { withReference: false })
    times.push(last.timing.assembleMs + last.timing.solveMs)
  }
  return { times, referenceTimes, frequenciesHz: last.modes.map((m) => m.frequencyHz), sturmPassed: last.sturmPassed }
}
