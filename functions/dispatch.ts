/**
 * Runs a job: from the LRU cache when the same call was answered before; shared with an
 * identical call already running; otherwise inline (light work) or in a Web Worker
 * (n × resamples above HEAVY_COST). A caller's cancel returns at once; the shared work
 * stops when every caller waiting on it has cancelled.
 */
import { LruCache, cacheKey } from "./cache";
import { CancelToken } from "./cancel";
import { isSheetError } from "./errors";
import { HEAVY_COST, Job, SheetResult } from "./job";
import { cancelledError, runInline, workerPool } from "./worker-client";

const cache = new LruCache<SheetResult>(128);

interface Running {
  promise: Promise<SheetResult>;
  refs: number;
  token: CancelToken;
}
const running = new Map<string, Running>();

/** Counters for tests and diagnostics. */
export const dispatchStats = { computed: 0, cacheHits: 0, shared: 0, offThread: 0 };

/** Forgets every cached answer (tests; the panel may offer it). */
export function clearResultCache(): void {
  cache.clear();
}

function start(job: Job, key: string): Running {
  const token = new CancelToken();
  dispatchStats.computed++;
  const heavy = job.cost > HEAVY_COST;
  if (heavy) dispatchStats.offThread++;
  const work = heavy ? workerPool().run(job.op, job.args, token) : Promise.resolve().then(() => runInline(job.op, job.args, token));
  const entry: Running = { promise: work, refs: 0, token };
  entry.promise = work.then((r) => {
    if (running.get(key) === entry) running.delete(key);
    if (!token.canceled && !isSheetError(r)) cache.set(key, r);
    return r;
  });
  running.set(key, entry);
  return entry;
}

export function runJob(job: Job, token?: CancelToken): Promise<SheetResult> {
  if (token?.canceled) return Promise.resolve(cancelledError());
  const key = cacheKey(job.op, job.args);
  const hit = cache.get(key);
  if (hit !== undefined) {
    dispatchStats.cacheHits++;
    return Promise.resolve(hit);
  }
  let entry = running.get(key);
  if (entry) dispatchStats.shared++;
  else entry = start(job, key);
  const e = entry;
  e.refs++;
  if (!token) return e.promise;
  return new Promise<SheetResult>((resolve) => {
    let settled = false;
    const unlisten = token.onCancel(() => {
      if (settled) return;
      settled = true;
      e.refs--;
      if (e.refs === 0) {
        e.token.cancel();
        if (running.get(key) === e) running.delete(key);
      }
      resolve(cancelledError());
    });
    e.promise.then((r) => {
      if (settled) return;
      settled = true;
      e.refs--;
      unlisten();
      resolve(r);
    });
  });
}
