/**
 * ExcelHost on a fake Excel built from office-addin-mock objects (excel-mock.ts): the
 * Office.js calls it makes — what it loads before reading, that it writes a block in
 * one batch only after checking the target is empty, number formats, text escaping,
 * charts by API level. Office.js semantics assumed here (from memory of its reference):
 * `Range.formulas` returns "" for an empty cell; a string written with a leading
 * apostrophe is stored as text; `null` in a written array leaves that cell unchanged.
 */
import { describe, expect, it } from "vitest";
import { BlockBuilder } from "../../taskpane/block";
import { BARLEY_QUALITY, BARLEY_TRIAL, LAB_PAIRED } from "../../taskpane/demo-data";
import { DEMO_TRIAL_SHEET, writeDemo } from "../../taskpane/demo";
import { ExcelHost, WRITE_CHUNK_BYTES, addressOf, cellInput, escapeText, kindOf } from "../../taskpane/excel-host";
import { CellsNotEmptyError } from "../../taskpane/host";
import { P_FORMAT } from "../../taskpane/number-format";
import { Cell, fakeExcel } from "./excel-mock";
import { analyse, block, col, demoBook, readAt } from "./block-fixture";

const trial: Cell[][] = [
  ["Line", "Yield"],
  ["A", 4.1],
  ["B", null],
  ["A", 3.9],
  ["C", 5.0],
];

function host(sheets: Record<string, Cell[][]>, level = "1.9") {
  const f = fakeExcel(sheets, level);
  return { f, h: new ExcelHost({ run: f.excel.run, supports: f.supports }) };
}

describe("reading through Office.js", () => {
  it("reads the region around the selection with value types (blank is not 0)", async () => {
    const { f, h } = host({ Trial: trial });
    f.selection = { sheet: "Trial", top: 2, left: 1, rows: 1, cols: 1 };
    const r = await h.readRegion("region");
    expect([r.sheet, r.top, r.left, r.rows, r.cols]).toEqual(["Trial", 0, 0, 5, 2]);
    expect(r.kinds[2]).toEqual(["text", "empty"]);
    expect(r.values[2]).toEqual(["B", null]);
    expect(r.kinds[1]).toEqual(["text", "number"]);
  });

  it("falls back to the selection itself below ExcelApi 1.7", async () => {
    const { f, h } = host({ Trial: trial }, "1.4");
    f.selection = { sheet: "Trial", top: 1, left: 0, rows: 2, cols: 2 };
    const r = await h.readRegion("region");
    expect([r.top, r.rows]).toEqual([1, 2]);
  });

  it("finds the table that holds the selection", async () => {
    const { f, h } = host({ Trial: trial });
    f.tables.push({ name: "Plots", sheet: "Trial", top: 0, left: 0, rows: 5, cols: 2 });
    f.selection = { sheet: "Trial", top: 3, left: 1, rows: 1, cols: 1 };
    const r = await h.readRegion("table");
    expect(r.table).toBe("Plots");
    f.selection = { sheet: "Trial", top: 9, left: 9, rows: 1, cols: 1 };
    await expect(h.readRegion("table")).rejects.toThrow(/not inside a table/);
  });

  it("maps every Office.js value type", () => {
    expect(["Empty", "Double", "Integer", "String", "Boolean", "Error", "RichValue"].map(kindOf)).toEqual(["empty", "number", "number", "text", "boolean", "error", "text"]);
  });
});

describe("writing through Office.js", () => {
  function smallBlock() {
    const b = new BlockBuilder(3, [20, 10, 10]);
    b.add([{ value: "Title", style: { bold: true, fill: "#1E4D5C", color: "#FFFFFF" }, span: 3 }], 20);
    b.add([{ value: "=1+1" }, { value: 0.00002, format: P_FORMAT }, { formula: "=RS.SNR(Trial!$B$2:$B$5,Trial!$A$2:$A$5)", format: "0.00" }]);
    b.add([{ value: "-x", style: { borderBottom: "#9FB4BB" } }, null, { value: 7 }]);
    return b.build();
  }

  it("escapes text that Excel would read as a formula", () => {
    expect(escapeText("=1+1")).toBe("'=1+1");
    expect(escapeText("+A")).toBe("'+A");
    expect(escapeText("-x")).toBe("'-x");
    expect(escapeText("@home")).toBe("'@home");
    expect(escapeText("'quoted")).toBe("''quoted");
    expect(escapeText("HB-07")).toBe("HB-07");
    expect(escapeText(-3)).toBe(-3);
    expect(cellInput({ formula: "=RS.SNR(A1:A3,B1:B3)" })).toBe("=RS.SNR(A1:A3,B1:B3)");
    expect(cellInput(null)).toBeNull();
  });

  it("checks the target, then writes values, formulas, formats and styles in one batch", async () => {
    const { f, h } = host({ Trial: trial, Results: [] });
    const before = f.syncs;
    const report = await h.writeBlock("Results", 2, 1, smallBlock());
    expect(f.syncs - before).toBe(2); // one read to check emptiness, one write
    const target = f.ranges.find((r) => r.sheet === "Results" && r.top === 2 && r.left === 1 && r.rows === 3 && r.cols === 3 && Array.isArray(r.mock.numberFormat))!;
    expect(target.mock.formulas).toEqual([
      ["Title", null, null],
      ["'=1+1", 0.00002, "=RS.SNR(Trial!$B$2:$B$5,Trial!$A$2:$A$5)"],
      ["'-x", null, 7],
    ]);
    expect(target.mock.numberFormat[1]).toEqual(["General", P_FORMAT, "0.00"]);
    const merged = f.ranges.find((r) => r.sheet === "Results" && r.top === 2 && r.cols === 3 && r.mock.merged)!;
    expect(merged.mock.format.font.bold).toBe(true);
    expect(merged.mock.format.fill.color).toBe("#1E4D5C");
    const bordered = f.ranges.find((r) => r.top === 4 && r.left === 1 && r.mock.borders.EdgeBottom)!;
    expect(bordered.mock.borders.EdgeBottom).toEqual({ style: "Continuous", color: "#9FB4BB" });
    const height = f.ranges.find((r) => r.top === 2 && r.left === 1 && r.rows === 1 && r.cols === 1 && r.mock.format.rowHeight === 20);
    expect(height).toBeDefined();
    expect(report.area).toEqual({ sheet: "Results", top: 2, left: 1, rows: 3, cols: 3 });
  });

  it("refuses to write over a filled cell, and writes nothing", async () => {
    const { f, h } = host({ Trial: trial, Results: [[null, null], [null, null, null, "mine"]] });
    await expect(h.writeBlock("Results", 0, 1, smallBlock())).rejects.toBeInstanceOf(CellsNotEmptyError);
    expect(f.ranges.some((r) => Array.isArray(r.mock.numberFormat) || Array.isArray(r.mock.formulas?.[0]) && r.mock.formulas[0][0] === "Title")).toBe(false);
    await expect(h.writeBlock("Results", 0, 1, smallBlock())).rejects.toThrow(/D2 is not empty/);
  });

  it("finds free columns right of the used range, one column apart", async () => {
    const { h } = host({ Trial: trial });
    const a = await h.findFreeSpace("Trial", 10, 3, 0);
    expect([a.top, a.left]).toEqual([0, 3]);
  });

  it("adds a sheet with a name not yet taken", async () => {
    const { f, h } = host({ Results: [], "Results (2)": [] });
    expect(await h.addSheet("Results")).toBe("Results (3)");
    expect(f.added).toEqual(["Results (3)"]);
  });

  it("writes the demo table as text where text (a leading = stays text)", async () => {
    const { f, h } = host({ Demo: [] });
    await h.writeTable("Demo", 0, 0, [["Line", "Yield"], ["=1+1", 4.2]]);
    const t = f.ranges.find((r) => r.sheet === "Demo" && r.rows === 2 && Array.isArray(r.mock.values) && r.mock.values[1][0] === "'=1+1");
    expect(t).toBeDefined();
  });
});

describe("charts by API level", () => {
  async function groupsBlock() {
    const { host: ph, trial: sheet } = await demoBook();
    const region = await readAt(ph, sheet);
    return block(analyse(region, { question: "groups", values: col(region, "Yield (t/ha)"), groups: col(region, "Line"), blocks: null, primary: "F" }), true);
  }

  it("ExcelApi 1.9: a column histogram with the extreme bars coloured, and an XY dot plot on fixed group positions", async () => {
    const b = await groupsBlock();
    const { f, h } = host({ Results: [] }, "1.9");
    const report = await h.writeBlock("Results", 0, 0, b);
    expect(report.fallbacks).toEqual([]);
    const hist = f.charts.find((c) => c.type === "ColumnClustered")!;
    const spec = b.charts.find((c) => c.kind === "histogram")!;
    expect(hist.source.left).toBe(spec.source.col + 2); // the counts column
    expect(hist.xValues!.left).toBe(spec.source.col); // bin lower edges as categories
    expect([...hist.pointColours.keys()].sort((a, c) => a - c)).toEqual(spec.highlight);
    expect(hist.mock.title.text).toBe(`${spec.title} (orange: as extreme as the data's ${Number(spec.observed!.toPrecision(4))} or more)`);
    const dots = f.charts.find((c) => c.type === "XYScatter")!;
    expect(dots.mock.axes.categoryAxis.minimum).toBe(0.5);
    expect(dots.mock.axes.categoryAxis.maximum).toBe(4.5);
    expect(dots.mock.axes.categoryAxis.title.text).toContain("1 = HB-07");
    expect(dots.position![0].top).toBe(b.charts.find((c) => c.kind === "dots")!.at.row);
  });

  it("ExcelApi 1.4: plain charts, with the fallbacks reported", async () => {
    const b = await groupsBlock();
    const { f, h } = host({ Results: [] }, "1.4");
    const report = await h.writeBlock("Results", 0, 0, b);
    expect(report.fallbacks.length).toBe(2);
    expect(f.charts.find((c) => c.type === "ColumnClustered")!.pointColours.size).toBe(0);
    expect(f.charts.find((c) => c.type === "XYScatter")!.mock.axes.categoryAxis.minimum).toBeUndefined();
  });
});

describe("request size, API level and the demo data", () => {
  function wideBlock(rows: number) {
    // 8 columns of 60-character text: about 0.5 kB a row, so 12,000 rows are about 6 MB.
    const b = new BlockBuilder(8, new Array(8).fill(12));
    for (let r = 0; r < rows; r++) b.add(Array.from({ length: 8 }, (_, c) => ({ value: `row ${r} col ${c} `.padEnd(60, "x"), format: "@" })));
    return b.build();
  }

  it("writes a block too large for one request in several, each under the budget and the 5 MB cap, after one emptiness check", async () => {
    const { f } = host({ Results: [] });
    let runs = 0;
    const run = f.excel.run;
    const counted = new ExcelHost({ run: (cb) => (runs++, run(cb)), supports: f.supports });
    const b = wideBlock(12000);
    const total = JSON.stringify(b.cells.map((row) => row.map(cellInput))).length;
    expect(total).toBeGreaterThan(5e6); // one request would break Excel on the web's 5 MB cap
    await counted.writeBlock("Results", 0, 0, b);
    expect(runs).toBe(1); // check and write in the same Excel.run
    expect(f.requestBytes[0]).toBe(0); // the first request only reads the target (emptiness check)
    const writes = f.requestBytes.slice(1);
    expect(writes.length).toBeGreaterThan(5);
    for (const n of writes) expect(n).toBeLessThanOrEqual(WRITE_CHUNK_BYTES);
    // every row written once, in order, with its escaped value
    const parts = f.ranges.filter((r) => r.sheet === "Results" && Array.isArray(r.mock.numberFormat)).sort((a, c) => a.top - c.top);
    let next = 0;
    for (const p of parts) {
      expect(p.top).toBe(next);
      next += p.rows;
    }
    expect(next).toBe(12000);
    expect(parts[parts.length - 1].mock.formulas.at(-1)[7]).toBe(b.cells[11999][7]!.value);
  });

  it("a usual block still goes in one write request", async () => {
    const { f, h } = host({ Results: [] });
    await h.writeBlock("Results", 0, 0, wideBlock(200));
    expect(f.requestBytes.length).toBe(2); // read (check), write
  });

  it("checks emptiness again when writing, even after the panel found the place free", async () => {
    const { f, h } = host({ Results: [] });
    expect(await h.isEmpty({ sheet: "Results", top: 0, left: 0, rows: 3, cols: 3 })).toBe(true);
    f.grids.get("Results")![1] = [null, "typed meanwhile"]; // the user types into the place
    await expect(h.writeBlock("Results", 0, 0, wideBlock(3))).rejects.toThrow(/B2 is not empty/);
    expect(f.ranges.some((r) => Array.isArray(r.mock.numberFormat))).toBe(false);
  });

  it("writes text starting with = + - @ as text, in a block and in a table", async () => {
    const b = new BlockBuilder(4, [10, 10, 10, 10]);
    b.add([{ value: "=SUM(A1)" }, { value: "+41 555" }, { value: "-5 kg" }, { value: "@field" }]);
    const { f, h } = host({ Results: [] });
    await h.writeBlock("Results", 0, 0, b.build());
    const w = f.ranges.find((r) => Array.isArray(r.mock.numberFormat))!;
    expect(w.mock.formulas).toEqual([["'=SUM(A1)", "'+41 555", "'-5 kg", "'@field"]]);
    await h.writeTable("Results", 5, 0, [["@x", "+y"]]);
    const t = f.ranges.find((r) => r.top === 5 && Array.isArray(r.mock.values) && r.mock.values[0][0] === "'@x")!;
    expect(t.mock.values).toEqual([["'@x", "'+y"]]);
  });

  it("addresses ranges by A1 text", () => {
    expect(addressOf(0, 0, 1, 1)).toBe("A1");
    expect(addressOf(2, 1, 3, 26)).toBe("B3:AA5");
  });

  for (const level of ["1.1", "1.4", "1.9"]) {
    it(`ExcelApi ${level}: calls nothing beyond the supported level (read, free space with a chart, sheet, block with charts, table, select)`, async () => {
      const { host: ph, trial: sheet } = await demoBook();
      const region = await readAt(ph, sheet);
      const b = block(analyse(region, { question: "groups", values: col(region, "Yield (t/ha)"), groups: col(region, "Line"), blocks: null, primary: "F" }), true);
      const { f, h } = host({ Trial: trial, Results: [] }, level);
      f.sheet("Trial").charts.items.push({ left: 0, width: 300 }); // a chart of the user's over columns A to G
      await h.readRegion("region");
      await h.readRegion("table").catch(() => undefined);
      const free = await h.findFreeSpace("Trial", 4, 2, 0);
      expect(free.left).toBeGreaterThanOrEqual(Math.ceil(300 / 48)); // right of the chart
      const name = await h.addSheet("Results");
      await h.writeBlock(name, 0, 0, b);
      await h.writeTable(name, 200, 0, [["a", 1]]);
      await h.select({ sheet: name, top: 0, left: 0, rows: 1, cols: 1 });
      expect(f.beyondLevel).toEqual([]);
    });
  }

  it("the demo data go to new sheets only: the user's sheets are not touched, a taken name gets a number", async () => {
    const mine: Cell[][] = [["my", "data"], [1, 2]];
    const { f, h } = host({ Sheet1: mine, [DEMO_TRIAL_SHEET]: [["the user's own sheet of that name"]] });
    f.selection = { sheet: "Sheet1", top: 1, left: 1, rows: 1, cols: 1 };
    const { trial, lab, quality } = await writeDemo(h);
    expect(trial).toBe(`${DEMO_TRIAL_SHEET} (2)`);
    expect(f.added).toEqual([trial, quality, lab]);
    // nothing was even looked at on the user's sheets
    expect(f.ranges.filter((r) => r.sheet === "Sheet1" || r.sheet === DEMO_TRIAL_SHEET)).toEqual([]);
    expect(f.grids.get("Sheet1")).toEqual(mine);
    // each table written once, whole, at A1 of its new sheet, text kept as text
    for (const [sheet, data] of [[trial, BARLEY_TRIAL], [quality, BARLEY_QUALITY], [lab, LAB_PAIRED]] as const) {
      const w = f.ranges.filter((r) => r.sheet === sheet && Array.isArray(r.mock.values) && r.rows === data.length && r.top === 0 && r.left === 0 && r.mock.values !== undefined);
      const written = w.find((r) => r.mock.values[0][0] === data[0][0])!;
      expect(written.mock.values.length).toBe(data.length);
    }
    expect(f.selection).toEqual({ sheet: trial, top: 0, left: 0, rows: 1, cols: 1 });
    expect(f.activated.at(-1)).toBe(trial);
  });
});
