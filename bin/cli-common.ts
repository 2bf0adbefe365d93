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
