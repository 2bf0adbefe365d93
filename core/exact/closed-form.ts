/**
 * Closed-form natural frequencies of a uniform bar (c = √(E/ρ), λ = ωL/c):
 *   fixed–free  f_n = (2n − 1) c / (4L)
 *   fixed–fixed f_n = n c / (2L);  free–free: 0 (rigid), then n c / (2L)
 *   fixed–free with a tip mass M:          λ tan λ = m / M          (m = ρAL)
 *   fixed–free with a tip spring k to ground: tan λ = −λ EA / (kL)
 * S. S. Rao, Mechanical Vibrations, "Continuous systems", longitudinal vibration of a
 * bar; R. D. Blevins, Formulas for Natural Frequency and Mode Shape, axial bars (both from memory).
 * Roots are bracketed one per branch of tan and found by bisection to full precision.
 */
import type { EndCondition } from '../model/project'

export function uniformBarFrequencies(start: EndCondition, end: EndCondition, waveSpeed: number, length: number, count: number): number[] {
  const out: number[] = []
  for (let n = 1; n <= count; n++) {
    if (start !== end) out.push(((2 * n - 1) * waveSpeed) / (4 * length))
    else if (start === 'fixed') out.push((n * waveSpeed) / (2 * length))
    else out.push(((n - 1) * waveSpeed) / (2 * length))
  }
  return out
}

/** Roots λ_n of λ tan λ = massRatio (bar mass over tip mass), one in each ((n−1)π, (n−½)π). */
export function tipMassRoots(massRatio: number, count: number): number[] {
  const out: number[] = []
  for (let n = 1; n <= count; n++) {
    const lo = (n - 1) * Math.PI
    const hi = (n - 0.5) * Math.PI
    // λ sin λ − r cos λ rises from −r (or 0⁻) to (n−½)π·(±1)…: bisection on the sign change.
    out.push(bisectRoot((x) => x * Math.sin(x) - massRatio * Math.cos(x), lo, hi, n))
  }
  return out
}

/** Roots λ_n of tan λ = −λ / stiffnessRatio (stiffnessRatio = kL/EA), one in each ((n−½)π, nπ). */
export function tipSpringRoots(stiffnessRatio: number, count: number): number[] {
  const out: number[] = []
  for (let n = 1; n <= count; n++) {
    const lo = (n - 0.5) * Math.PI
    const hi = n * Math.PI
    out.push(bisectRoot((x) => stiffnessRatio * Math.sin(x) + x * Math.cos(x), lo, hi, n))
  }
  return out
}

/** Bisection for the single sign change of f in (lo, hi). */
function bisectRoot(f: (x: number) => number, lo: number, hi: number, branch: number): number {
  let a = lo
  let b = hi
  let fa = f(a)
  if (fa === 0) a = a + 1e-15 * Math.max(1, Math.abs(a))
  fa = f(a)
  const fb = f(b)
  if (fa * fb > 0) throw new RangeError(`no root on branch ${branch}`)
  for (let i = 0; i < 200 && b - a > 4e-16 * Math.abs(b); i++) {
    const mid = 0.5 * (a + b)
    const fm = f(mid)
    if (fm === 0) return mid
    if (fm * fa < 0) b = mid
    else {
      a = mid
      fa = fm
    }
  }
  return 0.5 * (a + b)
}
