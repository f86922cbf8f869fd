/**
 * Benchmark cases of the rank tests and summaries: permutation Kruskal–Wallis and
 * Friedman, the exact rank-sum and signed-rank distributions, and selection-based
 * median / trimmed mean. Each baseline is a straightforward implementation of the same
 * work (same resamples, same exact p), so the ratio is like for like.
 */
import { BenchCase } from "./harness";
import { Rng } from "../../src/random";
import { permutationKW } from "../../src/kruskal";
import { permutationFriedman } from "../../src/friedman";
import { rankSumTest } from "../../src/ranksum";
import { signedRankTest } from "../../src/signedrank";
import { median, trimmedMean } from "../../src/summary";

function skewed(rng: Rng, n: number): Float64Array {
  const x = new Float64Array(n);
  for (let i = 0; i < n; i++) x[i] = -Math.log(1 - rng.nextFloat()) * (1 + rng.nextFloat());
  return x;
}

const rng = new Rng(777);
const kw = skewed(rng, 1000);
const kwLabels = Int32Array.from({ length: 1000 }, (_, i) => i % 4);

/** Baseline H: sort a copy of the shuffled data with the labels each time, rank, sum per group. */
function naiveKW(values: Float64Array, labels: Int32Array, resamples: number): number {
  const hOf = (lab: number[]) => {
    const idx = Array.from(values, (_, i) => i).sort((a, b) => values[a] - values[b]);
    const ranks: number[] = new Array(values.length);
    for (let i = 0; i < idx.length; ) {
      let j = i;
      while (j + 1 < idx.length && values[idx[j + 1]] === values[idx[i]]) j++;
      for (let t = i; t <= j; t++) ranks[idx[t]] = (i + j) / 2 + 1;
      i = j + 1;
    }
    const groups: number[][] = [];
    lab.forEach((g, i) => (groups[g] ??= []).push(ranks[i]));
    const n = values.length;
    let s = 0;
    for (const g of groups) s += g.reduce((a, b) => a + b, 0) ** 2 / g.length;
    return (12 / (n * (n + 1))) * s - 3 * (n + 1);
  };
  const lab = Array.from(labels);
  const obs = hOf(lab);
  let b = 0;
  for (let r = 0; r < resamples; r++) {
    for (let i = lab.length - 1; i > 0; i--) {
      const j = Math.floor(Math.random() * (i + 1));
      [lab[i], lab[j]] = [lab[j], lab[i]];
    }
    if (hOf(lab) >= obs) b++;
  }
  return (b + 1) / (resamples + 1);
}

// Rank-sum: 60 vs 60 without ties, exact p near the centre (the costliest tail point).
const rsX = skewed(rng, 60);
const rsY = skewed(rng, 60);

/** Baseline exact U distribution: the Mann–Whitney (1947) recursion f(m, n; u) over every (m, n) sub-table. */
function naiveRankSumP(x: Float64Array, y: Float64Array): number {
  const n1 = x.length;
  const n2 = y.length;
  let u = 0;
  for (const a of x) for (const b of y) if (a > b) u++;
  // f[m][n] is the count vector of U for sizes m, n (as probabilities to avoid overflow).
  let prev: Float64Array[] = [];
  for (let m = 0; m <= n1; m++) {
    const row: Float64Array[] = [];
    for (let n = 0; n <= n2; n++) {
      const f = new Float64Array(m * n + 1);
      if (m === 0 || n === 0) f[0] = 1;
      else {
        const a = prev[n];
        const b = row[n - 1];
        const pm = m / (m + n);
        for (let k = 0; k < a.length; k++) f[k + n] += pm * a[k];
        for (let k = 0; k < b.length; k++) f[k] += (1 - pm) * b[k];
      }
      row.push(f);
    }
    prev = row;
  }
  const f = prev[n2];
  let p = 0;
  for (let k = u; k < f.length; k++) p += f[k];
  return p;
}

// Signed rank: 400 differences without ties, exact.
const srD = skewed(rng, 400).map((v) => v - 0.9);

/** Baseline exact signed-rank distribution: full O(n · n(n+1)/2) count table (no truncation). */
function naiveSignedRankP(d: Float64Array): number {
  const a = Array.from(d, Math.abs);
  const idx = a.map((_, i) => i).sort((i, j) => a[i] - a[j]);
  const n = d.length;
  let v = 0;
  idx.forEach((i, r) => {
    if (d[i] > 0) v += r + 1;
  });
  const max = (n * (n + 1)) / 2;
  let c = new Float64Array(max + 1);
  c[0] = 1;
  for (let i = 1; i <= n; i++) {
    const next = new Float64Array(max + 1);
    for (let s = 0; s <= max; s++) {
      if (c[s] === 0) continue;
      next[s] += 0.5 * c[s];
      if (s + i <= max) next[s + i] += 0.5 * c[s];
    }
    c = next;
  }
  let p = 0;
  for (let s = v; s <= max; s++) p += c[s];
  return p;
}

// Friedman: 20 blocks × 5 treatments.
const frV = new Float64Array(100);
const frT = new Int32Array(100);
const frB = new Int32Array(100);
for (let b = 0; b < 20; b++) for (let t = 0; t < 5; t++) {
  const i = b * 5 + t;
  frV[i] = b + 0.2 * t + rng.normal();
  frT[i] = t;
  frB[i] = b;
}

/** Baseline Friedman: re-rank every block of the shuffled table from scratch, arrays of arrays. */
function naiveFriedman(resamples: number): number {
  const table: number[][] = [];
  for (let b = 0; b < 20; b++) table.push(Array.from(frV.subarray(b * 5, b * 5 + 5)));
  const stat = (tab: number[][]) => {
    const sums = [0, 0, 0, 0, 0];
    for (const row of tab) {
      const order = row.map((_, j) => j).sort((i, j) => row[i] - row[j]);
      order.forEach((j, r) => (sums[j] += r + 1));
    }
    return sums.reduce((a, s) => a + s * s, 0);
  };
  const obs = stat(table);
  let b = 0;
  for (let r = 0; r < resamples; r++) {
    const tab = table.map((row) => {
      const c = row.slice();
      for (let i = c.length - 1; i > 0; i--) {
        const j = Math.floor(Math.random() * (i + 1));
        [c[i], c[j]] = [c[j], c[i]];
      }
      return c;
    });
    if (stat(tab) >= obs) b++;
  }
  return (b + 1) / (resamples + 1);
}

const big = skewed(rng, 100000);
const scratch = new Float64Array(big.length);

export const rankCases: BenchCase[] = [
  {
    name: "Kruskal–Wallis permutation, 4 groups × 250, 9,999 resamples",
    run: () => permutationKW(kw, kwLabels, 4, { resamples: 9999, seed: 1 }),
    baseline: () => naiveKW(kw, kwLabels, 9999),
    targetMs: 60,
    reps: 5,
  },
  {
    name: "rank-sum exact p, 60 vs 60 (no ties)",
    run: () => rankSumTest(rsX, rsY, { direction: "greater" }),
    baseline: () => naiveRankSumP(rsX, rsY),
    targetMs: 10,
  },
  {
    name: "signed-rank exact p, n = 400 (no ties)",
    run: () => signedRankTest(srD, { direction: "greater" }),
    baseline: () => naiveSignedRankP(srD),
    targetMs: 30,
  },
  {
    name: "Friedman permutation, 20 blocks × 5, 9,999 resamples",
    run: () => permutationFriedman(frV, frT, 5, frB, 20, { resamples: 9999, seed: 1 }),
    baseline: () => naiveFriedman(9999),
    targetMs: 40,
    reps: 5,
  },
  {
    name: "median + 10 % trimmed mean by selection, n = 100,000",
    run: () => median(big, scratch) + trimmedMean(big, 0.1, scratch),
    baseline: () => {
      const s = Array.from(big).sort((a, b) => a - b);
      const g = Math.floor(0.1 * s.length);
      let t = 0;
      for (let i = g; i < s.length - g; i++) t += s[i];
      return (s[49999] + s[50000]) / 2 + t / (s.length - 2 * g);
    },
    targetMs: 10,
  },
];
