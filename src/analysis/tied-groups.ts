/**
 * "Do the groups differ?" for large data with few distinct values (e.g. 100,000 plot
 * yields recorded to 0.01 t/ha): every statistic from one shared set of relabellings,
 * each relabelling drawn in O(distinct values × groups) instead of O(rows).
 *
 * Tie compression. Observations with equal values are interchangeable, so a uniformly
 * random relabelling (group sizes fixed) is described completely by how many copies of
 * each distinct value fall in each group: for the distinct values in turn, the counts
 * follow the multivariate hypergeometric distribution given the groups' remaining sizes
 * (drawn as k − 1 conditional hypergeometric variates, ./discrete.ts). The one-way F
 * (Fisher 1925; Pitman 1937), Kruskal–Wallis H on mid-ranks (Kruskal & Wallis 1952), the
 * distance ratio D (../snr: the within-group gap sum in sorted order) and every pair's
 * difference of means follow from those counts. Monte Carlo p = (b + 1)/(m + 1)
 * (Phipson & Smyth 2010), with Clopper–Pearson (1934) Monte Carlo intervals.
 *
 * Pairwise comparisons use the same relabellings of all groups: the raw p of a pair is
 * the share with |difference| at least the observed; "maxt" is the Westfall & Young
 * (1993, Algorithm 2.8) step-down on the studentized differences (Welch-type); Holm
 * (1979) and Benjamini & Hochberg (1995) adjust the raw p. Intervals of the differences
 * are bootstrap intervals (percentile, basic or BCa; Efron 1987) from resampling within
 * each group, again through the counts of its distinct values (sequential binomials of
 * the multinomial), with the BCa acceleration from the two-sample jackknife (Davison &
 * Hinkley 1997, §3.2.1).
 *
 * The work splits into parts with their own seeds (seed/part/parts) that can run in
 * parallel (two Web Workers in the panel); the merged result depends only on the data,
 * resamples, seed and the number of parts — fixed at {@link SHARED_PARTS}.
 */
import { jStat } from "jstat";
import { anovaF, welchAnova } from "../classical";
import { splitByGroup } from "../groups";
import { kruskalWallis } from "../kruskal";
import { lettersFromPairwise } from "../letters";
import { benjaminiHochberg, holm } from "../multiplicity";
import { fFromSS } from "../oneway";
import { PairwiseRow } from "../pairwise";
import { CancelledError, TIE_TOLERANCE, clopperPearson } from "../permutation";
import { Rng } from "../random";
import { describeGroups } from "../summary";
import { bcaLevel, jackknifeAcceleration, leaveOneOutMeans, quantile } from "../bootstrap";
import { binomial, hypergeometric, logFactorials } from "./discrete";
import { groupEffects } from "./group-effects";
import type { ClassicalOutcome, GroupsRequest, GroupsResult, ProgressFn, TestOutcome } from "./types";

/** The shared relabellings always run in this many parts (so results never depend on the machine). */
export const SHARED_PARTS = 2;
/** Rows from which the shared path is used (when the data also have enough ties). */
export const SHARED_MIN_ROWS = 20000;

/** Data compressed to distinct values with their count in each group. */
export interface TiedLayout {
  n: number;
  k: number;
  /** Distinct values, ascending. */
  values: Float64Array;
  /** counts[j·k + g]: copies of values[j] in group g. */
  counts: Int32Array;
  /** Copies of values[j] in all groups. */
  totals: Int32Array;
  /** Mid-rank of values[j] in the pooled sample. */
  midranks: Float64Array;
  sizes: Int32Array;
}

export function tieLayout(values: ArrayLike<number>, codes: ArrayLike<number>, k: number): TiedLayout {
  const n = values.length;
  const order = Int32Array.from({ length: n }, (_, i) => i).sort((a, b) => values[a] - values[b]);
  const distinct: number[] = [];
  for (let i = 0; i < n; i++) {
    const v = values[order[i]];
    if (i === 0 || v !== distinct[distinct.length - 1]) distinct.push(v);
  }
  const D = distinct.length;
  const counts = new Int32Array(D * k);
  const totals = new Int32Array(D);
  const sizes = new Int32Array(k);
  let j = -1;
  let last = NaN;
  for (let i = 0; i < n; i++) {
    const o = order[i];
    if (values[o] !== last) {
      j++;
      last = values[o];
    }
    counts[j * k + codes[o]]++;
    totals[j]++;
    sizes[codes[o]]++;
  }
  const midranks = new Float64Array(D);
  let below = 0;
  for (let d = 0; d < D; d++) {
    midranks[d] = below + (totals[d] + 1) / 2;
    below += totals[d];
  }
  return { n, k, values: Float64Array.from(distinct), counts, totals, midranks, sizes };
}

/** True when the shared tie-compressed path pays: many rows, few distinct values. */
export function useShared(req: GroupsRequest): boolean {
  if (req.blocks !== null || req.values.length < SHARED_MIN_ROWS) return false;
  const seen = new Set<number>();
  for (let i = 0; i < req.values.length; i++) {
    seen.add(req.values[i]);
    if (seen.size * 20 > req.values.length) return false;
  }
  return true;
}

/** Statistics of one labelling, from its counts. */
interface Stats {
  /** Σ S_g² / n_g (monotone in F). */
  fq: number;
  /** Σ R_g² / n_g (monotone in H). */
  hq: number;
  /** Within-group gap sum W (D decreases in W). */
  w: number;
  means: Float64Array;
  vars: Float64Array;
}

/** Accumulates statistics for counts given value by value (the relabelling's inner loop). */
class Accumulator {
  readonly k: number;
  readonly sums: Float64Array;
  readonly squares: Float64Array;
  readonly ranks: Float64Array;
  readonly seen: Float64Array;
  readonly last: Float64Array;
  readonly sizes: Float64Array;
  readonly shift: number;
  w = 0;
  constructor(layout: TiedLayout) {
    this.k = layout.k;
    this.sums = new Float64Array(this.k);
    this.squares = new Float64Array(this.k);
    this.ranks = new Float64Array(this.k);
    this.seen = new Float64Array(this.k);
    this.last = new Float64Array(this.k);
    this.sizes = Float64Array.from(layout.sizes);
    let s = 0;
    for (let j = 0; j < layout.values.length; j++) s += layout.values[j] * layout.totals[j];
    this.shift = s / layout.n;
  }
  reset(first: number): void {
    this.sums.fill(0);
    this.squares.fill(0);
    this.ranks.fill(0);
    this.seen.fill(0);
    this.last.fill(first);
    this.w = 0;
  }
  add(g: number, x: number, value: number, midrank: number): void {
    const c = value - this.shift;
    this.sums[g] += x * c;
    this.squares[g] += x * c * c;
    this.ranks[g] += x * midrank;
    const before = this.seen[g];
    this.w += (value - this.last[g]) * before * (this.sizes[g] - before);
    this.last[g] = value;
    this.seen[g] = before + x;
  }
  stats(out: Stats): void {
    let fq = 0, hq = 0;
    for (let g = 0; g < this.k; g++) {
      const n = this.sizes[g];
      fq += (this.sums[g] * this.sums[g]) / n;
      hq += (this.ranks[g] * this.ranks[g]) / n;
      out.means[g] = this.sums[g] / n;
      out.vars[g] = n > 1 ? Math.max(0, (this.squares[g] - (this.sums[g] * this.sums[g]) / n) / (n - 1)) : 0;
    }
    out.fq = fq;
    out.hq = hq;
    out.w = this.w;
  }
}

function newStats(k: number): Stats {
  return { fq: 0, hq: 0, w: 0, means: new Float64Array(k), vars: new Float64Array(k) };
}

function pairIndex(k: number): [number, number][] {
  const out: [number, number][] = [];
  for (let a = 0; a < k; a++) for (let b = a + 1; b < k; b++) out.push([a, b]);
  return out;
}

function studentized(s: Stats, sizes: Int32Array, pairs: [number, number][], out: Float64Array): void {
  pairs.forEach(([a, b], i) => {
    const se = Math.sqrt(s.vars[a] / sizes[a] + s.vars[b] / sizes[b]);
    const d = Math.abs(s.means[a] - s.means[b]);
    out[i] = se > 0 ? d / se : d > 0 ? Infinity : 0;
  });
}

/** What one part of the work returns (plain data, mergeable). */
export interface SharedPartial {
  part: number;
  parts: number;
  resamples: number;
  countF: number;
  countH: number;
  countD: number;
  /** Per pair: |difference| at least the observed. */
  pairCounts: Float64Array;
  /** Max-T step-down counts, in the order of the observed statistics (largest first). */
  maxT: Float64Array;
  /** The primary statistic's value in each relabelling (as its monotone form). */
  nullPrimary: Float64Array;
  /** Bootstrap group means, replicate by replicate (k per replicate). */
  boot: Float64Array;
}

/** Resamples of part `part` of `parts` (they add up to the total). */
export function partSize(total: number, part: number, parts: number): number {
  return Math.floor(total / parts) + (part < total % parts ? 1 : 0);
}

const atLeast = (t: number, obs: number) => t >= obs - TIE_TOLERANCE * Math.abs(obs);

/** One part of the shared relabellings and bootstrap (see the file comment). */
export function sharedPartial(req: GroupsRequest, part: number, parts: number, onProgress?: ProgressFn): SharedPartial {
  const { values, codes, names, options } = req;
  const k = names.length;
  const layout = tieLayout(values, codes, k);
  const lf = logFactorials(layout.n);
  const D = layout.values.length;
  const pairs = pairIndex(k);
  const P = pairs.length;
  const acc = new Accumulator(layout);
  const obs = newStats(k);
  acc.reset(layout.values[0]);
  for (let j = 0; j < D; j++) for (let g = 0; g < k; g++) {
    const x = layout.counts[j * k + g];
    if (x > 0) acc.add(g, x, layout.values[j], layout.midranks[j]);
  }
  acc.stats(obs);
  const obsDiff = pairs.map(([a, b]) => Math.abs(obs.means[a] - obs.means[b]));
  const obsT = new Float64Array(P);
  studentized(obs, layout.sizes, pairs, obsT);
  const tOrder = Array.from({ length: P }, (_, i) => i).sort((a, b) => obsT[b] - obsT[a] || a - b);

  const R = partSize(options.resamples, part, parts);
  const rng = new Rng(`${options.seed}/${part}/${parts}`);
  const cap = new Int32Array(k);
  const s = newStats(k);
  const t = new Float64Array(P);
  const out: SharedPartial = {
    part, parts, resamples: R, countF: 0, countH: 0, countD: 0,
    pairCounts: new Float64Array(P), maxT: new Float64Array(P), nullPrimary: new Float64Array(R),
    boot: new Float64Array(R * k),
  };
  const report = (f: number) => {
    if (onProgress && onProgress(f) === true) throw new CancelledError();
  };
  // relabellings: half of the part's work, the bootstrap the other half
  for (let b = 0; b < R; b++) {
    for (let g = 0; g < k; g++) cap[g] = layout.sizes[g];
    let N = layout.n;
    acc.reset(layout.values[0]);
    for (let j = 0; j < D; j++) {
      let rem = layout.totals[j];
      let pop = N;
      for (let g = 0; g < k - 1 && rem > 0; g++) {
        const x = hypergeometric(pop, cap[g], rem, lf, rng);
        pop -= cap[g];
        cap[g] -= x;
        rem -= x;
        if (x > 0) acc.add(g, x, layout.values[j], layout.midranks[j]);
      }
      if (rem > 0) {
        cap[k - 1] -= rem;
        acc.add(k - 1, rem, layout.values[j], layout.midranks[j]);
      }
      N -= layout.totals[j];
    }
    acc.stats(s);
    if (atLeast(s.fq, obs.fq)) out.countF++;
    if (atLeast(s.hq, obs.hq)) out.countH++;
    if (atLeast(-s.w, -obs.w)) out.countD++;
    out.nullPrimary[b] = req.primary === "RANK" ? s.hq : req.primary === "SNR" ? s.w : s.fq;
    for (let i = 0; i < P; i++) if (atLeast(Math.abs(s.means[pairs[i][0]] - s.means[pairs[i][1]]), obsDiff[i])) out.pairCounts[i]++;
    studentized(s, layout.sizes, pairs, t);
    let q = -Infinity;
    for (let j = P - 1; j >= 0; j--) {
      const h = tOrder[j];
      if (t[h] > q) q = t[h];
      if (atLeast(q, obsT[h])) out.maxT[j]++;
    }
    if ((b & 63) === 63) report((0.5 * (b + 1)) / R);
  }
  // bootstrap: each group resampled through the counts of its distinct values
  const groupValues: Float64Array[] = [];
  const groupCounts: Int32Array[] = [];
  for (let g = 0; g < k; g++) {
    const vs: number[] = [];
    const cs: number[] = [];
    for (let j = 0; j < D; j++) {
      const c = layout.counts[j * k + g];
      if (c > 0) {
        vs.push(layout.values[j]);
        cs.push(c);
      }
    }
    groupValues.push(Float64Array.from(vs));
    groupCounts.push(Int32Array.from(cs));
  }
  const brng = new Rng(`${options.seed}/boot/${part}/${parts}`);
  for (let b = 0; b < R; b++) {
    for (let g = 0; g < k; g++) {
      const vs = groupValues[g];
      const cs = groupCounts[g];
      let rem = layout.sizes[g];
      let pool = layout.sizes[g];
      let sum = 0;
      for (let j = 0; j < vs.length && rem > 0; j++) {
        const x = j === vs.length - 1 ? rem : binomial(rem, cs[j] / pool, lf, brng);
        sum += x * vs[j];
        rem -= x;
        pool -= cs[j];
      }
      out.boot[b * k + g] = sum / layout.sizes[g];
    }
    if ((b & 63) === 63) report(0.5 + (0.5 * (b + 1)) / R);
  }
  report(1);
  return out;
}

function outcomeOf(count: number, m: number, statistic: number): TestOutcome {
  return { statistic, p: (count + 1) / (m + 1), exact: false, resamples: m, count, mcInterval: clopperPearson(count, m) };
}

/** Bootstrap interval of one difference of means from the merged replicates. */
function pairInterval(d: Float64Array, estimate: number, level: number, method: string, xa: Float64Array, xb: Float64Array): { lower: number; upper: number } {
  d.sort();
  const alpha = (1 - level) / 2;
  const z = (p: number) => jStat.normal.inv(p, 0, 1);
  if (d[0] === d[d.length - 1]) return { lower: estimate, upper: estimate };
  if (method === "percentile") return { lower: quantile(d, alpha), upper: quantile(d, 1 - alpha) };
  if (method === "basic") return { lower: 2 * estimate - quantile(d, 1 - alpha), upper: 2 * estimate - quantile(d, alpha) };
  let below = 0, ties = 0;
  for (let i = 0; i < d.length; i++) {
    if (d[i] < estimate) below++;
    else if (d[i] === estimate) ties++;
  }
  const p0 = (below + 0.5 * ties) / d.length;
  if (p0 <= 0 || p0 >= 1) return { lower: quantile(d, alpha), upper: quantile(d, 1 - alpha) };
  const z0 = z(p0);
  // jackknife of mean(a) − mean(b): leave-one-out means of each group (the other fixed)
  const ma = xa.reduce((s, v) => s + v, 0) / xa.length;
  const mb = xb.reduce((s, v) => s + v, 0) / xb.length;
  const ja = leaveOneOutMeans(xa).map((m) => m - mb);
  const jb = leaveOneOutMeans(xb).map((m) => ma - m);
  const a = jackknifeAcceleration([ja, jb]);
  return { lower: quantile(d, bcaLevel(z0, a, z(alpha))), upper: quantile(d, bcaLevel(z0, a, z(1 - alpha))) };
}

/** Merges the parts into the group comparison's result (same shape as analyseGroups). */
export function finishShared(req: GroupsRequest, partials: SharedPartial[]): GroupsResult {
  const { values, codes, names, options } = req;
  const k = names.length;
  const n = values.length;
  const layout = tieLayout(values, codes, k);
  const ordered = partials.slice().sort((a, b) => a.part - b.part);
  const m = ordered.reduce((s, p) => s + p.resamples, 0);
  const sum = (f: (p: SharedPartial) => number) => ordered.reduce((s, p) => s + f(p), 0);
  const pairs = pairIndex(k);
  const P = pairs.length;

  const summary = describeGroups(values, codes, names);
  const cf = anovaF(values, codes, k);
  const classicalF: ClassicalOutcome = { statistic: cf.f, df1: cf.df1, df2: cf.df2, p: cf.p };
  let welch: ClassicalOutcome | null = null;
  try {
    const w = welchAnova(values, codes, k);
    welch = { statistic: w.f, df1: w.df1, df2: w.df2, p: w.p };
  } catch (e) {
    if (!(e instanceof RangeError)) throw e;
  }
  const kw = kruskalWallis(values, codes, k);
  const rankClassical: ClassicalOutcome = { statistic: kw.h, df1: kw.df, df2: null, p: kw.p };

  // observed statistics and their monotone forms
  let total = 0, sst = 0;
  for (let i = 0; i < n; i++) total += values[i];
  const grand = total / n;
  for (let i = 0; i < n; i++) sst += (values[i] - grand) ** 2;
  const shiftBetween = (fq: number) => Math.max(0, fq); // sums are about the grand mean: Σ S_g²/n_g = SSB
  const fOf = (fq: number) => fFromSS(shiftBetween(fq), sst, n, k);
  let tieSum = 0;
  for (let j = 0; j < layout.totals.length; j++) tieSum += layout.totals[j] ** 3 - layout.totals[j];
  const corr = 1 - tieSum / (n * n * n - n);
  const hOf = (hq: number) => Math.max(0, ((12 / (n * (n + 1))) * hq - 3 * (n + 1)) / corr);
  let pw = 0;
  for (let g = 0; g < k; g++) pw += (layout.sizes[g] * (layout.sizes[g] - 1)) / 2;
  const pb = (n * (n - 1)) / 2 - pw;
  let A = 0, before = 0;
  for (let j = 0; j < layout.values.length; j++) {
    if (j > 0) A += (layout.values[j] - layout.values[j - 1]) * before * (n - before);
    before += layout.totals[j];
  }
  const dOf = (w: number) => (w > 0 ? (Math.max(0, A - w) / pb) / (w / pw) : A > 0 ? Infinity : 1);
  // observed W and rank sums from the data's own counts
  const acc = new Accumulator(layout);
  acc.reset(layout.values[0]);
  for (let j = 0; j < layout.values.length; j++) for (let g = 0; g < k; g++) {
    const x = layout.counts[j * k + g];
    if (x > 0) acc.add(g, x, layout.values[j], layout.midranks[j]);
  }
  const obs = newStats(k);
  acc.stats(obs);

  const f = outcomeOf(sum((p) => p.countF), m, fOf(obs.fq));
  const rank = outcomeOf(sum((p) => p.countH), m, hOf(obs.hq));
  const snr = outcomeOf(sum((p) => p.countD), m, dOf(obs.w));
  const primary = req.primary;
  const nullDistribution = new Float64Array(m);
  let off = 0;
  for (const p of ordered) {
    for (let i = 0; i < p.resamples; i++) {
      const t = p.nullPrimary[i];
      nullDistribution[off + i] = primary === "RANK" ? hOf(t) : primary === "SNR" ? dOf(t) : fOf(t);
    }
    off += p.resamples;
  }

  // pairwise
  const raw = new Float64Array(P);
  for (let i = 0; i < P; i++) raw[i] = (sum((p) => p.pairCounts[i]) + 1) / (m + 1);
  let adjusted: ArrayLike<number>;
  if (options.adjust === "holm") adjusted = holm(raw);
  else if (options.adjust === "bh") adjusted = benjaminiHochberg(raw);
  else if (options.adjust === "maxt") {
    const obsT = new Float64Array(P);
    studentized(obs, layout.sizes, pairs, obsT);
    const tOrder = Array.from({ length: P }, (_, i) => i).sort((a, b) => obsT[b] - obsT[a] || a - b);
    const adj = new Float64Array(P);
    let running = 0;
    for (let j = 0; j < P; j++) {
      const pj = (sum((p) => p.maxT[j]) + 1) / (m + 1);
      running = Math.max(running, Math.min(1, pj));
      adj[tOrder[j]] = running;
    }
    adjusted = adj;
  } else adjusted = raw;
  const groups = splitByGroup(values, codes, k);
  const means = summary.map((s) => s.mean);
  const boot = new Float64Array(m);
  const pairwise: PairwiseRow[] = pairs.map(([a, b], i) => {
    let o = 0;
    for (const p of ordered) {
      for (let r = 0; r < p.resamples; r++) boot[o + r] = p.boot[r * k + a] - p.boot[r * k + b];
      o += p.resamples;
    }
    const est = means[a] - means[b];
    const ci = pairInterval(boot, est, options.level, options.method, groups[a], groups[b]);
    return { a: names[a], b: names[b], difference: est, lower: ci.lower, upper: ci.upper, p: raw[i], pAdjusted: Math.min(1, Math.max(adjusted[i], options.adjust === "maxt" ? raw[i] : 0)), exact: false };
  });
  const letters = lettersFromPairwise(names, means, pairwise, options.alpha);
  const effects = groupEffects(values, codes, names, groups, options.level);
  return {
    question: "groups",
    n,
    names: names.slice(),
    summary,
    blocks: null,
    primary,
    f,
    snr,
    rank,
    classicalF,
    welch,
    rankClassical,
    pairwise,
    letters,
    effects,
    nullDistribution,
    options,
    shared: true,
  };
}

/** The whole shared analysis on this thread (parts one after the other). */
export function analyseGroupsShared(req: GroupsRequest, onProgress?: ProgressFn): GroupsResult {
  const parts: SharedPartial[] = [];
  for (let i = 0; i < SHARED_PARTS; i++) {
    parts.push(sharedPartial(req, i, SHARED_PARTS, onProgress ? (f) => onProgress((i + f) / SHARED_PARTS) : undefined));
  }
  return finishShared(req, parts);
}
