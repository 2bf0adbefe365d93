/** Report section 7: what the model assumes, and the cautions that go with any result. */

export const ASSUMPTIONS: readonly string[] = [
  'Linear elastic, isotropic material; stress stays well below yield.',
  'Small displacements: the geometry does not change with the motion, and a static preload does not change the stiffness.',
  'Axial (longitudinal) motion only: bending, torsion and their coupling with axial motion are not modelled, and each section stays plane.',
  'No damping in the modes: the natural frequencies are undamped; damping only limits the response near resonance.',
  'Point masses are rigid and move with the bar at their position; their rotary inertia plays no part in axial motion.',
  'Springs act along the axis between the bar and rigid ground; fixed ends hold the axial displacement at zero.',
]

export const CAUTIONS: readonly string[] = [
  'These results are an engineering aid, not a certification. They are only as good as the model: dimensions, materials, end fixity, attached masses and the stiffness of the supports all move the frequencies.',
  'Verify on the real part before relying on it, for example by an impact (tap) test of the installed part measuring its axial natural frequencies.',
  'Defer to the local codes, standards and licensed engineering practice that apply to the installation; where they ask for more than this check, they govern.',
]

export function notesSection(): string {
  return `<section id="assumptions">
<h2>7 Assumptions</h2>
<ul class="assumptions">${ASSUMPTIONS.map((a) => `<li>${a}</li>`).join('\n')}</ul>
</section>
<section class="cautions" id="cautions">
<h2>Cautions</h2>
<ul>${CAUTIONS.map((c) => `<li>${c}</li>`).join('\n')}</ul>
</section>`
}
