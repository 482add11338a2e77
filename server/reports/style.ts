/**
 * The report page's only stylesheet (inline): Tapwright's palette (tailwind.config.ts tokens ink, paper,
 * signal, copper, pass, fail), system fonts so nothing loads, and print rules for A4 and Letter: 15 mm
 * margins leave a column narrower than both papers, so the printer's paper size decides (`size: auto`).
 */
export const REPORT_CSS = `
:root { --ink: #18222e; --ink-soft: #445467; --rule: #c9d2dc; --paper: #fdfcfa; --paper-2: #f0ece4;
  --signal: #10746b; --copper: #a05427; --pass: #23703b; --pass-bg: #eef8f1; --fail: #a8352d; --fail-bg: #fcefee;
  --warn: #7b560c; }
* { box-sizing: border-box; }
html { background: var(--paper); color: var(--ink); }
body { margin: 0; font: 10pt/1.45 "Inter", system-ui, "Helvetica Neue", Arial, sans-serif; }
main { max-width: 180mm; margin: 0 auto; padding: 10mm 0; }
h1 { font-size: 17pt; margin: 0 0 3mm; }
h2 { font-size: 12pt; margin: 7mm 0 2mm; padding-bottom: 1mm; border-bottom: 1px solid var(--rule); break-after: avoid; }
.mark { margin: 0; font-weight: 700; letter-spacing: 0.04em; color: var(--signal); }
table { width: 100%; border-collapse: collapse; margin: 2mm 0; font-size: 8.6pt; }
th, td { text-align: left; padding: 1.2mm 1.6mm; border-bottom: 1px solid var(--rule); vertical-align: top; }
thead th { background: var(--paper-2); font-weight: 600; }
tr { break-inside: avoid; }
.num, .hash, .key { font-family: "JetBrains Mono", ui-monospace, "DejaVu Sans Mono", monospace; font-variant-numeric: tabular-nums; }
td.num { text-align: right; white-space: nowrap; }
.key { display: block; font-size: 7pt; color: var(--ink-soft); font-weight: 400; }
dt .key { display: inline; }
table.header { width: auto; }
table.header th { padding-right: 6mm; color: var(--ink-soft); font-weight: 500; }
.hash { word-break: break-all; }
.verdict { font-weight: 700; text-align: center; }
.verdict.pass { color: var(--pass); background: var(--pass-bg); }
.verdict.fail { color: var(--fail); background: var(--fail-bg); }
.banner { padding: 2.5mm 3mm; border-left: 4px solid; font-weight: 600; margin: 4mm 0; }
.banner.pass { color: var(--pass); background: var(--pass-bg); }
.banner.fail { color: var(--fail); background: var(--fail-bg); }
.banner.none { color: var(--warn); background: #fdf7e7; }
tr.best th, tr.best td { background: var(--paper-2); }
figure { margin: 3mm 0 5mm; break-inside: avoid; }
figure svg { width: 100%; height: auto; display: block; }
figcaption { font-size: 8pt; color: var(--ink-soft); }
svg text { font-family: "Inter", system-ui, Arial, sans-serif; fill: var(--ink); }
svg .tick { font-size: 9px; fill: var(--ink-soft); }
svg .axis, svg .legend { font-size: 10px; }
svg .marker-label { font-size: 10px; fill: var(--copper); }
svg .plot-bg { fill: #ffffff; stroke: var(--rule); }
svg .grid { stroke: var(--paper-2); stroke-width: 1; }
svg .line { fill: none; stroke-width: 1.2; stroke-linejoin: round; }
svg .line.thin { stroke-width: 0.8; }
svg .float { stroke: var(--signal); fill: var(--signal); }
svg polyline.float, svg polyline.fixed { fill: none; }
svg .fixed { stroke: var(--copper); fill: var(--copper); }
svg .line.fixed { stroke-dasharray: 4 2; }
svg .limit, svg .limit-line { stroke: var(--fail); stroke-width: 1.2; stroke-dasharray: 6 3; }
svg .mask-line { stroke: var(--warn); stroke-width: 1; stroke-dasharray: 3 2; }
svg .marker.best { stroke: var(--copper); stroke-width: 1.2; }
dl { font-size: 8.6pt; }
dt { font-weight: 600; margin-top: 1.5mm; }
dd { margin: 0 0 0 4mm; }
ul { padding-left: 5mm; }
footer { margin-top: 8mm; font-size: 7.5pt; color: var(--ink-soft); border-top: 1px solid var(--rule); }
@page { size: auto; margin: 15mm 14mm 16mm; }
@media print {
  html, body { background: #ffffff; }
  main { max-width: none; padding: 0; }
  a { color: inherit; text-decoration: none; }
}
`;
