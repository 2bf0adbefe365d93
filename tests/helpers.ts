/** Test helpers: relative comparisons that print actual, expected and tolerance. */
import { expect } from 'vitest'
import { readProjectDocument } from '../core/model/project-schema'
import type { Project } from '../core/model/project'

export function relativeError(actual: number, expected: number): number {
  return expected === 0 ? Math.abs(actual) : Math.abs(actual - expected) / Math.abs(expected)
}

/** Asserts |actual − expected| ≤ tolerance·|expected|, naming all three on failure. */
export function expectRelative(actual: number, expected: number, tolerance: number, what = 'value'): void {
  const error = relativeError(actual, expected)
  expect(error, `${what}: actual ${actual}, expected ${expected}, relative error ${error.toExponential(3)} > tolerance ${tolerance}`).toBeLessThanOrEqual(tolerance)
}

/** A project from a partial document (format, version and sensible defaults filled in); throws if invalid. */
export function makeProject(doc: Record<string, unknown>): Project {
  const result = readProjectDocument({ format: 'rodwave', version: 1, ends: { start: 'fixed', end: 'free' }, ...doc })
  if (!result.ok) throw new Error(result.issues.map((i) => `${i.path}: ${i.message}`).join('\n'))
  return result.project
}

export const STEEL = { id: 'steel', youngsModulus: 200e9, density: 7850 }

/** Uniform solid bar of one segment. */
export function uniformBar(options: { length?: number; diameter?: number; start?: 'fixed' | 'free'; end?: 'fixed' | 'free'; extra?: Record<string, unknown> } = {}): Project {
  return makeProject({
    materials: [STEEL],
    segments: [{ length: options.length ?? 1, material: 'steel', section: { shape: 'solid', diameter: options.diameter ?? 0.02 } }],
    ends: { start: options.start ?? 'fixed', end: options.end ?? 'free' },
    ...options.extra,
  })
}
