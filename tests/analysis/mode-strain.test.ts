/**
 * Strain and stress of the modes (modeStrain, fieldStrain) and the section along the bar,
 * against the closed-form mode shapes (docs/verification.md §1; S. S. Rao, Mechanical
 * Vibrations, continuous systems, from memory): mass-normalised, a fixed–free bar's mode n is
 * φ = √(2/m) sin kx with k = (2n − 1)π/2L, so its strain is √(2/m) k cos kx and its stress E times
 * that; a shaft's twist the same with the polar inertia ρI_pL for m, its largest shear stress
 * G (d/2) θ′ on a round section; a pinned–pinned beam's mode n is √(2/m) sin(nπx/L), its curvature
 * −(nπ/L)² times that and its stress at the surface E (d/2) κ. On a rectangle in torsion the
 * largest shear stress is k G θ′ b (b the short side; k = 0.675 for a square: S. P. Timoshenko &
 * J. N. Goodier, Theory of Elasticity, torsion of rectangular bars, table, from memory).
 */
import { describe, expect, test } from 'vitest'
import { analyseProject, areaAlongBar, fieldStrain, modeStrain, torsionConstantAlongBar, type FamilyAnalysis } from '../../core/analysis/modal-analysis'
import type { Project } from '../../core/model/project'
import { expectRelative, makeProject, STEEL } from '../helpers'

const E = STEEL.youngsModulus
const RHO = STEEL.density
const NU = 0.3
const G = E / (2 * (1 + NU))

function part(doc: Record<string, unknown>): Project {
  return makeProject({ version: 2, materials: [{ ...STEEL, poissonRatio: NU }], ...doc })
}

/** The sign that makes the finite-element mode agree with +√(2/m) sin kx next to the fixed start (sin kx > 0 there). */
function signOf(analysis: FamilyAnalysis, index: number): number {
  return Math.sign(analysis.vectors[index][0])
}

describe('axial strain and stress of a fixed–free bar', () => {
  const L = 1.3
  const d = 0.024
  const A = (Math.PI / 4) * d * d
  const m = RHO * A * L
  const bar = part({ segments: [{ length: L, material: 'steel', section: { shape: 'solid', diameter: d } }], ends: { start: 'fixed', end: 'free' } })

  test('2-node elements: each element’s strain is the secant slope of the exact mode over it, to 5e-5', () => {
    const N = 400
    const h = L / N
    const analysis = analyseProject(bar, { elementOrder: 1, elementsPerSegment: N, mass: 'consistent', modes: 3 }, { withReference: false }).families[0]
    for (const mode of [1, 2, 3]) {
      const k = ((2 * mode - 1) * Math.PI) / (2 * L)
      const s = signOf(analysis, mode - 1) * Math.sqrt(2 / m)
      const { x, strain, stress } = modeStrain(analysis, mode - 1)
      expect(x.length).toBe(2 * N)
      const peak = s * k
      for (let e = 0; e < N; e++) {
        expect(x[2 * e]).toBeCloseTo(e * h, 12)
        expect(x[2 * e + 1]).toBeCloseTo((e + 1) * h, 12)
        const secant = (s * (Math.sin(k * (e + 1) * h) - Math.sin(k * e * h))) / h
        for (const j of [2 * e, 2 * e + 1]) {
          expect(Math.abs(strain[j] - secant), `mode ${mode}, element ${e}: strain ${strain[j]}, secant ${secant}`).toBeLessThanOrEqual(5e-5 * Math.abs(peak))
          expectRelative(stress[j], E * strain[j], 1e-14, `mode ${mode}, element ${e}: stress`)
        }
      }
    }
  })

  test('3-node elements: strains at the element ends match √(2/m) k cos kx to 1e-4 of the peak', () => {
    const N = 200
    const analysis = analyseProject(bar, { elementOrder: 2, elementsPerSegment: N, mass: 'consistent', modes: 2 }, { withReference: false }).families[0]
    for (const mode of [1, 2]) {
      const k = ((2 * mode - 1) * Math.PI) / (2 * L)
      const s = signOf(analysis, mode - 1) * Math.sqrt(2 / m)
      const { x, strain } = modeStrain(analysis, mode - 1)
      expect(x.length).toBe(2 * N)
      x.forEach((at, j) => {
        const exact = s * k * Math.cos(k * at)
        expect(Math.abs(strain[j] - exact), `mode ${mode} at ${at} m: strain ${strain[j]}, exact ${exact}`).toBeLessThanOrEqual(1e-4 * k * Math.sqrt(2 / m))
      })
      // The two ends of each element are not the same point: start then end.
      expect(x[1] - x[0]).toBeCloseTo(L / N, 12)
    }
  })

  test('any vector: the strain of a linear field u = εx is ε everywhere, and stress follows each segment’s own modulus', () => {
    const aluminium = { id: 'al', youngsModulus: 69e9, density: 2700 }
    const stepped = makeProject({
      version: 2,
      materials: [STEEL, aluminium],
      segments: [
        { length: 0.5, material: 'steel', section: { shape: 'solid', diameter: 0.03 } },
        { length: 0.7, material: 'al', section: { shape: 'tube', outerDiameter: 0.04, innerDiameter: 0.02 } },
      ],
      ends: { start: 'fixed', end: 'free' },
    })
    for (const elementOrder of [1, 2] as const) {
      const analysis = analyseProject(stepped, { elementOrder, elementsPerSegment: 7, mass: 'consistent', modes: 2 }, { withReference: false }).families[0]
      const epsilon = 2.5e-4
      const field = Float64Array.from(analysis.model.dofNodes, (node) => epsilon * analysis.model.mesh.x[node])
      const { x, strain, stress } = fieldStrain(analysis, field)
      strain.forEach((value, j) => {
        expectRelative(value, epsilon, 1e-12, `order ${elementOrder}, point ${j}: strain`)
        const inSteel = x[j] < 0.5 || (x[j] === 0.5 && j % 2 === 1)
        expectRelative(stress[j], epsilon * (inSteel ? E : aluminium.youngsModulus), 1e-12, `order ${elementOrder}, point ${j} at ${x[j]} m: stress`)
      })
    }
  })
})

describe('torsion: twist rate and shear stress', () => {
  const L = 0.8
  test('round shaft: θ′ against √(2/(ρI_pL)) k cos kx, shear stress G (d/2) θ′', () => {
    const d = 0.05
    const Ip = (Math.PI / 32) * d ** 4
    const shaft = part({
      motions: ['torsion'],
      segments: [{ length: L, material: 'steel', section: { shape: 'solid', diameter: d } }],
      ends: { start: { torsion: 'fixed' }, end: { torsion: 'free' } },
    })
    const analysis = analyseProject(shaft, { elementOrder: 2, elementsPerSegment: 100, mass: 'consistent', modes: 2 }, { withReference: false }).families[0]
    const k = Math.PI / (2 * L)
    const s = signOf(analysis, 0) * Math.sqrt(2 / (RHO * Ip * L))
    const { x, strain, stress } = modeStrain(analysis, 0)
    x.forEach((at, j) => {
      expect(Math.abs(strain[j] - s * k * Math.cos(k * at)), `at ${at} m: ${strain[j]}`).toBeLessThanOrEqual(1e-4 * Math.abs(s * k))
      expectRelative(stress[j], G * (d / 2) * strain[j], 1e-12, `at ${at} m: shear stress`)
    })
  })

  test('cone, tube, square, and a section given by its constants: the radius (or factor) that each uses', () => {
    const shaft = part({
      motions: ['torsion'],
      segments: [
        { length: 0.3, material: 'steel', section: { shape: 'cone', startDiameter: 0.06, endDiameter: 0.03 } },
        { length: 0.2, material: 'steel', section: { shape: 'tube', outerDiameter: 0.05, innerDiameter: 0.03 } },
        { length: 0.25, material: 'steel', section: { shape: 'rectangle', width: 0.03, height: 0.03 } },
        { length: 0.2, material: 'steel', section: { shape: 'area', area: 7e-4, torsionConstant: 8e-8, polarMoment: 9e-8 } },
      ],
      ends: { start: { torsion: 'fixed' }, end: { torsion: 'free' } },
    })
    const analysis = analyseProject(shaft, { elementOrder: 1, elementsPerSegment: 6, mass: 'consistent', modes: 1 }, { withReference: false }).families[0]
    // A uniform twist rate: θ = κx.
    const rate = 0.01
    const field = Float64Array.from(analysis.model.dofNodes, (node) => rate * analysis.model.mesh.x[node])
    const { x, strain, stress } = fieldStrain(analysis, field)
    x.forEach((at, j) => {
      expectRelative(strain[j], rate, 1e-12, `twist rate at ${at} m`)
      const end = j % 2 === 1
      if (at < 0.3 || (at === 0.3 && end)) {
        const diameter = 0.06 + (0.03 - 0.06) * (at / 0.3)
        expectRelative(stress[j], G * (diameter / 2) * rate, 1e-12, `cone at ${at} m`)
      } else if (at < 0.5 || (Math.abs(at - 0.5) < 1e-12 && end)) {
        expectRelative(stress[j], G * 0.025 * rate, 1e-12, `tube at ${at} m`)
      } else if (at < 0.75 || (Math.abs(at - 0.75) < 1e-12 && end)) {
        expectRelative(stress[j], 0.675 * G * 0.03 * rate, 2e-3, `square at ${at} m`)
      } else {
        expect(stress[j], `given constants only, at ${at} m: no radius`).toBeNaN()
      }
    })
  })
})

describe('bending: curvature and surface stress', () => {
  test('pinned–pinned beam: κ against −(nπ/L)²√(2/m) sin(nπx/L), stress E (d/2) κ, both planes of a rectangle', () => {
    const L = 1.4
    const d = 0.03
    const A = (Math.PI / 4) * d * d
    const m = RHO * A * L
    const beam = part({
      motions: ['bending'],
      segments: [{ length: L, material: 'steel', section: { shape: 'solid', diameter: d } }],
      ends: { start: { bending: 'pinned' }, end: { bending: 'pinned' } },
    })
    const analysis = analyseProject(beam, { elementsPerSegment: 120, mass: 'consistent', modes: 2 }, { withReference: false }).families[0]
    for (const mode of [1, 2]) {
      const q = (mode * Math.PI) / L
      const { x, strain, stress } = modeStrain(analysis, mode - 1)
      // Sign from the curvature near the first quarter-wave, where sin is positive.
      const probe = x.findIndex((at) => at > 0.25 * (L / mode))
      const s = -Math.sign(strain[probe]) * Math.sqrt(2 / m)
      x.forEach((at, j) => {
        const exact = -q * q * s * Math.sin(q * at)
        expect(Math.abs(strain[j] - exact), `mode ${mode} at ${at} m: κ ${strain[j]}, exact ${exact}`).toBeLessThanOrEqual(2e-3 * q * q * Math.sqrt(2 / m))
        expectRelative(stress[j], E * (d / 2) * strain[j], 1e-12, `mode ${mode} at ${at} m: stress`)
      })
    }
  })

  test('a rectangle: the weak plane strains the thin side, the strong plane the wide one', () => {
    const beam = part({
      motions: ['bending'],
      segments: [{ length: 1, material: 'steel', section: { shape: 'rectangle', width: 0.05, height: 0.02 } }],
      ends: { start: { bending: 'pinned' }, end: { bending: 'pinned' } },
    })
    const analysis = analyseProject(beam, { elementsPerSegment: 40, mass: 'consistent', modes: 1 }, { withReference: false })
    const half = { 'bending-weak': 0.01, 'bending-strong': 0.025 } as Record<string, number>
    expect(analysis.families.map((f) => f.family.key).sort()).toEqual(['bending-strong', 'bending-weak'])
    for (const f of analysis.families) {
      const { strain, stress } = modeStrain(f, 0)
      strain.forEach((value, j) => {
        if (Math.abs(value) > 1e-9 * Math.max(...strain.map(Math.abs))) expectRelative(stress[j], E * half[f.family.key] * value, 1e-12, `${f.family.key} point ${j}`)
      })
    }
  })
})

describe('section along the bar', () => {
  const stepped = part({
    segments: [
      { length: 0.4, material: 'steel', section: { shape: 'solid', diameter: 0.04 } },
      { length: 0.6, material: 'steel', section: { shape: 'cone', startDiameter: 0.04, endDiameter: 0.02 } },
      { length: 0.5, material: 'steel', section: { shape: 'area', area: 3e-4 } },
    ],
  })
  const circle = (dia: number) => (Math.PI / 4) * dia * dia
  test('area: each segment’s own, the cone’s by its diameter, the ends held to the part', () => {
    expectRelative(areaAlongBar(stepped, -0.1), circle(0.04), 1e-14, 'before the start')
    expectRelative(areaAlongBar(stepped, 0.2), circle(0.04), 1e-14, 'first segment')
    expectRelative(areaAlongBar(stepped, 0.4), circle(0.04), 1e-14, 'at the first joint: the first segment’s')
    expectRelative(areaAlongBar(stepped, 0.55), circle(0.04 - 0.02 * (0.15 / 0.6)), 1e-12, 'inside the cone')
    expectRelative(areaAlongBar(stepped, 1.0), circle(0.02), 1e-12, 'end of the cone')
    expectRelative(areaAlongBar(stepped, 1.2), 3e-4, 1e-14, 'last segment')
    expectRelative(areaAlongBar(stepped, 9), 3e-4, 1e-14, 'beyond the end')
  })
  test('torsion constant: πd⁴/32 on round sections, undefined where the section does not give it', () => {
    expectRelative(torsionConstantAlongBar(stepped, 0.1)!, (Math.PI / 32) * 0.04 ** 4, 1e-14, 'solid')
    expectRelative(torsionConstantAlongBar(stepped, 0.7)!, (Math.PI / 32) * (0.04 - 0.02 * 0.5) ** 4, 1e-12, 'cone half-way')
    expect(torsionConstantAlongBar(stepped, 1.2)).toBeUndefined()
    expect(torsionConstantAlongBar(stepped, 5)).toBeUndefined()
    expectRelative(torsionConstantAlongBar(stepped, -1)!, (Math.PI / 32) * 0.04 ** 4, 1e-14, 'before the start')
  })
})
