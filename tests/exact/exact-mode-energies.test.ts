/**
 * The energy integrals of exact mode shapes (exact-mode-shape.ts) against closed forms and an
 * identity:
 * - in a uniform bar at any ω (k = ω/c) the motion started with u = 0, N = 1 is
 *   u = sin(kx)/(EA k), N = cos kx (S. S. Rao, Mechanical Vibrations, longitudinal vibration of
 *   a bar, from memory), so ∫₀ᴸ N²/EA dx = (L/2 + sin 2kL/(4k))/EA and
 *   ∫₀ᴸ ρA u² dx = ρA (L/2 − sin 2kL/(4k))/(EA k)², elementary integrals of cos² and sin²;
 * - at a natural frequency the Rayleigh quotient equals ω² (Lord Rayleigh, The Theory of Sound,
 *   §88; any chain, cone or not), so Σ∫S u′² + Σk u² = ω² (Σ∫I u² + Σm u²);
 * - the transfer over zero length is the identity (E. C. Pestel & F. A. Leckie, Matrix Methods
 *   in Elastomechanics, field matrices, from memory): the state at x = 0 is the start state.
 */
import { describe, expect, test } from 'vitest'
import { memberStateAt, modeEnergies } from '../../core/exact/exact-mode-shape'
import { buildStationChain } from '../../core/exact/station-chain'
import { exactAngularFrequencies } from '../../core/exact/wittrick-williams'
import { expectRelative } from '../helpers'

const EA = 200e9 * 3e-4
const RHO_A = 7850 * 3e-4
const C = Math.sqrt(EA / RHO_A)

describe('energy integrals of exact modes', () => {
  test.each([0.9, 17.3, 61.1])('a long uniform fixed–free bar (10 m) at kL = %f: both integrals to 1e-12', (kL) => {
    // Not at a natural frequency: the integrands' oscillations over the pieces then cancel nowhere.
    const L = 10
    const chain = buildStationChain([{ length: L, startStiffness: EA, startInertia: RHO_A, diameterRatio: 1, taperPower: 2 }], [], { start: 'fixed', end: 'free' })
    const k = kL / L
    const e = modeEnergies(chain, k * C)
    const tail = Math.sin(2 * kL) / (4 * k)
    expectRelative(e.strain[0], (L / 2 + tail) / EA, 1e-12, '∫N²/EA')
    expectRelative(e.kinetic[0], (RHO_A * (L / 2 - tail)) / (EA * k) ** 2, 1e-12, '∫ρA u²')
    expectRelative(e.denominator, e.kinetic[0], 1e-15, 'denominator (no station masses)')
  })

  test.each([0.12, 0.3, 4])('a steep cone (d_end/d_start = %f), fixed–free with a tip mass: Rayleigh quotient = ω² to 1e-12', (ratio) => {
    const chain = buildStationChain([{ length: 0.8, startStiffness: EA, startInertia: RHO_A, diameterRatio: ratio, taperPower: 2 }], [{ at: 0.8, stiffness: 0, inertia: 0.05 }], {
      start: 'fixed',
      end: 'free',
    })
    for (const omega of exactAngularFrequencies(chain, 3)) {
      const e = modeEnergies(chain, omega)
      let numerator = e.strain.reduce((a, b) => a + b, 0)
      e.shape.stationDisplacement.forEach((u, s) => (numerator += chain.stationStiffness[s] * u * u))
      expectRelative(numerator / e.denominator, omega * omega, 1e-12, `Rayleigh quotient at ω ${omega}`)
    }
  })

  test('the state at x = 0 of a member is its start state', () => {
    const chain = buildStationChain([{ length: 0.8, startStiffness: EA, startInertia: RHO_A, diameterRatio: 0.5, taperPower: 2 }], [], { start: 'fixed', end: 'free' })
    expect(memberStateAt(chain.members[0], { u0: 0.25, n0: -3 }, 1234, 0)).toEqual({ u: 0.25, n: -3 })
  })
})
