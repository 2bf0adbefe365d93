/**
 * Forced response: a harmonic force at one point of the bar, the displacement read at another,
 * over a frequency range, with the project's modal damping. Computed in the solver worker while
 * the panel is shown, again (lightly debounced) whenever an input or the part changes. Inputs
 * left at their defaults follow the part: both points at the free end (mid-span for a bar fixed
 * at both ends), the range from 0 to 1.3 × the highest reported mode.
 */
import { defineStore } from 'pinia'
import { computed, ref, watch } from 'vue'
import { totalLength } from '../../core/model/geometry'
import type { Motion, Project } from '../../core/model/project'
import { analysedFamilies, type FamilyKey } from '../../core/model/families'
import { useSolver } from '../solver/solver-client'
import type { FrequencyAxis, ResponseResult, ResponseTaskRequest } from '../solver/design-tasks'
import { partKey } from '../solver/part-key'
import { useKeyedResult } from '../composables/keyed-result'
import { useProjectStore } from './project-store'
import { useResultsStore } from './results-store'
import { useViewStore } from './view-store'

export const DEFAULT_POINTS = 400
export const POINT_LIMITS = [10, 20_000] as const
/** The default range ends this far above the highest reported mode, so its peak shows whole. */
export const RANGE_ABOVE_HIGHEST_MODE = 1.3
const RESPONSE_DEBOUNCE_MS = 200

export type ResponseField = 'forceAt' | 'responseAt' | 'fromHz' | 'toHz' | 'points'

/**
 * Where a point load and read-out go by default, for a family (axial by default): an end free to
 * move in that family (free; for bending also guided), or mid-span when both ends are held.
 */
export function defaultResponsePoint(project: Pick<Project, 'segments' | 'ends'>, motion: Motion = 'axial'): number {
  const length = totalLength(project.segments)
  const moves = (end: 'start' | 'end') => {
    const condition = project.ends[end][motion]
    return condition === 'free' || condition === 'guided'
  }
  if (moves('end')) return length
  if (moves('start')) return 0
  return length / 2
}

const isNumber = (v: number | undefined | null): v is number => typeof v === 'number' && Number.isFinite(v)

export const useResponseStore = defineStore('response', () => {
  const project = useProjectStore()
  const results = useResultsStore()
  const view = useViewStore()
  /** Typed inputs (SI); null follows the default, undefined is an emptied field. */
  const typed = ref<Record<Exclude<ResponseField, 'points'>, number | undefined | null>>({ forceAt: null, responseAt: null, fromHz: null, toHz: null })
  const points = ref<number | undefined>(DEFAULT_POINTS)
  const axis = ref<FrequencyAxis>('log')
  /** The family chosen (null: the part's first). */
  const chosenFamily = ref<FamilyKey | null>(null)
  const families = computed(() => (project.validProject ? analysedFamilies(project.validProject) : []))
  const family = computed(() => families.value.find((f) => f.key === chosenFamily.value) ?? families.value[0] ?? null)
  const { value: result, key: resultKey, running, failure, fetch } = useKeyedResult<ResponseResult>()
  let timer: ReturnType<typeof setTimeout> | null = null

  const defaults = computed(() => {
    const model = project.validProject
    if (!model) return null
    const motion = family.value?.motion ?? 'axial'
    const at = defaultResponsePoint(model, motion)
    const highest = Math.max(0, ...(results.solved?.modes.filter((m) => m.family === family.value?.key).map((m) => m.frequencyHz) ?? []))
    return { forceAt: at, responseAt: at, fromHz: 0, toHz: highest > 0 ? RANGE_ABOVE_HIGHEST_MODE * highest : undefined }
  })

  /** The value of each input: what was typed, else the default. */
  const values = computed(() => {
    const d = defaults.value
    const pick = (field: Exclude<ResponseField, 'points'>) => (typed.value[field] === null ? d?.[field] : typed.value[field])
    return { forceAt: pick('forceAt'), responseAt: pick('responseAt'), fromHz: pick('fromHz'), toHz: pick('toHz'), points: points.value }
  })

  const problems = computed(() => {
    const out = new Map<ResponseField, string>()
    const model = project.validProject
    if (!model) return out
    const length = totalLength(model.segments)
    const v = values.value
    for (const field of ['forceAt', 'responseAt'] as const) {
      const x = v[field]
      if (!isNumber(x)) out.set(field, x === undefined ? 'is required' : 'must be a number')
      else if (x < 0 || x > length * (1 + 1e-12)) out.set(field, 'must lie on the bar, between 0 and its length')
    }
    if (!isNumber(v.fromHz)) out.set('fromHz', v.fromHz === undefined ? 'is required' : 'must be a number')
    else if (v.fromHz < 0) out.set('fromHz', 'must be ≥ 0')
    if (!isNumber(v.toHz)) out.set('toHz', v.toHz === undefined ? 'is required' : 'must be a number')
    else if (isNumber(v.fromHz) && !(v.toHz > v.fromHz)) out.set('toHz', 'must be above the lowest frequency')
    const [low, high] = POINT_LIMITS
    if (!isNumber(v.points) || !Number.isInteger(v.points) || v.points < low || v.points > high) out.set('points', `must be a whole number from ${low} to ${high}`)
    return out
  })

  const request = computed<ResponseTaskRequest | null>(() => {
    const v = values.value
    if (problems.value.size > 0 || !isNumber(v.forceAt) || !isNumber(v.responseAt) || !isNumber(v.fromHz) || !isNumber(v.toHz) || !isNumber(v.points)) return null
    return { ...(family.value ? { family: family.value.key } : {}), forceAt: v.forceAt, responseAt: v.responseAt, fromHz: v.fromHz, toHz: v.toHz, points: v.points, axis: axis.value }
  })

  /** Everything the response depends on: the part, the damping, the excitations and the request. */
  const currentKey = computed(() => {
    const model = project.validProject
    return model && request.value ? JSON.stringify([partKey(model), model.damping, model.excitations, request.value]) : null
  })
  const isCurrent = computed(() => result.value !== null && resultKey.value === currentKey.value)

  async function compute(): Promise<void> {
    const model = project.validProject
    const key = currentKey.value
    const req = request.value
    if (model && req && key !== null) await fetch(key, () => useSolver().response(model, req))
  }

  function set(field: ResponseField, value: number | undefined): void {
    if (field === 'points') points.value = value
    else typed.value = { ...typed.value, [field]: value }
  }

  /** Another family: its own default points and range (a torque on a shaft is not a force on a hanger). */
  function chooseFamily(key: FamilyKey): void {
    chosenFamily.value = key
    resetInputs()
  }

  function resetInputs(): void {
    typed.value = { forceAt: null, responseAt: null, fromHz: null, toHz: null }
    points.value = DEFAULT_POINTS
  }

  const shown = computed(() => view.activeView === 'design' && view.designPanel === 'response')
  watch(
    [shown, currentKey],
    ([isShown]) => {
      if (timer) clearTimeout(timer)
      timer = null
      if (!isShown) return
      // The first drawing comes at once; typing is let settle.
      if (result.value === null) void compute()
      else
        timer = setTimeout(() => {
          timer = null
          void compute()
        }, RESPONSE_DEBOUNCE_MS)
    },
    { immediate: true },
  )

  return { typed, points, axis, families, family, values, problems, result, running, failure, isCurrent, set, resetInputs, chooseFamily }
})
