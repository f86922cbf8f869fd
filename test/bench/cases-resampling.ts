/** Benchmark cases of the bootstrap and the pairwise max-T step-down. */
import { BenchCase } from "./harness";
import { bootstrapInterval } from "../../src/bootstrap";
import { pairwiseComparisons, maxTPairwise } from "../../src/pairwise";
import { Rng } from "../../src/random";
import { jStat } from "jstat";

const rng = new Rng(7);
const n1000 = Float64Array.from({ length: 1000 }, () => Math.exp(0.5 * rng.normal()) * 3);
const six = Float64Array.from({ length: 120 }, (_, i) => Math.exp(0.4 * rng.normal()) * (5 + (i % 6) * 0.2));
const sixCodes = Int32Array.from({ length: 120 }, (_, i) => i % 6);
const sixNames = ["L1", "L2", "L3", "L4", "L5", "L6"];

/** Baseline: BCa of the mean with a fresh array per replicate, reduce() means and an O(n²) jackknife. */
function naiveBcaMean(x: Float64Array, B: number): [number, number] {
  const data = Array.from(x);
  const n = data.length;
  const r = new Rng(1);
  const est = data.reduce((a, b) => a + b, 0) / n;
  const reps: number[] = [];
  for (let b = 0; b < B; b++) {
    const res = data.map(() => data[r.int(n)]);
    reps.push(res.reduce((a, v) => a + v, 0) / n);
  }
  reps.sort((a, b) => a - b);
  const z0 = jStat.normal.inv(reps.filter((v) => v < est).length / B, 0, 1);
  const loo = data.map((_, i) => {
    const rest = data.filter((__, j) => j !== i);
    return rest.reduce((a, v) => a + v, 0) / rest.length;
  });
  const m = loo.reduce((a, b) => a + b, 0) / n;
  const a = loo.reduce((s, t) => s + (m - t) ** 3, 0) / (6 * loo.reduce((s, t) => s + (m - t) ** 2, 0) ** 1.5);
  const q = (z: number) => {
    const p = jStat.normal.cdf(z0 + (z0 + z) / (1 - a * (z0 + z)), 0, 1);
    return reps[Math.min(B - 1, Math.max(0, Math.round((B + 1) * p) - 1))];
  };
  return [q(-1.959964), q(1.959964)];
}

/** Baseline: max-T with arrays of arrays per relabelling and a copied, shuffled label list. */
function naiveMaxT(values: Float64Array, codes: Int32Array, k: number, B: number): number[] {
  const r = new Rng(1);
  const stats = (lab: number[]) => {
    const groups: number[][] = Array.from({ length: k }, () => []);
    lab.forEach((gr, i) => groups[gr].push(values[i]));
    const mean = groups.map((gr) => gr.reduce((a, b) => a + b, 0) / gr.length);
    const v = groups.map((gr, i) => gr.reduce((a, b) => a + (b - mean[i]) ** 2, 0) / (gr.length - 1) / gr.length);
    const out: number[] = [];
    for (let a = 0; a < k; a++) for (let b = a + 1; b < k; b++) out.push(Math.abs(mean[a] - mean[b]) / Math.sqrt(v[a] + v[b]));
    return out;
  };
  const obs = stats(Array.from(codes));
  const order = obs.map((_, i) => i).sort((a, b) => obs[b] - obs[a]);
  const counts = obs.map(() => 0);
  let lab = Array.from(codes);
  for (let b = 0; b < B; b++) {
    lab = lab.slice();
    for (let i = lab.length - 1; i > 0; i--) {
      const j = r.int(i + 1);
      [lab[i], lab[j]] = [lab[j], lab[i]];
    }
    const t = stats(lab);
    order.forEach((h, j) => {
      if (Math.max(...order.slice(j).map((l) => t[l])) >= obs[h]) counts[j]++;
    });
  }
  return counts.map((c) => (c + 1) / (B + 1));
}

export const resamplingCases: BenchCase[] = [
  {
    name: "BCa interval of the mean, n = 1,000, 9,999 resamples",
    run: () => bootstrapInterval(n1000, "mean", { resamples: 9999, seed: 1 }),
    baseline: () => naiveBcaMean(n1000, 9999),
    targetMs: 40,
  },
  {
    name: "BCa interval of the median, n = 1,000, 9,999 resamples",
    run: () => bootstrapInterval(n1000, "median", { resamples: 9999, seed: 1 }),
  },
  {
    name: "max-T step-down only, 6 groups × 20, 9,999 relabellings",
    run: () => maxTPairwise(six, sixCodes, 6, { resamples: 9999, seed: 1 }),
    baseline: () => naiveMaxT(six, sixCodes, 6, 9999),
  },
  {
    name: "pairwise table (15 pairs: intervals, raw p, max-T), 6 groups × 20, 9,999 resamples",
    run: () => pairwiseComparisons(six, sixCodes, sixNames, { adjust: "maxt", resamples: 9999, seed: 1 }),
    reps: 3,
  },
];
