/**
 * TWOTEST, PAIRTEST and CORRTEST: two-sample permutation test (src/twosample.ts: mean,
 * median or Welch t, Janssen 1997), paired sign-flip test (src/paired.ts; Fisher 1935)
 * and the permutation test of correlation (src/correlation.ts; Pitman 1937).
 */
import { correlationTest } from "../src/correlation";
import { pairedTest } from "../src/paired";
import { twoSampleTest } from "../src/twosample";
import { allEqual } from "./args";
import { CallArgs, paired, sample } from "./call-args";
import { divByZero, fail, notAvailable } from "./errors";
import { Job, SheetResult } from "./job";
import { Progress } from "./ops-types";
import { DirectionWord, directionOption, optionWord, resamplesOption, seedOption } from "./options";

export const TWO_STATISTICS = ["mean", "median", "t"] as const;
export const CORRELATION_METHODS = ["pearson", "spearman"] as const;

interface Resampling {
  direction: DirectionWord;
  resamples: number;
  seed: number;
}

export interface TwoTestArgs extends Resampling {
  statistic: (typeof TWO_STATISTICS)[number];
  x: Float64Array;
  y: Float64Array;
}

/** TWOTEST(values1, values2, [direction], [statistic], [resamples], [seed]) */
export function prepareTwoTest(a: CallArgs): Job {
  const direction = directionOption(a.raw(2));
  const statistic = optionWord("statistic", a.raw(3), TWO_STATISTICS);
  const resamples = resamplesOption(a.raw(4));
  const seed = seedOption(a.raw(5));
  const min = statistic === "t" ? 2 : 1;
  const x = sample(a, 0, min);
  const y = sample(a, 1, min);
  if (x.length + y.length < 3) fail(notAvailable("values1 and values2 together need at least three numbers: add values to either sample."));
  const args: TwoTestArgs = { statistic, x, y, direction, resamples, seed };
  return { op: "two.test", args, cost: (x.length + y.length) * resamples };
}

export function twoTest(a: TwoTestArgs, onProgress?: Progress): SheetResult {
  return twoSampleTest(a.x, a.y, { statistic: a.statistic, direction: a.direction, resamples: a.resamples, seed: a.seed, onProgress }).p;
}

export interface PairTestArgs extends Resampling {
  x: Float64Array;
  y: Float64Array;
}

/** PAIRTEST(values1, values2, [direction], [resamples], [seed]) */
export function preparePairTest(a: CallArgs): Job {
  const direction = directionOption(a.raw(2));
  const resamples = resamplesOption(a.raw(3));
  const seed = seedOption(a.raw(4));
  const { x, y } = paired(a, 0, 1, 2);
  const args: PairTestArgs = { x, y, direction, resamples, seed };
  return { op: "pair.test", args, cost: x.length * resamples };
}

export function pairTest(a: PairTestArgs, onProgress?: Progress): SheetResult {
  return pairedTest(a.x, a.y, { direction: a.direction, resamples: a.resamples, seed: a.seed, onProgress }).p;
}

export interface CorrTestArgs extends Resampling {
  method: (typeof CORRELATION_METHODS)[number];
  x: Float64Array;
  y: Float64Array;
}

/** CORRTEST(x, y, [method], [direction], [resamples], [seed]) */
export function prepareCorrTest(a: CallArgs): Job {
  const method = optionWord("method", a.raw(2), CORRELATION_METHODS);
  const direction = directionOption(a.raw(3));
  const resamples = resamplesOption(a.raw(4));
  const seed = seedOption(a.raw(5));
  const { x, y } = paired(a, 0, 1, 3);
  if (allEqual(x) || allEqual(y)) {
    fail(divByZero(`${allEqual(x) ? "x" : "y"} has the same value in every complete row, so the correlation is undefined.`));
  }
  const args: CorrTestArgs = { method, x, y, direction, resamples, seed };
  return { op: "corr.test", args, cost: x.length * resamples };
}

export function corrTest(a: CorrTestArgs, onProgress?: Progress): SheetResult {
  return correlationTest(a.x, a.y, { method: a.method, direction: a.direction, resamples: a.resamples, seed: a.seed, onProgress }).p;
}
