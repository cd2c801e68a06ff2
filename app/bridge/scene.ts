/**
 * The 3-D view's scene for a stored event (core/scene): both objects on SGP4 from the element
 * sets the event used (the newest at or before TCA when the exact one is gone), and the
 * catalogue as points at TCA. Built in the host, sent as plain data; the renderer only draws.
 */
import { KeepclearError } from '../../core/errors.js';
import type { ElementSet } from '../../core/elements/elementSet.js';
import { Sgp4Trajectory } from '../../core/propagation/sgp4.js';
import { buildEncounterScene, type EncounterScene } from '../../core/scene/encounterScene.js';
import type { Instant } from '../../core/time/instant.js';
import { elementSetHistory, EPOCH_MATCH_MS, getEvent, latestElementSets, type KeepclearDb } from '../../db/index.js';

function setFor(db: KeepclearDb, objectId: string, epoch: Instant, tca: Instant): ElementSet {
  const history = elementSetHistory(db, objectId);
  if (history.length === 0) throw new KeepclearError('NOT_FOUND', `no element set of object ${objectId}; import one to see the encounter in 3-D`);
  return (
    history.find((s) => Math.abs(s.epoch - epoch) <= EPOCH_MATCH_MS) ??
    history.filter((s) => s.epoch <= tca).at(-1) ??
    history.at(-1)!
  );
}

export function eventScene(db: KeepclearDb, eventId: string): EncounterScene {
  const e = getEvent(db, eventId);
  if (!e) throw new KeepclearError('NOT_FOUND', `no event "${eventId}"`);
  const primary = new Sgp4Trajectory(setFor(db, e.primary, e.primaryEpoch, e.tca));
  const secondary = new Sgp4Trajectory(setFor(db, e.secondary, e.secondaryEpoch, e.tca));
  const catalogue = latestElementSets(db)
    .filter((s) => s.objectId !== e.primary && s.objectId !== e.secondary)
    .map((s) => new Sgp4Trajectory(s));
  return buildEncounterScene({ event: e, primary, secondary, catalogue });
}
