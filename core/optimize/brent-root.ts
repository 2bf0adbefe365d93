/**
 * Brent's method for a root of f in [a, b] with f(a)·f(b) ≤ 0: inverse quadratic
 * interpolation and secant steps, falling back to bisection whenever they would not
 * shrink the bracket fast enough (R. P. Brent, Algorithms for Minimization without
 * Derivatives, 1973, ch. 4, "zero"; from memory). Converges whenever bisection would.
 * `tolerance` is relative (0: to a bracket of a few ulps); `ends` passes f(a) and f(b) when the
 * caller has them already (the exact references' residuals are costly).
 */
export function brentRoot(
  f: (x: number) => number,
  a: number,
  b: number,
  tolerance = 1e-13,
  maxEvaluations = 200,
  ends?: { readonly fa: number; readonly fb: number },
): number {
  let fa = ends ? ends.fa : f(a)
  let fb = ends ? ends.fb : f(b)
  if (fa === 0) return a
  if (fb === 0) return b
  if (fa * fb > 0) throw new RangeError('brentRoot: f(a) and f(b) have the same sign')
  let c = a
  let fc = fa
  let d = b - a
  let e = d
  for (let i = 0; i < maxEvaluations; i++) {
    if (fb * fc > 0) {
      c = a
      fc = fa
      d = b - a
      e = d
    }
    if (Math.abs(fc) < Math.abs(fb)) {
      a = b
      b = c
      c = a
      fa = fb
      fb = fc
      fc = fa
    }
    const tol = 2 * Number.EPSILON * Math.abs(b) + 0.5 * tolerance * Math.abs(b) + Number.MIN_VALUE
    const m = 0.5 * (c - b)
    if (Math.abs(m) <= tol || fb === 0) return b
    if (Math.abs(e) >= tol && Math.abs(fa) > Math.abs(fb)) {
      const s = fb / fa
      let p: number
      let q: number
      if (a === c) {
        p = 2 * m * s
        q = 1 - s
      } else {
        const qa = fa / fc
        const r = fb / fc
        p = s * (2 * m * qa * (qa - r) - (b - a) * (r - 1))
        q = (qa - 1) * (r - 1) * (s - 1)
      }
      if (p > 0) q = -q
      else p = -p
      if (2 * p < Math.min(3 * m * q - Math.abs(tol * q), Math.abs(e * q))) {
        e = d
        d = p / q
      } else {
        d = m
        e = m
      }
    } else {
      d = m
      e = m
    }
    a = b
    fa = fb
    b += Math.abs(d) > tol ? d : m > 0 ? tol : -tol
    fb = f(b)
  }
  return b
}
