/**
 * What the 3-D Pc costs on a whole demo-scale assessment: every event of a database's newest
 * screening run assessed twice with the same inputs, once with the automatic choice (3-D Pc where
 * the short-encounter check fails) and once with the 2-D method everywhere.
 *   npx keepclear demo --out /tmp/demo && node --import tsx bench/risk.ts /tmp/demo/keepclear-demo.db
 */
import { RiskContext } from '../app/risk.js';
import { eventsOfRun, latestRun, openDatabase } from '../db/index.js';

const file = process.argv[2];
if (!file) {
  process.stderr.write('usage: node --import tsx bench/risk.ts DB\n');
  process.exit(2);
}
const db = openDatabase(file);
try {
  const run = latestRun(db, 'done', ['screening']);
  if (!run) throw new Error(`${file}: no finished screening run`);
  const events = eventsOfRun(db, run.id);
  const slow = new Set<string>();
  const time = (model: 'auto' | '2d'): { ms: number; slowMs: number; methods: Map<string, number> } => {
    const ctx = new RiskContext(db, new Map(), { encounterModel: model });
    for (const e of events.slice(0, 5)) ctx.assess(e); // warm the JIT and the history cache
    const methods = new Map<string, number>();
    let slowMs = 0;
    const t0 = performance.now();
    for (const e of events) {
      const t = performance.now();
      const m = ctx.assess(e).pcMethod;
      if (m === '3d-coppola') slow.add(e.id);
      if (slow.has(e.id)) slowMs += performance.now() - t;
      methods.set(m, (methods.get(m) ?? 0) + 1);
    }
    return { ms: performance.now() - t0, slowMs, methods };
  };
  time('auto'); // which events take the 3-D method (and a first, cold pass)
  for (let round = 0; round < 3; round++) {
    const two = time('2d'), auto = time('auto');
    console.log(
      `run ${run.id}: ${events.length} events; 2-D everywhere ${two.ms.toFixed(0)} ms; automatic ${auto.ms.toFixed(0)} ms ` +
        `(+${(auto.ms - two.ms).toFixed(0)} ms); the ${slow.size} events with the 3-D method: ` +
        `${two.slowMs.toFixed(0)} ms by 2-D, ${auto.slowMs.toFixed(0)} ms by 3-D; methods ${JSON.stringify(Object.fromEntries(auto.methods))}`,
    );
  }
} finally {
  db.close();
}
