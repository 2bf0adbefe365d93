// @vitest-environment happy-dom
/**
 * Files and commands through the bridge, with an in-memory bridge and the in-page solver:
 * the demo opens solved, a bad file is refused whole with its problems and the model on
 * screen stays as it was, saving writes the project file and clears the recovery copy,
 * unsaved work is written for recovery, menu commands run, exports carry the right content.
 * Expected values come from core itself (analyseProject, readProjectText, writeProjectText,
 * modalSummaryCsv): these tests check the window's plumbing, not the engine.
 */
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { analyseProject } from '../../core/analysis/modal-analysis'
import { modalSummaryCsv } from '../../core/analysis/modal-summary'
import { readProjectText, validateProject } from '../../core/model/project-schema'
import { writeProjectText } from '../../core/model/project-file'
import { AUTOSAVE_MS, useFileStore } from '../../renderer/stores/file-store'
import { useProjectStore } from '../../renderer/stores/project-store'
import { useResultsStore } from '../../renderer/stores/results-store'
import { useViewStore } from '../../renderer/stores/view-store'
import * as edits from '../../renderer/stores/project-edits'
import { useSolver } from '../../renderer/solver/solver-client'
import { decodeProjectBytes } from '../../core/model/project-bytes'
import AppHeader from '../../renderer/components/AppHeader.vue'
import { mount } from '@vue/test-utils'
import { DEMO_TEXT, freshApp, MemoryBridge, settle } from './renderer-helpers'

function demo() {
  const read = readProjectText(DEMO_TEXT)
  if (!read.ok) throw new Error('fixture')
  return read.project
}

describe('file store', () => {
  let bridge: MemoryBridge

  beforeEach(async () => {
    bridge = freshApp()
    await useFileStore().start()
    await settle()
  })

  afterEach(() => {
    useFileStore().stop()
    vi.useRealTimers()
  })

  it('opens the demo solved, with the frequencies the engine computes', () => {
    const results = useResultsStore()
    const expected = analyseProject(demo())
    expect(useFileStore().ready).toBe(true)
    expect(results.solved?.modes.map((m) => m.frequencyHz)).toEqual(expected.modes.map((m) => m.frequencyHz))
    expect(results.firstElastic?.frequencyHz).toBe(expected.modes[0].frequencyHz)
    expect(useProjectStore().dirty).toBe(false)
    // Not saved to a file yet: the shell shows the project's own title.
    expect(bridge.states.at(-1)).toEqual({ dirty: false, title: 'Pipe hanger HR-7, condensate pump skid' })
  })

  it('refuses a bad file with every problem by path, and keeps the model on screen', async () => {
    const project = useProjectStore()
    project.edit((p) => edits.setSegmentLength(p, 2, 0.9), 'segments[2].length')
    const before = project.draftText
    const bad = JSON.parse(DEMO_TEXT)
    bad.segments[0].length = -2
    bad.segments[1].section.innerDiameter = 0.05
    bad.analysis.mass = 'heavy'
    const text = JSON.stringify(bad)
    bridge.nextOpen = { kind: 'opened', path: '/p/bad.rodwave.json', name: 'bad.rodwave.json', text }
    const files = useFileStore()
    // The edit is unsaved: the store asks first; agree to open another project.
    const opening = files.open()
    await settle()
    files.confirmation!.resolve(true)
    await opening
    const read = readProjectText(text)
    expect(read.ok).toBe(false)
    expect(files.refused?.issues).toEqual(read.ok ? [] : read.issues)
    expect(files.refused?.issues.map((i) => i.path)).toEqual(expect.arrayContaining(['segments[0].length', 'segments[1].section.innerDiameter', 'analysis.mass']))
    expect(project.draftText).toBe(before)
    expect(project.dirty).toBe(true)
  })

  it('keeps editing when the user declines to drop unsaved work', async () => {
    const project = useProjectStore()
    project.edit((p) => edits.setEnd(p, 'end', 'fixed'))
    const files = useFileStore()
    const starting = files.newDocument()
    await settle()
    expect(files.confirmation?.message).toContain('not saved')
    files.confirmation!.resolve(false)
    await starting
    expect(project.draft.ends.end.axial).toBe('fixed')
  })

  it('opens a good file and solves it', async () => {
    const other = { ...demo(), title: 'Shorter hanger', segments: demo().segments.map((s, i) => (i === 0 ? { ...s, length: 1.5 } : s)), masses: [] }
    const text = writeProjectText(other)
    bridge.nextOpen = { kind: 'opened', path: '/p/short.rodwave.json', name: 'short.rodwave.json', text }
    await useFileStore().open()
    await settle()
    expect(useProjectStore().fileName).toBe('short.rodwave.json')
    expect(useResultsStore().firstElastic?.frequencyHz).toBe(analyseProject(other).modes[0].frequencyHz)
  })

  it('reads a browser upload’s bytes in the solver (decode, parse, validate), byte-order mark and all', async () => {
    const other = { ...demo(), title: 'Uploaded hanger' }
    const bytes = new Uint8Array([0xef, 0xbb, 0xbf, ...new TextEncoder().encode(writeProjectText(other))])
    const readProject = vi.spyOn(useSolver(), 'readProject')
    bridge.nextOpen = { kind: 'opened', path: 'up.rodwave.json', name: 'up.rodwave.json', bytes }
    await useFileStore().open()
    await settle()
    expect(readProject).toHaveBeenCalledExactlyOnceWith({ bytes })
    expect(useProjectStore().draft.title).toBe('Uploaded hanger')
    expect(useProjectStore().dirty).toBe(false)
  })

  it('refuses an upload that is not UTF-8 with core’s message, keeping the model on screen', async () => {
    const before = useProjectStore().draftText
    const bytes = new TextEncoder().encode(writeProjectText({ ...demo(), title: 'caf?' }))
    bytes[bytes.indexOf(0x3f)] = 0xe9
    const expected = decodeProjectBytes(bytes)
    if (expected.ok) throw new Error('fixture: Latin-1 é must not be UTF-8')
    bridge.nextOpen = { kind: 'opened', path: 'latin1.rodwave.json', name: 'latin1.rodwave.json', bytes }
    await useFileStore().open()
    expect(useFileStore().refused).toEqual({ name: 'latin1.rodwave.json', issues: [{ path: '(file)', message: expected.message }] })
    expect(useProjectStore().draftText).toBe(before)
  })

  it('says that a browser’s PDF export opened the print dialog, not that a file was written', async () => {
    bridge.exportFile = async () => ({ kind: 'print-dialog', name: 'condensate-pump-hanger-report.pdf' })
    await useFileStore().runCommand('export-report-pdf')
    expect(useFileStore().notice?.text).toMatch(/^The report opened in a new tab with the print dialog; no file was written yet\./)
    expect(useFileStore().notice?.text).not.toMatch(/Exported/)
  })

  it('shows the part’s title in the header after Open and Save As, the file name beside it', async () => {
    const other = { ...demo(), title: 'Tie rod T-4, fan housing' }
    bridge.nextOpen = { kind: 'opened', path: '/p/t4.rodwave.json', name: 't4.rodwave.json', text: writeProjectText(other) }
    await useFileStore().open()
    await settle()
    const header = mount(AppHeader)
    expect(header.get('[data-testid="document-name"]').text()).toBe('Tie rod T-4, fan housing')
    expect(header.get('[data-testid="document-file"]').text()).toBe('t4.rodwave.json')
    await useFileStore().runCommand('save-as')
    await settle()
    expect(header.get('[data-testid="document-name"]').text()).toBe('Tie rod T-4, fan housing')
    expect(header.get('[data-testid="document-file"]').text()).toBe('t4.rodwave.json')
    // A part without a title is named by its file.
    useProjectStore().edit((p) => (p.title = '  '))
    await settle()
    expect(header.get('[data-testid="document-name"]').text()).toBe('t4.rodwave.json')
    expect(header.find('[data-testid="document-file"]').exists()).toBe(false)
    header.unmount()
  })

  it('saves the project file, marks it clean and clears the recovery copy', async () => {
    const project = useProjectStore()
    project.edit((p) => edits.updateAttachment(p, 'masses', 1, 'mass', 40), 'masses[1].mass')
    await useFileStore().runCommand('save')
    expect(bridge.saved).toHaveLength(1)
    expect(bridge.saved[0].path).toBeNull()
    expect(bridge.saved[0].text).toBe(writeProjectText(project.validProject!))
    expect(readProjectText(bridge.saved[0].text).ok).toBe(true)
    expect(project.dirty).toBe(false)
    expect(project.filePath).toBe('/projects/condensate-pump-hanger.rodwave.json')
    expect(bridge.recoveryCleared).toBe(1)
  })

  it('marks saved exactly what was written: an edit made while the save is in flight stays unsaved and is kept for recovery', async () => {
    const project = useProjectStore()
    project.edit((p) => edits.updateAttachment(p, 'masses', 1, 'mass', 40), 'masses[1].mass')
    const written = project.validProject!
    let finishSave!: () => void
    const save = bridge.saveProject.bind(bridge)
    bridge.saveProject = (request) => new Promise((resolve) => (finishSave = () => resolve(save(request))))
    const saving = useFileStore().runCommand('save')
    await settle()
    // The user types on while the file is being written.
    project.edit((p) => edits.updateAttachment(p, 'masses', 1, 'mass', 45))
    const edited = project.draftText
    finishSave()
    await saving
    expect(bridge.saved[0]!.text).toBe(writeProjectText(written))
    expect(project.dirty).toBe(true)
    expect(project.draftText).toBe(edited)
    // The recovery copy is not cleared: the newer edit is on neither disk nor the close prompt otherwise.
    expect(bridge.recoveryCleared).toBe(0)
    expect(bridge.states.at(-1)?.dirty).toBe(true)
    // Undoing the edit made during the save comes back to exactly what was saved.
    project.undo()
    expect(project.dirty).toBe(false)
  })

  it('refuses to save a part with problems and says why', async () => {
    const project = useProjectStore()
    project.edit((p) => edits.setSegmentLength(p, 0, -1))
    const problems = validateProject(JSON.parse(project.draftText)).length
    expect(problems).toBeGreaterThan(0)
    const files = useFileStore()
    expect(await files.save()).toBe(false)
    expect(bridge.saved).toHaveLength(0)
    expect(files.notice?.kind).toBe('error')
    expect(files.notice?.text).toContain(`The part has ${problems} problem`)
    // The desktop's close prompt, if it asked for this save, is told at once.
    expect(bridge.saveRefusals).toBe(1)
  })

  it('writes unsaved work to the recovery file every few seconds', async () => {
    vi.useFakeTimers()
    const files = useFileStore()
    files.stop()
    await files.start()
    useProjectStore().edit((p) => edits.setEnd(p, 'start', 'free'))
    await vi.advanceTimersByTimeAsync(AUTOSAVE_MS + 10)
    expect(bridge.recoveryWrites.at(-1)).toBe(useProjectStore().draftText)
    const writes = bridge.recoveryWrites.length
    await vi.advanceTimersByTimeAsync(AUTOSAVE_MS + 10)
    expect(bridge.recoveryWrites).toHaveLength(writes)
  })

  it('offers the copy an earlier session left and restores it as unsaved work, removing the copy only once the work is this session’s copy', async () => {
    const recovered = { ...demo(), title: 'Recovered hanger' }
    const second = freshApp()
    second.earlierCopies = [{ id: 'mhx1-0123456789ab', text: writeProjectText(recovered), savedAt: '2026-12-01T08:00:00.000Z' }]
    const ownCopyWhenSettled: (string | null)[] = []
    const settle = second.settleRecovery.bind(second)
    second.settleRecovery = async (id) => {
      ownCopyWhenSettled.push(second.recovery)
      return settle(id)
    }
    const files = useFileStore()
    await files.start()
    expect(files.recoveryText).toBe(writeProjectText(recovered))
    await files.restoreRecovery()
    expect(useProjectStore().draft.title).toBe('Recovered hanger')
    expect(useProjectStore().dirty).toBe(true)
    expect(second.settled).toEqual(['mhx1-0123456789ab'])
    // At the moment the earlier copy went, the restored work was already this session's copy.
    expect(ownCopyWhenSettled).toEqual([useProjectStore().draftText])
    expect(files.recoveryText).toBeNull()
    files.stop()
  })

  it('keeps an earlier session’s copy while this session autosaves and after "Discard" of other work, until the user answers', async () => {
    vi.useFakeTimers()
    const second = freshApp()
    second.earlierCopies = [{ id: 'mhx1-0123456789ab', text: writeProjectText({ ...demo(), title: 'Crashed work' }), savedAt: null }]
    const files = useFileStore()
    await files.start()
    useProjectStore().edit((p) => edits.setEnd(p, 'start', 'free'))
    await vi.advanceTimersByTimeAsync(3 * AUTOSAVE_MS + 10)
    // This session's autosave went to its own copy; the earlier one was neither overwritten nor removed.
    expect(second.recovery).toBe(useProjectStore().draftText)
    expect(second.settled).toEqual([])
    expect(files.recoveryText).toBe(second.earlierCopies[0]!.text)
    await files.discardRecovery()
    expect(second.settled).toEqual(['mhx1-0123456789ab'])
    expect(second.recovery).toBe(useProjectStore().draftText)
    expect(files.recoveryText).toBeNull()
    files.stop()
  })

  it('leaves a copy that cannot be read on offer, so that it can be discarded', async () => {
    const second = freshApp()
    second.earlierCopies = [{ id: 'mhx1-0123456789ab', text: '{"format": "rodw', savedAt: null }]
    const files = useFileStore()
    await files.start()
    await files.restoreRecovery()
    expect(files.refused?.name).toBe('the recovery file')
    expect(second.settled).toEqual([])
    expect(files.recoveryText).toBe('{"format": "rodw')
    files.stop()
  })

  it('asks before restoring over unsaved edits', async () => {
    const second = freshApp()
    second.earlierCopies = [{ id: 'mhx1-0123456789ab', text: writeProjectText({ ...demo(), title: 'Recovered hanger' }), savedAt: null }]
    const files = useFileStore()
    await files.start()
    useProjectStore().edit((p) => edits.setEnd(p, 'end', 'fixed'))
    const restoring = files.restoreRecovery()
    await settle()
    expect(files.confirmation?.message).toContain('not saved')
    files.confirmation!.resolve(false)
    await restoring
    expect(useProjectStore().draft.ends.end.axial).toBe('fixed')
    expect(second.settled).toEqual([])
    files.stop()
  })

  it('removes this session’s copy once the document is back to its saved state', async () => {
    vi.useFakeTimers()
    const files = useFileStore()
    files.stop()
    await files.start()
    const project = useProjectStore()
    project.edit((p) => edits.setEnd(p, 'start', 'free'))
    await vi.advanceTimersByTimeAsync(AUTOSAVE_MS + 10)
    expect(bridge.recovery).toBe(project.draftText)
    project.undo()
    expect(project.dirty).toBe(false)
    await vi.advanceTimersByTimeAsync(AUTOSAVE_MS + 10)
    expect(bridge.recovery).toBeNull()
  })

  it('runs the desktop menu’s commands, once when the keyboard sends the same', async () => {
    const project = useProjectStore()
    project.edit((p) => edits.setEnd(p, 'end', 'fixed'))
    bridge.menu('undo')
    await settle()
    expect(project.draft.ends.end.axial).toBe('free')
    // The same command twice at once (menu accelerator and key together) runs once.
    await new Promise((resolve) => setTimeout(resolve, 350))
    project.edit((p) => edits.setEnd(p, 'end', 'fixed'))
    project.edit((p) => edits.setEnd(p, 'start', 'free'))
    bridge.menu('undo')
    bridge.menu('undo')
    await settle()
    expect([project.draft.ends.start.axial, project.draft.ends.end.axial]).toEqual(['fixed', 'fixed'])
    bridge.menu('cautions')
    expect(useViewStore().cautionsOpen).toBe(true)
  })

  it('opens a file chosen under the desktop menu’s Open recent', async () => {
    const other = { ...demo(), title: 'From the recent list' }
    bridge.nextOpen = { kind: 'opened', path: '/p/recent.rodwave.json', name: 'recent.rodwave.json', text: writeProjectText(other) }
    bridge.chooseRecent('/p/recent.rodwave.json')
    await settle()
    expect(bridge.recentRequested).toEqual(['/p/recent.rodwave.json'])
    expect(useProjectStore().draft.title).toBe('From the recent list')
  })

  it('exports the modal summary with one row per mode', async () => {
    await useFileStore().runCommand('export-csv')
    expect(bridge.exported).toHaveLength(1)
    const request = bridge.exported[0]
    expect(request.kind).toBe('csv')
    expect(request.suggestedName).toBe('condensate-pump-hanger-modal-summary.csv')
    const analysis = analyseProject(demo())
    expect(request.content).toBe(modalSummaryCsv(analysis))
    expect(request.content.trim().split('\r\n')).toHaveLength(1 + analysis.modes.length)
  })

  it('exports the report as HTML for the HTML and the PDF commands', async () => {
    await useFileStore().runCommand('export-report-html')
    await useFileStore().runCommand('export-report-pdf')
    expect(bridge.exported.map((e) => [e.kind, e.suggestedName])).toEqual([
      ['html', 'condensate-pump-hanger-report.html'],
      ['pdf', 'condensate-pump-hanger-report.pdf'],
    ])
    for (const e of bridge.exported) {
      expect(e.content).toMatch(/^<!doctype html>/i)
      expect(e.content).toContain('Pipe hanger HR-7')
    }
  })
})
