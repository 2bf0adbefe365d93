/**
 * The editor's changes to a project, as plain functions that change a draft in place.
 * A draft may hold values the validator will refuse (NaN for text that is not a number,
 * a missing field for an emptied one): the editor never blocks typing, it names the
 * problem next to the field instead.
 */
import { libraryMaterial } from '../../core/model/materials'
import { meanSectionArea, sectionArea, sectionOuterSize, segmentBoundaries, totalLength } from '../../core/model/geometry'
import { MOTIONS, type BendingEndCondition, type BendingTheory, type EndCondition, type Excitation, type GroundSpring, type Material, type Motion, type PartEnd, type Project, type Section, type SectionShape, type Tolerances } from '../../core/model/project'

/** A value typed in a field: a number, NaN (not a number) or undefined (empty). */
export type Typed = number | undefined

/** Sets or (for undefined) removes a field, so an emptied field reads as "is required". */
export function assign<T extends object>(target: T, key: keyof T, value: Typed | string): void {
  if (value === undefined) delete target[key]
  else (target as Record<keyof T, unknown>)[key] = value
}

const isPositive = (v: unknown): v is number => typeof v === 'number' && Number.isFinite(v) && v > 0

/**
 * A segment's new length. Attachments move as the project file's rule says: one beyond
 * the segment moves with the bar's end, one inside it keeps its fraction of the segment.
 * Attachments stay where they are while either length is not a valid number.
 */
export function setSegmentLength(project: Project, index: number, length: Typed): void {
  const segment = project.segments[index]
  const before = segment.length
  assign(segment, 'length', length)
  if (!isPositive(before) || !isPositive(length) || !project.segments.every((s, i) => i === index || isPositive(s.length))) return
  const start = segmentBoundaries(project.segments.map((s, i) => (i === index ? { ...s, length: before } : s)))[index]
  const end = start + before
  const move = (at: number) => (at >= end ? at + (length - before) : at > start ? start + ((at - start) / before) * length : at)
  for (const list of [project.masses, project.springs]) {
    for (const a of list) if (typeof a.at === 'number' && Number.isFinite(a.at)) a.at = move(a.at)
  }
}

/** A copy of a segment after `index` (or a first one), the bar growing by its length. */
export function insertSegment(project: Project, after: number): void {
  const template = project.segments[after] ?? project.segments[project.segments.length - 1]
  const segment = template
    ? structuredClone({ length: isPositive(template.length) ? template.length : 0.5, material: template.material, section: template.section })
    : { length: 0.5, material: 'carbon-steel', section: { shape: 'solid', diameter: 0.025 } as Section }
  const bounds = segmentBoundaries(project.segments)
  const at = bounds[Math.min(after + 1, project.segments.length)] ?? 0
  project.segments.splice(after + 1, 0, segment)
  if (after + 1 < project.segments.length - 1) shiftAttachments(project, at, segment.length)
}

/** Removes a segment; attachments beyond it move back with the bar's end, ones on it go to its start. */
export function removeSegment(project: Project, index: number): void {
  if (project.segments.length <= 1) return
  const bounds = segmentBoundaries(project.segments)
  const [start, end] = [bounds[index], bounds[index + 1]]
  const removed = project.segments[index].length
  project.segments.splice(index, 1)
  if (!Number.isFinite(start) || !Number.isFinite(end)) return
  for (const list of [project.masses, project.springs]) {
    for (const a of list) {
      if (typeof a.at !== 'number') continue
      if (a.at >= end) a.at -= removed
      else if (a.at > start) a.at = start
    }
  }
}

function shiftAttachments(project: Project, from: number, by: number): void {
  for (const list of [project.masses, project.springs]) for (const a of list) if (typeof a.at === 'number' && a.at >= from) a.at += by
}

/** Swaps a segment with its neighbour; attachments keep their distance from the start. */
export function moveSegment(project: Project, index: number, direction: -1 | 1): void {
  const other = index + direction
  if (other < 0 || other >= project.segments.length) return
  const segments = project.segments
  ;[segments[index], segments[other]] = [segments[other], segments[index]]
}

/** A new section shape that keeps the old one's size where it can. */
export function setSectionShape(project: Project, index: number, shape: SectionShape): void {
  const segment = project.segments[index]
  const old = segment.section
  if (old.shape === shape) return
  const outer = finiteOr(safe(() => sectionOuterSize(old)), 0.025)
  const area = finiteOr(safe(() => (old.shape === 'cone' ? meanSectionArea(old) : sectionArea(old))), (Math.PI / 4) * outer * outer)
  const sections: Record<SectionShape, Section> = {
    solid: { shape: 'solid', diameter: outer },
    tube: { shape: 'tube', outerDiameter: outer, innerDiameter: round(outer / 2) },
    rectangle: { shape: 'rectangle', width: outer, height: outer },
    area: { shape: 'area', area: round(area) },
    cone: { shape: 'cone', startDiameter: outer, endDiameter: round(outer * 0.75) },
  }
  segment.section = sections[shape]
}

function safe(f: () => number): number {
  try {
    return f()
  } catch {
    return NaN
  }
}

function finiteOr(v: number, fallback: number): number {
  return Number.isFinite(v) && v > 0 ? v : fallback
}

/** Six significant digits: a derived size the user will likely retype anyway. */
function round(v: number): number {
  return Number(v.toPrecision(6))
}

export function setSectionDimension(project: Project, index: number, key: string, value: Typed): void {
  assign(project.segments[index].section as unknown as Record<string, unknown>, key, value)
}

/** The axial condition at one end (the only one of a version 1 part). */
export function setEnd(project: Project, end: 'start' | 'end', condition: EndCondition): void {
  project.ends[end].axial = condition
}

/** One family's condition at one end. */
export function setFamilyEnd<F extends keyof PartEnd>(project: Project, end: 'start' | 'end', family: F, condition: PartEnd[F]): void {
  project.ends[end][family] = condition
}

/** Analyses a family or stops analysing it; the last one stays (a part is analysed in at least one). */
export function setMotion(project: Project, motion: Motion, on: boolean): void {
  const next = MOTIONS.filter((m) => (m === motion ? on : project.motions.includes(m)))
  if (next.length) project.motions = next
}

/** The steady axial force (tension positive); an emptied field removes it (no preload). */
export function setPreload(project: Project, value: Typed): void {
  assign(project, 'preload', value)
}

export function setBendingTheory(project: Project, theory: BendingTheory): void {
  if (theory === 'euler-bernoulli') delete project.analysis.bendingTheory
  else project.analysis.bendingTheory = theory
}

export const BENDING_END_WORDS: Record<BendingEndCondition, string> = {
  clamped: 'clamped (no deflection, no slope)',
  pinned: 'pinned (no deflection)',
  guided: 'guided (no slope, slides sideways)',
  free: 'free',
}

/** A new project material, starting from carbon steel's handbook values. */
export function addMaterial(project: Project): string {
  const base = libraryMaterial('carbon-steel')!
  let n = project.materials.length + 1
  while (project.materials.some((m) => m.id === `material-${n}`)) n++
  const id = `material-${n}`
  project.materials.push({ id, name: `Material ${n}`, youngsModulus: base.youngsModulus, density: base.density })
  return id
}

/** Renames a project material; the segments that used the old id follow it. */
export function renameMaterial(project: Project, index: number, id: string): void {
  const material = project.materials[index]
  const old = material.id
  material.id = id
  if (old === id) return
  const stillDefined = project.materials.some((m) => m.id === old)
  if (stillDefined) return
  for (const s of project.segments) if (s.material === old) s.material = id
}

export type MaterialField = 'name' | 'youngsModulus' | 'density' | 'poissonRatio' | 'shearModulus'

export function updateMaterial(project: Project, index: number, key: MaterialField, value: Typed | string): void {
  assign(project.materials[index] as Material, key, value)
}

/** How a material's shear stiffness is given: Poisson's ratio (G = E / (2(1 + ν))) or the shear modulus itself. */
export type ShearGiven = 'poissonRatio' | 'shearModulus'

export function shearGiven(material: Pick<Material, 'shearModulus'>): ShearGiven {
  return material.shearModulus !== undefined ? 'shearModulus' : 'poissonRatio'
}

/** Gives a material's shear stiffness the other way, converted where both E and the old value are numbers. */
export function setShearGiven(project: Project, index: number, given: ShearGiven): void {
  const m = project.materials[index]
  if (shearGiven(m) === given) return
  const E = m.youngsModulus
  const ok = (v: unknown): v is number => typeof v === 'number' && Number.isFinite(v)
  if (given === 'shearModulus') {
    const nu = m.poissonRatio
    delete m.poissonRatio
    m.shearModulus = ok(nu) && ok(E) && nu > -1 ? round(E / (2 * (1 + nu))) : round(E / 2.6)
  } else {
    const G = m.shearModulus
    delete m.shearModulus
    m.poissonRatio = ok(G) && ok(E) && G > 0 ? round(E / (2 * G) - 1) : 0.3
  }
}

/** Segments (1-based numbers) that use a material. */
export function materialUsers(project: Project, id: string): number[] {
  return project.segments.flatMap((s, i) => (s.material === id ? [i + 1] : []))
}

export function removeMaterial(project: Project, index: number): void {
  if (materialUsers(project, project.materials[index].id).length === 0) project.materials.splice(index, 1)
}

export type AttachmentList = 'masses' | 'springs'

/** What a new attachment row starts from: a place (the free end, else the middle of the bar) and a label; its size is the user's to give. */
export interface AttachmentStart {
  readonly at: number
  readonly label: string
}

export function attachmentStart(project: Project, list: AttachmentList, pending = 0): AttachmentStart {
  const length = safe(() => totalLength(project.segments))
  const at = Number.isFinite(length) ? (project.ends.end.axial === 'free' ? length : round(length / 2)) : 0
  return { at, label: `${list === 'masses' ? 'Mass' : 'Spring'} ${project[list].length + pending + 1}` }
}

/** A confirmed attachment joins the part (a draft row only takes part from here on). A spring acts in `motion` (axial when not given). */
export function addAttachment(project: Project, list: AttachmentList, item: { at: Typed; value: Typed; label: string; motion?: Motion }): void {
  const entry: Record<string, unknown> = {}
  assign(entry, 'at', item.at)
  if (list === 'springs' && item.motion && item.motion !== 'axial') entry.motion = item.motion
  assign(entry, list === 'masses' ? 'mass' : 'stiffness', item.value)
  if (item.label.trim() !== '') entry.label = item.label
  ;(project[list] as unknown as Record<string, unknown>[]).push(entry)
}

export type AttachmentField = 'at' | 'mass' | 'stiffness' | 'label' | 'polarInertia' | 'transverseInertia' | 'rotationalStiffness'

/** An emptied inertia or rotational stiffness is removed (it is optional); other emptied fields read as "is required". */
const OPTIONAL_FIELDS = new Set<AttachmentField>(['polarInertia', 'transverseInertia', 'rotationalStiffness'])

export function updateAttachment(project: Project, list: AttachmentList, index: number, key: AttachmentField, value: Typed | string): void {
  const item = project[list][index] as unknown as Record<string, unknown>
  if (key === 'label' && value === '') delete item.label
  else if (OPTIONAL_FIELDS.has(key) && value === undefined) delete item[key]
  else assign(item, key, value)
}

/** The family a spring acts in; a rotational stiffness belongs to bending alone. */
export function setSpringMotion(project: Project, index: number, motion: Motion): void {
  const spring = project.springs[index] as GroundSpring
  if (motion === 'axial') delete spring.motion
  else spring.motion = motion
  if (motion !== 'bending') delete spring.rotationalStiffness
}

/**
 * Whether an excitation drives a family. `excites` absent means every analysed family; the
 * list is kept only while it leaves a family out, so a file stays as plain as it can.
 */
export function setExcites(project: Project, index: number, motion: Motion, on: boolean): void {
  const e = project.excitations[index]
  const current = e.excites && e.excites.length ? e.excites : [...MOTIONS]
  const next = MOTIONS.filter((m) => (m === motion ? on : current.includes(m)))
  if (next.length === 0) return
  if (next.length === MOTIONS.length) delete e.excites
  else e.excites = next
}

/** The families an excitation drives, as its checkboxes show them: every one when `excites` is absent. */
export function excitesOf(e: Pick<Excitation, 'excites'>): Motion[] {
  return e.excites && e.excites.length ? [...e.excites] : [...MOTIONS]
}

export function removeAttachment(project: Project, list: AttachmentList, index: number): void {
  project[list].splice(index, 1)
}

export type MeshMode = 'elementsPerSegment' | 'maxElementLength'

export function setMeshMode(project: Project, mode: MeshMode): void {
  const analysis = project.analysis
  if (mode === 'maxElementLength' && analysis.maxElementLength === undefined) {
    const length = safe(() => totalLength(project.segments))
    const elements = (analysis.elementsPerSegment ?? 40) * project.segments.length
    analysis.maxElementLength = Number.isFinite(length) && length > 0 ? round(length / elements) : 0.01
    delete analysis.elementsPerSegment
  } else if (mode === 'elementsPerSegment' && analysis.elementsPerSegment === undefined) {
    analysis.elementsPerSegment = 40
    delete analysis.maxElementLength
  }
}

export type ExcitationPreset = 'running-1x' | 'running-2x' | 'twice-line-50' | 'twice-line-60' | 'blade-pass' | 'gear-mesh'

export interface ExcitationPresetInfo {
  readonly id: ExcitationPreset
  readonly title: string
  /** The label the new excitation starts with. */
  readonly label: string
  /** A machine's speed must be asked for (a fixed frequency needs nothing). */
  readonly needsSpeed: boolean
  /** The order is a count to ask for (blades or vanes, teeth), in these words; else the order is fixed. */
  readonly count?: string
  readonly order?: number
}

export const EXCITATION_PRESETS: readonly ExcitationPresetInfo[] = [
  { id: 'running-1x', title: '1× running speed', label: 'Running speed 1×', needsSpeed: true, order: 1 },
  { id: 'running-2x', title: '2× running speed', label: 'Running speed 2×', needsSpeed: true, order: 2 },
  { id: 'twice-line-50', title: 'Twice line frequency, 100 Hz', label: 'Twice line frequency (50 Hz supply)', needsSpeed: false },
  { id: 'twice-line-60', title: 'Twice line frequency, 120 Hz', label: 'Twice line frequency (60 Hz supply)', needsSpeed: false },
  { id: 'blade-pass', title: 'Blade or vane pass', label: 'Blade or vane pass', needsSpeed: true, count: 'blades or vanes' },
  { id: 'gear-mesh', title: 'Gear mesh', label: 'Gear mesh', needsSpeed: true, count: 'teeth' },
]

export function presetInfo(preset: ExcitationPreset): ExcitationPresetInfo {
  return EXCITATION_PRESETS.find((p) => p.id === preset)!
}

/** What the user gives a speed preset: the machine's speed (single or a range, rpm), the count for a pass frequency, a label. */
export interface PresetAnswers {
  readonly rpm?: number | [number, number]
  readonly count?: number
  readonly label?: string
}

/** The excitation a preset adds. A speed preset takes the speed the user gave, never one copied from another excitation. */
export function presetExcitation(preset: ExcitationPreset, answers: PresetAnswers = {}): Excitation {
  const info = presetInfo(preset)
  const label = answers.label?.trim() || info.label
  if (preset === 'twice-line-50') return { label, hz: 100 }
  if (preset === 'twice-line-60') return { label, hz: 120 }
  if (answers.rpm === undefined) throw new Error(`the ${info.title} preset needs the machine's speed`)
  const order = info.order ?? answers.count
  if (order === undefined) throw new Error(`the ${info.title} preset needs the number of ${info.count}`)
  const rpm: number | [number, number] = Array.isArray(answers.rpm) ? [answers.rpm[0], answers.rpm[1]] : answers.rpm
  return { label, rpm, orders: [order] }
}

/** The distinct speeds (single or range, rpm) of the project's excitations, with the label of the first that has each: offered, never assumed. */
export function projectSpeeds(project: Project): { rpm: number | [number, number]; label: string }[] {
  const out: { rpm: number | [number, number]; label: string }[] = []
  project.excitations.forEach((e, i) => {
    if (!('rpm' in e)) return
    const values = Array.isArray(e.rpm) ? e.rpm : [e.rpm]
    if (!values.every((v) => typeof v === 'number' && Number.isFinite(v) && v > 0)) return
    if (out.some((s) => JSON.stringify(s.rpm) === JSON.stringify(e.rpm))) return
    out.push({ rpm: Array.isArray(e.rpm) ? [e.rpm[0], e.rpm[1]] : e.rpm, label: e.label?.trim() || `Excitation ${i + 1}` })
  })
  return out
}

export function addExcitation(project: Project, excitation: Excitation): void {
  project.excitations.push(excitation)
}

export function removeExcitation(project: Project, index: number): void {
  project.excitations.splice(index, 1)
}

/** Switches an excitation between a speed with orders and a fixed frequency, keeping its frequency. */
export function setExcitationKind(project: Project, index: number, kind: 'speed' | 'frequency'): void {
  const e = project.excitations[index]
  if (kind === 'speed' && 'hz' in e) {
    const toRpm = (hz: number) => round(hz * 60)
    const rpm = Array.isArray(e.hz) ? ([toRpm(e.hz[0]), toRpm(e.hz[1])] as [number, number]) : toRpm(e.hz)
    project.excitations[index] = { ...(e.label !== undefined ? { label: e.label } : {}), rpm, orders: [1] }
  } else if (kind === 'frequency' && 'rpm' in e) {
    const order = typeof e.orders[0] === 'number' && Number.isFinite(e.orders[0]) ? e.orders[0] : 1
    const toHz = (rpm: number) => round((rpm * order) / 60)
    const hz = Array.isArray(e.rpm) ? ([toHz(e.rpm[0]), toHz(e.rpm[1])] as [number, number]) : toHz(e.rpm)
    project.excitations[index] = { ...(e.label !== undefined ? { label: e.label } : {}), hz }
  }
}

/**
 * The value (or the range's low end, `which` = 0) and the range's high end (`which` = 1) of an
 * excitation's speed or frequency. An empty high end makes it a single value.
 */
export function setExcitationValue(project: Project, index: number, which: 0 | 1, value: Typed): void {
  const e = project.excitations[index] as unknown as Record<string, unknown>
  const key = 'rpm' in e ? 'rpm' : 'hz'
  const current = e[key]
  const low = Array.isArray(current) ? current[0] : current
  const high = Array.isArray(current) ? current[1] : undefined
  const nextLow = which === 0 ? value : low
  const nextHigh = which === 1 ? value : high
  if (nextHigh === undefined) assign(e, key, nextLow as Typed)
  else e[key] = [nextLow ?? NaN, nextHigh]
}

export function setExcitationOrders(project: Project, index: number, orders: number[]): void {
  const e = project.excitations[index]
  if ('rpm' in e) e.orders = orders
}

export function setExcitationLabel(project: Project, index: number, label: string): void {
  const e = project.excitations[index]
  if (label === '') delete e.label
  else e.label = label
}

/** "1, 2, 7" → [1, 2, 7]; an entry that is not a number stays as NaN so its field is named. */
export function parseOrders(text: string): number[] {
  return text
    .split(/[,;\s]+/)
    .filter((t) => t !== '')
    .map((t) => (/^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/.test(t) ? Number(t) : NaN))
}

/** One tolerance (a fraction, ±); an emptied field removes it, and the last one removed removes the set. */
export function setTolerance(project: Project, key: keyof Tolerances, value: Typed): void {
  const tolerances: Tolerances = project.tolerances ?? {}
  assign(tolerances, key, value)
  if (Object.keys(tolerances).length === 0) delete project.tolerances
  else project.tolerances = tolerances
}
