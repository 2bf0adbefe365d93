/**
 * The convergence study (a long run: every mass matrix and element order over eleven mesh
 * densities) with its progress and a Cancel; and the cheap comparison of the three mass
 * matrices on the project's own mesh. Both belong to the project they were run on and say
 * when the part has changed since.
 */
import { defineStore } from 'pinia'
import { computed, ref, shallowRef } from 'vue'
import type { ConvergenceStudy } from '../../core/analysis/convergence'
import { SolverCancelled, useSolver, type CancellableJob } from '../solver/solver-client'
import type { MassComparison } from '../solver/solver-tasks'
import { useProjectStore } from './project-store'

export const useConvergenceStore = defineStore('convergence', () => {
  const project = useProjectStore()
  const study = shallowRef<ConvergenceStudy | null>(null)
  const studyText = ref<string | null>(null)
  const progress = ref(0)
  const running = ref(false)
  const failure = ref<string | null>(null)
  const comparison = shallowRef<MassComparison | null>(null)
  const comparisonText = ref<string | null>(null)
  let job: CancellableJob<ConvergenceStudy> | null = null

  const currentText = computed(() => (project.validProject ? JSON.stringify(project.validProject) : null))
  const studyIsCurrent = computed(() => study.value !== null && studyText.value === currentText.value)
  const comparisonIsCurrent = computed(() => comparison.value !== null && comparisonText.value === currentText.value)

  async function run(): Promise<void> {
    const model = project.validProject
    const text = currentText.value
    if (!model || text === null) return
    cancel()
    running.value = true
    progress.value = 0
    failure.value = null
    const thisJob = useSolver().converge(model, (fraction) => {
      if (job === thisJob) progress.value = fraction
    })
    job = thisJob
    try {
      const result = await thisJob.result
      if (job !== thisJob) return
      study.value = result
      studyText.value = text
      progress.value = 1
    } catch (error) {
      if (job === thisJob && !(error instanceof SolverCancelled)) failure.value = error instanceof Error ? error.message : String(error)
    } finally {
      if (job === thisJob) {
        job = null
        running.value = false
      }
    }
  }

  function cancel(): void {
    if (!job) return
    const stopping = job
    job = null
    running.value = false
    stopping.cancel()
  }

  async function compare(): Promise<void> {
    const model = project.validProject
    const text = currentText.value
    if (!model || text === null || text === comparisonText.value) return
    try {
      const result = await useSolver().compareMasses(model)
      if (currentText.value !== text) return
      comparison.value = result
      comparisonText.value = text
    } catch (error) {
      failure.value = error instanceof Error ? error.message : String(error)
    }
  }

  return { study, progress, running, failure, comparison, studyIsCurrent, comparisonIsCurrent, run, cancel, compare }
})
