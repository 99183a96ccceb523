#include "report/html_style.h"

namespace twinprobe {

const std::string& ReportCss() {
  static const std::string css = R"CSS(
:root { --ink: #1b1b1b; --muted: #555; --rule: #d6d6d6; --accent: #0072B2; --warn: #D55E00; --soft: #f3f6f9; }
* { box-sizing: border-box; }
html { background: #fff; }
body { margin: 0 auto; max-width: 1200px; padding: 28px 40px 48px; color: var(--ink); background: #fff;
  font: 15px/1.5 "DejaVu Sans", "Liberation Sans", Arial, system-ui, sans-serif; }
h1 { font-size: 28px; line-height: 1.25; margin: 4px 0 8px; }
h2 { font-size: 21px; margin: 36px 0 12px; padding-bottom: 4px; border-bottom: 3px solid var(--accent); }
h3 { font-size: 16px; margin: 20px 0 6px; }
p { margin: 6px 0 10px; max-width: 78ch; }
.kicker { text-transform: uppercase; letter-spacing: .08em; font-size: 12px; color: var(--accent); font-weight: bold; margin: 0; }
.meta { color: var(--muted); font-size: 13.5px; }
.banner { border: 2px solid var(--warn); padding: 8px 12px; background: #fff4ec; max-width: none; }
.toc { border: 1px solid var(--rule); padding: 6px 16px 8px; margin: 16px 0 8px; }
.toc h2 { font-size: 14px; border: 0; margin: 4px 0; padding: 0; text-transform: uppercase; letter-spacing: .06em; color: var(--muted); }
.toc ol { columns: 2; margin: 0; padding-left: 22px; font-size: 14px; }
.toc a { color: var(--accent); }
.keyfigs { display: flex; flex-wrap: wrap; gap: 12px; margin: 12px 0 18px; }
.keyfig { flex: 1 1 200px; border: 1px solid var(--rule); border-top: 4px solid var(--accent); padding: 10px 14px; background: var(--soft); }
.keyfig .big { display: block; font-size: 30px; font-weight: bold; line-height: 1.1; font-variant-numeric: tabular-nums; white-space: nowrap; }
.keyfig .what { display: block; font-size: 14px; margin-top: 4px; }
.keyfig .small { display: block; font-size: 12.5px; color: var(--muted); }
.plain h3 { margin-top: 14px; }
.plain p { font-size: 15.5px; }
.verdict { font-weight: bold; }
.absent { color: var(--muted); font-style: italic; }
.note { color: var(--muted); font-size: 13.5px; }
.warning { border-left: 4px solid var(--warn); padding-left: 10px; }
dl.facts { display: grid; grid-template-columns: max-content 1fr; gap: 4px 18px; margin: 8px 0 14px; font-size: 14px; }
dl.facts dt { font-weight: bold; }
dl.facts dd { margin: 0; overflow-wrap: anywhere; }
table.data { border-collapse: collapse; margin: 10px 0 16px; font-size: 13.5px; }
table.data caption { text-align: left; font-weight: bold; padding-bottom: 4px; }
table.data th, table.data td { border-bottom: 1px solid var(--rule); padding: 4px 10px; text-align: left; vertical-align: top; }
table.data thead th { border-bottom: 2px solid #888; }
table.data .num { text-align: right; font-variant-numeric: tabular-nums; white-space: nowrap; }
table.data.stratum-table { display: inline-table; font-size: 12px; margin: 4px 14px 10px 0; vertical-align: top; } table.data.stratum-table th, table.data.stratum-table td { padding: 2px 6px; }
table.cross td { font-size: 15px; }
table.cross td.hl { background: var(--soft); font-weight: bold; }
table.cross small { font-weight: normal; color: var(--muted); }
.tables { display: flex; flex-wrap: wrap; gap: 0 32px; align-items: flex-start; }
.balance-item table.data { margin-bottom: 2px; }
.balance-item .note { margin: 0 0 16px; }
.hashes dl.facts dd, dl.facts dd.hash { font-family: "DejaVu Sans Mono", monospace; font-size: 12.5px; }
.headline { font-size: 18px; line-height: 1.45; font-weight: bold; max-width: 70ch; margin: 14px 0 6px; }
figure { margin: 14px 0 22px; }
.figure-body { display: flex; flex-wrap: wrap; gap: 10px 24px; align-items: flex-start; }
.figure-body .plot { flex: 0 1 640px; min-width: 0; }
.figure-body .figure-table { flex: 1 1 280px; }
.figure-body.wide .plot { flex: 0 1 780px; }
.figure-table table.data { margin-top: 0; }
figcaption { font-size: 13.5px; color: var(--muted); margin-top: 6px; }
svg.chart { width: 100%; height: auto; display: block; }
svg.chart text { font-family: "DejaVu Sans", "Liberation Sans", Arial, sans-serif; font-size: 13px; fill: #1b1b1b; }
svg.chart .tick { font-size: 11.5px; fill: #555; }
svg.chart .axis-label, svg.chart .note { font-size: 12.5px; fill: #444; }
svg.chart .grid line { stroke: #e4e4e4; stroke-width: 1; }
svg.chart .axis { stroke: #444; stroke-width: 1; }
svg.chart .null { stroke: #222; stroke-width: 1.2; stroke-dasharray: 5 3; }
svg.chart .sep { stroke: #999; }
svg.chart .val { font-variant-numeric: tabular-nums; }
svg.chart .small { font-size: 11.5px; }
svg.chart .head, svg.chart .strong { font-weight: bold; }
svg.chart .na { fill: #666; font-style: italic; }
ul.methods li, ul.cautions li { margin-bottom: 8px; max-width: 82ch; }
.source { color: var(--muted); font-size: 13.5px; }
footer { margin-top: 40px; border-top: 1px solid var(--rule); color: var(--muted); font-size: 12.5px; }
bdi { unicode-bidi: isolate; }
@media (max-width: 900px) { body { padding: 16px; } }
@page { size: A4; margin: 15mm 14mm 16mm; }
@media print {
  body { max-width: none; padding: 0; font-size: 10.5pt; }
  h1 { font-size: 20pt; }
  h2 { font-size: 14pt; margin-top: 18pt; break-after: avoid; page-break-after: avoid; }
  h3 { break-after: avoid; page-break-after: avoid; }
  /* A heading keeps its introduction and its first chart or table on the same page. Chromium
     honours break-after: avoid after a paragraph of several lines only when the paragraph is
     laid out as a table (checked with --print-to-pdf on the demo report). */
  h2 + p, h3 + p, h2 + p + p, h3 + p + p {
    display: table; break-inside: avoid; page-break-inside: avoid; break-after: avoid; page-break-after: avoid;
  }
  .toc { display: none; }
  .figure-body { display: block; }
  .figure-body .figure-table { margin-top: 6pt; }
  figure, table.data, .keyfigs, dl.facts { break-inside: avoid; page-break-inside: avoid; }
  .plain p { orphans: 3; widows: 3; }
  .keyfig { flex-basis: 120px; padding: 6pt 8pt; }
  .keyfig .big { font-size: 17pt; }
  #methods { break-before: page; page-break-before: always; }
  a { color: inherit; text-decoration: none; }
  .keyfig, table.cross td.hl { background: #fff; }
  svg.chart { max-height: 120mm; }
}
)CSS";
  return css;
}

}  // namespace twinprobe
