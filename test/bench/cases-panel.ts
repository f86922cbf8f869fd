/**
 * Benchmark cases of the panel's worker path: a one-way analysis ("do the groups
 * differ?") of 100,000 rows with 9,999 resamples — yields recorded to 0.01 t/ha, as
 * trial data are, so the shared tie-compressed relabellings apply. In the panel the two
 * parts run in two Web Workers at once and the merge runs in the first, so the panel's
 * wall time is about one part plus the merge (reported by the browser test as well).
 * Baseline: the engine's permutation F alone on the same data, one relabelling of all
 * 100,000 rows at a time.
 */
import { BenchCase } from "./harness";
import { permutationF } from "../../src/oneway";
import { Rng } from "../../src/random";
import { DEFAULT_OPTIONS, GroupsRequest } from "../../src/analysis/types";
import { SHARED_PARTS, finishShared, sharedPartial } from "../../src/analysis/tied-groups";
import { runJob } from "../../taskpane/analysis-worker";

const n = 100000;
const rng = new Rng(2024);
const values = new Float64Array(n);
const codes = new Int32Array(n);
for (let i = 0; i < n; i++) {
  codes[i] = i % 4;
  // right-skewed yields around 4–5 t/ha, rounded to 0.01
  values[i] = Math.round(100 * (3.6 + 0.1 * codes[i] + 0.6 * Math.exp(0.45 * rng.normal()))) / 100;
}
const request: GroupsRequest = { question: "groups", values, codes, names: ["HB-07", "HB-12", "HB-19", "HB-23"], blocks: null, primary: "F", options: DEFAULT_OPTIONS };
const parts = Array.from({ length: SHARED_PARTS }, (_, i) => sharedPartial(request, i, SHARED_PARTS));

export const panelCases: BenchCase[] = [
  {
    name: "panel one-way 100,000 rows × 9,999: one worker's part",
    run: () => sharedPartial(request, 0, SHARED_PARTS),
    reps: 3,
  },
  {
    name: "panel one-way 100,000 rows × 9,999: merge in a worker",
    run: () => finishShared(request, parts),
    reps: 3,
  },
  {
    name: "panel one-way 100,000 rows × 9,999: whole worker path, one thread",
    run: () => runJob({ type: "run", id: 1, request }, () => undefined),
    baseline: () => permutationF(values, codes, 4, { resamples: 9999, seed: 1 }),
    targetMs: 3000,
    reps: 3,
  },
];
