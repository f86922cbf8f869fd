/**
 * Wilcoxon rank-sum test of two independent samples (Wilcoxon 1945; Mann & Whitney 1947).
 *
 * Pool x (size n₁) and y (size n₂), n = n₁ + n₂, rank with mid-ranks; W = Σ ranks of x and
 * U = W − n₁(n₁ + 1)/2 (the number of pairs with x above y, ties counting ½). Under the
 * null W has mean n₁(n + 1)/2 and variance
 *   n₁n₂/12 · [(n + 1) − Σ(t³ − t) / (n(n − 1))]
 * (tie-corrected; Hollander & Wolfe 1973, Ch. 4). Direction "greater" means x tends to be
 * larger than y (large W).
 *
 * p-values:
 *  - exact (no ties): the counting recursion of src/rankdist.ts; two-sided uses
 *    |W − E W| (the null law is symmetric, so this equals twice the smaller tail);
 *  - permutation (ties, or samples too large for the exact recursion): the rank
 *    vector is relabelled with the sizes fixed — exact enumeration of the C(n, n₁)
 *    splits when at most `resamples`, else Monte Carlo; two-sided uses |W − E W|;
 *  - normal approximation: z = (W − E W)/SD(W), tie-corrected, no continuity correction.
 */
import { normalPValue } from "./distributions";
import { canonicalRows } from "./groups";
import { Direction, PermutationOptions, PermutationResult, groupSumsTest } from "./permutation";
import { RankTestPValues, rankSumExactFeasible, rankSumExactP } from "./rankdist";
import { midranks, sortedCopy, tieSumSorted } from "./ranks";

export interface RankSumResult extends RankTestPValues {
  /** Rank sum of x in the pooled sample (mid-ranks for ties). */
  w: number;
  /** Mann–Whitney U of x: W − n₁(n₁ + 1)/2. */
  u: number;
  n1: number;
  n2: number;
  /** True when the pooled sample has tied values. */
  ties: boolean;
  /** (W − E W) / SD(W). */
  z: number;
}

/**
 * Wilcoxon rank-sum / Mann–Whitney test of x against y (see the file comment for the
 * formulas). Throws a RangeError when a sample is empty or all values are equal.
 * Wilcoxon (1945); Mann & Whitney (1947); Hollander & Wolfe (1973), ch. 4.
 */
export function rankSumTest(x: ArrayLike<number>, y: ArrayLike<number>, options: PermutationOptions = {}): RankSumResult {
  const direction = options.direction ?? "two-sided";
  const n1 = x.length;
  const n2 = y.length;
  if (n1 < 1 || n2 < 1) throw new RangeError("the rank-sum test needs at least one value in each sample");
  const n = n1 + n2;
  const pooled = new Float64Array(n);
  for (let i = 0; i < n1; i++) pooled[i] = x[i];
  for (let i = 0; i < n2; i++) pooled[n1 + i] = y[i];
  const ranks = midranks(pooled);
  const tieTotal = tieSumSorted(sortedCopy(pooled));
  const variance = ((n1 * n2) / 12) * (n + 1 - tieTotal / (n * (n - 1)));
  if (!(variance > 0)) throw new RangeError("all values are equal, so the rank-sum test has nothing to compare");
  let w = 0;
  for (let i = 0; i < n1; i++) w += ranks[i];
  const mean = (n1 * (n + 1)) / 2;
  const u = w - (n1 * (n1 + 1)) / 2;
  const z = (w - mean) / Math.sqrt(variance);
  const ties = tieTotal > 0;
  const pNormal = normalPValue(z, direction);

  let pExact: number | null = null;
  let pPermutation: PermutationResult | null = null;
  if (!ties && rankSumExactFeasible(u, n1, n2, direction)) {
    pExact = rankSumExactP(u, n1, n2, direction);
  } else {
    const codes = new Int32Array(n);
    codes.fill(1, n1);
    // Rows in canonical order, so the Monte Carlo p does not depend on the order of the values.
    const rows = canonicalRows(ranks, codes);
    const r = groupSumsTest(rows.values, rows.codes, 2, (sums) => sums[0] - mean, { ...options, direction });
    pPermutation = { ...r, statistic: w, nullDistribution: r.nullDistribution?.map((d) => d + mean) };
  }
  return { w, u, n1, n2, ties, pExact, pPermutation, pNormal, z, direction };
}
