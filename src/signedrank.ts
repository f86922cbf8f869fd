/**
 * Wilcoxon signed-rank test on paired differences d (Wilcoxon 1945).
 *
 * Zero differences are dropped before ranking (Wilcoxon's 1945 convention; Pratt's 1959
 * variant, which ranks the zeros and then ignores their ranks, is not used). The n
 * remaining |d| are mid-ranked and V = Σ ranks of the positive d. Under the null of
 * symmetry about 0, V has mean n(n + 1)/4 and variance
 *   n(n + 1)(2n + 1)/24 − Σ(t³ − t)/48
 * over tie groups of |d| (Hollander & Wolfe 1973, Ch. 3). Direction "greater" means the
 * differences tend to be positive (large V).
 *
 * p-values:
 *  - exact (no ties among |d|): the counting recursion of src/rankdist.ts; two-sided uses
 *    |V − E V| (symmetric null: twice the smaller tail);
 *  - permutation (ties, or n too large for the exact recursion): sign flips of the
 *    signed mid-ranks (SignScheme) — all 2ⁿ when at most `resamples`, else Monte
 *    Carlo; two-sided uses |V − E V|;
 *  - normal approximation: z = (V − E V)/SD(V), tie-corrected, no continuity correction.
 */
import { normalPValue } from "./distributions";
import { Direction, PermutationOptions, PermutationResult, SignScheme, permutationTest } from "./permutation";
import { RankTestPValues, signedRankExactFeasible, signedRankExactP } from "./rankdist";
import { midranks, sortedCopy, tieSumSorted } from "./ranks";

export interface SignedRankResult extends RankTestPValues {
  /** Sum of the ranks of |d| over the positive differences. */
  v: number;
  /** Number of nonzero differences (those ranked). */
  n: number;
  /** Number of zero differences dropped. */
  zeros: number;
  /** True when some nonzero |d| are tied. */
  ties: boolean;
  /** (V − E V) / SD(V). */
  z: number;
}

/**
 * Wilcoxon signed-rank test of the differences d (see the file comment). Throws a
 * RangeError when every difference is zero.
 * Wilcoxon (1945); Hollander & Wolfe (1973), ch. 3.
 */
export function signedRankTest(d: ArrayLike<number>, options: PermutationOptions = {}): SignedRankResult {
  const direction = options.direction ?? "two-sided";
  let n = 0;
  for (let i = 0; i < d.length; i++) {
    if (d[i] !== d[i]) throw new RangeError("a difference is not a number");
    if (d[i] !== 0) n++;
  }
  const zeros = d.length - n;
  if (n === 0) throw new RangeError("every difference is zero, so the signed-rank test has nothing to test");
  const abs = new Float64Array(n);
  const positive = new Uint8Array(n);
  for (let i = 0, j = 0; i < d.length; i++) {
    if (d[i] === 0) continue;
    abs[j] = Math.abs(d[i]);
    positive[j] = d[i] > 0 ? 1 : 0;
    j++;
  }
  const ranks = midranks(abs);
  const tieTotal = tieSumSorted(sortedCopy(abs));
  let v = 0;
  for (let i = 0; i < n; i++) if (positive[i]) v += ranks[i];
  const mean = (n * (n + 1)) / 4;
  const variance = (n * (n + 1) * (2 * n + 1)) / 24 - tieTotal / 48;
  const z = (v - mean) / Math.sqrt(variance);
  const pNormal = normalPValue(z, direction);
  const ties = tieTotal > 0;

  let pExact: number | null = null;
  let pPermutation: PermutationResult | null = null;
  if (!ties && signedRankExactFeasible(v, n, direction)) {
    pExact = signedRankExactP(v, n, direction);
  } else {
    // T = Σ s_i a_i with a_i = sign(d_i)·rank_i equals 2V − n(n+1)/2: centred at 0 under flips.
    const a = new Float64Array(n);
    for (let i = 0; i < n; i++) a[i] = positive[i] ? ranks[i] : -ranks[i];
    // Canonical order (by signed rank), so the Monte Carlo p does not depend on the order of the pairs.
    a.sort();
    const scheme = new SignScheme(n);
    const s = scheme.signs;
    const r = permutationTest(
      scheme,
      () => {
        let t = 0;
        for (let i = 0; i < n; i++) t += s[i] * a[i];
        return t;
      },
      { ...options, direction },
    );
    const half = (n * (n + 1)) / 4;
    pPermutation = { ...r, statistic: v, nullDistribution: r.nullDistribution?.map((t) => t / 2 + half) };
  }
  return { v, n, zeros, ties, pExact, pPermutation, pNormal, z, direction };
}
