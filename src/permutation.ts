/**
 * The permutation engine: counts how often a relabelled statistic is at least as
 * extreme as the observed one.
 *
 * A *scheme* says which relabellings are allowed under the null hypothesis:
 *  - {@link GroupScheme}: any rearrangement of group labels (k-sample tests, correlation);
 *  - {@link BlockScheme}: rearrangements inside each block only (randomized blocks);
 *  - {@link SignScheme}: sign flips of paired differences.
 *
 * If the number of distinct relabellings is at most the requested resamples, all of
 * them are enumerated and p = (count at least as extreme, observed included) / total
 * ("exact"). Otherwise m random relabellings are drawn and p = (b + 1) / (m + 1)
 * (Phipson & Smyth 2010), with a Clopper–Pearson 95 % interval for the Monte Carlo
 * error. Values within a relative 1e-12 of the observed statistic count as ties, and
 * ties count as "at least as extreme".
 */
import { jStat } from "jstat";
import { multinomialCount, nextPermutation } from "./combinatorics";
import { Rng, shuffle } from "./random";

export type Direction = "two-sided" | "greater" | "less";

/** Relative tolerance for ties with the observed statistic. */
export const TIE_TOLERANCE = 1e-12;

/** A set of allowed relabellings, with a current state the statistic reads. */
export interface Scheme {
  /** Number of distinct relabellings (Infinity when beyond 2^53). */
  count(cap: number): number;
  /** Put the state at the first relabelling of the enumeration order. */
  first(): void;
  /** Advance to the next relabelling; false after the last one. */
  next(): boolean;
  /** Replace the state by a uniformly random relabelling. */
  random(rng: Rng): void;
  /** Restore the observed labelling. */
  reset(): void;
}

/** Rearrangements of the whole label vector (k-sample designs, correlation).
 * Fisher (1935); Pitman (1937). Enumerated with Knuth's Algorithm L, drawn by Fisher–Yates (Durstenfeld 1964).
 */
export class GroupScheme implements Scheme {
  readonly labels: Int32Array;
  private readonly original: Int32Array;
  constructor(labels: ArrayLike<number>) {
    this.original = Int32Array.from(labels);
    this.labels = Int32Array.from(labels);
  }
  count(cap: number): number {
    return multinomialCount(labelSizes(this.original), cap);
  }
  first(): void {
    this.labels.set(this.original);
    this.labels.sort();
  }
  next(): boolean {
    return nextPermutation(this.labels);
  }
  random(rng: Rng): void {
    shuffle(this.labels, rng);
  }
  reset(): void {
    this.labels.set(this.original);
  }
}

/**
 * Rearrangements inside blocks. Observations must be ordered so that each block is a
 * contiguous segment; `starts` holds each block's first index plus a final n.
 * Restricted randomization within blocks (Fisher 1935, ch. V).
 */
export class BlockScheme implements Scheme {
  readonly labels: Int32Array;
  private readonly original: Int32Array;
  private readonly starts: Int32Array;
  constructor(labels: ArrayLike<number>, starts: ArrayLike<number>) {
    this.original = Int32Array.from(labels);
    this.labels = Int32Array.from(labels);
    this.starts = Int32Array.from(starts);
  }
  count(cap: number): number {
    let total = 1;
    for (let b = 0; b + 1 < this.starts.length; b++) {
      const seg = this.original.subarray(this.starts[b], this.starts[b + 1]);
      total *= multinomialCount(labelSizes(seg), cap);
      if (total > cap) return Infinity;
    }
    return total;
  }
  first(): void {
    this.labels.set(this.original);
    for (let b = 0; b + 1 < this.starts.length; b++) this.labels.subarray(this.starts[b], this.starts[b + 1]).sort();
  }
  next(): boolean {
    // Odometer over blocks: advance block 0; when it wraps, carry into block 1, …
    for (let b = 0; b + 1 < this.starts.length; b++) {
      if (nextPermutation(this.labels, this.starts[b], this.starts[b + 1])) return true;
    }
    return false;
  }
  random(rng: Rng): void {
    for (let b = 0; b + 1 < this.starts.length; b++) shuffle(this.labels, rng, this.starts[b], this.starts[b + 1]);
  }
  reset(): void {
    this.labels.set(this.original);
  }
}

/** Sign flips of n paired differences; `signs[i]` is +1 or −1. Fisher (1935), §21. */
export class SignScheme implements Scheme {
  readonly signs: Float64Array;
  constructor(n: number) {
    this.signs = new Float64Array(n).fill(1);
  }
  count(cap: number): number {
    const c = Math.pow(2, this.signs.length);
    return c > cap ? Infinity : c;
  }
  first(): void {
    this.signs.fill(1);
  }
  next(): boolean {
    // Binary counter: +1 is digit 0, −1 is digit 1.
    const s = this.signs;
    for (let i = 0; i < s.length; i++) {
      if (s[i] > 0) {
        s[i] = -1;
        return true;
      }
      s[i] = 1;
    }
    return false;
  }
  random(rng: Rng): void {
    const s = this.signs;
    let bits = 0;
    for (let i = 0; i < s.length; i++) {
      if ((i & 31) === 0) bits = rng.nextU32();
      s[i] = bits & 1 ? -1 : 1;
      bits >>>= 1;
    }
  }
  reset(): void {
    this.signs.fill(1);
  }
}

/** Sizes of each label value 0..max in a label vector. (Bookkeeping, no statistical method.) */
export function labelSizes(labels: ArrayLike<number>): Int32Array {
  let k = 0;
  for (let i = 0; i < labels.length; i++) if (labels[i] + 1 > k) k = labels[i] + 1;
  const sizes = new Int32Array(k);
  for (let i = 0; i < labels.length; i++) sizes[labels[i]]++;
  return sizes;
}

export interface ResampleOptions {
  /** Requested resamples; exact enumeration when the distinct relabellings are at most this. Default 9999. */
  resamples?: number;
  /** Seed of the generator (ignored by exact results). Default 1. */
  seed?: number | string;
  /** Called about every 2^14 relabellings with the fraction done; return true to cancel. */
  onProgress?: (fraction: number) => boolean | void;
}

export interface PermutationOptions extends ResampleOptions {
  direction?: Direction;
  /** Keep every evaluated statistic (for histograms of the null distribution). */
  keepNull?: boolean;
}

export interface PermutationResult {
  /** Observed statistic. */
  statistic: number;
  /** Permutation p-value. */
  p: number;
  /** True when every distinct relabelling was evaluated. */
  exact: boolean;
  /** Relabellings evaluated: all of them (observed included) when exact, else m. */
  resamples: number;
  /** Number at least as extreme (observed included when exact; b when Monte Carlo). */
  count: number;
  /** 95 % Clopper–Pearson interval for the Monte Carlo p; null when exact. */
  mcInterval: [number, number] | null;
  direction: Direction;
  /** The evaluated statistics, when keepNull was asked for. */
  nullDistribution?: Float64Array;
}

/** Raised inside the engine when onProgress asks to cancel. (Control flow, no statistical method.) */
export class CancelledError extends Error {
  constructor() {
    super("cancelled");
    this.name = "CancelledError";
  }
}

/** Relabellings between two calls of onProgress in the engine's loops. */
export const PROGRESS_EVERY = 16384;

/**
 * The requested number of resamples (default 9999), checked: a whole number of at least 1.
 * A fraction or NaN would otherwise make the loop bounds and the p = (b + 1)/(m + 1)
 * denominator disagree.
 * Phipson & Smyth (2010) for the role of m.
 */
export function resampleCount(options: ResampleOptions): number {
  const m = options.resamples ?? 9999;
  if (!Number.isInteger(m) || m < 1) throw new RangeError(`resamples must be a whole number of at least 1 (got ${m})`);
  return m;
}

/** The observed statistic, checked: a NaN would count as extreme nowhere and give p = 0. */
function checkObserved(observed: number): number {
  if (observed !== observed) throw new RangeError("the statistic cannot be computed on these values (it is not a number)");
  return observed;
}

/**
 * Visits relabellings of a scheme: every distinct one when there are at most
 * `resamples` (exact), else `resamples` random ones. `visit` reads the scheme's state.
 * The scheme is reset to the observed labelling afterwards.
 * Exact: Fisher (1935); Monte Carlo: Dwass (1957).
 */
export function forEachRelabelling(
  scheme: Scheme,
  visit: (index: number) => void,
  options: ResampleOptions = {},
): { exact: boolean; evaluated: number } {
  const resamples = resampleCount(options);
  const total = scheme.count(resamples);
  const onProgress = options.onProgress;
  try {
    if (total <= resamples) {
      scheme.first();
      let i = 0;
      do {
        visit(i);
        i++;
        if (onProgress && i % PROGRESS_EVERY === 0 && onProgress(i / total) === true) throw new CancelledError();
      } while (scheme.next());
      return { exact: true, evaluated: i };
    }
    const rng = new Rng(options.seed ?? 1);
    for (let i = 0; i < resamples; i++) {
      scheme.random(rng);
      visit(i);
      if (onProgress && (i + 1) % PROGRESS_EVERY === 0 && onProgress((i + 1) / resamples) === true) throw new CancelledError();
    }
    return { exact: false, evaluated: resamples };
  } finally {
    scheme.reset();
  }
}

/**
 * True when `t` is at least as extreme as `observed` in the given direction, ties
 * counting: "greater" t ≥ o − δ, "less" t ≤ o + δ, two-sided |t| ≥ |o| − δ, with
 * δ = ε·max(|o|, scale), ε = {@link TIE_TOLERANCE} (ties count as "at least as extreme",
 * Phipson & Smyth 2010). `scale` (default 0) is the size of the terms the statistic is
 * computed from, for statistics built by cancellation (a difference of sums): their
 * rounding noise is relative to the terms, not to an observed value near 0. An infinite
 * observed value is matched only by the same infinity (δ is then 0, never ∞ − ∞).
 */
export function atLeastAsExtreme(t: number, observed: number, direction: Direction, scale = 0): boolean {
  const a = Math.abs(observed);
  const tol = a < Infinity ? TIE_TOLERANCE * (a > scale ? a : scale) : 0;
  switch (direction) {
    case "greater":
      return t >= observed - tol;
    case "less":
      return t <= observed + tol;
    default:
      return Math.abs(t) >= a - tol;
  }
}

/**
 * Permutation test of a statistic under a scheme. `statistic()` must compute the value
 * for the scheme's current state; it is first called on the observed labelling.
 * Exact: p = count / total (Fisher 1935). Monte Carlo: p = (b + 1)/(m + 1) (Phipson &
 * Smyth 2010). `tieScale`: see {@link atLeastAsExtreme}.
 */
export function permutationTest(scheme: Scheme, statistic: () => number, options: PermutationOptions = {}, tieScale = 0): PermutationResult {
  const direction = options.direction ?? "two-sided";
  const resamples = resampleCount(options);
  const observed = checkObserved(statistic());
  let count = 0;
  let kept: Float64Array | undefined;
  if (options.keepNull) kept = new Float64Array(Math.min(resamples, scheme.count(resamples)));
  const run = forEachRelabelling(
    scheme,
    (i) => {
      const t = statistic();
      if (kept) kept[i] = t;
      if (atLeastAsExtreme(t, observed, direction, tieScale)) count++;
    },
    options,
  );
  return summarize(observed, count, run.evaluated, run.exact, direction, kept);
}

/**
 * Builds the result object from counts (shared by tests that count by themselves):
 * exact p = count / evaluated (observed included in both), Monte Carlo
 * p = (count + 1)/(evaluated + 1) (Phipson & Smyth 2010) with its Clopper–Pearson band.
 */
export function summarize(
  observed: number,
  count: number,
  evaluated: number,
  exact: boolean,
  direction: Direction,
  nullDistribution?: Float64Array,
): PermutationResult {
  const p = exact ? count / evaluated : (count + 1) / (evaluated + 1);
  return {
    statistic: observed,
    p,
    exact,
    resamples: evaluated,
    count,
    mcInterval: exact ? null : clopperPearson(count, evaluated),
    direction,
    nullDistribution,
  };
}

/**
 * Clopper–Pearson (1934) interval for a binomial proportion b/m, at `level`.
 * Used as the Monte Carlo error band of a permutation p.
 */
export function clopperPearson(b: number, m: number, level = 0.95): [number, number] {
  const a = (1 - level) / 2;
  const lo = b === 0 ? 0 : jStat.beta.inv(a, b, m - b + 1);
  const hi = b === m ? 1 : jStat.beta.inv(1 - a, b + 1, m - b);
  return [lo, hi];
}

/**
 * Draws random partitions of values into groups of fixed sizes and returns each group's
 * sum: a partial Fisher–Yates shuffle (Durstenfeld 1964) of the values laid out group by
 * group, fused with the summation, stopping before the last group (whose sum is the
 * total minus the others). The fast path for statistics that depend on the data only
 * through group sums (F, difference of means, rank sums).
 */
export class PartitionSampler {
  private readonly pool: Float64Array;
  /** Segment boundaries of the pool: segment s holds group segmentCode[s]. */
  private readonly starts: Int32Array;
  private readonly segmentCode: Int32Array;
  private readonly draws: Int32Array;
  readonly k: number;
  readonly total: number;

  /**
   * The pool starts from the values sorted ascending and the segments are ordered by
   * group size, so the draws depend only on the multiset of values and the group sizes:
   * Monte Carlo results do not change when rows are reordered or groups renamed (for
   * statistics symmetric in groups of equal size, such as F and Kruskal–Wallis H).
   */
  constructor(values: ArrayLike<number>, codes: ArrayLike<number>, k: number) {
    const sizes = new Int32Array(k);
    for (let i = 0; i < codes.length; i++) sizes[codes[i]]++;
    this.segmentCode = Int32Array.from({ length: k }, (_, g) => g).sort((a, b) => sizes[a] - sizes[b] || a - b);
    this.starts = new Int32Array(k + 1);
    for (let s = 0; s < k; s++) this.starts[s + 1] = this.starts[s] + sizes[this.segmentCode[s]];
    this.pool = Float64Array.from(values).sort();
    let t = 0;
    for (let i = 0; i < this.pool.length; i++) t += this.pool[i];
    this.k = k;
    this.total = t;
    this.draws = new Int32Array(Math.max(1, this.starts[k - 1]));
  }

  /** Fills `sums` (length k, indexed by group code) with the group sums of a uniformly random partition. */
  sample(rng: Rng, sums: Float64Array): void {
    const v = this.pool;
    const n = v.length;
    const k = this.k;
    const idx = this.draws;
    rng.descendingInts(idx, n, this.starts[k - 1]);
    let rest = this.total;
    for (let seg = 0; seg < k - 1; seg++) {
      const end = this.starts[seg + 1];
      let s = 0;
      for (let i = this.starts[seg]; i < end; i++) {
        const j = i + idx[i];
        const x = v[j];
        v[j] = v[i];
        v[i] = x;
        s += x;
      }
      sums[this.segmentCode[seg]] = s;
      rest -= s;
    }
    sums[this.segmentCode[k - 1]] = rest;
  }
}

/** Sums of the values of each group code for a labelling (bookkeeping). */
function groupSums(values: ArrayLike<number>, codes: ArrayLike<number>, sums: Float64Array): void {
  sums.fill(0);
  for (let i = 0; i < codes.length; i++) sums[codes[i]] += values[i];
}

/**
 * Permutation test of a statistic that depends on the data only through the group sums
 * (group sizes fixed). Exact enumeration over distinct labellings when feasible, else
 * Monte Carlo with {@link PartitionSampler}; p and `tieScale` as in {@link permutationTest}.
 * Pitman (1937); Phipson & Smyth (2010).
 */
export function groupSumsTest(
  values: ArrayLike<number>,
  codes: ArrayLike<number>,
  k: number,
  statistic: (sums: Float64Array) => number,
  options: PermutationOptions = {},
  tieScale = 0,
): PermutationResult {
  const direction = options.direction ?? "two-sided";
  const resamples = resampleCount(options);
  const sums = new Float64Array(k);
  const scheme = new GroupScheme(codes);
  if (scheme.count(resamples) <= resamples) {
    return permutationTest(
      scheme,
      () => {
        groupSums(values, scheme.labels, sums);
        return statistic(sums);
      },
      options,
      tieScale,
    );
  }
  groupSums(values, codes, sums);
  const observed = checkObserved(statistic(sums));
  const sampler = new PartitionSampler(values, codes, k);
  const rng = new Rng(options.seed ?? 1);
  return monteCarloTest(
    () => {
      sampler.sample(rng, sums);
      return statistic(sums);
    },
    observed,
    direction,
    options,
    tieScale,
  );
}

/**
 * The Monte Carlo half of a permutation test, for samplers that draw a random
 * relabelling and evaluate it in one fused pass: `draw()` is called m = resamples times
 * and returns the statistic of a fresh uniformly random relabelling; b counts those at
 * least as extreme as `observed` ({@link atLeastAsExtreme}), and p = (b + 1)/(m + 1)
 * (Phipson & Smyth 2010) with a Clopper–Pearson (1934) band. Honours keepNull and
 * onProgress like {@link permutationTest}; `tieScale` as in {@link atLeastAsExtreme}.
 */
export function monteCarloTest(
  draw: () => number,
  observed: number,
  direction: Direction,
  options: PermutationOptions = {},
  tieScale = 0,
): PermutationResult {
  const resamples = resampleCount(options);
  checkObserved(observed);
  const kept = options.keepNull ? new Float64Array(resamples) : undefined;
  const onProgress = options.onProgress;
  let count = 0;
  for (let i = 0; i < resamples; i++) {
    const t = draw();
    if (kept) kept[i] = t;
    if (atLeastAsExtreme(t, observed, direction, tieScale)) count++;
    if (onProgress && (i + 1) % PROGRESS_EVERY === 0 && onProgress((i + 1) / resamples) === true) throw new CancelledError();
  }
  return summarize(observed, count, resamples, false, direction, kept);
}
