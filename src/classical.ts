/**
 * Classical (normal-theory) tests shown beside the resampling answers: one-way ANOVA F,
 * Welch's heteroscedastic ANOVA, Student and Welch two-sample t, paired t, and Levene's
 * test of equal spread (mean- or median-centred). Tail probabilities come from
 * src/distributions.ts (incomplete beta and gamma functions).
 *
 * Sums of squares use two passes about the mean (no Σx² − (Σx)²/n cancellation).
 * Degenerate inputs (a group without two values where a variance is needed, no spread
 * at all) throw a RangeError with a plain message.
 */
import { fUpper, tPValue } from "./distributions";
import type { Direction } from "./permutation";
import { medianInPlace } from "./summary";

/** Per-group n, mean and sum of squared deviations (two passes). */
function groupMoments(values: ArrayLike<number>, codes: ArrayLike<number>, k: number) {
  if (values.length !== codes.length) throw new RangeError("values and group codes differ in length");
  const n = new Float64Array(k);
  const mean = new Float64Array(k);
  const ss = new Float64Array(k);
  for (let i = 0; i < values.length; i++) {
    n[codes[i]]++;
    mean[codes[i]] += values[i];
  }
  for (let g = 0; g < k; g++) mean[g] = n[g] > 0 ? mean[g] / n[g] : 0;
  for (let i = 0; i < values.length; i++) {
    const e = values[i] - mean[codes[i]];
    ss[codes[i]] += e * e;
  }
  let used = 0;
  for (let g = 0; g < k; g++) if (n[g] > 0) used++;
  return { n, mean, ss, used };
}

function sampleMoments(x: ArrayLike<number>): { n: number; mean: number; ss: number } {
  const n = x.length;
  let s = 0;
  for (let i = 0; i < n; i++) s += x[i];
  const mean = s / n;
  let ss = 0;
  for (let i = 0; i < n; i++) ss += (x[i] - mean) * (x[i] - mean);
  return { n, mean, ss };
}

/**
 * One-way ANOVA F = [SSB/(k − 1)] / [SSW/(n − k)] on F(k − 1, n − k) (Fisher 1925);
 * k counts the groups with values. F is Infinity (p = 0) when the groups have no
 * spread inside but differ; RangeError when there is no spread at all or n ≤ k.
 */
export function anovaF(values: ArrayLike<number>, codes: ArrayLike<number>, k: number): { f: number; df1: number; df2: number; p: number } {
  const { n, mean, ss, used } = groupMoments(values, codes, k);
  const total = values.length;
  if (used < 2) throw new RangeError("the F test needs at least two groups with values");
  if (total <= used) throw new RangeError("the F test needs more values than groups");
  let grand = 0;
  for (let g = 0; g < k; g++) grand += n[g] * mean[g];
  grand /= total;
  let ssb = 0;
  let ssw = 0;
  for (let g = 0; g < k; g++) {
    if (n[g] === 0) continue;
    ssb += n[g] * (mean[g] - grand) * (mean[g] - grand);
    ssw += ss[g];
  }
  const df1 = used - 1;
  const df2 = total - used;
  if (ssw <= 1e-14 * (ssb + ssw)) {
    if (ssb > 0) return { f: Infinity, df1, df2, p: 0 };
    throw new RangeError("all values are equal, so the F test has nothing to compare");
  }
  const f = ssb / df1 / (ssw / df2);
  return { f, df1, df2, p: fUpper(f, df1, df2) };
}

/**
 * Welch's (1951) ANOVA for unequal variances: weights w_g = n_g / s_g², weighted mean
 * m = Σ w_g ȳ_g / Σ w_g, A = Σ w_g (ȳ_g − m)² / (k − 1),
 * λ = Σ (1 − w_g / Σw)² / (n_g − 1), F = A / [1 + 2(k − 2)λ / (k² − 1)] on
 * (k − 1, (k² − 1) / (3λ)) df. Every group needs two values and some spread.
 */
export function welchAnova(values: ArrayLike<number>, codes: ArrayLike<number>, k: number): { f: number; df1: number; df2: number; p: number } {
  const { n, mean, ss, used } = groupMoments(values, codes, k);
  if (used < 2) throw new RangeError("the Welch F test needs at least two groups with values");
  const w = new Float64Array(k);
  let sw = 0;
  for (let g = 0; g < k; g++) {
    if (n[g] === 0) continue;
    if (n[g] < 2) throw new RangeError(`group ${g + 1} has a single value; the Welch F test needs at least two per group`);
    const v = ss[g] / (n[g] - 1);
    if (!(v > 0)) throw new RangeError(`group ${g + 1} has no spread; the Welch F test needs some spread in every group`);
    w[g] = n[g] / v;
    sw += w[g];
  }
  let m = 0;
  for (let g = 0; g < k; g++) m += w[g] * mean[g];
  m /= sw;
  let a = 0;
  let lambda = 0;
  for (let g = 0; g < k; g++) {
    if (n[g] === 0) continue;
    a += w[g] * (mean[g] - m) * (mean[g] - m);
    const h = 1 - w[g] / sw;
    lambda += (h * h) / (n[g] - 1);
  }
  const kk = used;
  a /= kk - 1;
  const f = a / (1 + (2 * (kk - 2) * lambda) / (kk * kk - 1));
  const df1 = kk - 1;
  const df2 = (kk * kk - 1) / (3 * lambda);
  return { f, df1, df2, p: fUpper(f, df1, df2) };
}

/**
 * Student's two-sample t with pooled variance (Student 1908; Fisher 1925):
 * t = (x̄ − ȳ) / √(s_p² (1/n₁ + 1/n₂)), df = n₁ + n₂ − 2. Direction "greater": x above y.
 */
export function studentT(x: ArrayLike<number>, y: ArrayLike<number>, direction: Direction = "two-sided"): { t: number; df: number; p: number } {
  const a = sampleMoments(x);
  const b = sampleMoments(y);
  if (a.n < 1 || b.n < 1 || a.n + b.n < 3) throw new RangeError("the t test needs a value in each sample and at least three in all");
  const df = a.n + b.n - 2;
  const sp2 = (a.ss + b.ss) / df;
  const se = Math.sqrt(sp2 * (1 / a.n + 1 / b.n));
  if (!(se > 0)) throw new RangeError("neither sample has any spread, so the t test cannot be formed");
  const t = (a.mean - b.mean) / se;
  return { t, df, p: tPValue(t, df, direction) };
}

/**
 * Welch's two-sample t for unequal variances (Welch 1947; Satterthwaite 1946 df):
 * t = (x̄ − ȳ) / √(s₁²/n₁ + s₂²/n₂), df = (s₁²/n₁ + s₂²/n₂)² / [(s₁²/n₁)²/(n₁ − 1) + (s₂²/n₂)²/(n₂ − 1)].
 */
export function welchT(x: ArrayLike<number>, y: ArrayLike<number>, direction: Direction = "two-sided"): { t: number; df: number; p: number } {
  const a = sampleMoments(x);
  const b = sampleMoments(y);
  if (a.n < 2 || b.n < 2) throw new RangeError("the Welch t test needs at least two values in each sample");
  const va = a.ss / (a.n - 1) / a.n;
  const vb = b.ss / (b.n - 1) / b.n;
  const se2 = va + vb;
  if (!(se2 > 0)) throw new RangeError("neither sample has any spread, so the Welch t test cannot be formed");
  const t = (a.mean - b.mean) / Math.sqrt(se2);
  const df = (se2 * se2) / ((va * va) / (a.n - 1) + (vb * vb) / (b.n - 1));
  return { t, df, p: tPValue(t, df, direction) };
}

/**
 * Paired t: the one-sample t of d = x − y, t = d̄ / (s_d / √n), df = n − 1 (Student 1908).
 * Direction "greater": x above y.
 */
export function pairedT(
  x: ArrayLike<number>,
  y: ArrayLike<number>,
  direction: Direction = "two-sided",
): { t: number; df: number; p: number; meanDifference: number } {
  if (x.length !== y.length) throw new RangeError("the paired t test needs two ranges of the same length");
  const n = x.length;
  if (n < 2) throw new RangeError("the paired t test needs at least two pairs");
  const d = new Float64Array(n);
  for (let i = 0; i < n; i++) d[i] = x[i] - y[i];
  const m = sampleMoments(d);
  const se = Math.sqrt(m.ss / (n - 1) / n);
  if (!(se > 0)) throw new RangeError("all differences are equal, so the paired t test cannot be formed");
  const t = m.mean / se;
  return { t, df: n - 1, p: tPValue(t, n - 1, direction), meanDifference: m.mean };
}

/**
 * Levene's (1960) test of equal spread: the one-way ANOVA F of z_i = |y_i − c_g|, where c_g
 * is the group mean, or with center "median" the group median (Brown & Forsythe 1974).
 * W on F(k − 1, n − k).
 */
export function levene(
  values: ArrayLike<number>,
  codes: ArrayLike<number>,
  k: number,
  center: "mean" | "median" = "median",
): { w: number; df1: number; df2: number; p: number } {
  if (values.length !== codes.length) throw new RangeError("values and group codes differ in length");
  const centre = new Float64Array(k);
  if (center === "mean") {
    centre.set(groupMoments(values, codes, k).mean);
  } else {
    const sizes = new Int32Array(k);
    for (let i = 0; i < codes.length; i++) sizes[codes[i]]++;
    const groups = Array.from(sizes, (s) => new Float64Array(s));
    const fill = new Int32Array(k);
    for (let i = 0; i < codes.length; i++) groups[codes[i]][fill[codes[i]]++] = values[i];
    for (let g = 0; g < k; g++) if (sizes[g] > 0) centre[g] = medianInPlace(groups[g]);
  }
  const z = new Float64Array(values.length);
  for (let i = 0; i < values.length; i++) z[i] = Math.abs(values[i] - centre[codes[i]]);
  let spread = false;
  for (let i = 0; i < z.length && !spread; i++) spread = z[i] > 0;
  if (!spread) throw new RangeError("no group has any spread, so the test of equal spread cannot be formed");
  const r = anovaF(z, codes, k);
  return { w: r.f, df1: r.df1, df2: r.df2, p: r.p };
}
