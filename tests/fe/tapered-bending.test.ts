/**
 * A solid cone in bending has no closed form in Rodwave's reference: it is a Richardson estimate
 * from two fine finite-element meshes, labelled "extrapolated". Checked here against an
 * independent method written in the test: the Rayleigh–Ritz method with polynomial trial
 * functions w = (x/L)² P_k(2x/L − 1) (Legendre polynomials, clamped at x = 0), whose frequencies
 * converge from above and exponentially fast for the cone's analytic mode shapes (e.g.
 * L. Meirovitch, Principles and Techniques of Vibrations, the Rayleigh–Ritz method, from memory).
 */
import { describe, expect, test } from 'vitest'
import { CholeskyDecomposition, EigenvalueDecomposition, Matrix, inverse } from 'ml-matrix'
import { analyseProject } from '../../core/analysis/modal-analysis'
import { gaussLegendreRule } from '../../core/fe/gauss-legendre'
import { readProjectDocument } from '../../core/model/project-schema'
import { expectRelative } from '../helpers'

const E = 2e11
const RHO = 7850
const L = 0.8
const D0 = 0.05
const D1 = 0.02

/** Ritz frequencies (Hz) of the clamped–free cone with n trial functions. */
function ritz(n: number, count: number): number[] {
  const rule = gaussLegendreRule(60)
  const K = Matrix.zeros(n, n)
  const M = Matrix.zeros(n, n)
  for (let g = 0; g < rule.points.length; g++) {
    const xi = rule.points[g]
    const x = ((xi + 1) / 2) * L
    const weight = (rule.weights[g] * L) / 2
    const d = D0 + ((D1 - D0) * x) / L
    const ei = E * (Math.PI / 64) * d ** 4
    const rhoA = RHO * (Math.PI / 4) * d * d
    // Legendre P_k, P_k′, P_k″ at ξ by their recurrences.
    const P = [1, xi]
    const dP = [0, 1]
    const ddP = [0, 0]
    for (let k = 1; k < n; k++) {
      P.push(((2 * k + 1) * xi * P[k] - k * P[k - 1]) / (k + 1))
      dP.push(dP[k - 1] + (2 * k + 1) * P[k])
      ddP.push(ddP[k - 1] + (2 * k + 1) * dP[k])
    }
    const s = (xi + 1) / 2
    const w: number[] = []
    const curvature: number[] = []
    for (let k = 0; k < n; k++) {
      w.push(s * s * P[k])
      // d²w/dξ² = P/2 + 2sP′ + s²P″, and d/dx = (2/L) d/dξ.
      curvature.push((4 / (L * L)) * (P[k] / 2 + 2 * s * dP[k] + s * s * ddP[k]))
    }
    for (let i = 0; i < n; i++) {
      for (let j = i; j < n; j++) {
        const k = K.get(i, j) + weight * ei * curvature[i] * curvature[j]
        const m = M.get(i, j) + weight * rhoA * w[i] * w[j]
        K.set(i, j, k).set(j, i, k)
        M.set(i, j, m).set(j, i, m)
      }
    }
  }
  const Linv = inverse(new CholeskyDecomposition(M).lowerTriangularMatrix)
  const reduced = Linv.mmul(K).mmul(Linv.transpose())
  const values = new EigenvalueDecomposition(reduced.add(reduced.transpose()).mul(0.5), { assumeSymmetric: true }).realEigenvalues.sort((a, b) => a - b)
  return values.slice(0, count).map((v) => Math.sqrt(v) / (2 * Math.PI))
}

describe('a tapered (solid cone) cantilever in bending', () => {
  const read = readProjectDocument({
    format: 'rodwave',
    version: 2,
    motions: ['bending'],
    materials: [{ id: 'steel', youngsModulus: E, density: RHO }],
    segments: [{ length: L, material: 'steel', section: { shape: 'cone', startDiameter: D0, endDiameter: D1 } }],
    ends: { start: { bending: 'clamped' }, end: { bending: 'free' } },
    analysis: { elementsPerSegment: 40, modes: 3 },
  })
  if (!read.ok) throw new Error(JSON.stringify(read.issues))
  test('the Ritz check itself has converged (16 and 20 trial functions agree to 1e-9, below the 1e-8 asked of the reference)', () => {
    const a = ritz(16, 3)
    const b = ritz(20, 3)
    b.forEach((f, i) => expectRelative(a[i], f, 1e-9, `Ritz mode ${i + 1}`))
  })
  test('the extrapolated reference meets the Ritz frequencies to 1e-8, the finite elements at the file’s mesh to 2e-3', () => {
    const expected = ritz(20, 3)
    const family = analyseProject(read.project).families[0]
    expect(family.reference.method).toBe('extrapolated')
    expect(family.reference.formulation).toMatch(/Richardson/)
    family.modes.forEach((m, i) => {
      expectRelative(m.referenceHz!, expected[i], 1e-8, `reference, mode ${i + 1}`)
      expectRelative(m.frequencyHz, expected[i], 2e-3, `finite elements, mode ${i + 1}`)
    })
  })
})
