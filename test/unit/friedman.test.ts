import { describe, expect, it } from "vitest";
import { cellMeans, friedman, permutationFriedman } from "../../src/friedman";
import { getCase } from "../reference";
import { bruteMidranks, expectReference, permutationOf } from "./check";

/** Long format of a blocks × treatments table (rows = blocks). */
function longFormat(rows: number[][]): { v: number[]; t: number[]; b: number[] } {
  const v: number[] = [];
  const t: number[] = [];
  const b: number[] = [];
  rows.forEach((row, bi) =>
    row.forEach((x, ti) => {
      v.push(x);
      t.push(ti);
      b.push(bi);
    }),
  );
  return { v, t, b };
}

/**
 * Brute-force χ²_F from its variance form: with ranks r_bj within block b,
 * χ²_F = (kT − 1) · Σ_j (R_j − kB(kT+1)/2)² / Σ_b Σ_j (r_bj − (kT+1)/2)², the ANOVA-on-ranks form
 * that handles ties without a separate correction (Conover 1999, §5.8; formula from memory).
 */
function bruteFriedman(rows: number[][]): number {
  const kB = rows.length;
  const kT = rows[0].length;
  const ranks = rows.map((r) => bruteMidranks(r));
  const centre = (kT + 1) / 2;
  let num = 0;
  for (let j = 0; j < kT; j++) {
    let rj = 0;
    for (let b = 0; b < kB; b++) rj += ranks[b][j];
    num += (rj - kB * centre) ** 2;
  }
  let den = 0;
  for (let b = 0; b < kB; b++) for (let j = 0; j < kT; j++) den += (ranks[b][j] - centre) ** 2;
  return ((kT - 1) * num) / den;
}

// Rounding first base: Hollander & Wolfe (1973), p. 140ff (22 players × 3 methods) — shared reference values (cases.json, case 5).
const hw = getCase("hollander_wolfe_rank_tests");
const rounding: number[][] = hw.data.friedman_RoundingTimes_22x3.rows;

// npk: Yates (1935), 6 blocks × 4 plots, N on 2 plots per block — shared reference values (cases.json, case 6).
const npk = getCase("npk_rcbd_within_block_permutation");

describe("Friedman test (Friedman 1937)", () => {
  it("rounding first base (Hollander & Wolfe 1973): tie-corrected χ² = 11.143, df 2, p = 0.0038", () => {
    const { v, t, b } = longFormat(rounding);
    const r = friedman(v, t, 3, b, 22);
    expectReference(r.chi2, hw, "friedman_chi2");
    expectReference(r.df, hw, "friedman_df");
    expectReference(r.p, hw, "friedman_p");
  });

  it("npk (Yates 1935) on the 6 × 2 table of block × N cell means: χ² = 6, p = 0.0143", () => {
    // Method text of the shared case: Friedman on the block × N table of cell means (two plots per cell).
    const rows: any[][] = npk.data.rows;
    const cm = cellMeans(
      rows.map((r) => r[4] as number),
      rows.map((r) => Number(r[1])),
      2,
      rows.map((r) => Number(r[0]) - 1),
      6,
    );
    expect(cm.values.length).toBe(12);
    // block 1: N=0 plots 49.5, 46.8 → 48.15; N=1 plots 62.8, 57.0 → 59.9
    expect(cm.values[0]).toBeCloseTo(48.15, 12);
    expect(cm.values[1]).toBeCloseTo(59.9, 12);
    const r = friedman(cm.values, cm.treatCodes, 2, cm.blockCodes, 6);
    expectReference(r.chi2, npk, "friedman_cellmeans_chi2");
    expectReference(r.p, npk, "friedman_cellmeans_p");
    expect(r.df).toBe(1);
  });

  it("agrees with the ANOVA-on-ranks form (Conover 1999) on tied tables", () => {
    const tables = [
      rounding,
      [[1, 1, 2, 3], [2, 2, 2, 1], [5, 4, 4, 4], [0, 1, 0, 1], [3, 3, 1, 2]],
      [[1, 2], [2, 1], [3, 3], [1, 4]],
    ];
    for (const rows of tables) {
      const { v, t, b } = longFormat(rows);
      const got = friedman(v, t, rows[0].length, b, rows.length).chi2;
      expect(Math.abs(got - bruteFriedman(rows))).toBeLessThan(1e-12 * Math.max(1, got));
    }
  });

  it("gives a plain RangeError for a missing or repeated cell, or no spread in any block", () => {
    expect(() => friedman([1, 2, 3], [0, 1, 0], 2, [0, 0, 1], 2)).toThrow(/block 2 has no value for treatment 2/);
    expect(() => friedman([1, 2, 3, 4, 5], [0, 1, 0, 1, 1], 2, [0, 0, 1, 1, 1], 2)).toThrow(/block 2 has 2 values for treatment 2/);
    expect(() => friedman([1, 1, 2, 2], [0, 1, 0, 1], 2, [0, 0, 1, 1], 2)).toThrow(RangeError);
    expect(() => permutationFriedman([1, 2, 3], [0, 1, 0], 2, [0, 0, 1], 2)).toThrow(RangeError);
  });

  it("is invariant to row order and to the names of treatments and blocks", () => {
    const { v, t, b } = longFormat(rounding);
    const base = friedman(v, t, 3, b, 22).chi2;
    const p = permutationOf(v.length, 12);
    const shuffled = friedman(p.map((i) => v[i]), p.map((i) => t[i]), 3, p.map((i) => b[i]), 22).chi2;
    expect(Math.abs(shuffled - base)).toBeLessThan(1e-12 * base);
    const renamed = friedman(v, t.map((x) => (x + 1) % 3), 3, b.map((x) => 21 - x), 22).chi2;
    expect(Math.abs(renamed - base)).toBeLessThan(1e-12 * base);
  });
});

describe("permutation Friedman test (shuffles inside blocks)", () => {
  const small = [
    [3.1, 2.0, 2.0],
    [4.4, 4.1, 3.0],
    [5.0, 5.2, 1.0],
    [2.2, 2.2, 2.2],
    [7.5, 6.0, 6.5],
  ];

  it("exact p equals enumeration of all (3!)^5 = 7776 within-block arrangements (ties included)", () => {
    const { v, t, b } = longFormat(small);
    const r = permutationFriedman(v, t, 3, b, 5, { resamples: 10000, keepNull: true });
    expect(r.exact).toBe(true);
    expect(r.resamples).toBe(7776);
    const obs = bruteFriedman(small);
    expect(Math.abs(r.chi2 - obs)).toBeLessThan(1e-12 * obs);
    const perms = [[0, 1, 2], [0, 2, 1], [1, 0, 2], [1, 2, 0], [2, 0, 1], [2, 1, 0]];
    let count = 0;
    let total = 0;
    const rec = (blk: number, rows: number[][]): void => {
      if (blk === small.length) {
        total++;
        if (bruteFriedman(rows) >= obs * (1 - 1e-9)) count++;
        return;
      }
      for (const pm of perms) rec(blk + 1, [...rows, pm.map((j) => small[blk][j])]);
    };
    rec(0, []);
    expect(total).toBe(7776);
    expect(r.p).toBe(count / total);
    const kept = Array.from(r.nullDistribution!);
    expect(kept.filter((x) => x >= r.chi2 * (1 - 1e-12)).length).toBe(r.count);
  });

  it("npk cell means: exact over 2^6 arrangements is 2/64 two-sided in effect (all six blocks favour N)", () => {
    const rows: any[][] = npk.data.rows;
    const cm = cellMeans(rows.map((r) => r[4] as number), rows.map((r) => Number(r[1])), 2, rows.map((r) => Number(r[0]) - 1), 6);
    const r = permutationFriedman(cm.values, cm.treatCodes, 2, cm.blockCodes, 6, { resamples: 1000 });
    expect(r.exact).toBe(true);
    expect(r.resamples).toBe(64);
    // χ² is largest when every block ranks the same way: the observed and its mirror image.
    expect(r.p).toBe(2 / 64);
  });

  it("Monte Carlo agrees with the exact p, is reproducible by seed, and is invariant to row order", () => {
    const { v, t, b } = longFormat(small);
    const ex = permutationFriedman(v, t, 3, b, 5, { resamples: 10000 });
    const mc = permutationFriedman(v, t, 3, b, 5, { resamples: 5000, seed: 8 });
    const again = permutationFriedman(v, t, 3, b, 5, { resamples: 5000, seed: 8 });
    expect(mc.exact).toBe(false);
    expect(again.p).toBe(mc.p);
    const se = Math.sqrt((ex.p * (1 - ex.p)) / 5000);
    expect(Math.abs(mc.p - ex.p)).toBeLessThan(4 * se + 1 / 5000);
    const p = permutationOf(v.length, 21);
    const reordered = permutationFriedman(p.map((i) => v[i]), p.map((i) => t[i]), 3, p.map((i) => b[i]), 5, { resamples: 10000 });
    expect(reordered.p).toBe(ex.p);
    expect(ex.p).toBeGreaterThan(0);
    expect(ex.p).toBeLessThanOrEqual(1);
  });

  it("rounding first base: a Monte Carlo run reports the reference χ² and a small p in (0, 1]", () => {
    const { v, t, b } = longFormat(rounding);
    const r = permutationFriedman(v, t, 3, b, 22, { resamples: 9999, seed: 1 });
    expect(r.exact).toBe(false);
    expectReference(r.chi2, hw, "friedman_chi2");
    expect(r.p).toBeGreaterThan(0);
    expect(r.p).toBeLessThan(0.01);
  });
});
