import { describe, expect, it } from "vitest";
import { pairedTest } from "../../src/paired";
import { Direction } from "../../src/permutation";
import { Rng } from "../../src/random";
import { getCase, value } from "../reference";

// Darwin's Zea mays: 15 cross- minus self-fertilised height differences (eighths of an inch),
// Darwin (1876) as analysed by Fisher (1935), The Design of Experiments, §21; counts from the
// shared reference values (cases.json, case 1), where Fisher's published figures are quoted from memory.
const darwin = getCase("darwin_zea_mays");
const d: number[] = darwin.data.d_cross_minus_self_eighths_inch;
// Pairs with a baseline of our own: the test only sees x − y.
const self = d.map((_, i) => 140 + 3 * i);
const cross = d.map((v, i) => self[i] + v);

/** Every sign vector over all n differences (zeros included), from scratch. */
function bruteForce(diff: number[]) {
  const n = diff.length;
  const obs = diff.reduce((a, b) => a + b, 0);
  const tol = 1e-9 * Math.abs(obs);
  let ge = 0, le = 0, abs = 0, eq = 0, gt = 0;
  for (let mask = 0; mask < 1 << n; mask++) {
    let s = 0;
    for (let i = 0; i < n; i++) s += mask & (1 << i) ? -diff[i] : diff[i];
    if (s >= obs - tol) ge++;
    if (s <= obs + tol) le++;
    if (Math.abs(s) >= Math.abs(obs) - tol) abs++;
    if (Math.abs(s - obs) <= tol) eq++;
    if (s > obs + tol) gt++;
  }
  return { ge, le, abs, eq, gt, total: 1 << n };
}

describe("paired sign-flip test (Darwin's Zea mays, Fisher 1935)", () => {
  it("reproduces Fisher's exact counts over all 2^15 sign vectors", () => {
    const two = pairedTest(cross, self, { resamples: 32768 });
    const greater = pairedTest(cross, self, { direction: "greater", resamples: 32768, keepNull: true });
    const less = pairedTest(cross, self, { direction: "less", resamples: 32768 });
    for (const r of [two, greater, less]) {
      expect(r.exact).toBe(true);
      expect(r.resamples).toBe(32768);
      expect(r.n).toBe(15);
      expect(r.nonZero).toBe(15);
      expect(Math.abs(r.meanDifference - value(darwin, "sum_d") / 15)).toBeLessThan(1e-12);
    }
    expect(two.count).toBe(value(darwin, "count_abs_ge_obs")); // 1726
    expect(greater.count).toBe(value(darwin, "count_ge_obs")); // 863
    expect(Math.abs(two.p - value(darwin, "p_two_sided"))).toBeLessThan(1e-12);
    expect(Math.abs(greater.p - value(darwin, "p_one_sided_greater"))).toBeLessThan(1e-12);
    // Strictly greater 835 and equal 28, from the kept null distribution (mean differences).
    const nd = Array.from(greater.nullDistribution!);
    expect(nd.filter((m) => m === greater.meanDifference).length).toBe(value(darwin, "count_eq_obs"));
    expect(nd.filter((m) => m > greater.meanDifference).length).toBe(value(darwin, "count_gt_obs"));
    // "less": every vector except the 835 strictly greater ones.
    expect(less.count).toBe(32768 - value(darwin, "count_gt_obs"));
  });

  it("Monte Carlo with fewer resamples than 2^15 agrees with the exact p within 4 standard errors", () => {
    const m = 5000;
    const mc = pairedTest(cross, self, { resamples: m, seed: 8 });
    expect(mc.exact).toBe(false);
    expect(mc.p).toBe((mc.count + 1) / (m + 1));
    const p = value(darwin, "p_two_sided");
    expect(Math.abs(mc.p - p)).toBeLessThan(4 * Math.sqrt((p * (1 - p)) / m) + 1 / m);
  });
});

describe("paired sign-flip test: brute-force cross-checks and properties", () => {
  it("zero differences are skipped in the enumeration without changing p", () => {
    const given = [0, 1.3, -0.7, 2.1, 0, 0.4, -1.9, 3.2, 0, 0.8, 1.1, -0.2];
    const y = given.map((_, i) => 10 + i / 7);
    const x = given.map((v, i) => y[i] + v);
    const bf = bruteForce(x.map((v, i) => v - y[i])); // all 2^12 vectors, zeros flipped too
    const dirs: [Direction, number][] = [["greater", bf.ge], ["less", bf.le], ["two-sided", bf.abs]];
    for (const [direction, count] of dirs) {
      const r = pairedTest(x, y, { direction, resamples: 10000 });
      expect(r.exact).toBe(true);
      expect(r.nonZero).toBe(9);
      expect(r.n).toBe(12);
      expect(r.resamples).toBe(512);
      // Each vector over the 9 non-zero differences stands for 2^3 full vectors.
      expect(r.count * 8).toBe(count);
      expect(r.p).toBeCloseTo(count / bf.total, 14);
    }
  });

  it("is invariant to the order of the pairs and gives p in (0, 1]", () => {
    const rng = new Rng(5);
    const x = Array.from({ length: 30 }, () => rng.normal() + 0.2);
    const y = Array.from({ length: 30 }, () => rng.normal());
    const perm = Array.from({ length: 30 }, (_, i) => (i * 7) % 30);
    const a = pairedTest(x, y, { resamples: 3000, seed: 2 });
    const b = pairedTest(perm.map((i) => x[i]), perm.map((i) => y[i]), { resamples: 3000, seed: 2 });
    expect(b.count).toBe(a.count);
    expect(b.meanDifference).toBeCloseTo(a.meanDifference, 14);
    expect(a.p).toBeGreaterThan(0);
    expect(a.p).toBeLessThanOrEqual(1);
    // Swapping x and y: "greater" becomes "less" with the same p (the null is symmetric).
    const g = pairedTest(x, y, { direction: "greater", resamples: 3000, seed: 2 });
    const l = pairedTest(y, x, { direction: "less", resamples: 3000, seed: 2 });
    expect(l.count).toBe(g.count);
    expect(l.meanDifference).toBeCloseTo(-g.meanDifference, 14);
  });

  it("all differences zero: mean 0 and p = 1; mismatched lengths are refused", () => {
    const r = pairedTest([1, 2, 3], [1, 2, 3], {});
    expect(r.meanDifference).toBe(0);
    expect(r.nonZero).toBe(0);
    expect(r.p).toBe(1);
    expect(r.exact).toBe(true);
    expect(() => pairedTest([1, 2], [1], {})).toThrow(RangeError);
    expect(() => pairedTest([], [], {})).toThrow(RangeError);
    expect(() => pairedTest([1, Infinity], [1, 2], {})).toThrow(RangeError);
  });
});
