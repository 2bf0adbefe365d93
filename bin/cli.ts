/**
 * The command line over Rodwave's core: `rodwave <command> FILE [options]`.
 * runCli is a plain function over an injected IO, so tests run it without a process.
 * Exit codes (EXIT): 0 done, 1 invalid input, 2 wrong usage, 3 --fail-on-conflict found a
 * conflict, 4 no value in the tuner's range reaches the target.
 */
import { parseArgs } from 'node:util'
import { nowMs } from '../core/clock'
import { readProjectDocument, readProjectText, formatProjectIssues } from '../core/model/project-schema'
import { AnalysisInputError, type AnalysisOverrides } from '../core/analysis/modal-analysis'
import { MOTIONS, type BendingTheory, type Motion, type Project } from '../core/model/project'
import { COMMANDS, type CommandContext, type InputTiming } from './commands'
import { CAUTION, capEchoes, echo, echoPath, EXIT, integerOption, OPTIONS, OutOfReachError, UsageError, type CliIo, type CliValues } from './cli-common'

export { CAUTION, ECHO_LIMIT, echo, echoPath, EXIT, integerOption, numberOption, OutOfReachError, UsageError, type CliIo, type CliValues } from './cli-common'

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
  --modes N                    modes per family (per bending plane)
  --motions LIST               the motion families analysed, comma-separated: axial,torsion,bending
                               (overrides the file's "motions")
  --bending-theory euler-bernoulli|timoshenko
  --fail-on-conflict           exit 3 when any mode conflicts with an excitation
  --motion FAMILY              one family for sensitivity, tune, scatter, response and converge:
                               axial, torsion, bending (bending-weak, bending-strong on a two-plane section)
Run "rodwave <command> --help" for a command's own options.
Exit codes: 0 done, 1 invalid input, 2 wrong usage, 3 a conflict (--fail-on-conflict), 4 the target is out of reach (tune).

${CAUTION}`

function overridesFrom(values: CliValues): AnalysisOverrides {
  const overrides: AnalysisOverrides = {}
  if (values.mass !== undefined) {
    if (!['consistent', 'lumped', 'mixed'].includes(values.mass)) throw new UsageError(`--mass must be consistent, lumped or mixed (got "${echo(values.mass)}")`)
    overrides.mass = values.mass as AnalysisOverrides['mass']
  }
  const order = integerOption(values, 'order', 1, 2)
  if (order !== undefined) overrides.elementOrder = order as 1 | 2
  const eps = integerOption(values, 'elements-per-segment', 1, 2_000_000)
  if (eps !== undefined) overrides.elementsPerSegment = eps
  const modes = integerOption(values, 'modes', 1, 200)
  if (modes !== undefined) overrides.modes = modes
  if (values.motions !== undefined) overrides.motions = motionsOption(values.motions)
  const theory = values['bending-theory']
  if (theory !== undefined) {
    if (!BENDING_THEORIES.includes(theory as BendingTheory)) throw new UsageError(`--bending-theory must be euler-bernoulli or timoshenko (got "${echo(theory)}")`)
    overrides.bendingTheory = theory as BendingTheory
  }
  return overrides
}

const BENDING_THEORIES: readonly BendingTheory[] = ['euler-bernoulli', 'timoshenko']

/** `--motions axial,torsion`: known names, at least one, each once, in the order Rodwave reports them. */
function motionsOption(raw: string): Motion[] {
  const names = raw.split(',').map((name) => name.trim())
  const unknown = names.filter((name) => !MOTIONS.includes(name as Motion))
  if (unknown.length > 0 || names.length === 0) {
    const shown = unknown.map((name) => `"${echo(name)}"`).join(', ') || `"${echo(raw)}"`
    throw new UsageError(`--motions takes axial, torsion and bending, comma-separated (got ${shown})`)
  }
  return MOTIONS.filter((m) => names.includes(m))
}

/**
 * The project with --motions and --bending-theory applied, checked again as a file would be: a
 * family the file did not analyse may need data it does not give (a shear modulus for torsion,
 * a second moment for bending).
 */
function withFamilyOverrides(project: Project, overrides: AnalysisOverrides): ReturnType<typeof readProjectDocument> {
  if (!overrides.motions && !overrides.bendingTheory) return { ok: true, project }
  return readProjectDocument({
    ...project,
    ...(overrides.motions ? { motions: overrides.motions } : {}),
    analysis: { ...project.analysis, ...(overrides.bendingTheory ? { bendingTheory: overrides.bendingTheory } : {}) },
  })
}

function familyOptionsText(values: CliValues): string {
  return [values.motions !== undefined ? `--motions ${echo(values.motions)}` : '', values['bending-theory'] !== undefined ? `--bending-theory ${echo(values['bending-theory'])}` : '']
    .filter(Boolean)
    .join(' ')
}

/** Where the time before the command went, when the command line runs as a process. */
export interface RunOptions {
  /** Process start to the command line's first statement: Node's own start and loading Rodwave, ms. */
  readonly startupMs?: number
}

export async function runCli(argv: readonly string[], io: CliIo, options: RunOptions = {}): Promise<number> {
  const startedAt = nowMs()
  let parsed
  try {
    parsed = parseArgs({ args: [...argv], options: OPTIONS, allowPositionals: true, strict: true })
  } catch (error) {
    io.stderr(`rodwave: ${capEchoes(error instanceof Error ? error.message : String(error))}\n\n${USAGE}\n`)
    return EXIT.usage
  }
  const [commandName, file, ...extra] = parsed.positionals
  const values = parsed.values as CliValues
  if (!commandName || (values.help && !commandName)) {
    ;(values.help ? io.stdout : io.stderr)(`${USAGE}\n`)
    return values.help ? EXIT.done : EXIT.usage
  }
  const command = Object.hasOwn(COMMANDS, commandName) ? COMMANDS[commandName] : undefined
  if (!command) {
    io.stderr(`rodwave: unknown command "${echo(commandName)}"\n\n${USAGE}\n`)
    return EXIT.usage
  }
  if (values.help) {
    io.stdout(`Usage: rodwave ${commandName} FILE ${command.usage}\n${command.summary}\n${command.help ? `\n${command.help}\n` : ''}\n${CAUTION}\n`)
    return EXIT.done
  }
  if (!file || extra.length) {
    io.stderr(`rodwave: ${commandName} needs exactly one project FILE\nUsage: rodwave ${commandName} FILE ${command.usage}\n`)
    return EXIT.usage
  }
  let overrides: AnalysisOverrides
  try {
    overrides = overridesFrom(values)
  } catch (error) {
    if (error instanceof UsageError) {
      io.stderr(`rodwave: ${error.message}\n`)
      return EXIT.usage
    }
    throw error
  }
  const readStart = nowMs()
  let text: string
  try {
    text = await io.readFile(file)
  } catch (error) {
    const code = (error as { code?: string }).code
    const reason =
      code === 'ENOENT' ? 'no such file' : code === 'EISDIR' ? 'it is a folder' : code === 'EACCES' ? 'permission denied' : error instanceof Error ? error.message : String(error)
    io.stderr(`rodwave: cannot read ${echoPath(file)}: ${reason}\n`)
    return EXIT.invalidInput
  }
  const validateStart = nowMs()
  const read = readProjectText(text)
  if (!read.ok) {
    io.stderr(`rodwave: ${echoPath(file)} is not a valid Rodwave project:\n${formatProjectIssues(read.issues)}\n`)
    return EXIT.invalidInput
  }
  const overridden = withFamilyOverrides(read.project, overrides)
  if (!overridden.ok) {
    io.stderr(`rodwave: with ${familyOptionsText(values)}, ${echoPath(file)} is not a valid Rodwave project:\n${formatProjectIssues(overridden.issues)}\n`)
    return EXIT.invalidInput
  }
  const project: Project = overridden.project
  const timing: InputTiming = { startedAt, ...options, readMs: validateStart - readStart, validateMs: nowMs() - validateStart }
  const context: CommandContext = { project, file, values, overrides, io, timing }
  try {
    return await command.run(context)
  } catch (error) {
    if (error instanceof UsageError) {
      io.stderr(`rodwave: ${error.message}\n`)
      return EXIT.usage
    }
    if (error instanceof OutOfReachError) {
      io.stderr(`rodwave: ${error.message}\n`)
      return EXIT.targetOutOfReach
    }
    if (error instanceof AnalysisInputError) {
      // Found only by the analysis (a compression past the buckling load): invalid input, by path.
      io.stderr(`rodwave: ${echoPath(file)} is not a valid Rodwave project:\n  ${error.message}\n`)
      return EXIT.invalidInput
    }
    if (error instanceof RangeError) {
      io.stderr(`rodwave: ${error.message}\n`)
      return EXIT.invalidInput
    }
    throw error
  }
}
