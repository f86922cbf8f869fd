/**
 * Ranks with ties: mid-ranks (average ranks) and the tie counts used by the tie
 * corrections of rank tests.
 *
 * Mid-ranks: the observations are sorted; a run of t equal values occupying sorted
 * positions i+1 … i+t (1-based) all receive the average rank i + (t + 1)/2 (Kendall
 * 1945). Rank sums, and therefore every rank statistic, are
 * the same as with any other tie-breaking followed by averaging.
 *
 * Tie correction: tests built on the variance of rank sums replace n³ − n by
 * n³ − n − Σ (t³ − t) over tie groups (Kruskal & Wallis 1952; Friedman 1937; the
 * signed-rank variance uses Σ (t³ − t)/48).
 *
 * Values must be numbers other than NaN (±Infinity is ranked like any other value);
 * a NaN raises a RangeError, since it has no place in an order.
 */

/**
 * Sorted copy of the values (ascending, native numeric sort); O(n log n). Throws a
 * RangeError on NaN.
 * (Helper, no statistical method.)
 */
export function sortedCopy(x: ArrayLike<number>): Float64Array {
  const s = Float64Array.from(x as ArrayLike<number>);
  for (let i = 0; i < s.length; i++) if (s[i] !== s[i]) throw new RangeError("a value to rank is not a number");
  s.sort();
  return s;
}

/** First index in sorted[lo, hi) whose value is not below v (v itself in the array). */
function lowerBound(sorted: Float64Array, v: number): number {
  let lo = 0;
  let hi = sorted.length;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (sorted[mid] < v) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

/** First index in sorted whose value is above v. */
function upperBound(sorted: Float64Array, v: number): number {
  let lo = 0;
  let hi = sorted.length;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (sorted[mid] <= v) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

/**
 * Mid-ranks (1-based average ranks for ties) of x, in the input order; O(n log n):
 * one native sort, then two binary searches per observation. A value at sorted
 * positions lo … hi−1 (0-based) gets rank (lo + 1 + hi) / 2. −0 and +0 are equal.
 * Kendall (1945).
 */
export function midranks(x: ArrayLike<number>): Float64Array {
  const sorted = sortedCopy(x);
  const n = sorted.length;
  const r = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const v = x[i];
    r[i] = (lowerBound(sorted, v) + 1 + upperBound(sorted, v)) / 2;
  }
  return r;
}

/**
 * Sizes t of the tie groups (runs of equal values) with t ≥ 2, in ascending order of
 * the tied value; O(n log n).
 * Kruskal & Wallis (1952).
 */
export function tieGroups(x: ArrayLike<number>): number[] {
  return tieGroupsSorted(sortedCopy(x));
}

/** As {@link tieGroups}, for values already sorted ascending; O(n). Kruskal & Wallis (1952). */
export function tieGroupsSorted(sorted: ArrayLike<number>): number[] {
  const out: number[] = [];
  const n = sorted.length;
  let i = 0;
  while (i < n) {
    let j = i + 1;
    while (j < n && sorted[j] === sorted[i]) j++;
    if (j - i > 1) out.push(j - i);
    i = j;
  }
  return out;
}

/** Σ (t³ − t) over the tie groups of x (0 when there are no ties); O(n log n). Kruskal & Wallis (1952). */
export function tieSum(x: ArrayLike<number>): number {
  return tieSumSorted(sortedCopy(x));
}

/** As {@link tieSum}, for values already sorted ascending; O(n), no allocation. Kruskal & Wallis (1952). */
export function tieSumSorted(sorted: ArrayLike<number>): number {
  const n = sorted.length;
  let s = 0;
  let i = 0;
  while (i < n) {
    let j = i + 1;
    while (j < n && sorted[j] === sorted[i]) j++;
    const t = j - i;
    s += t * t * t - t;
    i = j;
  }
  return s;
}

/** True when at least two values of x are equal. (Helper, no statistical method.) */
export function hasTies(x: ArrayLike<number>): boolean {
  const s = sortedCopy(x);
  for (let i = 1; i < s.length; i++) if (s[i] === s[i - 1]) return true;
  return false;
}
