/**
 * Design-guidance commands: sensitivity, tune, scatter, response. Flags are SI (m, Hz, N),
 * like every stored value; output is a readable table, or JSON with --json (README, "Command line").
 */
import { analyseProject } from '../core/analysis/modal-analysis'
import { designParameters, findParameter } from '../core/analysis/design-parameters'
import { designSensitivities } from '../core/analysis/family-sensitivity'
import { tuneParameter, TargetOutOfReachError, TuneError } from '../core/analysis/tuner'
import { scatterQuantiles } from '../core/analysis/tolerance-scatter'
import { evaluateReceptance, pointWeights, receptanceModel } from '../core/analysis/forced-response'
import { bandResponses, gridStartHz, responseGrid, type BandResponse, type FrequencyAxis } from '../core/analysis/response-bands'
import { bandName, closestPair, modeKey, resonancePairs } from '../core/analysis/resonance'
import { totalLength } from '../core/model/geometry'
import { familyName, type Family } from '../core/model/families'
import { displayUnit, type UnitSystem } from '../core/model/units'
import type { Motion, Project } from '../core/model/project'
import { CAUTION, chosenFamilies, echo, EXIT, familyTitle, integerOption, numberOption, OutOfReachError, projectWithOverrides, UsageError, type CliIo } from './cli-common'
import type { Command, CommandContext } from './commands'
import { ScatterPool } from './parallel-scatter'

function modesOf(context: CommandContext): number {
  return context.overrides.modes ?? context.project.analysis.modes
}

/** The project the design commands work on: the file with every analysis flag applied (--motions, --bending-theory, mesh, modes). */
function designProject(context: CommandContext): Project {
  return projectWithOverrides(context.project, context.overrides)
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
  summary: 'for each reported mode of every analysed family, the derivative of its frequency with respect to every model parameter',
  usage: '[--json] [--motion FAMILY] [--modes N]',
  help: [
    'Parameters: every segment length and section dimension (an area section: its area and the constants it gives), every',
    "material's Young's modulus and density (and its shear modulus or Poisson's ratio where torsion or Timoshenko bending uses",
    'it), every point mass and its polar and transverse inertias, every spring stiffness and rotational stiffness, the preload.',
    'Only parameters that act on the chosen families are listed.',
    'Axial modes use the exact mode shapes; torsion and bending the finite-element modes (Rayleigh quotient), with the mesh',
    'of the analysis. --motion FAMILY: only that family (axial, torsion, bending; bending-weak or bending-strong).',
  ].join('\n'),
  async run(context) {
    const { values, io } = context
    const project = designProject(context)
    const chosen = chosenFamilies(project, values)
    const keys = new Set(chosen.families.map((f) => f.key))
    const sensitivities = designSensitivities(project, modesOf(context), chosen.motions).filter((s) => keys.has(s.family))
    if (values.json) {
      writeJson(io, {
        sensitivities: sensitivities.map((s) => ({ mode: s.mode, motion: s.motion, plane: s.plane, parameter: s.parameter, value: s.value, derivative: s.derivative, relative: s.relative })),
      })
      return EXIT.done
    }
    const lines: string[] = [`Sensitivities of the natural frequencies${project.title ? ` — ${project.title}` : ''}`]
    lines.push('Axial modes from the exact mode shapes; torsion and bending modes from the finite-element modes.')
    lines.push('relative = % change of the frequency per % change of the parameter; derivative in Hz per SI unit')
    for (const family of chosen.families) {
      const own = sensitivities.filter((s) => s.family === family.key)
      for (const mode of [...new Set(own.map((s) => s.mode))]) {
        const rows = own.filter((s) => s.mode === mode).sort((a, b) => Math.abs(b.relative) - Math.abs(a.relative))
        lines.push('', `${familyTitle(family)} mode ${mode}, ${rows[0].frequencyHz.toPrecision(6)} Hz`)
        lines.push(`${'parameter'.padEnd(40)}${'value'.padStart(14)}${'df/dp'.padStart(14)}${'relative'.padStart(10)}`)
        for (const s of rows) {
          lines.push(`${s.parameter.padEnd(40)}${s.value.toPrecision(6).padStart(14)}${s.derivative.toPrecision(5).padStart(14)}${s.relative.toFixed(4).padStart(10)}`)
        }
      }
    }
    writeText(io, lines)
    return EXIT.done
  },
}

const tune: Command = {
  summary: 'the parameter value that puts a mode on a target, or that maximises the smallest separation from every excitation',
  usage: '--parameter PATH --min A --max B [--motion FAMILY] [--mode N --target HZ] [--json]',
  help: [
    'PATH is a JSON path of the project file, as the sensitivity command lists them (e.g. segments[0].length).',
    "A and B are SI values (m, m², m⁴, Pa, kg/m³, kg, kg·m², N/m, N·m/rad, N). Every parameter needs 0 < A; a tube's bore",
    'may start at 0 (a solid bar) and must stay below the outer diameter.',
    '--motion FAMILY (axial, torsion or bending): --mode N counts in that family, and only its modes and the excitations that',
    'drive it count for the separation. Without it every analysed family counts and mode N is of the first (axial where',
    'analysed). On a two-plane section mode N of bending is of the weak plane.',
    `Exit ${EXIT.targetOutOfReach} when no value between A and B puts mode N on the target.`,
  ].join('\n'),
  async run(context) {
    const { values, io } = context
    const project = designProject(context)
    const chosen = chosenFamilies(project, values)
    if (chosen.given && values.motion !== chosen.motions[0]) throw new UsageError(`tune's --motion takes axial, torsion or bending (got "${echo(values.motion ?? '')}"); mode N of bending is of the weak plane`)
    const path = values.parameter
    if (!path) throw new UsageError(`--parameter is required; one of: ${parameterList(project)}`)
    if (!findParameter(project, path)) throw new UsageError(`"${echo(path)}" is not a parameter of this project; one of: ${parameterList(project)}`)
    const min = requireNumber(context, 'min')
    const max = requireNumber(context, 'max')
    const target = numberOption(values, 'target')
    const mode = integerOption(values, 'mode', 1, 200)
    if (mode !== undefined && target === undefined) throw new UsageError('--mode needs --target')
    const motion: Motion | undefined = chosen.given ? chosen.motions[0] : undefined
    let result
    try {
      result = tuneParameter(project, {
        parameter: path,
        min,
        max,
        modes: modesOf(context),
        ...(motion ? { motion } : {}),
        ...(target !== undefined ? { targetHz: target, mode: mode ?? 1 } : {}),
      })
    } catch (error) {
      if (error instanceof TargetOutOfReachError) throw new OutOfReachError(error.message)
      if (error instanceof TuneError) throw new UsageError(error.message)
      throw error
    }
    // The family of each frequency, by key; mode N of a target is the first family's.
    const familyOf = new Map(chosen.families.map((f) => [f.key as string, f]))
    const wordsOf = (key: string) => {
      const family = familyOf.get(key)
      return family ? familyName(family) : key
    }
    if (values.json) {
      writeJson(io, {
        parameter: result.parameter,
        value: result.value,
        frequenciesHz: result.frequenciesHz,
        families: result.families,
        minSeparation: result.minSeparation,
        goal: result.goal,
        before: result.before,
      })
      return EXIT.done
    }
    const sep = (s: number | null) => (s === null ? '—' : percent(s, 2))
    const targetFamily = result.families[0] ? wordsOf(result.families[0].family) : ''
    const lines = [
      `Tuned ${result.label} (${result.parameter}) for ${result.goal === 'target' ? `${targetFamily} mode ${mode ?? 1} at ${target} Hz` : `the largest separation from every excitation (${[...new Set(result.families.map((f) => wordsOf(f.family)))].join(', ')} modes)`}`,
      `value: ${result.before.value.toPrecision(8)} → ${result.value.toPrecision(8)} (SI units)`,
      `smallest separation: ${sep(result.before.minSeparation)} → ${sep(result.minSeparation)} (margin ${percent(project.margin)})`,
    ]
    if (result.goal === 'separation' && result.minSeparation !== null && result.minSeparation < project.margin) {
      lines.push(`No value between ${min} and ${max} clears the ${percent(project.margin)} margin; the value above comes closest. Try another parameter or a wider range.`)
    }
    const width = Math.max(6, ...result.families.map((f) => wordsOf(f.family).length)) + 2
    lines.push(
      '',
      `${'family'.padEnd(width)}${'mode'.padStart(4)}${'before (Hz)'.padStart(16)}${'after (Hz)'.padStart(16)}`,
      ...result.frequenciesHz.map(
        (f, i) => `${wordsOf(result.families[i].family).padEnd(width)}${String(result.families[i].mode).padStart(4)}${result.before.frequenciesHz[i].toPrecision(8).padStart(16)}${f.toPrecision(8).padStart(16)}`,
      ),
      '',
      'Frequencies from the exact solution where one exists (else the finite elements). Re-solve the tuned part and check it on the real part before ordering.',
    )
    writeText(io, lines)
    return EXIT.done
  },
}

const scatter: Command = {
  summary: "frequency bands from the file's tolerances (uniform scatter, fixed seed), checked against the margin",
  usage: '--samples N [--seed S] [--motion FAMILY] [--json] [--fail-on-conflict]',
  help: [
    "Each mode's band runs from the 5 % to the 95 % point of the samples. The resonance check then uses the band:",
    'a mode conflicts with an excitation (that drives its family) when any part of its band is within the margin of it.',
    '--motion FAMILY: only that family (axial, torsion, bending; bending-weak or bending-strong) is solved and checked.',
    'The draws cover the parameters that act on the families solved, so the bands of one family may differ a little',
    'between a run with --motion and one without (other random numbers, the same distribution).',
    `--fail-on-conflict: exit ${EXIT.conflict} when any band conflicts.`,
  ].join('\n'),
  async run(context) {
    const { values, io } = context
    const project = designProject(context)
    const samples = integerOption(values, 'samples', 10, 1_000_000)
    if (samples === undefined) throw new UsageError('--samples is required')
    const seed = integerOption(values, 'seed', 0, 2 ** 32 - 1) ?? 1
    if (!project.tolerances || Object.values(project.tolerances).every((t) => !t)) {
      io.stderr('rodwave: the project has no tolerances to scatter (add "tolerances" to the file)\n')
      return EXIT.invalidInput
    }
    const chosen = chosenFamilies(project, values)
    const keys = new Set(chosen.families.map((f) => f.key))
    const modes = modesOf(context)
    // Only the chosen motions are solved (a two-plane section's bending keeps both planes; the table shows the chosen one).
    const scattered: Project = { ...project, motions: chosen.motions }
    const nominal = analyseProject(scattered, {}, { withReference: false })
    const pool = ScatterPool.start()
    let frequencies: Float64Array
    try {
      frequencies = await pool.run(scattered, { seed, samples, modes })
    } finally {
      await pool.close()
    }
    const quantiles = scatterQuantiles(frequencies, nominal.modes).filter((q) => keys.has(q.family))
    // The check with tolerances: each mode's 5–95 % band against every excitation band that drives its family (as the app does).
    const bands = new Map(quantiles.map((q) => [modeKey(q), [q.p05, q.p95] as const]))
    const checked = nominal.modes.filter((m) => keys.has(m.family))
    const pairs = resonancePairs(checked, nominal.project, bands)
    const conflicts = pairs.filter((p) => p.status === 'conflict')
    if (values.json) {
      writeJson(io, {
        samples,
        seed,
        modes: quantiles,
        margin: project.margin,
        resonance: pairs.map((p) => ({
          mode: p.mode,
          motion: p.motion,
          plane: p.plane,
          modeBandHz: p.modeBandHz,
          excitation: p.band.label,
          order: p.band.order,
          excitationHz: [p.band.hz[0], p.band.hz[1]],
          separation: p.separation,
          status: p.status,
        })),
      })
    } else {
      const words = (f: Pick<Family, 'motion' | 'plane'>) => familyName(f)
      const width = Math.max(6, ...quantiles.map((q) => words(q).length)) + 2
      const lines = [
        `Tolerance scatter, ${samples} samples (seed ${seed}): ${Object.entries(project.tolerances)
          .filter(([, t]) => t)
          .map(([k, t]) => `${k} ±${(100 * (t as number)).toFixed(2)} %`)
          .join(', ')}`,
        `${'family'.padEnd(width)}${'mode'.padStart(4)}${'nominal (Hz)'.padStart(15)}${'5 %'.padStart(13)}${'50 %'.padStart(13)}${'95 %'.padStart(13)}`,
        ...quantiles.map(
          (q) =>
            `${words(q).padEnd(width)}${String(q.mode).padStart(4)}${q.nominalHz.toPrecision(7).padStart(15)}${q.p05.toPrecision(7).padStart(13)}${q.p50.toPrecision(7).padStart(13)}${q.p95.toPrecision(7).padStart(13)}`,
        ),
        '',
      ]
      if (pairs.length === 0) {
        lines.push(project.excitations.length === 0 ? 'No excitations in the project: no resonance check.' : 'No excitation drives these families: no resonance check.')
      } else {
        lines.push(`Resonance check with the 5–95 % bands, margin ${percent(project.margin)} (separation from the nearest point of each band; 0 where they overlap):`)
        lines.push(`${'family'.padEnd(width)}${'mode'.padStart(4)}  ${'closest excitation'.padEnd(36)}${'separation'.padStart(12)}  status`)
        for (const m of checked) {
          const pair = closestPair(pairs, m)
          if (pair) lines.push(`${words(m).padEnd(width)}${String(m.mode).padStart(4)}  ${echo(bandName(pair.band)).padEnd(36)}${percent(pair.separation).padStart(12)}  ${pair.status}`)
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

/** What the load and the response of a family are, and their units (SI, and as the project displays them). */
interface LoadKind {
  /** "force", "torque", "side force". */
  readonly load: string
  /** "displacement", "twist", "deflection". */
  readonly response: string
  /** "axial stress", "shear stress", "bending stress". */
  readonly stress: string
  /** The receptance as a ratio: "u/F", "θ/T", "w/F". */
  readonly ratio: string
  readonly si: { readonly load: string; readonly response: string; readonly receptance: string; readonly stressPerLoad: string }
  readonly display: { readonly load: Unit; readonly response: Unit; readonly receptance: Unit; readonly stress: Unit }
}

interface Unit {
  readonly symbol: string
  readonly toSI: number
}

/** A force (axial), a torque (torsion) or a side force (bending), and what each moves. */
function loadKind(motion: Motion, units: UnitSystem): LoadKind {
  const stress = displayUnit(units, 'stress')
  if (motion === 'torsion') {
    const torque = displayUnit(units, 'torque')
    return {
      load: 'torque',
      response: 'twist',
      stress: 'shear stress',
      ratio: 'θ/T',
      si: { load: 'N·m', response: 'rad', receptance: 'rad/(N·m)', stressPerLoad: 'Pa/(N·m)' },
      display: { load: torque, response: displayUnit(units, 'angle'), receptance: { symbol: `rad/(${torque.symbol})`, toSI: 1 / torque.toSI }, stress },
    }
  }
  const display = { load: displayUnit(units, 'force'), response: displayUnit(units, 'sectionDimension'), receptance: displayUnit(units, 'receptance'), stress }
  if (motion === 'bending') {
    return { load: 'side force', response: 'deflection', stress: 'bending stress', ratio: 'w/F', si: { load: 'N', response: 'm', receptance: 'm/N', stressPerLoad: 'Pa/N' }, display }
  }
  return { load: 'force', response: 'displacement', stress: 'axial stress', ratio: 'u/F', si: { load: 'N', response: 'm', receptance: 'm/N', stressPerLoad: 'Pa/N' }, display }
}

function responseText(
  project: Project,
  family: Family,
  request: { forceAt: number; responseAt: number; axis: FrequencyAxis; force: number | null },
  firstHz: number,
  fromHz: number,
  elastic: number,
  points: { frequencyHz: number; amplitude: number; phaseDeg: number }[],
  rows: BandResponse[],
  hasStatic: boolean,
): string[] {
  const { force } = request
  const kind = loadKind(family.motion, project.units)
  const { receptance, response, stress, load } = kind.display
  const shown = (unit: Unit, valueSI: number) => valueSI / unit.toSI
  const lines = [
    force === null
      ? `Receptance of the ${familyName(family)} modes: ${kind.response} at ${request.responseAt} m per unit ${kind.load} at ${request.forceAt} m (${receptance.symbol}), modal damping ζ = ${project.damping}, ${elastic} modes with static correction`
      : `${kind.response.charAt(0).toUpperCase()}${kind.response.slice(1)} at ${request.responseAt} m for a harmonic ${kind.load} of ${force} ${kind.si.load} at ${request.forceAt} m (${familyName(family)} modes), modal damping ζ = ${project.damping}, ${elastic} modes with static correction`,
    `Frequencies evenly spaced on a ${request.axis === 'log' ? 'logarithmic' : 'linear'} axis, plus every mode and its half-power points in the range.`,
  ]
  if (request.axis === 'log' && firstHz !== fromHz) lines.push(`A logarithmic axis cannot start at 0 Hz: it starts at ${firstHz.toPrecision(3)} Hz.`)
  const perLoad = force === null
  lines.push(
    `${'f (Hz)'.padStart(12)}${(perLoad ? `|${kind.ratio}| (${receptance.symbol})` : `|${kind.ratio.split('/')[0]}| (${response.symbol})`).padStart(22)}${'phase (°)'.padStart(12)}`,
    ...points.map(
      (p) => `${p.frequencyHz.toPrecision(7).padStart(12)}${(perLoad ? shown(receptance, p.amplitude) : shown(response, p.amplitude * force)).toExponential(4).padStart(22)}${p.phaseDeg.toFixed(2).padStart(12)}`,
    ),
    '',
  )
  if (rows.length === 0) {
    lines.push(project.excitations.length === 0 ? 'No excitations in the project: no amplification at excitation bands.' : `No excitation drives the ${familyName(family)} modes: no amplification at excitation bands.`)
    return lines
  }
  const stressHead = perLoad ? `${kind.stress}/${kind.ratio.split('/')[1]} (${stress.symbol}/${load.symbol.includes('·') ? `(${load.symbol})` : load.symbol})` : `${kind.stress} (${stress.symbol})`
  lines.push(perLoad ? `At each excitation band that drives the ${familyName(family)} modes (per unit ${kind.load} at the load point):` : `At each excitation band that drives the ${familyName(family)} modes (${kind.load} amplitude ${force} ${kind.si.load}):`)
  const names = rows.map((row) => `${echo(bandName(row.band))}, ${bandRange(row)}`)
  const width = Math.max(16, ...names.map((name) => name.length)) + 2
  const peakHead = perLoad ? `largest |${kind.ratio}| (${receptance.symbol})` : `largest |${kind.ratio.split('/')[0]}| (${response.symbol})`
  lines.push(`${'excitation band'.padEnd(width)}${peakHead.padStart(26)}${'at (Hz)'.padStart(11)}${'× static'.padStart(10)}${`largest ${stressHead}`.padStart(34)}${'where (m)'.padStart(11)}`)
  for (const [i, row] of rows.entries()) {
    const peak = perLoad ? shown(receptance, row.peakAmplitude) : shown(response, row.peakAmplitude * force)
    const stressValue = perLoad ? (row.stressPerForce * load.toSI) / stress.toSI : shown(stress, row.stressPerForce * force)
    lines.push(
      `${names[i].padEnd(width)}${peak.toExponential(4).padStart(26)}${row.peakHz.toPrecision(6).padStart(11)}${(row.amplification === null ? '—' : row.amplification.toPrecision(3)).padStart(10)}${stressValue.toPrecision(4).padStart(34)}${row.stressAt.toPrecision(4).padStart(11)}`,
    )
  }
  lines.push(`× static: the largest |${kind.ratio}| over the band divided by the static |${kind.ratio}| (0 Hz) between the same points.`)
  if (!hasStatic) lines.push(`The part has no ${familyName(family)} support, so it has no static value: a steady ${kind.load} moves it as a whole. No amplification can be given.`)
  lines.push(`Stress: the largest ${kind.stress} amplitude anywhere along the part over the band. The same damping ratio in every mode is an assumption: measured damping of a bolted or clamped part varies.`)
  return lines
}

const response: Command = {
  summary: "steady-state receptance with the file's damping, and at each excitation band its amplification and largest stress",
  usage: '--force-at X --response-at Y --from HZ --to HZ --points N [--motion FAMILY] [--log-spaced] [--force F] [--json]',
  help: [
    'X, Y in m from the start of the part; a harmonic load at X, the response read at Y. --motion chooses the family and so the',
    'load: axial, a force along the axis (displacement, m/N); torsion, a torque about it (twist, rad/(N·m)); bending, a side',
    'force (sideways deflection, m/N); bending-weak or bending-strong for one plane of a two-plane section. Default: the',
    'first analysed family (axial where analysed).',
    'N frequencies evenly spaced from HZ to HZ (on a logarithmic axis with --log-spaced; from 0 Hz it then starts',
    'three decades below the top), plus every mode and its half-power points inside the range.',
    '--force F: a load amplitude in N (N·m for torsion); responses and stresses (Pa) are then given for it, not per unit load.',
  ].join('\n'),
  async run(context) {
    const { values, io, overrides } = context
    const project = designProject(context)
    const chosen = chosenFamilies(project, values)
    if (chosen.families.length > 1 && chosen.given) {
      throw new UsageError(`--motion ${values.motion}: the section bends in two planes; the side force acts in one, so use --motion bending-weak or bending-strong`)
    }
    const family = chosen.families[0]
    const forceAt = requireNumber(context, 'force-at')
    const responseAt = requireNumber(context, 'response-at')
    const fromHz = requireNumber(context, 'from')
    const toHz = requireNumber(context, 'to')
    const points = integerOption(values, 'points', 1, 100_000)
    if (points === undefined) throw new UsageError('--points is required')
    const force = numberOption(values, 'force') ?? null
    const kind = loadKind(family.motion, project.units)
    if (force !== null && !(force > 0)) throw new UsageError(`--force must be a ${kind.load} amplitude > 0, in ${kind.si.load}`)
    const length = totalLength(project.segments)
    for (const [name, x] of [
      ['force-at', forceAt],
      ['response-at', responseAt],
    ] as const) {
      if (x < 0 || x > length) throw new UsageError(`--${name} must lie on the bar, between 0 and ${length} m`)
    }
    if (!(fromHz >= 0 && toHz > fromHz)) throw new UsageError('--from and --to must satisfy 0 ≤ from < to')
    const axis: FrequencyAxis = values['log-spaced'] ? 'log' : 'linear'
    const analysis = analyseProject(project, overrides, { withReference: false, families: [family.key] }).families[0]
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
        motion: family.motion,
        plane: family.plane,
        load: kind.load,
        units: kind.si,
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
    writeText(io, responseText(project, family, { forceAt, responseAt, axis, force }, firstHz, fromHz, elasticHz.length, curve, rows, model.staticFlexibility !== null))
    return EXIT.done
  },
}

export const DESIGN_COMMANDS: Record<string, Command> = { sensitivity, tune, scatter, response }
