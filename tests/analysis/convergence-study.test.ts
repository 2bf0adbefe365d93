/**
 * The convergence study's numbers (convergence.ts) against the same numbers computed here from
 * the discrete dispersion relations of the 2-node mesh (docs/verification.md §3; T. J. R. Hughes,
 * The Finite Element Method, chapter on eigenvalue problems, from memory): with K = EA/h[1 −1; −1 1]
 * and M = ρAh[a b; b a] a uniform mesh's modes are waves, and
 *   ω² = (c²/h²)·(2 − 2cos θ)/(2a + 2b cos θ),  θ = (2n − 1)πh/(2L) for a fixed–free bar,
 * so consistent (a = ⅓, b = ⅙), lumped (½, 0) and mixed (5/12, 1/12) meshes are known exactly.
 * From these the test forms the errors against f_n = (2n − 1)c/4L (§1), the observed orders
 * log(e_coarse/e_fine)/log 2 and the Richardson estimate f₁ + (f₁ − f₂)/(2^p − 1),
 * p = log((f₃ − f₂)/(f₂ − f₁))/log 2 (L. F. Richardson, Phil. Trans. R. Soc. A 210 (1911), from memory).
 * Every study here runs inside its test (not when the file is collected).
 */
import { describe, expect, test } from 'vitest'
import { convergenceStudy } from '../../core/analysis/convergence'
import { expectRelative, makeProject, STEEL, uniformBar } from '../helpers'

const c = Math.sqrt(STEEL.youngsModulus / STEEL.density)
const L = 0.8
const MASS = { consistent: [1 / 3, 1 / 6], lumped: [1 / 2, 0], mixed: [5 / 12, 1 / 12] } as const

function meshHz(mass: keyof typeof MASS, elements: number, n: number): number {
  const [a, b] = MASS[mass]
  const h = L / elements
  const theta = ((2 * n - 1) * Math.PI * h) / (2 * L)
  const half = Math.sin(theta / 2)
  // 2 − 2cos θ = 4 sin²(θ/2), kept in that form for its digits.
  return Math.sqrt(((c * c) / (h * h)) * ((4 * half * half) / (2 * a + 2 * b * Math.cos(theta)))) / (2 * Math.PI)
}
const exactHz = (n: number) => ((2 * n - 1) * c) / (4 * L)

describe('2-node meshes of a uniform fixed–free bar', () => {
  const densities = [4, 8, 16, 32]
  const modes = 2

  test('frequencies, errors, observed orders and Richardson estimates of each mass, as computed here', () => {
    const study = convergenceStudy(uniformBar({ length: L }), { modes, densities, orders: [1] })
    expect(study.series.map((s) => `${s.elementOrder} ${s.mass}`)).toEqual(['1 consistent', '1 lumped', '1 mixed'])
    expect(study.referenceMethod).toBe('exact')
    study.referenceHz.forEach((f, i) => expectRelative(f, exactHz(i + 1), 1e-13, `reference ${i + 1}`))
    for (const series of study.series) {
      const mass = series.mass as keyof typeof MASS
      expect(series.points.map((p) => p.elementsPerSegment)).toEqual(densities)
      expect(series.points.map((p) => p.dofs)).toEqual(densities)
      for (const point of series.points) {
        for (let n = 1; n <= modes; n++) {
          const f = meshHz(mass, point.elementsPerSegment, n)
          expectRelative(point.frequenciesHz[n - 1], f, 1e-11, `${mass}, ${point.elementsPerSegment} elements, mode ${n}`)
          expectRelative(point.errors[n - 1]!, (f - exactHz(n)) / exactHz(n), 1e-7, `${mass}, ${point.elementsPerSegment} elements, error of mode ${n}`)
        }
      }
      for (let n = 1; n <= modes; n++) {
        const error = (elements: number) => Math.abs(meshHz(mass, elements, n) - exactHz(n)) / exactHz(n)
        const observed = Math.log(error(16) / error(32)) / Math.log(2)
        expectRelative(series.observedOrder[n - 1]!, observed, 1e-6, `${mass} mode ${n}: observed order`)
        const [f3, f2, f1] = [8, 16, 32].map((e) => meshHz(mass, e, n))
        const p = Math.log((f3 - f2) / (f2 - f1)) / Math.log(2)
        expectRelative(series.extrapolatedHz[n - 1]!, f1 + (f1 - f2) / (2 ** p - 1), 1e-9, `${mass} mode ${n}: Richardson`)
      }
    }
    // Consistent from above with order 2, lumped from below with order 2, mixed of order 4.
    const order = (mass: string) => study.series.find((s) => s.mass === mass)!.observedOrder[0]!
    expect(Math.abs(order('consistent') - 2)).toBeLessThan(0.05)
    expect(Math.abs(order('lumped') - 2)).toBeLessThan(0.05)
    expect(Math.abs(order('mixed') - 4)).toBeLessThan(0.1)
  })

  test('meshes with more unknowns than allowed are left out; fewer than three meshes give no Richardson estimate', () => {
    const study = convergenceStudy(uniformBar({ length: L }), { modes: 1, densities, orders: [1, 2], masses: ['consistent'], maxDofs: 16 })
    const [linear, quadratic] = study.series
    expect(linear.points.map((p) => p.elementsPerSegment)).toEqual([4, 8, 16])
    // 3-node elements: two unknowns per element, so 8 elements (16 unknowns) is the largest.
    expect(quadratic.points.map((p) => p.elementsPerSegment)).toEqual([4, 8])
    expect(quadratic.points.map((p) => p.dofs)).toEqual([8, 16])
    expect(quadratic.extrapolatedHz).toEqual([null])
    expect(linear.extrapolatedHz[0]).not.toBeNull()
  })

  test('progress goes from above 0 to 1 and a false answer stops the study', () => {
    const fractions: number[] = []
    convergenceStudy(uniformBar({ length: L }), { modes: 1, densities: [4, 8], orders: [1], masses: ['consistent', 'lumped'], onProgress: (f) => void fractions.push(f) })
    expect(fractions).toEqual([0.25, 0.5, 0.75, 1])
    const stopped = convergenceStudy(uniformBar({ length: L }), { modes: 1, densities: [4, 8], orders: [1], masses: ['consistent', 'lumped'], onProgress: (f) => f < 0.5 })
    expect(stopped.series.map((s) => s.points.length)).toEqual([2, 0])
  })

  test('a family the project does not analyse gives the first analysed one; the rigid mode of a free–free bar has error 0 only where the mesh gives 0', () => {
    expect(convergenceStudy(uniformBar({ length: L }), { family: 'torsion', modes: 1, densities: [4] }).family.key).toBe('axial')
    const free = convergenceStudy(uniformBar({ length: L, start: 'free', end: 'free' }), { modes: 2, densities: [4, 8, 16], orders: [1], masses: ['lumped'] })
    const series = free.series[0]
    expect(free.referenceHz[0]).toBe(0)
    for (const point of series.points) {
      expect(point.errors[0]).toBe(point.frequenciesHz[0] === 0 ? 0 : null)
      // Mode 2 (the first elastic one), lumped: below the exact c/(2L).
      expect(point.errors[1]!).toBeLessThan(0)
    }
    // Errors at round-off give no observed order and no extrapolation: the rigid mode stays at 0.
    expect(series.observedOrder[0]).toBeNull()
    expect(series.extrapolatedHz[0]).toBe(0)
  })

  test('a mode the coarsest mesh cannot show (one element, one unknown) is not extrapolated: the finest mesh’s value stands', () => {
    const study = convergenceStudy(uniformBar({ length: L }), { modes: 2, densities: [1, 8, 16], orders: [1], masses: ['consistent'] })
    const [series] = study.series
    expect(series.points[0].frequenciesHz.length).toBe(1)
    expectRelative(series.extrapolatedHz[1]!, meshHz('consistent', 16, 2), 1e-11, 'mode 2: the 16-element value')
    // Mode 1 has all three meshes: extrapolated as usual.
    const [f3, f2, f1] = [1, 8, 16].map((e) => meshHz('consistent', e, 1))
    const p = Math.log((f3 - f2) / (f2 - f1)) / Math.log(2)
    expectRelative(series.extrapolatedHz[0]!, f1 + (f1 - f2) / (2 ** p - 1), 1e-9, 'mode 1: Richardson')
  })
})

describe('bending', () => {
  test('one element (the Hermite cubic) whatever orders are asked, three masses; the pinned–pinned reference (nπ/L)²√(EI/ρA)/2π', () => {
    const d = 0.02
    const project = makeProject({
      version: 2,
      motions: ['bending'],
      materials: [STEEL],
      segments: [{ length: L, material: 'steel', section: { shape: 'solid', diameter: d } }],
      ends: { start: { bending: 'pinned' }, end: { bending: 'pinned' } },
    })
    const study = convergenceStudy(project, { modes: 1, densities: [4, 8], orders: [2] })
    expect(study.family.key).toBe('bending')
    expect(study.series.map((s) => `${s.elementOrder} ${s.mass}`)).toEqual(['1 consistent', '1 lumped', '1 mixed'])
    // Two unknowns per node: 8 elements, 9 nodes, both ends pinned: 16 unknowns.
    expect(study.series[0].points.map((p) => p.dofs)).toEqual([8, 16])
    const I = (Math.PI / 64) * d ** 4
    const A = (Math.PI / 4) * d * d
    expectRelative(study.referenceHz[0], ((Math.PI / L) ** 2 * Math.sqrt((STEEL.youngsModulus * I) / (STEEL.density * A))) / (2 * Math.PI), 1e-12, 'reference')
  })
})
