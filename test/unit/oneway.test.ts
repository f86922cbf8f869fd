import { describe, expect, it } from "vitest";
import { encodeGroups } from "../../src/groups";
import { OneWayF, permutationF } from "../../src/oneway";
import { getCase, expected, value } from "../reference";

// PlantGrowth: Dobson (1983), An Introduction to Statistical Modelling, Table 7.1;
// reference values from two general-purpose reference libraries (shared cases.json, case 4).
const pg = getCase("plantgrowth_oneway");
const weight: number[] = pg.data.weight;
const g = encodeGroups(pg.data.group);

describe("one-way F (PlantGrowth, Dobson 1983)", () => {
  it("matches the published F = 4.846", () => {
    const f = new OneWayF(weight, g.codes, 3).f(g.codes);
    expect(f).toBeCloseTo(value(pg, "F"), 9);
    expect(Math.abs(f / value(pg, "F") - 1)).toBeLessThan(1e-9);
  });

  it("Monte Carlo permutation p is within the reference band", () => {
    const e = expected(pg, "perm_F_p_reference");
    const r = permutationF(weight, g.codes, 3, { resamples: 99999, seed: 1 });
    expect(r.exact).toBe(false);
    expect(Math.abs(r.p - e.value)).toBeLessThan(e.tolerance.abs);
    expect(r.mcInterval![0]).toBeLessThan(r.p);
    expect(r.mcInterval![1]).toBeGreaterThan(r.p);
  });

  it("is the same for the same seed and invariant to row order and group names", () => {
    const a = permutationF(weight, g.codes, 3, { resamples: 2000, seed: 7 });
    const b = permutationF(weight, g.codes, 3, { resamples: 2000, seed: 7 });
    expect(a.p).toBe(b.p);
    // Row order: reversing rows gives the same observed F and an exact result identical in law;
    // for small designs the exact p must match bit for bit.
    const small = weight.slice(0, 4).concat(weight.slice(10, 14), weight.slice(20, 23));
    const labs = [0, 0, 0, 0, 1, 1, 1, 1, 2, 2, 2];
    const ex1 = permutationF(small, labs, 3, { resamples: 20000 });
    const ex2 = permutationF(small.slice().reverse(), labs.slice().reverse(), 3, { resamples: 20000 });
    const renamed = labs.map((l) => (l + 1) % 3);
    const ex3 = permutationF(small, renamed, 3, { resamples: 20000 });
    expect(ex1.exact).toBe(true);
    expect(ex1.resamples).toBe(11550); // 11! / (4! 4! 3!)
    expect(ex2.p).toBe(ex1.p);
    expect(ex3.p).toBe(ex1.p);
    expect(ex1.p).toBeGreaterThan(0);
    expect(ex1.p).toBeLessThanOrEqual(1);
  });

  it("exact enumeration agrees with a brute-force recount and with Monte Carlo within its error", () => {
    const x = [3.1, 4.2, 2.2, 5.9, 6.1, 4.4, 7.0, 8.1, 5.5];
    const labs = [0, 0, 0, 1, 1, 1, 2, 2, 2];
    const ex = permutationF(x, labs, 3, { resamples: 5000, keepNull: true });
    expect(ex.exact).toBe(true);
    expect(ex.resamples).toBe(1680);
    // Brute force: every assignment of 9 items to 3 labelled groups of 3.
    const lay = new OneWayF(x, labs, 3);
    const fObs = lay.f(labs);
    let count = 0, total = 0;
    const cur = new Array(9).fill(-1);
    const rec = (i: number, c: number[]) => {
      if (i === 9) {
        total++;
        if (lay.f(cur) >= fObs * (1 - 1e-12)) count++;
        return;
      }
      for (let gg = 0; gg < 3; gg++) if (c[gg] < 3) { c[gg]++; cur[i] = gg; rec(i + 1, c); c[gg]--; }
    };
    rec(0, [0, 0, 0]);
    expect(total).toBe(1680);
    expect(ex.p).toBe(count / total);
    const mc = permutationF(x, labs, 3, { resamples: 1000, seed: 3 });
    expect(mc.exact).toBe(false);
    const se = Math.sqrt((ex.p * (1 - ex.p)) / 1000);
    expect(Math.abs(mc.p - ex.p)).toBeLessThan(4 * se + 1 / 1000);
  });
});

describe("one-way F far from zero", () => {
  it("a shift of the data by 10^6 leaves the exact count unchanged (location invariance of F)", () => {
    const x = [3.1, 4.2, 2.2, 5.9, 6.1, 4.4, 7.0, 8.1, 5.5];
    const labs = [0, 0, 0, 1, 1, 1, 2, 2, 2];
    const a = permutationF(x, labs, 3, { resamples: 5000 });
    const b = permutationF(x.map((v) => v + 1e6), labs, 3, { resamples: 5000 });
    expect(b.exact).toBe(true);
    expect(b.count).toBe(a.count);
    expect(b.f).toBeCloseTo(a.f, 6);
  });
});

describe("one-way F Monte Carlo is reproducible whatever the row order or group names", () => {
  // Property (design rule: invariance to row order and label names), on PlantGrowth (Dobson 1983)
  // with equal groups, and on an unequal-size subset of it.
  const perm = (n: number, seed: number) => {
    const idx = Array.from({ length: n }, (_, i) => i);
    let s = seed;
    for (let i = n - 1; i > 0; i--) {
      s = (s * 1103515245 + 12345) % 2147483648;
      const j = s % (i + 1);
      [idx[i], idx[j]] = [idx[j], idx[i]];
    }
    return idx;
  };
  it("gives bit-identical p for reordered rows and renamed groups", () => {
    const cases = [
      { x: weight, labels: pg.data.group as string[] },
      { x: weight.slice(0, 25), labels: (pg.data.group as string[]).slice(0, 25) },
    ];
    for (const { x, labels } of cases) {
      const ref = encodeGroups(labels);
      const a = permutationF(x, ref.codes, ref.names.length, { resamples: 4999, seed: 9 });
      expect(a.exact).toBe(false);
      for (const seed of [1, 2, 3]) {
        const order = perm(x.length, seed);
        const renamed = encodeGroups(order.map((i) => `line ${labels[i]}`));
        const b = permutationF(order.map((i) => x[i]), renamed.codes, renamed.names.length, { resamples: 4999, seed: 9 });
        expect(b.count).toBe(a.count);
        expect(b.p).toBe(a.p);
      }
    }
  });
});
