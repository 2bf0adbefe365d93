/**
 * A uniform mesh of 2-node elements has eigenvalues known in closed form, the discrete
 * dispersion relation (T. J. R. Hughes, The Finite Element Method, eigenvalue problems;
 * Cook, Malkus, Plesha & Witt, Concepts and Applications of FEA, mass matrices; both
 * from memory; verified against a dense solve in docs/verification.md §3):
 *   consistent mass  ω² = (6c²/h²)(1 − cos θ)/(2 + cos θ)
 *   lumped mass      ω  = (2c/h) sin(θ/2)
 * with θ = nπh/L (fixed–fixed) or (2n−1)πh/(2L) (fixed–free). 1 − cos θ is evaluated as
 * 2 sin²(θ/2) so that the reference itself keeps its digits on fine meshes.
 */
import { describe, expect, test } from 'vitest'
import { analyseProject } from '../../core/analysis/modal-analysis'
import { expectRelative, uniformBar } from '../helpers'

const E = 200e9
const RHO = 7850
const c = Math.sqrt(E / RHO)

function dispersion(mass: 'consistent' | 'lumped', theta: number, h: number): number {
  const half = Math.sin(theta / 2)
  if (mass === 'lumped') return ((2 * c) / h) * half
  return Math.sqrt(((6 * c * c) / (h * h)) * ((2 * half * half) / (2 + Math.cos(theta))))
}

describe('2-node elements reproduce the discrete dispersion relation to 1e-12', () => {
  const cases = [
    { ends: ['fixed', 'free'], N: 10 },
    { ends: ['fixed', 'fixed'], N: 10 },
    { ends: ['fixed', 'free'], N: 1000 },
    { ends: ['fixed', 'fixed'], N: 257 },
  ] as const
  for (const { ends, N } of cases) {
    for (const mass of ['consistent', 'lumped'] as const) {
      test(`${ends.join('–')}, ${N} elements, ${mass} mass`, () => {
        const L = 1.3
        const h = L / N
        const project = uniformBar({ length: L, start: ends[0], end: ends[1] })
        const modes = Math.min(8, ends[1] === 'fixed' ? N - 1 : N)
        const analysis = analyseProject(project, { elementOrder: 1, elementsPerSegment: N, mass, modes })
        analysis.modes.forEach((m, i) => {
          const n = i + 1
          const theta = ends[1] === 'fixed' ? (n * Math.PI * h) / L : ((2 * n - 1) * Math.PI * h) / (2 * L)
          expectRelative(2 * Math.PI * m.frequencyHz, dispersion(mass, theta, h), 1e-12, `ω${n}`)
        })
      })
    }
  }
})

describe('element matrices', () => {
  test('quadrature of a constant area reproduces the closed forms (both orders, every mass kind)', async () => {
    const { barElementMatrices } = await import('../../core/fe/bar-element')
    for (const order of [1, 2] as const) {
      for (const mass of ['consistent', 'lumped', 'mixed'] as const) {
        const closed = barElementMatrices(order, 0.37, 2.1e11, 7800, { uniformArea: 3e-4 }, mass)
        const quadrature = barElementMatrices(order, 0.37, 2.1e11, 7800, () => 3e-4, mass)
        closed.stiffness.forEach((v, i) => expectRelative(quadrature.stiffness[i], v, 1e-14, `K[${i}]`))
        closed.mass.forEach((v, i) => (v === 0 ? expect(Math.abs(quadrature.mass[i])).toBeLessThan(1e-18) : expectRelative(quadrature.mass[i], v, 1e-14, `M[${i}]`)))
      }
    }
  })
})
