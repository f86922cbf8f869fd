import { describe, expect, it } from "vitest";
import { encodeGroups } from "../../src/groups";
import { DistanceRatio, distanceRatio, permutationSNR } from "../../src/snr";
import { Rng, shuffle } from "../../src/random";
import { getCase, expected, value } from "../reference";
import { naiveDistanceRatio } from "../naive";

// PlantGrowth: Dobson (1983), An Introduction to Statistical Modelling, Table 7.1; D and its
// permutation p from the shared reference values (cases.json, case 4).
const pg = getCase("plantgrowth_oneway");
const weight: number[] = pg.data.weight;
const g = encodeGroups(pg.data.group);

function relClose(a: number, b: number, rel: number): void {
  expect(Math.abs(a - b)).toBeLessThanOrEqual(rel * Math.abs(b));
}

describe("distance ratio D (PlantGrowth, Dobson 1983; shared reference values, cases.json case 4)", () => {
  it("matches D, the mean between-group and within-group |difference|", () => {
    const r = distanceRatio(weight, g.codes, 3);
    relClose(r.d, value(pg, "D_snr"), 1e-9);
    relClose(r.between, value(pg, "D_mean_abs_diff_between"), 1e-9);
    relClose(r.within, value(pg, "D_mean_abs_diff_within"), 1e-9);
  });

  it("Monte Carlo permutation p (99,999 resamples) is within the reference band", () => {
    const e = expected(pg, "D_perm_p_reference");
    const r = permutationSNR(weight, g.codes, 3, { resamples: 99999, seed: 1 });
    expect(r.exact).toBe(false);
    expect(r.direction).toBe("greater");
    expect(r.resamples).toBe(99999);
    expect(Math.abs(r.p - e.value)).toBeLessThan(e.tolerance.abs);
    expect(r.p).toBe((r.count + 1) / 100000);
    expect(r.mcInterval![0]).toBeLessThan(r.p);
    expect(r.mcInterval![1]).toBeGreaterThan(r.p);
    relClose(r.d, value(pg, "D_snr"), 1e-9);
    expect(r.statistic).toBe(r.d);
  });
});

describe("distance ratio D: brute-force cross-checks", () => {
  it("equals the O(n²) pair definition, with ties and unequal groups, for any relabelling", () => {
    const rng = new Rng(11);
    for (let trial = 0; trial < 20; trial++) {
      const n = 5 + rng.int(60);
      const k = 2 + rng.int(4);
      // Rounded values so that ties occur, also across groups.
      const x = Array.from({ length: n }, () => Math.round(rng.normal() * 4) / 2 + 10);
      const lab = Array.from({ length: n }, (_, i) => (i < k ? i : rng.int(k)));
      const fast = distanceRatio(x, lab, k);
      const slow = naiveDistanceRatio(x, lab);
      relClose(fast.d, slow.d, 1e-12);
      relClose(fast.between, slow.between, 1e-12);
      relClose(fast.within, slow.within, 1e-12);
      // The hot path (labels in sorted order, sizes fixed) on shuffled labellings.
      const layout = new DistanceRatio(x, lab, k);
      const sortedLab = layout.toSorted(lab);
      for (let rep = 0; rep < 5; rep++) {
        shuffle(sortedLab, rng);
        const rowLab = new Int32Array(n);
        for (let r = 0; r < n; r++) rowLab[layout.order[r]] = sortedLab[r];
        relClose(layout.dFromWithinSum(layout.withinSumSorted(sortedLab)), naiveDistanceRatio(x, rowLab).d, 1e-12);
        // The fused Monte Carlo sampler returns W of the labelling it leaves behind.
        const w = layout.sampleWithinSum(rng, sortedLab);
        relClose(w, layout.withinSumSorted(sortedLab), 1e-13);
      }
    }
  });

  it("exact enumeration equals a brute-force count over every labelling", () => {
    const x = [3.1, 4.2, 2.2, 5.9, 6.1, 4.4, 7.0, 8.1, 5.5, 4.2];
    const labs = [0, 0, 0, 1, 1, 1, 2, 2, 2, 2];
    const ex = permutationSNR(x, labs, 3, { resamples: 5000, keepNull: true });
    expect(ex.exact).toBe(true);
    expect(ex.resamples).toBe(4200); // 10! / (3! 3! 4!)
    const dObs = naiveDistanceRatio(x, labs).d;
    let count = 0, total = 0;
    const cur = new Array(10).fill(-1);
    const cap = [3, 3, 4];
    const rec = (i: number, c: number[]) => {
      if (i === 10) {
        total++;
        if (naiveDistanceRatio(x, cur).d >= dObs * (1 - 1e-12)) count++;
        return;
      }
      for (let gg = 0; gg < 3; gg++) if (c[gg] < cap[gg]) { c[gg]++; cur[i] = gg; rec(i + 1, c); c[gg]--; }
    };
    rec(0, [0, 0, 0]);
    expect(total).toBe(4200);
    expect(ex.count).toBe(count);
    expect(ex.p).toBe(count / total);
    // The kept null distribution holds D values and gives the same count.
    expect(ex.nullDistribution!.length).toBe(4200);
    expect(Array.from(ex.nullDistribution!).filter((d) => d >= dObs * (1 - 1e-12)).length).toBe(count);
  });

  it("exact and Monte Carlo agree within 4 standard errors", () => {
    const x = [3.1, 4.2, 2.2, 5.9, 6.1, 4.4, 7.0, 8.1, 5.5, 4.2];
    const labs = [0, 0, 0, 1, 1, 1, 2, 2, 2, 2];
    const ex = permutationSNR(x, labs, 3, { resamples: 5000 });
    const m = 3000;
    const mc = permutationSNR(x, labs, 3, { resamples: m, seed: 5 });
    expect(ex.exact).toBe(true);
    expect(mc.exact).toBe(false);
    const se = Math.sqrt((ex.p * (1 - ex.p)) / m);
    expect(Math.abs(mc.p - ex.p)).toBeLessThan(4 * se + 1 / m);
  });
});

describe("distance ratio D: properties", () => {
  it("is invariant to row order and to the names of the groups", () => {
    const rev = weight.slice().reverse();
    const revCodes = Array.from(g.codes).reverse();
    // Swapping the names of trt1 and trt2 keeps the order of the tied pair's codes
    // (4.17 in ctrl and trt1), so the Monte Carlo stream is the same draw for draw.
    const renamed = Array.from(g.codes, (c) => [0, 2, 1][c]);
    const a = permutationSNR(weight, g.codes, 3, { resamples: 3000, seed: 9 });
    const b = permutationSNR(rev, revCodes, 3, { resamples: 3000, seed: 9 });
    const c = permutationSNR(weight, renamed, 3, { resamples: 3000, seed: 9 });
    relClose(b.d, a.d, 1e-12);
    relClose(c.d, a.d, 1e-12);
    // Ties in value are ordered by group code, so the sorted labelling and the counts
    // do not depend on row order.
    expect(b.count).toBe(a.count);
    expect(c.count).toBe(a.count);
    // Any renaming: the same law, so the p-values agree within Monte Carlo error.
    const any = permutationSNR(weight, Array.from(g.codes, (k) => (k + 2) % 3), 3, { resamples: 3000, seed: 9 });
    expect(Math.abs(any.p - a.p)).toBeLessThan(4 * Math.sqrt((2 * a.p * (1 - a.p)) / 3000) + 1 / 3000);
    // Exact results on a small design.
    const x = [3.1, 4.2, 2.2, 5.9, 6.1, 4.4, 7.0, 8.1, 5.5];
    const labs = [0, 0, 0, 1, 1, 1, 2, 2, 2];
    const e1 = permutationSNR(x, labs, 3, { resamples: 2000 });
    const e2 = permutationSNR(x.slice().reverse(), labs.slice().reverse(), 3, { resamples: 2000 });
    const e3 = permutationSNR(x, labs.map((l) => 2 - l), 3, { resamples: 2000 });
    expect(e1.exact).toBe(true);
    expect(e2.p).toBe(e1.p);
    expect(e3.p).toBe(e1.p);
  });

  it("gives p in (0, 1], the same p for the same seed, and D unchanged by a shift or positive scale", () => {
    const a = permutationSNR(weight, g.codes, 3, { resamples: 999, seed: 3 });
    const b = permutationSNR(weight, g.codes, 3, { resamples: 999, seed: 3 });
    expect(a.p).toBe(b.p);
    expect(a.p).toBeGreaterThan(0);
    expect(a.p).toBeLessThanOrEqual(1);
    const scaled = distanceRatio(weight.map((w) => 1000 + 3 * w), g.codes, 3);
    relClose(scaled.d, value(pg, "D_snr"), 1e-9);
  });

  it("is Infinity (never NaN) when every group is constant, and 1 with p = 1 when all values are equal", () => {
    const x = [2, 2, 2, 5, 5, 5, 9, 9];
    const labs = [0, 0, 0, 1, 1, 1, 2, 2];
    const r = distanceRatio(x, labs, 3);
    expect(r.within).toBe(0);
    expect(r.d).toBe(Infinity);
    const t = permutationSNR(x, labs, 3, { resamples: 1000, keepNull: true });
    expect(t.exact).toBe(true);
    expect(t.resamples).toBe(560); // 8! / (3! 3! 2!)
    expect(t.d).toBe(Infinity);
    // Only the observed partition (and its swap of the two groups of 3) keeps all groups constant.
    expect(t.count).toBe(2);
    expect(t.p).toBe(2 / 560);
    expect(Array.from(t.nullDistribution!).some((d) => Number.isNaN(d))).toBe(false);
    const same = permutationSNR([4, 4, 4, 4, 4], [0, 0, 1, 1, 1], 2, { resamples: 100 });
    expect(same.d).toBe(1);
    expect(same.p).toBe(1);
    const mc = permutationSNR(x, labs, 3, { resamples: 200, seed: 2 });
    expect(mc.exact).toBe(false);
    expect(mc.d).toBe(Infinity);
    expect(mc.p).toBeGreaterThan(0);
  });

  it("refuses designs where D is undefined", () => {
    expect(() => distanceRatio([1, 2, 3], [0, 0, 0], 1)).toThrow(RangeError);
    expect(() => distanceRatio([1, 2, 3], [0, 1, 2], 3)).toThrow(RangeError);
    expect(() => distanceRatio([1, NaN, 3], [0, 1, 1], 2)).toThrow(RangeError);
  });
});
