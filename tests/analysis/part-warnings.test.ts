/**
 * The warnings about the part itself (model-checks.ts) fire on the side of each threshold that
 * the message states, measured against the bar's own scale computed here: the axial stiffness of
 * the segments in series, 1/Σ(L/EA), and their mass Σ ρAL (statics of bars in series, common
 * practice, no source). The thresholds themselves (1e9, 1e7, 1e-6, 1e8) are Rodwave's
 * conditioning limits, read from core/analysis/model-checks.ts; the tests check that the ratios
 * are formed from the right quantities, on both sides of each limit.
 */
import { describe, expect, test } from 'vitest'
import { analyseProject, type ModalAnalysis } from '../../core/analysis/modal-analysis'
import { familyWarnings, modeChecks, modelWarnings } from '../../core/analysis/model-checks'
import { makeProject, STEEL } from '../helpers'

const E = STEEL.youngsModulus
const RHO = STEEL.density
const area = (d: number) => (Math.PI / 4) * d * d

// Two segments in series, EA/L of 3k and k: the series stiffness is ¾k, the softest k, the stiffest 3k.
const segments = [
  { length: 0.4, material: 'steel', section: { shape: 'solid', diameter: 0.03 } },
  { length: 0.9, material: 'steel', section: { shape: 'solid', diameter: 0.03 * Math.sqrt(0.9 / (3 * 0.4)) } },
]
const k1 = (E * area(0.03)) / 0.4
const k2 = (E * area(segments[1].section.diameter)) / 0.9
const series = 1 / (1 / k1 + 1 / k2)
const barMass = RHO * (area(0.03) * 0.4 + area(segments[1].section.diameter) * 0.9)

function warningsOf(doc: Record<string, unknown>, modes = 2): ReturnType<typeof modelWarnings> {
  const project = makeProject({ materials: [STEEL], segments, ...doc })
  return modelWarnings(analyseProject(project, { elementsPerSegment: 8, modes }, { withReference: false }))
}

describe('stiff springs: the ratio to the bar’s series stiffness', () => {
  test('the segments are what the comments say: EA/L of 3k and k', () => {
    expect(k1 / k2).toBeCloseTo(3, 12)
    expect(series / k2).toBeCloseTo(0.75, 12)
  })

  test('1.2e9 times the series stiffness (0.9e9 times the softest segment): warned, with the label and the ratio', () => {
    const stiffness = 1.2e9 * series
    const warnings = warningsOf({ springs: [{ at: 0.9, stiffness: 10 }, { at: 1.3, stiffness, label: 'anchor' }] })
    const stiff = warnings.filter((w) => w.code === 'stiff-spring')
    expect(stiff.length).toBe(1)
    expect(stiff[0].message).toContain(`Spring 2 (“anchor”) is ${(stiffness / series).toExponential(1)} times stiffer than the bar`)
  })

  test('0.8e9 times the series stiffness: no warning; an unlabelled spring is named by its number only', () => {
    expect(warningsOf({ springs: [{ at: 1.3, stiffness: 0.8e9 * series }] }).filter((w) => w.code === 'stiff-spring')).toEqual([])
    const [w] = warningsOf({ springs: [{ at: 1.3, stiffness: 2e9 * series }] }).filter((x) => x.code === 'stiff-spring')
    expect(w.message.startsWith('Spring 1 is 2.0e+9 times stiffer')).toBe(true)
  })

  test('a spring that acts on another motion is not compared with the axial stiffness', () => {
    const project = makeProject({
      version: 2,
      motions: ['axial', 'torsion'],
      materials: [{ ...STEEL, poissonRatio: 0.3 }],
      segments,
      springs: [{ at: 1.3, stiffness: 1e20, motion: 'torsion' }],
    })
    const warnings = modelWarnings(analyseProject(project, { elementsPerSegment: 8, modes: 2 }, { withReference: false }))
    expect(warnings.filter((w) => w.code === 'stiff-spring')).toEqual([])
  })
})

describe('heavy masses: the ratio to the bar’s mass', () => {
  test('1.5e7 times the bar’s mass: warned with its label; 0.8e7: not', () => {
    const heavy = warningsOf({ masses: [{ at: 1.3, mass: 1.5e7 * barMass, label: 'flywheel' }] }).filter((w) => w.code === 'heavy-mass')
    expect(heavy.length).toBe(1)
    expect(heavy[0].message).toContain(`Point mass 1 (“flywheel”) is 1.5e+7 times the bar's mass`)
    expect(warningsOf({ masses: [{ at: 1.3, mass: 0.8e7 * barMass }] }).filter((w) => w.code === 'heavy-mass')).toEqual([])
    const [unlabelled] = warningsOf({ masses: [{ at: 1.3, mass: 3e7 * barMass }] }).filter((w) => w.code === 'heavy-mass')
    expect(unlabelled.message.startsWith("Point mass 1 is 3.0e+7 times the bar's mass")).toBe(true)
    // Against the first segment's mass alone this one would be above the limit: the whole bar counts.
    const firstOnly = RHO * area(0.03) * 0.4
    const mass = 0.9e7 * barMass
    expect(mass / firstOnly).toBeGreaterThan(1e7)
    expect(warningsOf({ masses: [{ at: 1.3, mass }] }).filter((w) => w.code === 'heavy-mass')).toEqual([])
  })
})

describe('elements and sections', () => {
  test('two attachments 1e-8 m apart: the second is analysed at the first, and the move is warned; 1e-4 m apart: neither', () => {
    const near = warningsOf({ masses: [{ at: 0.7, mass: 0.1 }], springs: [{ at: 0.7 + 1e-8, stiffness: 1e5, label: 'guide' }] })
    expect(near.filter((w) => w.code === 'sliver-element')).toEqual([])
    const moved = near.filter((w) => w.code === 'attachment-moved')
    expect(moved.length).toBe(1)
    expect(moved[0].message).toMatch(/^Spring 1 \(“guide”\) at 0\.70000001 m is analysed at 0\.7 m, another attachment 1\.0e-8 m away/)
    const apart = warningsOf({ masses: [{ at: 0.7, mass: 0.1 }], springs: [{ at: 0.7 + 1e-4, stiffness: 1e5 }] })
    expect(apart.filter((w) => w.code === 'sliver-element' || w.code === 'attachment-moved')).toEqual([])
  })

  test('EA/L spanning more than 1e8 along the bar: warned with the span; 5e7: not', () => {
    const span = (ratio: number) => {
      // Same material and length: EA/L in the ratio of the areas, so of the squared diameters.
      const big = 0.2
      const small = big / Math.sqrt(ratio)
      const project = [
        { length: 0.5, material: 'steel', section: { shape: 'solid', diameter: big } },
        { length: 0.5, material: 'steel', section: { shape: 'solid', diameter: small } },
      ]
      return modelWarnings(analyseProject(makeProject({ materials: [STEEL], segments: project }), { elementsPerSegment: 4, modes: 1 }, { withReference: false })).filter(
        (w) => w.code === 'stiffness-range',
      )
    }
    const wide = span(4e8)
    expect(wide.length).toBe(1)
    expect(wide[0].message).toContain('span 4.0e+8')
    expect(span(5e7)).toEqual([])
  })
})

describe('the backward error of a vector that is all zeros', () => {
  test('is 0, not 0/0: nothing is left of the residual', () => {
    const analysis = analyseProject(makeProject({ materials: [STEEL], segments }), { elementsPerSegment: 8, modes: 2 }, { withReference: false }).families[0]
    const zero = { ...analysis, vectors: [new Float64Array(analysis.vectors[0].length), analysis.vectors[1]] }
    const checks = modeChecks(zero)
    expect(checks.backwardErrors[0]).toBe(0)
    expect(checks.backwardErrors[1]).toBeLessThanOrEqual(checks.limit)
  })
})

describe('the solver’s own checks, and their prefix when several families are analysed', () => {
  const project = makeProject({
    version: 2,
    motions: ['axial', 'torsion'],
    materials: [{ ...STEEL, poissonRatio: 0.3 }],
    segments,
  })
  const analysis = analyseProject(project, { elementsPerSegment: 8, modes: 2 }, { withReference: false })

  test('a clean analysis has no warning at all', () => {
    expect(modelWarnings(analysis)).toEqual([])
  })

  test('a failed Sturm count and an unconverged solve are reported, named by their family', () => {
    const [axial, torsion] = analysis.families
    const broken: ModalAnalysis = { ...analysis, families: [axial, { ...torsion, sturm: { ...torsion.sturm, passed: false }, converged: false }] }
    const codes = familyWarnings(broken.families[1]).map((w) => w.code)
    expect(codes).toEqual(['sturm', 'convergence'])
    const messages = modelWarnings(broken).map((w) => w.message)
    expect(messages.length).toBe(2)
    expect(messages.every((m) => m.startsWith('Torsion: '))).toBe(true)
  })

  test('one family alone: no prefix; the analysis’s own warnings are passed on', () => {
    const single = analyseProject(makeProject({ materials: [STEEL], segments }), { elementsPerSegment: 8, modes: 2 }, { withReference: false })
    const family = single.families[0]
    const broken: ModalAnalysis = {
      ...single,
      families: [{ ...family, sturm: { ...family.sturm, passed: false } }],
      warnings: [{ code: 'stubby-segment', message: 'carried over' }],
    }
    const warnings = modelWarnings(broken)
    expect(warnings.map((w) => w.code)).toEqual(['sturm', 'stubby-segment'])
    expect(warnings[0].message.startsWith('The Sturm count')).toBe(true)
    expect(warnings[1].message).toBe('carried over')
  })
})
