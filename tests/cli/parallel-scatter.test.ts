// The pool shares samples out in chunks to whichever worker is free; each sample's random
// stream depends only on the seed and its index, so the result must equal the serial one exactly.
import { readFileSync } from 'node:fs'
import { afterAll, describe, expect, test } from 'vitest'
import { ScatterPool } from '../../bin/parallel-scatter'
import { analyseProject } from '../../core/analysis/modal-analysis'
import { scatterFrequencies } from '../../core/analysis/tolerance-scatter'
import { readProjectText } from '../../core/model/project-schema'

const read = readProjectText(readFileSync('examples/condensate-pump-hanger.rodwave.json', 'utf8'))
if (!read.ok) throw new Error('demo project does not load')
const project = read.project
const pool = ScatterPool.start(2)
afterAll(() => pool.close())

describe('ScatterPool', () => {
  test('two workers and chunked hand-out give the serial result bit for bit, in sample order', async () => {
    const run = { seed: 17, samples: 230, modes: 3 }
    const parallel = await pool.run(project, run)
    const nominal = analyseProject(project, { modes: 3 }, { withReference: false })
    const serial = scatterFrequencies(project, { seed: 17, start: 0, count: 230, modes: 3 }, nominal)
    expect(parallel.length).toBe(230 * 3)
    expect(Array.from(parallel)).toEqual(Array.from(serial))
  }, 60_000)

  test('fewer samples than one chunk still come back whole', async () => {
    const parallel = await pool.run(project, { seed: 3, samples: 7, modes: 2 })
    expect(parallel.length).toBe(14)
    expect(parallel.every((f) => Number.isFinite(f) && f > 0)).toBe(true)
  }, 60_000)
})
