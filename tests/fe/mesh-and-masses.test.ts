/**
 * The mesher's rules (a node at every segment end and attachment, elements shared out in
 * proportion to length or sized by a largest element length) checked on parts whose meshes are
 * worked out by hand here; element matrices whose stiffness and inertia properties are given
 * differently (one varying, one constant), against integrals of the shape functions done here;
 * the mixed mass of the bending element as the mean of its consistent and lumped matrices
 * (Przemieniecki, Theory of Matrix Structural Analysis, ch. 11; Hinton, Rock & Zienkiewicz,
 * Earthq. Eng. Struct. Dyn. 4 (1976); both from memory); and the polar inertia of a cone, ∫ρI_p dx,
 * by Simpson's rule in the test.
 */
import { describe, expect, test } from 'vitest'
import { buildMesh, countMeshElements, elementAt, nearestNode } from '../../core/fe/mesh'
import { barElementMatrices } from '../../core/fe/bar-element'
import { beamElementMatrices, type BeamElementSection } from '../../core/fe/beam-element'
import { totalPolarInertia } from '../../core/fe/assemble'
import { expectRelative, makeProject, STEEL } from '../helpers'

const solid = (d: number) => ({ shape: 'solid', diameter: d })

describe('mesh', () => {
  // Segments of 1.0 m and 0.5 m; masses at 0.8 and 0.3 (given out of order), a spring at 1.2.
  const project = makeProject({
    materials: [STEEL],
    segments: [
      { length: 1, material: 'steel', section: solid(0.02) },
      { length: 0.5, material: 'steel', section: solid(0.03) },
    ],
    masses: [
      { at: 0.8, mass: 1 },
      { at: 0.3, mass: 2 },
    ],
    springs: [{ at: 1.2, stiffness: 1e6 }],
  })

  test('elements per segment shared out by length between the attachments: 3 + 5 + 2, then 4 + 6', () => {
    const mesh = buildMesh(project, { order: 1, elementsPerSegment: 10 })
    // First segment: pieces 0.3, 0.5, 0.2 of 1.0 → 3, 5, 2; second: 0.2, 0.3 of 0.5 → 4, 6.
    expect(mesh.elementCount).toBe(20)
    expect(countMeshElements(project, { order: 1, elementsPerSegment: 10 })).toBe(20)
    expect(mesh.pieces.map((p) => [p.segment, p.firstElement, p.count])).toEqual([
      [0, 0, 3],
      [0, 3, 5],
      [0, 8, 2],
      [1, 10, 4],
      [1, 14, 6],
    ])
    const expectedX = [
      ...Array.from({ length: 3 }, (_, i) => 0.1 * i),
      ...Array.from({ length: 5 }, (_, i) => 0.3 + 0.1 * i),
      ...Array.from({ length: 2 }, (_, i) => 0.8 + 0.1 * i),
      ...Array.from({ length: 4 }, (_, i) => 1 + 0.05 * i),
      ...Array.from({ length: 6 }, (_, i) => 1.2 + 0.05 * i),
      1.5,
    ]
    expect(mesh.x.length).toBe(21)
    mesh.x.forEach((x, i) => expect(x, `node ${i}`).toBeCloseTo(expectedX[i], 12))
    expect(Array.from(mesh.elementSegment)).toEqual([...Array(10).fill(0), ...Array(10).fill(1)])
    expect(mesh.segmentBoundaryNodes).toEqual([0, 10, 20])
    // Attachments sit on nodes: 0.8 → node 8, 0.3 → node 3, 1.2 → node 14.
    expect(mesh.massNodes).toEqual([8, 3])
    expect(mesh.springNodes).toEqual([14])
  })

  test('the element list: nodes, ends and fractions of the segment, for 2- and 3-node elements', () => {
    const linear = buildMesh(project, { order: 1, elementsPerSegment: 10 }).elements
    expect(linear.length).toBe(20)
    expect(linear[4].nodes).toEqual([4, 5])
    expect(linear[4].segment).toBe(0)
    expect(linear[4].x0).toBeCloseTo(0.4, 12)
    expect(linear[4].x1).toBeCloseTo(0.5, 12)
    expect(linear[4].t0).toBeCloseTo(0.4, 12)
    expect(linear[4].t1).toBeCloseTo(0.5, 12)
    // Element 12 of the second segment (0.5 m from x = 1): 1.10 … 1.15, fractions 0.2 … 0.3.
    expect(linear[12].segment).toBe(1)
    expect(linear[12].x0).toBeCloseTo(1.1, 12)
    expect(linear[12].t0).toBeCloseTo(0.2, 12)
    expect(linear[12].t1).toBeCloseTo(0.3, 12)
    const quadratic = buildMesh(project, { order: 2, elementsPerSegment: 10 })
    expect(quadratic.x.length).toBe(41)
    const e = quadratic.elements[12]
    expect(e.nodes).toEqual([24, 25, 26])
    expect(e.x0).toBeCloseTo(1.1, 12)
    expect(e.x1).toBeCloseTo(1.15, 12)
    expect(quadratic.x[25]).toBeCloseTo(1.125, 12)
    expect(e.t1).toBeCloseTo(0.3, 12)
    // The list is built once.
    expect(quadratic.elements).toBe(quadratic.elements)
  })

  test('largest element length: ⌈piece/h⌉ elements, an exact multiple not rounded up', () => {
    const bar = makeProject({ materials: [STEEL], segments: [{ length: 1, material: 'steel', section: solid(0.02) }, { length: 0.3, material: 'steel', section: solid(0.02) }] })
    // 1.0/0.25 = 4 exactly; 0.3/0.25 = 1.2 → 2.
    expect(countMeshElements(bar, { order: 1, maxElementLength: 0.25 })).toBe(6)
    // 0.3/0.1 is 2.9999999999999996 in floating point: 3 elements, not 4; 1.0/0.1 → 10.
    expect(countMeshElements(bar, { order: 1, maxElementLength: 0.1 })).toBe(13)
    // A length longer than every piece: one element each.
    expect(countMeshElements(bar, { order: 2, maxElementLength: 5 })).toBe(2)
    expect(buildMesh(bar, { order: 1, maxElementLength: 0.25 }).pieces.map((p) => p.length)).toEqual([expect.closeTo(0.25, 14), expect.closeTo(0.15, 14)])
  })

  test('element and node lookups by position', () => {
    const mesh = buildMesh(project, { order: 1, elementsPerSegment: 10 })
    for (const position of [0, 0.05, 0.3, 0.31, 0.99, 1.0, 1.26, 1.5]) {
      const e = elementAt(mesh, position)
      expect(mesh.x[e], `element of ${position}`).toBeLessThanOrEqual(position + 1e-12)
      expect(mesh.x[e + 1], `element of ${position}`).toBeGreaterThanOrEqual(position - 1e-12)
    }
    expect(elementAt(mesh, 0.31)).toBe(3)
    expect(nearestNode(mesh.x, 0.349)).toBe(3)
    expect(nearestNode(mesh.x, 0.351)).toBe(4)
    expect(nearestNode(mesh.x, 1.49)).toBe(20)
    expect(nearestNode(mesh.x, -1)).toBe(0)
  })
})

describe('bar element with a varying property beside a constant one', () => {
  const h = 0.2
  const G = 80e9
  const rho = 7800
  test('varying stiffness property, constant inertia: K = G·mean(J)/h [1 −1; −1 1], M = ρI_p h/6 [2 1; 1 2]', () => {
    const J = (t: number) => 2e-8 * (1 + t)
    const Ip = 3e-8
    const m = barElementMatrices(1, h, G, rho, J, 'consistent', { uniformArea: Ip })
    const k = (G * 3e-8) / h // mean of 2e-8(1 + t) over [0, 1] is 3e-8
    expect(Array.from(m.stiffness).map((v) => v / k)).toEqual([1, -1, -1, 1].map((v) => expect.closeTo(v, 12)))
    const c = (rho * Ip * h) / 6
    expect(Array.from(m.mass).map((v) => v / c)).toEqual([2, 1, 1, 2].map((v) => expect.closeTo(v, 12)))
  })

  test('constant stiffness, linearly varying inertia a → b: M = ρh/12 [3a + b, a + b; a + b, a + 3b]', () => {
    // ∫(1 − t)²(a + (b − a)t) dt = (3a + b)/12 and the like (derived here).
    const a = 4e-8
    const b = 1e-8
    const m = barElementMatrices(1, h, G, rho, { uniformArea: 2e-8 }, 'consistent', (t) => a + (b - a) * t)
    const c = (rho * h) / 12
    const expected = [3 * a + b, a + b, a + b, a + 3 * b].map((v) => c * v)
    m.mass.forEach((v, i) => expectRelative(v, expected[i], 1e-12, `M[${i}]`))
    const k = (G * 2e-8) / h
    m.stiffness.forEach((v, i) => expectRelative(v, [k, -k, -k, k][i], 1e-12, `K[${i}]`))
  })
})

describe('bending element: mixed mass', () => {
  const h = 0.3
  const rhoA = 9.5
  const section: BeamElementSection = { bendingStiffness: () => 1e4, massPerLength: () => rhoA, rotaryInertiaPerLength: () => 0, shearStiffness: () => 1e8 }
  test('the mean of the consistent ρAh/420[156 22h 54 −13h; …] and the HRZ diagonal ρAh/2, ρAh³/78', () => {
    const c = (rhoA * h) / 420
    const consistent = [
      [156, 22 * h, 54, -13 * h],
      [22 * h, 4 * h * h, 13 * h, -3 * h * h],
      [54, 13 * h, 156, -22 * h],
      [-13 * h, -3 * h * h, -22 * h, 4 * h * h],
    ].map((r) => r.map((v) => c * v))
    const lumped = [(rhoA * h) / 2, (rhoA * h ** 3) / 78, (rhoA * h) / 2, (rhoA * h ** 3) / 78]
    const mixed = beamElementMatrices(h, section, 'euler-bernoulli', 'mixed').mass
    for (let a = 0; a < 4; a++) {
      for (let b = 0; b < 4; b++) {
        const want = 0.5 * (consistent[a][b] + (a === b ? lumped[a] : 0))
        expect(Math.abs(mixed[4 * a + b] - want), `M[${a}][${b}]: ${mixed[4 * a + b]} vs ${want}`).toBeLessThanOrEqual(1e-13 * 156 * c)
      }
    }
  })
})

describe('polar inertia of the bar', () => {
  test('a cone, a tube and a disk: ∫ρ(π/32)d⁴ dx by Simpson’s rule, ρ(π/32)(D⁴ − d⁴)L, plus the disk', () => {
    const project = makeProject({
      version: 2,
      motions: ['torsion'],
      materials: [{ ...STEEL, poissonRatio: 0.3 }],
      segments: [
        { length: 0.4, material: 'steel', section: { shape: 'cone', startDiameter: 0.05, endDiameter: 0.02 } },
        { length: 0.3, material: 'steel', section: { shape: 'tube', outerDiameter: 0.04, innerDiameter: 0.03 } },
        { length: 0.2, material: 'steel', section: { shape: 'cone', startDiameter: 0.03, endDiameter: 0.03 } },
      ],
      masses: [{ at: 0.9, mass: 1, polarInertia: 2e-4 }],
      ends: { start: { torsion: 'fixed' }, end: { torsion: 'free' } },
    })
    const rho = STEEL.density
    const n = 2000
    let simpson = 0
    for (let i = 0; i <= n; i++) {
      const t = i / n
      const d = 0.05 + (0.02 - 0.05) * t
      simpson += (i === 0 || i === n ? 1 : i % 2 ? 4 : 2) * d ** 4
    }
    const cone = rho * (Math.PI / 32) * (simpson / (3 * n)) * 0.4
    const tube = rho * (Math.PI / 32) * (0.04 ** 4 - 0.03 ** 4) * 0.3
    const straightCone = rho * (Math.PI / 32) * 0.03 ** 4 * 0.2
    expectRelative(totalPolarInertia(project), cone + tube + straightCone + 2e-4, 1e-12, 'total polar inertia')
  })
})
