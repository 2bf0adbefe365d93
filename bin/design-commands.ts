/**
 * Design-guidance commands: sensitivity, tune, scatter, response. Flags are SI (m, Hz),
 * like every stored value; output is a readable table, or JSON with --json (README, "Command line").
 */
import { analyseProject, effectiveSettings } from '../core/analysis/modal-analysis'
import { designParameters } from '../core/analysis/design-parameters'
import { frequencySensitivities } from '../core/analysis/sensitivity'
import { tuneParameter, TuneError } from '../core/analysis/tuner'
import { scatterQuantiles } from '../core/analysis/tolerance-scatter'
import { forcedResponse } from '../core/analysis/forced-response'
import { totalLength } from '../core/model/geometry'
import { displayUnit, toDisplay } from '../core/model/units'
import { integerOption, numberOption, UsageError, type CliIo } from './cli'
import type { Command, CommandContext } from './commands'
import { ScatterPool } from './parallel-scatter'

function modesOf(context: CommandContext): number {
  return context.overrides.modes ?? context.project.analysis.modes
}

function requireNumber(context: CommandContext, name: 'min' | 'max' | 'target' | 'force-at' | 'response-at' | 'from' | 'to'): number {
  const v = numberOption(context.values, name)
  if (v === undefined) throw new UsageError(`--${name} is required`)
  return v
}

function writeJson(io: CliIo, value: unknown): void {
  io.stdout(`${JSON.stringify(value, null, 2)}\n`)
}

const sensitivity: Command = {
  summary: 'for each reported mode, the derivative of its frequency with respect to every model parameter',
  usage: '[--json] [--modes N]',
  async run(context) {
    const { project, values, io } = context
    const sensitivities = frequencySensitivities(project, modesOf(context))
    if (values.json) {
      writeJson(io, {
        sensitivities: sensitivities.map((s) => ({ mode: s.mode, parameter: s.parameter, value: s.value, derivative: s.derivative, relative: s.relative })),
      })
      return 0
    }
    const lines: string[] = [`Sensitivities of the exact natural frequencies${project.title ? ` — ${project.title}` : ''}`]
    lines.push('relative = % change of the frequency per % change of the parameter; derivative in Hz per SI unit')
    for (const mode of [...new Set(sensitivities.map((s) => s.mode))]) {
      const rows = sensitivities.filter((s) => s.mode === mode).sort((a, b) => Math.abs(b.relative) - Math.abs(a.relative))
      lines.push('', `Mode ${mode}, ${rows[0].frequencyHz.toPrecision(6)} Hz`)
      lines.push(`${'parameter'.padEnd(40)}${'value'.padStart(14)}${'df/dp'.padStart(14)}${'relative'.padStart(10)}`)
      for (const s of rows) {
        lines.push(`${s.parameter.padEnd(40)}${s.value.toPrecision(6).padStart(14)}${s.derivative.toPrecision(5).padStart(14)}${s.relative.toFixed(4).padStart(10)}`)
      }
    }
    io.stdout(`${lines.join('\n')}\n`)
    return 0
  },
}

const tune: Command = {
  summary: 'the parameter value that puts a mode on a target, or that maximises the smallest separation from every excitation',
  usage: '--parameter PATH --min A --max B [--mode N --target HZ] [--json]',
  async run(context) {
    const { project, values, io } = context
    const parameter = values.parameter
    if (!parameter) throw new UsageError(`--parameter is required; one of: ${designParameters(project).map((p) => p.path).join(', ')}`)
    const min = requireNumber(context, 'min')
    const max = requireNumber(context, 'max')
    const target = numberOption(values, 'target')
    const mode = integerOption(values, 'mode', 1, 200)
    if (mode !== undefined && target === undefined) throw new UsageError('--mode needs --target')
    let result
    try {
      result = tuneParameter(project, { parameter, min, max, modes: modesOf(context), ...(target !== undefined ? { targetHz: target, mode: mode ?? 1 } : {}) })
    } catch (error) {
      if (error instanceof TuneError) throw new UsageError(error.message)
      throw error
    }
    if (values.json) {
      writeJson(io, {
        parameter: result.parameter,
        value: result.value,
        frequenciesHz: result.frequenciesHz,
        minSeparation: result.minSeparation,
        goal: result.goal,
        before: result.before,
      })
      return 0
    }
    const sep = (s: number | null) => (s === null ? '—' : `${(100 * s).toFixed(2)} %`)
    const lines = [
      `Tuned ${result.label} (${result.parameter}) for ${result.goal === 'target' ? `mode ${mode ?? 1} at ${target} Hz` : 'the largest separation from every excitation'}`,
      `value: ${result.before.value.toPrecision(8)} → ${result.value.toPrecision(8)} (SI units)`,
      `smallest separation: ${sep(result.before.minSeparation)} → ${sep(result.minSeparation)} (margin ${(100 * project.margin).toFixed(1)} %)`,
      '',
      `${'mode'.padStart(4)}${'before (Hz)'.padStart(16)}${'after (Hz)'.padStart(16)}`,
      ...result.frequenciesHz.map((f, i) => `${String(i + 1).padStart(4)}${result.before.frequenciesHz[i].toPrecision(8).padStart(16)}${f.toPrecision(8).padStart(16)}`),
      '',
      'Frequencies from the exact piecewise solution. Re-solve the tuned part and check it on the real part before ordering.',
    ]
    io.stdout(`${lines.join('\n')}\n`)
    return 0
  },
}

const scatter: Command = {
  summary: "frequency bands from the file's tolerances (uniform scatter, fixed seed for repeatable results)",
  usage: '--samples N [--seed S] [--json]',
  async run(context) {
    const { project, values, io } = context
    const samples = integerOption(values, 'samples', 10, 1_000_000)
    if (samples === undefined) throw new UsageError('--samples is required')
    const seed = integerOption(values, 'seed', 0, 2 ** 32 - 1) ?? 1
    if (!project.tolerances || Object.values(project.tolerances).every((t) => !t)) {
      io.stderr('rodwave: the project has no tolerances to scatter (add "tolerances" to the file)\n')
      return 1
    }
    const modes = modesOf(context)
    const scattered = { ...project, analysis: effectiveSettings(project, context.overrides) }
    const nominal = analyseProject(scattered, {}, { withReference: false })
    const pool = ScatterPool.start()
    let frequencies: Float64Array
    try {
      frequencies = await pool.run(scattered, { seed, samples, modes })
    } finally {
      await pool.close()
    }
    const quantiles = scatterQuantiles(frequencies, nominal.modes)
    if (values.json) {
      writeJson(io, { samples, seed, modes: quantiles })
      return 0
    }
    const lines = [
      `Tolerance scatter, ${samples} samples (seed ${seed}): ${Object.entries(project.tolerances)
        .filter(([, t]) => t)
        .map(([k, t]) => `${k} ±${(100 * (t as number)).toFixed(2)} %`)
        .join(', ')}`,
      `${'mode'.padStart(4)}${'nominal (Hz)'.padStart(15)}${'5 %'.padStart(13)}${'50 %'.padStart(13)}${'95 %'.padStart(13)}`,
      ...quantiles.map((q) => `${String(q.mode).padStart(4)}${q.nominalHz.toPrecision(7).padStart(15)}${q.p05.toPrecision(7).padStart(13)}${q.p50.toPrecision(7).padStart(13)}${q.p95.toPrecision(7).padStart(13)}`),
    ]
    io.stdout(`${lines.join('\n')}\n`)
    return 0
  },
}

const response: Command = {
  summary: "steady-state receptance with the file's damping: harmonic force at x = X, displacement at x = Y",
  usage: '--force-at X --response-at Y --from HZ --to HZ --points N [--json]',
  async run(context) {
    const { project, values, io, overrides } = context
    const forceAt = requireNumber(context, 'force-at')
    const responseAt = requireNumber(context, 'response-at')
    const fromHz = requireNumber(context, 'from')
    const toHz = requireNumber(context, 'to')
    const points = integerOption(values, 'points', 1, 100_000)
    if (points === undefined) throw new UsageError('--points is required')
    const length = totalLength(project.segments)
    for (const [name, x] of [
      ['force-at', forceAt],
      ['response-at', responseAt],
    ] as const) {
      if (x < 0 || x > length) throw new UsageError(`--${name} must lie on the bar, between 0 and ${length} m`)
    }
    if (fromHz < 0 || toHz < fromHz) throw new UsageError('--from and --to must satisfy 0 ≤ from ≤ to')
    const analysis = analyseProject(project, overrides, { withReference: false }).families[0]
    const result = forcedResponse(analysis, { forceAt, responseAt, fromHz, toHz, points })
    if (values.json) {
      writeJson(io, {
        damping: project.damping,
        staticFlexibility: result.model.staticFlexibility,
        points: result.points.map((p) => ({ frequencyHz: p.frequencyHz, amplitude: p.amplitude, phaseDeg: p.phaseDeg })),
      })
      return 0
    }
    const unit = displayUnit(project.units, 'receptance')
    const lines = [
      `Receptance u(${responseAt} m)/F(${forceAt} m), modal damping ζ = ${project.damping}, ${analysis.modes.length} modes with static correction`,
      `${'f (Hz)'.padStart(12)}${`|u/F| (${unit.symbol})`.padStart(18)}${'phase (°)'.padStart(12)}`,
      ...result.points.map((p) => `${p.frequencyHz.toPrecision(7).padStart(12)}${toDisplay(project.units, 'receptance', p.amplitude).toExponential(4).padStart(18)}${p.phaseDeg.toFixed(2).padStart(12)}`),
    ]
    io.stdout(`${lines.join('\n')}\n`)
    return 0
  },
}

export const DESIGN_COMMANDS: Record<string, Command> = { sensitivity, tune, scatter, response }
