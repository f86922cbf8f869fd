/**
 * Distance signal-to-noise ratio of a grouping and its permutation test.
 *
 * D = (mean |xᵢ − xⱼ| over pairs in different groups) ÷ (mean |xᵢ − xⱼ| over pairs in the
 * same group), unordered pairs i < j. D near 1: groups are no further apart than
 * observations inside a group; large D: the grouping separates the values. It belongs
 * with the distance-based comparisons of between- and within-group distances (Mantel
 * 1967; Clarke 1993; Anderson 2001), here with |xᵢ − xⱼ| in one dimension; absolute
 * rather than squared differences make it less dominated by a single outlier than F.
 *
 * Fast evaluation. With the values sorted once, x₍₀₎ ≤ … ≤ x₍ₙ₋₁₎, for one group with
 * sorted members y₀ ≤ … ≤ y_{m−1}
 *   Σ_{i<j} (yⱼ − yᵢ) = Σ_r y_r (2r − m + 1) = Σ_{r=1}^{m−1} (y_r − y_{r−1}) · r · (m − r).
 * Splitting each member gap into the gaps gₛ = x₍ₛ₎ − x₍ₛ₋₁₎ of the pooled sorted values,
 * the within-group sum of a labelling is
 *   W = Σ_{s=1}^{n−1} gₛ · φₛ,   φₛ = Σ_g c_g(s) (n_g − c_g(s)),
 * with c_g(s) the number of group-g members below position s (A, the sum over all
 * pairs, is the same with φₛ = s(n − s)). One pass over the sorted order gives W
 * (c(n_g − c) is symmetric, so the engine passes from the top down): a member of group g
 * met after c others of g adds n_g − 1 − 2c to φ, an integer. Every term gₛ·φₛ is ≥ 0, so
 * there is no cancellation, tied values add exactly 0 and constant groups give W = 0
 * exactly. O(n) per relabelling; the between sum is A − W, and the pair counts
 * P_w = Σ_g n_g(n_g − 1)/2, P_b = n(n − 1)/2 − P_w are fixed when group sizes are.
 * So D = (P_w / P_b)(A / W − 1) is a decreasing function of W, and the permutation test
 * compares −W (finite even when W = 0).
 *
 * Degenerate cases (never NaN): W = 0 and A > 0 (every group constant, values differ
 * between groups) gives D = Infinity; all values equal (A = 0) gives D = 1 (no
 * separation) and a permutation p of 1. Fewer than two non-empty groups, or no group
 * with two members, leaves D undefined and raises a RangeError.
 */
import { GroupScheme, PermutationOptions, PermutationResult, monteCarloTest, permutationTest, resampleCount } from "./permutation";
import { Rng } from "./random";

/** Precomputed sorted layout for evaluating D under many relabellings.
 * See the file comment (Mantel 1967; Anderson 2001).
 */
export class DistanceRatio {
  readonly n: number;
  readonly k: number;
  /** Values in ascending order. */
  readonly sorted: Float64Array;
  /** gaps[s] = sorted[s] − sorted[s − 1] (gaps[0] = 0). */
  private readonly gaps: Float64Array;
  /** Row index of each sorted position. */
  readonly order: Int32Array;
  /** Group sizes of the labelling given to the constructor (kept by relabellings). */
  readonly sizes: Int32Array;
  /** Sum of |xᵢ − xⱼ| over all unordered pairs. */
  readonly totalSum: number;
  /** Number of within-group and between-group pairs for {@link sizes}. */
  readonly withinPairs: number;
  readonly betweenPairs: number;
  /** Per group n_g − 1 − 2c during a pass, and its starting values. */
  private readonly step: Float64Array;
  private readonly stepStart: Float64Array;
  private readonly scratchSizes: Int32Array;

  /**
   * @param values observations (finite numbers)
   * @param codes group code 0..k−1 of each observation
   * @param k number of group codes
   */
  constructor(values: ArrayLike<number>, codes: ArrayLike<number>, k: number) {
    const n = values.length;
    if (codes.length !== n) throw new RangeError("values and group codes differ in length");
    for (let i = 0; i < n; i++) {
      if (!Number.isFinite(values[i])) throw new RangeError(`value ${i + 1} is not a finite number`);
      const c = codes[i];
      if (!(c >= 0 && c < k && Number.isInteger(c))) throw new RangeError(`group code ${i + 1} is outside 0..${k - 1}`);
    }
    this.n = n;
    this.k = k;
    const order = Int32Array.from({ length: n }, (_, i) => i);
    // Ties are broken by group code, so the sorted labelling (and hence every Monte Carlo
    // draw) does not depend on the order of the rows.
    order.sort((a, b) => values[a] - values[b] || codes[a] - codes[b]);
    this.order = order;
    this.sorted = Float64Array.from(order, (i) => values[i]);
    this.sizes = new Int32Array(k);
    for (let i = 0; i < n; i++) this.sizes[codes[i]]++;
    this.gaps = new Float64Array(n);
    let a = 0;
    for (let r = 1; r < n; r++) {
      this.gaps[r] = this.sorted[r] - this.sorted[r - 1];
      a += this.gaps[r] * (r * (n - r));
    }
    this.totalSum = a;
    this.withinPairs = pairsWithin(this.sizes);
    this.betweenPairs = (n * (n - 1)) / 2 - this.withinPairs;
    this.step = new Float64Array(k);
    this.stepStart = Float64Array.from(this.sizes, (m) => m - 1);
    this.scratchSizes = new Int32Array(k);
    checkPairs(this.sizes, this.withinPairs, this.betweenPairs);
  }

  /** Labels given in row order, rearranged into sorted order (written to `out`). */
  toSorted(labels: ArrayLike<number>, out: Int32Array = new Int32Array(this.n)): Int32Array {
    for (let r = 0; r < this.n; r++) out[r] = labels[this.order[r]];
    return out;
  }

  /**
   * Within-group sum W = Σ_g Σ_{i<j in g} |xᵢ − xⱼ| for labels given in sorted order, with
   * the constructor's group sizes; one pass, no allocation (the permutation hot path).
   */
  withinSumSorted(sortedLabels: ArrayLike<number>): number {
    return weightedGaps(this.gaps, sortedLabels, this.stepStart, this.step);
  }

  /**
   * Draws a uniformly random relabelling in place (Fisher–Yates, Durstenfeld 1964, on
   * labels in sorted order) and returns its within-group sum W: the shuffle fixes
   * positions from the top down, and each one is passed as soon as it is fixed, in the
   * same order and arithmetic as {@link withinSumSorted}. One loop, no allocation.
   */
  sampleWithinSum(rng: Rng, sortedLabels: Int32Array): number {
    const step = this.step;
    step.set(this.stepStart);
    const gaps = this.gaps;
    let phi = 0;
    let w = 0;
    for (let s = sortedLabels.length - 1; s > 0; s--) {
      const j = rng.int(s + 1);
      const g = sortedLabels[j];
      sortedLabels[j] = sortedLabels[s];
      sortedLabels[s] = g;
      const d = step[g];
      phi += d;
      step[g] = d - 2;
      w += gaps[s] * phi;
    }
    return w;
  }

  /** D, between and within means for labels in row order (any group sizes); O(n). */
  summary(labels: ArrayLike<number>): { d: number; between: number; within: number } {
    const sz = this.scratchSizes;
    sz.fill(0);
    for (let i = 0; i < this.n; i++) sz[labels[i]]++;
    const pw = pairsWithin(sz);
    const pb = (this.n * (this.n - 1)) / 2 - pw;
    checkPairs(sz, pw, pb);
    const lab = this.toSorted(labels);
    const start = Float64Array.from(sz, (m) => m - 1);
    const w = weightedGaps(this.gaps, lab, start, this.step);
    const between = Math.max(0, this.totalSum - w) / pb;
    const within = w / pw;
    return { d: ratio(between, within), between, within };
  }

  /** D for labels in row order; O(n). */
  d(labels: ArrayLike<number>): number {
    return this.summary(labels).d;
  }

  /** D from a within-group sum W under the constructor's group sizes. */
  dFromWithinSum(w: number): number {
    return ratio(Math.max(0, this.totalSum - w) / this.betweenPairs, w / this.withinPairs);
  }
}

/**
 * W = Σ_s gaps[s] · φ_s for labels in sorted order (see the file comment), passing the
 * positions from the top down; no allocation.
 */
function weightedGaps(gaps: Float64Array, lab: ArrayLike<number>, start: Float64Array, step: Float64Array): number {
  step.set(start);
  let phi = 0;
  let w = 0;
  for (let s = gaps.length - 1; s > 0; s--) {
    const g = lab[s];
    const d = step[g];
    phi += d;
    step[g] = d - 2;
    w += gaps[s] * phi;
  }
  return w;
}

function pairsWithin(sizes: Int32Array): number {
  let p = 0;
  for (let g = 0; g < sizes.length; g++) p += (sizes[g] * (sizes[g] - 1)) / 2;
  return p;
}

function checkPairs(sizes: Int32Array, pw: number, pb: number): void {
  let groups = 0;
  for (let g = 0; g < sizes.length; g++) if (sizes[g] > 0) groups++;
  if (groups < 2 || pb <= 0) throw new RangeError("the distance ratio needs at least two groups with observations");
  if (pw <= 0) throw new RangeError("the distance ratio needs a group with at least two observations");
}

/** between / within, with Infinity for within = 0 < between and 1 when both are 0. */
function ratio(between: number, within: number): number {
  if (within > 0) return between / within;
  return between > 0 ? Infinity : 1;
}

/**
 * Distance signal-to-noise ratio D of a grouping, with the mean |xᵢ − xⱼ| between groups
 * and within groups (unordered pairs). O(n log n) for the sort, then O(n). D is
 * Infinity when every group is constant but groups differ, 1 when all values are equal.
 * Mantel (1967); Anderson (2001).
 */
export function distanceRatio(
  values: ArrayLike<number>,
  codes: ArrayLike<number>,
  k: number,
): { d: number; between: number; within: number } {
  return new DistanceRatio(values, codes, k).summary(codes);
}

/**
 * Permutation test of the distance ratio D (direction "greater": large D means the
 * groups separate the values). Labels are rearranged with group sizes fixed; each
 * relabelling costs one O(n) pass over the values sorted once. Exact enumeration when
 * the distinct labellings are at most the resamples, else Monte Carlo with
 * p = (b + 1)/(m + 1) (Phipson & Smyth 2010). Any `direction` in the options is
 * ignored. `statistic` and `d` are the observed D (possibly Infinity, never NaN);
 * `nullDistribution` (when kept) holds D of each relabelling.
 */
export function permutationSNR(
  values: ArrayLike<number>,
  codes: ArrayLike<number>,
  k: number,
  options: PermutationOptions = {},
): PermutationResult & { d: number } {
  const layout = new DistanceRatio(values, codes, k);
  const sortedLabels = layout.toSorted(codes);
  const resamples = resampleCount(options);
  const scheme = new GroupScheme(sortedLabels);
  // −W is increasing in D and finite, so ties and W = 0 need no special handling.
  const observed = -layout.withinSumSorted(sortedLabels);
  let result: PermutationResult;
  if (scheme.count(resamples) <= resamples) {
    result = permutationTest(scheme, () => -layout.withinSumSorted(scheme.labels), { ...options, direction: "greater" });
  } else {
    // Monte Carlo: shuffle and pass fused in one loop (same law as GroupScheme.random).
    const rng = new Rng(options.seed ?? 1);
    result = monteCarloTest(() => -layout.sampleWithinSum(rng, sortedLabels), observed, "greater", options);
  }
  const d = layout.dFromWithinSum(-observed);
  const nullDistribution = result.nullDistribution?.map((t) => layout.dFromWithinSum(-t));
  return { ...result, statistic: d, d, nullDistribution };
}
