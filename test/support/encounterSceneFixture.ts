/**
 * A realistic EncounterScene for the 3-D view's browser test and benchmark: the demo world's
 * riskiest planted approach (fleet member A0001 against a crossing payload, 50 m miss), SGP4 for
 * both objects and the catalogue, the default covariance table and the reference 2-D Pc.
 */
import type { Encounter } from '../../core/events/index.js';
import { approachAngleDeg, missAndSpeed, relativeRtn } from '../../core/events/geometry.js';
import { Sgp4Trajectory } from '../../core/propagation/sgp4.js';
import { assessEncounter } from '../../core/risk/assess.js';
import { buildEncounterScene, type EncounterScene } from '../../core/scene/encounterScene.js';
import { buildDemoScenario } from '../../core/synthetic/demo.js';

export function demoEncounterScene(catalogSize: number): EncounterScene {
  const demo = buildDemoScenario({ catalogSize });
  const planted = demo.planted.find((p) => p.role === 'grows-riskier') ?? demo.planted[0]!;
  const set = (id: string) => [...demo.fleet, ...demo.catalog].find((s) => s.objectId === id)!;
  const pSet = set(planted.primary), sSet = set(planted.secondary);
  const primary = new Sgp4Trajectory(pSet), secondary = new Sgp4Trajectory(sSet);
  const ps = new Float64Array(6), ss = new Float64Array(6);
  primary.stateInto(planted.tca, ps, 0);
  secondary.stateInto(planted.tca, ss, 0);
  const st = (a: Float64Array) => [a[0]!, a[1]!, a[2]!, a[3]!, a[4]!, a[5]!] as const;
  const encounter: Encounter = {
    primary: planted.primary, secondary: planted.secondary, tca: planted.tca,
    ...missAndSpeed(ps, ss), rtnKm: relativeRtn(ps, ss), approachAngleDeg: approachAngleDeg(ps, ss),
    entry: null, exit: null, primaryState: st(ps), secondaryState: st(ss), primaryEpoch: pSet.epoch, secondaryEpoch: sSet.epoch,
  };
  const risk = assessEncounter(encounter, { primary: { elements: pSet }, secondary: { elements: sSet } });
  const catalogue = demo.catalog.filter((s) => s.objectId !== planted.secondary).map((s) => new Sgp4Trajectory(s));
  return buildEncounterScene({ event: { ...encounter, id: 'R1-1', risk }, primary, secondary, catalogue });
}
