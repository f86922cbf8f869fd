/**
 * Benchmark cases of the permutation statistics: distance ratio D, two-sample mean
 * difference, paired sign flips, treatments after blocks. Each baseline does the same
 * number of resamples as the engine path it is compared with, so the ratio is like
 * for like.
 */
import { BenchCase } from "./harness";
import { Rng } from "../../src/random";
import { permutationSNR } from "../../src/snr";
import { twoSampleTest } from "../../src/twosample";
import { pairedTest } from "../../src/paired";
import { blockPermutationTest } from "../../src/blocks";
import { naiveDistanceRatio } from "../naive";

function skewed(rng: Rng, n: number): Float64Array {
  const x = new Float64Array(n);
  for (let i = 0; i < n; i++) x[i] = -Math.log(1 - rng.nextFloat()) * (1 + rng.nextFloat());
  return x;
}

const rng = new Rng(4242);
const d1000 = skewed(rng, 1000);
const labels1000 = Int32Array.from({ length: 1000 }, (_, i) => i % 4);
const two50x = skewed(rng, 50);
const two50y = skewed(rng, 50).map((v) => v + 0.2);
const pairX = skewed(rng, 30);
const pairY = pairX.map((v) => v + 0.3 * (rng.nextFloat() - 0.4));
// 6 blocks × 5 treatments, one plot each, block effects added.
const blockVals = new Float64Array(30);
const blockTreat = new Int32Array(30);
const blockBlock = new Int32Array(30);
for (let b = 0; b < 6; b++) {
  for (let t = 0; t < 5; t++) {
    const i = b * 5 + t;
    blockVals[i] = 5 + b * 0.7 + t * 0.1 + rng.normal();
    blockTreat[i] = t;
    blockBlock[i] = b;
  }
}

function shuffleArray(a: number[]): void {
  for (let i = a.length - 1; i > 0; i--) {
    const j = Math.floor(Math.random() * (i + 1));
    [a[i], a[j]] = [a[j], a[i]];
  }
}

/** Baseline 1: shuffle labels, then D from every pair, O(n²) per resample. */
function naiveDPairs(x: Float64Array, labels: Int32Array, resamples: number): number {
  const lab = Array.from(labels);
  const obs = naiveDistanceRatio(x, lab).d;
  let b = 0;
  for (let r = 0; r < resamples; r++) {
    shuffleArray(lab);
    if (naiveDistanceRatio(x, lab).d >= obs) b++;
  }
  return (b + 1) / (resamples + 1);
}

/** D by splitting into groups and sorting each group, O(n log n) per labelling. */
function dSorting(x: Float64Array, lab: number[], k: number): number {
  const groups: number[][] = Array.from({ length: k }, () => []);
  lab.forEach((g, i) => groups[g].push(x[i]));
  const withinSum = (v: number[]) => {
    v.sort((a, b) => a - b);
    let s = 0;
    for (let r = 0; r < v.length; r++) s += v[r] * (2 * r - v.length + 1);
    return s;
  };
  const all = withinSum(Array.from(x));
  let w = 0, pw = 0;
  for (const g of groups) {
    w += withinSum(g);
    pw += (g.length * (g.length - 1)) / 2;
  }
  const pb = (x.length * (x.length - 1)) / 2 - pw;
  return (all - w) / pb / (w / pw);
}

/** Baseline 2: shuffle labels, then re-sort every group per resample. */
function naiveDSorting(x: Float64Array, labels: Int32Array, k: number, resamples: number): number {
  const lab = Array.from(labels);
  const obs = dSorting(x, lab, k);
  let b = 0;
  for (let r = 0; r < resamples; r++) {
    shuffleArray(lab);
    if (dSorting(x, lab, k) >= obs) b++;
  }
  return (b + 1) / (resamples + 1);
}

/** Baseline: shuffle the pooled array, slice it, means by reduce. */
function naiveTwoSample(x: Float64Array, y: Float64Array, resamples: number): number {
  const mean = (v: number[]) => v.reduce((a, b) => a + b, 0) / v.length;
  const pooled = [...Array.from(x), ...Array.from(y)];
  const obs = Math.abs(mean(Array.from(x)) - mean(Array.from(y)));
  let b = 0;
  for (let r = 0; r < resamples; r++) {
    shuffleArray(pooled);
    if (Math.abs(mean(pooled.slice(0, x.length)) - mean(pooled.slice(x.length))) >= obs) b++;
  }
  return (b + 1) / (resamples + 1);
}

/** Baseline: a fresh array of random signs per resample, mapped and reduced. */
function naivePaired(x: Float64Array, y: Float64Array, resamples: number): number {
  const d = Array.from(x, (v, i) => v - y[i]);
  const obs = Math.abs(d.reduce((a, b) => a + b, 0));
  let b = 0;
  for (let r = 0; r < resamples; r++) {
    const signs = d.map(() => (Math.random() < 0.5 ? -1 : 1));
    if (Math.abs(d.map((v, i) => v * signs[i]).reduce((a, c) => a + c, 0)) >= obs) b++;
  }
  return (b + 1) / (resamples + 1);
}

/** Residual SS of a least-squares fit by normal equations (Gaussian elimination). */
function rss(design: number[][], y: number[]): number {
  const p = design[0].length;
  const a = Array.from({ length: p }, (_, i) => Array.from({ length: p + 1 }, (_, j) => {
    let s = 0;
    for (let r = 0; r < y.length; r++) s += design[r][i] * (j < p ? design[r][j] : y[r]);
    return s;
  }));
  for (let c = 0; c < p; c++) {
    let piv = c;
    for (let r = c + 1; r < p; r++) if (Math.abs(a[r][c]) > Math.abs(a[piv][c])) piv = r;
    [a[c], a[piv]] = [a[piv], a[c]];
    for (let r = 0; r < p; r++) {
      if (r === c) continue;
      const f = a[r][c] / a[c][c];
      for (let j = c; j <= p; j++) a[r][j] -= f * a[c][j];
    }
  }
  const beta = a.map((row, i) => row[p] / row[i]);
  let s = 0;
  for (let r = 0; r < y.length; r++) {
    let fit = 0;
    for (let j = 0; j < p; j++) fit += design[r][j] * beta[j];
    s += (y[r] - fit) ** 2;
  }
  return s;
}

/** Baseline: refit the full and reduced models by least squares for every shuffle inside blocks. */
function naiveBlocked(y: Float64Array, treat: Int32Array, block: Int32Array, kT: number, kB: number, resamples: number): number {
  const yy = Array.from(y);
  const reduced = yy.map((_, r) => Array.from({ length: kB }, (_, b) => (block[r] === b ? 1 : 0)));
  const rssReduced = rss(reduced, yy);
  const fOf = (lab: number[]) => {
    const full = yy.map((_, r) => [...reduced[r], ...Array.from({ length: kT - 1 }, (_, t) => (lab[r] === t + 1 ? 1 : 0))]);
    const rssFull = rss(full, yy);
    return ((rssReduced - rssFull) / (kT - 1)) / (rssFull / (y.length - kB - kT + 1));
  };
  const lab = Array.from(treat);
  const obs = fOf(lab);
  let b = 0;
  for (let r = 0; r < resamples; r++) {
    for (let s = 0; s < kB; s++) {
      const idx = lab.map((_, i) => i).filter((i) => block[i] === s);
      const seg = idx.map((i) => lab[i]);
      shuffleArray(seg);
      idx.forEach((i, j) => (lab[i] = seg[j]));
    }
    if (fOf(lab) >= obs) b++;
  }
  return (b + 1) / (resamples + 1);
}

export const statsCases: BenchCase[] = [
  {
    name: "distance ratio D, n = 1,000, 4 groups, 9,999 resamples (baseline re-sorts groups)",
    run: () => permutationSNR(d1000, labels1000, 4, { resamples: 9999, seed: 1 }),
    baseline: () => naiveDSorting(d1000, labels1000, 4, 9999),
    targetMs: 60,
  },
  {
    name: "distance ratio D, n = 1,000, 4 groups, 100 resamples (baseline O(n²) pairs)",
    run: () => permutationSNR(d1000, labels1000, 4, { resamples: 100, seed: 1 }),
    baseline: () => naiveDPairs(d1000, labels1000, 100),
  },
  {
    name: "two-sample mean difference, 50 + 50, 9,999 resamples",
    run: () => twoSampleTest(two50x, two50y, { resamples: 9999, seed: 1 }),
    baseline: () => naiveTwoSample(two50x, two50y, 9999),
    targetMs: 5,
  },
  {
    name: "paired sign flips, n = 30, 9,999 resamples",
    run: () => pairedTest(pairX, pairY, { resamples: 9999, seed: 1 }),
    baseline: () => naivePaired(pairX, pairY, 9999),
  },
  {
    name: "treatments after blocks, 6 blocks × 5 treatments, 9,999 resamples (baseline refits by least squares)",
    run: () => blockPermutationTest(blockVals, blockTreat, 5, blockBlock, 6, { resamples: 9999, seed: 1 }),
    baseline: () => naiveBlocked(blockVals, blockTreat, blockBlock, 5, 6, 9999),
  },
];
