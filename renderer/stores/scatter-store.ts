/**
 * Tolerance scatter: the project's tolerances turn each frequency into a band (5 % to 95 % of the
 * samples). The samples are shared between one worker per core, with progress and Cancel. The
 * bands belong to the part and its tolerances: when either changes they are kept on screen but
 * marked out of date, and the resonance check falls back to the nominal frequencies.
 */
import { defineStore } from 'pinia'
import { computed, ref, shallowRef } from 'vue'
import { scatterQuantiles, type ScatterQuantiles } from '../../core/analysis/tolerance-scatter'
import { modeKey } from '../../core/analysis/resonance'
import type { Project, Tolerances } from '../../core/model/project'
import { useSolver, type ScatterOutcome } from '../solver/solver-client'
import { useCancellableJob } from '../composables/cancellable-job'
import { scatterKey } from '../solver/part-key'
import { scatterWorkerCount } from '../solver/scatter-shares'
import { useProjectStore } from './project-store'

export const DEFAULT_SAMPLES = 10_000
export const DEFAULT_SEED = 1
export const SAMPLE_LIMITS = [20, 1_000_000] as const
const SEED_MAX = 2 ** 32 - 1

export interface ScatterSummary {
  /** scatterKey of the project the samples were drawn for. */
  readonly key: string
  readonly quantiles: ScatterQuantiles[]
  readonly samples: number
  readonly seed: number
  readonly workers: number
  readonly tolerances: Tolerances
}

export type ScatterField = 'samples' | 'seed' | 'tolerances'

const isInteger = (v: number | undefined): v is number => typeof v === 'number' && Number.isInteger(v)

export const useScatterStore = defineStore('scatter', () => {
  const project = useProjectStore()
  const samples = ref<number | undefined>(DEFAULT_SAMPLES)
  const seed = ref<number | undefined>(DEFAULT_SEED)
  /** Check resonance with each mode's tolerance band instead of its nominal frequency. */
  const checkWithBands = ref(false)
  const summary = shallowRef<ScatterSummary | null>(null)
  const progress = ref(0)
  const workers = ref(0)
  const { running, failure, run: runJob, cancel } = useCancellableJob<ScatterOutcome>()

  const currentKey = computed(() => (project.validProject ? scatterKey(project.validProject) : null))
  const isCurrent = computed(() => summary.value !== null && summary.value.key === currentKey.value)

  const problems = computed(() => {
    const out = new Map<ScatterField, string>()
    const [low, high] = SAMPLE_LIMITS
    if (!isInteger(samples.value) || samples.value < low || samples.value > high) out.set('samples', `must be a whole number from ${low} to ${high.toLocaleString('en-US')}`)
    if (!isInteger(seed.value) || seed.value < 0 || seed.value > SEED_MAX) out.set('seed', `must be a whole number from 0 to ${SEED_MAX}`)
    const tolerances = project.validProject?.tolerances ?? {}
    if (!Object.values(tolerances).some((t) => typeof t === 'number' && t > 0)) out.set('tolerances', 'Enter at least one tolerance above zero: with none, every sample is the nominal part.')
    return out
  })

  /** Per mode number, the 5 % and 95 % frequencies, when the scatter was run on this project's part and tolerances. */
  function bandsFor(solved: Project): Map<string, readonly [number, number]> | null {
    const s = summary.value
    if (!s || s.key !== scatterKey(solved)) return null
    return new Map(s.quantiles.map((q) => [modeKey(q), [q.p05, q.p95] as const]))
  }

  async function run(): Promise<void> {
    const model = project.validProject
    const key = currentKey.value
    if (!model || key === null || problems.value.size > 0 || !isInteger(samples.value) || !isInteger(seed.value)) return
    progress.value = 0
    const request = {
      seed: seed.value,
      samples: samples.value,
      modes: model.analysis.modes,
      workers: scatterWorkerCount(globalThis.navigator?.hardwareConcurrency, samples.value),
    }
    workers.value = request.workers
    await runJob(
      (isNewest) =>
        useSolver().scatter(model, request, (fraction) => {
          if (isNewest()) progress.value = fraction
        }),
      (outcome) => {
        summary.value = {
          key,
          quantiles: scatterQuantiles(outcome.frequencies, outcome.nominal),
          samples: outcome.samples,
          seed: outcome.seed,
          workers: outcome.workers,
          tolerances: { ...(model.tolerances ?? {}) },
        }
        progress.value = 1
      },
    )
  }

  return { samples, seed, checkWithBands, summary, running, progress, workers, failure, isCurrent, problems, bandsFor, run, cancel }
})
