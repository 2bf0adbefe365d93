/**
 * The post-solve checks tell the truth both ways (docs/verification.md §9):
 * - no accuracy warning where the frequencies are right: a uniform bar at 10⁵ and 10⁶ elements,
 *   whose frequencies are checked here against the discrete dispersion relation (§3), and a short
 *   stiff head on a thin rod, checked against a shooting function of the same mesh derived here;
 * - a warning where a mode is genuinely wrong: an eigenvector or an eigenvalue perturbed on purpose;
 * - the backward error η = ‖Kφ − λMφ‖∞ / ((‖K‖∞ + |λ|‖M‖∞)‖φ‖∞) that the checks report agrees
 *   with the same quantity computed here on dense matrices assembled by this file, and an eigenpair
 *   taken from the closed form (not from the solver) passes: the limit is not below round-off.
 */
import { describe, expect, test } from 'vitest'
import { Matrix } from 'ml-matrix'
import { analyseProject, type FamilyAnalysis } from '../../core/analysis/modal-analysis'
import { backwardErrorLimit, modeChecks, familyWarnings } from '../../core/analysis/model-checks'
import { seededRandom } from '../../core/random'
import { expectRelative, makeProject, STEEL, uniformBar } from '../helpers'

const E = STEEL.youngsModulus
const RHO = STEEL.density
const c = Math.sqrt(E / RHO)

/** Consistent-mass 2-node dispersion relation, ω² = (6c²/h²)(1 − cos θ)/(2 + cos θ) (§3), with 1 − cos θ = 2 sin²(θ/2). */
function consistentDispersion(theta: number, h: number): number {
  const half = Math.sin(theta / 2)
  return Math.sqrt(((6 * c * c) / (h * h)) * ((2 * half * half) / (2 + Math.cos(theta))))
}

function residualWarnings(analysis: FamilyAnalysis): string[] {
  return familyWarnings(analysis)
    .filter((w) => w.code === 'residual' || w.code === 'orthogonality')
    .map((w) => w.message)
}

/** The analysis with one mode's eigenvalue or vector replaced (the solver's output left untouched). */
function withMode(analysis: FamilyAnalysis, index: number, change: { eigenvalue?: number; vector?: Float64Array }): FamilyAnalysis {
  const modes = analysis.modes.map((m, i) => (i === index && change.eigenvalue !== undefined ? { ...m, eigenvalue: change.eigenvalue } : m))
  const vectors = analysis.vectors.map((v, i) => (i === index && change.vector ? change.vector : v))
  return { ...analysis, modes, vectors }
}

describe('accurate models raise no accuracy warning', () => {
  for (const elements of [100_000, 1_000_000]) {
    test(`uniform fixed–free bar, ${elements.toLocaleString('en')} elements, 20 modes: frequencies on the dispersion relation to 1e-12, no warning`, () => {
      const L = 1
      const h = L / elements
      const analysis = analyseProject(uniformBar({ length: L }), { elementOrder: 1, elementsPerSegment: elements, mass: 'consistent', modes: 20 }, { withReference: false }).families[0]
      analysis.modes.forEach((m, i) => {
        const theta = ((2 * i + 1) * Math.PI * h) / (2 * L)
        expectRelative(2 * Math.PI * m.frequencyHz, consistentDispersion(theta, h), 1e-12, `ω${i + 1}`)
      })
      const checks = modeChecks(analysis)
      checks.backwardErrors.forEach((eta, i) => expect(eta, `mode ${i + 1}: η ${eta}, limit ${checks.limit}`).toBeLessThanOrEqual(checks.limit))
      expect(residualWarnings(analysis)).toEqual([])
    })
  }

  test('a short stiff head on a thin rod: each eigenvalue brackets a root of an independent shooting function to 1e-11, no warning', () => {
    // 1 m of 5 mm rod under a 20 mm long, 200 mm head: EA differs by 1600 between the two.
    const rod = { length: 1, diameter: 0.005, elements: 40 }
    const head = { length: 0.02, diameter: 0.2, elements: 40 }
    const project = makeProject({
      materials: [STEEL],
      segments: [rod, head].map((s) => ({ length: s.length, material: 'steel', section: { shape: 'solid', diameter: s.diameter } })),
      analysis: { elementOrder: 1, elementsPerSegment: 40, mass: 'consistent', modes: 20 },
    })
    const analysis = analyseProject(project).families[0]
    // The same mesh, shot element by element from the fixed end (u = 0, tension 1): with
    // K = k[1 −1; −1 1], M = m[2 1; 1 2] (m = ρAh/6), the element's equations give
    //   u₊ − u = (T − 3λm u)/(k + λm),   T₊ = T − 3λm (u + u₊),
    // and the free end needs T = 0 after the last element (derived here from the element matrices).
    const pieces = [rod, head].flatMap((s) => Array.from({ length: s.elements }, () => ({ h: s.length / s.elements, area: (Math.PI / 4) * s.diameter ** 2 })))
    const endTension = (lambda: number) => {
      let u = 0
      let tension = 1
      for (const { h, area } of pieces) {
        const k = (E * area) / h
        const m = (RHO * area * h) / 6
        const next = u + (tension - 3 * lambda * m * u) / (k + lambda * m)
        tension -= 3 * lambda * m * (u + next)
        u = next
      }
      return tension
    }
    analysis.modes.forEach((mode, i) => {
      const below = endTension(mode.eigenvalue * (1 - 1e-11))
      const above = endTension(mode.eigenvalue * (1 + 1e-11))
      expect(Math.sign(below) * Math.sign(above), `λ${i + 1} = ${mode.eigenvalue}: end tension ${below} below, ${above} above`).toBe(-1)
    })
    expect(residualWarnings(analysis)).toEqual([])
  })

  test('an eigenpair from the closed form, rounded to double, passes the check (lumped 2-node mesh, 2000 elements)', () => {
    // Fixed–fixed lumped 2-node mesh: u_j = sin(jθ), ω = (2c/h) sin(θ/2), θ = nπh/L (§3).
    const N = 2000
    const L = 1
    const h = L / N
    const analysis = analyseProject(uniformBar({ length: L, start: 'fixed', end: 'fixed' }), { elementOrder: 1, elementsPerSegment: N, mass: 'lumped', modes: 5 }, { withReference: false }).families[0]
    const exact = analysis.vectors.map((_, i) => {
      const theta = ((i + 1) * Math.PI * h) / L
      const vector = Float64Array.from({ length: N - 1 }, (_, j) => Math.sin((j + 1) * theta))
      const omega = ((2 * c) / h) * Math.sin(theta / 2)
      return { vector, eigenvalue: omega * omega }
    })
    let replaced = analysis
    exact.forEach((pair, i) => (replaced = withMode(replaced, i, pair)))
    const checks = modeChecks(replaced)
    checks.backwardErrors.forEach((eta, i) => expect(eta, `mode ${i + 1}: η ${eta}, limit ${checks.limit}`).toBeLessThanOrEqual(checks.limit))
    expect(familyWarnings(replaced).filter((w) => w.code === 'residual')).toEqual([])
  })
})

describe('genuinely wrong modes are flagged', () => {
  const analysis = analyseProject(uniformBar({ length: 1 }), { elementOrder: 1, elementsPerSegment: 1000, mass: 'consistent', modes: 6 }, { withReference: false }).families[0]

  test('the unperturbed solution raises no warning (the baseline of the cases below)', () => {
    expect(residualWarnings(analysis)).toEqual([])
  })

  test('an eigenvector with 1e-9 relative noise: a residual warning for that mode only', () => {
    const random = seededRandom(11)
    const phi = analysis.vectors[2]
    const size = Math.max(...phi.map(Math.abs))
    const noisy = phi.map((v) => v + 1e-9 * size * (2 * random() - 1))
    const warnings = familyWarnings(withMode(analysis, 2, { vector: noisy })).filter((w) => w.code === 'residual')
    expect(warnings.map((w) => w.message.slice(0, 7))).toEqual(['Mode 3 '])
  })

  test('an eigenvalue 1e-6 off on a 100-element mesh: a residual warning for that mode only', () => {
    // η ≈ δ·λ‖Mφ‖/(‖K‖‖φ‖) ≈ δ·π²/(16N²)·O(1) ≈ 4e-11 for δ = 1e-6, N = 100, against a limit of ~7e-13.
    // (The normwise measure cannot see such a δ on a 10⁶-element mesh: there it is within round-off of K.)
    const coarse = analyseProject(uniformBar({ length: 1 }), { elementOrder: 1, elementsPerSegment: 100, mass: 'consistent', modes: 4 }, { withReference: false }).families[0]
    expect(residualWarnings(coarse)).toEqual([])
    const wrong = withMode(coarse, 0, { eigenvalue: coarse.modes[0].eigenvalue * (1 + 1e-6) })
    expect(familyWarnings(wrong).filter((w) => w.code === 'residual').map((w) => w.message.slice(0, 7))).toEqual(['Mode 1 '])
  })

  test('beyond the 60 modes checked for orthogonality (3-node mesh, 70 modes): none flagged, then mode 65 perturbed is', () => {
    const many = analyseProject(uniformBar({ length: 1 }), { elementOrder: 2, elementsPerSegment: 300, mass: 'lumped', modes: 70 }, { withReference: false }).families[0]
    expect(residualWarnings(many)).toEqual([])
    const random = seededRandom(3)
    const phi = many.vectors[64]
    const size = Math.max(...phi.map(Math.abs))
    const noisy = phi.map((v) => v + 1e-9 * size * (2 * random() - 1))
    expect(familyWarnings(withMode(many, 64, { vector: noisy })).filter((w) => w.code === 'residual').map((w) => w.message.slice(0, 8))).toEqual(['Mode 65 '])
  })

  test('two modes mixed by 1e-5: an orthogonality warning naming them', () => {
    const mixed = analysis.vectors[1].map((v, j) => v + 1e-5 * analysis.vectors[0][j])
    const warnings = familyWarnings(withMode(analysis, 1, { vector: mixed }))
    const orthogonality = warnings.filter((w) => w.code === 'orthogonality')
    expect(orthogonality).toHaveLength(1)
    expect(orthogonality[0].message).toMatch(/^Modes 1 and 2 are not mass-orthogonal \(φᵀMφ = 1\.0e-5\)/)
  })
})

describe('the backward error itself', () => {
  test('matches η computed here on dense matrices, within the factor 2 of the norm bound (3-node mesh, perturbed pairs)', () => {
    // 3-node consistent elements on a 0.8 m fixed–free bar; K and M assembled here from the
    // element matrices EA/3h [7 −8 1; −8 16 −8; 1 −8 7] and ρAh/30 [4 2 −1; 2 16 2; −1 2 4] (Cook et al., from memory).
    const N = 12
    const L = 0.8
    const d = 0.02
    const area = (Math.PI / 4) * d * d
    const h = L / N
    const analysis = analyseProject(uniformBar({ length: L, diameter: d }), { elementOrder: 2, elementsPerSegment: N, mass: 'consistent', modes: 5 }, { withReference: false }).families[0]
    const n = 2 * N
    const K = Matrix.zeros(n, n)
    const M = Matrix.zeros(n, n)
    const ke = [[7, -8, 1], [-8, 16, -8], [1, -8, 7]].map((r) => r.map((v) => (E * area * v) / (3 * h)))
    const me = [[4, 2, -1], [2, 16, 2], [-1, 2, 4]].map((r) => r.map((v) => (RHO * area * h * v) / 30))
    for (let e = 0; e < N; e++) {
      for (let a = 0; a < 3; a++) {
        for (let b = 0; b < 3; b++) {
          const ia = 2 * e + a - 1
          const ib = 2 * e + b - 1
          if (ia < 0 || ib < 0) continue
          K.set(ia, ib, K.get(ia, ib) + ke[a][b])
          M.set(ia, ib, M.get(ia, ib) + me[a][b])
        }
      }
    }
    const infinityNorm = (A: Matrix) => Math.max(...A.to2DArray().map((row) => row.reduce((s, v) => s + Math.abs(v), 0)))
    const random = seededRandom(5)
    let perturbed = analysis
    analysis.vectors.forEach((phi, i) => {
      const size = Math.max(...phi.map(Math.abs))
      perturbed = withMode(perturbed, i, { vector: phi.map((v) => v + 1e-7 * (i + 1) * size * (2 * random() - 1)) })
    })
    const reported = modeChecks(perturbed).backwardErrors
    perturbed.vectors.forEach((phi, i) => {
      const lambda = perturbed.modes[i].eigenvalue
      const x = Matrix.columnVector(Array.from(phi))
      const r = K.mmul(x).sub(M.mmul(x).mul(lambda))
      const eta = r.abs().max() / ((infinityNorm(K) + Math.abs(lambda) * infinityNorm(M)) * x.abs().max())
      expect(eta, `mode ${i + 1}: dense η ${eta} must stand above round-off`).toBeGreaterThan(1e3 * backwardErrorLimit(n, 2))
      // The checks bound ‖K‖∞ and ‖M‖∞ from above within a factor 2, so their η lies in [η/2, η].
      expect(reported[i], `mode ${i + 1}: reported ${reported[i]}, dense ${eta}`).toBeLessThanOrEqual(eta * (1 + 1e-9))
      expect(reported[i], `mode ${i + 1}: reported ${reported[i]}, dense ${eta}`).toBeGreaterThanOrEqual(eta / 2)
    })
  })
})
