/**
 * The command line over Rodwave's core: `rodwave <command> FILE [options]`.
 * runCli is a plain function over an injected IO, so tests run it without a process.
 * Exit codes: 0 done, 1 invalid input, 2 wrong usage, 3 --fail-on-conflict found a conflict.
 */
import { parseArgs } from 'node:util'
import { readProjectText, formatProjectIssues } from '../core/model/project-schema'
import type { AnalysisOverrides } from '../core/analysis/modal-analysis'
import type { Project } from '../core/model/project'
import { COMMANDS, type CommandContext } from './commands'

export interface CliIo {
  readFile(path: string): Promise<string>
  writeFile(path: string, data: string | Uint8Array): Promise<void>
  stdout(text: string): void
  stderr(text: string): void
}

export class UsageError extends Error {}

const USAGE = `Usage: rodwave <command> FILE [options]

Commands:
${Object.entries(COMMANDS)
  .map(([name, c]) => `  ${name.padEnd(12)}${c.summary}`)
  .join('\n')}

Options (override the file's analysis):
  --json                       JSON output (default for solve)
  --csv                        the modal summary table as CSV (solve), or the study as CSV (converge)
  --mass consistent|lumped|mixed
  --order 1|2                  element order (2-node or 3-node elements)
  --elements-per-segment N
  --modes N
  --fail-on-conflict           exit 3 when any mode conflicts with an excitation
Run "rodwave <command> --help" for a command's own options.`

const OPTIONS = {
  json: { type: 'boolean' },
  csv: { type: 'boolean' },
  mass: { type: 'string' },
  order: { type: 'string' },
  'elements-per-segment': { type: 'string' },
  modes: { type: 'string' },
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
  help: { type: 'boolean', short: 'h' },
} as const

export type CliValues = { [K in keyof typeof OPTIONS]?: (typeof OPTIONS)[K]['type'] extends 'boolean' ? boolean : string }

/** A whole number option within bounds, or a usage error naming the flag. */
export function integerOption(values: CliValues, name: keyof CliValues, min: number, max: number): number | undefined {
  const raw = values[name]
  if (raw === undefined) return undefined
  const v = Number(raw)
  if (typeof raw !== 'string' || !Number.isInteger(v) || v < min || v > max) {
    throw new UsageError(`--${name} must be a whole number from ${min} to ${max} (got "${String(raw)}")`)
  }
  return v
}

/** A finite number option, or a usage error naming the flag. */
export function numberOption(values: CliValues, name: keyof CliValues): number | undefined {
  const raw = values[name]
  if (raw === undefined) return undefined
  const v = Number(raw)
  if (typeof raw !== 'string' || raw.trim() === '' || !Number.isFinite(v)) throw new UsageError(`--${name} must be a number (got "${String(raw)}")`)
  return v
}

function overridesFrom(values: CliValues): AnalysisOverrides {
  const overrides: AnalysisOverrides = {}
  if (values.mass !== undefined) {
    if (!['consistent', 'lumped', 'mixed'].includes(values.mass)) throw new UsageError(`--mass must be consistent, lumped or mixed (got "${values.mass}")`)
    overrides.mass = values.mass as AnalysisOverrides['mass']
  }
  const order = integerOption(values, 'order', 1, 2)
  if (order !== undefined) overrides.elementOrder = order as 1 | 2
  const eps = integerOption(values, 'elements-per-segment', 1, 2_000_000)
  if (eps !== undefined) overrides.elementsPerSegment = eps
  const modes = integerOption(values, 'modes', 1, 200)
  if (modes !== undefined) overrides.modes = modes
  return overrides
}

export async function runCli(argv: readonly string[], io: CliIo): Promise<number> {
  let parsed
  try {
    parsed = parseArgs({ args: [...argv], options: OPTIONS, allowPositionals: true, strict: true })
  } catch (error) {
    io.stderr(`rodwave: ${error instanceof Error ? error.message : String(error)}\n\n${USAGE}\n`)
    return 2
  }
  const [commandName, file, ...extra] = parsed.positionals
  const values = parsed.values as CliValues
  if (!commandName || (values.help && !commandName)) {
    ;(values.help ? io.stdout : io.stderr)(`${USAGE}\n`)
    return values.help ? 0 : 2
  }
  const command = COMMANDS[commandName]
  if (!command) {
    io.stderr(`rodwave: unknown command "${commandName}"\n\n${USAGE}\n`)
    return 2
  }
  if (values.help) {
    io.stdout(`Usage: rodwave ${commandName} FILE ${command.usage}\n${command.summary}\n`)
    return 0
  }
  if (!file || extra.length) {
    io.stderr(`rodwave: ${commandName} needs exactly one project FILE\nUsage: rodwave ${commandName} FILE ${command.usage}\n`)
    return 2
  }
  let overrides: AnalysisOverrides
  try {
    overrides = overridesFrom(values)
  } catch (error) {
    if (error instanceof UsageError) {
      io.stderr(`rodwave: ${error.message}\n`)
      return 2
    }
    throw error
  }
  let text: string
  try {
    text = await io.readFile(file)
  } catch (error) {
    const code = (error as { code?: string }).code
    const reason =
      code === 'ENOENT' ? 'no such file' : code === 'EISDIR' ? 'it is a folder' : code === 'EACCES' ? 'permission denied' : error instanceof Error ? error.message : String(error)
    io.stderr(`rodwave: cannot read ${file}: ${reason}\n`)
    return 1
  }
  const read = readProjectText(text)
  if (!read.ok) {
    io.stderr(`rodwave: ${file} is not a valid Rodwave project:\n${formatProjectIssues(read.issues)}\n`)
    return 1
  }
  const project: Project = read.project
  const context: CommandContext = { project, file, values, overrides, io }
  try {
    return await command.run(context)
  } catch (error) {
    if (error instanceof UsageError) {
      io.stderr(`rodwave: ${error.message}\n`)
      return 2
    }
    if (error instanceof RangeError) {
      io.stderr(`rodwave: ${error.message}\n`)
      return 1
    }
    throw error
  }
}
