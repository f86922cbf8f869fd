import { describe, expect, it } from "vitest";
import { maxTPairwise, pairwiseComparisons } from "../../src/pairwise";
import { bootstrapDiffInterval } from "../../src/bootstrap";
import { benjaminiHochberg } from "../../src/multiplicity";
import { lettersFromPairwise } from "../../src/letters";
import { encodeGroups } from "../../src/groups";
import { getCase, value } from "../reference";

// PlantGrowth (Dobson 1983), shared reference values (cases.json cases 4 and 8).
const pg = getCase("plantgrowth_oneway");
const pw = getCase("plantgrowth_pairwise_exact_holm");
const weight: number[] = pg.data.weight;
const g = encodeGroups(pg.data.group);

/** Welch-type |t| for two groups. */
function welch(a: number[], b: number[]): number {
  const m = (x: number[]) => x.reduce((s, v) => s + v, 0) / x.length;
  const v = (x: number[]) => x.reduce((s, t) => s + (t - m(x)) ** 2, 0) / (x.length - 1);
  const se = Math.sqrt(v(a) / a.length + v(b) / b.length);
  const d = Math.abs(m(a) - m(b));
  return se > 0 ? d / se : d > 0 ? Infinity : 0;
}

describe("pairwise comparisons on PlantGrowth (cases.json case 8)", () => {
  const rows = pairwiseComparisons(weight, g.codes, g.names, { adjust: "holm", resamples: 200000 });
  const keys = ["ctrl_trt1", "ctrl_trt2", "trt1_trt2"];

  it("exact counts of |difference| ≥ observed out of C(20,10) = 184,756 and their Holm values", () => {
    expect(rows.map((r) => `${r.a}_${r.b}`)).toEqual(keys);
    rows.forEach((r, i) => {
      expect(r.exact).toBe(true);
      expect(Math.round(r.p * 184756)).toBe(value(pw, `${keys[i]}_count_absdiff_ge`));
      expect(r.p).toBeCloseTo(value(pw, `${keys[i]}_p_exact_two_sided`), 12);
      expect(r.pAdjusted).toBeCloseTo(value(pw, `${keys[i]}_p_holm`), 12);
      expect(r.difference).toBeCloseTo(value(pw, `${keys[i]}_mean_diff`), 10);
      expect(r.lower).toBeLessThan(r.difference);
      expect(r.upper).toBeGreaterThan(r.difference);
    });
  });

  it("each row's interval is the two-group bootstrap interval with the same seed", () => {
    const ctrl = weight.slice(0, 10);
    const trt1 = weight.slice(10, 20);
    const ci = bootstrapDiffInterval(ctrl, trt1, "mean", { resamples: 200000, seed: 1 });
    expect([rows[0].lower, rows[0].upper]).toEqual([ci.lower, ci.upper]);
  });

  it("letters: trt2 a, ctrl ab, trt1 b at alpha 0.05 (Holm)", () => {
    const means = [0, 1, 2].map((k) => weight.slice(10 * k, 10 * k + 10).reduce((a, b) => a + b, 0) / 10);
    expect(lettersFromPairwise(g.names, means, rows, 0.05)).toEqual(["ab", "b", "a"]);
  });

  it("'none' and 'bh' adjust the same raw p", () => {
    const none = pairwiseComparisons(weight, g.codes, g.names, { adjust: "none", resamples: 2000 });
    const bh = pairwiseComparisons(weight, g.codes, g.names, { adjust: "bh", resamples: 2000 });
    none.forEach((r) => expect(r.pAdjusted).toBe(r.p));
    const expectBh = benjaminiHochberg(none.map((r) => r.p));
    bh.forEach((r, i) => expect(r.pAdjusted).toBe(expectBh[i]));
  });

  it("max-T adjusted p lies between the raw p and Bonferroni's, with Monte Carlo error", () => {
    const mt = pairwiseComparisons(weight, g.codes, g.names, { adjust: "maxt", resamples: 20000, seed: 3 });
    mt.forEach((r) => {
      expect(r.pAdjusted).toBeGreaterThanOrEqual(r.p);
      expect(r.pAdjusted).toBeLessThanOrEqual(Math.min(1, 3 * r.p) + 0.01);
    });
    // the smallest raw p (trt1 vs trt2, 0.0086) stays significant at 5 %
    expect(mt[2].pAdjusted).toBeLessThan(0.05);
  });
});

describe("max-T step-down (Westfall & Young 1993) against full enumeration", () => {
  const x = [4.1, 5.3, 3.2, 6.8, 7.1, 5.9, 9.4, 8.8, 10.2];
  const labs = [0, 0, 0, 1, 1, 1, 2, 2, 2];

  /** Every assignment of the 9 values to three labelled groups of 3 (1,680), step-down by definition. */
  function bruteMaxT(): number[] {
    const stat = (lab: number[]) => {
      const grp = [0, 1, 2].map((k) => x.filter((_, i) => lab[i] === k));
      return [welch(grp[0], grp[1]), welch(grp[0], grp[2]), welch(grp[1], grp[2])];
    };
    const obs = stat(labs);
    const tables: number[][] = [];
    const cur = new Array(9).fill(-1);
    const rec = (i: number, c: number[]) => {
      if (i === 9) {
        tables.push(stat(cur));
        return;
      }
      for (let k = 0; k < 3; k++) if (c[k] < 3) { c[k]++; cur[i] = k; rec(i + 1, c); c[k]--; }
    };
    rec(0, [0, 0, 0]);
    expect(tables.length).toBe(1680);
    const order = [0, 1, 2].sort((a, b) => obs[b] - obs[a]);
    const out = [0, 0, 0];
    let running = 0;
    order.forEach((h, j) => {
      const rest = order.slice(j);
      const count = tables.filter((t) => Math.max(...rest.map((l) => t[l])) >= obs[h] * (1 - 1e-12)).length;
      running = Math.max(running, count / tables.length);
      out[h] = running;
    });
    return out;
  }

  it("exact max-T equals the brute-force step-down", () => {
    const exact = maxTPairwise(x, labs, 3, { resamples: 5000 });
    const brute = bruteMaxT();
    brute.forEach((v, i) => expect(exact[i]).toBeCloseTo(v, 14));
  });

  it("Monte Carlo max-T agrees with the exact values within its error", () => {
    const exact = maxTPairwise(x, labs, 3, { resamples: 5000 });
    const mc = maxTPairwise(x, labs, 3, { resamples: 1000, seed: 9 });
    exact.forEach((p, i) => expect(Math.abs(mc[i] - p)).toBeLessThan(4 * Math.sqrt((p * (1 - p)) / 1000) + 2 / 1000));
  });

  it("does not depend on row order or group names", () => {
    const a = maxTPairwise(x, labs, 3, { resamples: 5000 });
    const rev = maxTPairwise(x.slice().reverse(), labs.slice().reverse(), 3, { resamples: 5000 });
    expect(Array.from(rev)).toEqual(Array.from(a));
    // rename groups 0→2, 1→0, 2→1: pairs (0,1),(0,2),(1,2) become (2,0),(2,1),(0,1)
    const ren = maxTPairwise(x, labs.map((l) => [2, 0, 1][l]), 3, { resamples: 5000 });
    expect([ren[1], ren[2], ren[0]].map((v) => +v.toFixed(14))).toEqual(Array.from(a).map((v) => +v.toFixed(14)));
  });
});

describe("pairwise properties and errors", () => {
  const vals = [12.1, 13.4, 11.8, 12.9, 15.2, 16.1, 14.7, 15.9, 12.4, 12.0, 13.1, 12.6];
  const labels = ["B", "B", "B", "B", "A", "A", "A", "A", "C", "C", "C", "C"];

  it("rows do not depend on row order; renaming groups flips the sign of the difference only", () => {
    const e = encodeGroups(labels);
    const a = pairwiseComparisons(vals, e.codes, e.names, { resamples: 5000 });
    const e2 = encodeGroups(labels.slice().reverse());
    const b = pairwiseComparisons(vals.slice().reverse(), e2.codes, e2.names, { resamples: 5000 });
    for (const r of a) {
      const s = b.find((t) => (t.a === r.a && t.b === r.b) || (t.a === r.b && t.b === r.a))!;
      const sign = s.a === r.a ? 1 : -1;
      expect(s.difference).toBeCloseTo(sign * r.difference, 12);
      expect(s.p).toBe(r.p);
      expect(s.pAdjusted).toBe(r.pAdjusted);
      expect(s.exact).toBe(true);
      expect(r.p).toBeGreaterThan(0);
      expect(r.p).toBeLessThanOrEqual(1);
    }
  });

  it("clear errors for tiny groups, a single group, unknown adjustment", () => {
    expect(() => pairwiseComparisons([1, 2, 3, 4, 5], [0, 0, 0, 1, 1], ["x", "y"])).toThrow(/at least 3/);
    expect(() => pairwiseComparisons([1, 2, 3], [0, 0, 0], ["x"])).toThrow(/at least 2 groups/);
    expect(() => pairwiseComparisons(vals, encodeGroups(labels).codes, ["A", "B", "C"], { adjust: "tukey" as any })).toThrow(/unknown adjustment/);
  });
});
