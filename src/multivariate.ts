/**
 * Several traits at once: do groups differ in their multivariate location (PERMANOVA),
 * or in their spread (dispersion test)? Used together they tell a shift in location
 * from a difference in spread (Anderson 2001, 2006).
 *
 * Traits arrive as columns of equal length. With scale "standardize" (the default) each
 * column is centred and divided by its SD (divisor n − 1), so traits in different units
 * weigh alike; a constant column then carries no information and is left at 0. With
 * "none" the raw values are used. Distances: Euclidean (default) or Manhattan
 * (city-block).
 *
 * PERMANOVA (Anderson 2001; McArdle & Anderson 2001): with squared distances d²ᵢⱼ,
 * SST = (1/n) Σ_{i<j} d²ᵢⱼ, SSW = Σ_g (1/n_g) Σ_{i<j in g} d²ᵢⱼ, SSA = SST − SSW,
 * pseudo-F = [SSA/(k − 1)] / [SSW/(n − k)], R² = SSA/SST; p from relabellings of the
 * group labels (sizes fixed), exact when every distinct labelling fits in the requested
 * resamples. For Euclidean distances SSW is the within-group sum of squares summed over
 * traits, so each relabelling needs only group sums: O(n·traits). For other distances
 * the distance matrix is built once and the squared distances are summed within groups:
 * O(Σ n_g²) per relabelling. With one trait and Euclidean distance pseudo-F is the
 * one-way F.
 *
 * Dispersion (Anderson 2006, PERMDISP type): each observation's distance to its group
 * centre — the group mean vector in the (scaled) trait space for Euclidean distance, the
 * coordinate-wise group median (the centre that minimises city-block distance) for
 * Manhattan — compared among groups by a one-way F whose p comes from relabelling those
 * distances (./oneway). With one trait this is Levene's test (Euclidean, mean-centred;
 * Levene 1960) or the Brown–Forsythe test (Manhattan, median-centred; Brown & Forsythe
 * 1974), with a permutation p.
 */
import { permutationF } from "./oneway";
import { GroupScheme, PermutationOptions, PermutationResult, permutationTest } from "./permutation";

export type TraitScale = "standardize" | "none";
export type TraitDistance = "euclidean" | "manhattan";

export interface TraitOptions extends PermutationOptions {
  /** "standardize" (default) or "none". */
  scale?: TraitScale;
  /** "euclidean" (default) or "manhattan". */
  distance?: TraitDistance;
}

/** Largest n for which a non-Euclidean distance matrix (n² doubles) is built. */
export const MAX_MATRIX_ROWS = 4000;

interface Prepared {
  /** Row-major n × p data after scaling. */
  data: Float64Array;
  n: number;
  p: number;
  sizes: Float64Array;
  distance: TraitDistance;
}

function prepare(traits: ArrayLike<number>[], codes: ArrayLike<number>, k: number, options: TraitOptions): Prepared {
  const p = traits.length;
  if (p < 1) throw new RangeError("give at least one trait column");
  const n = codes.length;
  for (let t = 0; t < p; t++)
    if (traits[t].length !== n) throw new RangeError(`trait column ${t + 1} has ${traits[t].length} values but there are ${n} group labels`);
  if (k < 2) throw new RangeError("a comparison of groups needs at least 2 groups");
  if (n <= k) throw new RangeError("there must be more observations than groups");
  const scale = String(options.scale ?? "standardize").toLowerCase();
  if (scale !== "standardize" && scale !== "none") throw new RangeError(`unknown scale '${options.scale}': use standardize or none`);
  const distance = String(options.distance ?? "euclidean").toLowerCase() as TraitDistance;
  if (distance !== "euclidean" && distance !== "manhattan")
    throw new RangeError(`unknown distance '${options.distance}': use euclidean or manhattan`);
  const sizes = new Float64Array(k);
  for (let i = 0; i < n; i++) {
    const g = codes[i];
    if (!(Number.isInteger(g) && g >= 0 && g < k)) throw new RangeError(`group code ${g} at row ${i + 1} is out of range`);
    sizes[g]++;
  }
  for (let g = 0; g < k; g++) if (sizes[g] === 0) throw new RangeError(`group ${g + 1} has no observations`);
  const data = new Float64Array(n * p);
  for (let t = 0; t < p; t++) {
    const col = traits[t];
    let s = 0;
    for (let i = 0; i < n; i++) {
      const v = col[i];
      if (typeof v !== "number" || !Number.isFinite(v)) throw new RangeError(`trait ${t + 1}, row ${i + 1} is not a finite number`);
      s += v;
    }
    const mean = s / n;
    let ss = 0;
    for (let i = 0; i < n; i++) ss += (col[i] - mean) ** 2;
    const sd = Math.sqrt(ss / (n - 1));
    const f = scale === "standardize" ? (ss > (1e-28 * s * s) / n && sd > 0 ? 1 / sd : 0) : 1;
    for (let i = 0; i < n; i++) data[i * p + t] = (col[i] - mean) * f;
  }
  return { data, n, p, sizes, distance };
}

function pseudoFOf(ssa: number, ssw: number, n: number, k: number): number {
  if (ssw <= 0) return ssa > 0 ? Infinity : 0;
  return ssa / (k - 1) / (ssw / (n - k));
}

/**
 * PERMANOVA pseudo-F (Anderson 2001) on the traits' Euclidean or Manhattan distances,
 * with a permutation p (direction "greater"; exact when feasible). See the file comment.
 */
export function permanova(
  traits: ArrayLike<number>[],
  codes: ArrayLike<number>,
  k: number,
  options: TraitOptions = {},
): PermutationResult & { pseudoF: number; r2: number } {
  const prep = prepare(traits, codes, k, options);
  if (prep.distance !== "euclidean") return permanovaFromDistances(squaredDistances(prep), codes, k, options);
  const { data, n, p, sizes } = prep;
  let sst = 0;
  for (let i = 0; i < n * p; i++) sst += data[i] * data[i];
  if (!(sst > 0)) throw new RangeError("all observations are identical on every trait: nothing to compare");
  const sums = new Float64Array(k * p);
  const inv = sizes.map((s) => 1 / s);
  // SSA = Σ_g Σ_t S_gt² / n_g (columns are centred, so the grand term is 0)
  const between = (labels: ArrayLike<number>) => {
    sums.fill(0);
    for (let i = 0; i < n; i++) {
      const off = labels[i] * p;
      const row = i * p;
      for (let t = 0; t < p; t++) sums[off + t] += data[row + t];
    }
    let q = 0;
    for (let g = 0; g < k; g++) {
      let s2 = 0;
      for (let t = 0; t < p; t++) s2 += sums[g * p + t] * sums[g * p + t];
      q += s2 * inv[g];
    }
    return q;
  };
  const scheme = new GroupScheme(codes);
  const result = permutationTest(scheme, () => between(scheme.labels), { ...options, direction: "greater" });
  const ssa = Math.min(sst, result.statistic);
  const pseudoF = pseudoFOf(ssa, sst - ssa, n, k);
  const nullDistribution = result.nullDistribution?.map((q) => pseudoFOf(Math.min(sst, q), sst - Math.min(sst, q), n, k));
  return { ...result, statistic: pseudoF, pseudoF, r2: ssa / sst, nullDistribution };
}

/** n × n matrix of squared distances (row-major) between the prepared observations. */
function squaredDistances(prep: Prepared): Float64Array {
  const { data, n, p, distance } = prep;
  if (n > MAX_MATRIX_ROWS) throw new RangeError(`more than ${MAX_MATRIX_ROWS} rows are too many for ${distance} distances; use euclidean`);
  const d2 = new Float64Array(n * n);
  for (let i = 0; i < n; i++) {
    for (let j = i + 1; j < n; j++) {
      let s = 0;
      if (distance === "manhattan") {
        for (let t = 0; t < p; t++) s += Math.abs(data[i * p + t] - data[j * p + t]);
        s *= s;
      } else {
        for (let t = 0; t < p; t++) {
          const d = data[i * p + t] - data[j * p + t];
          s += d * d;
        }
      }
      d2[i * n + j] = s;
      d2[j * n + i] = s;
    }
  }
  return d2;
}

/**
 * PERMANOVA on a given n × n matrix of squared distances (row-major, symmetric, zero
 * diagonal): the distance matrix is used as is, and each relabelling sums the squared
 * distances within groups, O(Σ n_g²). The test statistic is −SSW (monotone in pseudo-F).
 * Anderson (2001); McArdle & Anderson (2001).
 */
export function permanovaFromDistances(
  squared: Float64Array,
  codes: ArrayLike<number>,
  k: number,
  options: PermutationOptions = {},
): PermutationResult & { pseudoF: number; r2: number } {
  const n = codes.length;
  if (squared.length !== n * n) throw new RangeError("the distance matrix must be n × n for n group labels");
  const sizes = new Float64Array(k);
  for (let i = 0; i < n; i++) sizes[codes[i]]++;
  let total = 0;
  for (let i = 0; i < n; i++) for (let j = i + 1; j < n; j++) total += squared[i * n + j];
  const sst = total / n;
  if (!(sst > 0)) throw new RangeError("all observations are identical: nothing to compare");
  const members = new Int32Array(n);
  const starts = new Int32Array(k + 1);
  const fill = new Int32Array(k);
  const ssw = (labels: ArrayLike<number>) => {
    // counting sort of the observations by label, in index order inside each group
    starts.fill(0);
    for (let i = 0; i < n; i++) starts[labels[i] + 1]++;
    for (let g = 0; g < k; g++) starts[g + 1] += starts[g];
    for (let g = 0; g < k; g++) fill[g] = starts[g];
    for (let i = 0; i < n; i++) members[fill[labels[i]]++] = i;
    let w = 0;
    for (let g = 0; g < k; g++) {
      let s = 0;
      const end = starts[g + 1];
      for (let a = starts[g]; a < end; a++) {
        const row = members[a] * n;
        for (let b = a + 1; b < end; b++) s += squared[row + members[b]];
      }
      w += s / (end - starts[g]);
    }
    return w;
  };
  const scheme = new GroupScheme(codes);
  const result = permutationTest(scheme, () => -ssw(scheme.labels), { ...options, direction: "greater" });
  const w = Math.min(sst, -result.statistic);
  const pseudoF = pseudoFOf(sst - w, w, n, k);
  const nullDistribution = result.nullDistribution?.map((q) => pseudoFOf(sst - Math.min(sst, -q), Math.min(sst, -q), n, k));
  return { ...result, statistic: pseudoF, pseudoF, r2: (sst - w) / sst, nullDistribution };
}

/**
 * Dispersion test (Anderson 2006): distances of the observations to their group centre
 * (group mean vector for Euclidean, coordinate-wise median for Manhattan) compared among
 * groups by a one-way F with a permutation p. Returns F, p and the mean distance per group.
 */
export function dispersionTest(
  traits: ArrayLike<number>[],
  codes: ArrayLike<number>,
  k: number,
  options: TraitOptions = {},
): PermutationResult & { f: number; meanDistance: number[] } {
  const { data, n, p, sizes, distance } = prepare(traits, codes, k, options);
  const centre = new Float64Array(k * p);
  if (distance === "euclidean") {
    for (let i = 0; i < n; i++) for (let t = 0; t < p; t++) centre[codes[i] * p + t] += data[i * p + t];
    for (let g = 0; g < k; g++) for (let t = 0; t < p; t++) centre[g * p + t] /= sizes[g];
  } else {
    const buf = new Float64Array(n);
    for (let g = 0; g < k; g++) {
      for (let t = 0; t < p; t++) {
        let m = 0;
        for (let i = 0; i < n; i++) if (codes[i] === g) buf[m++] = data[i * p + t];
        const s = buf.subarray(0, m).sort();
        centre[g * p + t] = m % 2 ? s[m >> 1] : (s[(m >> 1) - 1] + s[m >> 1]) / 2;
      }
    }
  }
  const z = new Float64Array(n);
  const meanDistance = new Array<number>(k).fill(0);
  for (let i = 0; i < n; i++) {
    const g = codes[i];
    let s = 0;
    if (distance === "euclidean") {
      for (let t = 0; t < p; t++) s += (data[i * p + t] - centre[g * p + t]) ** 2;
      s = Math.sqrt(s);
    } else {
      for (let t = 0; t < p; t++) s += Math.abs(data[i * p + t] - centre[g * p + t]);
    }
    z[i] = s;
    meanDistance[g] += s / sizes[g];
  }
  let zmin = Infinity;
  let zmax = -Infinity;
  for (let i = 0; i < n; i++) {
    if (z[i] < zmin) zmin = z[i];
    if (z[i] > zmax) zmax = z[i];
  }
  if (zmax - zmin <= 1e-12 * zmax)
    throw new RangeError("every observation is equally far from its group centre: there is no difference in spread to test");
  const r = permutationF(z, codes, k, options);
  return { ...r, f: r.f, meanDistance };
}
