/**
 * "Do two paired measurements differ?" — e.g. the same samples before and after a
 * treatment. The differences d = x − y are tested by sign flips (Fisher 1935, §21;
 * ../paired), by the Wilcoxon (1945) signed-rank test (../signedrank) and by the
 * classical paired t (Student 1908), with bootstrap intervals of the mean and median
 * difference (pairs resampled; Efron & Tibshirani 1993, §6.7).
 *
 * The sign-flip p is the engine call behind RS.PAIRTEST(x, y, direction, resamples,
 * seed), so a block's live formula agrees with the panel.
 */
import { bootstrapPairedInterval } from "../bootstrap";
import { pairedT } from "../classical";
import { pairedTest } from "../paired";
import { signedRankTest } from "../signedrank";
import { describe } from "../summary";
import { outcome } from "./groups";
import { Stages } from "./progress";
import type { PairedRequest, PairedResult, ProgressFn } from "./types";

export function analysePaired(req: PairedRequest, onProgress?: ProgressFn): PairedResult {
  const { x, y, options } = req;
  const n = x.length;
  if (y.length !== n) throw new RangeError("the two columns differ in length");
  if (n < 3) throw new RangeError("a paired comparison needs at least three pairs");
  const d = new Float64Array(n);
  const counts = { up: 0, down: 0, same: 0 };
  for (let i = 0; i < n; i++) {
    d[i] = x[i] - y[i];
    if (d[i] > 0) counts.up++;
    else if (d[i] < 0) counts.down++;
    else counts.same++;
  }
  const base = { resamples: options.resamples, seed: options.seed };
  const stages = new Stages([n, n, n, n], onProgress);

  const flip = pairedTest(x, y, { ...base, direction: options.direction, keepNull: true, onProgress: stages.next() });
  let signedRank: PairedResult["signedRank"] = null;
  const srProgress = stages.next();
  try {
    const sr = signedRankTest(d, { ...base, direction: options.direction, onProgress: srProgress });
    if (sr.pExact !== null) signedRank = { v: sr.v, p: sr.pExact, how: "exact", outcome: null };
    else if (sr.pPermutation) signedRank = { v: sr.v, p: sr.pPermutation.p, how: "permutation", outcome: outcome(sr.pPermutation) };
    else signedRank = { v: sr.v, p: sr.pNormal, how: "normal", outcome: null };
  } catch (e) {
    if (!(e instanceof RangeError)) throw e;
  }
  let t: PairedResult["pairedT"];
  try {
    const pt = pairedT(x, y, options.direction);
    t = { statistic: pt.t, df1: pt.df, df2: null, p: pt.p };
  } catch (e) {
    if (!(e instanceof RangeError)) throw e;
    t = { statistic: NaN, df1: n - 1, df2: null, p: NaN };
  }
  const boot = { ...base, level: options.level, method: options.method };
  const interval = bootstrapPairedInterval(x, y, "mean", { ...boot, onProgress: stages.next() });
  const medianInterval = bootstrapPairedInterval(x, y, "median", { ...boot, onProgress: stages.next() });
  const dy = describe(y);
  stages.done();
  return {
    question: "paired",
    n,
    x: describe(x),
    y: dy,
    d: describe(d),
    signFlip: { ...outcome(flip), nonZero: flip.nonZero },
    signedRank,
    pairedT: t,
    interval,
    medianInterval,
    percentChange: dy.mean !== 0 ? (100 * flip.meanDifference) / dy.mean : NaN,
    counts,
    nullDistribution: flip.nullDistribution ?? new Float64Array(0),
    options,
  };
}
