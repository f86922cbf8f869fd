/**
 * Edge cases and cheap properties of the permutation engine across its tests: ties at
 * the observed value, infinite or undefined statistics, the exact / Monte Carlo boundary,
 * direction handling, invariance to location, scale and row order, p in (0, 1].
 *
 * Published values: Darwin's Zea mays differences (Fisher 1935, §21) and the mouse
 * survival times (Efron & Tibshirani 1993, Table 2.1), with the full-enumeration counts
 * of the shared reference values (cases.json); PlantGrowth (Dobson 1983) pairwise exact
 * counts (cases.json case 8). Other data are constructed so that the answer is known by
 * definition (stated beside each check).
 */
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { blockPermutationTest } from "../../src/blocks";
import { correlationTest } from "../../src/correlation";
import { permutationFriedman } from "../../src/friedman";
import { encodeGroups } from "../../src/groups";
import { permutationKW } from "../../src/kruskal";
import { dispersionTest, permanova } from "../../src/multivariate";
import { permutationF } from "../../src/oneway";
import { pairedTest } from "../../src/paired";
import { pairwiseComparisons } from "../../src/pairwise";
import {
  GroupScheme,
  PermutationResult,
  SignScheme,
  atLeastAsExtreme,
  groupSumsTest,
  monteCarloTest,
  permutationTest,
} from "../../src/permutation";
import { rankSumTest } from "../../src/ranksum";
import { signedRankTest } from "../../src/signedrank";
import { permutationSNR } from "../../src/snr";
import { twoSampleTest } from "../../src/twosample";
import { getCase, value } from "../reference";

const darwin = getCase("darwin_zea_mays");
const d: number[] = darwin.data.d_cross_minus_self_eighths_inch;
const mouse = getCase("mouse_two_sample");
const treat: number[] = mouse.data.treatment;
const ctrl: number[] = mouse.data.control;

/** p in (0, 1], a finite statistic or ±Infinity (never NaN), and a null distribution of the right length. */
function wellFormed(r: PermutationResult): void {
  expect(r.p).toBeGreaterThan(0);
  expect(r.p).toBeLessThanOrEqual(1);
  expect(Number.isNaN(r.statistic)).toBe(false);
  expect(r.count).toBeGreaterThanOrEqual(r.exact ? 1 : 0);
  expect(r.count).toBeLessThanOrEqual(r.resamples);
  if (r.exact) expect(r.p).toBe(r.count / r.resamples);
  else expect(r.p).toBe((r.count + 1) / (r.resamples + 1));
  if (r.nullDistribution) {
    expect(r.nullDistribution.length).toBe(r.resamples);
    for (const t of r.nullDistribution) expect(Number.isNaN(t)).toBe(false);
  }
}

describe("tie rule at the observed value", () => {
  it("an infinite observed statistic is matched by the same infinity only (never ∞ − ∞)", () => {
    expect(atLeastAsExtreme(Infinity, Infinity, "greater")).toBe(true);
    expect(atLeastAsExtreme(1e308, Infinity, "greater")).toBe(false);
    expect(atLeastAsExtreme(-Infinity, -Infinity, "less")).toBe(true);
    expect(atLeastAsExtreme(-Infinity, Infinity, "two-sided")).toBe(true);
    expect(atLeastAsExtreme(5, Infinity, "two-sided")).toBe(false);
    // Observed labelling alone infinite: exact p = 1/6 (count includes the observed; C(4,2) = 6).
    const g = new GroupScheme([0, 0, 1, 1]);
    const r = permutationTest(g, () => (g.labels[0] === 0 && g.labels[1] === 0 ? Infinity : 1), { direction: "greater" });
    expect([r.exact, r.resamples, r.count, r.p]).toEqual([true, 6, 1, 1 / 6]);
  });

  it("the scale of the terms absorbs rounding noise near a zero statistic", () => {
    // 0.1 + 0.2 − 0.3 is 5.6e-17, not 0: relative to |observed| alone it would beat a true 0.
    expect(atLeastAsExtreme(0, 0.1 + 0.2 - 0.3, "two-sided")).toBe(false);
    expect(atLeastAsExtreme(0, 0.1 + 0.2 - 0.3, "two-sided", 0.6)).toBe(true);
    expect(atLeastAsExtreme(0.5, 0.6, "greater", 0.6)).toBe(false);
  });

  it("a zero observed difference gives p = 1 (every split is at least as extreme), despite decimals", () => {
    // Constructed: both samples have mean 0.35 exactly in decimals, so |difference| = 0 is the minimum.
    const x = [0.7, 0.1, 0.4, 0.2], y = [0.3, 0.5, 0.6, 0.0];
    expect(twoSampleTest(x, y).p).toBe(1);
    expect(twoSampleTest(x, y, { resamples: 50 }).p).toBe(1);
    // Constructed: paired differences summing to 0 in decimals.
    const dz = [0.1, -0.3, 0.2, 0.4, -0.1, -0.3];
    expect(pairedTest(dz, dz.map(() => 0)).p).toBe(1);
    // Constructed: y against x with zero covariance in decimals.
    const cx = [0.1, 0.2, 0.3, 0.4, 0.5], cy = [0.3, 0.1, 0.5, 0.5, 0.1];
    expect(correlationTest(cx, cy).p).toBe(1);
    // Constructed: groups with equal means 0.35 → SSB = 0 is the smallest possible, p = 1.
    expect(permutationF(x.concat(y), [0, 0, 0, 0, 1, 1, 1, 1], 2).p).toBe(1);
  });
});

describe("undefined statistics and bad options raise a RangeError, never a silent NaN or p = 0", () => {
  it("non-finite values in the one-way F", () => {
    expect(() => permutationF([1, 2, NaN, 4, 5, 6], [0, 0, 0, 1, 1, 1], 2)).toThrow(RangeError);
    expect(() => permutationF([1, 2, Infinity, 4, 5, 6], [0, 0, 0, 1, 1, 1], 2)).toThrow(RangeError);
    expect(() => permutationF([1, 2, 3, 4], [0, 0, 1, 2], 2)).toThrow(RangeError); // code outside 0..k−1
    expect(() => permutationF([1, 2, 3], [0, 0, 0], 1)).toThrow(RangeError); // a single group
    expect(() => permutationKW([1, 2, 3, 4], [0, 0, 1, 5], 2)).toThrow(RangeError);
  });

  it("a NaN observed statistic", () => {
    const g = new GroupScheme([0, 1]);
    expect(() => permutationTest(g, () => NaN)).toThrow(RangeError);
    expect(() => groupSumsTest([1, 2, 3], [0, 1, 1], 2, () => NaN)).toThrow(RangeError);
    expect(() => monteCarloTest(() => 0, NaN, "greater")).toThrow(RangeError);
  });

  it("resamples that are not a whole number of at least 1", () => {
    for (const resamples of [NaN, 10.5, 0, -3, Infinity]) {
      expect(() => twoSampleTest(treat, ctrl, { resamples })).toThrow(RangeError);
      expect(() => pairedTest(d, d.map(() => 0), { resamples })).toThrow(RangeError);
      expect(() => permutationF([1, 2, 3, 4, 5, 6], [0, 0, 0, 1, 1, 1], 2, { resamples })).toThrow(RangeError);
      expect(() => permutationSNR([1, 2, 3, 4, 5, 6], [0, 0, 0, 1, 1, 1], 2, { resamples })).toThrow(RangeError);
      expect(() => correlationTest([1, 2, 3], [2, 1, 3], { resamples })).toThrow(RangeError);
    }
  });

  it("all values equal: F is 0 and p = 1 (0.1 repeated, whose rounded mean misses 0.1 by an ulp)", () => {
    const r = permutationF([0.1, 0.1, 0.1, 0.1, 0.1, 0.1], [0, 0, 0, 1, 1, 1], 2, { keepNull: true });
    expect([r.f, r.statistic, r.p, r.exact, r.resamples]).toEqual([0, 0, 1, true, 20]);
    expect(Array.from(r.nullDistribution!).every((t) => t === 0)).toBe(true);
    const mc = permutationF(new Array(40).fill(7.3), Array.from({ length: 40 }, (_, i) => i % 2), 2, { resamples: 99 });
    expect([mc.f, mc.p, mc.exact]).toEqual([0, 1, false]);
  });
});

describe("exact enumeration and Monte Carlo (Darwin, Fisher 1935; mouse data, Efron & Tibshirani 1993)", () => {
  const zeros = d.map(() => 0);
  const total = 2 ** 15;

  it("exact when the relabellings equal the resamples, Monte Carlo one below (count == resamples boundary)", () => {
    const ex = pairedTest(d, zeros, { resamples: total });
    expect([ex.exact, ex.resamples, ex.count]).toEqual([true, total, value(darwin, "count_abs_ge_obs")]);
    const mc = pairedTest(d, zeros, { resamples: total - 1 });
    expect([mc.exact, mc.resamples]).toEqual([false, total - 1]);
    const splits = value(mouse, "perm_n_splits");
    const te = twoSampleTest(treat, ctrl, { resamples: splits });
    expect([te.exact, te.resamples, te.count]).toEqual([true, splits, value(mouse, "perm_count_absdiff_ge_obs")]);
    expect(twoSampleTest(treat, ctrl, { resamples: splits - 1 }).exact).toBe(false);
  });

  it("'less' and 'greater' count the same way in the exact and the Monte Carlo path", () => {
    // Darwin: #{S ≤ S_obs} = 2^15 − #{S > S_obs}; #{S ≥ S_obs} given (cases.json).
    const less = pairedTest(d, zeros, { direction: "less", resamples: total });
    expect(less.count).toBe(total - value(darwin, "count_gt_obs"));
    const greater = pairedTest(d, zeros, { direction: "greater", resamples: total });
    expect(greater.count).toBe(value(darwin, "count_ge_obs"));
    // Mouse: counts of splits with difference ≥ and ≤ the observed (cases.json).
    expect(twoSampleTest(treat, ctrl, { direction: "greater", resamples: 20000 }).count).toBe(value(mouse, "perm_count_diff_ge_obs"));
    expect(twoSampleTest(treat, ctrl, { direction: "less", resamples: 20000 }).count).toBe(value(mouse, "perm_count_diff_le_obs"));
    const m = 20000;
    const cases: Array<[PermutationResult, PermutationResult]> = [
      [less, pairedTest(d, zeros, { direction: "less", resamples: m, seed: 5 })],
      [greater, pairedTest(d, zeros, { direction: "greater", resamples: m, seed: 5 })],
      [twoSampleTest(treat, ctrl, { direction: "less", resamples: 20000 }), twoSampleTest(treat, ctrl, { direction: "less", resamples: 9999, seed: 5 })],
      [twoSampleTest(treat, ctrl, { direction: "greater", resamples: 20000 }), twoSampleTest(treat, ctrl, { direction: "greater", resamples: 9999, seed: 5 })],
    ];
    for (const [ex, mc] of cases) {
      expect(ex.exact).toBe(true);
      expect(mc.exact).toBe(false);
      const se = Math.sqrt((ex.p * (1 - ex.p)) / mc.resamples);
      expect(Math.abs(mc.p - ex.p)).toBeLessThan(4.5 * se + 1 / mc.resamples);
    }
  });

  it("keepNull holds one value per evaluated relabelling, on the statistic's scale", () => {
    const ex = pairedTest(d, zeros, { keepNull: true, resamples: total });
    expect(ex.nullDistribution!.length).toBe(total);
    expect(Math.max(...ex.nullDistribution!)).toBeCloseTo(d.reduce((s, v) => s + Math.abs(v), 0) / d.length, 12);
    const mc = twoSampleTest(treat, ctrl, { keepNull: true, resamples: 999 });
    expect(mc.nullDistribution!.length).toBe(999);
  });
});

describe("invariance to location, scale and row order", () => {
  it("exact counts of the mouse data survive ×0.1 and a shift of 1000 (Efron & Tibshirani 1993, Table 2.1)", () => {
    const f = (v: number) => 1000 + 0.1 * v;
    const tx = treat.map(f), cx = ctrl.map(f);
    const resamples = value(mouse, "perm_n_splits");
    expect(twoSampleTest(tx, cx, { resamples }).count).toBe(value(mouse, "perm_count_absdiff_ge_obs"));
    expect(twoSampleTest(tx, cx, { resamples, direction: "greater" }).count).toBe(value(mouse, "perm_count_diff_ge_obs"));
    expect(twoSampleTest(tx, cx, { resamples, direction: "less" }).count).toBe(value(mouse, "perm_count_diff_le_obs"));
    for (const statistic of ["median", "t"] as const) {
      const shifted = twoSampleTest(tx, cx, { statistic, resamples });
      expect(shifted.exact).toBe(true);
      expect(shifted.count).toBe(twoSampleTest(treat, ctrl, { statistic, resamples }).count);
    }
  });

  it("Darwin's count survives a common offset of 1000 and a scale of 1/8 inch (Fisher 1935)", () => {
    const x = d.map((v) => 1000 + v / 8);
    const y = d.map(() => 1000);
    expect(pairedTest(x, y, { resamples: 2 ** 15 }).count).toBe(value(darwin, "count_abs_ge_obs"));
    expect(pairedTest(x, y, { resamples: 2 ** 15, direction: "greater" }).count).toBe(value(darwin, "count_ge_obs"));
    // Decimal scale (not exact in binary): 0.1 inch units.
    const xd = d.map((v) => 1000 + v * 0.1);
    expect(pairedTest(xd, y, { resamples: 2 ** 15 }).count).toBe(value(darwin, "count_abs_ge_obs"));
  });

  it("pairwise exact counts of PlantGrowth survive a shift of 1000 (Dobson 1983; cases.json case 8)", () => {
    const pg = getCase("plantgrowth_oneway");
    const pw = getCase("plantgrowth_pairwise_exact_holm");
    const g = encodeGroups(pg.data.group);
    const w: number[] = pg.data.weight.map((v: number) => v + 1000);
    const rows = pairwiseComparisons(w, g.codes, g.names, { adjust: "none", resamples: 200000 });
    const keys = ["ctrl_trt1", "ctrl_trt2", "trt1_trt2"];
    rows.forEach((r, i) => {
      expect(r.exact).toBe(true);
      expect(Math.round(r.p * 184756)).toBe(value(pw, `${keys[i]}_count_absdiff_ge`));
    });
  });

  it("a pairwise row's Monte Carlo p is the two-sample test's with the same seed", () => {
    const pg = getCase("plantgrowth_oneway");
    const g = encodeGroups(pg.data.group);
    const w: number[] = pg.data.weight;
    const rows = pairwiseComparisons(w, g.codes, g.names, { adjust: "none", resamples: 999, seed: 11 });
    const two = twoSampleTest(w.slice(0, 10), w.slice(20, 30), { resamples: 999, seed: 11 });
    expect(rows[1].exact).toBe(false);
    expect(rows[1].p).toBe(two.p);
  });

  it("Monte Carlo p of H, D and the rank tests does not depend on row order (same seed); F within error", () => {
    // PlantGrowth (Dobson 1983): 30 values, 3 groups — beyond exact enumeration at 999 resamples.
    const pg = getCase("plantgrowth_oneway");
    const g = encodeGroups(pg.data.group);
    const w: number[] = pg.data.weight;
    const perm = Array.from({ length: w.length }, (_, i) => (i * 7) % w.length); // 7 is prime to 30
    const w2 = perm.map((i) => w[i]);
    const c2 = perm.map((i) => g.codes[i]);
    const o = { resamples: 999, seed: 4 };
    // F keeps the given row order in its Monte Carlo layout: the same law, so within error.
    const f1 = permutationF(w, g.codes, 3, o), f2 = permutationF(w2, c2, 3, o);
    expect(Math.abs(f1.p - f2.p)).toBeLessThan(4.5 * Math.sqrt((f1.p * (1 - f1.p)) / 999) + 0.002);
    expect(permutationKW(w2, c2, 3, o).p).toBe(permutationKW(w, g.codes, 3, o).p);
    expect(permutationSNR(w2, c2, 3, o).p).toBe(permutationSNR(w, g.codes, 3, o).p);
    const a = w.slice(0, 10), b = w.slice(10, 20);
    const rs1 = rankSumTest(a, b, { resamples: 999, seed: 4 }).pPermutation!;
    const rs2 = rankSumTest(a.slice().reverse(), b.slice().reverse(), { resamples: 999, seed: 4 }).pPermutation!;
    expect(rs1.exact).toBe(false); // ties in PlantGrowth send the rank sum to resampling
    expect(rs2.p).toBe(rs1.p);
    // Hollander & Wolfe (1973) signed-rank data, with a tie added so that resampling is used.
    const hw = getCase("hollander_wolfe_rank_tests").data.signedrank;
    const diffs: number[] = hw.x_first.map((v: number, i: number) => v - hw.y_second[i]).concat([0.5, -0.5, 0.25]);
    const sr1 = signedRankTest(diffs, { resamples: 99, seed: 2 }).pPermutation!;
    const sr2 = signedRankTest(diffs.slice().reverse(), { resamples: 99, seed: 2 }).pPermutation!;
    expect(sr1.exact).toBe(false);
    expect(sr2.p).toBe(sr1.p);
  });
});

describe("p in (0, 1], never NaN, for every test, down to one or two values per group (fast-check)", () => {
  const value = fc.oneof(
    fc.integer({ min: -5, max: 5 }),
    fc.double({ min: -1e3, max: 1e3, noNaN: true }),
    fc.constantFrom(1e9 + 0.5, 1e9 + 0.25, -1e-9, 1e-9, 0),
  );
  const options = fc.record({
    resamples: fc.constantFrom(1, 2, 19, 99),
    seed: fc.integer({ min: 1, max: 50 }),
    direction: fc.constantFrom("two-sided" as const, "greater" as const, "less" as const),
    keepNull: fc.boolean(),
  });
  /** Runs a test; a RangeError (documented degenerate input) is fine, anything else must be well formed. */
  const check = (run: () => PermutationResult | null) => {
    let r: PermutationResult | null;
    try {
      r = run();
    } catch (e) {
      expect(e).toBeInstanceOf(RangeError);
      return;
    }
    if (r) wellFormed(r);
  };

  it("two-sample, paired, correlation", () => {
    fc.assert(
      fc.property(fc.array(value, { minLength: 1, maxLength: 6 }), fc.array(value, { minLength: 1, maxLength: 6 }), options, (x, y, o) => {
        for (const statistic of ["mean", "median", "t"] as const) check(() => twoSampleTest(x, y, { ...o, statistic }));
        const m = Math.min(x.length, y.length);
        check(() => pairedTest(x.slice(0, m), y.slice(0, m), o));
        check(() => correlationTest(x.slice(0, m), y.slice(0, m), o));
        check(() => correlationTest(x.slice(0, m), y.slice(0, m), { ...o, method: "spearman" }));
        check(() => rankSumTest(x, y, o).pPermutation);
        check(() => signedRankTest(x, o).pPermutation);
      }),
      { numRuns: 150 },
    );
  });

  it("k groups: F, D, H, PERMANOVA, dispersion, blocks, Friedman", () => {
    fc.assert(
      fc.property(fc.array(fc.tuple(value, fc.integer({ min: 0, max: 2 })), { minLength: 2, maxLength: 9 }), options, (rows, o) => {
        const v = rows.map((r) => r[0]);
        const c = rows.map((r) => r[1]);
        check(() => permutationF(v, c, 3, o));
        check(() => permutationSNR(v, c, 3, o));
        check(() => permutationKW(v, c, 3, o));
        check(() => permanova([v], c, 3, o));
        check(() => dispersionTest([v], c, 3, o));
        // Blocks: row i in block ⌊i/3⌋ with treatments 0, 1, 2 cycling (complete when n is a multiple of 3).
        const n3 = v.length - (v.length % 3);
        if (n3 >= 3) {
          const vb = v.slice(0, n3), tb = vb.map((_, i) => i % 3), bb = vb.map((_, i) => Math.floor(i / 3));
          check(() => blockPermutationTest(vb, tb, 3, bb, n3 / 3, o));
          check(() => permutationFriedman(vb, tb, 3, bb, n3 / 3, o));
        }
      }),
      { numRuns: 150 },
    );
  });

  it("a sign scheme over no differences is one exact relabelling with p = 1", () => {
    const s = new SignScheme(0);
    const r = permutationTest(s, () => 0);
    expect([r.exact, r.resamples, r.count, r.p]).toEqual([true, 1, 1, 1]);
    const all0 = pairedTest([2, 3], [2, 3]);
    expect([all0.p, all0.exact, all0.nonZero, all0.meanDifference]).toEqual([1, true, 0, 0]);
  });
});
