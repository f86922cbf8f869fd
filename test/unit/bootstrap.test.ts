import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { jStat } from "jstat";
import {
  bootstrapDiffInterval,
  bootstrapInterval,
  bootstrapPairedInterval,
  jackknifeAcceleration,
  leaveOneOutMeans,
  leaveOneOutMedians,
  leaveOneOutTrimmed,
} from "../../src/bootstrap";
import { CancelledError } from "../../src/permutation";
import { Rng } from "../../src/random";
import { getCase, expected, value } from "../reference";
import * as summary from "../../src/summary";

// ---------------------------------------------------------------------------------------
// Straightforward reference versions (allocate freely, O(n²) jackknife), written from the
// textbook definitions (Efron & Tibshirani 1993, ch. 13–14) to cross-check the engine.

const mean = (x: number[]) => x.reduce((a, b) => a + b, 0) / x.length;
const sorted = (x: ArrayLike<number>) => Array.from(x).sort((a, b) => a - b);
const median = (x: number[]) => {
  const s = sorted(x);
  const h = s.length >> 1;
  return s.length % 2 ? s[h] : (s[h - 1] + s[h]) / 2;
};
const sd = (x: number[]) => {
  const m = mean(x);
  return Math.sqrt(x.reduce((a, v) => a + (v - m) ** 2, 0) / (x.length - 1));
};
const cv = (x: number[]) => (100 * sd(x)) / mean(x);
const trimmed = (x: number[]) => {
  const s = sorted(x);
  const g = Math.floor(0.1 * s.length);
  return mean(s.slice(g, s.length - g));
};
const oneStats: Record<string, (x: number[]) => number> = { mean, median, sd, cv, trimmed };
const twoStats: Record<string, (x: number[], y: number[]) => number> = {
  mean: (x, y) => mean(x) - mean(y),
  median: (x, y) => median(x) - median(y),
  ratio: (x, y) => (100 * mean(x)) / mean(y),
};

/** Quantile at (B + 1)p with linear interpolation, clamped — the documented convention. */
function q(s: number[], p: number): number {
  const B = s.length;
  const pos = (B + 1) * p;
  if (pos <= 1) return s[0];
  if (pos >= B) return s[B - 1];
  const i = Math.floor(pos);
  return s[i - 1] + (pos - i) * (s[i] - s[i - 1]);
}

const Phi = (z: number) => jStat.normal.cdf(z, 0, 1);
const PhiInv = (p: number) => jStat.normal.inv(p, 0, 1);

/** Replicates drawn index by index with Rng.int (the engine draws the same stream from the sorted sample). */
function naiveReplicates(groups: number[][], stat: (...g: number[][]) => number, B: number, seed: number): number[] {
  const rng = new Rng(seed);
  const s = groups.map(sorted);
  const out: number[] = [];
  for (let b = 0; b < B; b++) {
    const res = s.map((g) => Array.from({ length: g.length }, () => g[rng.int(g.length)]));
    out.push(stat(...res));
  }
  return out.sort((a, b) => a - b);
}

/** BCa from the definitions: z0 with ties as half, O(n²) jackknife inside each group. */
function naiveBca(groups: number[][], stat: (...g: number[][]) => number, B: number, seed: number, level = 0.95) {
  const reps = naiveReplicates(groups, stat, B, seed);
  const est = stat(...groups);
  const below = reps.filter((r) => r < est).length;
  const ties = reps.filter((r) => r === est).length;
  const z0 = PhiInv((below + 0.5 * ties) / B);
  let num = 0;
  let den = 0;
  groups.forEach((g, gi) => {
    const n = g.length;
    const loo = g.map((_, i) => stat(...groups.map((h, hi) => (hi === gi ? h.filter((_, j) => j !== i) : h))));
    const m = mean(loo);
    const l = loo.map((t) => (n - 1) * (m - t)); // empirical influence values
    num += l.reduce((a, v) => a + v ** 3, 0) / n ** 3;
    den += l.reduce((a, v) => a + v ** 2, 0) / n ** 2;
  });
  const a = den > 0 ? num / (6 * den ** 1.5) : 0;
  const alpha = (1 - level) / 2;
  const adj = (z: number) => Phi(z0 + (z0 + z) / (1 - a * (z0 + z)));
  return { reps, lower: q(reps, adj(PhiInv(alpha))), upper: q(reps, adj(PhiInv(1 - alpha))), a, z0 };
}

function skewed(n: number, seed: number): number[] {
  const rng = new Rng(seed);
  return Array.from({ length: n }, () => Math.round(100 * Math.exp(rng.normal())) / 10);
}

// ---------------------------------------------------------------------------------------

describe("random.ts additions for the bootstrap hot loop", () => {
  it("sumOfDraws, sumsOfDraws and countDraws follow the same stream as int(n)", () => {
    for (const n of [1, 2, 3, 7, 1000, 65537]) {
      const x = Float64Array.from({ length: n }, (_, i) => Math.sin(i + 1));
      const a = new Rng("s" + n);
      const b = new Rng("s" + n);
      let ref = 0;
      for (let i = 0; i < 2 * n + 5; i++) ref += x[b.int(n)];
      expect(a.sumOfDraws(x, 2 * n + 5)).toBe(ref);
      // the two generators stay in step afterwards
      expect(a.nextU32()).toBe(b.nextU32());
      const out = new Float64Array(2);
      const c = new Rng(9);
      const d = new Rng(9);
      c.sumsOfDraws(x, x.map((v) => v * v), n, out);
      let s1 = 0, s2 = 0;
      for (let i = 0; i < n; i++) {
        const j = d.int(n);
        s1 += x[j];
        s2 += x[j] * x[j];
      }
      expect([out[0], out[1]]).toEqual([s1, s2]);
      const counts = new Int32Array(n);
      const e = new Rng(4);
      const f = new Rng(4);
      e.countDraws(counts, 3 * n);
      const ref2 = new Int32Array(n);
      for (let i = 0; i < 3 * n; i++) ref2[f.int(n)]++;
      expect(Array.from(counts)).toEqual(Array.from(ref2));
    }
  });
});

describe("bootstrap SE on the mouse data (Efron & Tibshirani 1993, Table 2.1; shared reference values, cases.json case 2)", () => {
  const mouse = getCase("mouse_two_sample");
  const t: number[] = mouse.data.treatment;
  const c: number[] = mouse.data.control;

  it("ideal (B = ∞) SE of the difference by its exact formula √Σ_g ((n_g − 1)/n_g)·s_g²/n_g = 26.908", () => {
    const ideal = Math.sqrt([t, c].reduce((a, g) => a + (((g.length - 1) / g.length) * sd(g) ** 2) / g.length, 0));
    expect(Math.abs(ideal / value(mouse, "bootstrap_se_diff_ideal_Binf") - 1)).toBeLessThan(1e-9);
  });

  it("Monte Carlo SE of the difference (B = 200,000) is within the listed band of the reference and of the ideal value", () => {
    const r = bootstrapDiffInterval(t, c, "mean", { resamples: 200000, seed: 11 });
    const e = expected(mouse, "bootstrap_se_diff_mc_B200000");
    expect(Math.abs(r.se - e.value)).toBeLessThan(e.tolerance.abs);
    expect(Math.abs(r.se - value(mouse, "bootstrap_se_diff_ideal_Binf"))).toBeLessThan(e.tolerance.abs);
    expect(r.estimate).toBeCloseTo(value(mouse, "mean_difference"), 10);
  });

  it("SE of the treatment mean approaches the published ideal 23.36 (Efron & Tibshirani 1993, Table 2.2)", () => {
    const r = bootstrapInterval(t, "mean", { resamples: 200000, seed: 3 });
    const ideal = value(mouse, "bootstrap_se_treatment_mean_ideal_Binf");
    expect(Math.abs(r.se - ideal)).toBeLessThan((4 * ideal) / Math.sqrt(2 * 200000));
  });
});

describe("engine replicates and intervals equal the straightforward versions", () => {
  const x = skewed(23, 5);
  const y = skewed(17, 6);
  const B = 2000;

  it.each(["mean", "median", "sd", "cv", "trimmed"])("one-sample %s: percentile, basic and BCa", (stat) => {
    const f = oneStats[stat];
    const ref = naiveBca([x], f, B, 8);
    const pc = bootstrapInterval(x, stat as any, { method: "percentile", resamples: B, seed: 8 });
    const tol = (v: number) => 1e-9 * Math.max(1, Math.abs(v));
    expect(Math.abs(pc.lower - q(ref.reps, 0.025))).toBeLessThan(tol(pc.lower));
    expect(Math.abs(pc.upper - q(ref.reps, 0.975))).toBeLessThan(tol(pc.upper));
    const basic = bootstrapInterval(x, stat as any, { method: "basic", resamples: B, seed: 8 });
    expect(Math.abs(basic.lower - (2 * f(x) - q(ref.reps, 0.975)))).toBeLessThan(tol(basic.lower));
    expect(Math.abs(basic.upper - (2 * f(x) - q(ref.reps, 0.025)))).toBeLessThan(tol(basic.upper));
    const bca = bootstrapInterval(x, stat as any, { resamples: B, seed: 8 });
    expect(bca.method).toBe("BCa");
    expect(Math.abs(bca.lower - ref.lower)).toBeLessThan(tol(bca.lower));
    expect(Math.abs(bca.upper - ref.upper)).toBeLessThan(tol(bca.upper));
    expect(Math.abs(bca.estimate - f(x))).toBeLessThan(tol(bca.estimate));
    const sdReps = sd(ref.reps);
    expect(Math.abs(bca.se - sdReps)).toBeLessThan(1e-9 * sdReps);
  });

  it.each(["mean", "median", "ratio"])("two-sample %s: BCa with jackknives inside each group", (stat) => {
    const ref = naiveBca([x, y], twoStats[stat], B, 21);
    const r = bootstrapDiffInterval(x, y, stat as any, { resamples: B, seed: 21 });
    expect(Math.abs(r.lower - ref.lower)).toBeLessThan(1e-9 * Math.max(1, Math.abs(r.lower)));
    expect(Math.abs(r.upper - ref.upper)).toBeLessThan(1e-9 * Math.max(1, Math.abs(r.upper)));
  });

  it("median of data with ties: z0 counts replicates equal to the estimate as half", () => {
    const tiesData = [3, 5, 5, 5, 6, 7, 7, 9, 12];
    const ref = naiveBca([tiesData], median, 3000, 2);
    expect(ref.reps.filter((r) => r === 6).length).toBeGreaterThan(100); // many ties with the estimate 6
    const r = bootstrapInterval(tiesData, "median", { resamples: 3000, seed: 2 });
    expect(r.lower).toBeCloseTo(ref.lower, 12);
    expect(r.upper).toBeCloseTo(ref.upper, 12);
  });

  it("O(n) leave-one-out formulas equal deleting each value (O(n²))", () => {
    const s = Float64Array.from(sorted(x));
    const arr = Array.from(s);
    const del = (i: number) => arr.filter((_, j) => j !== i);
    const lm = leaveOneOutMeans(s);
    const lmed = leaveOneOutMedians(s);
    const ltr = leaveOneOutTrimmed(s);
    for (let i = 0; i < arr.length; i++) {
      expect(lm[i]).toBeCloseTo(mean(del(i)), 12);
      expect(lmed[i]).toBeCloseTo(median(del(i)), 12);
      expect(ltr[i]).toBeCloseTo(trimmed(del(i)), 12);
    }
  });

  it("jackknife acceleration of the mean is the skewness formula Σe³ / (6 (Σe²)^{3/2}) (Efron 1987; Efron & Tibshirani 1993, §14.3)", () => {
    const m = mean(x);
    const e = x.map((v) => v - m);
    const closed = e.reduce((a, v) => a + v ** 3, 0) / (6 * e.reduce((a, v) => a + v * v, 0) ** 1.5);
    expect(jackknifeAcceleration([leaveOneOutMeans(x)])).toBeCloseTo(closed, 14);
  });
});

describe("interval properties", () => {
  it("symmetric data give BCa ≈ percentile (a = 0, z0 ≈ 0)", () => {
    const sym = Array.from({ length: 41 }, (_, i) => (i - 20) ** 3 / 100);
    const pc = bootstrapInterval(sym, "mean", { method: "percentile", seed: 4 });
    const bca = bootstrapInterval(sym, "mean", { seed: 4 });
    const width = pc.upper - pc.lower;
    expect(Math.abs(bca.lower - pc.lower)).toBeLessThan(0.03 * width);
    expect(Math.abs(bca.upper - pc.upper)).toBeLessThan(0.03 * width);
    expect(jackknifeAcceleration([leaveOneOutMeans(sym)])).toBeCloseTo(0, 12);
  });

  it("is the same for the same seed and does not depend on row order", () => {
    const x = skewed(30, 12);
    const rev = x.slice().reverse();
    for (const stat of ["mean", "median", "sd", "cv", "trimmed"] as const) {
      const a = bootstrapInterval(x, stat, { seed: "abc" });
      expect(bootstrapInterval(x, stat, { seed: "abc" })).toEqual(a);
      expect(bootstrapInterval(rev, stat, { seed: "abc" })).toEqual(a);
    }
    const y = skewed(12, 13);
    expect(bootstrapDiffInterval(rev, y.slice().reverse(), "ratio")).toEqual(bootstrapDiffInterval(x, y, "ratio"));
  });

  it("a wider level gives a wider interval, containing the estimate for the mean", () => {
    const x = skewed(40, 14);
    const a = bootstrapInterval(x, "mean", { level: 0.8 });
    const b = bootstrapInterval(x, "mean", { level: 0.99 });
    expect(b.lower).toBeLessThan(a.lower);
    expect(b.upper).toBeGreaterThan(a.upper);
    expect(a.lower).toBeLessThan(a.estimate);
    expect(a.upper).toBeGreaterThan(a.estimate);
  });

  it("paired interval is the one-sample interval of the differences (Darwin 1876 via Fisher 1935; cases.json case 1)", () => {
    const d: number[] = getCase("darwin_zea_mays").data.d_cross_minus_self_eighths_inch;
    const y = d.map((_, i) => 100 + i);
    const x = d.map((v, i) => y[i] + v);
    for (const stat of ["mean", "median", "trimmed"] as const)
      expect(bootstrapPairedInterval(x, y, stat)).toEqual(bootstrapInterval(d, stat));
    expect(bootstrapInterval(d, "mean").estimate).toBeCloseTo(314 / 15, 12);
  });

  it("Monte Carlo SE of the median matches the exact bootstrap distribution by full enumeration (n = 5: 3,125 resamples)", () => {
    const x = [2.1, 3.4, 3.9, 7.7, 15.2];
    const all: number[] = [];
    const idx = [0, 0, 0, 0, 0];
    for (let c = 0; c < 3125; c++) {
      let r = c;
      for (let i = 0; i < 5; i++) {
        idx[i] = r % 5;
        r = Math.floor(r / 5);
      }
      all.push(median(idx.map((j) => x[j])));
    }
    const m = mean(all);
    const v = all.reduce((a, t) => a + (t - m) ** 2, 0) / all.length;
    const m4 = all.reduce((a, t) => a + (t - m) ** 4, 0) / all.length;
    const B = 100000;
    const seSe = Math.sqrt((m4 - v * v) / B) / (2 * Math.sqrt(v)); // delta method
    const r = bootstrapInterval(x, "median", { resamples: B, seed: 17 });
    expect(Math.abs(r.se - Math.sqrt(v))).toBeLessThan(4 * seSe);
  });
});

describe("estimates agree with the descriptive summaries (src/summary.ts)", () => {
  it("mean, median, SD, CV % and 10 % trimmed mean are defined alike", () => {
    for (const n of [3, 10, 19, 20, 41]) {
      const x = skewed(n, 30 + n);
      const opts = { resamples: 100 };
      expect(bootstrapInterval(x, "mean", opts).estimate).toBeCloseTo(summary.mean(x), 12);
      expect(bootstrapInterval(x, "median", opts).estimate).toBe(summary.median(x));
      expect(bootstrapInterval(x, "sd", opts).estimate).toBeCloseTo(summary.sd(x), 12);
      expect(bootstrapInterval(x, "cv", opts).estimate).toBeCloseTo((100 * summary.sd(x)) / summary.mean(x), 10);
      expect(bootstrapInterval(x, "trimmed", opts).estimate).toBeCloseTo(summary.trimmedMean(x, 0.1), 12);
    }
  });
});

describe("degenerate data and argument errors", () => {
  it("all values equal give a zero-width interval with a note, never NaN", () => {
    for (const stat of ["mean", "median", "sd", "cv", "trimmed"] as const) {
      const r = bootstrapInterval([4.2, 4.2, 4.2, 4.2], stat, { resamples: 500 });
      expect(r.lower).toBe(r.estimate);
      expect(r.upper).toBe(r.estimate);
      expect(r.se).toBe(0);
      expect(r.note).toMatch(/no width/);
    }
    const d = bootstrapDiffInterval([1, 1, 1], [3, 3, 3, 3], "mean", { resamples: 500 });
    expect([d.estimate, d.lower, d.upper]).toEqual([-2, -2, -2]);
  });

  it("clear RangeErrors for too few values, zero means, bad options", () => {
    expect(() => bootstrapInterval([1, 2], "mean")).toThrow(/at least 3 values/);
    expect(() => bootstrapInterval([0, 0, 0], "cv")).toThrow(/mean is 0/);
    expect(() => bootstrapInterval([-1, 2, 3], "cv")).toThrow(/negative/);
    expect(() => bootstrapDiffInterval([1, 2, 3], [0, 0, 0], "ratio")).toThrow(/reference mean is 0/);
    expect(() => bootstrapInterval([1, 2, NaN], "mean")).toThrow(/not a finite number/);
    expect(() => bootstrapInterval([1, 2, 3], "mean", { level: 95 })).toThrow(/between 0 and 1/);
    expect(() => bootstrapInterval([1, 2, 3], "mean", { resamples: 10 })).toThrow(/resamples/);
    expect(() => bootstrapInterval([1, 2, 3], "mode" as any)).toThrow(/unknown statistic/);
    expect(() => bootstrapInterval([1, 2, 3], "mean", { method: "student" as any })).toThrow(/unknown interval method/);
    expect(bootstrapInterval([1, 2, 3, 4], "mean", { method: "BCa" as any }).method).toBe("BCa");
  });

  it("small or odd data never give NaN (property)", () => {
    fc.assert(
      fc.property(
        fc.array(fc.integer({ min: 0, max: 6 }), { minLength: 3, maxLength: 9 }),
        fc.constantFrom("mean", "median", "sd", "cv", "trimmed"),
        fc.constantFrom("bca", "percentile", "basic"),
        (xs, stat, method) => {
          let r;
          try {
            r = bootstrapInterval(xs, stat as any, { resamples: 200, method: method as any });
          } catch (e) {
            expect(e).toBeInstanceOf(RangeError);
            return;
          }
          for (const v of [r.estimate, r.lower, r.upper, r.se]) expect(Number.isNaN(v)).toBe(false);
          expect(r.lower).toBeLessThanOrEqual(r.upper);
        },
      ),
      { numRuns: 300 },
    );
  });

  it("onProgress can cancel", () => {
    expect(() => bootstrapInterval(skewed(50, 1), "mean", { resamples: 5000, onProgress: () => true })).toThrow(CancelledError);
  });
});
