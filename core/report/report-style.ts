/**
 * The report's one stylesheet, inline in the document: an A4 page for print (page
 * numbers in the bottom margin), a sheet on a grey desk on screen. System fonts only.
 */
/** CSS string content: quotes and backslashes escaped, anything outside ASCII as a CSS escape. */
function cssString(text: string): string {
  return text.replace(/["\\]/g, (c) => `\\${c}`).replace(/[^\x20-\x7e]/g, (c) => `\\${(c.codePointAt(0) ?? 0).toString(16)} `)
}

/** The stylesheet, with the document's kind ("axial modal summary") in the page footer. */
export function reportCss(kind: string): string {
  return REPORT_CSS_TEMPLATE.replace('KIND', cssString(kind))
}

const REPORT_CSS_TEMPLATE = `
@page {
  size: A4;
  margin: 16mm 15mm 18mm 15mm;
  @bottom-left { content: "Rodwave \\2014  KIND"; font: 7.5pt "DejaVu Sans", "Liberation Sans", Arial, sans-serif; color: #5b6670; }
  @bottom-right { content: "Page " counter(page) " of " counter(pages); font: 7.5pt "DejaVu Sans", "Liberation Sans", Arial, sans-serif; color: #5b6670; }
}
:root { --ink: #1b1f24; --muted: #5b6670; --rule: #c9d0d6; --accent: #1f4e5f; --band: #f2f5f7;
  --conflict: #9f1c20; --conflict-bg: #fbe9e9; --clear: #1d6338; --closest-bg: #fff1c7; }
* { box-sizing: border-box; }
html { background: #e4e7ea; }
body { margin: 0; color: var(--ink); font-family: "DejaVu Sans", "Liberation Sans", "Helvetica Neue", Arial, sans-serif;
  font-size: 9pt; line-height: 1.4; -webkit-print-color-adjust: exact; print-color-adjust: exact; }
.sheet { max-width: 210mm; margin: 12px auto; padding: 16mm 15mm; background: #fff; box-shadow: 0 1px 4px rgba(0,0,0,.18); }
@media print {
  html { background: none; }
  .sheet { max-width: none; margin: 0; padding: 0; box-shadow: none; }
}
header.title-block { border-top: 3pt solid var(--accent); padding-top: 4mm; margin-bottom: 5mm; }
.doc-kind { margin: 0; font-size: 8pt; letter-spacing: .08em; text-transform: uppercase; color: var(--accent); font-weight: bold; }
h1 { margin: 1mm 0 3mm; font-size: 17pt; line-height: 1.2; }
h2 { margin: 7mm 0 2.5mm; padding-bottom: 1mm; font-size: 12pt; color: var(--accent); border-bottom: .6pt solid var(--accent);
  break-after: avoid; page-break-after: avoid; }
h3 { margin: 4.5mm 0 1.5mm; font-size: 9.5pt; break-after: avoid; page-break-after: avoid; }
p { margin: 1.5mm 0; }
.note { color: var(--muted); font-size: 8pt; }
table { border-collapse: collapse; width: 100%; margin: 1.5mm 0 3mm; font-size: 8.2pt; }
thead { display: table-header-group; }
tr { break-inside: avoid; page-break-inside: avoid; }
th, td { padding: .9mm 1.6mm; border-bottom: .4pt solid var(--rule); text-align: left; vertical-align: top; }
thead th { border-bottom: .9pt solid var(--ink); font-weight: bold; background: var(--band); }
th .unit { font-weight: normal; color: var(--muted); white-space: nowrap; }
td.num, th.num { text-align: right; font-variant-numeric: tabular-nums; white-space: nowrap; }
caption { caption-side: top; text-align: left; font-weight: bold; padding: 0 0 1mm; }
tr.total td { border-top: .9pt solid var(--ink); font-weight: bold; }
table.facts { width: auto; min-width: 60%; }
/* Small tables stay whole on a page, their caption and header with them. */
table.convergence, table.observed-orders, table.sturm, table.excitations, table.materials, table.modes { break-inside: avoid; page-break-inside: avoid; }
section.appendix { break-before: page; page-break-before: always; }
table.facts th { font-weight: normal; color: var(--muted); padding-right: 6mm; white-space: nowrap; background: none; }
table.facts td { font-weight: bold; }
table.title-facts { margin: 0; }
.status-conflict { color: var(--conflict); font-weight: bold; }
.status-clear { color: var(--clear); }
tr.conflict td { background: var(--conflict-bg); }
tr.closest td { background: var(--closest-bg); font-weight: bold; }
tr.closest td:first-child { box-shadow: inset 2pt 0 0 var(--conflict); }
.tag { display: inline-block; padding: 0 1.2mm; border: .5pt solid currentColor; border-radius: 1mm; font-size: 7pt;
  font-weight: normal; line-height: 1.5; white-space: nowrap; }
.verdict { margin: 3mm 0 0; padding: 2.5mm 3.5mm; border-left: 2.5pt solid var(--clear); background: var(--band); }
.verdict.has-conflict { border-left-color: var(--conflict); background: var(--conflict-bg); }
.verdict p { margin: .8mm 0; }
figure { margin: 2mm 0 4mm; break-inside: avoid; page-break-inside: avoid; }
figure svg { display: block; width: 100%; height: auto; max-width: 100%; }
figcaption { margin-top: 1mm; font-size: 8pt; color: var(--muted); }
figcaption b { color: var(--ink); }
.missing-figure { padding: 4mm; border: .6pt dashed var(--rule); color: var(--muted); }
ul { margin: 1.5mm 0; padding-left: 5mm; }
li { margin: .6mm 0; }
section.cautions { margin-top: 5mm; padding: 3mm 4mm; border: .9pt solid var(--conflict); break-inside: avoid; page-break-inside: avoid; }
section.cautions h2 { margin-top: 0; color: var(--conflict); border-bottom-color: var(--conflict); }
p.family-facts { color: var(--muted); }
ul.family-verdicts li { margin: .8mm 0; }
table.section-constants, table.ends, table.family-checks { break-inside: avoid; page-break-inside: avoid; }
a { color: inherit; text-decoration: none; }
footer.colophon { margin-top: 6mm; padding-top: 2mm; border-top: .4pt solid var(--rule); font-size: 7.5pt; color: var(--muted); }
.keep-together { break-inside: avoid; page-break-inside: avoid; }
`
