/**
 * The spilled histogram of NULLHIST: equal-width bins over the shuffled statistics and
 * the observed one, for a column chart beside the test.
 *
 * Layout (one header row, then one row per bin, lowest first):
 *   lower | upper | count | observed
 * Bins are [lower, upper) except the last, which includes its upper edge. The range
 * spans the smallest to the largest of the finite shuffled values and the observed
 * value, so the observed value always falls in a bin; its row carries the observed
 * value in the "observed" column, every other row "". A shuffled statistic of +∞ (a
 * relabelling with no spread within groups) counts in the last bin; if the observed
 * statistic itself is +∞, the last row's "observed" cell says "infinite".
 */
import { SheetError, divByZero } from "./errors";
import { ResultCell } from "./job";

export const HISTOGRAM_HEADER: ResultCell[] = ["lower", "upper", "count", "observed"];

export function histogramTable(nullDistribution: ArrayLike<number>, observed: number, bins: number): ResultCell[][] | SheetError {
  let lo = Infinity;
  let hi = -Infinity;
  let used = 0;
  for (let i = 0; i < nullDistribution.length; i++) {
    const t = nullDistribution[i];
    if (t === t) used++;
    if (Number.isFinite(t)) {
      if (t < lo) lo = t;
      if (t > hi) hi = t;
    }
  }
  if (Number.isFinite(observed)) {
    lo = Math.min(lo, observed);
    hi = Math.max(hi, observed);
  }
  if (used === 0 || !Number.isFinite(lo)) return divByZero("the shuffled statistic is undefined for these data (no spread at all).");
  if (hi === lo) {
    const pad = Math.abs(lo) > 0 ? Math.abs(lo) * 0.05 : 0.5;
    lo -= pad;
    hi += pad;
  }
  const width = (hi - lo) / bins;
  const counts = new Float64Array(bins);
  const binOf = (t: number) => {
    if (t === Infinity) return bins - 1;
    if (t === -Infinity) return 0;
    return Math.min(bins - 1, Math.max(0, Math.floor((t - lo) / width)));
  };
  for (let i = 0; i < nullDistribution.length; i++) {
    const t = nullDistribution[i];
    if (t === t) counts[binOf(t)]++;
  }
  const obsBin = observed === observed ? binOf(observed) : -1;
  const out: ResultCell[][] = [HISTOGRAM_HEADER.slice()];
  for (let b = 0; b < bins; b++) {
    const lower = lo + b * width;
    const upper = b === bins - 1 ? hi : lo + (b + 1) * width;
    const mark: ResultCell = b === obsBin ? (Number.isFinite(observed) ? observed : "infinite") : "";
    out.push([lower, upper, counts[b], mark]);
  }
  return out;
}
