/**
 * Sheet functions called exactly as Excel calls them (2D arrays, null for an omitted
 * optional argument), checked against the shared reference values (cases.json, each
 * case's published source named beside it), against the engine called directly, and
 * against brute-force enumerations written here.
 */
import { describe, expect, it } from "vitest";
import { blockPermutationTest } from "../../src/blocks";
import { bootstrapDiffInterval, bootstrapInterval } from "../../src/bootstrap";
import { correlationTest } from "../../src/correlation";
import { cellMeans, permutationFriedman } from "../../src/friedman";
import { permutationKW } from "../../src/kruskal";
import { permanova } from "../../src/multivariate";
import { permutationF } from "../../src/oneway";
import { pairedTest } from "../../src/paired";
import { permutationSNR } from "../../src/snr";
import { twoSampleTest } from "../../src/twosample";
import { SheetError } from "../../functions/errors";
import { sheetFunctions } from "../../functions/registry";
import { getCase, expected, value } from "../reference";

const col = (xs: unknown[]): unknown[][] => xs.map((x) => [x]);
const row = (xs: unknown[]): unknown[][] => [xs.slice()];
const call = (name: string, ...args: unknown[]) => sheetFunctions[name](...args) as Promise<any>;

function expectError(r: unknown, code: string, pattern?: RegExp): void {
  expect(r).toBeInstanceOf(SheetError);
  const e = r as SheetError;
  expect(e.code).toBe(code);
  expect(e.message.length).toBeGreaterThan(10);
  if (pattern) expect(e.message).toMatch(pattern);
}

function expectRel(actual: number, want: number, rel: number): void {
  expect(typeof actual).toBe("number");
  expect(Math.abs(actual - want)).toBeLessThanOrEqual(rel * Math.abs(want));
}

// PlantGrowth: Dobson (1983) An Introduction to Statistical Modelling, Table 7.1 —
// shared reference values (cases.json, case 4).
const pg = getCase("plantgrowth_oneway");
const weight: number[] = pg.data.weight;
const group: string[] = pg.data.group;

// Darwin's Zea mays, analysed by Fisher (1935) The Design of Experiments, §21 — case 1.
const darwin = getCase("darwin_zea_mays");
const dz: number[] = darwin.data.d_cross_minus_self_eighths_inch;

// Mouse survival: Efron & Tibshirani (1993) An Introduction to the Bootstrap, Table 2.1 — case 2.
const mouse = getCase("mouse_two_sample");
const treatment: number[] = mouse.data.treatment;
const control: number[] = mouse.data.control;

// npk: Yates (1935), 6 blocks × 4 plots — case 6.
const npk = getCase("npk_rcbd_within_block_permutation");
const npkRows: [string, string, string, string, number][] = npk.data.rows;

// Hollander & Wolfe (1973) Nonparametric Statistical Methods — case 5.
const hw = getCase("hollander_wolfe_rank_tests");

describe("GROUPTEST / STAT / SNR on PlantGrowth (Dobson 1983)", () => {
  it("STAT gives the published F = 4.846 and Kruskal–Wallis H = 7.988", async () => {
    expectRel(await call("STAT", col(weight), col(group)), value(pg, "F"), 1e-9);
    expectRel(await call("STAT", col(weight), col(group), "F"), value(pg, "F"), 1e-9);
    expectRel(await call("STAT", col(weight), col(group), "rank"), value(pg, "kruskal_H_tie_corrected"), 1e-9);
    expectRel(await call("STAT", col(weight), col(group), "SNR"), value(pg, "D_snr"), 1e-9);
  });

  it("SNR gives D = 1.2141 (mean between-group distance 0.8602 / within 0.7085)", async () => {
    const d = await call("SNR", col(weight), col(group));
    expectRel(d, value(pg, "D_snr"), 1e-9);
    expectRel(d, value(pg, "D_mean_abs_diff_between") / value(pg, "D_mean_abs_diff_within"), 1e-9);
  });

  it("GROUPTEST F and SNR p fall in the Monte Carlo reference bands (99,999 shuffles)", async () => {
    const eF = expected(pg, "perm_F_p_reference");
    const pF = await call("GROUPTEST", col(weight), col(group), null, 99999, null);
    expect(Math.abs(pF - eF.value)).toBeLessThan(eF.tolerance.abs);
    const eD = expected(pg, "D_perm_p_reference");
    const pD = await call("GROUPTEST", col(weight), col(group), "snr", 99999, null);
    expect(Math.abs(pD - eD.value)).toBeLessThan(eD.tolerance.abs);
  });

  it("GROUPTEST equals the engine called directly, for every statistic", async () => {
    const codes = group.map((g) => ["ctrl", "trt1", "trt2"].indexOf(g));
    const opts = { resamples: 2000, seed: 5 };
    expect(await call("GROUPTEST", col(weight), col(group), "F", 2000, 5)).toBe(permutationF(weight, codes, 3, opts).p);
    expect(await call("GROUPTEST", col(weight), col(group), "SNR", 2000, 5)).toBe(permutationSNR(weight, codes, 3, opts).p);
    expect(await call("GROUPTEST", col(weight), col(group), "RANK", 2000, 5)).toBe(permutationKW(weight, codes, 3, opts).p);
  });

  it("defaults are resamples 9999 and seed 1; option words ignore case and spaces", async () => {
    const codes = group.map((g) => ["ctrl", "trt1", "trt2"].indexOf(g));
    const p = await call("GROUPTEST", col(weight), col(group));
    expect(p).toBe(permutationF(weight, codes, 3, { resamples: 9999, seed: 1 }).p);
    expect(await call("GROUPTEST", col(weight), col(group), null, null, null)).toBe(p);
    expect(await call("GROUPTEST", col(weight), col(group), "", "", "")).toBe(p);
    expect(await call("GROUPTEST", col(weight), col(group), " f ", 9999, 1)).toBe(p);
    expect(await call("GROUPTEST", col(weight), col(group), [["F"]], [[9999]], [[1]])).toBe(p);
  });

  it("a row layout gives the same answer as a column layout; group names and row order do not matter for exact p", async () => {
    expect(await call("STAT", row(weight), row(group))).toBe(await call("STAT", col(weight), col(group)));
    // Small design, enumerated exactly: 9!/(3!3!3!) = 1680 relabellings ≤ 9999.
    const x = [4.17, 5.58, 5.18, 4.81, 4.17, 4.41, 6.31, 5.12, 5.54];
    const g = ["a", "a", "a", "b", "b", "b", "c", "c", "c"];
    const p1 = await call("GROUPTEST", col(x), col(g));
    const p2 = await call("GROUPTEST", col(x.slice().reverse()), col(g.slice().reverse().map((s) => `line ${s}`)), null, null, 12345);
    expect(p2).toBe(p1);
    expect(p1).toBeGreaterThan(0);
    expect(p1).toBeLessThanOrEqual(1);
  });

  it("numbers work as group labels, and labels match ignoring case and surrounding spaces", async () => {
    const numeric = group.map((g) => ({ ctrl: 1, trt1: 2, trt2: 3 })[g as "ctrl"]);
    expect(await call("STAT", col(weight), col(numeric))).toBe(await call("STAT", col(weight), col(group)));
    const messy = group.map((g, i) => (i % 3 === 0 ? ` ${g.toUpperCase()} ` : g));
    expect(await call("STAT", col(weight), col(messy))).toBe(await call("STAT", col(weight), col(group)));
  });

  it("the same seed gives the same p; another seed gives another Monte Carlo p, while an exact p ignores the seed", async () => {
    const a = await call("GROUPTEST", col(weight), col(group), "F", 999, 7);
    expect(await call("GROUPTEST", col(weight), col(group), "F", 999, 7)).toBe(a);
    const others = new Set<number>();
    for (const s of [8, 9, 10]) others.add(await call("GROUPTEST", col(weight), col(group), "F", 999, s));
    expect(others.size).toBeGreaterThan(1);
    const x = [1.1, 2.3, 0.7, 3.9, 4.4, 5.0];
    const g = ["a", "a", "a", "b", "b", "b"]; // C(6,3) = 20 splits: exact
    expect(await call("GROUPTEST", col(x), col(g), null, 99, 1)).toBe(await call("GROUPTEST", col(x), col(g), null, 99, 424242));
  });
});

describe("TWOTEST on the mouse data (Efron & Tibshirani 1993)", () => {
  it("exact p of the mean difference: 0.1410 one-sided, 0.2783 two-sided (11,440 splits)", async () => {
    const greater = await call("TWOTEST", col(treatment), col(control), "greater", null, 20000, null);
    expect(Math.abs(greater - value(mouse, "perm_p_greater"))).toBeLessThanOrEqual(1e-12);
    const two = await call("TWOTEST", col(treatment), col(control), null, "MEAN", 20000, null);
    expect(Math.abs(two - value(mouse, "perm_p_two_sided_abs"))).toBeLessThanOrEqual(1e-12);
    const less = await call("TWOTEST", col(treatment), col(control), "less", null, 20000, null);
    expect(Math.abs(less - value(mouse, "perm_count_diff_le_obs") / value(mouse, "perm_n_splits"))).toBeLessThanOrEqual(1e-12);
  });

  it("median and Welch t statistics equal the engine; samples of different lengths and blanks are fine", async () => {
    for (const statistic of ["median", "t"] as const) {
      const want = twoSampleTest(treatment, control, { statistic, direction: "two-sided", resamples: 999, seed: 3 }).p;
      expect(await call("TWOTEST", col([...treatment, null, ""]), row(control), null, statistic, 999, 3)).toBe(want);
    }
  });
});

describe("PAIRTEST on Darwin's Zea mays (Fisher 1935)", () => {
  it("exact sign-flip p = 1726/32768 two-sided and 863/32768 one-sided", async () => {
    // Differences as cross − self with a common self value, so values2 holds no zeros.
    const cross = dz.map((d) => d + 200);
    const self = dz.map(() => 200);
    const two = await call("PAIRTEST", col(cross), col(self), null, 40000, null);
    expect(Math.abs(two - value(darwin, "p_two_sided"))).toBeLessThanOrEqual(1e-12);
    const greater = await call("PAIRTEST", col(cross), col(self), "Greater", 40000, null);
    expect(Math.abs(greater - value(darwin, "p_one_sided_greater"))).toBeLessThanOrEqual(1e-12);
  });

  it("real zeros in values2 count as numbers (outside Excel, blanks are null or \"\")", async () => {
    const zeros = dz.map(() => 0);
    const two = await call("PAIRTEST", col(dz), col(zeros), null, 40000, null);
    expect(Math.abs(two - value(darwin, "p_two_sided"))).toBeLessThanOrEqual(1e-12);
  });

  it("a blank in either column drops the pair (pairwise), matching the engine on the complete pairs", async () => {
    const x = dz.map((d) => d + 200);
    const y: unknown[] = dz.map(() => 200);
    const xs: unknown[] = x.slice();
    xs[3] = null;
    y[7] = "";
    const keep = x.map((_, i) => i).filter((i) => i !== 3 && i !== 7);
    const want = pairedTest(keep.map((i) => x[i]), keep.map(() => 200), { resamples: 999, seed: 1 }).p;
    expect(await call("PAIRTEST", col(xs), col(y), null, 999, null)).toBe(want);
  });
});

describe("BLOCKTEST on npk (Yates 1935)", () => {
  const yieldCol = col(npkRows.map((r) => r[4]));
  const nCol = col(npkRows.map((r) => (r[1] === "1" ? "N" : "no N")));
  const blockCol = col(npkRows.map((r) => `block ${r[0]}`));

  it("exact within-block p for N after blocks = 290/46656", async () => {
    const p = await call("BLOCKTEST", yieldCol, nCol, blockCol, null, 50000, null);
    expect(Math.abs(p - value(npk, "exact_within_block_p"))).toBeLessThanOrEqual(1e-12);
  });

  it("Monte Carlo p agrees with the engine and with the reference band (99,999 shuffles)", async () => {
    const e = expected(npk, "mc_within_block_p_99999");
    const p = await call("BLOCKTEST", yieldCol, nCol, blockCol, "f", 9999, 2);
    const codesB = npkRows.map((r) => Number(r[0]) - 1);
    // npk's first row has N = 0: labels in order of first appearance make "no N" code 0.
    const tFirst = npkRows.map((r) => (r[1] === npkRows[0][1] ? 0 : 1));
    expect(p).toBe(blockPermutationTest(npkRows.map((r) => r[4]), tFirst, 2, codesB, 6, { resamples: 9999, seed: 2 }).p);
    expect(Math.abs(p - e.value)).toBeLessThan(4 * Math.sqrt((e.value * (1 - e.value)) / 9999) + e.tolerance.abs);
  });

  it("RANK averages replicate plots per block × treatment and runs the Friedman permutation test; brute force over the 2^6 arrangements", async () => {
    const p = await call("BLOCKTEST", yieldCol, nCol, blockCol, "RANK", 9999, null);
    // The cell means table gives Friedman χ² = 6 (shared reference values, case 6).
    const v = npkRows.map((r) => r[4]);
    const t = npkRows.map((r) => (r[1] === npkRows[0][1] ? 0 : 1));
    const b = npkRows.map((r) => Number(r[0]) - 1);
    const m = cellMeans(v, t, 2, b, 6);
    const engine = permutationFriedman(m.values, m.treatCodes, 2, m.blockCodes, 6, { resamples: 9999 });
    expect(engine.chi2).toBeCloseTo(value(npk, "friedman_cellmeans_chi2"), 9);
    expect(p).toBe(engine.p);
    // Brute force: with two treatments, each block either keeps or swaps its ranks;
    // χ² = 12 Σ_j (R_j − 9)² / (6·2·3) for the 6 blocks' within-block ranks.
    const up: boolean[] = [];
    for (let bb = 0; bb < 6; bb++) {
      const a = m.values[2 * bb + (m.treatCodes[2 * bb] === 0 ? 0 : 1)];
      const c = m.values[2 * bb + (m.treatCodes[2 * bb] === 0 ? 1 : 0)];
      up.push(a > c);
    }
    const chi = (flip: number) => {
      let r0 = 0;
      for (let bb = 0; bb < 6; bb++) r0 += up[bb] !== ((flip >> bb) & 1) > 0 ? 2 : 1;
      const r1 = 18 - r0;
      return (12 * ((r0 - 9) ** 2 + (r1 - 9) ** 2)) / 36;
    };
    const obs = chi(0);
    let count = 0;
    for (let f = 0; f < 64; f++) if (chi(f) >= obs - 1e-12) count++;
    expect(p).toBeCloseTo(count / 64, 12);
  });

  it("RANK names the block and treatment of an empty cell", async () => {
    const keep = npkRows.filter((r) => !(r[0] === "3" && r[1] === "1"));
    const r = await call("BLOCKTEST", col(keep.map((x) => x[4])), col(keep.map((x) => (x[1] === "1" ? "N" : "no N"))), col(keep.map((x) => `block ${x[0]}`)), "RANK");
    expectError(r, "#N/A", /block 'block 3' has no value for treatment 'N'/);
  });
});

describe("CORRTEST", () => {
  // Rounding first base times: Hollander & Wolfe (1973), p. 140ff (case 5) — first two methods.
  const rows: number[][] = hw.data.friedman_RoundingTimes_22x3.rows;
  const x = rows.map((r) => r[0]);
  const y = rows.map((r) => r[1]);

  it("equals the engine for pearson and spearman", async () => {
    for (const method of ["pearson", "spearman"] as const) {
      const want = correlationTest(x, y, { method, direction: "greater", resamples: 999, seed: 4 }).p;
      expect(await call("CORRTEST", col(x), col(y), method.toUpperCase(), "greater", 999, 4)).toBe(want);
    }
  });

  it("small n is enumerated exactly: matches a brute-force count over all 6! orderings", async () => {
    const a = [1.2, 3.4, 2.2, 5.1, 4.4, 6.0];
    const b = [2.0, 2.9, 2.5, 4.8, 5.5, 5.2];
    const r = (u: number[], v: number[]) => {
      const mu = u.reduce((s, t) => s + t, 0) / u.length;
      const mv = v.reduce((s, t) => s + t, 0) / v.length;
      let sxy = 0, sxx = 0, syy = 0;
      for (let i = 0; i < u.length; i++) {
        sxy += (u[i] - mu) * (v[i] - mv);
        sxx += (u[i] - mu) ** 2;
        syy += (v[i] - mv) ** 2;
      }
      return sxy / Math.sqrt(sxx * syy);
    };
    const obs = Math.abs(r(a, b));
    let count = 0, total = 0;
    const perm = (rest: number[], acc: number[]) => {
      if (rest.length === 0) {
        total++;
        if (Math.abs(r(a, acc)) >= obs - 1e-12) count++;
        return;
      }
      rest.forEach((v, i) => perm([...rest.slice(0, i), ...rest.slice(i + 1)], [...acc, v]));
    };
    perm(b, []);
    expect(total).toBe(720);
    expect(await call("CORRTEST", col(a), col(b))).toBeCloseTo(count / total, 12);
  });

  it("a constant column gives #DIV/0!", async () => {
    expectError(await call("CORRTEST", col([1, 2, 3, 4]), col([5, 5, 5, 5])), "#DIV/0!", /y has the same value/);
  });
});

describe("INTERVAL and DIFFINTERVAL", () => {
  it("spill one row (estimate, lower, upper) equal to the engine's interval; method word BCa is the engine's bca", async () => {
    const r = await call("INTERVAL", col(treatment), "median", 0.9, "BCa", 2000, 3);
    const e = bootstrapInterval(treatment, "median", { level: 0.9, method: "bca", resamples: 2000, seed: 3 });
    expect(r).toEqual([[e.estimate, e.lower, e.upper]]);
    const d = await call("DIFFINTERVAL", col(treatment), col(control), null, null, "percentile", 2000, null);
    const ed = bootstrapDiffInterval(treatment, control, "mean", { method: "percentile", resamples: 2000, seed: 1 });
    expect(d).toEqual([[ed.estimate, ed.lower, ed.upper]]);
  });

  it("the mouse data's difference of means is 30.63 (Efron & Tibshirani 1993, Table 2.1) and lies inside its interval", async () => {
    const [[est, lo, hi]] = await call("DIFFINTERVAL", col(treatment), col(control));
    expectRel(est, value(mouse, "mean_difference"), 1e-9);
    expect(lo).toBeLessThan(est);
    expect(hi).toBeGreaterThan(est);
    const [[ratio]] = await call("DIFFINTERVAL", col(treatment), col(control), "ratio");
    expectRel(ratio, (100 * value(mouse, "mean_treatment")) / value(mouse, "mean_control"), 1e-9);
  });

  it("levels, methods and statistics are validated with a how-to-fix message", async () => {
    expectError(await call("INTERVAL", col(treatment), "mode"), "#VALUE!", /statistic: 'mode' is not one of "mean", "median", "sd", "cv", "trimmed"/);
    expectError(await call("INTERVAL", col(treatment), null, 95), "#VALUE!", /level must be a number between 0 and 1.*for 95 % write 0.95/);
    expectError(await call("INTERVAL", col(treatment), null, 1), "#VALUE!", /level/);
    expectError(await call("INTERVAL", col(treatment), null, null, "student"), "#VALUE!", /method: 'student' is not one of "BCa", "percentile", "basic"/);
    expectError(await call("INTERVAL", col([1, 2])), "#N/A", /values has 2 numbers.*at least 3/);
    expectError(await call("DIFFINTERVAL", col([1, 2, 3]), col([0, 0, 0]), "ratio"), "#DIV/0!", /mean of values2 is 0/);
  });
});

describe("PAIRWISE and LETTERS on PlantGrowth (Dobson 1983)", () => {
  it("exact pair p and Holm adjustment match the shared reference values (case 8)", async () => {
    const pc = getCase("plantgrowth_pairwise_exact_holm");
    const t = await call("PAIRWISE", col(weight), col(group), "Holm", null, 200000, null);
    expect(t[0]).toEqual(["group 1", "group 2", "difference", "lower 95 %", "upper 95 %", "p", "adjusted p"]);
    expect(t.length).toBe(4);
    const byPair = new Map(t.slice(1).map((r: any[]) => [`${r[0]}_${r[1]}`, r]));
    for (const pair of ["ctrl_trt1", "ctrl_trt2", "trt1_trt2"]) {
      const r = byPair.get(pair) as any[];
      expectRel(r[2], value(pc, `${pair}_mean_diff`), 1e-9);
      expect(Math.abs(r[5] - value(pc, `${pair}_p_exact_two_sided`))).toBeLessThanOrEqual(1e-12);
      expect(Math.abs(r[6] - value(pc, `${pair}_p_holm`))).toBeLessThanOrEqual(1e-12);
      expect(r[3]).toBeLessThan(r[2]);
      expect(r[4]).toBeGreaterThan(r[2]);
    }
  });

  it("LETTERS: with the Holm p above, only trt1 and trt2 differ at 0.05 → trt2 a, ctrl ab, trt1 b (highest mean first)", async () => {
    const t = await call("LETTERS", col(weight), col(group), null, null, 200000, null);
    expect(t).toEqual([
      ["group", "n", "mean", "letters"],
      ["trt2", 10, expect.closeTo(5.526, 12), "a"],
      ["ctrl", 10, expect.closeTo(5.032, 12), "ab"],
      ["trt1", 10, expect.closeTo(4.661, 12), "b"],
    ]);
  });

  it("the level appears in the header; adjust words are validated", async () => {
    const t = await call("PAIRWISE", col(weight), col(group), "bh", 0.9, 200, null);
    expect(t[0][3]).toBe("lower 90 %");
    expectError(await call("PAIRWISE", col(weight), col(group), "bonferroni"), "#VALUE!", /adjust: 'bonferroni' is not one of "holm", "maxt", "bh", "none"/);
    expectError(await call("LETTERS", col(weight), col(group), 0), "#VALUE!", /alpha must be a number between 0 and 1/);
  });

  it("groups with fewer than 3 values are named", async () => {
    expectError(await call("PAIRWISE", col([1, 2, 3, 4, 5]), col(["a", "a", "a", "b", "b"])), "#N/A", /group 'b' has 2 values; each group needs at least 3/);
  });
});

describe("GROUPSUMMARY", () => {
  it("mouse data: means 86.86 and 56.22, SD = SE·√n (Efron & Tibshirani 1993, Table 2.1)", async () => {
    const values = [...treatment, ...control];
    const groups = [...treatment.map(() => "treatment"), ...control.map(() => "control")];
    const t = await call("GROUPSUMMARY", col(values), col(groups));
    expect(t[0]).toEqual(["group", "n", "mean", "median", "SD", "CV %", "min", "max"]);
    const [, tr, co] = t;
    expect(tr[0]).toBe("treatment");
    expect(tr[1]).toBe(7);
    expectRel(tr[2], value(mouse, "mean_treatment"), 1e-9);
    expectRel(tr[4], value(mouse, "se_treatment_sd_over_sqrt_n") * Math.sqrt(7), 1e-9);
    expectRel(co[2], value(mouse, "mean_control"), 1e-9);
    expectRel(co[4], value(mouse, "se_control_sd_over_sqrt_n") * 3, 1e-9);
    expectRel(tr[5], (100 * tr[4]) / tr[2], 1e-12);
    expect(tr[3]).toBe(94); // median of 16, 23, 38, 94, 99, 141, 197
    expect([tr[6], tr[7]]).toEqual([16, 197]);
  });

  it("a single value gives \"\" for SD and CV %, never null; one group is allowed", async () => {
    const t = await call("GROUPSUMMARY", col([3, 4, 5, 9]), col(["a", "a", "a", "b"]));
    expect(t[2]).toEqual(["b", 1, 9, 9, "", "", 9, 9]);
    const one = await call("GROUPSUMMARY", col([3, 4]), col(["a", "a"]));
    expect(one.length).toBe(2);
  });
});

describe("TRAITTEST", () => {
  it("equals the engine's PERMANOVA; with one trait it is the one-way F test (Anderson 2001)", async () => {
    const codes = group.map((g) => ["ctrl", "trt1", "trt2"].indexOf(g));
    const two = weight.map((w, i) => [w, (i * 7) % 5]);
    const want = permanova([weight, weight.map((_, i) => (i * 7) % 5)], codes, 3, { resamples: 999, seed: 1 }).p;
    expect(await call("TRAITTEST", two, col(group), null, 999, null)).toBe(want);
    // One trait, exact enumeration (9!/(3!3!3!) = 1680 labellings): pseudo-F is F, so p is F's exact p.
    const x = [4.17, 5.58, 5.18, 4.81, 4.17, 4.41, 6.31, 5.12, 5.54];
    const g = [0, 0, 0, 1, 1, 1, 2, 2, 2];
    const oneF = await call("TRAITTEST", col(x), col(g.map((c) => `line ${c}`)), "none");
    const exactF = permutationF(x, g, 3, { resamples: 9999 });
    expect(exactF.exact).toBe(true);
    expect(oneF).toBeCloseTo(exactF.p, 12);
  });

  it("a blank in any trait drops the row; a transposed block gets a hint", async () => {
    const blocks = weight.map((w, i) => [w, i % 4 === 0 ? null : (i * 7) % 5]);
    const keep = weight.map((_, i) => i).filter((i) => i % 4 !== 0);
    const codes = keep.map((i) => ["ctrl", "trt1", "trt2"].indexOf(group[i]));
    const want = permanova([keep.map((i) => weight[i]), keep.map((i) => (i * 7) % 5)], codes, 3, { resamples: 999, seed: 1 }).p;
    expect(await call("TRAITTEST", blocks, col(group), null, 999)).toBe(want);
    const transposed = [weight.slice(0, 6), weight.slice(6, 12)];
    expectError(await call("TRAITTEST", transposed, col(group.slice(0, 6))), "#N/A", /one row per plot or sample/);
  });
});

describe("NULLHIST", () => {
  it("counts every shuffled statistic once and marks the observed F in its bin", async () => {
    const t = await call("NULLHIST", col(weight), col(group), null, 12, 999, null);
    expect(t[0]).toEqual(["lower", "upper", "count", "observed"]);
    expect(t.length).toBe(13);
    const counts = t.slice(1).map((r: any[]) => r[2]);
    expect(counts.reduce((a: number, b: number) => a + b, 0)).toBe(999);
    const marked = t.slice(1).filter((r: any[]) => r[3] !== "");
    expect(marked.length).toBe(1);
    expectRel(marked[0][3], value(pg, "F"), 1e-9);
    expect(marked[0][0]).toBeLessThanOrEqual(marked[0][3]);
    expect(marked[0][1]).toBeGreaterThanOrEqual(marked[0][3]);
    for (let b = 2; b < t.length; b++) expect(t[b][0]).toBeCloseTo(t[b - 1][1], 12);
  });

  it("bin counts equal a recount of the engine's null distribution", async () => {
    const codes = group.map((g) => ["ctrl", "trt1", "trt2"].indexOf(g));
    const r = permutationSNR(weight, codes, 3, { resamples: 500, seed: 9, keepNull: true });
    const t = await call("NULLHIST", col(weight), col(group), "SNR", 7, 500, 9);
    const rows = t.slice(1);
    const lo = rows[0][0];
    const hi = rows[rows.length - 1][1];
    const width = (hi - lo) / 7;
    const recount = new Array(7).fill(0);
    for (const d of r.nullDistribution!) recount[Math.min(6, Math.floor((d - lo) / width))]++;
    expect(rows.map((x: any[]) => x[2])).toEqual(recount);
  });

  it("bins are validated", async () => {
    expectError(await call("NULLHIST", col(weight), col(group), null, 1), "#VALUE!", /bins must be a whole number from 2 to 1,000/);
  });
});

describe("arguments as Excel passes them", () => {
  it("text, logical values and error values in a numeric range name the argument and the position", async () => {
    const v: unknown[] = weight.slice();
    v[6] = "n/a";
    expectError(await call("GROUPTEST", col(v), col(group)), "#VALUE!", /^values, row 7: 'n\/a' is not a number\.$/);
    v[6] = true;
    expectError(await call("STAT", col(v), col(group)), "#VALUE!", /values, row 7: TRUE is a logical value, not a number/);
    v[6] = { code: "#N/A" };
    expectError(await call("SNR", col(v), col(group)), "#VALUE!", /values, row 7: the cell holds the error #N\/A/);
    v[6] = { type: "Error", basicValue: "#DIV/0!", errorType: "Div0" };
    expectError(await call("SNR", col(v), col(group)), "#VALUE!", /the cell holds the error #DIV\/0!/);
    expectError(await call("TWOTEST", row([1, 2, "x"]), col([1, 2, 3])), "#VALUE!", /values1, column 3: 'x' is not a number/);
    expectError(await call("GROUPTEST", col(weight), col(group.map((g, i) => (i === 4 ? false : g)))), "#VALUE!", /groups, row 5: FALSE is a logical value; group labels must be text or numbers/);
  });

  it("a header caught in the range gets a hint", async () => {
    expectError(await call("INTERVAL", col(["Yield (t/ha)", 4.1, 3.9, 4.6])), "#VALUE!", /^values, row 1: 'Yield \(t\/ha\)' is not a number \(leave the header out of the range\)\.$/);
  });

  it("a row dropped for a blank label is not checked for text", async () => {
    const v: unknown[] = weight.slice();
    const g: unknown[] = group.slice();
    v[2] = "typo";
    g[2] = null;
    const keep = weight.map((_, i) => i).filter((i) => i !== 2);
    expect(await call("STAT", col(v), col(g))).toBe(await call("STAT", col(keep.map((i) => weight[i])), col(keep.map((i) => group[i]))));
  });

  it("blank cells (null, \"\", undefined) drop their row pairwise across the call's ranges", async () => {
    const v: unknown[] = weight.slice();
    const g: unknown[] = group.slice();
    v[0] = null;
    g[11] = "";
    v[20] = undefined;
    const keep = weight.map((_, i) => i).filter((i) => ![0, 11, 20].includes(i));
    const want = await call("GROUPTEST", col(keep.map((i) => weight[i])), col(keep.map((i) => group[i])), null, 999);
    expect(await call("GROUPTEST", col(v), col(g), null, 999)).toBe(want);
  });

  it("sizes, shapes and group counts give #N/A or #VALUE! with a how-to-fix message", async () => {
    expectError(await call("GROUPTEST", col(weight.slice(1)), col(group)), "#N/A", /values has 29 cells but groups has 30 cells: give ranges of the same size/);
    expectError(await call("GROUPTEST", [[1, 2], [3, 4]], [["a"], ["b"]]), "#VALUE!", /values must be one column or one row \(it has 2 rows and 2 columns\)/);
    expectError(await call("GROUPTEST", col([1, 2, 3]), col(["a", "a", "a"])), "#N/A", /single group \('a'\).*at least two groups/);
    expectError(await call("GROUPTEST", col([1, 2, 3]), col(["a", "b", "c"])), "#N/A", /every group has a single value/);
    expectError(await call("GROUPTEST", col([null, null]), col(["a", "b"])), "#N/A", /no row has both values and groups filled in/);
    expectError(await call("GROUPTEST", null, col(["a"])), "#VALUE!", /values is missing/);
    expectError(await call("PAIRTEST", col([1]), col([2])), "#N/A", /1 complete row.*at least 2/);
    expectError(await call("GROUPTEST", col(weight), col(group), null, null, null, "extra"), "#VALUE!", /takes at most 5 arguments/);
  });

  it("resamples, seed and option words out of range give #VALUE! with the allowed range", async () => {
    expectError(await call("GROUPTEST", col(weight), col(group), null, 98), "#VALUE!", /resamples must be a whole number from 99 to 1,000,000 \(got 98\); leave it empty for 9,999/);
    expectError(await call("GROUPTEST", col(weight), col(group), null, 1000001), "#VALUE!", /resamples/);
    expectError(await call("GROUPTEST", col(weight), col(group), null, 500.5), "#VALUE!", /resamples/);
    expectError(await call("GROUPTEST", col(weight), col(group), null, "many"), "#VALUE!", /resamples must be a whole number.*got 'many'/);
    expectError(await call("GROUPTEST", col(weight), col(group), null, null, 1.5), "#VALUE!", /seed must be a whole number/);
    expectError(await call("GROUPTEST", col(weight), col(group), "anova"), "#VALUE!", /statistic: 'anova' is not one of "F", "SNR", "RANK"; leave it empty for "F"/);
    expectError(await call("TWOTEST", col(treatment), col(control), "up"), "#VALUE!", /direction: 'up' is not one of "two-sided", "greater", "less"/);
    expectError(await call("GROUPTEST", col(weight), col(group), [["F", "SNR"]]), "#VALUE!", /statistic must be a single value/);
    expectError(await call("GROUPTEST", col(weight), col(group), true), "#VALUE!", /statistic/);
  });

  it("STAT reports a zero spread as #DIV/0!, never NaN or an infinite value", async () => {
    expectError(await call("STAT", col([1, 1, 2, 2]), col(["a", "a", "b", "b"])), "#DIV/0!", /spread within groups is zero/);
    expectError(await call("STAT", col([3, 3, 3, 3]), col(["a", "a", "b", "b"])), "#DIV/0!", /all values are equal/);
    expectError(await call("SNR", col([1, 1, 2, 2]), col(["a", "a", "b", "b"])), "#DIV/0!");
    expectError(await call("STAT", col([3, 3, 3, 3]), col(["a", "a", "b", "b"]), "RANK"), "#DIV/0!");
    const p = await call("GROUPTEST", col([3, 3, 3, 3]), col(["a", "a", "b", "b"]));
    expect(p).toBe(1); // every relabelling ties with the observed one
  });

  it("an unknown function name is an error value, not an exception", async () => {
    const { callSheetFunction } = await import("../../functions/sheet");
    expectError(await callSheetFunction("NOPE", []), "#N/A", /no sheet function called NOPE/);
  });
});
