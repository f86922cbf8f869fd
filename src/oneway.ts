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
    let s = 0;
    for (let i = 0; i < this.n; i++) s += values[i];
    const mean = s / this.n;
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

/** F = [SSB/(k−1)] / [(SST−SSB)/(n−k)]; Infinity when SSW is 0 (relative to SST) but SSB > 0. */
export function fFromSS(ssb: number, sst: number, n: number, k: number): number {
  const ssw = sst - ssb;
  if (ssw <= 1e-12 * sst) return ssb > 0 ? Infinity : NaN;
  return ssb / (k - 1) / (ssw / (n - k));
}

/**
 * Permutation test of the one-way F (Fisher 1935; Pitman 1937): labels are shuffled
 * with group sizes fixed; p = share of relabellings with F at least the observed F.
 */
export function permutationF(
  values: ArrayLike<number>,
  codes: ArrayLike<number>,
  k: number,
  options: PermutationOptions = {},
): PermutationResult & { f: number } {
  const layout = new OneWayF(values, codes, k);
  const result = groupSumsTest(layout.centred, codes, k, (sums) => layout.ssbFromSums(sums), { ...options, direction: "greater" });
  const nullDistribution = result.nullDistribution?.map((q) => fFromSS(q, layout.sst, layout.n, k));
  const f = layout.f(codes);
  return { ...result, statistic: f, f, nullDistribution };
}
