/**
 * The preview's renderer of the block's number formats. Expected texts follow Excel's
 * documented number-format rules (a condition section applies when the condition holds,
 * otherwise the next section; "0" pads, "#,##0" groups thousands; "%" multiplies by
 * 100) — from memory of Excel's format syntax, common practice for spreadsheet tools.
 */
import { describe, expect, it } from "vitest";
import { INT_FORMAT, P_FORMAT, decimals, decimalsFor, formatNumber, general, pText } from "../../taskpane/number-format";

describe("p-value format", () => {
  it("never shows a p below 0.0001 as 0", () => {
    expect(formatNumber(0.00003, P_FORMAT)).toBe("< 0.0001");
    expect(formatNumber(0, P_FORMAT)).toBe("< 0.0001");
    expect(formatNumber(1e-12, P_FORMAT)).toBe("< 0.0001");
  });
  it("shows four decimals otherwise", () => {
    expect(formatNumber(0.0001, P_FORMAT)).toBe("0.0001");
    expect(formatNumber(0.012345, P_FORMAT)).toBe("0.0123");
    expect(formatNumber(0.05267333984375, P_FORMAT)).toBe("0.0527");
    expect(formatNumber(1, P_FORMAT)).toBe("1.0000");
    expect(pText(0.003)).toBe("0.0030");
  });
});

describe("fixed and grouped formats", () => {
  it("pads, rounds and groups thousands", () => {
    expect(formatNumber(1680, INT_FORMAT)).toBe("1,680");
    expect(formatNumber(9999, INT_FORMAT)).toBe("9,999");
    expect(formatNumber(4.5, decimals(2))).toBe("4.50");
    expect(formatNumber(-0.005, decimals(2))).toBe("-0.01");
    expect(formatNumber(-0.004, decimals(2))).toBe("0.00");
    expect(formatNumber(1234567.891, decimals(1))).toBe("1,234,567.9");
    expect(formatNumber(0.396, "0.0%")).toBe("39.6%");
    expect(formatNumber(17.6, "0.0")).toBe("17.6");
  });
  it("General keeps up to 11 characters of precision", () => {
    expect(general(4.08)).toBe("4.08");
    expect(general(1 / 3)).toBe("0.333333333");
    expect(general(-2 / 3)).toBe("-0.66666667");
    expect(general(0)).toBe("0");
    expect(formatNumber(7.25, undefined)).toBe("7.25");
  });
  it("chooses decimals by the size of the quantity", () => {
    expect(decimalsFor(4.5)).toBe(2);
    expect(decimalsFor(150)).toBe(1);
    expect(decimalsFor(2500)).toBe(0);
    expect(decimalsFor(0.05)).toBe(4);
  });
});
