/**
 * Exact null distributions of the rank-sum and signed-rank statistics without ties, by
 * counting recursions on generating functions, and their p-values.
 *
 * Rank sum: U = W − n₁(n₁ + 1)/2 takes the value u in as many ways as there are
 * partitions of u into at most n₁ parts each at most n₂ (Mann & Whitney 1947), whose
 * generating function is the Gaussian binomial coefficient
 *   Σ_u c(u) qᵘ = Π_{i=1..a} (1 − q^{b+i}) / (1 − q^i),   a = min(n₁, n₂), b = max(n₁, n₂).
 * Multiplying by (1 − q^{b+i}) and dividing by (1 − q^i) are one O(degree) pass each
 * (Harding 1984), and coefficient u depends only on lower ones, so P(U ≤ t) costs
 * O(a · t) with t ≤ n₁n₂/2 (symmetry gives the upper tail): at most O(n₁ · n₂ · min(n₁, n₂)).
 * After step i the array holds the coefficients of [b+i choose i]_q, never larger than
 * the final ones, so while C(n₁ + n₂, n₁) < 2^53 every count is an exact integer;
 * beyond, each step is rescaled by i/(b + i) so the array holds probabilities.
 *
 * Signed rank: V = Σ ranks of the positive differences has generating function
 * Π_{i=1..n} (1 + qⁱ)/2 (Wilcoxon 1945); P(V ≤ t) in O(n · t), t ≤ n(n + 1)/4. Halving is
 * exact in binary floating point, so the probabilities are exact while 2ⁿ < 2^53.
 *
 * Both null distributions are symmetric about their means, so two-sided
 * p = P(|S − μ| ≥ |s − μ|) = min(1, 2 · P(S ≤ min(s, max − s))), the same as doubling
 * the smaller one-sided p.
 */
import type { Direction, PermutationResult } from "./permutation";
import { binomial } from "./combinatorics";

/**
 * The p-values every rank test reports: exact from the counting recursions without
 * ties (Mann & Whitney 1947; Wilcoxon 1945), by permutation of the mid-ranks otherwise,
 * and the tie-corrected normal approximation z (no continuity correction).
 */
export interface RankTestPValues {
  /** Exact p from the null distribution when there are no ties; null with ties or beyond the exact work limit. */
  pExact: number | null;
  /** Permutation p of the mid-ranks (with the rank statistic as its statistic) whenever pExact is null; else null. */
  pPermutation: PermutationResult | null;
  /** Normal approximation p with tie correction, no continuity correction. */
  pNormal: number;
  /** (statistic − its null mean) / its null SD. */
  z: number;
  direction: Direction;
}

/** Largest a · t (steps of the recursions) done exactly; beyond, callers fall back to resampling. */
export const EXACT_WORK_LIMIT = 5e7;

/** P(U ≤ t) for the Mann–Whitney U of sizes n1, n2 without ties, t ≤ n1·n2/2 (direct sum). */
function rankSumLowerDirect(n1: number, n2: number, t: number): number {
  const a = Math.min(n1, n2);
  const b = Math.max(n1, n2);
  const total = binomial(a + b, a);
  const counts = total < 9007199254740992;
  const c = new Float64Array(t + 1);
  c[0] = 1;
  for (let i = 1; i <= a; i++) {
    const shift = b + i;
    for (let u = t; u >= shift; u--) c[u] -= c[u - shift];
    for (let u = i; u <= t; u++) c[u] += c[u - i];
    if (!counts) {
      const s = i / (b + i);
      for (let u = 0; u <= t; u++) c[u] *= s;
    }
  }
  let sum = 0;
  for (let u = 0; u <= t; u++) sum += c[u];
  return counts ? sum / total : sum;
}

/** P(V ≤ t) for the signed-rank V of n nonzero differences without ties, t ≤ n(n+1)/4. */
function signedRankLowerDirect(n: number, t: number): number {
  const c = new Float64Array(t + 1);
  c[0] = 1;
  for (let i = 1; i <= n; i++) {
    const top = Math.min(t, (i * (i + 1)) / 2);
    for (let u = top; u >= i; u--) c[u] = 0.5 * (c[u] + c[u - i]);
    for (let u = Math.min(i - 1, top); u >= 0; u--) c[u] *= 0.5;
  }
  let sum = 0;
  for (let u = 0; u <= t; u++) sum += c[u];
  return sum;
}

/**
 * P(S ≤ t) for a statistic S on 0..max with a symmetric law, from a direct lower-tail sum
 * valid for t ≤ max/2 (the other side by symmetry, P(S ≤ t) = 1 − P(S ≤ max − t − 1)).
 */
function symmetricCdf(t: number, max: number, direct: (t: number) => number): number {
  if (t < 0) return 0;
  if (t >= max) return 1;
  if (2 * t <= max) return direct(t);
  return 1 - direct(max - t - 1);
}

/** Lower-tail point whose cdf the p-value needs (for the work estimate); −1 when no sum is needed. */
function tailPoint(s: number, max: number, direction: Direction): number {
  if (direction === "two-sided" && 2 * s === max) return -1;
  const t = direction === "greater" ? max - s : direction === "less" ? s : Math.min(s, max - s);
  return Math.min(t, max - t - 1);
}

/**
 * Exact p from a symmetric integer statistic s on 0..max (see the file comment). The
 * observed value itself always counts, so p > 0; a p below the double range (under
 * about 1e-308, reached only by huge, fully separated samples) is returned as the
 * smallest positive double rather than 0.
 */
function symmetricP(s: number, max: number, direction: Direction, direct: (t: number) => number): number {
  let p: number;
  if (direction === "greater") p = symmetricCdf(max - s, max, direct);
  else if (direction === "less") p = symmetricCdf(s, max, direct);
  else if (2 * s === max) p = 1;
  else p = Math.min(1, 2 * symmetricCdf(Math.min(s, max - s), max, direct));
  return Math.max(p, Number.MIN_VALUE);
}

/** True when the exact rank-sum p for this U would take at most EXACT_WORK_LIMIT steps. Harding (1984). */
export function rankSumExactFeasible(u: number, n1: number, n2: number, direction: Direction): boolean {
  return Math.min(n1, n2) * (tailPoint(u, n1 * n2, direction) + 1) <= EXACT_WORK_LIMIT;
}

/**
 * Exact p of the Mann–Whitney U = W − n1(n1+1)/2 (integer, no ties): "greater"
 * P(U ≥ u), "less" P(U ≤ u), two-sided P(|U − n1n2/2| ≥ |u − n1n2/2|)
 * (Mann & Whitney 1947; Harding 1984 for the recursion).
 */
export function rankSumExactP(u: number, n1: number, n2: number, direction: Direction): number {
  return symmetricP(u, n1 * n2, direction, (t) => rankSumLowerDirect(n1, n2, t));
}

/** P(U ≤ t) for the Mann–Whitney U of sizes n1, n2 (no ties). Mann & Whitney (1947); Harding (1984). */
export function rankSumCdf(t: number, n1: number, n2: number): number {
  return symmetricCdf(Math.floor(t), n1 * n2, (x) => rankSumLowerDirect(n1, n2, x));
}

/** True when the exact signed-rank p for this V would take at most EXACT_WORK_LIMIT steps. Wilcoxon (1945). */
export function signedRankExactFeasible(v: number, n: number, direction: Direction): boolean {
  return n * (tailPoint(v, (n * (n + 1)) / 2, direction) + 1) <= EXACT_WORK_LIMIT;
}

/**
 * Exact p of the signed-rank V (integer, no ties or zeros among the n differences):
 * "greater" P(V ≥ v), "less" P(V ≤ v), two-sided P(|V − n(n+1)/4| ≥ |v − n(n+1)/4|)
 * (Wilcoxon 1945).
 */
export function signedRankExactP(v: number, n: number, direction: Direction): number {
  return symmetricP(v, (n * (n + 1)) / 2, direction, (t) => signedRankLowerDirect(n, t));
}

/** P(V ≤ t) for the signed-rank V of n differences (no ties). Wilcoxon (1945). */
export function signedRankCdf(t: number, n: number): number {
  return symmetricCdf(Math.floor(t), (n * (n + 1)) / 2, (x) => signedRankLowerDirect(n, x));
}
