/**
 * The effect sizes of a group comparison, shared by the one-way/blocked analysis
 * (./groups) and the large-data analysis (./tied-groups):
 *  - eta² and omega² of the one-way layout (Hays 1963; Olejnik & Algina 2003);
 *  - for every pair of groups, the Hodges–Lehmann shift with its distribution-free
 *    interval (Hodges & Lehmann 1963) and Cliff's delta (Cliff 1993).
 */
import { cliffsDelta, hodgesLehmann, oneWayEffectSizes } from "../effects";
import type { GroupsResult, PairEffect } from "./types";

/**
 * Effect sizes of `values` by group `codes` (0..k−1, names in `names`); `groups` are the
 * values split by group (as splitByGroup gives them); pairs in the order (0,1), (0,2), …, (k−2,k−1).
 */
export function groupEffects(
  values: ArrayLike<number>,
  codes: ArrayLike<number>,
  names: readonly string[],
  groups: readonly ArrayLike<number>[],
  level: number,
): GroupsResult["effects"] {
  const k = names.length;
  const eff = oneWayEffectSizes(values, codes, k);
  const pairs: PairEffect[] = [];
  for (let a = 0; a < k; a++) {
    for (let b = a + 1; b < k; b++) {
      pairs.push({ a: names[a], b: names[b], shift: hodgesLehmann(groups[a], groups[b], { level }), cliffsDelta: cliffsDelta(groups[a], groups[b]) });
    }
  }
  return { etaSquared: eff.etaSquared, omegaSquared: eff.omegaSquared, pairs };
}
