/**
 * Brent's method: a root of f in [a, b] where f changes sign, by inverse quadratic
 * interpolation and secant steps safeguarded by bisection, to a bracket of a few ulps
 * (R. P. Brent, Algorithms for Minimization without Derivatives, Prentice-Hall 1973, ch. 4,
 * the zero procedure; from memory). Used to refine the beam reference's roots, each already
 * isolated by the Wittrick–Williams count.
 */
export function brentRoot(f: (x: number) => number, a0: number, b0: number, fa0: number, fb0: number): number {
  let a = a0
  let b = b0
  let fa = fa0
  let fb = fb0
  if (fa === 0) return a
  if (fb === 0) return b
  if (fa * fb > 0) throw new RangeError(`brentRoot: no sign change on [${a}, ${b}]`)
  let c = a
  let fc = fa
  let d = b - a
  let e = d
  for (let iteration = 0; iteration < 300; iteration++) {
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
    const tol = 2 * Number.EPSILON * Math.abs(b) + Number.MIN_VALUE
    const m = 0.5 * (c - b)
    if (Math.abs(m) <= tol || fb === 0) return b
    if (Math.abs(e) < tol || Math.abs(fa) <= Math.abs(fb)) {
      d = m
      e = m
    } else {
      let p: number
      let q: number
      const s = fb / fa
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
    }
    a = b
    fa = fb
    b += Math.abs(d) > tol ? d : m > 0 ? tol : -tol
    fb = f(b)
  }
  return b
}
