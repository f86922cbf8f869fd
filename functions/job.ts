/**
 * A job: the engine work of one sheet-function call, as plain data that can be run
 * inline or posted to a Web Worker ({ op, args }), with its estimated cost.
 */
import { SheetError } from "./errors";

/** A cell value of a spilled result ("" for an empty cell, never null). */
export type ResultCell = number | string;

/** What a sheet function returns: a number, a spilled table, or an error value. */
export type SheetResult = number | string | ResultCell[][] | SheetError;

export interface Job {
  /** Operation name in the op table (ops.ts). */
  op: string;
  /** Plain, structured-cloneable input (numbers, strings, typed arrays, arrays, objects). */
  args: unknown;
  /**
   * Estimated work, in units of "one observation in one resample" (n × resamples for
   * most tests). Jobs above {@link HEAVY_COST} go to a Web Worker.
   */
  cost: number;
}

/** Work above this (n × resamples) runs in a Web Worker, so Excel stays responsive. */
export const HEAVY_COST = 2e7;
