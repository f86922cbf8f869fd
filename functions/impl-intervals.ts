/**
 * INTERVAL and DIFFINTERVAL: bootstrap confidence intervals (src/bootstrap.ts:
 * percentile, basic, BCa — Efron 1987; Efron & Tibshirani 1993), spilled as one row
 * estimate | lower | upper, so a column of calls lines up under one header.
 */
import { bootstrapDiffInterval, bootstrapInterval } from "../src/bootstrap";
import { mean } from "../src/summary";
import { CallArgs, sample } from "./call-args";
import { divByZero, fail } from "./errors";
import { Job, SheetResult } from "./job";
import { Progress } from "./ops-types";
import { levelOption, optionWord, resamplesOption, seedOption } from "./options";

export const INTERVAL_STATISTICS = ["mean", "median", "sd", "cv", "trimmed"] as const;
export const DIFF_STATISTICS = ["mean", "median", "ratio"] as const;
/** Method words as typed; "BCa" is the engine's "bca". */
export const INTERVAL_METHODS = ["BCa", "percentile", "basic"] as const;

type MethodWord = (typeof INTERVAL_METHODS)[number];
const engineMethod = (m: MethodWord) => (m === "BCa" ? "bca" : m);

/** The bootstrap needs at least this many values in each sample (src/bootstrap.ts). */
export const MIN_BOOTSTRAP_N = 3;

export interface IntervalArgs {
  statistic: (typeof INTERVAL_STATISTICS)[number];
  x: Float64Array;
  level: number;
  method: MethodWord;
  resamples: number;
  seed: number;
}

/** INTERVAL(values, [statistic], [level], [method], [resamples], [seed]) */
export function prepareInterval(a: CallArgs): Job {
  const statistic = optionWord("statistic", a.raw(1), INTERVAL_STATISTICS);
  const level = levelOption(a.raw(2));
  const method = optionWord("method", a.raw(3), INTERVAL_METHODS);
  const resamples = resamplesOption(a.raw(4));
  const seed = seedOption(a.raw(5));
  const x = sample(a, 0, MIN_BOOTSTRAP_N);
  if (statistic === "cv" && mean(x) === 0) fail(divByZero("the mean of values is 0, so the CV % is undefined."));
  const args: IntervalArgs = { statistic, x, level, method, resamples, seed };
  return { op: "interval", args, cost: x.length * resamples };
}

export function interval(a: IntervalArgs, onProgress?: Progress): SheetResult {
  const r = bootstrapInterval(a.x, a.statistic, { level: a.level, method: engineMethod(a.method), resamples: a.resamples, seed: a.seed, onProgress });
  return [[r.estimate, r.lower, r.upper]];
}

export interface DiffIntervalArgs {
  statistic: (typeof DIFF_STATISTICS)[number];
  x: Float64Array;
  y: Float64Array;
  level: number;
  method: MethodWord;
  resamples: number;
  seed: number;
}

/** DIFFINTERVAL(values1, values2, [statistic], [level], [method], [resamples], [seed]) */
export function prepareDiffInterval(a: CallArgs): Job {
  const statistic = optionWord("statistic", a.raw(2), DIFF_STATISTICS);
  const level = levelOption(a.raw(3));
  const method = optionWord("method", a.raw(4), INTERVAL_METHODS);
  const resamples = resamplesOption(a.raw(5));
  const seed = seedOption(a.raw(6));
  const x = sample(a, 0, MIN_BOOTSTRAP_N);
  const y = sample(a, 1, MIN_BOOTSTRAP_N);
  if (statistic === "ratio" && mean(y) === 0) fail(divByZero("the mean of values2 is 0, so values1 cannot be expressed as a % of it."));
  const args: DiffIntervalArgs = { statistic, x, y, level, method, resamples, seed };
  return { op: "diffinterval", args, cost: (x.length + y.length) * resamples };
}

export function diffInterval(a: DiffIntervalArgs, onProgress?: Progress): SheetResult {
  const r = bootstrapDiffInterval(a.x, a.y, a.statistic, { level: a.level, method: engineMethod(a.method), resamples: a.resamples, seed: a.seed, onProgress });
  return [[r.estimate, r.lower, r.upper]];
}
