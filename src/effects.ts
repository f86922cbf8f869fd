/**
 * Effect sizes: how large a difference is, not only whether it is there.
 *
 *  - difference of means / of medians and "% of reference" (x̄ as % of the check's
 *    mean), each with a bootstrap interval (see ./bootstrap);
 *  - Hodges–Lehmann shift: the median of all n·m differences xᵢ − yⱼ (Hodges & Lehmann
 *    1963) with its distribution-free interval from the rank-sum distribution (Bauer
 *    1972; Lehmann 1975, §2.6);
 *  - Cliff's delta (Cliff 1993): P(X > Y) − P(X < Y) estimated over all pairs;
 *  - eta² and omega² of a one-way layout (Hays 1963; Olejnik & Algina 2003).
 */
import { jStat } from "jstat";
import { BootstrapOptions, BootstrapResult, bootstrapDiffInterval } from "./bootstrap";
import { Rng } from "./random";

/** Difference of means x̄ − ȳ with a bootstrap interval (resampling inside each group; BCa by default).
 * Efron & Tibshirani (1993), §8.3; Efron (1987).
 */
export function differenceOfMeans(x: ArrayLike<number>, y: ArrayLike<number>, options: BootstrapOptions = {}): BootstrapResult {
  return bootstrapDiffInterval(x, y, "mean", options);
}

/** Difference of medians with a bootstrap interval (resampling inside each group). Efron & Tibshirani (1993), §8.3. */
export function differenceOfMedians(x: ArrayLike<number>, y: ArrayLike<number>, options: BootstrapOptions = {}): BootstrapResult {
  return bootstrapDiffInterval(x, y, "median", options);
}

/**
 * Mean of x as a percentage of the mean of a reference (check) group, 100·x̄/ȳ, with a
 * bootstrap interval (resampling inside each group) — the "% of check" of variety trials.
 * Efron & Tibshirani (1993), §8.3; Efron (1987).
 */
export function percentOfReference(x: ArrayLike<number>, reference: ArrayLike<number>, options: BootstrapOptions = {}): BootstrapResult {
  return bootstrapDiffInterval(x, reference, "ratio", options);
}

// ---------------------------------------------------------------------------------------
// Hodges–Lehmann shift

export interface ShiftEstimate {
  /** Median of the n·m differences xᵢ − yⱼ. */
  estimate: number;
  lower: number;
  upper: number;
  /** Requested confidence level. */
  level: number;
  /** Coverage the interval actually guarantees (exact method), or the requested level (normal method). */
  achievedLevel: number;
  /** "exact" rank-sum critical value, or "normal" approximation. */
  method: "exact" | "normal";
  /** Rank c of the endpoints: lower = d₍c₎, upper = d₍nm+1−c₎ among the sorted differences. */
  rank: number;
  note?: string;
}

/** Largest n·m handled by the exact rank-sum distribution (besides requiring no ties). */
export const EXACT_SHIFT_MAX_PRODUCT = 2500;

/**
 * Hodges–Lehmann estimate of the shift between x and y, the median of all differences
 * xᵢ − yⱼ (Hodges & Lehmann 1963), with its distribution-free interval [d₍c₎, d₍nm+1−c₎]
 * (Bauer 1972; Lehmann 1975, §2.6): c − 1 is the lower α/2 critical value of the
 * Mann–Whitney count U, i.e. c is the largest integer with P(U ≤ c − 1) ≤ α/2.
 *
 * The null distribution of U is exact (counted by dynamic programming over rank sums)
 * when the pooled sample has no ties and n·m ≤ {@link EXACT_SHIFT_MAX_PRODUCT}; the
 * guaranteed coverage 1 − 2·P(U ≤ c − 1) is then reported as achievedLevel. Otherwise
 * the normal approximation with continuity correction is used:
 * c = ⌊nm/2 + ½ − z_{1−α/2}·√(nm(n + m + 1)/12)⌋ (Lehmann 1975, §2.6).
 * The k-th difference is found without forming all n·m of them: a randomized selection
 * over the sorted difference matrix, counting in O(n + m) per step (Monahan 1984), so
 * the whole is O((n + m) log(nm)) after sorting.
 */
export function hodgesLehmann(x: ArrayLike<number>, y: ArrayLike<number>, options: { level?: number } = {}): ShiftEstimate {
  const level = options.level ?? 0.95;
  if (!(level > 0 && level < 1)) throw new RangeError(`level must be between 0 and 1, e.g. 0.95 (got ${level})`);
  const xs = sortedFinite(x, "the first group");
  const ys = sortedFinite(y, "the second group");
  const n = xs.length;
  const m = ys.length;
  const total = n * m;
  const sel = new DifferenceSelector(xs, ys);
  const estimate = total % 2 ? sel.kth((total + 1) / 2) : (sel.kth(total / 2) + sel.kth(total / 2 + 1)) / 2;

  const alpha = (1 - level) / 2;
  const ties = hasTiesPooled(xs, ys);
  let c: number;
  let achieved: number;
  let method: "exact" | "normal";
  if (!ties && total <= EXACT_SHIFT_MAX_PRODUCT) {
    method = "exact";
    const cdf = mannWhitneyCdf(n, m);
    // largest c with P(U ≤ c − 1) ≤ α/2 (tolerance against rounding in the cumulative sums)
    c = 0;
    while (c < total && cdf[c] <= alpha * (1 + 1e-12)) c++;
    achieved = c >= 1 ? 1 - 2 * cdf[c - 1] : 0;
  } else {
    method = "normal";
    const z = jStat.normal.inv(1 - alpha, 0, 1);
    c = Math.floor(total / 2 + 0.5 - z * Math.sqrt((total * (n + m + 1)) / 12));
    achieved = level;
  }
  let note: string | undefined;
  if (c < 1) {
    c = 1;
    achieved = method === "exact" ? 1 - 2 * mannWhitneyCdf(n, m)[0] : achieved;
    note = "the groups are too small for the requested level; the interval spans all differences";
  }
  const lower = sel.kth(c);
  const upper = sel.kth(total + 1 - c);
  const out: ShiftEstimate = { estimate, lower, upper, level, achievedLevel: achieved, method, rank: c };
  if (note) out.note = note;
  else if (method === "exact" && achieved > level + 1e-12)
    out.note = `exact interval: guaranteed coverage ${(100 * achieved).toFixed(1)} %`;
  return out;
}

/**
 * Cumulative null distribution of the Mann–Whitney count U for sizes n, m (no ties):
 * cdf[u] = P(U ≤ u), u = 0 … nm. Counts the n-subsets of ranks 1 … n + m by rank sum
 * (a knapsack recurrence with additions only), U = W − n(n + 1)/2 (Mann & Whitney 1947).
 */
export function mannWhitneyCdf(n: number, m: number): Float64Array {
  const N = n + m;
  const maxU = n * m;
  // counts[j][u]: subsets of size j of the ranks seen so far with U-offset u, where for
  // size j the rank sum is u + j(j + 1)/2. Adding rank r to a subset of size j − 1 adds r − j to u.
  const rows: Float64Array[] = [];
  for (let j = 0; j <= n; j++) rows.push(new Float64Array(maxU + 1));
  rows[0][0] = 1;
  for (let r = 1; r <= N; r++) {
    for (let j = Math.min(r, n); j >= 1; j--) {
      const shift = r - j; // 0 … m
      if (shift > m) continue;
      const dst = rows[j];
      const src = rows[j - 1];
      for (let u = maxU; u >= shift; u--) dst[u] += src[u - shift];
    }
  }
  const counts = rows[n];
  let total = 0;
  for (let u = 0; u <= maxU; u++) total += counts[u];
  const cdf = new Float64Array(maxU + 1);
  let cum = 0;
  for (let u = 0; u <= maxU; u++) {
    cum += counts[u];
    cdf[u] = cum / total;
  }
  return cdf;
}

/**
 * k-th smallest (1-based) of the differences xᵢ − yⱼ for sorted x and y, by randomized
 * selection on the sorted matrix (rows xᵢ, columns yⱼ in descending order, so every row
 * and column increases), keeping per row the range of candidate columns (Monahan 1984).
 */
export class DifferenceSelector {
  private readonly n: number;
  private readonly m: number;
  private readonly yd: Float64Array;
  private readonly lo: Float64Array;
  private readonly hi: Float64Array;
  private readonly less: Float64Array;
  private readonly leq: Float64Array;
  constructor(private readonly x: Float64Array, y: Float64Array) {
    this.n = x.length;
    this.m = y.length;
    this.yd = Float64Array.from(y).reverse(); // descending
    this.lo = new Float64Array(this.n);
    this.hi = new Float64Array(this.n);
    this.less = new Float64Array(this.n);
    this.leq = new Float64Array(this.n);
  }

  /** Entry of row i, column j: x[i] − yDescending[j], increasing in i and in j. */
  private at(i: number, j: number): number {
    return this.x[i] - this.yd[j];
  }

  /** k-th smallest difference (1-based), Monahan (1984)-style selection; RangeError outside 1 … n·m. */
  kth(k: number): number {
    const { n, m, lo, hi, less, leq } = this;
    if (!(k >= 1 && k <= n * m)) throw new RangeError("rank out of range");
    lo.fill(0);
    hi.fill(m);
    const rng = new Rng(1);
    let excludedLeft = 0;
    for (;;) {
      let candidates = 0;
      for (let i = 0; i < n; i++) candidates += hi[i] - lo[i];
      if (candidates <= 4 * (n + m) + 64) {
        const buf = new Float64Array(candidates);
        let t = 0;
        for (let i = 0; i < n; i++) for (let j = lo[i]; j < hi[i]; j++) buf[t++] = this.at(i, j);
        buf.sort();
        return buf[k - excludedLeft - 1];
      }
      // random candidate as pivot
      let r = Math.floor(rng.nextFloat() * candidates);
      let pi = 0;
      while (r >= hi[pi] - lo[pi]) {
        r -= hi[pi] - lo[pi];
        pi++;
      }
      const v = this.at(pi, lo[pi] + r);
      // per row: count of entries < v and ≤ v (non-increasing in i: two pointers)
      let jl = m;
      let je = m;
      let sumLess = 0;
      let sumLeq = 0;
      for (let i = 0; i < n; i++) {
        while (jl > 0 && this.at(i, jl - 1) >= v) jl--;
        while (je > 0 && this.at(i, je - 1) > v) je--;
        less[i] = jl;
        leq[i] = je;
        sumLess += jl;
        sumLeq += je;
      }
      if (k > sumLess && k <= sumLeq) return v;
      if (k <= sumLess) {
        for (let i = 0; i < n; i++) if (less[i] < hi[i]) hi[i] = Math.max(less[i], lo[i]);
      } else {
        for (let i = 0; i < n; i++) if (leq[i] > lo[i]) lo[i] = Math.min(leq[i], hi[i]);
        excludedLeft = 0;
        for (let i = 0; i < n; i++) excludedLeft += lo[i];
      }
    }
  }
}

// ---------------------------------------------------------------------------------------
// Cliff's delta

/**
 * Cliff's delta (Cliff 1993): δ = (#{xᵢ > yⱼ} − #{xᵢ < yⱼ}) / (n·m), in [−1, 1]; equal
 * to 2U/(nm) − 1 with U the Mann–Whitney count (ties as ½). O((n + m) log(n + m)):
 * both samples sorted, then one merge pass counting for each xᵢ the y below and above it.
 */
export function cliffsDelta(x: ArrayLike<number>, y: ArrayLike<number>): number {
  const xs = sortedFinite(x, "the first group");
  const ys = sortedFinite(y, "the second group");
  const m = ys.length;
  let below = 0; // #{y < current x}
  let notAbove = 0; // #{y ≤ current x}
  let greater = 0;
  let lessCount = 0;
  for (let i = 0; i < xs.length; i++) {
    const v = xs[i];
    while (below < m && ys[below] < v) below++;
    if (notAbove < below) notAbove = below;
    while (notAbove < m && ys[notAbove] <= v) notAbove++;
    greater += below;
    lessCount += m - notAbove;
  }
  return (greater - lessCount) / (xs.length * m);
}

// ---------------------------------------------------------------------------------------
// One-way effect sizes

export interface OneWayEffects {
  /** η² = SSB / SST (share of the total sum of squares between groups). */
  etaSquared: number;
  /** ω² = (SSB − (k − 1)·MSW) / (SST + MSW), less biased than η²; may be below 0. */
  omegaSquared: number;
  ssb: number;
  ssw: number;
  sst: number;
  n: number;
  k: number;
}

/**
 * η² (Pearson 1905; Fisher 1925) and ω² (Hays 1963) of a one-way layout:
 * η² = SSB/SST, ω² = (SSB − (k − 1)MSW)/(SST + MSW) with MSW = SSW/(n − k)
 * (Olejnik & Algina 2003, Table 1). Codes 0 … k−1; every group needs a value.
 */
export function oneWayEffectSizes(values: ArrayLike<number>, codes: ArrayLike<number>, k: number): OneWayEffects {
  const n = values.length;
  if (codes.length !== n) throw new RangeError(`values and groups differ in length (${n} and ${codes.length})`);
  if (k < 2) throw new RangeError("effect sizes need at least 2 groups");
  if (n - k < 1) throw new RangeError("effect sizes need more values than groups");
  const sums = new Float64Array(k);
  const sizes = new Float64Array(k);
  let total = 0;
  for (let i = 0; i < n; i++) {
    const v = values[i];
    if (!Number.isFinite(v)) throw new RangeError(`value ${i + 1} is not a finite number`);
    const g = codes[i];
    if (!(g >= 0 && g < k)) throw new RangeError(`group code ${g} is out of range`);
    sums[g] += v;
    sizes[g]++;
    total += v;
  }
  for (let g = 0; g < k; g++) if (sizes[g] === 0) throw new RangeError(`group ${g + 1} has no values`);
  const grand = total / n;
  let sst = 0;
  let ssw = 0;
  for (let i = 0; i < n; i++) {
    const g = codes[i];
    sst += (values[i] - grand) ** 2;
    ssw += (values[i] - sums[g] / sizes[g]) ** 2;
  }
  if (!(sst > 0)) throw new RangeError("all values are equal: there is no variation to divide among groups");
  const ssb = Math.max(0, sst - ssw);
  const msw = ssw / (n - k);
  return {
    etaSquared: ssb / sst,
    omegaSquared: (ssb - (k - 1) * msw) / (sst + msw),
    ssb,
    ssw,
    sst,
    n,
    k,
  };
}

// ---------------------------------------------------------------------------------------

function sortedFinite(x: ArrayLike<number>, what: string): Float64Array {
  if (x.length < 1) throw new RangeError(`${what} has no values`);
  const s = new Float64Array(x.length);
  for (let i = 0; i < x.length; i++) {
    const v = x[i];
    if (typeof v !== "number" || !Number.isFinite(v)) throw new RangeError(`${what}: value ${i + 1} is not a finite number`);
    s[i] = v;
  }
  return s.sort();
}

function hasTiesPooled(xs: Float64Array, ys: Float64Array): boolean {
  for (let i = 1; i < xs.length; i++) if (xs[i] === xs[i - 1]) return true;
  for (let j = 1; j < ys.length; j++) if (ys[j] === ys[j - 1]) return true;
  let i = 0;
  let j = 0;
  while (i < xs.length && j < ys.length) {
    if (xs[i] === ys[j]) return true;
    if (xs[i] < ys[j]) i++;
    else j++;
  }
  return false;
}
