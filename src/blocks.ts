/**
 * Treatments after blocks: the F test of the additive model y = μ + block + treatment,
 * and its permutation test with shuffles inside each block.
 *
 * Intra-block analysis (Yates 1936; Tocher 1952; John & Williams 1995).
 * With n_tb observations of treatment t in block b, block sizes n_b, replications r_t,
 * treatment totals T_t and block totals B_b:
 *   adjusted treatment totals   q_t = T_t − Σ_b n_tb B_b / n_b,
 *   information matrix          C = diag(r) − N diag(1/n_b) Nᵀ,
 *   treatments after blocks     SS_T = qᵀ C⁻ q   (any generalized inverse C⁻),
 *   blocks (ignoring treatments) SS_B = Σ_b B_b²/n_b − G²/n,
 *   error                       SS_E = SS_total − SS_B − SS_T,
 * on df₁ = rank C, df₂ = n − (number of blocks) − df₁ degrees of freedom, and
 * F = (SS_T/df₁)/(SS_E/df₂). This covers complete blocks (where q_t is the treatment
 * total minus its share of the grand total and C⁻ = I/b) and unbalanced or incomplete
 * blocks alike.
 *
 * Under shuffles of treatment labels inside each block, N, the block totals, SS_total
 * and SS_B stay fixed, so F increases with SS_T, which is what the permutation test
 * compares. C⁻ (here the Moore–Penrose inverse, from a Jacobi eigen-decomposition) is
 * computed once; each relabelling costs O(n) for the treatment totals plus O(k²) for
 * the quadratic form.
 */
import { jStat } from "jstat";
import { BlockScheme, PermutationOptions, PermutationResult, permutationTest } from "./permutation";

export interface BlockedF {
  /** F of treatments after blocks (Infinity when SS_E = 0 < SS_T; 0 when both are 0). */
  f: number;
  df1: number;
  df2: number;
  /** Classical p-value from the F(df₁, df₂) distribution. */
  p: number;
  /** Treatments adjusted for blocks. */
  ssTreatment: number;
  /** Blocks, unadjusted (fitted first). */
  ssBlocks: number;
  ssError: number;
}

/**
 * The blocked layout: observations reordered so that each block is a contiguous
 * segment (as {@link BlockScheme} requires), with everything that stays fixed under
 * within-block shuffles precomputed.
 * Intra-block analysis of Yates (1936); John & Williams (1995).
 */
export class BlockedLayout {
  readonly n: number;
  readonly kT: number;
  /** Values in block order, shifted by the minimum (sums of squares do not change). */
  readonly values: Float64Array;
  /** Treatment code of each observation, in block order. */
  readonly labels: Int32Array;
  /** First index of each non-empty block in block order, then n. */
  readonly starts: Int32Array;
  /** Row index of each observation in block order. */
  readonly order: Int32Array;
  readonly df1: number;
  readonly df2: number;
  readonly ssTotal: number;
  readonly ssBlocks: number;
  /** Σ_b n_tb B_b / n_b for each treatment. */
  private readonly blockShare: Float64Array;
  /** Generalized inverse of C, row-major kT × kT. */
  private readonly ginv: Float64Array;
  private readonly totals: Float64Array;

  constructor(values: ArrayLike<number>, treatCodes: ArrayLike<number>, kT: number, blockCodes: ArrayLike<number>, kB: number) {
    const n = values.length;
    if (treatCodes.length !== n || blockCodes.length !== n) throw new RangeError("values, treatments and blocks differ in length");
    let min = Infinity;
    for (let i = 0; i < n; i++) {
      if (!Number.isFinite(values[i])) throw new RangeError(`value ${i + 1} is not a finite number`);
      if (!(treatCodes[i] >= 0 && treatCodes[i] < kT && Number.isInteger(treatCodes[i]))) throw new RangeError(`treatment code ${i + 1} is outside 0..${kT - 1}`);
      if (!(blockCodes[i] >= 0 && blockCodes[i] < kB && Number.isInteger(blockCodes[i]))) throw new RangeError(`block code ${i + 1} is outside 0..${kB - 1}`);
      if (values[i] < min) min = values[i];
    }
    this.n = n;
    this.kT = kT;
    // Block by block; inside a block by value, then treatment: a canonical order, so
    // results do not depend on the order of the rows.
    const nb = new Int32Array(kB);
    for (let i = 0; i < n; i++) nb[blockCodes[i]]++;
    const startList: number[] = [];
    let acc = 0;
    for (let b = 0; b < kB; b++) {
      if (nb[b] > 0) startList.push(acc);
      acc += nb[b];
    }
    startList.push(n);
    this.starts = Int32Array.from(startList);
    const blocksUsed = startList.length - 1;
    this.order = Int32Array.from({ length: n }, (_, i) => i);
    this.order.sort((a, b) => blockCodes[a] - blockCodes[b] || values[a] - values[b] || treatCodes[a] - treatCodes[b]);
    this.values = Float64Array.from(this.order, (i) => values[i] - min);
    this.labels = Int32Array.from(this.order, (i) => treatCodes[i]);

    // Incidence, block totals, replications.
    const inc = new Float64Array(kT * kB);
    const bt = new Float64Array(kB);
    const rep = new Float64Array(kT);
    let grand = 0;
    for (let i = 0; i < n; i++) {
      const t = treatCodes[i], b = blockCodes[i];
      const v = values[i] - min;
      inc[t * kB + b]++;
      bt[b] += v;
      rep[t]++;
      grand += v;
    }
    this.blockShare = new Float64Array(kT);
    const c = new Float64Array(kT * kT);
    for (let t = 0; t < kT; t++) {
      let share = 0;
      for (let b = 0; b < kB; b++) if (nb[b] > 0) share += (inc[t * kB + b] * bt[b]) / nb[b];
      this.blockShare[t] = share;
      c[t * kT + t] = rep[t];
      for (let s = 0; s <= t; s++) {
        let x = 0;
        for (let b = 0; b < kB; b++) if (nb[b] > 0) x += (inc[t * kB + b] * inc[s * kB + b]) / nb[b];
        c[t * kT + s] -= x;
        if (s !== t) c[s * kT + t] = c[t * kT + s];
      }
    }
    const { inverse, rank } = pseudoInverse(c, kT);
    this.ginv = inverse;
    this.df1 = rank;
    this.df2 = n - blocksUsed - rank;
    if (this.df1 < 1) throw new RangeError("treatment differences cannot be estimated within blocks (each block holds a single treatment)");
    if (this.df2 < 1) throw new RangeError("no residual degrees of freedom: add replicates or blocks");

    const mean = grand / n;
    let sst = 0;
    for (let i = 0; i < n; i++) sst += (this.values[i] - mean) ** 2;
    this.ssTotal = sst;
    let ssb = 0;
    for (let b = 0; b < kB; b++) if (nb[b] > 0) ssb += (bt[b] - nb[b] * mean) ** 2 / nb[b];
    this.ssBlocks = ssb;
    this.totals = new Float64Array(kT);
  }

  /** SS of treatments after blocks, qᵀ C⁻ q, for treatment labels in block order; O(n + k²). */
  ssTreatment(labels: ArrayLike<number>): number {
    const kT = this.kT;
    const q = this.totals;
    q.fill(0);
    const v = this.values;
    for (let i = 0; i < this.n; i++) q[labels[i]] += v[i];
    for (let t = 0; t < kT; t++) q[t] -= this.blockShare[t];
    const g = this.ginv;
    let ss = 0;
    for (let t = 0; t < kT; t++) {
      let row = 0;
      for (let s = 0; s < kT; s++) row += g[t * kT + s] * q[s];
      ss += q[t] * row;
    }
    return Math.max(0, ss);
  }

  /** F for an SS of treatments after blocks (Infinity when SS_E = 0 < SS_T; 0 when both are 0). */
  f(ssT: number): number {
    const sse = Math.max(0, this.ssTotal - this.ssBlocks - ssT);
    if (sse > 1e-13 * this.ssTotal) return ssT / this.df1 / (sse / this.df2);
    return ssT > 1e-13 * this.ssTotal ? Infinity : 0;
  }

  /** The full F table for an SS of treatments after blocks. */
  fromSS(ssT: number): BlockedF {
    const sse = Math.max(0, this.ssTotal - this.ssBlocks - ssT);
    const f = this.f(ssT);
    const p = f === Infinity ? 0 : f === 0 ? 1 : Math.min(1, Math.max(0, 1 - jStat.centralF.cdf(f, this.df1, this.df2)));
    return { f, df1: this.df1, df2: this.df2, p, ssTreatment: ssT, ssBlocks: this.ssBlocks, ssError: sse };
  }
}

/**
 * Moore–Penrose inverse of a symmetric positive semi-definite k × k matrix (row-major)
 * by cyclic Jacobi rotations (Jacobi 1846; Golub & Van Loan 2013, ch. 8); eigenvalues
 * below 1e-10 of the largest count as zero. Returns the inverse and the rank.
 */
export function pseudoInverse(a: Float64Array, k: number): { inverse: Float64Array; rank: number } {
  const m = Float64Array.from(a);
  const vec = new Float64Array(k * k);
  for (let i = 0; i < k; i++) vec[i * k + i] = 1;
  for (let sweep = 0; sweep < 100; sweep++) {
    let off = 0, diag = 0;
    for (let i = 0; i < k; i++) {
      diag += m[i * k + i] ** 2;
      for (let j = i + 1; j < k; j++) off += m[i * k + j] ** 2;
    }
    if (off <= 1e-30 * diag || off === 0) break;
    for (let p = 0; p < k; p++) {
      for (let q = p + 1; q < k; q++) {
        const apq = m[p * k + q];
        if (apq === 0) continue;
        const theta = (m[q * k + q] - m[p * k + p]) / (2 * apq);
        const t = Math.sign(theta || 1) / (Math.abs(theta) + Math.sqrt(theta * theta + 1));
        const c = 1 / Math.sqrt(t * t + 1);
        const s = t * c;
        for (let r = 0; r < k; r++) {
          const arp = m[r * k + p], arq = m[r * k + q];
          m[r * k + p] = c * arp - s * arq;
          m[r * k + q] = s * arp + c * arq;
        }
        for (let r = 0; r < k; r++) {
          const apr = m[p * k + r], aqr = m[q * k + r];
          m[p * k + r] = c * apr - s * aqr;
          m[q * k + r] = s * apr + c * aqr;
        }
        for (let r = 0; r < k; r++) {
          const vrp = vec[r * k + p], vrq = vec[r * k + q];
          vec[r * k + p] = c * vrp - s * vrq;
          vec[r * k + q] = s * vrp + c * vrq;
        }
      }
    }
  }
  let maxEig = 0;
  for (let i = 0; i < k; i++) maxEig = Math.max(maxEig, Math.abs(m[i * k + i]));
  const tol = 1e-10 * maxEig;
  const inverse = new Float64Array(k * k);
  let rank = 0;
  for (let e = 0; e < k; e++) {
    const lambda = m[e * k + e];
    if (!(lambda > tol)) continue;
    rank++;
    for (let i = 0; i < k; i++) {
      const vi = vec[i * k + e] / lambda;
      for (let j = 0; j < k; j++) inverse[i * k + j] += vi * vec[j * k + e];
    }
  }
  return { inverse, rank };
}

/**
 * F of treatments after blocks in the additive model (intra-block analysis, see the
 * file comment), with its classical p-value from jstat's F distribution. Works for
 * complete, unbalanced and incomplete blocks; raises a RangeError when treatments are
 * not estimable within blocks or no residual degrees of freedom remain.
 * Yates (1936); John & Williams (1995).
 */
export function blockedF(
  values: ArrayLike<number>,
  treatCodes: ArrayLike<number>,
  kT: number,
  blockCodes: ArrayLike<number>,
  kB: number,
): BlockedF {
  const layout = new BlockedLayout(values, treatCodes, kT, blockCodes, kB);
  return layout.fromSS(layout.ssTreatment(layout.labels));
}

/**
 * Permutation test of treatments after blocks: treatment labels are shuffled inside
 * each block (Fisher 1935, ch. V), F compared through SS_T (direction "greater"; any
 * direction in the options is ignored). Exact enumeration of the Π_b n_b!/Π_t n_tb!
 * within-block arrangements when they are at most the resamples, else Monte Carlo
 * with p = (b + 1)/(m + 1) (Phipson & Smyth 2010). `statistic` and `f` are the
 * observed F; `nullDistribution` (when kept) holds F values.
 */
export function blockPermutationTest(
  values: ArrayLike<number>,
  treatCodes: ArrayLike<number>,
  kT: number,
  blockCodes: ArrayLike<number>,
  kB: number,
  options: PermutationOptions = {},
): PermutationResult & { f: number; df1: number; df2: number } {
  const layout = new BlockedLayout(values, treatCodes, kT, blockCodes, kB);
  const scheme = new BlockScheme(layout.labels, layout.starts);
  const r = permutationTest(scheme, () => layout.ssTreatment(scheme.labels), { ...options, direction: "greater" });
  const f = layout.f(r.statistic);
  const nullDistribution = r.nullDistribution?.map((ss) => layout.f(ss));
  return { ...r, statistic: f, f, df1: layout.df1, df2: layout.df2, nullDistribution };
}
