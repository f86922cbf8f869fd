/**
 * GROUPTEST, STAT, SNR and NULLHIST: do k groups differ? One-way F (Fisher 1925;
 * permutation test Pitman 1937), the distance signal-to-noise ratio D (src/snr.ts) or
 * Kruskal–Wallis H (Kruskal & Wallis 1952), all from src/.
 */
import { kruskalWallis, permutationKW } from "../src/kruskal";
import { OneWayF, permutationF } from "../src/oneway";
import { PermutationResult } from "../src/permutation";
import { distanceRatio, permutationSNR } from "../src/snr";
import { allEqual } from "./args";
import { CallArgs, grouped } from "./call-args";
import { divByZero } from "./errors";
import { histogramTable } from "./histogram";
import { Job, SheetResult } from "./job";
import { Progress } from "./ops-types";
import { binsOption, optionWord, resamplesOption, seedOption } from "./options";

export const GROUP_STATISTICS = ["F", "SNR", "RANK"] as const;
export type GroupStatistic = (typeof GROUP_STATISTICS)[number];

export interface GroupTestArgs {
  statistic: GroupStatistic;
  values: Float64Array;
  codes: Int32Array;
  k: number;
  resamples: number;
  seed: number;
}

export interface GroupNullArgs extends GroupTestArgs {
  bins: number;
}

const statisticWord = (raw: unknown) => optionWord("statistic", raw, GROUP_STATISTICS);

// ---- argument parsing (main thread) ---------------------------------------------------

/** GROUPTEST(values, groups, [statistic], [resamples], [seed]) */
export function prepareGroupTest(a: CallArgs): Job {
  const statistic = statisticWord(a.raw(2));
  const resamples = resamplesOption(a.raw(3));
  const seed = seedOption(a.raw(4));
  const { values, labels } = grouped(a, 0, 1);
  const args: GroupTestArgs = { statistic, values, codes: labels.codes, k: labels.k, resamples, seed };
  return { op: "groups.test", args, cost: values.length * resamples };
}

/** STAT(values, groups, [statistic]) */
export function prepareGroupStat(a: CallArgs): Job {
  const statistic = statisticWord(a.raw(2));
  const { values, labels } = grouped(a, 0, 1);
  return { op: "groups.stat", args: { statistic, values, codes: labels.codes, k: labels.k }, cost: values.length };
}

/** SNR(values, groups) */
export function prepareSnr(a: CallArgs): Job {
  const { values, labels } = grouped(a, 0, 1);
  return { op: "groups.stat", args: { statistic: "SNR", values, codes: labels.codes, k: labels.k }, cost: values.length };
}

/** NULLHIST(values, groups, [statistic], [bins], [resamples], [seed]) */
export function prepareNullHist(a: CallArgs): Job {
  const statistic = statisticWord(a.raw(2));
  const bins = binsOption(a.raw(3));
  const resamples = resamplesOption(a.raw(4));
  const seed = seedOption(a.raw(5));
  const { values, labels } = grouped(a, 0, 1);
  const args: GroupNullArgs = { statistic, values, codes: labels.codes, k: labels.k, resamples, seed, bins };
  return { op: "groups.null", args, cost: values.length * resamples };
}

// ---- engine calls (inline or in the worker) -------------------------------------------

function permutation(a: GroupTestArgs, keepNull: boolean, onProgress?: Progress): PermutationResult {
  const options = { resamples: a.resamples, seed: a.seed, keepNull, onProgress };
  switch (a.statistic) {
    case "SNR":
      return permutationSNR(a.values, a.codes, a.k, options);
    case "RANK":
      return permutationKW(a.values, a.codes, a.k, options);
    default:
      return permutationF(a.values, a.codes, a.k, options);
  }
}

export function groupTest(a: GroupTestArgs, onProgress?: Progress): SheetResult {
  return permutation(a, false, onProgress).p;
}

export function groupStat(a: { statistic: GroupStatistic; values: Float64Array; codes: Int32Array; k: number }): SheetResult {
  let s: number;
  switch (a.statistic) {
    case "SNR":
      s = distanceRatio(a.values, a.codes, a.k).d;
      if (!Number.isFinite(s)) return divByZero("every group is constant, so the spread within groups is zero and D is infinite.");
      return s;
    case "RANK": {
      if (allEqual(a.values)) return divByZero("all values are equal, so H is undefined.");
      s = kruskalWallis(a.values, a.codes, a.k).h;
      break;
    }
    default:
      s = new OneWayF(a.values, a.codes, a.k).f(a.codes);
  }
  if (!Number.isFinite(s)) {
    return divByZero(allEqual(a.values) ? "all values are equal, so the statistic is undefined." : "the spread within groups is zero, so F is infinite.");
  }
  return s;
}

export function groupNull(a: GroupNullArgs, onProgress?: Progress): SheetResult {
  const r = permutation(a, true, onProgress);
  return histogramTable(r.nullDistribution ?? new Float64Array(0), r.statistic, a.bins);
}
