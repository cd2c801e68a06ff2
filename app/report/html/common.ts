import { TIER_ORDER, TIERS, type TierId } from '../../../core/risk/tiers.js';
import type { CatalogueNote, EventRowModel, RunHeaderModel } from '../model.js';
import { esc, formatPc, num, shortIso, tierBadge } from './format.js';

export function cautionBox(caution: string): string {
  return `<aside class="caution" data-caution><b>Decision aid</b>${esc(caution)}</aside>`;
}

export function catalogueBanner(c: CatalogueNote | null): string {
  return c ? `<p class="banner" data-synthetic="${c.synthetic}">${esc(c.text)}</p>` : '';
}

const days = (a: string, b: string): string => Number(((Date.parse(b) - Date.parse(a)) / 86_400_000).toFixed(2)).toString();

export function runMeta(run: RunHeaderModel, generatedAt: string): string {
  const rows: [string, string][] = [
    ['Run', `<b>${esc(run.id)}</b> (${esc(run.status)}, screened ${esc(shortIso(run.createdAt))}${run.wallMs === null ? '' : ` in ${(run.wallMs / 1000).toFixed(1)} s`})`],
    ['Window', `${esc(shortIso(run.windowStart))} to ${esc(shortIso(run.windowEnd))} (${days(run.windowStart, run.windowEnd)} days)`],
    ['Screening volume', esc(run.volumeText)],
    ['Primaries', esc(run.primariesText)],
    ['Catalogue', `${run.catalogueSize.toLocaleString('en-GB')} objects; fingerprint <code>${esc(run.catalogueFingerprint.slice(0, 16))}</code>`],
    ['Report generated', esc(shortIso(generatedAt))],
  ];
  return `<dl class="meta">${rows.map(([k, v]) => `<dt>${k}</dt><dd>${v}</dd>`).join('')}</dl>`;
}

/** Counts per tier as cards: glyph, number, label and what the tier asks for. */
export function tierCards(events: readonly EventRowModel[], pcPlan: number, pcMonitor: number): string {
  const from: Record<TierId, string> = {
    plan: `Pc ≥ ${pcPlan.toExponential(0)}`,
    monitor: `Pc ≥ ${pcMonitor.toExponential(0)}`,
    routine: `Pc < ${pcMonitor.toExponential(0)}`,
  };
  const cards = TIER_ORDER.map((id) => {
    const t = TIERS[id];
    const n = events.filter((e) => e.tier === id).length;
    return `<div class="card tier-${id}" data-tier="${id}" data-count="${n}"><div class="n"><span class="glyph" aria-hidden="true">${t.glyph}</span>${n}</div><div><b>${esc(t.label)}</b> · ${esc(from[id])}</div><div class="what">${esc(t.meaning)}</div></div>`;
  });
  const unassessed = events.filter((e) => e.tier === null).length;
  if (unassessed) cards.push(`<div class="card plain" data-tier="none" data-count="${unassessed}"><div class="n">${unassessed}</div><div><b>Not assessed</b></div><div class="what">no Pc or tier stored</div></div>`);
  return `<div class="cards">${cards.join('')}</div>`;
}

const TABLE_HEAD = `<thead><tr><th>Event</th><th>Tier</th><th>TCA (UTC)</th><th>Primary</th><th>Secondary</th><th>Secondary name</th>
<th class="num">Miss km</th><th class="num">v<sub>rel</sub> km/s</th><th class="num">R, T, N km</th><th class="num">Pc <span class="name">method</span></th><th>Covariance <span class="name">primary / secondary</span></th></tr></thead>`;

/** TCA as date and time that may wrap between them, never inside either. */
const tcaCell = (iso: string): string => {
  const [date, time] = shortIso(iso).split(' ');
  return `<span class="nw">${esc(date ?? '')}</span> <span class="nw">${esc(time ?? '')}</span>`;
};

/** "history(n=4) / default(LEO, age 5.5 d)" as two short lines, one per object. */
const covarianceCell = (source: string | null): string => {
  if (source === null) return '—';
  const parts = source.split(' / ');
  return parts.length === 2 ? `<span class="cov">${esc(parts[0]!)}</span><span class="cov">${esc(parts[1]!)}</span>` : esc(source);
};

export function eventTable(events: readonly EventRowModel[], kind: string): string {
  const rows = events.map(
    (e) => `<tr data-event="${esc(e.id)}"><td class="nw">${esc(e.id)}</td><td>${tierBadge(e.tier)}</td><td>${tcaCell(e.tca)}</td><td>${esc(e.primary)}</td><td>${esc(e.secondary)}</td><td class="name-col">${esc(e.secondaryName ?? '')}</td>
<td class="num">${num(e.missKm, 3)}</td><td class="num">${num(e.relativeSpeedKmS, 3)}</td><td class="num">${e.rtnKm.map((x) => num(x, 3)).join(', ')}</td><td class="num">${esc(formatPc(e.pc))}<span class="name">${esc(e.pcMethod ?? '')}</span></td><td class="cov-col">${covarianceCell(e.covarianceSource)}</td></tr>`,
  );
  return `<table data-table="${esc(kind)}">${TABLE_HEAD}<tbody>${rows.join('\n')}</tbody></table>`;
}
