import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { MaxTStepDown, benjaminiHochberg, holm } from "../../src/multiplicity";
import { getCase, value } from "../reference";

// Benjamini & Hochberg (1995), §4: the 15 p-values of their worked example (values from
// memory); the procedure at q = 0.05 rejects 4 hypotheses there, a Bonferroni-type
// step-down 3. The full adjusted vectors below are hand computations from the formulas.
const bhExample = [0.0001, 0.0004, 0.0019, 0.0095, 0.0201, 0.0278, 0.0298, 0.0344, 0.0459, 0.324, 0.4262, 0.5719, 0.6528, 0.759, 1.0];
const bhByHand = [
  0.0015, 0.003, 0.0095, 0.035625, 0.0603, 0.0298 * 15 / 7, 0.0298 * 15 / 7, 0.0645, 0.0765, 0.486, 0.4262 * 15 / 11, 0.714875,
  0.6528 * 15 / 13, 0.759 * 15 / 14, 1,
];
const holmByHand = [0.0015, 0.0056, 0.0247, 0.114, 0.2211, 0.278, 0.278, 0.278, 0.3213, 1, 1, 1, 1, 1, 1];

describe("Holm (1979) and Benjamini–Hochberg (1995)", () => {
  it("reproduce the Benjamini & Hochberg (1995) example: 4 FDR rejections, 3 familywise", () => {
    const bh = benjaminiHochberg(bhExample);
    const h = holm(bhExample);
    bhByHand.forEach((v, i) => expect(bh[i]).toBeCloseTo(v, 12));
    holmByHand.forEach((v, i) => expect(h[i]).toBeCloseTo(v, 12));
    expect(Array.from(bh).filter((p) => p <= 0.05).length).toBe(4);
    expect(Array.from(h).filter((p) => p <= 0.05).length).toBe(3);
  });

  it("Holm on the PlantGrowth pairwise exact p-values (shared reference values, cases.json case 8)", () => {
    const c = getCase("plantgrowth_pairwise_exact_holm");
    const names = ["ctrl_trt1", "ctrl_trt2", "trt1_trt2"];
    const h = holm(names.map((n) => value(c, `${n}_p_exact_two_sided`)));
    names.forEach((n, i) => expect(h[i]).toBeCloseTo(value(c, `${n}_p_holm`), 12));
  });

  it("are monotone in p, at least the raw p, capped at 1, and follow the input order (property)", () => {
    fc.assert(
      fc.property(fc.array(fc.double({ min: 0, max: 1, noNaN: true }), { minLength: 1, maxLength: 30 }), (p) => {
        for (const adj of [holm(p), benjaminiHochberg(p)]) {
          for (let i = 0; i < p.length; i++) {
            expect(adj[i]).toBeGreaterThanOrEqual(p[i] - 1e-15);
            expect(adj[i]).toBeLessThanOrEqual(1);
            for (let j = 0; j < p.length; j++) if (p[i] < p[j]) expect(adj[i]).toBeLessThanOrEqual(adj[j] + 1e-15);
          }
        }
        // BH never exceeds Holm
        const h = holm(p);
        const b = benjaminiHochberg(p);
        for (let i = 0; i < p.length; i++) expect(b[i]).toBeLessThanOrEqual(h[i] + 1e-15);
        // permuting the input permutes the output
        const perm = p.map((_, i) => p.length - 1 - i);
        const hp = holm(perm.map((i) => p[i]));
        perm.forEach((i, r) => expect(hp[r]).toBe(h[i]));
      }),
      { numRuns: 200 },
    );
  });

  it("reject p-values outside [0, 1]", () => {
    expect(() => holm([0.2, 1.5])).toThrow(RangeError);
    expect(() => benjaminiHochberg([NaN])).toThrow(RangeError);
  });
});

describe("Westfall & Young (1993) max-T step-down accumulator", () => {
  it("with one hypothesis gives the ordinary permutation p", () => {
    const acc = new MaxTStepDown([2.5]);
    const nullStats = [0.1, 3, 2.5, 1, 2.4999999999999996, 0.2, 4, 1.1, 0.3];
    for (const t of nullStats) acc.add([t]);
    // observed 2.5: ties within 1e-12 count; 3, 2.5, 2.4999…, 4 → 4 of 9
    expect(acc.adjusted(true)[0]).toBeCloseTo(4 / 9, 15);
    expect(acc.adjusted(false)[0]).toBeCloseTo(5 / 10, 15);
  });

  it("equals the definition p̃_(j) = max_{i ≤ j} P(max_{l ≥ i} T*_l ≥ t_(i)) on random null tables", () => {
    fc.assert(
      fc.property(
        fc.array(fc.double({ min: 0, max: 5, noNaN: true }), { minLength: 1, maxLength: 6 }).chain((obs) =>
          fc.tuple(fc.constant(obs), fc.array(fc.array(fc.double({ min: 0, max: 5, noNaN: true }), { minLength: obs.length, maxLength: obs.length }), { minLength: 1, maxLength: 40 })),
        ),
        ([obs, table]) => {
          const acc = new MaxTStepDown(obs);
          table.forEach((row) => acc.add(row));
          const got = acc.adjusted(true);
          const order = obs.map((_, i) => i).sort((a, b) => obs[b] - obs[a] || a - b);
          let running = 0;
          order.forEach((h, j) => {
            const rest = order.slice(j);
            const count = table.filter((row) => Math.max(...rest.map((l) => row[l])) >= obs[h] - 1e-12 * obs[h]).length;
            running = Math.max(running, count / table.length);
            expect(got[h]).toBeCloseTo(running, 14);
          });
        },
      ),
      { numRuns: 200 },
    );
  });
});
