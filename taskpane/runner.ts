/**
 * Runs analyses for the panel in Web Workers (analysis-worker.js): progress comes back
 * as messages, and Cancel terminates the workers — the only way to stop a busy worker
 * at once — and fresh ones start for the next run. Large one-way data (the shared,
 * tie-compressed relabellings) run as two parts in two workers, merged in the first.
 * Where `Worker` does not exist (unit tests) the same jobs run inline.
 */
import { CancelledError } from "../src/permutation";
import { SHARED_PARTS, SharedPartial, useShared } from "../src/analysis/tied-groups";
import type { AnalysisRequest, AnalysisResult, GroupsRequest } from "../src/analysis/types";
import { runJob } from "./analysis-worker";
import type { PanelMessage, WorkerMessage } from "./worker-protocol";

export interface WorkerLike {
  postMessage(m: PanelMessage): void;
  terminate(): void;
  onmessage: ((e: { data: WorkerMessage }) => void) | null;
  onerror: ((e: unknown) => void) | null;
}

export class AnalysisRunner {
  private workers: (WorkerLike | null)[] = [null, null];
  private nextId = 1;
  private current: { ids: number[]; reject: (e: Error) => void } | null = null;
  private readonly factory: (() => WorkerLike) | null;
  /** Milliseconds the last analysis took in the workers (wall time, page side). */
  lastMs = NaN;

  constructor(url = "analysis-worker.js", factory?: (() => WorkerLike) | null) {
    this.factory = factory !== undefined ? factory : typeof Worker !== "undefined" ? () => new Worker(url) as unknown as WorkerLike : null;
  }

  get busy(): boolean {
    return this.current !== null;
  }

  /** Sends one message to worker `slot` (or runs it inline) and calls `on` with its replies. */
  private send(slot: number, msg: PanelMessage, on: (m: WorkerMessage) => void): void {
    if (!this.factory) {
      setTimeout(() => runJob(msg, on), 0);
      return;
    }
    const w = this.workers[slot] ?? (this.workers[slot] = this.factory());
    w.onmessage = (e) => on(e.data);
    w.onerror = (e) => {
      this.workers[slot] = null;
      on({ type: "error", id: msg.id, message: `the analysis worker failed: ${String((e as { message?: string })?.message ?? e)}` });
    };
    w.postMessage(msg);
  }

  run(request: AnalysisRequest, onProgress: (fraction: number) => void): Promise<AnalysisResult> {
    if (this.current) return Promise.reject(new Error("an analysis is already running"));
    const t0 = typeof performance !== "undefined" ? performance.now() : Date.now();
    return new Promise<AnalysisResult>((resolve, reject) => {
      const ids: number[] = [];
      this.current = { ids, reject };
      const live = () => this.current !== null && this.current.ids === ids;
      const done = (r: AnalysisResult) => {
        if (!live()) return;
        this.current = null;
        this.lastMs = (typeof performance !== "undefined" ? performance.now() : Date.now()) - t0;
        resolve(r);
      };
      const fail = (message: string) => {
        if (!live()) return;
        this.current = null;
        reject(new Error(message));
      };
      if (request.question === "groups" && useShared(request)) {
        const req = request as GroupsRequest;
        const fractions = new Array(SHARED_PARTS).fill(0);
        const partials: SharedPartial[] = [];
        for (let part = 0; part < SHARED_PARTS; part++) {
          const id = this.nextId++;
          ids.push(id);
          this.send(part % 2, { type: "part", id, request: req, part, parts: SHARED_PARTS }, (m) => {
            if (!live()) return;
            if (m.type === "progress") {
              fractions[part] = m.fraction;
              onProgress((0.95 * fractions.reduce((a, b) => a + b, 0)) / SHARED_PARTS);
            } else if (m.type === "partial") {
              partials.push(m.partial);
              if (partials.length === SHARED_PARTS) {
                const fid = this.nextId++;
                ids.push(fid);
                this.send(0, { type: "finish", id: fid, request: req, partials }, (f) => {
                  if (f.type === "done") done(f.result);
                  else if (f.type === "error") fail(f.message);
                });
              }
            } else if (m.type === "error") fail(m.message);
          });
        }
        return;
      }
      const id = this.nextId++;
      ids.push(id);
      this.send(0, { type: "run", id, request }, (m) => {
        if (!live()) return;
        if (m.type === "progress") onProgress(m.fraction);
        else if (m.type === "done") done(m.result);
        else if (m.type === "error") fail(m.message);
      });
    });
  }

  /** Stops the running analysis at once; its promise rejects with CancelledError. */
  cancel(): void {
    const c = this.current;
    if (!c) return;
    this.current = null;
    for (let i = 0; i < this.workers.length; i++) {
      this.workers[i]?.terminate();
      this.workers[i] = null;
    }
    c.reject(new CancelledError());
  }
}
