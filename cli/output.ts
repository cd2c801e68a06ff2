import { writeFileSync } from 'node:fs';
import { DECISION_AID_NOTE } from '../core/risk/assess.js';
import { toIso } from '../core/time/instant.js';
import type { ConjunctionEvent } from '../core/events/index.js';

/** Writes JSON to a file, or to stdout for "-" (and nothing else goes to stdout then). */
export function writeJson(target: string, value: unknown): void {
  const text = `${JSON.stringify(value, null, 2)}\n`;
  if (target === '-') process.stdout.write(text);
  else writeFileSync(target, text);
}

const fmtPc = (pc: number | null | undefined): string =>
  pc === null || pc === undefined ? '—' : pc < 1e-300 ? '< 1e-300' : pc.toExponential(2);

/** A plain-text table of events for the terminal. */
export function eventTable(events: readonly ConjunctionEvent[]): string {
  const head = ['event', 'TCA (UTC)', 'primary', 'secondary', 'miss km', 'v_rel km/s', 'Pc', 'tier', 'covariance'];
  const rows = events.map((e) => [
    e.id,
    toIso(e.tca),
    e.primary,
    e.secondary,
    e.missKm.toFixed(3),
    e.relativeSpeedKmS.toFixed(3),
    fmtPc(e.risk?.pc),
    e.risk?.tier ?? '—',
    e.risk?.covarianceSource ?? '—',
  ]);
  const widths = head.map((h, i) => Math.max(h.length, ...rows.map((r) => r[i]!.length)));
  const line = (r: string[]) => r.map((c, i) => c.padEnd(widths[i]!)).join('  ').trimEnd();
  return [line(head), ...rows.map(line), '', `Note: ${DECISION_AID_NOTE}`].join('\n') + '\n';
}

/** Progress on stderr: one rewritten line on a terminal, a line per 10 % otherwise. */
export function progressReporter(label: string): (done: number, total: number) => void {
  let lastDecile = -1;
  return (done, total) => {
    const pct = total > 0 ? Math.floor((100 * done) / total) : 100;
    if (process.stderr.isTTY) {
      process.stderr.write(`\r${label}: ${pct}% (${done}/${total})${done >= total ? '\n' : ''}`);
    } else if (Math.floor(pct / 10) > lastDecile) {
      lastDecile = Math.floor(pct / 10);
      process.stderr.write(`${label}: ${pct}% (${done}/${total})\n`);
    }
  };
}
