import { describe, expect, it } from "vitest";
import { Rng, shuffle } from "../../src/random";

describe("seeded generator", () => {
  it("gives the same stream for the same seed and a different one for another seed", () => {
    const a = new Rng(1), b = new Rng(1), c = new Rng(2);
    const xs = Array.from({ length: 5 }, () => a.nextU32());
    expect(Array.from({ length: 5 }, () => b.nextU32())).toEqual(xs);
    expect(Array.from({ length: 5 }, () => c.nextU32())).not.toEqual(xs);
  });

  it("int(n) is unbiased: chi-square goodness of fit over 7 cells (common practice: 5 % critical value 12.59 for 6 df)", () => {
    const rng = new Rng(11);
    const counts = new Array(7).fill(0);
    const m = 70000;
    for (let i = 0; i < m; i++) counts[rng.int(7)]++;
    const e = m / 7;
    const chi2 = counts.reduce((s, c) => s + (c - e) ** 2 / e, 0);
    expect(chi2).toBeLessThan(22.46); // 0.1 % critical value of chi-square(6), handbook table
  });

  it("descendingInts equals successive int() calls bit for bit, including rejection cases", () => {
    for (const first of [2, 3, 7, 100, 1000, 65537, 2000000]) {
      const a = new Rng(5), b = new Rng(5);
      const count = Math.min(first, 3000);
      const out = new Int32Array(count);
      a.descendingInts(out, first, count);
      const ref = Int32Array.from({ length: count }, (_, t) => b.int(first - t));
      expect(out).toEqual(ref);
      expect(a.nextU32()).toBe(b.nextU32());
    }
  });

  it("every permutation of 4 items is equally likely under shuffle (24 cells, chi-square)", () => {
    const rng = new Rng(3);
    const counts = new Map<string, number>();
    const m = 48000;
    for (let i = 0; i < m; i++) {
      const a = Int32Array.from([0, 1, 2, 3]);
      shuffle(a, rng);
      const key = a.join("");
      counts.set(key, (counts.get(key) ?? 0) + 1);
    }
    expect(counts.size).toBe(24);
    const e = m / 24;
    let chi2 = 0;
    for (const c of counts.values()) chi2 += (c - e) ** 2 / e;
    expect(chi2).toBeLessThan(49.73); // 0.1 % critical value of chi-square(23), handbook table
  });
});
