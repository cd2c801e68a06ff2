/**
 * Seeded pseudo-random numbers for Monte Carlo checks: xoshiro128** (Blackman & Vigna, 2018)
 * seeded through splitmix32, so a seed gives the same sequence on every platform.
 */
export class SeededRandom {
  private s0: number;
  private s1: number;
  private s2: number;
  private s3: number;
  private spare: number | null = null;

  constructor(seed: number) {
    let x = seed >>> 0;
    const next = (): number => {
      x = (x + 0x9e3779b9) >>> 0;
      let z = x;
      z = Math.imul(z ^ (z >>> 16), 0x85ebca6b) >>> 0;
      z = Math.imul(z ^ (z >>> 13), 0xc2b2ae35) >>> 0;
      return (z ^ (z >>> 16)) >>> 0;
    };
    this.s0 = next();
    this.s1 = next();
    this.s2 = next();
    this.s3 = next();
  }

  private nextU32(): number {
    const result = Math.imul(((Math.imul(this.s1, 5) << 7) | (Math.imul(this.s1, 5) >>> 25)) >>> 0, 9) >>> 0;
    const t = (this.s1 << 9) >>> 0;
    this.s2 ^= this.s0;
    this.s3 ^= this.s1;
    this.s1 ^= this.s2;
    this.s0 ^= this.s3;
    this.s2 ^= t;
    this.s3 = ((this.s3 << 11) | (this.s3 >>> 21)) >>> 0;
    this.s0 >>>= 0;
    this.s1 >>>= 0;
    this.s2 >>>= 0;
    return result;
  }

  /** Uniform in (0, 1) with 53 random bits (never exactly 0, so log() is safe). */
  uniform(): number {
    const hi = this.nextU32() >>> 5, lo = this.nextU32() >>> 6;
    return (hi * 67108864 + lo + 0.5) / 9007199254740992;
  }

  /** Standard normal by the Box–Muller transform (both values used). */
  normal(): number {
    if (this.spare !== null) {
      const s = this.spare;
      this.spare = null;
      return s;
    }
    const r = Math.sqrt(-2 * Math.log(this.uniform()));
    const t = 2 * Math.PI * this.uniform();
    this.spare = r * Math.sin(t);
    return r * Math.cos(t);
  }
}
