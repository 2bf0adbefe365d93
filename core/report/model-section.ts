/**
 * Report sections 1 and 2: the model as described (segments, section constants, ends per family,
 * preload and the buckling check, attachments) and its materials. A part analysed in axial
 * motion alone reads as in version 1.
 */
import type { ModalAnalysis } from '../analysis/modal-analysis'
import { materialOf, meanSectionArea, resolveMaterial, sectionArea, segmentBoundaries } from '../model/geometry'
import { libraryMaterial } from '../model/materials'
import { MOTIONS, springMotion, type GroundSpring, type Motion, type Project, type Section } from '../model/project'
import { hasTwoBendingPlanes, polarMoment, poissonRatioOf, secondMoments, shearModulus, torsionConstant } from '../model/section-properties'
import { escapeHtml, htmlTable, keyValueTable, type Cell } from './html'
import { formatFigure, formatPercent, MISSING } from './number-format'
import { endWords, familiesWords } from './report-families'
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

/** Whether the project is read as version 1 was: axial motion only, axial springs only. */
export function isAxialOnly(project: Project): boolean {
  return project.motions.length === 1 && project.motions[0] === 'axial' && project.springs.every((s) => springMotion(s) === 'axial')
}

/** A section constant along a segment: its value, or "start → end" on a taper. */
function constantText(section: Section, units: ReportUnits, value: (section: Section, t: number) => number | undefined): string {
  const start = value(section, 0)
  if (start === undefined) return MISSING
  if (section.shape !== 'cone') return units.figure('secondMoment', start)
  return `${units.figure('secondMoment', start)} → ${units.figure('secondMoment', value(section, 1) ?? start)}`
}

/** Second moments (bending), torsion constant and polar moment (torsion) of every segment, for the families analysed. */
function sectionConstantsTable(project: Project, units: ReportUnits): string {
  const bending = project.motions.includes('bending')
  const torsion = project.motions.includes('torsion')
  const twoPlanes = bending && project.segments.some((s) => hasTwoBendingPlanes(s.section))
  const unit = units.symbol('secondMoment')
  const columns = [
    { header: '#', numeric: true },
    ...(bending ? [{ header: twoPlanes ? 'I, weak plane' : 'Second moment I', unit, numeric: true }] : []),
    ...(twoPlanes ? [{ header: 'I, strong plane', unit, numeric: true }] : []),
    ...(torsion ? [{ header: 'Torsion constant J', unit, numeric: true }, { header: 'Polar second moment', unit, numeric: true }] : []),
  ]
  const rows: Cell[][] = project.segments.map((segment, i) => [
    String(i + 1),
    ...(bending ? [constantText(segment.section, units, (s, t) => secondMoments(s, t)?.weak)] : []),
    ...(twoPlanes ? [constantText(segment.section, units, (s, t) => secondMoments(s, t)?.strong)] : []),
    ...(torsion ? [constantText(segment.section, units, torsionConstant), constantText(segment.section, units, polarMoment)] : []),
  ])
  return htmlTable(columns, rows, { className: 'section-constants' })
}

function endsTable(project: Project, units: ReportUnits, length: number): string {
  const motions = MOTIONS.filter((m) => project.motions.includes(m))
  const rows: Cell[][] = (['start', 'end'] as const).map((which) => [
    which === 'start' ? 'Start, x = 0' : `End, x = ${units.withUnit('length', length)}`,
    ...motions.map((m) => endWords(project, which, m)),
  ])
  return htmlTable([{ header: 'End' }, ...motions.map((m) => ({ header: m.charAt(0).toUpperCase() + m.slice(1) }))], rows, { className: 'ends' })
}

function preloadText(project: Project, units: ReportUnits): string {
  const p = project.preload ?? 0
  if (p === 0) return 'none'
  return `${escapeHtml(units.withUnit('force', Math.abs(p)))} ${p > 0 ? 'tension' : 'compression'}`
}

function bendingTheoryText(project: Project, analysis: ModalAnalysis): string {
  if ((analysis.settings.bendingTheory ?? 'euler-bernoulli') !== 'timoshenko') {
    return 'Euler–Bernoulli: plane sections stay normal to the axis; shear deformation and rotary inertia are left out (Timoshenko theory is the option that includes them)'
  }
  const given = project.segments.some((s) => s.section.shape === 'area')
  return `Timoshenko: shear deformation and rotary inertia included, with Cowper's shear coefficient of each section shape${given ? ' (5/6 for a section given by its area alone)' : ''}`
}

/** Motions analysed, bending theory, preload and the buckling check: what version 1 did not have. */
function motionsFacts(project: Project, analysis: ModalAnalysis, units: ReportUnits): string {
  const bending = project.motions.includes('bending')
  const preload = project.preload ?? 0
  const entries: [string, string][] = [['Motions analysed', escapeHtml(familiesWords(analysis.families.map((f) => f.family)))]]
  if (bending) entries.push(['Bending theory', escapeHtml(bendingTheoryText(project, analysis))])
  if (bending || preload !== 0) {
    entries.push([
      'Axial preload (steady)',
      `${preloadText(project, units)}${preload !== 0 ? ': it stiffens (tension) or softens (compression) bending through the geometric stiffness; axial and torsional frequencies do not depend on it' : ''}`,
    ])
  }
  const buckling = analysis.buckling
  if (buckling) {
    const near = buckling.ratio > 0.5
    entries.push([
      'Buckling check',
      `<span class="${near ? 'status-conflict' : 'status-clear'}">the compression is ${formatPercent(buckling.ratio)} % of the critical compression, ${escapeHtml(units.withUnit('force', buckling.criticalCompression))}</span> (the least compression at which the part buckles on its bending supports; ${escapeHtml(buckling.method)})${near ? '. Above half of it the bending frequencies fall steeply with small changes in load or support.' : ''}`,
    ])
  } else if (preload < 0) {
    entries.push(['Buckling check', '<span class="status-conflict">not made: bending is not analysed</span>'])
  }
  return keyValueTable(entries)
}

function massesTable(project: Project, units: ReportUnits): string {
  if (!project.masses.length) return '<p>None.</p>'
  const polar = project.motions.includes('torsion') || project.masses.some((m) => m.polarInertia !== undefined)
  const transverse = project.motions.includes('bending') || project.masses.some((m) => m.transverseInertia !== undefined)
  const inertia = units.symbol('massInertia')
  return htmlTable(
    [
      { header: '#', numeric: true },
      { header: 'Label' },
      { header: 'At x', unit: units.symbol('length'), numeric: true },
      { header: 'Mass', unit: units.symbol('mass'), numeric: true },
      ...(polar ? [{ header: 'Polar inertia', unit: inertia, numeric: true }] : []),
      ...(transverse ? [{ header: 'Transverse inertia', unit: inertia, numeric: true }] : []),
    ],
    project.masses.map((m, i) => [
      String(i + 1),
      m.label?.trim() || MISSING,
      units.figure('length', m.at),
      units.figure('mass', m.mass),
      ...(polar ? [units.figure('massInertia', m.polarInertia ?? 0)] : []),
      ...(transverse ? [units.figure('massInertia', m.transverseInertia ?? 0)] : []),
    ]),
    { className: 'masses' },
  )
}

const SPRING_MOTION_TEXT: Record<Motion, string> = { axial: 'axial (along the axis)', torsion: 'torsion (about the axis)', bending: 'bending (sideways)' }

function springStiffnessText(spring: GroundSpring, units: ReportUnits): string {
  return units.withUnit(springMotion(spring) === 'torsion' ? 'rotationalStiffness' : 'stiffness', spring.stiffness)
}

function springsTable(project: Project, units: ReportUnits): string {
  if (!project.springs.length) return '<p>None.</p>'
  if (isAxialOnly(project)) {
    return htmlTable(
      [
        { header: '#', numeric: true },
        { header: 'Label' },
        { header: 'At x', unit: units.symbol('length'), numeric: true },
        { header: 'Stiffness', unit: units.symbol('stiffness'), numeric: true },
      ],
      project.springs.map((s, i) => [String(i + 1), s.label?.trim() || MISSING, units.figure('length', s.at), units.figure('stiffness', s.stiffness)]),
      { className: 'springs' },
    )
  }
  const rotational = project.springs.some((s) => springMotion(s) === 'bending')
  return htmlTable(
    [
      { header: '#', numeric: true },
      { header: 'Label' },
      { header: 'At x', unit: units.symbol('length'), numeric: true },
      { header: 'Motion' },
      { header: 'Stiffness', numeric: true },
      ...(rotational ? [{ header: 'Rotational stiffness', unit: units.symbol('rotationalStiffness'), numeric: true }] : []),
    ],
    project.springs.map((s, i) => {
      const motion = springMotion(s)
      const analysed = project.motions.includes(motion)
      return [
        String(i + 1),
        s.label?.trim() || MISSING,
        units.figure('length', s.at),
        { html: `${escapeHtml(SPRING_MOTION_TEXT[motion])}${analysed ? '' : ' <span class="tag">not analysed</span>'}` },
        springStiffnessText(s, units),
        ...(rotational ? [motion === 'bending' ? units.figure('rotationalStiffness', s.rotationalStiffness ?? 0) : MISSING] : []),
      ]
    }),
    { className: 'springs' },
  )
}

export function modelSection(analysis: ModalAnalysis, units: ReportUnits, barDrawing: string): string {
  const project = analysis.project
  const axialOnly = isAxialOnly(project)
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

  const length = bounds[bounds.length - 1]
  const ends = axialOnly
    ? keyValueTable([
        ['Start, x = 0', escapeHtml(endWords(project, 'start', 'axial'))],
        [`End, x = ${units.withUnit('length', length)}`, escapeHtml(endWords(project, 'end', 'axial'))],
      ])
    : endsTable(project, units, length)
  const twist = project.motions.includes('torsion') || project.motions.includes('bending')
  const constants = twist
    ? `<div class="keep-together"><h3>Section constants</h3>
${sectionConstantsTable(project, units)}</div>`
    : ''
  const motions = axialOnly && (project.preload ?? 0) === 0 ? '' : `<h3>Motions, theory and preload</h3>
${motionsFacts(project, analysis, units)}
`
  const massesHeading = axialOnly ? 'Point masses (rigid, moving with the bar)' : 'Point masses (rigid, moving and turning with the part)'
  const springsHeading = axialOnly ? 'Springs from the bar to ground (axial)' : 'Springs from the part to ground'

  return `<section id="model">
<h2>1 The part as modelled</h2>
<figure class="bar-drawing">${barDrawing}<figcaption><b>Figure 1.</b> The bar to scale along its axis (x from the start); section sizes drawn to their own scale.</figcaption></figure>
<h3>Segments, from the start (x = 0) to the end</h3>
${segments}
${constants}${motions}<h3>Ends</h3>
${ends}
<div class="keep-together"><h3>${massesHeading}</h3>
${massesTable(project, units)}</div>
<div class="keep-together"><h3>${springsHeading}</h3>
${springsTable(project, units)}</div>
</section>`
}

/** The materials the segments use, and any other project material, with values and their source. */
export function materialsSection(project: Project, units: ReportUnits, bendingTheory?: string): string {
  const shear = project.motions.includes('torsion') || (project.motions.includes('bending') && bendingTheory === 'timoshenko')
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
      ...(shear ? [poissonText(material), shearModulusText(material, units)] : []),
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
      ...(shear ? [{ header: "Poisson's ratio ν", numeric: true }, { header: 'Shear modulus G', unit: units.symbol('modulus'), numeric: true }] : []),
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

type MaterialValues = Parameters<typeof shearModulus>[0]

function poissonText(material: MaterialValues | undefined): string {
  const nu = material ? poissonRatioOf(material) : undefined
  return nu === undefined ? MISSING : formatFigure(nu, 3)
}

/** G as given, or from E and ν (G = E / (2(1 + ν))). */
function shearModulusText(material: MaterialValues | undefined, units: ReportUnits): string {
  const g = material ? shearModulus(material) : undefined
  return g === undefined ? MISSING : units.figure('modulus', g)
}
