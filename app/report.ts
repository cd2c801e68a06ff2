import { DECISION_AID_NOTE } from '../core/risk/assess.js';
import { TIERS, type TierId } from '../core/risk/tiers.js';
import { toIso } from '../core/time/instant.js';
import type { ConjunctionEvent } from '../core/events/index.js';
import type { RunRecord } from '../db/index.js';

const esc = (s: string): string =>
  s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;');

/** Pc for reading: below double precision's range it is shown as "< 1e-300", not "0.00e+0". */
const fmtPc = (pc: number | null | undefined): string =>
  pc === null || pc === undefined ? '—' : pc < 1e-300 ? '< 1e-300' : pc.toExponential(2);

/**
 * A self-contained HTML summary of one run (no scripts, no external resources), for mailing
 * or printing. The full per-event report is a later feature; this lists every event.
 */
export function runReportHtml(run: RunRecord, events: readonly ConjunctionEvent[], title: string): string {
  const s = run.settings;
  const v = s.volume;
  const volume = v.kind === 'sphere' ? `sphere, radius ${v.radiusKm} km` : `RTN ellipsoid ${v.rKm} × ${v.tKm} × ${v.nKm} km`;
  const row = (e: ConjunctionEvent): string => {
    const tier = (e.risk?.tier ?? 'routine') as TierId;
    const info = TIERS[tier];
    return `<tr><td>${esc(e.id)}</td><td class="nw">${toIso(e.tca)}</td><td>${esc(e.primary)}</td><td>${esc(e.secondary)}</td>
<td class="num">${e.missKm.toFixed(3)}</td><td class="num">${e.relativeSpeedKmS.toFixed(3)}</td>
<td class="num nw">${e.rtnKm.map((x) => x.toFixed(3)).join(', ')}</td><td class="num nw">${fmtPc(e.risk?.pc)}</td>
<td>${esc(e.risk?.pcMethod ?? '—')}</td><td>${esc(e.risk?.covarianceSource ?? '—')}</td>
<td><span class="tier" style="background:${info?.colour ?? '#888'}">${esc(info?.label ?? tier)}</span></td></tr>`;
  };
  const head = `<thead><tr><th>Event</th><th>TCA (UTC)</th><th>Primary</th><th>Secondary</th><th>Miss km</th><th>v<sub>rel</sub> km/s</th>
<th>R, T, N km</th><th>Pc</th><th>Pc method</th><th>Covariance</th><th>Tier</th></tr></thead>`;
  // Events graded above routine come first, highest Pc first.
  const attention = events
    .filter((e) => e.risk && e.risk.tier !== 'routine')
    .sort((a, b) => (b.risk?.pc ?? 0) - (a.risk?.pc ?? 0) || a.tca - b.tca);
  const rows = events.map(row).join('\n');
  const attentionBlock = attention.length
    ? `<h2>Needing attention (${attention.length})</h2><table>${head}<tbody>${attention.map(row).join('\n')}</tbody></table>`
    : '<h2>Needing attention</h2><p>No event is graded above routine.</p>';
  return `<!doctype html>
<html lang="en"><head><meta charset="utf-8"><title>${esc(title)}</title>
<style>
body{font:14px/1.4 system-ui,sans-serif;margin:2em;color:#1d232a}
table{border-collapse:collapse;width:100%}th,td{padding:4px 8px;border-bottom:1px solid #d5dbe1;text-align:left}
th{background:#eef2f5}.num{text-align:right;font-variant-numeric:tabular-nums}
.tier{color:#fff;padding:1px 6px;border-radius:3px}.nw{white-space:nowrap}h2{margin-top:1.5em}.caution{border-left:4px solid #8a5a00;background:#fff8e6;padding:8px 12px}
</style></head><body>
<h1>${esc(title)}</h1>
<p>Run <b>${esc(run.id)}</b>: window ${toIso(s.start)} to ${toIso(s.end)}; screening volume ${esc(volume)};
primaries ${esc(s.primaries === 'all' ? 'all objects' : s.primaries.join(', '))}; ${run.objectCount} objects;
${events.length} event(s); catalogue fingerprint <code>${esc(run.catalogFingerprint.slice(0, 16))}</code>.</p>
${run.flagged.length ? `<p>Flagged objects: ${run.flagged.map((f) => `${esc(f.id)} (${esc(f.reason)})`).join('; ')}</p>` : ''}
<p class="caution">${esc(DECISION_AID_NOTE)}</p>
${attentionBlock}
<h2>All events, by TCA</h2>
<table>${head}
<tbody>
${rows}
</tbody></table>
</body></html>
`;
}
