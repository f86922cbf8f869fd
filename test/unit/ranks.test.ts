import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { hasTies, midranks, sortedCopy, tieGroups, tieGroupsSorted, tieSum, tieSumSorted } from "../../src/ranks";
import { getCase } from "../reference";
import { bruteMidranks, permutationOf } from "./check";

describe("mid-ranks", () => {
  it("gives the rank sum 90 for the first sample of the chorioamnion example (Hollander & Wolfe 1973, p. 69f)", () => {
    // shared reference values (cases.json, case 5): rank sum of x = 90, W = U = 35.
    const c = getCase("hollander_wolfe_rank_tests");
    const x: number[] = c.data.ranksum.x_term;
    const y: number[] = c.data.ranksum.y_12_26_weeks;
    const r = midranks(x.concat(y));
    let w = 0;
    for (let i = 0; i < x.length; i++) w += r[i];
    expect(w).toBe(90);
    expect(w - (x.length * (x.length + 1)) / 2).toBe(35);
  });

  it("averages the one tie of PlantGrowth (4.17 twice; Dobson 1983)", () => {
    const c = getCase("plantgrowth_oneway");
    const wt: number[] = c.data.weight;
    const r = midranks(wt);
    const at = wt.map((v, i) => (v === 4.17 ? i : -1)).filter((i) => i >= 0);
    expect(at.length).toBe(2);
    // 4.17 is preceded by 3.59 and 3.83 only, so the pair takes ranks 3 and 4 → 3.5 each.
    expect(r[at[0]]).toBe(3.5);
    expect(r[at[1]]).toBe(3.5);
    expect(tieGroups(wt)).toEqual([2]);
    expect(tieSum(wt)).toBe(6);
  });

  it("equals the O(n²) definition on data with many ties", () => {
    fc.assert(
      fc.property(fc.array(fc.integer({ min: -5, max: 5 }), { minLength: 0, maxLength: 60 }), (ints) => {
        const x = ints.map((v) => v / 4);
        expect(Array.from(midranks(x))).toEqual(bruteMidranks(x));
      }),
      { numRuns: 300 },
    );
  });

  it("sums to n(n+1)/2, follows the rows when they are reordered, and ignores monotone rescaling", () => {
    const x = [3.2, 1.1, 3.2, 7, -2, 1.1, 1.1, 0, 9.5, 3.2, -0.0, 0];
    const n = x.length;
    const r = midranks(x);
    expect(r.reduce((a, b) => a + b, 0)).toBe((n * (n + 1)) / 2);
    const p = permutationOf(n, 11);
    const rp = midranks(p.map((i) => x[i]));
    p.forEach((i, j) => expect(rp[j]).toBe(r[i]));
    const scaled = midranks(x.map((v) => Math.exp(v / 3) * 100 + 7));
    expect(Array.from(scaled)).toEqual(Array.from(r));
    // −0 and +0 are one value.
    expect(r[x.indexOf(0)]).toBe(r[10]);
  });

  it("ranks infinities and rejects NaN", () => {
    expect(Array.from(midranks([Infinity, -Infinity, 1, Infinity]))).toEqual([3.5, 1, 2, 3.5]);
    expect(() => midranks([1, NaN])).toThrow(RangeError);
    expect(midranks([]).length).toBe(0);
  });
});

describe("tie counts", () => {
  it("agree with a brute-force count of equal pairs: Σ t(t−1)/2 pairs and Σ(t³−t)", () => {
    fc.assert(
      fc.property(fc.array(fc.integer({ min: 0, max: 6 }), { maxLength: 40 }), (x) => {
        let pairs = 0;
        for (let i = 0; i < x.length; i++) for (let j = i + 1; j < x.length; j++) if (x[i] === x[j]) pairs++;
        const groups = tieGroups(x);
        expect(groups.reduce((a, t) => a + (t * (t - 1)) / 2, 0)).toBe(pairs);
        const counts = new Map<number, number>();
        for (const v of x) counts.set(v, (counts.get(v) ?? 0) + 1);
        let s = 0;
        for (const t of counts.values()) s += t * t * t - t;
        expect(tieSum(x)).toBe(s);
        expect(tieSumSorted(sortedCopy(x))).toBe(s);
        expect(tieGroupsSorted(sortedCopy(x))).toEqual(groups);
        expect(hasTies(x)).toBe(pairs > 0);
      }),
      { numRuns: 200 },
    );
  });
});
