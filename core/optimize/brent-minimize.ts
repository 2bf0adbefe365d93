/**
 * Brent's method for a minimum of f on [a, b]: golden-section steps combined with
 * parabolic interpolation (R. P. Brent, Algorithms for Minimization without Derivatives,
 * 1973, ch. 5, "localmin"; from memory). Finds a local minimum; callers bracket the global
 * one first (tuner.ts scans a grid).
 */
export function brentMinimize(f: (x: number) => number, a: number, b: number, tolerance = 1e-10, maxEvaluations = 200): { x: number; fx: number } {
  const golden = 0.5 * (3 - Math.sqrt(5))
  let x = a + golden * (b - a)
  let w = x
  let v = x
  let fx = f(x)
  let fw = fx
  let fv = fx
  let d = 0
  let e = 0
  for (let i = 0; i < maxEvaluations; i++) {
    const m = 0.5 * (a + b)
    const tol = tolerance * Math.abs(x) + 1e-300
    const t2 = 2 * tol
    if (Math.abs(x - m) <= t2 - 0.5 * (b - a)) break
    let u: number
    let useGolden = true
    if (Math.abs(e) > tol) {
      const r = (x - w) * (fx - fv)
      let q = (x - v) * (fx - fw)
      let p = (x - v) * q - (x - w) * r
      q = 2 * (q - r)
      if (q > 0) p = -p
      else q = -q
      const eOld = e
      e = d
      if (Math.abs(p) < Math.abs(0.5 * q * eOld) && p > q * (a - x) && p < q * (b - x)) {
        d = p / q
        u = x + d
        if (u - a < t2 || b - u < t2) d = x < m ? tol : -tol
        useGolden = false
      }
    }
    if (useGolden) {
      e = x < m ? b - x : a - x
      d = golden * e
    }
    u = x + (Math.abs(d) >= tol ? d : d > 0 ? tol : -tol)
    const fu = f(u)
    if (fu <= fx) {
      if (u < x) b = x
      else a = x
      v = w
      fv = fw
      w = x
      fw = fx
      x = u
      fx = fu
    } else {
      if (u < x) a = u
      else b = u
      if (fu <= fw || w === x) {
        v = w
        fv = fw
        w = u
        fw = fu
      } else if (fu <= fv || v === x || v === w) {
        v = u
        fv = fu
      }
    }
  }
  return { x, fx }
}
