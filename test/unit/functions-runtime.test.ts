/**
 * The sheet functions' runtime: blank cells on the desktop (value types read through a
 * fake reader and a fake Office.js), the answer cache, the Web Worker pool (fake
 * workers), cancellation, and the Excel error boundary.
 */
import { afterEach, describe, expect, it } from "vitest";
import { permutationF } from "../../src/oneway";
import { cellName, parseAddress } from "../../functions/address";
import { BlankReader, EmptyMask, ExcelBlankReader, emptyMasks, readAddress, setBlankReader } from "../../functions/blanks";
import { cacheKey, LruCache } from "../../functions/cache";
import { CancelToken } from "../../functions/cancel";
import { clearResultCache, dispatchStats } from "../../functions/dispatch";
import { SheetError } from "../../functions/errors";
import { excelCall, toExcel } from "../../functions/excel-result";
import { sheetFunctions } from "../../functions/registry";
import { callSheetFunction } from "../../functions/sheet";
import { handleRequest, WorkerReply, WorkerRequest } from "../../functions/worker";
import { WorkerLike, WorkerPool, configureWorkerPool } from "../../functions/worker-client";
import { getCase } from "../reference";

// PlantGrowth: Dobson (1983), Table 7.1 — shared reference values (cases.json, case 4).
const pg = getCase("plantgrowth_oneway");
const weight: number[] = pg.data.weight;
const group: string[] = pg.data.group;
const codes = group.map((g) => ["ctrl", "trt1", "trt2"].indexOf(g));
const col = (xs: unknown[]): unknown[][] => xs.map((x) => [x]);

// ---- a small in-memory sheet standing in for the workbook ------------------------------

/** Sheet "Trial": column B = yields (rows 2–31), column C = groups; some cells empty. */
type Grid = Map<string, unknown>; // "B7" → value; absent = empty cell
function makeSheet(emptyValueRows: number[], emptyGroupRows: number[], realZeroRows: number[] = []): Grid {
  const g: Grid = new Map();
  weight.forEach((w, i) => {
    const r = i + 1; // 0-based sheet row (row 2 in A1 terms)
    if (!emptyValueRows.includes(i)) g.set(cellName(r, 1), realZeroRows.includes(i) ? 0 : w);
    if (!emptyGroupRows.includes(i)) g.set(cellName(r, 2), group[i]);
  });
  return g;
}
/** What Excel on the desktop passes: empty cells as 0. */
function desktopValues(g: Grid, col0: number, top: number, rows: number): unknown[][] {
  return Array.from({ length: rows }, (_, i) => [g.has(cellName(top + i, col0)) ? g.get(cellName(top + i, col0)) : 0]);
}
/** What the web may pass: empty cells as null. */
function webValues(g: Grid, col0: number, top: number, rows: number): unknown[][] {
  return Array.from({ length: rows }, (_, i) => [g.has(cellName(top + i, col0)) ? g.get(cellName(top + i, col0)) : null]);
}

/** Reads value types from the in-memory sheet, like Range.valueTypes → "Empty". */
class FakeReader implements BlankReader {
  calls: string[][] = [];
  constructor(private readonly sheets: Record<string, Grid>, private readonly fail = false) {}
  async readEmpty(addresses: string[]): Promise<(EmptyMask | null)[]> {
    this.calls.push(addresses);
    if (this.fail) return addresses.map(() => null);
    return addresses.map((a) => {
      const p = parseAddress(a);
      const grid = p ? this.sheets[p.sheet] : undefined;
      if (!p || !grid) return null;
      return Array.from({ length: p.rows }, (_, i) => Array.from({ length: p.cols }, (_, j) => !grid.has(cellName(p.top + i, p.left + j))));
    });
  }
}

const ADDR = ["Trial!B2:B31", "Trial!C2:C31"];

describe("blank cells on the desktop (passed as 0)", () => {
  const empties = { values: [4, 17], groups: [9] };
  const sheet = makeSheet(empties.values, empties.groups);
  const desktop = [desktopValues(sheet, 1, 1, 30), desktopValues(sheet, 2, 1, 30)];
  const web = [webValues(sheet, 1, 1, 30), webValues(sheet, 2, 1, 30)];

  it("value types drop the empty cells, giving exactly the answer for null blanks", async () => {
    const reader = new FakeReader({ Trial: sheet });
    const want = await callSheetFunction("GROUPTEST", [...web, null, 999, null]);
    const got = await callSheetFunction("GROUPTEST", [...desktop, null, 999, null], { blanks: { reader, addresses: ADDR } });
    expect(got).toBe(want);
    const keep = weight.map((_, i) => i).filter((i) => ![4, 17, 9].includes(i));
    expect(want).toBe(permutationF(keep.map((i) => weight[i]), keep.map((i) => codes[i]), 3, { resamples: 999, seed: 1 }).p);
    // Both ranges hold zeros (groups: a blank label passed as 0), read in one round trip.
    expect(reader.calls).toEqual([["'Trial'!B2:B31", "'Trial'!C2:C31"]]);
  });

  it("counting the desktop zeros as values would give another answer (the problem this solves)", async () => {
    const naive = await callSheetFunction("STAT", [desktop[0], web[1]]);
    const right = await callSheetFunction("STAT", [desktop[0], web[1]], { blanks: { reader: new FakeReader({ Trial: sheet }), addresses: ADDR } });
    expect(right).toBe(await callSheetFunction("STAT", web));
    expect(naive).not.toBe(right);
  });

  it("a real 0 typed in a cell stays a value", async () => {
    const withZero = makeSheet([], [], [5]);
    const reader = new FakeReader({ Trial: withZero });
    const v = desktopValues(withZero, 1, 1, 30);
    const got = await callSheetFunction("STAT", [v, col(group)], { blanks: { reader, addresses: ADDR } });
    const w = weight.slice();
    w[5] = 0;
    expect(got).toBe(await callSheetFunction("STAT", [col(w), col(group)]));
  });

  it("ranges without a 0 are not read at all", async () => {
    const reader = new FakeReader({ Trial: makeSheet([], []) });
    await callSheetFunction("STAT", [col(weight), col(group)], { blanks: { reader, addresses: ADDR } });
    expect(reader.calls).toEqual([]);
  });

  it("a computed array (no address) has no blank cells: its zeros are values", async () => {
    const reader = new FakeReader({ Trial: sheet });
    const got = await callSheetFunction("STAT", [desktop[0], web[1]], { blanks: { reader, addresses: ["", "Trial!C2:C31"] } });
    expect(reader.calls).toEqual([]);
    expect(got).toBe(await callSheetFunction("STAT", [desktop[0], web[1]]));
  });

  it("a failed read, a changed shape or missing addresses give #N/A instead of counting blanks as zeros", async () => {
    const failing = new FakeReader({ Trial: sheet }, true);
    const r1 = await callSheetFunction("STAT", desktop, { blanks: { reader: failing, addresses: ADDR } });
    expect(r1).toBeInstanceOf(SheetError);
    expect((r1 as SheetError).code).toBe("#N/A");
    expect((r1 as SheetError).message).toMatch(/could not check which cells of values are blank/);
    const r2 = await callSheetFunction("STAT", desktop, { blanks: { reader: new FakeReader({ Trial: sheet }), addresses: undefined } });
    expect((r2 as SheetError).message).toMatch(/does not report where arguments come from/);
    const shrink: BlankReader = { readEmpty: async (a) => a.map(() => [[true]]) };
    const r3 = await emptyMasks(desktop, [0, 1], ["values", "groups"], { reader: shrink, addresses: ADDR });
    expect((r3 as SheetError).code).toBe("#N/A");
  });

  it("a whole-column reference reads only the rows Excel passed, from the top-left cell", () => {
    expect(readAddress("Trial!B:B", desktop[0])).toBe("'Trial'!B1:B30");
    expect(readAddress("'My trial'!$B$2:$B$31", desktop[0])).toBe("'My trial'!B2:B31");
    expect(readAddress("[Book1.xlsx]Trial!C5", [[0]])).toBe("'Trial'!C5");
  });

  it("messages name the cell when Excel gave the address", async () => {
    const v = col(weight);
    v[6] = ["n/a"];
    const r = await callSheetFunction("STAT", [v, col(group)], { blanks: { reader: null, addresses: ADDR } });
    expect((r as SheetError).message).toBe("values, row 7 (B8): 'n/a' is not a number.");
  });

  it("the Office.js reader loads valueTypes of every range in one sync", async () => {
    const loaded: string[] = [];
    let syncs = 0;
    const fakeExcel = {
      run: async (cb: (ctx: unknown) => Promise<unknown>) =>
        cb({
          workbook: {
            worksheets: {
              getItem: (name: string) => ({
                getRange: (address: string) => {
                  const range: { valueTypes: string[][]; load: (p: string) => void } = {
                    valueTypes: [],
                    load: (prop: string) => {
                      loaded.push(`${name}!${address}:${prop}`);
                      const p = parseAddress(address)!;
                      range.valueTypes = Array.from({ length: p.rows }, (_, i) => [i === 1 ? "Empty" : "Double"]);
                    },
                  };
                  return range;
                },
              }),
            },
          },
          sync: async () => {
            syncs++;
          },
        }),
    };
    const g = globalThis as { Excel?: unknown };
    const saved = g.Excel;
    g.Excel = fakeExcel;
    try {
      const masks = await new ExcelBlankReader().readEmpty(["'Trial'!B2:B4", "'Other sheet'!C2:C4", "nonsense"]);
      expect(masks).toEqual([[[false], [true], [false]], [[false], [true], [false]], null]);
      expect(loaded).toEqual(["Trial!B2:B4:valueTypes", "Other sheet!C2:C4:valueTypes"]);
      expect(syncs).toBe(1);
      g.Excel = { run: async () => Promise.reject(new Error("ItemNotFound")) };
      expect(await new ExcelBlankReader().readEmpty(["Trial!B2:B4"])).toEqual([null]);
    } finally {
      g.Excel = saved;
    }
  });

  it("excelCall passes Excel's parameter addresses to the blank check", async () => {
    setBlankReader(new FakeReader({ Trial: sheet }));
    try {
      const invocation = { parameterAddresses: [...ADDR, "", "", ""] } as CustomFunctions.CancelableInvocation;
      const got = await excelCall("GROUPTEST", [...desktop, null, 999, null], invocation);
      expect(got).toBe(await callSheetFunction("GROUPTEST", [...web, null, 999, null]));
      expect(typeof invocation.onCanceled).toBe("function");
    } finally {
      setBlankReader(undefined);
    }
  });
});

describe("answer cache", () => {
  it("an identical call is answered from the cache; another seed is computed", async () => {
    clearResultCache();
    const before = { ...dispatchStats };
    const a = await sheetFunctions.GROUPTEST(col(weight), col(group), null, 999, 3);
    const b = await sheetFunctions.GROUPTEST(col(weight), col(group), "f", 999, 3);
    expect(b).toBe(a);
    expect(dispatchStats.computed - before.computed).toBe(1);
    expect(dispatchStats.cacheHits - before.cacheHits).toBe(1);
    await sheetFunctions.GROUPTEST(col(weight), col(group), null, 999, 4);
    expect(dispatchStats.computed - before.computed).toBe(2);
  });

  it("identical calls running at the same time share one computation", async () => {
    clearResultCache();
    const before = { ...dispatchStats };
    const [a, b] = await Promise.all([sheetFunctions.SNR(col(weight), col(group)), sheetFunctions.SNR(col(weight), col(group))]);
    expect(a).toBe(b);
    expect(dispatchStats.computed - before.computed).toBe(1);
    expect(dispatchStats.shared - before.shared).toBe(1);
  });

  it("keys tell typed arrays, numbers, text and nesting apart; the LRU drops the oldest entry", () => {
    const k = (x: unknown) => cacheKey("op", x);
    expect(k({ a: Float64Array.of(1, 2) })).toBe(k({ a: Float64Array.of(1, 2) }));
    expect(k({ a: Float64Array.of(1, 2) })).not.toBe(k({ a: Float64Array.of(2, 1) }));
    expect(k({ a: Float64Array.of(1) })).not.toBe(k({ a: Int32Array.of(1) }));
    expect(k({ a: 1, b: "x" })).toBe(k({ b: "x", a: 1 }));
    expect(k(["1"])).not.toBe(k([1]));
    expect(k({ a: -0 })).toBe(k({ a: 0 }));
    expect(cacheKey("a", 1)).not.toBe(cacheKey("b", 1));
    const lru = new LruCache<number>(2);
    lru.set("x", 1);
    lru.set("y", 2);
    lru.get("x");
    lru.set("z", 3);
    expect([lru.has("x"), lru.has("y"), lru.has("z")]).toEqual([true, false, true]);
  });
});

// ---- fake workers ------------------------------------------------------------------------

class FakeWorker implements WorkerLike {
  onmessage: ((ev: { data: WorkerReply }) => void) | null = null;
  onerror: ((ev: unknown) => void) | null = null;
  terminated = false;
  received: WorkerRequest[] = [];
  constructor(private readonly mode: "answer" | "hang" | "crash") {}
  postMessage(req: WorkerRequest): void {
    this.received.push(req);
    const copy = structuredClone(req);
    if (this.mode === "hang") return;
    setTimeout(() => {
      if (this.terminated) return;
      if (this.mode === "crash") this.onerror?.({ message: "script failed to load" });
      else this.onmessage?.({ data: structuredClone(handleRequest(copy)) });
    }, 0);
  }
  terminate(): void {
    this.terminated = true;
  }
}

const heavyArgs = { statistic: "F", values: Float64Array.from(weight), codes: Int32Array.from(codes), k: 3, resamples: 999, seed: 1 };

describe("Web Worker pool", () => {
  afterEach(() => {
    configureWorkerPool({ factory: null });
    clearResultCache();
  });

  it("the worker protocol: {id, op, args} in, {id, ok, result | error} out", () => {
    const ok = handleRequest({ id: 7, op: "groups.test", args: heavyArgs });
    expect(ok).toEqual({ id: 7, ok: true, result: permutationF(weight, codes, 3, { resamples: 999, seed: 1 }).p });
    const bad = handleRequest({ id: 8, op: "no.such.op", args: {} });
    expect(bad.ok).toBe(false);
    expect(bad).toMatchObject({ id: 8, error: { sheetError: true, code: "#N/A" } });
  });

  it("a heavy call (n × resamples > 2·10⁷) runs in a worker and gives the inline answer", async () => {
    const workers: FakeWorker[] = [];
    configureWorkerPool({ size: 2, factory: () => (workers.push(new FakeWorker("answer")), workers[workers.length - 1]) });
    const before = dispatchStats.offThread;
    const p = await sheetFunctions.GROUPTEST(col(weight), col(group), null, 700000, 2); // 30 × 700,000 = 2.1·10⁷
    expect(dispatchStats.offThread - before).toBe(1);
    expect(workers.length).toBe(1);
    expect(workers[0].received[0].op).toBe("groups.test");
    expect(p).toBe(permutationF(weight, codes, 3, { resamples: 700000, seed: 2 }).p);
  });

  it("cancel terminates the busy worker and the next job gets a fresh one", async () => {
    const workers: FakeWorker[] = [];
    let mode: "hang" | "answer" = "hang";
    const pool = new WorkerPool({ size: 1, factory: () => (workers.push(new FakeWorker(mode)), workers[workers.length - 1]) });
    const token = new CancelToken();
    const pending = pool.run("groups.test", heavyArgs, token);
    await new Promise((r) => setTimeout(r, 5));
    token.cancel();
    const r = await pending;
    expect(r).toBeInstanceOf(SheetError);
    expect((r as SheetError).message).toMatch(/cancelled/);
    expect(workers[0].terminated).toBe(true);
    mode = "answer";
    expect(await pool.run("groups.test", heavyArgs)).toBe(permutationF(weight, codes, 3, { resamples: 999, seed: 1 }).p);
    expect(pool.started).toBe(2);
  });

  it("a queued job leaves the queue on cancel without touching the busy worker", async () => {
    const workers: FakeWorker[] = [];
    const pool = new WorkerPool({ size: 1, factory: () => (workers.push(new FakeWorker("hang")), workers[workers.length - 1]) });
    const first = new CancelToken();
    const second = new CancelToken();
    const p1 = pool.run("groups.test", heavyArgs, first);
    const p2 = pool.run("groups.test", { ...heavyArgs, seed: 2 }, second);
    second.cancel();
    expect(((await p2) as SheetError).message).toMatch(/cancelled/);
    expect(workers[0].terminated).toBe(false);
    expect(workers[0].received.length).toBe(1);
    first.cancel();
    await p1;
    expect(workers[0].terminated).toBe(true);
  });

  it("a worker that fails to load falls back to running inline, and after two failures the pool stays inline", async () => {
    const pool = new WorkerPool({ size: 1, factory: () => new FakeWorker("crash") });
    const want = permutationF(weight, codes, 3, { resamples: 999, seed: 1 }).p;
    expect(await pool.run("groups.test", heavyArgs)).toBe(want);
    expect(await pool.run("groups.test", heavyArgs)).toBe(want);
    expect(pool.usesWorkers).toBe(false);
    expect(await pool.run("groups.test", heavyArgs)).toBe(want);
    expect(pool.started).toBe(2);
  });

  it("a worker that cannot even be created (the host blocks it) also falls back to inline", async () => {
    const pool = new WorkerPool({
      size: 1,
      factory: () => {
        throw new Error("SecurityError");
      },
    });
    const want = permutationF(weight, codes, 3, { resamples: 999, seed: 1 }).p;
    expect(await pool.run("groups.test", heavyArgs)).toBe(want);
    expect(await pool.run("groups.test", heavyArgs)).toBe(want);
    expect(pool.usesWorkers).toBe(false);
  });

  it("without Worker (as in vitest) everything runs inline", async () => {
    const pool = new WorkerPool();
    expect(pool.usesWorkers).toBe(typeof Worker !== "undefined");
    expect(await new WorkerPool({ factory: null }).run("groups.test", heavyArgs)).toBe(permutationF(weight, codes, 3, { resamples: 999, seed: 1 }).p);
  });

  it("Excel's onCanceled cancels a stale heavy call", async () => {
    const workers: FakeWorker[] = [];
    configureWorkerPool({ size: 1, factory: () => (workers.push(new FakeWorker("hang")), workers[workers.length - 1]) });
    const invocation = {} as CustomFunctions.CancelableInvocation;
    const pending = excelCall("GROUPTEST", [col(weight), col(group), null, 900000, 5], invocation);
    await new Promise((r) => setTimeout(r, 5));
    invocation.onCanceled!();
    const r = await pending;
    expect((r as SheetError).message).toMatch(/cancelled/);
    expect(workers[0].terminated).toBe(true);
  });
});

describe("the Excel error boundary", () => {
  it("outside Excel an error stays a SheetError; spilling functions wrap it in a 1 × 1 array", () => {
    const e = new SheetError("#VALUE!", "values, row 2: 'x' is not a number.");
    expect(toExcel(e, false)).toBe(e);
    expect(toExcel(e, true)).toEqual([[e]]);
    expect(toExcel(0.5, false)).toBe(0.5);
  });

  it("inside Excel it becomes CustomFunctions.Error, with the message only for #VALUE! and #N/A", () => {
    class RuntimeError {
      constructor(readonly code: string, readonly message?: string) {}
    }
    const g = globalThis as { CustomFunctions?: unknown };
    const saved = g.CustomFunctions;
    g.CustomFunctions = { Error: RuntimeError, associate: () => undefined };
    try {
      const v = toExcel(new SheetError("#VALUE!", "seed must be a whole number."), false) as RuntimeError;
      expect(v).toBeInstanceOf(RuntimeError);
      expect([v.code, v.message]).toEqual(["#VALUE!", "seed must be a whole number."]);
      const na = toExcel(new SheetError("#N/A", "too few groups."), true) as RuntimeError[][];
      expect(na[0][0]).toBeInstanceOf(RuntimeError);
      expect(na[0][0].message).toBe("too few groups.");
      const d = toExcel(new SheetError("#DIV/0!", "zero spread."), false) as RuntimeError;
      expect([d.code, d.message]).toEqual(["#DIV/0!", undefined]);
    } finally {
      g.CustomFunctions = saved;
    }
  });
});
