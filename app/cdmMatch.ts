import type { Cdm, CdmObject } from '../core/formats/cdm/index.js';
import { hardBodyRadiusFromAreaPc } from '../core/formats/cdm/index.js';
import type { Matrix } from '../core/math/linalg.js';
import type { Encounter } from '../core/events/index.js';
import { listCdms, type KeepclearDb, type StoredCdm } from '../db/index.js';

/** A screened event and a received message describe the same conjunction within this (ms). */
export const SAME_CONJUNCTION_MS = 60_000;

/** What a received message contributes to a screened event's risk: first in precedence. */
export interface CdmRiskInputs {
  readonly cdm: StoredCdm;
  readonly primaryRtnM2: Matrix | null;
  readonly secondaryRtnM2: Matrix | null;
  readonly primaryDoubtful: string | null;
  readonly secondaryDoubtful: string | null;
  readonly hbrPrimaryM: number | null;
  readonly hbrSecondaryM: number | null;
}

/**
 * The newest received message about the same pair (either order) with a TCA within
 * SAME_CONJUNCTION_MS, with each object's covariance mapped to the event's primary/secondary.
 */
export function matchingCdm(db: KeepclearDb, e: Encounter, cache?: Map<string, StoredCdm[]>): CdmRiskInputs | null {
  let list = cache?.get(e.primary);
  if (!list) {
    list = listCdms(db, { objectId: e.primary });
    cache?.set(e.primary, list);
  }
  const hits = list.filter(
    (c) =>
      ((c.object1Id === e.primary && c.object2Id === e.secondary) || (c.object1Id === e.secondary && c.object2Id === e.primary)) &&
      Math.abs(c.tca - e.tca) <= SAME_CONJUNCTION_MS,
  );
  const cdm = hits.sort((a, b) => b.creationDate - a.creationDate)[0];
  if (!cdm) return null;
  const parsed = cdm.parsed as Cdm;
  const swap = cdm.object1Id !== e.primary;
  const [p, s] = swap ? [parsed.object2, parsed.object1] : [parsed.object1, parsed.object2];
  const doubtful = (o: CdmObject) =>
    o.covariance.usable ? null : (o.covariance.note ?? `${o.metadata.object} covariance not positive semi-definite`);
  const hbr = (o: CdmObject) => (o.additional.areaPc !== undefined ? hardBodyRadiusFromAreaPc(o.additional.areaPc) : null);
  return {
    cdm,
    primaryRtnM2: p.covariance.usable,
    secondaryRtnM2: s.covariance.usable,
    primaryDoubtful: doubtful(p),
    secondaryDoubtful: doubtful(s),
    hbrPrimaryM: hbr(p),
    hbrSecondaryM: hbr(s),
  };
}
