/**
 * The report's view of a stored manoeuvre plan (app/plan/json.ts document → PlanModel). Read
 * defensively: documents of older plans may lack fields added later.
 */
import type { StoredPlan } from '../../db/index.js';
import type { PlanModel } from './model.js';

type Json = Record<string, unknown>;
const num = (x: unknown): number | null => (typeof x === 'number' && Number.isFinite(x) ? x : null);
const str = (x: unknown): string => (typeof x === 'string' ? x : '');
const obj = (x: unknown): Json | null => (x && typeof x === 'object' && !Array.isArray(x) ? (x as Json) : null);
const list = (x: unknown): Json[] => (Array.isArray(x) ? (x.filter((y) => obj(y)) as Json[]) : []);

export function planModelOf(p: StoredPlan): PlanModel | null {
  const d = p.document;
  const q = obj(d.proposal);
  if (!q) return null; // no burn proposed: the report says nothing rather than an empty section
  const v = obj(d.verification);
  const s = obj(v?.sgp4PlusDifference), n = obj(v?.fullyNumerical);
  const o = obj(d.original);
  const rs = obj(d.rescreen);
  const dv = Array.isArray(q.deltaVRtnMs) ? q.deltaVRtnMs.map((x) => num(x) ?? 0) : [0, 0, 0];
  return {
    target: p.target.kind === 'miss' ? { missKm: p.target.missKm } : { pc: p.target.pc },
    proposal: {
      burnTime: str(q.burnTime),
      leadTimeS: num(q.leadTimeS) ?? 0,
      direction: str(q.direction),
      deltaVMs: num(q.deltaVMs) ?? 0,
      deltaVRtnMs: [dv[0] ?? 0, dv[1] ?? 0, dv[2] ?? 0],
      achievedMissKm: num(q.achievedMissKm) ?? Number.NaN,
      achievedPc: num(q.achievedPc),
      propellantKg: num(q.propellantKg),
    },
    trade: list(d.trade)
      .filter((r) => num(r.deltaVMs) !== null && num(r.achievedMissKm) !== null)
      .map((r) => ({ leadTimeS: num(r.leadTimeS) ?? 0, deltaVMs: num(r.deltaVMs)!, achievedMissKm: num(r.achievedMissKm)!, achievedPc: num(r.achievedPc), direction: str(r.direction) })),
    tradeByDirection: list(d.tradeByDirection).map((r) => ({ leadTimeS: num(r.leadTimeS) ?? 0, direction: str(r.direction), deltaVMs: num(r.deltaVMs) })),
    ...(num(d.periodS) !== null ? { periodS: num(d.periodS)! } : {}),
    verification: v && s
      ? {
          method: str(v.method),
          missKm: num(s.missKm) ?? Number.NaN,
          pc: num(s.pc),
          fullyNumerical: n ? { missKm: num(n.missKm) ?? Number.NaN, pc: num(n.pc) } : null,
          notes: Array.isArray(d.notes) ? d.notes.filter((x): x is string => typeof x === 'string') : [],
        }
      : null,
    newApproaches: list(d.newApproaches).map((a) => ({ secondary: str(a.secondary), tca: str(a.tca), missKm: num(a.missKm) ?? Number.NaN, pc: num(a.pc) })),
    createdAt: str(d.createdAt),
    ...(o ? { original: { tca: str(o.tca), missKm: num(o.missKm) ?? Number.NaN, pc: num(o.pc) } } : {}),
    rescreen: rs ? { objects: num(rs.objects) ?? 0, approaches: list(rs.approaches).length, start: str(rs.start), end: str(rs.end) } : null,
  };
}
