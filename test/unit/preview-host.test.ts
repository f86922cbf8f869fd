/**
 * PreviewHost, the in-memory workbook behind preview.html: reading a selection, its
 * current region or a table (Excel's meaning of these, from memory of its behaviour:
 * the current region grows while a filled cell touches its edge); never writing over a
 * filled cell; free space to the right of everything (charts included); spilled arrays
 * and #SPILL! as in Excel's dynamic arrays.
 */
import { describe, expect, it } from "vitest";
import { BlockBuilder } from "../../taskpane/block";
import { CellsNotEmptyError } from "../../taskpane/host";
import { PreviewHost } from "../../taskpane/preview-host";
import { PreviewWorkbook } from "../../taskpane/preview-workbook";

function setup() {
  const calls: unknown[][] = [];
  const book = new PreviewWorkbook({
    TWICE: (x: unknown) => {
      calls.push([x]);
      return (x as number[][]).map((r) => r.map((v) => (typeof v === "number" ? 2 * v : "")));
    },
    ONE: () => 1,
    FAIL: () => ({ code: "#N/A", message: "values has 2 cells but groups has 3" }),
  });
  const host = new PreviewHost(book);
  return { book, host, calls };
}

describe("reading", () => {
  it("grows the current region around the selected cell and reports blanks by kind", async () => {
    const { book, host } = setup();
    await host.addSheet("S");
    await host.writeTable("S", 2, 1, [["a", "b"], [1, null], [2, 3]]);
    book.setValue("S", 6, 5, 9); // far away: not part of the region
    await host.select({ sheet: "S", top: 3, left: 2, rows: 1, cols: 1 });
    const r = await host.readRegion("region");
    expect([r.top, r.left, r.rows, r.cols]).toEqual([2, 1, 3, 2]);
    expect(r.kinds[1]).toEqual(["number", "empty"]);
    expect(r.values[1]).toEqual([1, null]);
    const sel = await host.readRegion("selection");
    expect([sel.rows, sel.cols, sel.values[0][0]]).toEqual([1, 1, null]);
  });

  it("reads a table by name, and refuses when the selection is outside every table", async () => {
    const { book, host } = setup();
    await host.addSheet("S");
    await host.writeTable("S", 0, 0, [["x"], [1], [2]]);
    book.tables.push({ name: "Yields", area: { sheet: "S", top: 0, left: 0, rows: 3, cols: 1 } });
    await host.select({ sheet: "S", top: 1, left: 0, rows: 1, cols: 1 });
    const t = await host.readRegion("table");
    expect(t.table).toBe("Yields");
    expect(t.rows).toBe(3);
    await host.select({ sheet: "S", top: 5, left: 5, rows: 1, cols: 1 });
    await expect(host.readRegion("table")).rejects.toThrow(/not inside a table/);
  });
});

describe("writing", () => {
  it("never writes over a filled cell and writes nothing at all then", async () => {
    const { book, host } = setup();
    await host.addSheet("S");
    book.setValue("S", 1, 1, "keep me");
    const b = new BlockBuilder(3, [10, 10, 10]);
    b.add([{ value: 1 }, { value: 2 }, { value: 3 }]);
    b.add([{ value: 4 }, { value: 5 }, { value: 6 }]);
    await expect(host.writeBlock("S", 0, 0, b.build())).rejects.toBeInstanceOf(CellsNotEmptyError);
    expect(book.sheet("S").get(1, 1)!.value).toBe("keep me");
    expect(book.sheet("S").get(0, 0)).toBeUndefined();
  });

  it("finds free space to the right of the used cells and of charts", async () => {
    const { book, host } = setup();
    await host.addSheet("S");
    await host.writeTable("S", 0, 0, [["a", "b", "c"], [1, 2, 3]]);
    let free = await host.findFreeSpace("S", 5, 4, 0);
    expect([free.top, free.left]).toEqual([0, 4]); // one empty column (D) apart
    book.placeChart("S", { kind: "histogram", title: "", at: { row: 0, col: 5 }, width: 300, height: 100, source: { row: 0, col: 0, rows: 1, cols: 4 }, cells: { rows: 5, cols: 4 } });
    free = await host.findFreeSpace("S", 5, 4, 3);
    expect(free.left).toBeGreaterThan(5 + 3);
    expect(free.top).toBe(3);
    expect(await host.isEmpty(free)).toBe(true);
  });

  it("keeps text as text: a value starting with = is never evaluated", async () => {
    const { book, host } = setup();
    await host.addSheet("S");
    const b = new BlockBuilder(2, [10, 10]);
    b.add([{ value: "=1+1" }, { value: "+2" }]);
    await host.writeBlock("S", 0, 0, b.build());
    expect(book.sheet("S").get(0, 0)).toMatchObject({ value: "=1+1" });
    expect(book.sheet("S").get(0, 0)!.formula).toBeUndefined();
  });
});

describe("formulas", () => {
  it("spills arrays, shows #SPILL! when blocked, and recalculates after a data change", async () => {
    const { book, host } = setup();
    await host.addSheet("S");
    await host.writeTable("S", 0, 0, [["v"], [1], [2]]);
    const b = new BlockBuilder(1, [10]);
    b.add([{ formula: "=RS.TWICE(S!$A$2:$A$3)" }]);
    b.add([{ format: "0.0" }]);
    await host.writeBlock("S", 0, 3, b.build());
    const s = book.sheet("S");
    expect([s.get(0, 3)!.value, s.get(1, 3)!.value]).toEqual([2, 4]);
    expect(s.get(1, 3)!.format).toBe("0.0");
    book.setValue("S", 2, 0, 10);
    await book.recalculate();
    expect(s.get(1, 3)!.value).toBe(20);
    book.setValue("S", 1, 3, "in the way");
    await book.recalculate();
    expect(s.get(0, 3)!.error!.code).toBe("#SPILL!");
  });

  it("passes blanks as null, errors through, and unknown names as #NAME?", async () => {
    const { book, host, calls } = setup();
    await host.addSheet("S");
    await host.writeTable("S", 0, 0, [["v"], [1], [null]]);
    const b = new BlockBuilder(3, [10, 10, 10]);
    b.add([{ formula: "=RS.TWICE(S!$A$2:$A$3)" }, { formula: "=RS.FAIL()" }, { formula: "=RS.NOPE(1)" }]);
    await host.writeBlock("S", 5, 0, b.build());
    expect(calls[0]).toEqual([[[1], [null]]]);
    const s = book.sheet("S");
    expect(s.get(5, 1)!.error).toEqual({ code: "#N/A", message: "values has 2 cells but groups has 3" });
    expect(s.get(5, 2)!.error!.code).toBe("#NAME?");
  });
});
