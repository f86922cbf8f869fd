import { describe, expect, it } from "vitest";
import { dispersionTest, permanova, permanovaFromDistances } from "../../src/multivariate";
import { encodeGroups } from "../../src/groups";
import { Rng } from "../../src/random";
import { getCase, value } from "../reference";

// PlantGrowth (Dobson 1983), shared reference values (cases.json case 4).
const pg = getCase("plantgrowth_oneway");
const weight: number[] = pg.data.weight;
const g = encodeGroups(pg.data.group);

/** Pseudo-F by its definition on a distance function (Anderson 2001, eqs. 1–3), O(n²). */
function pseudoFByDefinition(rows: number[][], labels: number[], k: number, dist: (a: number[], b: number[]) => number): number {
  const n = rows.length;
  const sizes = new Array(k).fill(0);
  labels.forEach((l) => sizes[l]++);
  let sst = 0;
  let ssw = 0;
  for (let i = 0; i < n; i++)
    for (let j = i + 1; j < n; j++) {
      const d2 = dist(rows[i], rows[j]) ** 2;
      sst += d2 / n;
      if (labels[i] === labels[j]) ssw += d2 / sizes[labels[i]];
    }
  return (sst - ssw) / (k - 1) / (ssw / (n - k));
}
const euclid = (a: number[], b: number[]) => Math.sqrt(a.reduce((s, v, t) => s + (v - b[t]) ** 2, 0));
const manhattan = (a: number[], b: number[]) => a.reduce((s, v, t) => s + Math.abs(v - b[t]), 0);

function traitsData(seed: number, n: number[], shift: number[][], spread: number[]) {
  const rng = new Rng(seed);
  const cols: number[][] = [[], [], []];
  const labels: number[] = [];
  n.forEach((size, grp) => {
    for (let i = 0; i < size; i++) {
      const z = rng.normal();
      cols[0].push(10 + shift[grp][0] + spread[grp] * (z + 0.3 * rng.normal()));
      cols[1].push(100 + shift[grp][1] + 20 * spread[grp] * (0.5 * z + rng.normal()));
      cols[2].push(Math.exp(0.3 * rng.normal()) * spread[grp] + shift[grp][2]);
      labels.push(grp);
    }
  });
  return { cols, labels, rows: labels.map((_, i) => cols.map((c) => c[i])) };
}

describe("PERMANOVA pseudo-F (Anderson 2001)", () => {
  it("with one trait and Euclidean distance equals the one-way F of PlantGrowth, 4.846087862380136", () => {
    for (const scale of ["none", "standardize"] as const) {
      const r = permanova([weight], g.codes, 3, { scale, resamples: 999 });
      expect(Math.abs(r.pseudoF / value(pg, "F") - 1)).toBeLessThan(1e-9);
      expect(r.statistic).toBe(r.pseudoF);
      expect(r.r2).toBeCloseTo((2 * value(pg, "F")) / (2 * value(pg, "F") + 27), 12); // = η²
    }
    // Manhattan on one trait is |xᵢ − xⱼ|, the same squared distances
    const m = permanova([weight], g.codes, 3, { distance: "manhattan", resamples: 999 });
    expect(Math.abs(m.pseudoF / value(pg, "F") - 1)).toBeLessThan(1e-9);
  });

  it("Monte Carlo p of the one-trait case is within the reference band of the permutation F (cases.json case 4)", () => {
    const e = getCase("plantgrowth_oneway").expected.find((x) => x.name === "perm_F_p_reference")!;
    const r = permanova([weight], g.codes, 3, { resamples: 99999, seed: 2 });
    expect(r.exact).toBe(false);
    expect(Math.abs(r.p - e.value)).toBeLessThan(e.tolerance.abs);
  });

  it("equals its O(n²) definition for several standardized traits, Euclidean and Manhattan", () => {
    const d = traitsData(1, [7, 9, 6], [[0, 0, 0], [1, 10, 0.2], [0.5, -5, 0.5]], [1, 1.2, 0.8]);
    const std = d.cols.map((c) => {
      const m = c.reduce((a, b) => a + b, 0) / c.length;
      const s = Math.sqrt(c.reduce((a, b) => a + (b - m) ** 2, 0) / (c.length - 1));
      return c.map((v) => (v - m) / s);
    });
    const rows = d.labels.map((_, i) => std.map((c) => c[i]));
    const e = permanova(d.cols, d.labels, 3, { resamples: 999 });
    expect(e.pseudoF).toBeCloseTo(pseudoFByDefinition(rows, d.labels, 3, euclid), 10);
    const m = permanova(d.cols, d.labels, 3, { distance: "manhattan", resamples: 999 });
    expect(m.pseudoF).toBeCloseTo(pseudoFByDefinition(rows, d.labels, 3, manhattan), 10);
    const raw = permanova(d.cols, d.labels, 3, { scale: "none", resamples: 999 });
    expect(raw.pseudoF).toBeCloseTo(pseudoFByDefinition(d.rows, d.labels, 3, euclid), 10);
  });

  it("exact p equals a brute-force count over all 560 labellings, on both computing paths", () => {
    const d = traitsData(4, [3, 3, 2], [[0, 0, 0], [1.5, 20, 0.5], [0.5, 0, 1]], [1, 1, 1]);
    const n = 8;
    const obs = pseudoFByDefinition(d.rows, d.labels, 3, manhattan);
    let count = 0;
    let total = 0;
    const cur = new Array(n).fill(-1);
    const cap = [3, 3, 2];
    const rec = (i: number, c: number[]) => {
      if (i === n) {
        total++;
        if (pseudoFByDefinition(d.rows, cur, 3, manhattan) >= obs * (1 - 1e-9)) count++;
        return;
      }
      for (let k = 0; k < 3; k++) if (c[k] < cap[k]) { c[k]++; cur[i] = k; rec(i + 1, c); c[k]--; }
    };
    rec(0, [0, 0, 0]);
    expect(total).toBe(560);
    const r = permanova(d.cols, d.labels, 3, { scale: "none", distance: "manhattan", resamples: 1000 });
    expect(r.exact).toBe(true);
    expect(r.resamples).toBe(560);
    expect(r.p).toBe(count / total);
    // Euclidean: fast group-sum path = generic distance-matrix path
    const sq = new Float64Array(n * n);
    for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) sq[i * n + j] = euclid(d.rows[i], d.rows[j]) ** 2;
    const fast = permanova(d.cols, d.labels, 3, { scale: "none", resamples: 1000 });
    const generic = permanovaFromDistances(sq, d.labels, 3, { resamples: 1000 });
    expect(fast.pseudoF).toBeCloseTo(generic.pseudoF, 10);
    expect(fast.p).toBe(generic.p);
  });

  it("does not depend on row order or group names; keeps the null distribution on request", () => {
    const d = traitsData(5, [3, 3, 3], [[0, 0, 0], [1, 0, 0], [0, 10, 0]], [1, 1, 1]);
    const a = permanova(d.cols, d.labels, 3, { resamples: 2000, keepNull: true });
    expect(a.exact).toBe(true);
    const rev = permanova(d.cols.map((c) => c.slice().reverse()), d.labels.slice().reverse(), 3, { resamples: 2000 });
    const ren = permanova(d.cols, d.labels.map((l) => (l + 1) % 3), 3, { resamples: 2000 });
    expect(rev.p).toBe(a.p);
    expect(ren.p).toBe(a.p);
    expect(rev.pseudoF).toBeCloseTo(a.pseudoF, 10);
    expect(a.nullDistribution!.length).toBe(1680);
    expect(a.nullDistribution!.filter((f) => f >= a.pseudoF * (1 - 1e-12)).length).toBe(a.count);
  });

  it("refuses mismatched columns and constant data", () => {
    expect(() => permanova([[1, 2, 3], [1, 2]], [0, 0, 1], 2)).toThrow(/trait column 2/);
    expect(() => permanova([[2, 2, 2, 2]], [0, 0, 1, 1], 2)).toThrow(/identical/);
    expect(() => permanova([[1, 2, 3, 4]], [0, 0, 1, 1], 2, { distance: "cosine" as any })).toThrow(/unknown distance/);
  });
});

describe("dispersion test (Anderson 2006)", () => {
  it("with one trait is Levene's F (mean-centred) and the Brown–Forsythe F (median-centred) of PlantGrowth (cases.json case 4)", () => {
    const lev = dispersionTest([weight], g.codes, 3, { scale: "none", resamples: 999 });
    expect(lev.f).toBeCloseTo(value(pg, "levene_mean_W"), 9);
    const std = dispersionTest([weight], g.codes, 3, { resamples: 999 });
    expect(std.f).toBeCloseTo(value(pg, "levene_mean_W"), 9);
    const bf = dispersionTest([weight], g.codes, 3, { scale: "none", distance: "manhattan", resamples: 999 });
    expect(bf.f).toBeCloseTo(value(pg, "brown_forsythe_W"), 9);
    // mean distance to the centre per group: mean |x − group mean|
    const ctrl = weight.slice(0, 10);
    const m = ctrl.reduce((a, b) => a + b, 0) / 10;
    expect(lev.meanDistance[0]).toBeCloseTo(ctrl.reduce((a, b) => a + Math.abs(b - m), 0) / 10, 12);
    expect(lev.p).toBeGreaterThan(0.1);
  });

  it("tells a shift in location from a difference in spread", () => {
    const shift = traitsData(7, [25, 25, 25], [[0, 0, 0], [2, 30, 1], [4, 60, 2]], [1, 1, 1]);
    const spread = traitsData(8, [25, 25, 25], [[0, 0, 0], [0, 0, 0], [0, 0, 0]], [1, 3, 6]);
    const opts = { resamples: 1999, seed: 1 };
    const locShift = permanova(shift.cols, shift.labels, 3, opts);
    const dispShift = dispersionTest(shift.cols, shift.labels, 3, opts);
    const dispSpread = dispersionTest(spread.cols, spread.labels, 3, opts);
    expect(locShift.p).toBeLessThan(0.001);
    expect(dispShift.p).toBeGreaterThan(0.05);
    expect(dispSpread.p).toBeLessThan(0.001);
    expect(dispSpread.meanDistance[2]).toBeGreaterThan(dispSpread.meanDistance[0]);
  });

  it("refuses data where every point is equally far from its centre", () => {
    expect(() => dispersionTest([[1, 3, 5, 7]], [0, 0, 1, 1], 2, { scale: "none" })).toThrow(/equally far/);
  });
});
