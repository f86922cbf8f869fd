/**
 * Descriptive summaries: n, mean, median, standard deviation, CV %, extremes and
 * quartiles, overall and per group, plus small allocation-light helpers (mean, sd,
 * median and trimmed mean by selection, quantiles) for the bootstrap.
 *
 * Conventions:
 *  - SD is the sample standard deviation with divisor n − 1, from two passes about the
 *    mean with the correction term of Chan, Golub & LeVeque (1983);
 *  - CV % = 100 · SD / mean (negative when the mean is negative), null when the mean is 0
 *    or SD is undefined;
 *  - quantiles are Hyndman & Fan's (1996) type 7: for p in [0, 1] and sorted x₍₁₎ … x₍ₙ₎,
 *    h = (n − 1)p, Q(p) = x₍⌊h⌋+1₎ + (h − ⌊h⌋)(x₍⌊h⌋+2₎ − x₍⌊h⌋+1₎); q1 = Q(0.25), q3 = Q(0.75);
 *  - the trimmed mean drops g = ⌊proportion · n⌋ values from each end (Tukey & McLaughlin
 *    1963; Wilcox 2012).
 * Summaries of an empty sample throw a RangeError; NaN inputs are the caller's to drop.
 */

export interface Description {
  n: number;
  mean: number;
  median: number;
  /** Sample SD (n − 1); null when n < 2. */
  sd: number | null;
  /** CV % = 100 · sd / mean; null when the mean is 0 or n < 2. */
  cv: number | null;
  min: number;
  max: number;
  /** Quartiles, Hyndman & Fan (1996) type 7. */
  q1: number;
  q3: number;
}

function requireValues(n: number): void {
  if (n < 1) throw new RangeError("there are no values to summarize");
}

/** Arithmetic mean Σx/n, with one refinement pass (mean + Σ(x − mean)/n).
 * The correction pass is the mean analogue of Chan, Golub & LeVeque (1983).
 */
export function mean(x: ArrayLike<number>): number {
  const n = x.length;
  requireValues(n);
  let s = 0;
  for (let i = 0; i < n; i++) s += x[i];
  const m = s / n;
  let r = 0;
  for (let i = 0; i < n; i++) r += x[i] - m;
  return m + r / n;
}

/**
 * Sample variance with divisor n − 1 by the corrected two-pass formula
 * [Σ(x − m)² − (Σ(x − m))²/n] / (n − 1) (Chan, Golub & LeVeque 1983); NaN when n < 2.
 */
export function variance(x: ArrayLike<number>, m: number = mean(x)): number {
  const n = x.length;
  if (n < 2) return NaN;
  let ss = 0;
  let s = 0;
  for (let i = 0; i < n; i++) {
    const e = x[i] - m;
    ss += e * e;
    s += e;
  }
  return Math.max(0, (ss - (s * s) / n) / (n - 1));
}

/** Sample standard deviation √variance (divisor n − 1); NaN when n < 2. Chan, Golub & LeVeque (1983). */
export function sd(x: ArrayLike<number>, m: number = mean(x)): number {
  return Math.sqrt(variance(x, m));
}

/**
 * Rearranges a[lo, hi) so that a[k] holds the value of rank k (0-based) in the segment,
 * smaller-or-equal values before it and larger-or-equal after (Hoare 1961, FIND, with a
 * median-of-three pivot). Expected O(hi − lo); falls back to sorting the remaining
 * segment after too many rounds, so the worst case is O(n log n).
 */
export function select(a: Float64Array, k: number, lo = 0, hi = a.length): number {
  let l = lo;
  let r = hi - 1;
  let budget = 2 * (32 - Math.clz32(hi - lo)) + 8;
  while (r > l) {
    if (budget-- === 0) {
      a.subarray(l, r + 1).sort();
      break;
    }
    const mid = (l + r) >>> 1;
    // median of three into a[mid]
    if (a[mid] < a[l]) swap(a, mid, l);
    if (a[r] < a[l]) swap(a, r, l);
    if (a[r] < a[mid]) swap(a, r, mid);
    const pivot = a[mid];
    let i = l;
    let j = r;
    while (i <= j) {
      while (a[i] < pivot) i++;
      while (a[j] > pivot) j--;
      if (i <= j) {
        swap(a, i, j);
        i++;
        j--;
      }
    }
    if (k <= j) r = j;
    else if (k >= i) l = i;
    else break;
  }
  return a[k];
}

function swap(a: Float64Array, i: number, j: number): void {
  const t = a[i];
  a[i] = a[j];
  a[j] = t;
}

/** Copies x into `scratch` (or a new array when it is missing or too short); returns the filled view. */
function copyInto(x: ArrayLike<number>, scratch?: Float64Array): Float64Array {
  const n = x.length;
  const buf = scratch && scratch.length >= n ? scratch.subarray(0, n) : new Float64Array(n);
  for (let i = 0; i < n; i++) buf[i] = x[i];
  return buf;
}

/**
 * Median by selection in O(n) expected time; pass a `scratch` array of length ≥ n to
 * avoid allocating (x itself is not changed).
 * Hoare (1961) selection.
 */
export function median(x: ArrayLike<number>, scratch?: Float64Array): number {
  const n = x.length;
  requireValues(n);
  const a = copyInto(x, scratch);
  return medianInPlace(a);
}

/** Median of a, reordering a in place (O(n) expected). Hoare (1961) selection. */
export function medianInPlace(a: Float64Array): number {
  const n = a.length;
  requireValues(n);
  const h = n >> 1;
  const upper = select(a, h);
  if (n % 2) return upper;
  // The largest value of the lower half a[0, h) is the other middle order statistic.
  let lower = a[0];
  for (let i = 1; i < h; i++) if (a[i] > lower) lower = a[i];
  return (lower + upper) / 2;
}

/** Type-7 quantile (Hyndman & Fan 1996) of values sorted ascending, p in [0, 1]. */
export function quantileSorted(sorted: ArrayLike<number>, p: number): number {
  const n = sorted.length;
  requireValues(n);
  if (!(p >= 0 && p <= 1)) throw new RangeError("a quantile level must lie between 0 and 1");
  const h = (n - 1) * p;
  const lo = Math.floor(h);
  if (lo >= n - 1) return sorted[n - 1];
  return sorted[lo] + (h - lo) * (sorted[lo + 1] - sorted[lo]);
}

/** Type-7 quantile of unsorted values (sorts a copy). Hyndman & Fan (1996). */
export function quantile(x: ArrayLike<number>, p: number): number {
  return quantileSorted(Float64Array.from(x as ArrayLike<number>).sort(), p);
}

/**
 * Trimmed mean: the mean after removing g = ⌊proportion · n⌋ of the smallest and of the
 * largest values (default proportion 0.1, i.e. the 10 % trimmed mean; Tukey & McLaughlin
 * 1963). Two selections, O(n) expected; `scratch` (length ≥ n) avoids allocation.
 */
export function trimmedMean(x: ArrayLike<number>, proportion = 0.1, scratch?: Float64Array): number {
  const n = x.length;
  requireValues(n);
  if (!(proportion >= 0 && proportion < 0.5)) throw new RangeError("the trimming proportion must be at least 0 and below 0.5");
  const g = Math.floor(proportion * n * (1 + 1e-9)); // guard against 0.29·100 = 28.999…
  if (g === 0) return mean(x);
  const a = copyInto(x, scratch);
  select(a, g); // a[0, g) ≤ a[g] ≤ a[g+1, n)
  select(a, n - g - 1, g, n); // a[g, n−g−1) ≤ a[n−g−1] ≤ a[n−g, n)
  let s = 0;
  for (let i = g; i < n - g; i++) s += a[i];
  return s / (n - 2 * g);
}

/**
 * Summary of one sample: n, mean, median, SD (n − 1), CV %, min, max and type-7
 * quartiles (see the file comment). One sorted copy; O(n log n).
 * Hyndman & Fan (1996); Chan, Golub & LeVeque (1983).
 */
export function describe(values: ArrayLike<number>): Description {
  const n = values.length;
  requireValues(n);
  const sorted = Float64Array.from(values as ArrayLike<number>);
  for (let i = 0; i < n; i++) if (sorted[i] !== sorted[i]) throw new RangeError("a value to summarize is not a number");
  sorted.sort();
  const m = mean(values);
  const s = n >= 2 ? sd(values, m) : null;
  const cv = s === null || m === 0 ? null : (100 * s) / m;
  return {
    n,
    mean: m,
    median: quantileSorted(sorted, 0.5),
    sd: s,
    cv,
    min: sorted[0],
    max: sorted[n - 1],
    q1: quantileSorted(sorted, 0.25),
    q3: quantileSorted(sorted, 0.75),
  };
}

/**
 * {@link describe} for each group: codes 0..names.length − 1 index `names`; one row per
 * name, in the order of `names`. A name without values throws a RangeError.
 * Hyndman & Fan (1996); Chan, Golub & LeVeque (1983).
 */
export function describeGroups(values: ArrayLike<number>, codes: ArrayLike<number>, names: readonly string[]): Array<{ group: string } & Description> {
  if (values.length !== codes.length) throw new RangeError("values and group codes differ in length");
  const k = names.length;
  const sizes = new Int32Array(k);
  for (let i = 0; i < codes.length; i++) {
    const c = codes[i];
    if (!(c >= 0 && c < k)) throw new RangeError(`row ${i + 1} has a group code without a name`);
    sizes[c]++;
  }
  const groups = Array.from(sizes, (s) => new Float64Array(s));
  const fill = new Int32Array(k);
  for (let i = 0; i < codes.length; i++) groups[codes[i]][fill[codes[i]]++] = values[i];
  return names.map((name, g) => {
    if (sizes[g] === 0) throw new RangeError(`group '${name}' has no values`);
    return { group: name, ...describe(groups[g]) };
  });
}
