/**
 * Reshuffle's sheet functions (namespace RS), as Excel sees them. The metadata plugin
 * reads the JSDoc of each top-level function below to build functions.json and appends
 * the CustomFunctions.associate calls; every function hands its arguments to the shared
 * implementation (excel-result.ts → sheet.ts), which never throws.
 *
 * Every range-taking function is cancelable (an edit cancels stale work) and asks for
 * its parameters' addresses, so that blank cells — passed as 0 by Excel on the desktop —
 * can be told from real zeros (blanks.ts).
 */
import "./office-guard";
import { excelCall } from "./excel-result";

/**
 * Permutation p-value that the groups differ: the group labels are shuffled many times and p is the share of shuffles whose statistic is at least the observed one.
 * @customfunction GROUPTEST
 * @param values Measurements: one column or one row of numbers. Blank cells drop their row.
 * @param groups Group label of each measurement (text or numbers), same size as values.
 * @param [statistic] "F" (default, one-way F), "SNR" (distance signal-to-noise ratio) or "RANK" (Kruskal–Wallis).
 * @param [resamples] Number of shuffles, 99 to 1,000,000 (default 9999). Small designs are enumerated exactly.
 * @param [seed] Whole number that fixes the shuffles (default 1): the same seed gives the same p.
 * @param invocation Supplied by Excel.
 * @returns The p-value.
 * @cancelable
 * @requiresParameterAddresses
 */
export function GROUPTEST(values: any[][], groups: any[][], statistic: any, resamples: any, seed: any, invocation: CustomFunctions.CancelableInvocation): Promise<any> {
  return excelCall("GROUPTEST", [values, groups, statistic, resamples, seed], invocation) as Promise<any>;
}

/**
 * The observed statistic for groups: one-way F, the distance signal-to-noise ratio, or Kruskal–Wallis H.
 * @customfunction STAT
 * @param values Measurements: one column or one row of numbers. Blank cells drop their row.
 * @param groups Group label of each measurement (text or numbers), same size as values.
 * @param [statistic] "F" (default), "SNR" or "RANK" (Kruskal–Wallis H).
 * @param invocation Supplied by Excel.
 * @returns The statistic.
 * @cancelable
 * @requiresParameterAddresses
 */
export function STAT(values: any[][], groups: any[][], statistic: any, invocation: CustomFunctions.CancelableInvocation): Promise<any> {
  return excelCall("STAT", [values, groups, statistic], invocation) as Promise<any>;
}

/**
 * Distance signal-to-noise ratio: mean distance between values of different groups divided by the mean distance between values of the same group (1 = no separation).
 * @customfunction SNR
 * @param values Measurements: one column or one row of numbers. Blank cells drop their row.
 * @param groups Group label of each measurement (text or numbers), same size as values.
 * @param invocation Supplied by Excel.
 * @returns The ratio D.
 * @cancelable
 * @requiresParameterAddresses
 */
export function SNR(values: any[][], groups: any[][], invocation: CustomFunctions.CancelableInvocation): Promise<any> {
  return excelCall("SNR", [values, groups], invocation) as Promise<any>;
}

/**
 * Permutation p-value comparing two independent samples (difference of means, of medians, or Welch t).
 * @customfunction TWOTEST
 * @param values1 First sample: one column or one row of numbers. Blank cells are skipped.
 * @param values2 Second sample: one column or one row of numbers. Blank cells are skipped.
 * @param [direction] "two-sided" (default), "greater" (values1 larger) or "less" (values1 smaller).
 * @param [statistic] "mean" (default), "median" or "t" (Welch t, safer when spreads differ).
 * @param [resamples] Number of shuffles, 99 to 1,000,000 (default 9999). Small samples are enumerated exactly.
 * @param [seed] Whole number that fixes the shuffles (default 1).
 * @param invocation Supplied by Excel.
 * @returns The p-value.
 * @cancelable
 * @requiresParameterAddresses
 */
export function TWOTEST(values1: any[][], values2: any[][], direction: any, statistic: any, resamples: any, seed: any, invocation: CustomFunctions.CancelableInvocation): Promise<any> {
  return excelCall("TWOTEST", [values1, values2, direction, statistic, resamples, seed], invocation) as Promise<any>;
}

/**
 * Paired permutation p-value: the sign of each difference values1 − values2 is flipped at random (e.g. before/after readings of the same samples).
 * @customfunction PAIRTEST
 * @param values1 First reading of each pair: one column or one row of numbers.
 * @param values2 Second reading of each pair, row for row with values1. A blank in either drops the pair.
 * @param [direction] "two-sided" (default), "greater" (values1 larger) or "less" (values1 smaller).
 * @param [resamples] Number of sign flips, 99 to 1,000,000 (default 9999). Up to 13 pairs are enumerated exactly.
 * @param [seed] Whole number that fixes the flips (default 1).
 * @param invocation Supplied by Excel.
 * @returns The p-value.
 * @cancelable
 * @requiresParameterAddresses
 */
export function PAIRTEST(values1: any[][], values2: any[][], direction: any, resamples: any, seed: any, invocation: CustomFunctions.CancelableInvocation): Promise<any> {
  return excelCall("PAIRTEST", [values1, values2, direction, resamples, seed], invocation) as Promise<any>;
}

/**
 * Permutation p-value that treatments differ, with labels shuffled only inside each block (e.g. varieties within farms).
 * @customfunction BLOCKTEST
 * @param values Measurements: one column or one row of numbers. Blank cells drop their row.
 * @param treatments Treatment of each measurement (text or numbers), same size as values.
 * @param blocks Block of each measurement (text or numbers), same size as values.
 * @param [statistic] "F" (default, treatments after blocks) or "RANK" (Friedman, on the mean of each block and treatment).
 * @param [resamples] Number of shuffles, 99 to 1,000,000 (default 9999).
 * @param [seed] Whole number that fixes the shuffles (default 1).
 * @param invocation Supplied by Excel.
 * @returns The p-value.
 * @cancelable
 * @requiresParameterAddresses
 */
export function BLOCKTEST(values: any[][], treatments: any[][], blocks: any[][], statistic: any, resamples: any, seed: any, invocation: CustomFunctions.CancelableInvocation): Promise<any> {
  return excelCall("BLOCKTEST", [values, treatments, blocks, statistic, resamples, seed], invocation) as Promise<any>;
}

/**
 * Permutation p-value of association between two columns: y is shuffled against x.
 * @customfunction CORRTEST
 * @param x First variable: one column or one row of numbers.
 * @param y Second variable, row for row with x. A blank in either drops the row.
 * @param [method] "pearson" (default) or "spearman" (ranks).
 * @param [direction] "two-sided" (default), "greater" (positive association) or "less" (negative).
 * @param [resamples] Number of shuffles, 99 to 1,000,000 (default 9999).
 * @param [seed] Whole number that fixes the shuffles (default 1).
 * @param invocation Supplied by Excel.
 * @returns The p-value.
 * @cancelable
 * @requiresParameterAddresses
 */
export function CORRTEST(x: any[][], y: any[][], method: any, direction: any, resamples: any, seed: any, invocation: CustomFunctions.CancelableInvocation): Promise<any> {
  return excelCall("CORRTEST", [x, y, method, direction, resamples, seed], invocation) as Promise<any>;
}

/**
 * Bootstrap confidence interval of a summary of one sample; spills estimate, lower, upper in one row.
 * @customfunction INTERVAL
 * @param values The sample: one column or one row of numbers. Blank cells are skipped.
 * @param [statistic] "mean" (default), "median", "sd", "cv" (CV %) or "trimmed" (10 % trimmed mean).
 * @param [level] Confidence level between 0 and 1 (default 0.95).
 * @param [method] "BCa" (default), "percentile" or "basic".
 * @param [resamples] Number of bootstrap resamples, 99 to 1,000,000 (default 9999).
 * @param [seed] Whole number that fixes the resamples (default 1).
 * @param invocation Supplied by Excel.
 * @returns One row: estimate, lower, upper.
 * @cancelable
 * @requiresParameterAddresses
 */
export function INTERVAL(values: any[][], statistic: any, level: any, method: any, resamples: any, seed: any, invocation: CustomFunctions.CancelableInvocation): Promise<any[][]> {
  return excelCall("INTERVAL", [values, statistic, level, method, resamples, seed], invocation) as Promise<any[][]>;
}

/**
 * Bootstrap confidence interval of a difference between two samples (or values1 as % of values2); spills difference, lower, upper in one row.
 * @customfunction DIFFINTERVAL
 * @param values1 First sample: one column or one row of numbers. Blank cells are skipped.
 * @param values2 Second (reference) sample. Blank cells are skipped.
 * @param [statistic] "mean" (default, difference of means), "median" (difference of medians) or "ratio" (mean of values1 as % of mean of values2).
 * @param [level] Confidence level between 0 and 1 (default 0.95).
 * @param [method] "BCa" (default), "percentile" or "basic".
 * @param [resamples] Number of bootstrap resamples, 99 to 1,000,000 (default 9999).
 * @param [seed] Whole number that fixes the resamples (default 1).
 * @param invocation Supplied by Excel.
 * @returns One row: difference (or %), lower, upper.
 * @cancelable
 * @requiresParameterAddresses
 */
export function DIFFINTERVAL(values1: any[][], values2: any[][], statistic: any, level: any, method: any, resamples: any, seed: any, invocation: CustomFunctions.CancelableInvocation): Promise<any[][]> {
  return excelCall("DIFFINTERVAL", [values1, values2, statistic, level, method, resamples, seed], invocation) as Promise<any[][]>;
}

/**
 * All pairwise comparisons of group means; spills a table with a header row and one row per pair: groups, difference, interval, p and adjusted p.
 * @customfunction PAIRWISE
 * @param values Measurements: one column or one row of numbers. Blank cells drop their row.
 * @param groups Group label of each measurement (text or numbers); at least 3 values per group.
 * @param [adjust] Adjustment for many comparisons: "holm" (default), "maxt", "bh" or "none".
 * @param [level] Confidence level of the intervals, between 0 and 1 (default 0.95).
 * @param [resamples] Number of shuffles and bootstrap resamples, 99 to 1,000,000 (default 9999).
 * @param [seed] Whole number that fixes the resampling (default 1).
 * @param invocation Supplied by Excel.
 * @returns A table with a header row.
 * @cancelable
 * @requiresParameterAddresses
 */
export function PAIRWISE(values: any[][], groups: any[][], adjust: any, level: any, resamples: any, seed: any, invocation: CustomFunctions.CancelableInvocation): Promise<any[][]> {
  return excelCall("PAIRWISE", [values, groups, adjust, level, resamples, seed], invocation) as Promise<any[][]>;
}

/**
 * Letter display of the pairwise comparisons; spills group, n, mean, letters, highest mean first. Groups sharing a letter are not shown to differ.
 * @customfunction LETTERS
 * @param values Measurements: one column or one row of numbers. Blank cells drop their row.
 * @param groups Group label of each measurement (text or numbers); at least 3 values per group.
 * @param [alpha] Significance level between 0 and 1 (default 0.05).
 * @param [adjust] Adjustment for many comparisons: "holm" (default), "maxt", "bh" or "none".
 * @param [resamples] Number of shuffles, 99 to 1,000,000 (default 9999).
 * @param [seed] Whole number that fixes the resampling (default 1).
 * @param invocation Supplied by Excel.
 * @returns A table with a header row.
 * @cancelable
 * @requiresParameterAddresses
 */
export function LETTERS(values: any[][], groups: any[][], alpha: any, adjust: any, resamples: any, seed: any, invocation: CustomFunctions.CancelableInvocation): Promise<any[][]> {
  return excelCall("LETTERS", [values, groups, alpha, adjust, resamples, seed], invocation) as Promise<any[][]>;
}

/**
 * Summary of each group; spills group, n, mean, median, SD, CV %, min, max with a header row.
 * @customfunction GROUPSUMMARY
 * @param values Measurements: one column or one row of numbers. Blank cells drop their row.
 * @param groups Group label of each measurement (text or numbers), same size as values.
 * @param invocation Supplied by Excel.
 * @returns A table with a header row.
 * @cancelable
 * @requiresParameterAddresses
 */
export function GROUPSUMMARY(values: any[][], groups: any[][], invocation: CustomFunctions.CancelableInvocation): Promise<any[][]> {
  return excelCall("GROUPSUMMARY", [values, groups], invocation) as Promise<any[][]>;
}

/**
 * Permutation p-value that groups differ on several measured traits at once (PERMANOVA on distances between rows).
 * @customfunction TRAITTEST
 * @param traits Block of numbers: one column per trait, one row per plot or sample. A blank cell drops its row.
 * @param groups Group label of each row (text or numbers), one column with as many rows as traits.
 * @param [scale] "standardize" (default: each trait to mean 0, SD 1 first) or "none".
 * @param [resamples] Number of shuffles, 99 to 1,000,000 (default 9999).
 * @param [seed] Whole number that fixes the shuffles (default 1).
 * @param invocation Supplied by Excel.
 * @returns The p-value.
 * @cancelable
 * @requiresParameterAddresses
 */
export function TRAITTEST(traits: any[][], groups: any[][], scale: any, resamples: any, seed: any, invocation: CustomFunctions.CancelableInvocation): Promise<any> {
  return excelCall("TRAITTEST", [traits, groups, scale, resamples, seed], invocation) as Promise<any>;
}

/**
 * Histogram of the shuffled statistic, for a chart; spills lower edge, upper edge, count and the observed value (in its bin's row) with a header row.
 * @customfunction NULLHIST
 * @param values Measurements: one column or one row of numbers. Blank cells drop their row.
 * @param groups Group label of each measurement (text or numbers), same size as values.
 * @param [statistic] "F" (default), "SNR" or "RANK".
 * @param [bins] Number of bins, 2 to 1,000 (default 30).
 * @param [resamples] Number of shuffles, 99 to 1,000,000 (default 9999).
 * @param [seed] Whole number that fixes the shuffles (default 1).
 * @param invocation Supplied by Excel.
 * @returns A table with a header row.
 * @cancelable
 * @requiresParameterAddresses
 */
export function NULLHIST(values: any[][], groups: any[][], statistic: any, bins: any, resamples: any, seed: any, invocation: CustomFunctions.CancelableInvocation): Promise<any[][]> {
  return excelCall("NULLHIST", [values, groups, statistic, bins, resamples, seed], invocation) as Promise<any[][]>;
}
