/**
 * Multiplicity: adjusted p-values for a family of tests.
 *
 *  - Holm (1979) step-down: controls the familywise error rate under any dependence;
 *  - Benjamini & Hochberg (1995) step-up: controls the false discovery rate for
 *    independent or positively dependent tests;
 *  - Westfall & Young (1993) max-T step-down: familywise control that uses the joint
 *    permutation distribution of all test statistics (from the same relabellings), so
 *    it is less conservative than Holm when the tests are correlated.
 *
 * All adjusted p-values are monotone in the order of the raw evidence and capped at 1.
 */
import { TIE_TOLERANCE } from "./permutation";

function checkP(p: ArrayLike<number>): void {
  for (let i = 0; i < p.length; i++) {
    const v = p[i];
    if (!(v >= 0 && v <= 1)) throw new RangeError(`p-value ${i + 1} is not between 0 and 1 (got ${v})`);
  }
}

/** Indices of p sorted by p ascending (stable, so equal p keep their order). */
function orderAscending(p: ArrayLike<number>): number[] {
  return Array.from({ length: p.length }, (_, i) => i).sort((a, b) => p[a] - p[b] || a - b);
}

/**
 * Holm (1979) adjusted p-values: with p₍₁₎ ≤ … ≤ p₍m₎,
 * p̃₍ᵢ₎ = min(1, max_{j ≤ i} (m − j + 1)·p₍ⱼ₎). Returned in the input order.
 */
export function holm(p: ArrayLike<number>): Float64Array {
  checkP(p);
  const m = p.length;
  const order = orderAscending(p);
  const out = new Float64Array(m);
  let running = 0;
  for (let r = 0; r < m; r++) {
    const i = order[r];
    running = Math.max(running, Math.min(1, (m - r) * p[i]));
    out[i] = running;
  }
  return out;
}

/**
 * Benjamini–Hochberg (1995) adjusted p-values (q-values of the step-up procedure):
 * p̃₍ᵢ₎ = min(1, min_{j ≥ i} m·p₍ⱼ₎ / j). Returned in the input order.
 */
export function benjaminiHochberg(p: ArrayLike<number>): Float64Array {
  checkP(p);
  const m = p.length;
  const order = orderAscending(p);
  const out = new Float64Array(m);
  let running = 1;
  for (let r = m - 1; r >= 0; r--) {
    const i = order[r];
    running = Math.min(running, (m * p[i]) / (r + 1));
    out[i] = running;
  }
  return out;
}

/**
 * Westfall & Young (1993, Algorithm 2.8) max-T step-down adjusted p-values, accumulated
 * over relabellings. Hypotheses are ordered by their observed statistic tₒ (larger = more
 * extreme) as r₁ (largest) … r_m. For each relabelling with statistics t*, the successive
 * maxima q_j = max(t*_{r_j}, …, t*_{r_m}) are compared with t_{r_j}; the count of
 * q_j ≥ t_{r_j} (ties within a relative 1e-12 count) gives p̃_{r_j} = count / total when
 * every relabelling was visited (observed included) or (count + 1)/(B + 1) for B random
 * relabellings (Phipson & Smyth 2010); then p̃_{r_j} = max(p̃_{r_{j−1}}, p̃_{r_j}).
 * Each relabelling costs O(m).
 */
export class MaxTStepDown {
  private readonly order: Int32Array;
  private readonly thresholds: Float64Array;
  private readonly counts: Float64Array;
  private visited = 0;
  readonly m: number;

  /** `observed` holds each hypothesis's statistic (e.g. |t|), larger meaning stronger evidence. */
  constructor(observed: ArrayLike<number>) {
    this.m = observed.length;
    for (let i = 0; i < this.m; i++)
      if (observed[i] !== observed[i]) throw new RangeError(`statistic ${i + 1} is not a number`);
    const idx = Array.from({ length: this.m }, (_, i) => i).sort((a, b) => observed[b] - observed[a] || a - b);
    this.order = Int32Array.from(idx);
    this.thresholds = new Float64Array(this.m);
    for (let j = 0; j < this.m; j++) {
      const t = observed[idx[j]];
      // a relabelled value counts when it reaches t up to the relative tie tolerance
      this.thresholds[j] = t === Infinity ? Infinity : t - TIE_TOLERANCE * Math.abs(t);
    }
    this.counts = new Float64Array(this.m);
  }

  /** Adds one relabelling's statistics (same order and meaning as `observed`). */
  add(stats: ArrayLike<number>): void {
    const order = this.order;
    const th = this.thresholds;
    const counts = this.counts;
    let q = -Infinity;
    for (let j = this.m - 1; j >= 0; j--) {
      const t = stats[order[j]];
      if (t > q) q = t;
      if (q >= th[j]) counts[j]++;
    }
    this.visited++;
  }

  /** Number of relabellings added so far. */
  get count(): number {
    return this.visited;
  }

  /** Adjusted p-values in the input order; `exact` when every relabelling (observed included) was added. */
  adjusted(exact: boolean): Float64Array {
    const out = new Float64Array(this.m);
    const B = this.visited;
    let running = 0;
    for (let j = 0; j < this.m; j++) {
      const c = this.counts[j];
      const p = exact ? c / B : (c + 1) / (B + 1);
      running = Math.max(running, Math.min(1, p));
      out[this.order[j]] = running;
    }
    return out;
  }
}
