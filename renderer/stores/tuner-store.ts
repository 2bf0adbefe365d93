/**
 * The tuner: one parameter between bounds, chosen to put a mode on a target frequency or to make
 * the smallest separation from every excitation as large as possible. The search runs on a worker
 * of its own (Cancel stops it); its result is only a proposal until the user accepts it, and
 * accepting is one edit of the project, undone like any other.
 */
import { defineStore } from 'pinia'
import { computed, ref, shallowRef, watch } from 'vue'
import { designParameters, withParameter, type DesignParameter } from '../../core/analysis/design-parameters'
import type { TuneRequest, TuneResult } from '../../core/analysis/tuner'
import type { Motion, Project } from '../../core/model/project'
import type { QuantityKind } from '../../core/model/units'
import { useSolver } from '../solver/solver-client'
import { useCancellableJob } from '../composables/cancellable-job'
import { useProjectStore } from './project-store'

export type TuneGoal = 'separation' | 'target'

/** Default bounds: ±30 % of the current value. */
export const DEFAULT_SPAN = 0.3
/** A bore is kept below this fraction of its outer diameter (and an outer diameter above the bore by as much): a wall must remain. */
const SMALLEST_WALL_RATIO = 0.95

/** Bounds a tube's wall keeps within, [lowest, highest] (SI), or null where any positive value will do. */
function wallLimits(project: Project, parameter: DesignParameter): [number, number] | null {
  const target = parameter.target
  if (target.kind !== 'sectionDimension') return null
  const section = project.segments[target.segment]?.section
  if (section?.shape !== 'tube') return null
  if (target.dimension === 'innerDiameter') return [0, SMALLEST_WALL_RATIO * section.outerDiameter]
  return [section.innerDiameter / SMALLEST_WALL_RATIO, Infinity]
}

/** ±30 % of the value, kept where a tube still has a wall. */
export function defaultBounds(project: Project, parameter: DesignParameter): [number, number] {
  const limits = wallLimits(project, parameter) ?? [0, Infinity]
  return [Math.max((1 - DEFAULT_SPAN) * parameter.value, limits[0]), Math.min((1 + DEFAULT_SPAN) * parameter.value, limits[1])]
}

export type TunerField = 'min' | 'max' | 'target' | 'goal'

const isNumber = (v: number | undefined): v is number => typeof v === 'number' && Number.isFinite(v)

export const useTunerStore = defineStore('tuner', () => {
  const project = useProjectStore()
  const parameterPath = ref<string | null>(null)
  /** Bounds typed by the user (SI); null follows the default ±30 %, undefined is an emptied field. */
  const typedMin = ref<number | undefined | null>(null)
  const typedMax = ref<number | undefined | null>(null)
  const goal = ref<TuneGoal>('separation')
  const mode = ref(1)
  /** The family the search looks at ('all': every analysed family's separation; a target mode is then of the first). */
  const motion = ref<Motion | 'all'>('all')
  const targetHz = ref<number | undefined>(undefined)
  const result = shallowRef<TuneResult | null>(null)
  /** The project (as JSON) the result was found for. */
  const resultText = ref<string | null>(null)
  // A tuner that finds no answer says why in its message (TuneError): the failure shows it as it is.
  const { running, failure, run: runJob, cancel } = useCancellableJob<TuneResult>()
  /** The last accepted change, in words for the screen. */
  const applied = ref<{ label: string; quantity: QuantityKind; before: number; after: number } | null>(null)

  const currentText = computed(() => (project.validProject ? JSON.stringify(project.validProject) : null))
  const parameters = computed<DesignParameter[]>(() => (project.validProject ? designParameters(project.validProject) : []))
  const parameter = computed<DesignParameter | null>(() => parameters.value.find((p) => p.path === parameterPath.value) ?? parameters.value[0] ?? null)
  const bounds = computed<[number | undefined, number | undefined]>(() => {
    const p = parameter.value
    const model = project.validProject
    const fallback = p && model ? defaultBounds(model, p) : [undefined, undefined]
    return [typedMin.value === null ? fallback[0] : typedMin.value, typedMax.value === null ? fallback[1] : typedMax.value]
  })
  const isCurrent = computed(() => result.value !== null && resultText.value === currentText.value)

  /** What stops a search, by field, in words. */
  const problems = computed(() => {
    const out = new Map<TunerField, string>()
    const p = parameter.value
    const model = project.validProject
    if (!p || !model) return out
    const [min, max] = bounds.value
    if (!isNumber(min)) out.set('min', min === undefined ? 'is required' : 'must be a number')
    else if (!(min > 0)) out.set('min', 'must be > 0')
    if (!isNumber(max)) out.set('max', max === undefined ? 'is required' : 'must be a number')
    else if (isNumber(min) && !(max > min)) out.set('max', 'must be greater than the lower bound')
    const limits = wallLimits(model, p)
    if (limits && isNumber(max) && max > limits[1]) out.set('max', 'must stay below the outer diameter: the tube needs a wall')
    if (limits && isNumber(min) && min < limits[0]) out.set('min', 'must stay above the bore: the tube needs a wall')
    if (goal.value === 'target') {
      if (!isNumber(targetHz.value)) out.set('target', targetHz.value === undefined ? 'is required' : 'must be a number')
      else if (!(targetHz.value > 0)) out.set('target', 'must be > 0')
    } else if (model.excitations.length === 0) {
      out.set('goal', 'The project has no excitations to keep clear of: enter them on the Resonance view, or put a mode on a target frequency instead.')
    }
    return out
  })

  function choose(path: string): void {
    if (path === parameter.value?.path) return
    parameterPath.value = path
    typedMin.value = null
    typedMax.value = null
  }

  function setBound(which: 'min' | 'max', value: number | undefined): void {
    if (which === 'min') typedMin.value = value
    else typedMax.value = value
  }

  /** Searches a parameter over a suggested range (kept where a tube still has a wall), for the best separation. */
  async function searchOver(path: string, range: readonly [number, number]): Promise<void> {
    const model = project.validProject
    const p = parameters.value.find((q) => q.path === path)
    if (!model || !p) return
    const [lowest, highest] = wallLimits(model, p) ?? [0, Infinity]
    parameterPath.value = path
    typedMin.value = Math.max(range[0], lowest)
    typedMax.value = Math.min(range[1], highest)
    goal.value = 'separation'
    await run()
  }

  async function run(): Promise<void> {
    const model = project.validProject
    const text = currentText.value
    const p = parameter.value
    const [min, max] = bounds.value
    if (!model || text === null || !p || problems.value.size > 0 || !isNumber(min) || !isNumber(max)) return
    result.value = null
    applied.value = null
    const request: TuneRequest = {
      parameter: p.path,
      min,
      max,
      modes: model.analysis.modes,
      ...(motion.value !== 'all' && model.motions.includes(motion.value) ? { motion: motion.value } : {}),
      ...(goal.value === 'target' ? { mode: mode.value, targetHz: targetHz.value } : {}),
    }
    await runJob(
      () => useSolver().tune(model, request),
      (found) => {
        result.value = found
        resultText.value = text
      },
    )
  }

  /** Applies the value found: one edit, so one undo brings the part back exactly. */
  function accept(): void {
    const found = result.value
    const p = parameters.value.find((q) => q.path === found?.parameter)
    if (!found || !p || !isCurrent.value) return
    project.edit((draft) => Object.assign(draft, withParameter(draft, p.target, found.value)))
    applied.value = { label: p.label, quantity: p.quantity, before: p.value, after: found.value }
    result.value = null
  }

  function discard(): void {
    result.value = null
    failure.value = null
  }

  // A mode beyond the reported ones cannot be targeted.
  watch(
    () => project.validProject?.analysis.modes,
    (modes) => {
      if (modes !== undefined && mode.value > modes) mode.value = modes
    },
  )

  return {
    parameterPath,
    goal,
    mode,
    motion,
    targetHz,
    result,
    running,
    failure,
    applied,
    parameters,
    parameter,
    bounds,
    isCurrent,
    problems,
    choose,
    setBound,
    searchOver,
    run,
    cancel,
    accept,
    discard,
  }
})
