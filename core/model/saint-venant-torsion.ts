/**
 * Saint-Venant's torsion constant of a solid rectangle b × h (b ≥ h), from the series solution
 * of the Prandtl stress function (S. P. Timoshenko & J. N. Goodier, Theory of Elasticity,
 * torsion of rectangular bars, from memory):
 *   J = k₁ b h³,  k₁ = (1/3) [1 − (192/π⁵)(h/b) Σ_{n odd} tanh(nπb/(2h)) / n⁵].
 * The series is summed as Σ 1/n⁵ − Σ (1 − tanh(nπb/2h))/n⁵: the first part is (31/32) ζ(5)
 * in closed form, the second falls like e^{−nπ} and needs a handful of terms, so k₁ is exact
 * to round-off for every aspect ratio (the plain series needs ~10⁴ terms for 1e-16).
 */

/** ζ(5) = 1.0369277551433699263… (OEIS A013663, from memory; the nearest double, checked in the tests by direct summation). */
const ZETA_5 = 1.03692775514337
/** Σ_{n odd} 1/n⁵ = (1 − 2⁻⁵) ζ(5). */
const ODD_RECIPROCAL_FIFTH_POWERS = (31 / 32) * ZETA_5

/** k₁(b/h) for b/h ≥ 1: J = k₁ b h³. 0.1406 for a square, → 1/3 for a thin strip. */
export function saintVenantCoefficient(aspectRatio: number): number {
  if (!(Number.isFinite(aspectRatio) && aspectRatio >= 1)) throw new RangeError(`the aspect ratio b/h must be a number ≥ 1, got ${String(aspectRatio).slice(0, 60)}`)
  let deficit = 0
  for (let n = 1; n < 200; n += 2) {
    const x = (n * Math.PI * aspectRatio) / 2
    // 1 − tanh x = 2 e^{−2x} / (1 + e^{−2x}), exact where tanh x rounds to 1.
    const e = Math.exp(-2 * x)
    const term = (2 * e) / (1 + e) / n ** 5
    deficit += term
    if (term < 1e-18 * ODD_RECIPROCAL_FIFTH_POWERS) break
  }
  const sum = ODD_RECIPROCAL_FIFTH_POWERS - deficit
  return (1 - ((192 / Math.PI ** 5) * sum) / aspectRatio) / 3
}

/** Saint-Venant's torsion constant J (m⁴) of a solid rectangle, in either orientation. */
export function rectangleTorsionConstant(width: number, height: number): number {
  for (const [name, value] of [
    ['width', width],
    ['height', height],
  ] as const) {
    if (!(Number.isFinite(value) && value > 0)) throw new RangeError(`the rectangle's ${name} must be a positive number (m), got ${String(value).slice(0, 60)}`)
  }
  const b = Math.max(width, height)
  const h = Math.min(width, height)
  return saintVenantCoefficient(b / h) * b * h ** 3
}

/**
 * The largest shear stress of a twisted solid rectangle, at the middle of its long sides, is
 * τ = k G θ′ t (t the thinner side) with k = 1 − (8/π²) Σ_{n odd} 1 / (n² cosh(nπb/(2t)))
 * (Timoshenko & Goodier, as above, from memory): k → 1 for a thin strip, 0.675 for a square.
 */
export function saintVenantShearStressFactor(width: number, height: number): number {
  const b = Math.max(width, height)
  const t = Math.min(width, height)
  let sum = 0
  for (let n = 1; n <= 39; n += 2) sum += 1 / (n * n * Math.cosh((n * Math.PI * b) / (2 * t)))
  return 1 - (8 / (Math.PI * Math.PI)) * sum
}
