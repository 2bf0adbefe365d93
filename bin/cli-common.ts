import { effectiveSettings, withMotions, type AnalysisOverrides } from '../core/analysis/modal-analysis'
import { bandName, type ResonancePair } from '../core/analysis/resonance'
import { analysedFamilies, familyName, type Family, type FamilyKey } from '../core/model/families'
import { LIMITS, type Motion, type Project } from '../core/model/project'
import { estimateDegreesOfFreedom } from '../core/model/project-schema'

/**
 * What every command of the command line shares: the IO it writes through, its options, the
 * exit codes, the usage errors, the caution line and how a message echoes what the user typed.
 * (A module of its own so that the commands can import it without a cycle through cli.ts.)
 */
export interface CliIo {
  readFile(path: string): Promise<string>
  writeFile(path: string, data: string | Uint8Array): Promise<void>
  stdout(text: string): void
  stderr(text: string): void
}

/** The process exit codes, as README's "Command line" lists them. */
export const EXIT = { done: 0, invalidInput: 1, usage: 2, conflict: 3, targetOutOfReach: 4 } as const

export class UsageError extends Error {}

/** A command's answer that the input cannot give (exit 4): the search ran, and nothing in the range reaches the target. */
export class OutOfReachError extends Error {}

/** The usual caution, one line, under every help text and text (not JSON/CSV) output. */
export const CAUTION =
  'Results are an engineering aid: verify them on the real part (an impact test, for example) and defer to local codes and licensed engineering practice.'

/** Longest value echoed back in a message; a longer one is cut with an ellipsis. */
export const ECHO_LIMIT = 60

/** A value the user typed, as a message shows it: at most ECHO_LIMIT characters. */
export function echo(value: string): string {
  return value.length <= ECHO_LIMIT ? value : `${value.slice(0, ECHO_LIMIT - 1)}…`
}

/** A path as a message shows it: its last ECHO_LIMIT characters, where the file's name is. */
export function echoPath(path: string): string {
  return path.length <= ECHO_LIMIT ? path : `…${path.slice(path.length - ECHO_LIMIT + 1)}`
}

/** The longest message about the arguments themselves (Node's parser quotes the offending option in it). */
const ARGUMENT_MESSAGE_LIMIT = 400

/** A message that may quote what the user typed: every word capped like echo, the whole at ARGUMENT_MESSAGE_LIMIT. */
export function capEchoes(message: string): string {
  const capped = message.replace(/\S{61,}/g, (word) => echo(word))
  return capped.length <= ARGUMENT_MESSAGE_LIMIT ? capped : `${capped.slice(0, ARGUMENT_MESSAGE_LIMIT - 1)}…`
}

export const OPTIONS = {
  json: { type: 'boolean' },
  csv: { type: 'boolean' },
  mass: { type: 'string' },
  order: { type: 'string' },
  'elements-per-segment': { type: 'string' },
  modes: { type: 'string' },
  motions: { type: 'string' },
  'bending-theory': { type: 'string' },
  motion: { type: 'string' },
  'fail-on-conflict': { type: 'boolean' },
  out: { type: 'string' },
  parameter: { type: 'string' },
  min: { type: 'string' },
  max: { type: 'string' },
  mode: { type: 'string' },
  target: { type: 'string' },
  samples: { type: 'string' },
  seed: { type: 'string' },
  'force-at': { type: 'string' },
  'response-at': { type: 'string' },
  from: { type: 'string' },
  to: { type: 'string' },
  points: { type: 'string' },
  'log-spaced': { type: 'boolean' },
  force: { type: 'string' },
  help: { type: 'boolean', short: 'h' },
} as const

export type CliValues = { [K in keyof typeof OPTIONS]?: (typeof OPTIONS)[K]['type'] extends 'boolean' ? boolean : string }

/** A whole number option within bounds, or a usage error naming the flag. */
export function integerOption(values: CliValues, name: keyof CliValues, min: number, max: number): number | undefined {
  const raw = values[name]
  if (raw === undefined) return undefined
  const v = Number(raw)
  if (typeof raw !== 'string' || !Number.isInteger(v) || v < min || v > max) {
    throw new UsageError(`--${name} must be a whole number from ${min} to ${max} (got "${echo(String(raw))}")`)
  }
  return v
}

/** A finite number option, or a usage error naming the flag. */
export function numberOption(values: CliValues, name: keyof CliValues): number | undefined {
  const raw = values[name]
  if (raw === undefined) return undefined
  const v = Number(raw)
  if (typeof raw !== 'string' || raw.trim() === '' || !Number.isFinite(v)) throw new UsageError(`--${name} must be a number (got "${echo(String(raw))}")`)
  return v
}

/** What `--motion` may name: a motion, or one bending plane of a two-plane section. */
const FAMILY_NAMES: readonly FamilyKey[] = ['axial', 'torsion', 'bending', 'bending-weak', 'bending-strong']

/** The families `--motion` chooses among the project's analysed ones (all of them without it). */
export interface ChosenFamilies {
  /** The motions of the chosen families. */
  readonly motions: Motion[]
  readonly families: Family[]
  /** Whether --motion was given. */
  readonly given: boolean
}

/**
 * `--motion NAME`: a family the project analyses. "bending" means both planes of a two-plane
 * section; "bending-weak" and "bending-strong" one of them.
 */
export function chosenFamilies(project: Project, values: CliValues): ChosenFamilies {
  const all = analysedFamilies(project)
  const raw = values.motion
  if (raw === undefined) return { motions: [...new Set(all.map((f) => f.motion))], families: all, given: false }
  if (!FAMILY_NAMES.includes(raw as FamilyKey)) {
    throw new UsageError(`--motion must be axial, torsion or bending (bending-weak or bending-strong for one plane of a two-plane section); got "${echo(raw)}"`)
  }
  const families = all.filter((f) => f.key === raw || f.motion === raw)
  if (families.length === 0) {
    const motion = raw.startsWith('bending') ? 'bending' : raw
    if (project.motions.includes(motion as Motion)) throw new UsageError(`--motion ${raw}: the section bends in one plane; use --motion bending`)
    throw new UsageError(`--motion ${raw}: the project does not analyse ${motion} (it analyses ${project.motions.join(', ')}); add it with --motions`)
  }
  return { motions: [families[0].motion], families, given: true }
}

/** A family in words with a capital: "Axial", "Bending (weak plane)". */
export function familyTitle(family: Pick<Family, 'motion' | 'plane'>): string {
  const name = familyName(family)
  return name.charAt(0).toUpperCase() + name.slice(1)
}

/** The project as the flags leave it (analysis settings and motions); refuses a mesh beyond the solver's limit. */
export function projectWithOverrides(project: Project, overrides: AnalysisOverrides): Project {
  const settings = effectiveSettings(project, overrides)
  const adjusted = { ...withMotions(project, overrides), analysis: settings }
  const dofs = estimateDegreesOfFreedom(adjusted)
  if (dofs > LIMITS.maxDegreesOfFreedom) {
    throw new UsageError(`--elements-per-segment gives about ${dofs.toExponential(2)} unknowns; Rodwave solves at most ${LIMITS.maxDegreesOfFreedom.toLocaleString('en-US')}`)
  }
  return adjusted
}

/** --motion picks one family for the design commands; solve and report analyse every family of --motions. */
export function refuseMotion(command: string, values: CliValues): void {
  if (values.motion !== undefined) throw new UsageError(`${command} analyses every family of the file's motions; choose them with --motions (--motion is for sensitivity, tune, scatter, response and converge)`)
}

/** One line per conflicting pair, naming the family of the mode: "torsion mode 2 (905.3 Hz) and Gear mesh ×1 (900 Hz): separation 0.6 %". */
export function conflictLines(conflicts: readonly ResonancePair[]): string[] {
  return conflicts.map((p) => {
    const [lo, hi] = p.band.hz
    const band = lo === hi ? `${lo.toPrecision(6)} Hz` : `${lo.toPrecision(6)}–${hi.toPrecision(6)} Hz`
    return `rodwave: conflict: ${familyName(p)} mode ${p.mode} (${p.frequencyHz.toPrecision(6)} Hz) and ${echo(bandName(p.band))} (${band}): separation ${(100 * p.separation).toFixed(1)} %\n`
  })
}

