/** Report sections 1 and 2: the model as described (segments, ends, attachments) and its materials. */
import { materialOf, meanSectionArea, resolveMaterial, sectionArea, segmentBoundaries } from '../model/geometry'
import { libraryMaterial } from '../model/materials'
import type { Project, Section } from '../model/project'
import { escapeHtml, htmlTable, keyValueTable, type Cell } from './html'
import { MISSING } from './number-format'
import type { ReportUnits } from './report-units'

function sectionText(section: Section, units: ReportUnits): string {
  const dim = (v: number) => units.figure('sectionDimension', v)
  const mm = units.symbol('sectionDimension')
  switch (section.shape) {
    case 'solid':
      return `solid round, ⌀ ${dim(section.diameter)} ${mm}`
    case 'tube':
      return `tube, ⌀ ${dim(section.outerDiameter)} outside, ⌀ ${dim(section.innerDiameter)} inside ${mm}`
    case 'rectangle':
      return `rectangle, ${dim(section.width)} × ${dim(section.height)} ${mm}`
    case 'area':
      return `given area ${units.withUnit('area', section.area)}`
    case 'cone':
      return `taper, ⌀ ${dim(section.startDiameter)} → ${dim(section.endDiameter)} ${mm}`
  }
}

function areaText(section: Section, units: ReportUnits): string {
  if (section.shape === 'cone') return `${units.figure('area', sectionArea(section, 0))} → ${units.figure('area', sectionArea(section, 1))}`
  return units.figure('area', sectionArea(section))
}

function materialLabel(project: Project, id: string): string {
  const name = resolveMaterial(project, id)?.name
  return name ? `${name} (${id})` : id
}

const END_TEXT = { fixed: 'fixed (no axial displacement)', free: 'free' } as const

export function modelSection(project: Project, units: ReportUnits, barDrawing: string): string {
  const bounds = segmentBoundaries(project.segments)
  let barMass = 0
  const segmentRows: Cell[][] = project.segments.map((segment, i) => {
    const material = materialOf(project, segment)
    const mass = material.density * meanSectionArea(segment.section) * segment.length
    barMass += mass
    return [
      String(i + 1),
      units.figure('length', bounds[i]),
      units.figure('length', segment.length),
      sectionText(segment.section, units),
      materialLabel(project, segment.material),
      areaText(segment.section, units),
      units.figure('mass', mass),
    ]
  })
  segmentRows.push(['', { html: 'Total' }, units.figure('length', bounds[bounds.length - 1]), '', '', '', units.figure('mass', barMass)])
  const segments = htmlTable(
    [
      { header: '#', numeric: true },
      { header: 'Starts at x', unit: units.symbol('length'), numeric: true },
      { header: 'Length', unit: units.symbol('length'), numeric: true },
      { header: 'Section' },
      { header: 'Material' },
      { header: 'Area', unit: units.symbol('area'), numeric: true },
      { header: 'Mass', unit: units.symbol('mass'), numeric: true },
    ],
    segmentRows,
    { className: 'segments', rowClass: (i) => (i === project.segments.length ? 'total' : undefined) },
  )

  const ends = keyValueTable([
    ['Start, x = 0', escapeHtml(END_TEXT[project.ends.start.axial])],
    [`End, x = ${units.withUnit('length', bounds[bounds.length - 1])}`, escapeHtml(END_TEXT[project.ends.end.axial])],
  ])

  const masses = project.masses.length
    ? htmlTable(
        [
          { header: '#', numeric: true },
          { header: 'Label' },
          { header: 'At x', unit: units.symbol('length'), numeric: true },
          { header: 'Mass', unit: units.symbol('mass'), numeric: true },
        ],
        project.masses.map((m, i) => [String(i + 1), m.label?.trim() || MISSING, units.figure('length', m.at), units.figure('mass', m.mass)]),
        { className: 'masses' },
      )
    : '<p>None.</p>'

  const springs = project.springs.length
    ? htmlTable(
        [
          { header: '#', numeric: true },
          { header: 'Label' },
          { header: 'At x', unit: units.symbol('length'), numeric: true },
          { header: 'Stiffness', unit: units.symbol('stiffness'), numeric: true },
        ],
        project.springs.map((s, i) => [String(i + 1), s.label?.trim() || MISSING, units.figure('length', s.at), units.figure('stiffness', s.stiffness)]),
        { className: 'springs' },
      )
    : '<p>None.</p>'

  return `<section id="model">
<h2>1 The part as modelled</h2>
<figure class="bar-drawing">${barDrawing}<figcaption><b>Figure 1.</b> The bar to scale along its axis (x from the start); section sizes drawn to their own scale.</figcaption></figure>
<h3>Segments, from the start (x = 0) to the end</h3>
${segments}
<h3>Ends</h3>
${ends}
<div class="keep-together"><h3>Point masses (rigid, moving with the bar)</h3>
${masses}</div>
<div class="keep-together"><h3>Springs from the bar to ground (axial)</h3>
${springs}</div>
</section>`
}

/** The materials the segments use, and any other project material, with values and their source. */
export function materialsSection(project: Project, units: ReportUnits): string {
  const usedBy = new Map<string, number[]>()
  project.segments.forEach((s, i) => usedBy.set(s.material, [...(usedBy.get(s.material) ?? []), i + 1]))
  const ids = [...project.materials.map((m) => m.id), ...[...usedBy.keys()].filter((id) => !project.materials.some((m) => m.id === id))]
  const rows: Cell[][] = ids.map((id) => {
    const own = project.materials.find((m) => m.id === id)
    const library = own ? undefined : libraryMaterial(id)
    const material = own ?? library
    const segments = usedBy.get(id)
    return [
      id,
      material?.name ?? MISSING,
      material ? units.figure('modulus', material.youngsModulus) : MISSING,
      material ? units.figure('density', material.density) : MISSING,
      segments ? segments.join(', ') : 'not used',
      own ? 'defined in the project' : library ? `built-in library: ${library.source}` : MISSING,
    ]
  })
  const table = htmlTable(
    [
      { header: 'Id' },
      { header: 'Name' },
      { header: "Young's modulus E", unit: units.symbol('modulus'), numeric: true },
      { header: 'Density', unit: units.symbol('density'), numeric: true },
      { header: 'Segments' },
      { header: 'Source of the values' },
    ],
    rows,
    { className: 'materials' },
  )
  return `<section id="materials">
<h2>2 Materials</h2>
${table}
<p class="note">Linear elastic, isotropic, at room temperature. Real lots vary (a few per cent in E is common); the tolerance study in the app turns such scatter into frequency bands.</p>
</section>`
}
