/**
 * Sheet errors: the Excel error values a sheet function can return, as a plain class
 * that works without Excel (preview page, tests, Web Worker) and becomes a
 * `CustomFunctions.Error` only at the Excel boundary (see excel-result.ts).
 *
 * Which code for what (Excel shows a custom message only with #VALUE! and #N/A, so every
 * problem the user can fix by editing an argument uses one of those two):
 *  - `#VALUE!` an argument holds something unusable: text, a logical value or an error
 *    in a numeric range, an unknown option word, an option number out of range;
 *  - `#N/A`    the data cannot answer the question: ranges of different sizes, too few
 *    groups or observations, blank cells that could not be told from zeros;
 *  - `#DIV/0!` the statistic divides by a zero spread (e.g. every value equal);
 *  - `#NUM!`   a result that is not a finite number for another reason.
 */
/** The codes a sheet function returns (#REF! and #NAME? can arrive as inputs but are not valid outputs). */
export type SheetErrorCode = "#VALUE!" | "#N/A" | "#NUM!" | "#DIV/0!";

export class SheetError {
  readonly code: SheetErrorCode;
  readonly message: string;
  constructor(code: SheetErrorCode, message: string) {
    this.code = code;
    this.message = message;
  }
  toString(): string {
    return `${this.code} ${this.message}`;
  }
}

/** A SheetError as it crosses postMessage (class identity is lost in a structured clone). */
export interface SheetErrorData {
  sheetError: true;
  code: SheetErrorCode;
  message: string;
}

export function isSheetError(x: unknown): x is SheetError {
  return x instanceof SheetError;
}

export function toErrorData(e: SheetError): SheetErrorData {
  return { sheetError: true, code: e.code, message: e.message };
}

export function isErrorData(x: unknown): x is SheetErrorData {
  return typeof x === "object" && x !== null && (x as SheetErrorData).sheetError === true;
}

export function fromErrorData(d: SheetErrorData): SheetError {
  return new SheetError(d.code, d.message);
}

/** `#VALUE!` with a message. */
export const invalid = (message: string) => new SheetError("#VALUE!", message);
/** `#N/A` with a message. */
export const notAvailable = (message: string) => new SheetError("#N/A", message);
/** `#DIV/0!` (Excel shows no message for it; the preview does). */
export const divByZero = (message: string) => new SheetError("#DIV/0!", message);
/** `#NUM!` (Excel shows no message for it; the preview does). */
export const badNumber = (message: string) => new SheetError("#NUM!", message);

/**
 * Thrown inside the argument layer to stop at the first problem; caught at the function
 * boundary (sheet.ts) and returned as the error value. Never escapes a sheet function.
 */
export class SheetErrorSignal extends Error {
  readonly error: SheetError;
  constructor(error: SheetError) {
    super(error.message);
    this.error = error;
  }
}

/** Stops argument parsing with the given error (caught at the function boundary). */
export function fail(error: SheetError): never {
  throw new SheetErrorSignal(error);
}
