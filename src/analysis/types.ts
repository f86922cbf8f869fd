/**
 * The panel's analyses as plain data: what is asked (an {@link AnalysisRequest}) and
 * what comes back (an {@link AnalysisResult}). Requests and results are structured-
 * cloneable, so they cross to and from a Web Worker unchanged.
 */
import type { BootstrapResult, IntervalMethod, IntervalStatistic } from "../bootstrap";
import type { Direction } from "../permutation";
import type { Adjust, PairwiseRow } from "../pairwise";
import type { Description } from "../summary";
import type { ShiftEstimate } from "../effects";
import type { TraitScale } from "../multivariate";

export type Question = "groups" | "paired" | "association" | "precision" | "traits";

/** The group statistic a reading leads with. */
export type GroupStatisticWord = "F" | "SNR" | "RANK";

export interface AnalysisOptions {
  /** Requested resamples (exact enumeration when the distinct relabellings are fewer). */
  resamples: number;
  seed: number;
  /** Level of intervals, e.g. 0.95. */
  level: number;
  /** Threshold for letters and wording, e.g. 0.05. */
  alpha: number;
  adjust: Adjust;
  method: IntervalMethod;
  direction: Direction;
}

export const DEFAULT_OPTIONS: AnalysisOptions = {
  resamples: 9999,
  seed: 1,
  level: 0.95,
  alpha: 0.05,
  adjust: "holm",
  method: "bca",
  direction: "two-sided",
};

export interface GroupsRequest {
  question: "groups";
  values: Float64Array;
  /** Group code 0..k−1 of each value; names indexed by code. */
  codes: Int32Array;
  names: string[];
  /** Blocks (e.g. farms) for a blocked design; null for a one-way layout. */
  blocks: { codes: Int32Array; names: string[] } | null;
  /** Which test the reading leads with. */
  primary: GroupStatisticWord;
  options: AnalysisOptions;
}

export interface PairedRequest {
  question: "paired";
  x: Float64Array;
  y: Float64Array;
  options: AnalysisOptions;
}

export interface AssociationRequest {
  question: "association";
  x: Float64Array;
  y: Float64Array;
  options: AnalysisOptions;
}

export interface PrecisionRequest {
  question: "precision";
  values: Float64Array;
  /** The statistic the reading is about (all five get an interval). */
  statistic: IntervalStatistic;
  options: AnalysisOptions;
}

export interface TraitsRequest {
  question: "traits";
  /** One column per trait, equal lengths. */
  traits: Float64Array[];
  codes: Int32Array;
  names: string[];
  scale: TraitScale;
  options: AnalysisOptions;
}

export type AnalysisRequest = GroupsRequest | PairedRequest | AssociationRequest | PrecisionRequest | TraitsRequest;

/** A resampling test's answer. */
export interface TestOutcome {
  statistic: number;
  p: number;
  exact: boolean;
  /** Relabellings evaluated (all of them when exact). */
  resamples: number;
  /** Relabellings at least as extreme: observed included when exact, b when Monte Carlo. */
  count: number;
  /** 95 % Clopper–Pearson interval of a Monte Carlo p; null when exact. */
  mcInterval: [number, number] | null;
}

/** A classical (distribution-based) test's answer. */
export interface ClassicalOutcome {
  statistic: number;
  df1: number;
  df2: number | null;
  p: number;
}

export type GroupSummaryRow = { group: string } & Description;

export interface PairEffect {
  a: string;
  b: string;
  /** Hodges–Lehmann shift a − b with its distribution-free interval. */
  shift: ShiftEstimate;
  cliffsDelta: number;
}

export interface GroupsResult {
  question: "groups";
  n: number;
  names: string[];
  summary: GroupSummaryRow[];
  blocks: { names: string[]; complete: boolean } | null;
  primary: GroupStatisticWord;
  /** Permutation F (after blocks when blocked). */
  f: TestOutcome;
  /** Distance ratio D (one-way only; null with blocks). */
  snr: TestOutcome | null;
  /** Kruskal–Wallis H (one-way) or Friedman χ² on cell means (blocked). */
  rank: TestOutcome | null;
  /** Why the rank test is missing, when it is. */
  rankNote?: string;
  /** Classical ANOVA F (after blocks when blocked). */
  classicalF: ClassicalOutcome;
  /** Welch's ANOVA (one-way only, when every group has spread). */
  welch: ClassicalOutcome | null;
  /** Classical χ² p of the rank statistic. */
  rankClassical: ClassicalOutcome | null;
  pairwise: PairwiseRow[];
  /** Letters per group, in the order of names. */
  letters: string[];
  effects: { etaSquared: number; omegaSquared: number; pairs: PairEffect[] };
  /** Null distribution of the primary statistic (for the histogram). */
  nullDistribution: Float64Array;
  options: AnalysisOptions;
  /** True when every test came from one shared set of relabellings (large data, ./tied-groups). */
  shared?: boolean;
}

export interface PairedResult {
  question: "paired";
  n: number;
  x: Description;
  y: Description;
  /** Summary of the differences x − y. */
  d: Description;
  signFlip: TestOutcome & { nonZero: number };
  signedRank: { v: number; p: number; how: "exact" | "permutation" | "normal"; outcome: TestOutcome | null } | null;
  pairedT: ClassicalOutcome;
  /** Bootstrap interval of the mean difference. */
  interval: BootstrapResult;
  /** Bootstrap interval of the median difference. */
  medianInterval: BootstrapResult;
  /** Mean difference as % of the mean of y (the reference measurement). */
  percentChange: number;
  /** Pairs with x above y, below y, and equal. */
  counts: { up: number; down: number; same: number };
  nullDistribution: Float64Array;
  options: AnalysisOptions;
}

export interface AssociationResult {
  question: "association";
  n: number;
  x: Description;
  y: Description;
  pearson: TestOutcome;
  spearman: TestOutcome;
  /** Classical t test of Pearson's r. */
  classical: ClassicalOutcome;
  /** Least-squares line y = intercept + slope·x. */
  slope: number;
  intercept: number;
  nullDistribution: Float64Array;
  options: AnalysisOptions;
}

export interface PrecisionResult {
  question: "precision";
  n: number;
  description: Description;
  statistic: IntervalStatistic;
  intervals: { statistic: IntervalStatistic; result: BootstrapResult | null; note?: string }[];
  /** Classical t interval of the mean. */
  tInterval: { lower: number; upper: number; df: number } | null;
  options: AnalysisOptions;
}

export interface TraitsResult {
  question: "traits";
  n: number;
  names: string[];
  traits: { means: number[]; test: TestOutcome; pAdjusted: number }[];
  permanova: TestOutcome & { r2: number };
  dispersion: TestOutcome & { meanDistance: number[] };
  scale: TraitScale;
  options: AnalysisOptions;
}

export type AnalysisResult = GroupsResult | PairedResult | AssociationResult | PrecisionResult | TraitsResult;

/** Progress callback: fraction done in [0, 1]; return true to stop. */
export type ProgressFn = (fraction: number) => boolean | void;
