/**
 * Two independent methods must agree (docs/verification.md §5): the exact piecewise solution
 * (transfer matrices with the Wittrick–Williams count) and the finite-element solution
 * extrapolated to zero element size (Richardson, from 2-node consistent-mass meshes at
 * 128, 256, 512 elements per segment), to 1e-7; and 3-node elements at 100 per segment
 * to 1e-6 directly. The models are invented test cases, not handbook data.
 */
import { describe, expect, test } from 'vitest'
import { analyseProject } from '../../core/analysis/modal-analysis'
import { exactReference } from '../../core/exact/reference'
import type { Project } from '../../core/model/project'
import { expectRelative, makeProject } from '../helpers'

const materials = [
  { id: 'steel', youngsModulus: 205e9, density: 7850 },
  { id: 'alu', youngsModulus: 69e9, density: 2700 },
  { id: 'ti', youngsModulus: 114e9, density: 4430 },
]

const MODELS: Record<string, Project> = {
  'stepped solid, two materials, fixed–free': makeProject({
    materials,
    segments: [
      { length: 0.9, material: 'steel', section: { shape: 'solid', diameter: 0.05 } },
      { length: 1.4, material: 'alu', section: { shape: 'solid', diameter: 0.032 } },
    ],
  }),
  'tube, cone and rectangle, fixed–fixed': makeProject({
    materials,
    segments: [
      { length: 0.5, material: 'steel', section: { shape: 'tube', outerDiameter: 0.06, innerDiameter: 0.045 } },
      { length: 0.3, material: 'steel', section: { shape: 'cone', startDiameter: 0.06, endDiameter: 0.025 } },
      { length: 0.8, material: 'ti', section: { shape: 'rectangle', width: 0.03, height: 0.012 } },
    ],
    ends: { start: 'fixed', end: 'fixed' },
  }),
  'expanding cone with a tip mass': makeProject({
    materials,
    segments: [{ length: 1.1, material: 'steel', section: { shape: 'cone', startDiameter: 0.02, endDiameter: 0.07 } }],
    masses: [{ at: 1.1, mass: 7.5 }],
  }),
  'interior mass and spring, free–free': makeProject({
    materials,
    segments: [
      { length: 0.6, material: 'alu', section: { shape: 'area', area: 8e-4 } },
      { length: 0.6, material: 'steel', section: { shape: 'solid', diameter: 0.03 } },
    ],
    ends: { start: 'free', end: 'free' },
    masses: [{ at: 0.3, mass: 1.2 }],
    springs: [{ at: 0.9, stiffness: 3e8 }],
  }),
  'free–free with no support (rigid-body mode)': makeProject({
    materials,
    segments: [
      { length: 1.0, material: 'steel', section: { shape: 'solid', diameter: 0.04 } },
      { length: 0.5, material: 'ti', section: { shape: 'tube', outerDiameter: 0.04, innerDiameter: 0.02 } },
    ],
    ends: { start: 'free', end: 'free' },
    masses: [{ at: 1.5, mass: 0.8 }],
  }),
  'stiff spring mid-span and heavy end mass, free–fixed': makeProject({
    materials,
    segments: [
      { length: 1.2, material: 'steel', section: { shape: 'solid', diameter: 0.025 } },
      { length: 0.4, material: 'steel', section: { shape: 'cone', startDiameter: 0.025, endDiameter: 0.05 } },
    ],
    ends: { start: 'free', end: 'fixed' },
    masses: [{ at: 0, mass: 12 }],
    springs: [{ at: 0.6, stiffness: 4e9 }],
  }),
}

const MODES = 6

describe.each(Object.entries(MODELS))('%s', (_, project) => {
  const exact = exactReference(project, MODES).frequenciesHz
  test('Richardson-extrapolated 2-node FE agrees with the exact solution to 1e-7', () => {
    const [f1, f2, f3] = [128, 256, 512].map(
      (n) => analyseProject(project, { elementOrder: 1, elementsPerSegment: n, mass: 'consistent', modes: MODES }, { withReference: false }).modes,
    )
    for (let m = 0; m < MODES; m++) {
      if (exact[m] === 0) {
        expect(f3[m].frequencyHz).toBe(0)
        continue
      }
      // Order 2 assumed for Richardson (the theory of the element); the observed order is tested elsewhere.
      const extrapolated = f3[m].frequencyHz + (f3[m].frequencyHz - f2[m].frequencyHz) / 3
      void f1
      expectRelative(extrapolated, exact[m], 1e-7, `mode ${m + 1}`)
    }
  })
  test('3-node elements at 100 per segment agree to 1e-6; 2-node consistent never below exact', () => {
    const quadratic = analyseProject(project, { elementOrder: 2, elementsPerSegment: 100, mass: 'consistent', modes: MODES }, { withReference: false })
    quadratic.modes.forEach((m, i) => (exact[i] === 0 ? expect(m.frequencyHz).toBe(0) : expectRelative(m.frequencyHz, exact[i], 1e-6, `mode ${i + 1}`)))
    const linear = analyseProject(project, { elementOrder: 1, elementsPerSegment: 20, mass: 'consistent', modes: MODES }, { withReference: false })
    linear.modes.forEach((m, i) => expect(m.frequencyHz, `mode ${i + 1}`).toBeGreaterThanOrEqual(exact[i] * (1 - 1e-13)))
  })
})
