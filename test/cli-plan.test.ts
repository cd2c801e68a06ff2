/**
 * `keepclear plan` and `keepclear spacecraft` as a user runs them (DESIGN.md CLI contract and
 * "JSON of plan"): argument errors exit 2, a plan without the spacecraft's mass and Isp exits 1
 * naming the command that sets them, `--json -` writes only the plan's JSON with its caution,
 * `--oem`/`--opm` write the files, the terminal shows the trade table, the chosen burn, both
 * verifications and the re-screen; `events` and the event report show the stored plan.
 */
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { formatOmmJson } from '../core/formats/omm/index.js';
import { formatTleFile } from '../core/formats/tle/index.js';
import { DECISION_AID_NOTE } from '../core/risk/assess.js';
import { buildDemoScenario } from '../core/synthetic/demo.js';
import { runKeepclear, type Run } from './support/cli.js';

let dir: string;
let db: string;
let eventId: string;
const keepclear = (args: string[]): Run => runKeepclear(args, dir);

beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'keepclear-cli-plan-'));
  const scenario = buildDemoScenario({ catalogSize: 200 });
  const fleet = join(dir, 'fleet.tle');
  const catalog = join(dir, 'catalog.json');
  writeFileSync(fleet, formatTleFile(scenario.fleet));
  writeFileSync(catalog, formatOmmJson(scenario.catalog));
  db = join(dir, 'plan.db');
  const r = keepclear(['screen', '--catalog', fleet, '--catalog', catalog, '--primary', '100001', '--db', db,
    '--start', '2026-12-07T00:00:00Z', '--days', '2', '--workers', '0', '--json', '-']);
  expect(r.code, r.stderr).toBe(0);
  const out = JSON.parse(r.stdout) as { events: { id: string; secondary: string }[] };
  eventId = out.events.find((e) => e.secondary === '330001')!.id;
}, 120_000);
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('keepclear plan: arguments and spacecraft data', () => {
  it.each([
    [['--event', 'R1-1'], /exactly one of --target-miss-km X or --target-pc P/],
    [['--event', 'R1-1', '--target-miss-km', '1', '--target-pc', '1e-6'], /exactly one of/],
    [['--event', 'R1-1', '--target-pc', '2'], /--target-pc must be a probability in \(0, 1\), got "2"/],
    [['--target-miss-km', '1'], /give --event ID/],
  ])('%j is a bad argument (exit 2)', (args, message) => {
    const r = keepclear(['plan', '--db', db, ...args]);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(message);
  });

  it('without mass and Isp: exit 1, naming the object and the command to run', () => {
    const r = keepclear(['plan', '--db', db, '--event', eventId, '--target-miss-km', '1']);
    expect(r.code).toBe(1);
    expect(r.stderr).toMatch(/^keepclear: spacecraft 100001: mass \(kg\) and Isp \(s\) not set.*keepclear spacecraft --id 100001 --mass-kg KG --isp-s S/m);
    expect(r.stdout).toBe('');
  });

  it('spacecraft sets them (Alpha-5 id accepted) and shows them', () => {
    const bad = keepclear(['spacecraft', '--db', db, '--id', 'A0001', '--mass-kg', '-3']);
    expect(bad.code).toBe(2);
    const r = keepclear(['spacecraft', '--db', db, '--id', 'A0001', '--mass-kg', '100', '--isp-s', '220']);
    expect(r.code, r.stderr).toBe(0);
    expect(r.stdout).toBe('spacecraft 100001: mass 100 kg, Isp 220 s (stored)\n');
    const unknown = keepclear(['spacecraft', '--db', db, '--id', '999999', '--mass-kg', '1']);
    expect(unknown.code).toBe(1);
    expect(unknown.stderr).toMatch(/no object "999999"/);
  });
});

describe('keepclear plan: a planned burn', () => {
  let json: Run;
  let terminal: Run;
  beforeAll(() => {
    json = keepclear(['plan', '--db', db, '--event', eventId, '--target-pc', '1e-6', '--json', '-',
      '--oem', join(dir, 'plan.oem'), '--opm', join(dir, 'burn.opm')]);
    terminal = keepclear(['plan', '--db', db, '--event', eventId, '--target-miss-km', '1']);
  }, 180_000);

  it('--json - writes only the plan JSON, with the contract fields and the caution', () => {
    expect(json.code, json.stderr).toBe(0);
    const d = JSON.parse(json.stdout);
    expect(d.caution).toContain(DECISION_AID_NOTE);
    expect(d.event).toBe(eventId);
    expect(d.proposal.achievedPc).toBeLessThanOrEqual(1e-6);
    expect(Date.parse(d.proposal.burnTime)).toBeLessThan(Date.parse(d.original.tca));
    expect(d.proposal.deltaVMs).toBeCloseTo(Math.hypot(...(d.proposal.deltaVRtnMs as number[])), 12);
    expect(d.trade.length).toBeGreaterThan(0);
    for (const row of d.trade) for (const k of ['leadTimeS', 'deltaVMs', 'achievedMissKm']) expect(row).toHaveProperty(k);
    expect(Array.isArray(d.newApproaches)).toBe(true);
    expect(d.verification.method).toMatch(/SGP4 trajectory \+ \(integrated manoeuvred − integrated unmanoeuvred\)/);
    expect(json.stderr).toMatch(/plan: re-screen: 100%/); // progress on stderr
    expect(json.stderr).toMatch(/wrote OEM .*plan\.oem, OPM .*burn\.opm/);
    expect(readFileSync(join(dir, 'plan.oem'), 'utf8')).toMatch(/^CCSDS_OEM_VERS\s+= 2\.0/);
    expect(readFileSync(join(dir, 'burn.opm'), 'utf8')).toMatch(/MAN_REF_FRAME\s+= RTN/);
  });

  it('the terminal shows the trade, the burn, both verifications, the re-screen and the caution', () => {
    expect(terminal.code, terminal.stderr).toBe(0);
    const t = terminal.stdout;
    expect(t).toMatch(/Trade over lead times/);
    expect(t).toMatch(/^Chosen burn: \S+Z, \d+ s \([\d.]+ orbits\) before TCA/m);
    expect(t).toMatch(/SGP4 \+ integrated difference \(the answer; .*\): new TCA \S+, miss \d+\.\d{3} km/);
    expect(t).toMatch(/fully numerical \(integrated manoeuvred primary against the SGP4 secondary, for comparison\): miss/);
    expect(t).toMatch(/Re-screen of the manoeuvred trajectory: \d+ objects/);
    expect(t).toMatch(/Caution: .*flight dynamics.*screening of the planned trajectory and local rules decide/);
  });

  it('events and the event report show the newest plan', () => {
    const e = keepclear(['events', '--db', db, '--json', '-']);
    expect(e.code, e.stderr).toBe(0);
    const ev = (JSON.parse(e.stdout).events as { id: string; plan: { deltaVMs: number; achievedMissKm: number } | null }[]).find((x) => x.id === eventId)!;
    expect(ev.plan).not.toBeNull();
    expect(ev.plan!.achievedMissKm).toBeGreaterThanOrEqual(1); // the newest plan is the 1 km one
    const table = keepclear(['events', '--db', db]);
    expect(table.stdout).toMatch(/plan \(Δv → miss\)/);
    expect(table.stdout).toMatch(new RegExp(`${eventId} .* ${ev.plan!.deltaVMs.toFixed(4)} m/s → ${ev.plan!.achievedMissKm.toFixed(3)} km`));
    const html = join(dir, 'event.html');
    const r = keepclear(['report', '--db', db, '--event', eventId, '--out', html]);
    expect(r.code, r.stderr).toBe(0);
    const page = readFileSync(html, 'utf8');
    expect(page).toContain('data-section="plan"');
    expect(page).toContain('data-plot="plan-trade"');
  });
});
