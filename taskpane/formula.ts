/**
 * The `=RS.…` formulas the results block writes: building them, and parsing exactly the
 * forms built here (for the preview's evaluator).
 *
 * Form: `=RS.NAME(arg, arg, …)` where each arg is a range reference (`B2:B41`,
 * `$B$2:$B$41`, `Trial!B2:B41`, `'Trial data'!$B$2:$B$41`, a single cell), a string
 * literal in double quotes (`""` inside for a quote), a number, TRUE or FALSE.
 */
import { cellName, parseAddress } from "../functions/address";
import type { Area } from "./host";

export type FormulaArg = { ref: Area } | { text: string } | { number: number } | { logical: boolean };

export interface ParsedFormula {
  /** Function name without the namespace, upper case ("GROUPTEST"). */
  name: string;
  args: FormulaArg[];
}

/** A sheet name as written in a formula: quoted unless it is a plain word. */
export function quoteSheet(sheet: string): string {
  return /^[A-Za-z_][A-Za-z0-9_.]*$/.test(sheet) && !/^[A-Za-z]{1,3}[0-9]+$/.test(sheet) ? sheet : `'${sheet.replace(/'/g, "''")}'`;
}

/** Absolute, sheet-qualified reference to an area: `'Trial data'!$D$2:$D$41`. */
export function refText(a: Area): string {
  const abs = (r: number, c: number) => cellName(r, c).replace(/^([A-Z]+)([0-9]+)$/, "$$$1$$$2");
  const tl = abs(a.top, a.left);
  const range = a.rows === 1 && a.cols === 1 ? tl : `${tl}:${abs(a.top + a.rows - 1, a.left + a.cols - 1)}`;
  return `${quoteSheet(a.sheet)}!${range}`;
}

/** Plain A1 text of an area for titles: `'Trial data'!A1:D41`. */
export function areaText(a: Area): string {
  const tl = cellName(a.top, a.left);
  const range = a.rows === 1 && a.cols === 1 ? tl : `${tl}:${cellName(a.top + a.rows - 1, a.left + a.cols - 1)}`;
  return `${quoteSheet(a.sheet)}!${range}`;
}

/** `=RS.NAME(…)` from arguments: areas become references, strings literals. */
export function rsFormula(name: string, args: (Area | string | number | boolean)[]): string {
  const parts = args.map((a) => {
    if (typeof a === "number") return String(a);
    if (typeof a === "boolean") return a ? "TRUE" : "FALSE";
    if (typeof a === "string") return `"${a.replace(/"/g, '""')}"`;
    return refText(a);
  });
  return `=RS.${name.toUpperCase()}(${parts.join(",")})`;
}

/** Parses a formula built by {@link rsFormula}; null for any other text. */
export function parseFormula(text: string): ParsedFormula | null {
  const m = /^=\s*RS\.([A-Za-z][A-Za-z0-9]*)\s*\((.*)\)\s*$/s.exec(text);
  if (!m) return null;
  const name = m[1].toUpperCase();
  const body = m[2];
  const args: FormulaArg[] = [];
  let i = 0;
  const skip = () => {
    while (i < body.length && /\s/.test(body[i])) i++;
  };
  skip();
  if (i >= body.length) return { name, args };
  for (;;) {
    skip();
    const arg = readArg();
    if (!arg) return null;
    args.push(arg);
    skip();
    if (i >= body.length) break;
    if (body[i] !== ",") return null;
    i++;
  }
  return { name, args };

  function readArg(): FormulaArg | null {
    if (body[i] === '"') {
      let s = "";
      i++;
      for (;;) {
        if (i >= body.length) return null;
        if (body[i] === '"') {
          if (body[i + 1] === '"') {
            s += '"';
            i += 2;
            continue;
          }
          i++;
          return { text: s };
        }
        s += body[i++];
      }
    }
    let sheet: string | null = null;
    if (body[i] === "'") {
      let s = "";
      i++;
      for (;;) {
        if (i >= body.length) return null;
        if (body[i] === "'") {
          if (body[i + 1] === "'") {
            s += "'";
            i += 2;
            continue;
          }
          i++;
          break;
        }
        s += body[i++];
      }
      if (body[i] !== "!") return null;
      i++;
      sheet = s;
    }
    const start = i;
    while (i < body.length && !/[,\s]/.test(body[i])) i++;
    const token = body.slice(start, i);
    if (token === "") return null;
    if (sheet === null) {
      if (/^-?[0-9]+(\.[0-9]+)?([eE][-+]?[0-9]+)?$/.test(token)) return { number: Number(token) };
      if (/^(TRUE|FALSE)$/i.test(token)) return { logical: token.toUpperCase() === "TRUE" };
    }
    const address = sheet === null ? token : `'${sheet.replace(/'/g, "''")}'!${token}`;
    const p = parseAddress(address);
    if (!p) return null;
    return { ref: { sheet: p.sheet, top: p.top, left: p.left, rows: p.rows, cols: p.cols } };
  }
}
