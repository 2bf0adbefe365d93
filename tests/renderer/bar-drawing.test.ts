// @vitest-environment happy-dom
/**
 * The scale drawing (core/drawing/bar-drawing.ts): identities a drawing to scale must
 * satisfy, checked on the shapes; and the standalone SVG the report embeds.
 */
import { describe, expect, it } from 'vitest'
import { barDrawing, barDrawingSvg, DARK_DRAWING_THEME, placeInRows, type DrawingShape } from '../../core/drawing/bar-drawing'
import { partEnd, type Project } from '../../core/model/project'

type Bar = Pick<Project, 'segments' | 'ends' | 'masses' | 'springs' | 'units' | 'title'>

const STEPPED: Bar = {
  title: 'Stepped test bar',
  units: 'SI',
  segments: [
    { length: 1.2, material: 'carbon-steel', section: { shape: 'solid', diameter: 0.03 } },
    { length: 0.4, material: 'carbon-steel', section: { shape: 'tube', outerDiameter: 0.05, innerDiameter: 0.03 } },
    { length: 0.6, material: 'carbon-steel', section: { shape: 'cone', startDiameter: 0.04, endDiameter: 0.02 } },
  ],
  ends: { start: partEnd('fixed'), end: partEnd('fixed') },
  masses: [{ at: 2.2, mass: 5, label: 'clamp <A&B>' }],
  springs: [{ at: 1, stiffness: 2e7, label: 'guide' }],
}

const segmentPolygons = (shapes: DrawingShape[]) => shapes.filter((s): s is Extract<DrawingShape, { kind: 'polygon' }> => s.kind === 'polygon' && s.role === 'segment')

describe('bar drawing', () => {
  const drawing = barDrawing(STEPPED, { width: 1000, height: 260 })
  const polygons = segmentPolygons(drawing.shapes)

  it('draws each segment with a width proportional to its length', () => {
    expect(polygons).toHaveLength(3)
    const widths = polygons.map((p) => p.points[1][0] - p.points[0][0])
    STEPPED.segments.forEach((s, i) => expect(widths[i] / widths[0]).toBeCloseTo(s.length / STEPPED.segments[0].length, 9))
    // Segments follow each other without gaps.
    expect(polygons[1].points[0][0]).toBeCloseTo(polygons[0].points[1][0], 9)
  })

  it('keeps the ratios of the outer sizes, and the lengths to scale, whatever the exaggeration', () => {
    const height = (p: (typeof polygons)[number], end: 0 | 1) => (end === 0 ? p.points[3][1] - p.points[0][1] : p.points[2][1] - p.points[1][1])
    expect(height(polygons[1], 0) / height(polygons[0], 0)).toBeCloseTo(0.05 / 0.03, 9)
    // A cone tapers: its end heights in the ratio of its end diameters.
    expect(height(polygons[2], 1) / height(polygons[2], 0)).toBeCloseTo(0.02 / 0.04, 9)
    const { axialScale, radialScale, exaggeration } = drawing.layout
    expect(radialScale / axialScale).toBeCloseTo(exaggeration, 12)
    expect(height(polygons[0], 0)).toBeCloseTo(0.03 * radialScale, 9)
    expect(exaggeration).toBeGreaterThan(1)
    expect(drawing.scaleNote).toContain(`×${exaggeration}`)
  })

  it('shows a tube hollow: a bore inside its outline, in the ratio of its diameters', () => {
    const bore = drawing.shapes.find((s) => s.role === 'bore' && s.segment === 1)
    expect(bore?.kind).toBe('rect')
    if (bore?.kind !== 'rect') return
    expect(bore.height / (0.05 * drawing.layout.radialScale)).toBeCloseTo(0.03 / 0.05, 9)
  })

  it('draws a wall at each fixed end and the attachments at their positions', () => {
    const walls = drawing.shapes.filter((s): s is Extract<DrawingShape, { kind: 'line' }> => s.kind === 'line' && s.role === 'support')
    const x = (at: number) => drawing.layout.originX + at * drawing.layout.axialScale
    expect(walls.map((w) => w.x1).sort((a, b) => a - b)).toEqual([x(0), x(2.2)].map((v) => expect.closeTo(v, 9)))
    const mass = drawing.shapes.find((s) => s.role === 'mass')
    expect(mass?.kind === 'rect' ? mass.x + mass.width / 2 : NaN).toBeCloseTo(x(2.2), 9)
    const spring = drawing.shapes.find((s) => s.role === 'spring')
    expect(spring?.kind === 'polyline' ? spring.points[0][0] : NaN).toBeCloseTo(x(1), 9)
  })

  it('draws a free end without a wall and a short, thick part to true scale', () => {
    const short = barDrawing({ ...STEPPED, ends: { start: partEnd('fixed'), end: partEnd('free') }, segments: [{ length: 0.1, material: 'm', section: { shape: 'solid', diameter: 0.1 } }], masses: [], springs: [] })
    expect(short.shapes.filter((s) => s.role === 'support')).toHaveLength(1)
    expect(short.layout.exaggeration).toBe(1)
    expect(short.scaleNote).toBe('Drawn to scale')
  })

  it('highlights the selected segment', () => {
    const selected = barDrawing(STEPPED, { highlightSegment: 2 })
    expect(selected.shapes.filter((s) => s.role === 'highlight').map((s) => s.segment)).toEqual([2])
    expect(segmentPolygons(selected.shapes)[2].style.stroke).not.toBe(segmentPolygons(selected.shapes)[0].style.stroke)
    expect(drawing.shapes.some((s) => s.role === 'highlight')).toBe(false)
  })

  it('labels dimensions in the chosen units', () => {
    const texts = (d: ReturnType<typeof barDrawing>) => d.shapes.filter((s) => s.kind === 'text').map((s) => (s.kind === 'text' ? s.text : ''))
    expect(texts(drawing)).toContain('Overall 2.2 m')
    expect(texts(drawing)).toContain('⌀50/30 mm')
    const us = barDrawing(STEPPED, { units: 'US' })
    // 2.2 m / 0.0254 m per inch = 86.61 in (NIST SP 811: 1 in = 0.0254 m).
    expect(texts(us)).toContain('Overall 86.61 in')
  })

  it('writes one standalone SVG with every shape, text escaped, in the theme given', () => {
    const svg = barDrawingSvg(STEPPED, { theme: DARK_DRAWING_THEME, width: 800, height: 240 })
    const doc = new DOMParser().parseFromString(svg, 'image/svg+xml')
    const root = doc.documentElement
    expect(root.tagName.toLowerCase()).toBe('svg')
    expect(root.getAttribute('viewBox')).toBe('0 0 800 240')
    expect(root.children.length).toBe(barDrawing(STEPPED, { width: 800, height: 240 }).shapes.length + 1)
    expect(svg).toContain('clamp &lt;A&amp;B&gt;')
    expect(svg).not.toContain('<A&B>')
    expect(svg).toContain(`fill="${DARK_DRAWING_THEME.background}"`)
    expect(svg).not.toMatch(/style=|<style/)
  })
})

describe('bar drawing of every family', () => {
  const texts = (d: ReturnType<typeof barDrawing>) => d.shapes.flatMap((s) => (s.kind === 'text' ? [s.text] : []))
  const hanger: Bar & Pick<Project, 'motions'> = {
    ...STEPPED,
    motions: ['axial', 'bending'],
    ends: { start: partEnd('fixed', 'fixed', 'pinned'), end: partEnd('free', 'fixed', 'clamped') },
    springs: [
      { at: 1, motion: 'torsion', stiffness: 2500, label: 'coupling' },
      { at: 1.4, motion: 'bending', stiffness: 0, rotationalStiffness: 300, label: 'bracket' },
    ],
  }
  const drawing = barDrawing(hanger, { width: 1000, height: 300 })
  const x = (at: number) => drawing.layout.originX + at * drawing.layout.axialScale

  it('draws each end’s bending support where bending is analysed: a pin under the start, jaws at the end', () => {
    const pins = drawing.shapes.filter((s) => s.role === 'pin')
    expect(new Set(pins.map((s) => s.end))).toEqual(new Set(['start']))
    const clamps = drawing.shapes.filter((s) => s.role === 'clamp')
    expect(clamps).toHaveLength(2)
    expect(clamps.every((s) => s.end === 'end' && s.kind === 'rect' && Math.abs(s.x + s.width - x(2.2)) < 1e-9)).toBe(true)
    // A wall only where axial motion (analysed) is held: the start; torsion is not analysed here.
    const walls = drawing.shapes.filter((s): s is Extract<DrawingShape, { kind: 'line' }> => s.kind === 'line' && s.role === 'support')
    expect(walls.map((w) => w.x1)).toEqual([expect.closeTo(x(0), 9)])
    // The wall stops at the bar's lower edge, so the pin below it reads.
    expect(walls[0].y2).toBeCloseTo(drawing.layout.axisY + (0.03 * drawing.layout.radialScale) / 2, 9)
  })

  it('says each end’s conditions in words, and names a spring’s family with its unit', () => {
    expect(texts(drawing)).toContain('Start: axial fixed · pinned')
    expect(texts(drawing)).toContain('End: axial free · clamped')
    expect(texts(drawing)).toContain('coupling, 2500 N·m/rad torsion')
    expect(texts(drawing)).toContain('bracket, 300 N·m/rad rotational')
    // A torsion spring rings the bar; a rotational bending spring has its spiral.
    expect(drawing.shapes.filter((s) => s.role === 'spring' && s.motion === 'torsion')).toHaveLength(2)
    expect(drawing.shapes.filter((s) => s.role === 'spring' && s.motion === 'bending')).toHaveLength(2)
  })

  it('draws a version 1 part (axial motion only) as before: no bending supports, no words at the ends', () => {
    const axial = barDrawing(STEPPED, { width: 1000, height: 260 })
    expect(axial.shapes.some((s) => s.role === 'pin' || s.role === 'clamp' || s.role === 'guide' || s.role === 'end-note')).toBe(false)
    expect(barDrawing({ ...STEPPED, motions: ['axial'] }, { width: 1000, height: 260 }).shapes).toEqual(axial.shapes)
  })

  it('draws a guided end as a sleeve on rollers', () => {
    const guided = barDrawing({ ...hanger, ends: { start: partEnd('fixed', 'fixed', 'guided'), end: partEnd('free', 'free', 'free') } }, { width: 1000, height: 300 })
    expect(guided.shapes.filter((s) => s.role === 'guide' && s.end === 'start').length).toBeGreaterThanOrEqual(4)
    expect(guided.shapes.some((s) => s.end === 'end' && s.role !== 'end-note')).toBe(false)
  })
})

describe('label rows', () => {
  it('puts overlapping labels on the next free row, and none where all rows are taken', () => {
    expect(placeInRows([{ centre: 10, width: 10 }, { centre: 14, width: 10 }, { centre: 30, width: 10 }, { centre: 16, width: 10 }], 2)).toEqual([0, 1, 0, -1])
  })
})
