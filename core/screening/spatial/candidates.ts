/**
 * Candidate (pair, index step) triples found by the broad phase, in growable typed arrays so
 * that millions of them cost a few bytes each and cross to the main thread without cloning.
 */
export class CandidateList {
  i = new Int32Array(1024);
  j = new Int32Array(1024);
  k = new Int32Array(1024);
  length = 0;

  push(i: number, j: number, k: number): void {
    if (this.length === this.i.length) {
      const grow = (a: Int32Array) => {
        const b = new Int32Array(a.length * 2);
        b.set(a);
        return b;
      };
      this.i = grow(this.i);
      this.j = grow(this.j);
      this.k = grow(this.k);
    }
    this.i[this.length] = i;
    this.j[this.length] = j;
    this.k[this.length] = k;
    this.length++;
  }

  /** Trimmed copies (transferable). */
  take(): Candidates {
    return { i: this.i.slice(0, this.length), j: this.j.slice(0, this.length), k: this.k.slice(0, this.length) };
  }
}

export interface Candidates {
  readonly i: Int32Array;
  readonly j: Int32Array;
  readonly k: Int32Array;
}

/**
 * Pairs with their candidate time regions: pair p is (first[p], second[p]) and its regions are
 * regions[offsets[p] .. offsets[p+1]) as flat [a0, b0, a1, b1, …] (ms), sorted and disjoint.
 */
export interface PairRegions {
  readonly first: Int32Array;
  readonly second: Int32Array;
  readonly offsets: Int32Array;
  readonly regions: Float64Array;
}

/**
 * Groups candidates of all blocks by pair; runs of consecutive steps become one region.
 * Step k covers [start + k·stepMs, start + (k+1)·stepMs]. Pairs come out sorted (first, second),
 * so the grouping does not depend on how blocks were split among threads.
 */
export function groupByPair(parts: readonly Candidates[], objects: number, steps: number, start: number, stepMs: number): PairRegions {
  let total = 0;
  for (const p of parts) total += p.i.length;
  // One sortable key per candidate: (i·N + j)·steps + k < 1e5·1e5·1e4 = 1e14 < 2⁵³.
  const keys = new Float64Array(total);
  let n = 0;
  for (const p of parts) {
    for (let c = 0; c < p.i.length; c++) keys[n++] = (p.i[c]! * objects + p.j[c]!) * steps + p.k[c]!;
  }
  keys.sort();
  const first: number[] = [], second: number[] = [], offsets: number[] = [0], regions: number[] = [];
  let prevPair = -1, prevK = -2;
  for (let c = 0; c < total; c++) {
    const key = keys[c]!;
    const k = key % steps;
    const pair = (key - k) / steps;
    if (pair !== prevPair) {
      if (prevPair >= 0) offsets.push(regions.length);
      const j = pair % objects;
      first.push((pair - j) / objects);
      second.push(j);
      regions.push(start + k * stepMs, start + (k + 1) * stepMs);
    } else if (k === prevK) {
      continue; // the same step found twice (cannot happen with disjoint blocks; harmless)
    } else if (k === prevK + 1) {
      regions[regions.length - 1] = start + (k + 1) * stepMs;
    } else {
      regions.push(start + k * stepMs, start + (k + 1) * stepMs);
    }
    prevPair = pair;
    prevK = k;
  }
  if (prevPair >= 0) offsets.push(regions.length);
  return {
    first: Int32Array.from(first),
    second: Int32Array.from(second),
    offsets: Int32Array.from(offsets),
    regions: Float64Array.from(regions),
  };
}
