/**
 * Telling blank cells from zeros.
 *
 * Excel on the desktop passes a blank cell inside a range argument as 0, so a value of 0
 * alone does not say whether the cell is empty. Every range-taking sheet function asks
 * Excel for its parameters' addresses (`@requiresParameterAddresses`); when a range holds
 * a 0 and has an address, the function reads that range's `valueTypes` through the
 * shared runtime (`Excel.run`) and treats cells typed "Empty" as blank. Ranges without
 * a 0 need no read (null and "" are blank already), so most calls cost nothing extra.
 *
 * The reader is an interface so tests can use a fake; outside Excel (preview page,
 * vitest) there is no reader and blanks are the null / "" cells.
 */
import { cellName, parseAddress } from "./address";
import { SheetError, notAvailable } from "./errors";

/** A grid with true where the cell is empty, same shape as the range. */
export type EmptyMask = boolean[][];

export interface BlankReader {
  /** One mask per address, or null where that range could not be read. */
  readEmpty(addresses: string[]): Promise<(EmptyMask | null)[]>;
}

/** Reads `Range.valueTypes` through Office.js, all ranges in one round trip. */
export class ExcelBlankReader implements BlankReader {
  async readEmpty(addresses: string[]): Promise<(EmptyMask | null)[]> {
    const parsed = addresses.map((a) => parseAddress(a));
    try {
      return await Excel.run(async (context) => {
        const ranges = parsed.map((p) => {
          if (!p || p.sheet === "") return null;
          const r = context.workbook.worksheets.getItem(p.sheet).getRange(p.range);
          r.load("valueTypes");
          return r;
        });
        await context.sync();
        return ranges.map((r) => (r ? r.valueTypes.map((row) => row.map((t) => String(t) === "Empty")) : null));
      });
    } catch {
      return parsed.map(() => null);
    }
  }
}

/** The reader used when running inside Excel: Office.js's, when `Excel.run` exists. */
export function defaultBlankReader(): BlankReader | null {
  return typeof Excel !== "undefined" && typeof (Excel as { run?: unknown }).run === "function" ? new ExcelBlankReader() : null;
}

let override: BlankReader | null | undefined;

/** Replaces the reader (tests pass a fake; null disables reading); undefined restores the default. */
export function setBlankReader(reader: BlankReader | null | undefined): void {
  override = reader;
}

/** The reader in use: the one set by {@link setBlankReader}, else {@link defaultBlankReader}. */
export function currentBlankReader(): BlankReader | null {
  return override !== undefined ? override : defaultBlankReader();
}

/** How a call finds its blank cells. */
export interface BlankContext {
  /** The reader of value types, or null outside Excel. */
  reader: BlankReader | null;
  /**
   * Parameter addresses as Excel reported them (one per parameter, "" for a value that
   * is not a reference), or undefined when Excel reported none.
   */
  addresses: string[] | undefined;
}

/** True when some cell of the grid is the number 0 (the only value a blank can be mistaken for). */
export function holdsZero(raw: unknown): boolean {
  if (!Array.isArray(raw)) return raw === 0;
  for (const row of raw) {
    if (Array.isArray(row)) {
      for (const v of row) if (v === 0) return true;
    } else if (row === 0) return true;
  }
  return false;
}

function sameShape(mask: EmptyMask, raw: unknown[][]): boolean {
  if (mask.length !== raw.length) return false;
  for (let i = 0; i < raw.length; i++) {
    if (!Array.isArray(raw[i]) || !Array.isArray(mask[i]) || mask[i].length !== raw[i].length) return false;
  }
  return true;
}

/**
 * The address to read for a parameter: the rectangle of the values Excel passed, from
 * the reported top-left cell (so a whole-column reference reads only the rows passed).
 * The reported address itself when it cannot be parsed (the read then fails, safely).
 */
export function readAddress(address: string, raw: unknown[][]): string {
  const p = parseAddress(address);
  if (!p || p.sheet === "") return address;
  const rows = raw.length;
  const cols = rows > 0 && Array.isArray(raw[0]) ? raw[0].length : 1;
  const sheet = `'${p.sheet.replace(/'/g, "''")}'`;
  const a = cellName(p.top, p.left);
  const b = cellName(p.top + Math.max(rows, 1) - 1, p.left + Math.max(cols, 1) - 1);
  return `${sheet}!${a === b ? a : `${a}:${b}`}`;
}

/**
 * The empty-cell masks of the range parameters at `indices` (null where none is needed
 * or none can exist), or an error when a range holds zeros that could be blanks and
 * Excel could not say which.
 *
 * Rules: no reader (outside Excel) → no masks; a range without a 0 → no mask; a value
 * that is not a reference (address "") → no mask (a computed array has no blank cells);
 * Excel gave no addresses at all → error; the read failed or changed shape → error.
 */
export async function emptyMasks(
  args: unknown[],
  indices: number[],
  names: string[],
  ctx: BlankContext,
): Promise<(EmptyMask | null)[] | SheetError> {
  const masks: (EmptyMask | null)[] = args.map(() => null);
  if (!ctx.reader) return masks;
  const wanted: number[] = [];
  for (const i of indices) {
    if (!Array.isArray(args[i]) || !holdsZero(args[i])) continue;
    if (ctx.addresses === undefined) {
      return notAvailable(
        `${names[i]} holds zeros, and this version of Excel does not report where arguments come from, so blank cells cannot be told from zeros; update Excel, or fill the blank cells.`,
      );
    }
    const a = ctx.addresses[i];
    if (typeof a === "string" && a.trim() !== "") wanted.push(i);
  }
  if (wanted.length === 0) return masks;
  const read = await ctx.reader.readEmpty(wanted.map((i) => readAddress(ctx.addresses![i], args[i] as unknown[][])));
  for (let w = 0; w < wanted.length; w++) {
    const i = wanted[w];
    const m = read[w];
    if (!m || !sameShape(m, args[i] as unknown[][])) {
      return notAvailable(
        `could not check which cells of ${names[i]} are blank (a blank and a 0 look alike); recalculate (F9), or use a range on one sheet.`,
      );
    }
    masks[i] = m;
  }
  return masks;
}
