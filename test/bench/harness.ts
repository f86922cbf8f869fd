/**
 * Benchmark harness: times a case and its straightforward baseline in the same run,
 * reporting medians and their ratio (never absolute thresholds in tests).
 */
export interface BenchCase {
  /** What is timed, e.g. "one-way F, 4 groups × 250, 9,999 resamples". */
  name: string;
  /** The engine path. */
  run: () => unknown;
  /** A straightforward implementation of the same work, for the ratio (optional). */
  baseline?: () => unknown;
  /** Target median in milliseconds on the project's 2-core machine (optional). */
  targetMs?: number;
  /** Repetitions (default 7; the baseline uses min(reps, 3)). */
  reps?: number;
}

export function median(xs: number[]): number {
  const s = xs.slice().sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
}

export function time(fn: () => unknown, reps: number): number {
  fn(); // warm-up
  const t: number[] = [];
  for (let i = 0; i < reps; i++) {
    const t0 = performance.now();
    fn();
    t.push(performance.now() - t0);
  }
  return median(t);
}

export function runCases(cases: BenchCase[]): void {
  const rows: string[][] = [["case", "median ms", "target ms", "baseline ms", "baseline / engine"]];
  for (const c of cases) {
    const reps = c.reps ?? 7;
    const ms = time(c.run, reps);
    const base = c.baseline ? time(c.baseline, Math.min(reps, 3)) : NaN;
    rows.push([
      c.name,
      ms.toFixed(1),
      c.targetMs ? `${c.targetMs}${ms <= c.targetMs ? " ok" : " MISSED"}` : "",
      Number.isFinite(base) ? base.toFixed(1) : "",
      Number.isFinite(base) ? `${(base / ms).toFixed(1)}×` : "",
    ]);
    console.log(`  ${c.name}: ${ms.toFixed(1)} ms`);
  }
  const widths = rows[0].map((_, j) => Math.max(...rows.map((r) => r[j].length)));
  console.log("");
  for (const r of rows) console.log(r.map((cell, j) => (j === 0 ? cell.padEnd(widths[j]) : cell.padStart(widths[j]))).join("  "));
}
