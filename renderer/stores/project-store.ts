/**
 * The project being edited: the draft, its problems by field (the same rules and words as
 * the file reader), the file it belongs to, whether it is saved, and undo/redo.
 *
 * Every change goes through `edit`, which records the state before it. Typing in one field
 * (the same `key`) within a short time is one undo step, and each keystroke is applied to
 * the state before that step, so a rule like "attachments move with a segment's length"
 * sees the length the user started from, not every intermediate keystroke.
 */
import { defineStore } from 'pinia'
import { computed, ref, shallowRef } from 'vue'
import { readProjectDocument, type ProjectIssue } from '../../core/model/project-schema'
import { newProject, writeProjectText } from '../../core/model/project-file'
import type { Project } from '../../core/model/project'
import type { UnitSystem } from '../../core/model/units'

interface HistoryEntry {
  /** The draft before the step, as JSON. */
  readonly text: string
  readonly key: string | null
  at: number
}

/** Keystrokes in one field closer together than this are one undo step. */
export const COALESCE_MS = 1500
const HISTORY_LIMIT = 200

export const UNTITLED = 'Untitled project'

export const useProjectStore = defineStore('project', () => {
  const draft = ref<Project>(newProject())
  const filePath = ref<string | null>(null)
  const fileName = ref(UNTITLED)
  const undoStack = shallowRef<HistoryEntry[]>([])
  const redoStack = shallowRef<string[]>([])
  /** JSON of the draft as last opened or saved, for the dirty flag. */
  const savedText = ref(JSON.stringify(draft.value))
  /** Counts the documents loaded (New, Open, the demo, a restored recovery): what belongs to the previous one can close. */
  const loads = ref(0)

  // The draft as JSON: NaN becomes null and emptied fields vanish, exactly as a file would hold them.
  const draftText = computed(() => JSON.stringify(draft.value))
  const plainDraft = computed<unknown>(() => JSON.parse(draftText.value))
  const readResult = computed(() => readProjectDocument(plainDraft.value))
  const issues = computed<ProjectIssue[]>(() => (readResult.value.ok ? [] : readResult.value.issues))
  /** The draft as a valid project, or null while it has problems. */
  const validProject = computed<Project | null>(() => (readResult.value.ok ? readResult.value.project : null))
  const issuesByPath = computed(() => {
    const map = new Map<string, string>()
    for (const issue of issues.value) map.set(issue.path, map.has(issue.path) ? `${map.get(issue.path)}; ${issue.message}` : issue.message)
    return map
  })
  /** Rows being typed outside the draft (new masses and springs not yet confirmed): unsaved work too. */
  const pendingRows = ref(0)
  const dirty = computed(() => draftText.value !== savedText.value || pendingRows.value > 0)
  const units = computed<UnitSystem>(() => draft.value.units)
  const canUndo = computed(() => undoStack.value.length > 0)
  const canRedo = computed(() => redoStack.value.length > 0)
  /** The name shown for the document: its file, else its title. */
  const documentTitle = computed(() => (filePath.value ? fileName.value : draft.value.title?.trim() || fileName.value))

  /** The problem of one field, by its JSON path. */
  function issueAt(path: string): string | undefined {
    return issuesByPath.value.get(path)
  }

  /** Problems at a path or below it (e.g. every problem of "excitations[0].orders"). */
  function issuesUnder(path: string): ProjectIssue[] {
    return issues.value.filter((i) => i.path === path || i.path.startsWith(`${path}.`) || i.path.startsWith(`${path}[`))
  }

  /**
   * Applies one change. With a `key`, changes to the same field in quick succession form
   * one undo step and are applied to the state before that step.
   */
  function edit(change: (project: Project) => void, key: string | null = null): void {
    const now = Date.now()
    const stack = undoStack.value
    const last = stack[stack.length - 1]
    const coalesce = key !== null && last !== undefined && last.key === key && now - last.at < COALESCE_MS && redoStack.value.length === 0
    const base = JSON.parse(coalesce ? last.text : draftText.value) as Project
    if (coalesce) last.at = now
    else undoStack.value = [...stack, { text: draftText.value, key, at: now }].slice(-HISTORY_LIMIT)
    change(base)
    draft.value = base
    redoStack.value = []
  }

  function undo(): void {
    const stack = undoStack.value
    if (!stack.length) return
    const entry = stack[stack.length - 1]
    redoStack.value = [...redoStack.value, draftText.value]
    undoStack.value = stack.slice(0, -1)
    draft.value = JSON.parse(entry.text) as Project
  }

  function redo(): void {
    const stack = redoStack.value
    if (!stack.length) return
    const text = stack[stack.length - 1]
    undoStack.value = [...undoStack.value, { text: draftText.value, key: null, at: 0 }]
    redoStack.value = stack.slice(0, -1)
    draft.value = JSON.parse(text) as Project
  }

  /** Replaces the document (New, Open, the demo, a restored recovery); history starts afresh. */
  function load(project: Project, source: { path: string | null; name: string; dirty?: boolean }): void {
    draft.value = JSON.parse(JSON.stringify(project)) as Project
    filePath.value = source.path
    fileName.value = source.name
    undoStack.value = []
    redoStack.value = []
    savedText.value = source.dirty ? '' : draftText.value
    loads.value++
  }

  /** The document is now the file at `path`, holding `savedDraft` (the draft as it was written; edits since stay unsaved). */
  function markSaved(path: string, name: string, savedDraft: string = draftText.value): void {
    filePath.value = path
    fileName.value = name
    savedText.value = savedDraft
  }

  /** The file text of the draft, or null while it has problems. */
  function fileText(): string | null {
    return validProject.value ? writeProjectText(validProject.value) : null
  }

  function setUnits(system: UnitSystem): void {
    if (draft.value.units !== system) edit((p) => (p.units = system), 'units')
  }

  return {
    draft,
    filePath,
    fileName,
    draftText,
    issues,
    validProject,
    dirty,
    units,
    canUndo,
    canRedo,
    documentTitle,
    loads,
    pendingRows,
    issueAt,
    issuesUnder,
    edit,
    undo,
    redo,
    load,
    markSaved,
    fileText,
    setUnits,
  }
})
