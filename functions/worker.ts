/**
 * Web Worker entry (bundled as worker.js beside taskpane.html): runs heavy engine work
 * off the page that hosts the custom functions, so Excel never sees an unresponsive
 * add-in. Protocol: receives { id, op, args }, runs the op table (ops.ts), posts
 * { id, ok: true, result } or { id, ok: false, error: { sheetError, code, message } }.
 * Cancellation is by terminating the worker (worker-client.ts), so no message for it.
 */
import { SheetErrorData, isSheetError, notAvailable, toErrorData } from "./errors";
import { ResultCell, SheetResult } from "./job";
import { runOp } from "./ops";

export interface WorkerRequest {
  id: number;
  op: string;
  args: unknown;
}

export type WorkerReply = { id: number; ok: true; result: number | string | ResultCell[][] } | { id: number; ok: false; error: SheetErrorData };

/** Answers one request (used by the worker's message handler and by tests). */
export function handleRequest(req: WorkerRequest): WorkerReply {
  let r: SheetResult;
  try {
    r = runOp(req.op, req.args);
  } catch (e) {
    r = notAvailable(`the calculation stopped: ${e instanceof Error ? e.message : String(e)}`);
  }
  if (isSheetError(r)) return { id: req.id, ok: false, error: toErrorData(r) };
  return { id: req.id, ok: true, result: r };
}

// Install the handler only when this file runs as a worker (not when a page or a test imports it).
const g = globalThis as unknown as {
  WorkerGlobalScope?: Function;
  importScripts?: unknown;
  postMessage?: (m: unknown) => void;
  onmessage?: ((ev: { data: WorkerRequest }) => void) | null;
};
const inWorker = (typeof g.WorkerGlobalScope === "function" && globalThis instanceof g.WorkerGlobalScope) || typeof g.importScripts === "function";
if (inWorker && typeof g.postMessage === "function") {
  g.onmessage = (ev) => {
    g.postMessage!(handleRequest(ev.data));
  };
}
