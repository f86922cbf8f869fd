/**
 * Counting and enumerating relabellings.
 */

/**
 * Number of distinct arrangements of a multiset with the given multiplicities,
 * n! / (n1! n2! … nk!), computed as a product of binomial coefficients. Returns
 * Infinity as soon as the count exceeds `cap` (default 2^53), so callers can compare it
 * with the requested resamples without overflow.
 * Multinomial coefficient as a product of binomials (Knuth 1997, TAOCP 1, §1.2.6).
 */
export function multinomialCount(sizes: ArrayLike<number>, cap = 9007199254740992): number {
  let total = 0;
  let count = 1;
  for (let g = 0; g < sizes.length; g++) {
    const k = sizes[g];
    for (let i = 1; i <= k; i++) {
      total++;
      count = (count * total) / i; // running C(total, i) times earlier factors
      if (count > cap) return Infinity;
    }
  }
  return Math.round(count);
}

/** Binomial coefficient C(n, k) as a double (exact while below 2^53).
 * Multiplicative formula (Knuth 1997, TAOCP 1, §1.2.6).
 */
export function binomial(n: number, k: number): number {
  if (k < 0 || k > n) return 0;
  k = Math.min(k, n - k);
  let c = 1;
  for (let i = 1; i <= k; i++) c = (c * (n - k + i)) / i;
  return Math.round(c);
}

/**
 * Advances a[lo, hi) to the next lexicographic permutation of its multiset of values
 * (Knuth, TAOCP 4A, Algorithm L). Returns false, leaving the segment sorted ascending,
 * after the last permutation. Starting from sorted order, it visits every distinct
 * arrangement exactly once.
 */
export function nextPermutation(a: Int32Array, lo = 0, hi = a.length): boolean {
  let i = hi - 2;
  while (i >= lo && a[i] >= a[i + 1]) i--;
  if (i < lo) {
    reverse(a, lo, hi - 1);
    return false;
  }
  let j = hi - 1;
  while (a[j] <= a[i]) j--;
  const t = a[i];
  a[i] = a[j];
  a[j] = t;
  reverse(a, i + 1, hi - 1);
  return true;
}

function reverse(a: Int32Array, i: number, j: number): void {
  while (i < j) {
    const t = a[i];
    a[i] = a[j];
    a[j] = t;
    i++;
    j--;
  }
}
