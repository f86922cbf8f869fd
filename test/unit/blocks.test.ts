import { describe, expect, it } from "vitest";
import { blockedF, blockPermutationTest, pseudoInverse } from "../../src/blocks";
import { encodeGroups } from "../../src/groups";
import { Rng } from "../../src/random";
import { getCase, value, expected } from "../reference";

// npk: Yates (1935), Complex experiments, as a randomized complete block design for N
// (6 blocks × 4 plots); values from the shared reference values (cases.json, case 6).
const npk = getCase("npk_rcbd_within_block_permutation");
const rows: any[] = npk.data.rows;
const blocks = encodeGroups(rows.map((r) => r[0]));
const nitrogen = encodeGroups(rows.map((r) => r[1]));
const yieldValues: number[] = rows.map((r) => r[4]);

/** Residual sum of squares of a least-squares fit (normal equations, Gaussian elimination with pivoting). */
function rss(design: number[][], y: number[]): number {
  const p = design[0].length;
  const a = Array.from({ length: p }, (_, i) =>
    Array.from({ length: p + 1 }, (_, j) => design.reduce((s, row, r) => s + row[i] * (j < p ? row[j] : y[r]), 0)),
  );
  for (let c = 0; c < p; c++) {
    let piv = c;
    for (let r = c + 1; r < p; r++) if (Math.abs(a[r][c]) > Math.abs(a[piv][c])) piv = r;
    [a[c], a[piv]] = [a[piv], a[c]];
    if (Math.abs(a[c][c]) < 1e-10) throw new Error("singular design in the test");
    for (let r = 0; r < p; r++) {
      if (r === c) continue;
      const f = a[r][c] / a[c][c];
      for (let j = c; j <= p; j++) a[r][j] -= f * a[c][j];
    }
  }
  const beta = a.map((row, i) => row[p] / row[i]);
  return y.reduce((s, yr, r) => s + (yr - design[r].reduce((f, x, j) => f + x * beta[j], 0)) ** 2, 0);
}

/** Treatments after blocks by comparing the full and the blocks-only least-squares fits. */
function leastSquaresF(y: number[], treat: number[], kT: number, block: number[], kB: number) {
  const reduced = y.map((_, r) => Array.from({ length: kB }, (_, b) => (block[r] === b ? 1 : 0)));
  const full = y.map((_, r) => [...reduced[r], ...Array.from({ length: kT - 1 }, (_, t) => (treat[r] === t + 1 ? 1 : 0))]);
  const rssReduced = rss(reduced, y);
  const rssFull = rss(full, y);
  const mean = y.reduce((a, b) => a + b, 0) / y.length;
  const sst = y.reduce((s, v) => s + (v - mean) ** 2, 0);
  const df1 = kT - 1, df2 = y.length - kB - kT + 1;
  return { ssTreatment: rssReduced - rssFull, ssError: rssFull, ssBlocks: sst - rssReduced, f: (rssReduced - rssFull) / df1 / (rssFull / df2), df1, df2 };
}

/** All distinct arrangements of a multiset of labels. */
function arrangements(labels: number[]): number[][] {
  if (labels.length <= 1) return [labels.slice()];
  const out: number[][] = [];
  const seen = new Set<number>();
  labels.forEach((l, i) => {
    if (seen.has(l)) return;
    seen.add(l);
    for (const rest of arrangements([...labels.slice(0, i), ...labels.slice(i + 1)])) out.push([l, ...rest]);
  });
  return out;
}

function relClose(a: number, b: number, rel: number): void {
  expect(Math.abs(a - b)).toBeLessThanOrEqual(rel * Math.abs(b));
}

describe("treatments after blocks (npk, Yates 1935; cases.json, case 6)", () => {
  it("matches F for N after blocks, its df, classical p and SS_N", () => {
    const r = blockedF(yieldValues, nitrogen.codes, 2, blocks.codes, 6);
    relClose(r.f, value(npk, "F_N_after_blocks"), 1e-9);
    expect([r.df1, r.df2]).toEqual(value(npk, "F_N_df"));
    relClose(r.p, value(npk, "p_N_F"), 1e-6);
    relClose(r.ssTreatment, value(npk, "SS_N"), 1e-9);
    // Complete blocks: SS_T is the one-way treatment SS, Σ T²/r − G²/n (textbook identity, Fisher 1935).
    const tot = [0, 0];
    yieldValues.forEach((v, i) => (tot[nitrogen.codes[i]] += v));
    const g = tot[0] + tot[1];
    relClose(r.ssTreatment, (tot[0] ** 2 + tot[1] ** 2) / 12 - g ** 2 / 24, 1e-12);
    relClose(r.ssTreatment + r.ssBlocks + r.ssError, yieldValues.reduce((s, v) => s + (v - g / 24) ** 2, 0), 1e-12);
  });

  it("exact within-block permutation: 290 of the 6^6 = 46,656 arrangements reach F_obs", () => {
    const r = blockPermutationTest(yieldValues, nitrogen.codes, 2, blocks.codes, 6, { resamples: 46656 });
    expect(r.exact).toBe(true);
    expect(r.resamples).toBe(value(npk, "exact_within_block_n"));
    expect(r.count).toBe(value(npk, "exact_within_block_count_ge"));
    expect(Math.abs(r.p - value(npk, "exact_within_block_p"))).toBeLessThan(1e-12);
    relClose(r.f, value(npk, "F_N_after_blocks"), 1e-9);
    expect([r.df1, r.df2]).toEqual([1, 17]);
  });

  it("Monte Carlo within blocks agrees with the exact p", () => {
    // 40,000 < 46,656 forces Monte Carlo. The reference band (cases.json) is for m = 99,999;
    // here the same rule, 4 Monte Carlo standard errors around the exact p (common practice), at m = 40,000.
    const m = 40000;
    const e = expected(npk, "mc_within_block_p_99999");
    const exact = value(npk, "exact_within_block_p");
    const r = blockPermutationTest(yieldValues, nitrogen.codes, 2, blocks.codes, 6, { resamples: m, seed: 1 });
    expect(r.exact).toBe(false);
    expect(r.p).toBe((r.count + 1) / (m + 1));
    const band = 4 * Math.sqrt((exact * (1 - exact)) / m);
    expect(band).toBeGreaterThan(e.tolerance.abs);
    expect(Math.abs(r.p - exact)).toBeLessThan(band);
  });
});

describe("treatments after blocks: unbalanced and incomplete blocks against least squares", () => {
  it("unbalanced blocks with missing cells: SS, F and df equal the full-vs-reduced least-squares fit", () => {
    const rng = new Rng(31);
    let checked = 0;
    for (let trial = 0; trial < 40; trial++) {
      const kT = 2 + rng.int(3), kB = 2 + rng.int(4);
      const treat: number[] = [], block: number[] = [], y: number[] = [];
      for (let b = 0; b < kB; b++) {
        const size = 2 + rng.int(5);
        for (let j = 0; j < size; j++) {
          // Every treatment in block 0 keeps the design connected; other blocks are random.
          const t = b === 0 ? j % kT : rng.int(kT);
          treat.push(t);
          block.push(b);
          y.push(10 + b + 0.5 * t + rng.normal());
        }
      }
      if (y.length - kB - kT + 1 < 1) continue;
      // Block 0 must hold every treatment for the connectedness the brute force assumes.
      if (new Set(treat.filter((_, i) => block[i] === 0)).size < kT) continue;
      const fast = blockedF(y, treat, kT, block, kB);
      const slow = leastSquaresF(y, treat, kT, block, kB);
      relClose(fast.ssTreatment, slow.ssTreatment, 1e-9);
      relClose(fast.ssError, slow.ssError, 1e-9);
      relClose(fast.ssBlocks, slow.ssBlocks, 1e-9);
      relClose(fast.f, slow.f, 1e-9);
      expect(fast.df1).toBe(slow.df1);
      expect(fast.df2).toBe(slow.df2);
      checked++;
    }
    expect(checked).toBeGreaterThanOrEqual(10);
  });

  it("balanced incomplete blocks (4 treatments in 4 blocks of 3) equal least squares", () => {
    // An algebraic check: the first 12 npk yields (Yates 1935) placed in a balanced incomplete layout.
    const design = [[0, 1, 2], [0, 1, 3], [0, 2, 3], [1, 2, 3]];
    const treat = design.flat();
    const block = design.flatMap((b, i) => b.map(() => i));
    const y = yieldValues.slice(0, 12);
    const fast = blockedF(y, treat, 4, block, 4);
    const slow = leastSquaresF(y, treat, 4, block, 4);
    relClose(fast.ssTreatment, slow.ssTreatment, 1e-9);
    relClose(fast.ssError, slow.ssError, 1e-9);
    relClose(fast.f, slow.f, 1e-9);
    expect([fast.df1, fast.df2]).toEqual([3, 5]);
  });

  it("exact within-block enumeration of an unbalanced design equals a brute-force count with least squares", () => {
    // npk blocks 1–4 (Yates 1935) with the four N × P combinations as treatments, made
    // unbalanced by dropping four plots: blocks of 4, 3, 3 and 2 plots.
    const keep = Array.from({ length: 16 }, (_, i) => i).filter((i) => ![5, 9, 13, 14].includes(i));
    const y = keep.map((i) => yieldValues[i]);
    const treat = keep.map((i) => 2 * Number(rows[i][1]) + Number(rows[i][2]));
    const block = keep.map((i) => Number(rows[i][0]) - 1);
    const r = blockPermutationTest(y, treat, 4, block, 4, { resamples: 5000, keepNull: true });
    expect(r.exact).toBe(true);
    expect(r.resamples).toBe(24 * 6 * 6 * 2);
    const fObs = leastSquaresF(y, treat, 4, block, 4).f;
    relClose(r.f, fObs, 1e-9);
    expect([r.df1, r.df2]).toEqual([3, 5]);
    let count = 0, total = 0;
    const perBlock = [0, 1, 2, 3].map((b) => arrangements(treat.filter((_, i) => block[i] === b)));
    const rec = (b: number, acc: number[]) => {
      if (b === perBlock.length) {
        total++;
        if (leastSquaresF(y, acc, 4, block, 4).f >= fObs * (1 - 1e-9)) count++;
        return;
      }
      for (const arr of perBlock[b]) rec(b + 1, [...acc, ...arr]);
    };
    rec(0, []);
    expect(total).toBe(1728);
    expect(r.count).toBe(count);
    expect(r.p).toBe(count / total);
    expect(r.nullDistribution!.length).toBe(1728);
    // Monte Carlo agrees within 4 standard errors.
    const m = 1000;
    const mc = blockPermutationTest(y, treat, 4, block, 4, { resamples: m, seed: 12 });
    expect(mc.exact).toBe(false);
    expect(Math.abs(mc.p - r.p)).toBeLessThan(4 * Math.sqrt((r.p * (1 - r.p)) / m) + 1 / m);
  });
});

describe("treatments after blocks: properties", () => {
  it("is invariant to row order and to the names of blocks and treatments", () => {
    const n = rows.length;
    const perm = Array.from({ length: n }, (_, i) => (i * 5 + 3) % n);
    const y2 = perm.map((i) => yieldValues[i]);
    const t2 = perm.map((i) => 1 - nitrogen.codes[i]);
    const b2 = perm.map((i) => (blocks.codes[i] * 5 + 2) % 6);
    const a = blockPermutationTest(yieldValues, nitrogen.codes, 2, blocks.codes, 6, { resamples: 46656 });
    const b = blockPermutationTest(y2, t2, 2, b2, 6, { resamples: 46656 });
    relClose(b.f, a.f, 1e-12);
    expect(b.count).toBe(a.count);
    // Monte Carlo: rows are laid out canonically, so row order does not change a single draw.
    const m1 = blockPermutationTest(yieldValues, nitrogen.codes, 2, blocks.codes, 6, { resamples: 5000, seed: 6 });
    const m2 = blockPermutationTest(perm.map((i) => yieldValues[i]), perm.map((i) => nitrogen.codes[i]), 2, perm.map((i) => blocks.codes[i]), 6, { resamples: 5000, seed: 6 });
    expect(m2.count).toBe(m1.count);
    expect(m1.p).toBeGreaterThan(0);
    expect(m1.p).toBeLessThanOrEqual(1);
  });

  it("refuses designs without a within-block treatment contrast or without residual df", () => {
    // Each block holds a single treatment: nothing to compare inside blocks.
    expect(() => blockedF([1, 2, 3, 4], [0, 0, 1, 1], 2, [0, 0, 1, 1], 2)).toThrow(RangeError);
    // Two treatments in a single block of two plots: df2 = 2 − 1 − 1 = 0.
    expect(() => blockedF([1, 2], [0, 1], 2, [0, 0], 1)).toThrow(RangeError);
    expect(() => blockedF([1, 2, NaN, 4], [0, 1, 0, 1], 2, [0, 0, 1, 1], 2)).toThrow(RangeError);
  });

  it("gives F = Infinity (p = 0, never NaN) when treatments and blocks explain every value", () => {
    const y = [1, 3, 2, 4, 5, 7];
    const r = blockedF(y, [0, 1, 0, 1, 0, 1], 2, [0, 0, 1, 1, 2, 2], 3);
    expect(r.f).toBe(Infinity);
    expect(r.p).toBe(0);
    const t = blockPermutationTest(y, [0, 1, 0, 1, 0, 1], 2, [0, 0, 1, 1, 2, 2], 3, { resamples: 100 });
    expect(t.exact).toBe(true);
    expect(t.resamples).toBe(8);
    // The observed arrangement and its mirror (treatments swapped in every block) both fit exactly.
    expect(t.count).toBe(2);
    expect(t.f).toBe(Infinity);
  });

  it("the generalized inverse satisfies C C⁻ C = C on a singular information matrix", () => {
    // C of the incomplete design above: 4 × 4, rank 3 (rows sum to 0).
    const c = Float64Array.from([2, -2 / 3, -2 / 3, -2 / 3, -2 / 3, 2, -2 / 3, -2 / 3, -2 / 3, -2 / 3, 2, -2 / 3, -2 / 3, -2 / 3, -2 / 3, 2]);
    const { inverse, rank } = pseudoInverse(c, 4);
    expect(rank).toBe(3);
    const mul = (a: Float64Array, b: Float64Array) => {
      const o = new Float64Array(16);
      for (let i = 0; i < 4; i++) for (let j = 0; j < 4; j++) for (let k = 0; k < 4; k++) o[i * 4 + j] += a[i * 4 + k] * b[k * 4 + j];
      return o;
    };
    const back = mul(mul(c, inverse), c);
    for (let i = 0; i < 16; i++) expect(Math.abs(back[i] - c[i])).toBeLessThan(1e-12);
  });
});
