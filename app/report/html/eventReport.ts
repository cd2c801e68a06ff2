import { encounterPlaneSpec } from '../../../core/plots/encounterPlane.js';
import { planTradeSpec } from '../../../core/plots/planTrade.js';
import { rtnSeriesSpec, rtnSingleSpec } from '../../../core/plots/rtn.js';
import { seriesTrendSpec } from '../../../core/plots/seriesTrend.js';
import type { EventReportModel, PlanModel } from '../model.js';
import { catalogueBanner, cautionBox, runMeta } from './common.js';
import { esc, formatPc, num, shortIso, tierBadge } from './format.js';
import { pageHtml } from './page.js';
import { plotFigure } from './plots.js';

const table = (kind: string, head: string[], rows: string[][], numeric: number[] = []): string =>
  `<table data-table="${kind}"><thead><tr>${head.map((h, i) => `<th${numeric.includes(i) ? ' class="num"' : ''}>${h}</th>`).join('')}</tr></thead><tbody>${rows
    .map((r) => `<tr>${r.map((c, i) => `<td${numeric.includes(i) ? ' class="num"' : ''}>${c}</td>`).join('')}</tr>`)
    .join('\n')}</tbody></table>`;

async function planSection(p: PlanModel, eventId: string): Promise<string> {
  const target = [p.target.missKm !== undefined ? `miss ≥ ${p.target.missKm} km` : '', p.target.pc !== undefined ? `Pc ≤ ${p.target.pc.toExponential(0)}` : '']
    .filter(Boolean)
    .join(' and ');
  const q = p.proposal;
  const chosen = table(
    'plan-burn',
    ['Burn time (UTC)', 'Lead time s', 'Direction', 'Δv m/s', 'Δv R, T, N m/s', 'Miss after km', 'Pc after', 'Propellant kg'],
    [[
      esc(shortIso(q.burnTime)),
      num(q.leadTimeS, 0),
      esc(q.direction),
      num(q.deltaVMs, 4),
      q.deltaVRtnMs.map((x) => num(x, 4)).join(', '),
      num(q.achievedMissKm, 3),
      esc(formatPc(q.achievedPc)),
      q.propellantKg === null ? '—' : num(q.propellantKg, 4),
    ]],
    [1, 3, 4, 5, 6, 7],
  );
  const trade = p.trade.length
    ? table(
        'plan-trade',
        ['Lead time s', 'Direction', 'Δv m/s', 'Miss after km', 'Pc after'],
        p.trade.map((t) => [num(t.leadTimeS, 0), esc(t.direction ?? '—'), num(t.deltaVMs, 4), num(t.achievedMissKm, 3), esc(formatPc(t.achievedPc ?? null))]),
        [0, 2, 3, 4],
      )
    : '<p class="none">No trade over lead times was given.</p>';
  const v = p.verification;
  const numerical = v?.fullyNumerical
    ? `<p data-plan="fully-numerical">Fully numerical, for comparison (the integrated manoeuvred primary itself against the secondary): miss ${num(v.fullyNumerical.missKm, 3)} km, Pc ${esc(formatPc(v.fullyNumerical.pc))}.</p>`
    : '';
  const verified = v
    ? `<p data-plan="verified">Verified by ${esc(v.method)}: miss ${num(v.missKm, 3)} km, Pc ${esc(formatPc(v.pc))}.</p>${numerical}${
        v.notes?.length ? `<ul class="warnings">${v.notes.map((n) => `<li>${esc(n)}</li>`).join('')}</ul>` : ''
      }`
    : '<p class="none" data-plan="verified">The proposal has not been verified by numerical propagation.</p>';
  const fresh = p.newApproaches.length
    ? table(
        'plan-new-approaches',
        ['Secondary', 'TCA (UTC)', 'Miss km', 'Pc'],
        p.newApproaches.map((a) => [esc(a.secondary), esc(shortIso(a.tca)), num(a.missKm, 3), esc(formatPc(a.pc ?? null))]),
        [2, 3],
      )
    : '<p class="none">Re-screening the manoeuvred trajectory found no new approach.</p>';
  const rows = p.tradeByDirection && p.tradeByDirection.length > 0 ? p.tradeByDirection : p.trade.map((t) => ({ leadTimeS: t.leadTimeS, direction: t.direction ?? 'chosen direction', deltaVMs: t.deltaVMs }));
  const plot = p.periodS && rows.length > 1
    ? await plotFigure(
        'plan-trade',
        planTradeSpec({ eventId, periodS: p.periodS, rows, chosen: { leadTimeS: q.leadTimeS, deltaVMs: q.deltaVMs } }),
        'Δv needed against how long before TCA the burn is made.',
      )
    : '';
  const o = p.original;
  const before = o ? `<p>Without a burn: miss ${num(o.missKm, 3)} km, Pc ${esc(formatPc(o.pc))}.</p>` : '';
  const rs = p.rescreen;
  const rescreen = rs
    ? `<p data-plan="rescreen">The manoeuvred trajectory was screened again against ${num(rs.objects, 0)} objects from the burn to ${esc(shortIso(rs.end))}: ${num(rs.approaches, 0)} approach(es) in the screening volume, ${num(p.newApproaches.length, 0)} of them new.</p>`
    : '';
  return `<section data-section="plan"><h2>Manoeuvre plan</h2>
<p>Target: ${esc(target || 'not stated')}.${p.createdAt ? ` Planned ${esc(shortIso(p.createdAt))}.` : ''}</p>
<p class="caution" data-plan="caution">A proposal to check, not an instruction: the operator's own flight dynamics, the screening provider's screening of the planned trajectory and local rules decide.</p>
${before}
<h3>Chosen burn</h3>${chosen}
<h3>Verified result</h3>${verified}
<h3>Trade over lead times</h3>${plot}${trade}
<h3>New approaches after the burn</h3>${rescreen}${fresh}</section>`;
}

/**
 * The event report: the numbers (each with unit and source), the encounter plane to scale, the
 * RTN miss, the series' trend when a series is given, a manoeuvre plan when given, the caution.
 */
export async function renderEventReportHtml(m: EventReportModel): Promise<string> {
  const e = m.event;
  const plane = m.plane
    ? await plotFigure(
        'encounter-plane',
        encounterPlaneSpec(m.plane),
        'Encounter plane to scale: the Pc is the share of the secondary\'s uncertainty (ellipses) that falls on the grey hard-body disk.',
      )
    : `<p class="none" data-plot-missing="encounter-plane">${esc(m.planeNote ?? 'No encounter plane.')}</p>`;
  const rtn = await plotFigure('rtn', rtnSingleSpec({ eventId: e.id, rtnKm: e.rtnKm }), 'R radial, T in-track, N cross-track, in the primary\'s frame at TCA.');
  const s = m.series;
  const seriesEvents = s?.events?.length
    ? table(
        'series-events',
        ['Event', 'Source', 'Data created (UTC)', 'Time to TCA h', 'TCA (UTC)', 'Miss km', 'Pc', 'Tier'],
        s.events.map((x) => [
          `${x.current ? '<b>' : ''}${esc(x.id)}${x.current ? '</b> (this report)' : ''}`,
          esc(x.sourceText),
          esc(shortIso(x.dataAt)),
          num(x.hoursToTca, 1),
          esc(shortIso(x.tca)),
          num(x.missKm, 3),
          esc(formatPc(x.pc)),
          tierBadge(x.tier),
        ]),
        [3, 5, 6],
      )
    : '';
  const series = s
    ? `<section data-section="series"><h2>Series ${esc(s.id)}: ${esc(s.state)}</h2>
${s.stateMeaning ? `<p class="sub">${esc(s.stateMeaning)}.${s.changeText ? ` Since the first sighting: ${esc(s.changeText)}.` : ''}</p>` : ''}
${s.points.length
  ? `${await plotFigure('series-trend', seriesTrendSpec({ seriesId: s.id, points: s.points, pcPlan: m.thresholds.pcPlan, pcMonitor: m.thresholds.pcMonitor }), 'Each point is one event of the series, placed at the time its data was created.')}
${await plotFigure('rtn-series', rtnSeriesSpec(s.id, s.points), 'How the predicted geometry settled as TCA came near.')}`
  : '<p class="none">The series has no points yet.</p>'}
${seriesEvents}
</section>`
    : '';
  const facts = table(
    'facts',
    ['Quantity', 'Value', 'Unit', 'Source'],
    m.facts.map((f) => [esc(f.label), `<span class="nw">${esc(f.value)}</span>`, esc(f.unit), esc(f.source)]),
  );
  const warnings = m.warnings.length
    ? `<ul class="warnings" data-warnings>${m.warnings.map((w) => `<li>${esc(w)}</li>`).join('')}</ul>`
    : '<p class="none" data-warnings>No warnings from the assessment.</p>';
  const messages = m.messages.length
    ? table(
        'messages',
        ['Originator', 'Message id', 'Created (UTC)', 'TCA (UTC)', 'Miss m', 'Reported Pc'],
        m.messages.map((c) => [esc(c.originator), esc(c.messageId), esc(shortIso(c.creationDate)), esc(shortIso(c.tca)), num(c.missDistanceM, 1), esc(formatPc(c.reportedPc))]),
        [4, 5],
      )
    : '<p class="none">No received message is linked to this event.</p>';
  const names = (id: string, name: string | null): string => `<b>${esc(id)}</b>${name ? ` (${esc(name)})` : ''}`;
  const body = `
<header>
<h1>${esc(m.title)}</h1>
<p class="sub">Primary ${names(e.primary, e.primaryName)} · secondary ${names(e.secondary, e.secondaryName)} · TCA ${esc(shortIso(e.tca))}</p>
${catalogueBanner(m.catalogue)}
${cautionBox(m.caution)}
<div class="cards">
<div class="card plain"><div class="n">${tierBadge(e.tier)}</div><div class="what">tier</div></div>
<div class="card plain"><div class="n">${esc(formatPc(e.pc))}</div><div class="what">Pc · ${esc(e.pcMethod ?? 'not assessed')}</div></div>
<div class="card plain"><div class="n">${e.missKm < 1 ? `${num(e.missKm * 1000, 0)} m` : `${num(e.missKm, 3)} km`}</div><div class="what">miss distance at TCA</div></div>
<div class="card plain"><div class="n">${num(e.relativeSpeedKmS, 2)} km/s</div><div class="what">relative speed</div></div>
</div>
</header>
<section data-section="geometry">
<h2>Geometry at TCA</h2>
<div class="plots-row">${plane}${rtn}</div>
</section>
<section data-section="facts">
<h2>Numbers, units and sources</h2>
${facts}
<h3>Warnings</h3>
${warnings}
</section>
<section data-section="messages">
<h2>Received messages (${m.messages.length})</h2>
${messages}
</section>
${series}
${m.plan ? await planSection(m.plan, e.id) : ''}
${m.run ? `<section data-section="run"><h2>Screening run ${esc(m.run.id)}</h2>${runMeta(m.run, m.generatedAt)}</section>` : ''}`;
  const footer = `Keepclear event report · ${esc(e.id)} · generated ${esc(shortIso(m.generatedAt))} · ${esc(m.caution)}`;
  return pageHtml(m.title, body, footer);
}
