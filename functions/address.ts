/**
 * A1-style addresses as Excel reports them for parameters ("Sheet1!A2:A31",
 * "'Trial 2024'!$B$2:$B$41", "Sheet1!C5"): the sheet name and the rectangle, so that a
 * message can name the cell ("B8") and the blank-cell reader can ask the sheet for the
 * same range.
 */
export interface RangeAddress {
  /** Sheet name without quotes ("" when the address had no sheet part). */
  sheet: string;
  /**
   * Workbook part without brackets ("Book2.xlsx" for "[Book2.xlsx]Sheet1!A1", also after a
   * folder path); "" when the address names no workbook.
   */
  book?: string;
  /** The range part as written, without "$" (e.g. "A2:A31"). */
  range: string;
  /** 0-based first row and column. */
  top: number;
  left: number;
  /** Number of rows and columns. */
  rows: number;
  cols: number;
}

const CELL = /^\$?([A-Za-z]{1,3})\$?([0-9]{1,7})$/;
const COLUMN = /^\$?([A-Za-z]{1,3})$/;
const ROW = /^\$?([0-9]{1,7})$/;

/** Rows and columns of a worksheet (Excel 2007 and later). */
export const SHEET_ROWS = 1048576;
export const SHEET_COLS = 16384;

/** Column letters → 0-based index ("A" → 0, "AA" → 26). */
export function columnIndex(letters: string): number {
  let c = 0;
  for (const ch of letters.toUpperCase()) c = c * 26 + (ch.charCodeAt(0) - 64);
  return c - 1;
}

/** 0-based column index → letters (0 → "A", 26 → "AA"). */
export function columnLetters(index: number): string {
  let s = "";
  let c = index + 1;
  while (c > 0) {
    const r = (c - 1) % 26;
    s = String.fromCharCode(65 + r) + s;
    c = Math.floor((c - 1) / 26);
  }
  return s;
}

/** Cell name for a 0-based row and column ("B8"). */
export function cellName(row: number, col: number): string {
  return `${columnLetters(col)}${row + 1}`;
}

/**
 * Parses a single-area A1 address (a cell, a rectangle, whole columns or whole rows) with
 * an optional sheet part; null for anything else (several areas, R1C1, names).
 */
export function parseAddress(address: string | null | undefined): RangeAddress | null {
  if (typeof address !== "string") return null;
  let text = address.trim();
  if (text === "") return null;
  let sheet = "";
  let book = "";
  const bang = text.lastIndexOf("!");
  if (bang >= 0) {
    let s = text.slice(0, bang);
    text = text.slice(bang + 1);
    if (s.startsWith("'") && s.endsWith("'") && s.length >= 2) s = s.slice(1, -1).replace(/''/g, "'");
    // A workbook prefix "[Book1.xlsx]Sheet1" (or "C:\folder\[Book1.xlsx]Sheet1") names
    // the sheet after the bracket.
    const open = s.indexOf("[");
    const close = s.lastIndexOf("]");
    if (open >= 0 && close > open) {
      book = s.slice(open + 1, close);
      s = s.slice(close + 1);
    }
    sheet = s;
  }
  const parts = text.split(":");
  if (parts.length > 2) return null;
  if (parts.length === 2) {
    // Whole columns ("A:C") or whole rows ("2:9").
    const ca = COLUMN.exec(parts[0]), cb = COLUMN.exec(parts[1]);
    if (ca && cb) {
      const c1 = columnIndex(ca[1]), c2 = columnIndex(cb[1]);
      const left = Math.min(c1, c2);
      return { sheet, book, range: `${columnLetters(left)}:${columnLetters(Math.max(c1, c2))}`, top: 0, left, rows: SHEET_ROWS, cols: Math.abs(c2 - c1) + 1 };
    }
    const ra = ROW.exec(parts[0]), rb = ROW.exec(parts[1]);
    if (ra && rb) {
      const r1 = Number(ra[1]) - 1, r2 = Number(rb[1]) - 1;
      if (r1 < 0 || r2 < 0) return null;
      const top = Math.min(r1, r2);
      return { sheet, book, range: `${top + 1}:${Math.max(r1, r2) + 1}`, top, left: 0, rows: Math.abs(r2 - r1) + 1, cols: SHEET_COLS };
    }
  }
  const a = CELL.exec(parts[0]);
  const b = CELL.exec(parts[parts.length - 1]);
  if (!a || !b) return null;
  const r1 = Number(a[2]) - 1, c1 = columnIndex(a[1]);
  const r2 = Number(b[2]) - 1, c2 = columnIndex(b[1]);
  if (r1 < 0 || r2 < 0) return null;
  const top = Math.min(r1, r2), left = Math.min(c1, c2);
  const rows = Math.abs(r2 - r1) + 1, cols = Math.abs(c2 - c1) + 1;
  const range = rows === 1 && cols === 1 ? cellName(top, left) : `${cellName(top, left)}:${cellName(top + rows - 1, left + cols - 1)}`;
  return { sheet, book, range, top, left, rows, cols };
}
