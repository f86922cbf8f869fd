/**
 * One-way layout: the F statistic and its O(n) update per relabelling.
 *
 * F = [SSB / (k − 1)] / [(SST − SSB) / (n − k)], SSB = Σ_g S_g² / n_g − S² / n
 * (Fisher 1925). Under relabelling with fixed group sizes, n, k, S and SST do not
 * change, so F is an increasing function of Σ_g S_g² / n_g: the permutation test
 * compares that quantity (no division by a residual that may be 0).
 */
import { PermutationOptions, PermutationResult, groupSumsTest } from "./permutation";

/** Precomputed one-way layout for repeated evaluation under relabelling. */
export class OneWayF {
  private readonly values: Float64Array;
  private readonly invSizes: Float64Array;
  private readonly sums: Float64Array;
  readonly n: number;
  readonly k: number;
  readonly grandSum: number;
  readonly sst: number;

  constructor(values: ArrayLike<number>, codes: ArrayLike<number>, k: number) {
    this.values = Float64Array.from(values);
    this.n = values.length;
    this.k = k;
    const sizes = new Float64Array(k);
    for (let i = 0; i < codes.length; i++) sizes[codes[i]]++;
    this.invSizes = sizes.map((s) => (s > 0 ? 1 / s : 0));
    this.sums = new Float64Array(k);
    let s = 0;
    for (let i = 0; i < this.n; i++) s += this.values[i];
    this.grandSum = s;
    const mean = s / this.n;
    let ss = 0;
    for (let i = 0; i < this.n; i++) ss += (this.values[i] - mean) ** 2;
    this.sst = ss;
  }

  /** Σ_g S_g² / n_g for the labelling (monotone in F); O(n + k). */
  between(codes: ArrayLike<number>): number {
    const sums = this.sums;
    sums.fill(0);
    const v = this.values;
    for (let i = 0; i < this.n; i++) sums[codes[i]] += v[i];
    let q = 0;
    for (let g = 0; g < this.k; g++) q += sums[g] * sums[g] * this.invSizes[g];
    return q;
  }

  /** Between-group sum of squares for the labelling. */
  ssb(codes: ArrayLike<number>): number {
    return Math.max(0, this.between(codes) - (this.grandSum * this.grandSum) / this.n);
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
  const inv = new Float64Array(k);
  for (let i = 0; i < codes.length; i++) inv[codes[i]]++;
  for (let g = 0; g < k; g++) inv[g] = 1 / inv[g];
  const between = (sums: Float64Array) => {
    let q = 0;
    for (let g = 0; g < k; g++) q += sums[g] * sums[g] * inv[g];
    return q;
  };
  const result = groupSumsTest(values, codes, k, between, { ...options, direction: "greater" });
  const c = (layout.grandSum * layout.grandSum) / layout.n;
  const nullDistribution = result.nullDistribution?.map((q) => fFromSS(Math.max(0, q - c), layout.sst, layout.n, k));
  const f = layout.f(codes);
  return { ...result, statistic: f, f, nullDistribution };
}
