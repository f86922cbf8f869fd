/**
 * Two-sample permutation tests: difference of means, difference of medians, Welch t.
 *
 * The pooled n = n₁ + n₂ observations are split at random into groups of the observed
 * sizes (Fisher 1935; Pitman 1937). Every statistic is updated in O(n) per split:
 *  - mean: through the first group's sum only (n₂S₁ − n₁S₂ = n₁n₂(x̄ − ȳ) is compared, on
 *    values shifted by their minimum, which is exact for values within a factor of two
 *    of it (Sterbenz 1974), so sums keep the digits that separate splits and integer
 *    data stay exact);
 *  - median: the pooled values are sorted once; one pass over the sorted order with the
 *    split's labels finds both medians;
 *  - Welch t = (x̄ − ȳ) / √(s₁²/n₁ + s₂²/n₂) from each group's sum and sum of squares:
 *    the studentized permutation test, which keeps its level asymptotically when the
 *    two variances differ (Janssen 1997), unlike the raw difference.
 * Exact enumeration of the C(n, n₁) splits when they are at most the resamples;
 * otherwise Monte Carlo with p = (b + 1)/(m + 1) (Phipson & Smyth 2010). Two-sided
 * compares |statistic| with |observed|; "greater" means x larger than y.
 */
import { GroupScheme, PermutationOptions, PermutationResult, groupSumsTest, permutationTest } from "./permutation";

export type TwoSampleStatistic = "mean" | "median" | "t";

/**
 * Permutation test of x against y. `estimate` (= `statistic`) is the observed
 * mean(x) − mean(y), median(x) − median(y), or Welch t. Welch t is ±Infinity when both
 * samples are constant and their means differ, 0 when all values are equal; it needs
 * at least two values in each sample. `nullDistribution` (when kept) is on the same scale.
 * Fisher (1935); Pitman (1937); Janssen (1997) for Welch t.
 */
export function twoSampleTest(
  x: ArrayLike<number>,
  y: ArrayLike<number>,
  options: PermutationOptions & { statistic?: TwoSampleStatistic } = {},
): PermutationResult & { estimate: number } {
  const n1 = x.length;
  const n2 = y.length;
  if (n1 < 1 || n2 < 1) throw new RangeError("each sample needs at least one value");
  const statistic = options.statistic ?? "mean";
  for (let i = 0; i < n1; i++) if (!Number.isFinite(x[i])) throw new RangeError(`value ${i + 1} of the first sample is not a finite number`);
  for (let i = 0; i < n2; i++) if (!Number.isFinite(y[i])) throw new RangeError(`value ${i + 1} of the second sample is not a finite number`);
  // Each sample sorted: a canonical layout, so results do not depend on row order.
  const pooled = new Float64Array(n1 + n2);
  pooled.set(Float64Array.from(x).sort(), 0);
  pooled.set(Float64Array.from(y).sort(), n1);
  const codes = new Int32Array(n1 + n2);
  codes.fill(1, n1);
  switch (statistic) {
    case "mean":
      return meanTest(pooled, codes, n1, n2, options);
    case "median":
      return medianTest(pooled, codes, n1, n2, options);
    case "t":
      if (n1 < 2 || n2 < 2) throw new RangeError("Welch t needs at least two values in each sample");
      return welchTest(pooled, codes, n1, n2, options);
    default:
      throw new RangeError(`unknown two-sample statistic "${statistic as string}"`);
  }
}

/** Difference of means, compared as n₂S₁ − n₁S₂ on values shifted by their minimum. */
function meanTest(
  pooled: Float64Array,
  codes: Int32Array,
  n1: number,
  n2: number,
  options: PermutationOptions,
): PermutationResult & { estimate: number } {
  // Shifting by a data value keeps sums small (and exact for integers) without changing
  // the difference; the sum over all values is then a small number too.
  const shift = minimum(pooled);
  const shifted = pooled.map((v) => v - shift);
  // The terms n₂S₁ and n₁S₂ are at most max(n₁, n₂)·ΣShifted: the scale of the rounding
  // noise, so a zero difference ties with zero.
  let total = 0;
  for (let i = 0; i < shifted.length; i++) total += shifted[i];
  const r = groupSumsTest(shifted, codes, 2, (s) => n2 * s[0] - n1 * s[1], options, Math.max(n1, n2) * total);
  const scale = 1 / (n1 * n2);
  let sx = 0, sy = 0;
  for (let i = 0; i < n1; i++) sx += pooled[i];
  for (let i = n1; i < n1 + n2; i++) sy += pooled[i];
  const estimate = sx / n1 - sy / n2;
  const nullDistribution = r.nullDistribution?.map((t) => t * scale);
  return { ...r, statistic: estimate, estimate, nullDistribution };
}

/** Difference of medians: one pass over the pooled sorted order per split. */
function medianTest(
  pooled: Float64Array,
  codes: Int32Array,
  n1: number,
  n2: number,
  options: PermutationOptions,
): PermutationResult & { estimate: number } {
  const n = n1 + n2;
  const order = Int32Array.from({ length: n }, (_, i) => i);
  order.sort((a, b) => pooled[a] - pooled[b] || codes[a] - codes[b]);
  // Shifted by the minimum, as for the mean: the midpoints keep the digits that separate
  // splits, and the range is the scale of their rounding noise.
  const shift = minimum(pooled);
  const v = Float64Array.from(order, (i) => pooled[i] - shift);
  const scheme = new GroupScheme(Int32Array.from(order, (i) => codes[i]));
  const lo1 = (n1 - 1) >> 1, hi1 = n1 >> 1;
  const lo2 = (n2 - 1) >> 1, hi2 = n2 >> 1;
  const stat = () => {
    const lab = scheme.labels;
    let c1 = 0, c2 = 0;
    let a1 = 0, b1 = 0, a2 = 0, b2 = 0;
    // Stops once both medians are found (at the latest at the last value).
    for (let r = 0; r < n; r++) {
      const x = v[r];
      if (lab[r] === 0) {
        if (c1 === lo1) a1 = x;
        if (c1 === hi1) {
          b1 = x;
          if (c2 > hi2) break;
        }
        c1++;
      } else {
        if (c2 === lo2) a2 = x;
        if (c2 === hi2) {
          b2 = x;
          if (c1 > hi1) break;
        }
        c2++;
      }
    }
    return (a1 + b1) / 2 - (a2 + b2) / 2;
  };
  const r = permutationTest(scheme, stat, options, v[n - 1]);
  return { ...r, estimate: r.statistic };
}

/** Welch t from each group's sum and sum of squares (values centred on the pooled mean). */
function welchTest(
  pooled: Float64Array,
  codes: Int32Array,
  n1: number,
  n2: number,
  options: PermutationOptions,
): PermutationResult & { estimate: number } {
  const n = n1 + n2;
  let mean = 0;
  for (let i = 0; i < n; i++) mean += pooled[i];
  mean /= n;
  const v = pooled.map((x) => x - mean);
  const scheme = new GroupScheme(codes);
  const stat = () => {
    const lab = scheme.labels;
    let s1 = 0, q1 = 0, s2 = 0, q2 = 0;
    for (let i = 0; i < n; i++) {
      const x = v[i];
      if (lab[i] === 0) {
        s1 += x;
        q1 += x * x;
      } else {
        s2 += x;
        q2 += x * x;
      }
    }
    return welchT(s1, q1, n1, s2, q2, n2);
  };
  // Compare a finite stand-in for ±Infinity so the tie rule never meets Infinity − Infinity.
  const finite = () => {
    const t = stat();
    return t === Infinity ? Number.MAX_VALUE : t === -Infinity ? -Number.MAX_VALUE : t;
  };
  const r = permutationTest(scheme, finite, options);
  const estimate = fromFinite(r.statistic);
  const nullDistribution = r.nullDistribution?.map(fromFinite);
  return { ...r, statistic: estimate, estimate, nullDistribution };
}

function fromFinite(t: number): number {
  return t === Number.MAX_VALUE ? Infinity : t === -Number.MAX_VALUE ? -Infinity : t;
}

/**
 * Welch (1947) t from sums and sums of squares of two groups:
 * t = (S₁/n₁ − S₂/n₂) / √(s₁²/n₁ + s₂²/n₂), s² = (Q − S²/n)/(n − 1).
 * ±Infinity when both variances are 0 and the means differ; 0 when nothing differs.
 */
export function welchT(s1: number, q1: number, n1: number, s2: number, q2: number, n2: number): number {
  const m1 = s1 / n1, m2 = s2 / n2;
  const v1 = Math.max(0, q1 - s1 * m1) / (n1 - 1);
  const v2 = Math.max(0, q2 - s2 * m2) / (n2 - 1);
  const se2 = v1 / n1 + v2 / n2;
  const diff = m1 - m2;
  if (se2 > 0) return diff / Math.sqrt(se2);
  return diff > 0 ? Infinity : diff < 0 ? -Infinity : 0;
}

function minimum(a: Float64Array): number {
  let m = Infinity;
  for (let i = 0; i < a.length; i++) if (a[i] < m) m = a[i];
  return m;
}
