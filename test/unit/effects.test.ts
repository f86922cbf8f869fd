import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { jStat } from "jstat";
import {
  DifferenceSelector,
  cliffsDelta,
  differenceOfMeans,
  differenceOfMedians,
  hodgesLehmann,
  mannWhitneyCdf,
  oneWayEffectSizes,
  percentOfReference,
} from "../../src/effects";
import { bootstrapDiffInterval } from "../../src/bootstrap";
import { encodeGroups } from "../../src/groups";
import { Rng } from "../../src/random";
import { getCase, value } from "../reference";

const mouse = getCase("mouse_two_sample");
const hw = getCase("hollander_wolfe_rank_tests");
const pg = getCase("plantgrowth_oneway");

/** All n·m differences x_i − y_j, sorted (the O(n²) definition). */
function allDifferences(x: number[], y: number[]): number[] {
  const d: number[] = [];
  for (const a of x) for (const b of y) d.push(a - b);
  return d.sort((p, q) => p - q);
}
function medianOf(s: number[]): number {
  const h = s.length >> 1;
  return s.length % 2 ? s[h] : (s[h - 1] + s[h]) / 2;
}

/** Null distribution of U by enumerating every n-subset of the ranks 1 … n + m. */
function bruteMannWhitney(n: number, m: number): number[] {
  const N = n + m;
  const counts = new Array(n * m + 1).fill(0);
  const rec = (start: number, left: number, sum: number) => {
    if (left === 0) {
      counts[sum - (n * (n + 1)) / 2]++;
      return;
    }
    for (let r = start; r <= N - left + 1; r++) rec(r + 1, left - 1, sum + r);
  };
  rec(1, n, 0);
  return counts;
}

describe("Mann–Whitney null distribution (for the Hodges–Lehmann interval)", () => {
  it("equals full enumeration of rank subsets", () => {
    for (const [n, m] of [[1, 1], [2, 5], [4, 6], [7, 3], [6, 6]]) {
      const counts = bruteMannWhitney(n, m);
      const total = counts.reduce((a, b) => a + b, 0);
      const cdf = mannWhitneyCdf(n, m);
      let cum = 0;
      counts.forEach((c, u) => {
        cum += c;
        expect(cdf[u]).toBeCloseTo(cum / total, 14);
      });
    }
  });

  it("gives the exact rank-sum p of the mouse data, U = 36 (shared reference values, cases.json case 2)", () => {
    const cdf = mannWhitneyCdf(7, 9);
    expect(value(mouse, "ranksum_U_treatment")).toBe(36);
    expect(1 - cdf[35]).toBeCloseTo(value(mouse, "ranksum_p_greater_exact"), 12);
  });

  it("gives the exact p of Hollander & Wolfe (1973, p. 69), W = 35 (cases.json case 5)", () => {
    const cdf = mannWhitneyCdf(10, 5);
    expect(1 - cdf[value(hw, "ranksum_W_x_R") - 1]).toBeCloseTo(value(hw, "ranksum_p_greater_exact"), 12);
  });
});

describe("Hodges–Lehmann shift (Hodges & Lehmann 1963; Lehmann 1975)", () => {
  it("estimate equals the O(n²) median of all pairwise differences (property, with ties)", () => {
    fc.assert(
      fc.property(
        fc.array(fc.integer({ min: -20, max: 20 }), { minLength: 1, maxLength: 25 }),
        fc.array(fc.integer({ min: -20, max: 20 }), { minLength: 1, maxLength: 25 }),
        (x, y) => {
          expect(hodgesLehmann(x, y).estimate).toBe(medianOf(allDifferences(x, y)));
        },
      ),
      { numRuns: 300 },
    );
  });

  it("selection of the k-th difference matches the sorted list, also for large samples", () => {
    const rng = new Rng(3);
    const x = Array.from({ length: 310 }, () => rng.normal() * 3);
    const y = Array.from({ length: 280 }, () => Math.exp(rng.normal()));
    const d = allDifferences(x, y);
    const sel = new DifferenceSelector(Float64Array.from(x).sort(), Float64Array.from(y).sort());
    for (const k of [1, 2, 17, 1000, 43400, 43401, 86799, 86800]) expect(sel.kth(k)).toBe(d[k - 1]);
    expect(hodgesLehmann(x, y).estimate).toBe(medianOf(d));
  });

  it("exact interval: endpoints are the differences of rank c and nm + 1 − c, c from the enumerated null", () => {
    const x = [0.8, 0.83, 1.89, 1.04, 1.45, 1.38, 1.91, 1.64, 0.73, 1.46]; // Hollander & Wolfe (1973), p. 69
    const y = [1.15, 0.88, 0.9, 0.74, 1.21];
    const r = hodgesLehmann(x, y, { level: 0.95 });
    expect(r.method).toBe("exact");
    const counts = bruteMannWhitney(10, 5);
    const total = counts.reduce((a, b) => a + b, 0);
    // largest c with P(U ≤ c − 1) ≤ 0.025
    let cum = 0;
    let c = 0;
    while (cum + counts[c] <= 0.025 * total) cum += counts[c++];
    expect(r.rank).toBe(c);
    const d = allDifferences(x, y);
    expect(r.lower).toBe(d[c - 1]);
    expect(r.upper).toBe(d[50 - c]);
    expect(r.achievedLevel).toBeCloseTo(1 - (2 * cum) / total, 12);
    expect(r.achievedLevel).toBeGreaterThanOrEqual(0.95);
    expect(r.estimate).toBe(medianOf(d));
  });

  it("exact interval covers a true shift at least at the achieved level (simulation, 2,000 data sets)", () => {
    const rng = new Rng(8);
    let covered = 0;
    const N = 2000;
    let achieved = 0;
    for (let s = 0; s < N; s++) {
      const x = Array.from({ length: 8 }, () => Math.exp(rng.normal()) + 1.5);
      const y = Array.from({ length: 7 }, () => Math.exp(rng.normal()));
      const r = hodgesLehmann(x, y, { level: 0.9 });
      achieved = r.achievedLevel;
      if (r.lower <= 1.5 && 1.5 <= r.upper) covered++;
    }
    const se = Math.sqrt((achieved * (1 - achieved)) / N);
    expect(Math.abs(covered / N - achieved)).toBeLessThan(4 * se);
  });

  it("normal approximation with ties: c = ⌊nm/2 + ½ − z·√(nm(n + m + 1)/12)⌋", () => {
    const x = [3, 4, 4, 5, 6, 6, 7, 9, 9, 10, 12];
    const y = [1, 2, 2, 3, 4, 5, 5, 6, 8];
    const r = hodgesLehmann(x, y, { level: 0.95 });
    expect(r.method).toBe("normal");
    const c = Math.floor(99 / 2 + 0.5 - jStat.normal.inv(0.975, 0, 1) * Math.sqrt((99 * 21) / 12));
    const d = allDifferences(x, y);
    expect(r.rank).toBe(c);
    expect([r.lower, r.upper]).toEqual([d[c - 1], d[99 - c]]);
  });

  it("samples too small for the level give the full range with a note", () => {
    const r = hodgesLehmann([1, 2], [3, 5], { level: 0.95 });
    expect([r.lower, r.upper]).toEqual([-4, -1]);
    expect(r.note).toMatch(/too small/);
    expect(r.achievedLevel).toBeCloseTo(1 - 2 / 6, 12);
  });

  it("is invariant to row order and equivariant to shifts", () => {
    const x = [5.1, 3.2, 8.8, 6.0, 4.4, 7.3];
    const y = [2.2, 4.1, 3.0, 1.9, 5.5];
    const a = hodgesLehmann(x, y);
    expect(hodgesLehmann(x.slice().reverse(), y.slice().reverse())).toEqual(a);
    const b = hodgesLehmann(x.map((v) => v + 10), y);
    expect(b.estimate).toBeCloseTo(a.estimate + 10, 12);
    expect(b.lower).toBeCloseTo(a.lower + 10, 12);
  });
});

describe("Cliff's delta (Cliff 1993)", () => {
  const brute = (x: number[], y: number[]) => {
    let s = 0;
    for (const a of x) for (const b of y) s += Math.sign(a - b);
    return s / (x.length * y.length);
  };

  it("O(n log n) version equals the O(n²) definition (property, with ties)", () => {
    fc.assert(
      fc.property(
        fc.array(fc.integer({ min: 0, max: 12 }), { minLength: 1, maxLength: 30 }),
        fc.array(fc.integer({ min: 0, max: 12 }), { minLength: 1, maxLength: 30 }),
        (x, y) => {
          expect(cliffsDelta(x, y)).toBeCloseTo(brute(x, y), 14);
        },
      ),
      { numRuns: 400 },
    );
  });

  it("equals 2U/(nm) − 1 for the mouse data (U = 36, cases.json case 2) and Hollander & Wolfe p. 69 (W = 35, case 5)", () => {
    expect(cliffsDelta(mouse.data.treatment, mouse.data.control)).toBeCloseTo((2 * 36) / 63 - 1, 14);
    expect(cliffsDelta(hw.data.ranksum.x_term, hw.data.ranksum.y_12_26_weeks)).toBeCloseTo((2 * 35) / 50 - 1, 14);
  });

  it("is antisymmetric and bounded", () => {
    const x = [1, 5, 9, 9];
    const y = [2, 9, 10];
    expect(cliffsDelta(y, x)).toBeCloseTo(-cliffsDelta(x, y), 14);
    expect(cliffsDelta([5, 6], [1, 2, 3])).toBe(1);
  });
});

describe("difference and % of reference with bootstrap intervals", () => {
  it("are the two-sample bootstrap intervals (mouse data, Efron & Tibshirani 1993)", () => {
    const t = mouse.data.treatment;
    const c = mouse.data.control;
    expect(differenceOfMeans(t, c, { seed: 5 })).toEqual(bootstrapDiffInterval(t, c, "mean", { seed: 5 }));
    expect(differenceOfMedians(t, c)).toEqual(bootstrapDiffInterval(t, c, "median"));
    const pct = percentOfReference(t, c);
    expect(pct.estimate).toBeCloseTo((100 * value(mouse, "mean_treatment")) / value(mouse, "mean_control"), 10);
    expect(pct.lower).toBeLessThan(pct.estimate);
    expect(pct.upper).toBeGreaterThan(pct.estimate);
  });
});

describe("eta² and omega² (PlantGrowth, Dobson 1983; cases.json case 4)", () => {
  const g = encodeGroups(pg.data.group);
  const e = oneWayEffectSizes(pg.data.weight, g.codes, 3);
  const F = value(pg, "F");

  it("agree with the published F through η² = (k−1)F/((k−1)F + n − k) and ω² = (k−1)(F−1)/((k−1)F + n − k + 1)", () => {
    expect(e.etaSquared).toBeCloseTo((2 * F) / (2 * F + 27), 12);
    expect(e.omegaSquared).toBeCloseTo((2 * (F - 1)) / (2 * F + 28), 12);
  });

  it("sums of squares match the widely reproduced ANOVA table (3.7663 and 10.4921; from memory)", () => {
    expect(e.ssb).toBeCloseTo(3.7663, 4);
    expect(e.ssw).toBeCloseTo(10.4921, 4);
    expect(e.ssb + e.ssw).toBeCloseTo(e.sst, 12);
  });

  it("do not depend on row order or group names", () => {
    const w = pg.data.weight.slice().reverse();
    const codes = Array.from(g.codes).reverse().map((c) => (c + 1) % 3);
    const r = oneWayEffectSizes(w, codes, 3);
    expect(r.etaSquared).toBeCloseTo(e.etaSquared, 12);
    expect(r.omegaSquared).toBeCloseTo(e.omegaSquared, 12);
  });

  it("refuse data without variation or an empty group", () => {
    expect(() => oneWayEffectSizes([2, 2, 2, 2], [0, 0, 1, 1], 2)).toThrow(/all values are equal/);
    expect(() => oneWayEffectSizes([1, 2, 3], [0, 0, 0], 2)).toThrow(/no values/);
  });
});
