/**
 * The manoeuvre panel: ask for a plan (a target miss or Pc), show the chosen burn, its verified
 * result, the trade over lead times and the new approaches the burn makes — always under the
 * decision-aid caution.
 */
import type { PlanView } from '../../core/bridge/contract.js';
import { el } from '../dom.js';
import { formatFixed, formatPc, formatUtc } from '../format.js';

function table(head: readonly string[], rows: readonly (readonly string[])[], numericFrom = 0): HTMLTableElement {
  return el(
    'table',
    { class: 'facts' },
    el('thead', {}, el('tr', {}, ...head.map((h) => el('th', { text: h })))),
    el('tbody', {}, ...rows.map((r) => el('tr', {}, ...r.map((c, i) => el('td', { text: c, class: i >= numericFrom && numericFrom > 0 ? 'num' : '' }))))),
  );
}

export function renderPlan(plan: PlanView): HTMLElement {
  const out = el('div', { class: 'plan-view' });
  out.dataset['plan'] = plan.event;
  const target = plan.target.missKm !== null ? `miss ≥ ${formatFixed(plan.target.missKm, 3)} km` : `Pc ≤ ${formatPc(plan.target.pc)}`;
  out.append(el('p', { text: `Target: ${target}` }));
  const p = plan.proposal;
  if (!p) {
    out.append(el('p', { class: 'warn', text: plan.note ?? 'No burn meets the target within the lead times tried.' }));
  } else {
    out.append(
      el('h4', { text: 'Chosen burn' }),
      table(
        ['Quantity', 'Value', 'Unit'],
        [
          ['Burn time (UTC)', formatUtc(p.burnTime), 'UTC'],
          ['Lead time before TCA', formatFixed(p.leadTimeS, 0), 's'],
          ['Direction', p.direction, 'RTN of the primary'],
          ['Δv', formatFixed(p.deltaVMs, 4), 'm/s'],
          ['Δv R, T, N', p.deltaVRtnMs.map((x) => formatFixed(x, 4)).join(', '), 'm/s'],
          ['Predicted miss after the burn', formatFixed(p.achievedMissKm, 3), 'km'],
          ['Predicted Pc after the burn', formatPc(p.achievedPc), '—'],
          ['Propellant', formatFixed(p.propellantKg, 4), 'kg'],
        ],
      ),
    );
  }
  const v = plan.verification;
  out.append(el('h4', { text: 'Verified result' }));
  if (v) {
    const verified = el('p', { text: `${v.method}: miss ${formatFixed(v.missKm, 3)} km, Pc ${formatPc(v.pc)}` });
    verified.dataset['verified'] = 'yes';
    out.append(verified, ...(v.notes.length ? [el('ul', {}, ...v.notes.map((n) => el('li', { text: n })))] : []));
  } else {
    out.append(el('p', { text: 'Not verified.' }));
  }
  out.append(
    el('h4', { text: 'Trade over lead times' }),
    plan.trade.length
      ? table(['Lead time (s)', 'Δv (m/s)', 'Miss (km)', 'Pc'], plan.trade.map((t) => [formatFixed(t.leadTimeS, 0), formatFixed(t.deltaVMs, 4), formatFixed(t.achievedMissKm, 3), formatPc(t.achievedPc)]), 1)
      : el('p', { text: 'No trade computed.' }),
    el('h4', { text: 'New approaches after the burn' }),
    plan.newApproaches.length
      ? table(['Secondary', 'TCA (UTC)', 'Miss (km)', 'Pc'], plan.newApproaches.map((a) => [a.secondary, formatUtc(a.tca), formatFixed(a.missKm, 3), formatPc(a.pc)]), 2)
      : el('p', { text: 'Re-screening the manoeuvred path found no new close approach.' }),
  );
  return out;
}
