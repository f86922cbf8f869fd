/**
 * The op table: every engine operation a sheet function can ask for, by name, as a
 * function of plain data. The same table runs inline (small jobs, tests, no Worker)
 * and inside the Web Worker (functions/worker.ts), so both give identical answers.
 */
import { CancelledError } from "../src/permutation";
import { SheetError, SheetErrorSignal, notAvailable } from "./errors";
import { blockTest } from "./impl-blocks";
import { groupNull, groupStat, groupTest } from "./impl-groups";
import { diffInterval, interval } from "./impl-intervals";
import { letters, pairwise } from "./impl-pairwise";
import { summary } from "./impl-summary";
import { traitTest } from "./impl-traits";
import { corrTest, pairTest, twoTest } from "./impl-two";
import { SheetResult } from "./job";
import { Progress } from "./ops-types";

// eslint-disable-next-line @typescript-eslint/no-explicit-any
type Op = (args: any, onProgress?: Progress) => SheetResult;

export const ops: Record<string, Op> = {
  "groups.test": groupTest,
  "groups.stat": groupStat,
  "groups.null": groupNull,
  "two.test": twoTest,
  "pair.test": pairTest,
  "corr.test": corrTest,
  "block.test": blockTest,
  interval,
  diffinterval: diffInterval,
  pairwise,
  letters,
  summary,
  "traits.test": traitTest,
};

/**
 * Runs one operation. Engine input errors (RangeError: too few values, a constant
 * column, …) become #N/A with the engine's plain message; a result that is not a
 * finite number becomes #NUM!. Cancellation propagates as CancelledError.
 */
export function runOp(op: string, args: unknown, onProgress?: Progress): SheetResult {
  const f = Object.prototype.hasOwnProperty.call(ops, op) ? ops[op] : undefined;
  if (!f) return notAvailable(`unknown operation ${op}.`);
  try {
    return checkResult(f(args, onProgress));
  } catch (e) {
    if (e instanceof CancelledError) throw e;
    if (e instanceof SheetErrorSignal) return e.error;
    if (e instanceof RangeError) return notAvailable(sentence(e.message));
    return notAvailable(`the calculation failed: ${sentence(e instanceof Error ? e.message : String(e))}`);
  }
}

function sentence(s: string): string {
  const t = s.trim();
  return /[.!?]$/.test(t) ? t : `${t}.`;
}

/** Never NaN, ±Infinity, null or undefined in what reaches a cell. */
export function checkResult(r: SheetResult): SheetResult {
  if (r instanceof SheetError) return r;
  if (typeof r === "number") return Number.isFinite(r) ? r : new SheetError("#NUM!", "the result is not a finite number.");
  if (typeof r === "string") return r;
  if (Array.isArray(r)) {
    if (r.length === 0) return notAvailable("the result is empty.");
    return r.map((row) => row.map((c) => (typeof c === "number" ? (Number.isFinite(c) ? c : "") : typeof c === "string" ? c : "")));
  }
  return notAvailable("the calculation gave no result.");
}
