/**
 * What the terminal shows of a plan: the event, the trade table (cheapest direction per lead
 * time), the chosen burn, the verified result both ways (saying which is which), the re-screen
 * with its new approaches, notes and the caution.
 */
import type { EventPlan } from '../../app/plan/index.js';
import { cheapestPerLeadTime } from '../../app/plan/index.js';
import { formatPc } from '../../core/events/pcText.js';
import { TIER_ORDER, TIERS } from '../../core/risk/tiers.js';
import { toIso } from '../../core/time/instant.js';

const LOWEST_TIER: string = TIER_ORDER[TIER_ORDER.length - 1]!;
const labelOf = (tier: string | null): string => (tier ? ((TIERS as Record<string, { label: string } | undefined>)[tier]?.label ?? tier) : '—');

const DIRECTION_WORDS: Record<string, string> = { R: 'radial', T: 'in-track', N: 'cross-track', best: 'best direction' };

function table(head: string[], rows: string[][], right: number[]): string {
  const widths = head.map((h, i) => Math.max(h.length, ...rows.map((r) => r[i]!.length)));
  const line = (r: string[]) => r.map((c, i) => (right.includes(i) ? c.padStart(widths[i]!) : c.padEnd(widths[i]!))).join('  ').trimEnd();
  return [line(head), ...rows.map(line)].join('\n');
}

const fx = (x: number | null | undefined, d: number): string => (x === null || x === undefined ? '—' : x.toFixed(d));
const rtn = (v: readonly number[] | null): string => (v ? v.map((x) => x.toFixed(4)).join(', ') : '—');

export function planText(p: EventPlan): string {
  const c = p.core, e = p.event;
  const out: string[] = [];
  const target = p.target.kind === 'miss' ? `miss ≥ ${p.target.missKm} km` : `Pc ≤ ${p.target.pc}`;
  out.push(
    `Plan for event ${e.id}: ${e.primary}${p.objectName ? ` (${p.objectName})` : ''} and ${e.secondary}, TCA ${toIso(e.tca)}` +
      (p.planId !== null ? ` — stored as plan ${p.planId}` : ''),
    `Without a burn: miss ${fx(c.original.missKm, 3)} km, Pc ${formatPc(c.original.pc)} (TCA found again ${toIso(c.original.tca)})`,
    `Target: ${target} · spacecraft ${p.spacecraft.massKg} kg, Isp ${p.spacecraft.ispS} s · Pc: ${p.pcMethod}`,
  );
  if (c.status === 'no-burn-needed') {
    out.push('', 'The event already meets the target: no burn is proposed.');
  } else {
    const rows = cheapestPerLeadTime(c.trade);
    out.push(
      '',
      `Trade over lead times (orbital period ${(c.periodS / 60).toFixed(1)} min; cheapest direction per lead time, every direction in --json tradeByDirection):`,
      table(
        ['lead s', 'orbits', 'burn (UTC)', 'dir', 'Δv m/s', 'Δv R, T, N m/s', 'miss km', 'Pc', 'status'],
        rows.map((r) => [
          r.leadTimeS.toFixed(0),
          (r.leadTimeS / c.periodS).toFixed(2),
          toIso(r.burnTime),
          r.direction,
          fx(r.deltaVMs, 4),
          rtn(r.deltaVRtnMs),
          fx(r.achievedMissKm, 3),
          r.status === 'met' ? formatPc(r.achievedPc) : '—',
          r.status === 'met' ? 'met' : `${r.status}${r.note ? `: ${r.note}` : ''}`,
        ]),
        [0, 1, 4, 6],
      ),
    );
  }
  const q = c.proposal;
  if (c.status === 'planned' && q && q.deltaVMs !== null) {
    out.push(
      '',
      `Chosen burn: ${toIso(q.burnTime)}, ${q.leadTimeS.toFixed(0)} s (${(q.leadTimeS / c.periodS).toFixed(2)} orbits) before TCA, ` +
        `${DIRECTION_WORDS[q.direction] ?? q.direction} Δv ${q.deltaVMs.toFixed(4)} m/s [R, T, N ${rtn(q.deltaVRtnMs)} m/s]; ` +
        `propellant ${q.propellantKg.toFixed(4)} kg`,
    );
    const v = c.verification;
    if (v) {
      const s = v.sgp4PlusDifference, n = v.fullyNumerical, nu = v.fullyNumericalUnmanoeuvred;
      out.push(
        'Verified result:',
        `  SGP4 + integrated difference (the answer; what the re-screen and the OEM use): ` +
          (s ? `new TCA ${toIso(s.tca)}, miss ${s.missKm.toFixed(3)} km, Pc ${formatPc(s.pc)}` : 'no closest approach found'),
        `  fully numerical (integrated manoeuvred primary against the SGP4 secondary, for comparison): ` +
          (n ? `miss ${n.missKm.toFixed(3)} km, Pc ${formatPc(n.pc)}` : 'no closest approach found') +
          (nu ? `; the same model without the burn: miss ${nu.missKm.toFixed(3)} km` : ''),
        `  at the old TCA SGP4 and the integrator differ by ${v.modelDifferenceAtTcaKm.toFixed(3)} km; the burn moves the primary ${v.burnDisplacementAtTcaKm.toFixed(3)} km`,
      );
    }
  } else if (c.status === 'no-proposal') {
    out.push('', 'No row of the trade table meets the target within the limits: no burn is proposed.');
  }
  const r = p.rescreen;
  if (r) {
    const vol = r.volume.kind === 'sphere' ? `${r.volume.radiusKm} km sphere` : `RTN ellipsoid ${r.volume.rKm} × ${r.volume.tKm} × ${r.volume.nKm} km`;
    out.push(
      '',
      `Re-screen of the manoeuvred trajectory: ${r.objects} objects, ${toIso(r.start)} … ${toIso(r.end)}, ${vol}: ` +
        `${r.approaches.length} approach(es), ${p.newApproaches.length} new` +
        (r.comparedWithRun ? ` (compared with run ${r.comparedWithRun})` : ''),
    );
    // As for events: what needs attention first (above the lowest tier, highest Pc first); the
    // rest are counted, and --json lists every one.
    const attention = p.newApproaches.filter((a) => a.tier !== LOWEST_TIER).sort((a, b) => (b.pc ?? 0) - (a.pc ?? 0) || a.missKm - b.missKm);
    if (attention.length > 0) {
      out.push(
        `New approaches needing attention (${attention.length}), highest Pc first:`,
        table(
          ['secondary', 'TCA (UTC)', 'miss km', 'v_rel km/s', 'Pc', 'tier'],
          attention.map((a) => [a.secondary, toIso(a.tca), a.missKm.toFixed(3), a.relativeSpeedKmS.toFixed(3), formatPc(a.pc), labelOf(a.tier)]),
          [2, 3],
        ),
      );
    }
    const routine = p.newApproaches.length - attention.length;
    if (routine > 0) out.push(`${routine} new ${labelOf(LOWEST_TIER)} approach(es) not listed: --json FILE lists every approach of the re-screen.`);
    const closer = r.approaches.filter((a) => a.before && a.missKm < a.before.missKm - 1e-3 && a.secondary !== p.event.secondary);
    if (closer.length > 0)
      out.push(`Known approaches that come closer after the burn: ${closer.map((a) => `${a.secondary} ${a.before!.missKm.toFixed(3)} → ${a.missKm.toFixed(3)} km`).join('; ')}`);
    for (const f of r.flagged) out.push(`flagged in the re-screen: ${f.id}: ${f.reason}`);
  }
  if (p.notes.length > 0) out.push('', 'Notes:', ...p.notes.map((n) => `  - ${n}`));
  out.push('', `Caution: ${p.caution}`);
  return out.join('\n') + '\n';
}
