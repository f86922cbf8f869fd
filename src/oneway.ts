/**
 * One-way layout: the F statistic and its O(n) update per relabelling.
 *
 * F = [SSB / (k − 1)] / [(SST − SSB) / (n − k)], SSB = Σ_g S_g² / n_g − S² / n
 * (Fisher 1925). Under relabelling with fixed group sizes, n, k, S and SST do not
 * change, so F is an increasing function of SSB: the permutation test compares SSB
 * (no division by a residual that may be 0).
 */
import { PermutationOptions, PermutationResult, groupSumsTest } from "./permutation";

/**
 * Precomputed one-way layout for repeated evaluation under relabelling. Values are
 * centred on their mean first, so SSB = Σ_g S_g²/n_g of the centred values, free of the
 * cancellation in Σ S_g²/n_g − S²/n when the data sit far from 0.
 * Fisher (1925).
 */
export class OneWayF {
  /** Values minus their mean. */
  readonly centred: Float64Array;
  private readonly invSizes: Float64Array;
  private readonly sums: Float64Array;
  readonly n: number;
  readonly k: number;
  readonly sst: number;

  constructor(values: ArrayLike<number>, codes: ArrayLike<number>, k: number) {
    this.n = values.length;
    this.k = k;
    if (codes.length !== this.n) throw new RangeError(`values and group codes differ in length (${this.n} and ${codes.length})`);
    let s = 0;
    let min = Infinity;
    let max = -Infinity;
    for (let i = 0; i < this.n; i++) {
      const v = values[i];
      if (!Number.isFinite(v)) throw new RangeError(`value ${i + 1} is not a finite number`);
      const c = codes[i];
      if (!(Number.isInteger(c) && c >= 0 && c < k)) throw new RangeError(`group code ${i + 1} is outside 0..${k - 1}`);
      s += v;
      if (v < min) min = v;
      if (v > max) max = v;
    }
    // Equal values centre to exactly 0 (their rounded mean may miss the value by an ulp,
    // which would leave SST tiny but positive and F = Infinity).
    const mean = min === max ? min : s / this.n;
    this.centred = Float64Array.from(values, (v) => v - mean);
    const sizes = new Float64Array(k);
    for (let i = 0; i < codes.length; i++) sizes[codes[i]]++;
    this.invSizes = sizes.map((c) => (c > 0 ? 1 / c : 0));
    this.sums = new Float64Array(k);
    let ss = 0;
    for (let i = 0; i < this.n; i++) ss += this.centred[i] * this.centred[i];
    this.sst = ss;
  }

  /** Between-group sum of squares Σ_g n_g (ȳ_g − ȳ)² for the labelling; O(n + k). */
  ssb(codes: ArrayLike<number>): number {
    const sums = this.sums;
    sums.fill(0);
    const v = this.centred;
    for (let i = 0; i < this.n; i++) sums[codes[i]] += v[i];
    return this.ssbFromSums(sums);
  }

  /** SSB from the group sums of the centred values. */
  ssbFromSums(sums: ArrayLike<number>): number {
    let q = 0;
    for (let g = 0; g < this.k; g++) q += sums[g] * sums[g] * this.invSizes[g];
    return Math.min(q, this.sst);
  }

  /** F ratio for the labelling (Infinity when the within-group spread is 0). */
  f(codes: ArrayLike<number>): number {
    return fFromSS(this.ssb(codes), this.sst, this.n, this.k);
  }
}

/**
 * F = [SSB/(k−1)] / [(SST−SSB)/(n−k)] (Fisher 1925); Infinity when SSW is 0 (relative to
 * SST) but SSB > 0, and NaN (0/0) when SSB and SSW are both 0, i.e. all values are equal:
 * callers report that case themselves (see {@link permutationF}).
 */
export function fFromSS(ssb: number, sst: number, n: number, k: number): number {
  const ssw = sst - ssb;
  if (ssw <= 1e-12 * sst) return ssb > 0 ? Infinity : NaN;
  return ssb / (k - 1) / (ssw / (n - k));
}

/**
 * Permutation test of the one-way F (Fisher 1935; Pitman 1937): labels are shuffled
 * with group sizes fixed; p = share of relabellings with F at least the observed F
 * (compared through SSB, direction "greater"). Needs two groups with values and finite
 * values (RangeError otherwise). When all values are equal nothing varies: F is
 * reported as 0 (as for blocks and PERMANOVA) and p = 1, never NaN.
 */
export function permutationF(
  values: ArrayLike<number>,
  codes: ArrayLike<number>,
  k: number,
  options: PermutationOptions = {},
): PermutationResult & { f: number } {
  const layout = new OneWayF(values, codes, k);
  const sizes = new Int32Array(k);
  for (let i = 0; i < codes.length; i++) sizes[codes[i]]++;
  if (sizes.filter((m) => m > 0).length < 2) throw new RangeError("the F test needs at least two groups with values");
  // Rows are laid out in their given order (a canonical order, as the rank tests use,
  // would change the Monte Carlo draws of published results blocks); exact p does not
  // depend on row order, the Monte Carlo p only in law.
  const result = groupSumsTest(layout.centred, codes, k, (sums) => layout.ssbFromSums(sums), { ...options, direction: "greater" }, layout.sst);
  const toF = (q: number) => (layout.sst > 0 ? fFromSS(q, layout.sst, layout.n, k) : 0);
  const nullDistribution = result.nullDistribution?.map(toF);
  const f = toF(layout.ssb(codes));
  return { ...result, statistic: f, f, nullDistribution };
}
