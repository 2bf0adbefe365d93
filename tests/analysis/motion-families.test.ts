/**
 * The analysis of every motion family of one part: references per family, effective mass per
 * family, resonance pairs by what each excitation drives, the modal summary's motion column,
 * and version 1 files unchanged. Expected frequencies are the closed forms of the uniform
 * bar, shaft and beam (S. S. Rao, Mechanical Vibrations, continuous systems; R. D. Blevins,
 * Formulas for Natural Frequency and Mode Shape; both from memory — see docs/verification.md),
 * computed in the test.
 */
import { describe, expect, test } from 'vitest'
import { analyseProject } from '../../core/analysis/modal-analysis'
import { modalSummaryCsv, solveDocument } from '../../core/analysis/modal-summary'
import { readProjectDocument, readProjectText } from '../../core/model/project-schema'
import { writeProjectText } from '../../core/model/project-file'
import type { Project } from '../../core/model/project'
import { expectRelative } from '../helpers'

const E = 2e11
const RHO = 7850
const NU = 0.3
const G = E / (2 * (1 + NU))
const L = 1.2
const D = 0.03
const A = (Math.PI / 4) * D * D
const I = (Math.PI / 64) * D ** 4

function project(doc: Record<string, unknown>): Project {
  const read = readProjectDocument({ format: 'rodwave', version: 2, materials: [{ id: 'steel', youngsModulus: E, density: RHO, poissonRatio: NU }], ...doc })
  if (!read.ok) throw new Error(read.issues.map((i) => `${i.path}: ${i.message}`).join('\n'))
  return read.project
}

/** A uniform round rod, fixed (clamped) at the start and free at the end in every family. */
const rod = (extra: Record<string, unknown> = {}) =>
  project({
    motions: ['axial', 'torsion', 'bending'],
    segments: [{ length: L, material: 'steel', section: { shape: 'solid', diameter: D } }],
    ends: { start: { axial: 'fixed', torsion: 'fixed', bending: 'clamped' }, end: { axial: 'free', torsion: 'free', bending: 'free' } },
    analysis: { elementsPerSegment: 60, modes: 3 },
    ...extra,
  })

// Closed forms: fixed–free bar and shaft (2n − 1)c/4L; clamped–free beam (βL)²/(2πL²)√(EI/ρA), βL by bisection on cos cosh = −1.
const axialHz = (n: number) => ((2 * n - 1) / (4 * L)) * Math.sqrt(E / RHO)
const torsionHz = (n: number) => ((2 * n - 1) / (4 * L)) * Math.sqrt(G / RHO)
function cantileverHz(n: number): number {
  let lo = (n - 1) * Math.PI + 0.1
  let hi = n * Math.PI
  const f = (x: number) => Math.cos(x) + 1 / Math.cosh(x)
  for (let i = 0; i < 200; i++) {
    const mid = 0.5 * (lo + hi)
    if (f(lo) * f(mid) <= 0) hi = mid
    else lo = mid
  }
  const b = 0.5 * (lo + hi)
  return ((b * b) / (2 * Math.PI * L * L)) * Math.sqrt((E * I) / (RHO * A))
}

describe('a part analysed in all three families', () => {
  const analysis = analyseProject(rod())
  test('families in the reported order, each mode numbered within its family', () => {
    expect(analysis.families.map((f) => f.family.key)).toEqual(['axial', 'torsion', 'bending'])
    expect(analysis.modes.map((m) => `${m.motion} ${m.mode}`)).toEqual(['axial 1', 'axial 2', 'axial 3', 'torsion 1', 'torsion 2', 'torsion 3', 'bending 1', 'bending 2', 'bending 3'])
  })
  test('every reference is exact and equals its closed form to 1e-12; the finite elements within 2e-3', () => {
    const expected: Record<string, (n: number) => number> = { axial: axialHz, torsion: torsionHz, bending: cantileverHz }
    for (const f of analysis.families) {
      expect(f.reference.method, f.family.key).toBe('exact')
      f.modes.forEach((m) => {
        expectRelative(m.referenceHz!, expected[f.family.key](m.mode), 1e-12, `${f.family.key} ${m.mode} reference`)
        expectRelative(m.frequencyHz, expected[f.family.key](m.mode), 2e-3, `${f.family.key} ${m.mode} finite elements`)
      })
    }
  })
  test('effective mass per family: 8/((2n − 1)²π²) of the mass in axial motion, of the polar inertia in torsion', () => {
    for (const key of ['axial', 'torsion']) {
      analysis.modes.filter((m) => m.family === key).forEach((m) => expectRelative(m.effectiveMassFraction!, 8 / ((2 * m.mode - 1) ** 2 * Math.PI ** 2), 1e-3, `${key} ${m.mode}`))
    }
    // Polar inertia in kg·m²: ρ Ip L.
    const torsion = analysis.families[1]
    expectRelative(torsion.model.totalMass, RHO * ((Math.PI / 32) * D ** 4) * L, 1e-12, 'polar inertia of the shaft')
  })
  test('the solve document and the modal summary carry the motion of each mode', () => {
    const doc = solveDocument(analysis)
    expect(doc.modes.map((m) => m.motion)).toEqual(analysis.modes.map((m) => m.motion))
    expect(Object.keys(doc.reference.families)).toEqual(['axial', 'torsion', 'bending'])
    expect(doc.reference.frequenciesHz).toEqual(doc.reference.families.axial)
    expect(doc.reference.methods).toEqual({ axial: 'exact', torsion: 'exact', bending: 'exact' })
    const csv = modalSummaryCsv(analysis).trim().split('\r\n')
    expect(csv[0].split(',').slice(0, 3)).toEqual(['mode', 'motion', 'frequency_hz'])
    expect(csv.slice(1).map((row) => row.split(',')[1])).toEqual(analysis.modes.map((m) => m.motion))
  })
})

describe('excitations drive the families they name', () => {
  test('one that names only torsion is paired only with torsion modes; one that names nothing with every family', () => {
    const analysis = analyseProject(
      rod({
        excitations: [
          { label: 'Gear mesh', hz: 900, excites: ['torsion'] },
          { label: 'Line', hz: 100 },
        ],
      }),
    )
    const gear = analysis.resonance.filter((p) => p.band.label === 'Gear mesh')
    expect(new Set(gear.map((p) => p.motion))).toEqual(new Set(['torsion']))
    expect(gear).toHaveLength(3)
    const line = analysis.resonance.filter((p) => p.band.label === 'Line')
    expect(new Set(line.map((p) => p.motion))).toEqual(new Set(['axial', 'torsion', 'bending']))
  })
  test('an excitation that drives only an unanalysed family is said to check nothing', () => {
    const analysis = analyseProject(rod({ motions: ['axial'], excitations: [{ label: 'Gear mesh', hz: 900, excites: ['torsion'] }] }))
    expect(analysis.resonance).toEqual([])
    expect(analysis.warnings.map((w) => w.code)).toContain('excitation-unanalysed')
  })
})

describe('file format version 2', () => {
  test('a version 1 file reads as version 2, axial only, its ends the axial conditions, and writes back as version 2', () => {
    const read = readProjectText(
      JSON.stringify({ format: 'rodwave', version: 1, materials: [], segments: [{ length: 1, material: 'carbon-steel', section: { shape: 'solid', diameter: 0.02 } }], ends: { start: 'fixed', end: 'free' } }),
    )
    expect(read.ok).toBe(true)
    if (!read.ok) return
    expect(read.project.version).toBe(2)
    expect(read.project.motions).toEqual(['axial'])
    expect(read.project.ends.start).toEqual({ axial: 'fixed', torsion: 'free', bending: 'free' })
    const again = readProjectText(writeProjectText(read.project))
    expect(again.ok && again.project).toEqual(read.project)
    expect(JSON.parse(writeProjectText(read.project)).version).toBe(2)
  })
  test.each([
    [{ motions: ['torsion'], materials: [{ id: 'x', youngsModulus: 2e11, density: 7850 }], segments: [{ length: 1, material: 'x', section: { shape: 'solid', diameter: 0.02 } }] }, 'materials[0].poissonRatio: needed for torsion (or give shearModulus)'],
    [{ motions: ['bending'], segments: [{ length: 1, material: 'carbon-steel', section: { shape: 'area', area: 1e-4 } }] }, 'segments[0].section.secondMoment: needed for bending'],
    [{ motions: ['torsion'], segments: [{ length: 1, material: 'carbon-steel', section: { shape: 'area', area: 1e-4, secondMoment: 1e-9 } }] }, 'segments[0].section.torsionConstant: needed for torsion'],
    [{ motions: ['bending'], springs: [{ at: 0.5, motion: 'bending', stiffness: 0 }] }, 'springs[0].stiffness: a bending spring needs a sideways stiffness or a rotationalStiffness > 0'],
    [{ springs: [{ at: 0.5, stiffness: 1e5, rotationalStiffness: 3 }] }, 'springs[0].rotationalStiffness: only a bending spring has a rotational stiffness; this spring acts in axial'],
    [{ motions: [] }, 'motions: must name at least one of "axial", "torsion", "bending"'],
    [{ motions: ['axial', 'axial'] }, 'motions: must not name a motion twice'],
    [{ title: 'Rod \u001b]0;owned\u0007' }, 'title: must not contain control characters (found U+001B)'],
    [{ ends: { start: { bending: 'welded' }, end: 'free' } }, 'ends.start.bending: must be one of: "clamped", "pinned", "guided", "free"'],
  ])('%#: %s', (change, expected) => {
    const doc = {
      format: 'rodwave',
      version: 2,
      segments: [{ length: 1, material: 'carbon-steel', section: { shape: 'solid', diameter: 0.02 } }],
      ends: { start: 'fixed', end: 'free' },
      ...change,
    }
    const read = readProjectDocument(doc)
    expect(read.ok).toBe(false)
    if (!read.ok) expect(read.issues.map((i) => `${i.path}: ${i.message}`)).toContain(expected)
  })
  test('a long value is echoed in at most 60 characters', () => {
    const read = readProjectDocument({
      format: 'rodwave',
      version: 2,
      segments: [{ length: 1, material: 'x'.repeat(90), section: { shape: 'solid', diameter: 0.02 } }],
      ends: { start: 'fixed', end: 'free' },
    })
    expect(read.ok).toBe(false)
    if (!read.ok) for (const issue of read.issues) expect(issue.message.length).toBeLessThan(140)
  })
  test('unknowns × modes are capped, and the message says how', () => {
    const read = readProjectDocument({
      format: 'rodwave',
      version: 2,
      segments: [{ length: 1, material: 'carbon-steel', section: { shape: 'solid', diameter: 0.02 } }],
      ends: { start: 'fixed', end: 'free' },
      analysis: { elementsPerSegment: 1_500_000, modes: 200 },
    })
    expect(read.ok).toBe(false)
    if (!read.ok) expect(read.issues[0].path).toBe('analysis.modes')
  })
})
