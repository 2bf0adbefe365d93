/** Test doubles and fixtures for the renderer tests: an in-memory bridge, the demo project, fresh stores. */
import { readFileSync } from 'node:fs'
import { join } from 'node:path'
import { createPinia, setActivePinia } from 'pinia'
import type { ExportRequest, ExportResult, MenuCommand, OpenResult, RecoveredWork, RodwaveBridge, SaveRequest } from '../../renderer/bridge/contract'
import { setBridge } from '../../renderer/bridge/bridge'
import { createInlineSolverClient, setSolver } from '../../renderer/solver/solver-client'

export const DEMO_PATH = join(import.meta.dirname, '../../examples/condensate-pump-hanger.rodwave.json')
/** The demo project's text: a fixture for interface behaviour, never a check of correctness. */
export const DEMO_TEXT = readFileSync(DEMO_PATH, 'utf8')

/** A bridge that keeps everything in memory and records what the window asked of it. */
export class MemoryBridge implements RodwaveBridge {
  readonly platform = 'browser' as const
  nextOpen: OpenResult = { kind: 'cancelled' }
  /** This session's recovery copy. */
  recovery: string | null = null
  /** Copies earlier sessions left (readRecovery offers them). */
  earlierCopies: RecoveredWork[] = []
  /** Ids of earlier copies the window settled (restored or discarded). */
  readonly settled: string[] = []
  readonly saved: SaveRequest[] = []
  readonly exported: ExportRequest[] = []
  readonly states: { dirty: boolean; title: string }[] = []
  readonly recoveryWrites: string[] = []
  recoveryCleared = 0
  readonly recentRequested: string[] = []
  private listeners = new Set<(command: MenuCommand) => void>()
  private recentListeners = new Set<(path: string) => void>()

  async openProject(): Promise<OpenResult> {
    return this.nextOpen
  }
  async openRecent(path: string): Promise<OpenResult> {
    this.recentRequested.push(path)
    return this.nextOpen
  }
  async saveProject(request: SaveRequest) {
    this.saved.push(request)
    const name = request.path ?? request.suggestedName
    return { kind: 'saved' as const, path: `/projects/${name}`, name }
  }
  async exportFile(request: ExportRequest): Promise<ExportResult> {
    this.exported.push(request)
    return { kind: 'saved' as const, path: `/exports/${request.suggestedName}`, name: request.suggestedName }
  }
  async recentFiles(): Promise<string[]> {
    return this.saved.map((s) => s.suggestedName)
  }
  async demoProject() {
    return { name: 'condensate-pump-hanger.rodwave.json', text: DEMO_TEXT }
  }
  async setDocumentState(state: { dirty: boolean; title: string }): Promise<void> {
    this.states.push(state)
  }
  saveRefusals = 0
  async saveRefused(): Promise<void> {
    this.saveRefusals++
  }
  async writeRecovery(text: string): Promise<void> {
    this.recoveryWrites.push(text)
    this.recovery = text
  }
  async readRecovery(): Promise<RecoveredWork[]> {
    return [...this.earlierCopies]
  }
  async clearRecovery(): Promise<void> {
    this.recoveryCleared++
    this.recovery = null
  }
  async settleRecovery(id: string): Promise<void> {
    this.settled.push(id)
    this.earlierCopies = this.earlierCopies.filter((copy) => copy.id !== id)
  }
  onMenuCommand(listener: (command: MenuCommand) => void): () => void {
    this.listeners.add(listener)
    return () => this.listeners.delete(listener)
  }
  onOpenRecentRequest(listener: (path: string) => void): () => void {
    this.recentListeners.add(listener)
    return () => this.recentListeners.delete(listener)
  }
  /** The desktop menu's File › Open recent. */
  chooseRecent(path: string): void {
    for (const listener of this.recentListeners) listener(path)
  }
  /** What the desktop menu does: sends a command to the window. */
  menu(command: MenuCommand): void {
    for (const listener of this.listeners) listener(command)
  }
}

/** Fresh Pinia, the in-memory bridge and the in-page solver. */
export function freshApp(bridge = new MemoryBridge()): MemoryBridge {
  setActivePinia(createPinia())
  setBridge(bridge)
  setSolver(createInlineSolverClient())
  return bridge
}

/** Lets promises and the solver's queued work run. */
export async function settle(rounds = 5): Promise<void> {
  for (let i = 0; i < rounds; i++) await new Promise((resolve) => setTimeout(resolve, 0))
}
