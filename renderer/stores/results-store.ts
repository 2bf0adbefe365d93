/**
 * The modes of the project on screen. Every valid change of the draft is solved again,
 * lightly debounced, in the solver worker; while the draft has problems the last valid
 * results stay up, marked as such. Also the resonance check on the basis chosen (the exact
 * frequencies, or the tolerance bands of a scatter of this part) and the plain-language
 * warnings every screen can reach.
 */
import { defineStore } from 'pinia'
import { computed, ref, shallowRef, watch } from 'vue'
import type { Project } from '../../core/model/project'
import { resonancePairs, type ResonancePair } from '../../core/analysis/resonance'
import { checkedFrequency, pairSentence } from '../../core/charts/interference-chart'
import { figure } from '../../core/charts/chart-text'
import { SolverSuperseded, useSolver } from '../solver/solver-client'
import type { SolvedModel, SolveRefusal } from '../solver/solver-tasks'
import { familyPairSentence, modeName } from '../format/motion'
import { useProjectStore } from './project-store'
import { useScatterStore } from './scatter-store'

/** Wait this long after the last keystroke before solving. */
export const SOLVE_DEBOUNCE_MS = 120

/** A reported frequency further than this from the exact reference asks for a finer mesh. */
export const MESH_ERROR_NOTE = 0.01

/** What the resonance check rests on: the nominal (exact where known) frequencies, or each mode's tolerance band. */
export type ResonanceBasis = 'nominal' | 'bands'

export type WarningLevel = 'conflict' | 'problem' | 'note'

export interface ScreenWarning {
  readonly level: WarningLevel
  readonly text: string
  /** The view that shows it. */
  readonly view: 'part' | 'modes' | 'resonance' | 'convergence' | 'design'
}

/** Analysis warnings that inform rather than question the results. */
const NOTE_CODES = new Set<string>(['stubby-segment', 'excitation-unanalysed', 'compression-unchecked'])

export const useResultsStore = defineStore('results', () => {
  const project = useProjectStore()
  const scatter = useScatterStore()
  const solved = shallowRef<SolvedModel | null>(null)
  const solving = ref(false)
  const failure = ref<string | null>(null)
  /** JSON of the project the results belong to. */
  const solvedText = ref<string | null>(null)
  /** The analysis's refusal of a part (a compression past the buckling load), and the JSON of that part. */
  const refused = shallowRef<(SolveRefusal & { readonly text: string }) | null>(null)
  let timer: ReturnType<typeof setTimeout> | null = null
  let generation = 0

  const current = computed(() => (project.validProject ? JSON.stringify(project.validProject) : null))
  /** The results are of an older model than the one on screen (it has problems, the analysis refused it, or a solve is on its way). */
  const stale = computed(() => solved.value !== null && solvedText.value !== current.value)
  /** The refusal of the part on screen, if the analysis refused it: its path and message. */
  const inputProblem = computed<SolveRefusal | null>(() => (refused.value && refused.value.text === current.value ? refused.value : null))

  async function solveNow(model: Project, text: string): Promise<void> {
    const ticket = ++generation
    solving.value = true
    try {
      const outcome = await useSolver().solve(model)
      if (ticket !== generation) return
      failure.value = null
      if (!outcome.ok) {
        // The last valid results stay up, marked as such; the refusal is shown beside its field.
        refused.value = { ...outcome.refusal, text }
        return
      }
      refused.value = null
      solved.value = outcome.model
      solvedText.value = text
    } catch (error) {
      if (error instanceof SolverSuperseded || ticket !== generation) return
      failure.value = error instanceof Error ? error.message : String(error)
    } finally {
      if (ticket === generation) solving.value = false
    }
  }

  /** Solves the current model now (the debounce is for typing; loading a file wants its results at once). */
  function solveCurrent(): Promise<void> {
    if (timer) clearTimeout(timer)
    timer = null
    const model = project.validProject
    const text = current.value
    if (!model || text === null || text === solvedText.value || text === refused.value?.text) return Promise.resolve()
    return solveNow(model, text)
  }

  watch(current, (text) => {
    if (timer) clearTimeout(timer)
    if (text === null || text === solvedText.value || text === refused.value?.text) return
    timer = setTimeout(() => {
      timer = null
      void solveCurrent()
    }, SOLVE_DEBOUNCE_MS)
  })

  /** The lowest elastic mode of every analysed family: the first to meet a rising excitation. */
  const firstElastic = computed(() => {
    let best = null as SolvedModel['modes'][number] | null
    for (const m of solved.value?.modes ?? []) if (!m.rigidBody && (!best || m.frequencyHz < best.frequencyHz)) best = m
    return best
  })
  /** Tolerance bands of this very part, when the check is asked to use them. */
  const checkBands = computed(() => (solved.value && scatter.checkWithBands ? scatter.bandsFor(solved.value.project) : null))
  const resonanceBasis = computed<ResonanceBasis>(() => (checkBands.value ? 'bands' : 'nominal'))
  /** Every mode–excitation pair on the basis in use. */
  const resonance = computed<ResonancePair[]>(() => {
    const s = solved.value
    if (!s) return []
    const bands = checkBands.value
    return bands ? resonancePairs(s.modes.map((m) => ({ ...m, frequencyHz: checkedFrequency(m) })), s.project, bands) : s.resonance
  })
  const conflicts = computed(() => resonance.value.filter((p) => p.status === 'conflict'))
  /** The pair with the smallest separation of all, the one to look at first. */
  const closestPair = computed(() => {
    let best = null as ResonancePair | null
    for (const p of resonance.value) if (!best || Math.abs(p.separation) < Math.abs(best.separation)) best = p
    return best
  })

  const warnings = computed<ScreenWarning[]>(() => {
    const list: ScreenWarning[] = []
    const problems = project.issues.length
    if (problems > 0) {
      list.push({
        level: 'problem',
        text: `The part has ${problems} problem${problems === 1 ? '' : 's'} to fix; the results shown are for the last valid model.`,
        view: 'part',
      })
    }
    if (inputProblem.value) {
      list.push({ level: 'problem', text: `The part cannot be analysed as it is (${inputProblem.value.path}): ${inputProblem.value.message} The results shown are for the last valid model.`, view: 'part' })
    }
    if (failure.value) list.push({ level: 'problem', text: `The solver stopped: ${failure.value}`, view: 'modes' })
    const result = solved.value
    if (!result) return list
    // Closest first: the pair most likely to resonate leads the list and the banner.
    const byCloseness = [...conflicts.value].sort((a, b) => Math.abs(a.separation) - Math.abs(b.separation))
    for (const pair of byCloseness) list.push({ level: 'conflict', text: familyPairSentence(pairSentence(pair), pair), view: 'resonance' })
    if (scatter.checkWithBands && !checkBands.value) {
      list.push({
        level: 'note',
        text: 'The check was asked to use tolerance bands, but none are current for this part: it uses the nominal frequencies until the scatter is run again.',
        view: 'design',
      })
    }
    if (result.project.excitations.length === 0) {
      list.push({ level: 'note', text: 'No excitations entered: the modes have not been checked against the machines nearby.', view: 'resonance' })
    }
    for (const w of result.modelWarnings) list.push({ level: NOTE_CODES.has(w.code) ? 'note' : 'problem', text: w.message, view: w.code === 'buckling-proximity' ? 'part' : 'modes' })
    for (const m of result.modes) {
      if (m.errorVsReference !== null && Math.abs(m.errorVsReference) > MESH_ERROR_NOTE) {
        const method = result.families.find((f) => f.key === m.family)?.reference.method
        const name = modeName(m)
        list.push({
          level: 'note',
          text: `${name.charAt(0).toUpperCase()}${name.slice(1)} is ${figure(Math.abs(100 * m.errorVsReference), 2)} % from the ${method === 'extrapolated' ? 'extrapolated reference' : 'exact solution'} on this mesh; ${m.motion === 'bending' ? 'a finer mesh' : 'a finer mesh or 3-node elements'} would close the gap.`,
          view: 'convergence',
        })
      }
    }
    return list
  })

  return { solved, solving, failure, stale, inputProblem, firstElastic, resonance, resonanceBasis, conflicts, closestPair, warnings, solveCurrent }
})
