/**
 * PAIRWISE and LETTERS: all pairwise comparisons of group means (src/pairwise.ts:
 * bootstrap interval of each difference, pair-wise permutation p, Holm 1979 /
 * Benjamini & Hochberg 1995 / Westfall & Young 1993 max-T adjustment) and the compact
 * letter display built from them (src/letters.ts; Piepho 2004).
 */
import { splitByGroup } from "../src/groups";
import { lettersFromPairwise } from "../src/letters";
import { Adjust, pairwiseComparisons } from "../src/pairwise";
import { mean } from "../src/summary";
import { CallArgs, grouped } from "./call-args";
import { Job, ResultCell, SheetResult } from "./job";
import { MIN_BOOTSTRAP_N } from "./impl-intervals";
import { Progress } from "./ops-types";
import { alphaOption, levelOption, optionWord, resamplesOption, seedOption } from "./options";

export const ADJUST_WORDS = ["holm", "maxt", "bh", "none"] as const;

export interface PairwiseArgs {
  values: Float64Array;
  codes: Int32Array;
  /** Display names (numbers or text), by code. */
  names: (string | number)[];
  adjust: Adjust;
  level: number;
  resamples: number;
  seed: number;
}

export interface LettersArgs extends Omit<PairwiseArgs, "level"> {
  alpha: number;
}

/** Cost of all pairs: each pair's bootstrap and permutation run over its own rows. */
function pairwiseCost(sizes: Int32Array, resamples: number, adjust: Adjust): number {
  const k = sizes.length;
  let n = 0;
  for (let g = 0; g < k; g++) n += sizes[g];
  return 2 * Math.max(1, k - 1) * n * resamples + (adjust === "maxt" ? n * resamples : 0);
}

/** PAIRWISE(values, groups, [adjust], [level], [resamples], [seed]) */
export function preparePairwise(a: CallArgs): Job {
  const adjust = optionWord("adjust", a.raw(2), ADJUST_WORDS);
  const level = levelOption(a.raw(3));
  const resamples = resamplesOption(a.raw(4));
  const seed = seedOption(a.raw(5));
  const { values, labels } = grouped(a, 0, 1, MIN_BOOTSTRAP_N);
  const args: PairwiseArgs = { values, codes: labels.codes, names: labels.names, adjust, level, resamples, seed };
  return { op: "pairwise", args, cost: pairwiseCost(labels.sizes, resamples, adjust) };
}

/** LETTERS(values, groups, [alpha], [adjust], [resamples], [seed]) */
export function prepareLetters(a: CallArgs): Job {
  const alpha = alphaOption(a.raw(2));
  const adjust = optionWord("adjust", a.raw(3), ADJUST_WORDS);
  const resamples = resamplesOption(a.raw(4));
  const seed = seedOption(a.raw(5));
  const { values, labels } = grouped(a, 0, 1, MIN_BOOTSTRAP_N);
  const args: LettersArgs = { values, codes: labels.codes, names: labels.names, adjust, alpha, resamples, seed };
  return { op: "letters", args, cost: pairwiseCost(labels.sizes, resamples, adjust) };
}

/** "95" for 0.95, "99.5" for 0.995. */
function percent(level: number): string {
  return String(Math.round(level * 1e6) / 1e4);
}

export function pairwise(a: PairwiseArgs, onProgress?: Progress): SheetResult {
  const text = a.names.map(String);
  const shown = new Map(text.map((t, i) => [t, a.names[i]]));
  const rows = pairwiseComparisons(a.values, a.codes, text, { adjust: a.adjust, level: a.level, resamples: a.resamples, seed: a.seed, onProgress });
  const pct = percent(a.level);
  const out: ResultCell[][] = [["group 1", "group 2", "difference", `lower ${pct} %`, `upper ${pct} %`, "p", "adjusted p"]];
  for (const r of rows) out.push([shown.get(r.a) ?? r.a, shown.get(r.b) ?? r.b, r.difference, r.lower, r.upper, r.p, r.pAdjusted]);
  return out;
}

export function letters(a: LettersArgs, onProgress?: Progress): SheetResult {
  const text = a.names.map(String);
  const k = text.length;
  const rows = pairwiseComparisons(a.values, a.codes, text, { adjust: a.adjust, resamples: a.resamples, seed: a.seed, onProgress });
  const groups = splitByGroup(a.values, a.codes, k);
  const means = groups.map((g) => mean(g));
  const ls = lettersFromPairwise(text, means, rows, a.alpha);
  const order = Array.from({ length: k }, (_, i) => i).sort((i, j) => means[j] - means[i] || i - j);
  const out: ResultCell[][] = [["group", "n", "mean", "letters"]];
  for (const g of order) out.push([a.names[g], groups[g].length, means[g], ls[g]]);
  return out;
}
