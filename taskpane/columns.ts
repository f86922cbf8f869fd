/**
 * The columns of a region as the panel lists them: name, kind (numbers, labels, mixed),
 * how many cells are filled and how many are blank — from the workbook's value types,
 * so a blank cell is never mistaken for a 0 — and whether the first row is a header.
 */
import { columnLetters } from "../functions/address";
import type { Area, CellValue, RegionRead, ValueKind } from "./host";

export type ColumnKind = "numbers" | "labels" | "mixed" | "empty";

export interface ColumnInfo {
  /** 0-based index within the region. */
  index: number;
  /** Sheet column letters ("D"). */
  letter: string;
  /** Header text, or "Column D" without a header row. */
  name: string;
  kind: ColumnKind;
  /** Filled cells below the header. */
  filled: number;
  blanks: number;
  numbers: number;
  texts: number;
  /** Cells holding an Excel error. */
  errors: number;
  /** Distinct labels (text or numbers), capped at 1000. */
  distinct: number;
  /** The data cells of this column (header excluded). */
  area: Area;
}

/**
 * True when the first row looks like column names: it holds no numbers, at least one
 * text, and some column has text on top and numbers below (or every cell of the first
 * row is text that does not appear again in its column).
 */
export function detectHeader(region: RegionRead): boolean {
  if (region.rows < 2) return false;
  const top = region.kinds[0];
  if (top.some((k) => k === "number" || k === "boolean" || k === "error")) return false;
  if (!top.some((k) => k === "text")) return false;
  for (let c = 0; c < region.cols; c++) {
    if (top[c] !== "text") continue;
    for (let r = 1; r < region.rows; r++) if (region.kinds[r][c] === "number") return true;
  }
  // All-text table: a header when no first-row value repeats below it.
  for (let c = 0; c < region.cols; c++) {
    if (top[c] !== "text") continue;
    const name = String(region.values[0][c]).trim().toLowerCase();
    for (let r = 1; r < region.rows; r++) if (String(region.values[r][c] ?? "").trim().toLowerCase() === name) return false;
  }
  return true;
}

/** Describes each column of the region (below the header when `header`). */
export function describeColumns(region: RegionRead, header: boolean): ColumnInfo[] {
  const out: ColumnInfo[] = [];
  const first = header ? 1 : 0;
  for (let c = 0; c < region.cols; c++) {
    let numbers = 0, texts = 0, blanks = 0, errors = 0;
    const seen = new Set<string>();
    for (let r = first; r < region.rows; r++) {
      const k: ValueKind = region.kinds[r][c];
      const v: CellValue = region.values[r][c];
      if (k === "empty") blanks++;
      else if (k === "number") numbers++;
      else if (k === "error") errors++;
      else texts++;
      if (k !== "empty" && seen.size < 1000) seen.add(String(v).trim().toLowerCase());
    }
    const letter = columnLetters(region.left + c);
    const rawName = header ? String(region.values[0][c] ?? "").trim() : "";
    const filled = numbers + texts + errors;
    let kind: ColumnKind = "empty";
    if (filled > 0) kind = numbers === filled ? "numbers" : numbers === 0 && errors === 0 ? "labels" : "mixed";
    out.push({
      index: c,
      letter,
      name: rawName !== "" ? rawName : `Column ${letter}`,
      kind,
      filled,
      blanks,
      numbers,
      texts,
      errors,
      distinct: seen.size,
      area: { sheet: region.sheet, top: region.top + first, left: region.left + c, rows: region.rows - first, cols: 1 },
    });
  }
  return out;
}

/** "numbers · 40 filled · 0 blank" and friends, for pickers. */
export function columnSummary(c: ColumnInfo): string {
  const kind =
    c.kind === "numbers" ? "numbers" :
    c.kind === "labels" ? `labels (${c.distinct} different)` :
    c.kind === "mixed" ? `mixed: ${c.numbers} numbers, ${c.texts + c.errors} other` : "empty";
  return `${kind} · ${c.filled} filled · ${c.blanks} blank`;
}
