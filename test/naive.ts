/**
 * Straightforward reference versions of engine statistics, shared by the tests'
 * brute-force cross-checks and the benchmarks' baselines.
 */

/** Distance ratio by its definition, O(n²): mean |xi − xj| between groups ÷ mean |xi − xj| within groups. */
export function naiveDistanceRatio(x: ArrayLike<number>, lab: ArrayLike<number>): { d: number; between: number; within: number } {
  let sw = 0, nw = 0, sb = 0, nb = 0;
  for (let i = 0; i < x.length; i++) {
    for (let j = i + 1; j < x.length; j++) {
      const a = Math.abs(x[i] - x[j]);
      if (lab[i] === lab[j]) {
        sw += a;
        nw++;
      } else {
        sb += a;
        nb++;
      }
    }
  }
  return { d: sb / nb / (sw / nw), between: sb / nb, within: sw / nw };
}
