/**
 * Near-rigid modes: a free–free part held by a very soft spring rings at ω² ≈ k / m_total,
 * the rigid body on its spring. The expected values come from outside the solver:
 * - a uniform free–free bar with a spring k at x = L: u = cos(λx/L) satisfies N(0) = 0, and
 *   N(L) + k u(L) = 0 gives −(EA λ/L) sin λ + k cos λ = 0, i.e. λ tan λ = kL/EA (the same
 *   equation as the tip mass of S. S. Rao, Mechanical Vibrations, longitudinal vibration of
 *   bars, from memory), solved here by bisection; for small r = kL/EA, λ² = r − r²/3 + …,
 *   so f = √(k/m)/2π · (1 − r/6 + …);
 * - any part with k ≪ its own stiffness: f = √(k/m_total)/2π, the first correction being of
 *   relative order k × (the part's flexibility ∫dx/S), ≤ 2e-12 for the springs below;
 * - the same for torsion: f = √(k_t / J_total)/2π with J_total = ∫ρIp dx + Σ disks.
 */
import { describe, expect, test } from 'vitest'
import { exactReference, stationChain } from '../../core/exact/reference'
import { torsionExactReference } from '../../core/exact/torsion-chain'
import { frequenciesBelow } from '../../core/exact/wittrick-williams'
import { expectRelative, makeProject, uniformBar } from '../helpers'
import { bisect } from './independent'

const E = 200e9
const RHO = 7850
const L = 1
const D = 0.02
const AREA = (Math.PI / 4) * D * D
const BAR_MASS = RHO * AREA * L

/** Lowest root of λ tan λ = r in (0, π/2), by bisection on λ sin λ − r cos λ. */
function springRoot(r: number): number {
  return bisect((x) => x * Math.sin(x) - r * Math.cos(x), 0, Math.PI / 2)
}

describe('free–free uniform bar on one spring at its end (λ tan λ = kL/EA)', () => {
  test.each([1e-6, 1e-3, 1, 1e3, 1e6, 1e8])('k = %f N/m: first mode to 1e-12', (k) => {
    const project = uniformBar({ length: L, diameter: D, start: 'free', end: 'free', extra: { springs: [{ at: L, stiffness: k }] } })
    const reference = exactReference(project, 3)
    const lambda = springRoot((k * L) / (E * AREA))
    const expected = (lambda * Math.sqrt(E / RHO)) / (2 * Math.PI * L)
    expectRelative(reference.frequenciesHz[0], expected, 1e-12, 'f1')
  })

  test('k = 1e-6 N/m: within 1e-6 of √(k/m)/2π (the rigid bar on its spring), and so is the count', () => {
    const k = 1e-6
    const project = uniformBar({ length: L, diameter: D, start: 'free', end: 'free', extra: { springs: [{ at: L, stiffness: k }] } })
    const rigid = Math.sqrt(k / BAR_MASS) / (2 * Math.PI)
    const f1 = exactReference(project, 2).frequenciesHz[0]
    expectRelative(f1, rigid, 1e-6, 'f1')
    // The count of frequencies below ω must step exactly there (it used to step 1.2e-3 early).
    const chain = stationChain(project)
    const omega = 2 * Math.PI * rigid
    expect(frequenciesBelow(chain, omega * (1 - 1e-9))).toBe(0)
    expect(frequenciesBelow(chain, omega * (1 + 1e-9))).toBe(1)
    expect(frequenciesBelow(chain, omega * 0.999)).toBe(0)
  })
})

describe('stepped and tapered parts on a 1e-6 N/m spring: f = √(k/m_total)/2π to 1e-12', () => {
  const k = 1e-6
  // Masses from the geometry, written out here: a cone's volume is πL(d₀² + d₀d₁ + d₁²)/12.
  const cases: [string, Record<string, unknown>, number][] = [
    [
      'solid, tube and expanding cone, spring at the start',
      {
        segments: [
          { length: 0.5, material: 'steel', section: { shape: 'solid', diameter: 0.04 } },
          { length: 0.3, material: 'steel', section: { shape: 'tube', outerDiameter: 0.04, innerDiameter: 0.03 } },
          { length: 0.4, material: 'steel', section: { shape: 'cone', startDiameter: 0.02, endDiameter: 0.06 } },
        ],
        springs: [{ at: 0, stiffness: k }],
      },
      RHO * ((Math.PI / 4) * 0.04 ** 2 * 0.5 + (Math.PI / 4) * (0.04 ** 2 - 0.03 ** 2) * 0.3 + (Math.PI * 0.4 * (0.02 ** 2 + 0.02 * 0.06 + 0.06 ** 2)) / 12),
    ],
    [
      'tapering cone with two point masses, spring mid-span',
      {
        segments: [{ length: 0.8, material: 'steel', section: { shape: 'cone', startDiameter: 0.05, endDiameter: 0.01 } }],
        masses: [
          { at: 0, mass: 0.7 },
          { at: 0.8, mass: 0.25 },
        ],
        springs: [{ at: 0.4, stiffness: k }],
      },
      RHO * ((Math.PI * 0.8 * (0.05 ** 2 + 0.05 * 0.01 + 0.01 ** 2)) / 12) + 0.95,
    ],
  ]
  test.each(cases)('%s', (_, doc, mass) => {
    const project = makeProject({ materials: [{ id: 'steel', youngsModulus: E, density: RHO }], ends: { start: 'free', end: 'free' }, ...doc })
    const reference = exactReference(project, 2)
    expect(reference.formulation).toMatch(/transfer matrices/)
    expectRelative(reference.frequenciesHz[0], Math.sqrt(k / mass) / (2 * Math.PI), 1e-12, 'f1')
  })
})

describe('torsion: a free–free shaft with a disk on a 1e-9 N·m/rad spring', () => {
  test.each([1, 0.4])('diameter ratio %f: f = √(k/J_total)/2π to 1e-11', (ratio) => {
    const G = 79e9
    const d0 = 0.03
    const length = 0.9
    const ip0 = (Math.PI * d0 ** 4) / 32
    // ∫₀ᴸ Ip₀ (1 + (ρ_d − 1)x/L)⁴ dx = Ip₀ L (ρ_d⁵ − 1) / (5(ρ_d − 1)); Ip₀ L at ρ_d = 1.
    const shaftInertia = RHO * ip0 * length * (ratio === 1 ? 1 : (ratio ** 5 - 1) / (5 * (ratio - 1)))
    const disk = 0.02
    // ∫dx/GJ is 1.2e-3 rad/(N·m) for the tapered shaft: k × that ≈ 1e-12.
    const k = 1e-9
    const reference = torsionExactReference(
      {
        segments: [{ length, shearModulus: G, density: RHO, torsionConstant: ip0, polarMoment: ip0, diameterRatio: ratio }],
        disks: [{ at: length, polarInertia: disk }],
        springs: [{ at: 0.3, stiffness: k }],
        ends: { start: 'free', end: 'free' },
      },
      2,
    )
    expectRelative(reference.frequenciesHz[0], Math.sqrt(k / (shaftInertia + disk)) / (2 * Math.PI), 1e-11, 'f1')
  })
})
