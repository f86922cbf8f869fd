/**
 * "Do groups differ on several traits at once?" — PERMANOVA on the (standardized)
 * traits (Anderson 2001) with a dispersion test beside it (Anderson 2006), so that a
 * shift in location can be told from a difference in spread; then each trait alone by
 * the permutation F (Pitman 1937) with Holm's (1979) adjustment across traits.
 * The PERMANOVA call is the one behind RS.TRAITTEST(traits, groups, scale, resamples,
 * seed); each trait's F is RS.GROUPTEST(trait, groups, "F", resamples, seed).
 */
import { holm } from "../multiplicity";
import { dispersionTest, permanova } from "../multivariate";
import { permutationF } from "../oneway";
import { outcome } from "./groups";
import { Stages } from "./progress";
import type { ProgressFn, TraitsRequest, TraitsResult } from "./types";

export function analyseTraits(req: TraitsRequest, onProgress?: ProgressFn): TraitsResult {
  const { traits, codes, names, options } = req;
  const k = names.length;
  const n = codes.length;
  if (traits.length < 1) throw new RangeError("choose at least one trait column");
  if (k < 2) throw new RangeError("there is only one group: a comparison needs at least two");
  const base = { resamples: options.resamples, seed: options.seed };
  const p = traits.length;
  const stages = new Stages([n * p, n * p, ...traits.map(() => n)], onProgress);
  const pm = permanova(traits, codes, k, { ...base, scale: req.scale, onProgress: stages.next() });
  const disp = dispersionTest(traits, codes, k, { ...base, scale: req.scale, onProgress: stages.next() });
  const sizes = new Float64Array(k);
  for (let i = 0; i < n; i++) sizes[codes[i]]++;
  const per = traits.map((t) => {
    const means = new Array<number>(k).fill(0);
    for (let i = 0; i < n; i++) means[codes[i]] += t[i] / sizes[codes[i]];
    return { means, test: outcome(permutationF(t, codes, k, { ...base, onProgress: stages.next() })), pAdjusted: 1 };
  });
  const adj = holm(per.map((t) => t.test.p));
  per.forEach((t, i) => (t.pAdjusted = adj[i]));
  stages.done();
  return {
    question: "traits",
    n,
    names: names.slice(),
    traits: per,
    permanova: { ...outcome(pm), r2: pm.r2 },
    dispersion: { ...outcome(disp), meanDistance: disp.meanDistance },
    scale: req.scale,
    options,
  };
}
