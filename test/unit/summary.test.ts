import { describe as group, expect, it } from "vitest";
import fc from "fast-check";
import { encodeGroups } from "../../src/groups";
import { describe, describeGroups, mean, median, medianInPlace, quantile, quantileSorted, sd, select, trimmedMean, variance } from "../../src/summary";
import { getCase } from "../reference";
import { expectReference, permutationOf } from "./check";

// Mouse survival: Efron & Tibshirani (1993), Table 2.1 — shared reference values (cases.json, case 2).
const mouse = getCase("mouse_two_sample");
const mouseVariant = getCase("mouse_two_sample_variant_50_31");
// PlantGrowth: Dobson (1983) — shared reference values (cases.json, case 8: differences of group means).
const pg = getCase("plantgrowth_oneway");
const pairs = getCase("plantgrowth_pairwise_exact_holm");

/** Type-7 quantile by brute force: linear interpolation of the points ((i − 1)/(n − 1), x₍ᵢ₎) (Hyndman & Fan 1996). */
function bruteType7(x: number[], p: number): number {
  const s = x.slice().sort((a, b) => a - b);
  const n = s.length;
  if (n === 1) return s[0];
  for (let i = 0; i < n - 1; i++) {
    const p0 = i / (n - 1);
    const p1 = (i + 1) / (n - 1);
    if (p >= p0 && p <= p1) return s[i] + ((p - p0) / (p1 - p0)) * (s[i + 1] - s[i]);
  }
  return s[n - 1];
}

group("descriptive summaries", () => {
  it("mouse survival (Efron & Tibshirani 1993): means and SD (n − 1) behind the published standard errors", () => {
    for (const c of [mouse, mouseVariant]) {
      const t = describe(c.data.treatment);
      const k = describe(c.data.control);
      expectReference(t.mean, c, "mean_treatment");
      expectReference(k.mean, c, "mean_control");
      expectReference(t.sd! / Math.sqrt(t.n), c, "se_treatment_sd_over_sqrt_n");
      expectReference(k.sd! / Math.sqrt(k.n), c, "se_control_sd_over_sqrt_n");
      expectReference(t.mean - k.mean, c, "mean_difference");
      // plug-in SD / √n is the ideal bootstrap SE of the mean (Efron & Tibshirani 1993, Table 2.2)
      const plugIn = Math.sqrt((variance(c.data.treatment) * (t.n - 1)) / t.n);
      expectReference(plugIn / Math.sqrt(t.n), c, "bootstrap_se_treatment_mean_ideal_Binf");
    }
  });

  it("PlantGrowth (Dobson 1983): group means reproduce the pairwise mean differences", () => {
    const g = encodeGroups(pg.data.group);
    const rows = describeGroups(pg.data.weight, g.codes, g.names);
    expect(rows.map((r) => r.group)).toEqual(["ctrl", "trt1", "trt2"]);
    expect(rows.map((r) => r.n)).toEqual([10, 10, 10]);
    expectReference(rows[0].mean - rows[1].mean, pairs, "ctrl_trt1_mean_diff");
    expectReference(rows[0].mean - rows[2].mean, pairs, "ctrl_trt2_mean_diff");
    expectReference(rows[1].mean - rows[2].mean, pairs, "trt1_trt2_mean_diff");
    for (const r of rows) expect(r.cv).toBeCloseTo((100 * r.sd!) / r.mean, 12);
  });

  it("type-7 quartiles (Hyndman & Fan 1996): 1…10 gives 3.25 and 7.75 by the definition h = (n − 1)p", () => {
    const d = describe([10, 9, 8, 7, 6, 5, 4, 3, 2, 1]);
    expect(d.q1).toBe(3.25);
    expect(d.q3).toBe(7.75);
    expect(d.median).toBe(5.5);
    expect([d.min, d.max]).toEqual([1, 10]);
  });

  it("quantiles equal the brute-force interpolation of the order statistics", () => {
    fc.assert(
      fc.property(fc.array(fc.integer({ min: -50, max: 50 }), { minLength: 1, maxLength: 40 }), fc.double({ min: 0, max: 1, noNaN: true }), (xs, p) => {
        const got = quantile(xs, p);
        const want = bruteType7(xs, p);
        expect(Math.abs(got - want)).toBeLessThanOrEqual(1e-9 * (1 + Math.abs(want)));
      }),
      { numRuns: 300 },
    );
    expect(() => quantileSorted([1, 2], 1.5)).toThrow(RangeError);
  });

  it("median and trimmed mean by selection equal their sort-based definitions", () => {
    fc.assert(
      fc.property(
        fc.array(fc.integer({ min: -20, max: 20 }), { minLength: 1, maxLength: 80 }),
        fc.double({ min: 0, max: 0.49, noNaN: true }),
        (xs, prop) => {
          const s = xs.slice().sort((a, b) => a - b);
          const n = s.length;
          const med = n % 2 ? s[(n - 1) / 2] : (s[n / 2 - 1] + s[n / 2]) / 2;
          expect(median(xs)).toBe(med);
          const g = Math.floor(prop * n * (1 + 1e-9));
          const kept = s.slice(g, n - g);
          const want = kept.reduce((a, b) => a + b, 0) / kept.length;
          expect(Math.abs(trimmedMean(xs, prop) - want)).toBeLessThan(1e-12 * (1 + Math.abs(want)));
          // select puts the k-th order statistic in place
          const a = Float64Array.from(xs);
          const k = Math.floor(prop * n);
          expect(select(a, k)).toBe(s[k]);
          for (let i = 0; i < k; i++) expect(a[i]).toBeLessThanOrEqual(s[k]);
          for (let i = k + 1; i < n; i++) expect(a[i]).toBeGreaterThanOrEqual(s[k]);
        },
      ),
      { numRuns: 300 },
    );
  });

  it("selection stays correct on orderings that defeat simple pivots (sorted, reversed, constant, organ pipe)", () => {
    const n = 20001;
    const shapes = [
      Array.from({ length: n }, (_, i) => i),
      Array.from({ length: n }, (_, i) => n - i),
      Array.from({ length: n }, () => 7),
      Array.from({ length: n }, (_, i) => Math.min(i, n - 1 - i)),
      Array.from({ length: n }, (_, i) => (i % 2 ? i : n - i)),
    ];
    for (const x of shapes) {
      const s = x.slice().sort((a, b) => a - b);
      expect(median(x)).toBe(s[(n - 1) / 2]);
      for (const k of [0, 1, 777, n - 2, n - 1]) expect(select(Float64Array.from(x), k)).toBe(s[k]);
    }
  });

  it("10 % trimmed mean of 1…20 with two outliers drops two values at each end (Tukey & McLaughlin 1963 definition)", () => {
    const x = Array.from({ length: 20 }, (_, i) => i + 1);
    x[0] = -1000;
    x[19] = 5000;
    // g = ⌊0.1 · 20⌋ = 2: mean of 3 … 18 = 10.5
    expect(trimmedMean(x)).toBe(10.5);
    expect(trimmedMean(x, 0)).toBe(mean(x));
    expect(() => trimmedMean(x, 0.5)).toThrow(RangeError);
  });

  it("is invariant to row order, reuses scratch buffers, and keeps x unchanged", () => {
    const w: number[] = pg.data.weight;
    const base = describe(w);
    const p = permutationOf(w.length, 9);
    const re = describe(p.map((i) => w[i]));
    expect(re.median).toBe(base.median);
    expect(re.q1).toBe(base.q1);
    expect(re.q3).toBe(base.q3);
    expect(Math.abs(re.mean - base.mean)).toBeLessThan(1e-14);
    expect(Math.abs(re.sd! - base.sd!)).toBeLessThan(1e-14);
    const copy = w.slice();
    const scratch = new Float64Array(64);
    expect(median(w, scratch)).toBe(base.median);
    expect(trimmedMean(w, 0.1, scratch)).toBe(trimmedMean(w, 0.1));
    expect(w).toEqual(copy);
    expect(medianInPlace(Float64Array.from([3, 1, 2]))).toBe(2);
  });

  it("keeps SD accurate for values with a large common offset (two-pass variance)", () => {
    const x = [1e9 + 4, 1e9 + 7, 1e9 + 13, 1e9 + 16];
    expect(variance(x)).toBe(30);
    expect(sd([4, 7, 13, 16])).toBeCloseTo(Math.sqrt(30), 14);
  });

  it("is NaN-free: CV is null when the mean is 0, SD and CV are null for a single value", () => {
    const z = describe([-1, 1, -2, 2]);
    expect(z.mean).toBe(0);
    expect(z.cv).toBeNull();
    const one = describe([4.2]);
    expect(one.sd).toBeNull();
    expect(one.cv).toBeNull();
    expect([one.median, one.q1, one.q3, one.min, one.max]).toEqual([4.2, 4.2, 4.2, 4.2, 4.2]);
    expect(() => describe([])).toThrow(RangeError);
    expect(() => describe([1, NaN])).toThrow(RangeError);
    expect(() => describeGroups([1, 2], [0, 0], ["a", "b"])).toThrow(/group 'b' has no values/);
  });
});
