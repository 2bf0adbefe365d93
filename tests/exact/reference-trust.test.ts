/**
 * The extrapolated reference uses only meshes whose own solve passed its checks (Sturm count and
 * convergence). Here the solver is made to report a failed Sturm check on every mesh finer than a
 * limit (vi.mock wraps the real analyseFamily), so that the rule is exercised however the solver
 * itself fares. Model: a cylinder entered as a cone of constant diameter (so the reference is
 * extrapolated), pinned–pinned, against f_n = (nπ/L)²/(2π)·√(EI/ρA) (R. D. Blevins, Formulas for
 * Natural Frequency and Mode Shape, table of single-span beams; from memory).
 */
import { describe, expect, test, vi } from 'vitest'
import { extrapolatedReference } from '../../core/exact/family-reference'
import { analysedFamilies } from '../../core/model/families'
import { effectiveSettings } from '../../core/analysis/modal-analysis'
import type { Project } from '../../core/model/project'
import { expectRelative, makeProject, STEEL } from '../helpers'
import { referenceText } from '../../core/report/checks-section'
import type { FamilyAnalysis } from '../../core/analysis/modal-analysis'

const limit = vi.hoisted(() => ({ elementsPerSegment: Infinity }))

vi.mock('../../core/analysis/modal-analysis', async (importOriginal) => {
  const actual = await importOriginal<typeof import('../../core/analysis/modal-analysis')>()
  return {
    ...actual,
    analyseFamily: (...args: Parameters<typeof actual.analyseFamily>) => {
      const analysis = actual.analyseFamily(...args)
      const elements = args[2].elementsPerSegment ?? 0
      return elements > limit.elementsPerSegment ? { ...analysis, sturm: { ...analysis.sturm, passed: false } } : analysis
    },
  }
})

const L = 1.2
const d = 0.025
const I = (Math.PI / 64) * d ** 4
const A = (Math.PI / 4) * d * d
const closedForm = (n: number) => (((n * Math.PI) / L) ** 2 * Math.sqrt((STEEL.youngsModulus * I) / (STEEL.density * A))) / (2 * Math.PI)

function cylinderAsCone(elementsPerSegment: number): Project {
  return makeProject({
    version: 2,
    materials: [{ ...STEEL, poissonRatio: 0.3 }],
    motions: ['bending'],
    segments: [{ length: L, material: 'steel', section: { shape: 'cone', startDiameter: d, endDiameter: d } }],
    ends: { start: { bending: 'pinned' }, end: { bending: 'pinned' } },
    analysis: { elementsPerSegment, modes: 3 },
  })
}

function referenceWith(finestTrusted: number, analysisMesh: number) {
  limit.elementsPerSegment = finestTrusted
  try {
    const project = cylinderAsCone(analysisMesh)
    const family = analysedFamilies(project).find((f) => f.key === 'bending')!
    return extrapolatedReference(project, family, effectiveSettings(project), 3)
  } finally {
    limit.elementsPerSegment = Infinity
  }
}

describe('the extrapolated reference uses only meshes whose solve passed its checks', () => {
  test('all pass: 4 × and 8 × the analysis mesh, the closed form to 1e-9', () => {
    const reference = referenceWith(Infinity, 40)
    expect(reference.formulation).toContain('at 160 elements per segment and 320 elements per segment')
    reference.frequenciesHz.forEach((f, i) => expectRelative(f, closedForm(i + 1), 1e-9, `mode ${i + 1}`))
  })
  test('the finest fails: the pair is halved to 80 and 160 elements per segment, still the closed form to 1e-9', () => {
    const reference = referenceWith(160, 40)
    expect(reference.method).toBe('extrapolated')
    expect(reference.formulation).toContain('at 80 elements per segment and 160 elements per segment')
    reference.frequenciesHz.forEach((f, i) => expectRelative(f, closedForm(i + 1), 1e-9, `mode ${i + 1}`))
  })
  test('none passes down to the analysis mesh: no reference, and the reason given', () => {
    const reference = referenceWith(39, 40)
    expect(reference.method).toBeNull()
    expect(reference.frequenciesHz).toEqual([])
    expect(reference.formulation).toMatch(/^the solves on the reference meshes, down to 40 elements per segment, did not pass their own checks/)
    // The report gives that reason in place of a reference method.
    const text = referenceText({ reference, family: { motion: 'bending' } } as unknown as FamilyAnalysis)
    expect(text).toBe(`No exact solution is available for this model, and no extrapolated one: ${reference.formulation}. The convergence study gives the error estimate.`)
  })
})
