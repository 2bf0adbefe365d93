/** What the window shows: the view, the theme, selections and open panels. No project data. */
import { defineStore } from 'pinia'
import { computed, ref, watch } from 'vue'
import type { ConvergenceAxis } from '../../core/charts/convergence-chart'
import type { FamilyKey } from '../../core/model/families'
import type { ShapeLower } from '../charts/family-shape-chart'
import { useProjectStore } from './project-store'

export type ViewName = 'part' | 'modes' | 'resonance' | 'convergence' | 'design'
export type ThemePreference = 'system' | 'light' | 'dark'
/** The panels of the design view: sensitivities with the tuner, tolerance scatter, forced response. */
export type DesignPanel = 'guide' | 'scatter' | 'response'

export const VIEWS: readonly { name: ViewName; title: string }[] = [
  { name: 'part', title: 'Part' },
  { name: 'modes', title: 'Modes' },
  { name: 'resonance', title: 'Resonance' },
  { name: 'convergence', title: 'Convergence' },
  { name: 'design', title: 'Design' },
]

export const DESIGN_PANELS: readonly { name: DesignPanel; title: string }[] = [
  { name: 'guide', title: 'What moves each mode' },
  { name: 'scatter', title: 'Tolerance bands' },
  { name: 'response', title: 'Forced response' },
]

const THEME_KEY = 'rodwave.theme'

function storedTheme(): ThemePreference {
  try {
    const value = globalThis.localStorage?.getItem(THEME_KEY)
    return value === 'light' || value === 'dark' ? value : 'system'
  } catch {
    return 'system'
  }
}

export const useViewStore = defineStore('view', () => {
  const activeView = ref<ViewName>('modes')
  const themePreference = ref<ThemePreference>(storedTheme())
  const query = typeof window !== 'undefined' && typeof window.matchMedia === 'function' ? window.matchMedia('(prefers-color-scheme: dark)') : null
  const systemDark = ref(query?.matches ?? false)
  query?.addEventListener('change', (event) => (systemDark.value = event.matches))
  const dark = computed(() => (themePreference.value === 'system' ? systemDark.value : themePreference.value === 'dark'))
  watch(themePreference, (value) => {
    try {
      globalThis.localStorage?.setItem(THEME_KEY, value)
    } catch {
      // Private windows may refuse storage; the choice then lasts for this session.
    }
  })

  const selectedSegment = ref<number | null>(null)
  /** Modes ticked for the mode-shape chart (indices into the solved modes); none: the first of the chart's family. */
  const selectedModes = ref<number[]>([])
  const lowerQuantity = ref<ShapeLower>('stress')
  /** The family the modes table shows ('all': every analysed family). */
  const modesFamily = ref<FamilyKey | 'all'>('all')
  /** The family of the mode-shape chart and the animation (null: the table's, or that of the first plotted mode). */
  const shapeFamily = ref<FamilyKey | null>(null)
  /** The family the convergence study and the mass comparison are run for (null: the first analysed). */
  const convergenceFamily = ref<FamilyKey | null>(null)
  const convergenceMode = ref<number | null>(null)
  const convergenceAxis = ref<ConvergenceAxis>('elements')
  const conflictsOnly = ref(false)
  const designPanel = ref<DesignPanel>('guide')
  /** The mode whose sensitivities are listed, by its key ("bending 1"; null: the first elastic one). */
  const sensitivityMode = ref<string | null>(null)
  const warningsOpen = ref(false)
  const cautionsOpen = ref(false)
  // The warnings panel belongs to the moment it was opened: another view or another document closes it.
  watch(activeView, () => (warningsOpen.value = false))
  watch(
    () => useProjectStore().loads,
    () => (warningsOpen.value = false),
  )

  function cycleTheme(): void {
    const order: ThemePreference[] = ['system', 'light', 'dark']
    themePreference.value = order[(order.indexOf(themePreference.value) + 1) % order.length]
  }

  function toggleMode(index: number): void {
    const set = new Set(selectedModes.value)
    if (set.has(index)) set.delete(index)
    else set.add(index)
    selectedModes.value = [...set].sort((a, b) => a - b)
  }

  return {
    activeView,
    themePreference,
    dark,
    selectedSegment,
    selectedModes,
    lowerQuantity,
    modesFamily,
    shapeFamily,
    convergenceFamily,
    convergenceMode,
    convergenceAxis,
    conflictsOnly,
    designPanel,
    sensitivityMode,
    warningsOpen,
    cautionsOpen,
    cycleTheme,
    toggleMode,
  }
})
