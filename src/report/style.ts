/**
 * The sheets' stylesheet, inlined in every sheet: a plain engineering calculation in black and
 * grey on white, one red for what fails and for failure planes, sized to print on A4 and on
 * Letter alike (the text block is 180 mm wide, inside both with 15 mm margins). No fonts or
 * files from anywhere else: system fonts, with the usual math fonts named for MathML.
 */
export const SHEET_CSS = `
@page { margin: 14mm 15mm 16mm 15mm; }
:root { --ink: #1d2126; --grey: #5f656d; --rule: #b9bdc2; --faint: #f3f3f1; --fail: #a3211a; --pass: #1d5e36; }
* { box-sizing: border-box; }
html { background: #e4e4e0; }
body { margin: 0; padding: 18px 0 40px; color: var(--ink); font: 9.6pt/1.42 'DejaVu Sans', 'Liberation Sans', 'Segoe UI', Helvetica, Arial, sans-serif; }
.sheet { width: 190mm; max-width: 100%; margin: 0 auto 22px; padding: 11mm 10mm 9mm; background: #fff; box-shadow: 0 1px 4px rgba(0,0,0,.18); }
math { font-family: 'STIX Two Math', 'Cambria Math', 'DejaVu Math TeX Gyre', 'Latin Modern Math', math; font-size: 1.06em; }
h1 { font-size: 13.5pt; margin: 0; letter-spacing: .01em; }
h2 { font-size: 10.6pt; margin: 16px 0 6px; padding-bottom: 2px; border-bottom: 1.4px solid var(--ink); text-transform: uppercase; letter-spacing: .06em; }
h3 { font-size: 10pt; margin: 0 0 2px; }
p { margin: 4px 0; }
code, .mono { font-family: 'DejaVu Sans Mono', 'Liberation Mono', Consolas, monospace; font-size: 8.6pt; }
table { border-collapse: collapse; width: 100%; }
th, td { text-align: left; vertical-align: top; padding: 2.5px 5px; }
th { font-weight: 600; color: var(--grey); font-size: 8.4pt; text-transform: uppercase; letter-spacing: .04em; border-bottom: 1px solid var(--rule); }
td.num, th.num { text-align: right; font-variant-numeric: tabular-nums; white-space: nowrap; }

/* title block */
.title-block { border: 1.6px solid var(--ink); }
.title-block .banner { display: flex; justify-content: space-between; align-items: baseline; padding: 6px 8px; border-bottom: 1.2px solid var(--ink); }
.title-block .banner .what { font-size: 8.4pt; color: var(--grey); text-transform: uppercase; letter-spacing: .08em; }
.title-block table td { border-top: 1px solid var(--rule); border-right: 1px solid var(--rule); padding: 3px 8px; height: 23px; }
.title-block table td:last-child { border-right: 0; }
.title-block tr:first-child td { border-top: 0; }
.title-block .k { color: var(--grey); font-size: 7.8pt; text-transform: uppercase; letter-spacing: .05em; width: 16%; white-space: nowrap; }
.title-block .v { font-weight: 600; }

/* the answer in one paragraph */
.verdict { margin: 12px 0 4px; padding: 8px 10px; border-left: 5px solid var(--pass); background: var(--faint); break-inside: avoid; }
.verdict.fail { border-left-color: var(--fail); }
.verdict .status { display: inline-block; font-weight: 700; letter-spacing: .08em; padding: 0 6px; margin-right: 6px; color: #fff; background: var(--pass); }
.verdict.fail .status { background: var(--fail); }
.verdict .governing { font-size: 10.4pt; font-weight: 600; margin: 2px 0; }
.verdict .sub { color: var(--grey); margin: 2px 0 0; }

/* inputs */
table.inputs td { border-bottom: 1px solid #e6e6e3; }
table.inputs td.path { white-space: nowrap; width: 28%; }
table.inputs tr.heading td { font-weight: 600; background: var(--faint); }
table.inputs td.unit { width: 8%; color: var(--grey); white-space: nowrap; }
table.inputs td.value { width: 22%; font-weight: 600; }
table.inputs td.value .note { font-weight: 400; }
table.inputs td.label { color: var(--grey); font-size: 8.6pt; }

/* figures */
figure { margin: 6px 0 0; break-inside: avoid; }
figure svg { display: block; width: 100%; height: auto; border: 1px solid var(--rule); }
figcaption { color: var(--grey); font-size: 8.4pt; margin-top: 3px; }

/* strength checks */
.check { margin: 10px 0 14px; padding-top: 6px; border-top: 1px solid var(--rule); }
.check .head, .check .clause { break-after: avoid; }
table.steps tr, table.summary, table.inputs tr, table.limits tr { break-inside: avoid; }
.check:first-of-type { border-top: 0; }
.check .head { display: flex; justify-content: space-between; gap: 10px; align-items: baseline; }
.check .code, .code { font-family: 'DejaVu Sans Mono', 'Liberation Mono', Consolas, monospace; font-size: 7.8pt; color: var(--grey); }
.check .clause { color: var(--grey); font-size: 8.6pt; margin: 0 0 4px; }
table.steps { table-layout: fixed; }
table.steps td { padding: 3px 4px; border-bottom: 1px dotted #d3d5d8; }
table.steps .what { display: flex; justify-content: space-between; gap: 12px; color: var(--grey); font-size: 8.2pt; }
table.steps .what .ref { text-align: right; white-space: nowrap; font-size: 7.9pt; }
table.steps .eq { padding: 1px 0 1px 12px; overflow-x: auto; }
table.steps tr.decisive td { border-bottom: 0; }
table.summary { margin-top: 5px; border: 1px solid var(--rule); }
table.summary th, table.summary td { text-align: right; font-variant-numeric: tabular-nums; }
table.summary td { font-weight: 600; }
.ok { color: var(--pass); font-weight: 700; }
.ng { color: var(--fail); font-weight: 700; }
.note { color: var(--grey); font-size: 8.4pt; }
.exempt { padding: 4px 8px; background: var(--faint); }

/* limits, warnings */
table.limits td { border-bottom: 1px solid #e6e6e3; }
table.limits tr.fail td { background: #fbeceb; }
ul.warnings { margin: 4px 0; padding-left: 0; list-style: none; }
ul.warnings li { margin: 3px 0; padding-left: 10px; border-left: 3px solid #c9a227; }

/* foot */
.caution { margin-top: 16px; padding: 8px 10px; border: 1.4px solid var(--ink); break-inside: avoid; }
.caution h2 { border: 0; margin: 0 0 3px; }
.provenance { margin-top: 10px; color: var(--grey); font-size: 8.2pt; break-inside: avoid; }
.provenance .hash { color: var(--ink); word-break: break-all; }
.provenance pre { white-space: pre-wrap; word-break: break-all; margin: 4px 0 0; padding: 5px 6px; background: var(--faint); font-size: 7.4pt; }

/* batch summary */
table.batch td { border-bottom: 1px solid #e6e6e3; }
table.batch td:nth-child(2) { white-space: nowrap; }
table.batch tr.fail td, table.batch tr.error td { background: #fbeceb; }
a { color: inherit; }

@media print {
  html, body { background: #fff; padding: 0; }
  .sheet { width: auto; margin: 0; padding: 0; box-shadow: none; }
  .sheet + .sheet { break-before: page; }
  body { font-size: 9pt; }
  h2 { break-after: avoid; }
  table.steps .eq { overflow: visible; }
}
`;
