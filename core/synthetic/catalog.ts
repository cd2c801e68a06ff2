import type { ElementSet } from '../elements/elementSet.js';
import { KeepclearError } from '../errors.js';
import type { Instant } from '../time/instant.js';
import { draftToElementSet, type Draft } from './draft.js';
import { constellation } from './families/constellation.js';
import type { Family } from './families/context.js';
import { debris } from './families/debris.js';
import { eccentric } from './families/eccentric.js';
import { geo } from './families/geo.js';
import { leoScatter } from './families/leoScatter.js';
import { meo } from './families/meo.js';
import { sunSync } from './families/sunSync.js';
import { Rng } from './random.js';

/**
 * Shares of the synthetic population. Rough figures from memory of the public catalogue of the
 * mid-2020s (~30,000 tracked objects in orbit), not measured: a large broadband constellation
 * is about a fifth of it, fragmentation debris and other LEO objects most of the rest, with
 * MEO, GEO and eccentric orbits a few per cent each.
 */
export const POPULATION_SHARES: Readonly<Record<string, number>> = {
  constellation: 0.22,
  sunSync: 0.12,
  debris: 0.28,
  leoScatter: 0.26,
  meo: 0.025,
  geo: 0.055,
  eccentric: 0.04,
};

const FAMILIES: Readonly<Record<string, Family>> = {
  constellation, sunSync, debris, leoScatter, meo, geo, eccentric,
};

export interface CatalogOptions {
  readonly size?: number;
  readonly seed?: number;
  /** Reference time: every element-set epoch lies in the `maxAgeDays` before it. */
  readonly epoch: Instant;
  /** First catalogue number (default 1); ids are consecutive decimal strings. */
  readonly idStart?: number;
  /** Oldest element-set age, days (default 3). */
  readonly maxAgeDays?: number;
}

/**
 * A seeded synthetic catalogue resembling the real population (see POPULATION_SHARES).
 * Same options → identical output. Objects are shuffled before numbering so that an id range
 * mixes regimes, as a real catalogue does. Names tell the family (invented names):
 * "SKEIN-…" constellation, "EO-SAT …" sun-synchronous, "BREAKUP k DEB" debris cloud k,
 * "OBJECT …" other LEO, "NAVSET s-…"/"NAV R/B …" MEO, "GEOCOM …"/"GEO OBJECT …" GEO,
 * "GTO R/B …"/"HEO …" eccentric. Elements are rounded to TLE precision and epochs fall on
 * TLE-exact instants, so a TLE export loses nothing.
 */
export function generateCatalog(opts: CatalogOptions): ElementSet[] {
  const size = opts.size ?? 30_000;
  const seed = opts.seed ?? 1;
  const idStart = opts.idStart ?? 1;
  const maxAgeDays = opts.maxAgeDays ?? 3;
  if (!Number.isInteger(size) || size < 0) throw new KeepclearError('BAD_ARGUMENT', `catalogue size must be a whole number ≥ 0, got ${size}`);
  if (!Number.isInteger(idStart) || idStart < 1) throw new KeepclearError('BAD_ARGUMENT', `idStart must be a whole number ≥ 1, got ${idStart}`);
  if (!(maxAgeDays > 0)) throw new KeepclearError('BAD_ARGUMENT', `maxAgeDays must be > 0, got ${maxAgeDays}`);

  const root = new Rng(seed);
  const ctx = { epoch: opts.epoch, maxAgeDays };
  const names = Object.keys(POPULATION_SHARES);
  const drafts: Draft[] = [];
  let assigned = 0;
  names.forEach((name, index) => {
    // Each family draws from its own stream: changing one family never reshuffles another.
    const rng = root.fork(index);
    const share = POPULATION_SHARES[name] ?? 0;
    // Rounding remainder goes to the other-LEO family, the least structured one.
    const count = name === 'leoScatter' ? 0 : Math.min(Math.round(size * share), size - assigned);
    assigned += count;
    if (name !== 'leoScatter') drafts.push(...FAMILIES[name]!(rng, count, ctx));
  });
  drafts.push(...leoScatter(root.fork(names.length), size - assigned, ctx));

  const order = root.fork(names.length + 1);
  for (let k = drafts.length - 1; k > 0; k--) {
    const j = order.int(k + 1);
    const t = drafts[k]!;
    drafts[k] = drafts[j]!;
    drafts[j] = t;
  }
  const extras = root.fork(names.length + 2);
  return drafts.map((d, k) => draftToElementSet(d, String(idStart + k), k + 1, extras));
}
