/* eslint-disable @typescript-eslint/no-explicit-any -- these tests build deliberately malformed documents */
/** Every rule of the project file format reports its JSON path and a plain message. */
import { describe, expect, test } from 'vitest'
import { readProjectDocument, readProjectText, formatProjectIssues } from '../../core/model/project-schema'

const valid = () => ({
  format: 'rodwave',
  version: 1,
  materials: [{ id: 'st', youngsModulus: 2e11, density: 7850 }],
  segments: [
    { length: 1, material: 'st', section: { shape: 'solid', diameter: 0.02 } },
    { length: 0.5, material: 'st', section: { shape: 'tube', outerDiameter: 0.03, innerDiameter: 0.01 } },
  ],
  ends: { start: 'fixed', end: 'free' },
})

function issuesOf(doc: unknown): string[] {
  const r = readProjectDocument(doc)
  return r.ok ? [] : r.issues.map((i) => `${i.path}: ${i.message}`)
}

function withChange(change: (d: Record<string, any>) => void): Record<string, any> {
  const d: Record<string, any> = valid()
  change(d)
  return d
}

describe('a valid file', () => {
  test('reads, with defaults filled in', () => {
    const r = readProjectDocument(valid())
    expect(r.ok).toBe(true)
    if (!r.ok) return
    expect(r.project.units).toBe('SI')
    expect(r.project.masses).toEqual([])
    expect(r.project.margin).toBe(0.15)
    expect(r.project.damping).toBe(0.02)
    expect(r.project.analysis).toEqual({ elementOrder: 1, mass: 'consistent', modes: 8, elementsPerSegment: 40 })
  })
  test('a segment may name a built-in material', () => {
    expect(issuesOf(withChange((d) => (d.segments[0].material = 'aluminium-6061-t6')))).toEqual([])
  })
})

describe('each rule names the field', () => {
  test.each([
    ['negative length', (d: any) => (d.segments[0].length = -1), 'segments[0].length: must be > 0'],
    ['zero diameter', (d: any) => (d.segments[0].section.diameter = 0), 'segments[0].section.diameter: must be > 0'],
    ['text for a number', (d: any) => (d.segments[1].length = '0.5'), 'segments[1].length: must be a number'],
    ['missing field', (d: any) => delete d.segments[0].length, 'segments[0].length: is required'],
    ['unknown shape', (d: any) => (d.segments[0].section = { shape: 'hexagon', size: 1 }), 'segments[0].section.shape: must be one of: "solid", "tube", "rectangle", "area", "cone"'],
    ['bore bigger than the outside', (d: any) => (d.segments[1].section.innerDiameter = 0.04), 'segments[1].section.innerDiameter: must be smaller than outerDiameter'],
    ['unknown material', (d: any) => (d.segments[1].material = 'unobtainium'), 'segments[1].material: "unobtainium" is neither in materials nor in the built-in library'],
    ['duplicate material id', (d: any) => d.materials.push({ id: 'st', youngsModulus: 1e11, density: 7000 }), 'materials[1].id: "st" is already used by materials[0]'],
    ['non-positive modulus', (d: any) => (d.materials[0].youngsModulus = 0), 'materials[0].youngsModulus: must be > 0'],
    ['unknown end condition', (d: any) => (d.ends.end = 'pinned'), 'ends.end: must be "fixed" or "free" (the axial condition), or an object with axial, torsion and bending conditions'],
    ['mass off the bar', (d: any) => (d.masses = [{ at: 1.6, mass: 1 }]), 'masses[0].at: must lie on the bar, between 0 and its length 1.5 m'],
    ['negative spring position', (d: any) => (d.springs = [{ at: -0.1, stiffness: 1e6 }]), 'springs[0].at: must be ≥ 0'],
    ['zero spring stiffness', (d: any) => (d.springs = [{ at: 0.1, stiffness: 0 }]), 'springs[0].stiffness: must be > 0'],
    ['inverted speed range', (d: any) => (d.excitations = [{ rpm: [1800, 1500], orders: [1] }]), 'excitations[0].rpm: the first value (minimum) must not exceed the second (maximum)'],
    ['orders missing', (d: any) => (d.excitations = [{ rpm: 1500 }]), 'excitations[0].orders: is required'],
    ['zero order', (d: any) => (d.excitations = [{ rpm: 1500, orders: [0] }]), 'excitations[0].orders[0]: must be > 0'],
    ['margin of 1', (d: any) => (d.margin = 1), 'margin: must be < 1'],
    ['damping of 0', (d: any) => (d.damping = 0), 'damping: must be > 0'],
    ['tolerance of 0.5', (d: any) => (d.tolerances = { length: 0.5 }), 'tolerances.length: must be < 0.5'],
    ['element order 3', (d: any) => (d.analysis = { elementOrder: 3 }), 'analysis.elementOrder: must be one of: 1, 2'],
    ['fractional elements', (d: any) => (d.analysis = { elementsPerSegment: 2.5 }), 'analysis.elementsPerSegment: must be a whole number'],
    ['both mesh settings', (d: any) => (d.analysis = { elementsPerSegment: 4, maxElementLength: 0.1 }), 'analysis: give either elementsPerSegment or maxElementLength, not both'],
    ['zero modes', (d: any) => (d.analysis = { modes: 0 }), 'analysis.modes: must be ≥ 1'],
    ['a mesh too large', (d: any) => (d.analysis = { elementsPerSegment: 5_000_000 }), 'analysis.elementsPerSegment: gives a mesh of about 1.00e+7 unknowns; Rodwave solves at most 2,000,000'],
    ['an unknown field', (d: any) => (d.segments[0].colour = 'red'), 'segments[0].colour: is not a field of a Rodwave project'],
    ['no segments', (d: any) => (d.segments = []), 'segments: must have at least one segment'],
    ['units', (d: any) => (d.units = 'imperial'), 'units: must be one of: "SI", "US"'],
  ])('%s', (_, change, expected) => {
    expect(issuesOf(withChange(change))).toContain(expected)
  })
  test('every problem of a file is listed at once', () => {
    const issues = issuesOf(
      withChange((d) => {
        d.segments[0].length = -1
        d.segments[1].material = 'nothing'
        d.masses = [{ at: 9, mass: -2 }]
      }),
    )
    expect(issues).toEqual(
      expect.arrayContaining(['segments[0].length: must be > 0', 'segments[1].material: "nothing" is neither in materials nor in the built-in library', 'masses[0].mass: must be > 0']),
    )
  })
})

describe('file-level problems', () => {
  test.each([
    ['', '(file): is empty'],
    ['{"format": "rodwave",', '(file): is not valid JSON'],
    ['[1, 2]', '(file): must be a JSON object (a Rodwave project)'],
    ['{"format": "other", "version": 1}', 'format: must be "rodwave": this is not a Rodwave project file'],
    ['{"format": "rodwave", "version": 3}', 'version: this file is format version 3, written by a newer Rodwave; this one reads versions up to 2'],
    ['{"format": "rodwave", "version": 0}', 'version: unknown format version 0'],
    ['{"format": "rodwave", "version": "1"}', 'version: must be a whole number'],
  ])('%j', (text, expected) => {
    const r = readProjectText(text)
    expect(r.ok).toBe(false)
    if (!r.ok) expect(formatProjectIssues(r.issues)).toContain(expected)
  })
  test('a __proto__ key is refused as an unknown field and pollutes nothing', () => {
    const text = JSON.stringify(valid()).replace('"format"', '"__proto__": {"polluted": true}, "format"')
    const r = readProjectText(text)
    expect(r.ok).toBe(false)
    if (!r.ok) expect(r.issues.map((i) => i.path)).toContain('__proto__')
    expect(({} as Record<string, unknown>).polluted).toBeUndefined()
  })
})

describe('the mesh limit counts what each solve holds', () => {
  // A bending mesh has a deflection and a rotation per node, less what the supports hold
  // (clamped 2, pinned 1, guided 1, free 0); each principal plane is solved on its own.
  const beam = (elements: number, start: string, end: string, shape: Record<string, unknown>, modes = 10) =>
    readProjectDocument({
      format: 'rodwave',
      version: 2,
      motions: ['bending'],
      materials: [{ id: 'st', youngsModulus: 2e11, density: 7850 }],
      segments: [{ length: 1, material: 'st', section: shape }],
      ends: { start: { bending: start }, end: { bending: end } },
      analysis: { elementsPerSegment: elements, modes },
    })
  const round = { shape: 'solid', diameter: 0.02 }
  test('a clamped–free beam of 10⁶ elements has 2,000,000 unknowns: allowed', () => {
    expect(beam(1_000_000, 'clamped', 'free', round).ok).toBe(true)
  })
  test('a free–free beam of 10⁶ elements has 2,000,002: refused, the field named', () => {
    const read = beam(1_000_000, 'free', 'free', round)
    expect(read.ok).toBe(false)
    if (!read.ok) expect(read.issues[0].path).toBe('analysis.elementsPerSegment')
  })
  test('a rectangle’s two planes are two solves: each may have 2,000,000 unknowns, and their mode shapes count twice towards unknowns × modes', () => {
    const rectangle = { shape: 'rectangle', width: 0.04, height: 0.02 }
    // 2,000,000 × 30 modes = 6e7 ≤ 1e8 for one plane; × 2 planes = 1.2e8 > 1e8.
    expect(beam(1_000_000, 'clamped', 'free', round, 30).ok).toBe(true)
    const two = beam(1_000_000, 'clamped', 'free', rectangle, 30)
    expect(two.ok).toBe(false)
    if (!two.ok) expect(two.issues[0].path).toBe('analysis.modes')
    expect(beam(1_000_000, 'clamped', 'free', rectangle, 10).ok).toBe(true)
  })
})
