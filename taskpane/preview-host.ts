/**
 * PreviewHost: the workbook port over the in-memory {@link PreviewWorkbook}. Used by
 * preview.html (the add-in without Excel) and the browser tests. Formulas written by a
 * block are evaluated with the real sheet functions after the write.
 */
import { cellName } from "../functions/address";
import type { Block } from "./block";
import { Area, CellValue, CellsNotEmptyError, DataSource, RegionRead, ValueKind, WorkbookHost, WriteReport } from "./host";
import { PreviewWorkbook } from "./preview-workbook";

/** Pixel sizes the preview grid uses (the chart footprint is computed from these). */
export const ROW_PX = 21;
export const CHAR_PX = 7;
export const colPx = (chars: number) => Math.round(chars * CHAR_PX + 5);

export class PreviewHost implements WorkbookHost {
  readonly kind = "preview" as const;
  readonly book: PreviewWorkbook;

  constructor(book: PreviewWorkbook) {
    this.book = book;
  }

  async readRegion(source: DataSource): Promise<RegionRead> {
    const sel = this.book.selection ?? { sheet: this.book.active, top: 0, left: 0, rows: 1, cols: 1 };
    let area: Area;
    let table: string | undefined;
    if (source === "selection") area = sel;
    else if (source === "table") {
      const t = this.book.tables.find(
        (x) => x.area.sheet.toLowerCase() === sel.sheet.toLowerCase() && within(sel.top, sel.left, x.area),
      );
      if (!t) throw new Error("The selected cell is not inside a table. Choose “Current region” or select the data.");
      area = t.area;
      table = t.name;
    } else area = this.currentRegion(sel);
    return { ...area, ...this.read(area), source, table };
  }

  /** Values and kinds of an area. */
  read(a: Area): { values: CellValue[][]; kinds: ValueKind[][] } {
    const s = this.book.sheet(a.sheet);
    const values: CellValue[][] = [];
    const kinds: ValueKind[][] = [];
    for (let r = 0; r < a.rows; r++) {
      const vr: CellValue[] = [];
      const kr: ValueKind[] = [];
      for (let c = 0; c < a.cols; c++) {
        const kind = s.kindAt(a.top + r, a.left + c);
        const cell = s.get(a.top + r, a.left + c);
        vr.push(kind === "empty" ? null : cell!.value);
        kr.push(kind);
      }
      values.push(vr);
      kinds.push(kr);
    }
    return { values, kinds };
  }

  /**
   * The filled rectangle around the selection's top-left cell: grown one row or column
   * at a time while a filled cell touches its border (Excel's "current region").
   */
  currentRegion(sel: Area): Area {
    const s = this.book.sheet(sel.sheet);
    let top = sel.top, left = sel.left, bottom = sel.top + sel.rows - 1, right = sel.left + sel.cols - 1;
    const filled = (r: number, c: number) => r >= 0 && c >= 0 && !s.isEmptyAt(r, c);
    const rowHas = (r: number) => {
      for (let c = left - 1; c <= right + 1; c++) if (filled(r, c)) return true;
      return false;
    };
    const colHas = (c: number) => {
      for (let r = top - 1; r <= bottom + 1; r++) if (filled(r, c)) return true;
      return false;
    };
    // Grow each edge as far as it goes (cheap row checks first), until nothing changes.
    let grown = true;
    while (grown) {
      grown = false;
      while (top > 0 && rowHas(top - 1)) { top--; grown = true; }
      while (rowHas(bottom + 1)) { bottom++; grown = true; }
      while (left > 0 && colHas(left - 1)) { left--; grown = true; }
      while (colHas(right + 1)) { right++; grown = true; }
    }
    // Trim empty outer rows and columns (a lone selected empty cell stays as it is).
    return { sheet: s.name, top, left, rows: bottom - top + 1, cols: right - left + 1 };
  }

  async isEmpty(a: Area): Promise<boolean> {
    return this.firstFilled(a) === null;
  }

  private firstFilled(a: Area): string | null {
    const s = this.book.sheet(a.sheet);
    for (let r = a.top; r < a.top + a.rows; r++) for (let c = a.left; c < a.left + a.cols; c++) if (!s.isEmptyAt(r, c)) return cellName(r, c);
    return null;
  }

  async findFreeSpace(sheet: string, rows: number, cols: number, nearRow: number): Promise<Area> {
    const s = this.book.sheet(sheet);
    let lastCol = s.usedExtent().lastCol;
    // Charts cover cells too: start right of them.
    for (const ch of s.charts) lastCol = Math.max(lastCol, ch.at.col + this.chartCols(s.name, ch.at.col, ch.width) - 1);
    let left = lastCol + 2;
    const area = { sheet: s.name, top: Math.max(0, nearRow), left, rows, cols };
    while (this.firstFilled(area) !== null) area.left = ++left;
    return area;
  }

  /** Columns a chart of `width` pixels starting at column `col` covers. */
  chartCols(sheet: string, col: number, width: number): number {
    const s = this.book.sheet(sheet);
    let px = 0;
    let n = 0;
    while (px < width) {
      px += colPx(s.widths.get(col + n) ?? 9);
      n++;
    }
    return n;
  }

  async addSheet(base: string): Promise<string> {
    let name = base;
    for (let i = 2; this.book.hasSheet(name); i++) name = `${base} (${i})`;
    this.book.addSheet(name);
    this.book.onChange();
    return name;
  }

  async writeBlock(sheet: string, top: number, left: number, block: Block): Promise<WriteReport> {
    const s = this.book.sheet(sheet);
    const area = { sheet: s.name, top, left, rows: block.rows, cols: block.cols };
    const filled = this.firstFilled(area);
    if (filled) throw new CellsNotEmptyError(area, filled);
    let cells = 0;
    block.widths.forEach((w, j) => {
      const cur = s.widths.get(left + j);
      if (cur === undefined || cur < w) s.widths.set(left + j, w);
    });
    block.heights.forEach((h, i) => {
      if (h !== undefined) s.heights.set(top + i, h);
    });
    const formulas: [number, number][] = [];
    for (let r = 0; r < block.rows; r++) {
      for (let c = 0; c < block.cols; c++) {
        const b = block.cells[r][c];
        if (!b) continue;
        cells++;
        if (b.formula !== undefined) {
          s.set(top + r, left + c, { value: null, formula: b.formula, format: b.format, style: b.style, span: b.span, tag: b.tag });
          formulas.push([top + r, left + c]);
        } else {
          // Strings are stored as text: the preview never evaluates a value.
          s.set(top + r, left + c, { value: b.value ?? null, format: b.format, style: b.style, span: b.span, tag: b.tag });
        }
      }
    }
    for (const ch of block.charts) this.book.placeChart(s.name, { ...ch, at: { row: top + ch.at.row, col: left + ch.at.col }, source: { ...ch.source, row: top + ch.source.row, col: left + ch.source.col } });
    this.book.onChange();
    for (const [r, c] of formulas) await this.book.evaluate(s.name, r, c);
    this.book.onChange();
    return { area, cells, charts: block.charts.length, fallbacks: [] };
  }

  async writeTable(sheet: string, top: number, left: number, values: CellValue[][]): Promise<Area> {
    const s = this.book.sheet(sheet);
    const area = { sheet: s.name, top, left, rows: values.length, cols: Math.max(...values.map((r) => r.length)) };
    const filled = this.firstFilled(area);
    if (filled) throw new CellsNotEmptyError(area, filled);
    values.forEach((row, i) => row.forEach((v, j) => s.set(top + i, left + j, { value: v, style: i === 0 ? { bold: true } : undefined })));
    for (let j = 0; j < area.cols; j++) {
      const longest = Math.max(...values.map((r) => String(r[j] ?? "").length));
      s.widths.set(left + j, Math.max(s.widths.get(left + j) ?? 0, Math.min(40, Math.max(9, longest + 2))));
    }
    this.book.onChange();
    return area;
  }

  async select(a: Area): Promise<void> {
    this.book.active = this.book.sheet(a.sheet).name;
    this.book.selection = { ...a, sheet: this.book.active };
    this.book.onChange();
  }
}

function within(r: number, c: number, a: Area): boolean {
  return r >= a.top && r < a.top + a.rows && c >= a.left && c < a.left + a.cols;
}
