/**
 * Files and the application's commands: New, Open, Save, Save As, recent files, exports,
 * the recovery of unsaved work, and what the desktop shell is told (title, dirty state).
 * A file that breaks a rule is refused with its problems listed; the model on screen
 * stays exactly as it was.
 */
import { defineStore } from 'pinia'
import { computed, ref, watch } from 'vue'
import type { ExportKind, ExportResult, MenuCommand, OpenResult, RecoveredWork } from '../bridge/contract'
import { newProject } from '../../core/model/project-file'
import { readProjectText, type ProjectIssue, type ProjectReadResult } from '../../core/model/project-schema'
import type { Project } from '../../core/model/project'
import { version as appVersion } from '../../package.json'
import { useBridge } from '../bridge/bridge'
import { useSolver } from '../solver/solver-client'
import { useConvergenceStore } from './convergence-store'
import { UNTITLED, useProjectStore } from './project-store'
import { useResultsStore } from './results-store'
import { useViewStore } from './view-store'

/** Unsaved work is written to the recovery file this often while the document is dirty. */
export const AUTOSAVE_MS = 4000
/** The same command from the menu and from the keyboard this close together runs once. */
const DUPLICATE_COMMAND_MS = 300

export interface RefusedFile {
  readonly name: string
  readonly issues: readonly ProjectIssue[]
}

export interface Notice {
  readonly kind: 'info' | 'error'
  readonly text: string
}

export interface Confirmation {
  readonly message: string
  readonly confirmLabel: string
  readonly resolve: (confirmed: boolean) => void
}

export const useFileStore = defineStore('file', () => {
  const project = useProjectStore()
  const results = useResultsStore()
  const view = useViewStore()
  const ready = ref(false)
  const recent = ref<string[]>([])
  const refused = ref<RefusedFile | null>(null)
  const notice = ref<Notice | null>(null)
  /** Copies of unsaved work that earlier sessions left, newest first; the first is on offer. */
  const recoveries = ref<RecoveredWork[]>([])
  const recoveryText = computed(() => recoveries.value[0]?.text ?? null)
  const confirmation = ref<Confirmation | null>(null)
  const busy = ref<string | null>(null)
  let lastRecoveryWritten: string | null = null
  let noticeTimer: ReturnType<typeof setTimeout> | null = null
  let autosaveTimer: ReturnType<typeof setInterval> | null = null
  let lastCommand: { command: MenuCommand; at: number } | null = null
  let stopListening: (() => void) | null = null

  function tell(kind: Notice['kind'], text: string): void {
    notice.value = { kind, text }
    if (noticeTimer) clearTimeout(noticeTimer)
    noticeTimer = setTimeout(() => (notice.value = null), kind === 'error' ? 12_000 : 5000)
  }

  function ask(message: string, confirmLabel: string): Promise<boolean> {
    confirmation.value?.resolve(false)
    return new Promise((resolve) => {
      confirmation.value = {
        message,
        confirmLabel,
        resolve: (confirmed) => {
          confirmation.value = null
          resolve(confirmed)
        },
      }
    })
  }

  /** True when there is nothing unsaved, or the user agrees to drop it. */
  async function mayDiscard(action: string): Promise<boolean> {
    if (!project.dirty) return true
    return ask(`The changes to “${project.documentTitle}” are not saved. ${action} anyway and lose them?`, `${action} without saving`)
  }

  function show(loaded: Project, source: { path: string | null; name: string; dirty?: boolean }): void {
    project.load(loaded, source)
    refused.value = null
    view.selectedSegment = null
    // Nothing ticked: the charts show the first modes of the family most worth a look (Modes view).
    view.selectedModes = []
    view.shapeFamily = null
    void results.solveCurrent()
  }

  async function refreshRecent(): Promise<void> {
    try {
      recent.value = await useBridge().recentFiles()
    } catch {
      recent.value = []
    }
  }

  /** Reads what the bridge opened; a bad file is refused whole and the model stays. */
  async function accept(result: OpenResult): Promise<void> {
    if (result.kind === 'cancelled') return
    if (result.kind === 'error') {
      tell('error', result.message)
      return
    }
    // Decoding, parsing and validating a file (up to 20 MB) run in the solver worker, never on this thread.
    let read: ProjectReadResult
    busy.value = `Reading ${result.name}…`
    try {
      read = await useSolver().readProject('bytes' in result ? { bytes: result.bytes } : { text: result.text })
    } catch (error) {
      tell('error', `Could not read "${result.name}": ${error instanceof Error ? error.message : String(error)}`)
      return
    } finally {
      busy.value = null
    }
    if (!read.ok) {
      refused.value = { name: result.name, issues: read.issues }
      return
    }
    show(read.project, { path: result.path, name: result.name })
    tell('info', `Opened ${result.name}`)
    await refreshRecent()
  }

  async function start(): Promise<void> {
    const bridge = useBridge()
    stopListening?.()
    const stopMenu = bridge.onMenuCommand((command) => void runCommand(command))
    // The desktop menu's File › Open recent (the browser has none).
    const stopRecent = bridge.onOpenRecentRequest?.((path) => void openRecent(path))
    stopListening = () => {
      stopMenu()
      stopRecent?.()
    }
    try {
      const demo = await bridge.demoProject()
      const read = readProjectText(demo.text)
      if (read.ok) show(read.project, { path: null, name: demo.name })
      else refused.value = { name: demo.name, issues: read.issues }
    } catch (error) {
      tell('error', `The demo project could not be loaded: ${error instanceof Error ? error.message : String(error)}`)
    }
    try {
      recoveries.value = await bridge.readRecovery()
    } catch {
      recoveries.value = []
    }
    await refreshRecent()
    ready.value = true
    startAutosave()
  }

  function startAutosave(): void {
    if (autosaveTimer) clearInterval(autosaveTimer)
    autosaveTimer = setInterval(() => void writeRecovery(), AUTOSAVE_MS)
  }

  /** The autosave: this session's copy follows the unsaved draft, and goes once nothing is unsaved. */
  async function writeRecovery(): Promise<void> {
    if (!project.dirty) {
      if (lastRecoveryWritten !== null) await clearRecovery()
      return
    }
    if (project.draftText === lastRecoveryWritten) return
    const text = project.draftText
    try {
      await useBridge().writeRecovery(text)
      lastRecoveryWritten = text
    } catch {
      // The next tick tries again.
    }
  }

  async function clearRecovery(): Promise<void> {
    lastRecoveryWritten = null
    try {
      await useBridge().clearRecovery()
    } catch {
      // A stale recovery file is offered once more and can be discarded then.
    }
  }

  /** Shows recovered text as an unsaved document; false (and the problems shown) when it cannot be read. */
  function showRecovered(text: string): boolean {
    const read = readProjectText(text)
    if (read.ok) {
      show(read.project, { path: null, name: UNTITLED, dirty: true })
      tell('info', 'Unsaved work restored. Save it to keep it.')
      return true
    }
    // Work saved while it still had problems comes back as it was, problems named in the editor.
    try {
      const draft = JSON.parse(text) as Project
      if (draft && Array.isArray(draft.segments) && typeof draft.ends === 'object' && draft.analysis) {
        show(draft, { path: null, name: UNTITLED, dirty: true })
        view.activeView = 'part'
        tell('info', 'Unsaved work restored; it still has problems to fix.')
        return true
      }
    } catch {
      // Not JSON at all: fall through to the refusal.
    }
    refused.value = { name: 'the recovery file', issues: read.issues }
    return false
  }

  /**
   * Brings back the unsaved work of an earlier session, as an unsaved document. The earlier
   * copy is removed only once the restored work is this session's recovery copy, so the work
   * is on disk at every moment. A copy that cannot be read stays on offer (to be discarded).
   */
  async function restoreRecovery(): Promise<void> {
    const copy = recoveries.value[0]
    if (copy === undefined) return
    if (!(await mayDiscard('Restore the earlier work'))) return
    if (!showRecovered(copy.text)) return
    recoveries.value = recoveries.value.filter((c) => c.id !== copy.id)
    const text = project.draftText
    try {
      await useBridge().writeRecovery(text)
      lastRecoveryWritten = text
      await useBridge().settleRecovery(copy.id)
    } catch {
      // The earlier copy stays on disk and is offered again at the next start.
    }
  }

  /** The user does not want the earlier session's work: its copy goes (this session's stays). */
  async function discardRecovery(): Promise<void> {
    const copy = recoveries.value[0]
    if (copy === undefined) return
    recoveries.value = recoveries.value.filter((c) => c.id !== copy.id)
    try {
      await useBridge().settleRecovery(copy.id)
    } catch {
      // It is offered again at the next start and can be discarded then.
    }
  }

  async function newDocument(): Promise<void> {
    if (!(await mayDiscard('Start a new project'))) return
    show(newProject(), { path: null, name: UNTITLED })
    view.activeView = 'part'
  }

  async function open(): Promise<void> {
    if (!(await mayDiscard('Open another project'))) return
    await accept(await useBridge().openProject())
  }

  async function openRecent(path: string): Promise<void> {
    if (!(await mayDiscard('Open another project'))) return
    await accept(await useBridge().openRecent(path))
  }

  async function save(asNew = false): Promise<boolean> {
    const text = project.fileText()
    if (text === null) {
      tell('error', `The part has ${project.issues.length} problem${project.issues.length === 1 ? '' : 's'}; fix ${project.issues.length === 1 ? 'it' : 'them'} before saving (unsaved work is kept for recovery meanwhile).`)
      view.activeView = 'part'
      // A close waiting on this save (the desktop's "Save" in its close prompt) ends now, not after a timeout.
      void useBridge()
        .saveRefused()
        .catch(() => undefined)
      return false
    }
    // What is written is the draft as it is now; edits made while the file is being written stay unsaved.
    const writtenDraft = project.draftText
    const path = asNew ? null : project.filePath
    const result = await useBridge().saveProject({ path, suggestedName: suggestedName('.rodwave.json'), text })
    if (result.kind === 'cancelled') return false
    if (result.kind === 'error') {
      tell('error', result.message)
      return false
    }
    project.markSaved(result.path, result.name, writtenDraft)
    // The recovery copy goes only when nothing is left unsaved; otherwise the autosave keeps it current.
    if (!project.dirty) await clearRecovery()
    await refreshRecent()
    tell('info', project.dirty ? `Saved ${result.name}; changes made while it was being saved are not saved yet` : `Saved ${result.name}`)
    return true
  }

  /** A file name from the document's (demo.rodwave.json → demo-modal-summary.csv), else from its title. */
  function suggestedName(suffix: string): string {
    const fromFile = project.fileName !== UNTITLED ? project.fileName.replace(/\.rodwave\.json$|\.json$/i, '') : ''
    return `${fromFile || slug(project.draft.title ?? '') || 'rodwave-project'}${suffix}`
  }

  async function exportCsv(): Promise<void> {
    const solved = results.solved
    if (!solved) {
      tell('error', 'There are no results to export yet.')
      return
    }
    if (results.stale) tell('info', 'The part has changed since these results; exporting the last solved model.')
    const result = await useBridge().exportFile({ kind: 'csv', suggestedName: suggestedName('-modal-summary.csv'), content: solved.summaryCsv })
    reportExport(result)
  }

  /** Says what an export did: a file written, the print dialog opened (a browser's PDF), or why not. */
  function reportExport(result: ExportResult): void {
    if (result.kind === 'saved') tell('info', `Exported ${result.name}`)
    else if (result.kind === 'print-dialog') tell('info', 'The report opened in a new tab with the print dialog; no file was written yet. To keep a PDF, choose “Save as PDF” as the printer there.')
    else if (result.kind === 'error') tell('error', result.message)
  }

  async function exportReport(kind: Exclude<ExportKind, 'csv'>): Promise<void> {
    const model = project.validProject
    if (!model) {
      tell('error', 'The part has problems; fix them before exporting a report.')
      return
    }
    const convergence = useConvergenceStore()
    busy.value = 'Writing the report…'
    try {
      const html = await useSolver().report({
        project: model,
        convergence: convergence.studyIsCurrent ? convergence.study : null,
        generatedAt: new Date().toISOString(),
        appVersion,
      })
      const result = await useBridge().exportFile({ kind, suggestedName: suggestedName(kind === 'pdf' ? '-report.pdf' : '-report.html'), content: html })
      reportExport(result)
    } catch (error) {
      tell('error', `The report could not be written: ${error instanceof Error ? error.message : String(error)}`)
    } finally {
      busy.value = null
    }
  }

  /** Runs a command from the menu, the keyboard or a button. */
  async function runCommand(command: MenuCommand): Promise<void> {
    const now = Date.now()
    if (lastCommand && lastCommand.command === command && now - lastCommand.at < DUPLICATE_COMMAND_MS) return
    lastCommand = { command, at: now }
    switch (command) {
      case 'new':
        return newDocument()
      case 'open':
        return open()
      case 'save':
        await save()
        return
      case 'save-as':
        await save(true)
        return
      case 'export-csv':
        return exportCsv()
      case 'export-report-html':
        return exportReport('html')
      case 'export-report-pdf':
        return exportReport('pdf')
      case 'undo':
        project.undo()
        return
      case 'redo':
        project.redo()
        return
      case 'cautions':
        view.cautionsOpen = true
        return
    }
  }

  // The desktop shell shows the title and asks before closing unsaved work.
  watch(
    () => [project.dirty, project.documentTitle] as const,
    ([dirty, title]) => {
      if (!ready.value) return
      void useBridge()
        .setDocumentState({ dirty, title })
        .catch(() => undefined)
    },
  )
  watch(ready, (isReady) => {
    if (isReady) void useBridge().setDocumentState({ dirty: project.dirty, title: project.documentTitle })
  })

  function stop(): void {
    stopListening?.()
    stopListening = null
    if (autosaveTimer) clearInterval(autosaveTimer)
    autosaveTimer = null
  }

  return {
    ready,
    recent,
    refused,
    notice,
    recoveryText,
    confirmation,
    busy,
    start,
    stop,
    runCommand,
    newDocument,
    open,
    openRecent,
    save,
    exportCsv,
    exportReport,
    restoreRecovery,
    discardRecovery,
    writeRecovery,
    tell,
  }
})

function slug(text: string): string {
  return text
    .toLowerCase()
    .normalize('NFKD')
    .replace(/[^a-z0-9]+/g, '-')
    .replace(/^-+|-+$/g, '')
    .slice(0, 60)
}
