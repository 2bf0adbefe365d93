// @vitest-environment happy-dom
/**
 * The editor's store: edits, the validator's messages by field (the same words the file
 * reader gives for the same value in a file), undo/redo, and the project file's rule for
 * attachments when a segment's length changes (Rodwave project file spec, "Attachments
 * when a length changes"). The demo project is only a fixture here.
 */
import { beforeEach, describe, expect, it } from 'vitest'
import { readProjectText } from '../../core/model/project-schema'
import { useProjectStore } from '../../renderer/stores/project-store'
import * as edits from '../../renderer/stores/project-edits'
import { commandForKey } from '../../renderer/composables/shortcuts'
import { DEMO_TEXT, freshApp } from './renderer-helpers'

function demoProject() {
  const read = readProjectText(DEMO_TEXT)
  if (!read.ok) throw new Error('the demo fixture must be valid')
  return read.project
}

/** What the file reader says about `path` when the demo's file is changed so (every message, as the editor joins them). */
function fileMessage(change: (doc: Record<string, unknown>) => void, path: string): string {
  const doc = JSON.parse(DEMO_TEXT) as Record<string, unknown>
  change(doc)
  const read = readProjectText(JSON.stringify(doc))
  const messages = read.ok ? [] : read.issues.filter((i) => i.path === path).map((i) => i.message)
  if (messages.length === 0) throw new Error(`the file reader found no problem at ${path}`)
  return messages.join('; ')
}

describe('project store', () => {
  beforeEach(() => {
    freshApp()
    useProjectStore().load(demoProject(), { path: null, name: 'demo' })
  })

  it('starts clean, becomes dirty with an edit and clean again when saved', () => {
    const store = useProjectStore()
    expect(store.dirty).toBe(false)
    store.edit((p) => edits.setSegmentLength(p, 2, 0.8), 'segments[2].length')
    expect(store.dirty).toBe(true)
    expect(store.draft.segments[2].length).toBe(0.8)
    store.markSaved('/p/demo.rodwave.json', 'demo.rodwave.json')
    expect(store.dirty).toBe(false)
  })

  it('names a bad field with the file reader’s own message, as the user types', () => {
    const store = useProjectStore()
    store.edit((p) => edits.setSegmentLength(p, 0, -1), 'segments[0].length')
    const expected = fileMessage((d) => ((d.segments as { length: number }[])[0].length = -1), 'segments[0].length')
    expect(store.issueAt('segments[0].length')).toBe(expected)
    expect(store.validProject).toBeNull()

    // Text that is not a number reaches the validator as a non-number, like null in a file.
    store.edit((p) => edits.setSegmentLength(p, 0, NaN), 'segments[0].length')
    expect(store.issueAt('segments[0].length')).toBe(fileMessage((d) => ((d.segments as { length: unknown }[])[0].length = null), 'segments[0].length'))

    // An emptied field is a missing field.
    store.edit((p) => edits.setSegmentLength(p, 0, undefined), 'segments[0].length')
    expect(store.issueAt('segments[0].length')).toBe(fileMessage((d) => delete (d.segments as { length?: number }[])[0].length, 'segments[0].length'))
  })

  it('reports rules between fields at the field that breaks them', () => {
    const store = useProjectStore()
    store.edit((p) => edits.setSectionDimension(p, 1, 'innerDiameter', 0.05))
    const tube = fileMessage((d) => ((d.segments as { section: Record<string, number> }[])[1].section.innerDiameter = 0.05), 'segments[1].section.innerDiameter')
    expect(store.issueAt('segments[1].section.innerDiameter')).toBe(tube)
    store.undo()
    store.edit((p) => edits.updateAttachment(p, 'masses', 0, 'at', 5))
    expect(store.issueAt('masses[0].at')).toBe(fileMessage((d) => ((d.masses as { at: number }[])[0].at = 5), 'masses[0].at'))
    store.edit((p) => edits.setExcitationValue(p, 0, 1, 100))
    expect(store.issuesUnder('excitations[0]').map((i) => i.path)).toContain('excitations[0].rpm')
  })

  it('undoes and redoes whole edits, one field’s typing being one step', () => {
    const store = useProjectStore()
    const original = store.draftText
    // Typing "0.7" into one field: three keystrokes, one step.
    for (const v of [0, 0.7, 0.75]) store.edit((p) => edits.setSegmentLength(p, 2, v), 'segments[2].length')
    store.edit((p) => edits.setEnd(p, 'end', 'fixed'))
    expect(store.draft.ends.end.axial).toBe('fixed')
    store.undo()
    expect(store.draft.ends.end.axial).toBe('free')
    expect(store.draft.segments[2].length).toBe(0.75)
    store.undo()
    expect(store.draftText).toBe(original)
    expect(store.canUndo).toBe(false)
    store.redo()
    expect(store.draft.segments[2].length).toBe(0.75)
    store.redo()
    expect(store.draft.ends.end.axial).toBe('fixed')
    expect(store.canRedo).toBe(false)
  })

  it('maps the keys Ctrl+Z, Ctrl+Y and Ctrl+Shift+Z (and Cmd) to undo and redo', () => {
    const key = (k: string, extra: Partial<KeyboardEvent> = {}) => commandForKey({ key: k, ctrlKey: true, metaKey: false, shiftKey: false, altKey: false, ...extra })
    expect(key('z')).toBe('undo')
    expect(key('y')).toBe('redo')
    expect(key('Z', { shiftKey: true })).toBe('redo')
    expect(key('s')).toBe('save')
    expect(key('S', { shiftKey: true })).toBe('save-as')
    expect(key('o')).toBe('open')
    expect(key('n')).toBe('new')
    expect(commandForKey({ key: 'z', ctrlKey: false, metaKey: true, shiftKey: false, altKey: false })).toBe('undo')
    expect(commandForKey({ key: 'z', ctrlKey: false, metaKey: false, shiftKey: false, altKey: false })).toBeNull()
  })

  it('moves attachments beyond a segment with the bar’s end and keeps those on it at their fraction', () => {
    const store = useProjectStore()
    // Demo: segment 0 is 1.9 m; masses at 1.98 m and 2.91 m lie beyond it.
    store.edit((p) => edits.setSegmentLength(p, 0, 1.7), 'segments[0].length')
    expect(store.draft.masses[0].at).toBeCloseTo(1.78, 12)
    expect(store.draft.masses[1].at).toBeCloseTo(2.71, 12)
    // A mass on segment 1 (1.9 … 2.06 m at first, now 1.7 … 1.86 m) keeps its fraction 0.5 when that segment doubles.
    store.edit((p) => edits.updateAttachment(p, 'masses', 0, 'at', 1.78))
    store.edit((p) => edits.setSegmentLength(p, 1, 0.32), 'segments[1].length')
    expect(store.draft.masses[0].at).toBeCloseTo(1.7 + 0.5 * 0.32, 12)
    expect(store.draft.masses[1].at).toBeCloseTo(2.71 + 0.16, 12)
    expect(store.issues).toEqual([])
  })

  it('applies each keystroke of a length to the length the user started from', () => {
    const store = useProjectStore()
    // "1.9" → "" → "1" → "1.7": the empty moment must not lose the attachments' places.
    for (const v of [undefined, 1, 1.7]) store.edit((p) => edits.setSegmentLength(p, 0, v), 'segments[0].length')
    expect(store.draft.masses[1].at).toBeCloseTo(2.71, 12)
  })

  it('keeps a new section’s size close to the old one', () => {
    const store = useProjectStore()
    store.edit((p) => edits.setSectionShape(p, 2, 'tube'))
    const section = store.draft.segments[2].section
    expect(section).toEqual({ shape: 'tube', outerDiameter: 0.024, innerDiameter: 0.012 })
    expect(store.issues).toEqual([])
  })

  it('switches the display units as an undoable edit, the stored values staying SI', () => {
    const store = useProjectStore()
    const lengths = store.draft.segments.map((s) => s.length)
    store.setUnits('US')
    expect(store.units).toBe('US')
    expect(store.draft.segments.map((s) => s.length)).toEqual(lengths)
    expect(JSON.parse(store.fileText()!).units).toBe('US')
    store.undo()
    expect(store.units).toBe('SI')
  })

  it('renames a project material and the segments that use it follow', () => {
    const store = useProjectStore()
    store.edit((p) => edits.renameMaterial(p, 0, 'a36'))
    expect(store.draft.segments.every((s) => s.material === 'a36')).toBe(true)
    expect(store.issues).toEqual([])
    store.edit((p) => edits.removeMaterial(p, 0))
    expect(store.draft.materials).toHaveLength(1)
  })

  it('adds a speed preset at the speed the user gives, never one copied from another excitation', () => {
    const store = useProjectStore()
    // The demo already has a 2960–2990 rpm pump: a new running-speed excitation must not inherit it.
    expect(() => edits.presetExcitation('running-1x')).toThrow(/speed/)
    store.edit((p) => edits.addExcitation(p, edits.presetExcitation('running-1x', { rpm: 1480 })))
    expect(store.draft.excitations.at(-1)).toEqual({ label: 'Running speed 1×', rpm: 1480, orders: [1] })
    store.edit((p) => edits.addExcitation(p, edits.presetExcitation('running-2x', { rpm: [1450, 1490], label: 'Fan' })))
    expect(store.draft.excitations.at(-1)).toEqual({ label: 'Fan', rpm: [1450, 1490], orders: [2] })
    // Blade pass and gear mesh ask for their count.
    expect(() => edits.presetExcitation('blade-pass', { rpm: 1480 })).toThrow(/blades or vanes/)
    store.edit((p) => edits.addExcitation(p, edits.presetExcitation('gear-mesh', { rpm: 1480, count: 23 })))
    expect(store.draft.excitations.at(-1)).toEqual({ label: 'Gear mesh', rpm: 1480, orders: [23] })
    store.edit((p) => edits.addExcitation(p, edits.presetExcitation('twice-line-60')))
    expect(store.draft.excitations.at(-1)).toEqual({ label: 'Twice line frequency (60 Hz supply)', hz: 120 })
    expect(store.issues).toEqual([])
    // The project's speeds are offered, each once.
    expect(edits.projectSpeeds(store.draft).map((s) => s.rpm)).toEqual([[2960, 2990], 1480, [1450, 1490]])
    store.edit((p) => edits.setExcitationOrders(p, 0, edits.parseOrders('1, x, 3')))
    expect(store.issueAt('excitations[0].orders[1]')).toBeDefined()
  })
})
