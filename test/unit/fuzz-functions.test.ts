/**
 * Fuzzing the argument layer of every sheet function with fast-check: ranges of mixed
 * cells (numbers, blanks as null / "" / undefined, text, logical values, Excel error
 * values, NaN and ±Infinity as a preview page might pass), group labels, option words
 * in any case, numbers in and out of range. Small resamples (100–300) keep it fast.
 *
 * Properties, for more than 10,000 generated calls in all: a call never throws; it
 * returns a finite number, a non-empty rectangular table of finite numbers and text
 * (no null, undefined or NaN), or an error value with a known code and a message.
 * And, for the desktop: zeros that the value types call "Empty" give the same answer
 * as null blanks.
 */
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { BlankReader, EmptyMask } from "../../functions/blanks";
import { FUNCTION_SPECS } from "../../functions/catalog";
import { SheetError } from "../../functions/errors";
import { callSheetFunction } from "../../functions/sheet";

// #REF! and #NAME? may arrive as inputs but are not valid custom-function outputs.
const CODES = new Set(["#VALUE!", "#N/A", "#NUM!", "#DIV/0!"]);

/** Checks one outcome; returns a description of the problem, or "" when it is fine. */
function problem(r: unknown): string {
  if (r instanceof SheetError) {
    if (!CODES.has(r.code)) return `unknown code ${r.code}`;
    if (typeof r.message !== "string" || r.message.length < 5) return "error without a message";
    return "";
  }
  if (typeof r === "number") return Number.isFinite(r) ? "" : `number ${r}`;
  if (Array.isArray(r)) {
    if (r.length === 0) return "empty table";
    const w = Array.isArray(r[0]) ? r[0].length : -1;
    if (w <= 0) return "table without columns";
    for (const row of r) {
      if (!Array.isArray(row) || row.length !== w) return "ragged table";
      for (const c of row) {
        if (typeof c === "number" && !Number.isFinite(c)) return `cell ${c}`;
        if (typeof c !== "number" && typeof c !== "string") return `cell of type ${c === null ? "null" : typeof c}`;
      }
    }
    return "";
  }
  return `unexpected result ${String(r)}`;
}

// ---- cells ---------------------------------------------------------------------------------

const numberCell = fc.oneof(
  { weight: 6, arbitrary: fc.double({ min: -1e6, max: 1e6, noNaN: true, noDefaultInfinity: true }) },
  { weight: 6, arbitrary: fc.integer({ min: -5, max: 12 }) },
  { weight: 1, arbitrary: fc.constant(0) },
);
const blankCell = fc.constantFrom<unknown>(null, "", undefined);
const badCell = fc.oneof(
  fc.string({ maxLength: 6 }),
  fc.constantFrom<unknown>("n/a", "1,5", true, false, NaN, Infinity, -Infinity, { code: "#N/A" }, { type: "Error", basicValue: "#REF!" }, { type: "Entity", text: "x" }, [1]),
);
/** Mostly numbers, some blanks, rarely something unusable. */
const valueCell = fc.oneof({ weight: 20, arbitrary: numberCell }, { weight: 3, arbitrary: blankCell }, { weight: 1, arbitrary: badCell });
/** Labels: mostly two or three groups (spelt in several ways), sometimes more, rarely unusable. */
const labelCell = fc.oneof(
  { weight: 20, arbitrary: fc.constantFrom<unknown>("a", "b", "A", " b ", "c", 1) },
  { weight: 4, arbitrary: fc.constantFrom<unknown>("HB-07", "HB-12", 2, 3, "d") },
  { weight: 2, arbitrary: blankCell },
  { weight: 1, arbitrary: fc.oneof(fc.string({ maxLength: 4 }), fc.constantFrom<unknown>(true, { code: "#DIV/0!" }, NaN, 0)) },
);
/** Blocks for BLOCKTEST: a few farms. */
const blockCell = fc.oneof(
  { weight: 20, arbitrary: fc.constantFrom<unknown>("North", "Creek", "Hill") },
  { weight: 1, arbitrary: blankCell },
  { weight: 1, arbitrary: fc.constantFrom<unknown>(false, { code: "#N/A" }) },
);

const vector = (cell: fc.Arbitrary<unknown>, n: number, asRow: boolean) =>
  fc.array(cell, { minLength: n, maxLength: n }).map((xs) => (asRow && n > 0 ? [xs] : xs.map((x) => [x])));

// ---- options ---------------------------------------------------------------------------------

const anyCase = (words: string[]) =>
  fc.tuple(fc.constantFrom(...words), fc.constantFrom("lower", "upper", "same", "spaced")).map(([w, how]) =>
    how === "lower" ? w.toLowerCase() : how === "upper" ? w.toUpperCase() : how === "spaced" ? ` ${w} ` : w,
  );

function word(words: string[], clean: boolean): fc.Arbitrary<unknown> {
  if (clean) return fc.oneof({ weight: 4, arbitrary: anyCase(words) }, { weight: 1, arbitrary: fc.constantFrom<unknown>(null, "") });
  return fc.oneof(
    { weight: 6, arbitrary: anyCase(words) },
    { weight: 3, arbitrary: fc.constantFrom<unknown>(null, "") },
    { weight: 1, arbitrary: fc.oneof(fc.string({ maxLength: 8 }), fc.constantFrom<unknown>(3, true, [["x", "y"]], [[words[0]]], { code: "#N/A" })) },
  );
}

/** An option value: `clean` draws only valid values (so the engine runs), else also invalid ones. */
function numberOption(valid: fc.Arbitrary<unknown>, invalid: unknown[], clean: boolean): fc.Arbitrary<unknown> {
  return clean ? valid : fc.oneof({ weight: 8, arbitrary: valid }, { weight: 2, arbitrary: fc.constantFrom<unknown>(...invalid) });
}

const OPTION: Record<string, (fn: string, clean: boolean) => fc.Arbitrary<unknown>> = {
  statistic: (fn, clean) =>
    word(
      fn === "TWOTEST" ? ["mean", "median", "t"] : fn === "BLOCKTEST" ? ["F", "RANK"] : fn === "INTERVAL" ? ["mean", "median", "sd", "cv", "trimmed"] : fn === "DIFFINTERVAL" ? ["mean", "median", "ratio"] : ["F", "SNR", "RANK"],
      clean,
    ),
  direction: (_, clean) => word(["two-sided", "greater", "less"], clean),
  method: (fn, clean) => word(fn === "CORRTEST" ? ["pearson", "spearman"] : ["BCa", "percentile", "basic"], clean),
  adjust: (_, clean) => word(["holm", "maxt", "bh", "none"], clean),
  scale: (_, clean) => word(["standardize", "none"], clean),
  // 100–300 (the bootstrap functions start at 100); 9999 (null) rarely, to stay fast.
  resamples: (_, clean) =>
    numberOption(fc.oneof({ weight: 30, arbitrary: fc.integer({ min: 100, max: 300 }) }, { weight: 1, arbitrary: fc.constant(null) }), [0, 98, 150.5, -5, 2e6, "x", "200", true, [[120]]], clean),
  seed: (_, clean) => numberOption(fc.oneof(fc.integer({ min: -1000, max: 1000 }), fc.constantFrom<unknown>(null, "")), [1.5, "s", 1e300], clean),
  level: (_, clean) => numberOption(fc.constantFrom<unknown>(0.8, 0.9, 0.95, 0.99, null), [0, 1, 95, -0.5, "x", NaN], clean),
  alpha: (_, clean) => numberOption(fc.constantFrom<unknown>(0.01, 0.05, 0.1, null), [0, 1, 5, "x"], clean),
  bins: (_, clean) => numberOption(fc.oneof(fc.integer({ min: 2, max: 40 }), fc.constant(null)), [0, 1, 1001, 2.5, "x"], clean),
};

/** Clean cells: numbers and blanks only. */
const cleanValue = fc.oneof({ weight: 10, arbitrary: numberCell }, { weight: 1, arbitrary: blankCell });
const cleanLabel = fc.oneof({ weight: 10, arbitrary: fc.constantFrom<unknown>("a", "b", "A", " b ", "c", 1) }, { weight: 1, arbitrary: blankCell });
/** PAIRWISE and LETTERS need 3 values per group: fewer groups. */
const fewGroups = fc.oneof({ weight: 10, arbitrary: fc.constantFrom<unknown>("a", "A", "b", " B ", "c") }, { weight: 1, arbitrary: blankCell });

/**
 * Arguments for one call of `fn`, shaped as Excel passes them. Half the calls are
 * "clean" (valid options, numbers and blanks, sizes that match), so the engine runs;
 * the others mix in every kind of slip.
 */
function callArgs(fn: string): fc.Arbitrary<unknown[]> {
  const spec = FUNCTION_SPECS.find((s) => s.name === fn)!;
  return fc
    .record({
      clean: fc.boolean(),
      n: fc.oneof(fc.integer({ min: 0, max: 6 }), fc.integer({ min: 7, max: 24 })),
      m: fc.integer({ min: 0, max: 14 }),
      mismatch: fc.integer({ min: 0, max: 9 }),
      asRow: fc.boolean(),
      traitCols: fc.integer({ min: 1, max: 3 }),
    })
    .chain(({ clean, n, m, mismatch, asRow, traitCols }) => {
      const value = clean ? cleanValue : valueCell;
      const parts = spec.params.map((p, i) => {
        if (!p.range) return OPTION[p.name](fn, clean);
        // The second sample of two-sample functions has its own length; other ranges
        // line up with the first, except now and then (a size mismatch).
        const len = (fn === "TWOTEST" || fn === "DIFFINTERVAL") && i === 1 ? m : i > 0 && mismatch === 0 && !clean ? n + 1 : n;
        if (p.name === "traits") return fc.array(fc.array(value, { minLength: traitCols, maxLength: traitCols }), { minLength: n, maxLength: n });
        if (p.name === "blocks") return vector(blockCell, len, asRow);
        if (["groups", "treatments"].includes(p.name)) {
          return vector(clean ? (fn === "PAIRWISE" || fn === "LETTERS" ? fewGroups : cleanLabel) : labelCell, len, asRow);
        }
        return vector(value, len, asRow);
      });
      return fc.tuple(...parts);
    });
}

const RUNS_PER_FUNCTION = 750; // 14 functions × 750 = 10,500 calls

describe("fuzzing every sheet function's arguments", () => {
  for (const spec of FUNCTION_SPECS) {
    it(`${spec.name}: never throws; a finite number, a clean table or an error value`, async () => {
      await fc.assert(
        fc.asyncProperty(callArgs(spec.name), async (args) => {
          let r: unknown;
          try {
            r = await callSheetFunction(spec.name, args);
          } catch (e) {
            throw new Error(`${spec.name} threw: ${String(e)}`);
          }
          const why = problem(r);
          if (why) throw new Error(`${spec.name}(${JSON.stringify(args)}) → ${why}`);
        }),
        { numRuns: RUNS_PER_FUNCTION, seed: 20240601 },
      );
    });
  }
});

// ---- desktop blanks: a 0 typed "Empty" is a blank ------------------------------------------

const DESKTOP_BLANK = Symbol("blank passed as 0");

/** Reader that knows which cells were blanks passed as 0, by address "P<i>!…". */
class MarkedReader implements BlankReader {
  constructor(private readonly marks: boolean[][][]) {}
  async readEmpty(addresses: string[]): Promise<(EmptyMask | null)[]> {
    return addresses.map((a) => {
      const i = Number(/^'P(\d+)'/.exec(a)?.[1]);
      return Number.isInteger(i) ? this.marks[i] : null;
    });
  }
}

describe("fuzzing desktop blanks", () => {
  const cell = fc.oneof({ weight: 8, arbitrary: fc.integer({ min: -3, max: 9 }) }, { weight: 2, arbitrary: fc.constant<unknown>(DESKTOP_BLANK) });
  const label = fc.oneof({ weight: 8, arbitrary: fc.constantFrom<unknown>("a", "b", "c", 1) }, { weight: 2, arbitrary: fc.constant<unknown>(DESKTOP_BLANK) });
  const cases: [string, (n: number) => fc.Arbitrary<unknown[][][]>, unknown[]][] = [
    ["GROUPTEST", (n) => fc.tuple(vector(cell, n, false), vector(label, n, false)), ["F", 99, 1]],
    ["STAT", (n) => fc.tuple(vector(cell, n, false), vector(label, n, false)), ["RANK"]],
    ["PAIRTEST", (n) => fc.tuple(vector(cell, n, false), vector(cell, n, false)), [null, 99, 1]],
    ["CORRTEST", (n) => fc.tuple(vector(cell, n, false), vector(cell, n, false)), ["spearman", null, 99, 1]],
    ["GROUPSUMMARY", (n) => fc.tuple(vector(cell, n, false), vector(label, n, false)), []],
    ["BLOCKTEST", (n) => fc.tuple(vector(cell, n, false), vector(label, n, false), vector(label, n, false)), ["F", 99, 1]],
  ];
  for (const [fn, ranges, options] of cases) {
    it(`${fn}: desktop zeros marked Empty answer as null blanks do`, async () => {
      await fc.assert(
        fc.asyncProperty(
          fc.integer({ min: 1, max: 12 }).chain((n) => ranges(n)),
          async (rs) => {
            const desktop = rs.map((r) => r.map((row) => row.map((c) => (c === DESKTOP_BLANK ? 0 : c))));
            const web = rs.map((r) => r.map((row) => row.map((c) => (c === DESKTOP_BLANK ? null : c))));
            const marks = rs.map((r) => r.map((row) => row.map((c) => c === DESKTOP_BLANK)));
            const addresses = [...rs.map((r, i) => `P${i}!A1:A${r.length}`), ...options.map(() => "")];
            const a = await callSheetFunction(fn, [...desktop, ...options], { blanks: { reader: new MarkedReader(marks), addresses } });
            const b = await callSheetFunction(fn, [...web, ...options]);
            expect(problem(a)).toBe("");
            if (b instanceof SheetError) expect((a as SheetError).code).toBe(b.code);
            else expect(a).toEqual(b);
          },
        ),
        { numRuns: 200, seed: 7 },
      );
    });
  }
});
