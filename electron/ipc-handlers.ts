/**
 * Registers one handler per channel of the contract, and nothing else. Every call is
 * checked twice before it does anything: the sender (only the app's own top frame) and the
 * arguments (type and size). A refused or failed call answers with a clear message: as an
 * `error` result where the channel's response has one, otherwise as a rejected promise
 * whose message (Electron passes only the message, never the stack) says what went wrong.
 */
import type { z } from 'zod'
import { CHANNELS, type SaveResult } from './ipc-contract'
import {
  describeIssues,
  documentStateSchema,
  exportRequestSchema,
  filePathSchema,
  noArgumentSchema,
  recoveryIdSchema,
  recoveryTextSchema,
  saveRequestSchema,
} from './ipc-validation'
import { checkSender, type IpcSenderInfo, type TrustedWindow } from './sender-check'
import type { CloseGuard } from './close-guard'
import type { FileHandlers } from './file-handlers'
import type { RecentFiles } from './recent-files'
import type { RecoveryStore } from './recovery'

export interface IpcMainLike {
  handle(channel: string, listener: (event: IpcSenderInfo, ...args: unknown[]) => Promise<unknown>): void
}

export interface ShellServices {
  readonly files: FileHandlers
  readonly recentFiles: RecentFiles
  readonly recovery: RecoveryStore
  readonly closeGuard: Pick<CloseGuard, 'documentChanged' | 'saveStarted' | 'saveFinished' | 'saveRefused'>
}

export interface IpcRegistration {
  readonly ipcMain: IpcMainLike
  /** The window whose top frame may call; null while there is none. */
  readonly trustedWindow: () => TrustedWindow | null
  readonly services: ShellServices
  /** Where refusals and failures are logged in full (the window gets a short message). */
  readonly log?: (message: string) => void
}

/** How a channel reports a refusal: as its own `error` result, or as a rejection. */
type Refusal = 'error-result' | 'reject'

interface ChannelSpec<T> {
  readonly schema: z.ZodType<T>
  readonly refusal: Refusal
  readonly run: (argument: T) => Promise<unknown>
}

const LABELS: Readonly<Record<string, string>> = {
  [CHANNELS.openProject]: 'Open project',
  [CHANNELS.openRecent]: 'Open recent',
  [CHANNELS.saveProject]: 'Save project',
  [CHANNELS.exportFile]: 'Export',
  [CHANNELS.recentFiles]: 'Recent projects',
  [CHANNELS.demoProject]: 'Demo project',
  [CHANNELS.setDocumentState]: 'Document state',
  [CHANNELS.writeRecovery]: 'Write recovery copy',
  [CHANNELS.readRecovery]: 'Read recovery copy',
  [CHANNELS.clearRecovery]: 'Clear recovery copy',
  [CHANNELS.settleRecovery]: 'Remove earlier recovery copy',
  [CHANNELS.saveRefused]: 'Save refused',
}

function spec<T>(schema: z.ZodType<T>, refusal: Refusal, run: (argument: T) => Promise<unknown>): ChannelSpec<unknown> {
  return { schema, refusal, run } as ChannelSpec<unknown>
}

function channelSpecs(services: ShellServices): Record<string, ChannelSpec<unknown>> {
  const { files, recentFiles, recovery, closeGuard } = services
  return {
    [CHANNELS.openProject]: spec(noArgumentSchema, 'error-result', () => files.openProject()),
    [CHANNELS.openRecent]: spec(filePathSchema, 'error-result', (path) => files.openRecent(path)),
    [CHANNELS.saveProject]: spec(saveRequestSchema, 'error-result', async (request) => {
      closeGuard.saveStarted()
      let result: SaveResult = { kind: 'error', message: 'The save did not finish.' }
      try {
        result = await files.saveProject(request)
        return result
      } finally {
        closeGuard.saveFinished(result)
      }
    }),
    [CHANNELS.exportFile]: spec(exportRequestSchema, 'error-result', (request) => files.exportFile(request)),
    [CHANNELS.recentFiles]: spec(noArgumentSchema, 'reject', () => recentFiles.list()),
    [CHANNELS.demoProject]: spec(noArgumentSchema, 'reject', () => files.demoProject()),
    [CHANNELS.setDocumentState]: spec(documentStateSchema, 'reject', async (state) => {
      closeGuard.documentChanged(state)
    }),
    [CHANNELS.writeRecovery]: spec(recoveryTextSchema, 'reject', (text) => recovery.write(text)),
    [CHANNELS.readRecovery]: spec(noArgumentSchema, 'reject', () => recovery.startSession()),
    [CHANNELS.clearRecovery]: spec(noArgumentSchema, 'reject', () => recovery.clear()),
    [CHANNELS.settleRecovery]: spec(recoveryIdSchema, 'reject', (id) => recovery.settle(id)),
    [CHANNELS.saveRefused]: spec(noArgumentSchema, 'reject', async () => {
      closeGuard.saveRefused()
    }),
  }
}

/** The channels the window may invoke: every request/response channel of the contract. */
export const INVOKE_CHANNELS: readonly string[] = Object.keys(LABELS)

export function registerIpcHandlers(registration: IpcRegistration): string[] {
  const specs = channelSpecs(registration.services)
  const log = registration.log ?? (() => undefined)

  for (const [channel, channelSpec] of Object.entries(specs)) {
    const label = LABELS[channel]
    const refuse = (message: string) => {
      log(`${channel}: ${message}`)
      if (channelSpec.refusal === 'error-result') return { kind: 'error', message }
      throw new Error(message)
    }

    registration.ipcMain.handle(channel, async (event, ...args) => {
      const verdict = checkSender(event, registration.trustedWindow())
      if (!verdict.trusted) return refuse(`${label} was refused: ${verdict.reason}.`)
      if (args.length > 1) return refuse(`${label} was refused: it takes at most one argument, got ${args.length}.`)
      const parsed = channelSpec.schema.safeParse(args[0])
      if (!parsed.success) return refuse(`${label} was refused: ${describeIssues(parsed.error)}.`)
      try {
        return await channelSpec.run(parsed.data)
      } catch (error) {
        log(`${channel} failed: ${error instanceof Error ? (error.stack ?? error.message) : String(error)}`)
        const reason = error instanceof Error ? error.message : String(error)
        if (channelSpec.refusal === 'error-result') return { kind: 'error', message: `${label} failed: ${reason}` }
        throw new Error(`${label} failed: ${reason}`, { cause: error })
      }
    })
  }
  return Object.keys(specs)
}
