// @vitest-environment happy-dom
/**
 * The window's handling of the three motion families, against closed forms where there are
 * numbers: the editor's changes (motions, supports by family, shear stiffness, springs, what an
 * excitation drives), the refusal of a compression past Euler's load beside the preload field,
 * the slope of a bending mode shape, the forced response of a shaft in torsion, the units of the
 * new quantities, the family named in every warning, and the modes table's motion column.
 */
import { describe, expect, it } from 'vitest'
import { mount } from '@vue/test-utils'
import { analyseProject } from '../../core/analysis/modal-analysis'
import { excitationBands } from '../../core/analysis/resonance'
import { readProjectDocument } from '../../core/model/project-schema'
import type { Project } from '../../core/model/project'
import { INCH, POUND_FORCE, PSI } from '../../core/model/units'
import * as edits from '../../renderer/stores/project-edits'
import { useProjectStore } from '../../renderer/stores/project-store'
import { useResultsStore } from '../../renderer/stores/results-store'
import { defaultResponsePoint } from '../../renderer/stores/response-store'
import { solveTask } from '../../renderer/solver/solver-tasks'
import { responseTask } from '../../renderer/solver/design-tasks'
import { lowerQuantityOf } from '../../renderer/charts/family-shape-chart'
import { responseWords } from '../../renderer/format/design-text'
import { familyPairSentence, modeName, motionsText } from '../../renderer/format/motion'
import { closestPairAt } from '../../renderer/format/tuner-advice'
import ModesTable from '../../renderer/components/ModesTable.vue'
import { expectRelative } from '../helpers'
import { freshApp, settle } from './renderer-helpers'

const E = 200e9
const RHO = 7850
const NU = 0.3
const G = E / (2 * (1 + NU))
const L = 1.2
const D = 0.02
const I = (Math.PI / 64) * D ** 4
/** Polar moment and torsion constant of a solid round section, πd⁴/32. */
const J = (Math.PI / 32) * D ** 4

/** A uniform steel rod of every family: axial and torsion fixed–free, bending pinned–pinned. */
function rod(extra: Record<string, unknown> = {}): Project {
  const read = readProjectDocument({
    format: 'rodwave',
    version: 2,
    motions: ['axial', 'torsion', 'bending'],
    materials: [{ id: 'steel', youngsModulus: E, density: RHO, poissonRatio: NU }],
    segments: [{ length: L, material: 'steel', section: { shape: 'solid', diameter: D } }],
    ends: { start: { axial: 'fixed', torsion: 'fixed', bending: 'pinned' }, end: { axial: 'free', torsion: 'free', bending: 'pinned' } },
    analysis: { elementOrder: 2, elementsPerSegment: 60, mass: 'consistent', modes: 3 },
    ...extra,
  })
  if (!read.ok) throw new Error(read.issues.map((i) => `${i.path}: ${i.message}`).join('\n'))
  return read.project
}

describe('the editor’s changes by family', () => {
  it('keeps at least one family analysed', () => {
    const p = rod({ motions: ['bending'] })
    edits.setMotion(p, 'bending', false)
    expect(p.motions).toEqual(['bending'])
    edits.setMotion(p, 'axial', true)
    expect(p.motions).toEqual(['axial', 'bending'])
    edits.setMotion(p, 'bending', false)
    expect(p.motions).toEqual(['axial'])
  })

  it('sets one family’s condition at one end, leaving the others', () => {
    const p = rod()
    edits.setFamilyEnd(p, 'end', 'bending', 'guided')
    edits.setFamilyEnd(p, 'start', 'torsion', 'free')
    expect(p.ends.end).toEqual({ axial: 'free', torsion: 'free', bending: 'guided' })
    expect(p.ends.start).toEqual({ axial: 'fixed', torsion: 'free', bending: 'pinned' })
  })

  it('gives the shear stiffness the other way with G = E / (2(1 + ν)) (isotropic elasticity; e.g. S. Timoshenko & J. N. Goodier, Theory of Elasticity, from memory)', () => {
    const p = rod()
    edits.setShearGiven(p, 0, 'shearModulus')
    expect(p.materials[0].poissonRatio).toBeUndefined()
    expectRelative(p.materials[0].shearModulus!, G, 1e-5, 'G from ν')
    edits.setShearGiven(p, 0, 'poissonRatio')
    expect(p.materials[0].shearModulus).toBeUndefined()
    expectRelative(p.materials[0].poissonRatio!, NU, 1e-5, 'ν back from G')
  })

  it('keeps a rotational stiffness only on a bending spring, and leaves an axial spring without a motion field (as version 1 wrote it)', () => {
    const p = rod({ springs: [{ at: 0.6, motion: 'bending', stiffness: 1e5, rotationalStiffness: 200 }] })
    edits.setSpringMotion(p, 0, 'torsion')
    expect(p.springs[0]).toEqual({ at: 0.6, motion: 'torsion', stiffness: 1e5 })
    edits.setSpringMotion(p, 0, 'axial')
    expect(p.springs[0]).toEqual({ at: 0.6, stiffness: 1e5 })
    edits.addAttachment(p, 'springs', { at: 0.3, value: 50, label: 'coupling', motion: 'torsion' })
    expect(p.springs[1]).toEqual({ at: 0.3, motion: 'torsion', stiffness: 50, label: 'coupling' })
    // An emptied inertia is removed (optional), not left as a field the file would refuse.
    const q = rod({ masses: [{ at: 1.2, mass: 2, polarInertia: 0.01 }] })
    edits.updateAttachment(q, 'masses', 0, 'polarInertia', undefined)
    expect(q.masses[0]).toEqual({ at: 1.2, mass: 2 })
  })

  it('narrows what an excitation drives, drops the list when it names every family, and never empties it', () => {
    const p = rod({ excitations: [{ label: 'gear mesh', hz: 400 }] })
    edits.setExcites(p, 0, 'axial', false)
    edits.setExcites(p, 0, 'bending', false)
    expect(p.excitations[0].excites).toEqual(['torsion'])
    edits.setExcites(p, 0, 'torsion', false)
    expect(p.excitations[0].excites).toEqual(['torsion'])
    edits.setExcites(p, 0, 'axial', true)
    edits.setExcites(p, 0, 'bending', true)
    expect(p.excitations[0].excites).toBeUndefined()
    expect(edits.excitesOf(p.excitations[0])).toEqual(['axial', 'torsion', 'bending'])
  })

  it('puts the default load of a response where the family lets the part move: the free end, else mid-span', () => {
    const p = rod()
    expect(defaultResponsePoint(p, 'axial')).toBe(L)
    expect(defaultResponsePoint(p, 'torsion')).toBe(L)
    expect(defaultResponsePoint(p, 'bending')).toBe(L / 2)
  })
})

describe('a compression past the buckling load', () => {
  // Euler's load of a pinned–pinned strut, π²EI/L² (S. P. Timoshenko & J. M. Gere, Theory of Elastic Stability, §2.1, from memory).
  const euler = (Math.PI ** 2 * E * I) / (L * L)

  it('gives the critical compression of the part on its bending supports (Euler’s load, 1e-6)', () => {
    const outcome = solveTask(rod({ preload: -0.3 * euler }))
    if (!outcome.ok) throw new Error('a compression of 30 % of Euler’s load is carried')
    expectRelative(outcome.model.buckling!.criticalCompression, euler, 1e-6, 'critical compression')
    expectRelative(outcome.model.buckling!.compression, 0.3 * euler, 1e-12, 'compression')
  })

  it('is refused with the load named on the preload field; the last valid results stay, marked as such, until the preload is fixed', async () => {
    freshApp()
    const project = useProjectStore()
    const results = useResultsStore()
    project.load(rod({ preload: -0.6 * euler }), { path: null, name: 'rod' })
    await results.solveCurrent()
    const valid = results.solved
    expect(valid).not.toBeNull()
    // Above half the load: the analysis warns, and the window passes it on.
    expect(results.warnings.some((w) => w.text.includes('% of the part\'s buckling load'))).toBe(true)
    project.edit((p) => edits.setPreload(p, -1.1 * euler), 'preload')
    await results.solveCurrent()
    await settle()
    expect(results.inputProblem?.path).toBe('preload')
    expect(results.inputProblem?.message).toContain('at or beyond the buckling load')
    expect(results.inputProblem?.message).toContain(Number(euler.toPrecision(4)).toLocaleString('en-US'))
    expect(results.solved).toBe(valid)
    expect(results.stale).toBe(true)
    expect(results.warnings.some((w) => w.level === 'problem' && w.text.includes('(preload)'))).toBe(true)
    project.edit((p) => edits.setPreload(p, -0.2 * euler), 'preload')
    await results.solveCurrent()
    expect(results.inputProblem).toBeNull()
    expect(results.stale).toBe(false)
  })
})

describe('mode shapes of bending', () => {
  it('carry the slope: for a pinned–pinned beam w = sin(πx/L), so w′ = ±π/L at the ends per unit peak (1e-4)', () => {
    const outcome = solveTask(rod({ motions: ['bending'], preload: 1000 }))
    if (!outcome.ok) throw new Error('solves')
    const curve = outcome.model.families[0].shapes.curves[0]
    expect(curve.displacement.reduce((a, b) => Math.max(a, Math.abs(b)), 0)).toBeCloseTo(1, 12)
    const slope = curve.rotation!
    expectRelative(slope[0], Math.PI / L, 1e-4, 'slope at the start')
    expectRelative(slope[slope.length - 1], -Math.PI / L, 1e-4, 'slope at the end')
    // Mid-span: the crest, no slope.
    const mid = curve.x.findIndex((x) => Math.abs(x - L / 2) < 1e-9)
    expect(Math.abs(slope[mid])).toBeLessThan(1e-6)
  })
})

describe('forced response of a shaft in torsion', () => {
  // A fixed–free shaft with a torque T at its free end: with k = ω/c, c = √(G/ρ), θ(x) = T sin(kx)/(GJ k cos kL),
  // so the static tip flexibility is L/(GJ) and the largest shear stress per torque is r/J at the fixed end
  // statically, √2·r/J at kL = π/4 (S. S. Rao, Mechanical Vibrations, torsional vibration of shafts, from memory).
  const c = Math.sqrt(G / RHO)
  const f1 = c / (4 * L)
  const shaft = rod({
    motions: ['torsion'],
    damping: 1e-4,
    analysis: { elementOrder: 2, elementsPerSegment: 200, mass: 'consistent', modes: 6 },
    excitations: [
      { label: 'half the first mode', hz: f1 / 2, excites: ['torsion'] },
      { label: 'axial only', hz: f1 / 2, excites: ['axial'] },
    ],
  })
  const result = responseTask(shaft, { family: 'torsion', forceAt: L, responseAt: L, fromHz: 0, toHz: 3 * f1, points: 50, axis: 'linear' })

  it('is the torsion family’s, with the static twist per torque L/(GJ) (1e-9)', () => {
    expect(result.motion).toBe('torsion')
    expectRelative(result.staticFlexibility!, L / (G * J), 1e-9, 'static twist per torque')
  })

  it('lists only the excitations that drive torsion, with amplification 4/π and stress per torque √2·r/J at half the first frequency (1e-4)', () => {
    expect(result.bands.map((b) => b.band.label)).toEqual(['half the first mode'])
    const band = result.bands[0]
    expectRelative(band.amplification!, 4 / Math.PI, 1e-4, 'amplification')
    expectRelative(band.stressPerForce, (Math.SQRT2 * (D / 2)) / J, 1e-3, 'shear stress per torque')
  })
})

describe('units of the new quantities (NIST SP 811: 1 in = 0.0254 m, 1 lbf = 4.4482216152605 N)', () => {
  it('shows a torsional receptance in rad/(N·m) or rad/(lbf·in), its stress per torque in MPa/(N·m) or psi/(lbf·in)', () => {
    const si = responseWords('torsion', 'SI')
    expect([si.ratio, si.ratioUnit, si.ratioFactor, si.stressUnit]).toEqual(['|θ/T|', 'rad/(N·m)', 1, 'MPa/(N·m)'])
    expectRelative(si.stressFactor, 1e-6, 1e-15, 'MPa per Pa')
    const us = responseWords('torsion', 'US')
    expect(us.ratioUnit).toBe('rad/(lbf·in)')
    expectRelative(us.ratioFactor, POUND_FORCE * INCH, 1e-15, 'rad/(N·m) → rad/(lbf·in)')
    expectRelative(us.stressFactor, (POUND_FORCE * INCH) / PSI, 1e-15, 'Pa/(N·m) → psi/(lbf·in)')
    expect(responseWords('bending', 'SI')).toMatchObject({ load: 'side force', ratio: '|w/F|', ratioUnit: 'm/N', stressUnit: 'MPa/N' })
  })

  it('labels the lower mode-shape plot per family, per unit of peak motion', () => {
    expect(lowerQuantityOf('bending', 'stress', 'SI')).toMatchObject({ unit: 'MPa/mm', factor: 1e-3 / 1e6 })
    expect(lowerQuantityOf('bending', 'slope', 'SI')).toMatchObject({ unit: 'rad/mm', factor: 1e-3 })
    expectRelative(lowerQuantityOf('bending', 'stress', 'US').factor, INCH / PSI, 1e-15, 'Pa/m → psi/in')
    expect(lowerQuantityOf('torsion', 'stress', 'SI')).toMatchObject({ unit: 'MPa/rad', factor: 1e-6 })
    expect(lowerQuantityOf('torsion', 'strain', 'US')).toMatchObject({ unit: '1/in', factor: INCH })
  })
})

describe('words that name the family', () => {
  it('names the family in conflict first, and every motion a clear verdict covers', () => {
    const pair = { mode: 1, motion: 'bending' as const, plane: 'weak' as const }
    expect(familyPairSentence('Mode 1 at 51.2 Hz is 2.6 % above Pump ×1 (49.33–49.83 Hz)', pair)).toBe('Bending mode 1 (weak plane) at 51.2 Hz is 2.6 % above Pump ×1 (49.33–49.83 Hz)')
    const torsionMode: { mode: number; motion: 'torsion'; plane: null } = { mode: 3, motion: 'torsion', plane: null }
    expect(modeName(torsionMode)).toBe('torsion mode 3')
    expect(motionsText([{ motion: 'axial' }, { motion: 'torsion' }, { motion: 'bending', plane: 'strong' }])).toBe('axial motion, torsion and bending (strong plane)')
  })

  it('finds a tuner’s closest pair only among the families a band drives', () => {
    const bands = excitationBands([{ label: 'gear mesh', hz: 100, excites: ['torsion'] }, { label: 'pump', hz: 300 }], ['axial', 'torsion'])
    // Axial mode 1 sits on the gear mesh (1 %), which drives torsion only: the closest pair is torsion's, 20 % from it.
    const pair = closestPairAt([101, 120], bands, [{ family: 'axial', mode: 1 }, { family: 'torsion', mode: 1 }])
    expect(pair).toMatchObject({ family: 'torsion', mode: 1, motion: 'torsion' })
    expect(pair!.band.label).toBe('gear mesh')
    expectRelative(pair!.separation, 0.2, 1e-12, 'separation')
    // Without the layout every band meets every frequency (a result of one family).
    expect(closestPairAt([101, 120], bands)!.separation).toBeCloseTo(0.01, 12)
  })
})

describe('the modes table with every family', () => {
  it('gives each row its motion, torsion its effective polar inertia in kg·m², and filters by family', async () => {
    freshApp()
    const analysis = analyseProject(rod())
    const wrapper = mount(ModesTable, { props: { modes: analysis.modes, units: 'SI', shownModes: [], closest: new Map() } })
    const motions = wrapper.findAll('tbody tr').map((tr) => tr.findAll('td')[2].text())
    expect(motions).toEqual(analysis.modes.map((m) => m.motion))
    expect(wrapper.get('thead').text()).toContain('torsion: polar inertia')
    const torsion = wrapper.get('[data-testid="mode-row-torsion-1"]').findAll('td')
    expect(torsion[7].text()).toContain('kg·m²')
    await wrapper.setProps({ family: 'bending' })
    expect(wrapper.findAll('tbody tr').map((tr) => tr.attributes('data-family'))).toEqual(['bending', 'bending', 'bending'])
  })
})
