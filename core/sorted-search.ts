/**
 * In an ascending array a of length ≥ 2, the interval [a[i], a[i + 1]] that holds a value: the
 * largest i ≤ a.length − 2 with a[i] ≤ value (0 below a[0]), by bisection.
 */
export function intervalHolding(a: ArrayLike<number>, value: number): number {
  let lo = 0
  let hi = a.length - 1
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1
    if (a[mid] <= value) lo = mid
    else hi = mid
  }
  return lo
}
