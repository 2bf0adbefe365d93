/**
 * Design-guidance commands: sensitivity, tune, scatter, response. Flags are SI (m, Hz, N),
 * like every stored value; output is a readable table, or JSON with --json (README, "Command line").
 */
import { analyseProject, effectiveSettings } from '../core/analysis/modal-analysis'
import { designParameters, findParameter } from '../core/analysis/design-parameters'
import { frequencySensitivities } from '../core/analysis/sensitivity'
import { tuneParameter, TargetOutOfReachError, TuneError } from '../core/analysis/tuner'
import { scatterQuantiles } from '../core/analysis/tolerance-scatter'
import { evaluateReceptance, pointWeights, receptanceModel } from '../core/analysis/forced-response'
import { bandResponses, gridStartHz, responseGrid, type BandResponse, type FrequencyAxis } from '../core/analysis/response-bands'
import { bandName, closestPair, modeKey, resonancePairs } from '../core/analysis/resonance'
import { totalLength } from '../core/model/geometry'
import { displayUnit, toDisplay, type UnitSystem } from '../core/model/units'
import type { Project } from '../core/model/project'
import { CAUTION, echo, EXIT, integerOption, numberOption, OutOfReachError, UsageError, type CliIo } from './cli-common'
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

/** A text report: its lines, then the usual caution. */
function writeText(io: CliIo, lines: readonly string[]): void {
  io.stdout(`${lines.join('\n')}\n\n${CAUTION}\n`)
}

const percent = (fraction: number, digits = 1) => `${(100 * fraction).toFixed(digits)} %`

/** How many parameter paths a message lists before it refers to the sensitivity command. */
const LISTED_PARAMETERS = 12

/** The project's parameter paths for a message, each capped, at most LISTED_PARAMETERS of them. */
function parameterList(project: Project): string {
  const paths = designParameters(project).map((p) => echo(p.path))
  const shown = paths.slice(0, LISTED_PARAMETERS).join(', ')
  return paths.length > LISTED_PARAMETERS ? `${shown}, … (${paths.length} in all: the sensitivity command lists them)` : shown
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
      return EXIT.done
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
    writeText(io, lines)
    return EXIT.done
  },
}

const tune: Command = {
  summary: 'the parameter value that puts a mode on a target, or that maximises the smallest separation from every excitation',
  usage: '--parameter PATH --min A --max B [--mode N --target HZ] [--json]',
  help: [
    'PATH is a JSON path of the project file, as the sensitivity command lists them (e.g. segments[0].length).',
    "A and B are SI values (m, Pa, kg/m³, kg, N/m). Every parameter needs 0 < A; a tube's bore may start at 0",
    '(a solid bar) and must stay below the outer diameter.',
    `Exit ${EXIT.targetOutOfReach} when no value between A and B puts mode N on the target.`,
  ].join('\n'),
  async run(context) {
    const { project, values, io } = context
    const path = values.parameter
    if (!path) throw new UsageError(`--parameter is required; one of: ${parameterList(project)}`)
    if (!findParameter(project, path)) throw new UsageError(`"${echo(path)}" is not a parameter of this project; one of: ${parameterList(project)}`)
    const min = requireNumber(context, 'min')
    const max = requireNumber(context, 'max')
    const target = numberOption(values, 'target')
    const mode = integerOption(values, 'mode', 1, 200)
    if (mode !== undefined && target === undefined) throw new UsageError('--mode needs --target')
    let result
    try {
      result = tuneParameter(project, { parameter: path, min, max, modes: modesOf(context), ...(target !== undefined ? { targetHz: target, mode: mode ?? 1 } : {}) })
    } catch (error) {
      if (error instanceof TargetOutOfReachError) throw new OutOfReachError(error.message)
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
      return EXIT.done
    }
    const sep = (s: number | null) => (s === null ? '—' : percent(s, 2))
    const lines = [
      `Tuned ${result.label} (${result.parameter}) for ${result.goal === 'target' ? `mode ${mode ?? 1} at ${target} Hz` : 'the largest separation from every excitation'}`,
      `value: ${result.before.value.toPrecision(8)} → ${result.value.toPrecision(8)} (SI units)`,
      `smallest separation: ${sep(result.before.minSeparation)} → ${sep(result.minSeparation)} (margin ${percent(project.margin)})`,
    ]
    if (result.goal === 'separation' && result.minSeparation !== null && result.minSeparation < project.margin) {
      lines.push(`No value between ${min} and ${max} clears the ${percent(project.margin)} margin; the value above comes closest. Try another parameter or a wider range.`)
    }
    lines.push(
      '',
      `${'mode'.padStart(4)}${'before (Hz)'.padStart(16)}${'after (Hz)'.padStart(16)}`,
      ...result.frequenciesHz.map((f, i) => `${String(i + 1).padStart(4)}${result.before.frequenciesHz[i].toPrecision(8).padStart(16)}${f.toPrecision(8).padStart(16)}`),
      '',
      'Frequencies from the exact piecewise solution. Re-solve the tuned part and check it on the real part before ordering.',
    )
    writeText(io, lines)
    return EXIT.done
  },
}

const scatter: Command = {
  summary: "frequency bands from the file's tolerances (uniform scatter, fixed seed), checked against the margin",
  usage: '--samples N [--seed S] [--json] [--fail-on-conflict]',
  help: [
    "Each mode's band runs from the 5 % to the 95 % point of the samples. The resonance check then uses the band:",
    'a mode conflicts with an excitation when any part of its band is within the margin of it.',
    `--fail-on-conflict: exit ${EXIT.conflict} when any band conflicts.`,
  ].join('\n'),
  async run(context) {
    const { project, values, io } = context
    const samples = integerOption(values, 'samples', 10, 1_000_000)
    if (samples === undefined) throw new UsageError('--samples is required')
    const seed = integerOption(values, 'seed', 0, 2 ** 32 - 1) ?? 1
    if (!project.tolerances || Object.values(project.tolerances).every((t) => !t)) {
      io.stderr('rodwave: the project has no tolerances to scatter (add "tolerances" to the file)\n')
      return EXIT.invalidInput
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
    // The check with tolerances: each mode's 5–95 % band against every excitation band (as the app does).
    const bands = new Map(quantiles.map((q) => [modeKey(q), [q.p05, q.p95] as const]))
    const pairs = resonancePairs(nominal.modes, nominal.project, bands)
    const conflicts = pairs.filter((p) => p.status === 'conflict')
    if (values.json) {
      writeJson(io, {
        samples,
        seed,
        modes: quantiles,
        margin: project.margin,
        resonance: pairs.map((p) => ({
          mode: p.mode,
          modeBandHz: p.modeBandHz,
          excitation: p.band.label,
          order: p.band.order,
          excitationHz: [p.band.hz[0], p.band.hz[1]],
          separation: p.separation,
          status: p.status,
        })),
      })
    } else {
      const lines = [
        `Tolerance scatter, ${samples} samples (seed ${seed}): ${Object.entries(project.tolerances)
          .filter(([, t]) => t)
          .map(([k, t]) => `${k} ±${(100 * (t as number)).toFixed(2)} %`)
          .join(', ')}`,
        `${'mode'.padStart(4)}${'nominal (Hz)'.padStart(15)}${'5 %'.padStart(13)}${'50 %'.padStart(13)}${'95 %'.padStart(13)}`,
        ...quantiles.map((q) => `${String(q.mode).padStart(4)}${q.nominalHz.toPrecision(7).padStart(15)}${q.p05.toPrecision(7).padStart(13)}${q.p50.toPrecision(7).padStart(13)}${q.p95.toPrecision(7).padStart(13)}`),
        '',
      ]
      if (pairs.length === 0) {
        lines.push('No excitations in the project: no resonance check.')
      } else {
        lines.push(`Resonance check with the 5–95 % bands, margin ${percent(project.margin)} (separation from the nearest point of each band; 0 where they overlap):`)
        lines.push(`${'mode'.padStart(4)}  ${'closest excitation'.padEnd(36)}${'separation'.padStart(12)}  status`)
        for (const m of nominal.modes) {
          const pair = closestPair(pairs, m)
          if (pair) lines.push(`${String(m.mode).padStart(4)}  ${echo(bandName(pair.band)).padEnd(36)}${percent(pair.separation).padStart(12)}  ${pair.status}`)
        }
        lines.push(conflicts.length ? `${conflicts.length} mode–excitation pair(s) inside the margin with the tolerance bands.` : 'Every band clears the margin.')
      }
      writeText(io, lines)
    }
    if (values['fail-on-conflict'] && conflicts.length > 0) {
      io.stderr(`rodwave: ${conflicts.length} mode–excitation pair(s) inside the ${percent(project.margin)} margin with the tolerance bands\n`)
      return EXIT.conflict
    }
    return EXIT.done
  },
}

/** The largest displacement and stress of a band for a force amplitude, or per unit force. */
function bandJson(row: BandResponse, force: number | null) {
  return {
    excitation: row.band.label,
    order: row.band.order,
    excitationHz: [row.band.hz[0], row.band.hz[1]],
    peakHz: row.peakHz,
    peakAmplitude: row.peakAmplitude,
    amplification: row.amplification,
    stressPerForce: row.stressPerForce,
    stressAt: row.stressAt,
    stressHz: row.stressHz,
    ...(force !== null ? { peakDisplacement: row.peakAmplitude * force, peakStress: row.stressPerForce * force } : {}),
  }
}

function bandRange(row: BandResponse): string {
  const [lo, hi] = row.band.hz
  return lo === hi ? `${lo.toPrecision(5)} Hz` : `${lo.toPrecision(5)}–${hi.toPrecision(5)} Hz`
}

function responseText(project: Project, units: UnitSystem, request: { forceAt: number; responseAt: number; axis: FrequencyAxis; force: number | null }, firstHz: number, fromHz: number, elastic: number, points: { frequencyHz: number; amplitude: number; phaseDeg: number }[], rows: BandResponse[], hasStatic: boolean): string[] {
  const { force } = request
  const receptance = displayUnit(units, 'receptance')
  const displacement = displayUnit(units, 'sectionDimension')
  const stress = displayUnit(units, 'stress')
  const forceUnit = displayUnit(units, 'force')
  const lines = [
    force === null
      ? `Receptance u(${request.responseAt} m)/F(${request.forceAt} m), modal damping ζ = ${project.damping}, ${elastic} modes with static correction`
      : `Displacement at ${request.responseAt} m for a harmonic force of ${force} N at ${request.forceAt} m, modal damping ζ = ${project.damping}, ${elastic} modes with static correction`,
    `Frequencies evenly spaced on a ${request.axis === 'log' ? 'logarithmic' : 'linear'} axis, plus every mode and its half-power points in the range.`,
  ]
  if (request.axis === 'log' && firstHz !== fromHz) lines.push(`A logarithmic axis cannot start at 0 Hz: it starts at ${firstHz.toPrecision(3)} Hz.`)
  lines.push(
    force === null
      ? `${'f (Hz)'.padStart(12)}${`|u/F| (${receptance.symbol})`.padStart(18)}${'phase (°)'.padStart(12)}`
      : `${'f (Hz)'.padStart(12)}${`|u| (${displacement.symbol})`.padStart(18)}${'phase (°)'.padStart(12)}`,
    ...points.map(
      (p) =>
        `${p.frequencyHz.toPrecision(7).padStart(12)}${(force === null ? toDisplay(units, 'receptance', p.amplitude) : toDisplay(units, 'sectionDimension', p.amplitude * force)).toExponential(4).padStart(18)}${p.phaseDeg.toFixed(2).padStart(12)}`,
    ),
    '',
  )
  if (rows.length === 0) {
    lines.push('No excitations in the project: no amplification at excitation bands.')
    return lines
  }
  const stressHead = force === null ? `stress/F (${stress.symbol}/${forceUnit.symbol})` : `stress (${stress.symbol})`
  lines.push(force === null ? 'At each excitation band (per unit force at the force point):' : `At each excitation band (force amplitude ${force} N):`)
  const names = rows.map((row) => `${echo(bandName(row.band))}, ${bandRange(row)}`)
  const width = Math.max(16, ...names.map((name) => name.length)) + 2
  lines.push(`${'excitation band'.padEnd(width)}${(force === null ? `largest |u/F| (${receptance.symbol})` : `largest |u| (${displacement.symbol})`).padStart(24)}${'at (Hz)'.padStart(11)}${'× static'.padStart(10)}${`largest ${stressHead}`.padStart(26)}${'where (m)'.padStart(11)}`)
  for (const [i, row] of rows.entries()) {
    const peak = force === null ? toDisplay(units, 'receptance', row.peakAmplitude) : toDisplay(units, 'sectionDimension', row.peakAmplitude * force)
    const stressValue = force === null ? (row.stressPerForce * forceUnit.toSI) / stress.toSI : toDisplay(units, 'stress', row.stressPerForce * force)
    lines.push(
      `${names[i].padEnd(width)}${peak.toExponential(4).padStart(24)}${row.peakHz.toPrecision(6).padStart(11)}${(row.amplification === null ? '—' : row.amplification.toPrecision(3)).padStart(10)}${stressValue.toPrecision(4).padStart(26)}${row.stressAt.toPrecision(4).padStart(11)}`,
    )
  }
  lines.push('× static: the largest |u/F| over the band divided by the static |u/F| (0 Hz) between the same points.')
  if (!hasStatic) lines.push('The bar has no support, so it has no static value: a steady force moves it as a whole. No amplification can be given.')
  lines.push('Stress: the largest axial stress amplitude anywhere along the bar over the band. The same damping ratio in every mode is an assumption: measured damping of a bolted or clamped part varies.')
  return lines
}

const response: Command = {
  summary: "steady-state receptance with the file's damping, and at each excitation band its amplification and largest stress",
  usage: '--force-at X --response-at Y --from HZ --to HZ --points N [--log-spaced] [--force F] [--json]',
  help: [
    'X, Y in m from the start of the bar; a harmonic force at X, the displacement read at Y.',
    'N frequencies evenly spaced from HZ to HZ (on a logarithmic axis with --log-spaced; from 0 Hz it then starts',
    'three decades below the top), plus every mode and its half-power points inside the range.',
    '--force F: a force amplitude in N; displacements (m) and stresses (Pa) are then given for it, not per unit force.',
  ].join('\n'),
  async run(context) {
    const { project, values, io, overrides } = context
    const forceAt = requireNumber(context, 'force-at')
    const responseAt = requireNumber(context, 'response-at')
    const fromHz = requireNumber(context, 'from')
    const toHz = requireNumber(context, 'to')
    const points = integerOption(values, 'points', 1, 100_000)
    if (points === undefined) throw new UsageError('--points is required')
    const force = numberOption(values, 'force') ?? null
    if (force !== null && !(force > 0)) throw new UsageError('--force must be a force amplitude > 0, in N')
    const length = totalLength(project.segments)
    for (const [name, x] of [
      ['force-at', forceAt],
      ['response-at', responseAt],
    ] as const) {
      if (x < 0 || x > length) throw new UsageError(`--${name} must lie on the bar, between 0 and ${length} m`)
    }
    if (!(fromHz >= 0 && toHz > fromHz)) throw new UsageError('--from and --to must satisfy 0 ≤ from < to')
    const axis: FrequencyAxis = values['log-spaced'] ? 'log' : 'linear'
    const analysis = analyseProject(project, overrides, { withReference: false }).families[0]
    const model = receptanceModel(analysis, pointWeights(analysis, forceAt), pointWeights(analysis, responseAt), project.damping)
    const elasticHz = analysis.modes.filter((m) => !m.rigidBody).map((m) => m.frequencyHz)
    const grid = responseGrid({ fromHz, toHz, points, axis }, elasticHz, project.damping)
    const curve = grid.map((frequencyHz) => {
      const [real, imaginary] = evaluateReceptance(model, 2 * Math.PI * frequencyHz)
      return { frequencyHz, amplitude: Math.hypot(real, imaginary), phaseDeg: (Math.atan2(imaginary, real) * 180) / Math.PI }
    })
    const rows = bandResponses(analysis, model, forceAt)
    if (values.json) {
      writeJson(io, {
        damping: project.damping,
        axis,
        force,
        staticFlexibility: model.staticFlexibility,
        points: curve.map((p) => ({ ...p, ...(force !== null ? { displacement: p.amplitude * force } : {}) })),
        bands: rows.map((row) => bandJson(row, force)),
      })
      return EXIT.done
    }
    const firstHz = gridStartHz({ fromHz, toHz, axis })
    writeText(io, responseText(project, project.units, { forceAt, responseAt, axis, force }, firstHz, fromHz, elasticHz.length, curve, rows, model.staticFlexibility !== null))
    return EXIT.done
  },
}

export const DESIGN_COMMANDS: Record<string, Command> = { sensitivity, tune, scatter, response }
