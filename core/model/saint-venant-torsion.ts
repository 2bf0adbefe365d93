/** Σ over odd n of 1/n⁵ = (1 − 2⁻⁵) ζ(5), ζ(5) = 1.0369277551433699… (Abramowitz & Stegun, table 23.3, from memory). */
const ODD_FIFTH_POWERS = (31 / 32) * 1.03692775514337

/**
 * Saint-Venant's torsion constant of a solid rectangle b × h (b ≥ h), by its series
 * (S. P. Timoshenko & J. N. Goodier, Theory of Elasticity, torsion of rectangular bars, from memory):
 *   J = k₁ b h³,  k₁ = (1/3)[1 − (192/π⁵)(h/b) Σ_{n odd} tanh(nπb/(2h)) / n⁵].
 * Summed as Σ 1/n⁵ − Σ (1 − tanh)/n⁵: the first is closed, the second falls exponentially, so a
 * few terms give full precision (the plain series falls only as n⁻⁵).
 */
export function saintVenantTorsionConstant(width: number, height: number): number {
  const b = Math.max(width, height)
  const h = Math.min(width, height)
  let deficit = 0
  for (let n = 1; n <= 99; n += 2) {
    const z = (n * Math.PI * b) / (2 * h)
    // 1 − tanh z = 2/(e^{2z} + 1), without cancellation.
    const term = 2 / (Math.exp(2 * z) + 1) / n ** 5
    deficit += term
    if (term < 1e-18 * ODD_FIFTH_POWERS) break
  }
  const k1 = (1 - ((192 / Math.PI ** 5) * (h / b)) * (ODD_FIFTH_POWERS - deficit)) / 3
  return k1 * b * h ** 3
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
