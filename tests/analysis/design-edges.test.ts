/**
 * The design tools at their edges: the words of a sensitivity (whose number comes from
 * df/dL = −f/L of a uniform fixed–free bar, f = c/4L: docs/verification.md §1); the separation of
 * a mode's tolerance band from an excitation band (§8: measured from the nearest edges, 0 when
 * they overlap); the tuner's refusals, each naming what is wrong; a tolerance draw of a library
 * material and of a tube whose bore could reach its outside; a draw of every kind of parameter
 * (each moves by at most its tolerance, and nothing else moves).
 */
import { describe, expect, test } from 'vitest'
import { describeSensitivity, frequencySensitivities } from '../../core/analysis/sensitivity'
import { separationBetweenBands } from '../../core/analysis/resonance'
import { tuneParameter, TuneError } from '../../core/analysis/tuner'
import { scatterDraw } from '../../core/analysis/tolerance-scatter'
import { designParameters } from '../../core/analysis/design-parameters'
import { seededRandom } from '../../core/random'
import { expectRelative, makeProject, STEEL, uniformBar } from '../helpers'

const c = Math.sqrt(STEEL.youngsModulus / STEEL.density)

describe('sensitivity in words', () => {
  test('shortening a 1.2 m fixed–free bar by 10 mm raises mode 1 by f/L × 10 mm', () => {
    const L = 1.2
    const s = frequencySensitivities(uniformBar({ length: L }), 1).find((x) => x.parameter === 'segments[0].length')!
    const f = c / (4 * L)
    const hz = (value: number) => `${value.toFixed(3)} Hz`
    expect(describeSensitivity(s, -0.01, '10 mm', hz)).toBe(`reducing the length of segment 1 by 10 mm raises mode 1 by ${hz((f / L) * 0.01)}`)
    expect(describeSensitivity(s, 0.02, '20 mm', hz)).toBe(`increasing the length of segment 1 by 20 mm lowers mode 1 by ${hz((f / L) * 0.02)}`)
    const density = frequencySensitivities(uniformBar({ length: L }), 1).find((x) => x.parameter === 'materials[0].density')!
    // df/dρ = −f/(2ρ) (§1): a zero step changes nothing and still reads as an increase that raises by 0.
    expect(describeSensitivity(density, 0, 'nothing', hz)).toBe('increasing the density of steel by nothing raises mode 1 by 0.000 Hz')
  })
})

describe('parameters of other motions have no axial effect', () => {
  test('a hub’s polar and transverse inertia, Poisson’s ratio, the preload: df = 0 for the axial modes', () => {
    const project = makeProject({
      version: 2,
      motions: ['axial', 'torsion', 'bending'],
      materials: [{ ...STEEL, poissonRatio: 0.3 }],
      segments: [{ length: 1, material: 'steel', section: { shape: 'solid', diameter: 0.03 } }],
      masses: [{ at: 1, mass: 2, polarInertia: 0.01, transverseInertia: 0.02 }],
      springs: [{ at: 0.5, stiffness: 100, motion: 'torsion' }],
      ends: { start: { axial: 'fixed', torsion: 'fixed', bending: 'clamped' }, end: { axial: 'free', torsion: 'free', bending: 'free' } },
      preload: 500,
    })
    const parameters = designParameters(project).filter((p) => ['polarInertia', 'transverseInertia', 'preload', 'poissonRatio'].includes(p.target.kind))
    expect(parameters.length).toBe(4)
    const s = frequencySensitivities(project, 2, parameters)
    expect(s.length).toBe(8)
    for (const x of s) expect(x.derivative, x.parameter).toBe(0)
  })
})

describe('separation of a band of frequencies from an excitation band (§8)', () => {
  test('below, above and overlapping', () => {
    expectRelative(separationBetweenBands([80, 90], [100, 120]), (90 - 100) / 100, 1e-15, 'below')
    expectRelative(separationBetweenBands([130, 150], [100, 120]), (130 - 120) / 120, 1e-15, 'above')
    expect(separationBetweenBands([95, 105], [100, 120])).toBe(0)
    expect(separationBetweenBands([115, 125], [100, 120])).toBe(0)
    expect(separationBetweenBands([120, 125], [100, 120])).toBe(0)
  })
})

describe('the tuner refuses what it cannot do, naming it', () => {
  const bar = uniformBar({ length: 1, extra: { excitations: [{ label: 'pump', hz: 1500 }] } })
  test('an unknown parameter, bad bounds, a motion not analysed, a target ≤ 0, no excitation', () => {
    expect(() => tuneParameter(bar, { parameter: 'segments[4].length', min: 0.5, max: 2 })).toThrow(
      new TuneError('"segments[4].length" is not a parameter of this project (see the sensitivity command for the list)'),
    )
    for (const [min, max] of [
      [0, 1],
      [1, 1],
      [2, 1],
    ]) {
      expect(() => tuneParameter(bar, { parameter: 'segments[0].length', min, max }), `${min} … ${max}`).toThrow(new TuneError('the bounds must satisfy 0 < min < max'))
    }
    for (const [min, max] of [
      [Number.NaN, 1],
      [0.5, Infinity],
    ]) {
      expect(() => tuneParameter(bar, { parameter: 'segments[0].length', min, max }), `${min} … ${max}`).toThrow(new TuneError('the bounds must be finite numbers'))
    }
    expect(() => tuneParameter(bar, { parameter: 'segments[0].length', min: 0.5, max: 2, motion: 'torsion' })).toThrow(new TuneError('the project does not analyse torsion'))
    expect(() => tuneParameter(bar, { parameter: 'segments[0].length', min: 0.5, max: 2, targetHz: 0 })).toThrow(new TuneError('the target frequency must be > 0'))
    expect(() => tuneParameter(uniformBar({ length: 1 }), { parameter: 'segments[0].length', min: 0.5, max: 2 })).toThrow(
      new TuneError('the project has no excitations to separate from; give --mode and --target instead'),
    )
  })

  test('an unreachable target names the range in the parameter’s SI unit', () => {
    // f₁ = c/(4L) for L in [0.5, 2] m spans c/8 … c/2 (§1).
    try {
      tuneParameter(bar, { parameter: 'segments[0].length', min: 0.5, max: 2, targetHz: 10 })
      expect.unreachable()
    } catch (error) {
      expect(error).toBeInstanceOf(TuneError)
      expect((error as Error).message).toBe(
        `no value of length of segment 1 between 0.5 and 2 m puts mode 1 on 10 Hz; over that range it moves between ${(c / 8).toPrecision(6)} and ${(c / 2).toPrecision(6)} Hz`,
      )
    }
    // A unitless parameter (Poisson's ratio has no SI unit in the list): no double space is left.
    const shaft = makeProject({
      version: 2,
      motions: ['torsion'],
      materials: [{ ...STEEL, poissonRatio: 0.3 }],
      segments: [{ length: 1, material: 'steel', section: { shape: 'solid', diameter: 0.02 } }],
      ends: { start: { torsion: 'fixed' }, end: { torsion: 'free' } },
    })
    try {
      tuneParameter(shaft, { parameter: 'materials[0].poissonRatio', min: 0.1, max: 0.4, targetHz: 5 })
      expect.unreachable()
    } catch (error) {
      expect((error as Error).message).toMatch(/^no value of Poisson's ratio of steel between 0\.1 and 0\.4 puts mode 1 on 5 Hz; over that range it moves between /)
    }
  })
})

describe('tolerance draws', () => {
  test('a library material scatters as a project material of its id, keeping the library’s other values', () => {
    const project = makeProject({ materials: [], segments: [{ length: 1, material: 'aluminium-6061-t6', section: { shape: 'solid', diameter: 0.02 } }] })
    const drawn = scatterDraw(project, { youngsModulus: 0.05 }, seededRandom(5))
    expect(drawn.materials.length).toBe(1)
    expect(drawn.materials[0].id).toBe('aluminium-6061-t6')
    const E = drawn.materials[0].youngsModulus
    // 6061-T6: E = 68.9 GPa (docs/verification.md §6); ±5 %.
    expect(Math.abs(E / 68.9e9 - 1)).toBeLessThanOrEqual(0.05 + 1e-9)
    expect(E).not.toBe(68.9e9)
  })

  test('a diameter tolerance that lets a thin tube’s bore reach its outside is refused, naming the segment', () => {
    const project = makeProject({
      materials: [STEEL],
      segments: [
        { length: 1, material: 'steel', section: { shape: 'solid', diameter: 0.02 } },
        { length: 1, material: 'steel', section: { shape: 'tube', outerDiameter: 0.0201, innerDiameter: 0.02 } },
      ],
    })
    let refused: Error | null = null
    for (let seed = 1; seed <= 40 && !refused; seed++) {
      try {
        scatterDraw(project, { diameter: 0.05 }, seededRandom(seed))
      } catch (error) {
        refused = error as Error
      }
    }
    expect(refused?.message).toBe('the diameter tolerance lets the bore of segment 2 reach its outer diameter; reduce tolerances.diameter')
  })

  test('every kind of parameter moves within its tolerance; without tolerances nothing moves', () => {
    const project = makeProject({
      version: 2,
      motions: ['axial', 'torsion', 'bending'],
      materials: [{ ...STEEL, poissonRatio: 0.3 }],
      segments: [{ length: 1, material: 'steel', section: { shape: 'solid', diameter: 0.03 } }],
      masses: [{ at: 0.5, mass: 2, polarInertia: 0.01, transverseInertia: 0.02 }],
      springs: [
        { at: 1, stiffness: 1e6 },
        { at: 0.7, stiffness: 0, rotationalStiffness: 400, motion: 'bending' },
      ],
      ends: { start: { axial: 'fixed', torsion: 'fixed', bending: 'clamped' }, end: { axial: 'free', torsion: 'free', bending: 'free' } },
      preload: 1000,
    })
    const t = { youngsModulus: 0.01, density: 0.02, length: 0.03, diameter: 0.04, mass: 0.05, stiffness: 0.06, poissonRatio: 0.07 }
    const drawn = scatterDraw(project, t, seededRandom(17))
    const within = (value: number, nominal: number, tolerance: number, what: string) => {
      expect(Math.abs(value / nominal - 1), `${what}: ${value} against ${nominal} ± ${tolerance}`).toBeLessThanOrEqual(tolerance + 1e-12)
      expect(value, `${what} drawn`).not.toBe(nominal)
    }
    within(drawn.materials[0].youngsModulus, STEEL.youngsModulus, t.youngsModulus, 'E')
    within(drawn.materials[0].density, STEEL.density, t.density, 'ρ')
    within(drawn.materials[0].poissonRatio!, 0.3, t.poissonRatio, 'ν')
    within(drawn.segments[0].length, 1, t.length, 'length')
    within((drawn.segments[0].section as { diameter: number }).diameter, 0.03, t.diameter, 'diameter')
    within(drawn.masses[0].mass, 2, t.mass, 'mass')
    within(drawn.masses[0].polarInertia!, 0.01, t.mass, 'polar inertia')
    within(drawn.masses[0].transverseInertia!, 0.02, t.mass, 'transverse inertia')
    within(drawn.springs[0].stiffness, 1e6, t.stiffness, 'spring')
    within(drawn.springs[1].rotationalStiffness!, 400, t.stiffness, 'rotational spring')
    // The preload has no tolerance: it stays.
    expect(drawn.preload).toBe(1000)
    const still = scatterDraw(project, {}, seededRandom(17))
    expect(still.segments[0].length).toBe(1)
    expect(still.materials[0].youngsModulus).toBe(STEEL.youngsModulus)
    expect(still.masses[0].polarInertia).toBe(0.01)
  })
})
