/**
 * Argument checks for every IPC request. The renderer is treated as untrusted: each
 * argument is checked for type and size before any file or dialog is touched.
 */
import { isAbsolute } from 'node:path'
import { z } from 'zod'
import { MAX_PROJECT_BYTES } from '../core/model/project-bytes'
import type { DocumentState, ExportRequest, SaveRequest } from './ipc-contract'
import { RECOVERY_ID_PATTERN } from './recovery'

const MEGABYTE = 1024 * 1024
/** Largest project file Rodwave opens or saves (so whatever it saves, it can open again): core's one limit. */
export { MAX_PROJECT_BYTES }
/** Largest export: a report's HTML with its charts as inline SVG. */
export const MAX_EXPORT_BYTES = 50 * MEGABYTE
export const MAX_PATH_LENGTH = 4096
export const MAX_NAME_LENGTH = 255
export const MAX_TITLE_LENGTH = 500

export function utf8Length(text: string): number {
  return Buffer.byteLength(text, 'utf8')
}

export function formatMegabytes(bytes: number): string {
  return `${(bytes / MEGABYTE).toFixed(1)} MB`
}

function textUpTo(limit: number) {
  return z.string().refine((text) => utf8Length(text) <= limit, { error: `must be at most ${formatMegabytes(limit)}` })
}

export const filePathSchema = z
  .string()
  .min(1, { error: 'must not be empty' })
  .max(MAX_PATH_LENGTH, { error: `must be at most ${MAX_PATH_LENGTH} characters` })
  .refine((path) => !path.includes('\0'), { error: 'must not contain a NUL character' })
  .refine((path) => isAbsolute(path), { error: 'must be an absolute path' })

const suggestedNameSchema = z.string().max(MAX_NAME_LENGTH, { error: `must be at most ${MAX_NAME_LENGTH} characters` })

export const saveRequestSchema = z.object({
  path: filePathSchema.nullable(),
  suggestedName: suggestedNameSchema,
  text: textUpTo(MAX_PROJECT_BYTES),
}) satisfies z.ZodType<SaveRequest>

export const exportRequestSchema = z.object({
  kind: z.enum(['csv', 'html', 'pdf']),
  suggestedName: suggestedNameSchema,
  content: textUpTo(MAX_EXPORT_BYTES),
}) satisfies z.ZodType<ExportRequest>

/** A title too long for the window frame is shortened, never refused: the dirty flag beside it must always arrive. */
export function shortTitle(title: string): string {
  return title.length <= MAX_TITLE_LENGTH ? title : `${title.slice(0, MAX_TITLE_LENGTH - 1)}…`
}

export const documentStateSchema = z.object({
  dirty: z.boolean(),
  title: z.string().transform(shortTitle),
}) satisfies z.ZodType<DocumentState, unknown>

export const recoveryTextSchema = textUpTo(MAX_PROJECT_BYTES)

export const recoveryIdSchema = z.string().regex(RECOVERY_ID_PATTERN, { error: 'must name a recovery copy' })

/** For channels without a request: any argument at all is a mistake. */
export const noArgumentSchema = z.undefined({ error: 'this request takes no argument' })

/** One line per problem, each naming the field: `text: must be at most 20.0 MB`. */
export function describeIssues(error: z.ZodError): string {
  return error.issues
    .map((issue) => {
      const field = issue.path.length === 0 ? 'request' : issue.path.map(String).join('.')
      return `${field}: ${issue.message}`
    })
    .join('; ')
}
