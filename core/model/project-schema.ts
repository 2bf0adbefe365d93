/**
 * Reading a project file: JSON text → a valid Project, or the complete list of
 * problems, each named by its JSON path ("segments[2].section.diameter: must be > 0").
 * Structure and ranges are checked with a zod schema; rules that relate fields
 * (material ids, positions within the bar, the tube's bore) are checked after it.
 * Nothing here throws on bad input.
 */
import * as z from 'zod'
import {
  DEFAULT_ANALYSIS,
  DEFAULT_DAMPING,
  DEFAULT_MARGIN,
  FORMAT_NAME,
  FORMAT_VERSION,
  LIMITS,
  type AnalysisSettings,
  type Project,
} from './project'
import { resolveMaterial } from './geometry'
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
const dimension = () => physical(1e-6, 100, 'm')
const length = () => physical(1e-6, 1e4, 'm')
const label = () => z.string().max(200, 'must be at most 200 characters')
const speedOrFrequency = () => physical(1e-6, 1e9, '(rpm or Hz)')
const valueOrRange = () => z.union([speedOrFrequency(), z.tuple([speedOrFrequency(), speedOrFrequency()])])

const sectionSchema = z.discriminatedUnion('shape', [
  z.strictObject({ shape: z.literal('solid'), diameter: dimension() }),
  z.strictObject({ shape: z.literal('tube'), outerDiameter: dimension(), innerDiameter: nonNegative().lte(100, 'must be at most 100 m') }),
  z.strictObject({ shape: z.literal('rectangle'), width: dimension(), height: dimension() }),
  z.strictObject({ shape: z.literal('area'), area: physical(1e-12, 1e4, 'm²') }),
  z.strictObject({ shape: z.literal('cone'), startDiameter: dimension(), endDiameter: dimension() }),
])

const endCondition = z.enum(['fixed', 'free'])
const fraction = (upper: number, text: string) => z.number().gte(0, 'must be ≥ 0').lt(upper, text)

const projectSchema = z.strictObject({
  format: z.literal(FORMAT_NAME),
  version: z.literal(FORMAT_VERSION),
  title: label().optional(),
  units: z.enum(['SI', 'US']).default('SI'),
  materials: z
    .array(
      z.strictObject({
        id: z.string().min(1, 'must not be empty').max(100, 'must be at most 100 characters'),
        name: label().optional(),
        youngsModulus: physical(1e3, 1e13, 'Pa'),
        density: physical(1e-3, 1e6, 'kg/m³'),
      }),
    )
    .max(1000, 'must have at most 1000 entries')
    .default([]),
  segments: z
    .array(z.strictObject({ length: length(), material: z.string().min(1, 'must not be empty'), section: sectionSchema }))
    .min(1, 'must have at least one segment')
    .max(LIMITS.maxSegments, `must have at most ${LIMITS.maxSegments} segments`),
  ends: z.strictObject({ start: endCondition, end: endCondition }),
  masses: z
    .array(z.strictObject({ at: nonNegative(), mass: physical(1e-12, 1e12, 'kg'), label: label().optional() }))
    .max(LIMITS.maxAttachments, `must have at most ${LIMITS.maxAttachments} entries`)
    .default([]),
  springs: z
    .array(z.strictObject({ at: nonNegative(), stiffness: physical(1e-6, 1e20, 'N/m'), label: label().optional() }))
    .max(LIMITS.maxAttachments, `must have at most ${LIMITS.maxAttachments} entries`)
    .default([]),
  analysis: z
    .strictObject({
      elementOrder: z.literal([1, 2]).optional(),
      elementsPerSegment: z.number().int('must be a whole number').gte(1, 'must be ≥ 1').optional(),
      maxElementLength: physical(1e-7, 1e4, 'm').optional(),
      mass: z.enum(['consistent', 'lumped', 'mixed']).optional(),
      modes: z.number().int('must be a whole number').gte(1, 'must be ≥ 1').lte(LIMITS.maxModes, `must be ≤ ${LIMITS.maxModes}`).optional(),
    })
    .optional(),
  excitations: z
    .array(
      z.union([
        z.strictObject({
          label: label().optional(),
          rpm: valueOrRange(),
          orders: z.array(physical(1e-6, 1e5, '')).min(1, 'must list at least one order').max(LIMITS.maxOrdersPerExcitation, `must list at most ${LIMITS.maxOrdersPerExcitation} orders`),
        }),
        z.strictObject({ label: label().optional(), hz: valueOrRange() }),
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
    })
    .optional(),
})

/** Migrations from version v to v + 1, keyed by v. Version 1 is the first format, so none exist yet. */
const MIGRATIONS: Record<number, (doc: Record<string, unknown>) => Record<string, unknown>> = {}

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
    return { ok: false, issues: [{ path: '(file)', message: `is not valid JSON (${detail})` }] }
  }
  return readProjectDocument(doc)
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
  const project: Project = {
    format: FORMAT_NAME,
    version: FORMAT_VERSION,
    ...(data.title !== undefined ? { title: data.title } : {}),
    units: data.units,
    materials: data.materials,
    segments: data.segments,
    ends: data.ends,
    masses: data.masses,
    springs: data.springs,
    analysis,
    excitations: data.excitations as Project['excitations'],
    margin: data.margin,
    damping: data.damping,
    ...(data.tolerances ? { tolerances: data.tolerances } : {}),
  }
  const dofs = estimateDegreesOfFreedom(project)
  const fixedEnds = (project.ends.start === 'fixed' ? 1 : 0) + (project.ends.end === 'fixed' ? 1 : 0)
  if (dofs - fixedEnds < 1) {
    const field = project.analysis.maxElementLength !== undefined ? 'analysis.maxElementLength' : 'analysis.elementsPerSegment'
    return { ok: false, issues: [{ path: field, message: 'leaves no node free to move between the two fixed ends; use at least 2 elements' }] }
  }
  if (dofs > LIMITS.maxDegreesOfFreedom) {
    const field = project.analysis.maxElementLength !== undefined ? 'analysis.maxElementLength' : 'analysis.elementsPerSegment'
    return {
      ok: false,
      issues: [
        {
          path: field,
          message: `gives a mesh of about ${dofs.toExponential(2)} unknowns; Rodwave solves at most ${LIMITS.maxDegreesOfFreedom.toLocaleString('en-US')}`,
        },
      ],
    }
  }
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

/**
 * Rules that relate fields to each other, checked on the raw document: a field of the
 * wrong type is skipped here (the schema reports it), so these never repeat its problems.
 */
function checkProjectRules(doc: Record<string, unknown>): ProjectIssue[] {
  const issues: ProjectIssue[] = []
  const materials = listOf(doc.materials)
  const ownIds = new Map<string, number>()
  materials.forEach((m, i) => {
    if (!isRecord(m) || typeof m.id !== 'string') return
    if (ownIds.has(m.id)) issues.push({ path: `materials[${i}].id`, message: `"${m.id}" is already used by materials[${ownIds.get(m.id)}]` })
    else ownIds.set(m.id, i)
  })
  let length = 0
  let lengthKnown = true
  listOf(doc.segments).forEach((s, i) => {
    if (!isRecord(s)) return
    if (isFiniteNumber(s.length) && s.length > 0) length += s.length
    else lengthKnown = false
    if (typeof s.material === 'string' && s.material !== '' && !ownIds.has(s.material) && !resolveMaterial({ materials: [] }, s.material)) {
      issues.push({ path: `segments[${i}].material`, message: `"${s.material}" is neither in materials nor in the built-in library` })
    }
    const section = s.section
    if (isRecord(section) && section.shape === 'tube' && isFiniteNumber(section.innerDiameter) && isFiniteNumber(section.outerDiameter)) {
      if (section.outerDiameter > 0 && section.innerDiameter >= 0 && !(section.innerDiameter < section.outerDiameter)) {
        issues.push({ path: `segments[${i}].section.innerDiameter`, message: 'must be smaller than outerDiameter' })
      }
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

/** Nodes of the mesh the analysis settings ask for (unknowns plus fixed ends), without building it. */
export function estimateDegreesOfFreedom(project: Project): number {
  const { elementOrder, elementsPerSegment, maxElementLength } = project.analysis
  // Cheap guard first: a mesh far beyond the limit is refused without planning it.
  if (maxElementLength !== undefined) {
    let rough = 0
    for (const s of project.segments) rough += s.length / maxElementLength
    if (rough * elementOrder > 10 * LIMITS.maxDegreesOfFreedom) return Math.ceil(rough * elementOrder)
  }
  return countMeshElements(project, { order: elementOrder, elementsPerSegment, maxElementLength }) * elementOrder + 1
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
    else out += out ? `.${String(p)}` : String(p)
  }
  return out || '(file)'
}

function toProjectIssues(issue: z.core.$ZodIssue): ProjectIssue[] {
  if (issue.code === 'unrecognized_keys') {
    return issue.keys.map((key) => ({ path: formatPath([...issue.path, key]), message: 'is not a field of a Rodwave project' }))
  }
  if (issue.code === 'invalid_union' && !(issue as { discriminator?: string }).discriminator) {
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
