import { describe, expect, it } from "vitest";
import { jStat } from "jstat";
import { chiSquareUpper, fUpper, normalPValue, normalUpper, tPValue, tUpper } from "../../src/distributions";

const rel = (a: number, b: number) => Math.abs(a / b - 1);

// Closed forms of the reference distributions (standard results, e.g. Johnson, Kotz &
// Balakrishnan 1994/1995): chi-squared with 2 df is exponential; F with 2 numerator df
// has P(F ≥ f) = (1 + 2f/d2)^(−d2/2); t with 1 df is Cauchy; t with 2 df has
// P(|T| ≥ t) = 1 − t/√(2 + t²).
describe("tail probabilities against closed forms", () => {
  it("chi-squared, 2 df: P = exp(−x/2), also far in the tail", () => {
    for (const x of [0.01, 0.5, 2, 3.9, 4, 6, 11.14, 30, 50, 200, 700]) {
      expect(rel(chiSquareUpper(x, 2), Math.exp(-x / 2))).toBeLessThan(1e-13);
    }
    expect(chiSquareUpper(0, 3)).toBe(1);
  });

  it("chi-squared, 4 df: P = exp(−x/2)(1 + x/2)", () => {
    for (const x of [0.1, 1, 3, 5, 9.49, 20, 80]) {
      expect(rel(chiSquareUpper(x, 4), Math.exp(-x / 2) * (1 + x / 2))).toBeLessThan(1e-13);
    }
  });

  it("F with 2 numerator df, any denominator df (also fractional)", () => {
    for (const d2 of [1, 2, 3, 5, 10, 17.128418616644137, 27, 100, 1000, 1e5]) {
      for (const f of [0.01, 0.1, 0.5, 1, 2, 4.846, 10, 30, 1000]) {
        const closed = Math.exp((-d2 / 2) * Math.log1p((2 * f) / d2));
        if (closed > 1e-300) expect(rel(fUpper(f, 2, d2), closed)).toBeLessThan(d2 > 1000 ? 1e-11 : 1e-12);
      }
    }
    expect(fUpper(0, 2, 5)).toBe(1);
    expect(fUpper(Infinity, 2, 5)).toBe(0);
  });

  it("Student t with 1 and 2 df", () => {
    for (const t of [0.05, 0.5, 1, 2, 5, 20, 1e4]) {
      // Cancellation-free forms: 1 − 2 atan(t)/π = 2 atan(1/t)/π; 1 − t/√(2+t²) = 2 / (√(2+t²)(√(2+t²) + t)).
      const r = Math.sqrt(2 + t * t);
      expect(rel(tPValue(t, 1, "two-sided"), (2 * Math.atan(1 / t)) / Math.PI)).toBeLessThan(1e-12);
      expect(rel(tPValue(t, 2, "two-sided"), 2 / (r * (r + t)))).toBeLessThan(1e-12);
      expect(rel(tUpper(-t, 2), 0.5 + t / (2 * Math.sqrt(2 + t * t)))).toBeLessThan(1e-13);
    }
  });

  it("normal tail agrees with the t tail for huge df and with known quantiles", () => {
    // 1.959963984540054 is the 0.975 standard normal quantile (standard tables, to 16 digits from memory).
    expect(Math.abs(normalUpper(1.959963984540054) - 0.025)).toBeLessThan(1e-15);
    expect(normalUpper(0)).toBeCloseTo(0.5, 15);
    expect(rel(normalPValue(-1.2, "less"), normalUpper(1.2))).toBeLessThan(1e-15);
    // t → normal as df → ∞: P(T ≥ t) = P(Z ≥ t) + φ(t)(t³ + t)/(4 df) + O(df⁻²) (Fisher 1925);
    // exercises ln B with huge arguments and the switch to the expansion beyond 1e7 df.
    for (const df of [1e6, 9.9e6, 1.01e7, 1e12]) {
      for (const t of [1.7, 3.1]) {
        const phi = Math.exp(-t * t / 2) / Math.sqrt(2 * Math.PI);
        expect(rel(tUpper(t, df), normalUpper(t) + (phi * (t ** 3 + t)) / (4 * df))).toBeLessThan(1e-9);
      }
    }
  });

  it("agrees with jstat's cdfs where those are accurate", () => {
    for (const [x, df] of [[3, 1], [7.5, 3], [11, 5], [2.5, 10]]) {
      expect(Math.abs(chiSquareUpper(x, df) - (1 - jStat.chisquare.cdf(x, df)))).toBeLessThan(1e-8);
    }
    for (const [f, a, b] of [[1.2, 3, 14], [4, 5, 20], [0.7, 1, 8]]) {
      expect(Math.abs(fUpper(f, a, b) - (1 - jStat.centralF.cdf(f, a, b)))).toBeLessThan(1e-7);
    }
    for (const [t, df] of [[1.1, 14], [2.2, 9.5], [-0.4, 30]]) {
      expect(Math.abs(tUpper(t, df) - (1 - jStat.studentt.cdf(t, df)))).toBeLessThan(1e-7);
    }
  });
});
