/**
 * The files that send a plan to the screening provider (CCSDS 502.0-B-2, KVN):
 * - OEM: the manoeuvred trajectory (SGP4 + integrated difference) from the burn to the end of
 *   the screening window, one segment, EME2000, a node every OEM_STEP_S;
 * - OPM: the primary's state at the burn (before it) and one impulsive manoeuvre block (Δv in
 *   RTN, MAN_DELTA_MASS = −propellant).
 * Both are written with millisecond times (the writers' precision): the OPM's burn epoch is the
 * burn time rounded to the millisecond, with the state evaluated at that same instant; the OEM
 * starts at the first whole millisecond at or after the burn, so its first node is after the
 * velocity change (a burn moved by < 1 ms changes nothing measurable).
 */
import { KeepclearError } from '../../core/errors.js';
import { sampleOem, formatOemKvn } from '../../core/formats/oem/index.js';
import { formatOpmKvn } from '../../core/formats/opm/index.js';
import { burnOpm } from '../../core/manoeuvre/index.js';
import type { StateArray } from '../../core/events/index.js';
import { toIso, type Instant } from '../../core/time/instant.js';
import type { EventPlan } from './service.js';

/** OEM node spacing (s): LAGRANGE 9 on 60-s nodes interpolates LEO to micrometres (core/formats/oem/sample.ts). */
export const OEM_STEP_S = 60;
const ORIGINATOR = 'KEEPCLEAR';

function planned(p: EventPlan) {
  const traj = p.core.manoeuvredTrajectory, q = p.core.proposal;
  if (p.core.status !== 'planned' || !traj || !q || !q.deltaVRtnMs)
    throw new KeepclearError('NOT_FOUND', `the plan of event ${p.event.id} proposes no burn (${p.core.status}): there is nothing to write`);
  return { traj, q, dv: q.deltaVRtnMs };
}

const comments = (p: EventPlan): string[] => [
  `Avoidance plan for conjunction ${p.event.id}: ${p.event.primary} and ${p.event.secondary}, TCA ${toIso(p.event.tca)}`,
  'Made by Keepclear as a decision aid; the operator\'s flight dynamics and the provider\'s screening decide',
];

export function planOemText(p: EventPlan, creationDate: Instant = p.createdAt): string {
  const { traj, q } = planned(p);
  const start = Math.ceil(q.burnTime) as Instant;
  const oem = sampleOem([{ trajectory: traj, start, end: p.windowEnd, stepS: OEM_STEP_S }], {
    objectName: p.objectName ?? p.event.primary,
    objectId: p.event.primary,
    originator: ORIGINATOR,
    creationDate,
    comments: [
      ...comments(p),
      `Manoeuvred trajectory after the impulsive burn at ${toIso(q.burnTime)}: SGP4 plus the difference of two numerical ` +
        'integrations (with and without the burn) started from the SGP4 state at the burn',
    ],
  });
  return formatOemKvn(oem);
}

export function planOpmText(p: EventPlan, creationDate: Instant = p.createdAt): string {
  const { traj, q, dv } = planned(p);
  const t = Math.round(q.burnTime) as Instant;
  const s = new Float64Array(6);
  const failure = traj.base.stateInto(t, s, 0);
  if (failure) throw new KeepclearError('PROPAGATION_FAILED', `${p.event.primary} has no state at the burn ${toIso(t)} (${failure})`);
  const msg = burnOpm({
    objectName: p.objectName ?? p.event.primary,
    objectId: p.event.primary,
    stateAtBurn: [s[0]!, s[1]!, s[2]!, s[3]!, s[4]!, s[5]!] as StateArray,
    burn: { time: t, deltaVRtnMs: dv },
    propellantKg: q.propellantKg,
    massKg: p.spacecraft.massKg,
    originator: ORIGINATOR,
    creationDate,
    comments: comments(p),
  });
  return formatOpmKvn(msg);
}
