/**
 * Sensitivities of the exact frequencies to every parameter of the part, computed in the solver
 * worker while the design view's guidance panel is shown, and again whenever the part changes.
 * They belong to the part, not to the excitations: editing those keeps them.
 */
import { defineStore } from 'pinia'
import { computed, watch } from 'vue'
import { useSolver } from '../solver/solver-client'
import type { SensitivityTable } from '../solver/design-tasks'
import { partKey } from '../solver/part-key'
import { useKeyedResult } from '../composables/keyed-result'
import { useProjectStore } from './project-store'
import { useViewStore } from './view-store'

export const useSensitivityStore = defineStore('sensitivity', () => {
  const project = useProjectStore()
  const view = useViewStore()
  const { value: table, key: tableKey, running, failure, fetch } = useKeyedResult<SensitivityTable>()

  const currentKey = computed(() => (project.validProject ? partKey(project.validProject) : null))
  const isCurrent = computed(() => table.value !== null && tableKey.value === currentKey.value)

  async function refresh(): Promise<void> {
    const model = project.validProject
    const key = currentKey.value
    if (model && key !== null) await fetch(key, () => useSolver().sensitivities(model))
  }

  const shown = computed(() => view.activeView === 'design' && view.designPanel === 'guide')
  watch(
    [shown, currentKey],
    ([isShown]) => {
      if (isShown) void refresh()
    },
    { immediate: true },
  )

  return { table, running, failure, isCurrent, refresh }
})
