// @vitest-environment happy-dom
/**
 * New point masses and springs start as drafts: the solve (the project's valid model and its
 * JSON) does not see them until they are confirmed, their problems use the file reader's own
 * words, and confirming is one undoable edit. Also: the warnings panel closes on another view,
 * another document and Escape. The demo project is a fixture for interface behaviour only;
 * expected frequencies come from the engine (core) for the same part.
 */
import { beforeEach, describe, expect, it } from 'vitest'
import { mount } from '@vue/test-utils'
import { readProjectText } from '../../core/model/project-schema'
import { analyseProject } from '../../core/analysis/modal-analysis'
import { useProjectStore } from '../../renderer/stores/project-store'
import { useAttachmentDraftsStore } from '../../renderer/stores/attachment-drafts-store'
import { useResultsStore } from '../../renderer/stores/results-store'
import { useViewStore } from '../../renderer/stores/view-store'
import PartAttachmentsTable from '../../renderer/components/PartAttachmentsTable.vue'
import { DEMO_TEXT, freshApp, settle } from './renderer-helpers'

function demo() {
  const read = readProjectText(DEMO_TEXT)
  if (!read.ok) throw new Error('the demo fixture must be valid')
  return read.project
}

/** What the file reader says at `path` when the demo gets this spring. */
function fileMessage(spring: Record<string, unknown>, path: string): string {
  const doc = JSON.parse(DEMO_TEXT) as { springs: unknown[] }
  doc.springs.push(spring)
  const read = readProjectText(JSON.stringify(doc))
  const messages = read.ok ? [] : read.issues.filter((i) => i.path === path).map((i) => i.message)
  if (!messages.length) throw new Error(`the file reader found no problem at ${path}`)
  return messages.join('; ')
}

describe('draft attachments', () => {
  beforeEach(() => {
    freshApp()
    useProjectStore().load(demo(), { path: null, name: 'demo' })
  })

  it('keep a new spring out of the model, and so out of the solve, until it is confirmed', async () => {
    const project = useProjectStore()
    const results = useResultsStore()
    const drafts = useAttachmentDraftsStore()
    await results.solveCurrent()
    const first = results.firstElastic!.frequencyHz
    const modelBefore = JSON.stringify(project.validProject)

    const id = drafts.add('springs')
    // The free end, where the issue's 1e7 N/m spring moved mode 1 before anything was typed.
    expect(drafts.drafts.springs[0]).toMatchObject({ at: 2.91, value: undefined, label: 'Spring 1' })
    drafts.update('springs', id, 'value', 1e7)
    expect(JSON.stringify(project.validProject)).toBe(modelBefore)
    // Unsaved work all the same: closing would ask.
    expect(project.dirty).toBe(true)
    await results.solveCurrent()
    expect(results.firstElastic!.frequencyHz).toBe(first)

    expect(drafts.confirm('springs', id)).toBe(true)
    expect(drafts.drafts.springs).toEqual([])
    expect(project.draft.springs).toEqual([{ at: 2.91, stiffness: 1e7, label: 'Spring 1' }])
    await results.solveCurrent()
    const withSpring = demo()
    withSpring.springs.push({ at: 2.91, stiffness: 1e7, label: 'Spring 1' })
    expect(results.firstElastic!.frequencyHz).toBe(analyseProject(withSpring).modes[0].frequencyHz)
    expect(results.firstElastic!.frequencyHz).toBeGreaterThan(first)
    // One edit: one undo takes it out again.
    project.undo()
    expect(project.draft.springs).toEqual([])
  })

  it('refuse to confirm a draft that breaks the file’s rules, with the file reader’s words by field', () => {
    const drafts = useAttachmentDraftsStore()
    const project = useProjectStore()
    const id = drafts.add('springs')
    // Nothing shown until a field is typed in or a confirm is refused.
    expect(drafts.shownProblem('springs', id, 'value')).toBeUndefined()
    expect(drafts.confirm('springs', id)).toBe(false)
    expect(drafts.shownProblem('springs', id, 'value')).toBe(fileMessage({ at: 2.91, label: 'Spring 1' }, 'springs[0].stiffness'))
    drafts.update('springs', id, 'value', 5e6)
    drafts.update('springs', id, 'at', 4)
    expect(drafts.shownProblem('springs', id, 'at')).toBe(fileMessage({ at: 4, stiffness: 5e6 }, 'springs[0].at'))
    expect(drafts.confirm('springs', id)).toBe(false)
    expect(project.draft.springs).toEqual([])
    drafts.discard('springs', id)
    expect(drafts.drafts.springs).toEqual([])
    expect(project.dirty).toBe(false)
  })

  it('are dropped when another document is opened', async () => {
    const drafts = useAttachmentDraftsStore()
    drafts.add('masses')
    useProjectStore().load(demo(), { path: '/x.rodwave.json', name: 'x.rodwave.json' })
    await settle(1)
    expect(drafts.drafts.masses).toEqual([])
  })

  it('show in the table as a draft with Confirm and Discard, and Enter in the size confirms', async () => {
    const drafts = useAttachmentDraftsStore()
    const project = useProjectStore()
    const id = drafts.add('masses')
    const wrapper = mount(PartAttachmentsTable, {
      props: {
        list: 'masses',
        items: project.draft.masses,
        drafts: drafts.drafts.masses,
        units: 'SI',
        issueAt: () => undefined,
        draftIssue: (draftId: number, field: 'at' | 'value' | 'label') => drafts.shownProblem('masses', draftId, field),
        onDraftUpdate: (draftId: number, field: 'at' | 'value' | 'label', v: number | string | undefined) => drafts.update('masses', draftId, field, v),
        onConfirm: (draftId: number) => drafts.confirm('masses', draftId),
      },
    })
    expect(wrapper.find('[data-testid="masses-draft-0"]').exists()).toBe(true)
    expect(wrapper.text()).toContain('Not in the results until you confirm it')
    expect(wrapper.get('[data-testid="masses-draft-0-confirm"]').text()).toContain('Confirm')
    expect(wrapper.get('[data-testid="masses-draft-0-discard"]').text()).toBe('Discard')
    const input = wrapper.get('[data-testid="masses-draft-0-mass"]')
    await input.trigger('focus')
    await input.setValue('10')
    await input.trigger('keydown', { key: 'Enter' })
    await settle()
    expect(drafts.drafts.masses.some((d) => d.id === id)).toBe(false)
    expect(project.draft.masses.at(-1)).toEqual({ at: 2.91, mass: 10, label: 'Mass 3' })
  })
})

describe('the warnings panel', () => {
  beforeEach(() => {
    freshApp()
    useProjectStore().load(demo(), { path: null, name: 'demo' })
  })

  it('closes when the view changes and when another document is opened', async () => {
    const view = useViewStore()
    view.warningsOpen = true
    view.activeView = 'part'
    await settle(1)
    expect(view.warningsOpen).toBe(false)
    view.warningsOpen = true
    useProjectStore().load(demo(), { path: '/y.rodwave.json', name: 'y.rodwave.json' })
    await settle(1)
    expect(view.warningsOpen).toBe(false)
  })
})
