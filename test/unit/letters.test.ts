import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { compactLetters, letterSymbol, lettersFromPairwise } from "../../src/letters";
import { PairwiseRow } from "../../src/pairwise";

/** differs() from a list of differing name pairs. */
function rel(names: string[], pairs: [string, string][]) {
  const set = new Set(pairs.map(([a, b]) => [a, b].sort().join("|")));
  return (i: number, j: number) => set.has([names[i], names[j]].sort().join("|"));
}
const share = (a: string, b: string) => [...a].some((ch) => b.includes(ch));

describe("compact letter display, insert-and-absorb (Piepho 2004) — hand-worked examples", () => {
  it("no differences: every group gets 'a'", () => {
    expect(compactLetters(["A", "B", "C"], [3, 2, 1], () => false)).toEqual(["a", "a", "a"]);
  });

  it("all differ: one letter each, 'a' for the highest mean", () => {
    expect(compactLetters(["A", "B", "C"], [1, 3, 2], () => true)).toEqual(["c", "a", "b"]);
  });

  it("non-transitive: A = B, B = C, A ≠ C gives a, ab, b", () => {
    const names = ["A", "B", "C"];
    expect(compactLetters(names, [9, 6, 3], rel(names, [["A", "C"]]))).toEqual(["a", "ab", "b"]);
    // input order does not matter, only the means
    expect(compactLetters(["C", "A", "B"], [3, 9, 6], rel(["C", "A", "B"], [["A", "C"]]))).toEqual(["b", "a", "ab"]);
  });

  it("a chain of four: A ≠ C, A ≠ D, B ≠ D gives a, ab, bc, c (worked by hand through insert and absorb)", () => {
    const names = ["A", "B", "C", "D"];
    const d = rel(names, [["A", "C"], ["A", "D"], ["B", "D"]]);
    expect(compactLetters(names, [10, 8, 6, 4], d)).toEqual(["a", "ab", "bc", "c"]);
  });

  it("two clusters: {A, B} differ from {C, D} gives a, a, b, b", () => {
    const names = ["A", "B", "C", "D"];
    const d = rel(names, [["A", "C"], ["A", "D"], ["B", "C"], ["B", "D"]]);
    expect(compactLetters(names, [10, 9, 2, 1], d)).toEqual(["a", "a", "b", "b"]);
  });

  it("letter symbols go a–z, A–Z, then primes", () => {
    expect([letterSymbol(0), letterSymbol(25), letterSymbol(26), letterSymbol(52)]).toEqual(["a", "z", "A", "a′"]);
  });
});

describe("compact letter display — properties", () => {
  const relation = fc.integer({ min: 1, max: 8 }).chain((k) =>
    fc.tuple(
      fc.constant(k),
      fc.array(fc.boolean(), { minLength: (k * (k - 1)) / 2, maxLength: (k * (k - 1)) / 2 }),
      fc.uniqueArray(fc.integer({ min: -1000, max: 1000 }), { minLength: k, maxLength: k }),
    ),
  );
  const pairIndex = (i: number, j: number, k: number) => {
    const [a, b] = i < j ? [i, j] : [j, i];
    return a * k - (a * (a + 1)) / 2 + (b - a - 1);
  };

  it("groups share a letter exactly when they are not declared different; the top mean has 'a'", () => {
    fc.assert(
      fc.property(relation, ([k, bits, means]) => {
        const names = Array.from({ length: k }, (_, i) => `g${i}`);
        const letters = compactLetters(names, means, (i, j) => bits[pairIndex(i, j, k)]);
        for (let i = 0; i < k; i++) {
          expect(letters[i].length).toBeGreaterThan(0);
          for (let j = i + 1; j < k; j++) expect(share(letters[i], letters[j])).toBe(!bits[pairIndex(i, j, k)]);
        }
        const top = means.indexOf(Math.max(...means));
        expect(letters[top]).toContain("a");
      }),
      { numRuns: 500 },
    );
  });

  it("does not depend on the order of the groups or their names", () => {
    fc.assert(
      fc.property(relation, fc.integer(), ([k, bits, means], shift) => {
        const names = Array.from({ length: k }, (_, i) => `g${i}`);
        const letters = compactLetters(names, means, (i, j) => bits[pairIndex(i, j, k)]);
        const perm = Array.from({ length: k }, (_, i) => (i + Math.abs(shift)) % k).reverse();
        const names2 = perm.map((i) => `renamed-${names[i]}`);
        const letters2 = compactLetters(names2, perm.map((i) => means[i]), (a, b) => bits[pairIndex(perm[a], perm[b], k)]);
        perm.forEach((i, r) => expect(letters2[r]).toBe(letters[i]));
      }),
      { numRuns: 300 },
    );
  });
});

describe("letters from pairwise rows", () => {
  const row = (a: string, b: string, pAdjusted: number): PairwiseRow => ({ a, b, difference: 0, lower: 0, upper: 0, p: pAdjusted, pAdjusted, exact: true });

  it("differ when pAdjusted ≤ alpha; rows may name the pair in either order", () => {
    const names = ["ctrl", "trt1", "trt2"];
    const rows = [row("ctrl", "trt1", 0.25), row("trt2", "ctrl", 0.0967), row("trt1", "trt2", 0.0259)];
    expect(lettersFromPairwise(names, [5.032, 4.661, 5.526], rows, 0.05)).toEqual(["ab", "b", "a"]);
    expect(lettersFromPairwise(names, [5.032, 4.661, 5.526], rows, 0.1)).toEqual(["b", "b", "a"]);
    expect(lettersFromPairwise(names, [5.032, 4.661, 5.526], rows, 0.0259)).toEqual(["ab", "b", "a"]);
  });

  it("refuse a missing pair or a bad alpha", () => {
    expect(() => lettersFromPairwise(["a", "b", "c"], [1, 2, 3], [row("a", "b", 0.1)])).toThrow(/no comparison/);
    expect(() => lettersFromPairwise(["a", "b"], [1, 2], [row("a", "b", 0.1)], 5)).toThrow(/alpha/);
  });
});
