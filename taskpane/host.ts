/**
 * The workbook port: everything the panel needs from a workbook, and nothing more.
 *
 * Two hosts implement it: `ExcelHost` (Office.js, inside Excel) and `PreviewHost` (an
 * in-memory workbook drawn as an HTML grid, for preview.html and the browser tests).
 * The panel never touches Office.js or the grid directly.
 *
 * Coordinates are 0-based (row, column) on a named sheet.
 */
import type { Block } from "./block";

/** A cell value as read from the workbook. */
export type CellValue = number | string | boolean | null;

/** What a cell holds, from the workbook's own value types (a blank is never a 0). */
export type ValueKind = "empty" | "number" | "text" | "boolean" | "error";

/** Where the panel takes its data from. */
export type DataSource = "selection" | "region" | "table";

/** A rectangle on a sheet. */
export interface Area {
  sheet: string;
  top: number;
  left: number;
  rows: number;
  cols: number;
}

/** A rectangle of cells read from the workbook. */
export interface RegionRead extends Area {
  values: CellValue[][];
  kinds: ValueKind[][];
  /** How the rectangle was found. */
  source: DataSource;
  /** The table's name when source is "table". */
  table?: string;
}

/** Outcome of writing a block. */
export interface WriteReport {
  area: Area;
  /** Number of cells written (values, formulas or formats). */
  cells: number;
  charts: number;
  /** Charts that fell back to a simpler kind because of the Excel API level. */
  fallbacks: string[];
}

/** Raised when a write would touch a non-empty cell; nothing is written. */
export class CellsNotEmptyError extends Error {
  readonly area: Area;
  readonly firstFilled: string;
  constructor(area: Area, firstFilled: string) {
    super(`cell ${firstFilled} is not empty`);
    this.name = "CellsNotEmptyError";
    this.area = area;
    this.firstFilled = firstFilled;
  }
}

export interface WorkbookHost {
  /** "excel" or "preview". */
  readonly kind: "excel" | "preview";
  /**
   * Reads the data: the selected cells ("selection"), the block of filled cells around
   * the selection ("region"), or the table the selection is in ("table").
   */
  readRegion(source: DataSource): Promise<RegionRead>;
  /** True when every cell of the area is empty (no value, no formula). */
  isEmpty(area: Area): Promise<boolean>;
  /**
   * A free rectangle of the given size on `sheet`, beside the used cells (to the right
   * of everything on the sheet, one empty column apart, from row `nearRow`).
   */
  findFreeSpace(sheet: string, rows: number, cols: number, nearRow: number): Promise<Area>;
  /** Adds a sheet named `base` (or "base (2)", … when taken); returns its name. */
  addSheet(base: string): Promise<string>;
  /**
   * Writes the block with its top-left corner at (sheet, top, left), in one batch:
   * values, formulas, number formats, fonts, fills, borders, column widths, then charts.
   * Throws {@link CellsNotEmptyError} (writing nothing) when any target cell is filled.
   */
  writeBlock(sheet: string, top: number, left: number, block: Block): Promise<WriteReport>;
  /** Writes plain values (the demo data) onto an empty sheet area, as text where text. */
  writeTable(sheet: string, top: number, left: number, values: CellValue[][]): Promise<Area>;
  /** Selects an area and brings its sheet to the front. */
  select(area: Area): Promise<void>;
}

/** Text that Excel would take as the start of a formula when written as a value. */
export function looksLikeFormula(text: string): boolean {
  return /^[=+\-@]/.test(text);
}
