/**
 * The exact bending reference against published frequency and buckling equations. Each expected
 * value is computed inside the test from the equation beside it (roots by scanning and
 * bisection), never from the routine under test.
 * Sources: R. D. Blevins, Formulas for Natural Frequency and Mode Shape, table of single-span
 * beams (frequency equations, and the βL values quoted below), from memory; S. Timoshenko &
 * J. Gere, Theory of Elastic Stability, columns (buckling loads), from memory.
 * The beam: steel rod of 20 mm diameter, EI = 200e9·π·0.02⁴/64 N·m², ρA = 7850·π·0.01² kg/m,
 * L = 1.8 m (an invented case; only the closed forms are the expected values).
 */
import { describe, expect, test } from 'vitest'
import { beamCriticalCompression } from '../../core/exact/beam-buckling'
import type { BeamEndCondition } from '../../core/exact/beam-chain'
import { exactBeamAngularFrequencies } from '../../core/exact/beam-frequencies'
import { beamRigidBodyModes } from '../../core/exact/beam-rigid-body-modes'
import { beamModesBelow } from '../../core/exact/beam-wittrick-williams'
import { expectRelative } from '../helpers'
import { beamChain, equationRoots, reversed, uniformMembers } from './beam-test-helpers'

const EI = (200e9 * Math.PI * 0.02 ** 4) / 64
const RHO_A = 7850 * Math.PI * 0.01 ** 2
const L = 1.8
/** ω = (βL)² √(EI/(ρA L⁴)). */
const omegaOf = (betaL: number, length = L, ei = EI, rhoA = RHO_A) => betaL * betaL * Math.sqrt(ei / (rhoA * length ** 4))

const MODES = 8

// Frequency equations in forms that stay well scaled for large βL (divided by cosh βL).
const cosCoshMinusOne = (x: number) => Math.cos(x) - 1 / Math.cosh(x) // cos βL cosh βL = 1
const cosCoshPlusOne = (x: number) => Math.cos(x) + 1 / Math.cosh(x) // cos βL cosh βL = −1
const tanEqualsTanh = (x: number) => Math.sin(x) - Math.cos(x) * Math.tanh(x) // tan βL = tanh βL
const tanPlusTanh = (x: number) => Math.sin(x) + Math.cos(x) * Math.tanh(x) // tan βL = −tanh βL

/**
 * Each end pair: its rigid-body modes and the βL of its elastic modes. Guided ends (slope held,
 * shear free) are the symmetry plane of a span twice as long (common practice, no source):
 * guided–free and guided–clamped are the symmetric modes of a free–free / clamped–clamped span
 * of 2L, tan βL = −tanh βL; guided–pinned is half a pinned–pinned span of 2L, βL = (n − ½)π;
 * guided–guided, βL = nπ (w = cos(nπx/L)).
 */
const END_PAIRS: readonly [BeamEndCondition, BeamEndCondition, number, (n: number) => number[], string][] = [
  ['clamped', 'free', 0, (n) => equationRoots(cosCoshPlusOne, n), 'cos βL cosh βL = −1'],
  ['clamped', 'clamped', 0, (n) => equationRoots(cosCoshMinusOne, n, 1), 'cos βL cosh βL = 1'],
  ['free', 'free', 2, (n) => equationRoots(cosCoshMinusOne, n, 1), 'cos βL cosh βL = 1, two rigid modes'],
  ['pinned', 'pinned', 0, (n) => Array.from({ length: n }, (_, i) => (i + 1) * Math.PI), 'βL = nπ'],
  ['clamped', 'pinned', 0, (n) => equationRoots(tanEqualsTanh, n, 1), 'tan βL = tanh βL'],
  ['pinned', 'free', 1, (n) => equationRoots(tanEqualsTanh, n, 1), 'tan βL = tanh βL, one rigid mode'],
  ['guided', 'free', 1, (n) => equationRoots(tanPlusTanh, n, 1), 'tan βL = −tanh βL, one rigid mode'],
  ['guided', 'clamped', 0, (n) => equationRoots(tanPlusTanh, n, 1), 'tan βL = −tanh βL'],
  ['guided', 'pinned', 0, (n) => Array.from({ length: n }, (_, i) => (i + 0.5) * Math.PI), 'βL = (n − ½)π'],
  ['guided', 'guided', 1, (n) => Array.from({ length: n }, (_, i) => (i + 1) * Math.PI), 'βL = nπ, one rigid mode'],
]

describe('the frequency equations themselves (Blevins, from memory)', () => {
  test('βL roots found by the test agree with the published values to 1e-8', () => {
    const published: [number[], number[]][] = [
      [equationRoots(cosCoshPlusOne, 4), [1.87510407, 4.69409113, 7.85475744, 10.99554073]],
      [equationRoots(cosCoshMinusOne, 3, 1), [4.73004074, 7.85320462, 10.99560784]],
      [equationRoots(tanEqualsTanh, 2, 1), [3.92660231, 7.06858275]],
      // Half the symmetric clamped–clamped values 4.73004074 and 10.99560784 (the span of 2L).
      [equationRoots(tanPlusTanh, 2, 1), [4.73004074 / 2, 10.99560784 / 2]],
    ]
    for (const [found, values] of published) values.forEach((v, i) => expectRelative(found[i], v, 1e-8, `βL${i + 1}`))
  })
})

describe.each(END_PAIRS)('uniform %s–%s beam', (start, end, rigid, roots, equation) => {
  test(`${MODES} modes against ${equation}, to 1e-10, both ways round and with extra stations`, () => {
    const expected = [...new Array<number>(rigid).fill(0), ...roots(MODES - rigid).map((x) => omegaOf(x))]
    const plain = beamChain({ members: uniformMembers(L, EI, RHO_A), start, end })
    const cut = beamChain({ members: uniformMembers(L, EI, RHO_A, [0.17, 0.5, 0.61]), start, end })
    for (const [what, chain] of [
      ['one member', plain],
      ['four members', cut],
      ['reversed', reversed(cut)],
    ] as const) {
      expect(beamRigidBodyModes(chain), `${what}: rigid-body modes`).toBe(rigid)
      const omegas = exactBeamAngularFrequencies(chain, MODES)
      expected.forEach((w, i) => (w === 0 ? expect(omegas[i], `${what}: mode ${i + 1}`).toBe(0) : expectRelative(omegas[i], w, 1e-10, `${what}: mode ${i + 1}`)))
    }
  })
  test('J from 4 ulps to 1e-10 either side of each root is n − 1 below and n above', () => {
    // Guided–free and guided–clamped (and free–free and clamped–clamped) share their roots: there the
    // end's displacement and force blocks are singular together, the hardest case for the last pivot.
    // Within a couple of ulps of such a root the count may be off by one (the pivots' signs are
    // round-off there); the root finder never evaluates it there.
    const chain = beamChain({ members: uniformMembers(L, EI, RHO_A, [0.17, 0.5, 0.61]), start, end })
    const omegas = exactBeamAngularFrequencies(chain, MODES)
    const offsets = [4, 16, 64, 256, 1024, 4096].map((k) => k * Number.EPSILON).concat([1e-12, 1e-10])
    omegas.forEach((w, i) => {
      if (w === 0) return
      for (const d of offsets) {
        expect(beamModesBelow(chain, w * (1 - d)), `J at root ${i + 1} × (1 − ${d})`).toBe(i)
        expect(beamModesBelow(chain, w * (1 + d)), `J at root ${i + 1} × (1 + ${d})`).toBe(i + 1)
      }
    })
  })
  test('J(ω) equals the number of equation roots below ω (rigid modes included)', () => {
    const chain = beamChain({ members: uniformMembers(L, EI, RHO_A, [0.3, 0.8]), start, end })
    const expected = [...new Array<number>(rigid).fill(0), ...roots(12).map((x) => omegaOf(x))]
    for (let omega = 0.37; omega < expected[expected.length - 1]; omega *= 1.13) {
      expect(beamModesBelow(chain, omega), `J(${omega})`).toBe(expected.filter((w) => w < omega).length)
    }
  })
})

describe('axial force (pinned–pinned closed form, Blevins / Timoshenko, from memory)', () => {
  const eulerLoad = (Math.PI ** 2 * EI) / L ** 2
  test.each([
    ['tension 5 kN', 5000],
    ['tension 3 × Euler load', 3 * eulerLoad],
    ['compression 0.4 × Euler load', -0.4 * eulerLoad],
    ['compression 0.999 × Euler load', -0.999 * eulerLoad],
  ])('%s: ω² = (nπ/L)⁴EI/ρA + (nπ/L)²P/ρA, 8 modes to 1e-10', (_, P) => {
    const chain = beamChain({ members: uniformMembers(L, EI, RHO_A, [0.25, 0.7]), start: 'pinned', end: 'pinned', axialForce: P })
    const omegas = exactBeamAngularFrequencies(chain, MODES)
    for (let n = 1; n <= MODES; n++) {
      const k = (n * Math.PI) / L
      expectRelative(omegas[n - 1], Math.sqrt((k ** 4 * EI + k * k * P) / RHO_A), 1e-10, `mode ${n}`)
    }
  })
  test('taut string: pinned–pinned with EI → 0 tends to f_n = n/(2L)·√(P/ρA) (exactly, with the EI term)', () => {
    const P = 2000
    for (const ei of [1e-2, 1e-5]) {
      const chain = beamChain({ members: uniformMembers(L, ei, RHO_A), start: 'pinned', end: 'pinned', axialForce: P })
      const omegas = exactBeamAngularFrequencies(chain, 5)
      omegas.forEach((w, i) => {
        const n = i + 1
        const string = (n / (2 * L)) * Math.sqrt(P / RHO_A) * 2 * Math.PI
        const bendingShare = ((n * Math.PI) / L) ** 2 * (ei / P)
        expectRelative(w, string * Math.sqrt(1 + bendingShare), 1e-10, `EI ${ei}, mode ${n}`)
        expectRelative(w, string, 1.01 * 0.5 * bendingShare, `EI ${ei}, mode ${n}: string limit`)
      })
    }
  })
  test('taut string with clamped ends: f_n = n f₀ √(1 + Bn²)(1 + 2√B/π + 4B/π²), B = π²EI/(PL²) (H. Fletcher, J. Acoust. Soc. Am. 36 (1964) 203, from memory)', () => {
    // The formula is asymptotic to second order in 1/κL (κ = √(P/EI)): the remainder must be far
    // below the last term kept, (4 + n²π²/2)/(κL)², and shrink as (κL)⁻³ — 8× per doubling.
    const P = 2000
    const remainders = [1e3, 2e3].map((kappaL) => {
      const ei = P * (L / kappaL) ** 2
      const chain = beamChain({ members: uniformMembers(L, ei, RHO_A), start: 'clamped', end: 'clamped', axialForce: P })
      const B = (Math.PI ** 2 * ei) / (P * L * L)
      return exactBeamAngularFrequencies(chain, 4).map((w, i) => {
        const n = i + 1
        const string = ((n * Math.PI) / L) * Math.sqrt(P / RHO_A)
        expect(w / string - 1, `κL ${kappaL}, mode ${n}: above the string by ≈ 2/κL`).toBeGreaterThan(1.9 / kappaL)
        const fletcher = string * Math.sqrt(1 + B * n * n) * (1 + (2 * Math.sqrt(B)) / Math.PI + (4 * B) / Math.PI ** 2)
        const remainder = w / fletcher - 1
        expect(Math.abs(remainder), `κL ${kappaL}, mode ${n}: remainder`).toBeLessThan((0.1 * (4 + (n * n * Math.PI ** 2) / 2)) / kappaL ** 2)
        return remainder
      })
    })
    remainders[0].forEach((r, i) => {
      const ratio = r / remainders[1][i]
      expect(ratio, `mode ${i + 1}: remainder ratio for κL 1000 → 2000`).toBeGreaterThan(7.6)
      expect(ratio, `mode ${i + 1}: remainder ratio for κL 1000 → 2000`).toBeLessThan(8.4)
    })
  })
})

describe('attachments (frequency equations derived from the general solution, as in Blevins, from memory)', () => {
  const beamMass = RHO_A * L
  /**
   * Clamped–free beam with a tip mass M (R = M/ρAL) and rotary inertia J (j = J/ρAL³): with
   * w = A(cosh βx − cos βx) + B(sinh βx − sin βx), EI w'' = ω²J w′ and EI w''' = −ω²M w at x = L give
   * det [[(ch + c) − x³j(sh + s), (sh + s) − x³j(ch − c)], [(sh − s) + xR(ch − c), (ch + c) + xR(sh − s)]] = 0,
   * which for j = 0 is 1 + cos x cosh x + xR(cos x sinh x − sin x cosh x) = 0 (Blevins, tip mass, from memory).
   */
  const tipMassEquation = (R: number, j: number) => (x: number) => {
    const ch = 1
    const sh = Math.tanh(x)
    const c = Math.cos(x) / Math.cosh(x)
    const s = Math.sin(x) / Math.cosh(x)
    const x3 = x ** 3
    return (ch + c - x3 * j * (sh + s)) * (ch + c + x * R * (sh - s)) - (sh + s - x3 * j * (ch - c)) * (sh - s + x * R * (ch - c))
  }
  test.each([0.2, 1, 5])('clamped–free with a tip mass, M/ρAL = %f: 6 modes to 1e-10', (R) => {
    // The same equation in Blevins' one-line form, to tie the determinant to the published one.
    const published = (x: number) => 1 + Math.cos(x) * Math.cosh(x) + x * R * (Math.cos(x) * Math.sinh(x) - Math.sin(x) * Math.cosh(x))
    const roots = equationRoots(tipMassEquation(R, 0), 6)
    roots.forEach((x) => expect(Math.abs(published(x)) / Math.cosh(x) ** 2).toBeLessThan(1e-12))
    const chain = beamChain({ members: uniformMembers(L, EI, RHO_A, [0.4]), start: 'clamped', end: 'free', stationMass: { 2: R * beamMass } })
    const omegas = exactBeamAngularFrequencies(chain, 6)
    roots.forEach((x, i) => expectRelative(omegas[i], omegaOf(x), 1e-10, `mode ${i + 1}`))
  })
  test.each([
    [1, 0.05],
    [0.3, 0.4],
  ])('clamped–free with a tip mass M/ρAL = %f and rotary inertia J/ρAL³ = %f: 6 modes to 1e-10', (R, j) => {
    const roots = equationRoots(tipMassEquation(R, j), 6)
    const chain = beamChain({
      members: uniformMembers(L, EI, RHO_A),
      start: 'clamped',
      end: 'free',
      stationMass: { 1: R * beamMass },
      stationRotaryInertia: { 1: j * beamMass * L * L },
    })
    const omegas = exactBeamAngularFrequencies(chain, 6)
    roots.forEach((x, i) => expectRelative(omegas[i], omegaOf(x), 1e-10, `mode ${i + 1}`))
  })
  test.each([0.5, 3, 40])('clamped–free with a tip side spring, kL³/EI = %f: x³(1 + cos x cosh x) = (kL³/EI)(cos x sinh x − sin x cosh x), 6 modes to 1e-10', (kappa) => {
    const equation = (x: number) => x ** 3 * (1 / Math.cosh(x) + Math.cos(x)) - kappa * (Math.cos(x) * Math.tanh(x) - Math.sin(x))
    const roots = equationRoots(equation, 6)
    const chain = beamChain({ members: uniformMembers(L, EI, RHO_A), start: 'clamped', end: 'free', stationSideStiffness: { 1: (kappa * EI) / L ** 3 } })
    const omegas = exactBeamAngularFrequencies(chain, 6)
    roots.forEach((x, i) => expectRelative(omegas[i], omegaOf(x), 1e-10, `mode ${i + 1}`))
  })
  test('pinned–pinned with rotational end springs: → pinned–pinned as k → 0, → clamped–clamped as k → ∞', () => {
    const withSprings = (k: number) =>
      exactBeamAngularFrequencies(
        beamChain({ members: uniformMembers(L, EI, RHO_A, [0.5]), start: 'pinned', end: 'pinned', stationRotationalStiffness: { 0: k, 2: k } }),
        6,
      )
    const soft = withSprings(1e-9 * (EI / L))
    const stiff = withSprings(1e11 * (EI / L))
    const clamped = equationRoots(cosCoshMinusOne, 6, 1)
    for (let n = 1; n <= 6; n++) {
      // Shifts are first order in kL/EI (soft) and EI/kL (stiff): ≈ 1e-9 and 1e-11 here.
      expectRelative(soft[n - 1], omegaOf(n * Math.PI), 1e-8, `soft, mode ${n}`)
      expectRelative(stiff[n - 1], omegaOf(clamped[n - 1]), 1e-9, `stiff, mode ${n}`)
    }
  })
})

describe('near-rigid modes keep their digits', () => {
  /**
   * Free–free modes φₙ = cosh βx + cos βx − σ(sinh βx + sin βx), σ = (cosh βL − cos βL)/(sinh βL − sin βL),
   * cos βL cosh βL = 1 (Blevins, from memory); even n symmetric about the centre, odd n antisymmetric.
   * The perturbation sums below use them with ∫φₙ² by Simpson's rule.
   */
  const freeFreeModes = (count: number) =>
    equationRoots(cosCoshMinusOne, count, 1).map((bl, n) => {
      const beta = bl / L
      const sigma = (Math.cosh(bl) - Math.cos(bl)) / (Math.sinh(bl) - Math.sin(bl))
      // cosh y − σ sinh y = e^(−y) + (1 − σ) sinh y, with 1 − σ = (cos βL − sin βL − e^(−βL))/(sinh βL − sin βL):
      // the same function without the cancellation of two huge terms at high modes.
      const oneMinusSigma = (Math.cos(bl) - Math.sin(bl) - Math.exp(-bl)) / (Math.sinh(bl) - Math.sin(bl))
      const phi = (x: number) => Math.exp(-beta * x) + oneMinusSigma * Math.sinh(beta * x) + Math.cos(beta * x) - sigma * Math.sin(beta * x)
      let integral = 0
      const pieces = 2000
      for (let p = 0; p < pieces; p++) {
        const a = (p * L) / pieces
        const b = ((p + 1) * L) / pieces
        integral += ((b - a) / 6) * (phi(a) ** 2 + 4 * phi(0.5 * (a + b)) ** 2 + phi(b) ** 2)
      }
      return { symmetric: n % 2 === 0, phi, modalMass: RHO_A * integral, omega: omegaOf(bl) }
    })
  const modes = freeFreeModes(40)
  /**
   * Beyond the 40 computed modes, their large-n limits (the same formulas as βL → ∞): βL = (n + ½)π,
   * ∫φ² = L, φ(0)² = 4, φ(L) = ±2 and φ(L/2)² = 1 − sin βL (2 for symmetric modes, 0 otherwise),
   * exact to e^(−βL) < 1e-50 there; the sums' tails fall as n⁻⁴ and are summed to n = 200000.
   */
  const tail = (term: (symmetric: boolean, omega: number) => number) => {
    let sum = 0
    for (let n = 41; n <= 200_000; n++) sum += term(n % 2 === 1, omegaOf((n + 0.5) * Math.PI))
    return sum
  }
  const M = RHO_A * L

  /**
   * One soft side spring k at the centre: a rigid rotation about the centre (ω = 0) and a bounce
   * with, by second-order perturbation of the rigid translation (common practice, no source),
   * ω² = k/M − k² Σₙ φₙ(L/2)² / (M·mₙ·(ωₙ² − k/M)) + O(k³), over the symmetric modes.
   */
  test.each([1e-6, 1e-3, 3e-2])('free–free on one side spring k = %f N/m at its centre: the bounce to 1e-12', (k) => {
    const chain = beamChain({ members: uniformMembers(L, EI, RHO_A, [0.5]), start: 'free', end: 'free', stationSideStiffness: { 1: k } })
    expect(beamRigidBodyModes(chain)).toBe(1)
    const omegas = exactBeamAngularFrequencies(chain, 3)
    expect(omegas[0]).toBe(0)
    const base = k / M
    let second = 0
    for (const mode of modes) if (mode.symmetric) second += (k * k * mode.phi(L / 2) ** 2) / (M * mode.modalMass * (mode.omega ** 2 - base))
    second += tail((symmetric, omega) => (symmetric ? (k * k * 2) / (M * M * (omega ** 2 - base)) : 0))
    expectRelative(omegas[1], Math.sqrt(base - second), 1e-12, 'bounce')
    // The plain rigid-body estimate √(k/M)/2π, where the correction is below 1e-10.
    if (k <= 1e-6) expectRelative(omegas[1] / (2 * Math.PI), Math.sqrt(k / M) / (2 * Math.PI), 1e-9, '√(k/M)/2π')
  })
  /**
   * A tension P makes the free rotation r = x − L/2 elastic: ω² = P∫r′²/∫ρA r² = 12P/(ρA L²) to first
   * order, less P² Σₙ (∫r′φₙ′)² / (∫ρA r² · mₙ · (ωₙ² − 12P/ρAL²)) over the antisymmetric modes
   * (∫r′φₙ′ = φₙ(L) − φₙ(0)); the remainder is O(P³).
   */
  test.each([1e-6, 1e-3, 1e-2])('free–free with a tension of %f N: the rotation becomes elastic, to 1e-12', (P) => {
    const chain = beamChain({ members: uniformMembers(L, EI, RHO_A, [0.3]), start: 'free', end: 'free', axialForce: P })
    expect(beamRigidBodyModes(chain)).toBe(1)
    const omegas = exactBeamAngularFrequencies(chain, 3)
    expect(omegas[0]).toBe(0)
    const rotationMass = (RHO_A * L ** 3) / 12
    const first = (12 * P) / (RHO_A * L * L)
    let second = 0
    for (const mode of modes) if (!mode.symmetric) second += (P * P * (mode.phi(L) - mode.phi(0)) ** 2) / (rotationMass * mode.modalMass * (mode.omega ** 2 - first))
    second += tail((symmetric, omega) => (symmetric ? 0 : (P * P * 16) / (rotationMass * RHO_A * L * (omega ** 2 - first))))
    expectRelative(omegas[1], Math.sqrt(first - second), 1e-12, 'rotation under tension')
    if (P <= 1e-6) expectRelative(omegas[1], Math.sqrt(first), 1e-9, '√(12P/ρAL²)')
  })
  test.each([1e-8, 1e-6])('pinned–free with a soft rotational spring %f N·m/rad at the pin: ω² = k/(ρA L³/3) to 1e-9, both ways round', (k) => {
    // First-order estimate; the correction is of relative order kL/EI ≤ 1.2e-9 here.
    const chain = beamChain({ members: uniformMembers(L, EI, RHO_A, [0.6]), start: 'pinned', end: 'free', stationRotationalStiffness: { 0: k } })
    expect(beamRigidBodyModes(chain)).toBe(0)
    for (const c of [chain, reversed(chain)]) {
      const omegas = exactBeamAngularFrequencies(c, 2)
      expectRelative(omegas[0], Math.sqrt(k / ((RHO_A * L ** 3) / 3)), 1e-9, 'rocking about the pin')
    }
  })
})

describe('buckling loads (Timoshenko & Gere, from memory)', () => {
  const euler = (Math.PI ** 2 * EI) / L ** 2
  test.each([
    ['pinned', 'pinned', 1],
    ['clamped', 'free', 0.25],
    ['clamped', 'clamped', 4],
    ['guided', 'free', 0.25],
    ['guided', 'pinned', 0.25],
    ['guided', 'guided', 1],
    ['clamped', 'guided', 1],
  ] as const)('%s–%s: %f·π²EI/L² to 1e-11, both ways round', (start, end, factor) => {
    const chain = beamChain({ members: uniformMembers(L, EI, RHO_A, [0.35]), start, end })
    expectRelative(beamCriticalCompression(chain), factor * euler, 1e-11, 'load')
    expectRelative(beamCriticalCompression(reversed(chain)), factor * euler, 1e-11, 'load, reversed')
  })
  test('clamped–pinned: (kL)² EI/L² with tan kL = kL, ≈ 20.19 EI/L² = 2.0457 π²EI/L² (from memory)', () => {
    const kl = equationRoots((x) => Math.sin(x) - x * Math.cos(x), 1, 1)[0]
    expectRelative(kl * kl, 20.19, 1e-3, 'published value')
    const chain = beamChain({ members: uniformMembers(L, EI, RHO_A), start: 'clamped', end: 'pinned' })
    expectRelative(beamCriticalCompression(chain), (kl * kl * EI) / L ** 2, 1e-11, 'load')
    expectRelative(beamCriticalCompression(reversed(chain)), (kl * kl * EI) / L ** 2, 1e-11, 'load, reversed')
  })
  test.each([0.5, 10, 1e3])('clamped–free with a tip side spring kL³/EI = %f: tan kL = kL − (kL)³EI/(kL³) (elastically held top)', (kappa) => {
    const kl = equationRoots((x) => Math.sin(x) - Math.cos(x) * (x - x ** 3 / kappa), 1, 0.5)[0]
    const chain = beamChain({ members: uniformMembers(L, EI, RHO_A, [0.5]), start: 'clamped', end: 'free', stationSideStiffness: { 2: (kappa * EI) / L ** 3 } })
    expectRelative(beamCriticalCompression(chain), (kl * kl * EI) / L ** 2, 1e-11, 'load')
  })
  test('a rotation the supports leave free buckles under any compression: 0', () => {
    for (const [start, end] of [
      ['free', 'free'],
      ['pinned', 'free'],
      ['free', 'pinned'],
    ] as const) {
      const chain = beamChain({ members: uniformMembers(L, EI, RHO_A), start, end })
      expect(beamCriticalCompression(chain), `${start}–${end}`).toBe(0)
      expect(() => exactBeamAngularFrequencies({ ...chain, axialForce: -1e-3 }, 3), `${start}–${end}`).toThrow(/buckling load/)
    }
  })
  test('frequencies are refused at and above the buckling load, given below it', () => {
    const chain = beamChain({ members: uniformMembers(L, EI, RHO_A), start: 'clamped', end: 'free' })
    const critical = (Math.PI ** 2 * EI) / (4 * L * L)
    for (const factor of [1 + 1e-9, 1.5]) {
      expect(() => exactBeamAngularFrequencies({ ...chain, axialForce: -factor * critical }, 2)).toThrow(RangeError)
      expect(() => exactBeamAngularFrequencies({ ...chain, axialForce: -factor * critical }, 2)).toThrow(/axialForce.*at or above the buckling load/)
    }
    const below = exactBeamAngularFrequencies({ ...chain, axialForce: -(1 - 1e-6) * critical }, 2)
    expect(below[0]).toBeGreaterThan(0)
    expect(below[0]).toBeLessThan(0.01 * omegaOf(1.8751))
  })
})
