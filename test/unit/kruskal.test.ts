import { describe, expect, it } from "vitest";
import { encodeGroups } from "../../src/groups";
import { kruskalWallis, permutationKW } from "../../src/kruskal";
import { getCase } from "../reference";
import { bruteMidranks, expectReference, forEachAssignment, permutationOf } from "./check";

/** H from the textbook definition with O(n²) ranks: 12/(n(n+1)) Σ n_g (R̄_g − (n+1)/2)² / C. */
function bruteH(x: ArrayLike<number>, codes: ArrayLike<number>, k: number): number {
  const n = x.length;
  const r = bruteMidranks(x);
  const sum = new Array(k).fill(0);
  const size = new Array(k).fill(0);
  for (let i = 0; i < n; i++) {
    sum[codes[i]] += r[i];
    size[codes[i]]++;
  }
  let s = 0;
  for (let g = 0; g < k; g++) if (size[g]) s += size[g] * (sum[g] / size[g] - (n + 1) / 2) ** 2;
  const counts = new Map<number, number>();
  for (let i = 0; i < n; i++) counts.set(x[i], (counts.get(x[i]) ?? 0) + 1);
  let t = 0;
  for (const c of counts.values()) t += c ** 3 - c;
  return ((12 / (n * (n + 1))) * s) / (1 - t / (n ** 3 - n));
}

// PlantGrowth: Dobson (1983), Table 7.1 — shared reference values (cases.json, case 4).
const pg = getCase("plantgrowth_oneway");
const weight: number[] = pg.data.weight;
const pgGroups = encodeGroups(pg.data.group);

// Mucociliary efficiency: Hollander & Wolfe (1973), p. 116 — shared reference values (cases.json, case 5).
const hw = getCase("hollander_wolfe_rank_tests");
const kwData = hw.data.kw;
const kwValues: number[] = [...kwData.normal, ...kwData.obstructive, ...kwData.asbestosis];
const kwCodes: number[] = [
  ...kwData.normal.map(() => 0),
  ...kwData.obstructive.map(() => 1),
  ...kwData.asbestosis.map(() => 2),
];

describe("Kruskal–Wallis H (Kruskal & Wallis 1952)", () => {
  it("PlantGrowth (Dobson 1983): tie-corrected H = 7.9882 and its χ²(2) p", () => {
    const r = kruskalWallis(weight, pgGroups.codes, 3);
    expectReference(r.h, pg, "kruskal_H_tie_corrected");
    expectReference(r.p, pg, "kruskal_p");
    expect(r.df).toBe(2);
  });

  it("mucociliary efficiency (Hollander & Wolfe 1973, p. 116): H = 0.7714, p = 0.68", () => {
    const r = kruskalWallis(kwValues, kwCodes, 3);
    expectReference(r.h, hw, "kw_H");
    expectReference(r.p, hw, "kw_p");
  });

  it("agrees with the O(n²) textbook formula on tied data", () => {
    const x = [1, 2, 2, 3, 5, 5, 5, 8, 1, 0, 2, 9, 9, 4];
    const codes = [0, 1, 2, 3, 0, 1, 2, 3, 0, 1, 2, 3, 3, 0];
    expect(Math.abs(kruskalWallis(x, codes, 4).h / bruteH(x, codes, 4) - 1)).toBeLessThan(1e-12);
    expect(Math.abs(kruskalWallis(weight, pgGroups.codes, 3).h / bruteH(weight, pgGroups.codes, 3) - 1)).toBeLessThan(1e-12);
  });

  it("is invariant to row order and to the names of the groups", () => {
    const base = kruskalWallis(weight, pgGroups.codes, 3);
    const p = permutationOf(weight.length, 5);
    const shuffled = kruskalWallis(p.map((i) => weight[i]), p.map((i) => pgGroups.codes[i]), 3);
    expect(Math.abs(shuffled.h - base.h)).toBeLessThan(1e-12 * base.h);
    const renamed = encodeGroups(pg.data.group.map((g: string) => ({ ctrl: "zz", trt1: "aa", trt2: "mm" })[g]));
    expect(Math.abs(kruskalWallis(weight, renamed.codes, 3).h - base.h)).toBeLessThan(1e-12 * base.h);
  });

  it("refuses data without anything to compare", () => {
    expect(() => kruskalWallis([2, 2, 2, 2], [0, 0, 1, 1], 2)).toThrow(RangeError);
    expect(() => kruskalWallis([1, 2, 3], [0, 0, 0], 1)).toThrow(RangeError);
  });
});

describe("permutation Kruskal–Wallis", () => {
  it("exact p equals a full enumeration of labellings (tied data, 3 groups of 3: 1680 labellings)", () => {
    const x = [3.1, 4.2, 2.2, 4.2, 6.1, 4.4, 7.0, 3.1, 5.5];
    const codes = [0, 0, 0, 1, 1, 1, 2, 2, 2];
    const r = permutationKW(x, codes, 3, { resamples: 5000, keepNull: true });
    expect(r.exact).toBe(true);
    expect(r.resamples).toBe(1680);
    const hObs = bruteH(x, codes, 3);
    expect(Math.abs(r.h - hObs)).toBeLessThan(1e-12 * hObs);
    let count = 0;
    let total = 0;
    forEachAssignment([3, 3, 3], (c) => {
      total++;
      if (bruteH(x, c, 3) >= hObs * (1 - 1e-9)) count++;
    });
    expect(total).toBe(1680);
    expect(r.p).toBe(count / total);
    // the kept null distribution is on the H scale
    const kept = Array.from(r.nullDistribution!);
    expect(kept.filter((h) => h >= r.h * (1 - 1e-12)).length).toBe(r.count);
    expect(Math.max(...kept)).toBeGreaterThanOrEqual(r.h);
  });

  it("mucociliary data (Hollander & Wolfe 1973): exact over 252,252 labellings matches enumeration; Monte Carlo agrees", () => {
    const ex = permutationKW(kwValues, kwCodes, 3, { resamples: 300000 });
    expect(ex.exact).toBe(true);
    expect(ex.resamples).toBe(252252); // 14! / (5! 4! 5!)
    const hObs = bruteH(kwValues, kwCodes, 3);
    let count = 0;
    forEachAssignment([5, 4, 5], (c) => {
      if (bruteH(kwValues, c, 3) >= hObs * (1 - 1e-9)) count++;
    });
    expect(ex.p).toBe(count / 252252);
    const mc = permutationKW(kwValues, kwCodes, 3, { resamples: 20000, seed: 9 });
    expect(mc.exact).toBe(false);
    const se = Math.sqrt((ex.p * (1 - ex.p)) / 20000);
    expect(Math.abs(mc.p - ex.p)).toBeLessThan(4 * se);
    expect(mc.mcInterval![0]).toBeLessThan(mc.p);
    expect(mc.mcInterval![1]).toBeGreaterThan(mc.p);
  });

  it("PlantGrowth: Monte Carlo p is near the χ² p and reproducible by seed; p in (0, 1]", () => {
    const a = permutationKW(weight, pgGroups.codes, 3, { resamples: 20000, seed: 3 });
    const b = permutationKW(weight, pgGroups.codes, 3, { resamples: 20000, seed: 3 });
    expect(a.p).toBe(b.p);
    expectReference(a.h, pg, "kruskal_H_tie_corrected");
    // Sanity band only (not a reference value): at n = 30 the χ² and permutation p differ by a few thousandths.
    expect(Math.abs(a.p - kruskalWallis(weight, pgGroups.codes, 3).p)).toBeLessThan(0.006);
    expect(a.p).toBeGreaterThan(0);
    expect(a.p).toBeLessThanOrEqual(1);
  });

  it("exact p is invariant to row order and group names, and is 1 when all groups look alike", () => {
    const x = [5, 1, 4, 4, 2, 8, 7, 3];
    const codes = [0, 1, 2, 0, 1, 2, 0, 1];
    const base = permutationKW(x, codes, 3, { resamples: 10000 });
    expect(base.exact).toBe(true);
    const p = permutationOf(x.length, 2);
    const reordered = permutationKW(p.map((i) => x[i]), p.map((i) => codes[i]), 3, { resamples: 10000 });
    const renamed = permutationKW(x, codes.map((c) => (c + 2) % 3), 3, { resamples: 10000 });
    expect(reordered.p).toBe(base.p);
    expect(renamed.p).toBe(base.p);
    // identical rank sums in every group → H = 0 → every relabelling is at least as extreme
    const flat = permutationKW([1, 4, 2, 3], [0, 0, 1, 1], 2, { resamples: 100 });
    expect(flat.h).toBe(0);
    expect(flat.p).toBe(1);
  });
});
