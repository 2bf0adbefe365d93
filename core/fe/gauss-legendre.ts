/**
 * Gauss–Legendre quadrature on [−1, 1]: n points integrate polynomials of degree
 * 2n − 1 exactly (Abramowitz & Stegun, Handbook of Mathematical Functions, table 25.4,
 * from memory; the values below are the closed forms).
 */
export interface QuadratureRule {
  readonly points: readonly number[]
  readonly weights: readonly number[]
}

const s3 = Math.sqrt(3 / 5)
const a4 = Math.sqrt(3 / 7 - (2 / 7) * Math.sqrt(6 / 5))
const b4 = Math.sqrt(3 / 7 + (2 / 7) * Math.sqrt(6 / 5))
const wa4 = (18 + Math.sqrt(30)) / 36
const wb4 = (18 - Math.sqrt(30)) / 36

const RULES: Record<number, QuadratureRule> = {
  1: { points: [0], weights: [2] },
  2: { points: [-1 / Math.sqrt(3), 1 / Math.sqrt(3)], weights: [1, 1] },
  3: { points: [-s3, 0, s3], weights: [5 / 9, 8 / 9, 5 / 9] },
  4: { points: [-b4, -a4, a4, b4], weights: [wb4, wa4, wa4, wb4] },
}

export function gaussLegendre(points: 1 | 2 | 3 | 4): QuadratureRule {
  return RULES[points]
}
