/**
 * Which design parameters a project offers, per analysed motion, and what changing each does, by
 * the rules written in core/analysis/design-parameters.ts's header and the project file's JSON
 * paths (README, "Project file"): lengths and section dimensions act on every motion that the
 * section serves; E and ρ always; the shear modulus (or Poisson's ratio) only with torsion or
 * Timoshenko bending; masses on axial motion and bending, their polar inertia on torsion, their
 * transverse inertia on bending; springs on their own motion; the preload on bending.
 */
import { describe, expect, test } from 'vitest'
import { designParameters, findParameter, sectionDimensions, withParameter } from '../../core/analysis/design-parameters'
import type { Project } from '../../core/model/project'
import { displayUnit } from '../../core/model/units'
import { makeProject, STEEL } from '../helpers'

function full(motions: string[], extra: Record<string, unknown> = {}): Project {
  return makeProject({
    version: 2,
    motions,
    materials: [{ ...STEEL, name: 'spring steel', poissonRatio: 0.29 }],
    segments: [
      { length: 0.5, material: 'steel', section: { shape: 'tube', outerDiameter: 0.05, innerDiameter: 0.03 } },
      { length: 0.4, material: 'aluminium-6061-t6', section: { shape: 'rectangle', width: 0.04, height: 0.02 } },
      { length: 0.3, material: 'steel', section: { shape: 'area', area: 4e-4, secondMoment: 2e-8, torsionConstant: 3e-8, polarMoment: 4e-8 } },
    ],
    masses: [
      { at: 0.2, mass: 1.5, polarInertia: 0.01, transverseInertia: 0.02, label: 'hub' },
      { at: 0.7, mass: 0.5 },
    ],
    springs: [
      { at: 0.9, stiffness: 2e6 },
      { at: 1.0, stiffness: 300, motion: 'torsion', label: 'coupling' },
      { at: 1.2, stiffness: 0, rotationalStiffness: 500, motion: 'bending' },
    ],
    ends: { start: { axial: 'fixed', torsion: 'fixed', bending: 'clamped' }, end: { axial: 'free', torsion: 'free', bending: 'free' } },
    ...extra,
  })
}

const paths = (project: Project, motions?: string[]) => designParameters(project, motions as never).map((p) => p.path)

describe('the parameters each motion offers', () => {
  test('axial: lengths, the area-giving dimensions, E and ρ, masses, the axial spring', () => {
    expect(paths(full(['axial']))).toEqual([
      'segments[0].length',
      'segments[0].section.outerDiameter',
      'segments[0].section.innerDiameter',
      'segments[1].length',
      'segments[1].section.width',
      'segments[1].section.height',
      'segments[2].length',
      'segments[2].section.area',
      'materials[0].youngsModulus',
      'materials[0].density',
      'library["aluminium-6061-t6"].youngsModulus',
      'library["aluminium-6061-t6"].density',
      'masses[0].mass',
      'masses[1].mass',
      'springs[0].stiffness',
    ])
  })

  test('torsion: the torsion constants instead of the area, ν, the polar inertia of the hub, the torsional spring', () => {
    const list = paths(full(['torsion']))
    expect(list).toContain('segments[2].section.torsionConstant')
    expect(list).toContain('segments[2].section.polarMoment')
    expect(list).not.toContain('segments[2].section.area')
    expect(list).not.toContain('segments[2].section.secondMoment')
    expect(list).toContain('materials[0].poissonRatio')
    expect(list).toContain('masses[0].polarInertia')
    expect(list).not.toContain('masses[1].polarInertia')
    expect(list).not.toContain('masses[0].mass')
    expect(list).toEqual(expect.arrayContaining(['springs[1].stiffness']))
    expect(list).not.toContain('springs[0].stiffness')
    expect(list).not.toContain('preload')
  })

  test('bending: second moments, masses and their transverse inertia, the rotational spring, the preload; ν only under Timoshenko', () => {
    const list = paths(full(['bending'], { preload: -200 }))
    expect(list).toEqual(expect.arrayContaining(['segments[2].section.area', 'segments[2].section.secondMoment', 'masses[0].mass', 'masses[0].transverseInertia', 'springs[2].rotationalStiffness', 'preload']))
    expect(list).not.toContain('springs[2].stiffness')
    expect(list).not.toContain('materials[0].poissonRatio')
    expect(paths(full(['bending'], { analysis: { bendingTheory: 'timoshenko' } }))).toContain('materials[0].poissonRatio')
    // No preload, no preload parameter.
    expect(paths(full(['bending']))).not.toContain('preload')
  })

  test('what a file leaves out or sets to zero is no parameter: a mass without transverse inertia, a bending spring without (or with zero) rotational stiffness', () => {
    // A parameter that is absent (or 0) contributes nothing to the energy functionals and has no
    // value to scale (the header rules above): only the present, positive ones are offered.
    const project = full(['bending'], {
      masses: [
        { at: 0.2, mass: 1.5, transverseInertia: 0.02 },
        { at: 0.7, mass: 0.5 },
        { at: 0.8, mass: 0.4, transverseInertia: 0 },
      ],
      springs: [
        { at: 0.9, stiffness: 2e6, motion: 'bending' },
        { at: 1.0, stiffness: 3e5, rotationalStiffness: 0, motion: 'bending' },
        { at: 1.2, stiffness: 0, rotationalStiffness: 500, motion: 'bending' },
      ],
    })
    const list = paths(project)
    expect(list).toContain('masses[0].transverseInertia')
    expect(list).not.toContain('masses[1].transverseInertia')
    expect(list).not.toContain('masses[2].transverseInertia')
    expect(list).toEqual(expect.arrayContaining(['springs[0].stiffness', 'springs[1].stiffness', 'springs[2].rotationalStiffness']))
    expect(list).not.toContain('springs[0].rotationalStiffness')
    expect(list).not.toContain('springs[1].rotationalStiffness')
  })

  test('a density is a density: shown in kg/m³ (SI) and lbm/in³ (US)', () => {
    // The SI unit of density is kg/m³ (BIPM, The International System of Units, derived units);
    // lbm/in³ is the usual US customary one (common practice, no source).
    const density = designParameters(full(['axial'])).find((p) => p.path === 'materials[0].density')!
    expect(density.value).toBe(STEEL.density)
    expect(displayUnit('SI', density.quantity).symbol).toBe('kg/m³')
    expect(displayUnit('US', density.quantity).symbol).toBe('lbm/in³')
  })

  test('a given shear modulus is offered instead of Poisson’s ratio', () => {
    const project = makeProject({
      version: 2,
      motions: ['torsion'],
      materials: [{ ...STEEL, shearModulus: 79e9 }],
      segments: [{ length: 1, material: 'steel', section: { shape: 'solid', diameter: 0.02 } }],
      ends: { start: { torsion: 'fixed' }, end: { torsion: 'free' } },
    })
    const g = designParameters(project).find((p) => p.path === 'materials[0].shearModulus')!
    expect(g).toMatchObject({ label: 'shear modulus of steel', quantity: 'modulus', value: 79e9, target: { kind: 'shearModulus', material: 'steel' } })
  })

  test('labels, quantities, values and targets say what each is', () => {
    const list = designParameters(full(['axial', 'torsion', 'bending'], { preload: 150 }))
    const of = (path: string) => list.find((p) => p.path === path)!
    expect(of('segments[0].section.innerDiameter')).toMatchObject({ label: 'bore of segment 1', quantity: 'sectionDimension', value: 0.03, target: { kind: 'sectionDimension', segment: 0, dimension: 'innerDiameter' } })
    expect(of('segments[2].section.area')).toMatchObject({ label: 'area of segment 3', quantity: 'area', value: 4e-4 })
    expect(of('segments[2].section.torsionConstant')).toMatchObject({ label: 'torsion constant of segment 3', quantity: 'secondMoment', value: 3e-8 })
    expect(of('materials[0].youngsModulus')).toMatchObject({ label: "Young's modulus of spring steel", quantity: 'modulus' })
    expect(of('materials[0].poissonRatio')).toMatchObject({ label: "Poisson's ratio of spring steel", quantity: 'ratio', value: 0.29 })
    expect(of('masses[0].mass')).toMatchObject({ label: 'mass “hub”', quantity: 'mass', value: 1.5 })
    expect(of('masses[1].mass')).toMatchObject({ label: 'mass 2' })
    expect(of('masses[0].polarInertia')).toMatchObject({ label: 'polar inertia of mass “hub”', quantity: 'massInertia', value: 0.01, target: { kind: 'polarInertia', index: 0 } })
    expect(of('masses[0].transverseInertia')).toMatchObject({ label: 'transverse inertia of mass “hub”', quantity: 'massInertia', value: 0.02, target: { kind: 'transverseInertia', index: 0 } })
    expect(of('springs[0].stiffness')).toMatchObject({ label: 'stiffness of spring 1', quantity: 'stiffness' })
    expect(of('springs[1].stiffness')).toMatchObject({ label: 'stiffness of spring “coupling”', quantity: 'rotationalStiffness', value: 300 })
    expect(of('springs[2].rotationalStiffness')).toMatchObject({ label: 'rotational stiffness of spring 3', quantity: 'rotationalStiffness', value: 500, target: { kind: 'rotationalStiffness', index: 2 } })
    expect(of('preload')).toMatchObject({ label: 'preload', quantity: 'force', value: 150, target: { kind: 'preload' } })
    expect(list.find((p) => p.path === 'springs[2].stiffness')).toBeUndefined()
    expect(findParameter(full(['axial']), 'segments[1].section.height')?.value).toBe(0.02)
    expect(findParameter(full(['axial']), 'segments[9].length')).toBeUndefined()
  })

  test('section dimensions: a tube without a bore has none to change; an area section gives what its motions use', () => {
    expect(sectionDimensions({ shape: 'tube', outerDiameter: 0.05, innerDiameter: 0 })).toEqual(['outerDiameter'])
    expect(sectionDimensions({ shape: 'cone', startDiameter: 0.05, endDiameter: 0.03 })).toEqual(['startDiameter', 'endDiameter'])
    const area = { shape: 'area', area: 1e-4, secondMoment: 1e-9, secondMomentStrong: 2e-9, torsionConstant: 3e-9 } as const
    expect(sectionDimensions(area, ['torsion'])).toEqual(['torsionConstant'])
    expect(sectionDimensions(area, ['axial'])).toEqual(['area'])
    expect(sectionDimensions(area, ['bending'])).toEqual(['area', 'secondMoment', 'secondMomentStrong'])
    expect(sectionDimensions(area)).toEqual(['area', 'secondMoment', 'secondMomentStrong', 'torsionConstant'])
  })
})

describe('changing a parameter', () => {
  const project = full(['axial', 'torsion', 'bending'], { preload: 150 })
  const change = (path: string, value: number) => withParameter(project, findParameter(project, path)!.target, value)

  test('each field changes alone, in a copy', () => {
    expect(change('segments[1].section.width', 0.05).segments[1].section).toEqual({ shape: 'rectangle', width: 0.05, height: 0.02 })
    expect(change('segments[1].section.width', 0.05).segments[0]).toBe(project.segments[0])
    expect(change('materials[0].density', 7000).materials[0]).toMatchObject({ id: 'steel', density: 7000, youngsModulus: STEEL.youngsModulus })
    expect(change('materials[0].poissonRatio', 0.31).materials[0].poissonRatio).toBe(0.31)
    expect(change('masses[0].polarInertia', 0.03).masses[0]).toMatchObject({ mass: 1.5, polarInertia: 0.03, transverseInertia: 0.02 })
    expect(change('masses[0].transverseInertia', 0.05).masses[0].transverseInertia).toBe(0.05)
    expect(change('masses[1].mass', 0.9).masses.map((m) => m.mass)).toEqual([1.5, 0.9])
    expect(change('springs[2].rotationalStiffness', 800).springs[2]).toMatchObject({ stiffness: 0, rotationalStiffness: 800 })
    expect(change('springs[1].stiffness', 400).springs.map((s) => s.stiffness)).toEqual([2e6, 400, 0])
    expect(change('preload', -50).preload).toBe(-50)
    expect(project.preload).toBe(150)
  })

  test('a library material becomes a project material of the same id, with the library’s other values', () => {
    const changed = change('library["aluminium-6061-t6"].youngsModulus', 70e9)
    expect(changed.materials.length).toBe(2)
    const added = changed.materials[1]
    expect(added.id).toBe('aluminium-6061-t6')
    expect(added.youngsModulus).toBe(70e9)
    expect(added.density).toBeGreaterThan(2600)
    expect(added.density).toBeLessThan(2800) // 6061: about 2700 kg/m³ (docs/verification.md §6)
    expect(project.materials.length).toBe(1)
  })
})
