// @vitest-environment happy-dom
/**
 * The design view's stores and tasks, with the in-page solver:
 * - the tuner's proposal changes the part only when accepted, as one undoable edit, and undo
 *   restores the exact previous value; a search that finds nothing says the engine's own words;
 * - a tolerance scatter split between one or two workers gives the same samples and quantiles
 *   (each sample depends only on the seed and its index), and the same as the engine run whole;
 * - the resonance check moves to the tolerance bands when asked, and back when the part changes.
 * The demo project is a fixture for interface behaviour only.
 */
import { beforeEach, describe, expect, it } from 'vitest'
import { readProjectText } from '../../core/model/project-schema'
import { tuneParameter, TuneError } from '../../core/analysis/tuner'
import { scatterFrequencies, scatterQuantiles } from '../../core/analysis/tolerance-scatter'
import { analyseProject } from '../../core/analysis/modal-analysis'
import { separationBetweenBands } from '../../core/analysis/resonance'
import { useProjectStore } from '../../renderer/stores/project-store'
import { useResultsStore } from '../../renderer/stores/results-store'
import { useScatterStore } from '../../renderer/stores/scatter-store'
import { useTunerStore } from '../../renderer/stores/tuner-store'
import * as edits from '../../renderer/stores/project-edits'
import { createInlineSolverClient } from '../../renderer/solver/solver-client'
import { joinShares, scatterShares, scatterWorkerCount } from '../../renderer/solver/scatter-shares'
import { DEMO_TEXT, freshApp, settle } from './renderer-helpers'
import { uniformBar } from '../helpers'

function demo() {
  const read = readProjectText(DEMO_TEXT)
  if (!read.ok) throw new Error('the demo fixture must be valid')
  return read.project
}

describe('tuner through the project store', () => {
  beforeEach(() => {
    freshApp()
    useProjectStore().load(demo(), { path: null, name: 'demo' })
  })

  it('applies the value found as one edit, and one undo restores the exact previous value', async () => {
    const project = useProjectStore()
    const tuner = useTunerStore()
    const before = project.draftText
    tuner.choose('masses[1].mass')
    // Default bounds: ±30 % of the current 55 kg.
    expect(tuner.bounds[0]).toBeCloseTo(0.7 * 55, 12)
    expect(tuner.bounds[1]).toBeCloseTo(1.3 * 55, 12)
    tuner.goal = 'separation'
    await tuner.run()
    const found = tuner.result!
    expect(found.parameter).toBe('masses[1].mass')
    // The proposal is what the engine finds for the same request.
    expect(found.value).toBe(tuneParameter(demo(), { parameter: 'masses[1].mass', min: 0.7 * 55, max: 1.3 * 55, modes: demo().analysis.modes }).value)
    expect(project.draftText).toBe(before)
    expect(project.canUndo).toBe(false)

    tuner.accept()
    expect(project.draft.masses[1].mass).toBe(found.value)
    expect(project.draft.masses[0].mass).toBe(2.4)
    expect(tuner.applied).toMatchObject({ before: 55, after: found.value })

    project.undo()
    expect(project.draft.masses[1].mass).toBe(55)
    expect(project.draftText).toBe(before)
    expect(project.canUndo).toBe(false)
    project.redo()
    expect(project.draft.masses[1].mass).toBe(found.value)
  })

  it('moves attachments by the file format’s rule when a tuned length is applied', async () => {
    const project = useProjectStore()
    const tuner = useTunerStore()
    tuner.choose('segments[0].length')
    await tuner.run()
    const found = tuner.result!
    tuner.accept()
    // Both masses sit beyond segment 1: they move with the bar's end.
    const shift = found.value - 1.9
    expect(project.draft.segments[0].length).toBe(found.value)
    expect(project.draft.masses[0].at).toBeCloseTo(1.98 + shift, 12)
    expect(project.draft.masses[1].at).toBeCloseTo(2.91 + shift, 12)
  })

  it('will not apply a proposal for a part that has changed since', async () => {
    const project = useProjectStore()
    const tuner = useTunerStore()
    tuner.choose('masses[1].mass')
    await tuner.run()
    project.edit((p) => edits.assign(p, 'margin', 0.2), 'margin')
    expect(tuner.isCurrent).toBe(false)
    tuner.accept()
    expect(project.draft.masses[1].mass).toBe(55)
  })

  it('shows an impossible search as the engine’s own message', async () => {
    const tuner = useTunerStore()
    tuner.choose('segments[2].length')
    tuner.goal = 'target'
    tuner.mode = 1
    tuner.targetHz = 10
    await tuner.run()
    let expected = ''
    try {
      tuneParameter(demo(), { parameter: 'segments[2].length', min: 0.7 * 0.85, max: 1.3 * 0.85, mode: 1, targetHz: 10, modes: demo().analysis.modes })
    } catch (error) {
      if (error instanceof TuneError) expected = error.message
    }
    expect(expected).toMatch(/moves between/)
    expect(tuner.failure).toBe(expected)
    expect(tuner.result).toBeNull()
  })

  it('names bad bounds and keeps a tube’s wall', () => {
    const tuner = useTunerStore()
    tuner.choose('segments[1].section.innerDiameter')
    // Bore 27 mm in a 44 mm tube: +30 % would be 35.1 mm; the default stops at 95 % of 44 mm.
    expect(tuner.bounds[1]).toBeCloseTo(Math.min(1.3 * 0.027, 0.95 * 0.044), 12)
    tuner.setBound('max', 0.05)
    expect(tuner.problems.get('max')).toMatch(/outer diameter/)
    tuner.setBound('max', 0.03)
    expect(tuner.problems.has('max')).toBe(false)
    tuner.setBound('min', 0.035)
    expect(tuner.problems.get('max')).toBe('must be greater than the lower bound')
    tuner.setBound('min', undefined)
    expect(tuner.problems.get('min')).toBe('is required')
  })
})

describe('tolerance scatter shared between workers', () => {
  it('splits the samples into contiguous shares that cover them once', () => {
    expect(scatterShares(10, 3)).toEqual([
      { start: 0, count: 4 },
      { start: 4, count: 3 },
      { start: 7, count: 3 },
    ])
    expect(scatterShares(2, 8)).toEqual([
      { start: 0, count: 1 },
      { start: 1, count: 1 },
    ])
    expect(scatterWorkerCount(16, 10_000)).toBe(8)
    expect(scatterWorkerCount(2, 10_000)).toBe(2)
    expect(scatterWorkerCount(undefined, 10_000)).toBe(2)
    expect(scatterWorkerCount(4, 3)).toBe(3)
    expect(Array.from(joinShares([new Float64Array([1, 2]), new Float64Array([3])]))).toEqual([1, 2, 3])
  })

  it('gives the same samples and quantiles on one worker and on two, and the same as the engine run whole', async () => {
    const project = uniformBar({ extra: { tolerances: { youngsModulus: 0.03, density: 0.01, length: 0.005, diameter: 0.01 }, analysis: { elementsPerSegment: 10, modes: 3 } } })
    const client = createInlineSolverClient()
    const request = { seed: 7, samples: 41, modes: 3 }
    const one = await client.scatter(project, { ...request, workers: 1 }, () => undefined).result
    const progress: number[] = []
    const two = await client.scatter(project, { ...request, workers: 2 }, (f) => progress.push(f)).result
    expect(one.workers).toBe(1)
    expect(two.workers).toBe(2)
    expect(Array.from(two.frequencies)).toEqual(Array.from(one.frequencies))
    const quantiles = (o: typeof one) => scatterQuantiles(o.frequencies, o.nominal)
    expect(quantiles(two)).toEqual(quantiles(one))
    const whole = scatterFrequencies(project, { seed: 7, start: 0, count: 41, modes: 3 })
    expect(Array.from(one.frequencies)).toEqual(Array.from(whole))
    // Progress rises to 1 and never falls.
    expect(progress[progress.length - 1]).toBe(1)
    for (let i = 1; i < progress.length; i++) expect(progress[i]).toBeGreaterThanOrEqual(progress[i - 1])
  })
})

describe('the resonance check on tolerance bands', () => {
  beforeEach(() => {
    freshApp()
    useProjectStore().load(demo(), { path: null, name: 'demo' })
  })

  it('uses each mode’s band when asked, and the nominal frequencies again once the part changes', async () => {
    const project = useProjectStore()
    const results = useResultsStore()
    const scatter = useScatterStore()
    await results.solveCurrent()
    scatter.samples = 40
    await scatter.run()
    const summary = scatter.summary!
    expect(summary.quantiles).toHaveLength(demo().analysis.modes)
    expect(results.resonanceBasis).toBe('nominal')

    scatter.checkWithBands = true
    expect(results.resonanceBasis).toBe('bands')
    const pairs = results.resonance
    const nominal = analyseProject(demo()).resonance
    expect(pairs).toHaveLength(nominal.length)
    for (const pair of pairs) {
      const q = summary.quantiles.find((x) => x.mode === pair.mode)!
      expect(pair.modeBandHz).toEqual([q.p05, q.p95])
      expect(pair.separation).toBe(separationBetweenBands([q.p05, q.p95], pair.band.hz))
    }
    // A band is wider than a point: no pair can be further from resonance on bands than nominally.
    pairs.forEach((pair, i) => expect(Math.abs(pair.separation)).toBeLessThanOrEqual(Math.abs(nominal[i].separation)))

    project.edit((p) => edits.setSegmentLength(p, 2, 0.8), 'segments[2].length')
    await results.solveCurrent()
    expect(scatter.isCurrent).toBe(false)
    expect(results.resonanceBasis).toBe('nominal')
    expect(results.resonance.every((p) => p.modeBandHz === undefined)).toBe(true)
    expect(results.warnings.some((w) => w.level === 'note' && /tolerance bands/.test(w.text))).toBe(true)
  })

  it('refuses to run without a tolerance, naming what is missing', async () => {
    const project = useProjectStore()
    const scatter = useScatterStore()
    for (const key of ['youngsModulus', 'density', 'length', 'diameter', 'mass'] as const) project.edit((p) => edits.setTolerance(p, key, undefined))
    expect(project.draft.tolerances).toBeUndefined()
    expect(scatter.problems.get('tolerances')).toMatch(/at least one tolerance/)
    await scatter.run()
    await settle()
    expect(scatter.summary).toBeNull()
  })
})
