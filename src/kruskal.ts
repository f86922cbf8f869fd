/**
 * Kruskal–Wallis test of k independent samples on mid-ranks (Kruskal & Wallis 1952).
 *
 * With R_g the rank sum and n_g the size of group g, n = Σ n_g, and Σ(t³ − t) over tie
 * groups of the pooled sample,
 *
 *   H = [12 / (n(n + 1)) · Σ_g R_g² / n_g − 3(n + 1)] / [1 − Σ(t³ − t) / (n³ − n)],
 *
 * referred to χ² with k − 1 df for the classical p. Under relabelling with fixed group
 * sizes, n, the tie structure and Σ R_g are fixed, so H is an increasing function of
 * Σ_g R_g² / n_g: the permutation test compares that quantity from the group rank sums.
 */
import { chiSquareUpper } from "./distributions";
import { canonicalRows } from "./groups";
import { PermutationOptions, PermutationResult, groupSumsTest } from "./permutation";
import { midranks, tieSum } from "./ranks";

/** Group sizes of codes 0..k−1; RangeError if fewer than two groups have observations. */
function groupSizes(codes: ArrayLike<number>, k: number): Float64Array {
  const sizes = new Float64Array(k);
  for (let i = 0; i < codes.length; i++) {
    const c = codes[i];
    if (!(Number.isInteger(c) && c >= 0 && c < k)) throw new RangeError(`group code ${i + 1} is outside 0..${k - 1}`);
    sizes[c]++;
  }
  let used = 0;
  for (let g = 0; g < k; g++) if (sizes[g] > 0) used++;
  if (used < 2) throw new RangeError("the rank test needs at least two groups with values");
  return sizes;
}

/** Pieces of H shared by the classical and the permutation test. */
function layout(values: ArrayLike<number>, codes: ArrayLike<number>, k: number) {
  if (values.length !== codes.length) throw new RangeError("values and group codes differ in length");
  const n = values.length;
  const sizes = groupSizes(codes, k);
  const ranks = midranks(values);
  const correction = 1 - tieSum(values) / (n * n * n - n);
  if (!(correction > 0)) throw new RangeError("all values are equal, so the rank test has nothing to compare");
  const inv = sizes.map((s) => (s > 0 ? 1 / s : 0));
  /** Σ_g R_g² / n_g from the group rank sums (monotone in H). */
  const between = (sums: Float64Array): number => {
    let q = 0;
    for (let g = 0; g < k; g++) q += sums[g] * sums[g] * inv[g];
    return q;
  };
  /** H from Σ_g R_g² / n_g (affine). */
  const fromBetween = (q: number): number => Math.max(0, ((12 / (n * (n + 1))) * q - 3 * (n + 1)) / correction);
  const h = (sums: Float64Array): number => fromBetween(between(sums));
  return { n, sizes, ranks, between, fromBetween, h };
}

/**
 * Kruskal–Wallis H with the tie correction, df = (groups with values) − 1, and the
 * χ² p-value (Kruskal & Wallis 1952). Throws a RangeError when fewer than two groups
 * have values or when all values are equal.
 */
export function kruskalWallis(values: ArrayLike<number>, codes: ArrayLike<number>, k: number): { h: number; df: number; p: number } {
  const { sizes, ranks, h } = layout(values, codes, k);
  const sums = new Float64Array(k);
  for (let i = 0; i < codes.length; i++) sums[codes[i]] += ranks[i];
  let used = 0;
  for (let g = 0; g < k; g++) if (sizes[g] > 0) used++;
  const stat = h(sums);
  const df = used - 1;
  return { h: stat, df, p: chiSquareUpper(stat, df) };
}

/**
 * Permutation Kruskal–Wallis test: group labels are shuffled with sizes fixed, and
 * p = share of relabellings with H at least the observed H (direction is always
 * "greater"; ties with the observed value count). Exact enumeration of the distinct
 * labellings when there are at most `resamples` of them, else Monte Carlo with
 * p = (b + 1)/(m + 1). H depends on the data only through the rank sums, so each
 * relabelling costs O(n) (random partition) — see groupSumsTest.
 * Kruskal & Wallis (1952); permutation form as in Pitman (1937).
 */
export function permutationKW(
  values: ArrayLike<number>,
  codes: ArrayLike<number>,
  k: number,
  options: PermutationOptions = {},
): PermutationResult & { h: number } {
  const { ranks, between, fromBetween, h } = layout(values, codes, k);
  // Rows in canonical order, so the Monte Carlo p does not depend on the order of the rows.
  const rows = canonicalRows(ranks, codes);
  const result = groupSumsTest(rows.values, rows.codes, k, between, { ...options, direction: "greater" });
  const obs = new Float64Array(k);
  for (let i = 0; i < codes.length; i++) obs[codes[i]] += ranks[i];
  const hObs = h(obs);
  const nullDistribution = result.nullDistribution?.map(fromBetween);
  return { ...result, statistic: hObs, h: hObs, nullDistribution };
}
