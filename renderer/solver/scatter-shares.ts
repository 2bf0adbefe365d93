/**
 * A tolerance scatter split between workers: contiguous shares of the samples, one per worker,
 * joined back in sample order. Sample i depends only on the seed and i, so the joined result
 * is the same whatever the number of workers.
 */

/** Workers are capped: beyond this, memory for the workers grows faster than the work shrinks. */
export const MAX_SCATTER_WORKERS = 8

/** One worker per logical core the browser reports, at most MAX_SCATTER_WORKERS, never more than samples. */
export function scatterWorkerCount(hardwareConcurrency: number | undefined, samples: number): number {
  const cores = hardwareConcurrency && hardwareConcurrency > 0 ? Math.floor(hardwareConcurrency) : 2
  return Math.max(1, Math.min(cores, MAX_SCATTER_WORKERS, samples))
}

/** Contiguous shares covering 0 … samples − 1, their sizes differing by at most one. */
export function scatterShares(samples: number, workers: number): { start: number; count: number }[] {
  const shares = Math.max(1, Math.min(workers, samples))
  const base = Math.floor(samples / shares)
  const extra = samples % shares
  const out: { start: number; count: number }[] = []
  let start = 0
  for (let w = 0; w < shares; w++) {
    const count = base + (w < extra ? 1 : 0)
    out.push({ start, count })
    start += count
  }
  return out
}

/** The shares' frequencies (each row-major count × modes) one after another, in sample order. */
export function joinShares(parts: readonly Float64Array[]): Float64Array {
  const out = new Float64Array(parts.reduce((n, p) => n + p.length, 0))
  let offset = 0
  for (const part of parts) {
    out.set(part, offset)
    offset += part.length
  }
  return out
}
