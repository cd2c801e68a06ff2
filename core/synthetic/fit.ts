import type { ElementSet } from '../elements/elementSet.js';
import { KeepclearError } from '../errors.js';
import { Sgp4Trajectory } from '../propagation/sgp4.js';
import { MS_PER_DAY, toIso, type Instant } from '../time/instant.js';
import { keplerianFromState, meanMotionRevPerDay, wrapTwoPi } from './kepler.js';
import { SYNTHETIC_SOURCE } from './draft.js';

/**
 * Fits SGP4 mean elements to one TEME state: the element set whose SGP4 state at `at` equals
 * the target. Newton iterations on six equinoctial elements (n, e·cos ϖ, e·sin ϖ,
 * tan(i/2)·sin Ω, tan(i/2)·cos Ω, λ = M + ϖ), chosen because classical ω and M are not separately
 * defined for near-circular orbits and would make the Jacobian singular. Jacobians by central
 * differences through SGP4 itself, so the fit matches what every other part propagates.
 *
 * The start is the osculating two-body state (WGS-72 μ). Long spans between epoch and `at` are
 * reached by moving the epoch in steps of at most MAX_EPOCH_STEP_DAYS, each seeded by SGP4's
 * own secular rates (halved when drag makes that start too poor), so Newton always starts close
 * to the answer.
 */
export const FIT_POSITION_TOLERANCE_KM = 1e-3; // 1 m, the contract of this function
export const FIT_VELOCITY_TOLERANCE_KMS = 1e-6; // 1 mm/s
/** Iterate on well past the contract (1 mm, 1 µm/s) while Newton still improves, for margin. */
const GOAL_POSITION_KM = 1e-6;
const GOAL_VELOCITY_KMS = 1e-9;
const MAX_EPOCH_STEP_DAYS = 1;
/** Strong drag makes secular-rate shifts poor; steps are halved down to this before giving up. */
const MIN_EPOCH_STEP_MS = 60_000;
const MAX_ITERATIONS = 30;
/** Central-difference steps: each moves the position by roughly a metre or less. */
const STEPS = [1e-7, 1e-7, 1e-7, 1e-7, 1e-7, 1e-7];

/** n (rev/day), e·cos ϖ, e·sin ϖ, tan(i/2)·sin Ω, tan(i/2)·cos Ω, λ = M + ϖ (rad). */
export type Equinoctial = [number, number, number, number, number, number];
export type Template = Partial<ElementSet> & { objectId: string; epoch: Instant };
export interface FitTarget { r: readonly number[]; v: readonly number[] }

const RAD = 180 / Math.PI;

export function toEquinoctial(n: number, e: number, i: number, raan: number, argp: number, m: number): Equinoctial {
  const lonPerigee = raan + argp, t = Math.tan(i / 2);
  return [n, e * Math.cos(lonPerigee), e * Math.sin(lonPerigee), t * Math.sin(raan), t * Math.cos(raan), lonPerigee + m];
}

export function elementSetOf(x: Equinoctial, epoch: Instant, template: Template): ElementSet {
  const [n, af, ag, chi, psi, lambda] = x;
  const e = Math.hypot(af, ag);
  const lonPerigee = e > 0 ? Math.atan2(ag, af) : 0;
  const tanHalfI = Math.hypot(chi, psi);
  const raan = tanHalfI > 0 ? Math.atan2(chi, psi) : 0;
  return {
    name: null, intlDesignator: null, classification: 'U', bstar: 0, meanMotionDot: 0,
    meanMotionDdot: 0, elementSetNo: 999, revAtEpoch: 0, ephemerisType: 0,
    source: { ...SYNTHETIC_SOURCE, line: 0 },
    ...template,
    epoch,
    meanMotionRevPerDay: n,
    eccentricity: e,
    inclinationDeg: 2 * Math.atan(tanHalfI) * RAD,
    raanDeg: wrapTwoPi(raan) * RAD,
    argPerigeeDeg: wrapTwoPi(lonPerigee - raan) * RAD,
    meanAnomalyDeg: wrapTwoPi(lambda - lonPerigee) * RAD,
  };
}

/** SGP4 state minus target, or null when SGP4 refuses these elements. */
function residual(x: Equinoctial, epoch: Instant, at: Instant, template: Template, target: FitTarget): number[] | null {
  if (!(x[0] > 0) || Math.hypot(x[1], x[2]) >= 0.99) return null;
  const out = new Float64Array(6);
  const failure = new Sgp4Trajectory(elementSetOf(x, epoch, template)).stateInto(at, out, 0);
  if (failure) return null;
  return [0, 1, 2, 3, 4, 5].map((k) => out[k]! - (k < 3 ? target.r[k]! : target.v[k - 3]!));
}

/** Position error and velocity error scaled by a time (s) so both weigh alike in the merit. */
const VELOCITY_WEIGHT_S = 1000;
const merit = (res: number[]): number =>
  res.reduce((s, d, k) => s + (k < 3 ? d * d : d * d * VELOCITY_WEIGHT_S * VELOCITY_WEIGHT_S), 0);
const positionError = (res: number[]): number => Math.hypot(res[0]!, res[1]!, res[2]!);
const velocityError = (res: number[]): number => Math.hypot(res[3]!, res[4]!, res[5]!);
const converged = (res: number[]): boolean =>
  positionError(res) < FIT_POSITION_TOLERANCE_KM && velocityError(res) < FIT_VELOCITY_TOLERANCE_KMS;

/** Gaussian elimination with partial pivoting; a 6×6 system. */
function solve(a: number[][], b: number[]): number[] | null {
  const n = b.length;
  const m = a.map((row, i) => [...row, b[i]!]);
  for (let c = 0; c < n; c++) {
    let p = c;
    for (let r = c + 1; r < n; r++) if (Math.abs(m[r]![c]!) > Math.abs(m[p]![c]!)) p = r;
    if (m[p]![c] === 0) return null;
    [m[c], m[p]] = [m[p]!, m[c]!];
    for (let r = c + 1; r < n; r++) {
      const f = m[r]![c]! / m[c]![c]!;
      for (let k = c; k <= n; k++) m[r]![k]! -= f * m[c]![k]!;
    }
  }
  const x = new Array<number>(n).fill(0);
  for (let r = n - 1; r >= 0; r--) {
    let s = m[r]![n]!;
    for (let k = r + 1; k < n; k++) s -= m[r]![k]! * x[k]!;
    x[r] = s / m[r]![r]!;
  }
  return x;
}

function newton(start: Equinoctial, epoch: Instant, at: Instant, template: Template, target: FitTarget): { x: Equinoctial; res: number[] } {
  let x = start;
  let res = residual(x, epoch, at, template, target);
  if (!res) throw new KeepclearError('INTERNAL', `fit of ${template.objectId}: SGP4 rejects the starting elements`);
  for (let it = 0; it < MAX_ITERATIONS; it++) {
    if (positionError(res) < GOAL_POSITION_KM && velocityError(res) < GOAL_VELOCITY_KMS) break;
    const jac: number[][] = Array.from({ length: 6 }, () => new Array<number>(6).fill(0));
    for (let j = 0; j < 6; j++) {
      const h = j === 0 ? STEPS[0]! * x[0] : STEPS[j]!;
      const plus = [...x] as Equinoctial, minus = [...x] as Equinoctial;
      plus[j] = plus[j]! + h;
      minus[j] = minus[j]! - h;
      const rp = residual(plus, epoch, at, template, target), rm = residual(minus, epoch, at, template, target);
      if (!rp || !rm) throw new KeepclearError('INTERNAL', `fit of ${template.objectId}: SGP4 fails near the solution`);
      for (let k = 0; k < 6; k++) jac[k]![j] = (rp[k]! - rm[k]!) / (2 * h);
    }
    const step = solve(jac, res.map((d) => -d));
    if (!step) break;
    // Halve the step until the merit falls: keeps Newton from overshooting on long spans.
    let accepted = false;
    for (let scale = 1; scale > 1e-3; scale /= 2) {
      const trial = x.map((v, k) => v + scale * step[k]!) as Equinoctial;
      const tr = residual(trial, epoch, at, template, target);
      if (tr && merit(tr) < merit(res)) {
        x = trial;
        res = tr;
        accepted = true;
        break;
      }
    }
    if (!accepted) break; // at rounding level: no further improvement possible
  }
  return { x, res };
}

/** Moves fitted elements from one epoch to another along SGP4's secular rates. */
function shiftEpoch(x: Equinoctial, from: Instant, to: Instant, template: Template): Equinoctial {
  const es = elementSetOf(x, from, template);
  const rec = new Sgp4Trajectory(es).satrec;
  const minutes = (to - from) / 60_000;
  const i = es.inclinationDeg / RAD;
  const raan = es.raanDeg / RAD + rec.nodedot * minutes;
  const argp = es.argPerigeeDeg / RAD + rec.argpdot * minutes;
  const m = es.meanAnomalyDeg / RAD + rec.mdot * minutes;
  return toEquinoctial(x[0], es.eccentricity, i, raan, argp, m);
}

/**
 * Mean elements (epoch `template.epoch`) whose SGP4 state at `at` matches `target` (TEME km,
 * km/s) within 1 m and 1 mm/s. Other fields (B*, name, …) come from the template and are held
 * fixed. Throws KeepclearError INTERNAL when no such set is found.
 */
export function fitElementSetToState(target: FitTarget, at: Instant, template: Template): ElementSet {
  const osc = keplerianFromState(target.r, target.v);
  const start = toEquinoctial(meanMotionRevPerDay(osc.a), osc.e, osc.i, osc.raan, osc.argp, osc.meanAnomaly);
  let epoch = at;
  let fit = newton(start, epoch, at, template, target);
  let stepMs = MAX_EPOCH_STEP_DAYS * MS_PER_DAY;
  while (epoch !== template.epoch) {
    const remaining = template.epoch - epoch;
    const next = (Math.abs(remaining) <= stepMs ? template.epoch : Math.round(epoch + Math.sign(remaining) * stepMs)) as Instant;
    let trial: { x: Equinoctial; res: number[] } | null = null;
    try {
      trial = newton(shiftEpoch(fit.x, epoch, next, template), next, at, template, target);
    } catch (e) {
      if (!(e instanceof KeepclearError)) throw e;
    }
    if (trial && converged(trial.res)) {
      fit = trial;
      epoch = next;
      stepMs = Math.min(stepMs * 2, MAX_EPOCH_STEP_DAYS * MS_PER_DAY);
    } else if ((stepMs /= 2) < MIN_EPOCH_STEP_MS) {
      break; // reported below with the last good residual
    }
  }
  const dr = positionError(fit.res), dv = velocityError(fit.res);
  if (epoch !== template.epoch || !converged(fit.res))
    throw new KeepclearError('INTERNAL', `fit of ${template.objectId} did not converge: position error ${(dr * 1000).toFixed(3)} m, velocity error ${(dv * 1e6).toFixed(3)} mm/s at epoch ${toIso(epoch)}`);
  return elementSetOf(fit.x, template.epoch, template);
}
