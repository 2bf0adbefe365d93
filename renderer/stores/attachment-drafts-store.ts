/**
 * New point masses and springs while they are being typed. A new row is a draft kept here,
 * outside the project: the solve, the drawing, the file and undo never see it, so the results
 * do not jump on a half-typed value. Confirming checks the row by the file's own rules and adds
 * it to the part as one edit; discarding drops it. Opening another document drops every draft;
 * while one is open the document counts as changed, so closing asks first.
 */
import { defineStore } from 'pinia'
import { ref, watch } from 'vue'
import { readProjectDocument } from '../../core/model/project-schema'
import type { Motion } from '../../core/model/project'
import * as edits from './project-edits'
import { useProjectStore } from './project-store'

export type DraftField = 'at' | 'value' | 'label'

export interface AttachmentDraft {
  readonly id: number
  /** SI; undefined while empty, NaN for text that is not a number. */
  at: number | undefined
  value: number | undefined
  label: string
  /** A spring's family (axial unless chosen). */
  motion: Motion
  /** Fields whose problems are shown: typed in, or all of them after a confirm that was refused. */
  shown: DraftField[]
}

const FIELD_OF_PATH: Record<string, DraftField> = { at: 'at', mass: 'value', stiffness: 'value', label: 'label', rotationalStiffness: 'value' }

export const useAttachmentDraftsStore = defineStore('attachment-drafts', () => {
  const project = useProjectStore()
  const drafts = ref<Record<edits.AttachmentList, AttachmentDraft[]>>({ masses: [], springs: [] })
  let nextId = 1

  function find(list: edits.AttachmentList, id: number): AttachmentDraft | undefined {
    return drafts.value[list].find((d) => d.id === id)
  }

  /** Starts a draft row; returns its id. */
  function add(list: edits.AttachmentList): number {
    const start = edits.attachmentStart(project.draft, list, drafts.value[list].length)
    const draft: AttachmentDraft = { id: nextId++, at: start.at, value: undefined, label: start.label, motion: 'axial', shown: [] }
    drafts.value[list].push(draft)
    return draft.id
  }

  function update(list: edits.AttachmentList, id: number, field: DraftField, value: number | string | undefined): void {
    const draft = find(list, id)
    if (!draft) return
    if (field === 'label') draft.label = String(value ?? '')
    else draft[field] = value as number | undefined
    if (!draft.shown.includes(field)) draft.shown.push(field)
  }

  /** A spring draft's family. */
  function setMotion(id: number, motion: Motion): void {
    const draft = find('springs', id)
    if (draft) draft.motion = motion
  }

  /** The draft's problems by field, in the file reader's words, as if it were added to the part now. */
  function problems(list: edits.AttachmentList, id: number): Map<DraftField, string> {
    const out = new Map<DraftField, string>()
    const draft = find(list, id)
    if (!draft) return out
    const candidate = JSON.parse(project.draftText) as Parameters<typeof edits.addAttachment>[0]
    edits.addAttachment(candidate, list, draft)
    const read = readProjectDocument(JSON.parse(JSON.stringify(candidate)))
    if (read.ok) return out
    const prefix = `${list}[${candidate[list].length - 1}]`
    for (const issue of read.issues) {
      if (issue.path !== prefix && !issue.path.startsWith(`${prefix}.`)) continue
      const field = FIELD_OF_PATH[issue.path.slice(prefix.length + 1)] ?? 'value'
      out.set(field, out.has(field) ? `${out.get(field)}; ${issue.message}` : issue.message)
    }
    return out
  }

  /** The problem to show beside a field: only once the field was typed in (or a confirm was refused). */
  function shownProblem(list: edits.AttachmentList, id: number, field: DraftField): string | undefined {
    const draft = find(list, id)
    return draft?.shown.includes(field) ? problems(list, id).get(field) : undefined
  }

  /** Adds the draft to the part (one undoable edit) if its values pass the file's rules; else shows its problems. */
  function confirm(list: edits.AttachmentList, id: number): boolean {
    const draft = find(list, id)
    if (!draft) return false
    if (problems(list, id).size > 0) {
      draft.shown = ['at', 'value', 'label']
      return false
    }
    project.edit((p) => edits.addAttachment(p, list, draft))
    discard(list, id)
    return true
  }

  function discard(list: edits.AttachmentList, id: number): void {
    drafts.value[list] = drafts.value[list].filter((d) => d.id !== id)
  }

  watch(
    () => project.loads,
    () => (drafts.value = { masses: [], springs: [] }),
  )
  // A draft is unsaved work: the document counts as changed (and closing asks) while one is open.
  watch(
    () => drafts.value.masses.length + drafts.value.springs.length,
    (count) => (project.pendingRows = count),
    { flush: 'sync' },
  )

  return { drafts, add, update, setMotion, problems, shownProblem, confirm, discard }
})
