import { describe, expect, it } from "vitest";
import { rankSumCdf, rankSumExactP } from "../../src/rankdist";
import { rankSumTest } from "../../src/ranksum";
import { Direction } from "../../src/permutation";
import { getCase } from "../reference";
import { bruteMidranks, enumerationP, expectReference, forEachSubset, lcg, permutationOf } from "./check";

/** Brute force: W of every C(n, n1) choice of the "x" positions among the given pooled ranks. */
function allRankSums(ranks: number[], n1: number): number[] {
  const out: number[] = [];
  forEachSubset(ranks.length, n1, (m) => {
    let w = 0;
    for (let i = 0; i < ranks.length; i++) if (m[i]) w += ranks[i];
    out.push(w);
  });
  return out;
}


/** Exact counts of U by a subset-sum recursion in BigInt (independent of the Gaussian-binomial recursion). */
function bigIntUCounts(n1: number, n2: number): bigint[] {
  const n = n1 + n2;
  const maxW = (n1 * (2 * n - n1 + 1)) / 2;
  // dp[j][s]: subsets of {1..i} of size j with sum s
  const dp: bigint[][] = Array.from({ length: n1 + 1 }, () => new Array(maxW + 1).fill(0n));
  dp[0][0] = 1n;
  for (let i = 1; i <= n; i++) {
    for (let j = Math.min(i, n1); j >= 1; j--) {
      const row = dp[j];
      const prev = dp[j - 1];
      for (let s = maxW; s >= i; s--) if (prev[s - i] !== 0n) row[s] += prev[s - i];
    }
  }
  const base = (n1 * (n1 + 1)) / 2;
  return dp[n1].slice(base, base + n1 * n2 + 1);
}

// Chorioamnion permeability: Hollander & Wolfe (1973), p. 69f — shared reference values (cases.json, case 5).
const hw = getCase("hollander_wolfe_rank_tests");
const hx: number[] = hw.data.ranksum.x_term;
const hy: number[] = hw.data.ranksum.y_12_26_weeks;

describe("Wilcoxon rank-sum test (Wilcoxon 1945; Mann & Whitney 1947)", () => {
  it("chorioamnion permeability (Hollander & Wolfe 1973): W = 90, U = 35, exact and normal p", () => {
    const g = rankSumTest(hx, hy, { direction: "greater" });
    expect(g.w).toBe(90);
    expectReference(g.u, hw, "ranksum_W_x_R");
    expect(g.ties).toBe(false);
    expect(g.pPermutation).toBeNull();
    expectReference(g.pExact!, hw, "ranksum_p_greater_exact");
    expectReference(g.pNormal, hw, "ranksum_p_greater_normal_no_cc");
    const two = rankSumTest(hx, hy);
    expectReference(two.pExact!, hw, "ranksum_p_two_sided_exact");
  });

  for (const id of ["mouse_two_sample", "mouse_two_sample_variant_50_31"]) {
    it(`mouse survival (Efron & Tibshirani 1993, Table 2.1; ${id}): U = 36 and exact p`, () => {
      const c = getCase(id);
      const r = rankSumTest(c.data.treatment, c.data.control, { direction: "greater" });
      expectReference(r.u, c, "ranksum_U_treatment");
      expectReference(r.pExact!, c, "ranksum_p_greater_exact");
      expectReference(rankSumTest(c.data.treatment, c.data.control).pExact!, c, "ranksum_p_two_sided_exact");
    });
  }

  it("exact distribution equals full enumeration of all splits for small samples (every u, every direction)", () => {
    for (const [n1, n2] of [[1, 1], [1, 4], [2, 3], [3, 3], [4, 2], [5, 6], [7, 4], [6, 8]]) {
      const n = n1 + n2;
      const ws = allRankSums(Array.from({ length: n }, (_, i) => i + 1), n1);
      const us = ws.map((w) => w - (n1 * (n1 + 1)) / 2);
      for (let t = -1; t <= n1 * n2 + 1; t++) {
        const brute = us.filter((u) => u <= t).length / us.length;
        expect(Math.abs(rankSumCdf(t, n1, n2) - brute)).toBeLessThan(1e-14);
      }
      const mean = (n1 * n2) / 2;
      for (let u = 0; u <= n1 * n2; u++) {
        for (const d of ["greater", "less", "two-sided"] as Direction[]) {
          expect(Math.abs(rankSumExactP(u, n1, n2, d) - enumerationP(us, u, mean, d))).toBeLessThan(1e-14);
        }
      }
    }
  });

  it("exact distribution matches BigInt subset counts beyond 2^53 splits (25 vs 35: rescaled path) and below (20 vs 30)", () => {
    for (const [n1, n2] of [[25, 35], [20, 30]]) {
      const counts = bigIntUCounts(n1, n2);
      const total = counts.reduce((a, b) => a + b, 0n);
      let cum = 0n;
      for (let t = 0; t <= n1 * n2; t++) {
        cum += counts[t];
        if (t % 37 !== 0 && t !== (n1 * n2) / 2) continue;
        // cum/total as a double: scale to keep 60 significant bits
        const want = Number((cum * 10n ** 18n) / total) / 1e18;
        const got = rankSumCdf(t, n1, n2);
        expect(Math.abs(got - want)).toBeLessThan(1e-15 + 1e-11 * want);
      }
    }
  });

  it("with ties: exact permutation of the mid-ranks equals enumeration; normal variance is tie-corrected", () => {
    const x = [1.5, 2, 2, 3.5, 5];
    const y = [2, 3.5, 0.5, 1.5, 1.5, 0.2];
    const ranks = bruteMidranks(x.concat(y));
    const ws = allRankSums(ranks, x.length);
    const mean = (x.length * 12) / 2;
    for (const d of ["greater", "less", "two-sided"] as Direction[]) {
      const r = rankSumTest(x, y, { direction: d, resamples: 10000 });
      expect(r.ties).toBe(true);
      expect(r.pExact).toBeNull();
      expect(r.pPermutation!.exact).toBe(true);
      expect(r.pPermutation!.resamples).toBe(462); // C(11, 5)
      expect(r.pPermutation!.p).toBe(enumerationP(ws, r.w, mean, d));
      expect(r.pPermutation!.statistic).toBe(r.w);
    }
    // The variance formula equals the variance of W over all splits (exact identity).
    const wm = ws.reduce((a, b) => a + b, 0) / ws.length;
    const wv = ws.reduce((a, b) => a + (b - wm) ** 2, 0) / ws.length;
    const r = rankSumTest(x, y);
    expect(Math.abs(wm - mean)).toBeLessThan(1e-12);
    expect(Math.abs((r.w - mean) / Math.sqrt(wv) - r.z)).toBeLessThan(1e-12);
  });

  it("is symmetric in the samples, invariant to row order, and keeps p in (0, 1]", () => {
    const a = rankSumTest(hx, hy, { direction: "greater" });
    const b = rankSumTest(hy, hx, { direction: "less" });
    expect(b.pExact).toBe(a.pExact);
    expect(Math.abs(b.pNormal - a.pNormal)).toBeLessThan(1e-15);
    const px = permutationOf(hx.length, 4).map((i) => hx[i]);
    const py = permutationOf(hy.length, 8).map((i) => hy[i]);
    expect(rankSumTest(px, py, { direction: "greater" }).pExact).toBe(a.pExact);
    const mid = rankSumTest([1, 4], [2, 3]);
    expect(mid.pExact).toBe(1);
    const extreme = rankSumTest([10, 11, 12], [1, 2, 3]);
    expect(extreme.pExact).toBeCloseTo(2 / 20, 15);
    expect(extreme.pExact!).toBeGreaterThan(0);
  });

  it("large samples beyond the exact work limit use Monte Carlo, which agrees with the normal approximation", () => {
    const u = lcg(17);
    const x = Array.from({ length: 1000 }, () => u() + 0.02);
    const y = Array.from({ length: 1000 }, () => u());
    const r = rankSumTest(x, y, { resamples: 4000, seed: 2 });
    expect(r.ties).toBe(false);
    expect(r.pExact).toBeNull();
    expect(r.pPermutation!.exact).toBe(false);
    const p = r.pNormal;
    expect(Math.abs(r.pPermutation!.p - p)).toBeLessThan(4 * Math.sqrt((p * (1 - p)) / 4000) + 1e-3);
    // …while an extreme observation keeps the exact tail cheap (work ∝ the tail point).
    const far = rankSumTest(x.map((v) => v + 0.95), y, { direction: "greater" });
    expect(far.pExact).not.toBeNull();
    expect(far.pExact!).toBeGreaterThan(0);
    expect(far.pExact!).toBeLessThan(1e-300);
  });

  it("refuses empty or constant samples", () => {
    expect(() => rankSumTest([], [1, 2])).toThrow(RangeError);
    expect(() => rankSumTest([3, 3], [3, 3, 3])).toThrow(RangeError);
  });
});
