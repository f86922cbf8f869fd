/**
 * `npm run calibrate`: Monte Carlo calibration of the engine under skewed data.
 *
 *  1. Type-I error of the permutation tests at α = 0.05 and 0.01 — one-way F, the
 *     distance ratio D, the two-sample difference of means and the studentized (Welch t)
 *     permutation test — under skewed nulls (gamma, lognormal) with unequal group sizes,
 *     and under "equal means, unequal spreads" (the Behrens–Fisher situation, where only
 *     a studentized statistic is expected to keep its level; Janssen 1997).
 *  2. Coverage of 95 % percentile and BCa bootstrap intervals for the mean (normal as a
 *     control, gamma, lognormal) and the median (lognormal) at n = 10, 20, 50, with the share of misses
 *     below and above.
 *
 * Each rate is followed by its Monte Carlo standard error √(r(1 − r)/N). Data sets per
 * cell: N (default 10,000, about 3 minutes on 2 cores; `node scripts/run-ts.js test/bench/calibrate.ts 2000` for fewer),
 * 999 relabellings per test, 1,999 resamples per interval. Deterministic seeds.
 */
import { permutationF } from "../../src/oneway";
import { permutationSNR } from "../../src/snr";
import { twoSampleTest } from "../../src/twosample";
import { bootstrapInterval, IntervalStatistic } from "../../src/bootstrap";
import { Rng } from "../../src/random";

const N = Number(process.argv[2] ?? 10000);
const TEST_RESAMPLES = 999;
const INTERVAL_RESAMPLES = 1999;

/** Gamma(shape a, scale 1) by Marsaglia & Tsang (2000); a < 1 via Gamma(a + 1)·U^{1/a}. */
function gamma(rng: Rng, a: number): number {
  if (a < 1) return gamma(rng, a + 1) * Math.pow(1 - rng.nextFloat(), 1 / a);
  const d = a - 1 / 3;
  const c = 1 / Math.sqrt(9 * d);
  for (;;) {
    let x: number;
    let v: number;
    do {
      x = rng.normal();
      v = 1 + c * x;
    } while (v <= 0);
    v = v * v * v;
    const u = 1 - rng.nextFloat();
    if (Math.log(u) < 0.5 * x * x + d - d * v + d * Math.log(v)) return d * v;
  }
}

type Draw = (rng: Rng, group: number) => number;

interface NullScenario {
  name: string;
  draw: Draw;
}

// Null scenarios. "spread": all groups have mean 2, SDs 2/√a for shapes a = (0.5, 2, 8):
// the largest spread sits in the smallest group (the hard case for unstudentized tests);
// the two-sample tests use the first two groups (sizes 8 and 24, SDs 2.83 and 1.41).
const kSampleScenarios: NullScenario[] = [
  { name: "gamma(2), identical", draw: (r) => gamma(r, 2) },
  { name: "lognormal(0, 1), identical", draw: (r) => Math.exp(r.normal()) },
  { name: "gamma, equal means, SD 2.83 / 1.41 (/ 0.71)", draw: (r, g) => { const a = [0.5, 2, 8][g]; return (2 / a) * gamma(r, a); } },
];
const kSizes = [5, 10, 20];
const twoSizes = [8, 24];

function simulateData(rng: Rng, sizes: number[], draw: Draw): { values: Float64Array; codes: Int32Array } {
  const n = sizes.reduce((a, b) => a + b, 0);
  const values = new Float64Array(n);
  const codes = new Int32Array(n);
  let i = 0;
  sizes.forEach((s, g) => {
    for (let j = 0; j < s; j++, i++) {
      values[i] = draw(rng, g);
      codes[i] = g;
    }
  });
  return { values, codes };
}

function rate(hits: number, total: number): string {
  const r = hits / total;
  return `${r.toFixed(4)} (${Math.sqrt((r * (1 - r)) / total).toFixed(4)})`;
}

function typeOneError(): string[][] {
  const rows: string[][] = [["test", "sizes", "null", "α = 0.05 (SE)", "α = 0.01 (SE)"]];
  type Test = { name: string; sizes: number[]; p: (v: Float64Array, c: Int32Array, seed: number) => number };
  const split = (v: Float64Array, c: Int32Array) => [v.filter((_, i) => c[i] === 0), v.filter((_, i) => c[i] === 1)];
  const tests: Test[] = [
    { name: "one-way F", sizes: kSizes, p: (v, c, seed) => permutationF(v, c, 3, { resamples: TEST_RESAMPLES, seed }).p },
    { name: "distance ratio D", sizes: kSizes, p: (v, c, seed) => permutationSNR(v, c, 3, { resamples: TEST_RESAMPLES, seed }).p },
    {
      name: "two-sample mean difference",
      sizes: twoSizes,
      p: (v, c, seed) => {
        const [x, y] = split(v, c);
        return twoSampleTest(x, y, { statistic: "mean", resamples: TEST_RESAMPLES, seed }).p;
      },
    },
    {
      name: "two-sample Welch t",
      sizes: twoSizes,
      p: (v, c, seed) => {
        const [x, y] = split(v, c);
        return twoSampleTest(x, y, { statistic: "t", resamples: TEST_RESAMPLES, seed }).p;
      },
    },
  ];
  for (const test of tests) {
    for (const sc of kSampleScenarios) {
      const t0 = Date.now();
      const rng = new Rng(`type1|${test.name}|${sc.name}`);
      let r05 = 0;
      let r01 = 0;
      for (let s = 0; s < N; s++) {
        const { values, codes } = simulateData(rng, test.sizes, sc.draw);
        const p = test.p(values, codes, s + 1);
        if (p <= 0.05) r05++;
        if (p <= 0.01) r01++;
      }
      rows.push([test.name, test.sizes.join("/"), sc.name, rate(r05, N), rate(r01, N)]);
      console.error(`  ${test.name} | ${sc.name}: ${((Date.now() - t0) / 1000).toFixed(1)} s`);
    }
  }
  return rows;
}

function coverage(): string[][] {
  const rows: string[][] = [["statistic", "data", "n", "method", "coverage (SE)", "miss low", "miss high"]];
  const cells: { stat: IntervalStatistic; name: string; draw: (r: Rng) => number; truth: number }[] = [
    { stat: "mean", name: "normal (control)", draw: (r) => r.normal(), truth: 0 },
    { stat: "mean", name: "gamma(2)", draw: (r) => gamma(r, 2), truth: 2 },
    { stat: "mean", name: "lognormal(0, 1)", draw: (r) => Math.exp(r.normal()), truth: Math.exp(0.5) },
    { stat: "median", name: "lognormal(0, 1)", draw: (r) => Math.exp(r.normal()), truth: 1 },
  ];
  for (const cell of cells) {
    for (const n of [10, 20, 50]) {
      const t0 = Date.now();
      const rng = new Rng(`coverage|${cell.stat}|${cell.name}|${n}`);
      const hit = { percentile: 0, bca: 0 };
      const low = { percentile: 0, bca: 0 };
      const high = { percentile: 0, bca: 0 };
      const x = new Float64Array(n);
      for (let s = 0; s < N; s++) {
        for (let i = 0; i < n; i++) x[i] = cell.draw(rng);
        for (const method of ["percentile", "bca"] as const) {
          // same seed for both methods: the two intervals come from the same resamples
          const r = bootstrapInterval(x, cell.stat, { method, resamples: INTERVAL_RESAMPLES, seed: s + 1 });
          if (cell.truth < r.lower) low[method]++;
          else if (cell.truth > r.upper) high[method]++;
          else hit[method]++;
        }
      }
      for (const method of ["percentile", "bca"] as const)
        rows.push([cell.stat, cell.name, String(n), method === "bca" ? "BCa" : "percentile", rate(hit[method], N), (low[method] / N).toFixed(4), (high[method] / N).toFixed(4)]);
      console.error(`  coverage ${cell.stat} | ${cell.name} | n = ${n}: ${((Date.now() - t0) / 1000).toFixed(1)} s`);
    }
  }
  return rows;
}

function printTable(rows: string[][]): void {
  const widths = rows[0].map((_, j) => Math.max(...rows.map((r) => r[j].length)));
  const line = (r: string[]) => "| " + r.map((c, j) => c.padEnd(widths[j])).join(" | ") + " |";
  console.log(line(rows[0]));
  console.log("| " + widths.map((w) => "-".repeat(w)).join(" | ") + " |");
  for (const r of rows.slice(1)) console.log(line(r));
}

const start = Date.now();
console.log(`Reshuffle calibration (node ${process.version}): N = ${N} data sets per cell, ${TEST_RESAMPLES} relabellings per test, ${INTERVAL_RESAMPLES} resamples per interval`);
console.log("");
console.log("Type-I error of the permutation tests (rejection rate when the null holds; Monte Carlo SE in brackets)");
console.log("");
printTable(typeOneError());
console.log("");
console.log("Coverage of 95 % bootstrap intervals (true value inside; misses below / above the interval)");
console.log("");
printTable(coverage());
console.log("");
console.log(`total ${((Date.now() - start) / 1000).toFixed(0)} s`);
