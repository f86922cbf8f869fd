import { describe, expect, it } from "vitest";
import { correlationTest, pearson } from "../../src/correlation";
import { Direction } from "../../src/permutation";
import { Rng } from "../../src/random";

// Anscombe's quartet: Anscombe (1973), Graphs in statistical analysis, The American
// Statistician 27(1), 17–21. Data and r = 0.816 for all four sets quoted from memory.
const ax = [10, 8, 13, 9, 11, 14, 6, 4, 12, 7, 5];
const ay1 = [8.04, 6.95, 7.58, 8.81, 8.33, 9.96, 7.24, 4.26, 10.84, 4.82, 5.68];
const ay2 = [9.14, 8.14, 8.74, 8.77, 9.26, 8.1, 6.13, 3.1, 9.13, 7.26, 4.74];
const ay3 = [7.46, 6.77, 12.74, 7.11, 7.81, 8.84, 6.08, 5.39, 8.15, 6.42, 5.73];
const ax4 = [8, 8, 8, 8, 8, 8, 8, 19, 8, 8, 8];
const ay4 = [6.58, 5.76, 7.71, 8.84, 8.47, 7.04, 5.25, 12.5, 5.56, 7.91, 6.89];

function naivePearson(x: number[], y: number[]): number {
  const n = x.length;
  const mx = x.reduce((a, b) => a + b, 0) / n, my = y.reduce((a, b) => a + b, 0) / n;
  let sxy = 0, sxx = 0, syy = 0;
  for (let i = 0; i < n; i++) {
    sxy += (x[i] - mx) * (y[i] - my);
    sxx += (x[i] - mx) ** 2;
    syy += (y[i] - my) ** 2;
  }
  return sxy / Math.sqrt(sxx * syy);
}

/** Mid-ranks by counting (O(n²)): 1 + #below + (#equal − 1)/2. */
function naiveMidranks(x: number[]): number[] {
  return x.map((v) => 1 + x.filter((u) => u < v).length + (x.filter((u) => u === v).length - 1) / 2);
}

/** Counts over all n! permutations of y (Heap 1963), statistic from scratch. */
function bruteForce(x: number[], y: number[], stat: (a: number[], b: number[]) => number) {
  const obs = stat(x, y);
  const tol = 1e-9 * Math.abs(obs);
  const a = y.slice();
  const n = a.length;
  let ge = 0, le = 0, abs = 0, total = 0;
  const visit = () => {
    const t = stat(x, a);
    total++;
    if (t >= obs - tol) ge++;
    if (t <= obs + tol) le++;
    if (Math.abs(t) >= Math.abs(obs) - tol) abs++;
  };
  const c = new Array(n).fill(0);
  visit();
  let i = 0;
  while (i < n) {
    if (c[i] < i) {
      const j = i % 2 === 0 ? 0 : c[i];
      [a[j], a[i]] = [a[i], a[j]];
      visit();
      c[i]++;
      i = 0;
    } else {
      c[i] = 0;
      i++;
    }
  }
  return { ge, le, abs, total };
}

describe("Pearson correlation (Anscombe's quartet, Anscombe 1973)", () => {
  it("gives r = 0.816 for each of the four sets", () => {
    for (const [x, y] of [[ax, ay1], [ax, ay2], [ax, ay3], [ax4, ay4]]) {
      const r = correlationTest(x, y, { resamples: 999, seed: 1 });
      expect(Math.abs(r.r - 0.816)).toBeLessThan(0.0006);
      expect(r.r).toBeCloseTo(naivePearson(x, y), 13);
      expect(r.statistic).toBe(r.r);
      expect(r.n).toBe(11);
    }
  });

  it("set IV is exact over the 11 placements of its single x = 19", () => {
    // x has 10 tied values, so rearranging x (11 arrangements) gives the exact null distribution.
    const r = correlationTest(ax4, ay4, { resamples: 999, keepNull: true });
    expect(r.exact).toBe(true);
    expect(r.resamples).toBe(11);
    const rs = ay4.map((_, k) => naivePearson(ay4.map((__, i) => (i === k ? 19 : 8)), ay4));
    const count = rs.filter((v) => Math.abs(v) >= Math.abs(r.r) * (1 - 1e-12)).length;
    expect(r.count).toBe(count);
    expect(r.p).toBe(count / 11);
    const kept = Array.from(r.nullDistribution!).sort((a, b) => a - b);
    rs.sort((a, b) => a - b).forEach((v, i) => expect(kept[i]).toBeCloseTo(v, 12));
  });
});

describe("Spearman correlation", () => {
  it("without ties equals 1 − 6 Σd² / (n(n² − 1)) (Spearman 1904)", () => {
    for (const y of [ay1, ay2, ay3]) {
      const rx = naiveMidranks(ax), ry = naiveMidranks(y);
      const d2 = rx.reduce((s, v, i) => s + (v - ry[i]) ** 2, 0);
      const r = correlationTest(ax, y, { method: "spearman", resamples: 99 });
      expect(r.r).toBeCloseTo(1 - (6 * d2) / (11 * 120), 13);
    }
    // Set I: Σd² = 40, so rho = 1 − 240/1320 = 0.8182 (arithmetic on the data above).
    expect(correlationTest(ax, ay1, { method: "spearman", resamples: 99 }).r).toBeCloseTo(9 / 11, 13);
  });

  it("with ties equals Pearson's r on mid-ranks", () => {
    const r = correlationTest(ax4, ay4, { method: "spearman", resamples: 99 });
    expect(r.r).toBeCloseTo(naivePearson(naiveMidranks(ax4), naiveMidranks(ay4)), 13);
  });
});

describe("correlation permutation test: brute-force cross-checks", () => {
  const x = [1.2, 2.5, 3.1, 4.8, 5.0, 6.7, 7.3, 8.9];
  const yTied = [2, 3, 3, 5, 4, 6, 6, 6];
  for (const method of ["pearson", "spearman"] as const) {
    it(`${method}: exact p over distinct arrangements of a tied y equals all 8! permutations`, () => {
      const stat = method === "pearson" ? naivePearson : (a: number[], b: number[]) => naivePearson(naiveMidranks(a), naiveMidranks(b));
      const bf = bruteForce(x, yTied, stat);
      expect(bf.total).toBe(40320);
      const dirs: [Direction, number][] = [["greater", bf.ge], ["less", bf.le], ["two-sided", bf.abs]];
      for (const [direction, count] of dirs) {
        const r = correlationTest(x, yTied, { method, direction, resamples: 5000 });
        expect(r.exact).toBe(true);
        expect(r.resamples).toBe(3360); // 8! / (2! 3!)
        // Each distinct arrangement stands for 2!·3! = 12 permutations.
        expect(r.count * 12).toBe(count);
        expect(Math.abs(r.p - count / 40320)).toBeLessThan(1e-12);
      }
    });
  }

  it("rearranges x when x has fewer distinct arrangements, with the same exact p", () => {
    const xt = [1, 1, 1, 1, 2, 2, 3, 3];
    const y = [0.3, 1.9, 0.8, 2.2, 2.0, 1.1, 3.5, 2.9];
    const bf = bruteForce(xt, y, naivePearson); // permutes y: 40,320
    const r = correlationTest(xt, y, { resamples: 1000 });
    expect(r.exact).toBe(true);
    expect(r.resamples).toBe(420); // 8! / (4! 2! 2!)
    expect(Math.abs(r.p - bf.abs / 40320)).toBeLessThan(1e-12);
  });

  it("exact and Monte Carlo agree within 4 standard errors", () => {
    const ex = correlationTest(x, yTied, { resamples: 5000 });
    const m = 2000;
    const mc = correlationTest(x, yTied, { resamples: m, seed: 4 });
    expect(mc.exact).toBe(false);
    expect(mc.p).toBe((mc.count + 1) / (m + 1));
    expect(Math.abs(mc.p - ex.p)).toBeLessThan(4 * Math.sqrt((ex.p * (1 - ex.p)) / m) + 1 / m);
  });
});

describe("correlation permutation test: properties", () => {
  const rng = new Rng(8);
  const x = Array.from({ length: 40 }, () => rng.normal());
  const y = x.map((v) => 0.3 * v + rng.normal());
  it("is invariant to row order, symmetric in x and y, unchanged by increasing transforms of x", () => {
    const a = correlationTest(x, y, { resamples: 3000, seed: 2 });
    const perm = Array.from({ length: 40 }, (_, i) => (i * 13) % 40);
    const b = correlationTest(perm.map((i) => x[i]), perm.map((i) => y[i]), { resamples: 3000, seed: 2 });
    expect(b.count).toBe(a.count);
    expect(b.r).toBeCloseTo(a.r, 14);
    const c = correlationTest(y, x, { resamples: 3000, seed: 2 });
    expect(c.r).toBeCloseTo(a.r, 14);
    expect(Math.abs(c.p - a.p)).toBeLessThan(4 * Math.sqrt((2 * a.p * (1 - a.p)) / 3000) + 1 / 3000);
    const d = correlationTest(x.map((v) => 1000 + 2 * v), y, { resamples: 3000, seed: 2 });
    expect(d.r).toBeCloseTo(a.r, 12);
    expect(d.count).toBe(a.count);
    expect(a.p).toBeGreaterThan(0);
    expect(a.p).toBeLessThanOrEqual(1);
  });

  it("negating x swaps the one-sided directions", () => {
    const small = x.slice(0, 7), sy = y.slice(0, 7);
    const g = correlationTest(small, sy, { direction: "greater", resamples: 6000 });
    const l = correlationTest(small.map((v) => -v), sy, { direction: "less", resamples: 6000 });
    expect(g.exact).toBe(true);
    expect(l.count).toBe(g.count);
    expect(l.r).toBeCloseTo(-g.r, 14);
  });

  it("refuses constant columns, mismatched lengths and non-finite values", () => {
    expect(() => correlationTest([1, 1, 1], [1, 2, 3], {})).toThrow(RangeError);
    expect(() => correlationTest([1, 2, 3], [1, 2], {})).toThrow(RangeError);
    expect(() => correlationTest([1, 2, NaN], [1, 2, 3], {})).toThrow(RangeError);
    expect(() => pearson([1, 2, 3], [5, 5, 5])).toThrow(RangeError);
  });
});
