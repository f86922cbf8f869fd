/**
 * GROUPSUMMARY: n, mean, median, SD (n − 1), CV %, min and max of each group
 * (src/summary.ts), one row per group in order of first appearance.
 */
import { describeGroups } from "../src/summary";
import { keptRows, labelsAt, numbersAt } from "./args";
import { CallArgs, noCompleteRow } from "./call-args";
import { fail, notAvailable } from "./errors";
import { Job, ResultCell, SheetResult } from "./job";

export const SUMMARY_HEADER: ResultCell[] = ["group", "n", "mean", "median", "SD", "CV %", "min", "max"];

export interface SummaryArgs {
  values: Float64Array;
  codes: Int32Array;
  names: (string | number)[];
}

/** GROUPSUMMARY(values, groups) — one group is fine here. */
export function prepareSummary(a: CallArgs): Job {
  const v = a.vector(0);
  const g = a.vector(1);
  const keep = keptRows([v, g]);
  const values = numbersAt(v, keep);
  const labels = labelsAt(g, keep);
  if (labels.k === 0) fail(notAvailable(noCompleteRow(v.name, g.name)));
  const args: SummaryArgs = { values, codes: labels.codes, names: labels.names };
  return { op: "summary", args, cost: values.length };
}

export function summary(a: SummaryArgs): SheetResult {
  const rows = describeGroups(a.values, a.codes, a.names.map(String));
  const out: ResultCell[][] = [SUMMARY_HEADER.slice()];
  rows.forEach((r, g) => out.push([a.names[g], r.n, r.mean, r.median, r.sd ?? "", r.cv ?? "", r.min, r.max]));
  return out;
}
