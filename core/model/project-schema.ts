/**
 * Reading a project file: JSON text → a valid Project, or the complete list of
 * problems, each named by its JSON path ("segments[2].section.diameter: must be > 0").
 * Structure and ranges are checked with a zod schema; rules that relate fields
 * (material ids, positions within the bar, the tube's bore) are checked after it.
 * Nothing here throws on bad input.
 */
import * as z from 'zod'
import {
  BENDING_END_CONDITIONS,
  DEFAULT_ANALYSIS,
  DEFAULT_DAMPING,
  DEFAULT_MARGIN,
  FORMAT_NAME,
  FORMAT_VERSION,
  LIMITS,
  MOTIONS,
  partEnd,
  type AnalysisSettings,
  type BendingEndCondition,
  type EndCondition,
  type Motion,
  type PartEnd,
  type Project,
} from './project'
import { resolveMaterial } from './geometry'
import { hasTwoBendingPlanes, secondMoments, shearModulus, torsionConstant, polarMoment } from './section-properties'
import { countMeshElements } from '../fe/mesh'

// The renderer runs under a Content-Security-Policy without 'unsafe-eval'.
z.config({ jitless: true })

export interface ProjectIssue {
  /** JSON path of the offending field, e.g. "segments[0].length"; "(file)" for the whole document. */
  readonly path: string
  readonly message: string
}

export type ProjectReadResult = { ok: true; project: Project } | { ok: false; issues: ProjectIssue[] }

/** Project files larger than this are refused before parsing. */
export const MAX_FILE_CHARACTERS = 20_000_000

const nonNegative = () => z.number().gte(0, 'must be ≥ 0')
/**
 * A positive quantity within physical bounds, so that areas, stiffnesses and masses derived
 * from it stay finite and well away from underflow (e.g. no 1e308 m diameter).
 */
const physical = (min: number, max: number, unit: string) =>
  z.number().superRefine((v, ctx) => {
    // One message per field: the first rule it breaks.
    const message = !(v > 0) ? 'must be > 0' : v < min ? `must be at least ${min} ${unit}`.trim() : v > max ? `must be at most ${max} ${unit}`.trim() : null
    if (message) ctx.addIssue({ code: 'custom', message })
  })
/** A quantity that may be 0 (an inertia, a spring's unused half) within physical bounds. */
const physicalOrZero = (max: number, unit: string) =>
  z.number().superRefine((v, ctx) => {
    const message = !(v >= 0) ? 'must be ≥ 0' : v > max ? `must be at most ${max} ${unit}` : null
    if (message) ctx.addIssue({ code: 'custom', message })
  })
const dimension = () => physical(1e-6, 100, 'm')
const length = () => physical(1e-6, 1e4, 'm')
const secondMomentOfArea = () => physical(1e-30, 1e4, 'm⁴')

/** C0 and C1 control characters and DEL: they could retitle a terminal or erase its lines. */
// eslint-disable-next-line no-control-regex -- finding control characters is the point
const CONTROL_CHARACTER = /[\u0000-\u001f\u007f-\u009f]/
function controlCharacterMessage(text: string): string | null {
  const match = CONTROL_CHARACTER.exec(text)
  return match ? `must not contain control characters (found U+${match[0].charCodeAt(0).toString(16).toUpperCase().padStart(4, '0')})` : null
}
/** Text for people: a title, a name, a label. */
const text = (max: number) =>
  z.string().superRefine((v, ctx) => {
    const message = v.length > max ? `must be at most ${max} characters` : controlCharacterMessage(v)
    if (message) ctx.addIssue({ code: 'custom', message })
  })
const label = () => text(LIMITS.maxLabelLength)
/** An identifier (material ids and references to them). */
const identifier = () =>
  z.string().superRefine((v, ctx) => {
    const message = v === '' ? 'must not be empty' : v.length > LIMITS.maxIdLength ? `must be at most ${LIMITS.maxIdLength} characters` : controlCharacterMessage(v)
    if (message) ctx.addIssue({ code: 'custom', message })
  })
const speedOrFrequency = () => physical(1e-6, 1e9, '(rpm or Hz)')
const valueOrRange = () => z.union([speedOrFrequency(), z.tuple([speedOrFrequency(), speedOrFrequency()])])
const motion = z.enum(MOTIONS as [Motion, ...Motion[]])
const motionList = () =>
  z
    .array(motion)
    .min(1, 'must name at least one of "axial", "torsion", "bending"')
    .superRefine((v, ctx) => {
      if (new Set(v).size !== v.length) ctx.addIssue({ code: 'custom', message: 'must not name a motion twice' })
    })

const sectionSchema = z.discriminatedUnion('shape', [
  z.strictObject({ shape: z.literal('solid'), diameter: dimension() }),
  z.strictObject({ shape: z.literal('tube'), outerDiameter: dimension(), innerDiameter: nonNegative().lte(100, 'must be at most 100 m') }),
  z.strictObject({ shape: z.literal('rectangle'), width: dimension(), height: dimension() }),
  z.strictObject({
    shape: z.literal('area'),
    area: physical(1e-12, 1e4, 'm²'),
    secondMoment: secondMomentOfArea().optional(),
    secondMomentStrong: secondMomentOfArea().optional(),
    torsionConstant: secondMomentOfArea().optional(),
    polarMoment: secondMomentOfArea().optional(),
  }),
  z.strictObject({ shape: z.literal('cone'), startDiameter: dimension(), endDiameter: dimension() }),
])

const endCondition = z.enum(['fixed', 'free'])
const bendingEnd = z.enum(BENDING_END_CONDITIONS as [BendingEndCondition, ...BendingEndCondition[]])
/** A version 1 end (the axial condition as a string) or one condition per family. */
const partEndSchema = z.union([
  endCondition,
  z.strictObject({ axial: endCondition.optional(), torsion: endCondition.optional(), bending: bendingEnd.optional() }),
])
const fraction = (upper: number, text: string) => z.number().gte(0, 'must be ≥ 0').lt(upper, text)

const projectSchema = z.strictObject({
  format: z.literal(FORMAT_NAME),
  version: z.literal(FORMAT_VERSION),
  title: label().optional(),
  units: z.enum(['SI', 'US']).default('SI'),
  motions: motionList().default(['axial']),
  materials: z
    .array(
      z.strictObject({
        id: identifier(),
        name: label().optional(),
        youngsModulus: physical(1e3, 1e13, 'Pa'),
        density: physical(1e-3, 1e6, 'kg/m³'),
        poissonRatio: z.number().gt(-1, 'must be > −1').lt(0.5, 'must be < 0.5').optional(),
        shearModulus: physical(1e3, 1e13, 'Pa').optional(),
      }),
    )
    .max(1000, 'must have at most 1000 entries')
    .default([]),
  segments: z
    .array(z.strictObject({ length: length(), material: identifier(), section: sectionSchema }))
    .min(1, 'must have at least one segment')
    .max(LIMITS.maxSegments, `must have at most ${LIMITS.maxSegments} segments`),
  ends: z.strictObject({ start: partEndSchema, end: partEndSchema }),
  preload: z
    .number()
    .refine((v) => Math.abs(v) <= 1e12, 'must be between −1e12 and 1e12 N')
    .optional(),
  masses: z
    .array(
      z.strictObject({
        at: nonNegative(),
        mass: physical(1e-12, 1e12, 'kg'),
        polarInertia: physicalOrZero(1e12, 'kg·m²').optional(),
        transverseInertia: physicalOrZero(1e12, 'kg·m²').optional(),
        label: label().optional(),
      }),
    )
    .max(LIMITS.maxAttachments, `must have at most ${LIMITS.maxAttachments} entries`)
    .default([]),
  springs: z
    .array(
      z.strictObject({
        at: nonNegative(),
        motion: motion.optional(),
        // Bending springs may be rotational only; the rule between the two is checked below.
        stiffness: physicalOrZero(1e20, 'N/m'),
        rotationalStiffness: physicalOrZero(1e20, 'N·m/rad').optional(),
        label: label().optional(),
      }),
    )
    .max(LIMITS.maxAttachments, `must have at most ${LIMITS.maxAttachments} entries`)
    .default([]),
  analysis: z
    .strictObject({
      elementOrder: z.literal([1, 2]).optional(),
      elementsPerSegment: z.number().int('must be a whole number').gte(1, 'must be ≥ 1').optional(),
      maxElementLength: physical(1e-7, 1e4, 'm').optional(),
      mass: z.enum(['consistent', 'lumped', 'mixed']).optional(),
      modes: z.number().int('must be a whole number').gte(1, 'must be ≥ 1').lte(LIMITS.maxModes, `must be ≤ ${LIMITS.maxModes}`).optional(),
      bendingTheory: z.enum(['euler-bernoulli', 'timoshenko']).optional(),
    })
    .optional(),
  excitations: z
    .array(
      z.union([
        z.strictObject({
          label: label().optional(),
          rpm: valueOrRange(),
          orders: z.array(physical(1e-6, 1e5, '')).min(1, 'must list at least one order').max(LIMITS.maxOrdersPerExcitation, `must list at most ${LIMITS.maxOrdersPerExcitation} orders`),
          excites: motionList().optional(),
        }),
        z.strictObject({ label: label().optional(), hz: valueOrRange(), excites: motionList().optional() }),
      ]),
    )
    .max(LIMITS.maxExcitations, `must have at most ${LIMITS.maxExcitations} entries`)
    .default([]),
  margin: z.number().gt(0, 'must be > 0').lt(1, 'must be < 1').default(DEFAULT_MARGIN),
  damping: z.number().gt(0, 'must be > 0').lt(1, 'must be < 1').default(DEFAULT_DAMPING),
  tolerances: z
    .strictObject({
      youngsModulus: fraction(0.5, 'must be < 0.5').optional(),
      density: fraction(0.5, 'must be < 0.5').optional(),
      length: fraction(0.5, 'must be < 0.5').optional(),
      diameter: fraction(0.5, 'must be < 0.5').optional(),
      mass: fraction(0.5, 'must be < 0.5').optional(),
      stiffness: fraction(0.5, 'must be < 0.5').optional(),
      poissonRatio: fraction(0.5, 'must be < 0.5').optional(),
    })
    .optional(),
})

/**
 * Migrations from version v to v + 1, keyed by v. Version 1 → 2: the part was analysed in axial
 * motion only, and each end was its axial condition (kept as a plain string, which version 2
 * still reads as the axial condition with the other families free).
 */
const MIGRATIONS: Record<number, (doc: Record<string, unknown>) => Record<string, unknown>> = {
  1: (doc) => ({ ...doc, motions: doc.motions ?? ['axial'] }),
}

/** Brings an older document up to FORMAT_VERSION, or says why it cannot. */
export function migrateDocument(doc: unknown): { ok: true; doc: Record<string, unknown> } | { ok: false; issues: ProjectIssue[] } {
  if (typeof doc !== 'object' || doc === null || Array.isArray(doc)) {
    return { ok: false, issues: [{ path: '(file)', message: 'must be a JSON object (a Rodwave project)' }] }
  }
  const record = doc as Record<string, unknown>
  if (record.format !== FORMAT_NAME) {
    return { ok: false, issues: [{ path: 'format', message: `must be "${FORMAT_NAME}": this is not a Rodwave project file` }] }
  }
  const version = record.version
  if (typeof version !== 'number' || !Number.isInteger(version)) {
    return { ok: false, issues: [{ path: 'version', message: 'must be a whole number' }] }
  }
  if (version > FORMAT_VERSION) {
    return {
      ok: false,
      issues: [{ path: 'version', message: `this file is format version ${version}, written by a newer Rodwave; this one reads versions up to ${FORMAT_VERSION}` }],
    }
  }
  let current = record
  for (let v = version; v < FORMAT_VERSION; v++) {
    const step = MIGRATIONS[v]
    if (!step) return { ok: false, issues: [{ path: 'version', message: `unknown format version ${version}` }] }
    current = { ...step(current), version: v + 1 }
  }
  return { ok: true, doc: current }
}

/** JSON text of a project file → project or problems. */
export function readProjectText(text: string): ProjectReadResult {
  if (text.length > MAX_FILE_CHARACTERS) {
    return {
      ok: false,
      issues: [{ path: '(file)', message: `is ${(text.length / 1e6).toFixed(1)} million characters; a project file may have at most ${MAX_FILE_CHARACTERS / 1e6} million` }],
    }
  }
  if (text.trim() === '') return { ok: false, issues: [{ path: '(file)', message: 'is empty' }] }
  let doc: unknown
  try {
    doc = JSON.parse(text)
  } catch (error) {
    const detail = error instanceof RangeError ? 'nested too deeply' : error instanceof Error ? error.message : String(error)
    return { ok: false, issues: [{ path: '(file)', message: `is not valid JSON (${echo(detail, 120)})` }] }
  }
  return readProjectDocument(doc)
}

function toPartEnd(value: EndCondition | { axial?: EndCondition; torsion?: EndCondition; bending?: BendingEndCondition }): PartEnd {
  if (typeof value === 'string') return partEnd(value)
  return partEnd(value.axial ?? 'free', value.torsion ?? 'free', value.bending ?? 'free')
}

/** A parsed JSON document → project or problems. */
export function readProjectDocument(doc: unknown): ProjectReadResult {
  const migrated = migrateDocument(doc)
  if (!migrated.ok) return migrated
  const parsed = projectSchema.safeParse(migrated.doc, { error: describeIssue })
  // Rules between fields are checked on the raw document too, so one pass reports every problem.
  const ruleIssues = checkProjectRules(migrated.doc)
  if (!parsed.success) return { ok: false, issues: [...parsed.error.issues.flatMap(toProjectIssues), ...ruleIssues] }
  if (ruleIssues.length) return { ok: false, issues: ruleIssues }
  const data = parsed.data
  const analysis: AnalysisSettings = {
    elementOrder: data.analysis?.elementOrder ?? DEFAULT_ANALYSIS.elementOrder,
    mass: data.analysis?.mass ?? DEFAULT_ANALYSIS.mass,
    modes: data.analysis?.modes ?? DEFAULT_ANALYSIS.modes,
  }
  if (data.analysis?.maxElementLength !== undefined) analysis.maxElementLength = data.analysis.maxElementLength
  if (data.analysis?.elementsPerSegment !== undefined || analysis.maxElementLength === undefined) {
    analysis.elementsPerSegment = data.analysis?.elementsPerSegment ?? DEFAULT_ANALYSIS.elementsPerSegment
  }
  if (data.analysis?.bendingTheory !== undefined) analysis.bendingTheory = data.analysis.bendingTheory
  const project: Project = {
    format: FORMAT_NAME,
    version: FORMAT_VERSION,
    ...(data.title !== undefined ? { title: data.title } : {}),
    units: data.units,
    // Reported in one order whatever the file's.
    motions: MOTIONS.filter((m) => data.motions.includes(m)),
    materials: data.materials,
    segments: data.segments,
    ends: { start: toPartEnd(data.ends.start), end: toPartEnd(data.ends.end) },
    ...(data.preload !== undefined ? { preload: data.preload } : {}),
    masses: data.masses,
    springs: data.springs,
    analysis,
    excitations: data.excitations as Project['excitations'],
    margin: data.margin,
    damping: data.damping,
    ...(data.tolerances ? { tolerances: data.tolerances } : {}),
  }
  const propertyIssues = checkFamilyProperties(project)
  if (propertyIssues.length) return { ok: false, issues: propertyIssues }
  const meshIssue = checkMeshSize(project)
  if (meshIssue) return { ok: false, issues: [meshIssue] }
  return { ok: true, project }
}

/** Validates a project already in memory (the app's editor), with the same rules and messages. */
export function validateProject(project: unknown): ProjectIssue[] {
  const result = readProjectDocument(project)
  return result.ok ? [] : result.issues
}

const isRecord = (v: unknown): v is Record<string, unknown> => typeof v === 'object' && v !== null && !Array.isArray(v)
const isFiniteNumber = (v: unknown): v is number => typeof v === 'number' && Number.isFinite(v)
const listOf = (v: unknown): unknown[] => (Array.isArray(v) ? v : [])

/** Longest piece of the user's text echoed in a message. */
export const ECHO_LIMIT = 60

/** A value from the file as it may appear in a message: at most `limit` characters, control characters escaped. */
export function echo(value: string, limit = ECHO_LIMIT): string {
  const short = value.length > limit ? `${value.slice(0, limit)}…` : value
  // eslint-disable-next-line no-control-regex -- escaping control characters is the point
  return short.replace(/[\u0000-\u001f\u007f-\u009f]/g, (c) => `\\u${c.charCodeAt(0).toString(16).padStart(4, '0')}`)
}

/**
 * Rules that relate fields to each other, checked on the raw document: a field of the
 * wrong type is skipped here (the schema reports it), so these never repeat its problems.
 */
function checkProjectRules(doc: Record<string, unknown>): ProjectIssue[] {
  const issues: ProjectIssue[] = []
  const materials = listOf(doc.materials)
  const ownIds = new Map<string, number>()
  materials.forEach((m, i) => {
    if (!isRecord(m) || typeof m.id !== 'string' || m.id.length > LIMITS.maxIdLength) return
    if (ownIds.has(m.id)) issues.push({ path: `materials[${i}].id`, message: `"${echo(m.id)}" is already used by materials[${ownIds.get(m.id)}]` })
    else ownIds.set(m.id, i)
  })
  let length = 0
  let lengthKnown = true
  listOf(doc.segments).forEach((s, i) => {
    if (!isRecord(s)) return
    if (isFiniteNumber(s.length) && s.length > 0) length += s.length
    else lengthKnown = false
    if (typeof s.material === 'string' && s.material !== '' && s.material.length <= LIMITS.maxIdLength && !ownIds.has(s.material) && !resolveMaterial({ materials: [] }, s.material)) {
      issues.push({ path: `segments[${i}].material`, message: `"${echo(s.material)}" is neither in materials nor in the built-in library` })
    }
    const section = s.section
    if (isRecord(section) && section.shape === 'tube' && isFiniteNumber(section.innerDiameter) && isFiniteNumber(section.outerDiameter)) {
      if (section.outerDiameter > 0 && section.innerDiameter >= 0 && !(section.innerDiameter < section.outerDiameter)) {
        issues.push({ path: `segments[${i}].section.innerDiameter`, message: 'must be smaller than outerDiameter' })
      }
    }
    if (isRecord(section) && section.shape === 'area' && section.secondMomentStrong !== undefined && section.secondMoment === undefined) {
      issues.push({ path: `segments[${i}].section.secondMoment`, message: 'is required with secondMomentStrong (it is the weaker principal second moment)' })
    }
  })
  if (lengthKnown && length > 0) {
    const lengthText = `${+length.toPrecision(6)} m`
    for (const name of ['masses', 'springs']) {
      listOf(doc[name]).forEach((a, i) => {
        if (isRecord(a) && isFiniteNumber(a.at) && a.at > length * (1 + 1e-12)) {
          issues.push({ path: `${name}[${i}].at`, message: `must lie on the bar, between 0 and its length ${lengthText}` })
        }
      })
    }
  }
  listOf(doc.springs).forEach((a, i) => {
    if (!isRecord(a)) return
    const kind = a.motion ?? 'axial'
    if (kind === 'bending') {
      const side = isFiniteNumber(a.stiffness) ? a.stiffness : NaN
      const turn = a.rotationalStiffness === undefined ? 0 : isFiniteNumber(a.rotationalStiffness) ? a.rotationalStiffness : NaN
      if (side === 0 && turn === 0) issues.push({ path: `springs[${i}].stiffness`, message: 'a bending spring needs a sideways stiffness or a rotationalStiffness > 0' })
    } else if (kind === 'axial' || kind === 'torsion') {
      if (isFiniteNumber(a.stiffness) && a.stiffness >= 0 && a.stiffness < 1e-6) {
        issues.push({ path: `springs[${i}].stiffness`, message: a.stiffness === 0 ? 'must be > 0' : `must be at least 1e-6 ${kind === 'axial' ? 'N/m' : 'N·m/rad'}` })
      }
      if (a.rotationalStiffness !== undefined) {
        issues.push({ path: `springs[${i}].rotationalStiffness`, message: `only a bending spring has a rotational stiffness; this spring acts in ${kind}` })
      }
    }
  })
  listOf(doc.excitations).forEach((e, i) => {
    if (!isRecord(e)) return
    for (const key of ['rpm', 'hz']) {
      const range = e[key]
      if (Array.isArray(range) && range.length === 2 && isFiniteNumber(range[0]) && isFiniteNumber(range[1]) && range[0] > range[1]) {
        issues.push({ path: `excitations[${i}].${key}`, message: 'the first value (minimum) must not exceed the second (maximum)' })
      }
    }
  })
  const analysis = doc.analysis
  if (isRecord(analysis) && analysis.elementsPerSegment !== undefined && analysis.maxElementLength !== undefined) {
    issues.push({ path: 'analysis', message: 'give either elementsPerSegment or maxElementLength, not both' })
  }
  return issues
}

/**
 * What each analysed family needs of the materials and sections: torsion needs the shear
 * modulus (or Poisson's ratio) and, for `area` sections, J and Ip; bending needs I for `area`
 * sections, and Timoshenko theory the shear modulus too.
 */
function checkFamilyProperties(project: Project): ProjectIssue[] {
  const issues: ProjectIssue[] = []
  const torsion = project.motions.includes('torsion')
  const bending = project.motions.includes('bending')
  const timoshenko = bending && project.analysis.bendingTheory === 'timoshenko'
  const needsShear = new Map<string, string>()
  project.segments.forEach((segment, i) => {
    const section = segment.section
    if (torsion || timoshenko) needsShear.set(segment.material, torsion ? 'torsion' : 'Timoshenko bending')
    if (section.shape !== 'area') return
    if (torsion && torsionConstant(section) === undefined) issues.push({ path: `segments[${i}].section.torsionConstant`, message: 'needed for torsion' })
    if (torsion && polarMoment(section) === undefined) issues.push({ path: `segments[${i}].section.polarMoment`, message: 'needed for torsion (or give secondMoment, and secondMomentStrong where it differs)' })
    if (bending && secondMoments(section) === undefined) issues.push({ path: `segments[${i}].section.secondMoment`, message: 'needed for bending' })
  })
  for (const [id, family] of needsShear) {
    const material = resolveMaterial(project, id)
    if (!material || shearModulus(material) !== undefined) continue
    const index = project.materials.findIndex((m) => m.id === id)
    issues.push({ path: `materials[${index}].poissonRatio`, message: `needed for ${family} (or give shearModulus)` })
  }
  return issues
}

/** Unknowns of each family's discrete model, without building it (fixed ends not subtracted). */
export function estimateUnknowns(project: Project): { family: Motion; unknowns: number; solves: number }[] {
  const { elementOrder, elementsPerSegment, maxElementLength } = project.analysis
  const motions = project.motions.length ? project.motions : (['axial'] as Motion[])
  // Cheap guard first: a mesh far beyond the limit is refused without planning it.
  let elements: number
  if (maxElementLength !== undefined) {
    let rough = 0
    for (const s of project.segments) rough += s.length / maxElementLength
    elements = rough > 10 * LIMITS.maxDegreesOfFreedom ? Math.ceil(rough) : countMeshElements(project, { order: 1, elementsPerSegment, maxElementLength })
  } else {
    elements = countMeshElements(project, { order: 1, elementsPerSegment, maxElementLength })
  }
  const planes = project.segments.some((s) => hasTwoBendingPlanes(s.section)) ? 2 : 1
  // Bending: a deflection and a rotation per node, less what the supports hold; each plane is its own solve.
  const heldByEnd = { clamped: 2, pinned: 1, guided: 1, free: 0 } as const
  const held = heldByEnd[project.ends.start.bending] + heldByEnd[project.ends.end.bending]
  return motions.map((family) => ({
    family,
    unknowns: family === 'bending' ? 2 * (elements + 1) - held : elements * (family === 'axial' ? elementOrder : 1) + 1,
    solves: family === 'bending' ? planes : 1,
  }))
}

/** Nodes of the largest family's mesh the analysis settings ask for (unknowns plus fixed ends), without building it. */
export function estimateDegreesOfFreedom(project: Project): number {
  return Math.max(...estimateUnknowns(project).map((f) => f.unknowns))
}

function checkMeshSize(project: Project): ProjectIssue | null {
  const field = project.analysis.maxElementLength !== undefined ? 'analysis.maxElementLength' : 'analysis.elementsPerSegment'
  const families = estimateUnknowns(project)
  const largest = Math.max(...families.map((f) => f.unknowns))
  if (families.some((f) => f.family === 'axial')) {
    const fixedEnds = (project.ends.start.axial === 'fixed' ? 1 : 0) + (project.ends.end.axial === 'fixed' ? 1 : 0)
    const axial = families.find((f) => f.family === 'axial')!.unknowns
    if (axial - fixedEnds < 1) return { path: field, message: 'leaves no node free to move between the two fixed ends; use at least 2 elements' }
  }
  if (largest > LIMITS.maxDegreesOfFreedom) {
    return { path: field, message: `gives a mesh of about ${largest.toExponential(2)} unknowns; Rodwave solves at most ${LIMITS.maxDegreesOfFreedom.toLocaleString('en-US')}` }
  }
  let product = 0
  for (const f of families) product += f.unknowns * f.solves * project.analysis.modes
  if (product > LIMITS.maxUnknownsTimesModes) {
    const path = project.analysis.modes > 1 ? 'analysis.modes' : field
    return {
      path,
      message: `asks for ${project.analysis.modes} modes of about ${(product / project.analysis.modes).toExponential(2)} unknowns; Rodwave keeps at most ${LIMITS.maxUnknownsTimesModes.toExponential(0)} unknowns × modes (the mode shapes alone would need ${((8 * product) / 1e9).toFixed(1)} GB): ask for fewer modes or a coarser mesh`,
    }
  }
  return null
}

/** Words for the problems zod finds, in Rodwave's own phrasing. */
function describeIssue(issue: z.core.$ZodRawIssue): string | undefined {
  if (issue.input === undefined && (issue.code === 'invalid_type' || issue.code === 'invalid_value' || issue.code === 'invalid_union')) {
    return 'is required'
  }
  if (issue.code === 'invalid_type') {
    if (issue.expected === 'number') return typeof issue.input === 'number' ? 'must be a finite number' : 'must be a number'
    if (issue.expected === 'string') return 'must be text'
    if (issue.expected === 'array') return 'must be a list'
    if (issue.expected === 'object') return 'must be an object'
    if (issue.expected === 'tuple') return 'must be a list of two numbers [minimum, maximum]'
    return `must be ${issue.expected}`
  }
  if (issue.code === 'invalid_value') return `must be one of: ${issue.values.map((v) => JSON.stringify(v)).join(', ')}`
  if (issue.code === 'invalid_union') {
    const discriminator = (issue as { discriminator?: string }).discriminator
    if (discriminator === 'shape') return 'must be one of: "solid", "tube", "rectangle", "area", "cone"'
    return undefined
  }
  return undefined
}

function formatPath(path: readonly PropertyKey[]): string {
  let out = ''
  for (const p of path) {
    if (typeof p === 'number') out += `[${p}]`
    else out += out ? `.${echo(String(p))}` : echo(String(p))
  }
  return out || '(file)'
}

function toProjectIssues(issue: z.core.$ZodIssue): ProjectIssue[] {
  if (issue.code === 'unrecognized_keys') {
    return issue.keys.map((key) => ({ path: formatPath([...issue.path, key]), message: 'is not a field of a Rodwave project' }))
  }
  if (issue.code === 'invalid_union' && !(issue as { discriminator?: string }).discriminator) {
    const last = issue.path.at(-1)
    if (last === 'start' || last === 'end') {
      // An object end with a wrong field: report that field's own problem.
      const inside = issue.errors.find((branch) => branch.length > 0 && branch.every((sub) => sub.path.length > 0))
      if (inside) return inside.flatMap((sub) => toProjectIssues({ ...sub, path: [...issue.path, ...sub.path] } as z.core.$ZodIssue))
      return [{ path: formatPath(issue.path), message: 'must be "fixed" or "free" (the axial condition), or an object with axial, torsion and bending conditions' }]
    }
    // Excitations: a speed with orders, or a frequency. Report the closest alternative's own problems.
    const branches = issue.errors
    const best = branches.reduce((a, b) => (b.length < a.length ? b : a), branches[0] ?? [])
    if (best.length) return best.flatMap((sub) => toProjectIssues({ ...sub, path: [...issue.path, ...sub.path] } as z.core.$ZodIssue))
    return [{ path: formatPath(issue.path), message: 'must be either { rpm, orders } or { hz }' }]
  }
  const path = issue.code === 'invalid_union' && issue.path.at(-1) !== 'shape' ? [...issue.path, 'shape'] : issue.path
  return [{ path: formatPath(path), message: issue.message }]
}

/** The problems as lines "path: message", one per problem. */
export function formatProjectIssues(issues: readonly ProjectIssue[]): string {
  return issues.map((i) => `${i.path}: ${i.message}`).join('\n')
}
