/**
 * Progress over the stages of an analysis: each stage gets a share of the bar in
 * proportion to its estimated work, and the engine's per-test callbacks are mapped
 * into that share. A stop request (the callback returning true) raises
 * CancelledError inside the engine at its next check.
 */
import { CancelledError } from "../permutation";
import type { ProgressFn } from "./types";

export class Stages {
  private readonly weights: number[];
  private readonly total: number;
  private index = 0;
  private readonly report?: ProgressFn;

  /** `weights`: estimated work of each stage in running order. */
  constructor(weights: number[], report?: ProgressFn) {
    this.weights = weights.map((w) => Math.max(w, 0));
    this.total = this.weights.reduce((a, b) => a + b, 0) || 1;
    this.report = report;
  }

  private base(i: number): number {
    let s = 0;
    for (let j = 0; j < i; j++) s += this.weights[j];
    return s;
  }

  /** Starts the next stage; returns the engine callback for it. */
  next(): ProgressFn | undefined {
    const i = this.index++;
    const report = this.report;
    if (!report) return undefined;
    const start = this.base(i) / this.total;
    const share = (this.weights[i] ?? 0) / this.total;
    if (report(start) === true) throw new CancelledError();
    return (f: number) => report(start + share * Math.min(1, Math.max(0, f)));
  }

  /** Marks the whole analysis done. */
  done(): void {
    this.report?.(1);
  }
}
