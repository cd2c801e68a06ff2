/**
 * Demo world generation time at full size (30,000 generated objects): the single week
 * (buildDemoScenario) and the three weeks with two re-issued catalogues (buildDemoWeeks).
 * Goal: a few seconds. Wall and CPU time both printed: on a shared machine CPU time is the
 * steadier figure. Run alone: `npm run bench -- world`.
 */
import { buildDemoScenario } from '../core/synthetic/demo.js';
import { buildDemoWeeks } from '../core/synthetic/demoWeeks.js';

function timed<T>(f: () => T): { value: T; wallMs: number; cpuMs: number } {
  const c0 = process.cpuUsage();
  const t0 = performance.now();
  const value = f();
  const c = process.cpuUsage(c0);
  return { value, wallMs: performance.now() - t0, cpuMs: (c.user + c.system) / 1000 };
}

export function benchDemoWorld(): void {
  const one = timed(() => buildDemoScenario());
  const three = timed(() => buildDemoWeeks());
  const r = three.value.reissue;
  console.log(
    `demo world: one week (${one.value.catalog.length} objects) built in ${(one.wallMs / 1000).toFixed(2)} s wall, ` +
      `${(one.cpuMs / 1000).toFixed(2)} s CPU; three weeks in ${(three.wallMs / 1000).toFixed(2)} s wall, ` +
      `${(three.cpuMs / 1000).toFixed(2)} s CPU (${r.refitted} sets refitted, ${r.secular} carried along secular rates)`,
  );
}

if (import.meta.url === `file://${process.argv[1]}`) benchDemoWorld();
