/**
 * ExcelHost: the workbook port on Office.js.
 *
 *  - API level: everything works on ExcelApi 1.1 (ranges are addressed by A1 text, never
 *    by the 1.7 `getRangeByIndexes`); each call from a later set is made only after
 *    `isSetSupported` says yes, with a plainer fallback otherwise: surrounding region
 *    (1.7), used range or null object (1.4), range left edge (1.10), merges, widths,
 *    heights and autofit (1.2), chart details (1.7, 1.8).
 *  - Reads the selection, its surrounding region or the table it is in, in row chunks of
 *    one request each (Excel on the web caps a response at 5 MB and a read at 5,000,000
 *    cells), with value types, so a blank cell is reported as blank, never as 0.
 *  - Writes a block in one Excel.run: first it checks, right there, that every target
 *    cell is empty (nothing is written otherwise); then number formats, values and
 *    formulas (text that would start a formula is written with a leading apostrophe, so
 *    it stays text), fonts, fills, borders, merges, widths, heights, then the charts.
 *    A small block goes in one request; a large one is cut into requests of at most
 *    WRITE_CHUNK_BYTES (Excel on the web caps a request at 5 MB).
 *  - Charts: histogram as a column chart with the extreme bars coloured (point colours
 *    need ExcelApi 1.7); per-group dot plot as an XY scatter with the x axis fixed to
 *    the groups (1.7), else a plain scatter; min–median–max as line markers.
 */
import { cellName } from "../functions/address";
import type { Block, BlockCell, CellStyle, ChartSpec } from "./block";
import { Area, CellValue, CellsNotEmptyError, DataSource, RegionRead, ValueKind, WorkbookHost, WriteReport, looksLikeFormula } from "./host";

/** Cells per read request (well under the 5 MB response cap). */
export const READ_CHUNK_CELLS = 100000;

/** Estimated bytes per write request (a fifth of the 5 MB request cap, for the payload's overhead). */
export const WRITE_CHUNK_BYTES = 1_000_000;

/** Estimated bytes of one queued formatting call (a property set on a range proxy). */
const OP_BYTES = 300;

/** A1 address of a rectangle (0-based): "B3" or "B3:D9". */
export function addressOf(top: number, left: number, rows: number, cols: number): string {
  const tl = cellName(top, left);
  return rows === 1 && cols === 1 ? tl : `${tl}:${cellName(top + rows - 1, left + cols - 1)}`;
}

/** A range by 0-based indexes through `getRange(address)` (ExcelApi 1.1). */
function rangeAt(ws: Excel.Worksheet, top: number, left: number, rows: number, cols: number): Excel.Range {
  return ws.getRange(addressOf(top, left, rows, cols));
}

/** Size in bytes of a value as it travels in a request (JSON). */
function jsonBytes(v: unknown): number {
  return JSON.stringify(v).length;
}

/**
 * Keeps each request under a byte budget: `reserve(n)` before queuing n bytes sends
 * what is queued first when the request would grow past the budget.
 */
export class RequestBudget {
  private used = 0;
  /** Requests sent because the budget was full. */
  flushes = 0;
  constructor(
    private readonly context: Excel.RequestContext,
    private readonly limit = WRITE_CHUNK_BYTES,
  ) {}
  async reserve(bytes: number): Promise<void> {
    if (this.used > 0 && this.used + bytes > this.limit) {
      await this.context.sync();
      this.flushes++;
      this.used = 0;
    }
    this.used += bytes;
  }
}

/** What ExcelHost needs from Office.js (the global `Excel.run`, and the API level test). */
export interface ExcelDeps {
  run: <T>(batch: (context: Excel.RequestContext) => Promise<T>) => Promise<T>;
  /** True when ExcelApi `version` is available. */
  supports: (version: string) => boolean;
}

export function officeDeps(): ExcelDeps {
  return {
    run: (batch) => Excel.run(batch),
    supports: (v) => {
      try {
        return Office.context.requirements.isSetSupported("ExcelApi", v);
      } catch {
        return false;
      }
    },
  };
}

/** A value type from Office.js as the port's kind. */
export function kindOf(t: string): ValueKind {
  switch (t) {
    case "Empty":
      return "empty";
    case "Double":
    case "Integer":
      return "number";
    case "Boolean":
      return "boolean";
    case "Error":
      return "error";
    default:
      return "text";
  }
}

/** A block cell as written through `Range.formulas` (null leaves the cell untouched). */
export function cellInput(c: BlockCell | null): string | number | boolean | null {
  if (!c) return null;
  if (c.formula !== undefined) return c.formula;
  if (c.value === undefined || c.value === null) return null;
  return escapeText(c.value);
}

/** Strings that Excel would read as a formula (= + - @) or a quote prefix get an apostrophe. */
export function escapeText<T extends string | number | boolean | null>(v: T): T | string {
  if (typeof v !== "string") return v;
  return looksLikeFormula(v) || v.startsWith("'") ? `'${v}` : v;
}

/** Points of a column `chars` wide (7 px per character + 5 px, at 0.75 pt per px). */
export const columnPoints = (chars: number) => (chars * 7 + 5) * 0.75;

function styleKey(s: CellStyle | undefined): string {
  return s ? JSON.stringify(s) : "";
}

/** Number of property sets applyStyle queues for a style (for the request budget). */
function styleOps(s: CellStyle): number {
  return Object.keys(s).length + (s.wrap ? 1 : 0) + (s.borderBottom ? 1 : 0) + (s.borderTop ? 1 : 0);
}

function applyStyle(r: Excel.Range, s: CellStyle): void {
  const font = r.format.font;
  if (s.bold !== undefined) font.bold = s.bold;
  if (s.italic !== undefined) font.italic = s.italic;
  if (s.size !== undefined) font.size = s.size;
  if (s.color !== undefined) font.color = s.color;
  if (s.fill !== undefined) r.format.fill.color = s.fill;
  if (s.align !== undefined) r.format.horizontalAlignment = s.align === "center" ? "Center" : s.align === "right" ? "Right" : "Left";
  if (s.wrap) {
    r.format.wrapText = true;
    r.format.verticalAlignment = "Top";
  }
  if (s.borderBottom) {
    const b = r.format.borders.getItem("EdgeBottom");
    b.style = "Continuous";
    b.color = s.borderBottom;
  }
  if (s.borderTop) {
    const b = r.format.borders.getItem("EdgeTop");
    b.style = "Continuous";
    b.color = s.borderTop;
  }
}

export class ExcelHost implements WorkbookHost {
  readonly kind = "excel" as const;
  private readonly deps: ExcelDeps;

  constructor(deps: ExcelDeps = officeDeps()) {
    this.deps = deps;
  }

  async readRegion(source: DataSource): Promise<RegionRead> {
    return this.deps.run(async (context) => {
      const sel = context.workbook.getSelectedRange();
      sel.load("rowIndex, columnIndex, rowCount, columnCount");
      sel.worksheet.load("name");
      let range: Excel.Range = sel;
      let table: string | undefined;
      if (source === "region") {
        if (this.deps.supports("1.7")) range = sel.getCell(0, 0).getSurroundingRegion();
      } else if (source === "table") {
        const tables = sel.worksheet.tables;
        tables.load("items/name");
        await context.sync();
        const ranges = tables.items.map((t) => {
          const r = t.getRange();
          r.load("rowIndex, columnIndex, rowCount, columnCount");
          return r;
        });
        await context.sync();
        const i = ranges.findIndex(
          (r) => sel.rowIndex >= r.rowIndex && sel.rowIndex < r.rowIndex + r.rowCount && sel.columnIndex >= r.columnIndex && sel.columnIndex < r.columnIndex + r.columnCount,
        );
        if (i < 0) throw new Error("The selected cell is not inside a table. Choose “The whole table around the selected cell” or select the data.");
        range = ranges[i];
        table = tables.items[i].name;
      }
      range.load("rowIndex, columnIndex, rowCount, columnCount");
      await context.sync();
      const sheet = sel.worksheet.name;
      const top = range.rowIndex, left = range.columnIndex, rows = range.rowCount, cols = range.columnCount;
      const ws = sel.worksheet;
      const chunk = Math.max(1, Math.floor(READ_CHUNK_CELLS / Math.max(1, cols)));
      const values: CellValue[][] = [];
      const kinds: ValueKind[][] = [];
      // One request per chunk: each response stays well under the 5 MB cap.
      for (let r = 0; r < rows; r += chunk) {
        const p = rangeAt(ws, top + r, left, Math.min(chunk, rows - r), cols);
        p.load("values, valueTypes");
        await context.sync();
        p.values.forEach((row, i) => {
          const kr = (p.valueTypes[i] as unknown as string[]).map(kindOf);
          kinds.push(kr);
          values.push(row.map((v, j) => (kr[j] === "empty" ? null : (v as CellValue))));
        });
      }
      return { sheet, top, left, rows, cols, values, kinds, source, table };
    });
  }

  async isEmpty(a: Area): Promise<boolean> {
    return this.deps.run(async (context) => {
      return (await firstFilledIn(context, context.workbook.worksheets.getItem(a.sheet), a)) === null;
    });
  }

  async findFreeSpace(sheet: string, rows: number, cols: number, nearRow: number): Promise<Area> {
    return this.deps.run(async (context) => {
      const ws = context.workbook.worksheets.getItem(sheet);
      // ExcelApi 1.4 tells an empty sheet apart; below it the used range of an empty sheet is A1.
      const used = this.deps.supports("1.4") ? ws.getUsedRangeOrNullObject(true) : ws.getUsedRange();
      used.load("columnIndex, columnCount");
      const charts = ws.charts;
      charts.load("items/left, items/width");
      await context.sync();
      let left = used.isNullObject ? 0 : used.columnIndex + used.columnCount + 1;
      const chartRight = Math.max(0, ...charts.items.map((c) => c.left + c.width));
      if (chartRight > 0) left += await this.columnsBefore(context, ws, left, chartRight);
      const area = { sheet, top: Math.max(0, nearRow), left, rows, cols };
      for (let tries = 0; tries < 50; tries++) {
        if ((await firstFilledIn(context, ws, area)) === null) return area;
        area.left += cols + 1;
      }
      throw new Error("No free space found beside the data; write the results on a new sheet.");
    });
  }

  /**
   * How many columns from `left` on start left of `edge` (points): the left edge of a
   * column is its `left` (ExcelApi 1.10), else the sum of the column widths before it
   * (1.2), else Excel's default width of 48 points.
   */
  private async columnsBefore(context: Excel.RequestContext, ws: Excel.Worksheet, left: number, edge: number): Promise<number> {
    const PROBES = 200;
    let lefts: number[];
    if (this.deps.supports("1.10")) {
      const probes = Array.from({ length: PROBES }, (_, c) => rangeAt(ws, 0, left + c, 1, 1));
      probes.forEach((p) => p.load("left"));
      await context.sync();
      lefts = probes.map((p) => p.left);
    } else {
      let widths: number[];
      if (this.deps.supports("1.2")) {
        const probes = Array.from({ length: left + PROBES }, (_, c) => rangeAt(ws, 0, c, 1, 1));
        probes.forEach((p) => p.load("format/columnWidth"));
        await context.sync();
        widths = probes.map((p) => p.format.columnWidth);
      } else widths = new Array(left + PROBES).fill(48);
      lefts = [];
      let x = widths.slice(0, left).reduce((a, w) => a + w, 0);
      for (let c = 0; c < PROBES; c++) {
        lefts.push(x);
        x += widths[left + c];
      }
    }
    const k = lefts.findIndex((x) => x >= edge);
    return k < 0 ? PROBES : k;
  }

  async addSheet(base: string): Promise<string> {
    return this.deps.run(async (context) => {
      const sheets = context.workbook.worksheets;
      sheets.load("items/name");
      await context.sync();
      const taken = new Set(sheets.items.map((s) => s.name.toLowerCase()));
      let name = base;
      for (let i = 2; taken.has(name.toLowerCase()); i++) name = `${base} (${i})`;
      sheets.add(name);
      await context.sync();
      return name;
    });
  }

  async writeBlock(sheet: string, top: number, left: number, block: Block): Promise<WriteReport> {
    const area: Area = { sheet, top, left, rows: block.rows, cols: block.cols };
    return this.deps.run(async (context) => {
      const ws = context.workbook.worksheets.getItem(sheet);
      // Checked here, in the same Excel.run as the write: nothing is written over a filled cell.
      const filled = await firstFilledIn(context, ws, area);
      if (filled) throw new CellsNotEmptyError(area, filled);

      // One request from here on for a usual block; a large one in requests under the budget.
      const budget = new RequestBudget(context);
      const formats = block.cells.map((row) => row.map((c) => c?.format ?? "General"));
      const inputs = block.cells.map((row) => row.map(cellInput));
      const rowBytes = inputs.map((row, i) => jsonBytes(row) + jsonBytes(formats[i]) + 2);
      for (let r0 = 0; r0 < block.rows; ) {
        let r1 = r0 + 1;
        let bytes = rowBytes[r0];
        while (r1 < block.rows && bytes + rowBytes[r1] <= WRITE_CHUNK_BYTES / 2) bytes += rowBytes[r1++];
        await budget.reserve(bytes + OP_BYTES);
        const part = rangeAt(ws, top + r0, left, r1 - r0, block.cols);
        part.numberFormat = formats.slice(r0, r1);
        part.formulas = inputs.slice(r0, r1) as unknown as string[][];
        r0 = r1;
      }
      const canMerge = this.deps.supports("1.2");
      let cells = 0;
      for (let r = 0; r < block.rows; r++) {
        const row = block.cells[r];
        let c = 0;
        while (c < block.cols) {
          const cell = row[c];
          if (cell) cells++;
          if (cell?.span && cell.span > 1) {
            const m = rangeAt(ws, top + r, left + c, 1, cell.span);
            await budget.reserve(OP_BYTES * (1 + (cell.style ? styleOps(cell.style) : 0)));
            if (canMerge) m.merge(false);
            if (cell.style) applyStyle(m, cell.style);
            c += cell.span;
            continue;
          }
          const key = styleKey(cell?.style);
          if (!key) {
            c++;
            continue;
          }
          let end = c + 1;
          while (end < block.cols && !row[end]?.span && styleKey(row[end]?.style) === key) end++;
          await budget.reserve(OP_BYTES * styleOps(cell!.style!));
          applyStyle(rangeAt(ws, top + r, left + c, 1, end - c), cell!.style!);
          c = end;
        }
      }
      if (this.deps.supports("1.2")) {
        for (let j = 0; j < block.widths.length; j++) {
          await budget.reserve(OP_BYTES);
          rangeAt(ws, top, left + j, 1, 1).format.columnWidth = columnPoints(block.widths[j]);
        }
        for (let i = 0; i < block.heights.length; i++) {
          const h = block.heights[i];
          if (h === undefined) continue;
          await budget.reserve(OP_BYTES);
          rangeAt(ws, top + i, left, 1, 1).format.rowHeight = h;
        }
      }
      const fallbacks: string[] = [];
      for (const spec of block.charts) {
        await budget.reserve(OP_BYTES * (20 + (spec.highlight?.length ?? 0)) + jsonBytes(spec.title));
        this.addChart(ws, top, left, spec, fallbacks);
      }
      ws.activate();
      await context.sync();
      return { area, cells, charts: block.charts.length, fallbacks };
    });
  }

  /** Queues one chart (no sync): see the file comment for the kinds and API levels. */
  addChart(ws: Excel.Worksheet, top: number, left: number, spec: ChartSpec, fallbacks: string[]): Excel.Chart {
    const s = spec.source;
    const at = (r: number, c: number, rows = 1, cols = 1) => rangeAt(ws, top + r, left + c, rows, cols);
    const v17 = this.deps.supports("1.7");
    let chart: Excel.Chart;
    switch (spec.kind) {
      case "histogram": {
        chart = ws.charts.add("ColumnClustered", at(s.row, s.col + 2, s.rows, 1), "Columns");
        if (v17) {
          const series = chart.series.getItemAt(0);
          series.setXAxisValues(at(s.row, s.col, s.rows, 1));
          for (const i of spec.highlight ?? []) series.points.getItemAt(i).format.fill.setSolidColor("#D9822B");
          series.format.fill.setSolidColor("#8FA9B3");
          if (this.deps.supports("1.8")) series.gapWidth = 10;
        } else fallbacks.push("This version of Excel cannot colour single bars: the histogram does not mark the extreme shuffles.");
        break;
      }
      case "dots":
      case "scatter": {
        chart = ws.charts.add("XYScatter", at(s.row, s.col, s.rows, 2), "Columns");
        if (spec.kind === "dots" && spec.categories) {
          if (v17) {
            const x = chart.axes.categoryAxis;
            x.minimum = 0.5;
            x.maximum = spec.categories.length + 0.5;
            x.majorUnit = 1;
            chart.series.getItemAt(0).markerStyle = "Circle";
          } else fallbacks.push("This version of Excel cannot fix the axis of the dot plot: read the groups by their numbers.");
        }
        break;
      }
      case "range": {
        chart = ws.charts.add("LineMarkers", at(s.row, s.col, s.rows, 4), "Columns");
        if (v17) for (let i = 0; i < 3; i++) chart.series.getItemAt(i).format.line.lineStyle = "None";
        else fallbacks.push("This version of Excel joins the lowest, median and highest values by lines.");
        break;
      }
    }
    // Excel draws no marker line: the title says which bars are the extreme ones.
    chart.title.text =
      spec.kind === "histogram" && spec.observed !== undefined && v17
        ? `${spec.title} (orange: as extreme as the data's ${Number(spec.observed.toPrecision(4))} or more)`
        : spec.title;
    chart.legend.visible = spec.kind === "range";
    const xTitle = spec.kind === "dots" && spec.categories ? `${spec.xTitle ?? ""}: ${spec.categories.map((c, i) => `${i + 1} = ${c}`).join(", ")}` : spec.xTitle;
    if (xTitle) {
      chart.axes.categoryAxis.title.text = xTitle;
      chart.axes.categoryAxis.title.visible = true;
    }
    if (spec.yTitle) {
      chart.axes.valueAxis.title.text = spec.yTitle;
      chart.axes.valueAxis.title.visible = true;
    }
    chart.setPosition(at(spec.at.row, spec.at.col), at(spec.at.row + spec.cells.rows - 1, spec.at.col + spec.cells.cols - 1));
    return chart;
  }

  async writeTable(sheet: string, top: number, left: number, values: CellValue[][]): Promise<Area> {
    const cols = Math.max(...values.map((r) => r.length));
    const area: Area = { sheet, top, left, rows: values.length, cols };
    return this.deps.run(async (context) => {
      const ws = context.workbook.worksheets.getItem(sheet);
      const filled = await firstFilledIn(context, ws, area);
      if (filled) throw new CellsNotEmptyError(area, filled);
      const target = rangeAt(ws, top, left, values.length, cols);
      target.values = values.map((row) => Array.from({ length: cols }, (_, j) => escapeText(row[j] ?? null))) as unknown as string[][];
      rangeAt(ws, top, left, 1, cols).format.font.bold = true;
      if (this.deps.supports("1.2")) target.format.autofitColumns();
      await context.sync();
      return area;
    });
  }

  async select(a: Area): Promise<void> {
    await this.deps.run(async (context) => {
      const ws = context.workbook.worksheets.getItem(a.sheet);
      ws.activate();
      rangeAt(ws, a.top, a.left, a.rows, a.cols).select();
      await context.sync();
    });
  }
}

/**
 * The first filled cell (A1 name) of an area, or null: its formulas read in row chunks,
 * one request each (a formula is "" exactly when the cell is empty).
 */
async function firstFilledIn(context: Excel.RequestContext, ws: Excel.Worksheet, a: Area): Promise<string | null> {
  const chunk = Math.max(1, Math.floor(READ_CHUNK_CELLS / Math.max(1, a.cols)));
  for (let r = 0; r < a.rows; r += chunk) {
    const rows = Math.min(chunk, a.rows - r);
    const part = rangeAt(ws, a.top + r, a.left, rows, a.cols);
    part.load("formulas");
    await context.sync();
    const filled = firstFilled(part.formulas as unknown[][], { ...a, top: a.top + r, rows });
    if (filled) return filled;
  }
  return null;
}

/** The first cell (A1 name) of a formulas grid that is not empty, or null. */
function firstFilled(formulas: unknown[][], a: Area): string | null {
  for (let r = 0; r < formulas.length; r++) {
    for (let c = 0; c < formulas[r].length; c++) {
      const f = formulas[r][c];
      if (f !== "" && f !== null && f !== undefined) return cellName(a.top + r, a.left + c);
    }
  }
  return null;
}
