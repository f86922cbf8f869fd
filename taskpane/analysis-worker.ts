/**
 * Web Worker running the panel's analyses off the page's thread, so the panel (and
 * Excel) stay responsive. Progress is posted at most every 50 ms. Cancel is the panel
 * terminating the worker (see runner.ts).
 */
import { runAnalysis } from "../src/analysis/run";
import { finishShared, sharedPartial } from "../src/analysis/tied-groups";
import type { PanelMessage, WorkerMessage } from "./worker-protocol";

/** The worker's job for one message (also run inline by tests and the bench). */
export function runJob(msg: PanelMessage, post: (m: WorkerMessage) => void, now: () => number = () => performance.now()): void {
  const t0 = now();
  let last = -Infinity;
  const progress = (fraction: number) => {
    const t = now();
    if (t - last >= 50) {
      last = t;
      post({ type: "progress", id: msg.id, fraction });
    }
    return false;
  };
  try {
    if (msg.type === "part") {
      const partial = sharedPartial(msg.request, msg.part, msg.parts, progress);
      post({ type: "partial", id: msg.id, partial, ms: now() - t0 });
    } else if (msg.type === "finish") {
      post({ type: "done", id: msg.id, result: finishShared(msg.request, msg.partials), ms: now() - t0 });
    } else {
      post({ type: "done", id: msg.id, result: runAnalysis(msg.request, progress), ms: now() - t0 });
    }
  } catch (e) {
    post({ type: "error", id: msg.id, message: e instanceof Error ? e.message : String(e) });
  }
}

if (typeof self !== "undefined" && typeof (self as unknown as { importScripts?: unknown }).importScripts === "function") {
  const scope = self as unknown as { onmessage: ((e: MessageEvent<PanelMessage>) => void) | null; postMessage(m: WorkerMessage): void };
  scope.onmessage = (e) => {
    if (e.data && typeof e.data.type === "string") runJob(e.data, (m) => scope.postMessage(m));
  };
}
