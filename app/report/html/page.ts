import { esc, tierCss } from './format.js';

/**
 * The document shell shared by every report: inline CSS only, no scripts, no external resources
 * (fonts, images, styles), so the file reads the same mailed, archived or printed to PDF.
 */
export function pageHtml(title: string, body: string, footer: string): string {
  return `<!doctype html>
<html lang="en"><head><meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<title>${esc(title)}</title>
<style>
${CSS}
${tierCss()}
</style></head>
<body>
<main>
${body}
</main>
<footer>${footer}</footer>
</body></html>
`;
}

const CSS = `
:root{--ink:#1B1F24;--muted:#5A6570;--rule:#D5DBE1;--head:#EEF2F5}
*{box-sizing:border-box}
html{-webkit-print-color-adjust:exact;print-color-adjust:exact}
body{font:14px/1.45 "Liberation Sans",Arial,"DejaVu Sans",Helvetica,sans-serif;color:var(--ink);margin:0;background:#fff}
main{max-width:1020px;margin:0 auto;padding:24px 28px 8px}
footer{max-width:1020px;margin:0 auto;padding:8px 28px 24px;color:var(--muted);font-size:12px;border-top:1px solid var(--rule)}
h1{font-size:22px;margin:0 0 6px}
h2{font-size:17px;margin:28px 0 8px;padding-bottom:3px;border-bottom:2px solid var(--ink)}
h3{font-size:15px;margin:18px 0 6px}
.sub{color:var(--muted);margin:0 0 12px}
dl.meta{display:grid;grid-template-columns:max-content 1fr;gap:2px 14px;margin:8px 0 14px}
dl.meta dt{color:var(--muted)}dl.meta dd{margin:0}
.banner{border:2px dashed #6B4E00;background:#FFF4D6;color:#3D2C00;padding:8px 12px;margin:10px 0;font-weight:bold}
.caution{border-left:5px solid #6B4E00;background:#FFF8E6;padding:9px 13px;margin:12px 0}
.caution b{display:block;margin-bottom:2px}
.cards{display:flex;flex-wrap:wrap;gap:10px;margin:12px 0}
.card{flex:1 1 150px;border-radius:6px;padding:10px 14px;border:1px solid rgba(0,0,0,.15)}
.card .n{font-size:28px;font-weight:bold;line-height:1.1}
.card .glyph{font-size:20px;margin-right:6px}
.card .what{font-size:12px}
.card.plain{background:var(--head)}
figure.plot{margin:14px 0;break-inside:avoid;page-break-inside:avoid}
figure.plot svg{max-width:100%;height:auto;display:block}
figure.plot figcaption{color:var(--muted);font-size:12px;margin-top:4px}
.plots-row{display:flex;flex-wrap:wrap;gap:18px;align-items:flex-start}
.plots-row figure.plot{flex:0 1 auto}
.plots-row figure.plot figcaption{width:0;min-width:100%}
table{border-collapse:collapse;width:100%;font-size:12.5px;margin:6px 0 10px}
th,td{padding:3px 7px;border-bottom:1px solid var(--rule);text-align:left;vertical-align:top}
th{background:var(--head);font-weight:bold}
thead{display:table-header-group}
tr{break-inside:avoid;page-break-inside:avoid}
td.num,th.num{text-align:right;font-variant-numeric:tabular-nums;white-space:nowrap}
.nw{white-space:nowrap}
.name{display:block;color:var(--muted);font-size:11px}
td.name-col{color:var(--muted);font-size:11.5px}
td.cov-col{font-size:11.5px}.cov{display:block;white-space:nowrap}
.tier{display:inline-block;padding:0 7px;border-radius:3px;font-weight:bold;white-space:nowrap}
.tier-none{background:#fff;color:var(--muted);border:1px solid var(--rule)}
.tier .glyph{font-size:.95em}
ul.warnings{margin:4px 0 10px;padding-left:20px}
.none{color:var(--muted);font-style:italic}
.key{display:flex;flex-wrap:wrap;gap:18px;font-size:13px;color:var(--muted);margin:4px 0}
@page{size:A4;margin:12mm 10mm}
@media print{
main,footer{max-width:none;padding-left:0;padding-right:0}h2{break-after:avoid}
table{font-size:9px}th,td{padding:2px 4px}td.num,th.num{white-space:normal}
td.name-col,td.cov-col,.name{font-size:8.5px}.cov{white-space:normal}
}
`;
