/**
 * What a naive 60-s grid would cost on the same inputs, measured on a sample in this run and
 * scaled: every object propagated at every step (SGP4), and every pair's distance checked at
 * every step. Fleet: the sample's objects against the primaries' states; all-vs-all: the sample's
 * propagation cost per object-step and a measured cost per pair-step, scaled by N·steps and
 * N(N−1)/2·steps. One core.
 */
import { Sgp4Trajectory } from '../core/propagation/sgp4.js';
import type { ElementSet } from '../core/elements/elementSet.js';
import type { Instant } from '../core/time/instant.js';

export const NAIVE_STEP_S = 60;
const SAMPLE_OBJECTS = 200;

export function naiveGridSeconds(
  sets: readonly ElementSet[],
  primaries: readonly string[] | 'all',
  start: number,
  days: number,
): number {
  const steps = Math.floor((days * 86_400) / NAIVE_STEP_S) + 1;
  const stride = Math.max(1, Math.floor(sets.length / SAMPLE_OBJECTS));
  const sample = sets.filter((_, i) => i % stride === 0).slice(0, SAMPLE_OBJECTS).map((s) => new Sgp4Trajectory(s));
  const buf = new Float64Array(6);
  if (primaries !== 'all') {
    // Primary states at every step (part of the naive method's cost too: counted once).
    const ps = primaries.map((id) => new Sgp4Trajectory(sets.find((s) => s.objectId === id)!));
    const pos = new Float64Array(ps.length * steps * 3);
    const t0 = performance.now();
    ps.forEach((p, i) => {
      for (let k = 0; k < steps; k++) {
        p.stateInto((start + k * NAIVE_STEP_S * 1000) as Instant, buf, 0);
        pos.set(buf.subarray(0, 3), (i * steps + k) * 3);
      }
    });
    const primMs = performance.now() - t0;
    let near = 0;
    const t1 = performance.now();
    for (const s of sample) {
      for (let k = 0; k < steps; k++) {
        if (s.stateInto((start + k * NAIVE_STEP_S * 1000) as Instant, buf, 0)) break;
        for (let i = 0; i < ps.length; i++) {
          const o = (i * steps + k) * 3;
          if (Math.hypot(buf[0]! - pos[o]!, buf[1]! - pos[o + 1]!, buf[2]! - pos[o + 2]!) < 5) near++;
        }
      }
    }
    const perObjectMs = (performance.now() - t1) / sample.length;
    if (near < 0) console.log(near);
    return (primMs + perObjectMs * sets.length) / 1000;
  }
  // All-vs-all: propagation per object-step, then distance per pair-step.
  const t1 = performance.now();
  const pos = new Float64Array(sample.length * 3);
  const sampleSteps = Math.min(steps, 200);
  for (let k = 0; k < sampleSteps; k++) {
    sample.forEach((s, i) => {
      s.stateInto((start + k * NAIVE_STEP_S * 1000) as Instant, buf, 0);
      pos[i * 3] = buf[0]!; pos[i * 3 + 1] = buf[1]!; pos[i * 3 + 2] = buf[2]!;
    });
  }
  const propMsPerObjectStep = (performance.now() - t1) / (sampleSteps * sample.length);
  let near = 0, pairs = 0;
  const t2 = performance.now();
  for (let rep = 0; rep < 20; rep++) {
    for (let i = 0; i < sample.length; i++) for (let j = i + 1; j < sample.length; j++) {
      pairs++;
      if (Math.hypot(pos[i * 3]! - pos[j * 3]!, pos[i * 3 + 1]! - pos[j * 3 + 1]!, pos[i * 3 + 2]! - pos[j * 3 + 2]!) < 5) near++;
    }
  }
  const pairMsPerStep = (performance.now() - t2) / pairs;
  if (near < 0) console.log(near);
  const n = sets.length;
  return (propMsPerObjectStep * n * steps + pairMsPerStep * ((n * (n - 1)) / 2) * steps) / 1000;
}

/** Raw SGP4 rate on one core (evaluations/s), JIT warmed, on the first 2,000 sets. */
export function sgp4Rate(sets: readonly ElementSet[], start: number): number {
  const sample = sets.slice(0, 2000).map((s) => new Sgp4Trajectory(s));
  const buf = new Float64Array(6);
  for (let k = 0; k < 5; k++) for (const tr of sample) tr.stateInto((start + k * 61_000) as Instant, buf, 0);
  const t0 = performance.now();
  let n = 0;
  for (let k = 0; k < 60; k++) for (const tr of sample) {
    tr.stateInto((start + k * 97_000) as Instant, buf, 0);
    n++;
  }
  return n / ((performance.now() - t0) / 1000);
}
