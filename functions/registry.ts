/**
 * The sheet functions as plain async functions, keyed by their uppercase name, for
 * callers outside Excel's calculation: the preview page's formula evaluator and the
 * panel. Same arguments as in a cell (2D arrays; null for an omitted optional), same
 * answers; an error comes back as a SheetError (code + message), never thrown.
 *
 * Blank cells here are the null / "" cells (the caller reads values itself, so a blank
 * is never a 0). No CustomFunctions.associate here: functions.ts registers with Excel.
 */
import { CancelToken } from "./cancel";
import { FUNCTION_SPECS } from "./catalog";
import { SheetResult } from "./job";
import { callSheetFunction } from "./sheet";

export { SheetError, isSheetError } from "./errors";
export type { SheetErrorCode } from "./errors";
export { CancelToken } from "./cancel";
export type { SheetResult, ResultCell } from "./job";
export { FUNCTION_SPECS } from "./catalog";
export type { FunctionSpec, ParamSpec } from "./catalog";

export type SheetFunction = (...args: any[]) => any | Promise<any>;

export const sheetFunctions: Record<string, SheetFunction> = Object.fromEntries(
  FUNCTION_SPECS.map((spec) => [spec.name, (...args: unknown[]): Promise<SheetResult> => callSheetFunction(spec.name, args)]),
);

/** As {@link sheetFunctions}, with a cancel token (the panel's Cancel button). */
export function callWithCancel(name: string, args: unknown[], token: CancelToken): Promise<SheetResult> {
  return callSheetFunction(name, args, { token });
}
