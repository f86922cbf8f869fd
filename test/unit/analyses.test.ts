/**
 * The panel's analyses (src/analysis): each composed result checked against shared
 * reference values (cases.json: Dobson 1983 PlantGrowth; Yates 1935 npk; Fisher 1935 on
 * Darwin's Zea mays; Hollander & Wolfe 1973; Efron & Tibshirani 1993 mouse data),
 * against brute-force enumeration inside the test, against the sheet functions (the
 * same engine calls, so live cells agree with the panel), and for properties: row
 * order and label names do not matter, p lies in (0, 1], cancel stops the run.
 */
import { describe, expect, it } from "vitest";
import { jStat } from "jstat";
import { sheetFunctions } from "../../functions/registry";
import { analyseAssociation } from "../../src/analysis/association";
import { analyseGroups } from "../../src/analysis/groups";
import { analysePaired } from "../../src/analysis/paired";
import { analysePrecision } from "../../src/analysis/precision";
import { analyseTraits } from "../../src/analysis/traits";
import { runAnalysis } from "../../src/analysis/run";
import { AnalysisOptions, DEFAULT_OPTIONS, GroupsRequest } from "../../src/analysis/types";
import { encodeGroups } from "../../src/groups";
import { permutationF } from "../../src/oneway";
import { CancelledError } from "../../src/permutation";
import { Rng, shuffle } from "../../src/random";
import { expected, getCase, value } from "../reference";

const opts = (o: Partial<AnalysisOptions> = {}): AnalysisOptions => ({ ...DEFAULT_OPTIONS, ...o });
const rel = (a: number, b: number) => Math.abs(a - b) / Math.max(1e-300, Math.abs(b));

function plantGrowth(): { values: Float64Array; labels: string[] } {
  const c = getCase("plantgrowth_oneway");
  return { values: Float64Array.from(c.data.weight as number[]), labels: c.data.group as string[] };
}

function groupsReq(values: ArrayLike<number>, labels: ArrayLike<unknown>, o: Partial<AnalysisOptions> = {}, blocks: ArrayLike<unknown> | null = null): GroupsRequest {
  const g = encodeGroups(labels);
  const b = blocks ? encodeGroups(blocks) : null;
  return { question: "groups", values: Float64Array.from(values), codes: g.codes, names: g.names, blocks: b ? { codes: b.codes, names: b.names } : null, primary: "F", options: opts(o) };
}

describe("do groups differ — PlantGrowth (Dobson 1983, shared reference values cases.json)", () => {
  const { values, labels } = plantGrowth();
  const r = analyseGroups(groupsReq(values, labels, { resamples: 200000 }));

  it("gives the classical F, Welch F and Kruskal–Wallis H of the reference", () => {
    const c = getCase("plantgrowth_oneway");
    expect(rel(r.classicalF.statistic, value(c, "F"))).toBeLessThan(1e-9);
    expect(rel(r.classicalF.p, value(c, "F_p"))).toBeLessThan(1e-6);
    expect([r.classicalF.df1, r.classicalF.df2]).toEqual(value(c, "F_df"));
    expect(rel(r.welch!.statistic, value(c, "welch_F"))).toBeLessThan(1e-9);
    expect(rel(r.welch!.p, value(c, "welch_p"))).toBeLessThan(1e-6);
    expect(rel(r.rankClassical!.statistic, value(c, "kruskal_H_tie_corrected"))).toBeLessThan(1e-9);
    expect(rel(r.rankClassical!.p, value(c, "kruskal_p"))).toBeLessThan(1e-6);
    expect(rel(r.snr!.statistic, value(c, "D_snr"))).toBeLessThan(1e-9);
  });

  it("gives Monte Carlo permutation p within the reference bands", () => {
    const c = getCase("plantgrowth_oneway");
    const fRef = expected(c, "perm_F_p_reference");
    const dRef = expected(c, "D_perm_p_reference");
    // Band for 200,000 resamples: 4 binomial standard errors (common practice).
    const band = (p: number) => 4 * Math.sqrt((p * (1 - p)) / 200000);
    expect(Math.abs(r.f.p - fRef.value)).toBeLessThan(band(fRef.value));
    expect(Math.abs(r.snr!.p - dRef.value)).toBeLessThan(band(dRef.value));
    expect(r.f.exact).toBe(false);
    expect(r.f.mcInterval![0]).toBeLessThan(r.f.p);
  });

  it("gives the exact pairwise permutation p and Holm adjustment of the reference", () => {
    const c = getCase("plantgrowth_pairwise_exact_holm");
    const find = (a: string, b: string) => r.pairwise.find((p) => p.a === a && p.b === b)!;
    for (const [a, b] of [["ctrl", "trt1"], ["ctrl", "trt2"], ["trt1", "trt2"]]) {
      const row = find(a, b);
      expect(row.exact).toBe(true);
      expect(Math.abs(row.p - value(c, `${a}_${b}_p_exact_two_sided`))).toBeLessThan(1e-12);
      expect(Math.abs(row.pAdjusted - value(c, `${a}_${b}_p_holm`))).toBeLessThan(1e-12);
      expect(rel(row.difference, value(c, `${a}_${b}_mean_diff`))).toBeLessThan(1e-9);
    }
    // Only trt1–trt2 is clear at 0.05 after Holm: trt2 and trt1 share no letter.
    const L = Object.fromEntries(r.names.map((n, i) => [n, r.letters[i]]));
    expect([...L.trt1].some((ch) => L.trt2.includes(ch))).toBe(false);
    expect([...L.ctrl].some((ch) => L.trt1.includes(ch))).toBe(true);
  });

  it("has effect sizes that agree with their definitions (brute force)", () => {
    // eta² = SSB/SST by hand
    const mean = values.reduce((a, b) => a + b, 0) / values.length;
    const g = encodeGroups(labels);
    let sst = 0, ssb = 0;
    values.forEach((v) => (sst += (v - mean) ** 2));
    for (let k = 0; k < 3; k++) {
      const xs = values.filter((_, i) => g.codes[i] === k);
      const m = xs.reduce((a, b) => a + b, 0) / xs.length;
      ssb += xs.length * (m - mean) ** 2;
    }
    expect(rel(r.effects.etaSquared, ssb / sst)).toBeLessThan(1e-12);
    // Cliff's delta of ctrl vs trt1 over all 100 pairs
    const a = values.filter((_, i) => labels[i] === "ctrl");
    const b = values.filter((_, i) => labels[i] === "trt1");
    let d = 0;
    for (const x of a) for (const y of b) d += Math.sign(x - y);
    expect(r.effects.pairs[0].cliffsDelta).toBeCloseTo(d / 100, 12);
  });

  it("does not depend on row order or on the group names (exact parts)", () => {
    const rng = new Rng(5);
    const idx = Int32Array.from({ length: values.length }, (_, i) => i);
    shuffle(idx, rng);
    const v2 = Array.from(idx, (i) => values[i]);
    const l2 = Array.from(idx, (i) => ({ ctrl: "C", trt1: "T1", trt2: "T2" } as Record<string, string>)[labels[i]]);
    const r2 = analyseGroups(groupsReq(v2, l2, { resamples: 200000 }));
    const p1 = new Map(r.pairwise.map((p) => [[p.a, p.b].sort().join("|"), p.p]));
    const rename: Record<string, string> = { C: "ctrl", T1: "trt1", T2: "trt2" };
    for (const p of r2.pairwise) expect(p.p).toBeCloseTo(p1.get([rename[p.a], rename[p.b]].sort().join("|"))!, 14);
    expect(r2.classicalF.statistic).toBeCloseTo(r.classicalF.statistic, 10);
  });

  it("reports progress and stops when asked", () => {
    const seen: number[] = [];
    analyseGroups(groupsReq(values, labels, { resamples: 20000 }), (f) => void seen.push(f));
    expect(seen.length).toBeGreaterThan(3);
    expect(seen[seen.length - 1]).toBe(1);
    for (let i = 1; i < seen.length; i++) expect(seen[i]).toBeGreaterThanOrEqual(seen[i - 1] - 1e-12);
    expect(() => analyseGroups(groupsReq(values, labels, { resamples: 200000 }), (f) => f > 0.2)).toThrow(CancelledError);
  });
});

describe("blocked design — npk as randomized blocks (Yates 1935, cases.json)", () => {
  const c = getCase("npk_rcbd_within_block_permutation");
  const rows = c.data.rows as [string, string, string, string, number][];
  const r = analyseGroups(groupsReq(rows.map((x) => x[4]), rows.map((x) => x[1]), { resamples: 50000 }, rows.map((x) => x[0])));

  it("gives F after blocks, its exact within-block permutation p and Friedman on cell means", () => {
    expect(rel(r.classicalF.statistic, value(c, "F_N_after_blocks"))).toBeLessThan(1e-9);
    expect(rel(r.classicalF.p, value(c, "p_N_F"))).toBeLessThan(1e-6);
    expect(r.f.exact).toBe(true);
    expect(r.f.resamples).toBe(value(c, "exact_within_block_n"));
    expect(Math.abs(r.f.p - value(c, "exact_within_block_p"))).toBeLessThan(1e-12);
    expect(rel(r.rankClassical!.statistic, value(c, "friedman_cellmeans_chi2"))).toBeLessThan(1e-9);
    expect(rel(r.rankClassical!.p, value(c, "friedman_cellmeans_p"))).toBeLessThan(1e-6);
    expect(r.snr).toBeNull();
    expect(r.blocks!.complete).toBe(true);
  });
});

describe("paired measurements", () => {
  it("Darwin's Zea mays (Fisher 1935 §21, cases.json): exact sign-flip p and paired t", () => {
    const c = getCase("darwin_zea_mays");
    const d = Float64Array.from(c.data.d_cross_minus_self_eighths_inch as number[]);
    const r = analysePaired({ question: "paired", x: d, y: new Float64Array(d.length), options: opts({ resamples: 40000 }) });
    expect(r.signFlip.exact).toBe(true);
    expect(r.signFlip.resamples).toBe(32768);
    expect(Math.abs(r.signFlip.p - value(c, "p_two_sided"))).toBeLessThan(1e-12);
    expect(rel(r.pairedT.statistic, value(c, "t_paired"))).toBeLessThan(1e-9);
    expect(r.counts).toEqual({ up: 13, down: 2, same: 0 });
  });

  it("Hollander & Wolfe (1973) signed-rank example: V and the exact one-sided p", () => {
    const c = getCase("hollander_wolfe_rank_tests");
    const x = Float64Array.from(c.data.signedrank.x_first as number[]);
    const y = Float64Array.from(c.data.signedrank.y_second as number[]);
    const r = analysePaired({ question: "paired", x, y, options: opts({ direction: "greater" }) });
    expect(r.signedRank!.v).toBe(value(c, "signedrank_V"));
    expect(r.signedRank!.how).toBe("exact");
    expect(Math.abs(r.signedRank!.p - value(c, "signedrank_p_greater_exact"))).toBeLessThan(1e-12);
  });
});

describe("association", () => {
  it("has the exact permutation p of a brute-force enumeration of all 7! orders", () => {
    const x = Float64Array.from([1.2, 2.3, 2.9, 4.1, 5.0, 6.2, 7.7]);
    const y = Float64Array.from([2.0, 1.7, 3.9, 3.1, 5.5, 4.8, 7.0]);
    const r = analyseAssociation({ question: "association", x, y, options: opts() });
    const corr = (a: ArrayLike<number>, b: ArrayLike<number>) => {
      const n = a.length;
      const ma = Array.from(a).reduce((s, v) => s + v, 0) / n, mb = Array.from(b).reduce((s, v) => s + v, 0) / n;
      let sab = 0, saa = 0, sbb = 0;
      for (let i = 0; i < n; i++) {
        sab += (a[i] - ma) * (b[i] - mb);
        saa += (a[i] - ma) ** 2;
        sbb += (b[i] - mb) ** 2;
      }
      return sab / Math.sqrt(saa * sbb);
    };
    const obs = Math.abs(corr(x, y));
    let count = 0, total = 0;
    const perm = (arr: number[], k: number): void => {
      if (k === arr.length) {
        total++;
        if (Math.abs(corr(x, arr)) >= obs * (1 - 1e-12)) count++;
        return;
      }
      for (let i = k; i < arr.length; i++) {
        [arr[k], arr[i]] = [arr[i], arr[k]];
        perm(arr, k + 1);
        [arr[k], arr[i]] = [arr[i], arr[k]];
      }
    };
    perm(Array.from(y), 0);
    expect(total).toBe(5040);
    expect(r.pearson.exact).toBe(true);
    expect(Math.abs(r.pearson.p - count / total)).toBeLessThan(1e-12);
    // classical t of r: t = r √(n−2)/√(1−r²) on n − 2 df (Fisher 1915)
    const rr = corr(x, y);
    const t = (rr * Math.sqrt(5)) / Math.sqrt(1 - rr * rr);
    expect(r.classical.statistic).toBeCloseTo(t, 10);
    expect(r.classical.p).toBeCloseTo(2 * (1 - jStat.studentt.cdf(t, 5)), 10);
  });
});

describe("precision of a summary", () => {
  it("mouse treatment group (Efron & Tibshirani 1993, cases.json): t interval from the reference SE", () => {
    const c = getCase("mouse_two_sample");
    const x = Float64Array.from(c.data.treatment as number[]);
    const r = analysePrecision({ question: "precision", values: x, statistic: "mean", options: opts() });
    const se = value(c, "se_treatment_sd_over_sqrt_n");
    const q = jStat.studentt.inv(0.975, 6);
    expect(r.tInterval!.lower).toBeCloseTo(value(c, "mean_treatment") - q * se, 9);
    expect(r.tInterval!.upper).toBeCloseTo(value(c, "mean_treatment") + q * se, 9);
    const mean = r.intervals.find((i) => i.statistic === "mean")!.result!;
    expect(mean.estimate).toBeCloseTo(value(c, "mean_treatment"), 12);
    expect(mean.lower).toBeLessThan(mean.estimate);
    expect(mean.upper).toBeGreaterThan(mean.estimate);
    // Bootstrap SE of the mean near the ideal (B = ∞) value of the reference, within 5 % (Monte Carlo, 9,999 resamples).
    expect(Math.abs(mean.se - value(c, "bootstrap_se_treatment_mean_ideal_Binf")) / value(c, "bootstrap_se_treatment_mean_ideal_Binf")).toBeLessThan(0.05);
  });
});

describe("several traits", () => {
  it("each trait's p is the permutation F of that trait; Holm across traits", () => {
    const { values, labels } = plantGrowth();
    const g = encodeGroups(labels);
    const other = Float64Array.from(values, (v, i) => Math.sqrt(v) + (i % 3) * 0.01);
    const r = analyseTraits({ question: "traits", traits: [values, other], codes: g.codes, names: g.names, scale: "standardize", options: opts({ resamples: 1999 }) });
    expect(r.traits[0].test.p).toBe(permutationF(values, g.codes, 3, { resamples: 1999, seed: 1 }).p);
    const ps = r.traits.map((t) => t.test.p).sort((a, b) => a - b);
    expect(Math.min(...r.traits.map((t) => t.pAdjusted))).toBeCloseTo(Math.min(1, 2 * ps[0]), 12);
    expect(r.permanova.p).toBeGreaterThan(0);
    expect(r.permanova.p).toBeLessThanOrEqual(1);
  });
});

describe("the same numbers as the sheet functions", () => {
  it("GROUPTEST, STAT, SNR, BLOCKTEST, PAIRTEST, CORRTEST and INTERVAL agree with the panel's analyses", async () => {
    const { values, labels } = plantGrowth();
    const col = (xs: ArrayLike<unknown>) => Array.from(xs, (x) => [x]);
    const r = runAnalysis(groupsReq(values, labels));
    if (r.question !== "groups") throw new Error();
    expect(await sheetFunctions.GROUPTEST(col(values), col(labels), "F", 9999, 1)).toBe(r.f.p);
    expect(await sheetFunctions.GROUPTEST(col(values), col(labels), "SNR", 9999, 1)).toBe(r.snr!.p);
    expect(await sheetFunctions.GROUPTEST(col(values), col(labels), "RANK", 9999, 1)).toBe(r.rank!.p);
    expect(await sheetFunctions.SNR(col(values), col(labels))).toBeCloseTo(r.snr!.statistic, 12);
    const blocks = labels.map((_, i) => `b${i % 5}`);
    const rb = runAnalysis(groupsReq(values, labels, {}, blocks));
    if (rb.question !== "groups") throw new Error();
    expect(await sheetFunctions.BLOCKTEST(col(values), col(labels), col(blocks), "F", 9999, 1)).toBe(rb.f.p);
    expect(await sheetFunctions.BLOCKTEST(col(values), col(labels), col(blocks), "RANK", 9999, 1)).toBe(rb.rank!.p);
    const x = values.slice(0, 10), y = values.slice(10, 20);
    const rp = runAnalysis({ question: "paired", x, y, options: opts() });
    if (rp.question !== "paired") throw new Error();
    expect(await sheetFunctions.PAIRTEST(col(x), col(y), "two-sided", 9999, 1)).toBe(rp.signFlip.p);
    const ra = runAnalysis({ question: "association", x, y, options: opts() });
    if (ra.question !== "association") throw new Error();
    expect(await sheetFunctions.CORRTEST(col(x), col(y), "spearman", "two-sided", 9999, 1)).toBe(ra.spearman.p);
    const rq = runAnalysis({ question: "precision", values: x, statistic: "cv", options: opts() });
    if (rq.question !== "precision") throw new Error();
    const cv = rq.intervals.find((i) => i.statistic === "cv")!.result!;
    expect(await sheetFunctions.INTERVAL(col(x), "cv", 0.95, "BCa", 9999, 1)).toEqual([[cv.estimate, cv.lower, cv.upper]]);
  });

  it("p values lie in (0, 1]", () => {
    const { values, labels } = plantGrowth();
    const r = analyseGroups(groupsReq(values, labels, { resamples: 999 }));
    for (const p of [r.f.p, r.snr!.p, r.rank!.p, r.classicalF.p, ...r.pairwise.flatMap((x) => [x.p, x.pAdjusted])]) {
      expect(p).toBeGreaterThan(0);
      expect(p).toBeLessThanOrEqual(1);
    }
  });
});
