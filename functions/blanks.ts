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
 * Limits, each answered with #N/A and a plain message rather than counting blanks as
 * zeros: Excel reported no address for a range holding zeros; the range lies in another
 * workbook (its cells cannot be read from this one — a same-named sheet here must not
 * stand in for it); the read failed (sheet renamed or deleted meanwhile, several areas)
 * or came back in another shape. A huge range (a whole column) is narrowed to its used
 * part before reading, so the read stays small (see {@link ExcelBlankReader}).
 *
 * The reader is an interface so tests can use a fake; outside Excel (preview page,
 * vitest) there is no reader and blanks are the null / "" cells.
 */
import { RangeAddress, cellName, parseAddress } from "./address";
import { SheetError, notAvailable } from "./errors";

/** A grid with true where the cell is empty, same shape as the range. */
export type EmptyMask = boolean[][];

export interface BlankReader {
  /** One mask per address, or null where that range could not be read. */
  readEmpty(addresses: string[]): Promise<(EmptyMask | null)[]>;
  /** Name of the workbook the functions run in ("Book1.xlsx"), or null when unknown. */
  workbookName?(): Promise<string | null>;
}

/** Ranges up to this many cells are read directly; larger ones only where the sheet is used. */
export const DIRECT_READ_CELLS = 65_536;
/**
 * Cells of value types fetched per round trip from a large range (~2 MB of reply, under
 * the 5 MB request/response cap of Excel on the web).
 */
export const READ_CHUNK_CELLS = 200_000;

/**
 * Reads `Range.valueTypes` through Office.js.
 *
 * Small ranges (≤ {@link DIRECT_READ_CELLS} cells) are read as they are, all in one round
 * trip. A larger range — typically a whole-column reference, 1,048,576 rows of which a
 * few hundred hold data — is first narrowed to its used part
 * (`getUsedRangeOrNullObject(true)`, cells with values only): every cell outside that
 * part is empty by definition, and the used part is read in chunks of at most
 * {@link READ_CHUNK_CELLS} cells. Rows outside the used part share one all-empty row
 * array, so the mask costs one pointer per row.
 */
export class ExcelBlankReader implements BlankReader {
  async readEmpty(addresses: string[]): Promise<(EmptyMask | null)[]> {
    const parsed = addresses.map((a) => parseAddress(a));
    try {
      return await Excel.run(async (context) => {
        const sheets = parsed.map((p) => (p && p.sheet !== "" ? context.workbook.worksheets.getItem(p.sheet) : null));
        const direct = parsed.map((p, i) => {
          const ws = sheets[i];
          if (!p || !ws || p.rows * p.cols > DIRECT_READ_CELLS) return null;
          const r = ws.getRange(p.range);
          r.load("valueTypes");
          return r;
        });
        const used = parsed.map((p, i) => {
          const ws = sheets[i];
          if (!p || !ws || p.rows * p.cols <= DIRECT_READ_CELLS) return null;
          const u = ws.getRange(p.range).getUsedRangeOrNullObject(true);
          u.load("address");
          return u;
        });
        await context.sync();
        const out: (EmptyMask | null)[] = [];
        for (let i = 0; i < parsed.length; i++) {
          const p = parsed[i];
          const d = direct[i];
          const u = used[i];
          if (d) out.push(d.valueTypes.map((row) => row.map(isEmptyType)));
          else if (p && u) out.push(await readLarge(context, sheets[i]!, p, u));
          else out.push(null);
        }
        return out;
      });
    } catch {
      return parsed.map(() => null);
    }
  }

  async workbookName(): Promise<string | null> {
    try {
      return await Excel.run(async (context) => {
        context.workbook.load("name");
        await context.sync();
        return typeof context.workbook.name === "string" ? context.workbook.name : null;
      });
    } catch {
      return null;
    }
  }
}

const isEmptyType = (t: unknown): boolean => String(t) === "Empty";

/** The mask of a large range from its used part (see {@link ExcelBlankReader}). */
async function readLarge(context: Excel.RequestContext, ws: Excel.Worksheet, p: RangeAddress, used: Excel.Range): Promise<EmptyMask | null> {
  const emptyRow: boolean[] = new Array<boolean>(p.cols).fill(true);
  const mask: EmptyMask = new Array<boolean[]>(p.rows).fill(emptyRow);
  if (used.isNullObject) return mask;
  const u = parseAddress(used.address);
  if (!u) return null;
  const top = Math.max(u.top, p.top);
  const bottom = Math.min(u.top + u.rows, p.top + p.rows);
  const left = Math.max(u.left, p.left);
  const right = Math.min(u.left + u.cols, p.left + p.cols);
  if (bottom <= top || right <= left) return mask;
  const width = right - left;
  const step = Math.max(1, Math.floor(READ_CHUNK_CELLS / width));
  for (let r0 = top; r0 < bottom; r0 += step) {
    const r1 = Math.min(bottom, r0 + step);
    const chunk = ws.getRange(`${cellName(r0, left)}:${cellName(r1 - 1, right - 1)}`);
    chunk.load("valueTypes");
    await context.sync();
    const types = chunk.valueTypes;
    if (!Array.isArray(types) || types.length !== r1 - r0) return null;
    for (let i = 0; i < types.length; i++) {
      const row = emptyRow.slice();
      const t = types[i];
      if (!Array.isArray(t) || t.length !== width) return null;
      for (let j = 0; j < width; j++) row[left - p.left + j] = isEmptyType(t[j]);
      mask[r0 + i - p.top] = row;
    }
  }
  return mask;
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
 * Excel gave no address for it (no addresses at all, or none at its position) → error;
 * a range in another workbook (its cells cannot be read from here) → error; the read
 * failed or changed shape → error.
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
    const a = ctx.addresses?.[i];
    if (typeof a !== "string") {
      return notAvailable(
        `${names[i]} holds zeros, and this version of Excel does not report where arguments come from, so blank cells cannot be told from zeros; update Excel, or fill the blank cells.`,
      );
    }
    if (a.trim() !== "") wanted.push(i);
  }
  if (wanted.length === 0) return masks;
  const books = wanted.map((i) => parseAddress(ctx.addresses![i])?.book ?? "");
  if (books.some((b) => b !== "")) {
    const here = ctx.reader.workbookName ? await ctx.reader.workbookName() : null;
    for (let w = 0; w < wanted.length; w++) {
      if (books[w] !== "" && (here === null || !sameWorkbook(books[w], here))) {
        return notAvailable(
          `${names[wanted[w]]} is in another workbook ([${books[w]}]), where a blank cell and a 0 cannot be told apart; copy the data into this workbook, or fill the blank cells.`,
        );
      }
    }
  }
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

/** "Book1.xlsx" and "Book1" (an unsaved or extension-less name) are the same workbook; case is ignored. */
export function sameWorkbook(a: string, b: string): boolean {
  const norm = (s: string) => s.trim().toLowerCase();
  const bare = (s: string) => norm(s).replace(/\.[a-z0-9]{3,4}$/, "");
  return norm(a) === norm(b) || bare(a) === bare(b);
}
