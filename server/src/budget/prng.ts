// Seeded pseudo-random numbers for the Monte Carlo budget: xoshiro128** (D. Blackman and S. Vigna,
// "Scrambled linear pseudorandom number generators", ACM Trans. Math. Softw. 47(4), 2021), seeded
// through SplitMix64 as its authors recommend. Same seed, same sequence, on every platform.

const MASK64 = (1n << 64n) - 1n;

/** SplitMix64 step (Steele, Lea and Flood, "Fast splittable pseudorandom number generators", OOPSLA 2014). */
function splitMix64(state: bigint): [bigint, bigint] {
  const next = (state + 0x9e3779b97f4a7c15n) & MASK64;
  let z = next;
  z = ((z ^ (z >> 30n)) * 0xbf58476d1ce4e5b9n) & MASK64;
  z = ((z ^ (z >> 27n)) * 0x94d049bb133111ebn) & MASK64;
  return [next, z ^ (z >> 31n)];
}

const rotl = (x: number, k: number) => (x << k) | (x >>> (32 - k));

export class Xoshiro128 {
  private s0: number;
  private s1: number;
  private s2: number;
  private s3: number;
  private spare: number | null = null;

  constructor(seed: number) {
    let st = BigInt(Math.floor(Math.abs(seed))) & MASK64;
    let a: bigint;
    let b: bigint;
    [st, a] = splitMix64(st);
    [st, b] = splitMix64(st);
    this.s0 = Number(a & 0xffffffffn) | 0;
    this.s1 = Number(a >> 32n) | 0;
    this.s2 = Number(b & 0xffffffffn) | 0;
    this.s3 = Number(b >> 32n) | 0;
    if ((this.s0 | this.s1 | this.s2 | this.s3) === 0) this.s0 = 1; // the all-zero state is a fixed point
  }

  /** Next 32-bit output, unsigned. */
  nextUint32(): number {
    const result = Math.imul(rotl(Math.imul(this.s1, 5), 7), 9);
    const t = this.s1 << 9;
    this.s2 ^= this.s0;
    this.s3 ^= this.s1;
    this.s1 ^= this.s2;
    this.s0 ^= this.s3;
    this.s2 ^= t;
    this.s3 = rotl(this.s3, 11);
    return result >>> 0;
  }

  /** Uniform in [0, 1) with 53 random bits. */
  next(): number {
    const hi = this.nextUint32() >>> 5; // 27 bits
    const lo = this.nextUint32() >>> 6; // 26 bits
    return (hi * 67108864 + lo) / 9007199254740992;
  }

  /** Uniform in [-1, 1). */
  symmetric(): number {
    return 2 * this.next() - 1;
  }

  /** Standard normal by the Box-Muller transform (Box and Muller, Ann. Math. Statist. 29, 1958). */
  normal(): number {
    if (this.spare !== null) {
      const s = this.spare;
      this.spare = null;
      return s;
    }
    let u = 0;
    while (u === 0) u = this.next();
    const v = this.next();
    const r = Math.sqrt(-2 * Math.log(u));
    this.spare = r * Math.sin(2 * Math.PI * v);
    return r * Math.cos(2 * Math.PI * v);
  }

  /** A tolerance draw in [-1, 1]: uniform, or normal with the bound at 3 sigma (truncated there). */
  draw(distribution: 'uniform' | 'normal'): number {
    if (distribution === 'uniform') return this.symmetric();
    for (;;) {
      const z = this.normal() / 3;
      if (z >= -1 && z <= 1) return z;
    }
  }
}
