/**
 * Two independent methods must agree: the exact bending reference (transfer matrices with the
 * Wittrick–Williams count) and a dense Hermite-cubic finite-element model written in the test
 * (element matrices by quadrature of the energy functionals, solved with ml-matrix; each
 * frequency the Rayleigh quotient of its mode from the element energies), extrapolated to zero
 * element size from meshes of about 24, 48 and 96 elements in all (Richardson, h⁴ and h⁶ terms removed;
 * Hermite-cubic frequency and buckling-load errors are O(h⁴), G. Strang & G. Fix, An Analysis of
 * the Finite Element Method, ch. 6, from memory). Stepped parts of 2–3 members with different
 * EI and ρA, masses with rotary inertia, side and rotational springs, tension and compression.
 * The models are invented test cases; the finite elements are the expected values.
 */
import { describe, expect, test } from 'vitest'
import { beamCriticalCompression } from '../../core/exact/beam-buckling'
import type { BeamChain, BeamMember } from '../../core/exact/beam-chain'
import { exactBeamAngularFrequencies } from '../../core/exact/beam-frequencies'
import { beamRigidBodyModes } from '../../core/exact/beam-rigid-body-modes'
import { expectRelative } from '../helpers'
import { beamChain, hermiteBucklingLoad, hermiteFrequencies, reversed, richardsonH4H6 } from './beam-test-helpers'

/** A solid round member (E, ρ of steel unless given): EI = Eπd⁴/64, ρA = ρπd²/4. */
const rod = (diameter: number, length: number, youngsModulus = 205e9, density = 7850): BeamMember => ({
  length,
  bendingStiffness: (youngsModulus * Math.PI * diameter ** 4) / 64,
  massPerLength: (density * Math.PI * diameter ** 2) / 4,
})
/** A tube. */
const tube = (outer: number, inner: number, length: number, youngsModulus = 205e9, density = 7850): BeamMember => ({
  length,
  bendingStiffness: (youngsModulus * Math.PI * (outer ** 4 - inner ** 4)) / 64,
  massPerLength: (density * Math.PI * (outer ** 2 - inner ** 2)) / 4,
})

/** Elements per member on the three meshes: 24, 48, 96 in all. */
const meshes = (chain: BeamChain) => {
  const coarse = Math.ceil(24 / chain.members.length)
  return [coarse, 2 * coarse, 4 * coarse]
}
const MODES = 8
const TOLERANCE = 1e-9
/** Modes 7–8: the extrapolation's own remainder, O((λh)⁸), reaches a few 1e-9 there. */
const TOLERANCE_HIGH = 1e-8
const tolerance = (mode: number) => (mode <= 6 ? TOLERANCE : TOLERANCE_HIGH)

const feFrequencies = (chain: BeamChain): number[] => {
  const levels = meshes(chain).map((n) => hermiteFrequencies(chain, n))
  return levels[0].map((_, i) => richardsonH4H6(levels[0][i], levels[1][i], levels[2][i]))
}
const feBuckling = (chain: BeamChain): number => {
  const [a, b, c] = meshes(chain).map((n) => hermiteBucklingLoad(chain, n))
  return richardsonH4H6(a, b, c)
}

const steppedCantilever = beamChain({
  members: [rod(0.04, 0.5), rod(0.03, 0.7), rod(0.02, 0.6, 70e9, 2700)],
  start: 'clamped',
  end: 'free',
  stationMass: { 2: 1.5, 3: 0.4 },
  stationRotaryInertia: { 2: 2e-3 },
  stationSideStiffness: { 1: 2e5 },
})
const tensionedTie = beamChain({
  members: [tube(0.05, 0.04, 1.2), rod(0.025, 2.1)],
  start: 'pinned',
  end: 'pinned',
  axialForce: 20e3,
  stationMass: { 1: 3.2 },
  stationRotaryInertia: { 1: 0.01 },
  stationRotationalStiffness: { 0: 4e3 },
})
const springSupported = beamChain({
  members: [rod(0.03, 0.4), tube(0.04, 0.03, 0.9), rod(0.03, 0.5, 114e9, 4430)],
  start: 'free',
  end: 'free',
  stationMass: { 0: 0.8, 2: 2.5 },
  stationSideStiffness: { 1: 5e5, 2: 8e4 },
  stationRotationalStiffness: { 3: 600 },
})
const guidedPinned = beamChain({
  members: [rod(0.035, 0.8), rod(0.045, 0.6)],
  start: 'guided',
  end: 'pinned',
  stationMass: { 0: 1.1, 1: 0.7 },
  stationRotaryInertia: { 0: 4e-3 },
  stationSideStiffness: { 1: 3e5 },
  stationRotationalStiffness: { 1: 2e3 },
})
const freeFree = beamChain({
  members: [rod(0.05, 0.3), rod(0.03, 0.9)],
  start: 'free',
  end: 'free',
  stationMass: { 0: 2, 2: 0.5 },
  stationRotaryInertia: { 0: 5e-3, 2: 1e-3 },
})
const clampedClamped = beamChain({
  members: [rod(0.03, 0.7), rod(0.03, 0.7, 70e9, 2700), rod(0.03, 0.5)],
  start: 'clamped',
  end: 'clamped',
  axialForce: 15e3,
  stationMass: { 1: 4 },
})

describe('frequencies: exact reference against extrapolated Hermite finite elements', () => {
  const cases: [string, BeamChain][] = [
    ['stepped clamped–free, side spring, masses with rotary inertia', steppedCantilever],
    ['pinned–pinned tie in tension, mass at the step, rotational spring', tensionedTie],
    ['free–free on two side springs, masses, rotational spring', springSupported],
    ['guided–pinned, springs and masses at the step', guidedPinned],
    ['free–free with no support (two rigid-body modes)', freeFree],
    ['clamped–clamped in tension with a heavy mass', clampedClamped],
  ]
  test.each(cases)(`%s: ${MODES} modes to ${TOLERANCE} (modes 7–8: ${TOLERANCE_HIGH}), both ways round`, (_, chain) => {
    const exact = exactBeamAngularFrequencies(chain, MODES)
    const fe = feFrequencies(chain)
    const rigid = beamRigidBodyModes(chain)
    for (let i = 0; i < MODES; i++) {
      if (i < rigid) {
        expect(exact[i], `mode ${i + 1} is rigid`).toBe(0)
        expect(fe[i], `mode ${i + 1} is rigid in the finite elements too`).toBeLessThan(1e-5 * fe[rigid])
      } else expectRelative(exact[i], fe[i], tolerance(i + 1), `mode ${i + 1}`)
    }
    exactBeamAngularFrequencies(reversed(chain), MODES).forEach((w, i) => (i < rigid ? expect(w).toBe(0) : expectRelative(w, exact[i], 1e-12, `reversed, mode ${i + 1}`)))
  })
  test.each([
    [0.5, 'free–free on two side springs', springSupported],
    [0.9, 'guided–pinned', guidedPinned],
    [0.3, 'stepped clamped–free', steppedCantilever],
  ] as const)(`a compression of %f of the (finite-element) buckling load, %s: ${MODES} modes to ${TOLERANCE} (modes 7–8: ${TOLERANCE_HIGH})`, (fraction, _, base) => {
    const chain = { ...base, axialForce: -fraction * feBuckling(base) }
    const exact = exactBeamAngularFrequencies(chain, MODES)
    const fe = feFrequencies(chain)
    for (let i = 0; i < MODES; i++) expectRelative(exact[i], fe[i], tolerance(i + 1), `mode ${i + 1}`)
  })
})

describe('buckling loads: exact reference against extrapolated Hermite finite elements', () => {
  test.each([
    ['stepped clamped–free with a side spring', steppedCantilever],
    ['pinned–pinned with a rotational spring', tensionedTie],
    ['free–free on two side springs', springSupported],
    ['guided–pinned with springs', guidedPinned],
    ['clamped–clamped, three members', clampedClamped],
  ])(`%s: to ${TOLERANCE}, both ways round`, (_, chain) => {
    const fe = feBuckling(chain)
    expectRelative(beamCriticalCompression(chain), fe, TOLERANCE, 'critical compression')
    expectRelative(beamCriticalCompression(reversed(chain)), fe, TOLERANCE, 'critical compression, reversed')
  })
})
