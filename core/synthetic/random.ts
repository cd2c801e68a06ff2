/**
 * Seeded pseudo-random numbers for the synthetic world.
 *
 * mulberry32 (Tommy Ettinger's public-domain 32-bit generator): tiny, fast and good enough for
 * drawing orbits; not for cryptography. Only 32-bit integer arithmetic (Math.imul, >>>) is used
 * to produce the stream, so the same seed gives the same sequence on every JS engine.
 * Normals by the Box–Muller transform (Box & Muller 1958), both values of a pair used.
 */
export class Rng {
  private state: number;
  private spare: number | null = null;

  constructor(seed: number) {
    // Mix the seed once so that seeds 1, 2, 3 … do not start on correlated streams.
    this.state = mix32(seed >>> 0 ^ 0x9e3779b9);
  }

  /** Uniform in [0, 1), 32 bits of resolution. */
  next(): number {
    this.state = (this.state + 0x6d2b79f5) | 0;
    let t = this.state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  }

  uniform(lo: number, hi: number): number {
    return lo + (hi - lo) * this.next();
  }

  /** Integer in [0, n). */
  int(n: number): number {
    return Math.floor(this.next() * n);
  }

  normal(mean = 0, sd = 1): number {
    if (this.spare !== null) {
      const z = this.spare;
      this.spare = null;
      return mean + sd * z;
    }
    // 1 − next() lies in (0, 1], so the logarithm is finite.
    const u1 = 1 - this.next();
    const u2 = this.next();
    const radius = Math.sqrt(-2 * Math.log(u1));
    this.spare = radius * Math.sin(2 * Math.PI * u2);
    return mean + sd * radius * Math.cos(2 * Math.PI * u2);
  }

  /** Log-normal with the given median and log-space standard deviation. */
  logNormal(median: number, sdLn: number): number {
    return median * Math.exp(this.normal(0, sdLn));
  }

  exponential(mean: number): number {
    return -mean * Math.log(1 - this.next());
  }

  pick<T>(items: readonly T[]): T {
    const item = items[this.int(items.length)];
    if (item === undefined) throw new RangeError('pick from an empty list');
    return item;
  }

  /** Index drawn with probability proportional to its weight. */
  weighted(weights: readonly number[]): number {
    let total = 0;
    for (const w of weights) total += w;
    let x = this.next() * total;
    for (let i = 0; i < weights.length; i++) {
      x -= weights[i]!;
      if (x < 0) return i;
    }
    return weights.length - 1;
  }

  /** A unit vector uniformly distributed on the sphere. */
  direction(): [number, number, number] {
    const z = this.uniform(-1, 1);
    const phi = this.uniform(0, 2 * Math.PI);
    const s = Math.sqrt(1 - z * z);
    return [s * Math.cos(phi), s * Math.sin(phi), z];
  }

  /** An independent stream derived from this one, so one family's draws never shift another's. */
  fork(label: number): Rng {
    return new Rng(mix32(Math.floor(this.next() * 4294967296) ^ Math.imul(label + 1, 0x85ebca6b)));
  }
}

/** murmur3's 32-bit finaliser: spreads every input bit over the whole word. */
function mix32(x: number): number {
  x = Math.imul(x ^ (x >>> 16), 0x85ebca6b);
  x = Math.imul(x ^ (x >>> 13), 0xc2b2ae35);
  return (x ^ (x >>> 16)) >>> 0;
}
