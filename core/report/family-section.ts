/**
 * One section per motion family in a report of several families: the family's ends and
 * elements, its modes table and mode-shape figure, its convergence study when one is given,
 * its Sturm check and its reference method.
 */
import type { ModalAnalysis, FamilyAnalysis } from '../analysis/modal-analysis'
import { referencePart, sturmPart } from './checks-section'
import { escapeHtml } from './html'
import { bendingElementText, convergencePart, elementOrderText } from './mesh-section'
import { familyModesNotes, familyModesTable, modeShapeFigure } from './modes-section'
import { capitalise, endWords, familySectionId, referenceMethodWords } from './report-families'
import type { FamilyFigures } from './report-figures'
import type { ReportUnits } from './report-units'

/** "Axial modes", "Torsion modes", "Bending modes (weak plane)". */
export function familySectionTitle(family: FamilyAnalysis['family']): string {
  return `${capitalise(family.motion)} modes${family.plane ? ` (${family.plane} plane)` : ''}`
}

/** Figure numbers a family section uses: its mode shapes, then its convergence charts. */
export function familyFigureCount(figures: FamilyFigures): number {
  return 1 + (figures.convergence.length ? 1 : 0)
}

export function familySection(analysis: ModalAnalysis, family: FamilyAnalysis, figures: FamilyFigures, units: ReportUnits, number: number, firstFigure: number): string {
  const project = analysis.project
  const motion = family.family.motion
  const elements = motion === 'bending' ? bendingElementText(analysis.settings.bendingTheory) : elementOrderText(analysis.settings.elementOrder)
  const facts = `<p class="family-facts">Ends: start ${escapeHtml(endWords(project, 'start', motion))}, end ${escapeHtml(endWords(project, 'end', motion))}. ${escapeHtml(capitalise(elements))}, ${family.model.dofNodes.length} unknowns. Reference: ${escapeHtml(referenceMethodWords(family.reference.method))}.</p>`
  const study = figures.study
  const convergence = study
    ? convergencePart(study, {
        modesReported: family.modes.length,
        charts: figures.convergence,
        figureLabels: figures.convergence.map((_, k) => `${firstFigure + 1}${figures.convergence.length > 1 ? String.fromCharCode(97 + k) : ''}`),
        bendingTheory: analysis.settings.bendingTheory,
      })
    : `<h3>Convergence as the mesh is refined</h3>
<p>No convergence study of this family is included in this report; the error against the reference in the modes table shows the accuracy of this mesh.</p>`
  return `<section id="${familySectionId(family.family.key)}" class="family" data-family="${family.family.key}">
<h2>${number} ${escapeHtml(familySectionTitle(family.family))}</h2>
${facts}
${familyModesTable(family, units)}
${familyModesNotes(family, units, { reference: 'reference method, below', convergence: 'below' })}
${modeShapeFigure(family, units, String(firstFigure), figures.modeShapes, figures.modeShapeModes)}
${convergence}
${sturmPart(family)}
${referencePart(family)}
</section>`
}
