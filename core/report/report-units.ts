/** Quantities in the project's display units (core/model/units.ts), formatted for the report. */
import { displayUnit, toDisplay, type QuantityKind, type UnitSystem } from '../model/units'
import { formatFigure } from './number-format'

export interface ReportUnits {
  readonly system: UnitSystem
  /** The unit symbol a quantity is shown in. */
  symbol(kind: QuantityKind): string
  /** An SI value in the display unit, as a figure without its unit. */
  figure(kind: QuantityKind, valueSI: number, significant?: number): string
  /** The same figure followed by its unit. */
  withUnit(kind: QuantityKind, valueSI: number, significant?: number): string
}

export function reportUnits(system: UnitSystem): ReportUnits {
  return {
    system,
    symbol: (kind) => displayUnit(system, kind).symbol,
    figure: (kind, valueSI, significant = 4) => formatFigure(toDisplay(system, kind, valueSI), significant),
    withUnit: (kind, valueSI, significant = 4) => `${formatFigure(toDisplay(system, kind, valueSI), significant)} ${displayUnit(system, kind).symbol}`,
  }
}

export function unitSystemName(system: UnitSystem): string {
  return system === 'SI' ? 'SI (m, mm, kg, N, GPa)' : 'US customary (in, lbm, lbf, psi)'
}
