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

const generated = new Map<number, QuadratureRule>()

/**
 * n-point Gauss–Legendre rule for any n, by Newton's method on P_n from the Chebyshev-like
 * start cos(π(i − ¼)/(n + ½)), the textbook construction (e.g. Press et al., Numerical
 * Recipes, §4.6 "gauleg", from memory). Used for the smooth integrands of exact mode shapes.
 */
export function gaussLegendreRule(n: number): QuadratureRule {
  if (n >= 1 && n <= 4) return RULES[n]
  const cached = generated.get(n)
  if (cached) return cached
  const points: number[] = new Array(n)
  const weights: number[] = new Array(n)
  for (let i = 1; i <= Math.ceil(n / 2); i++) {
    let z = Math.cos((Math.PI * (i - 0.25)) / (n + 0.5))
    let derivative = 0
    for (let iteration = 0; iteration < 100; iteration++) {
      let p0 = 1
      let p1 = 0
      for (let j = 1; j <= n; j++) {
        const p2 = p1
        p1 = p0
        p0 = ((2 * j - 1) * z * p1 - (j - 1) * p2) / j
      }
      derivative = (n * (z * p0 - p1)) / (z * z - 1)
      const step = p0 / derivative
      z -= step
      if (Math.abs(step) < 1e-16) break
    }
    points[i - 1] = -z
    points[n - i] = z
    weights[i - 1] = weights[n - i] = 2 / ((1 - z * z) * derivative * derivative)
  }
  const rule = { points, weights }
  generated.set(n, rule)
  return rule
}
