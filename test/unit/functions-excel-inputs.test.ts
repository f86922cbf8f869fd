/**
 * Values as Excel really hands them to an `any[][]` parameter, and the spilled shapes
 * that go back: error cells (CustomFunctions.Error objects and rich error values), a
 * single cell passed as a scalar, rows against columns, whole-column references with
 * a million mostly blank rows (web: null; desktop: 0 plus value types read through a
 * fake Office.js), dates as serial numbers, numbers stored as text, group labels typed
 * as 1, "1" or " 1 ", ranges in another workbook, and PAIRWISE / LETTERS / NULLHIST
 * tables (header row, "" for an empty cell, never null or NaN).
 *
 * Data: PlantGrowth, Dobson (1983) An Introduction to Statistical Modelling, Table 7.1
 * — shared reference values (cases.json, case 4). Every check compares a call on the
 * awkward input with the same call on the clean input, or a table's shape.
 */
import { describe, expect, it } from "vitest";
import { cellName, parseAddress } from "../../functions/address";
import { looksNumeric } from "../../functions/args";
import { BlankReader, EmptyMask, ExcelBlankReader, READ_CHUNK_CELLS, emptyMasks, sameWorkbook } from "../../functions/blanks";
import { SheetError } from "../../functions/errors";
import { callSheetFunction } from "../../functions/sheet";
import { getCase, value } from "../reference";

const pg = getCase("plantgrowth_oneway");
const weight: number[] = pg.data.weight;
const group: string[] = pg.data.group;
const col = (xs: unknown[]): unknown[][] => xs.map((x) => [x]);
const row = (xs: unknown[]): unknown[][] => [xs.slice()];
const call = (name: string, ...args: unknown[]) => callSheetFunction(name, args) as Promise<any>;

function expectError(r: unknown, code: string, pattern: RegExp): void {
  expect(r).toBeInstanceOf(SheetError);
  expect((r as SheetError).code).toBe(code);
  expect((r as SheetError).message).toMatch(pattern);
}

/** Every cell a number or a string; all rows as wide as the header. */
function expectCleanTable(t: unknown, header: string[], rows: number): void {
  expect(Array.isArray(t)).toBe(true);
  const table = t as unknown[][];
  expect(table[0]).toEqual(header);
  expect(table.length).toBe(rows + 1);
  for (const r of table) {
    expect(r.length).toBe(header.length);
    for (const c of r) {
      expect(["number", "string"]).toContain(typeof c);
      if (typeof c === "number") expect(Number.isFinite(c)).toBe(true);
    }
  }
}

describe("error cells as Excel passes them", () => {
  it("a CustomFunctions.Error object in a numeric range is #VALUE! naming the cell and saying how to fix it", async () => {
    // The runtime passes an error cell as an object with `code` (the ErrorCode value, e.g. "#DIV/0!").
    const v: unknown[] = weight.slice();
    v[3] = { code: "#DIV/0!", message: "" };
    const r = await callSheetFunction("STAT", [col(v), col(group)], { blanks: { reader: null, addresses: ["Trial!B2:B31", "Trial!C2:C31"] } });
    expectError(r, "#VALUE!", /^values, row 4 \(B5\): the cell holds the error #DIV\/0!; fix the formula there or clear the cell\.$/);
  });

  it("a rich error value with only errorType gets Excel's code, not an invented one", async () => {
    const v: unknown[] = weight.slice();
    v[0] = { type: "Error", errorType: "Div0" };
    expectError(await call("STAT", col(v), col(group)), "#VALUE!", /the cell holds the error #DIV\/0!;/);
    v[0] = { type: "Error", errorType: "NotAvailable" };
    expectError(await call("STAT", col(v), col(group)), "#VALUE!", /the cell holds the error #N\/A;/);
  });

  it("an error in a group label or in an option names it and says what to do", async () => {
    const g: unknown[] = group.slice();
    g[8] = { code: "#REF!" };
    expectError(await call("STAT", col(weight), col(g)), "#VALUE!", /^groups, row 9: the cell holds the error #REF!; group labels must be text or numbers: fix or clear that cell\.$/);
    expectError(await call("GROUPTEST", col(weight), col(group), null, [[{ code: "#N/A" }]]), "#VALUE!", /^resamples holds the error #N\/A; fix that cell, or leave resamples empty for the default\.$/);
  });

  it("a logical value says to enter a number", async () => {
    const v: unknown[] = weight.slice();
    v[1] = false;
    expectError(await call("STAT", col(v), col(group)), "#VALUE!", /values, row 2: FALSE is a logical value, not a number; enter a number or clear the cell\./);
  });
});

describe("numbers stored as text", () => {
  it("recognises text that is meant as a number, and only that", () => {
    for (const t of ["4.2", " 4.2 ", "4,2", "1,234.5", "-3", "5%", "1e3", "(12)"]) expect(looksNumeric(t)).toBe(true);
    for (const t of ["n/a", "", " ", "trt1", "4.2 t/ha", "-", ".", "1,5x", "Yield (t/ha)"]) expect(looksNumeric(t)).toBe(false);
  });

  it("are #VALUE! naming the cell, with the fix; never read silently as numbers", async () => {
    const v: unknown[] = weight.slice();
    v[6] = "4.2 ";
    const r = await callSheetFunction("GROUPTEST", [col(v), col(group)], { blanks: { reader: null, addresses: ["Trial!B2:B31", "Trial!C2:C31"] } });
    expectError(r, "#VALUE!", /^values, row 7 \(B8\): '4\.2 ' is a number stored as text; enter it as a number \(retype it, or convert the column with =VALUE\(…\) or Text to Columns\)\.$/);
  });

  it("in the first row it is not taken for a header", async () => {
    expectError(await call("INTERVAL", col(["4.1", 3.9, 4.6, 4.4])), "#VALUE!", /^values, row 1: '4\.1' is a number stored as text; .*Text to Columns\)\.$/);
  });
});

describe("shapes: a single cell, rows and columns", () => {
  it("a single-cell argument passed as a scalar equals the same cell passed as [[x]]", async () => {
    const a = await call("GROUPSUMMARY", 5.5, "ctrl");
    const b = await call("GROUPSUMMARY", [[5.5]], [["ctrl"]]);
    expect(a).toEqual(b);
    expect(a[1].slice(0, 3)).toEqual(["ctrl", 1, 5.5]);
  });

  it("values in a row and groups in a column of the same length pair up cell for cell", async () => {
    const want = await call("STAT", col(weight), col(group));
    expect(await call("STAT", row(weight), col(group))).toBe(want);
    expect(await call("STAT", col(weight), row(group))).toBe(want);
    expect(want).toBeCloseTo(value(pg, "F"), 9);
  });
});

describe("group labels and dates", () => {
  it("1, \"1\" and \" 1 \" are one group; \"A \" and \"a\" are one group; the first spelling is shown", async () => {
    const v = [4.1, 4.3, 5.0, 5.2, 6.1, 6.3];
    const t = await call("GROUPSUMMARY", col(v), col([1, "1", " 1 ", "A ", "a", 2]));
    expect(t.slice(1).map((r: unknown[]) => [r[0], r[1]])).toEqual([
      [1, 3],
      ["A", 2],
      [2, 1],
    ]);
    // Same answer as the labels spelt one way (Excel compares text ignoring case).
    const clean = await call("STAT", col(v), col([1, 1, 1, "a", "a", 2]));
    expect(await call("STAT", col(v), col([1, "1", " 1 ", "A ", "a", 2]))).toBe(clean);
  });

  it("dates arrive as serial numbers: as values they are numbers, as labels they are groups shown as the serial", async () => {
    const days = [45292, 45293, 45292, 45293, 45292, 45293]; // 1 and 2 January 2024 as Excel serials
    const t = await call("GROUPSUMMARY", col([3, 4, 5, 6, 7, 8]), col(days));
    expect(t.slice(1).map((r: unknown[]) => r[0])).toEqual([45292, 45293]);
    const i = await call("INTERVAL", col(days.map((d, k) => d + k)), null, null, "percentile", 199);
    expect(i.length).toBe(1);
    expect(i[0].every((c: unknown) => typeof c === "number")).toBe(true);
  });
});

// ---- whole-column references -------------------------------------------------------------

const ROWS = 1_048_576;

/** A whole column as Excel passes it: the 30 PlantGrowth rows from row 2, the rest `fill`. */
function wholeColumn(data: unknown[], fill: unknown): unknown[][] {
  const out: unknown[][] = new Array(ROWS);
  out[0] = ["header"];
  for (let i = 1; i < ROWS; i++) out[i] = [i - 1 < data.length ? data[i - 1] : fill];
  return out;
}

/**
 * A fake Office.js that answers `getUsedRangeOrNullObject(true)` and chunked
 * `valueTypes` reads for one sheet whose filled cells are B2:C31, and records every read.
 */
function fakeExcel(reads: string[], workbook = "Trial.xlsx") {
  const filled = (r: number, c: number) => c >= 1 && c <= 2 && r >= 1 && r <= 30;
  const range = (address: string) => {
    const p = parseAddress(address)!;
    const obj: Record<string, unknown> = {
      load: (prop: string) => {
        reads.push(`${p.range}:${prop}`);
        if (prop.includes("valueTypes")) {
          if (p.rows * p.cols > 5_000_000) throw new Error("read above the 5,000,000-cell cap");
          obj.valueTypes = Array.from({ length: p.rows }, (_, i) => Array.from({ length: p.cols }, (_, j) => (filled(p.top + i, p.left + j) ? "Double" : "Empty")));
        }
      },
      getUsedRangeOrNullObject: (valuesOnly: boolean) => {
        expect(valuesOnly).toBe(true);
        const top = Math.max(p.top, 1), left = Math.max(p.left, 1), right = Math.min(p.left + p.cols - 1, 2), bottom = Math.min(p.top + p.rows - 1, 30);
        if (bottom < top || right < left) return { isNullObject: true, load: () => undefined };
        return { isNullObject: false, address: `Trial!${cellName(top, left)}:${cellName(bottom, right)}`, load: (prop: string) => reads.push(`used:${prop}`) };
      },
    };
    return obj;
  };
  return {
    run: async (cb: (ctx: unknown) => Promise<unknown>) =>
      cb({
        workbook: {
          name: workbook,
          load: () => undefined,
          worksheets: { getItem: (name: string) => (name === "Trial" ? { getRange: range } : { getRange: () => { throw new Error("ItemNotFound"); } }) },
        },
        sync: async () => undefined,
      }),
  };
}

async function withExcel<T>(fake: unknown, f: () => Promise<T>): Promise<T> {
  const g = globalThis as { Excel?: unknown };
  const saved = g.Excel;
  g.Excel = fake;
  try {
    return await f();
  } finally {
    g.Excel = saved;
  }
}

describe("a whole-column reference (1,048,576 rows, mostly blank)", () => {
  const want = (async () => call("STAT", col(weight), col(group)))();

  it("on the web (blanks as null) it gives the answer of the 30 filled rows (a blank cell beside the header drops that row)", async () => {
    const v = wholeColumn(weight, null);
    const g = wholeColumn(group, null);
    v[0] = [null]; // a blank header cell: the row is dropped like any blank
    expect(await call("STAT", v, g)).toBe(await want);
  });

  it("on the desktop (blanks as 0) only the used part is read, in one small read, and the answer is the same", async () => {
    const v = wholeColumn(weight, 0);
    const g = wholeColumn(group, 0);
    v[0] = [0];
    g[0] = [0];
    const reads: string[] = [];
    const got = await withExcel(fakeExcel(reads), () =>
      callSheetFunction("STAT", [v, g], { blanks: { reader: new ExcelBlankReader(), addresses: ["Trial!B:B", "Trial!C:C"] } }),
    );
    expect(got).toBe(await want);
    // Two used-range lookups, then the used part B2:B31 / C2:C31 — never the million rows.
    expect(reads).toEqual(["used:address", "used:address", "B2:B31:valueTypes", "C2:C31:valueTypes"]);
  });

  it("the mask of a large range shares one empty row outside the used part; a used part above the chunk size is read in chunks", async () => {
    const reads: string[] = [];
    const masks = await withExcel(fakeExcel(reads), () => new ExcelBlankReader().readEmpty(["'Trial'!B1:B1048576", "'Trial'!A1:D300000", "'Trial'!F1:F100000"]));
    const [b, block, empty] = masks as EmptyMask[];
    expect(b.length).toBe(ROWS);
    expect(b[0]).toEqual([true]);
    expect(b[1]).toEqual([false]);
    expect(b[31]).toEqual([true]);
    expect(b[40]).toBe(b[1_000_000]);
    expect(block.length).toBe(300_000);
    expect(block[5]).toEqual([true, false, false, true]);
    expect(block[31]).toEqual([true, true, true, true]);
    expect(empty.every((r) => r[0] === true)).toBe(true); // nothing used in column F: no value read at all
    expect(reads.filter((r) => r.endsWith("valueTypes")).every((r) => {
      const p = parseAddress(r.split(":valueTypes")[0])!;
      return p.rows * p.cols <= READ_CHUNK_CELLS;
    })).toBe(true);
  });

  it("a used part larger than one chunk is read in several chunks that line up", async () => {
    // Column B filled on 250,000 rows: two chunks of at most READ_CHUNK_CELLS cells.
    const reads: string[] = [];
    const fake = {
      run: async (cb: (ctx: unknown) => Promise<unknown>) =>
        cb({
          workbook: {
            worksheets: {
              getItem: () => ({
                getRange: (address: string) => {
                  const p = parseAddress(address)!;
                  const obj: Record<string, unknown> = {
                    load: (prop: string) => {
                      reads.push(p.range);
                      obj.valueTypes = Array.from({ length: p.rows }, (_, i) => [(p.top + i) % 2 === 0 ? "Empty" : "Double"]);
                    },
                    getUsedRangeOrNullObject: () => ({ isNullObject: false, address: "S!B1:B250000", load: () => undefined }),
                  };
                  return obj;
                },
              }),
            },
          },
          sync: async () => undefined,
        }),
    };
    const [m] = (await withExcel(fake, () => new ExcelBlankReader().readEmpty(["'S'!B1:B1048576"]))) as EmptyMask[];
    expect(reads).toEqual([`B1:B${READ_CHUNK_CELLS}`, `B${READ_CHUNK_CELLS + 1}:B250000`]);
    expect(m[0][0]).toBe(true);
    expect(m[1][0]).toBe(false);
    expect(m[READ_CHUNK_CELLS][0]).toBe(READ_CHUNK_CELLS % 2 === 0);
    expect(m[249_999][0]).toBe(false);
    expect(m[250_000][0]).toBe(true);
  });
});

// ---- blanks: other workbooks, missing addresses -------------------------------------------

describe("blank cells that cannot be told from zeros", () => {
  const v = col([...weight.slice(0, 29), 0]);
  const g = col(group);
  const reader = (book: string | null): BlankReader => ({
    readEmpty: async (a) => a.map(() => Array.from({ length: 30 }, () => [false])),
    workbookName: async () => book,
  });

  it("a range in another workbook is #N/A naming it, never read from a same-named sheet here", async () => {
    let reads = 0;
    const r = reader("Trial.xlsx");
    const counting: BlankReader = { readEmpty: async (a) => (reads++, r.readEmpty(a)), workbookName: r.workbookName };
    const m = await emptyMasks([v, g], [0, 1], ["values", "groups"], { reader: counting, addresses: ["[Other.xlsx]Trial!B2:B31", "Trial!C2:C31"] });
    expectError(m, "#N/A", /^values is in another workbook \(\[Other\.xlsx\]\), where a blank cell and a 0 cannot be told apart; copy the data into this workbook, or fill the blank cells\.$/);
    expect(reads).toBe(0);
    // A reader that cannot name its workbook cannot vouch for it either.
    expectError(await emptyMasks([v, g], [0], ["values", "groups"], { reader: reader(null), addresses: ["'C:\\data\\[Other.xlsx]Trial'!B2:B31", ""] }), "#N/A", /another workbook \(\[Other\.xlsx\]\)/);
  });

  it("the address may name this workbook (with or without its extension): then it is read", async () => {
    const m = await emptyMasks([v, g], [0, 1], ["values", "groups"], { reader: reader("Trial.xlsx"), addresses: ["[Trial]Trial!B2:B31", "Trial!C2:C31"] });
    expect(Array.isArray(m)).toBe(true);
    expect(sameWorkbook("TRIAL.xlsx", "trial.xlsx")).toBe(true);
    expect(sameWorkbook("Trial", "Trial.xlsm")).toBe(true);
    expect(sameWorkbook("Trial 2", "Trial.xlsx")).toBe(false);
  });

  it("an address missing at the position of a range holding zeros is #N/A, not zeros counted as values", async () => {
    const m = await emptyMasks([v, g], [0, 1], ["values", "groups"], { reader: reader("Trial.xlsx"), addresses: [] });
    expectError(m, "#N/A", /^values holds zeros, and this version of Excel does not report where arguments come from/);
  });
});

// ---- spilled tables -------------------------------------------------------------------------

describe("spilled tables: header row, \"\" for empty, never null or NaN", () => {
  it("PAIRWISE: header and one row per pair, group names as typed (numbers stay numbers)", async () => {
    const labels = group.map((x) => ({ ctrl: 10, trt1: "trt1", trt2: "trt2" })[x]);
    const t = await call("PAIRWISE", col(weight), col(labels), null, 0.9, 199, 3);
    expectCleanTable(t, ["group 1", "group 2", "difference", "lower 90 %", "upper 90 %", "p", "adjusted p"], 3);
    expect(t.slice(1).map((r: unknown[]) => [r[0], r[1]])).toEqual([
      [10, "trt1"],
      [10, "trt2"],
      ["trt1", "trt2"],
    ]);
    for (const r of t.slice(1)) {
      expect(r[3]).toBeLessThanOrEqual(r[4]);
      expect(r[5]).toBeGreaterThan(0);
      expect(r[6]).toBeGreaterThanOrEqual(r[5]);
      expect(r[6]).toBeLessThanOrEqual(1);
    }
  });

  it("LETTERS: header and one row per group, highest mean first, a letter string in every row", async () => {
    const t = await call("LETTERS", col(weight), col(group), null, null, 199, 3);
    expectCleanTable(t, ["group", "n", "mean", "letters"], 3);
    const means = t.slice(1).map((r: unknown[]) => r[2] as number);
    expect(means).toEqual([...means].sort((a, b) => b - a));
    for (const r of t.slice(1)) expect(r[3]).toMatch(/^[a-z]+$/);
  });

  it("NULLHIST: header, one row per bin, \"\" in the observed column except in the observed value's bin", async () => {
    const t = await call("NULLHIST", col(weight), col(group), "RANK", 5, 199, 3);
    expectCleanTable(t, ["lower", "upper", "count", "observed"], 5);
    const marks = t.slice(1).map((r: unknown[]) => r[3]);
    expect(marks.filter((m: unknown) => m !== "").length).toBe(1);
    expect(marks.filter((m: unknown) => m === "").length).toBe(4);
  });

  it("NULLHIST where some shuffles have no spread within groups: the table stays clean", async () => {
    // Two values per group, two distinct values: some relabellings give F = +∞.
    const t = await call("NULLHIST", col([1, 1, 2, 2, 1, 2]), col(["a", "a", "b", "b", "c", "c"]), null, 4, 199, 1);
    if (t instanceof SheetError) expect(["#DIV/0!", "#N/A"]).toContain(t.code);
    else expectCleanTable(t, ["lower", "upper", "count", "observed"], 4);
  });
});
