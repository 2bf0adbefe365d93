/**
 * Bending element matrices against their published closed forms for a uniform element.
 * Sources (all from memory): J. S. Przemieniecki, Theory of Matrix Structural Analysis (1968),
 * ch. 5 (beam stiffness with shear deformation), ch. 11 (consistent mass) and ch. 15 (geometric
 * stiffness); R. D. Cook, D. S. Malkus, M. E. Plesha & R. J. Witt, Concepts and Applications of
 * Finite Element Analysis, the beam element and its consistent mass; E. Hinton, T. Rock &
 * O. C. Zienkiewicz, Earthq. Eng. Struct. Dyn. 4 (1976) for the lumped (HRZ) diagonal.
 */
import { describe, expect, test } from 'vitest'
import { beamElementMatrices, beamShapes, type BeamElementSection } from '../../core/fe/beam-element'

const h = 0.37
const EI = 2.3e4
const rhoA = 12.5
const kGA = 4.1e7
const rhoI = 3.2e-3
const uniform: BeamElementSection = {
  bendingStiffness: () => EI,
  massPerLength: () => rhoA,
  rotaryInertiaPerLength: () => rhoI,
  shearStiffness: () => kGA,
}

function expectMatrix(actual: Float64Array, expected: number[][], scale: number, label: string): void {
  for (let a = 0; a < 4; a++) {
    for (let b = 0; b < 4; b++) {
      const got = actual[4 * a + b]
      const want = expected[a][b]
      expect(Math.abs(got - want), `${label}[${a}][${b}]: ${got} vs ${want}`).toBeLessThanOrEqual(1e-13 * scale)
    }
  }
}

describe('Euler–Bernoulli (Hermite cubic) element', () => {
  const m = beamElementMatrices(h, uniform, 'euler-bernoulli', 'consistent')
  test('stiffness EI/h³ [12 6h −12 6h; 6h 4h² −6h 2h²; …] (Przemieniecki ch. 5)', () => {
    const c = EI / h ** 3
    const K = [
      [12, 6 * h, -12, 6 * h],
      [6 * h, 4 * h * h, -6 * h, 2 * h * h],
      [-12, -6 * h, 12, -6 * h],
      [6 * h, 2 * h * h, -6 * h, 4 * h * h],
    ].map((r) => r.map((v) => c * v))
    expectMatrix(m.elastic, K, 12 * c, 'K')
  })
  test('consistent mass ρAh/420 [156 22h 54 −13h; …] (Przemieniecki ch. 11)', () => {
    const c = (rhoA * h) / 420
    const M = [
      [156, 22 * h, 54, -13 * h],
      [22 * h, 4 * h * h, 13 * h, -3 * h * h],
      [54, 13 * h, 156, -22 * h],
      [-13 * h, -3 * h * h, -22 * h, 4 * h * h],
    ].map((r) => r.map((v) => c * v))
    expectMatrix(m.mass, M, 156 * c, 'M')
  })
  test('geometric stiffness 1/(30h) [36 3h −36 3h; 3h 4h² −3h −h²; …] per newton of tension (Przemieniecki ch. 15)', () => {
    const c = 1 / (30 * h)
    const G = [
      [36, 3 * h, -36, 3 * h],
      [3 * h, 4 * h * h, -3 * h, -h * h],
      [-36, -3 * h, 36, -3 * h],
      [3 * h, -h * h, -3 * h, 4 * h * h],
    ].map((r) => r.map((v) => c * v))
    expectMatrix(m.geometric, G, 36 * c, 'Kg')
  })
  test('lumped (HRZ) diagonal: ρAh/2 translations and ρAh³/78 rotations (Hinton, Rock & Zienkiewicz)', () => {
    const lumped = beamElementMatrices(h, uniform, 'euler-bernoulli', 'lumped').mass
    const expected = [(rhoA * h) / 2, (rhoA * h ** 3) / 78, (rhoA * h) / 2, (rhoA * h ** 3) / 78]
    for (let a = 0; a < 4; a++) {
      for (let b = 0; b < 4; b++) {
        const want = a === b ? expected[a] : 0
        expect(Math.abs(lumped[4 * a + b] - want)).toBeLessThanOrEqual(1e-14 * rhoA * h)
      }
    }
  })
  test('rigid-body motions store no strain energy (identity)', () => {
    // Translation w = 1 and rotation w = x, θ = 1 over [0, h].
    for (const q of [
      [1, 0, 1, 0],
      [0, 1, h, 1],
    ]) {
      let energy = 0
      for (let a = 0; a < 4; a++) for (let b = 0; b < 4; b++) energy += q[a] * m.elastic[4 * a + b] * q[b]
      expect(Math.abs(energy)).toBeLessThan(1e-12 * EI / h)
    }
  })
})

describe('Timoshenko (interdependent interpolation) element', () => {
  const phi = (12 * EI) / (kGA * h * h)
  const m = beamElementMatrices(h, uniform, 'timoshenko', 'consistent')
  test('stiffness EI/((1+Φ)h³) [12 6h −12 6h; 6h (4+Φ)h² −6h (2−Φ)h²; …] (Przemieniecki ch. 5)', () => {
    const c = EI / ((1 + phi) * h ** 3)
    const K = [
      [12, 6 * h, -12, 6 * h],
      [6 * h, (4 + phi) * h * h, -6 * h, (2 - phi) * h * h],
      [-12, -6 * h, 12, -6 * h],
      [6 * h, (2 - phi) * h * h, -6 * h, (4 + phi) * h * h],
    ].map((r) => r.map((v) => c * v))
    expectMatrix(m.elastic, K, 12 * c, 'K')
  })
  test('the shear strain w′ − ψ is constant along the element (the interpolation’s defining property)', () => {
    for (let a = 0; a < 4; a++) {
      const strain = (t: number) => {
        const s = beamShapes(t, h, phi)
        return s.dw[a] - s.psi[a]
      }
      expect(Math.abs(strain(0.1) - strain(0.8))).toBeLessThan(1e-12 * (Math.abs(strain(0.1)) + 1 / h))
    }
  })
  test('reduces to the Hermite element as the shear stiffness grows (Φ → 0)', () => {
    const stiff = beamElementMatrices(h, { ...uniform, shearStiffness: () => 1e20, rotaryInertiaPerLength: () => 0 }, 'timoshenko', 'consistent')
    const eb = beamElementMatrices(h, uniform, 'euler-bernoulli', 'consistent')
    for (let i = 0; i < 16; i++) {
      expect(Math.abs(stiff.elastic[i] - eb.elastic[i])).toBeLessThan(1e-9 * 12 * EI / h ** 3)
      expect(Math.abs(stiff.mass[i] - eb.mass[i])).toBeLessThan(1e-9 * rhoA * h)
    }
  })
})
