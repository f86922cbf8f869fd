/**
 * Test helpers for the rank, classical and summary tests: comparison with a shared
 * reference value at the tolerance its entry states, and brute-force enumerations
 * used as independent cross-checks.
 */
import { expect } from "vitest";
import type { Direction } from "../../src/permutation";
import { Case, expected } from "../reference";

/**
 * Asserts that `actual` matches the entry `name` of case `c` within the entry's own
 * tolerance: `abs` (exact kinds) or `rel` (deterministic, asymptotic).
 */
export function expectReference(actual: number, c: Case, name: string): void {
  const e = expected(c, name);
  const want = e.value as number;
  const tol = e.tolerance ?? {};
  if (typeof tol.rel === "number") {
    expect(Math.abs(actual - want), `${name}: ${actual} vs ${want}`).toBeLessThanOrEqual(tol.rel * Math.abs(want));
  } else if (typeof tol.abs === "number") {
    expect(Math.abs(actual - want), `${name}: ${actual} vs ${want}`).toBeLessThanOrEqual(tol.abs);
  } else {
    throw new Error(`entry ${name} has no usable tolerance`);
  }
}

/** Calls visit with every subset of {0, …, n−1} of size m, as a 0/1 membership array. */
export function forEachSubset(n: number, m: number, visit: (inSubset: Uint8Array) => void): void {
  const member = new Uint8Array(n);
  const rec = (i: number, left: number): void => {
    if (left === 0) {
      visit(member);
      return;
    }
    if (n - i < left) return;
    member[i] = 1;
    rec(i + 1, left - 1);
    member[i] = 0;
    rec(i + 1, left);
  };
  rec(0, m);
}

/** Calls visit with every assignment of n items to groups of the given sizes (codes 0..k−1). */
export function forEachAssignment(sizes: number[], visit: (codes: Int32Array) => void): void {
  const n = sizes.reduce((a, b) => a + b, 0);
  const codes = new Int32Array(n);
  const left = sizes.slice();
  const rec = (i: number): void => {
    if (i === n) {
      visit(codes);
      return;
    }
    for (let g = 0; g < left.length; g++) {
      if (left[g] === 0) continue;
      left[g]--;
      codes[i] = g;
      rec(i + 1);
      left[g]++;
    }
  };
  rec(0);
}

/** O(n²) mid-ranks from the definition: #{x_j < x_i} + (#{x_j = x_i} + 1)/2. */
export function bruteMidranks(x: ArrayLike<number>): number[] {
  const r: number[] = [];
  for (let i = 0; i < x.length; i++) {
    let below = 0;
    let equal = 0;
    for (let j = 0; j < x.length; j++) {
      if (x[j] < x[i]) below++;
      else if (x[j] === x[i]) equal++;
    }
    r.push(below + (equal + 1) / 2);
  }
  return r;
}

/** A small deterministic generator for test data (LCG; not the engine's generator). */
export function lcg(seed: number): () => number {
  let s = seed >>> 0;
  return () => {
    s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
    return s / 4294967296;
  };
}

/** Shuffled copy of indices 0..n−1 (Fisher–Yates on an LCG stream). */
export function permutationOf(n: number, seed: number): number[] {
  const u = lcg(seed);
  const p = Array.from({ length: n }, (_, i) => i);
  for (let i = n - 1; i > 0; i--) {
    const j = Math.floor(u() * (i + 1));
    [p[i], p[j]] = [p[j], p[i]];
  }
  return p;
}

/**
 * p from a fully enumerated null distribution with the engine's conventions: share of
 * values at least as extreme as `v` (two-sided: |value − mean| ≥ |v − mean|), with a
 * small absolute tolerance for rank sums that are multiples of 0.5.
 */
export function enumerationP(values: number[], v: number, mean: number, direction: Direction): number {
  const eps = 1e-9;
  const hits = values.filter((s) =>
    direction === "greater" ? s >= v - eps : direction === "less" ? s <= v + eps : Math.abs(s - mean) >= Math.abs(v - mean) - eps,
  );
  return hits.length / values.length;
}
