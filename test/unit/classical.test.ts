import { describe, expect, it } from "vitest";
import { anovaF, levene, pairedT, studentT, welchAnova, welchT } from "../../src/classical";
import { encodeGroups } from "../../src/groups";
import { getCase, value } from "../reference";
import { expectReference, permutationOf } from "./check";

// PlantGrowth: Dobson (1983), Table 7.1 — shared reference values (cases.json, cases 4 and 8).
const pg = getCase("plantgrowth_oneway");
const weight: number[] = pg.data.weight;
const groups = encodeGroups(pg.data.group);
const pairs = getCase("plantgrowth_pairwise_exact_holm");

// Darwin's Zea mays, Fisher (1935) §17 (case 1); mouse survival, Efron & Tibshirani (1993) Table 2.1 (case 2).
const dz = getCase("darwin_zea_mays");
const darwin: number[] = dz.data.d_cross_minus_self_eighths_inch;

/** Brute-force one-way F from pairwise squared differences: SS_within = Σ_g Σ_{i<j in g} (x_i − x_j)² / n_g. */
function bruteF(x: number[], codes: ArrayLike<number>, k: number): number {
  const n = x.length;
  const pairSS = (idx: number[]) => {
    let s = 0;
    for (let a = 0; a < idx.length; a++) for (let b = a + 1; b < idx.length; b++) s += (x[idx[a]] - x[idx[b]]) ** 2;
    return s / idx.length;
  };
  const all = Array.from({ length: n }, (_, i) => i);
  const sst = pairSS(all);
  let ssw = 0;
  for (let g = 0; g < k; g++) ssw += pairSS(all.filter((i) => codes[i] === g));
  return ((sst - ssw) / (k - 1)) / (ssw / (n - k));
}

function groupValues(g: number): number[] {
  return weight.filter((_, i) => groups.codes[i] === g);
}

describe("one-way ANOVA and Welch's ANOVA", () => {
  it("PlantGrowth (Dobson 1983): F = 4.846 on (2, 27), p = 0.0159", () => {
    const r = anovaF(weight, groups.codes, 3);
    expectReference(r.f, pg, "F");
    expectReference(r.p, pg, "F_p");
    expect([r.df1, r.df2]).toEqual(value(pg, "F_df"));
  });

  it("PlantGrowth: Welch (1951) F = 5.181 on (2, 17.128), p = 0.0174", () => {
    const r = welchAnova(weight, groups.codes, 3);
    expectReference(r.f, pg, "welch_F");
    const [df1, df2] = value(pg, "welch_df");
    expect(r.df1).toBe(df1);
    expect(Math.abs(r.df2 / df2 - 1)).toBeLessThan(1e-9);
    expectReference(r.p, pg, "welch_p");
  });

  it("F equals the pairwise-difference form of the sums of squares (brute force)", () => {
    const r = anovaF(weight, groups.codes, 3);
    expect(Math.abs(r.f / bruteF(weight, groups.codes, 3) - 1)).toBeLessThan(1e-11);
  });

  it("with two groups, F = Student t² and Welch F = Welch t² with the same df (exact identities)", () => {
    const x = groupValues(0);
    const y = groupValues(2);
    const codes = x.map(() => 0).concat(y.map(() => 1));
    const f = anovaF(x.concat(y), codes, 2);
    const t = studentT(x, y);
    expect(Math.abs(f.f / t.t ** 2 - 1)).toBeLessThan(1e-12);
    expect(Math.abs(f.p / t.p - 1)).toBeLessThan(1e-10);
    const wf = welchAnova(x.concat(y), codes, 2);
    const wt = welchT(x, y);
    expect(Math.abs(wf.f / wt.t ** 2 - 1)).toBeLessThan(1e-12);
    expect(Math.abs(wf.df2 / wt.df - 1)).toBeLessThan(1e-12);
    expect(Math.abs(wf.p / wt.p - 1)).toBeLessThan(1e-10);
  });

  it("is invariant to row order and group names; degenerate inputs are RangeErrors", () => {
    const base = anovaF(weight, groups.codes, 3);
    const p = permutationOf(weight.length, 7);
    const reordered = anovaF(p.map((i) => weight[i]), p.map((i) => (groups.codes[i] + 1) % 3), 3);
    expect(Math.abs(reordered.f / base.f - 1)).toBeLessThan(1e-12);
    const wBase = welchAnova(weight, groups.codes, 3);
    const wRe = welchAnova(p.map((i) => weight[i]), p.map((i) => (groups.codes[i] + 2) % 3), 3);
    expect(Math.abs(wRe.f / wBase.f - 1)).toBeLessThan(1e-12);
    expect(() => anovaF([1, 1, 1, 1], [0, 0, 1, 1], 2)).toThrow(RangeError);
    expect(anovaF([1, 1, 2, 2], [0, 0, 1, 1], 2)).toEqual({ f: Infinity, df1: 1, df2: 2, p: 0 });
    expect(() => welchAnova([1, 2, 3], [0, 0, 1], 2)).toThrow(/single value/);
    expect(() => welchAnova([1, 1, 2, 3], [0, 0, 1, 1], 2)).toThrow(/no spread/);
  });
});

describe("Levene and Brown–Forsythe tests of equal spread", () => {
  it("PlantGrowth: median-centred W = 1.1192 (Brown & Forsythe 1974), p = 0.341", () => {
    const r = levene(weight, groups.codes, 3, "median");
    expectReference(r.w, pg, "brown_forsythe_W");
    expectReference(r.p, pg, "brown_forsythe_p");
    expect([r.df1, r.df2]).toEqual([2, 27]);
  });

  it("PlantGrowth: mean-centred W (Levene 1960) and p", () => {
    const r = levene(weight, groups.codes, 3, "mean");
    expectReference(r.w, pg, "levene_mean_W");
    expectReference(r.p, pg, "levene_mean_p");
  });

  it("equals the ANOVA F of absolute deviations computed by hand", () => {
    const med = (a: number[]) => {
      const s = a.slice().sort((x, y) => x - y);
      return s.length % 2 ? s[(s.length - 1) / 2] : (s[s.length / 2 - 1] + s[s.length / 2]) / 2;
    };
    const centres = [0, 1, 2].map((g) => med(groupValues(g)));
    const z = weight.map((v, i) => Math.abs(v - centres[groups.codes[i]]));
    expect(Math.abs(levene(weight, groups.codes, 3, "median").w / bruteF(z, groups.codes, 3) - 1)).toBeLessThan(1e-11);
    expect(() => levene([1, 1, 2, 2], [0, 0, 1, 1], 2)).toThrow(RangeError);
  });
});

describe("two-sample and paired t", () => {
  for (const id of ["mouse_two_sample", "mouse_two_sample_variant_50_31"]) {
    it(`mouse survival (Efron & Tibshirani 1993; ${id}): Student and Welch t with both directions`, () => {
      const c = getCase(id);
      const s = studentT(c.data.treatment, c.data.control);
      expectReference(s.t, c, "student_t");
      expectReference(s.df, c, "student_df");
      expectReference(s.p, c, "student_p_two_sided");
      expectReference(studentT(c.data.treatment, c.data.control, "greater").p, c, "student_p_greater");
      const w = welchT(c.data.treatment, c.data.control);
      expectReference(w.t, c, "welch_t");
      expectReference(w.p, c, "welch_p_two_sided");
      expectReference(welchT(c.data.treatment, c.data.control, "greater").p, c, "welch_p_greater");
      // direction "less" is the complement of "greater" for a continuous t
      expect(Math.abs(welchT(c.data.treatment, c.data.control, "less").p + welchT(c.data.treatment, c.data.control, "greater").p - 1)).toBeLessThan(1e-14);
    });
  }

  it("PlantGrowth pairs: Welch two-sided p for each pair (shared reference values, case 8)", () => {
    const names = ["ctrl", "trt1", "trt2"];
    for (const [a, b] of [[0, 1], [0, 2], [1, 2]]) {
      const r = welchT(groupValues(a), groupValues(b));
      expectReference(r.p, pairs, `${names[a]}_${names[b]}_welch_p_for_context`);
    }
  });

  it("Darwin's Zea mays (Fisher 1935): paired t = 2.148 on 14 df, p two-sided and greater", () => {
    const zeros = darwin.map(() => 0);
    const r = pairedT(darwin, zeros);
    expectReference(r.t, dz, "t_paired");
    expectReference(r.df, dz, "t_df");
    expectReference(r.p, dz, "t_p_two_sided");
    expectReference(pairedT(darwin, zeros, "greater").p, dz, "t_p_greater");
    expect(r.meanDifference).toBeCloseTo(value(dz, "sum_d") / 15, 12);
    // The same differences split into two columns give the same paired t.
    const y = darwin.map((_, i) => 100 + i);
    const x = darwin.map((d, i) => d + y[i]);
    expect(Math.abs(pairedT(x, y).t / r.t - 1)).toBeLessThan(1e-12);
  });

  it("is invariant to the order of observations; degenerate inputs are RangeErrors", () => {
    const c = getCase("mouse_two_sample");
    const t = c.data.treatment as number[];
    const p = permutationOf(t.length, 3);
    expect(Math.abs(studentT(p.map((i) => t[i]), c.data.control).t / studentT(t, c.data.control).t - 1)).toBeLessThan(1e-12);
    expect(() => studentT([1], [1])).toThrow(RangeError);
    expect(() => welchT([1], [1, 2])).toThrow(RangeError);
    expect(() => pairedT([1, 2], [1])).toThrow(RangeError);
    expect(() => pairedT([2, 3], [1, 2])).toThrow(RangeError);
  });
});
