/**
 * "Do the groups differ?" — the composition behind the panel's first question: group
 * summaries; the permutation F, the distance ratio and a rank test beside the classical
 * F (and Welch's ANOVA); pairwise comparisons with adjusted p and letters; effect sizes.
 *
 * Every number is computed by the same engine call, with the same seed and resamples,
 * as the matching sheet function, so a results block can hold live `=RS.…` formulas
 * that agree with the panel's reading:
 *  - one-way: permutation F (Pitman 1937), distance ratio D (./snr), Kruskal–Wallis H
 *    (Kruskal & Wallis 1952), classical F (Fisher 1925), Welch (1951);
 *  - blocked (an optional block column, e.g. farms): F of treatments after blocks with
 *    shuffles inside blocks (Fisher 1935, ch. V; ./blocks) and Friedman's (1937) test on
 *    the block × treatment cell means (./friedman);
 *  - pairwise: ./pairwise (permutation p per pair, bootstrap interval, Holm, BH or
 *    max-T); with blocks, each pair's labels are shuffled within blocks (Fisher 1935,
 *    ch. V; blockedPairwiseComparisons, where max-T is answered by Holm 1979);
 *    letters: insert–absorb (Piepho 2004) from those rows;
 *  - effect sizes: η², ω² (Olejnik & Algina 2003), Hodges–Lehmann shift (Hodges &
 *    Lehmann 1963) and Cliff's (1993) delta per pair.
 */
import { blockPermutationTest, blockedF } from "../blocks";
import { anovaF, welchAnova } from "../classical";
import { cellMeans, friedman, permutationFriedman } from "../friedman";
import { splitByGroup } from "../groups";
import { kruskalWallis, permutationKW } from "../kruskal";
import { lettersFromPairwise } from "../letters";
import { permutationF } from "../oneway";
import { blockedPairwiseComparisons, pairwiseComparisons } from "../pairwise";
import { PermutationResult } from "../permutation";
import { permutationSNR } from "../snr";
import { describeGroups } from "../summary";
import { groupEffects } from "./group-effects";
import { Stages } from "./progress";
import type { ClassicalOutcome, GroupsRequest, GroupsResult, ProgressFn, TestOutcome } from "./types";

/** The parts of a permutation result a block shows. */
export function outcome(r: PermutationResult): TestOutcome {
  return { statistic: r.statistic, p: r.p, exact: r.exact, resamples: r.resamples, count: r.count, mcInterval: r.mcInterval };
}

/** Runs the group comparison described in the file comment. */
export function analyseGroups(req: GroupsRequest, onProgress?: ProgressFn): GroupsResult {
  const { values, codes, names, options } = req;
  const k = names.length;
  const n = values.length;
  if (n !== codes.length) throw new RangeError("values and groups differ in length");
  if (k < 2) throw new RangeError("there is only one group: a comparison needs at least two");
  const resamples = options.resamples;
  const seed = options.seed;
  const pairs = (k * (k - 1)) / 2;
  // Work estimates (observations × resamples) for the progress bar.
  const blocked = req.blocks !== null && req.blocks.names.length >= 2;
  const stages = new Stages([n, blocked ? 0 : 2 * n, n, pairs * 2 * ((2 * n) / k), 0.01 * n], onProgress);
  // The distance ratio has no blocked form: a blocked design leads with F instead.
  const primary = blocked && req.primary === "SNR" ? "F" : req.primary;

  const summary = describeGroups(values, codes, names);
  const ranked = { resamples, seed };
  let f: TestOutcome;
  let snr: TestOutcome | null = null;
  let rank: TestOutcome | null = null;
  let rankNote: string | undefined;
  let classicalF: ClassicalOutcome;
  let welch: ClassicalOutcome | null = null;
  let rankClassical: ClassicalOutcome | null = null;
  let nullDistribution: Float64Array = new Float64Array(0);
  let blocksInfo: GroupsResult["blocks"] = null;
  const keep = (w: string) => primary === w;

  if (blocked) {
    const b = req.blocks!;
    const kB = b.names.length;
    const cf = blockedF(values, codes, k, b.codes, kB);
    classicalF = { statistic: cf.f, df1: cf.df1, df2: cf.df2, p: cf.p };
    const pf = blockPermutationTest(values, codes, k, b.codes, kB, { ...ranked, keepNull: keep("F"), onProgress: stages.next() });
    f = outcome(pf);
    if (pf.nullDistribution) nullDistribution = pf.nullDistribution;
    stages.next();
    // Friedman on cell means; needs every treatment in every block.
    const cells = new Int32Array(k * kB);
    for (let i = 0; i < n; i++) cells[b.codes[i] * k + codes[i]]++;
    const complete = cells.every((c) => c > 0);
    blocksInfo = { names: b.names.slice(), complete };
    if (complete) {
      const m = cellMeans(values, codes, k, b.codes, kB);
      try {
        const fr = friedman(m.values, m.treatCodes, k, m.blockCodes, kB);
        rankClassical = { statistic: fr.chi2, df1: fr.df, df2: null, p: fr.p };
        const pr = permutationFriedman(m.values, m.treatCodes, k, m.blockCodes, kB, { ...ranked, keepNull: keep("RANK"), onProgress: stages.next() });
        rank = outcome(pr);
        if (keep("RANK") && pr.nullDistribution) nullDistribution = pr.nullDistribution;
      } catch (e) {
        if (!(e instanceof RangeError)) throw e;
        rankNote = e.message;
        stages.next();
      }
    } else {
      rankNote = "the rank test needs every group on every block";
      stages.next();
    }
  } else {
    const cf = anovaF(values, codes, k);
    classicalF = { statistic: cf.f, df1: cf.df1, df2: cf.df2, p: cf.p };
    try {
      const w = welchAnova(values, codes, k);
      welch = { statistic: w.f, df1: w.df1, df2: w.df2, p: w.p };
    } catch (e) {
      if (!(e instanceof RangeError)) throw e;
    }
    const pf = permutationF(values, codes, k, { ...ranked, keepNull: keep("F"), onProgress: stages.next() });
    f = outcome(pf);
    if (pf.nullDistribution) nullDistribution = pf.nullDistribution;
    try {
      const ps = permutationSNR(values, codes, k, { ...ranked, keepNull: keep("SNR"), onProgress: stages.next() });
      snr = outcome(ps);
      if (ps.nullDistribution) nullDistribution = ps.nullDistribution;
    } catch (e) {
      if (!(e instanceof RangeError)) throw e;
    }
    try {
      const kw = kruskalWallis(values, codes, k);
      rankClassical = { statistic: kw.h, df1: kw.df, df2: null, p: kw.p };
      const pk = permutationKW(values, codes, k, { ...ranked, keepNull: keep("RANK"), onProgress: stages.next() });
      rank = outcome(pk);
      if (pk.nullDistribution) nullDistribution = pk.nullDistribution;
    } catch (e) {
      if (!(e instanceof RangeError)) throw e;
      rankNote = e.message;
      stages.next();
    }
  }

  const pairOptions = { adjust: options.adjust, level: options.level, resamples, seed, onProgress: stages.next() };
  // With blocks, each pair is compared by shuffles within blocks ("maxt" answered by Holm).
  const pairwise = blocked
    ? blockedPairwiseComparisons(values, codes, names, req.blocks!.codes, req.blocks!.names.length, pairOptions)
    : pairwiseComparisons(values, codes, names, pairOptions);
  const letters = lettersFromPairwise(names, summary.map((s) => s.mean), pairwise, options.alpha);

  stages.next();
  const effects = groupEffects(values, codes, names, splitByGroup(values, codes, k), options.level);
  stages.done();
  return {
    question: "groups",
    n,
    names: names.slice(),
    summary,
    blocks: blocksInfo,
    primary,
    f,
    snr,
    rank,
    rankNote,
    classicalF,
    welch,
    rankClassical,
    pairwise,
    letters,
    effects,
    nullDistribution,
    options,
  };
}
