/** One cold solve in a fresh process, for the benchmark's peak-memory figure. Prints JSON. */
import { readFileSync } from 'node:fs'
import { analyseProject } from '../core/analysis/modal-analysis'
import { readProjectText } from '../core/model/project-schema'

const [file, elements, modes] = process.argv.slice(2)
const read = readProjectText(readFileSync(file, 'utf8'))
if (!read.ok) throw new Error('bad benchmark file')
const analysis = analyseProject(read.project, { elementsPerSegment: Number(elements), modes: Number(modes) })
process.stdout.write(
  JSON.stringify({
    assembleMs: analysis.timing.assembleMs,
    solveMs: analysis.timing.solveMs,
    f1: analysis.modes[0].frequencyHz,
    sturmPassed: analysis.families[0].sturm.passed,
    maxRssMiB: process.resourceUsage().maxRSS / 1024,
  }),
)
