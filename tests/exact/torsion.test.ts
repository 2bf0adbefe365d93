/**
 * Torsion through the exact chain (core/exact/torsion-chain.ts), each check against a
 * published formula or an independent computation:
 * - uniform shaft, c = √(G/ρ): fixed–free f_n = (2n − 1)c/(4L), fixed–fixed n c/(2L),
 *   free–free 0 then n c/(2L) (S. S. Rao, Mechanical Vibrations, torsional vibration of
 *   shafts, from memory);
 * - fixed–free shaft with a tip disk: β tan β = J_shaft/J_disk, J_shaft = ρIpL (Rao, same
 *   section, from memory), roots by bisection here;
 * - two disks on a shaft, free–free: on a light shaft ω² = k_t (J₁ + J₂)/(J₁J₂), k_t = GJ/L
 *   (Rao, torsional systems, from memory); with the shaft's inertia μ = ρIpL, θ = A cos kx +
 *   B sin kx with the disks' equations T(0) = −ω²J₁θ(0), T(L) = ω²J₂θ(L) gives
 *   (λ²r₁r₂ − 1) sin λ = λ(r₁ + r₂) cos λ, r = J/μ, λ = kL (derived here), whose expansion
 *   for small μ is ω² = k_t (J₁ + J₂)/(J₁J₂) · [1 + μ/(J₁ + J₂) − μ(J₁ + J₂)/(3J₁J₂) + O(μ²)];
 * - a rectangular shaft: c = √(GJ/(ρIp)) with Saint-Venant's J ≠ Ip = bh(b² + h²)/12;
 * - solid cones (J, Ip ∝ d⁴), alone and with disks, springs and prismatic segments, against RK4
 *   shooting on (GJ θ′)′ + ω² ρIp θ = 0 with Richardson extrapolation (tests/exact/independent.ts);
 *   mode shapes against the same integration; Rayleigh's quotient of the exact shape equals ω²
 *   (Lord Rayleigh, The Theory of Sound, from memory); the Wittrick–Williams count against the
 *   number of RK4 roots below ω.
 */
import { describe, expect, test } from 'vitest'
import { exactModeShape, memberStateAt, modeEnergies } from '../../core/exact/exact-mode-shape'
import { torsionExactReference, torsionStationChain, type TorsionChainInput, type TorsionSegment } from '../../core/exact/torsion-chain'
import { exactAngularFrequencies, frequenciesBelow } from '../../core/exact/wittrick-williams'
import { rectangleTorsionConstant } from '../../core/model/saint-venant-torsion'
import { expectRelative } from '../helpers'
import { bisect, integratePiece, rk4Frequencies, type TestChain, type TestPiece } from './independent'

const G = 80e9
const RHO = 7850
const C = Math.sqrt(G / RHO)
const polar = (d: number) => (Math.PI * d ** 4) / 32

function roundSegment(length: number, d: number, diameterRatio = 1): TorsionSegment {
  return { length, shearModulus: G, density: RHO, torsionConstant: polar(d), polarMoment: polar(d), diameterRatio }
}
function shaft(partial: Partial<TorsionChainInput> & Pick<TorsionChainInput, 'segments'>): TorsionChainInput {
  return { disks: [], springs: [], ends: { start: 'fixed', end: 'free' }, ...partial }
}

describe('uniform round shaft', () => {
  const L = 1.2
  const d = 0.04
  test.each([
    ['fixed', 'free', (n: number) => ((2 * n - 1) * C) / (4 * L)],
    ['free', 'fixed', (n: number) => ((2 * n - 1) * C) / (4 * L)],
    ['fixed', 'fixed', (n: number) => (n * C) / (2 * L)],
    ['free', 'free', (n: number) => ((n - 1) * C) / (2 * L)],
  ] as const)('%s–%s: 8 modes to 1e-12', (start, end, formula) => {
    const reference = torsionExactReference(shaft({ segments: [roundSegment(L, d)], ends: { start, end } }), 8)
    reference.frequenciesHz.forEach((f, i) => (formula(i + 1) === 0 ? expect(f).toBe(0) : expectRelative(f, formula(i + 1), 1e-12, `f${i + 1}`)))
  })
})

describe('fixed–free shaft with a tip disk: β tan β = J_shaft/J_disk', () => {
  test.each([0.3, 1, 4])('J_shaft/J_disk = %f: 6 modes to 1e-12', (ratio) => {
    const L = 0.8
    const d = 0.03
    const shaftInertia = RHO * polar(d) * L
    const reference = torsionExactReference(shaft({ segments: [roundSegment(L, d)], disks: [{ at: L, polarInertia: shaftInertia / ratio }] }), 6)
    reference.frequenciesHz.forEach((f, i) => {
      const beta = bisect((x) => x * Math.sin(x) - ratio * Math.cos(x), i * Math.PI, (i + 0.5) * Math.PI)
      expectRelative(f, (beta * C) / (2 * Math.PI * L), 1e-12, `f${i + 1}`)
    })
    if (ratio === 1) expect(Math.abs((2 * Math.PI * reference.frequenciesHz[0] * L) / C - 0.8603)).toBeLessThan(5e-5) // Rao's table, from memory
  })
})

describe('two disks on a shaft, free–free', () => {
  const L = 0.5
  const d = 0.02
  const kt = (G * polar(d)) / L
  const mu = RHO * polar(d) * L
  const [J1, J2] = [0.05, 0.02]
  const input = shaft({
    segments: [roundSegment(L, d)],
    disks: [
      { at: 0, polarInertia: J1 },
      { at: L, polarInertia: J2 },
    ],
    ends: { start: 'free', end: 'free' },
  })
  const reference = torsionExactReference(input, 4)

  test('the rigid rotation, then the frequency equation (λ²r₁r₂ − 1) sin λ = λ(r₁ + r₂) cos λ to 1e-12', () => {
    expect(reference.frequenciesHz[0]).toBe(0)
    const [r1, r2] = [J1 / mu, J2 / mu]
    const g = (x: number) => (x * x * r1 * r2 - 1) * Math.sin(x) - x * (r1 + r2) * Math.cos(x)
    // One root per branch: the first below π/2 (tan λ > 0 needs λ²r₁r₂ > 1), then one in each (nπ, (n + 1)π).
    const first = bisect(g, 1 / Math.sqrt(r1 * r2), Math.PI / 2)
    expectRelative(reference.frequenciesHz[1], (first * C) / (2 * Math.PI * L), 1e-12, 'f2')
    for (let n = 1; n <= 2; n++) {
      const lambda = bisect(g, n * Math.PI, n * Math.PI + Math.PI / 2)
      expectRelative(reference.frequenciesHz[n + 1], (lambda * C) / (2 * Math.PI * L), 1e-12, `f${n + 2}`)
    }
  })

  test('light-shaft formula, and its first-order shaft-inertia correction', () => {
    const exact = (2 * Math.PI * reference.frequenciesHz[1]) ** 2
    const light = (kt * (J1 + J2)) / (J1 * J2)
    const corrected = light * (1 + mu / (J1 + J2) - (mu * (J1 + J2)) / (3 * J1 * J2))
    const lightError = Math.abs(exact - light) / exact
    const correctedError = Math.abs(exact - corrected) / exact
    // μ/J ≈ 1e-3 here: the light-shaft formula is off by O(μ/J), the corrected one by O((μ/J)²).
    expect(mu / J2).toBeGreaterThan(1e-4)
    expect(lightError).toBeLessThan(3 * (mu / J2))
    expect(lightError).toBeGreaterThan(0.1 * (mu / (J1 + J2)))
    expect(correctedError).toBeLessThan(3 * (mu / J2) ** 2)
  })
})

describe('rectangular shaft: c = √(GJ/(ρIp)), J from Saint-Venant, Ip = bh(b² + h²)/12', () => {
  test('fixed–free, 5 modes to 1e-12', () => {
    const [b, h, L] = [0.05, 0.02, 0.9]
    const J = rectangleTorsionConstant(b, h)
    const Ip = (b * h * (b * b + h * h)) / 12
    const reference = torsionExactReference(shaft({ segments: [{ length: L, shearModulus: G, density: RHO, torsionConstant: J, polarMoment: Ip, diameterRatio: 1 }] }), 5)
    const c = Math.sqrt((G * J) / (RHO * Ip))
    expect(c / C).toBeLessThan(0.8) // J is well below Ip for a 5:2 rectangle
    reference.frequenciesHz.forEach((f, i) => expectRelative(f, ((2 * i + 1) * c) / (4 * L), 1e-12, `f${i + 1}`))
  })
})

/** The same shaft for the RK4 solver: pieces between stations. */
function testChain(input: TorsionChainInput, cuts: number[]): TestChain {
  // Stations: segment boundaries plus `cuts` (disk and spring positions inside segments).
  const bounds = [0]
  for (const s of input.segments) bounds.push(bounds[bounds.length - 1] + s.length)
  const stations = [...new Set([...bounds, ...cuts])].sort((a, b) => a - b)
  const pieces = stations.slice(1).map((x1, i) => {
    const x0 = stations[i]
    const s = bounds.findIndex((b, j) => j + 1 < bounds.length && b <= x0 && x0 < bounds[j + 1])
    const seg = input.segments[s]
    const t0 = (x0 - bounds[s]) / seg.length
    const t1 = (x1 - bounds[s]) / seg.length
    const d0 = 1 + (seg.diameterRatio - 1) * t0
    const d1 = 1 + (seg.diameterRatio - 1) * t1
    return { length: x1 - x0, stiffness: seg.shearModulus * seg.torsionConstant * d0 ** 4, inertia: seg.density * seg.polarMoment * d0 ** 4, ratio: d1 / d0, power: 4 as const }
  })
  const at = (x: number) => stations.findIndex((s) => Math.abs(s - x) < 1e-12)
  const springs = stations.map(() => 0)
  const masses = stations.map(() => 0)
  for (const disk of input.disks) masses[at(disk.at)] += disk.polarInertia
  for (const spring of input.springs) springs[at(spring.at)] += spring.stiffness
  return { pieces, springs, masses, fixedStart: input.ends.start === 'fixed', fixedEnd: input.ends.end === 'fixed' }
}

const CONES: [string, TorsionChainInput, number[]][] = [
  ['tapering cone, fixed–free', shaft({ segments: [roundSegment(0.7, 0.05, 0.4)] }), []],
  ['expanding cone, fixed–fixed', shaft({ segments: [roundSegment(0.6, 0.02, 3)], ends: { start: 'fixed', end: 'fixed' } }), []],
  [
    'prismatic + cone + prismatic with two disks and a spring, free–free',
    shaft({
      segments: [roundSegment(0.4, 0.04), roundSegment(0.3, 0.04, 0.5), roundSegment(0.5, 0.02)],
      disks: [
        { at: 0, polarInertia: 2e-3 },
        { at: 0.55, polarInertia: 5e-4 },
      ],
      springs: [{ at: 1.2, stiffness: 3e3 }],
      ends: { start: 'free', end: 'free' },
    }),
    [0.55],
  ],
  [
    'cone with a mid-span disk and a spring, free–fixed',
    shaft({
      segments: [roundSegment(1.0, 0.06, 0.3)],
      disks: [{ at: 0.35, polarInertia: 1e-3 }],
      springs: [{ at: 0, stiffness: 1e4 }],
      ends: { start: 'free', end: 'fixed' },
    }),
    [0.35],
  ],
]

describe('solid cones in torsion against RK4 shooting with Richardson extrapolation', () => {
  test.each(CONES)('%s: 6 modes to 1e-12', (_, input, cuts) => {
    const omegas = exactAngularFrequencies(torsionStationChain(input), 6)
    const rigid = omegas[0] === 0 ? 1 : 0
    const independent = rk4Frequencies(testChain(input, cuts), omegas[5] * 1.04)
    expect(independent.length).toBe(6 - rigid)
    independent.forEach((w, i) => expectRelative(omegas[i + rigid], w, 1e-12, `ω${i + 1 + rigid}`))
  })

  test.each(CONES)('%s: the Wittrick–Williams count against the RK4 roots below ω', (_, input, cuts) => {
    const chain = torsionStationChain(input)
    const omegas = exactAngularFrequencies(chain, 6)
    const rigid = omegas[0] === 0 ? 1 : 0
    const roots = rk4Frequencies(testChain(input, cuts), omegas[5] * 1.04, { steps: 300 })
    for (let i = 1; i <= 40; i++) {
      const w = (omegas[5] * 1.03 * i) / 40
      const below = rigid + roots.filter((r) => r < w).length
      if (roots.some((r) => Math.abs(r - w) < 1e-6 * w)) continue
      expect(frequenciesBelow(chain, w), `ω = ${w}`).toBe(below)
    }
  })

  test.each(CONES)('%s: exact mode shapes match RK4 at every station; Rayleigh quotient = ω²', (_, input, cuts) => {
    const chain = torsionStationChain(input)
    const tc = testChain(input, cuts)
    expect(chain.members.length).toBe(tc.pieces.length)
    for (const omega of exactAngularFrequencies(chain, 4).filter((w) => w > 0)) {
      const shape = exactModeShape(chain, omega)
      // RK4 from the same start state, 1000 and 2000 steps per piece, Richardson-extrapolated,
      // compared at stations and at interior points of every member.
      const rk4 = (piece: TestPiece, y0: number, f0: number) => {
        const coarse = integratePiece(piece, omega, y0, f0, 1000)
        const fine = integratePiece(piece, omega, y0, f0, 2000)
        return fine.map((v, j) => v + (v - coarse[j]) / 15)
      }
      let y = tc.fixedStart ? 0 : 1
      let f = tc.fixedStart ? 1 : tc.springs[0] - omega * omega * tc.masses[0]
      const compared: [number, number, string][] = []
      tc.pieces.forEach((piece, i) => {
        for (const t of [0.25, 0.5, 0.75]) {
          const x = t * piece.length
          const part = { ...piece, length: x, ratio: 1 + (piece.ratio - 1) * t }
          const [yx] = rk4(part, y, f)
          compared.push([yx, memberStateAt(chain.members[i], shape.members[i], omega, x).u, `member ${i}, x = ${x}`])
        }
        ;[y, f] = rk4(piece, y, f)
        f += (tc.springs[i + 1] - omega * omega * tc.masses[i + 1]) * y
        compared.push([y, shape.stationDisplacement[i + 1], `station ${i + 1}`])
      })
      const scale = Math.max(...compared.map(([a]) => Math.abs(a)))
      for (const [rk4, exact, where] of compared) expect(Math.abs(rk4 - exact) / scale, `ω ${omega}, ${where}: RK4 ${rk4}, exact ${exact}`).toBeLessThan(1e-12)
      const e = modeEnergies(chain, omega)
      let numerator = e.strain.reduce((a, b) => a + b, 0)
      shape.stationDisplacement.forEach((u, s) => (numerator += chain.stationStiffness[s] * u * u))
      expectRelative(numerator / e.denominator, omega * omega, 1e-13, `Rayleigh quotient at ω ${omega}`)
    }
  })
})

describe('torsion input checks', () => {
  const good = roundSegment(1, 0.03)
  test.each([
    [{ segments: [{ ...good, torsionConstant: 0 }] }, /segments\[0\]\.torsionConstant must be a positive number/],
    [{ segments: [good, { ...good, polarMoment: Number.NaN }] }, /segments\[1\]\.polarMoment/],
    [{ segments: [{ ...good, diameterRatio: -2 }] }, /segments\[0\]\.diameterRatio/],
    [{ segments: [good], disks: [{ at: 1.5, polarInertia: 1 }] }, /disks\[0\]\.at must lie on the shaft/],
    [{ segments: [good], springs: [{ at: 0.5, stiffness: -1 }] }, /springs\[0\]\.stiffness must be a positive number/],
    [{ segments: [] }, /at least one segment/],
    // A disk of no inertia or a spring of no stiffness is no attachment: refused, not ignored.
    [{ segments: [good], disks: [{ at: 0.5, polarInertia: 0 }] }, /^disks\[0\]\.polarInertia must be a positive number \(kg·m²\), got 0$/],
    [{ segments: [good], springs: [{ at: 0.5, stiffness: 0 }] }, /^springs\[0\]\.stiffness must be a positive number \(N·m\/rad\), got 0$/],
    [{ segments: [good], ends: { start: 'fixed', end: 'guided' } }, /^ends\.end must be "fixed" or "free" for torsion$/],
  ])('%o is refused with the field named', (partial, message) => {
    expect(() => torsionStationChain(shaft(partial as Parameters<typeof shaft>[0]))).toThrow(message)
  })
})
