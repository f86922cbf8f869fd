/**
 * Friedman test of kT treatments in kB blocks, one observation per block × treatment
 * cell (Friedman 1937).
 *
 * Values are ranked within each block (mid-ranks for ties); R_j is the rank sum of
 * treatment j over the blocks. With the tie correction (Hollander & Wolfe 1973, Ch. 7),
 *
 *   χ²_F = 12 Σ_j (R_j − kB(kT + 1)/2)² / [kB kT (kT + 1) − Σ_b Σ (t³ − t)/(kT − 1)],
 *
 * the inner sum over tie groups of block b; referred to χ² with kT − 1 df. Shuffling
 * treatment labels inside blocks keeps each block's ranks and the denominator, and
 * Σ_j R_j is fixed, so χ²_F is an increasing function of Σ_j R_j²: the permutation test
 * compares that quantity, in O(n) per relabelling.
 */
import { chiSquareUpper } from "./distributions";
import { BlockScheme, PermutationOptions, PermutationResult, permutationTest } from "./permutation";
import { midranks, sortedCopy, tieSumSorted } from "./ranks";

/** A complete block layout with ranks within blocks, in block-contiguous order. */
interface RankedBlocks {
  /** Treatment code of each observation, block by block. */
  treat: Int32Array;
  /** Within-block mid-rank of each observation, same order. */
  ranks: Float64Array;
  /** Start of each block plus a final n (for BlockScheme). */
  starts: Int32Array;
  /** Denominator kB kT (kT + 1) − Σ (t³ − t)/(kT − 1). */
  denominator: number;
}

/**
 * Checks that every block × treatment cell holds exactly one value; throws a RangeError
 * naming the first cell that is empty or repeated (blocks and treatments counted from 1
 * in code order).
 */
function checkComplete(treatCodes: ArrayLike<number>, kT: number, blockCodes: ArrayLike<number>, kB: number, n: number): void {
  if (treatCodes.length !== n || blockCodes.length !== n) throw new RangeError("values, treatments and blocks differ in length");
  if (kT < 2) throw new RangeError("the Friedman test needs at least two treatments");
  if (kB < 1) throw new RangeError("the Friedman test needs at least one block");
  const cells = new Int32Array(kT * kB);
  for (let i = 0; i < n; i++) {
    const t = treatCodes[i];
    const b = blockCodes[i];
    if (!(t >= 0 && t < kT && b >= 0 && b < kB)) throw new RangeError(`row ${i + 1} has a treatment or block code out of range`);
    cells[b * kT + t]++;
  }
  for (let b = 0; b < kB; b++) {
    for (let t = 0; t < kT; t++) {
      const c = cells[b * kT + t];
      if (c === 0) throw new RangeError(`block ${b + 1} has no value for treatment ${t + 1}; the rank test within blocks needs exactly one value per treatment in every block`);
      if (c > 1) throw new RangeError(`block ${b + 1} has ${c} values for treatment ${t + 1}; the rank test within blocks needs exactly one (use the cell means)`);
    }
  }
}

/** Sorts observations by block (stable) and ranks within each block. */
function rankBlocks(values: ArrayLike<number>, treatCodes: ArrayLike<number>, kT: number, blockCodes: ArrayLike<number>, kB: number): RankedBlocks {
  const n = values.length;
  checkComplete(treatCodes, kT, blockCodes, kB, n);
  const starts = new Int32Array(kB + 1);
  for (let b = 0; b < kB; b++) starts[b + 1] = starts[b] + kT;
  const fill = starts.slice(0, kB);
  const ordered = new Float64Array(n);
  const treat = new Int32Array(n);
  for (let i = 0; i < n; i++) {
    const j = fill[blockCodes[i]]++;
    ordered[j] = values[i];
    treat[j] = treatCodes[i];
  }
  const ranks = new Float64Array(n);
  let ties = 0;
  for (let b = 0; b < kB; b++) {
    const seg = ordered.subarray(starts[b], starts[b + 1]);
    ranks.set(midranks(seg), starts[b]);
    ties += tieSumSorted(sortedCopy(seg));
  }
  const denominator = kB * kT * (kT + 1) - ties / (kT - 1);
  if (!(denominator > 0)) throw new RangeError("every block has all values equal, so the rank test within blocks has nothing to compare");
  return { treat, ranks, starts, denominator };
}

/** χ²_F from the treatment rank sums. */
function chi2FromSums(sums: Float64Array, kT: number, kB: number, denominator: number): number {
  const centre = (kB * (kT + 1)) / 2;
  let q = 0;
  for (let j = 0; j < kT; j++) q += (sums[j] - centre) * (sums[j] - centre);
  return (12 * q) / denominator;
}

/**
 * Friedman χ² with the tie correction, df = kT − 1 and the χ² p-value (Friedman 1937;
 * tie correction as in Hollander & Wolfe 1973). Observations may come in any order;
 * every block × treatment cell must hold exactly one value (RangeError otherwise —
 * with replicates, average them first, e.g. with {@link cellMeans}).
 */
export function friedman(
  values: ArrayLike<number>,
  treatCodes: ArrayLike<number>,
  kT: number,
  blockCodes: ArrayLike<number>,
  kB: number,
): { chi2: number; df: number; p: number } {
  const { treat, ranks, denominator } = rankBlocks(values, treatCodes, kT, blockCodes, kB);
  const sums = new Float64Array(kT);
  for (let i = 0; i < ranks.length; i++) sums[treat[i]] += ranks[i];
  const chi2 = chi2FromSums(sums, kT, kB, denominator);
  const df = kT - 1;
  return { chi2, df, p: chiSquareUpper(chi2, df) };
}

/**
 * Permutation Friedman test: treatment labels are shuffled inside each block
 * (BlockScheme; the observations are put in block order internally), p = share of
 * relabellings with χ²_F at least the observed (direction "greater"). Exact over all
 * (kT!)^kB arrangements when at most `resamples`, else Monte Carlo with
 * p = (b + 1)/(m + 1). Same completeness rule as {@link friedman}.
 * Friedman (1937); within-block permutation as in Fisher (1935), ch. V.
 */
export function permutationFriedman(
  values: ArrayLike<number>,
  treatCodes: ArrayLike<number>,
  kT: number,
  blockCodes: ArrayLike<number>,
  kB: number,
  options: PermutationOptions = {},
): PermutationResult & { chi2: number } {
  const { treat, ranks, starts, denominator } = rankBlocks(values, treatCodes, kT, blockCodes, kB);
  const scheme = new BlockScheme(treat, starts);
  const labels = scheme.labels;
  const sums = new Float64Array(kT);
  const n = ranks.length;
  const sumOfSquares = (): number => {
    sums.fill(0);
    for (let i = 0; i < n; i++) sums[labels[i]] += ranks[i];
    let q = 0;
    for (let j = 0; j < kT; j++) q += sums[j] * sums[j];
    return q;
  };
  const r = permutationTest(scheme, sumOfSquares, { ...options, direction: "greater" });
  // χ²_F = 12 (Σ R_j² − kB²kT(kT+1)²/4) / denominator, since Σ_j R_j = kB kT (kT+1)/2.
  const offset = (kB * kB * kT * (kT + 1) * (kT + 1)) / 4;
  const toChi2 = (q: number) => Math.max(0, (12 * (q - offset)) / denominator);
  sums.fill(0);
  for (let i = 0; i < n; i++) sums[treat[i]] += ranks[i];
  const chi2 = chi2FromSums(sums, kT, kB, denominator);
  return { ...r, statistic: chi2, chi2, nullDistribution: r.nullDistribution?.map(toChi2) };
}

/**
 * Mean of the values in each block × treatment cell, as inputs for {@link friedman} when
 * cells hold replicates: returns one value per non-empty cell with its codes (cells in
 * block-major order). Empty cells are left out, so {@link friedman} then reports them.
 * Cell means of a two-way layout (Friedman 1937 ranks one value per cell).
 */
export function cellMeans(
  values: ArrayLike<number>,
  treatCodes: ArrayLike<number>,
  kT: number,
  blockCodes: ArrayLike<number>,
  kB: number,
): { values: Float64Array; treatCodes: Int32Array; blockCodes: Int32Array } {
  const sum = new Float64Array(kT * kB);
  const count = new Int32Array(kT * kB);
  for (let i = 0; i < values.length; i++) {
    const c = blockCodes[i] * kT + treatCodes[i];
    sum[c] += values[i];
    count[c]++;
  }
  let m = 0;
  for (let c = 0; c < count.length; c++) if (count[c] > 0) m++;
  const out = { values: new Float64Array(m), treatCodes: new Int32Array(m), blockCodes: new Int32Array(m) };
  for (let c = 0, j = 0; c < count.length; c++) {
    if (count[c] === 0) continue;
    out.values[j] = sum[c] / count[c];
    out.treatCodes[j] = c % kT;
    out.blockCodes[j] = Math.floor(c / kT);
    j++;
  }
  return out;
}
