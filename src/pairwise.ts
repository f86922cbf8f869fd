/**
 * All pairwise comparisons of k groups: for each pair (a, b), in the order of the group
 * names (a before b), the difference of means a − b with a bootstrap interval, the raw
 * two-sided permutation p of that pair, and a p adjusted for the k(k − 1)/2 comparisons.
 *
 *  - Interval: bootstrap of the difference of means, resampling inside each of the two
 *    groups (./bootstrap; BCa by default).
 *  - Raw p: the pair's observations alone are relabelled (group sizes fixed), statistic
 *    the difference of means, two-sided with |difference| (Pitman 1937); exact when the
 *    C(n_a + n_b, n_a) splits are at most the requested resamples. This is
 *    {@link twoSampleTest} on the pair.
 *  - Adjustments: "holm" (Holm 1979) and "bh" (Benjamini & Hochberg 1995) on the raw p;
 *    "maxt": Westfall & Young (1993) max-T step-down from one set of relabellings of all
 *    observations among all k groups. The max-T statistic is the studentized difference
 *    |ȳ_a − ȳ_b| / √(s_a²/n_a + s_b²/n_b) (Welch-type; Janssen 1997), so that a pair with
 *    large or noisy groups does not dominate the maximum when spreads differ; each
 *    relabelling costs O(n + k²). Because the max-T and raw p come from different
 *    relabellings, the reported max-T p is raised to the raw p where it would fall below
 *    (this only makes it more conservative). "none" reports the raw p.
 *
 * Each row uses the given seed, so a row is reproduced by the two-group functions with
 * the same seed, and adding a group does not change the other rows' raw p or interval.
 */
import { BootstrapOptions, IntervalMethod, bootstrapDiffInterval } from "./bootstrap";
import { MaxTStepDown, benjaminiHochberg, holm } from "./multiplicity";
import { BlockScheme, GroupScheme, PermutationResult, ResampleOptions, forEachRelabelling, permutationTest } from "./permutation";
import { twoSampleTest } from "./twosample";

export type Adjust = "holm" | "maxt" | "bh" | "none";

export interface PairwiseOptions extends ResampleOptions {
  /** Multiplicity adjustment; default "holm". */
  adjust?: Adjust;
  /** Level of the bootstrap intervals; default 0.95. */
  level?: number;
  /** Interval method; default "bca". */
  method?: IntervalMethod;
}

export interface PairwiseRow {
  a: string;
  b: string;
  /** mean a − mean b */
  difference: number;
  /** bootstrap interval of the difference */
  lower: number;
  upper: number;
  /** raw two-sided permutation p for that pair (exact when feasible) */
  p: number;
  pAdjusted: number;
  /** true when the raw p came from every split of the pair's observations */
  exact: boolean;
}

/** Pairwise comparisons of all groups (see the file comment for the methods).
 * Pitman (1937); Holm (1979); Benjamini & Hochberg (1995); Westfall & Young (1993).
 */
export function pairwiseComparisons(
  values: ArrayLike<number>,
  codes: ArrayLike<number>,
  names: string[],
  options: PairwiseOptions = {},
): PairwiseRow[] {
  const k = names.length;
  const n = values.length;
  if (codes.length !== n) throw new RangeError(`values and groups differ in length (${n} and ${codes.length})`);
  if (k < 2) throw new RangeError("pairwise comparisons need at least 2 groups");
  const adjust = String(options.adjust ?? "holm").toLowerCase() as Adjust;
  if (adjust !== "holm" && adjust !== "maxt" && adjust !== "bh" && adjust !== "none")
    throw new RangeError(`unknown adjustment '${options.adjust}': use holm, maxt, bh or none`);
  const groups = split(values, codes, k, names);
  const resamples = options.resamples ?? 9999;
  const seed = options.seed ?? 1;
  const pairs = k * (k - 1) / 2;
  let done = 0;
  const onProgress = options.onProgress;
  const step = (f: number) => (onProgress ? onProgress((done + f) / (pairs + (adjust === "maxt" ? 1 : 0))) : undefined);

  const rows: PairwiseRow[] = [];
  for (let a = 0; a < k; a++) {
    for (let b = a + 1; b < k; b++) {
      const xa = groups[a];
      const xb = groups[b];
      const bootOptions: BootstrapOptions = { level: options.level, method: options.method, resamples, seed };
      const ci = bootstrapDiffInterval(xa, xb, "mean", bootOptions);
      // The two-group test itself (values shifted by their minimum, each sample sorted):
      // no cancellation far from 0, and the row's p is RS.TWOTEST's for the same seed.
      const test = twoSampleTest(xa, xb, {
        statistic: "mean",
        resamples,
        seed,
        direction: "two-sided",
        onProgress: onProgress ? step : undefined,
      });
      rows.push({ a: names[a], b: names[b], difference: ci.estimate, lower: ci.lower, upper: ci.upper, p: test.p, pAdjusted: test.p, exact: test.exact });
      done++;
    }
  }

  const raw = rows.map((r) => r.p);
  let adjusted: ArrayLike<number>;
  if (adjust === "holm") adjusted = holm(raw);
  else if (adjust === "bh") adjusted = benjaminiHochberg(raw);
  else if (adjust === "maxt") adjusted = maxTPairwise(values, codes, k, { resamples, seed, onProgress: onProgress ? step : undefined });
  else adjusted = raw;
  for (let i = 0; i < rows.length; i++) rows[i].pAdjusted = Math.min(1, Math.max(adjusted[i], adjust === "maxt" ? rows[i].p : 0));
  return rows;
}

/**
 * Westfall–Young max-T step-down adjusted p for every pair (a < b, row order as in
 * {@link pairwiseComparisons}), from relabellings of all observations among the k groups
 * (exact enumeration when feasible). Statistic: studentized |difference of means|.
 * Westfall & Young (1993), Algorithm 2.8; studentized as in Janssen (1997).
 */
export function maxTPairwise(values: ArrayLike<number>, codes: ArrayLike<number>, k: number, options: ResampleOptions = {}): Float64Array {
  const n = values.length;
  // centre on the grand mean so sums of squares lose no precision
  let grand = 0;
  for (let i = 0; i < n; i++) grand += values[i];
  grand /= n;
  const v = new Float64Array(n);
  const v2 = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    v[i] = values[i] - grand;
    v2[i] = v[i] * v[i];
  }
  const sizes = new Float64Array(k);
  for (let i = 0; i < n; i++) sizes[codes[i]]++;
  const sums = new Float64Array(k);
  const sq = new Float64Array(k);
  const means = new Float64Array(k);
  const varOverN = new Float64Array(k);
  const stats = new Float64Array((k * (k - 1)) / 2);

  const compute = (labels: ArrayLike<number>) => {
    sums.fill(0);
    sq.fill(0);
    for (let i = 0; i < n; i++) {
      const g = labels[i];
      sums[g] += v[i];
      sq[g] += v2[i];
    }
    for (let g = 0; g < k; g++) {
      const m = sums[g] / sizes[g];
      means[g] = m;
      varOverN[g] = Math.max(0, (sq[g] - sums[g] * m) / (sizes[g] - 1)) / sizes[g];
    }
    let t = 0;
    for (let a = 0; a < k; a++) {
      for (let b = a + 1; b < k; b++) {
        const d = Math.abs(means[a] - means[b]);
        const se = Math.sqrt(varOverN[a] + varOverN[b]);
        stats[t++] = se > 0 ? d / se : d > 0 ? Infinity : 0;
      }
    }
  };

  compute(codes);
  const acc = new MaxTStepDown(stats);
  const scheme = new GroupScheme(codes);
  const run = forEachRelabelling(
    scheme,
    () => {
      compute(scheme.labels);
      acc.add(stats);
    },
    options,
  );
  return acc.adjusted(run.exact);
}

function split(values: ArrayLike<number>, codes: ArrayLike<number>, k: number, names: string[]): Float64Array[] {
  const sizes = new Int32Array(k);
  for (let i = 0; i < codes.length; i++) {
    const g = codes[i];
    if (!(Number.isInteger(g) && g >= 0 && g < k)) throw new RangeError(`group code ${g} at row ${i + 1} is out of range`);
    const v = values[i];
    if (typeof v !== "number" || !Number.isFinite(v)) throw new RangeError(`value at row ${i + 1} is not a finite number`);
    sizes[g]++;
  }
  for (let g = 0; g < k; g++)
    if (sizes[g] < 3) throw new RangeError(`group '${names[g]}' has ${sizes[g]} value(s); each group needs at least 3 for pairwise intervals`);
  const out = Array.from(sizes, (s) => new Float64Array(s));
  const fill = new Int32Array(k);
  for (let i = 0; i < codes.length; i++) out[codes[i]][fill[codes[i]]++] = values[i];
  return out;
}

/**
 * Pairwise comparisons that respect blocks (e.g. lines compared across farms), in the
 * same row order and shape as {@link pairwiseComparisons}.
 *
 *  - Raw p, per pair (a, b): only the rows of treatments a and b are kept, laid out block
 *    by block (each block a contiguous segment, as {@link BlockScheme} requires; inside a
 *    block in a canonical order, so the row order does not matter), and the two labels
 *    are rearranged WITHIN each block only — Fisher's (1935, ch. V) randomization within
 *    blocks. Statistic: the difference of means ȳ_a − ȳ_b, two-sided with |difference|.
 *    Each block keeps its own count of a and b plots, so n_a and n_b stay fixed and
 *    ȳ_a − ȳ_b = S_a (1/n_a + 1/n_b) − T/n_b, with S_a the sum of the a-labelled values
 *    and T the pair's total: O(n) per relabelling. Exact when the Π_b C(n_ab + n_bb, n_ab)
 *    within-block relabellings are at most the requested resamples, else Monte Carlo with
 *    p = (b + 1)/(m + 1) (Phipson & Smyth 2010). Blocks holding only one of the two
 *    treatments cannot be rearranged and add a fixed amount to both means; a pair that
 *    shares no block has a single relabelling and p = 1 (no within-block evidence).
 *    In a complete block design with equal replication the difference of means equals
 *    the block-adjusted difference, and for two treatments the test equals the
 *    permutation F after blocks (blockPermutationTest in ./blocks).
 *  - Interval: the bootstrap interval of the difference of means, resampling inside each
 *    of the two treatment groups (not inside blocks), exactly as in
 *    {@link pairwiseComparisons}.
 *  - Adjustment: "holm" (Holm 1979), "bh" (Benjamini & Hochberg 1995) or "none" on the
 *    raw p. "maxt" has no within-block version here (the pairs' relabellings are not one
 *    shared set), so "maxt" is answered with Holm's adjustment, which also controls the
 *    familywise error rate; callers that print the method should say Holm.
 *
 * Every pair uses the given seed. References: Fisher (1935), The Design of Experiments,
 * ch. V; Holm (1979); Benjamini & Hochberg (1995); Phipson & Smyth (2010).
 */
export function blockedPairwiseComparisons(
  values: ArrayLike<number>,
  treatCodes: ArrayLike<number>,
  names: string[],
  blockCodes: ArrayLike<number>,
  kB: number,
  options: PairwiseOptions = {},
): PairwiseRow[] {
  const k = names.length;
  const n = values.length;
  if (treatCodes.length !== n) throw new RangeError(`values and groups differ in length (${n} and ${treatCodes.length})`);
  if (blockCodes.length !== n) throw new RangeError(`values and blocks differ in length (${n} and ${blockCodes.length})`);
  if (k < 2) throw new RangeError("pairwise comparisons need at least 2 groups");
  const adjust = String(options.adjust ?? "holm").toLowerCase() as Adjust;
  if (adjust !== "holm" && adjust !== "maxt" && adjust !== "bh" && adjust !== "none")
    throw new RangeError(`unknown adjustment '${options.adjust}': use holm, maxt, bh or none`);
  for (let i = 0; i < n; i++) {
    const bc = blockCodes[i];
    if (!(Number.isInteger(bc) && bc >= 0 && bc < kB)) throw new RangeError(`block code ${bc} at row ${i + 1} is out of range`);
  }
  const groups = split(values, treatCodes, k, names);
  const resamples = options.resamples ?? 9999;
  const seed = options.seed ?? 1;
  const pairs = (k * (k - 1)) / 2;
  let done = 0;
  const onProgress = options.onProgress;
  const step = (f: number) => (onProgress ? onProgress((done + f) / pairs) : undefined);

  const rows: PairwiseRow[] = [];
  for (let a = 0; a < k; a++) {
    for (let b = a + 1; b < k; b++) {
      const ci = bootstrapDiffInterval(groups[a], groups[b], "mean", { level: options.level, method: options.method, resamples, seed });
      const test = withinBlockPairTest(values, treatCodes, a, b, blockCodes, kB, {
        resamples,
        seed,
        onProgress: onProgress ? step : undefined,
      });
      rows.push({ a: names[a], b: names[b], difference: ci.estimate, lower: ci.lower, upper: ci.upper, p: test.p, pAdjusted: test.p, exact: test.exact });
      done++;
    }
  }
  const raw = rows.map((r) => r.p);
  const adjusted = adjust === "bh" ? benjaminiHochberg(raw) : adjust === "none" ? raw : holm(raw);
  for (let i = 0; i < rows.length; i++) rows[i].pAdjusted = Math.min(1, adjusted[i]);
  return rows;
}

/** Two-sided within-block permutation test of ȳ_a − ȳ_b on the rows of treatments a and b
 * (see {@link blockedPairwiseComparisons}). Fisher (1935, ch. V). */
function withinBlockPairTest(
  values: ArrayLike<number>,
  treatCodes: ArrayLike<number>,
  a: number,
  b: number,
  blockCodes: ArrayLike<number>,
  kB: number,
  options: ResampleOptions,
): PermutationResult {
  const rowsOf: number[] = [];
  for (let i = 0; i < values.length; i++) if (treatCodes[i] === a || treatCodes[i] === b) rowsOf.push(i);
  // Block by block; inside a block by value, then treatment (a canonical order).
  rowsOf.sort((i, j) => blockCodes[i] - blockCodes[j] || values[i] - values[j] || treatCodes[i] - treatCodes[j]);
  const m = rowsOf.length;
  const nb = new Int32Array(kB);
  for (const i of rowsOf) nb[blockCodes[i]]++;
  const starts: number[] = [];
  let acc = 0;
  for (let q = 0; q < kB; q++) {
    if (nb[q] > 0) starts.push(acc);
    acc += nb[q];
  }
  starts.push(m);
  // Centre on the pair's mean: no cancellation far from 0.
  let mean = 0;
  for (const i of rowsOf) mean += values[i];
  mean /= m;
  const v = Float64Array.from(rowsOf, (i) => values[i] - mean);
  const labels = Int32Array.from(rowsOf, (i) => (treatCodes[i] === a ? 0 : 1));
  let na = 0;
  let total = 0;
  let scale = 0;
  for (let i = 0; i < m; i++) {
    if (labels[i] === 0) na++;
    total += v[i];
    scale = Math.max(scale, Math.abs(v[i]));
  }
  const nbb = m - na;
  const scheme = new BlockScheme(labels, starts);
  const lab = scheme.labels;
  const statistic = () => {
    let sa = 0;
    for (let i = 0; i < m; i++) if (lab[i] === 0) sa += v[i];
    return sa / na - (total - sa) / nbb;
  };
  return permutationTest(scheme, statistic, { ...options, direction: "two-sided" }, scale);
}
