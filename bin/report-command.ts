/**
 * `rodwave report FILE --out PATH`: the modal summary report as one self-contained HTML
 * file, or as PDF printed by a headless Chromium/Chrome when one is installed. Without a
 * browser engine a PDF request falls back to the HTML next to the requested path.
 * Every file is replaced atomically (temporary file, then rename), never left half-written.
 */
import { execFile } from 'node:child_process'
import { constants as fsConstants } from 'node:fs'
import { access, mkdtemp, readFile, rm, writeFile } from 'node:fs/promises'
import { tmpdir } from 'node:os'
import { extname, join } from 'node:path'
import { pathToFileURL } from 'node:url'
import { promisify } from 'node:util'
import { convergenceStudy, type ConvergenceStudy } from '../core/analysis/convergence'
import { analyseProject } from '../core/analysis/modal-analysis'
import { modelWarnings } from '../core/analysis/model-checks'
import type { Project } from '../core/model/project'
import { modalReportHtml } from '../core/report/modal-report'
import { writeFileAtomic } from '../electron/atomic-write'
import { conflictLines, echoPath, projectWithOverrides, refuseMotion, UsageError } from './cli-common'
import type { CommandContext } from './commands'

/** The convergence study in a report covers at most this many modes (one table column each)… */
export const REPORT_CONVERGENCE_MODES = 6
/** …and skips meshes with more unknowns than this (the study of the condensate-pump example then took about 0.4 s here, against 1.4 s uncapped). */
export const REPORT_CONVERGENCE_MAX_DOFS = 20_000
/** A browser that has not printed in this time is stopped. */
const PRINT_TIMEOUT_MS = 120_000

export const BROWSER_CANDIDATES = ['/usr/bin/chromium', '/usr/bin/chromium-browser', '/usr/bin/google-chrome'] as const

export type BrowserSearch = { found: true; path: string } | { found: false; reason: string }

async function isExecutable(path: string): Promise<boolean> {
  try {
    await access(path, fsConstants.X_OK)
    return true
  } catch {
    return false
  }
}

/** CHROME_PATH when set (and then only it), else the first of the usual install paths. */
export async function findBrowserEngine(env: NodeJS.ProcessEnv = process.env): Promise<BrowserSearch> {
  const chosen = env.CHROME_PATH?.trim()
  if (chosen) {
    return (await isExecutable(chosen)) ? { found: true, path: chosen } : { found: false, reason: `CHROME_PATH names ${chosen}, which is not an executable file` }
  }
  for (const path of BROWSER_CANDIDATES) if (await isExecutable(path)) return { found: true, path }
  return { found: false, reason: `no Chromium or Chrome at ${BROWSER_CANDIDATES.join(', ')} and CHROME_PATH is not set` }
}

/** Prints an HTML file to PDF with a headless browser; returns the PDF's bytes. */
export async function printHtmlToPdf(browserPath: string, html: string): Promise<Uint8Array> {
  const work = await mkdtemp(join(tmpdir(), 'rodwave-report-'))
  try {
    const htmlPath = join(work, 'report.html')
    const pdfPath = join(work, 'report.pdf')
    await writeFile(htmlPath, html)
    try {
      await promisify(execFile)(
        browserPath,
        [
          '--headless',
          '--no-sandbox',
          '--disable-gpu',
          '--no-first-run',
          '--disable-background-networking',
          '--disable-component-update',
          // A profile of its own, so a browser the user has open (or a parallel print) does not interfere.
          `--user-data-dir=${join(work, 'profile')}`,
          `--print-to-pdf=${pdfPath}`,
          '--no-pdf-header-footer',
          pathToFileURL(htmlPath).href,
        ],
        { timeout: PRINT_TIMEOUT_MS, maxBuffer: 16 * 1024 * 1024 },
      )
    } catch (error) {
      const detail = (error as { killed?: boolean }).killed ? `no answer within ${PRINT_TIMEOUT_MS / 1000} s` : error instanceof Error ? error.message.split('\n')[0] : String(error)
      throw new Error(`${browserPath} could not print the report (${detail})`, { cause: error })
    }
    let pdf: Buffer
    try {
      pdf = await readFile(pdfPath)
    } catch {
      throw new Error(`${browserPath} ran but wrote no PDF`)
    }
    if (pdf.subarray(0, 5).toString('latin1') !== '%PDF-') throw new Error(`${browserPath} wrote something that is not a PDF`)
    return pdf
  } finally {
    await rm(work, { recursive: true, force: true })
  }
}

/** Rodwave's version from its package.json: one folder up from bin/, two from the built dist/cli/. */
async function appVersion(): Promise<string> {
  for (const relative of ['../package.json', '../../package.json']) {
    try {
      const pkg = JSON.parse(await readFile(new URL(relative, import.meta.url), 'utf8')) as { name?: unknown; version?: unknown }
      if (pkg.name === 'rodwave' && typeof pkg.version === 'string') return pkg.version
    } catch {
      // not there: try the next place
    }
  }
  return 'unknown version'
}

type ReportFormat = 'html' | 'pdf'

function formatOf(out: string): ReportFormat {
  const extension = extname(out).toLowerCase()
  if (extension === '.html' || extension === '.htm') return 'html'
  if (extension === '.pdf') return 'pdf'
  throw new UsageError(`--out must end in .html, .htm or .pdf (got "${echoPath(out)}")`)
}

function describeWriteError(path: string, error: unknown): string {
  const code = (error as { code?: string }).code
  const reason =
    code === 'ENOENT' ? 'the folder does not exist' : code === 'EACCES' || code === 'EPERM' ? 'permission denied' : code === 'EISDIR' ? 'it is a folder' : error instanceof Error ? error.message : String(error)
  return `rodwave: cannot write ${echoPath(path)}: ${reason}\n`
}

/** `report FILE --out PATH`: writes the report and returns the exit code. */
export async function runReport({ project, values, overrides, io }: CommandContext): Promise<number> {
  const out = values.out
  if (out === undefined || out.trim() === '') throw new UsageError('report needs --out PATH (a .html or .pdf file)')
  if (values.json || values.csv) throw new UsageError('report writes a file; --json and --csv do not apply')
  refuseMotion('report', values)
  const format = formatOf(out)

  const solved: Project = projectWithOverrides(project, overrides)
  const settings = solved.analysis
  const analysis = analyseProject(solved, overrides)
  // One study per family analysed (analysis.project carries the motions the command line chose).
  const convergence: ConvergenceStudy[] = []
  for (const { family } of analysis.families) {
    try {
      convergence.push(convergenceStudy(analysis.project, { family: family.key, modes: Math.min(settings.modes, REPORT_CONVERGENCE_MODES), maxDofs: REPORT_CONVERGENCE_MAX_DOFS }))
    } catch (error) {
      if (!(error instanceof RangeError)) throw error
      io.stderr(`rodwave: warning: the convergence study of ${family.key} stopped (${error.message}); the report leaves it out\n`)
    }
  }
  const html = modalReportHtml({ analysis, convergence, generatedAt: new Date(), appVersion: await appVersion() })

  let written: string
  if (format === 'pdf') {
    const engine = await findBrowserEngine()
    let pdf: Uint8Array | null = null
    let problem = ''
    if (engine.found) {
      try {
        pdf = await printHtmlToPdf(engine.path, html)
      } catch (error) {
        problem = error instanceof Error ? error.message : String(error)
      }
    } else {
      problem = `no browser engine to print PDF: ${engine.reason}`
    }
    written = pdf ? out : `${out.slice(0, -extname(out).length)}.html`
    try {
      await writeFileAtomic(written, pdf ?? html)
    } catch (error) {
      io.stderr(describeWriteError(written, error))
      return 1
    }
    if (!pdf) io.stderr(`rodwave: ${problem}.\nrodwave: wrote the HTML report to ${written} instead; open it in a browser and print it to PDF (A4).\n`)
  } else {
    written = out
    try {
      await writeFileAtomic(written, html)
    } catch (error) {
      io.stderr(describeWriteError(written, error))
      return 1
    }
  }
  io.stdout(`${written}\n`)
  for (const warning of modelWarnings(analysis)) io.stderr(`rodwave: warning: ${warning.message}\n`)
  const conflicts = analysis.resonance.filter((p) => p.status === 'conflict')
  if (values['fail-on-conflict'] && conflicts.length > 0) {
    for (const line of conflictLines(conflicts)) io.stderr(line)
    io.stderr(`rodwave: ${conflicts.length} mode–excitation pair(s) inside the ${(100 * project.margin).toFixed(1)} % margin\n`)
    return 3
  }
  return 0
}
