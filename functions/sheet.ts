/**
 * One sheet-function call, end to end: blank cells resolved (blanks.ts), arguments
 * parsed into an engine job (catalog.ts), the job run (dispatch.ts: cache, inline or
 * Web Worker). Every outcome is a value — a number, a table or a SheetError; nothing
 * throws past this function.
 */
import { BlankContext, EmptyMask, emptyMasks } from "./blanks";
import { CallArgs } from "./call-args";
import { CancelToken } from "./cancel";
import { FUNCTIONS } from "./catalog";
import { runJob } from "./dispatch";
import { SheetErrorSignal, invalid, isSheetError, notAvailable } from "./errors";
import { SheetResult } from "./job";
import { checkResult } from "./ops";

export interface CallContext {
  /** How to find blank cells; omitted: blanks are null / "" only (preview, tests, panel). */
  blanks?: BlankContext;
  /** Cancels the call (Excel's onCanceled). */
  token?: CancelToken;
}

export async function callSheetFunction(name: string, args: readonly unknown[], ctx: CallContext = {}): Promise<SheetResult> {
  try {
    const spec = FUNCTIONS[String(name).toUpperCase()];
    if (!spec) return notAvailable(`there is no sheet function called ${name}.`);
    const names = spec.params.map((p) => p.name);
    if (args.length > names.length) {
      return invalid(`${spec.name} takes at most ${names.length} arguments (${names.join(", ")}); it was given ${args.length}.`);
    }
    const padded = names.map((_, i) => (args[i] === undefined ? null : args[i]));
    let masks: (EmptyMask | null)[] = [];
    if (ctx.blanks) {
      const ranges = spec.params.flatMap((p, i) => (p.range ? [i] : []));
      const m = await emptyMasks(padded, ranges, names, ctx.blanks);
      if (isSheetError(m)) return m;
      masks = m;
    }
    const call = new CallArgs(names, padded, masks, ctx.blanks?.addresses);
    const job = spec.prepare(call);
    return checkResult(await runJob(job, ctx.token));
  } catch (e) {
    if (e instanceof SheetErrorSignal) return e.error;
    return notAvailable(`unexpected problem: ${e instanceof Error ? e.message : String(e)}`);
  }
}
