/**
 * Seeded randomness for the engine.
 *
 * A seed (number or text) is expanded by seedrandom's ARC4-based generator into the
 * 128-bit state of xoshiro128** (Blackman & Vigna 2018), which then produces the stream.
 * Everything is 32-bit integer arithmetic (Math.imul, >>>), so the same seed gives the
 * same stream on every machine and JavaScript engine.
 */
import seedrandom from "seedrandom";

const TWO_POW_32 = 4294967296;

/**
 * Seeded generator: xoshiro128** (Blackman & Vigna 2018) seeded through seedrandom's
 * ARC4 (see the file comment), with unbiased bounded integers (Lemire 2019) and the
 * fused draw loops of the bootstrap.
 */
export class Rng {
  private s0: number;
  private s1: number;
  private s2: number;
  private s3: number;

  constructor(seed: number | string = 1) {
    const src = seedrandom(String(seed));
    this.s0 = src.int32() | 0;
    this.s1 = src.int32() | 0;
    this.s2 = src.int32() | 0;
    this.s3 = src.int32() | 0;
    if ((this.s0 | this.s1 | this.s2 | this.s3) === 0) this.s0 = 1;
  }

  /** Next unsigned 32-bit integer (xoshiro128**, Blackman & Vigna 2018). */
  nextU32(): number {
    const s0 = this.s0, s1 = this.s1, s2 = this.s2, s3 = this.s3;
    const r = Math.imul(rotl(Math.imul(s1, 5), 7), 9) >>> 0;
    const t = s1 << 9;
    let n2 = s2 ^ s0;
    let n3 = s3 ^ s1;
    const n1 = s1 ^ n2;
    const n0 = s0 ^ n3;
    n2 ^= t;
    n3 = rotl(n3, 11);
    this.s0 = n0; this.s1 = n1; this.s2 = n2; this.s3 = n3;
    return r;
  }

  /** Uniform double in [0, 1) with 53 random bits. */
  nextFloat(): number {
    const hi = this.nextU32() >>> 5; // 27 bits
    const lo = this.nextU32() >>> 6; // 26 bits
    return (hi * 67108864 + lo) / 9007199254740992;
  }

  /**
   * Unbiased integer in [0, n) for 1 ≤ n ≤ 2^32. For n < 2^21 this is Lemire's (2019)
   * multiply-and-reject method (x·n is exact in a double); above, modulo with rejection
   * of the incomplete top range. Neither has modulo bias.
   */
  int(n: number): number {
    if (n <= 1) return 0;
    if (n < 2097152) {
      let prod = this.nextU32() * n;
      let lo = prod >>> 0;
      if (lo < n) {
        const threshold = (TWO_POW_32 - n) % n;
        while (lo < threshold) {
          prod = this.nextU32() * n;
          lo = prod >>> 0;
        }
      }
      return Math.floor(prod * 2.3283064365386963e-10);
    }
    const limit = TWO_POW_32 - (TWO_POW_32 % n);
    let x = this.nextU32();
    while (x >= limit) x = this.nextU32();
    return x % n;
  }

  /**
   * Fills out[t] = int(first − step·t) for t = 0 … count − 1 (step 0: a fixed bound, as
   * in bootstrap draws; step 1: the decreasing bounds of a Fisher–Yates shuffle). Same
   * stream and results as calling {@link int} that many times, with the generator state
   * kept in locals (the engine's hot loops: no allocation, no property writes per draw).
   */
  boundedInts(out: Int32Array, first: number, step: 0 | 1, count: number): void {
    if (first >= 2097152) {
      for (let t = 0; t < count; t++) out[t] = this.int(first - step * t);
      return;
    }
    let s0 = this.s0, s1 = this.s1, s2 = this.s2, s3 = this.s3;
    let n = first;
    let threshold = -1; // (2^32 − n) mod n, computed only when a draw needs it, as in int()
    for (let t = 0; t < count; t++, n -= step) {
      if (step) threshold = -1;
      if (n <= 1) {
        out[t] = 0;
        continue;
      }
      let prod = 0;
      for (;;) {
        const r = Math.imul(rotl(Math.imul(s1, 5), 7), 9) >>> 0;
        const x = s1 << 9;
        s2 ^= s0;
        s3 ^= s1;
        s1 ^= s2;
        s0 ^= s3;
        s2 ^= x;
        s3 = rotl(s3, 11);
        prod = r * n;
        const lo = prod >>> 0;
        if (lo >= n) break;
        if (threshold < 0) threshold = (TWO_POW_32 - n) % n;
        if (lo >= threshold) break;
      }
      out[t] = (prod * 2.3283064365386963e-10) | 0; // < 2^21, so | 0 is floor
    }
    this.s0 = s0; this.s1 = s1; this.s2 = s2; this.s3 = s3;
  }

  /** Fills out[t] = int(first − t) for t < count: the draws of a Fisher–Yates shuffle. */
  descendingInts(out: Int32Array, first: number, count: number): void {
    this.boundedInts(out, first, 1, count);
  }

  private scratch = new Int32Array(0);

  /** `count` indices drawn uniformly with replacement from [0, n), in a reused buffer. */
  private draws(n: number, count: number): Int32Array {
    if (this.scratch.length < count) this.scratch = new Int32Array(count);
    this.boundedInts(this.scratch, n, 0, count);
    return this.scratch;
  }

  /**
   * Sum of `count` values drawn uniformly with replacement from `values` — the same
   * stream and result as summing `values[this.int(values.length)]` `count` times.
   */
  sumOfDraws(values: ArrayLike<number>, count: number): number {
    // Fused with the generator (rather than boundedInts + a second pass): this is the
    // bootstrap-of-the-mean hot loop, where the extra pass costs about a third.
    const n = values.length;
    if (n >= 2097152 || n <= 1) {
      let t = 0;
      for (let i = 0; i < count; i++) t += values[this.int(n)];
      return t;
    }
    let s0 = this.s0, s1 = this.s1, s2 = this.s2, s3 = this.s3;
    const threshold = (TWO_POW_32 - n) % n;
    let s = 0;
    for (let i = 0; i < count; ) {
      const r = Math.imul(rotl(Math.imul(s1, 5), 7), 9) >>> 0;
      const x = s1 << 9;
      s2 ^= s0;
      s3 ^= s1;
      s1 ^= s2;
      s0 ^= s3;
      s2 ^= x;
      s3 = rotl(s3, 11);
      const prod = r * n;
      if (prod >>> 0 < threshold) continue; // Lemire's rejection, as in int()
      s += values[(prod * 2.3283064365386963e-10) | 0];
      i++;
    }
    this.s0 = s0; this.s1 = s1; this.s2 = s2; this.s3 = s3;
    return s;
  }

  /**
   * Sums of a[j] and of b[j] over the same `count` indices j drawn uniformly with
   * replacement from [0, a.length) (b at least as long as a); writes them to out[0],
   * out[1]. Same stream as {@link sumOfDraws}.
   */
  sumsOfDraws(a: ArrayLike<number>, b: ArrayLike<number>, count: number, out: Float64Array): void {
    const idx = this.draws(a.length, count);
    let sa = 0, sb = 0;
    for (let i = 0; i < count; i++) {
      const j = idx[i];
      sa += a[j];
      sb += b[j];
    }
    out[0] = sa;
    out[1] = sb;
  }

  /**
   * Adds one to counts[j] for each of `count` indices j drawn uniformly with replacement
   * from [0, counts.length) (the caller zeroes counts first). Same stream as
   * {@link sumOfDraws}; used for order statistics of a resample of a sorted sample.
   */
  countDraws(counts: Int32Array, count: number): void {
    // Fused like sumOfDraws: the bootstrap-of-the-median hot loop.
    const n = counts.length;
    if (n >= 2097152 || n <= 1) {
      for (let i = 0; i < count; i++) counts[this.int(n)]++;
      return;
    }
    let s0 = this.s0, s1 = this.s1, s2 = this.s2, s3 = this.s3;
    const threshold = (TWO_POW_32 - n) % n;
    for (let i = 0; i < count; ) {
      const r = Math.imul(rotl(Math.imul(s1, 5), 7), 9) >>> 0;
      const x = s1 << 9;
      s2 ^= s0;
      s3 ^= s1;
      s1 ^= s2;
      s0 ^= s3;
      s2 ^= x;
      s3 = rotl(s3, 11);
      const prod = r * n;
      if (prod >>> 0 < threshold) continue;
      counts[(prod * 2.3283064365386963e-10) | 0]++;
      i++;
    }
    this.s0 = s0; this.s1 = s1; this.s2 = s2; this.s3 = s3;
  }

  /** Standard normal deviate (Marsaglia polar method), for simulations. */
  normal(): number {
    let u = 0, v = 0, s = 0;
    do {
      u = 2 * this.nextFloat() - 1;
      v = 2 * this.nextFloat() - 1;
      s = u * u + v * v;
    } while (s >= 1 || s === 0);
    return u * Math.sqrt((-2 * Math.log(s)) / s);
  }
}

function rotl(x: number, k: number): number {
  return (x << k) | (x >>> (32 - k));
}

/** In-place Fisher–Yates shuffle (Durstenfeld 1964) of a[lo, hi). */
export function shuffle(a: { [i: number]: number; length: number }, rng: Rng, lo = 0, hi = a.length): void {
  for (let i = hi - 1; i > lo; i--) {
    const j = lo + rng.int(i - lo + 1);
    const t = a[i];
    a[i] = a[j];
    a[j] = t;
  }
}
