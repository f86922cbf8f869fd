/**
 * Range arguments as Excel passes them (2D arrays), turned into the engine's inputs.
 *
 *  - A range is a column, a row (or, for TRAITTEST, a block of columns).
 *  - A blank cell (null, undefined, "" — or a 0 that Excel's value types call "Empty",
 *    see blanks.ts) drops its row from the call; rows are dropped pairwise across all
 *    ranges of one call, so the remaining rows still line up.
 *  - In a numeric range, text, a logical value, an Excel error or a rich value stops the
 *    call with #VALUE! naming the argument and the position ("values, row 7 (B8): 'n/a'
 *    is not a number").
 *  - Group labels are numbers or text, compared as Excel compares text (ignoring case and
 *    surrounding spaces); the first spelling seen is the one shown.
 */
import { RangeAddress, cellName, parseAddress } from "./address";
import { EmptyMask } from "./blanks";
import { fail, invalid, notAvailable } from "./errors";

/** Cell contents after unwrapping Office.js rich values. */
type Cell =
  | { kind: "blank" }
  | { kind: "number"; value: number }
  | { kind: "text"; value: string }
  | { kind: "logical"; value: boolean }
  | { kind: "error"; code: string }
  | { kind: "other" };

const BLANK: Cell = { kind: "blank" };

/**
 * Reads one cell: primitives as they come; Excel error objects ({code:"#N/A"} or a
 * rich error value {type:"Error", basicValue:"#N/A"}); rich values through their
 * `type` and `basicValue`.
 */
export function readCell(v: unknown): Cell {
  if (v === null || v === undefined || v === "") return BLANK;
  if (typeof v === "number") return { kind: "number", value: v };
  if (typeof v === "string") return { kind: "text", value: v };
  if (typeof v === "boolean") return { kind: "logical", value: v };
  if (typeof v === "object") {
    const o = v as Record<string, unknown>;
    const type = typeof o.type === "string" ? o.type : "";
    if (typeof o.code === "string" && o.code.startsWith("#")) return { kind: "error", code: o.code };
    if (type === "Error") {
      const code = typeof o.basicValue === "string" && o.basicValue.startsWith("#") ? o.basicValue : typeof o.errorType === "string" ? errorCodeOf(o.errorType) : "#VALUE!";
      return { kind: "error", code };
    }
    if (v instanceof Error) return { kind: "error", code: "#VALUE!" };
    if (type === "Empty") return BLANK;
    if ((type === "Double" || type === "FormattedNumber") && typeof o.basicValue === "number") return { kind: "number", value: o.basicValue };
    if (type === "String" && typeof o.basicValue === "string") return o.basicValue === "" ? BLANK : { kind: "text", value: o.basicValue };
    if (type === "Boolean" && typeof o.basicValue === "boolean") return { kind: "logical", value: o.basicValue };
  }
  return { kind: "other" };
}

/** Excel's error code for a rich error value's `errorType` ("Div0" → "#DIV/0!"). */
const ERROR_CODES: Record<string, string> = {
  Div0: "#DIV/0!",
  NotAvailable: "#N/A",
  Name: "#NAME?",
  Null: "#NULL!",
  Num: "#NUM!",
  Ref: "#REF!",
  Value: "#VALUE!",
  Spill: "#SPILL!",
  Calc: "#CALC!",
  Busy: "#BUSY!",
  GettingData: "#GETTING_DATA",
  Connect: "#CONNECT!",
  Blocked: "#BLOCKED!",
  Field: "#FIELD!",
  External: "#EXTERNAL!",
};

function errorCodeOf(errorType: string): string {
  return Object.prototype.hasOwnProperty.call(ERROR_CODES, errorType) ? ERROR_CODES[errorType] : `#${errorType.toUpperCase()}`;
}

/**
 * True for text that Excel users mean as a number but typed or imported as text:
 * "4.2", " 4.2 ", "4,2" (decimal comma), "1,234.5", "-3", "5%" — not "n/a" or "".
 */
export function looksNumeric(text: string): boolean {
  const t = text.trim();
  if (t === "" || !/^[-+(]?[0-9.,\s]+([eE][-+]?[0-9]+)?%?\)?$/.test(t) || !/[0-9]/.test(t)) return false;
  const plain = t.replace(/[\s%()+]/g, "");
  return Number.isFinite(Number(plain)) || Number.isFinite(Number(plain.replace(/,/g, ""))) || Number.isFinite(Number(plain.replace(",", ".")));
}

/** "1 cell", "2 cells". */
export function count(n: number, word: string): string {
  return `${n} ${word}${n === 1 ? "" : "s"}`;
}

/** True when every value equals the first (also for fewer than two values). */
export function allEqual(x: ArrayLike<number>): boolean {
  for (let i = 1; i < x.length; i++) if (x[i] !== x[0]) return false;
  return true;
}

/** True for a blank cell value (fast path for primitives, rich values through readCell). */
function isBlankValue(v: unknown): boolean {
  if (v === null || v === undefined || v === "") return true;
  return typeof v === "object" ? readCell(v).kind === "blank" : false;
}

/** How a cell is quoted in a message. */
function describe(c: Cell): string {
  switch (c.kind) {
    case "text": {
      const t = c.value.length > 24 ? `${c.value.slice(0, 21)}…` : c.value;
      if (looksNumeric(c.value)) return `'${t}' is a number stored as text; enter it as a number (retype it, or convert the column with =VALUE(…) or Text to Columns)`;
      return `'${t}' is not a number`;
    }
    case "logical":
      return `${c.value ? "TRUE" : "FALSE"} is a logical value, not a number; enter a number or clear the cell`;
    case "error":
      return `the cell holds the error ${c.code}; fix the formula there or clear the cell`;
    case "number":
      return `${c.value} is not a finite number`;
    default:
      return "the cell holds a value that is not a number";
  }
}

/** A range argument: its cells, blank mask and (when known) where it sits in the sheet. */
export interface RangeArg {
  /** Parameter name used in messages ("values", "groups"). */
  name: string;
  cells: unknown[][];
  rows: number;
  cols: number;
  /** 1 where the cell counts as blank, row-major (index row · cols + col). */
  blank: Uint8Array;
  address: RangeAddress | null;
}

/**
 * Checks that `raw` is a rectangular range and marks its blank cells (value blanks,
 * or cells the mask from blanks.ts calls empty). A single value is taken as a 1 × 1 range.
 */
export function rangeArg(name: string, raw: unknown, mask: EmptyMask | null = null, address?: string): RangeArg {
  if (raw === null || raw === undefined) fail(invalid(`${name} is missing: give a range of cells.`));
  const cells: unknown[][] = Array.isArray(raw) ? (raw.length > 0 && !Array.isArray(raw[0]) ? [raw as unknown[]] : (raw as unknown[][])) : [[raw]];
  const rows = cells.length;
  if (rows === 0) fail(invalid(`${name} is empty: give a range of cells.`));
  const cols = Array.isArray(cells[0]) ? cells[0].length : 0;
  for (const row of cells) {
    if (!Array.isArray(row) || row.length !== cols || cols === 0) fail(invalid(`${name} is not a rectangular range of cells: give one block of cells (a column, a row or a rectangle).`));
  }
  const blank = new Uint8Array(rows * cols);
  for (let i = 0; i < rows; i++) {
    const row = cells[i];
    const m = mask !== null ? mask[i] : undefined;
    for (let j = 0; j < cols; j++) if ((m !== undefined && m[j] === true) || isBlankValue(row[j])) blank[i * cols + j] = 1;
  }
  return { name, cells, rows, cols, blank, address: parseAddress(address) };
}

/** One column or one row of a range argument, in reading order. */
export interface Vector {
  name: string;
  length: number;
  /** Cell i of the vector. */
  cell(i: number): unknown;
  isBlank(i: number): boolean;
  /** "row 7 (B8)" for a column, "column 3 (D2)" for a row. */
  position(i: number): string;
}

/** A column or row range as a vector; #VALUE! for a block with several rows and columns. */
export function vectorOf(r: RangeArg): Vector {
  const byRow = r.cols === 1;
  if (r.rows > 1 && r.cols > 1) {
    fail(invalid(`${r.name} must be one column or one row (it has ${r.rows} rows and ${r.cols} columns): select a single column of measurements.`));
  }
  const length = byRow ? r.rows : r.cols;
  return {
    name: r.name,
    length,
    cell: (i) => (byRow ? r.cells[i][0] : r.cells[0][i]),
    isBlank: (i) => r.blank[byRow ? i * r.cols : i] === 1,
    position: (i) => {
      const where = byRow ? `row ${i + 1}` : `column ${i + 1}`;
      if (!r.address) return where;
      const cell = byRow ? cellName(r.address.top + i, r.address.left) : cellName(r.address.top, r.address.left + i);
      return `${where} (${cell})`;
    },
  };
}

/**
 * Indices of the rows kept in a call: those with no blank in any of the vectors. All
 * vectors must have the same length (#N/A otherwise).
 */
export function keptRows(vectors: Vector[]): number[] {
  const n = vectors[0].length;
  for (const v of vectors) {
    if (v.length !== n) {
      fail(notAvailable(`${vectors[0].name} has ${count(n, "cell")} but ${v.name} has ${count(v.length, "cell")}: give ranges of the same size, row for row.`));
    }
  }
  const keep: number[] = [];
  for (let i = 0; i < n; i++) {
    let ok = true;
    for (const v of vectors) if (v.isBlank(i)) ok = false;
    if (ok) keep.push(i);
  }
  return keep;
}

/** The numbers at the kept rows; #VALUE! at the first cell that is not a finite number. */
export function numbersAt(v: Vector, keep: number[]): Float64Array {
  const out = new Float64Array(keep.length);
  for (let j = 0; j < keep.length; j++) {
    const raw = v.cell(keep[j]);
    if (typeof raw === "number" && Number.isFinite(raw)) {
      out[j] = raw === 0 ? 0 : raw; // −0 → 0
      continue;
    }
    const c = readCell(raw);
    if (c.kind !== "number" || !Number.isFinite(c.value)) {
      const header = keep[j] === 0 && c.kind === "text" && !looksNumeric(c.value) ? " (leave the header out of the range)" : "";
      fail(invalid(`${v.name}, ${v.position(keep[j])}: ${describe(c)}${header}.`));
    }
    out[j] = c.value === 0 ? 0 : c.value; // −0 → 0
  }
  return out;
}

/** Encoded group labels of the kept rows. */
export interface Labels {
  codes: Int32Array;
  /** Display value of each group (number or text, first spelling seen), by code. */
  names: (string | number)[];
  sizes: Int32Array;
  k: number;
}

/** Labels (numbers or text) at the kept rows, coded 0..k−1 in order of first appearance. */
export function labelsAt(v: Vector, keep: number[]): Labels {
  const index = new Map<string, number>();
  const names: (string | number)[] = [];
  const codes = new Int32Array(keep.length);
  for (let j = 0; j < keep.length; j++) {
    const raw = v.cell(keep[j]);
    const c: Cell = typeof raw === "string" ? { kind: "text", value: raw } : readCell(raw);
    let key: string;
    let shown: string | number;
    if (c.kind === "number" && Number.isFinite(c.value)) {
      shown = c.value === 0 ? 0 : c.value;
      key = String(shown);
    } else if (c.kind === "text") {
      shown = c.value.trim();
      key = shown.toLowerCase();
    } else {
      const what = c.kind === "logical" ? `${c.value ? "TRUE" : "FALSE"} is a logical value` : c.kind === "error" ? `the cell holds the error ${c.code}` : "the cell holds an unusable value";
      fail(invalid(`${v.name}, ${v.position(keep[j])}: ${what}; group labels must be text or numbers: fix or clear that cell.`));
    }
    let code = index.get(key);
    if (code === undefined) {
      code = names.length;
      index.set(key, code);
      names.push(shown);
    }
    codes[j] = code;
  }
  const sizes = new Int32Array(names.length);
  for (let j = 0; j < codes.length; j++) sizes[codes[j]]++;
  return { codes, names, sizes, k: names.length };
}

/** The column vectors of a block range (each column one variable), e.g. TRAITTEST's traits. */
export function columnsOf(r: RangeArg): Vector[] {
  const out: Vector[] = [];
  for (let j = 0; j < r.cols; j++) {
    out.push({
      name: r.name,
      length: r.rows,
      cell: (i) => r.cells[i][j],
      isBlank: (i) => r.blank[i * r.cols + j] === 1,
      position: (i) => {
        const where = `row ${i + 1}, column ${j + 1}`;
        return r.address ? `${where} (${cellName(r.address.top + i, r.address.left + j)})` : where;
      },
    });
  }
  return out;
}
