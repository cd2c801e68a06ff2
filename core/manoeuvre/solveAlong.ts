/**
 * The smallest Δv along one fixed direction (a unit vector in RTN) that meets the target, for
 * one burn time: a first guess from the linear map, then a bracket [not met, met] on the
 * re-propagated result, narrowed until it is below the resolution. The reported Δv is the met
 * end of the bracket, so its verified miss (or Pc) meets the target.
 *
 * "Smallest" assumes the target, once met along the direction, stays met for larger burns: true
 * of the linear map (the in-plane miss grows linearly with Δv, so the met set is one interval
 * [s*, ∞)) and so of the real problem while the linear map is good. Where it is not (large
 * Δv, odd geometry) the answer is still a verified burn that meets the target, possibly not
 * the smallest.
 */
import type { Vec3 } from './burn.js';
import { narrowBracket } from './bracketSearch.js';
import { predictBurn, verifyBurn, type BurnEvaluation } from './evaluateBurn.js';
import type { BurnCase, PlanningContext } from './planningContext.js';

/**
 * Resolution of the answer: 0.1 mm/s or 0.2 % of Δv, whichever is larger. Small-satellite
 * thrusters execute a burn to a few percent (common practice), so a finer answer would mean
 * nothing and cost integrations.
 */
export const DV_RESOLUTION_MS = 1e-4;
export const DV_RELATIVE_RESOLUTION = 2e-3;
const tolerance = (s: number): number => Math.max(DV_RESOLUTION_MS, DV_RELATIVE_RESOLUTION * s);
/** Smallest burn the linear search starts from (m/s). */
const LINEAR_FLOOR_MS = 1e-5;
/**
 * First step of the non-linear bracket away from the linear guess (2 %); the ratio squares at
 * each further step (2 %, 4 %, 8 %, 17 %, 37 %, …). The STM guess is usually within 1 % of the
 * verified answer in LEO over a few orbits, so most brackets close at the first step.
 */
const FIRST_BRACKET_RATIO = 1.02;

type Probe = BurnEvaluation & { readonly s: number };

/** s·u; "+ 0" turns −0 into 0 so reported components read cleanly. */
const along = (u: Vec3, s: number): Vec3 => [u[0] * s + 0, u[1] * s + 0, u[2] * s + 0];

/** d(margin)/ds of the linear map at s (per m/s), by a 0.1 % forward difference. */
function linearSlope(ctx: PlanningContext, bc: BurnCase, u: Vec3, s: number): number {
  const a = predictBurn(ctx, bc, along(u, s)).margin, b = predictBurn(ctx, bc, along(u, 1.001 * s)).margin;
  return (b - a) / (0.001 * s);
}

/** Smallest s (m/s) along u meeting the target by the linear map; null when none ≤ maxDeltaVMs. */
export function linearSolve(ctx: PlanningContext, bc: BurnCase, u: Vec3, hintMs?: number): number | null {
  const probe = (s: number): Probe => ({ ...predictBurn(ctx, bc, along(u, s)), s });
  const max = ctx.maxDeltaVMs;
  let s = Math.min(max, Math.max(LINEAR_FLOOR_MS, hintMs ?? 1e-3));
  let p = probe(s);
  let lo: Probe, hi: Probe;
  if (p.margin >= 0) {
    hi = p;
    for (;;) {
      s /= 2;
      if (s < LINEAR_FLOOR_MS) return hi.s;
      p = probe(s);
      if (p.margin < 0) {
        lo = p;
        break;
      }
      hi = p;
    }
  } else {
    lo = p;
    for (;;) {
      if (s >= max) return null;
      s = Math.min(max, 2 * s);
      p = probe(s);
      if (p.margin >= 0) {
        hi = p;
        break;
      }
      lo = p;
    }
  }
  return narrowBracket(probe, lo, hi, (x) => 1e-3 * x).s;
}

export interface DirectionSolution {
  /** met: a verified burn; not-reached: not even maxDeltaVMs meets the target */
  readonly status: 'met' | 'not-reached';
  readonly unit: Vec3;
  readonly deltaVMs: number | null;
  readonly linearDeltaVMs: number | null;
  /** the verified evaluation at deltaVMs (met) or at the largest burn tried (not-reached) */
  readonly evaluation: BurnEvaluation;
  /** re-propagations spent */
  readonly verifications: number;
}

/**
 * @param original the evaluation without a burn (margin < 0: the target is not met yet)
 */
export function solveAlong(ctx: PlanningContext, bc: BurnCase, u: Vec3, original: BurnEvaluation, linearMs: number | null): DirectionSolution {
  let verifications = 0;
  const probe = (s: number): Probe => {
    verifications++;
    return { ...verifyBurn(ctx, bc, along(u, s)), s };
  };
  const max = ctx.maxDeltaVMs;
  const zero: Probe = { ...original, s: 0 };
  let s = Math.min(max, linearMs ?? max);
  let p = probe(s);
  // One secant step with the linear map's slope of the margin usually lands within the
  // resolution; probing half a resolution beyond it brackets the answer in one more probe.
  const slope = linearMs !== null && Number.isFinite(p.margin) ? linearSlope(ctx, bc, u, s) : NaN;
  if (slope > 0) {
    const half = 0.5 * tolerance(s);
    const guess = s - p.margin / slope + (p.margin >= 0 ? -half : half);
    const q = guess > 0.5 * s && guess < Math.min(max, 2 * s) ? probe(guess) : null;
    if (q && (q.margin >= 0) !== (p.margin >= 0)) {
      const [lo, hi] = q.margin >= 0 ? [p, q] : [q, p];
      const best = narrowBracket(probe, lo, hi, tolerance);
      return { status: 'met', unit: u, deltaVMs: best.s, linearDeltaVMs: linearMs, evaluation: best, verifications };
    }
    if (q) {
      p = q;
      s = q.s;
    }
  }
  let lo: Probe, hi: Probe;
  let ratio = FIRST_BRACKET_RATIO;
  if (p.margin >= 0) {
    hi = p;
    for (;;) {
      s /= ratio;
      ratio *= ratio;
      if (s < DV_RESOLUTION_MS) {
        lo = zero;
        break;
      }
      p = probe(s);
      if (p.margin < 0) {
        lo = p;
        break;
      }
      hi = p;
    }
  } else {
    lo = p;
    for (;;) {
      if (s >= max) return { status: 'not-reached', unit: u, deltaVMs: null, linearDeltaVMs: linearMs, evaluation: p, verifications };
      s = Math.min(max, s * ratio);
      ratio *= ratio;
      p = probe(s);
      if (p.margin >= 0) {
        hi = p;
        break;
      }
      lo = p;
    }
  }
  const best = narrowBracket(probe, lo, hi, tolerance);
  return { status: 'met', unit: u, deltaVMs: best.s, linearDeltaVMs: linearMs, evaluation: best, verifications };
}
