/**
 * Permutation test of association between two paired columns: Pearson's r, or
 * Spearman's rank correlation (Pearson's r on mid-ranks, Spearman 1904).
 *
 * Under independence every rearrangement of y against x is equally likely (Pitman
 * 1937). Only Σ xᵢyᵢ changes under a rearrangement, so the engine compares
 * n·Σ xᵢ y_π(i) − Σx·Σy (= n·S_xy, increasing in r) in O(n) per rearrangement, on
 * values shifted by their minimum (exact for integer data and for mid-ranks).
 * y is coded by its distinct values, so rearrangements that only swap tied y values
 * count once: the exact null distribution runs over the n!/Π mⱼ! distinct
 * arrangements, and is used when that count is at most the resamples. When x has
 * fewer distinct arrangements, x is rearranged instead (the same null distribution,
 * as r is symmetric in x and y). Otherwise Monte Carlo rearrangements of y with
 * p = (b + 1)/(m + 1) (Phipson & Smyth 2010).
 */
import { multinomialCount } from "./combinatorics";
import { GroupScheme, PermutationOptions, PermutationResult, permutationTest } from "./permutation";
import { midranks } from "./ranks";

export type CorrelationMethod = "pearson" | "spearman";

/**
 * Pearson's r = S_xy / √(S_xx S_yy) (Pearson 1896) with centred sums, clamped to [−1, 1].
 * Raises a RangeError when either column is constant (r undefined).
 */
export function pearson(x: ArrayLike<number>, y: ArrayLike<number>): number {
  const n = x.length;
  let mx = 0, my = 0;
  for (let i = 0; i < n; i++) {
    mx += x[i];
    my += y[i];
  }
  mx /= n;
  my /= n;
  let sxx = 0, syy = 0, sxy = 0;
  for (let i = 0; i < n; i++) {
    const a = x[i] - mx, b = y[i] - my;
    sxx += a * a;
    syy += b * b;
    sxy += a * b;
  }
  if (!(sxx > 0) || !(syy > 0)) throw new RangeError("correlation is undefined when a column is constant");
  return Math.max(-1, Math.min(1, sxy / Math.sqrt(sxx * syy)));
}

/**
 * Permutation test of correlation ("pearson", default, or "spearman"). Two-sided
 * compares |r|; "greater" tests positive association, "less" negative. `statistic`
 * and `r` are the observed coefficient; `nullDistribution` (when kept) holds r values.
 * Needs at least two pairs and neither column constant.
 * Permutation test of Pitman (1937); Spearman (1904) on mid-ranks.
 */
export function correlationTest(
  x: ArrayLike<number>,
  y: ArrayLike<number>,
  options: PermutationOptions & { method?: CorrelationMethod } = {},
): PermutationResult & { r: number; n: number } {
  const n = x.length;
  if (y.length !== n) throw new RangeError(`the two columns differ in length (${n} and ${y.length})`);
  if (n < 2) throw new RangeError("correlation needs at least two pairs");
  for (let i = 0; i < n; i++) {
    if (!Number.isFinite(x[i]) || !Number.isFinite(y[i])) throw new RangeError(`pair ${i + 1} holds a value that is not a finite number`);
  }
  const method = options.method ?? "pearson";
  if (method !== "pearson" && method !== "spearman") throw new RangeError(`unknown correlation method "${method as string}"`);
  const rx = method === "spearman" ? midranks(x) : Float64Array.from(x);
  const ry = method === "spearman" ? midranks(y) : Float64Array.from(y);
  const r = pearson(rx, ry);
  // Pairs sorted by x, then y: a canonical order, so results do not depend on row order.
  const order = Int32Array.from({ length: n }, (_, i) => i);
  order.sort((i, j) => rx[i] - rx[j] || ry[i] - ry[j]);
  let a = Float64Array.from(order, (i) => rx[i]);
  let b = Float64Array.from(order, (i) => ry[i]);

  // Rearrange the column with fewer distinct arrangements (y unless x has fewer).
  const resamples = options.resamples ?? 9999;
  const cy = distinctCodes(b);
  let codes = cy;
  if (multinomialCount(cy.sizes, resamples) > resamples) {
    const cx = distinctCodes(a);
    if (multinomialCount(cx.sizes, resamples) <= resamples) {
      codes = cx;
      const t = a;
      a = b;
      b = t;
    }
  }
  const shiftA = minimum(a);
  const fixed = a.map((v) => v - shiftA);
  const shiftB = minimum(codes.values);
  const moving = codes.values.map((v) => v - shiftB);
  let sa = 0, sb = 0;
  for (let i = 0; i < n; i++) {
    sa += fixed[i];
    sb += moving[codes.codes[i]];
  }
  const base = sa * sb;
  const scheme = new GroupScheme(codes.codes);
  const lab = scheme.labels;
  const stat = () => {
    let s = 0;
    for (let i = 0; i < n; i++) s += fixed[i] * moving[lab[i]];
    return n * s - base;
  };
  // n·Σ xy and Σx·Σy (shifted, both ≥ 0) are of the size of `base`: the scale of the
  // rounding noise, so a zero covariance ties with zero.
  const res = permutationTest(scheme, stat, options, base);
  let nullDistribution: Float64Array | undefined;
  if (res.nullDistribution) {
    // n·S_xy → r: divide by n·√(S_xx S_yy), both fixed.
    let ma = 0, mb = 0;
    for (let i = 0; i < n; i++) {
      ma += a[i];
      mb += b[i];
    }
    ma /= n;
    mb /= n;
    let saa = 0, sbb = 0;
    for (let i = 0; i < n; i++) {
      saa += (a[i] - ma) ** 2;
      sbb += (b[i] - mb) ** 2;
    }
    const scale = 1 / (n * Math.sqrt(saa * sbb));
    nullDistribution = res.nullDistribution.map((t) => Math.max(-1, Math.min(1, t * scale)));
  }
  return { ...res, statistic: r, r, n, nullDistribution };
}

/** Codes of the distinct values (0..d−1 in ascending order), the values, and their counts. */
function distinctCodes(v: Float64Array): { codes: Int32Array; values: Float64Array; sizes: Int32Array } {
  const sorted = Float64Array.from(v).sort();
  const uniq: number[] = [];
  for (let i = 0; i < sorted.length; i++) if (i === 0 || sorted[i] !== sorted[i - 1]) uniq.push(sorted[i]);
  const index = new Map<number, number>();
  uniq.forEach((u, j) => index.set(u, j));
  const codes = Int32Array.from(v, (x) => index.get(x)!);
  const sizes = new Int32Array(uniq.length);
  for (let i = 0; i < codes.length; i++) sizes[codes[i]]++;
  return { codes, values: Float64Array.from(uniq), sizes };
}

function minimum(a: Float64Array): number {
  let m = Infinity;
  for (let i = 0; i < a.length; i++) if (a[i] < m) m = a[i];
  return m;
}
