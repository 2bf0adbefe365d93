/**
 * SI ↔ US customary conversion for display and input. Stored values are always SI;
 * conversion happens only at the edges (screens, command-line flags).
 *
 * Factors are exact by definition, from NIST Special Publication 811 (2008),
 * Guide for the Use of the International System of Units, appendix B:
 * 1 in = 0.0254 m; 1 lb (avoirdupois pound mass) = 0.45359237 kg;
 * 1 lbf = 4.4482216152605 N; derived units are formed from these.
 */
export type UnitSystem = 'SI' | 'US'

export type QuantityKind =
  | 'length'
  | 'sectionDimension'
  | 'area'
  | 'force'
  | 'modulus'
  | 'stress'
  | 'density'
  | 'mass'
  | 'stiffness'
  | 'frequency'
  | 'speed'
  | 'receptance'
  | 'fraction'
  | 'secondMoment'
  | 'massInertia'
  | 'rotationalStiffness'
  | 'torque'
  | 'ratio'
  | 'angle'

export interface Unit {
  readonly symbol: string
  /** Value in SI base units of one of this unit. */
  readonly toSI: number
}

export const INCH = 0.0254
export const POUND_MASS = 0.45359237
export const POUND_FORCE = 4.4482216152605
export const PSI = POUND_FORCE / (INCH * INCH)
export const POUND_PER_CUBIC_INCH = POUND_MASS / (INCH * INCH * INCH)
export const POUND_FORCE_PER_INCH = POUND_FORCE / INCH
export const RPM = 1 / 60

/** The unit each quantity is shown in, per system. */
const DISPLAY_UNITS: Record<UnitSystem, Record<QuantityKind, Unit>> = {
  SI: {
    length: { symbol: 'm', toSI: 1 },
    sectionDimension: { symbol: 'mm', toSI: 1e-3 },
    area: { symbol: 'mm²', toSI: 1e-6 },
    force: { symbol: 'N', toSI: 1 },
    modulus: { symbol: 'GPa', toSI: 1e9 },
    stress: { symbol: 'MPa', toSI: 1e6 },
    density: { symbol: 'kg/m³', toSI: 1 },
    mass: { symbol: 'kg', toSI: 1 },
    stiffness: { symbol: 'N/m', toSI: 1 },
    frequency: { symbol: 'Hz', toSI: 1 },
    speed: { symbol: 'rpm', toSI: RPM },
    receptance: { symbol: 'm/N', toSI: 1 },
    fraction: { symbol: '%', toSI: 0.01 },
    secondMoment: { symbol: 'mm⁴', toSI: 1e-12 },
    massInertia: { symbol: 'kg·m²', toSI: 1 },
    rotationalStiffness: { symbol: 'N·m/rad', toSI: 1 },
    torque: { symbol: 'N·m', toSI: 1 },
    ratio: { symbol: '', toSI: 1 },
    angle: { symbol: 'rad', toSI: 1 },
  },
  US: {
    length: { symbol: 'in', toSI: INCH },
    sectionDimension: { symbol: 'in', toSI: INCH },
    area: { symbol: 'in²', toSI: INCH * INCH },
    force: { symbol: 'lbf', toSI: POUND_FORCE },
    modulus: { symbol: 'psi', toSI: PSI },
    stress: { symbol: 'psi', toSI: PSI },
    density: { symbol: 'lbm/in³', toSI: POUND_PER_CUBIC_INCH },
    mass: { symbol: 'lbm', toSI: POUND_MASS },
    stiffness: { symbol: 'lbf/in', toSI: POUND_FORCE_PER_INCH },
    frequency: { symbol: 'Hz', toSI: 1 },
    speed: { symbol: 'rpm', toSI: RPM },
    receptance: { symbol: 'in/lbf', toSI: INCH / POUND_FORCE },
    fraction: { symbol: '%', toSI: 0.01 },
    secondMoment: { symbol: 'in⁴', toSI: INCH ** 4 },
    massInertia: { symbol: 'lbm·in²', toSI: POUND_MASS * INCH * INCH },
    rotationalStiffness: { symbol: 'lbf·in/rad', toSI: POUND_FORCE * INCH },
    torque: { symbol: 'lbf·in', toSI: POUND_FORCE * INCH },
    ratio: { symbol: '', toSI: 1 },
    angle: { symbol: 'rad', toSI: 1 },
  },
}

export function displayUnit(system: UnitSystem, kind: QuantityKind): Unit {
  return DISPLAY_UNITS[system][kind]
}

/** SI value → value in the display unit of `system`. */
export function toDisplay(system: UnitSystem, kind: QuantityKind, valueSI: number): number {
  return valueSI / DISPLAY_UNITS[system][kind].toSI
}

/** Value typed in the display unit of `system` → SI. */
export function fromDisplay(system: UnitSystem, kind: QuantityKind, value: number): number {
  return value * DISPLAY_UNITS[system][kind].toSI
}

/** Hz ↔ rpm (1 rpm = 1/60 Hz). */
export function hzToRpm(hz: number): number {
  return hz / RPM
}

export function rpmToHz(rpm: number): number {
  return rpm * RPM
}
