/**
 * The arguments of one call, by position, with their parameter names (for messages),
 * blank masks and addresses; and the common data shapes built from them.
 */
import { Labels, RangeArg, count, Vector, columnsOf, keptRows, labelsAt, numbersAt, rangeArg, vectorOf } from "./args";
import { EmptyMask } from "./blanks";
import { fail, notAvailable } from "./errors";

export class CallArgs {
  constructor(
    readonly params: readonly string[],
    readonly args: readonly unknown[],
    readonly masks: readonly (EmptyMask | null)[] = [],
    readonly addresses?: readonly string[],
  ) {}

  raw(i: number): unknown {
    return this.args[i];
  }
  range(i: number): RangeArg {
    return rangeArg(this.params[i], this.args[i], this.masks[i] ?? null, this.addresses?.[i]);
  }
  vector(i: number): Vector {
    return vectorOf(this.range(i));
  }
  columns(i: number): Vector[] {
    return columnsOf(this.range(i));
  }
}

/** Numbers of one range, blanks dropped; at least `min` of them. */
export function sample(a: CallArgs, i: number, min: number): Float64Array {
  const v = a.vector(i);
  const x = numbersAt(v, keptRows([v]));
  if (x.length < min) {
    fail(notAvailable(`${v.name} has ${count(x.length, "number")} after blank cells are dropped; it needs at least ${min}: add values or select a larger range.`));
  }
  return x;
}

/** Two ranges row for row (blank in either drops the row); at least `min` complete pairs. */
export function paired(a: CallArgs, i: number, j: number, min: number): { x: Float64Array; y: Float64Array } {
  const u = a.vector(i);
  const v = a.vector(j);
  const keep = keptRows([u, v]);
  const x = numbersAt(u, keep);
  const y = numbersAt(v, keep);
  if (x.length < min) {
    fail(notAvailable(`${u.name} and ${v.name} have ${count(x.length, "complete row")} (both cells filled); at least ${min} are needed: fill the missing cells or select larger ranges.`));
  }
  return { x, y };
}

export interface Grouped {
  values: Float64Array;
  labels: Labels;
}

/** The message for ranges that share no complete row. */
export function noCompleteRow(valuesName: string, groupsName: string): string {
  return `no row has both ${valuesName} and ${groupsName} filled in: check that the two ranges cover the same rows.`;
}

function groupNames(l: Labels): string {
  return l.names.map((n) => `'${n}'`).join(", ");
}

/**
 * Values with group labels row for row (blank in either drops the row): at least two
 * groups, and at least one group with two or more values (so there is spread within
 * groups), unless `minPerGroup` asks more of every group.
 */
export function grouped(a: CallArgs, vi: number, gi: number, minPerGroup = 1): Grouped {
  const v = a.vector(vi);
  const g = a.vector(gi);
  const keep = keptRows([v, g]);
  const values = numbersAt(v, keep);
  const labels = labelsAt(g, keep);
  checkGroups(labels, v.name, g.name, minPerGroup);
  return { values, labels };
}

/** The group-count checks of {@link grouped}, for callers that build labels themselves. */
export function checkGroups(labels: Labels, valuesName: string, groupsName: string, minPerGroup = 1): void {
  if (labels.k === 0) fail(notAvailable(noCompleteRow(valuesName, groupsName)));
  if (labels.k < 2) {
    fail(notAvailable(`${groupsName} has a single group (${groupNames(labels)}) once blank rows are dropped; give at least two groups.`));
  }
  let big = 0;
  for (let g = 0; g < labels.k; g++) {
    if (labels.sizes[g] < minPerGroup) {
      fail(notAvailable(`group '${labels.names[g]}' has ${count(labels.sizes[g], "value")}; each group needs at least ${minPerGroup}: add values to it or leave it out of the ranges.`));
    }
    if (labels.sizes[g] >= 2) big++;
  }
  if (big === 0) fail(notAvailable(`every group has a single value; at least one group needs two or more values to measure the spread within groups.`));
}
