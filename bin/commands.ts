/** The command-line commands: each turns a validated project into output and an exit code. */
import { analyseProject, effectiveSettings, withMotions, type AnalysisOverrides } from '../core/analysis/modal-analysis'
import { familyName } from '../core/model/families'
import { convergenceStudy, type ConvergenceStudy } from '../core/analysis/convergence'
import { modalSummaryCsv, solveDocument } from '../core/analysis/modal-summary'
import type { ElementOrder, MassMatrixKind, Project } from '../core/model/project'
import { nowMs } from '../core/clock'
import type { CliIo, CliValues } from './cli-common'
import { CAUTION, chosenFamilies, conflictLines, projectWithOverrides, refuseMotion, UsageError } from './cli-common'
import { DESIGN_COMMANDS } from './design-commands'

/** What happened before the command ran, for `solve`'s timing. */
export interface InputTiming {
  /** nowMs() when runCli began. */
  readonly startedAt: number
  readonly startupMs?: number
  readonly readMs: number
  readonly validateMs: number
}

export interface CommandContext {
  readonly project: Project
  readonly file: string
  readonly values: CliValues
  readonly overrides: AnalysisOverrides
  readonly io: CliIo
  readonly timing?: InputTiming
}

export interface Command {
  readonly summary: string
  readonly usage: string
  /** More lines for `rodwave <command> --help`: what the options mean. */
  readonly help?: string
  run(context: CommandContext): Promise<number>
}

const solve: Command = {
  summary: 'modes of every analysed family, reference comparison, effective mass, resonance check',
  usage: '[--json | --csv] [--motions LIST] [--bending-theory T] [--mass K] [--order 1|2] [--elements-per-segment N] [--modes N] [--fail-on-conflict]',
  help: [
    'Modes are numbered within their family (axial, torsion, bending; a two-plane section bends as bending-weak and bending-strong).',
    'JSON: each mode and each resonance pair carries its motion and plane; reference.families and reference.methods give every',
    "family's reference (exact, or extrapolated: a Richardson estimate from two fine meshes). CSV: a motion column after mode.",
    'With --fail-on-conflict every conflicting pair is named on stderr with its family.',
  ].join('\n'),
  async run({ project, values, overrides, io, timing }) {
    if (values.json && values.csv) throw new UsageError('choose one of --json and --csv')
    refuseMotion('solve', values)
    const analyseStart = nowMs()
    const analysis = analyseProject(projectWithOverrides(project, overrides), overrides)
    const document = solveDocument(analysis, {
      analyseMs: nowMs() - analyseStart,
      ...(timing ? { startupMs: timing.startupMs, readMs: timing.readMs, validateMs: timing.validateMs, startedAt: timing.startedAt } : {}),
    })
    if (values.csv) io.stdout(modalSummaryCsv(analysis))
    else io.stdout(`${JSON.stringify(document, null, 2)}\n`)
    for (const warning of document.warnings) io.stderr(`rodwave: warning: ${warning.message}\n`)
    const conflicts = analysis.resonance.filter((p) => p.status === 'conflict')
    if (values['fail-on-conflict'] && conflicts.length > 0) {
      for (const line of conflictLines(conflicts)) io.stderr(line)
      io.stderr(`rodwave: ${conflicts.length} mode–excitation pair(s) inside the ${(100 * project.margin).toFixed(1)} % margin\n`)
      return 3
    }
    return 0
  },
}

const converge: Command = {
  summary: 'frequencies against mesh density for each mass matrix and element order, with errors and observed orders',
  usage: '[--json | --csv] [--motion FAMILY] [--motions LIST] [--bending-theory T] [--mass K] [--order 1|2] [--modes N]',
  help: 'The study covers one family: --motion (default: the first analysed, axial where analysed). Bending has one element kind, so --order does not apply to it.',
  async run({ project: fileProject, values, overrides, io }) {
    if (values.json && values.csv) throw new UsageError('choose one of --json and --csv')
    if (values['elements-per-segment'] !== undefined) throw new UsageError('converge runs its own mesh densities; --elements-per-segment does not apply')
    const project = { ...withMotions(fileProject, overrides), analysis: effectiveSettings(fileProject, overrides) }
    const chosen = chosenFamilies(project, values)
    if (chosen.given && chosen.families.length > 1) throw new UsageError(`--motion ${values.motion}: the section bends in two planes; converge studies one, so use --motion bending-weak or bending-strong`)
    const study = convergenceStudy(project, {
      family: chosen.families[0].key,
      modes: overrides.modes ?? project.analysis.modes,
      ...(overrides.elementOrder ? { orders: [overrides.elementOrder] } : {}),
      ...(overrides.mass ? { masses: [overrides.mass] } : {}),
    })
    if (values.json) io.stdout(`${JSON.stringify(study, null, 2)}\n`)
    else if (values.csv) io.stdout(convergenceCsv(study))
    else io.stdout(`${convergenceText(project, study)}\n${CAUTION}\n`)
    return 0
  },
}

// The report and its chart renderer (ECharts) are loaded only when a report is asked for.
const report: Command = {
  summary: 'the modal summary report: one self-contained HTML file, or PDF where a browser engine is available',
  usage: '--out PATH.html|PATH.pdf [--motions LIST] [--bending-theory T] [--mass K] [--order 1|2] [--elements-per-segment N] [--modes N] [--fail-on-conflict]',
  async run(context) {
    const { runReport } = await import('./report-command')
    return runReport(context)
  },
}

export const COMMANDS: Record<string, Command> = { solve, converge, report, ...DESIGN_COMMANDS }

function seriesName(order: ElementOrder, mass: MassMatrixKind): string {
  return `${order === 1 ? '2-node' : '3-node'} elements, ${mass} mass`
}

function convergenceCsv(study: ConvergenceStudy): string {
  const lines = ['element_order,mass,elements_per_segment,dofs,mode,frequency_hz,reference_hz,error_vs_reference']
  for (const s of study.series) {
    for (const p of s.points) {
      p.frequenciesHz.forEach((f, m) => {
        const ref = study.referenceHz[m]
        lines.push([s.elementOrder, s.mass, p.elementsPerSegment, p.dofs, m + 1, f, ref ?? '', p.errors[m] ?? ''].join(','))
      })
    }
  }
  return lines.join('\r\n') + '\r\n'
}

function convergenceText(project: Project, study: ConvergenceStudy): string {
  const out: string[] = []
  out.push(`Mesh convergence of the ${familyName(study.family)} modes${project.title ? ` — ${project.title}` : ''}`)
  const listed = study.referenceHz.map((f, i) => `f${i + 1} = ${f.toPrecision(10)} Hz`).join(', ')
  out.push(
    study.referenceMethod === 'exact'
      ? `Reference (exact): ${listed}`
      : study.referenceMethod === 'extrapolated'
        ? `Reference (no exact solution: a Richardson estimate from two fine meshes): ${listed}`
        : 'No exact reference: compare with the Richardson estimates.',
  )
  const modes = study.modes
  for (const s of study.series) {
    out.push('')
    out.push(seriesName(s.elementOrder, s.mass))
    out.push(['elem/seg'.padStart(8), 'unknowns'.padStart(9), ...Array.from({ length: modes }, (_, m) => `error f${m + 1}`.padStart(11))].join(' '))
    for (const p of s.points) {
      out.push(
        [
          String(p.elementsPerSegment).padStart(8),
          String(p.dofs).padStart(9),
          ...p.errors.map((e) => (e === null ? '—' : e.toExponential(2)).padStart(11)),
        ].join(' '),
      )
    }
    out.push(['observed order'.padStart(18), ...s.observedOrder.map((o) => (o === null ? '—' : o.toFixed(2)).padStart(11))].join(' '))
    out.push(['Richardson (Hz)'.padStart(18), ...s.extrapolatedHz.map((f) => (f === null ? '—' : f.toPrecision(9)).padStart(11))].join(' '))
  }
  return out.join('\n') + '\n'
}
