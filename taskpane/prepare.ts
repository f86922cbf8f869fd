/**
 * From the cells the panel read to an analysis request: the chosen columns are parsed
 * exactly as the sheet functions parse their ranges (functions/args.ts: blank rows
 * dropped row for row, text in a number column reported by position, labels compared
 * as Excel compares text), so the panel's numbers and the block's live formulas agree.
 */
import { keptRows, labelsAt, numbersAt, rangeArg, vectorOf, Vector } from "../functions/args";
import { checkGroups } from "../functions/call-args";
import { SheetErrorSignal } from "../functions/errors";
import type { IntervalStatistic } from "../src/bootstrap";
import type { TraitScale } from "../src/multivariate";
import type { AnalysisOptions, AnalysisRequest, GroupStatisticWord, Question } from "../src/analysis/types";
import type { ColumnInfo } from "./columns";
import { areaText } from "./formula";
import type { RegionRead } from "./host";
import type { BlockContext, DataRef } from "./results-block";
import { MAX_DOTS } from "./results-block";

/** A problem with the chosen data, in words for the user. */
export class DataProblem extends Error {
  constructor(message: string) {
    super(message);
    this.name = "DataProblem";
  }
}

export interface Choices {
  question: Question;
  /** Column indices within the region. */
  values?: number;
  groups?: number;
  blocks?: number | null;
  first?: number;
  second?: number;
  traits?: number[];
  primary?: GroupStatisticWord;
  statistic?: IntervalStatistic;
  scale?: TraitScale;
}

export interface Prepared {
  request: AnalysisRequest;
  /** Everything the block builder needs besides the result (date and live added later). */
  context: Omit<BlockContext, "date" | "live">;
  /** Rows × resamples: the work, for choosing between live formulas and values. */
  work: number;
}

/** The column's cells (below the header) as a one-column 2D range, blanks null. */
function rawColumn(region: RegionRead, info: ColumnInfo): unknown[][] {
  const first = info.area.top - region.top;
  const out: unknown[][] = [];
  for (let r = first; r < region.rows; r++) {
    const k = region.kinds[r][info.index];
    const v = region.values[r][info.index];
    out.push([k === "empty" ? null : k === "error" ? { code: String(v) } : v]);
  }
  return out;
}

function vector(region: RegionRead, info: ColumnInfo): Vector {
  return vectorOf(rangeArg(info.name, rawColumn(region, info), null, areaText(info.area)));
}

function ref(info: ColumnInfo): DataRef {
  return { name: info.name, area: info.area };
}

function pick(columns: ColumnInfo[], index: number | undefined, what: string): ColumnInfo {
  const c = index === undefined ? undefined : columns[index];
  if (!c) throw new DataProblem(`Choose the ${what}.`);
  return c;
}

function guard<T>(f: () => T): T {
  try {
    return f();
  } catch (e) {
    if (e instanceof SheetErrorSignal) throw new DataProblem(capital(e.error.message));
    throw e;
  }
}

function capital(s: string): string {
  return s.charAt(0).toUpperCase() + s.slice(1);
}

/** Builds the request (see the file comment); throws DataProblem with a plain message. */
export function prepare(region: RegionRead, columns: ColumnInfo[], choices: Choices, options: AnalysisOptions): Prepared {
  return guard(() => build(region, columns, choices, options));
}

function build(region: RegionRead, columns: ColumnInfo[], ch: Choices, options: AnalysisOptions): Prepared {
  const total = columns[0] ? columns[0].area.rows : 0;
  const base = { data: { sheet: region.sheet, top: region.top, left: region.left, rows: region.rows, cols: region.cols } };
  switch (ch.question) {
    case "groups": {
      const vc = pick(columns, ch.values, "column with the measurements");
      const gc = pick(columns, ch.groups, "column with the groups");
      if (vc.index === gc.index) throw new DataProblem("The measurements and the groups must be different columns.");
      const bc = ch.blocks === null || ch.blocks === undefined ? null : pick(columns, ch.blocks, "column with the blocks");
      if (bc && (bc.index === vc.index || bc.index === gc.index)) throw new DataProblem("The blocks must be a column of their own.");
      const v = vector(region, vc);
      const g = vector(region, gc);
      const keep = keptRows([v, g]);
      const values = numbersAt(v, keep);
      const labels = labelsAt(g, keep);
      checkGroups(labels, vc.name, gc.name, 3);
      let blocks: { codes: Int32Array; names: string[] } | null = null;
      if (bc) {
        const b = vector(region, bc);
        const keepB = keptRows([v, g, b]);
        if (keepB.length !== keep.length) {
          throw new DataProblem(`${bc.name} is blank in ${keep.length - keepB.length} row(s) that have ${vc.name} and ${gc.name}: fill them in, or run without blocks.`);
        }
        const bl = labelsAt(b, keep);
        if (bl.k < 2) throw new DataProblem(`${bc.name} has a single block; choose “no blocks” or a column with at least two blocks.`);
        blocks = { codes: bl.codes, names: bl.names.map(String) };
      }
      const names = labels.names.map(String);
      const points = values.length <= MAX_DOTS ? Array.from(values, (y, i) => ({ x: labels.codes[i] + 1, y, group: labels.codes[i] })) : undefined;
      return {
        request: { question: "groups", values, codes: labels.codes, names, blocks, primary: ch.primary ?? "F", options },
        context: { ...base, rowsUsed: values.length, rowsSkipped: total - values.length, values: ref(vc), groups: ref(gc), blocks: bc ? ref(bc) : undefined, groupNames: labels.names, points },
        work: values.length * options.resamples,
      };
    }
    case "paired":
    case "association": {
      const paired = ch.question === "paired";
      const fc = pick(columns, ch.first, paired ? "first measurement" : "first column");
      const sc = pick(columns, ch.second, paired ? "second measurement" : "second column");
      if (fc.index === sc.index) throw new DataProblem("Choose two different columns.");
      const a = vector(region, fc);
      const b = vector(region, sc);
      const keep = keptRows([a, b]);
      const x1 = numbersAt(a, keep);
      const x2 = numbersAt(b, keep);
      if (keep.length < 3) throw new DataProblem(`${fc.name} and ${sc.name} have ${keep.length} complete row(s) (both cells filled); at least 3 are needed.`);
      const context = { ...base, rowsUsed: keep.length, rowsSkipped: total - keep.length, first: ref(fc), second: ref(sc) };
      if (paired) {
        // Change = second − first: the engine's x is the second measurement.
        return { request: { question: "paired", x: x2, y: x1, options }, context, work: keep.length * options.resamples * 3 };
      }
      const constant = (x: Float64Array) => x.every((t) => t === x[0]);
      if (constant(x1) || constant(x2)) throw new DataProblem(`${constant(x1) ? fc.name : sc.name} has the same value in every complete row, so there is nothing to relate.`);
      const points = keep.length <= MAX_DOTS ? Array.from(x1, (x, i) => ({ x, y: x2[i] })) : undefined;
      return { request: { question: "association", x: x1, y: x2, options }, context: { ...context, points }, work: keep.length * options.resamples * 2 };
    }
    case "precision": {
      const vc = pick(columns, ch.values, "column to summarise");
      const v = vector(region, vc);
      const keep = keptRows([v]);
      const values = numbersAt(v, keep);
      if (values.length < 3) throw new DataProblem(`${vc.name} has ${values.length} number(s) after blank cells are dropped; at least 3 are needed.`);
      return {
        request: { question: "precision", values, statistic: ch.statistic ?? "mean", options },
        context: { ...base, rowsUsed: values.length, rowsSkipped: total - values.length, values: ref(vc) },
        work: values.length * options.resamples * 5,
      };
    }
    case "traits": {
      const gc = pick(columns, ch.groups, "column with the groups");
      const tcs = (ch.traits ?? []).map((i) => pick(columns, i, "traits"));
      if (tcs.length < 2) throw new DataProblem("Choose at least two trait columns (for one trait, ask whether groups differ).");
      if (tcs.some((t) => t.index === gc.index)) throw new DataProblem("The groups column cannot also be a trait.");
      const tv = tcs.map((t) => vector(region, t));
      const g = vector(region, gc);
      const keep = keptRows([...tv, g]);
      const traits = tv.map((t) => numbersAt(t, keep));
      const labels = labelsAt(g, keep);
      checkGroups(labels, "the traits", gc.name);
      if (keep.length <= labels.k) throw new DataProblem(`There are ${keep.length} complete rows for ${labels.k} groups; more rows than groups are needed.`);
      return {
        request: { question: "traits", traits, codes: labels.codes, names: labels.names.map(String), scale: ch.scale ?? "standardize", options },
        context: { ...base, rowsUsed: keep.length, rowsSkipped: total - keep.length, groups: ref(gc), traits: tcs.map(ref), groupNames: labels.names },
        work: keep.length * options.resamples * (tcs.length + 2),
      };
    }
  }
}
