/**
 * "Are two columns associated?" — Pearson's r and Spearman's rank correlation, each
 * with a permutation p (Pitman 1937; ../correlation), beside the classical t test of r
 * (t = r √((n − 2)/(1 − r²)) on n − 2 df; Fisher 1915) and the least-squares line.
 * The permutation calls are those behind RS.CORRTEST(x, y, method, direction,
 * resamples, seed).
 */
import { correlationTest } from "../correlation";
import { tPValue } from "../distributions";
import { describe } from "../summary";
import { outcome } from "./groups";
import { Stages } from "./progress";
import type { AssociationRequest, AssociationResult, ProgressFn } from "./types";

export function analyseAssociation(req: AssociationRequest, onProgress?: ProgressFn): AssociationResult {
  const { x, y, options } = req;
  const n = x.length;
  if (y.length !== n) throw new RangeError("the two columns differ in length");
  if (n < 3) throw new RangeError("an association needs at least three pairs");
  const base = { resamples: options.resamples, seed: options.seed, direction: options.direction };
  const stages = new Stages([n, n], onProgress);
  const pe = correlationTest(x, y, { ...base, method: "pearson", keepNull: true, onProgress: stages.next() });
  const sp = correlationTest(x, y, { ...base, method: "spearman", onProgress: stages.next() });
  const r = pe.r;
  const df = n - 2;
  const t = Math.abs(r) >= 1 ? (r > 0 ? Infinity : -Infinity) : r * Math.sqrt(df / (1 - r * r));
  const p = Number.isFinite(t) ? tPValue(t, df, options.direction) : 0;
  const dx = describe(x);
  const dy = describe(y);
  let sxy = 0;
  let sxx = 0;
  for (let i = 0; i < n; i++) {
    sxy += (x[i] - dx.mean) * (y[i] - dy.mean);
    sxx += (x[i] - dx.mean) * (x[i] - dx.mean);
  }
  const slope = sxy / sxx;
  stages.done();
  return {
    question: "association",
    n,
    x: dx,
    y: dy,
    pearson: outcome(pe),
    spearman: outcome(sp),
    classical: { statistic: t, df1: df, df2: null, p },
    slope,
    intercept: dy.mean - slope * dx.mean,
    nullDistribution: pe.nullDistribution ?? new Float64Array(0),
    options,
  };
}
