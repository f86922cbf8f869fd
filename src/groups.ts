/**
 * Encoding of group labels as integer codes 0..k−1, in order of first appearance.
 */
export interface Grouping {
  /** Code of each observation. */
  codes: Int32Array;
  /** Group names, indexed by code. */
  names: string[];
  /** Number of observations per code. */
  sizes: Int32Array;
}

/** Encodes labels (any values, compared by their text) as codes in order of first appearance.
 * (Bookkeeping, no statistical method.)
 */
export function encodeGroups(labels: ArrayLike<unknown>): Grouping {
  const index = new Map<string, number>();
  const names: string[] = [];
  const codes = new Int32Array(labels.length);
  for (let i = 0; i < labels.length; i++) {
    const key = String(labels[i]);
    let c = index.get(key);
    if (c === undefined) {
      c = names.length;
      index.set(key, c);
      names.push(key);
    }
    codes[i] = c;
  }
  const sizes = new Int32Array(names.length);
  for (let i = 0; i < codes.length; i++) sizes[codes[i]]++;
  return { codes, names, sizes };
}

/** Splits values into one array per group code. (Bookkeeping, no statistical method.) */
export function splitByGroup(values: ArrayLike<number>, codes: ArrayLike<number>, k: number): Float64Array[] {
  const sizes = new Int32Array(k);
  for (let i = 0; i < codes.length; i++) sizes[codes[i]]++;
  const out = Array.from(sizes, (s) => new Float64Array(s));
  const fill = new Int32Array(k);
  for (let i = 0; i < codes.length; i++) {
    const g = codes[i];
    out[g][fill[g]++] = values[i];
  }
  return out;
}

/**
 * Rows in a canonical order — by value, ties by group code — as index order plus the
 * reordered values and codes. A Monte Carlo permutation test run on this layout draws
 * the same relabellings whatever the order of the rows, so its p (for a given seed) does
 * not depend on row order. (Bookkeeping, no statistical method.)
 */
export function canonicalRows(values: ArrayLike<number>, codes: ArrayLike<number>): { order: Int32Array; values: Float64Array; codes: Int32Array } {
  const order = Int32Array.from({ length: values.length }, (_, i) => i);
  order.sort((a, b) => values[a] - values[b] || codes[a] - codes[b]);
  return { order, values: Float64Array.from(order, (i) => values[i]), codes: Int32Array.from(order, (i) => codes[i]) };
}
