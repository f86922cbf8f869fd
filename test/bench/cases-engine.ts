/** Benchmark cases of the permutation engine (one-way F and friends). */
import { BenchCase } from "./harness";
import { permutationF } from "../../src/oneway";
import { Rng } from "../../src/random";

function gammaLike(rng: Rng, n: number): Float64Array {
  const x = new Float64Array(n);
  for (let i = 0; i < n; i++) x[i] = -Math.log(1 - rng.nextFloat()) * (1 + rng.nextFloat());
  return x;
}

const rng = new Rng(42);
const f4x250 = gammaLike(rng, 1000);
const labels4x250 = Int32Array.from({ length: 1000 }, (_, i) => i % 4);

/** Baseline: recompute group means and F from scratch with arrays of arrays, copying labels each time. */
function naiveF(values: Float64Array, labels: Int32Array, resamples: number): number {
  const obs = fNaive(values, Array.from(labels));
  let b = 0;
  const lab = Array.from(labels);
  for (let r = 0; r < resamples; r++) {
    for (let i = lab.length - 1; i > 0; i--) {
      const j = Math.floor(Math.random() * (i + 1));
      [lab[i], lab[j]] = [lab[j], lab[i]];
    }
    if (fNaive(values, lab.slice()) >= obs) b++;
  }
  return (b + 1) / (resamples + 1);
}
function fNaive(values: Float64Array, lab: number[]): number {
  const groups: number[][] = [];
  lab.forEach((g, i) => (groups[g] ??= []).push(values[i]));
  const all = Array.from(values);
  const grand = all.reduce((a, b) => a + b, 0) / all.length;
  let ssb = 0, ssw = 0;
  for (const grp of groups) {
    const m = grp.reduce((a, b) => a + b, 0) / grp.length;
    ssb += grp.length * (m - grand) ** 2;
    for (const v of grp) ssw += (v - m) ** 2;
  }
  return ssb / (groups.length - 1) / (ssw / (all.length - groups.length));
}

export const engineCases: BenchCase[] = [
  {
    name: "one-way F, 4 groups × 250, 9,999 resamples",
    run: () => permutationF(f4x250, labels4x250, 4, { resamples: 9999, seed: 1 }),
    baseline: () => naiveF(f4x250, labels4x250, 9999),
    targetMs: 50,
  },
];
