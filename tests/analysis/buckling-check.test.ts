/**
 * The buckling check of a compressed part (buckling.ts) on its every route, against Euler's and
 * Engesser's loads (S. P. Timoshenko & J. M. Gere, Theory of Elastic Stability, ch. 2, from
 * memory): a pinned–pinned or guided–guided column (w = sin πx/L or cos πx/L) buckles at
 * P_E = π²EI/L²; with shear deformation (Timoshenko beam, shear stiffness κGA) at
 * P_E/(1 + P_E/(κGA)) (Engesser's formula, the one that follows from ½∫P w′² dx with w′ the
 * slope of the centre line). κ = 6(1 + ν)/(7 + 6ν) for a solid circle (G. R. Cowper, J. Appl.
 * Mech. 33 (1966), from memory).
 */
import { describe, expect, test } from 'vitest'
import { checkBuckling, criticalCompression, finiteElementCriticalCompression } from '../../core/analysis/buckling'
import { effectiveSettings } from '../../core/analysis/modal-analysis'
import type { Project } from '../../core/model/project'
import { expectRelative, makeProject, STEEL } from '../helpers'

const E = STEEL.youngsModulus
const NU = 0.3
const G = E / (2 * (1 + NU))
const L = 1.1
const d = 0.02
const I = (Math.PI / 64) * d ** 4
const A = (Math.PI / 4) * d * d
const EULER = (Math.PI * Math.PI * E * I) / (L * L)

function column(start: string, end: string, options: { preload?: number; cone?: boolean; theory?: string; motions?: string[] } = {}): Project {
  return makeProject({
    version: 2,
    motions: options.motions ?? ['bending'],
    materials: [{ ...STEEL, poissonRatio: NU }],
    segments: [{ length: L, material: 'steel', section: options.cone ? { shape: 'cone', startDiameter: d, endDiameter: d } : { shape: 'solid', diameter: d } }],
    ends: { start: { bending: start, axial: 'fixed' }, end: { bending: end, axial: 'free' } },
    analysis: { elementsPerSegment: 20, modes: 2, ...(options.theory ? { bendingTheory: options.theory } : {}) },
    ...(options.preload === undefined ? {} : { preload: options.preload }),
  })
}

describe('when the check applies', () => {
  test('no compression, a tension, or bending not analysed: no check', () => {
    expect(checkBuckling(column('pinned', 'pinned'), effectiveSettings(column('pinned', 'pinned')))).toBeNull()
    const pulled = column('pinned', 'pinned', { preload: 500 })
    expect(checkBuckling(pulled, effectiveSettings(pulled))).toBeNull()
    const axialOnly = column('pinned', 'pinned', { preload: -500, motions: ['axial'] })
    expect(checkBuckling(axialOnly, effectiveSettings(axialOnly))).toBeNull()
  })

  test('a compression of 0.3 P_E on a pinned–pinned column: ratio 0.3, the exact route named', () => {
    const project = column('pinned', 'pinned', { preload: -0.3 * EULER })
    const check = checkBuckling(project, effectiveSettings(project))!
    expectRelative(check.compression, 0.3 * EULER, 1e-15, 'compression')
    expectRelative(check.criticalCompression, EULER, 1e-12, 'critical compression')
    expectRelative(check.ratio, 0.3, 1e-12, 'ratio')
    expect(check.method).toBe('exact, Euler–Bernoulli segments')
  })

  test('a rotation left free (pinned–free): no compression can be carried, ratio infinite, the reason named', () => {
    const project = column('pinned', 'free', { preload: -1 })
    const check = checkBuckling(project, effectiveSettings(project))!
    expect(check.criticalCompression).toBe(0)
    expect(check.ratio).toBe(Infinity)
    expect(check.method).toBe('a rotation the supports leave free')
    expect(finiteElementCriticalCompression(project, effectiveSettings(project))).toEqual({ load: 0, method: 'a rotation the supports leave free' })
  })
})

describe('the finite-element route', () => {
  test('a cone of constant diameter (no exact route), pinned–pinned: P_E to 1e-8, the route named', () => {
    const project = column('pinned', 'pinned', { cone: true, preload: -10 })
    const critical = criticalCompression(project, effectiveSettings(project))
    expectRelative(critical.load, EULER, 1e-8, 'pinned–pinned')
    expect(critical.method).toBe('finite elements, Richardson-extrapolated from 64 and 128 elements per segment')
  })

  test('guided–guided (a free sideways translation, held by the check itself): P_E to 1e-8', () => {
    const project = column('guided', 'guided', { cone: true, preload: -10 })
    expectRelative(criticalCompression(project, effectiveSettings(project)).load, EULER, 1e-8, 'guided–guided')
  })

  test('a start far below the bracket: a clamped–clamped column (4 P_E) is still found', () => {
    const project = column('clamped', 'clamped', { cone: true, preload: -10 })
    expectRelative(criticalCompression(project, effectiveSettings(project)).load, 4 * EULER, 1e-8, 'clamped–clamped')
  })

  test('Timoshenko theory, pinned–pinned: Engesser’s P_E/(1 + P_E/(κGA)) to 1e-6', () => {
    const stubby = 0.2 // a short column (L/d = 11), so that shear matters
    const project = makeProject({
      version: 2,
      motions: ['bending'],
      materials: [{ ...STEEL, poissonRatio: NU }],
      segments: [{ length: stubby * L, material: 'steel', section: { shape: 'solid', diameter: d } }],
      ends: { start: { bending: 'pinned' }, end: { bending: 'pinned' } },
      analysis: { elementsPerSegment: 20, modes: 2, bendingTheory: 'timoshenko' },
      preload: -10,
    })
    const euler = EULER / (stubby * stubby)
    const kappa = (6 * (1 + NU)) / (7 + 6 * NU)
    const engesser = euler / (1 + euler / (kappa * G * A))
    expect(engesser / euler).toBeLessThan(0.995)
    const critical = criticalCompression(project, effectiveSettings(project))
    expect(critical.method).toMatch(/^finite elements/)
    expectRelative(critical.load, engesser, 1e-6, 'Timoshenko pinned–pinned')
  })
})

describe('the finite-element route at its edges', () => {
  test('free–guided (a free translation beside a free end rotation): the cantilever load P_E/4 to 1e-7', () => {
    // Shifting the column sideways costs nothing, so free–guided buckles as a clamped–free
    // cantilever of the same length: π²EI/(4L²) (Timoshenko & Gere, Theory of Elastic Stability,
    // §2.1, from memory). The check's own spring on the free translation must sit on a
    // deflection unknown, not on the free end's rotation, which is then the second unknown.
    // Measured error 3.8e-8 (round-off of the nearly singular pencil at 128 elements): 1e-7.
    const project = column('free', 'guided', { cone: true, preload: -10 })
    const critical = criticalCompression(project, effectiveSettings(project))
    expect(critical.method).toMatch(/^finite elements/)
    expectRelative(critical.load, EULER / 4, 1e-7, 'free–guided')
    const flipped = column('guided', 'free', { cone: true, preload: -10 })
    expectRelative(criticalCompression(flipped, effectiveSettings(flipped)).load, EULER / 4, 1e-7, 'guided–free')
  })

  test('a thin wire (d = 0.1 mm, P_E ≈ 1e-5 N) on the finite-element route: P_E to 1e-8, not to an absolute step', () => {
    const wire = 1e-4
    const project = makeProject({
      version: 2,
      motions: ['bending'],
      materials: [{ ...STEEL, poissonRatio: NU }],
      segments: [{ length: L, material: 'steel', section: { shape: 'cone', startDiameter: wire, endDiameter: wire } }],
      ends: { start: { bending: 'pinned' }, end: { bending: 'pinned' } },
      analysis: { elementsPerSegment: 20, modes: 2 },
      preload: -1e-6,
    })
    // Euler's load π²EI/L² (Timoshenko & Gere, Theory of Elastic Stability, §2.2, from memory).
    const euler = (Math.PI * Math.PI * E * ((Math.PI / 64) * wire ** 4)) / (L * L)
    expect(euler).toBeLessThan(1e-4)
    expectRelative(criticalCompression(project, effectiveSettings(project)).load, euler, 1e-8, 'thin wire')
  })
})
