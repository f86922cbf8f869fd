/**
 * The preview's in-memory workbook: sheets of cells (values, formulas, number formats,
 * styles), tables, a selection, charts — and an evaluator that computes the `=RS.…`
 * formulas written into it with the real sheet functions, spilling arrays into the
 * cells beside them as Excel does. No DOM here (the grid is drawn by preview-grid.ts).
 */
import { cellName } from "../functions/address";
import type { CellStyle, ChartSpec } from "./block";
import { parseFormula } from "./formula";
import type { Area, CellValue, ValueKind } from "./host";

/** A sheet function as the evaluator calls it: Excel-style arguments in, a result out. */
export type SheetFunction = (...args: unknown[]) => unknown;
export type FunctionTable = Record<string, SheetFunction>;

export interface CellError {
  code: string;
  message: string;
}

export interface PreviewCell {
  /** Constant, or the computed value of a formula / spill. */
  value: CellValue;
  formula?: string;
  /** Set on cells filled by another cell's spilled array (key of the anchor). */
  spillOf?: number;
  error?: CellError;
  format?: string;
  style?: CellStyle;
  /** Merged across this many columns (anchor only). */
  span?: number;
  tag?: string;
}

/** A chart placed on a sheet: the block's spec with absolute cell positions. */
export interface PlacedChart extends ChartSpec {
  id: number;
  sheet: string;
}

export const MAX_COLS = 16384;
const key = (r: number, c: number) => r * MAX_COLS + c;

export class PreviewSheet {
  readonly name: string;
  readonly cells = new Map<number, PreviewCell>();
  /** Column widths in characters. */
  readonly widths = new Map<number, number>();
  /** Row heights in points (rows with wrapped text). */
  readonly heights = new Map<number, number>();
  readonly charts: PlacedChart[] = [];
  constructor(name: string) {
    this.name = name;
  }

  get(r: number, c: number): PreviewCell | undefined {
    return this.cells.get(key(r, c));
  }

  /** True when the cell has no value, formula or spilled value. */
  isEmptyAt(r: number, c: number): boolean {
    const cell = this.cells.get(key(r, c));
    return !cell || (cell.formula === undefined && cell.spillOf === undefined && (cell.value === null || cell.value === ""));
  }

  kindAt(r: number, c: number): ValueKind {
    const cell = this.cells.get(key(r, c));
    if (!cell) return "empty";
    if (cell.error) return "error";
    const v = cell.value;
    if (v === null || v === "") return "empty";
    if (typeof v === "number") return "number";
    if (typeof v === "boolean") return "boolean";
    return "text";
  }

  /** Last used row and column (values and formulas; -1 when the sheet is empty). */
  usedExtent(): { lastRow: number; lastCol: number } {
    let lastRow = -1;
    let lastCol = -1;
    for (const [k, cell] of this.cells) {
      if (cell.formula === undefined && cell.spillOf === undefined && (cell.value === null || cell.value === "")) continue;
      const r = Math.floor(k / MAX_COLS);
      const c = k % MAX_COLS;
      if (r > lastRow) lastRow = r;
      if (c > lastCol) lastCol = c;
    }
    return { lastRow, lastCol };
  }

  /** Cells touched by values, formats or styles (for drawing). */
  extent(): { lastRow: number; lastCol: number } {
    let lastRow = -1;
    let lastCol = -1;
    for (const k of this.cells.keys()) {
      const r = Math.floor(k / MAX_COLS);
      const c = k % MAX_COLS;
      if (r > lastRow) lastRow = r;
      if (c > lastCol) lastCol = c;
    }
    return { lastRow, lastCol };
  }

  set(r: number, c: number, cell: PreviewCell): void {
    this.cells.set(key(r, c), cell);
  }

  delete(r: number, c: number): void {
    this.cells.delete(key(r, c));
  }
}

export class PreviewWorkbook {
  readonly sheets: PreviewSheet[] = [];
  readonly tables: { name: string; area: Area }[] = [];
  active = "";
  selection: Area | null = null;
  private functions: FunctionTable;
  private chartIds = 1;
  /** Called after any change (the grid redraws). */
  onChange: () => void = () => undefined;
  /** Formula evaluations running now (tests wait for 0). */
  pending = 0;

  constructor(functions: FunctionTable = {}) {
    this.functions = functions;
  }

  setFunctions(functions: FunctionTable): void {
    this.functions = functions;
  }

  sheet(name: string): PreviewSheet {
    const s = this.sheets.find((x) => x.name.toLowerCase() === name.toLowerCase());
    if (!s) throw new RangeError(`no sheet named '${name}'`);
    return s;
  }

  hasSheet(name: string): boolean {
    return this.sheets.some((x) => x.name.toLowerCase() === name.toLowerCase());
  }

  addSheet(name: string): PreviewSheet {
    if (this.hasSheet(name)) throw new RangeError(`a sheet named '${name}' exists`);
    const s = new PreviewSheet(name);
    this.sheets.push(s);
    if (!this.active) this.active = name;
    return s;
  }

  /** Sets a constant (text stays text, whatever its first character). */
  setValue(sheet: string, r: number, c: number, value: CellValue, format?: string): void {
    const s = this.sheet(sheet);
    const old = s.get(r, c);
    s.set(r, c, { value, format: format ?? old?.format, style: old?.style });
  }

  placeChart(sheet: string, spec: ChartSpec): PlacedChart {
    const placed: PlacedChart = { ...spec, id: this.chartIds++, sheet };
    this.sheet(sheet).charts.push(placed);
    return placed;
  }

  /** Values of an area as Excel passes a range to a function: blanks are null. */
  rangeValues(a: Area, defaultSheet: string): unknown[][] {
    const s = this.sheet(a.sheet || defaultSheet);
    const out: unknown[][] = [];
    for (let r = 0; r < a.rows; r++) {
      const row: unknown[] = [];
      for (let c = 0; c < a.cols; c++) {
        const cell = s.get(a.top + r, a.left + c);
        if (!cell) row.push(null);
        else if (cell.error) row.push({ code: cell.error.code });
        else row.push(cell.value === "" ? null : cell.value);
      }
      out.push(row);
    }
    return out;
  }

  /** Every formula cell, in sheet order then row-major order. */
  formulaCells(): { sheet: PreviewSheet; r: number; c: number; cell: PreviewCell }[] {
    const out: { sheet: PreviewSheet; r: number; c: number; cell: PreviewCell }[] = [];
    for (const s of this.sheets) {
      const keys = [...s.cells.keys()].sort((a, b) => a - b);
      for (const k of keys) {
        const cell = s.cells.get(k)!;
        if (cell.formula !== undefined) out.push({ sheet: s, r: Math.floor(k / MAX_COLS), c: k % MAX_COLS, cell });
      }
    }
    return out;
  }

  /** Recomputes every formula (the preview's "recalculate"). */
  async recalculate(): Promise<void> {
    for (const f of this.formulaCells()) await this.evaluate(f.sheet.name, f.r, f.c);
    this.onChange();
  }

  /** Evaluates the formula at (sheet, r, c) and spills its result. */
  async evaluate(sheetName: string, r: number, c: number): Promise<void> {
    const s = this.sheet(sheetName);
    const cell = s.get(r, c);
    if (!cell || cell.formula === undefined) return;
    const anchorKey = key(r, c);
    this.clearSpill(s, anchorKey);
    this.pending++;
    let result: unknown;
    try {
      result = await this.call(cell.formula, sheetName);
    } catch (e) {
      result = { code: "#VALUE!", message: e instanceof Error ? e.message : String(e) };
    } finally {
      this.pending--;
    }
    const current = s.get(r, c);
    if (current !== cell) return; // overwritten meanwhile
    const err = asError(result);
    if (err) {
      cell.value = err.code;
      cell.error = err;
      return;
    }
    cell.error = undefined;
    if (Array.isArray(result)) {
      const rows = result.length;
      const cols = rows > 0 && Array.isArray(result[0]) ? (result[0] as unknown[]).length : 1;
      const grid = rows > 0 && Array.isArray(result[0]) ? (result as unknown[][]) : [result as unknown[]];
      // #SPILL! when a cell the array needs holds something.
      for (let i = 0; i < grid.length; i++) {
        for (let j = 0; j < cols; j++) {
          if (i === 0 && j === 0) continue;
          if (!s.isEmptyAt(r + i, c + j)) {
            cell.value = "#SPILL!";
            cell.error = { code: "#SPILL!", message: `the result needs ${grid.length} × ${cols} cells, and ${cellName(r + i, c + j)} is not empty` };
            return;
          }
        }
      }
      for (let i = 0; i < grid.length; i++) {
        for (let j = 0; j < cols; j++) {
          const v = spillValue(grid[i][j]);
          if (i === 0 && j === 0) {
            cell.value = v.value;
            cell.error = v.error;
            continue;
          }
          const old = s.get(r + i, c + j);
          s.set(r + i, c + j, { value: v.value, error: v.error, spillOf: anchorKey, format: old?.format, style: old?.style, span: old?.span, tag: old?.tag });
        }
      }
      return;
    }
    const v = spillValue(result);
    cell.value = v.value;
    cell.error = v.error;
  }

  private clearSpill(s: PreviewSheet, anchorKey: number): void {
    for (const [k, cell] of s.cells) {
      if (cell.spillOf === anchorKey) s.cells.set(k, { value: null, format: cell.format, style: cell.style, span: cell.span, tag: cell.tag });
    }
  }

  /** Parses and calls a formula; an error object for anything unsupported. */
  async call(formula: string, sheetName: string): Promise<unknown> {
    const parsed = parseFormula(formula);
    if (!parsed) return { code: "#NAME?", message: `the preview cannot evaluate ${formula}` };
    const fn = this.functions[parsed.name];
    if (!fn) return { code: "#NAME?", message: `RS.${parsed.name} is not a Reshuffle function` };
    const args = parsed.args.map((a) => {
      if ("ref" in a) return this.rangeValues(a.ref, sheetName);
      if ("text" in a) return a.text;
      if ("number" in a) return a.number;
      return a.logical;
    });
    return await fn(...args);
  }
}

/** Recognises an error result: an object with a code starting with "#". */
export function asError(x: unknown): CellError | null {
  if (typeof x === "object" && x !== null && !Array.isArray(x)) {
    const o = x as { code?: unknown; message?: unknown };
    if (typeof o.code === "string" && o.code.startsWith("#")) return { code: o.code, message: typeof o.message === "string" ? o.message : "" };
    if (x instanceof Error) return { code: "#VALUE!", message: x.message };
  }
  return null;
}

function spillValue(v: unknown): { value: CellValue; error?: CellError } {
  const err = asError(v);
  if (err) return { value: err.code, error: err };
  if (v === null || v === undefined) return { value: null };
  if (typeof v === "number") return Number.isFinite(v) ? { value: v } : { value: "#NUM!", error: { code: "#NUM!", message: "not a finite number" } };
  if (typeof v === "string" || typeof v === "boolean") return { value: v };
  return { value: String(v) };
}
