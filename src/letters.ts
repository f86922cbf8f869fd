/**
 * Compact letter display by the insert-and-absorb algorithm (Piepho 2004): groups
 * sharing a letter are not shown to differ; two groups that differ share no letter.
 *
 * Start with one letter held by every group. For each pair (i, j) that differs, every
 * letter held by both is split in two: a copy without i and a copy without j (insert);
 * then any letter whose groups are a subset of another letter's groups is dropped
 * (absorb). Afterwards redundant memberships are swept out (the sweeping step of Piepho 2004): a group
 * leaves a letter when it keeps another letter and every other holder of that letter
 * still shares some other letter with it; then absorb again. The display is exact: two
 * groups share a letter if and only if they are not declared different.
 *
 * Letters are named in order of the highest-mean group holding them (then the next
 * holder, …), so the highest-mean group gets "a". Symbols: a–z, then A–Z, then a′, b′, ….
 */
import { PairwiseRow } from "./pairwise";

/**
 * Letters for each group (in the input order of names). `differs(i, j)` says whether
 * groups i and j (indices into names) are declared different; it is asked once per pair
 * with i < j.
 * Insert–absorb with sweeping (Piepho 2004).
 */
export function compactLetters(names: string[], means: number[], differs: (i: number, j: number) => boolean): string[] {
  const k = names.length;
  if (means.length !== k) throw new RangeError(`names and means differ in length (${k} and ${means.length})`);
  if (k === 0) return [];
  for (let i = 0; i < k; i++) if (!Number.isFinite(means[i])) throw new RangeError(`the mean of '${names[i]}' is not a finite number`);
  // rank 0 = highest mean (ties kept in input order)
  const byMean = Array.from({ length: k }, (_, i) => i).sort((a, b) => means[b] - means[a] || a - b);
  const rank = new Int32Array(k);
  byMean.forEach((g, r) => (rank[g] = r));

  // columns: membership as boolean arrays indexed by group
  let columns: Uint8Array[] = [new Uint8Array(k).fill(1)];
  for (let i = 0; i < k; i++) {
    for (let j = i + 1; j < k; j++) {
      if (!differs(i, j)) continue;
      const next: Uint8Array[] = [];
      let changed = false;
      for (const col of columns) {
        if (col[i] && col[j]) {
          const c1 = col.slice();
          c1[i] = 0;
          const c2 = col.slice();
          c2[j] = 0;
          next.push(c1, c2);
          changed = true;
        } else next.push(col);
      }
      if (changed) columns = absorb(next);
    }
  }
  // Now the columns are the maximal sets of mutually not-different groups, whatever the
  // order of the pairs; ordering them (and the sweep) by the means makes the result
  // depend only on the relation and the ranking of the means.
  const keyOf = (col: Uint8Array) => byMean.filter((g) => col[g]).map((g) => rank[g]);
  const byKey = (c1: Uint8Array, c2: Uint8Array) => {
    const a = keyOf(c1);
    const b = keyOf(c2);
    for (let t = 0; t < Math.min(a.length, b.length); t++) if (a[t] !== b[t]) return a[t] - b[t];
    return a.length - b.length;
  };
  columns.sort(byKey);
  columns = absorb(sweep(columns, byMean));
  columns.sort(byKey);
  const out = new Array<string>(k).fill("");
  columns.forEach((col, c) => {
    const sym = letterSymbol(c);
    for (let g = 0; g < k; g++) if (col[g]) out[g] += sym;
  });
  return out;
}

/** Drops empty columns and columns whose holders are a subset of another column's. */
function absorb(columns: Uint8Array[]): Uint8Array[] {
  const cols = columns.filter((c) => c.some((v) => v));
  const keep = new Array<boolean>(cols.length).fill(true);
  for (let a = 0; a < cols.length; a++) {
    if (!keep[a]) continue;
    for (let b = 0; b < cols.length; b++) {
      if (a === b || !keep[b]) continue;
      if (isSubset(cols[a], cols[b])) {
        keep[a] = false; // equal columns: the later copy survives this check, the earlier is dropped
        break;
      }
    }
  }
  return cols.filter((_, i) => keep[i]);
}

function isSubset(a: Uint8Array, b: Uint8Array): boolean {
  for (let g = 0; g < a.length; g++) if (a[g] && !b[g]) return false;
  return true;
}

/** Removes redundant memberships (see the file comment); never leaves a group without a letter. */
function sweep(columns: Uint8Array[], groupOrder: number[]): Uint8Array[] {
  const k = groupOrder.length;
  const cols = columns.map((c) => c.slice());
  const letterCount = new Int32Array(k);
  for (const c of cols) for (let g = 0; g < k; g++) letterCount[g] += c[g];
  const shareOther = (g: number, h: number, except: number) => {
    for (let c = 0; c < cols.length; c++) if (c !== except && cols[c][g] && cols[c][h]) return true;
    return false;
  };
  for (let c = 0; c < cols.length; c++) {
    const col = cols[c];
    for (const g of groupOrder) {
      if (!col[g] || letterCount[g] < 2) continue;
      let redundant = true;
      for (let h = 0; h < k && redundant; h++) if (h !== g && col[h] && !shareOther(g, h, c)) redundant = false;
      if (redundant) {
        col[g] = 0;
        letterCount[g]--;
      }
    }
  }
  return cols;
}

/** Symbol of the c-th letter: a–z, A–Z, then the same with primes. (Naming only; Piepho 2004 uses a, b, c, ….) */
export function letterSymbol(c: number): string {
  const base = "abcdefghijklmnopqrstuvwxyzABCDEFGHIJKLMNOPQRSTUVWXYZ";
  return base[c % base.length] + "′".repeat(Math.floor(c / base.length));
}

/**
 * Letters from pairwise comparisons: groups i and j differ when the row for the pair
 * has pAdjusted ≤ alpha. Every pair of names must have a row (in either order).
 * Piepho (2004).
 */
export function lettersFromPairwise(names: string[], means: number[], rows: PairwiseRow[], alpha = 0.05): string[] {
  if (!(alpha > 0 && alpha < 1)) throw new RangeError(`alpha must be between 0 and 1, e.g. 0.05 (got ${alpha})`);
  const p = new Map<string, number>();
  const key = (a: string, b: string) => JSON.stringify(a < b ? [a, b] : [b, a]);
  for (const r of rows) p.set(key(r.a, r.b), r.pAdjusted);
  return compactLetters(names, means, (i, j) => {
    const v = p.get(key(names[i], names[j]));
    if (v === undefined) throw new RangeError(`no comparison of '${names[i]}' with '${names[j]}'`);
    return v <= alpha;
  });
}
