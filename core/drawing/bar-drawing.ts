/**
 * Scale drawing of the bar, side view: segments to scale along the axis with their
 * outer sizes, tubes in half-section (the bore shows), cones tapered, ends held along or
 * about the axis (axial or torsion fixed) as hatched walls, bending supports where bending
 * is analysed (pinned: a hinge on a triangle; clamped: jaws gripping the bar; guided: a
 * sleeve on rollers), point masses as blocks, springs to ground as zigzags (a torsion spring
 * with a ring round the bar, a rotational bending spring with a spiral), the segment and
 * overall lengths dimensioned, and, when more than axial motion is analysed, each end's
 * conditions in words.
 *
 * Pure layout: `barDrawing` returns shapes in the coordinates of a viewBox; the app's
 * Vue component renders those shapes and `barDrawingSvg` writes them as one
 * standalone <svg> (presentation attributes only, no stylesheet), so the report can
 * embed it. Lengths are always to scale; the diameter axis may be exaggerated so a
 * slender rod stays legible, and the drawing says so.
 *
 * Options (all optional):
 * - width, height: size of the drawing in px (default 960 × 260); the viewBox is 0 0 width height.
 * - units: 'SI' or 'US' for the dimension labels (default: the project's own units).
 * - highlightSegment: index of a segment to highlight (the app's selected table row).
 * - theme: colours and font, LIGHT_DRAWING_THEME (default) or DARK_DRAWING_THEME, or any part of one.
 * - fontSize: label size in px (default 12).
 * - maxExaggeration: largest factor the diameters may be enlarged by (default 50).
 * - title: text of the SVG's <title> (default: the project's title).
 */
import { sectionOuterSize, segmentBoundaries, totalLength } from '../model/geometry'
import type { GroundSpring, Motion, PartEnd, Project, Section } from '../model/project'
import { displayUnit, toDisplay, type QuantityKind, type UnitSystem } from '../model/units'
import { escapeHtml as escapeXml } from '../report/html'
import { figure } from '../charts/chart-text'

export interface DrawingTheme {
  readonly background: string
  readonly barFill: string
  readonly barStroke: string
  /** Fill of a tube's bore in the half-section. */
  readonly boreFill: string
  readonly centreLine: string
  readonly support: string
  readonly mass: string
  readonly spring: string
  readonly dimension: string
  readonly text: string
  readonly mutedText: string
  readonly highlightStroke: string
  readonly highlightFill: string
  readonly fontFamily: string
}

export const LIGHT_DRAWING_THEME: DrawingTheme = {
  background: '#ffffff',
  barFill: '#c8d2dc',
  barStroke: '#33404d',
  boreFill: '#ffffff',
  centreLine: '#7d8894',
  support: '#33404d',
  mass: '#6d4aa8',
  spring: '#2b7657',
  dimension: '#4a5563',
  text: '#1c232b',
  mutedText: '#56606c',
  highlightStroke: '#1d5fc4',
  highlightFill: 'rgba(29, 95, 196, 0.10)',
  fontFamily: "system-ui, -apple-system, 'Segoe UI', Roboto, 'Helvetica Neue', Arial, sans-serif",
}

export const DARK_DRAWING_THEME: DrawingTheme = {
  background: '#1b2128',
  barFill: '#4b5967',
  barStroke: '#c5ced8',
  boreFill: '#1b2128',
  centreLine: '#6f7a86',
  support: '#c5ced8',
  mass: '#b89ef0',
  spring: '#74cf9c',
  dimension: '#a9b3be',
  text: '#e4e9ef',
  mutedText: '#9ba6b2',
  highlightStroke: '#7eaaff',
  highlightFill: 'rgba(126, 170, 255, 0.16)',
  fontFamily: LIGHT_DRAWING_THEME.fontFamily,
}

export interface BarDrawingOptions {
  readonly width?: number
  readonly height?: number
  readonly units?: UnitSystem
  readonly highlightSegment?: number | null
  readonly theme?: Partial<DrawingTheme>
  readonly fontSize?: number
  readonly maxExaggeration?: number
  readonly title?: string
}

/** What a shape depicts; the app uses it for hit testing and tests use it to find parts. */
export type ShapeRole =
  | 'background'
  | 'segment'
  | 'bore'
  | 'highlight'
  | 'centre-line'
  | 'support'
  | 'hatch'
  | 'mass'
  | 'spring'
  | 'ground'
  | 'pin'
  | 'clamp'
  | 'guide'
  | 'end-note'
  | 'dimension'
  | 'extension'
  | 'arrow'
  | 'label'
  | 'note'

export interface ShapeStyle {
  readonly fill?: string
  readonly stroke?: string
  readonly strokeWidth?: number
  readonly dash?: string
  readonly fontSize?: number
  readonly fontWeight?: number
}

interface ShapeBase {
  readonly role: ShapeRole
  readonly style: ShapeStyle
  /** The segment a shape belongs to, for segments, bores, highlights and their labels. */
  readonly segment?: number
  /** The attachment a shape belongs to. */
  readonly attachment?: { readonly kind: 'mass' | 'spring'; readonly index: number }
  /** The end a support belongs to. */
  readonly end?: 'start' | 'end'
  /** The family a support or spring acts in. */
  readonly motion?: Motion
}

export type DrawingShape =
  | (ShapeBase & { readonly kind: 'rect'; readonly x: number; readonly y: number; readonly width: number; readonly height: number })
  | (ShapeBase & { readonly kind: 'polygon'; readonly points: readonly (readonly [number, number])[] })
  | (ShapeBase & { readonly kind: 'polyline'; readonly points: readonly (readonly [number, number])[] })
  | (ShapeBase & { readonly kind: 'line'; readonly x1: number; readonly y1: number; readonly x2: number; readonly y2: number })
  | (ShapeBase & { readonly kind: 'text'; readonly x: number; readonly y: number; readonly text: string; readonly anchor: 'start' | 'middle' | 'end' })

/** How bar coordinates map to the drawing, for overlays drawn in the same space (the app's animation). */
export interface DrawingLayout {
  /** x (px) of the bar's start, x = 0 m. */
  readonly originX: number
  /** y (px) of the bar's axis. */
  readonly axisY: number
  /** px per metre along the axis. */
  readonly axialScale: number
  /** px per metre across the axis (axialScale × exaggeration). */
  readonly radialScale: number
  /** How much the diameters are enlarged against the lengths (1 = true scale). */
  readonly exaggeration: number
  /** Bar length, m. */
  readonly length: number
}

export interface BarDrawing {
  readonly width: number
  readonly height: number
  /** "0 0 width height". */
  readonly viewBox: string
  readonly shapes: DrawingShape[]
  readonly layout: DrawingLayout
  /** Plain-text description of the scale, also drawn as the note. */
  readonly scaleNote: string
  readonly title: string
}

/** Segment and section labels are left out beyond this many segments (they could not be read). */
export const MAX_LABELLED_SEGMENTS = 40

const ARROW_LENGTH = 7
const ARROW_HALF_WIDTH = 2.6

/** Layout and shapes of the drawing. */
/** What the drawing needs of a project; without `motions` it draws axial motion (a version 1 part). */
export type DrawnProject = Pick<Project, 'segments' | 'ends' | 'masses' | 'springs' | 'units' | 'title'> & Partial<Pick<Project, 'motions'>>

export function barDrawing(project: DrawnProject, options: BarDrawingOptions = {}): BarDrawing {
  const width = options.width ?? 960
  const height = options.height ?? 260
  const units = options.units ?? project.units
  const theme: DrawingTheme = { ...LIGHT_DRAWING_THEME, ...options.theme }
  const fontSize = options.fontSize ?? 12
  const maxExaggeration = options.maxExaggeration ?? 50
  const title = options.title ?? project.title ?? 'Bar'
  const shapes: DrawingShape[] = []
  const text = (x: number, y: number, content: string, anchor: 'start' | 'middle' | 'end', role: ShapeRole, extra: Partial<ShapeBase> = {}, style: ShapeStyle = {}) =>
    shapes.push({ kind: 'text', x, y, text: content, anchor, role, style: { fill: theme.text, fontSize, ...style }, ...extra })

  const segments = project.segments
  const bounds = segmentBoundaries(segments)
  const length = totalLength(segments)
  const labelled = segments.length <= MAX_LABELLED_SEGMENTS
  const motions = motionsOf(project)
  // A wall where the end is held along the axis (axial) or about it (torsion), in a family analysed.
  const held = (end: PartEnd) => (motions.includes('axial') && end.axial === 'fixed') || (motions.includes('torsion') && end.torsion === 'fixed')
  const fixedStart = held(project.ends.start)
  const fixedEnd = held(project.ends.end)
  const bending = motions.includes('bending')
  // Each end's conditions in words, when a family beside axial motion is analysed.
  const endNotes = motions.length > 1 || motions[0] !== 'axial' ? (['start', 'end'] as const).map((end) => endConditionWords(project.ends[end], motions)) : null

  const maxSize = Math.max(...segments.flatMap((s) => [sectionOuterSize(s.section, 0), sectionOuterSize(s.section, 1)]))
  const charWidth = 0.6 * fontSize
  const line = fontSize + 4
  const hasSprings = project.springs.length > 0
  const springDrop = hasSprings ? 30 : 0
  // Room under the bar for the springs to ground and a pinned bending support's triangle, whichever needs more.
  const dropBelow = Math.max(springDrop + (hasSprings ? 8 : 0), motionsOf(project).includes('bending') ? 20 : 0)
  const sectionLabels = labelled ? segments.map((s) => sectionLabel(s.section, units)) : []
  const lengthLabels = labelled ? segments.map((s) => quantityText(units, 'length', s.length)) : []
  const attachmentItems = [
    ...project.masses.map((m, index) => ({ kind: 'mass' as const, index, at: m.at, label: attachmentLabel('mass', m.mass, m.label, units) })),
    ...project.springs.map((s, index) => ({ kind: 'spring' as const, index, at: s.at, label: springLabel(s, units), motion: s.motion ?? ('axial' as Motion), rotational: (s.rotationalStiffness ?? 0) > 0 && s.motion === 'bending' })),
  ].sort((a, b) => a.at - b.at)
  const clampCentre = (centre: number, labelWidth: number) => Math.min(Math.max(centre, labelWidth / 2 + 2), width - labelWidth / 2 - 2)
  const labelBox = (centre: number, label: string) => {
    const labelWidth = label.length * charWidth + 8
    return { centre: clampCentre(centre, labelWidth), width: labelWidth }
  }
  const rowCount = (rows: number[], minimum: number) => Math.max(minimum, 1 + Math.max(-1, ...rows))

  // Labels are staggered into rows where they would overlap, so the height left for the bar
  // depends on the axial scale; a short, thick part is fitted by its diameter instead (both scales
  // shrink together and the drawing is centred). Two passes settle both.
  const margin = Math.max(28, 0.05 * width)
  let axialScale = (width - 2 * margin) / length
  const arrange = (scale: number) => {
    const originX = (width - length * scale) / 2
    const px = (x: number) => originX + x * scale
    const sectionBoxes = sectionLabels.map((label, i) => labelBox(px((bounds[i] + bounds[i + 1]) / 2), label))
    const lengthBoxes = lengthLabels.map((label, i) => labelBox(px((bounds[i] + bounds[i + 1]) / 2), label))
    const attachmentBoxes = attachmentItems.map((a) => labelBox(px(a.at), a.label))
    const sectionRows = placeInRows(sectionBoxes, 3)
    const lengthRows = placeInRows(lengthBoxes, 2)
    const attachmentRows = placeInRows(attachmentBoxes, 2)
    const sectionRowCount = labelled ? rowCount(sectionRows, 1) : 0
    const lengthRowCount = labelled ? rowCount(lengthRows, 1) : 0
    const attachmentRowCount = attachmentItems.length ? rowCount(attachmentRows, 1) : 0
    const sectionTop = 6 + fontSize
    const chainTextTop = 6 + sectionRowCount * line + fontSize
    const chainY = 6 + (sectionRowCount + lengthRowCount) * line + 2
    const barZoneTop = chainY + 8
    // Below the bar: springs, attachment labels, the overall dimension, the note.
    const below = dropBelow + attachmentRowCount * line + 18 + 2 * fontSize + 4 + (endNotes ? line : 0)
    const barZone = Math.max(12, Math.min(160, height - barZoneTop - below))
    return {
      originX, px, sectionBoxes, lengthBoxes, attachmentBoxes, sectionRows, lengthRows, attachmentRows,
      sectionRowCount, lengthRowCount, attachmentRowCount, sectionTop, chainTextTop, chainY, barZoneTop, barZone,
    }
  }
  let arranged = arrange(axialScale)
  for (let pass = 0; pass < 2 && maxSize * axialScale > arranged.barZone - 4; pass++) {
    axialScale = (arranged.barZone - 4) / maxSize
    arranged = arrange(axialScale)
  }
  const { originX, px, sectionBoxes, lengthBoxes, sectionRows, lengthRows, attachmentRows } = arranged
  const { sectionRowCount, lengthRowCount, attachmentRowCount, sectionTop, chainTextTop, chainY, barZoneTop, barZone } = arranged
  const axisY = barZoneTop + barZone / 2

  // Radial scale: true scale unless the largest section would be thinner than the zone allows.
  const fitScale = (barZone - 4) / maxSize
  const rawExaggeration = Math.min(maxExaggeration, Math.max(1, fitScale / axialScale))
  const exaggeration = rawExaggeration <= 1 ? 1 : niceFloor(rawExaggeration)
  const radialScale = axialScale * exaggeration
  const half = (size: number) => Math.max(0.75, (size * radialScale) / 2)

  shapes.push({ kind: 'rect', x: 0, y: 0, width, height, role: 'background', style: { fill: theme.background } })

  // Highlight band behind the selected segment.
  const highlighted = options.highlightSegment ?? null
  if (highlighted !== null && highlighted >= 0 && highlighted < segments.length) {
    const x0 = px(bounds[highlighted])
    const x1 = px(bounds[highlighted + 1])
    shapes.push({
      kind: 'rect',
      x: x0,
      y: barZoneTop - 4,
      width: Math.max(1, x1 - x0),
      height: barZone + 8,
      role: 'highlight',
      segment: highlighted,
      style: { fill: theme.highlightFill },
    })
  }

  // Segments: outline polygon (tapered for cones), bore for tubes.
  segments.forEach((segment, i) => {
    const x0 = px(bounds[i])
    const x1 = px(bounds[i + 1])
    const r0 = half(sectionOuterSize(segment.section, 0))
    const r1 = half(sectionOuterSize(segment.section, 1))
    const isHighlighted = i === highlighted
    const stroke = isHighlighted ? theme.highlightStroke : theme.barStroke
    const strokeWidth = isHighlighted ? 2 : 1
    shapes.push({
      kind: 'polygon',
      points: [
        [x0, axisY - r0],
        [x1, axisY - r1],
        [x1, axisY + r1],
        [x0, axisY + r0],
      ],
      role: 'segment',
      segment: i,
      style: { fill: theme.barFill, stroke, strokeWidth, ...(segment.section.shape === 'area' ? { dash: '4 3' } : {}) },
    })
    if (segment.section.shape === 'tube' && segment.section.innerDiameter > 0) {
      const bore = Math.max(0.5, (segment.section.innerDiameter * radialScale) / 2)
      shapes.push({
        kind: 'rect',
        x: x0,
        y: axisY - bore,
        width: Math.max(0.5, x1 - x0),
        height: 2 * bore,
        role: 'bore',
        segment: i,
        style: { fill: theme.boreFill, stroke, strokeWidth: 0.8 },
      })
    }
  })

  // Centre line across the bar.
  shapes.push({
    kind: 'line',
    x1: px(0) - 10,
    y1: axisY,
    x2: px(length) + 10,
    y2: axisY,
    role: 'centre-line',
    style: { stroke: theme.centreLine, strokeWidth: 0.8, dash: '12 3 2 3' },
  })

  // Fixed ends: a wall hatched on its outer side.
  const wallHalf = Math.min(barZone / 2 + 4, half(maxSize) + 12)
  // Where a pinned bending support stands under an end, the wall stops at the bar's lower edge so that both read.
  const pinnedAt = (end: 'start' | 'end') => bending && project.ends[end].bending === 'pinned'
  const wall = (x: number, outward: -1 | 1, bottom: number) => {
    shapes.push({ kind: 'line', x1: x, y1: axisY - wallHalf, x2: x, y2: bottom, role: 'support', style: { stroke: theme.support, strokeWidth: 2 } })
    for (let yy = axisY - wallHalf; yy < bottom - 1; yy += 6) {
      shapes.push({ kind: 'line', x1: x, y1: Math.min(yy + 6, bottom), x2: x + outward * 8, y2: yy, role: 'hatch', style: { stroke: theme.support, strokeWidth: 0.8 } })
    }
  }
  const edgeAt = (x: number) => axisY + half(outerSizeAt(segments, bounds, x))
  if (fixedStart) wall(px(0), -1, pinnedAt('start') ? edgeAt(0) : axisY + wallHalf)
  if (fixedEnd) wall(px(length), 1, pinnedAt('end') ? edgeAt(length) : axisY + wallHalf)

  // Attachments: masses as blocks across the bar, springs as zigzags down to ground.
  const barHalfAt = (x: number) => half(outerSizeAt(segments, bounds, x))
  const groundY = axisY + barZone / 2 + springDrop
  for (const a of attachmentItems) {
    const x = px(a.at)
    const r = barHalfAt(a.at)
    if (a.kind === 'mass') {
      const blockHalf = Math.min(barZone / 2 + 2, r + 7)
      shapes.push({
        kind: 'rect',
        x: x - 5,
        y: axisY - blockHalf,
        width: 10,
        height: 2 * blockHalf,
        role: 'mass',
        attachment: { kind: 'mass', index: a.index },
        style: { fill: theme.mass, stroke: theme.barStroke, strokeWidth: 0.8 },
      })
    } else {
      const top = axisY + r
      const points: [number, number][] = [[x, top]]
      const coils = 6
      const zigTop = top + 4
      const zigBottom = groundY - 4
      points.push([x, zigTop])
      for (let k = 1; k <= coils; k++) points.push([x + (k % 2 ? 5 : -5), zigTop + ((zigBottom - zigTop) * (k - 0.5)) / coils])
      points.push([x, zigBottom], [x, groundY])
      const motion = a.kind === 'spring' ? a.motion : 'axial'
      shapes.push({ kind: 'polyline', points, role: 'spring', attachment: { kind: 'spring', index: a.index }, motion, style: { stroke: theme.spring, strokeWidth: 1.4, fill: 'none' } })
      if (motion === 'torsion') {
        // A ring round the bar: the spring resists turning about the axis.
        shapes.push({ kind: 'polyline', points: ellipsePoints(x, axisY, 4, r + 5), role: 'spring', attachment: { kind: 'spring', index: a.index }, motion, style: { stroke: theme.spring, strokeWidth: 1.4, fill: 'none' } })
      } else if (a.kind === 'spring' && a.rotational) {
        // A spiral on the axis: the spring resists the slope.
        shapes.push({ kind: 'polyline', points: spiralPoints(x, axisY - r - 8, 6), role: 'spring', attachment: { kind: 'spring', index: a.index }, motion, style: { stroke: theme.spring, strokeWidth: 1.2, fill: 'none' } })
      }
      shapes.push({ kind: 'line', x1: x - 9, y1: groundY, x2: x + 9, y2: groundY, role: 'ground', attachment: { kind: 'spring', index: a.index }, style: { stroke: theme.support, strokeWidth: 1.5 } })
      for (let k = -9; k < 9; k += 4) {
        shapes.push({ kind: 'line', x1: x + k, y1: groundY + 5, x2: x + k + 4, y2: groundY, role: 'hatch', style: { stroke: theme.support, strokeWidth: 0.8 } })
      }
    }
  }
  // Bending supports, over the wall and the attachments so that they read: where the end is held sideways or against turning.
  if (bending) {
    for (const end of ['start', 'end'] as const) {
      const condition = project.ends[end].bending
      const outward: -1 | 1 = end === 'start' ? -1 : 1
      const x = end === 'start' ? px(0) : px(length)
      const r = half(outerSizeAt(segments, bounds, end === 'start' ? 0 : length))
      const colour = theme.support
      const tag = { end, motion: 'bending' as Motion }
      if (condition === 'pinned') {
        // A hinge under the bar's edge, on a triangle down to hatched ground.
        const top = axisY + Math.max(r, 1)
        const base = top + 14
        shapes.push({ kind: 'polygon', points: [[x, top + 3], [x - 7, base], [x + 7, base]], role: 'pin', ...tag, style: { fill: theme.background, stroke: colour, strokeWidth: 1.3 } })
        shapes.push({ kind: 'polygon', points: circlePoints(x, top + 3, 2.6), role: 'pin', ...tag, style: { fill: theme.background, stroke: colour, strokeWidth: 1.3 } })
        shapes.push({ kind: 'line', x1: x - 10, y1: base, x2: x + 10, y2: base, role: 'ground', ...tag, style: { stroke: colour, strokeWidth: 1.5 } })
        for (let k = -10; k < 10; k += 4) shapes.push({ kind: 'line', x1: x + k, y1: base + 4, x2: x + k + 4, y2: base, role: 'hatch', ...tag, style: { stroke: colour, strokeWidth: 0.8 } })
      } else if (condition === 'clamped') {
        // Jaws gripping the bar above and below, just inside the end.
        const jaw = Math.min(10, Math.max(4, 0.5 * r))
        const w = 8
        const left = outward < 0 ? x : x - w
        shapes.push({ kind: 'rect', x: left, y: axisY - r - jaw, width: w, height: jaw, role: 'clamp', ...tag, style: { fill: colour, stroke: colour, strokeWidth: 0.8 } })
        shapes.push({ kind: 'rect', x: left, y: axisY + r, width: w, height: jaw, role: 'clamp', ...tag, style: { fill: colour, stroke: colour, strokeWidth: 0.8 } })
      } else if (condition === 'guided') {
        // A sleeve that keeps the end square, on rollers against a track: free to slide sideways.
        const sleeve = Math.max(r + 3, 6)
        const track = x + outward * 14
        shapes.push({ kind: 'line', x1: x, y1: axisY - sleeve, x2: x + outward * 8, y2: axisY - sleeve, role: 'guide', ...tag, style: { stroke: colour, strokeWidth: 1.4 } })
        shapes.push({ kind: 'line', x1: x, y1: axisY + sleeve, x2: x + outward * 8, y2: axisY + sleeve, role: 'guide', ...tag, style: { stroke: colour, strokeWidth: 1.4 } })
        shapes.push({ kind: 'line', x1: x + outward * 8, y1: axisY - sleeve, x2: x + outward * 8, y2: axisY + sleeve, role: 'guide', ...tag, style: { stroke: colour, strokeWidth: 1.4 } })
        for (const dy of [-sleeve / 2, sleeve / 2]) {
          shapes.push({ kind: 'polygon', points: circlePoints(x + outward * 11, axisY + dy, 3), role: 'guide', ...tag, style: { fill: theme.background, stroke: colour, strokeWidth: 1 } })
        }
        shapes.push({ kind: 'line', x1: track, y1: axisY - sleeve - 6, x2: track, y2: axisY + sleeve + 6, role: 'guide', ...tag, style: { stroke: colour, strokeWidth: 1.5 } })
        for (let yy = axisY - sleeve - 6; yy < axisY + sleeve + 5; yy += 5) {
          shapes.push({ kind: 'line', x1: track, y1: yy + 5, x2: track + outward * 5, y2: yy, role: 'hatch', ...tag, style: { stroke: colour, strokeWidth: 0.8 } })
        }
      }
    }
  }

  const belowTop = axisY + barZone / 2 + dropBelow
  const attachmentLabelTop = belowTop + fontSize
  // Segment length chain above the bar, with extension lines from the outline.
  if (labelled) {
    for (let i = 0; i <= segments.length; i++) {
      const x = px(bounds[i])
      const top = i < segments.length ? barHalfAt(bounds[i]) : barHalfAt(length)
      shapes.push({ kind: 'line', x1: x, y1: axisY - top - 3, x2: x, y2: chainY - 4, role: 'extension', style: { stroke: theme.dimension, strokeWidth: 0.6 } })
    }
    segments.forEach((_, i) => {
      dimension(shapes, px(bounds[i]), px(bounds[i + 1]), chainY, theme.dimension)
      const row = lengthRows[i]
      const labelY = chainTextTop + (lengthRowCount - 1 - Math.max(row, 0)) * line
      if (row >= 0) text(lengthBoxes[i].centre, labelY, lengthLabels[i], 'middle', 'label', { segment: i })
      const sectionRow = sectionRows[i]
      if (sectionRow >= 0) {
        text(sectionBoxes[i].centre, sectionTop + (sectionRowCount - 1 - sectionRow) * line, sectionLabels[i], 'middle', 'label', { segment: i }, { fill: theme.mutedText })
      }
    })
  }

  // Overall length below everything attached.
  const overallY = belowTop + attachmentRowCount * line + 6 + fontSize / 2
  const bottomEdge = axisY + barHalfAt(0)
  const bottomEnd = axisY + barHalfAt(length)
  shapes.push({ kind: 'line', x1: px(0), y1: bottomEdge + 3, x2: px(0), y2: overallY + 4, role: 'extension', style: { stroke: theme.dimension, strokeWidth: 0.6 } })
  shapes.push({ kind: 'line', x1: px(length), y1: bottomEnd + 3, x2: px(length), y2: overallY + 4, role: 'extension', style: { stroke: theme.dimension, strokeWidth: 0.6 } })
  dimension(shapes, px(0), px(length), overallY, theme.dimension)
  const overallText = `Overall ${quantityText(units, 'length', length)}`
  shapes.push({ kind: 'rect', x: px(length / 2) - (overallText.length * charWidth) / 2 - 4, y: overallY - fontSize / 2 - 1, width: overallText.length * charWidth + 8, height: fontSize + 2, role: 'label', style: { fill: theme.background } })
  text(px(length / 2), overallY + fontSize / 2 - 2, overallText, 'middle', 'label', {}, { fontWeight: 600 })
  const notesY = overallY + fontSize / 2 + 6 + fontSize
  if (endNotes) {
    text(Math.max(6, px(0) - 20), notesY, `Start: ${endNotes[0]}`, 'start', 'end-note', { end: 'start' }, { fill: theme.mutedText, fontSize: fontSize - 1 })
    text(Math.min(width - 6, px(length) + 20), notesY, `End: ${endNotes[1]}`, 'end', 'end-note', { end: 'end' }, { fill: theme.mutedText, fontSize: fontSize - 1 })
  }

  attachmentItems.forEach((a, k) => {
    const row = attachmentRows[k]
    if (row < 0) return
    const colour = a.kind === 'mass' ? theme.mass : theme.spring
    const box = arranged.attachmentBoxes[k]
    const baseline = attachmentLabelTop + row * line
    // A backing so extension lines passing behind do not cross the words.
    shapes.push({ kind: 'rect', x: box.centre - box.width / 2, y: baseline - fontSize + 1, width: box.width, height: fontSize + 3, role: 'label', style: { fill: theme.background } })
    text(box.centre, baseline, a.label, 'middle', 'label', { attachment: { kind: a.kind, index: a.index } }, { fill: colour })
  })

  // Scale note, bottom left; and why labels are missing on very long chains.
  const scaleNote =
    exaggeration === 1
      ? 'Drawn to scale'
      : `Diameters drawn ×${figure(exaggeration, 2)} against lengths (lengths to scale)`
  const notes = [scaleNote]
  if (!labelled) notes.push(`${segments.length} segments: segment dimensions left out`)
  text(6, Math.min(height - 4, notesY + (endNotes ? line : 0)), notes.join(' · '), 'start', 'note', {}, { fill: theme.mutedText, fontSize: fontSize - 1 })

  return {
    width,
    height,
    viewBox: `0 0 ${width} ${height}`,
    shapes,
    layout: { originX, axisY, axialScale, radialScale, exaggeration, length },
    scaleNote,
    title,
  }
}

/** The drawing as one standalone <svg> element (presentation attributes, no stylesheet). */
export function barDrawingSvg(project: DrawnProject, options: BarDrawingOptions = {}): string {
  const drawing = barDrawing(project, options)
  const theme: DrawingTheme = { ...LIGHT_DRAWING_THEME, ...options.theme }
  const parts: string[] = [
    `<svg xmlns="http://www.w3.org/2000/svg" width="${drawing.width}" height="${drawing.height}" viewBox="${drawing.viewBox}" role="img" aria-label="${escapeXml(`Scale drawing: ${drawing.title}. ${drawing.scaleNote}`)}" font-family="${escapeXml(theme.fontFamily)}">`,
    `<title>${escapeXml(drawing.title)}</title>`,
  ]
  for (const shape of drawing.shapes) parts.push(shapeSvg(shape))
  parts.push('</svg>')
  return parts.join('\n')
}

/** One shape as an SVG element string. */
export function shapeSvg(shape: DrawingShape): string {
  const attributes = styleAttributes(shape.style, shape.kind === 'text')
  const n = round2
  switch (shape.kind) {
    case 'rect':
      return `<rect x="${n(shape.x)}" y="${n(shape.y)}" width="${n(shape.width)}" height="${n(shape.height)}"${attributes}/>`
    case 'polygon':
      return `<polygon points="${pointsAttribute(shape.points)}"${attributes}/>`
    case 'polyline':
      return `<polyline points="${pointsAttribute(shape.points)}"${attributes}/>`
    case 'line':
      return `<line x1="${n(shape.x1)}" y1="${n(shape.y1)}" x2="${n(shape.x2)}" y2="${n(shape.y2)}"${attributes}/>`
    case 'text':
      return `<text x="${n(shape.x)}" y="${n(shape.y)}" text-anchor="${shape.anchor}"${attributes}>${escapeXml(shape.text)}</text>`
  }
}

export function pointsAttribute(points: readonly (readonly [number, number])[]): string {
  return points.map(([x, y]) => `${round2(x)},${round2(y)}`).join(' ')
}

function styleAttributes(style: ShapeStyle, isText: boolean): string {
  let out = ''
  if (style.fill !== undefined) out += ` fill="${escapeXml(style.fill)}"`
  else if (!isText) out += ' fill="none"'
  if (style.stroke !== undefined) out += ` stroke="${escapeXml(style.stroke)}"`
  if (style.strokeWidth !== undefined) out += ` stroke-width="${style.strokeWidth}"`
  if (style.dash !== undefined) out += ` stroke-dasharray="${escapeXml(style.dash)}"`
  if (style.fontSize !== undefined) out += ` font-size="${style.fontSize}"`
  if (style.fontWeight !== undefined) out += ` font-weight="${style.fontWeight}"`
  return out
}

const round2 = (v: number) => Math.round(v * 100) / 100

/** A dimension line between x0 and x1 at y, with filled arrowheads pointing outwards to the extension lines. */
function dimension(shapes: DrawingShape[], x0: number, x1: number, y: number, colour: string): void {
  shapes.push({ kind: 'line', x1: x0, y1: y, x2: x1, y2: y, role: 'dimension', style: { stroke: colour, strokeWidth: 0.8 } })
  const arrow = Math.min(ARROW_LENGTH, (x1 - x0) / 3)
  if (arrow < 1.5) return
  shapes.push({ kind: 'polygon', points: [[x0, y], [x0 + arrow, y - ARROW_HALF_WIDTH], [x0 + arrow, y + ARROW_HALF_WIDTH]], role: 'arrow', style: { fill: colour } })
  shapes.push({ kind: 'polygon', points: [[x1, y], [x1 - arrow, y - ARROW_HALF_WIDTH], [x1 - arrow, y + ARROW_HALF_WIDTH]], role: 'arrow', style: { fill: colour } })
}

/**
 * Greedy placement of labels into rows: each label takes the lowest row where it does not
 * overlap the previous label in that row. Returns the row of each label, or −1 where none is free.
 */
export function placeInRows(items: readonly { centre: number; width: number }[], rows: number): number[] {
  const rightEdge = new Array<number>(rows).fill(-Infinity)
  return items.map((item) => {
    const left = item.centre - item.width / 2
    for (let r = 0; r < rows; r++) {
      if (left >= rightEdge[r]) {
        rightEdge[r] = item.centre + item.width / 2
        return r
      }
    }
    return -1
  })
}

/** Outer size at position x (m), the larger one at a step. */
function outerSizeAt(segments: Project['segments'], bounds: number[], x: number): number {
  let size = 0
  for (let i = 0; i < segments.length; i++) {
    if (x >= bounds[i] - 1e-12 && x <= bounds[i + 1] + 1e-12) {
      const t = Math.min(1, Math.max(0, (x - bounds[i]) / segments[i].length))
      size = Math.max(size, sectionOuterSize(segments[i].section, t))
    }
  }
  return size
}

/** The largest of 1, 2, 2.5, 5 × 10ⁿ not above v. */
function niceFloor(v: number): number {
  const power = 10 ** Math.floor(Math.log10(v))
  const steps = [10, 5, 2.5, 2, 1]
  for (const s of steps) if (s * power <= v * (1 + 1e-12)) return s * power
  return power
}

function quantityText(units: UnitSystem, kind: QuantityKind, valueSI: number): string {
  return `${figure(toDisplay(units, kind, valueSI), 4)} ${displayUnit(units, kind).symbol}`
}

/** Short label of a section's outer sizes: ⌀24 mm, ⌀44/27 mm, 30 × 10 mm, A 353 mm², ⌀50→20 mm. */
export function sectionLabel(section: Section, units: UnitSystem): string {
  const unit = displayUnit(units, 'sectionDimension').symbol
  const size = (v: number) => figure(toDisplay(units, 'sectionDimension', v), 3)
  switch (section.shape) {
    case 'solid':
      return `⌀${size(section.diameter)} ${unit}`
    case 'tube':
      return `⌀${size(section.outerDiameter)}/${size(section.innerDiameter)} ${unit}`
    case 'rectangle':
      return `${size(section.width)} × ${size(section.height)} ${unit}`
    case 'area':
      return `A ${figure(toDisplay(units, 'area', section.area), 3)} ${displayUnit(units, 'area').symbol}`
    case 'cone':
      return `⌀${size(section.startDiameter)}→${size(section.endDiameter)} ${unit}`
  }
}

function motionsOf(project: DrawnProject): readonly Motion[] {
  return project.motions ?? ['axial']
}

/** Each family's condition at one end, in words: "axial fixed · torsion free · pinned". */
export function endConditionWords(end: PartEnd, motions: readonly Motion[]): string {
  const words: string[] = []
  if (motions.includes('axial')) words.push(`axial ${end.axial}`)
  if (motions.includes('torsion')) words.push(`twist ${end.torsion === 'fixed' ? 'held' : 'free'}`)
  if (motions.includes('bending')) words.push(end.bending === 'free' ? 'free sideways' : end.bending)
  return words.join(' · ')
}

/** A spring's label: its name, stiffness in the unit of its family, and the family where it is not axial. */
function springLabel(spring: GroundSpring, units: UnitSystem): string {
  const name = spring.label?.trim()
  const motion = spring.motion ?? 'axial'
  const parts: string[] = []
  if (motion === 'torsion') parts.push(`${quantityText(units, 'rotationalStiffness', spring.stiffness)} torsion`)
  else if (motion === 'bending') {
    if (spring.stiffness > 0) parts.push(`${quantityText(units, 'stiffness', spring.stiffness)} sideways`)
    if ((spring.rotationalStiffness ?? 0) > 0) parts.push(`${quantityText(units, 'rotationalStiffness', spring.rotationalStiffness as number)} rotational`)
  } else parts.push(quantityText(units, 'stiffness', spring.stiffness))
  const quantity = parts.join(', ')
  return name ? `${name}, ${quantity}` : quantity
}

function circlePoints(cx: number, cy: number, r: number): [number, number][] {
  return Array.from({ length: 12 }, (_, k) => [cx + r * Math.cos((k * Math.PI) / 6), cy + r * Math.sin((k * Math.PI) / 6)] as [number, number])
}

function ellipsePoints(cx: number, cy: number, rx: number, ry: number): [number, number][] {
  return Array.from({ length: 25 }, (_, k) => [cx + rx * Math.cos((k * Math.PI) / 12), cy + ry * Math.sin((k * Math.PI) / 12)] as [number, number])
}

/** Two turns of an Archimedean spiral of outer radius r. */
function spiralPoints(cx: number, cy: number, r: number): [number, number][] {
  return Array.from({ length: 33 }, (_, k) => {
    const t = (k / 32) * 4 * Math.PI
    const rho = (r * k) / 32
    return [cx + rho * Math.cos(t), cy + rho * Math.sin(t)] as [number, number]
  })
}

function attachmentLabel(kind: 'mass' | 'spring', value: number, label: string | undefined, units: UnitSystem): string {
  const quantity = kind === 'mass' ? quantityText(units, 'mass', value) : quantityText(units, 'stiffness', value)
  const name = label?.trim()
  return name ? `${name}, ${quantity}` : quantity
}

/** Half the drawn outer size (px) at position x (m) of a drawing's layout: for overlays such as the app's animation. */
export function drawnHalfHeight(project: Pick<Project, 'segments'>, layout: DrawingLayout, x: number): number {
  const size = outerSizeAt(project.segments, segmentBoundaries(project.segments), x)
  return Math.max(0.75, (size * layout.radialScale) / 2)
}
