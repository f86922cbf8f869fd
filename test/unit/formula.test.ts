/**
 * The `=RS.…` formulas the block writes, and the preview's parser of exactly those forms
 * (A1 references as Excel writes them: `$` for absolute, sheet names quoted with `'`
 * when they are not plain words, `''` for a quote inside — Excel's reference syntax,
 * from memory of its documentation).
 */
import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { areaText, parseFormula, quoteSheet, refText, rsFormula } from "../../taskpane/formula";

const area = { sheet: "Trial data", top: 1, left: 3, rows: 40, cols: 1 };

describe("building formulas", () => {
  it("writes sheet-qualified absolute references", () => {
    expect(refText(area)).toBe("'Trial data'!$D$2:$D$41");
    expect(refText({ sheet: "Data", top: 0, left: 0, rows: 1, cols: 1 })).toBe("Data!$A$1");
    expect(areaText({ sheet: "Data", top: 0, left: 0, rows: 41, cols: 4 })).toBe("Data!A1:D41");
    expect(quoteSheet("O'Brien farm")).toBe("'O''Brien farm'");
    expect(quoteSheet("AB12")).toBe("'AB12'"); // looks like a cell
  });
  it("writes the call with option words quoted and numbers plain", () => {
    const g = { ...area, left: 1 };
    expect(rsFormula("grouptest", [area, g, "F", 9999, 1])).toBe("=RS.GROUPTEST('Trial data'!$D$2:$D$41,'Trial data'!$B$2:$B$41,\"F\",9999,1)");
  });
});

describe("parsing formulas", () => {
  it("reads back what it writes", () => {
    const p = parseFormula(rsFormula("PAIRWISE", [area, { ...area, left: 1 }, "holm", 0.95, 9999, 1]))!;
    expect(p.name).toBe("PAIRWISE");
    expect(p.args).toEqual([{ ref: area }, { ref: { ...area, left: 1 } }, { text: "holm" }, { number: 0.95 }, { number: 9999 }, { number: 1 }]);
  });
  it("accepts unqualified, relative and single-cell references", () => {
    expect(parseFormula("=RS.SNR(D2:D41, B2:B41)")!.args[0]).toEqual({ ref: { sheet: "", top: 1, left: 3, rows: 40, cols: 1 } });
    expect(parseFormula("=RS.STAT(Data!A1,Data!$B$1)")!.args[1]).toEqual({ ref: { sheet: "Data", top: 0, left: 1, rows: 1, cols: 1 } });
    expect(parseFormula('=RS.GROUPTEST(A1:A3,B1:B3,"say ""hi""",TRUE)')!.args.slice(2)).toEqual([{ text: 'say "hi"' }, { logical: true }]);
  });
  it("rejects anything else", () => {
    expect(parseFormula("=1+1")).toBeNull();
    expect(parseFormula("=SUM(A1:A3)")).toBeNull();
    expect(parseFormula("=RS.GROUPTEST(A1:A3")).toBeNull();
    expect(parseFormula("=RS.GROUPTEST(A1:A3,,B1)")).toBeNull();
    expect(parseFormula("RS.GROUPTEST(A1:A3)")).toBeNull();
  });
  it("round-trips any sheet name and rectangle (property)", () => {
    fc.assert(
      fc.property(fc.string({ minLength: 1, maxLength: 12 }).filter((s) => !/[\[\]!]/.test(s) && s.trim() === s && s !== ""), fc.nat(5000), fc.nat(200), fc.integer({ min: 1, max: 900 }), fc.integer({ min: 1, max: 5 }), (sheet, top, left, rows, cols) => {
        const a = { sheet, top, left, rows, cols };
        const p = parseFormula(rsFormula("TRAITTEST", [a, "standardize", 999, 7]));
        expect(p).not.toBeNull();
        expect(p!.args[0]).toEqual({ ref: a });
      }),
    );
  });
});
