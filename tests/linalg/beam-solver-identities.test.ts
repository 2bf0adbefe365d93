/**
 * The bending solver's shortcuts (Kato–Temple acceptance after one Rayleigh quotient step from
 * the coarse level, modes settled on coarser levels, counts reused after the Ritz step) must leave
 * every mode a solution to working accuracy. Checked by the identities of the generalized
 * eigenproblem on a grid of beams: the backward error η = ‖Kφ − λMφ‖/((‖K‖ + |λ|‖M‖)‖φ‖) of each
 * mode below the round-off limit (n + 2b + 3)·ε times a safety factor (N. J. Higham, Accuracy and
 * Stability of Numerical Algorithms, §3.1 and §3.5; from memory), M-orthonormality of the modes
 * to 1e-10, and a passed Sturm count. The parts are invented; no frequency of Rodwave's is an
 * expected value here.
 */
import { describe, expect, test } from 'vitest'
import { analyseFamily, effectiveSettings } from '../../core/analysis/modal-analysis'
import { familyWarnings, modeChecks } from '../../core/analysis/model-checks'
import { bilinearForm } from '../../core/linalg/symmetric-band-matrix'
import { familyOf } from '../../core/model/families'
import { readProjectDocument } from '../../core/model/project-schema'

const STEEL = { id: 'steel', youngsModulus: 2e11, density: 7850, poissonRatio: 0.3 }

interface Case {
  readonly start: string
  readonly end: string
  readonly elements: number
  readonly theory: 'euler-bernoulli' | 'timoshenko'
  readonly mass?: 'consistent' | 'lumped'
  readonly preload?: number
  readonly stepped?: boolean
}

const CASES: Case[] = [
  { start: 'clamped', end: 'free', elements: 1999, theory: 'euler-bernoulli' },
  { start: 'clamped', end: 'pinned', elements: 300, theory: 'timoshenko' },
  { start: 'clamped', end: 'pinned', elements: 1999, theory: 'timoshenko' },
  { start: 'free', end: 'free', elements: 1999, theory: 'timoshenko' },
  { start: 'pinned', end: 'pinned', elements: 1999, theory: 'euler-bernoulli', preload: 4000 },
  { start: 'pinned', end: 'pinned', elements: 6000, theory: 'euler-bernoulli', preload: -800 },
  { start: 'clamped', end: 'guided', elements: 6000, theory: 'euler-bernoulli', mass: 'lumped' },
  { start: 'clamped', end: 'free', elements: 3000, theory: 'euler-bernoulli', stepped: true },
  { start: 'pinned', end: 'free', elements: 1000, theory: 'timoshenko', stepped: true },
]

function analyse(c: Case) {
  const segments = c.stepped
    ? [
        { length: 0.8, material: 'steel', section: { shape: 'tube', outerDiameter: 0.04, innerDiameter: 0.03 } },
        { length: 0.5, material: 'steel', section: { shape: 'cone', startDiameter: 0.035, endDiameter: 0.02 } },
      ]
    : [{ length: 1, material: 'steel', section: { shape: 'solid', diameter: 0.02 } }]
  const read = readProjectDocument({
    format: 'rodwave',
    version: 2,
    motions: ['bending'],
    materials: [STEEL],
    segments,
    ends: { start: { bending: c.start }, end: { bending: c.end } },
    ...(c.preload !== undefined ? { preload: c.preload } : {}),
    ...(c.stepped ? { springs: [{ at: 0.55, motion: 'bending', stiffness: 3e5, rotationalStiffness: 120 }], masses: [{ at: 1.1, mass: 0.6 }] } : {}),
    analysis: { elementsPerSegment: Math.round(c.elements / segments.length), modes: 10, mass: c.mass ?? 'consistent', bendingTheory: c.theory },
  })
  if (!read.ok) throw new Error(read.issues.map((i) => `${i.path}: ${i.message}`).join('; '))
  return analyseFamily(read.project, familyOf('bending'), effectiveSettings(read.project), { withReference: false })
}

describe('bending modes satisfy the eigenproblem to working accuracy (backward error, orthonormality, Sturm)', () => {
  for (const c of CASES) {
    const name = `${c.theory} ${c.start}–${c.end}, ${c.elements} elements${c.mass === 'lumped' ? ', lumped mass' : ''}${c.preload ? `, preload ${c.preload} N` : ''}${c.stepped ? ', stepped with a spring and a mass' : ''}`
    test(name, () => {
      const family = analyse(c)
      const checks = modeChecks(family)
      checks.backwardErrors.forEach((eta, i) => expect(eta, `mode ${i + 1}: η = ${eta}, limit ${checks.limit}`).toBeLessThanOrEqual(checks.limit))
      const { mass } = family.model.pencil
      family.vectors.forEach((u, i) =>
        family.vectors.forEach((v, j) => {
          if (j < i) return
          expect(Math.abs(bilinearForm(mass, u, v) - (i === j ? 1 : 0)), `φ${i + 1}ᵀMφ${j + 1}`).toBeLessThan(1e-10)
        }),
      )
      expect(family.sturm.passed).toBe(true)
      expect(family.converged).toBe(true)
      expect(familyWarnings(family).map((w) => w.code)).toEqual([])
    })
  }
})
