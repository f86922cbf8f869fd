/**
 * The panel's large-data path (src/analysis/tied-groups.ts, discrete.ts): the
 * hypergeometric and binomial samplers against their exact probability functions
 * (chi-square goodness of fit; formulas from Johnson, Kemp & Kotz 2005, ch. 3 and 6),
 * the relabelling distribution against full enumeration, the observed statistics
 * against the engine's own functions, and the p-values and intervals against the
 * engine's within Monte Carlo error.
 */
import { describe, expect, it } from "vitest";
import { jStat } from "jstat";
import { binomial, hypergeometric, logFactorials } from "../../src/analysis/discrete";
import { finishShared, sharedPartial, tieLayout, useShared, analyseGroupsShared } from "../../src/analysis/tied-groups";
import { DEFAULT_OPTIONS, GroupsRequest } from "../../src/analysis/types";
import { bootstrapDiffInterval } from "../../src/bootstrap";
import { kruskalWallis } from "../../src/kruskal";
import { OneWayF, permutationF } from "../../src/oneway";
import { maxTPairwise } from "../../src/pairwise";
import { Rng } from "../../src/random";
import { midranks } from "../../src/ranks";
import { distanceRatio } from "../../src/snr";

const lf = logFactorials(200000);

function chiSquareP(observed: number[], expected: number[]): number {
  // pool cells with expected < 5 into their neighbour (common practice)
  const o: number[] = [], e: number[] = [];
  let ao = 0, ae = 0;
  for (let i = 0; i < expected.length; i++) {
    ao += observed[i];
    ae += expected[i];
    if (ae >= 5) {
      o.push(ao);
      e.push(ae);
      ao = 0;
      ae = 0;
    }
  }
  if (ae > 0) {
    o[o.length - 1] += ao;
    e[e.length - 1] += ae;
  }
  let x2 = 0;
  for (let i = 0; i < o.length; i++) x2 += (o[i] - e[i]) ** 2 / e[i];
  return 1 - jStat.chisquare.cdf(x2, o.length - 1);
}

const choose = (n: number, k: number) => Math.exp(lf[n] - lf[k] - lf[n - k]);

describe("samplers by inversion from the mode", () => {
  it("hypergeometric draws follow C(K,x)C(N−K,m−x)/C(N,m)", () => {
    const rng = new Rng(7);
    for (const [N, K, m] of [[50, 20, 12], [30, 27, 5], [1000, 3, 400], [200, 100, 150]]) {
      const draws = 100000;
      const counts = new Array(m + 1).fill(0);
      for (let i = 0; i < draws; i++) counts[hypergeometric(N, K, m, lf, rng)]++;
      const pmf = counts.map((_, x) => (x <= K && m - x <= N - K ? (choose(K, x) * choose(N - K, m - x)) / choose(N, m) : 0));
      expect(chiSquareP(counts, pmf.map((p) => p * draws))).toBeGreaterThan(0.001);
    }
  });

  it("hypergeometric mean and variance for trial-sized parameters", () => {
    const rng = new Rng(8);
    const [N, K, m] = [100000, 25000, 170];
    let s = 0, s2 = 0;
    const draws = 200000;
    for (let i = 0; i < draws; i++) {
      const x = hypergeometric(N, K, m, lf, rng);
      s += x;
      s2 += x * x;
    }
    const mean = s / draws;
    const v = s2 / draws - mean * mean;
    const mu = (m * K) / N;
    const sigma2 = (m * K * (N - K) * (N - m)) / (N * N * (N - 1));
    expect(Math.abs(mean - mu)).toBeLessThan(5 * Math.sqrt(sigma2 / draws));
    expect(Math.abs(v - sigma2) / sigma2).toBeLessThan(0.02);
  });

  it("binomial draws follow C(m,x) pˣ (1−p)^(m−x)", () => {
    const rng = new Rng(9);
    for (const [m, p] of [[20, 0.3], [7, 0.95], [300, 0.01], [1000, 0.5]]) {
      const draws = 100000;
      const counts = new Array(m + 1).fill(0);
      for (let i = 0; i < draws; i++) counts[binomial(m, p, lf, rng)]++;
      const pmf = counts.map((_, x) => choose(m, x) * p ** x * (1 - p) ** (m - x));
      expect(chiSquareP(counts, pmf.map((q) => q * draws))).toBeGreaterThan(0.001);
    }
  });
});

function tiedData(n: number, k: number, seed: number, effect = 0): { values: Float64Array; codes: Int32Array } {
  const rng = new Rng(seed);
  const values = new Float64Array(n);
  const codes = new Int32Array(n);
  for (let i = 0; i < n; i++) {
    codes[i] = i % k;
    values[i] = Math.round(10 * (4 + effect * codes[i] + 0.6 * Math.exp(0.5 * rng.normal()))) / 10;
  }
  return { values, codes };
}

function req(values: Float64Array, codes: Int32Array, k: number, o = {}): GroupsRequest {
  return { question: "groups", values, codes, names: Array.from({ length: k }, (_, i) => `g${i}`), blocks: null, primary: "F", options: { ...DEFAULT_OPTIONS, ...o } };
}

describe("tie-compressed relabelling", () => {
  it("keeps counts and mid-ranks of the data (brute force)", () => {
    const { values, codes } = tiedData(500, 3, 1);
    const L = tieLayout(values, codes, 3);
    const r = midranks(values);
    for (let i = 0; i < values.length; i++) {
      const j = L.values.indexOf(values[i]);
      expect(L.midranks[j]).toBe(r[i]);
    }
    expect(L.totals.reduce((a, b) => a + b, 0)).toBe(500);
    expect(Array.from(L.sizes)).toEqual([167, 167, 166]);
  });

  it("draws every labelling of a small tied sample with its exact probability (all 20 enumerated)", () => {
    // values 1,1,2,2,3,3 into two groups of 3: the group-1 sum under all C(6,3) = 20 splits
    const values = Float64Array.from([1, 1, 2, 2, 3, 3]);
    const codes = Int32Array.from([0, 0, 0, 1, 1, 1]);
    const exact = new Map<number, number>();
    for (let a = 0; a < 6; a++) for (let b = a + 1; b < 6; b++) for (let c = b + 1; c < 6; c++) {
      const s = values[a] + values[b] + values[c];
      exact.set(s, (exact.get(s) ?? 0) + 1 / 20);
    }
    const R = 60000;
    const part = sharedPartial(req(values, codes, 2, { resamples: R }), 0, 1);
    // F's monotone form from centred sums: S₁ − 6 (the grand total 12 split in two) gives Σ S²/3 = 2(S₁ − 6)²/3
    const obs = new Map<number, number>();
    for (const q of part.nullPrimary) {
      const d = Math.sqrt((q * 3) / 2);
      obs.set(d, (obs.get(d) ?? 0) + 1);
    }
    const byDev = new Map<number, number>();
    for (const [s, p] of exact) byDev.set(Math.abs(s - 6), (byDev.get(Math.abs(s - 6)) ?? 0) + p);
    const keys = [...byDev.keys()].sort();
    const o = keys.map((d) => [...obs].filter(([x]) => Math.abs(x - d) < 1e-9).reduce((s, [, c]) => s + c, 0));
    expect(o.reduce((a, b) => a + b, 0)).toBe(R);
    expect(chiSquareP(o, keys.map((d) => byDev.get(d)! * R))).toBeGreaterThan(0.001);
  });

  it("gives the engine's observed F, H and D, and p within Monte Carlo error of the engine's", () => {
    const k = 4;
    const { values, codes } = tiedData(4000, k, 3, 0.03);
    const r = finishShared(req(values, codes, k), [0, 1].map((i) => sharedPartial(req(values, codes, k), i, 2)));
    expect(r.f.statistic).toBeCloseTo(new OneWayF(values, codes, k).f(codes), 9);
    expect(r.rank!.statistic).toBeCloseTo(kruskalWallis(values, codes, k).h, 9);
    expect(r.snr!.statistic).toBeCloseTo(distanceRatio(values, codes, k).d, 9);
    const pe = permutationF(values, codes, k, { resamples: 9999, seed: 1 }).p;
    const band = 4 * Math.sqrt((2 * pe * (1 - pe)) / 9999) + 2e-4;
    expect(Math.abs(r.f.p - pe)).toBeLessThan(band);
    expect(r.f.resamples).toBe(9999);
    expect(r.shared).toBe(true);
  });

  it("max-T pairwise p and bootstrap intervals agree with the engine's within Monte Carlo error", () => {
    const k = 3;
    const { values, codes } = tiedData(3000, k, 4, 0.04);
    const q = req(values, codes, k, { adjust: "maxt" });
    const r = analyseGroupsShared(q);
    const engine = maxTPairwise(values, codes, k, { resamples: 9999, seed: 1 });
    r.pairwise.forEach((row, i) => {
      const band = 4 * Math.sqrt((2 * engine[i] * (1 - engine[i])) / 9999) + 3e-4;
      expect(row.pAdjusted).toBeGreaterThanOrEqual(row.p);
      expect(Math.abs(row.pAdjusted - Math.max(engine[i], row.p))).toBeLessThan(band);
    });
    const xa = values.filter((_, i) => codes[i] === 0);
    const xb = values.filter((_, i) => codes[i] === 1);
    const ci = bootstrapDiffInterval(xa, xb, "mean", { resamples: 9999, seed: 1 });
    const width = ci.upper - ci.lower;
    expect(Math.abs(r.pairwise[0].lower - ci.lower)).toBeLessThan(0.05 * width);
    expect(Math.abs(r.pairwise[0].upper - ci.upper)).toBeLessThan(0.05 * width);
    expect(r.pairwise[0].difference).toBeCloseTo(ci.estimate, 12);
  });

  it("is used only for many rows with few distinct values", () => {
    const big = tiedData(30000, 4, 5);
    expect(useShared(req(big.values, big.codes, 4))).toBe(true);
    const small = tiedData(3000, 4, 5);
    expect(useShared(req(small.values, small.codes, 4))).toBe(false);
    const distinct = Float64Array.from(big.values, (v, i) => v + i * 1e-7);
    expect(useShared(req(distinct, big.codes, 4))).toBe(false);
  });

  it("reproduces itself for the same seed and changes with the seed", () => {
    const { values, codes } = tiedData(2000, 3, 6);
    const a = analyseGroupsShared(req(values, codes, 3, { resamples: 999 }));
    const b = analyseGroupsShared(req(values, codes, 3, { resamples: 999 }));
    const c = analyseGroupsShared(req(values, codes, 3, { resamples: 999, seed: 2 }));
    expect(a.f.p).toBe(b.f.p);
    expect(a.pairwise.map((p) => p.lower)).toEqual(b.pairwise.map((p) => p.lower));
    expect(a.nullDistribution).not.toEqual(c.nullDistribution);
  });
});
