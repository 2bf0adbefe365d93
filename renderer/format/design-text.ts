/**
 * Design guidance in words and display units: a sensible step per parameter (about 1 % of its
 * value, rounded to 1, 2 or 5 × 10ⁿ in the unit it is shown in) and what that step does to a
 * mode ("Shortening segment 2 by 10 mm raises mode 1 by 4.1 Hz"), from the first-order
 * sensitivity. Receptance and stress per unit force in the chosen units.
 */
import type { DesignParameter } from '../../core/analysis/design-parameters'
import type { Sensitivity } from '../../core/analysis/sensitivity'
import type { QuantityKind, UnitSystem } from '../../core/model/units'
import type { Motion } from '../../core/model/project'
import { fromScreen, screenUnit, toScreen } from './quantity'
import { formatFigure, formatScientific, MINUS } from '../../core/report/number-format'
import { modeName } from './motion'

/** Segment lengths step in the section unit (mm, in): 1 % of a rod's length reads as whole millimetres. */
export function stepKind(quantity: QuantityKind): QuantityKind {
  return quantity === 'length' ? 'sectionDimension' : quantity
}

/** The nearest of 1, 2 and 5 × 10ⁿ to v, nearest on a logarithmic scale. */
export function roundStep(v: number): number {
  if (!(v > 0 && Number.isFinite(v))) return NaN
  const power = 10 ** Math.floor(Math.log10(v))
  let best = power
  for (const m of [2, 5, 10]) if (Math.abs(Math.log10((m * power) / v)) < Math.abs(Math.log10(best / v))) best = m * power
  // 10 ** −n is not exact in binary: one significant digit is what the step has.
  return Number(best.toPrecision(1))
}

export interface SensitivityStep {
  /** The step in SI units of the parameter. */
  readonly stepSI: number
  /** The quantity the step is shown in (and df/dp is given per). */
  readonly kind: QuantityKind
  /** "10 mm". */
  readonly text: string
}

/** About 1 % of the parameter's value, a round number in the unit it is shown in. */
export function sensitivityStep(parameter: Pick<DesignParameter, 'quantity' | 'value'>, units: UnitSystem): SensitivityStep {
  const kind = stepKind(parameter.quantity)
  const shownStep = roundStep(0.01 * Math.abs(toScreen(units, kind, parameter.value)))
  return { stepSI: fromScreen(units, kind, shownStep), kind, text: `${formatFigure(shownStep, 1)} ${screenUnit(units, kind).symbol}` }
}

export function capitalised(text: string): string {
  return text.charAt(0).toUpperCase() + text.slice(1)
}

/** The change of a parameter by a step, up or down, in words: "shortening segment 2 by 10 mm". */
export function changeWords(parameter: Pick<DesignParameter, 'label' | 'target'>, up: boolean, stepText: string): string {
  const target = parameter.target
  switch (target.kind) {
    case 'segmentLength':
      return `${up ? 'lengthening' : 'shortening'} segment ${target.segment + 1} by ${stepText}`
    case 'mass':
      return up ? `adding ${stepText} to ${parameter.label}` : `removing ${stepText} from ${parameter.label}`
    default:
      return `${up ? 'increasing' : 'reducing'} the ${parameter.label} by ${stepText}`
  }
}

/** Relative sensitivities smaller than this are round-off: the parameter does not move the mode. */
const NO_EFFECT = 1e-9

/**
 * What a step of the parameter does to the mode, said in the direction that raises it (the other
 * direction lowers it by about as much, to first order).
 */
export function sensitivitySentence(s: Pick<Sensitivity, 'mode' | 'derivative' | 'relative'>, parameter: Pick<DesignParameter, 'label' | 'target' | 'quantity' | 'value'>, units: UnitSystem): string {
  const step = sensitivityStep(parameter, units)
  const change = Math.abs(s.derivative) * step.stepSI
  // A sensitivity of one family among several names it: "raises bending mode 1".
  const mode = 'motion' in s ? modeName(s) : `mode ${s.mode}`
  if (!(Math.abs(s.relative) >= NO_EFFECT) || !Number.isFinite(change)) {
    return `Changing the ${parameter.label} by ${step.text} leaves ${mode} unchanged (to first order)`
  }
  return `${capitalised(changeWords(parameter, s.derivative > 0, step.text))} raises ${mode} by ${formatFigure(change, 2)} Hz`
}

/** df/dp per unit of the step: "−21.64" (Hz per mm, with derivativeUnit). */
export function derivativeText(s: Pick<Sensitivity, 'derivative'>, parameter: Pick<DesignParameter, 'quantity'>, units: UnitSystem): string {
  return formatFigure(s.derivative * screenUnit(units, stepKind(parameter.quantity)).toSI, 4)
}

export function derivativeUnit(parameter: Pick<DesignParameter, 'quantity'>, units: UnitSystem): string {
  return `Hz/${screenUnit(units, stepKind(parameter.quantity)).symbol}`
}

/** (p/f) df/dp with three decimals and a true minus sign: "−0.456". */
export function relativeText(relative: number): string {
  const text = Math.abs(relative).toFixed(3)
  if (Number(text) === 0) return '0.000'
  return relative < 0 ? `${MINUS}${text}` : text
}

/** Sensitivities of one mode (of one family, when given), largest relative effect first. */
export function rankedSensitivities<T extends Pick<Sensitivity, 'mode' | 'relative'> & { readonly family?: string }>(sensitivities: readonly T[], mode: number, family?: string): T[] {
  return sensitivities.filter((s) => s.mode === mode && (family === undefined || s.family === family)).sort((a, b) => Math.abs(b.relative) - Math.abs(a.relative))
}

/** |u/F| in the display unit of receptance (m/N or in/lbf), as a power of ten. */
export function receptanceText(metresPerNewton: number, units: UnitSystem): string {
  return formatScientific(toScreen(units, 'receptance', metresPerNewton), 3)
}

/** The unit of stress per unit force: MPa/N or psi/lbf. */
export function stressPerForceUnit(units: UnitSystem): string {
  return `${screenUnit(units, 'stress').symbol}/${screenUnit(units, 'force').symbol}`
}

/** Pa per N → MPa per N, or psi per lbf. */
export function stressPerForceValue(pascalPerNewton: number, units: UnitSystem): number {
  return (pascalPerNewton * screenUnit(units, 'force').toSI) / screenUnit(units, 'stress').toSI
}

export function stressPerForceText(pascalPerNewton: number, units: UnitSystem): string {
  return formatFigure(stressPerForceValue(pascalPerNewton, units), 3)
}

/**
 * What a forced response of a family is in words and units: a force along the axis and the
 * displacement (u/F, m/N), a torque and the twist (θ/T, rad/(N·m)), a side force and the
 * deflection (w/F, m/N); the stress is the axial stress, the largest shear stress, or the
 * bending stress at the surface, per unit of the load.
 */
export interface ResponseWords {
  /** "force", "torque", "side force". */
  readonly load: string
  /** "|u/F|", "|θ/T|", "|w/F|". */
  readonly ratio: string
  /** "displacement", "twist", "deflection". */
  readonly readout: string
  readonly stress: string
  /** Unit of the ratio on screen and the factor from SI to it. */
  readonly ratioUnit: string
  readonly ratioFactor: number
  /** Unit of stress per load on screen and the factor from SI (Pa/N, Pa/(N·m)) to it. */
  readonly stressUnit: string
  readonly stressFactor: number
}

export function responseWords(motion: Motion, units: UnitSystem): ResponseWords {
  const stress = screenUnit(units, 'stress')
  if (motion === 'torsion') {
    const torque = screenUnit(units, 'torque')
    const angle = screenUnit(units, 'angle')
    return {
      load: 'torque',
      ratio: '|θ/T|',
      readout: 'twist',
      stress: 'largest shear stress',
      ratioUnit: `${angle.symbol}/(${torque.symbol})`,
      ratioFactor: torque.toSI / angle.toSI,
      stressUnit: `${stress.symbol}/(${torque.symbol})`,
      stressFactor: torque.toSI / stress.toSI,
    }
  }
  const receptance = screenUnit(units, 'receptance')
  const force = screenUnit(units, 'force')
  return {
    load: motion === 'bending' ? 'side force' : 'force',
    ratio: motion === 'bending' ? '|w/F|' : '|u/F|',
    readout: motion === 'bending' ? 'deflection' : 'displacement',
    stress: motion === 'bending' ? 'bending stress at the surface' : 'axial stress',
    ratioUnit: receptance.symbol,
    ratioFactor: 1 / receptance.toSI,
    stressUnit: `${stress.symbol}/${force.symbol}`,
    stressFactor: force.toSI / stress.toSI,
  }
}
