/**
 * Report section 7 (later with several families): what the model assumes and leaves out for the
 * motions analysed, and the cautions that go with any result.
 */
import type { BendingTheory, Motion } from '../model/project'

export interface NotesInput {
  /** The motions analysed. */
  readonly motions: readonly Motion[]
  readonly bendingTheory?: BendingTheory
  /** Some section bends differently in its two principal planes. */
  readonly twoPlanes?: boolean
}

/** An axial-only report's assumptions (the version 1 list, with the other motions said to be left out of this report). */
const AXIAL_ONLY: readonly string[] = [
  'Linear elastic, isotropic material; stress stays well below yield.',
  'Small displacements: the geometry does not change with the motion, and a static preload does not change the stiffness.',
  'Axial (longitudinal) motion only: bending and torsion were not analysed for this report, their coupling with axial motion is not modelled, and each section stays plane.',
  'No damping in the modes: the natural frequencies are undamped; damping only limits the response near resonance.',
  'Point masses are rigid and move with the bar at their position; their rotary inertia plays no part in axial motion.',
  'Springs act along the axis between the bar and rigid ground; fixed ends hold the axial displacement at zero.',
]

/** What the model assumes, for the motions analysed. */
export function reportAssumptions(input: NotesInput): string[] {
  const { motions } = input
  if (motions.length === 1 && motions[0] === 'axial') return [...AXIAL_ONLY]
  const bending = motions.includes('bending')
  const torsion = motions.includes('torsion')
  const out: string[] = [
    'Linear elastic, isotropic material; stress stays well below yield.',
    bending
      ? 'Small displacements about the straight part: the geometry does not change with the motion. A steady axial preload enters bending through its geometric stiffness; it changes neither the axial nor the torsional stiffness.'
      : 'Small displacements: the geometry does not change with the motion, and a static preload does not change the stiffness.',
    `The motions analysed (${motions.join(', ')}) are independent of each other, as they are in a straight part whose sections are symmetric; ${motions.length < 3 ? `${(['axial', 'torsion', 'bending'] as const).filter((m) => !motions.includes(m)).join(' and ')} ${3 - motions.length === 1 ? 'was' : 'were'} not analysed for this report, and ` : ''}coupled bending–torsion of unsymmetric sections (shear centre off the centroid) is not modelled.`,
  ]
  if (torsion) {
    out.push('Torsion follows Saint-Venant theory: each section turns as a whole and warps freely; warping restrained at a fixed end is not modelled.')
  }
  if (bending) {
    out.push(
      input.bendingTheory === 'timoshenko'
        ? 'Bending follows Timoshenko theory: shear deformation and rotary inertia are included, with a shear coefficient from the section shape.'
        : 'Bending follows Euler–Bernoulli theory: plane sections stay normal to the axis, so shear deformation and rotary inertia are left out. That overestimates the frequencies of stubby segments and of high modes; Timoshenko theory is the option that includes them.',
    )
    if (input.twoPlanes) out.push('Sections with two principal planes are taken as aligned along the part: the weak and strong planes of every segment point the same way, so each plane bends on its own.')
    out.push('The part is straight: initial curvature (a bow or a kink) is not modelled.')
    out.push('The part is at rest: gyroscopic effects and bearing dynamics of a spinning shaft are not modelled, so the bending frequencies are not the lateral critical speeds of a rotor.')
  }
  out.push('No damping in the modes: the natural frequencies are undamped; damping only limits the response near resonance.')
  const inertia = [torsion ? 'their polar inertia enters torsion' : '', bending ? 'their transverse inertia enters bending' : ''].filter(Boolean)
  out.push(`Point masses are rigid and move with the part at their position${inertia.length ? `; ${inertia.join(' and ')}` : ''}.`)
  out.push(
    'Springs act between the part and rigid ground, each in its own motion: along the axis, about the axis (torsion), or sideways and against the slope (bending); a held end holds the displacement, twist, deflection or slope its condition names at zero.',
  )
  return out
}

const AID =
  'These results are an engineering aid, not a certification. They are only as good as the model: dimensions, materials, end fixity, attached masses and the stiffness of the supports all move the frequencies.'
const CODES = 'Defer to the local codes, standards and licensed engineering practice that apply to the installation; where they ask for more than this check, they govern.'

/** The cautions of any report, and those of the motions analysed (or not analysed). */
export function reportCautions(input: NotesInput): string[] {
  const { motions } = input
  if (motions.length === 1 && motions[0] === 'axial') {
    return [
      AID,
      'Verify on the real part before relying on it, for example by an impact (tap) test of the installed part measuring its axial natural frequencies.',
      'This report covers axial motion only. A slender rod or tie usually has bending modes far below its axial ones, and a shaft rings in torsion: a clear axial check says nothing about them.',
      CODES,
    ]
  }
  const out = [
    AID,
    `Verify on the real part before relying on it, for example by an impact (tap) test of the installed part measuring its natural frequencies in ${motions.length > 1 ? 'each motion analysed' : `${motions[0]}`}.`,
  ]
  if (motions.includes('bending')) {
    out.push('For a spinning shaft, the bending frequencies here are those of the part at rest: gyroscopic effects and bearing dynamics are not modelled, and the lateral critical speeds of a rotor need a rotor-dynamics analysis.')
  }
  const left = (['axial', 'torsion', 'bending'] as const).filter((m) => !motions.includes(m))
  if (left.length) out.push(`${left.map((m) => m.charAt(0).toUpperCase() + m.slice(1)).join(' and ')} ${left.length === 1 ? 'was' : 'were'} not analysed: a clear check of the other motions says nothing about ${left.length === 1 ? 'it' : 'them'}.`)
  out.push(CODES)
  return out
}

export function notesSection(input: NotesInput = { motions: ['axial'] }, number = 7): string {
  return `<section id="assumptions">
<h2>${number} Assumptions</h2>
<ul class="assumptions">${reportAssumptions(input)
    .map((a) => `<li>${a}</li>`)
    .join('\n')}</ul>
</section>
<section class="cautions" id="cautions">
<h2>Cautions</h2>
<ul>${reportCautions(input)
    .map((c) => `<li>${c}</li>`)
    .join('\n')}</ul>
</section>`
}
