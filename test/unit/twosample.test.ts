import { describe, expect, it } from "vitest";
import { TwoSampleStatistic, twoSampleTest } from "../../src/twosample";
import { Direction } from "../../src/permutation";
import { Rng } from "../../src/random";
import { getCase, value } from "../reference";

// Mouse survival data: Efron & Tibshirani (1993), An Introduction to the Bootstrap, Table 2.1;
// exact counts from the shared reference values (cases.json, case 2, both copies of the control data).
const mouse = getCase("mouse_two_sample");
const mouseVariant = getCase("mouse_two_sample_variant_50_31");
// PlantGrowth: Dobson (1983); all pairwise exact tests (cases.json, case 8).
const pg = getCase("plantgrowth_oneway");
const pairs = getCase("plantgrowth_pairwise_exact_holm");
const weight: number[] = pg.data.weight;
const ctrl = weight.slice(0, 10), trt1 = weight.slice(10, 20), trt2 = weight.slice(20, 30);

function median(v: number[]): number {
  const s = v.slice().sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
}
function mean(v: number[]): number {
  return v.reduce((a, b) => a + b, 0) / v.length;
}
function welch(a: number[], b: number[]): number {
  const va = a.reduce((s, v) => s + (v - mean(a)) ** 2, 0) / (a.length - 1);
  const vb = b.reduce((s, v) => s + (v - mean(b)) ** 2, 0) / (b.length - 1);
  return (mean(a) - mean(b)) / Math.sqrt(va / a.length + vb / b.length);
}
const naive: Record<TwoSampleStatistic, (a: number[], b: number[]) => number> = {
  mean: (a, b) => mean(a) - mean(b),
  median: (a, b) => median(a) - median(b),
  t: welch,
};

/** Every split of the pooled values into sizes n1 and n − n1, statistic from scratch. */
function bruteForce(x: number[], y: number[], stat: (a: number[], b: number[]) => number) {
  const pooled = [...x, ...y];
  const n = pooled.length, n1 = x.length;
  const obs = stat(x, y);
  const tol = 1e-9 * Math.abs(obs);
  let ge = 0, le = 0, abs = 0, total = 0;
  const pick: number[] = [];
  const rec = (start: number) => {
    if (pick.length === n1) {
      const inA = new Set(pick);
      const a = pick.map((i) => pooled[i]);
      const b = pooled.filter((_, i) => !inA.has(i));
      const t = stat(a, b);
      total++;
      if (t >= obs - tol) ge++;
      if (t <= obs + tol) le++;
      if (Math.abs(t) >= Math.abs(obs) - tol) abs++;
      return;
    }
    for (let i = start; i <= n - (n1 - pick.length); i++) {
      pick.push(i);
      rec(i + 1);
      pick.pop();
    }
  };
  rec(0);
  return { ge, le, abs, total };
}

describe("two-sample difference of means (mouse data, Efron & Tibshirani 1993)", () => {
  for (const c of [mouse, mouseVariant]) {
    it(`gives the exact counts of the full enumeration (${c.id})`, () => {
      const x: number[] = c.data.treatment, y: number[] = c.data.control;
      const g = twoSampleTest(x, y, { direction: "greater", resamples: 20000 });
      const l = twoSampleTest(x, y, { direction: "less", resamples: 20000 });
      const t = twoSampleTest(x, y, { direction: "two-sided", resamples: 20000 });
      for (const r of [g, l, t]) {
        expect(r.exact).toBe(true);
        expect(r.resamples).toBe(value(c, "perm_n_splits"));
        expect(Math.abs(r.estimate / value(c, "mean_difference") - 1)).toBeLessThan(1e-9);
        expect(r.statistic).toBe(r.estimate);
      }
      expect(g.count).toBe(value(c, "perm_count_diff_ge_obs"));
      expect(l.count).toBe(value(c, "perm_count_diff_le_obs"));
      expect(t.count).toBe(value(c, "perm_count_absdiff_ge_obs"));
      expect(Math.abs(g.p - value(c, "perm_p_greater"))).toBeLessThan(1e-12);
      // Two-sided is the |difference| definition (not twice the smaller tail; cases.json notes).
      expect(Math.abs(t.p - value(c, "perm_p_two_sided_abs"))).toBeLessThan(1e-12);
      expect(Math.abs(t.p - value(c, "perm_p_two_sided_doubled"))).toBeGreaterThan(1e-3);
    });
  }

  it("Welch t of the observed split matches the reference value (cases.json, case 2)", () => {
    for (const c of [mouse, mouseVariant]) {
      const r = twoSampleTest(c.data.treatment, c.data.control, { statistic: "t", resamples: 20000 });
      expect(Math.abs(r.estimate / value(c, "welch_t") - 1)).toBeLessThan(1e-9);
      expect(r.exact).toBe(true);
    }
  });
});

describe("two-sample exact tests on PlantGrowth pairs (Dobson 1983; cases.json, case 8)", () => {
  const groups: Record<string, number[]> = { ctrl, trt1, trt2 };
  for (const [a, b] of [["ctrl", "trt1"], ["ctrl", "trt2"], ["trt1", "trt2"]]) {
    it(`${a} vs ${b}: count of |difference| ≥ observed over all 184,756 splits`, () => {
      const r = twoSampleTest(groups[a], groups[b], { resamples: 184756 });
      expect(r.exact).toBe(true);
      expect(r.resamples).toBe(184756);
      expect(r.count).toBe(value(pairs, `${a}_${b}_count_absdiff_ge`));
      expect(Math.abs(r.p - value(pairs, `${a}_${b}_p_exact_two_sided`))).toBeLessThan(1e-12);
      expect(Math.abs(r.estimate / value(pairs, `${a}_${b}_mean_diff`) - 1)).toBeLessThan(1e-9);
    });
  }

  it("keeps the exact counts when a large constant is added to every value", () => {
    // Sums of values near 1000 lose the digits that separate splits unless the engine shifts them.
    const r = twoSampleTest(ctrl.map((v) => v + 1000), trt1.map((v) => v + 1000), { resamples: 184756 });
    expect(r.count).toBe(value(pairs, "ctrl_trt1_count_absdiff_ge"));
    const m = twoSampleTest(mouse.data.treatment.map((v: number) => v + 1e7), mouse.data.control.map((v: number) => v + 1e7), { direction: "greater", resamples: 20000 });
    expect(m.count).toBe(value(mouse, "perm_count_diff_ge_obs"));
  });
});

describe("two-sample statistics: brute-force cross-checks", () => {
  const x: number[] = mouse.data.treatment, y: number[] = mouse.data.control;
  for (const stat of ["mean", "median", "t"] as TwoSampleStatistic[]) {
    it(`${stat}: exact counts in all three directions equal a full enumeration from scratch`, () => {
      const bf = bruteForce(x, y, naive[stat]);
      expect(bf.total).toBe(11440);
      const dirs: [Direction, number][] = [["greater", bf.ge], ["less", bf.le], ["two-sided", bf.abs]];
      for (const [direction, count] of dirs) {
        const r = twoSampleTest(x, y, { statistic: stat, direction, resamples: 11440 });
        expect(r.exact).toBe(true);
        expect(r.count).toBe(count);
        expect(r.p).toBe(count / 11440);
      }
    });
  }

  it("median with odd and even sizes and ties equals a full enumeration", () => {
    const a = [3, 5, 5, 8, 1, 9, 4];
    const b = [5, 2, 7, 7, 6, 3];
    const bf = bruteForce(a, b, naive.median);
    const r = twoSampleTest(a, b, { statistic: "median", direction: "two-sided", resamples: 2000, keepNull: true });
    expect(r.exact).toBe(true);
    expect(r.resamples).toBe(1716); // C(13, 7)
    expect(r.count).toBe(bf.abs);
    expect(r.estimate).toBe(median(a) - median(b));
    expect(r.nullDistribution!.length).toBe(1716);
  });

  for (const stat of ["mean", "median", "t"] as TwoSampleStatistic[]) {
    it(`${stat}: exact and Monte Carlo agree within 4 standard errors`, () => {
      const ex = twoSampleTest(x, y, { statistic: stat, resamples: 20000 });
      const m = 4000;
      const mc = twoSampleTest(x, y, { statistic: stat, resamples: m, seed: 17 });
      expect(mc.exact).toBe(false);
      expect(mc.p).toBe((mc.count + 1) / (m + 1));
      const se = Math.sqrt((ex.p * (1 - ex.p)) / m);
      expect(Math.abs(mc.p - ex.p)).toBeLessThan(4 * se + 1 / m);
      expect(mc.mcInterval![0]).toBeLessThanOrEqual(mc.p);
      expect(mc.mcInterval![1]).toBeGreaterThanOrEqual(mc.p);
    });
  }
});

describe("two-sample tests: properties", () => {
  const rng = new Rng(21);
  const a = Array.from({ length: 40 }, () => rng.normal() + 0.3);
  const b = Array.from({ length: 35 }, () => rng.normal() * 2);
  for (const stat of ["mean", "median", "t"] as TwoSampleStatistic[]) {
    it(`${stat}: invariant to row order, antisymmetric in the samples, p in (0, 1]`, () => {
      const r = twoSampleTest(a, b, { statistic: stat, resamples: 2000, seed: 4 });
      const shuffled = twoSampleTest(a.slice().reverse(), b.slice().sort(), { statistic: stat, resamples: 2000, seed: 4 });
      expect(shuffled.count).toBe(r.count);
      expect(shuffled.estimate).toBeCloseTo(r.estimate, 12);
      expect(r.p).toBeGreaterThan(0);
      expect(r.p).toBeLessThanOrEqual(1);
      // Swapping the samples flips the sign; "greater" for (x, y) is "less" for (y, x).
      const g = twoSampleTest(a, b, { statistic: stat, direction: "greater", resamples: 2000, seed: 4 });
      const l = twoSampleTest(b, a, { statistic: stat, direction: "less", resamples: 2000, seed: 4 });
      expect(l.estimate).toBeCloseTo(-g.estimate, 12);
      expect(Math.abs(l.p - g.p)).toBeLessThan(4 * Math.sqrt((2 * g.p * (1 - g.p)) / 2000) + 1 / 2000);
    });
  }

  it("Welch t of two constant samples is ±Infinity, never NaN, with a valid p", () => {
    const r = twoSampleTest([5, 5, 5], [2, 2, 2], { statistic: "t", resamples: 100 });
    expect(r.estimate).toBe(Infinity);
    expect(r.exact).toBe(true);
    expect(r.resamples).toBe(20);
    // Only the observed split and its mirror reach |t| = Infinity.
    expect(r.count).toBe(2);
    const same = twoSampleTest([4, 4], [4, 4, 4], { statistic: "t", resamples: 100 });
    expect(same.estimate).toBe(0);
    expect(same.p).toBe(1);
  });

  it("refuses empty samples, Welch t with one value, and non-finite values", () => {
    expect(() => twoSampleTest([], [1, 2], {})).toThrow(RangeError);
    expect(() => twoSampleTest([1], [1, 2], { statistic: "t" })).toThrow(RangeError);
    expect(() => twoSampleTest([1, NaN], [1, 2], {})).toThrow(RangeError);
    expect(() => twoSampleTest([1, 2], [1, 2], { statistic: "mode" as TwoSampleStatistic })).toThrow(RangeError);
  });
});
