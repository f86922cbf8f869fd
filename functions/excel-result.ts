/**
 * The Excel boundary: a sheet function's outcome as Excel wants it. A SheetError
 * becomes `new CustomFunctions.Error(code, message)` when the real runtime is present
 * (the message only for #VALUE! and #N/A, the codes Excel shows messages for); outside
 * Excel it stays a SheetError. A spilling function returns its error as a 1 × 1 array.
 */
import { BlankContext, currentBlankReader } from "./blanks";
import { CancelToken } from "./cancel";
import { FUNCTIONS } from "./catalog";
import { SheetError, isSheetError } from "./errors";
import { SheetResult } from "./job";
import { callSheetFunction } from "./sheet";

type ErrorCtor = new (code: CustomFunctions.ErrorCode, message?: string) => CustomFunctions.Error;

function runtimeErrorClass(): ErrorCtor | null {
  const cf = (globalThis as { CustomFunctions?: { Error?: unknown } }).CustomFunctions;
  return cf && typeof cf.Error === "function" ? (cf.Error as ErrorCtor) : null;
}

/** A SheetError as the runtime's error value (or itself outside Excel). */
export function toExcelError(e: SheetError): CustomFunctions.Error | SheetError {
  const Ctor = runtimeErrorClass();
  if (!Ctor) return e;
  const code = e.code as unknown as CustomFunctions.ErrorCode;
  return e.code === "#VALUE!" || e.code === "#N/A" ? new Ctor(code, e.message) : new Ctor(code);
}

export function toExcel(r: SheetResult, spills: boolean): unknown {
  if (isSheetError(r)) {
    const e = toExcelError(r);
    return spills ? [[e]] : e;
  }
  if (spills && !Array.isArray(r)) return [[r]];
  return r;
}

/**
 * Runs a sheet function for Excel: wires `invocation.onCanceled` to a cancel token,
 * passes the parameter addresses to the blank-cell check, converts the outcome.
 */
export async function excelCall(name: string, args: unknown[], invocation?: CustomFunctions.CancelableInvocation): Promise<unknown> {
  const spec = FUNCTIONS[name];
  const spills = spec ? spec.spills : false;
  try {
    const token = new CancelToken();
    if (invocation) invocation.onCanceled = () => token.cancel();
    const blanks: BlankContext = { reader: currentBlankReader(), addresses: invocation?.parameterAddresses };
    return toExcel(await callSheetFunction(name, args, { blanks, token }), spills);
  } catch (e) {
    return toExcel(new SheetError("#N/A", `unexpected problem: ${e instanceof Error ? e.message : String(e)}`), spills);
  }
}
