/**
 * The convergence study of one motion family (a long run: every mass matrix and element order
 * over eleven mesh densities) with its progress and a Cancel; and the cheap comparison of the
 * three mass matrices on the project's own mesh. Both belong to the project and family they
 * were run for and say when the part has changed since.
 */
import { defineStore } from 'pinia'
import { computed, ref, shallowRef } from 'vue'
import type { ConvergenceStudy } from '../../core/analysis/convergence'
import { analysedFamilies, type FamilyKey } from '../../core/model/families'
import { useSolver } from '../solver/solver-client'
import type { MassComparison } from '../solver/solver-tasks'
import { useCancellableJob } from '../composables/cancellable-job'
import { useProjectStore } from './project-store'
import { useViewStore } from './view-store'

export const useConvergenceStore = defineStore('convergence', () => {
  const project = useProjectStore()
  const view = useViewStore()
  const study = shallowRef<ConvergenceStudy | null>(null)
  const studyText = ref<string | null>(null)
  const progress = ref(0)
  const { running, failure, run: runJob, cancel } = useCancellableJob<ConvergenceStudy>()
  const comparison = shallowRef<MassComparison | null>(null)
  const comparisonText = ref<string | null>(null)

  /** The families the part asks for, and the one chosen (the first by default). */
  const families = computed(() => (project.validProject ? analysedFamilies(project.validProject) : []))
  const family = computed<FamilyKey | null>(() => families.value.find((f) => f.key === view.convergenceFamily)?.key ?? families.value[0]?.key ?? null)
  // A result belongs to the part and to the family it was run for.
  const currentText = computed(() => (project.validProject ? JSON.stringify([project.validProject, family.value]) : null))
  const studyIsCurrent = computed(() => study.value !== null && studyText.value === currentText.value)
  const comparisonIsCurrent = computed(() => comparison.value !== null && comparisonText.value === currentText.value)

  async function run(): Promise<void> {
    const model = project.validProject
    const text = currentText.value
    const key = family.value ?? undefined
    if (!model || text === null) return
    progress.value = 0
    await runJob(
      (isNewest) =>
        useSolver().converge(
          model,
          (fraction) => {
            if (isNewest()) progress.value = fraction
          },
          key,
        ),
      (result) => {
        study.value = result
        studyText.value = text
        progress.value = 1
      },
    )
  }

  async function compare(): Promise<void> {
    const model = project.validProject
    const text = currentText.value
    if (!model || text === null || text === comparisonText.value) return
    try {
      const result = await useSolver().compareMasses(model, family.value ?? undefined)
      if (currentText.value !== text) return
      comparison.value = result
      comparisonText.value = text
    } catch (error) {
      failure.value = error instanceof Error ? error.message : String(error)
    }
  }

  return { study, progress, running, failure, comparison, families, family, studyIsCurrent, comparisonIsCurrent, run, cancel, compare }
})
