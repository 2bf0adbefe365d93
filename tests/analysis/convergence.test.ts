/**
 * Convergence behaviour of the element and mass choices on a uniform bar, against the
 * closed form (docs/verification.md §3; Hughes, The Finite Element Method, from memory):
 * 2-node consistent mass converges as O(h²) from above, lumped as O(h²) from below, their
 * average ("mixed") as O(h⁴); 3-node elements as O(h⁴), consistent and mixed from above, lumped
 * from below (the series of the 3-node dispersion relation, tests/fe/three-node-dispersion.test.ts).
 */
import { describe, expect, test } from 'vitest'
import { convergenceStudy } from '../../core/analysis/convergence'
import { analyseProject } from '../../core/analysis/modal-analysis'
import { readProjectDocument } from '../../core/model/project-schema'
import { STEEL, uniformBar } from '../helpers'

describe('observed orders on a uniform fixed–free bar', () => {
  const project = uniformBar({ length: 1 })
  const study = convergenceStudy(project, { modes: 3, densities: [8, 16, 32, 64] })
  const series = (order: 1 | 2, mass: string) => study.series.find((s) => s.elementOrder === order && s.mass === mass)!
  test.each([
    [1, 'consistent', 2, 1],
    [1, 'lumped', 2, -1],
    [1, 'mixed', 4, 0],
    [2, 'consistent', 4, 1],
    [2, 'lumped', 4, -1],
    [2, 'mixed', 4, 1],
  ] as const)('%i-order elements, %s mass: order %i', (order, mass, expectedOrder, sign) => {
    const s = series(order, mass)
    s.observedOrder.forEach((p, m) => {
      expect(p, `mode ${m + 1}: observed order ${p}, expected ${expectedOrder} ± 0.1`).not.toBeNull()
      expect(Math.abs((p as number) - expectedOrder), `mode ${m + 1}: observed order ${p}`).toBeLessThanOrEqual(0.1)
    })
    if (sign !== 0) {
      for (const point of s.points) for (const e of point.errors) expect(Math.sign(e as number), `error ${e} has the wrong sign`).toBe(sign)
    }
  })
  test('Richardson estimates are at least 100 times closer to the exact frequencies than the finest mesh', () => {
    const s = series(1, 'consistent')
    const finest = s.points[s.points.length - 1]
    s.extrapolatedHz.forEach((f, m) => {
      const ref = study.referenceHz[m]
      const extrapolated = Math.abs((f as number) - ref) / ref
      const mesh = Math.abs(finest.errors[m] as number)
      expect(extrapolated, `mode ${m + 1}: Richardson error ${extrapolated}, finest mesh ${mesh}`).toBeLessThan(mesh / 100)
    })
  })
})

describe('consistent-mass 2-node frequencies are upper bounds (Rayleigh–Ritz)', () => {
  test('never below the exact frequency on a stepped, loaded bar', () => {
    const project = uniformBar({
      extra: {
        segments: [
          { length: 0.7, material: 'steel', section: { shape: 'solid', diameter: 0.03 } },
          { length: 0.5, material: 'steel', section: { shape: 'cone', startDiameter: 0.03, endDiameter: 0.015 } },
        ],
        masses: [{ at: 1.2, mass: 2 }],
        springs: [{ at: 0.4, stiffness: 5e7 }],
      },
    })
    for (const N of [2, 5, 20, 80]) {
      const a = analyseProject(project, { elementOrder: 1, elementsPerSegment: N, mass: 'consistent', modes: 6 })
      for (const m of a.modes) expect(m.frequencyHz, `N = ${N}, mode ${m.mode}`).toBeGreaterThanOrEqual((m.referenceHz as number) * (1 - 1e-13))
    }
  })
})

/**
 * Hermite cubic beam elements: the frequency error of consistent mass falls as O(h⁴), of lumped
 * (and so mixed) mass as O(h²) (G. Strang and G. Fix, An Analysis of the Finite Element Method,
 * §6.3, eigenvalue error O(h^{2(k+1−m)}) with k = 3, m = 2; lumped from memory). On fine meshes the
 * error reaches round-off, where it no longer falls as h⁴ and may wander; the observed order must
 * come from the meshes before that.
 */
describe('observed orders of a uniform pinned–pinned beam in three segments, up to 1024 elements per segment', () => {
  const read = readProjectDocument({
    format: 'rodwave',
    version: 2,
    motions: ['bending'],
    materials: [{ ...STEEL, poissonRatio: 0.3 }],
    // One section throughout; three segments so the finest mesh has 3072 elements, well into round-off.
    segments: [0.42, 0.16, 0.42].map((length) => ({ length, material: 'steel', section: { shape: 'solid', diameter: 0.024 } })),
    ends: { start: { bending: 'pinned' }, end: { bending: 'pinned' } },
  })
  if (!read.ok) throw new Error(read.issues.map((i) => `${i.path}: ${i.message}`).join('\n'))
  const study = convergenceStudy(read.project, { modes: 2, family: 'bending' })
  test.each([
    ['consistent', 4],
    ['lumped', 2],
    ['mixed', 2],
  ] as const)('%s mass: order %i ± 0.2 for modes 1 and 2', (mass, expectedOrder) => {
    const s = study.series.find((x) => x.mass === mass)!
    s.observedOrder.forEach((p, m) => {
      expect(p, `mode ${m + 1}`).not.toBeNull()
      expect(Math.abs((p as number) - expectedOrder), `mode ${m + 1}: observed order ${p}, expected ${expectedOrder} ± 0.2`).toBeLessThanOrEqual(0.2)
    })
  })
  test('past the meshes that show the order, the error stays at round-off: no finer mesh strays above 1e-10', () => {
    for (const series of study.series.filter((x) => x.mass === 'consistent')) {
      const errors = series.points.map((p) => Math.abs(p.errors[0] as number))
      const first = errors.findIndex((e) => e < 1e-10)
      expect(first, 'some mesh reaches 1e-10').toBeGreaterThan(0)
      errors.slice(first).forEach((e, i) => expect(e, `mesh ${first + i}`).toBeLessThan(1e-10))
    }
  })
})
