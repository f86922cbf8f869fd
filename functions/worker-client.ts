/**
 * A small pool of Web Workers (at most 2) for heavy sheet-function work.
 *
 *  - Jobs queue when every worker is busy; workers start on first use.
 *  - Cancel: a queued job leaves the queue; a running one has its worker terminated
 *    (the only way to stop a busy worker) and a fresh one is started for the next job.
 *  - When `Worker` does not exist (vitest, old hosts) or the worker script fails to
 *    load twice, jobs run inline on the calling thread — same op table, same answers.
 */
import { CancelledError } from "../src/permutation";
import { CancelToken } from "./cancel";
import { fromErrorData, isErrorData, notAvailable } from "./errors";
import { SheetResult } from "./job";
import { runOp } from "./ops";
import type { WorkerReply, WorkerRequest } from "./worker";

/** What the pool needs of a worker (the DOM Worker has it; tests pass fakes). */
export interface WorkerLike {
  postMessage(message: WorkerRequest): void;
  terminate(): void;
  onmessage: ((ev: { data: WorkerReply }) => void) | null;
  onerror: ((ev: unknown) => void) | null;
}

export type WorkerFactory = () => WorkerLike;

export interface PoolOptions {
  /** Number of workers, 1 or 2 (default: 2 when the machine has 3+ cores, else 1). */
  size?: number;
  /** Creates a worker; null runs everything inline. Default: `new Worker(url)` when Worker exists. */
  factory?: WorkerFactory | null;
  /** Script URL of the worker bundle, relative to the page (default "worker.js"). */
  url?: string;
}

export const cancelledError = () => notAvailable("the calculation was cancelled.");

/** Runs an op on this thread, honouring the token at the engine's progress checks. */
export function runInline(op: string, args: unknown, token?: CancelToken): SheetResult {
  if (token?.canceled) return cancelledError();
  try {
    return runOp(op, args, token ? () => token.canceled : undefined);
  } catch (e) {
    if (e instanceof CancelledError) return cancelledError();
    return notAvailable(`the calculation stopped: ${e instanceof Error ? e.message : String(e)}`);
  }
}

interface Task {
  id: number;
  op: string;
  args: unknown;
  token?: CancelToken;
  resolve: (r: SheetResult) => void;
  unlisten: () => void;
}

interface Slot {
  worker: WorkerLike | null;
  task: Task | null;
}

function defaultSize(): number {
  const cores = typeof navigator !== "undefined" && navigator.hardwareConcurrency ? navigator.hardwareConcurrency : 2;
  return cores >= 3 ? 2 : 1;
}

export class WorkerPool {
  private readonly factory: WorkerFactory | null;
  private readonly slots: Slot[];
  private readonly queue: Task[] = [];
  private nextId = 1;
  private failures = 0;
  /** Workers started so far (respawns included), for tests and diagnostics. */
  started = 0;

  constructor(options: PoolOptions = {}) {
    const url = options.url ?? "worker.js";
    this.factory =
      options.factory !== undefined
        ? options.factory
        : typeof Worker !== "undefined"
          ? () => new Worker(url) as unknown as WorkerLike
          : null;
    const size = Math.max(1, Math.min(2, options.size ?? defaultSize()));
    this.slots = Array.from({ length: size }, () => ({ worker: null, task: null }));
  }

  /** True when jobs go to workers (false: inline). */
  get usesWorkers(): boolean {
    return this.factory !== null && this.failures < 2;
  }

  /** Runs an op in a worker (or inline, see the file comment). Never rejects. */
  run(op: string, args: unknown, token?: CancelToken): Promise<SheetResult> {
    if (!this.usesWorkers) return Promise.resolve().then(() => runInline(op, args, token));
    if (token?.canceled) return Promise.resolve(cancelledError());
    return new Promise<SheetResult>((resolve) => {
      const task: Task = { id: this.nextId++, op, args, token, resolve, unlisten: () => undefined };
      if (token) task.unlisten = token.onCancel(() => this.cancel(task));
      this.queue.push(task);
      this.pump();
    });
  }

  /** Stops every worker; queued and running jobs end as cancelled. */
  terminate(): void {
    for (const t of this.queue.splice(0)) this.finish(t, cancelledError());
    for (const s of this.slots) {
      if (s.task) this.finish(s.task, cancelledError());
      s.task = null;
      s.worker?.terminate();
      s.worker = null;
    }
  }

  private finish(task: Task, r: SheetResult): void {
    task.unlisten();
    task.resolve(r);
  }

  private pump(): void {
    for (const slot of this.slots) {
      if (this.queue.length === 0) return;
      if (slot.task) continue;
      if (!this.usesWorkers) {
        // The worker script is broken: run what is left inline.
        for (const t of this.queue.splice(0)) this.finish(t, runInline(t.op, t.args, t.token));
        return;
      }
      const task = this.queue.shift()!;
      slot.task = task;
      try {
        const w = slot.worker ?? this.spawn(slot);
        w.postMessage({ id: task.id, op: task.op, args: task.args });
      } catch {
        // The worker could not start (e.g. blocked by the host) or the arguments cannot
        // be cloned: run this job inline.
        if (!slot.worker) this.failures++;
        slot.task = null;
        this.finish(task, runInline(task.op, task.args, task.token));
      }
    }
  }

  private spawn(slot: Slot): WorkerLike {
    const w = this.factory!();
    this.started++;
    slot.worker = w;
    w.onmessage = (ev) => {
      const reply = ev.data;
      const task = slot.task;
      if (!task || task.id !== reply.id) return;
      slot.task = null;
      this.failures = 0;
      this.finish(task, reply.ok ? reply.result : isErrorData(reply.error) ? fromErrorData(reply.error) : notAvailable("the worker gave no answer."));
      this.pump();
    };
    w.onerror = () => {
      // The script failed to load or the worker crashed: drop it, run its job inline.
      this.failures++;
      const task = slot.task;
      slot.task = null;
      slot.worker = null;
      try {
        w.terminate();
      } catch {
        // already gone
      }
      if (task) this.finish(task, runInline(task.op, task.args, task.token));
      this.pump();
    };
    return w;
  }

  private cancel(task: Task): void {
    const q = this.queue.indexOf(task);
    if (q >= 0) {
      this.queue.splice(q, 1);
      this.finish(task, cancelledError());
      return;
    }
    const slot = this.slots.find((s) => s.task === task);
    if (!slot) return;
    slot.task = null;
    slot.worker?.terminate();
    slot.worker = null; // a fresh worker starts with the next job
    this.finish(task, cancelledError());
    this.pump();
  }
}

let shared: WorkerPool | null = null;

/** The pool used by the sheet functions (created on first use). */
export function workerPool(): WorkerPool {
  if (!shared) shared = new WorkerPool();
  return shared;
}

/** Replaces the shared pool (the page can set the worker URL; tests pass fakes). */
export function configureWorkerPool(options: PoolOptions): WorkerPool {
  shared?.terminate();
  shared = new WorkerPool(options);
  return shared;
}
