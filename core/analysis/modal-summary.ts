/**
 * The modal summary in the two forms other tools read: the `solve --json` document
 * (see README, "Command line") and the modal summary table (CSV, RFC 4180 quoting, text
 * cells that a spreadsheet would run as a formula neutralised).
 */
import { nowMs } from '../clock'
import { hzToRpm } from '../model/units'
import type { ModalAnalysis } from './modal-analysis'
import { bandName, closestPair } from './resonance'
import { modelWarnings } from './model-checks'

export interface SolveDocument {
  title: string
  motions: string[]
  totals: { length: number; mass: number; elements: number; dofs: number }
  analysis: { elementOrder: number; elementsPerSegment?: number; maxElementLength?: number; mass: string; modes: number; bendingTheory?: string }
  margin: number
  preload?: number
  modes: {
    mode: number
    motion: string
    plane: string | null
    frequencyHz: number
    rigidBody: boolean
    referenceHz: number | null
    errorVsReference: number | null
    participationFactor: number | null
    effectiveMass: number | null
    effectiveMassFraction: number | null
    cumulativeEffectiveMassFraction: number | null
  }[]
  reference: {
    /** The axial family's (or the only family's) method and frequencies, as in version 1. */
    method: 'exact' | 'extrapolated' | null
    formulation: string | null
    frequenciesHz: number[]
    /** Every family's reference frequencies, by family key ("axial", "torsion", "bending" or "bending-weak"/"bending-strong"). */
    families: Record<string, number[]>
    /** Every family's method: "exact", or "extrapolated" (a Richardson estimate from two fine meshes). */
    methods: Record<string, 'exact' | 'extrapolated' | null>
    formulations: Record<string, string | null>
  }
  resonance: { mode: number; motion: string; plane: string | null; modeHz: number; excitation: string; order: number | null; excitationHz: [number, number]; separation: number; status: string }[]
  buckling: { compression: number; criticalCompression: number; ratio: number; method: string } | null
  checks: { sturmCount: { passed: boolean; shifts: number[]; counts: number[]; expected: number[]; families: Record<string, { passed: boolean; shifts: number[]; counts: number[]; expected: number[] }> } }
  /** Plain-language warnings about trust in the results (model-checks.ts); empty when none. */
  warnings: { code: string; message: string }[]
  timing: SolveTiming
}

/**
 * Wall time of each phase of a solve, ms. The phases before the analysis are known only to the
 * front end that read the file, which passes them in; writing the document out comes after it.
 */
export interface SolveTiming {
  /** Process start to the command line's first statement (Node's start, loading Rodwave). */
  startupMs?: number
  /** Reading the project file. */
  readMs?: number
  /** Parsing and checking it against the file format. */
  validateMs?: number
  /** Meshing and assembling stiffness and mass. */
  assembleMs: number
  /** The eigen solver, with its Sturm checks. */
  solveMs: number
  /** The exact reference. */
  referenceMs: number
  /** The rest of the analysis: frequencies, effective mass, the resonance check (when the front end timed the whole analysis). */
  resultsMs?: number
  /** The trust checks behind `warnings` (residuals, orthogonality, conditioning). */
  checksMs: number
  /** From the front end's start (or the analysis) to the finished document. */
  totalMs: number
}

/** Phases a front end measured around the analysis, for the document's timing. */
export interface SolvePhases {
  readonly startupMs?: number
  readonly readMs?: number
  readonly validateMs?: number
  /** The whole analyseProject call, so the time after the reference can be given. */
  readonly analyseMs?: number
  /** nowMs() when the front end began (after startup). */
  readonly startedAt?: number
}

export function solveDocument(analysis: ModalAnalysis, phases: SolvePhases = {}): SolveDocument {
  const s = analysis.settings
  const primary = analysis.families.find((f) => f.family.motion === 'axial') ?? analysis.families[0]
  const sturmOf = (f: (typeof analysis.families)[number]) => ({ passed: f.sturm.passed, shifts: f.sturm.shifts, counts: f.sturm.counts, expected: f.sturm.expected })
  const checksStart = nowMs()
  const warnings = modelWarnings(analysis).map((w) => ({ code: w.code, message: w.message }))
  const finished = nowMs()
  const { assembleMs, solveMs, referenceMs } = analysis.timing
  // The checks of the analysis itself (buckling) and of the solved modes.
  const checksMs = analysis.timing.checksMs + (finished - checksStart)
  const timing: SolveTiming = {
    ...(phases.startupMs !== undefined ? { startupMs: phases.startupMs } : {}),
    ...(phases.readMs !== undefined ? { readMs: phases.readMs } : {}),
    ...(phases.validateMs !== undefined ? { validateMs: phases.validateMs } : {}),
    assembleMs,
    solveMs,
    referenceMs,
    ...(phases.analyseMs !== undefined ? { resultsMs: Math.max(0, phases.analyseMs - assembleMs - solveMs - referenceMs) } : {}),
    checksMs,
    totalMs:
      (phases.startupMs ?? 0) +
      (phases.startedAt !== undefined ? finished - phases.startedAt : (phases.readMs ?? 0) + (phases.validateMs ?? 0) + (phases.analyseMs ?? assembleMs + solveMs + referenceMs) + checksMs),
  }
  return {
    title: analysis.project.title ?? '',
    motions: [...analysis.project.motions],
    totals: analysis.totals,
    analysis: {
      elementOrder: s.elementOrder,
      ...(s.elementsPerSegment !== undefined ? { elementsPerSegment: s.elementsPerSegment } : {}),
      ...(s.maxElementLength !== undefined ? { maxElementLength: s.maxElementLength } : {}),
      mass: s.mass,
      modes: s.modes,
      ...(analysis.project.motions.includes('bending') ? { bendingTheory: s.bendingTheory ?? 'euler-bernoulli' } : {}),
    },
    margin: analysis.project.margin,
    ...(analysis.project.preload !== undefined ? { preload: analysis.project.preload } : {}),
    modes: analysis.modes.map((m) => ({
      mode: m.mode,
      motion: m.motion,
      plane: m.plane,
      frequencyHz: m.frequencyHz,
      rigidBody: m.rigidBody,
      referenceHz: m.referenceHz,
      errorVsReference: m.errorVsReference,
      participationFactor: m.participationFactor,
      effectiveMass: m.effectiveMass,
      effectiveMassFraction: m.effectiveMassFraction,
      cumulativeEffectiveMassFraction: m.cumulativeEffectiveMassFraction,
    })),
    reference: {
      method: primary?.reference.method ?? null,
      formulation: primary?.reference.formulation ?? null,
      frequenciesHz: primary?.reference.frequenciesHz ?? [],
      families: Object.fromEntries(analysis.families.map((f) => [f.family.key, f.reference.frequenciesHz])),
      methods: Object.fromEntries(analysis.families.map((f) => [f.family.key, f.reference.method])),
      formulations: Object.fromEntries(analysis.families.map((f) => [f.family.key, f.reference.formulation])),
    },
    resonance: analysis.resonance.map((p) => ({
      mode: p.mode,
      motion: p.motion,
      plane: p.plane,
      modeHz: p.frequencyHz,
      excitation: p.band.label,
      order: p.band.order,
      excitationHz: [p.band.hz[0], p.band.hz[1]],
      separation: p.separation,
      status: p.status,
    })),
    buckling: analysis.buckling ? { ...analysis.buckling } : null,
    checks: {
      sturmCount: {
        ...(primary ? sturmOf(primary) : { passed: true, shifts: [], counts: [], expected: [] }),
        passed: analysis.sturmPassed,
        families: Object.fromEntries(analysis.families.map((f) => [f.family.key, sturmOf(f)])),
      },
    },
    warnings,
    timing,
  }
}

export const MODAL_SUMMARY_COLUMNS = [
  'mode',
  'motion',
  'frequency_hz',
  'speed_rpm',
  'reference_hz',
  'error_vs_reference',
  'effective_mass_percent',
  'cumulative_effective_mass_percent',
  'closest_excitation',
  'separation_percent',
  'status',
  'plane',
] as const

/**
 * A text cell beginning with one of these is read by spreadsheets as a formula (or turned into
 * one): =, +, -, @, tab, carriage return (OWASP, "CSV Injection", owasp.org/www-community/attacks/CSV_Injection).
 */
const FORMULA_START = /^[=+\-@\t\r]/

function csvField(value: string | number | null): string {
  if (value === null) return ''
  // Numbers are written by formatNumber and stay numbers (a negative separation is "-6.3", not text);
  // only text is neutralised, with the leading apostrophe that guidance recommends.
  const text = typeof value === 'number' ? formatNumber(value) : FORMULA_START.test(value) ? `'${value}` : value
  return /[",\r\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text
}

/** Enough digits to round-trip what matters, without noise: 10 significant. */
function formatNumber(v: number): string {
  if (!Number.isFinite(v)) return ''
  if (v === 0) return '0'
  return String(Number(v.toPrecision(10)))
}

/** The modal summary table: one row per mode, with its closest excitation and status. */
export function modalSummaryCsv(analysis: ModalAnalysis): string {
  const lines = [MODAL_SUMMARY_COLUMNS.join(',')]
  for (const m of analysis.modes) {
    const pair = closestPair(analysis.resonance, m)
    const row = [
      m.mode,
      m.motion,
      m.frequencyHz,
      hzToRpm(m.frequencyHz),
      m.referenceHz,
      m.errorVsReference,
      m.effectiveMassFraction === null ? null : 100 * m.effectiveMassFraction,
      m.cumulativeEffectiveMassFraction === null ? null : 100 * m.cumulativeEffectiveMassFraction,
      pair ? bandName(pair.band) : m.rigidBody ? 'rigid-body mode' : null,
      pair ? 100 * pair.separation : null,
      pair ? pair.status : null,
      m.plane,
    ]
    lines.push(row.map(csvField).join(','))
  }
  return lines.join('\r\n') + '\r\n'
}
