/**
 * Paired permutation test by sign flips (Fisher 1935, §21, on Darwin's Zea mays data).
 *
 * Under the null hypothesis the two members of each pair are exchangeable, so each
 * difference dᵢ = xᵢ − yᵢ is as likely to carry either sign. The statistic is the sum
 * S = Σ sᵢ dᵢ over sign vectors s (equivalent to the mean difference, n fixed), O(n)
 * per flip. A zero difference adds 0 whatever its sign, so only the m non-zero
 * differences are flipped: each of their 2^m sign vectors stands for 2^(n−m) equally
 * likely full vectors with the same S, and the p-value over the 2^m vectors equals the
 * one over all 2^n. Exact enumeration when 2^m ≤ resamples; otherwise Monte Carlo with
 * p = (b + 1)/(m + 1) (Phipson & Smyth 2010).
 */
import { PermutationOptions, PermutationResult, SignScheme, permutationTest } from "./permutation";

/**
 * Sign-flip test of the paired differences x − y. "greater" means x larger than y;
 * two-sided compares |S| with |S_obs|. `statistic` and `meanDifference` are the mean of
 * all n differences (zeros included); `nonZero` is the number of differences flipped,
 * and `resamples` counts sign vectors of those (2^nonZero when exact). With every
 * difference zero, the mean difference is 0 and p = 1.
 * Fisher (1935), §21.
 */
export function pairedTest(
  x: ArrayLike<number>,
  y: ArrayLike<number>,
  options: PermutationOptions = {},
): PermutationResult & { meanDifference: number; n: number; nonZero: number } {
  const n = x.length;
  if (y.length !== n) throw new RangeError(`the paired samples differ in length (${n} and ${y.length})`);
  if (n < 1) throw new RangeError("the paired test needs at least one pair");
  const nz: number[] = [];
  let sum = 0;
  for (let i = 0; i < n; i++) {
    if (!Number.isFinite(x[i]) || !Number.isFinite(y[i])) throw new RangeError(`pair ${i + 1} holds a value that is not a finite number`);
    const d = x[i] - y[i];
    sum += d;
    if (d !== 0) nz.push(d);
  }
  const meanDifference = sum / n;
  // Sorted by size (then sign): a canonical order, so results do not depend on the order
  // of the pairs, nor (barring a tie of +a with −a) on which sample comes first.
  const d = Float64Array.from(nz.sort((a, b) => Math.abs(a) - Math.abs(b) || a - b));
  const m = d.length;
  const scheme = new SignScheme(m);
  const signs = scheme.signs;
  const stat = () => {
    let s = 0;
    for (let i = 0; i < m; i++) s += signs[i] * d[i];
    return s;
  };
  // |S| ≤ Σ|dᵢ|: the scale of the rounding noise in S, so a zero sum is a tie with zero.
  let scale = 0;
  for (let i = 0; i < m; i++) scale += Math.abs(d[i]);
  const r = permutationTest(scheme, stat, options, scale);
  const nullDistribution = r.nullDistribution?.map((s) => s / n);
  return { ...r, statistic: meanDifference, meanDifference, n, nonZero: m, nullDistribution };
}
