import { describe, expect, it } from "vitest";
import { blockedPairwiseComparisons, maxTPairwise, pairwiseComparisons } from "../../src/pairwise";
import { blockPermutationTest } from "../../src/blocks";
import { holm } from "../../src/multiplicity";
import { bootstrapDiffInterval } from "../../src/bootstrap";
import { benjaminiHochberg } from "../../src/multiplicity";
import { lettersFromPairwise } from "../../src/letters";
import { encodeGroups } from "../../src/groups";
import { getCase, value } from "../reference";

// PlantGrowth (Dobson 1983), shared reference values (cases.json cases 4 and 8).
const pg = getCase("plantgrowth_oneway");
const pw = getCase("plantgrowth_pairwise_exact_holm");
const weight: number[] = pg.data.weight;
const g = encodeGroups(pg.data.group);

/** Welch-type |t| for two groups. */
function welch(a: number[], b: number[]): number {
  const m = (x: number[]) => x.reduce((s, v) => s + v, 0) / x.length;
  const v = (x: number[]) => x.reduce((s, t) => s + (t - m(x)) ** 2, 0) / (x.length - 1);
  const se = Math.sqrt(v(a) / a.length + v(b) / b.length);
  const d = Math.abs(m(a) - m(b));
  return se > 0 ? d / se : d > 0 ? Infinity : 0;
}

describe("pairwise comparisons on PlantGrowth (cases.json case 8)", () => {
  const rows = pairwiseComparisons(weight, g.codes, g.names, { adjust: "holm", resamples: 200000 });
  const keys = ["ctrl_trt1", "ctrl_trt2", "trt1_trt2"];

  it("exact counts of |difference| ≥ observed out of C(20,10) = 184,756 and their Holm values", () => {
    expect(rows.map((r) => `${r.a}_${r.b}`)).toEqual(keys);
    rows.forEach((r, i) => {
      expect(r.exact).toBe(true);
      expect(Math.round(r.p * 184756)).toBe(value(pw, `${keys[i]}_count_absdiff_ge`));
      expect(r.p).toBeCloseTo(value(pw, `${keys[i]}_p_exact_two_sided`), 12);
      expect(r.pAdjusted).toBeCloseTo(value(pw, `${keys[i]}_p_holm`), 12);
      expect(r.difference).toBeCloseTo(value(pw, `${keys[i]}_mean_diff`), 10);
      expect(r.lower).toBeLessThan(r.difference);
      expect(r.upper).toBeGreaterThan(r.difference);
    });
  });

  it("each row's interval is the two-group bootstrap interval with the same seed", () => {
    const ctrl = weight.slice(0, 10);
    const trt1 = weight.slice(10, 20);
    const ci = bootstrapDiffInterval(ctrl, trt1, "mean", { resamples: 200000, seed: 1 });
    expect([rows[0].lower, rows[0].upper]).toEqual([ci.lower, ci.upper]);
  });

  it("letters: trt2 a, ctrl ab, trt1 b at alpha 0.05 (Holm)", () => {
    const means = [0, 1, 2].map((k) => weight.slice(10 * k, 10 * k + 10).reduce((a, b) => a + b, 0) / 10);
    expect(lettersFromPairwise(g.names, means, rows, 0.05)).toEqual(["ab", "b", "a"]);
  });

  it("'none' and 'bh' adjust the same raw p", () => {
    const none = pairwiseComparisons(weight, g.codes, g.names, { adjust: "none", resamples: 2000 });
    const bh = pairwiseComparisons(weight, g.codes, g.names, { adjust: "bh", resamples: 2000 });
    none.forEach((r) => expect(r.pAdjusted).toBe(r.p));
    const expectBh = benjaminiHochberg(none.map((r) => r.p));
    bh.forEach((r, i) => expect(r.pAdjusted).toBe(expectBh[i]));
  });

  it("max-T adjusted p lies between the raw p and Bonferroni's, with Monte Carlo error", () => {
    const mt = pairwiseComparisons(weight, g.codes, g.names, { adjust: "maxt", resamples: 20000, seed: 3 });
    mt.forEach((r) => {
      expect(r.pAdjusted).toBeGreaterThanOrEqual(r.p);
      expect(r.pAdjusted).toBeLessThanOrEqual(Math.min(1, 3 * r.p) + 0.01);
    });
    // the smallest raw p (trt1 vs trt2, 0.0086) stays significant at 5 %
    expect(mt[2].pAdjusted).toBeLessThan(0.05);
  });
});

describe("max-T step-down (Westfall & Young 1993) against full enumeration", () => {
  const x = [4.1, 5.3, 3.2, 6.8, 7.1, 5.9, 9.4, 8.8, 10.2];
  const labs = [0, 0, 0, 1, 1, 1, 2, 2, 2];

  /** Every assignment of the 9 values to three labelled groups of 3 (1,680), step-down by definition. */
  function bruteMaxT(): number[] {
    const stat = (lab: number[]) => {
      const grp = [0, 1, 2].map((k) => x.filter((_, i) => lab[i] === k));
      return [welch(grp[0], grp[1]), welch(grp[0], grp[2]), welch(grp[1], grp[2])];
    };
    const obs = stat(labs);
    const tables: number[][] = [];
    const cur = new Array(9).fill(-1);
    const rec = (i: number, c: number[]) => {
      if (i === 9) {
        tables.push(stat(cur));
        return;
      }
      for (let k = 0; k < 3; k++) if (c[k] < 3) { c[k]++; cur[i] = k; rec(i + 1, c); c[k]--; }
    };
    rec(0, [0, 0, 0]);
    expect(tables.length).toBe(1680);
    const order = [0, 1, 2].sort((a, b) => obs[b] - obs[a]);
    const out = [0, 0, 0];
    let running = 0;
    order.forEach((h, j) => {
      const rest = order.slice(j);
      const count = tables.filter((t) => Math.max(...rest.map((l) => t[l])) >= obs[h] * (1 - 1e-12)).length;
      running = Math.max(running, count / tables.length);
      out[h] = running;
    });
    return out;
  }

  it("exact max-T equals the brute-force step-down", () => {
    const exact = maxTPairwise(x, labs, 3, { resamples: 5000 });
    const brute = bruteMaxT();
    brute.forEach((v, i) => expect(exact[i]).toBeCloseTo(v, 14));
  });

  it("Monte Carlo max-T agrees with the exact values within its error", () => {
    const exact = maxTPairwise(x, labs, 3, { resamples: 5000 });
    const mc = maxTPairwise(x, labs, 3, { resamples: 1000, seed: 9 });
    exact.forEach((p, i) => expect(Math.abs(mc[i] - p)).toBeLessThan(4 * Math.sqrt((p * (1 - p)) / 1000) + 2 / 1000));
  });

  it("does not depend on row order or group names", () => {
    const a = maxTPairwise(x, labs, 3, { resamples: 5000 });
    const rev = maxTPairwise(x.slice().reverse(), labs.slice().reverse(), 3, { resamples: 5000 });
    expect(Array.from(rev)).toEqual(Array.from(a));
    // rename groups 0→2, 1→0, 2→1: pairs (0,1),(0,2),(1,2) become (2,0),(2,1),(0,1)
    const ren = maxTPairwise(x, labs.map((l) => [2, 0, 1][l]), 3, { resamples: 5000 });
    expect([ren[1], ren[2], ren[0]].map((v) => +v.toFixed(14))).toEqual(Array.from(a).map((v) => +v.toFixed(14)));
  });
});

describe("pairwise properties and errors", () => {
  const vals = [12.1, 13.4, 11.8, 12.9, 15.2, 16.1, 14.7, 15.9, 12.4, 12.0, 13.1, 12.6];
  const labels = ["B", "B", "B", "B", "A", "A", "A", "A", "C", "C", "C", "C"];

  it("rows do not depend on row order; renaming groups flips the sign of the difference only", () => {
    const e = encodeGroups(labels);
    const a = pairwiseComparisons(vals, e.codes, e.names, { resamples: 5000 });
    const e2 = encodeGroups(labels.slice().reverse());
    const b = pairwiseComparisons(vals.slice().reverse(), e2.codes, e2.names, { resamples: 5000 });
    for (const r of a) {
      const s = b.find((t) => (t.a === r.a && t.b === r.b) || (t.a === r.b && t.b === r.a))!;
      const sign = s.a === r.a ? 1 : -1;
      expect(s.difference).toBeCloseTo(sign * r.difference, 12);
      expect(s.p).toBe(r.p);
      expect(s.pAdjusted).toBe(r.pAdjusted);
      expect(s.exact).toBe(true);
      expect(r.p).toBeGreaterThan(0);
      expect(r.p).toBeLessThanOrEqual(1);
    }
  });

  it("clear errors for tiny groups, a single group, unknown adjustment", () => {
    expect(() => pairwiseComparisons([1, 2, 3, 4, 5], [0, 0, 0, 1, 1], ["x", "y"])).toThrow(/at least 3/);
    expect(() => pairwiseComparisons([1, 2, 3], [0, 0, 0], ["x"])).toThrow(/at least 2 groups/);
    expect(() => pairwiseComparisons(vals, encodeGroups(labels).codes, ["A", "B", "C"], { adjust: "tukey" as any })).toThrow(/unknown adjustment/);
  });
});

describe("pairwise comparisons within blocks (Fisher 1935, ch. V; Holm 1979)", () => {
  // Rounding first base: Hollander & Wolfe (1973), p. 140ff — shared reference values
  // (cases.json, case 5); players 5, 10, 12 and 21 as blocks, 3 methods, one time per cell.
  const hw = getCase("hollander_wolfe_rank_tests");
  const table: number[][] = [4, 9, 11, 20].map((i) => hw.data.friedman_RoundingTimes_22x3.rows[i]);
  const methods = ["Round Out", "Narrow Angle", "Wide Angle"];
  const v: number[] = [], t: number[] = [], b: number[] = [];
  table.forEach((row, bi) => row.forEach((x, ti) => { v.push(x); t.push(ti); b.push(bi); }));

  /** Every within-block relabelling of the pair, by brute force: 2^4 swap patterns. */
  function brute(a: number, c: number): { p: number; diff: number } {
    const mean = (x: number[]) => x.reduce((s, y) => s + y, 0) / x.length;
    const diffOf = (swap: number) => {
      const xa: number[] = [], xc: number[] = [];
      table.forEach((row, bi) => {
        if ((swap >> bi) & 1) { xa.push(row[c]); xc.push(row[a]); } else { xa.push(row[a]); xc.push(row[c]); }
      });
      return mean(xa) - mean(xc);
    };
    const obs = Math.abs(diffOf(0));
    let count = 0;
    for (let s = 0; s < 16; s++) if (Math.abs(diffOf(s)) >= obs * (1 - 1e-9) - 1e-12) count++;
    return { p: count / 16, diff: diffOf(0) };
  }

  it("each pair's p is the full enumeration of the 2^4 within-block swaps; Holm on those p", () => {
    const rows = blockedPairwiseComparisons(v, t, methods, b, 4, { adjust: "holm", resamples: 999 });
    const pairs = [[0, 1], [0, 2], [1, 2]];
    expect(rows.map((r) => `${r.a}|${r.b}`)).toEqual(pairs.map(([a, c]) => `${methods[a]}|${methods[c]}`));
    const want = pairs.map(([a, c]) => brute(a, c));
    rows.forEach((r, i) => {
      expect(r.exact).toBe(true);
      expect(r.p).toBeCloseTo(want[i].p, 14);
      expect(r.difference).toBeCloseTo(want[i].diff, 12);
    });
    const h = holm(want.map((w) => w.p));
    rows.forEach((r, i) => expect(r.pAdjusted).toBeCloseTo(h[i], 14));
    // at least one pair is not tied at p = 1, so the check has teeth
    expect(Math.min(...want.map((w) => w.p))).toBe(2 / 16);
  });

  it("'bh' and 'none' adjust the same raw p; 'maxt' falls back to Holm", () => {
    const none = blockedPairwiseComparisons(v, t, methods, b, 4, { adjust: "none", resamples: 999 });
    const bh = blockedPairwiseComparisons(v, t, methods, b, 4, { adjust: "bh", resamples: 999 });
    const mt = blockedPairwiseComparisons(v, t, methods, b, 4, { adjust: "maxt", resamples: 999 });
    const raw = none.map((r) => r.p);
    none.forEach((r) => expect(r.pAdjusted).toBe(r.p));
    const eb = benjaminiHochberg(raw), eh = holm(raw);
    bh.forEach((r, i) => expect(r.pAdjusted).toBe(eb[i]));
    mt.forEach((r, i) => expect(r.pAdjusted).toBe(eh[i]));
    expect(() => blockedPairwiseComparisons(v, t, methods, b, 4, { adjust: "tukey" as any })).toThrow(/unknown adjustment/);
  });

  it("Monte Carlo agrees with the exact enumeration within its error (first 16 players, 2^16 swaps)", () => {
    const all: number[][] = hw.data.friedman_RoundingTimes_22x3.rows.slice(0, 16);
    const V: number[] = [], T: number[] = [], B: number[] = [];
    all.forEach((row, bi) => row.forEach((x, ti) => { V.push(x); T.push(ti); B.push(bi); }));
    const exact = blockedPairwiseComparisons(V, T, methods, B, 16, { adjust: "none", resamples: 1 << 16 });
    const mc = blockedPairwiseComparisons(V, T, methods, B, 16, { adjust: "none", resamples: 4000, seed: 5 });
    exact.forEach((r, i) => {
      expect(r.exact).toBe(true);
      expect(mc[i].exact).toBe(false);
      expect(Math.abs(mc[i].p - r.p)).toBeLessThan(4 * Math.sqrt((r.p * (1 - r.p)) / 4000) + 2 / 4000);
    });
  });

  it("Darwin's Zea mays as 15 blocks of two plants: the exact sign-flip count 1726 of 32768 (Fisher 1935, §21; cases.json case 1)", () => {
    // Only the within-block difference matters: cross = d, self = 0 in each pot pair.
    const dz = getCase("darwin_zea_mays");
    const d: number[] = dz.data.d_cross_minus_self_eighths_inch;
    const V = d.flatMap((x) => [x, 0]);
    const T = d.flatMap(() => [0, 1]);
    const B = d.flatMap((_, i) => [i, i]);
    const [r] = blockedPairwiseComparisons(V, T, ["cross", "self"], B, d.length, { resamples: 40000 });
    expect(r.exact).toBe(true);
    expect(Math.round(r.p * 32768)).toBe(value(dz, "count_abs_ge_obs"));
    expect(r.p).toBeCloseTo(value(dz, "p_two_sided"), 14);
    expect(r.difference).toBeCloseTo(value(dz, "sum_d") / d.length, 12);
  });

  it("two treatments: equals the permutation F after blocks on npk's N (Yates 1935; cases.json case 6: 290 of 46656)", () => {
    // F after blocks with two treatments, in complete blocks with equal counts, rises with
    // |difference of means|, so both tests count the same relabellings.
    const npk = getCase("npk_rcbd_within_block_permutation");
    const rows: any[] = npk.data.rows;
    const blocks = encodeGroups(rows.map((r) => r[0]));
    const nitrogen = encodeGroups(rows.map((r) => r[1]));
    const y: number[] = rows.map((r) => r[4]);
    const [r] = blockedPairwiseComparisons(y, nitrogen.codes, nitrogen.names, blocks.codes, blocks.names.length, { resamples: 50000 });
    const f = blockPermutationTest(y, nitrogen.codes, 2, blocks.codes, blocks.names.length, { resamples: 50000 });
    expect(r.exact).toBe(true);
    expect(f.exact).toBe(true);
    expect(f.resamples).toBe(value(npk, "exact_within_block_n"));
    expect(Math.round(r.p * value(npk, "exact_within_block_n"))).toBe(value(npk, "exact_within_block_count_ge"));
    expect(r.p).toBeCloseTo(value(npk, "exact_within_block_p"), 14);
    expect(r.p).toBeCloseTo(f.p, 14);
    // and Monte Carlo (both with seed 1) agree within their error
    const rm = blockedPairwiseComparisons(y, nitrogen.codes, nitrogen.names, blocks.codes, blocks.names.length, { resamples: 9999 })[0];
    expect(rm.exact).toBe(false);
    expect(Math.abs(rm.p - f.p)).toBeLessThan(4 * Math.sqrt((f.p * (1 - f.p)) / 9999) + 2 / 9999);
  });

  it("does not depend on row order or block names; p in (0, 1]; the interval is the two-group bootstrap", () => {
    const a = blockedPairwiseComparisons(v, t, methods, b, 4, { resamples: 999 });
    const perm = v.map((_, i) => (i * 7) % v.length); // 7 is prime to 12: a reordering
    const b2 = blockedPairwiseComparisons(perm.map((i) => v[i]), perm.map((i) => t[i]), methods, perm.map((i) => 3 - b[i]), 4, { resamples: 999 });
    a.forEach((r, i) => {
      expect(b2[i].p).toBe(r.p);
      expect(b2[i].pAdjusted).toBe(r.pAdjusted);
      expect(b2[i].difference).toBeCloseTo(r.difference, 12);
      expect(r.p).toBeGreaterThan(0);
      expect(r.p).toBeLessThanOrEqual(1);
    });
    const ci = bootstrapDiffInterval(table.map((row) => row[0]), table.map((row) => row[1]), "mean", { resamples: 999, seed: 1 });
    expect([a[0].lower, a[0].upper]).toEqual([ci.lower, ci.upper]);
  });

  it("ignoring the blocks would give another answer: blocks matter on npk", () => {
    const npk = getCase("npk_rcbd_within_block_permutation");
    const rows: any[] = npk.data.rows;
    const blocks = encodeGroups(rows.map((r) => r[0]));
    const nitrogen = encodeGroups(rows.map((r) => r[1]));
    const y: number[] = rows.map((r) => r[4]);
    const within = blockedPairwiseComparisons(y, nitrogen.codes, nitrogen.names, blocks.codes, blocks.names.length, { resamples: 50000 })[0];
    const ignoring = pairwiseComparisons(y, nitrogen.codes, nitrogen.names, { resamples: 50000 })[0];
    expect(within.difference).toBeCloseTo(ignoring.difference, 12);
    expect(within.p).toBeLessThan(ignoring.p);
  });

  it("clear errors for bad block codes or lengths", () => {
    expect(() => blockedPairwiseComparisons(v, t, methods, b.slice(1), 4)).toThrow(/blocks differ in length/);
    expect(() => blockedPairwiseComparisons(v, t, methods, b.map((x) => x + 1), 4)).toThrow(/block code/);
  });
});
