import { describe, expect, it } from "vitest";
import { Direction } from "../../src/permutation";
import { signedRankCdf, signedRankExactP } from "../../src/rankdist";
import { signedRankTest } from "../../src/signedrank";
import { getCase } from "../reference";
import { bruteMidranks, enumerationP, expectReference, lcg, permutationOf } from "./check";

/** Brute force: V = Σ ranks with a + sign over all 2^n sign vectors of the given ranks. */
function allSignedSums(ranks: number[]): number[] {
  const n = ranks.length;
  const out: number[] = [];
  for (let mask = 0; mask < 1 << n; mask++) {
    let v = 0;
    for (let i = 0; i < n; i++) if (mask & (1 << i)) v += ranks[i];
    out.push(v);
  }
  return out;
}


/** Exact counts of V for ranks 1..n by a subset-sum recursion in BigInt. */
function bigIntVCounts(n: number): bigint[] {
  const max = (n * (n + 1)) / 2;
  const c = new Array<bigint>(max + 1).fill(0n);
  c[0] = 1n;
  for (let i = 1; i <= n; i++) for (let s = max; s >= i; s--) c[s] += c[s - i];
  return c;
}

// Hamilton depression scale: Hollander & Wolfe (1973), p. 29f — shared reference values (cases.json, case 5).
const hw = getCase("hollander_wolfe_rank_tests");
const sx: number[] = hw.data.signedrank.x_first;
const sy: number[] = hw.data.signedrank.y_second;
const hwD = sx.map((v, i) => v - sy[i]);

// Darwin's Zea mays, differences as given by Fisher (1935), §17 — shared reference values (cases.json, case 1).
const dz = getCase("darwin_zea_mays");
const darwin: number[] = dz.data.d_cross_minus_self_eighths_inch;

describe("Wilcoxon signed-rank test (Wilcoxon 1945)", () => {
  it("Hamilton depression scale (Hollander & Wolfe 1973): V = 40, exact p = 10/512, normal p", () => {
    const r = signedRankTest(hwD, { direction: "greater" });
    expectReference(r.v, hw, "signedrank_V");
    expect(r.n).toBe(9);
    expect(r.ties).toBe(false);
    expectReference(r.pExact!, hw, "signedrank_p_greater_exact");
    expectReference(r.pNormal, hw, "signedrank_p_normal_no_cc");
    expect(r.pPermutation).toBeNull();
  });

  it("Darwin's Zea mays (Fisher 1935): V = 96, exact two-sided 1352/32768 and one-sided 676/32768", () => {
    const two = signedRankTest(darwin);
    expectReference(two.v, dz, "wilcoxon_V_plus");
    expectReference(two.pExact!, dz, "wilcoxon_p_two_sided_exact");
    expectReference(signedRankTest(darwin, { direction: "greater" }).pExact!, dz, "wilcoxon_p_greater_exact");
  });

  it("exact distribution equals enumeration of all 2^n sign vectors (n = 1 … 12, every v and direction)", () => {
    for (let n = 1; n <= 12; n++) {
      const vs = allSignedSums(Array.from({ length: n }, (_, i) => i + 1));
      const max = (n * (n + 1)) / 2;
      for (let t = -1; t <= max + 1; t++) {
        const brute = vs.filter((v) => v <= t).length / vs.length;
        expect(signedRankCdf(t, n)).toBe(brute); // dyadic rationals: exact
      }
      for (let v = 0; v <= max; v++) {
        for (const d of ["greater", "less", "two-sided"] as Direction[]) {
          expect(signedRankExactP(v, n, d)).toBe(enumerationP(vs, v, max / 2, d));
        }
      }
    }
  });

  it("exact distribution matches BigInt counts beyond 2^53 sign vectors (n = 70)", () => {
    const n = 70;
    const counts = bigIntVCounts(n);
    const total = 1n << BigInt(n);
    let cum = 0n;
    for (let t = 0; t <= (n * (n + 1)) / 2; t++) {
      cum += counts[t];
      if (t % 41 !== 0) continue;
      const want = Number((cum * 10n ** 18n) / total) / 1e18;
      expect(Math.abs(signedRankCdf(t, n) - want)).toBeLessThan(1e-15 + 1e-12 * want);
    }
  });

  it("drops zero differences (Wilcoxon's convention) and reports how many", () => {
    const withZeros = [0, ...hwD.slice(0, 4), 0, ...hwD.slice(4)];
    const r = signedRankTest(withZeros, { direction: "greater" });
    expect(r.zeros).toBe(2);
    expect(r.n).toBe(9);
    expect(r.v).toBe(40);
    expect(r.pExact).toBe(signedRankTest(hwD, { direction: "greater" }).pExact);
    expect(() => signedRankTest([0, 0, 0])).toThrow(RangeError);
  });

  it("with ties among |d|: exact sign-flip p of the mid-ranks equals enumeration; tie-corrected variance is exact", () => {
    const d = [1.5, -1.5, 2, 2, -2, 3, 0.5, -4, 4, 4, 0];
    const nz = d.filter((v) => v !== 0);
    const ranks = bruteMidranks(nz.map(Math.abs));
    const vs = allSignedSums(ranks);
    const v = nz.reduce((s, x, i) => (x > 0 ? s + ranks[i] : s), 0);
    const mean = (nz.length * (nz.length + 1)) / 4;
    for (const dir of ["greater", "less", "two-sided"] as Direction[]) {
      const r = signedRankTest(d, { direction: dir, resamples: 5000 });
      expect(r.ties).toBe(true);
      expect(r.pExact).toBeNull();
      expect(r.pPermutation!.exact).toBe(true);
      expect(r.pPermutation!.resamples).toBe(1024);
      expect(r.v).toBe(v);
      expect(r.pPermutation!.p).toBe(enumerationP(vs, v, mean, dir));
    }
    // Var(V) under sign flips is Σ r²/4, which the tie-corrected formula must equal.
    const r = signedRankTest(d);
    const varFlips = ranks.reduce((s, x) => s + x * x, 0) / 4;
    expect(Math.abs((r.v - mean) / Math.sqrt(varFlips) - r.z)).toBeLessThan(1e-12);
  });

  it("keeps the kept null distribution on the V scale", () => {
    const r = signedRankTest([1, 1, -2, 3, 3, 5], { resamples: 100, keepNull: true });
    const kept = Array.from(r.pPermutation!.nullDistribution!);
    expect(kept.length).toBe(64);
    expect(Math.min(...kept)).toBe(0);
    expect(Math.max(...kept)).toBe(21);
    expect(r.pPermutation!.statistic).toBe(r.v);
  });

  it("mirrors under a change of sign, ignores the order of pairs, and keeps p in (0, 1]", () => {
    const g = signedRankTest(darwin, { direction: "greater" });
    const l = signedRankTest(darwin.map((x) => -x), { direction: "less" });
    expect(l.pExact).toBe(g.pExact);
    const p = permutationOf(darwin.length, 3);
    expect(signedRankTest(p.map((i) => darwin[i])).pExact).toBe(signedRankTest(darwin).pExact);
    const allPositive = signedRankTest([1, 2, 3, 4, 5], { direction: "greater" });
    expect(allPositive.pExact).toBe(1 / 32);
    expect(signedRankTest([1, -2, 3, -4, 2.5]).pExact).toBeLessThanOrEqual(1);
  });

  it("large n beyond the exact work limit uses Monte Carlo sign flips, agreeing with the normal approximation", () => {
    const u = lcg(5);
    const d = Array.from({ length: 800 }, () => u() - 0.47);
    const r = signedRankTest(d, { resamples: 4000, seed: 4 });
    expect(r.pExact).toBeNull();
    expect(r.pPermutation!.exact).toBe(false);
    const p = r.pNormal;
    expect(Math.abs(r.pPermutation!.p - p)).toBeLessThan(4 * Math.sqrt((p * (1 - p)) / 4000) + 1e-3);
  });
});
