/**
 * The parts of the engine the bending benchmark uses, bundled by it as the command line is
 * bundled (bench/bending-bench.ts), and the timing loop it runs in a fresh process.
 */
import { analyseProject } from '../core/analysis/modal-analysis'
import { readProjectDocument } from '../core/model/project-schema'

export { analyseProject } from '../core/analysis/modal-analysis'
export { assembleFamily } from '../core/fe/assemble'
export { familyOf } from '../core/model/families'
export { readProjectDocument } from '../core/model/project-schema'
export { diagonalEntry } from '../core/linalg/symmetric-band-matrix'

/** Assembly + solve times (ms) of `runs` analyses after `warmups` untimed ones, as `solve --json` times them. */
export function timeDocument(document: unknown, warmups: number, runs: number): { times: number[]; frequenciesHz: number[]; sturmPassed: boolean } {
  const read = readProjectDocument(document)
  if (!read.ok) throw new Error(read.issues.map((i) => `${i.path}: ${i.message}`).join('; '))
  for (let i = 0; i < warmups; i++) analyseProject(read.project, {}, { withReference: false })
  const times: number[] = []
  let last = analyseProject(read.project, {}, { withReference: false })
  times.push(last.timing.assembleMs + last.timing.solveMs)
  for (let r = 1; r < runs; r++) {
    last = analyseProject(read.project, {}, { withReference: false })
    times.push(last.timing.assembleMs + last.timing.solveMs)
  }
  return { times, frequenciesHz: last.modes.map((m) => m.frequencyHz), sturmPassed: last.sturmPassed }
}
