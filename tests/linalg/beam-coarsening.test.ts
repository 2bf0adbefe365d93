/**
 * The beam's coarse levels against their definition, computed independently in the test:
 * the Galerkin products Pᵀ M P and Pᵀ K P formed densely with ml-matrix from P's columns, and
 * the interpolation P against the property it is built on. Sources:
 * - Galerkin (Rayleigh–Ritz) restriction of a pencil, K_c = PᵀKP, M_c = PᵀMP (e.g. W. L. Briggs,
 *   V. E. Henson & S. F. McCormick, A Multigrid Tutorial, the variational coarse operator; from
 *   memory): an identity, checked to round-off;
 * - cubic Hermite interpolation reproduces every cubic polynomial and its slope exactly (e.g.
 *   C. de Boor, A Practical Guide to Splines, ch. on piecewise cubic interpolation; from memory).
 */
import { describe, expect, test } from 'vitest'
import { Matrix } from 'ml-matrix'
import { assembleFamily } from '../../core/fe/assemble'
import { beamCoarsening, coarsenBeamMass, prolongateBeam, prolongateBeamAll, type BeamCoarsening } from '../../core/linalg/beam-coarsening'
import { assembleFromForms, coarsenBeamForms } from '../../core/linalg/beam-energy'
import { bandToDense, type SymmetricBandMatrix } from '../../core/linalg/symmetric-band-matrix'
import { familyOf } from '../../core/model/families'
import { makeProject } from '../helpers'

const STEEL = { id: 'steel', youngsModulus: 2e11, density: 7850, poissonRatio: 0.3 }

/** Stepped beams with the features that make the coarsening non-trivial (invented test parts). */
function model(options: { start: string; end: string; perSegment: number; preload?: number; features?: boolean }) {
  const project = makeProject({
    format: 'rodwave',
    version: 2,
    motions: ['bending'],
    materials: [STEEL],
    segments: [
      { length: 0.7, material: 'steel', section: { shape: 'tube', outerDiameter: 0.05, innerDiameter: 0.04 } },
      { length: 0.45, material: 'steel', section: { shape: 'solid', diameter: 0.03 } },
    ],
    ends: { start: { bending: options.start }, end: { bending: options.end } },
    ...(options.preload !== undefined ? { preload: options.preload } : {}),
    ...(options.features
      ? {
          masses: [{ at: 0.93, mass: 1.5, transverseInertia: 3e-4 }],
          springs: [{ at: 0.31, motion: 'bending', stiffness: 2e6, rotationalStiffness: 450 }],
        }
      : {}),
    analysis: { elementsPerSegment: options.perSegment, modes: 6, mass: 'consistent', bendingTheory: 'euler-bernoulli' },
  })
  return assembleFamily(project, familyOf('bending'), { order: 1, elementsPerSegment: options.perSegment, mass: 'consistent', bendingTheory: 'euler-bernoulli' })
}

/** P as a dense matrix, column by column: the interpolation of each coarse unit vector. */
function denseProlongation(map: BeamCoarsening): Matrix {
  const p = new Matrix(map.fineOrder, map.coarseOrder)
  const unit = new Float64Array(map.coarseOrder)
  const column = new Float64Array(map.fineOrder)
  for (let j = 0; j < map.coarseOrder; j++) {
    unit.fill(0)
    unit[j] = 1
    prolongateBeam(map, unit, column)
    for (let i = 0; i < map.fineOrder; i++) p.set(i, j, column[i])
  }
  return p
}

function galerkin(a: SymmetricBandMatrix, p: Matrix): Matrix {
  return p.transpose().mmul(new Matrix(bandToDense(a))).mmul(p)
}

/** Largest entry difference relative to the largest entry of the expected matrix. */
function relativeDifference(actual: number[][], expected: Matrix): number {
  let scale = 0
  let worst = 0
  for (let i = 0; i < expected.rows; i++) {
    for (let j = 0; j < expected.columns; j++) {
      scale = Math.max(scale, Math.abs(expected.get(i, j)))
      worst = Math.max(worst, Math.abs(actual[i][j] - expected.get(i, j)))
    }
  }
  return worst / scale
}

const CASES = [
  { start: 'clamped', end: 'free', perSegment: 13, ratio: 4 },
  { start: 'pinned', end: 'guided', perSegment: 21, ratio: 4, preload: 3.2e4, features: true },
  { start: 'free', end: 'free', perSegment: 18, ratio: 4, features: true },
  { start: 'guided', end: 'pinned', perSegment: 40, ratio: 16, preload: -9e3, features: true },
  { start: 'clamped', end: 'clamped', perSegment: 35, ratio: 16, features: true },
]

describe('beam coarse levels (Galerkin identity, checked densely with ml-matrix)', () => {
  for (const c of CASES) {
    const name = `${c.start}–${c.end}, ${c.perSegment} elements per segment, ratio ${c.ratio}${c.features ? ', with a point mass, J and a spring' : ''}${c.preload ? `, preload ${c.preload} N` : ''}`
    test(`coarse mass = PᵀMP: ${name}`, () => {
      const fine = model(c)
      const map = beamCoarsening(fine.layout!, c.ratio)
      const p = denseProlongation(map)
      const coarse = coarsenBeamMass(fine.pencil.mass, map)
      expect(relativeDifference(bandToDense(coarse), galerkin(fine.pencil.mass, p))).toBeLessThan(1e-13)
    })

    test(`coarse stiffness from the coarsened strain forms = PᵀKP: ${name}`, () => {
      const fine = model(c)
      const map = beamCoarsening(fine.layout!, c.ratio)
      const p = denseProlongation(map)
      const forms = coarsenBeamForms(fine.pencil.beamForms!, map)
      const coarse = assembleFromForms(forms, map.coarseOrder)
      // PᵀKP sums entries of size EI/h³ into ones of size EI/H³: round-off of ε·(H/h)³ relative.
      expect(relativeDifference(bandToDense(coarse), galerkin(fine.pencil.stiffness, p))).toBeLessThan(1e-10)
    })
  }

  test('the interpolation reproduces a cubic and its slope at every fine node (Hermite exactness)', () => {
    const fine = model({ start: 'free', end: 'free', perSegment: 30, features: true })
    const layout = fine.layout!
    const map = beamCoarsening(layout, 4)
    const cubic = (x: number) => 0.3 - 1.7 * x + 2.2 * x * x - 0.9 * x ** 3
    const slope = (x: number) => -1.7 + 4.4 * x - 2.7 * x * x
    // The coarse vector of the cubic: w at each coarse node, s = ℓ_c θ.
    const coarse = new Float64Array(map.coarseOrder)
    map.coarse.x.forEach((x, node) => {
      coarse[map.coarseIndex[2 * node]] = cubic(x)
      coarse[map.coarseIndex[2 * node + 1]] = map.coarse.rotationScale * slope(x)
    })
    const [interpolated] = prolongateBeamAll(map, [coarse])
    let worst = 0
    layout.x.forEach((x, node) => {
      worst = Math.max(worst, Math.abs(interpolated[map.fineIndex[2 * node]] - cubic(x)))
      worst = Math.max(worst, Math.abs(interpolated[map.fineIndex[2 * node + 1]] / layout.rotationScale - slope(x)))
    })
    expect(worst).toBeLessThan(1e-12)
  })

  test('segment joints, point masses and springs stay nodes of every coarse level', () => {
    const fine = model({ start: 'clamped', end: 'free', perSegment: 300, features: true })
    let layout = fine.layout!
    const positions = Array.from(layout.anchors!, (node) => layout.x[node])
    // The joint at 0.7 m, the spring at 0.31 m and the mass at 0.93 m.
    expect(positions.map((x) => Number(x.toFixed(9)))).toEqual([0.31, 0.7, 0.93])
    for (let level = 0; level < 3; level++) {
      layout = beamCoarsening(layout, 4).coarse
      expect(Array.from(layout.anchors!, (node) => layout.x[node])).toEqual(positions)
    }
  })
})
