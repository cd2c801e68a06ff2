/**
 * Manoeuvre planning speed (issue 8: "a whole plan … takes a few seconds"):
 *   node --import tsx bench/plan.ts            plan of the demo's closest event, 20 lead times
 *   node --import tsx bench/plan.ts rescreen   also a re-screen of the manoeuvred primary
 *                                              against the 30,000-object demo catalogue
 *                                              (app/plan/rescreen.ts)
 *   node --import tsx bench/plan.ts command    the whole `keepclear plan` command on the demo
 *                                              database's riskiest event (builds the demo into
 *                                              a temporary folder first; needs dist/, npm run build:cli)
 * Prints wall and CPU time (the machine is shared: CPU time is the steadier figure).
 */
import { buildDemoScenario } from '../core/synthetic/demo.js';
import { Sgp4Trajectory } from '../core/propagation/sgp4.js';
import { planAvoidance, dragFromBstar, closestApproachNear, type PlanResult } from '../core/manoeuvre/index.js';
import { assessEncounter } from '../core/risk/assess.js';
import { rescreenTrajectory } from '../app/plan/rescreen.js';
import type { Encounter } from '../core/events/index.js';

const rescreen = process.argv.includes('rescreen');
if (process.argv.includes('command')) {
  await benchCommand();
  process.exit(0);
}
const scenario = buildDemoScenario({ catalogSize: rescreen ? 30_000 : 0 });
// The demo's closest event: 50 m, crossing at 170° (nearly head-on).
const closest = [...scenario.planted].sort((a, b) => a.designedMissKm - b.designedMissKm)[0]!;
const pes = scenario.fleet.find((f) => f.objectId === closest.primary)!;
const ses = scenario.catalog.find((f) => f.objectId === closest.secondary)!;
const primary = new Sgp4Trajectory(pes), secondary = new Sgp4Trajectory(ses);
const periodS = 86_400 / pes.meanMotionRevPerDay;
const event = closestApproachNear({ primary, secondary, primaryEpoch: pes.epoch, secondaryEpoch: ses.epoch, minPeriodS: periodS }, closest.tca, periodS / 4)!;
// As an app service would pass it: covariances resolved once (here a fixed RTN covariance, m²).
const cov = [[40 ** 2, 0, 0], [0, 200 ** 2, 0], [0, 0, 60 ** 2]];
const pcOf = (e: Encounter) =>
  assessEncounter(e, { primary: { cdmRtnM2: cov }, secondary: { cdmRtnM2: cov }, hbrPrimaryM: 5, hbrSecondaryM: 5 }).pc;

function timed(label: string, run: () => PlanResult): PlanResult {
  run(); // warm-up: JIT compilation is not part of a plan's cost
  const reps = 3;
  let wall = 0, cpu = 0, r!: PlanResult;
  for (let k = 0; k < reps; k++) {
    const c0 = process.cpuUsage(), t0 = performance.now();
    r = run();
    wall += performance.now() - t0;
    const c = process.cpuUsage(c0);
    cpu += (c.user + c.system) / 1000;
  }
  const w = r.work;
  console.log(
    `${label}: wall ${(wall / reps).toFixed(0)} ms, CPU ${(cpu / reps).toFixed(0)} ms per plan; ${r.trade.length} rows, ` +
      `${w.integrations} burn integrations, ${w.stmIntegrations} STM integrations, ${w.pcCalls} Pc calls; ` +
      `proposal ${r.proposal?.deltaVMs?.toFixed(4)} m/s ${r.proposal?.direction} at ${(r.proposal!.leadTimeS / periodS).toFixed(2)} orbits, ` +
      `miss ${r.proposal?.achievedMissKm?.toFixed(3)} km, Pc ${r.proposal?.achievedPc?.toExponential(2)}`,
  );
  return r;
}

console.log(`event ${event.primary} × ${event.secondary}: miss ${event.missKm.toFixed(3)} km, ${event.approachAngleDeg.toFixed(1)}°, ${event.relativeSpeedKmS.toFixed(2)} km/s`);
const base = { event, primary, secondary, pcOf, spacecraft: { massKg: 100, ispS: 220 }, drag: dragFromBstar(pes.bstar), verificationEnd: scenario.end };
const plan = timed('miss ≥ 1 km, T + best, 20 lead times', () => planAvoidance({ ...base, target: { kind: 'miss', missKm: 1 } }));
timed('Pc ≤ 1e-6, T + best, 20 lead times', () => planAvoidance({ ...base, target: { kind: 'pc', pc: 1e-6 } }));
timed('miss ≥ 1 km, R/T/N + best, 20 lead times', () => planAvoidance({ ...base, target: { kind: 'miss', missKm: 1 }, directions: ['R', 'T', 'N', 'best'] }));

if (rescreen) {
  const traj = plan.manoeuvredTrajectory!;
  const start = plan.proposal!.burnTime;
  const args = { primarySet: pes, trajectory: traj, catalogue: scenario.catalog, start, end: scenario.end, volume: { kind: 'sphere', radiusKm: 5 } } as const;
  await rescreenTrajectory(args); // warm-up
  const c0 = process.cpuUsage(), t0 = performance.now();
  const r = await rescreenTrajectory(args);
  const c = process.cpuUsage(c0);
  console.log(
    `re-screen of the manoeuvred primary (app/plan/rescreen.ts), ${r.objects} objects (${r.radiusPruned} dismissed by radius bands), ` +
      `${((scenario.end - start) / 86_400_000).toFixed(1)} days, worker threads (one per core): wall ${(performance.now() - t0).toFixed(0)} ms, ` +
      `CPU ${((c.user + c.system) / 1000).toFixed(0)} ms, ${r.encounters.length} approaches within 5 km`,
  );
}

/**
 * The whole command as a user times it: `keepclear plan --event ID --target-miss-km 1` on the
 * demo database (30,000 objects, the fleet's week), for the event with the highest Pc. Wall,
 * user + system CPU and peak memory from /usr/bin/time (GNU time) of the child process.
 */
async function benchCommand(): Promise<void> {
  const { spawnSync } = await import('node:child_process');
  const { mkdtempSync, rmSync } = await import('node:fs');
  const { tmpdir, loadavg } = await import('node:os');
  const { join } = await import('node:path');
  const dir = mkdtempSync(join(tmpdir(), 'keepclear-bench-plan-'));
  const db = join(dir, 'keepclear-demo.db');
  const kc = (args: string[]) => spawnSync(process.execPath, ['bin/keepclear.js', ...args], { encoding: 'utf8', maxBuffer: 256 << 20 });
  try {
    const demo = kc(['demo', '--out', dir]);
    if (demo.status !== 0) throw new Error(demo.stderr);
    kc(['spacecraft', '--db', db, '--id', '100001', '--mass-kg', '100', '--isp-s', '220']);
    const events = JSON.parse(kc(['events', '--db', db, '--json', '-']).stdout) as { events: { id: string; primary: string; pc: number | null }[] };
    const riskiest = [...events.events].sort((a, b) => (b.pc ?? 0) - (a.pc ?? 0))[0]!;
    kc(['spacecraft', '--db', db, '--id', riskiest.primary, '--mass-kg', '100', '--isp-s', '220']);
    for (let k = 0; k < 3; k++) {
      const r = spawnSync('/usr/bin/time', ['-f', '%e %U %S %M', process.execPath, 'bin/keepclear.js', 'plan', '--db', db,
        '--event', riskiest.id, '--target-miss-km', '1', '--json', join(dir, 'plan.json')], { encoding: 'utf8', maxBuffer: 256 << 20 });
      const [wall, user, sys, rssKb] = r.stderr.trim().split('\n').pop()!.split(' ').map(Number);
      const plan = JSON.parse((await import('node:fs')).readFileSync(join(dir, 'plan.json'), 'utf8')) as {
        proposal: { deltaVMs: number; achievedMissKm: number } | null; newApproaches: unknown[]; timingsMs: Record<string, number>;
        rescreen: { objects: number } | null;
      };
      console.log(
        `keepclear plan --event ${riskiest.id} (Pc ${riskiest.pc?.toExponential(2)}): wall ${wall!.toFixed(2)} s, CPU ${(user! + sys!).toFixed(2)} s, ` +
          `peak RSS ${(rssKb! / 1024).toFixed(0)} MiB; trade ${(plan.timingsMs.tradeMs! / 1000).toFixed(2)} s, re-screen of ` +
          `${plan.rescreen?.objects} objects ${(plan.timingsMs.rescreenMs! / 1000).toFixed(2)} s (wall, in the command); ` +
          `Δv ${plan.proposal?.deltaVMs.toFixed(4)} m/s → ${plan.proposal?.achievedMissKm.toFixed(3)} km, ${plan.newApproaches.length} new approaches; ` +
          `load average ${loadavg()[0]!.toFixed(1)}`,
      );
    }
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}
