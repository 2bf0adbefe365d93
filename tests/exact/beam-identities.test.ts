/**
 * Identities of the exact bending reference: the Wittrick–Williams count is non-decreasing and
 * steps by exactly one at each simple root; the member transfer matrix equals the closed-form
 * solution A cosh αx + B sinh αx + C cos βx + D sin βx (built in the test) and is symplectic; the
 * member dynamic stiffness is symmetric, reduces to the static beam stiffness at ω = 0, P = 0, and
 * its first derivatives in ω² and P are minus the consistent mass matrix and the geometric
 * stiffness matrix (J. S. Przemieniecki, Theory of Matrix Structural Analysis, beam elements,
 * from memory; here computed in the test from the energy functionals by quadrature); rigid-body
 * counts follow from the supports; bad input is refused naming the field.
 */
import { beforeAll, describe, expect, test } from 'vitest'
import { beamCriticalCompression } from '../../core/exact/beam-buckling'
import type { BeamChain, BeamMember } from '../../core/exact/beam-chain'
import { exactBeamAngularFrequencies } from '../../core/exact/beam-frequencies'
import { beamRigidBodyModes } from '../../core/exact/beam-rigid-body-modes'
import { beamMemberDynamicStiffness, beamMemberTransfer } from '../../core/exact/beam-transfer-matrix'
import { beamModesBelow } from '../../core/exact/beam-wittrick-williams'
import { expectRelative } from '../helpers'
import { beamChain, equationRoots, hermiteElement, uniformMembers } from './beam-test-helpers'

const rod = (diameter: number, length: number, youngsModulus = 205e9, density = 7850): BeamMember => ({
  length,
  bendingStiffness: (youngsModulus * Math.PI * diameter ** 4) / 64,
  massPerLength: (density * Math.PI * diameter ** 2) / 4,
})

const CHAINS: [string, BeamChain][] = [
  [
    'stepped clamped–free with a mass and a side spring',
    beamChain({ members: [rod(0.04, 0.5), rod(0.03, 0.7), rod(0.02, 0.6, 70e9, 2700)], start: 'clamped', end: 'free', stationMass: { 2: 1.5 }, stationSideStiffness: { 1: 2e5 } }),
  ],
  ['free–free in tension (one rigid-body mode)', beamChain({ members: [rod(0.03, 0.9), rod(0.05, 0.4)], start: 'free', end: 'free', axialForce: 8e3, stationRotaryInertia: { 1: 0.02 } })],
  ['pinned–guided in compression', beamChain({ members: [rod(0.03, 0.6), rod(0.03, 0.6)], start: 'pinned', end: 'guided', axialForce: -7e3, stationMass: { 1: 0.9 } })],
  ['uniform free–free cut in three (two rigid-body modes)', beamChain({ members: uniformMembers(1.4, 3e3, 4, [0.2, 0.55]), start: 'free', end: 'free' })],
]

describe.each(CHAINS)('the count J(ω) on %s', (_, chain) => {
  let omegas: number[] = []
  let rigid = 0
  beforeAll(() => {
    omegas = exactBeamAngularFrequencies(chain, 10)
    rigid = beamRigidBodyModes(chain)
  })
  test('is non-decreasing on a fine grid and never exceeds the roots found below ω', () => {
    let previous = 0
    const top = omegas[omegas.length - 1] * 0.999
    for (let omega = omegas[rigid] * 1e-3; omega < top; omega *= 1.01) {
      const j = beamModesBelow(chain, omega)
      expect(j, `J(${omega}) ≥ J at the previous point`).toBeGreaterThanOrEqual(previous)
      expect(j, `J(${omega}) counts the roots below`).toBe(omegas.filter((w) => w < omega).length)
      previous = j
    }
  })
  test('steps by exactly one at each returned root; J just above root n is n (rigid modes counted)', () => {
    for (let n = 1; n <= omegas.length; n++) {
      if (n <= rigid) {
        expect(omegas[n - 1]).toBe(0)
        continue
      }
      const w = omegas[n - 1]
      expect(beamModesBelow(chain, w * (1 - 1e-9)), `just below root ${n}`).toBe(n - 1)
      expect(beamModesBelow(chain, w * (1 + 1e-9)), `just above root ${n}`).toBe(n)
    }
    expect(beamModesBelow(chain, (omegas[rigid] || 1) * 1e-6), 'near zero: the rigid-body modes').toBe(rigid)
  })
})

describe('repeated roots', () => {
  /**
   * Two equal spans, clamped at the outer ends and held at the middle station by side and
   * rotational springs so stiff that the spans decouple to round-off: each clamped–clamped
   * frequency of one span (cos βℓ cosh βℓ = 1, Blevins, from memory) appears twice.
   */
  test.each([1e20, 1e30])('two clamped–clamped spans decoupled by springs %f × EI/ℓ³: each root twice, to 1e-14; J steps by two', (factor) => {
    const EI = 1000
    const rhoA = 2
    const l = 0.8
    const chain = beamChain({
      members: uniformMembers(2 * l, EI, rhoA, [0.5]),
      start: 'clamped',
      end: 'clamped',
      stationSideStiffness: { 1: (factor * EI) / l ** 3 },
      stationRotationalStiffness: { 1: (factor * EI) / l },
    })
    const betaL = equationRoots((x) => Math.cos(x) - 1 / Math.cosh(x), 4, 1)
    const omegas = exactBeamAngularFrequencies(chain, 8)
    betaL.forEach((x, n) => {
      const expected = x * x * Math.sqrt(EI / (rhoA * l ** 4))
      expectRelative(omegas[2 * n], expected, 1e-14, `root ${n + 1}, first copy`)
      expectRelative(omegas[2 * n + 1], expected, 1e-14, `root ${n + 1}, second copy`)
      expect(beamModesBelow(chain, expected * (1 - 1e-9)), `J below root ${n + 1}`).toBe(2 * n)
      expect(beamModesBelow(chain, expected * (1 + 1e-9)), `J above root ${n + 1}`).toBe(2 * n + 2)
    })
  })
})

describe('member transfer matrix against the closed-form solution (built in the test)', () => {
  /**
   * State (w, w′, P w′ − EI w''', EI w'') of the four solutions cosh αx, sinh αx, cos βx, sin βx,
   * α² = (P + √(P² + 4EI ρA ω²))/2EI, β² = (−P + √(P² + 4EI ρA ω²))/2EI; T = Φ(ℓ) Φ(0)⁻¹.
   */
  const closedForm = (member: BeamMember, P: number, omega: number): number[][] => {
    const { length: l, bendingStiffness: EI, massPerLength: m } = member
    const root = Math.sqrt(P * P + 4 * EI * m * omega * omega)
    const a = Math.sqrt((P + root) / (2 * EI))
    const b = Math.sqrt((-P + root) / (2 * EI))
    const state = (x: number): number[][] => {
      // columns: cosh αx, sinh αx, cos βx, sin βx; rows: w, w′, w'', w'''
      const derivatives = [
        [Math.cosh(a * x), Math.sinh(a * x), Math.cos(b * x), Math.sin(b * x)],
        [a * Math.sinh(a * x), a * Math.cosh(a * x), -b * Math.sin(b * x), b * Math.cos(b * x)],
        [a * a * Math.cosh(a * x), a * a * Math.sinh(a * x), -b * b * Math.cos(b * x), -b * b * Math.sin(b * x)],
        [a ** 3 * Math.sinh(a * x), a ** 3 * Math.cosh(a * x), b ** 3 * Math.sin(b * x), -(b ** 3) * Math.cos(b * x)],
      ]
      return [derivatives[0], derivatives[1], derivatives[1].map((d1, j) => P * d1 - EI * derivatives[3][j]), derivatives[2].map((d2) => EI * d2)]
    }
    const phi0 = state(0)
    const phiL = state(l)
    return multiply(phiL, invert4(phi0))
  }
  test.each([
    ['no axial force', 0, 900],
    ['tension', 3e4, 1500],
    ['compression', -2e4, 400],
    ['high tension, low frequency', 4e5, 20],
  ])('%s: every entry to 1e-11 of its row scale; symplectic (TᵀJT = J)', (_, P, omega) => {
    const member = rod(0.03, 0.8)
    const T = beamMemberTransfer(member, P, omega)
    const expected = closedForm(member, P, omega)
    for (let i = 0; i < 4; i++) {
      const scale = Math.max(...expected[i].map((v, j) => Math.abs(v) * [1, 0.8, 0.8 ** 3 / member.bendingStiffness, 0.8 ** 2 / member.bendingStiffness][j]))
      for (let j = 0; j < 4; j++) {
        const unit = [1, 0.8, 0.8 ** 3 / member.bendingStiffness, 0.8 ** 2 / member.bendingStiffness][j]
        expect(Math.abs(T[i * 4 + j] - expected[i][j]) * unit, `T[${i}][${j}]: ${T[i * 4 + j]} vs ${expected[i][j]}`).toBeLessThanOrEqual(1e-11 * scale)
      }
    }
    // Symplectic: T̂ᵀ J T̂ = J with J = [[0, I], [−I, 0]], for T̂ = S T S⁻¹ in the units S = diag(1, ℓ, ℓ³/EI, ℓ²/EI)
    // (which keep J: s₁s₃ = s₂s₄).
    const S = [1, 0.8, 0.8 ** 3 / member.bendingStiffness, 0.8 ** 2 / member.bendingStiffness]
    const t = (i: number, j: number) => (T[i * 4 + j] * S[i]) / S[j]
    const J = [
      [0, 0, 1, 0],
      [0, 0, 0, 1],
      [-1, 0, 0, 0],
      [0, -1, 0, 0],
    ]
    let size = 0
    for (let i = 0; i < 4; i++) for (let j = 0; j < 4; j++) size = Math.max(size, Math.abs(t(i, j)))
    for (let i = 0; i < 4; i++)
      for (let j = 0; j < 4; j++) {
        let sum = 0
        for (let k = 0; k < 4; k++) for (let q = 0; q < 4; q++) sum += t(k, i) * J[k][q] * t(q, j)
        expect(Math.abs(sum - J[i][j]), `(T̂ᵀJT̂)[${i}][${j}]`).toBeLessThanOrEqual(1e-13 * size * size)
      }
  })
})

describe('member dynamic stiffness', () => {
  const member = rod(0.025, 0.6)
  const { length: l, bendingStiffness: EI } = member
  const fe = hermiteElement(l, EI, member.massPerLength)
  const scaleOf = (matrix: number[][]) => Math.max(...matrix.flat().map(Math.abs))
  test('at ω = 0, P = 0: the static beam stiffness EI/ℓ³ [[12, 6ℓ, −12, 6ℓ], [6ℓ, 4ℓ², −6ℓ, 2ℓ²], …] to 1e-13', () => {
    const K = beamMemberDynamicStiffness(member, 0, 0)
    const c = EI / l ** 3
    const classic = [
      [12, 6 * l, -12, 6 * l],
      [6 * l, 4 * l * l, -6 * l, 2 * l * l],
      [-12, -6 * l, 12, -6 * l],
      [6 * l, 2 * l * l, -6 * l, 4 * l * l],
    ].map((row) => row.map((v) => v * c))
    const scale = scaleOf(classic)
    K.forEach((row, i) => row.forEach((v, j) => expect(Math.abs(v - classic[i][j]), `K[${i}][${j}]`).toBeLessThanOrEqual(1e-13 * scale)))
    K.forEach((row, i) => row.forEach((v, j) => expect(Math.abs(v - fe.k[i][j]), `K[${i}][${j}] vs quadrature`).toBeLessThanOrEqual(1e-12 * scale)))
  })
  test('symmetric at any ω and P (below the first clamped–clamped frequency and beyond it): K₁₁ and K₂₂ to 1e-12', () => {
    for (const [P, omega] of [
      [5e3, 300],
      [-3e3, 2500],
      [0, 9000],
    ]) {
      const K = beamMemberDynamicStiffness(member, P, omega)
      const scale = scaleOf(K)
      for (let i = 0; i < 4; i++) for (let j = 0; j < i; j++) expect(Math.abs(K[i][j] - K[j][i]), `P ${P}, ω ${omega}: K[${i}][${j}]`).toBeLessThanOrEqual(1e-12 * scale)
    }
  })
  test('dK/d(ω²) at 0 = −(consistent mass), dK/dP at 0 = geometric stiffness, to 1e-7', () => {
    // A forward difference in ω² (truncation relative ≈ ρAω²ℓ⁴/EI ≈ 1e-8 here) and a central one in P.
    const omega = 0.1
    const P = 1
    const K0 = beamMemberDynamicStiffness(member, 0, 0)
    const Kw = beamMemberDynamicStiffness(member, 0, omega)
    const KP = beamMemberDynamicStiffness(member, P, 0)
    const KmP = beamMemberDynamicStiffness(member, -P, 0)
    const massScale = scaleOf(fe.m)
    const geometricScale = scaleOf(fe.g)
    for (let i = 0; i < 4; i++)
      for (let j = 0; j < 4; j++) {
        const dMass = -(Kw[i][j] - K0[i][j]) / (omega * omega)
        expect(Math.abs(dMass - fe.m[i][j]), `−dK/dω² [${i}][${j}]: ${dMass} vs ${fe.m[i][j]}`).toBeLessThanOrEqual(1e-7 * massScale)
        const dGeometric = (KP[i][j] - KmP[i][j]) / (2 * P)
        expect(Math.abs(dGeometric - fe.g[i][j]), `dK/dP [${i}][${j}]: ${dGeometric} vs ${fe.g[i][j]}`).toBeLessThanOrEqual(1e-7 * geometricScale)
      }
  })
  test('the consistent mass and geometric matrices of the test are the published ones (ρAℓ/420·[156, 22ℓ, 54, −13ℓ; …], P/30ℓ·[36, 3ℓ, −36, 3ℓ; …])', () => {
    const m = member.massPerLength
    const mass = [
      [156, 22 * l, 54, -13 * l],
      [22 * l, 4 * l * l, 13 * l, -3 * l * l],
      [54, 13 * l, 156, -22 * l],
      [-13 * l, -3 * l * l, -22 * l, 4 * l * l],
    ].map((row) => row.map((v) => (v * m * l) / 420))
    const geometric = [
      [36, 3 * l, -36, 3 * l],
      [3 * l, 4 * l * l, -3 * l, -l * l],
      [-36, -3 * l, 36, -3 * l],
      [3 * l, -l * l, -3 * l, 4 * l * l],
    ].map((row) => row.map((v) => v / (30 * l)))
    mass.forEach((row, i) => row.forEach((v, j) => expect(Math.abs(v - fe.m[i][j])).toBeLessThanOrEqual(1e-13 * scaleOf(mass))))
    geometric.forEach((row, i) => row.forEach((v, j) => expect(Math.abs(v - fe.g[i][j])).toBeLessThanOrEqual(1e-13 * scaleOf(geometric))))
  })
})

describe('rigid-body modes follow from the supports and the axial force (common practice, no source)', () => {
  const members = uniformMembers(1, 100, 1, [0.5])
  test.each([
    ['free', 'free', {}, 0, 2],
    ['free', 'free', {}, 50, 1], // tension holds the rotation
    ['free', 'free', { side: { 1: 10 } }, 0, 1], // rotation about the spring
    ['free', 'free', { side: { 0: 10, 2: 10 } }, 0, 0],
    ['free', 'free', { rotational: { 2: 10 } }, 0, 1], // translation stays free
    ['free', 'free', { side: { 1: 10 }, rotational: { 0: 1 } }, 0, 0],
    ['pinned', 'free', {}, 0, 1],
    ['pinned', 'free', { side: { 1: 10 } }, 0, 0],
    ['pinned', 'free', { side: { 0: 10 } }, 0, 1], // a spring at the pin adds nothing
    ['pinned', 'free', {}, 50, 0],
    ['guided', 'free', {}, 0, 1],
    ['guided', 'guided', {}, 0, 1],
    ['guided', 'guided', {}, 50, 1], // the translation has no slope: tension does not hold it
    ['guided', 'pinned', {}, 0, 0],
    ['pinned', 'pinned', {}, 0, 0],
    ['clamped', 'free', {}, 0, 0],
  ] as const)('%s–%s %o, P = %f: %i', (start, end, springs, P, expected) => {
    const s = springs as { side?: Record<number, number>; rotational?: Record<number, number> }
    const chain = beamChain({ members, start, end, axialForce: P, stationSideStiffness: s.side, stationRotationalStiffness: s.rotational })
    expect(beamRigidBodyModes(chain)).toBe(expected)
    const omegas = exactBeamAngularFrequencies(chain, expected + 1)
    expect(omegas.filter((w) => w === 0).length).toBe(expected)
    expect(omegas[expected]).toBeGreaterThan(0)
  })
})

describe('input checks name the field', () => {
  const good = beamChain({ members: uniformMembers(1, 100, 1, [0.5]), start: 'clamped', end: 'free' })
  test.each([
    ['no members', { ...good, members: [] }, /members/],
    ['negative length', { ...good, members: [good.members[0], { ...good.members[1], length: -1 }] }, /members\[1\]\.length/],
    ['zero bending stiffness', { ...good, members: [{ ...good.members[0], bendingStiffness: 0 }, good.members[1]] }, /members\[0\]\.bendingStiffness/],
    ['NaN mass per length', { ...good, members: [{ ...good.members[0], massPerLength: Number.NaN }, good.members[1]] }, /members\[0\]\.massPerLength/],
    ['infinite axial force', { ...good, axialForce: Infinity }, /axialForce/],
    ['station array too short', { ...good, stationMass: [0, 0] }, /stationMass.*3/],
    ['negative spring', { ...good, stationSideStiffness: [0, -5, 0] }, /stationSideStiffness\[1\]/],
    ['unknown end', { ...good, end: 'hinged' as never }, /end must be one of/],
  ])('%s', (_, chain, message) => {
    expect(() => exactBeamAngularFrequencies(chain as BeamChain, 3)).toThrow(message)
    expect(() => beamModesBelow(chain as BeamChain, 10)).toThrow(message)
    expect(() => beamCriticalCompression(chain as BeamChain)).toThrow(message)
    expect(() => beamRigidBodyModes(chain as BeamChain)).toThrow(message)
  })
  test('omega and count', () => {
    expect(() => beamModesBelow(good, 0)).toThrow(/omega/)
    expect(() => beamModesBelow(good, Number.NaN)).toThrow(/omega/)
    expect(() => exactBeamAngularFrequencies(good, 2.5)).toThrow(/count/)
    expect(exactBeamAngularFrequencies(good, 0)).toEqual([])
  })
})

function multiply(a: number[][], b: number[][]): number[][] {
  return a.map((row) => b[0].map((_, j) => row.reduce((s, v, k) => s + v * b[k][j], 0)))
}

/** Gauss–Jordan with partial pivoting (4×4). */
function invert4(a: number[][]): number[][] {
  const n = 4
  const m = a.map((row, i) => [...row, ...Array.from({ length: n }, (_, j) => (i === j ? 1 : 0))])
  for (let c = 0; c < n; c++) {
    let p = c
    for (let r = c + 1; r < n; r++) if (Math.abs(m[r][c]) > Math.abs(m[p][c])) p = r
    ;[m[c], m[p]] = [m[p], m[c]]
    const pivot = m[c][c]
    for (let j = 0; j < 2 * n; j++) m[c][j] /= pivot
    for (let r = 0; r < n; r++) {
      if (r === c) continue
      const f = m[r][c]
      for (let j = 0; j < 2 * n; j++) m[r][j] -= f * m[c][j]
    }
  }
  return m.map((row) => row.slice(n))
}
