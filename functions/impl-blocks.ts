/**
 * BLOCKTEST: treatments compared within blocks, labels shuffled inside each block
 * (Fisher 1935, ch. V). "F": treatments after blocks (src/blocks.ts, intra-block
 * analysis); "RANK": Friedman (1937) on within-block ranks (src/friedman.ts), after
 * averaging replicate observations of a block × treatment cell (cellMeans).
 */
import { blockPermutationTest } from "../src/blocks";
import { cellMeans, permutationFriedman } from "../src/friedman";
import { keptRows, labelsAt, numbersAt } from "./args";
import { CallArgs, checkGroups } from "./call-args";
import { fail, notAvailable } from "./errors";
import { Job, SheetResult } from "./job";
import { Progress } from "./ops-types";
import { optionWord, resamplesOption, seedOption } from "./options";

export const BLOCK_STATISTICS = ["F", "RANK"] as const;

export interface BlockTestArgs {
  statistic: (typeof BLOCK_STATISTICS)[number];
  values: Float64Array;
  treat: Int32Array;
  kT: number;
  block: Int32Array;
  kB: number;
  resamples: number;
  seed: number;
}

/** BLOCKTEST(values, treatments, blocks, [statistic], [resamples], [seed]) */
export function prepareBlockTest(a: CallArgs): Job {
  const statistic = optionWord("statistic", a.raw(3), BLOCK_STATISTICS);
  const resamples = resamplesOption(a.raw(4));
  const seed = seedOption(a.raw(5));
  const v = a.vector(0);
  const t = a.vector(1);
  const b = a.vector(2);
  const keep = keptRows([v, t, b]);
  let values = numbersAt(v, keep);
  const treatments = labelsAt(t, keep);
  const blocks = labelsAt(b, keep);
  checkGroups(treatments, v.name, t.name);
  if (blocks.k < 2) fail(notAvailable(`blocks has ${blocks.k === 1 ? "a single block" : "no block"}; give at least two blocks (or use GROUPTEST).`));
  let treat = treatments.codes;
  let block = blocks.codes;
  // Every block must hold at least two treatments for shuffles inside it to matter,
  // and for the rank test every block × treatment cell needs a value.
  const cells = new Int32Array(treatments.k * blocks.k);
  for (let i = 0; i < treat.length; i++) cells[block[i] * treatments.k + treat[i]]++;
  if (statistic === "RANK") {
    for (let bb = 0; bb < blocks.k; bb++) {
      for (let tt = 0; tt < treatments.k; tt++) {
        if (cells[bb * treatments.k + tt] === 0) {
          fail(notAvailable(`block '${blocks.names[bb]}' has no value for treatment '${treatments.names[tt]}'; the rank test needs every treatment in every block (or use "F").`));
        }
      }
    }
    const m = cellMeans(values, treat, treatments.k, block, blocks.k);
    values = m.values;
    treat = m.treatCodes;
    block = m.blockCodes;
  }
  const args: BlockTestArgs = { statistic, values, treat, kT: treatments.k, block, kB: blocks.k, resamples, seed };
  return { op: "block.test", args, cost: values.length * resamples };
}

export function blockTest(a: BlockTestArgs, onProgress?: Progress): SheetResult {
  const options = { resamples: a.resamples, seed: a.seed, onProgress };
  if (a.statistic === "RANK") return permutationFriedman(a.values, a.treat, a.kT, a.block, a.kB, options).p;
  return blockPermutationTest(a.values, a.treat, a.kT, a.block, a.kB, options).p;
}
