/**
 * TRAITTEST: do groups differ on several traits at once? PERMANOVA pseudo-F on
 * Euclidean distances between rows (Anderson 2001; McArdle & Anderson 2001), traits
 * standardized first by default (src/multivariate.ts), p from relabelling the groups.
 */
import { permanova } from "../src/multivariate";
import { allEqual, count, keptRows, labelsAt, numbersAt } from "./args";
import { CallArgs, checkGroups } from "./call-args";
import { fail, notAvailable } from "./errors";
import { Job, SheetResult } from "./job";
import { Progress } from "./ops-types";
import { optionWord, resamplesOption, seedOption } from "./options";

export const SCALE_WORDS = ["standardize", "none"] as const;

export interface TraitTestArgs {
  traits: Float64Array[];
  codes: Int32Array;
  k: number;
  scale: (typeof SCALE_WORDS)[number];
  resamples: number;
  seed: number;
}

/** TRAITTEST(traits, groups, [scale], [resamples], [seed]) */
export function prepareTraitTest(a: CallArgs): Job {
  const scale = optionWord("scale", a.raw(2), SCALE_WORDS);
  const resamples = resamplesOption(a.raw(3));
  const seed = seedOption(a.raw(4));
  const block = a.range(0);
  const g = a.vector(1);
  if (block.rows !== g.length) {
    const hint = block.cols === g.length ? " Put one row per plot or sample and one column per trait." : "";
    fail(notAvailable(`traits has ${count(block.rows, "row")} but groups has ${count(g.length, "cell")}: give one group label per row of traits.${hint}`));
  }
  const columns = a.columns(0);
  const keep = keptRows([...columns, g]);
  const traits = columns.map((c) => numbersAt(c, keep));
  const labels = labelsAt(g, keep);
  checkGroups(labels, "traits", g.name);
  if (keep.length <= labels.k) fail(notAvailable(`there are ${keep.length} complete rows for ${labels.k} groups; more rows than groups are needed: add rows (plots or samples) or fill the blank cells.`));
  if (traits.every((t) => allEqual(t))) fail(notAvailable("every trait has the same value in every complete row, so there is nothing to compare: check that traits covers the measured columns."));
  const args: TraitTestArgs = { traits, codes: labels.codes, k: labels.k, scale, resamples, seed };
  return { op: "traits.test", args, cost: keep.length * traits.length * resamples };
}

export function traitTest(a: TraitTestArgs, onProgress?: Progress): SheetResult {
  return permanova(a.traits, a.codes, a.k, { scale: a.scale, resamples: a.resamples, seed: a.seed, onProgress }).p;
}
