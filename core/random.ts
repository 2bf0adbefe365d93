/**
 * Small seeded pseudo-random generator (mulberry32, a public-domain 32-bit
 * generator by Tommy Ettinger, from memory): repeatable start vectors and
 * tolerance scatter without depending on the platform's Math.random.
 */
export type RandomSource = () => number

export function seededRandom(seed: number): RandomSource {
  let state = seed >>> 0
  return () => {
    state = (state + 0x6d2b79f5) >>> 0
    let t = state
    t = Math.imul(t ^ (t >>> 15), t | 1)
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61)
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296
  }
}
