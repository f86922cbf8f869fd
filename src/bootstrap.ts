/**
 * Bootstrap confidence intervals: percentile, basic and BCa (Efron 1987), for one
 * sample, two independent samples (resampling inside each group) and paired samples
 * (resampling pairs, i.e. one sample of differences).
 *
 * Replicates. B resamples of size n are drawn with replacement (Efron 1979); each gives
 * the statistic θ*. The replicates are sorted once; the bootstrap SE is their standard
 * deviation (divisor B − 1). Each replicate costs O(n) and allocates nothing:
 *  - mean: a sum of n random draws;
 *  - SD, CV %: sums of the centred values and of their squares over the same draws;
 *  - median, 10 % trimmed mean: the sample is sorted once; a resample is represented
 *    by how many times each sorted position was drawn (a reused count buffer), and its
 *    order statistics are read off the running counts in one pass.
 *
 * Quantiles of the replicates: the p-quantile is the order statistic at position
 * (B + 1)·p (1-based), interpolated linearly between neighbours (Davison & Hinkley
 * 1997, §5.2); with B = 9999 and level 0.95 the endpoints are exactly the 250th and
 * 9750th order statistics. A position below 1 or above B is clamped to the extreme
 * replicate, with a note.
 *
 * Intervals at level 1 − 2α (θ̂ the estimate, q(p) the quantile of the replicates):
 *  - percentile: [q(α), q(1 − α)] (Efron & Tibshirani 1993, §13.3);
 *  - basic: [2θ̂ − q(1 − α), 2θ̂ − q(α)] (Davison & Hinkley 1997, §5.2);
 *  - BCa: [q(α₁), q(α₂)], α_j = Φ(z₀ + (z₀ + z_j)/(1 − a(z₀ + z_j))), z_j = Φ⁻¹(α), Φ⁻¹(1 − α)
 *    (Efron 1987). Bias correction z₀ = Φ⁻¹(p₀), p₀ = (#{θ* < θ̂} + ½·#{θ* = θ̂}) / B
 *    (replicates tied with the estimate count as half). Acceleration a from the
 *    jackknife: with leave-one-out values θ₍ᵢ₎ and dᵢ = θ̄₍·₎ − θ₍ᵢ₎,
 *    a = Σ dᵢ³ / (6 (Σ dᵢ²)^{3/2}) (Efron & Tibshirani 1993, eq. 14.15). For two samples
 *    the jackknife runs inside each group g (size n_g) and the empirical influence values
 *    l = (n_g − 1)·d are combined as a = Σ_g n_g⁻³ Σ l³ / (6 (Σ_g n_g⁻² Σ l²)^{3/2})
 *    (Davison & Hinkley 1997, §3.2.1 and §5.3). Every jackknife is O(n) after one sort
 *    (leave-one-out formulas).
 *
 * The sample is sorted before resampling, so the result does not depend on the order of
 * the rows.
 *
 * Degenerate data: fewer than 3 values (per group), non-finite values, a CV or ratio
 * with a mean of 0 raise a RangeError with a plain message; data whose replicates show
 * no spread at all (e.g. all values equal) give the zero-width interval with a note.
 * When BCa is not defined (every replicate on one side of the estimate) the percentile
 * interval is returned with a note. No result is ever NaN.
 */
import { jStat } from "jstat";
import { CancelledError, ResampleOptions } from "./permutation";
import { Rng } from "./random";

/** One-sample statistics: mean, median, SD (divisor n − 1), CV % = 100·SD/mean, 10 % trimmed mean. */
export type IntervalStatistic = "mean" | "median" | "sd" | "cv" | "trimmed";
/** Two-sample statistics: difference of means x − y, difference of medians, mean(x) as % of mean(y). */
export type DiffStatistic = "mean" | "median" | "ratio";
/** Statistics of paired differences x − y. */
export type PairedStatistic = "mean" | "median" | "trimmed";
export type IntervalMethod = "bca" | "percentile" | "basic";

export interface BootstrapOptions extends ResampleOptions {
  /** Confidence level in (0, 1); default 0.95. */
  level?: number;
  /** "bca" (default), "percentile" or "basic" (case-insensitive). */
  method?: IntervalMethod;
}

export interface BootstrapResult {
  /** The statistic on the data. */
  estimate: number;
  lower: number;
  upper: number;
  level: number;
  /** "BCa", "percentile" or "basic": the interval actually returned. */
  method: string;
  resamples: number;
  /** Bootstrap standard error: SD of the replicates (divisor B − 1). */
  se: number;
  /** Plain-words remark when the interval is degenerate or a fallback was used. */
  note?: string;
}

/** Share of each tail trimmed by the "trimmed" statistic. */
export const TRIM = 0.1;
const MIN_N = 3;
const MIN_RESAMPLES = 99;
const MAX_RESAMPLES = 10_000_000;
const PROGRESS_MASK = 1023;

/** A statistic prepared for resampling: its estimate, B replicates, and its jackknife. */
interface Resampler {
  estimate: number;
  /** Writes B replicates into out. */
  replicate(rng: Rng, out: Float64Array, onProgress?: (f: number) => boolean | void): void;
  /** Acceleration a from the jackknife. */
  acceleration(): number;
  /** Plain message when a replicate is undefined (returned as NaN). */
  readonly undefinedMessage?: string;
}

// ---------------------------------------------------------------------------------------
// Public API

/**
 * Bootstrap interval of a one-sample statistic ("mean", "median", "sd", "cv" (CV %),
 * "trimmed" (10 % trimmed mean)), by the percentile, basic or BCa method (Efron 1987;
 * Efron & Tibshirani 1993). Same data, options and seed ⇒ the same interval.
 */
export function bootstrapInterval(
  x: ArrayLike<number>,
  statistic: IntervalStatistic = "mean",
  options: BootstrapOptions = {},
): BootstrapResult {
  const xs = checkSample(x, "the values");
  const stat = String(statistic).toLowerCase() as IntervalStatistic;
  let r: Resampler;
  switch (stat) {
    case "mean":
      r = new MeanResampler(xs);
      break;
    case "median":
      r = new OrderResampler(xs, "median");
      break;
    case "trimmed":
      r = new OrderResampler(xs, "trimmed");
      break;
    case "sd":
      r = new SpreadResampler(xs, false);
      break;
    case "cv":
      checkCv(xs);
      r = new SpreadResampler(xs, true);
      break;
    default:
      throw new RangeError(`unknown statistic '${statistic}': use mean, median, sd, cv or trimmed`);
  }
  return interval(r, options);
}

/**
 * Bootstrap interval of a two-sample statistic, resampling x and y separately inside
 * each group (Efron & Tibshirani 1993, §8.3): "mean" = mean(x) − mean(y), "median" =
 * median(x) − median(y), "ratio" = 100·mean(x)/mean(y) (x as % of the reference y).
 * BCa acceleration from jackknives inside each group (Davison & Hinkley 1997, §3.2.1).
 */
export function bootstrapDiffInterval(
  x: ArrayLike<number>,
  y: ArrayLike<number>,
  statistic: DiffStatistic = "mean",
  options: BootstrapOptions = {},
): BootstrapResult {
  const xs = checkSample(x, "the first group");
  const ys = checkSample(y, "the second group");
  const stat = String(statistic).toLowerCase() as DiffStatistic;
  let r: Resampler;
  switch (stat) {
    case "mean":
      r = new TwoMeansResampler(xs, ys, false);
      break;
    case "ratio":
      checkReference(ys);
      r = new TwoMeansResampler(xs, ys, true);
      break;
    case "median":
      r = new TwoMediansResampler(xs, ys);
      break;
    default:
      throw new RangeError(`unknown statistic '${statistic}': use mean, median or ratio`);
  }
  return interval(r, options);
}

/**
 * Bootstrap interval for paired data: pairs are resampled, which is the one-sample
 * bootstrap of the differences x − y (Efron & Tibshirani 1993, §6.7). Statistic of
 * the differences: "mean", "median" or "trimmed".
 */
export function bootstrapPairedInterval(
  x: ArrayLike<number>,
  y: ArrayLike<number>,
  statistic: PairedStatistic = "mean",
  options: BootstrapOptions = {},
): BootstrapResult {
  if (x.length !== y.length) throw new RangeError(`paired data need two ranges of the same length (got ${x.length} and ${y.length})`);
  const stat = String(statistic).toLowerCase();
  if (stat !== "mean" && stat !== "median" && stat !== "trimmed")
    throw new RangeError(`unknown statistic '${statistic}' for paired data: use mean, median or trimmed`);
  const d = new Float64Array(x.length);
  for (let i = 0; i < d.length; i++) d[i] = x[i] - y[i];
  return bootstrapInterval(d, stat as IntervalStatistic, options);
}

// ---------------------------------------------------------------------------------------
// Interval construction

function interval(r: Resampler, options: BootstrapOptions): BootstrapResult {
  const level = options.level ?? 0.95;
  if (!(level > 0 && level < 1)) throw new RangeError(`level must be between 0 and 1, e.g. 0.95 (got ${level})`);
  const resamples = options.resamples ?? 9999;
  if (!Number.isInteger(resamples) || resamples < MIN_RESAMPLES || resamples > MAX_RESAMPLES)
    throw new RangeError(`resamples must be a whole number from ${MIN_RESAMPLES} to ${MAX_RESAMPLES} (9999 is usual; got ${resamples})`);
  const method = normalizeMethod(options.method);
  const label = method === "bca" ? "BCa" : method;
  const estimate = r.estimate;
  if (!Number.isFinite(estimate)) throw new RangeError("the statistic cannot be computed on these values");

  const reps = new Float64Array(resamples);
  r.replicate(new Rng(options.seed ?? 1), reps, options.onProgress);
  for (let b = 0; b < resamples; b++) {
    if (reps[b] !== reps[b]) throw new RangeError(r.undefinedMessage ?? "the statistic cannot be computed on some resamples of these values");
  }
  reps.sort();
  const se = sdOf(reps);
  const base = { estimate, level, resamples, se };

  if (reps[0] === reps[resamples - 1]) {
    return {
      ...base,
      lower: estimate,
      upper: estimate,
      method: label,
      se: 0,
      note: "every resample gives the same value (the data show no spread), so the interval has no width",
    };
  }

  const alpha = (1 - level) / 2;
  const notes: string[] = [];
  let lower: number;
  let upper: number;
  let used = label;
  if (method === "bca") {
    let below = 0;
    let ties = 0;
    for (let b = 0; b < resamples; b++) {
      if (reps[b] < estimate) below++;
      else if (reps[b] === estimate) ties++;
    }
    const p0 = (below + 0.5 * ties) / resamples;
    if (p0 <= 0 || p0 >= 1) {
      notes.push("BCa is not defined here (every resample lies on one side of the estimate); the percentile interval is shown");
      used = "percentile";
      lower = quantile(reps, alpha, notes);
      upper = quantile(reps, 1 - alpha, notes);
    } else {
      const z0 = normalInv(p0);
      const a = r.acceleration();
      lower = quantile(reps, bcaLevel(z0, a, normalInv(alpha)), notes);
      upper = quantile(reps, bcaLevel(z0, a, normalInv(1 - alpha)), notes);
    }
  } else {
    const qlo = quantile(reps, alpha, notes);
    const qhi = quantile(reps, 1 - alpha, notes);
    if (method === "percentile") {
      lower = qlo;
      upper = qhi;
    } else {
      lower = 2 * estimate - qhi;
      upper = 2 * estimate - qlo;
    }
  }
  if (!Number.isFinite(lower) || !Number.isFinite(upper))
    throw new RangeError("the interval is unbounded for these values (for CV % or a ratio: too many zeros)");
  const out: BootstrapResult = { ...base, lower, upper, method: used };
  if (notes.length) out.note = Array.from(new Set(notes)).join("; ");
  return out;
}

function normalizeMethod(m: string | undefined): IntervalMethod {
  const s = (m ?? "bca").toString().toLowerCase();
  if (s === "bca" || s === "percentile" || s === "basic") return s;
  throw new RangeError(`unknown interval method '${m}': use BCa, percentile or basic`);
}

/** BCa-adjusted tail probability Φ(z₀ + (z₀ + z)/(1 − a(z₀ + z))) (Efron 1987). */
export function bcaLevel(z0: number, a: number, z: number): number {
  const w = z0 + z;
  const den = 1 - a * w;
  if (den <= 0) return w > 0 ? 1 : 0; // limit of the formula as the denominator reaches 0
  return normalCdf(z0 + w / den);
}

/**
 * Quantile of sorted replicates at probability p: order statistic at position (B + 1)p,
 * linear interpolation between neighbours, clamped (with a note) outside [1, B].
 * Davison & Hinkley (1997), §5.2.
 */
export function quantile(sorted: Float64Array, p: number, notes?: string[]): number {
  const B = sorted.length;
  const pos = (B + 1) * p;
  if (pos < 1) {
    notes?.push("an endpoint is the most extreme resample; use more resamples");
    return sorted[0];
  }
  if (pos > B) {
    notes?.push("an endpoint is the most extreme resample; use more resamples");
    return sorted[B - 1];
  }
  const i = Math.floor(pos);
  const f = pos - i;
  if (f === 0 || i >= B) return sorted[i - 1];
  return sorted[i - 1] + f * (sorted[i] - sorted[i - 1]);
}

function normalInv(p: number): number {
  return jStat.normal.inv(p, 0, 1);
}
function normalCdf(z: number): number {
  return jStat.normal.cdf(z, 0, 1);
}

function sdOf(x: Float64Array): number {
  const n = x.length;
  let m = 0;
  for (let i = 0; i < n; i++) m += x[i];
  m /= n;
  let ss = 0;
  for (let i = 0; i < n; i++) ss += (x[i] - m) * (x[i] - m);
  return n > 1 ? Math.sqrt(ss / (n - 1)) : 0;
}

/**
 * Acceleration from leave-one-out values of one or more groups (Efron & Tibshirani
 * 1993, eq. 14.15; groups combined with influence values l = (n_g − 1)·d as in
 * Davison & Hinkley 1997, §3.2.1). Returns 0 when the jackknife shows no spread.
 */
export function jackknifeAcceleration(groups: Float64Array[]): number {
  let num = 0;
  let den = 0;
  for (const theta of groups) {
    const n = theta.length;
    let m = 0;
    for (let i = 0; i < n; i++) m += theta[i];
    m /= n;
    const w = (n - 1) / n; // l / n = (n − 1) d / n
    let s2 = 0;
    let s3 = 0;
    for (let i = 0; i < n; i++) {
      const d = m - theta[i];
      s2 += d * d;
      s3 += d * d * d;
    }
    num += w * w * w * s3;
    den += w * w * s2;
  }
  if (!(den > 0)) return 0;
  const a = num / (6 * Math.pow(den, 1.5));
  return Number.isFinite(a) ? a : 0;
}

// ---------------------------------------------------------------------------------------
// Input checks

function checkSample(x: ArrayLike<number>, what: string): Float64Array {
  const n = x.length;
  if (n < MIN_N) throw new RangeError(`${what}: a bootstrap interval needs at least ${MIN_N} values (got ${n})`);
  const xs = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const v = x[i];
    if (typeof v !== "number" || !Number.isFinite(v)) throw new RangeError(`${what}: value ${i + 1} is not a finite number`);
    xs[i] = v;
  }
  // sorted once: resamples index the sorted sample, so results do not depend on row order
  return xs.sort();
}

function checkCv(x: Float64Array): void {
  let s = 0;
  for (let i = 0; i < x.length; i++) {
    if (x[i] < 0) throw new RangeError("CV % needs values on a ratio scale: none may be negative");
    s += x[i];
  }
  if (s === 0) throw new RangeError("CV % is not defined when the mean is 0");
}

function checkReference(y: Float64Array): void {
  let s = 0;
  for (let i = 0; i < y.length; i++) {
    if (y[i] < 0) throw new RangeError("a % of the reference needs reference values that are not negative");
    s += y[i];
  }
  if (s === 0) throw new RangeError("a % of the reference is not defined when the reference mean is 0");
}

function progress(onProgress: ((f: number) => boolean | void) | undefined, b: number, B: number): void {
  if (onProgress && (b & PROGRESS_MASK) === PROGRESS_MASK && onProgress((b + 1) / B) === true) throw new CancelledError();
}

// ---------------------------------------------------------------------------------------
// Resamplers

/** Mean: replicate = sum of n draws / n; jackknife θ₍ᵢ₎ = (S − xᵢ)/(n − 1). */
class MeanResampler implements Resampler {
  readonly estimate: number;
  constructor(private readonly x: Float64Array) {
    this.estimate = meanOf(x);
  }
  replicate(rng: Rng, out: Float64Array, onProgress?: (f: number) => boolean | void): void {
    const x = this.x;
    const n = x.length;
    const inv = 1 / n;
    for (let b = 0; b < out.length; b++) {
      out[b] = rng.sumOfDraws(x, n) * inv;
      progress(onProgress, b, out.length);
    }
  }
  acceleration(): number {
    return jackknifeAcceleration([leaveOneOutMeans(this.x)]);
  }
}

/**
 * SD (divisor n − 1) or CV % = 100·SD/mean. Replicates from sums of the centred values
 * cᵢ = xᵢ − x̄ and of cᵢ² over the same draws. Jackknife: with SS = Σcᵢ²,
 * SS₍ᵢ₎ = SS − cᵢ²·n/(n − 1), mean₍ᵢ₎ = x̄ − cᵢ/(n − 1).
 */
class SpreadResampler implements Resampler {
  readonly estimate: number;
  readonly undefinedMessage = "some resamples contain only zeros, so CV % is undefined for them: too many zeros for a CV interval";
  private readonly c: Float64Array;
  private readonly c2: Float64Array;
  private readonly mean: number;
  private readonly ss: number;
  constructor(x: Float64Array, private readonly cv: boolean) {
    const n = x.length;
    this.mean = meanOf(x);
    this.c = x.map((v) => v - this.mean);
    this.c2 = this.c.map((v) => v * v);
    let ss = 0;
    for (let i = 0; i < n; i++) ss += this.c2[i];
    this.ss = ss;
    const sd = Math.sqrt(ss / (n - 1));
    this.estimate = cv ? (100 * sd) / this.mean : sd;
  }
  replicate(rng: Rng, out: Float64Array, onProgress?: (f: number) => boolean | void): void {
    const c = this.c;
    const c2 = this.c2;
    const n = c.length;
    const sums = new Float64Array(2);
    const mean = this.mean;
    for (let b = 0; b < out.length; b++) {
      rng.sumsOfDraws(c, c2, n, sums);
      const s1 = sums[0];
      const v = Math.max(0, (sums[1] - (s1 * s1) / n) / (n - 1));
      const sd = Math.sqrt(v);
      if (this.cv) {
        const m = mean + s1 / n;
        out[b] = m > 1e-12 * mean ? (100 * sd) / m : NaN; // a resample of zeros only
      } else out[b] = sd;
      progress(onProgress, b, out.length);
    }
  }
  acceleration(): number {
    const n = this.c.length;
    const theta = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      const ssi = Math.max(0, this.ss - (this.c2[i] * n) / (n - 1));
      const sd = Math.sqrt(ssi / (n - 2));
      if (this.cv) {
        const m = this.mean - this.c[i] / (n - 1);
        theta[i] = m > 0 ? (100 * sd) / m : this.estimate; // no finite value: neutral influence
      } else theta[i] = sd;
    }
    return jackknifeAcceleration([theta]);
  }
}

/**
 * Median or 10 % trimmed mean of one sample, by counting draws per sorted position.
 */
class OrderResampler implements Resampler {
  readonly estimate: number;
  private readonly sorted: Float64Array;
  constructor(x: Float64Array, private readonly kind: "median" | "trimmed") {
    this.sorted = Float64Array.from(x).sort();
    this.estimate = kind === "median" ? medianSorted(this.sorted) : trimmedMeanSorted(this.sorted, TRIM);
  }
  replicate(rng: Rng, out: Float64Array, onProgress?: (f: number) => boolean | void): void {
    const s = this.sorted;
    const counts = new Int32Array(s.length);
    const median = this.kind === "median";
    for (let b = 0; b < out.length; b++) {
      counts.fill(0);
      rng.countDraws(counts, s.length);
      out[b] = median ? medianFromCounts(s, counts) : trimmedFromCounts(s, counts, TRIM);
      progress(onProgress, b, out.length);
    }
  }
  acceleration(): number {
    const theta = this.kind === "median" ? leaveOneOutMedians(this.sorted) : leaveOneOutTrimmed(this.sorted, TRIM);
    return jackknifeAcceleration([theta]);
  }
}

/** Difference of means x̄ − ȳ, or ratio 100·x̄/ȳ; jackknife inside each group. */
class TwoMeansResampler implements Resampler {
  readonly estimate: number;
  readonly undefinedMessage = "some resamples of the reference contain only zeros: too many zeros for a % of the reference";
  private readonly mx: number;
  private readonly my: number;
  constructor(private readonly x: Float64Array, private readonly y: Float64Array, private readonly ratio: boolean) {
    this.mx = meanOf(x);
    this.my = meanOf(y);
    this.estimate = ratio ? (100 * this.mx) / this.my : this.mx - this.my;
  }
  replicate(rng: Rng, out: Float64Array, onProgress?: (f: number) => boolean | void): void {
    const x = this.x;
    const y = this.y;
    const nx = x.length;
    const ny = y.length;
    const ix = 1 / nx;
    const iy = 1 / ny;
    for (let b = 0; b < out.length; b++) {
      const a = rng.sumOfDraws(x, nx) * ix;
      const c = rng.sumOfDraws(y, ny) * iy;
      out[b] = this.ratio ? (c > 0 ? (100 * a) / c : NaN) : a - c;
      progress(onProgress, b, out.length);
    }
  }
  acceleration(): number {
    const jx = leaveOneOutMeans(this.x);
    const jy = leaveOneOutMeans(this.y);
    if (this.ratio) {
      for (let i = 0; i < jx.length; i++) jx[i] = (100 * jx[i]) / this.my;
      for (let j = 0; j < jy.length; j++) jy[j] = jy[j] > 0 ? (100 * this.mx) / jy[j] : this.estimate; // no finite value: neutral influence
    } else {
      for (let i = 0; i < jx.length; i++) jx[i] -= this.my;
      for (let j = 0; j < jy.length; j++) jy[j] = this.mx - jy[j];
    }
    return jackknifeAcceleration([jx, jy]);
  }
}

/** Difference of medians; counts per sorted position in each group. */
class TwoMediansResampler implements Resampler {
  readonly estimate: number;
  private readonly sx: Float64Array;
  private readonly sy: Float64Array;
  constructor(x: Float64Array, y: Float64Array) {
    this.sx = Float64Array.from(x).sort();
    this.sy = Float64Array.from(y).sort();
    this.estimate = medianSorted(this.sx) - medianSorted(this.sy);
  }
  replicate(rng: Rng, out: Float64Array, onProgress?: (f: number) => boolean | void): void {
    const cx = new Int32Array(this.sx.length);
    const cy = new Int32Array(this.sy.length);
    for (let b = 0; b < out.length; b++) {
      cx.fill(0);
      cy.fill(0);
      rng.countDraws(cx, cx.length);
      rng.countDraws(cy, cy.length);
      out[b] = medianFromCounts(this.sx, cx) - medianFromCounts(this.sy, cy);
      progress(onProgress, b, out.length);
    }
  }
  acceleration(): number {
    const jx = leaveOneOutMedians(this.sx);
    const jy = leaveOneOutMedians(this.sy);
    const mx = medianSorted(this.sx);
    const my = medianSorted(this.sy);
    for (let i = 0; i < jx.length; i++) jx[i] -= my;
    for (let j = 0; j < jy.length; j++) jy[j] = mx - jy[j];
    return jackknifeAcceleration([jx, jy]);
  }
}

// ---------------------------------------------------------------------------------------
// Order statistics helpers (exported for effect sizes and tests)

function meanOf(x: ArrayLike<number>): number {
  let s = 0;
  for (let i = 0; i < x.length; i++) s += x[i];
  return s / x.length;
}

/** Median of values sorted ascending (average of the two middle values when n is even).
 * Sample median (Hyndman & Fan 1996, type 7 at p = ½).
 */
export function medianSorted(s: ArrayLike<number>): number {
  const n = s.length;
  const h = n >> 1;
  return n % 2 ? s[h] : (s[h - 1] + s[h]) / 2;
}

/**
 * Trimmed mean of values sorted ascending: drop g = ⌊trim·n⌋ values at each end and
 * average the rest (Tukey & McLaughlin 1963; Wilcox 2012, §3.1).
 */
export function trimmedMeanSorted(s: ArrayLike<number>, trim = TRIM): number {
  const n = s.length;
  const g = Math.floor(trim * n);
  let t = 0;
  for (let i = g; i < n - g; i++) t += s[i];
  return t / (n - 2 * g);
}

/** Median of a resample given by draw counts per sorted position (counts sum to n). */
function medianFromCounts(s: Float64Array, counts: Int32Array): number {
  const n = s.length;
  // 0-based positions of the middle order statistics in the resample
  const lo = (n - 1) >> 1;
  const hi = n >> 1;
  let cum = 0;
  let j = 0;
  for (; j < n; j++) {
    cum += counts[j];
    if (cum > lo) break;
  }
  const a = s[j];
  if (hi === lo || cum > hi) return a;
  for (j++; j < n; j++) if (counts[j] > 0) break;
  return (a + s[j]) / 2;
}

/**
 * Trimmed mean of a resample given by draw counts per sorted position: the total
 * Σ c_j s_j minus the g lowest and g highest resampled values (walks from each end).
 */
function trimmedFromCounts(s: Float64Array, counts: Int32Array, trim: number): number {
  const n = s.length;
  const g = Math.floor(trim * n);
  let t = 0;
  for (let j = 0; j < n; j++) t += counts[j] * s[j];
  let left = g;
  for (let j = 0; left > 0; j++) {
    const c = counts[j] < left ? counts[j] : left;
    t -= c * s[j];
    left -= c;
  }
  left = g;
  for (let j = n - 1; left > 0; j--) {
    const c = counts[j] < left ? counts[j] : left;
    t -= c * s[j];
    left -= c;
  }
  return t / (n - 2 * g);
}

/** Leave-one-out means (S − xᵢ)/(n − 1), O(n). Jackknife values (Quenouille 1949; Efron & Tibshirani 1993, §11.2). */
export function leaveOneOutMeans(x: ArrayLike<number>): Float64Array {
  const n = x.length;
  const m = meanOf(x);
  const out = new Float64Array(n);
  // (S − xᵢ)/(n − 1) = m − (xᵢ − m)/(n − 1): centred form, no cancellation
  for (let i = 0; i < n; i++) out[i] = m - (x[i] - m) / (n - 1);
  return out;
}

/** Leave-one-out medians of a sorted sample (one per sorted position), O(n).
 * Jackknife values (Efron & Tibshirani 1993, §11.2).
 */
export function leaveOneOutMedians(s: Float64Array): Float64Array {
  const n = s.length;
  const out = new Float64Array(n);
  const m = n - 1;
  // reduced position p maps to original p (p < r) or p + 1 (p ≥ r)
  const at = (p: number, r: number) => (p < r ? s[p] : s[p + 1]);
  for (let r = 0; r < n; r++) {
    const h = m >> 1;
    out[r] = m % 2 ? at(h, r) : (at(h - 1, r) + at(h, r)) / 2;
  }
  return out;
}

/** Leave-one-out trimmed means of a sorted sample, O(n) with prefix sums.
 * Jackknife values (Efron & Tibshirani 1993, §11.2).
 */
export function leaveOneOutTrimmed(s: Float64Array, trim = TRIM): Float64Array {
  const n = s.length;
  const prefix = new Float64Array(n + 1);
  for (let i = 0; i < n; i++) prefix[i + 1] = prefix[i] + s[i];
  const m = n - 1;
  const g = Math.floor(trim * m);
  const lo = g;
  const hi = m - g; // reduced positions [lo, hi)
  const out = new Float64Array(n);
  for (let r = 0; r < n; r++) {
    let sum: number;
    if (hi <= r) sum = prefix[hi] - prefix[lo];
    else if (lo >= r) sum = prefix[hi + 1] - prefix[lo + 1];
    else sum = prefix[hi + 1] - prefix[lo] - s[r];
    out[r] = sum / (hi - lo);
  }
  return out;
}
