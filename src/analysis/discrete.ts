/**
 * Hypergeometric and binomial random variates by inversion from the mode, for the
 * tie-compressed relabelling of large data (./tied-groups.ts).
 *
 * Inversion from the mode (Kachitvichyanukul & Schmeiser 1985, "Computer generation of
 * hypergeometric random variates", J. Stat. Comput. Simul. 22; Devroye 1986, §X.4):
 * the probability at the mode is computed from log-factorials, then a uniform u is
 * spent on the probabilities met walking outward from the mode, alternately up and
 * down, each found from its neighbour by the ratio of successive terms. The expected
 * number of steps is of the order of the standard deviation, so a draw costs O(1 + sd)
 * with no rejection. The result follows the distribution exactly up to floating-point
 * rounding of the probabilities (relative 1e-13 or so).
 */
import { Rng } from "../random";

/** ln k! for k = 0 … n, by summing logs (exact to rounding; n up to a few million). */
export function logFactorials(n: number): Float64Array {
  const t = new Float64Array(n + 1);
  for (let k = 2; k <= n; k++) t[k] = t[k - 1] + Math.log(k);
  return t;
}

/** A source of uniform doubles in [0, 1) (the engine's Rng). */
export interface Uniform {
  nextFloat(): number;
}

/**
 * Number of successes in `m` draws without replacement from `N` items of which `K` are
 * successes: P(x) = C(K, x) C(N − K, m − x) / C(N, m), x from max(0, m − N + K) to
 * min(m, K). `lf` must hold ln k! up to at least N.
 */
export function hypergeometric(N: number, K: number, m: number, lf: Float64Array, u: Uniform): number {
  if (m === 0 || K === 0) return 0;
  if (K === N) return m;
  if (m === N) return K;
  const lo = Math.max(0, m - (N - K));
  const hi = Math.min(m, K);
  if (lo === hi) return lo;
  const NK = N - K;
  let mode = Math.floor(((m + 1) * (K + 1)) / (N + 2));
  if (mode < lo) mode = lo;
  if (mode > hi) mode = hi;
  const pm = Math.exp(lf[K] - lf[mode] - lf[K - mode] + lf[NK] - lf[m - mode] - lf[NK - m + mode] - lf[N] + lf[m] + lf[N - m]);
  let r = u.nextFloat() - pm;
  if (r < 0) return mode;
  let xu = mode, pu = pm, xl = mode, pl = pm;
  for (;;) {
    let moved = false;
    if (xu < hi) {
      // P(x + 1) / P(x) = (K − x)(m − x) / ((x + 1)(N − K − m + x + 1))
      pu *= ((K - xu) * (m - xu)) / ((xu + 1) * (NK - m + xu + 1));
      xu++;
      r -= pu;
      if (r < 0) return xu;
      moved = true;
    }
    if (xl > lo) {
      // P(x − 1) / P(x) = x (N − K − m + x) / ((K − x + 1)(m − x + 1))
      pl *= (xl * (NK - m + xl)) / ((K - xl + 1) * (m - xl + 1));
      xl--;
      r -= pl;
      if (r < 0) return xl;
      moved = true;
    }
    if (!moved) return mode; // only rounding is left over
  }
}

/** Binomial(m, p) successes, p in [0, 1]: P(x) = C(m, x) pˣ (1 − p)^(m − x). `lf` up to m. */
export function binomial(m: number, p: number, lf: Float64Array, u: Uniform): number {
  if (m === 0 || p <= 0) return 0;
  if (p >= 1) return m;
  const q = 1 - p;
  let mode = Math.floor((m + 1) * p);
  if (mode > m) mode = m;
  const lp = Math.log(p);
  const lq = Math.log(q);
  const pm = Math.exp(lf[m] - lf[mode] - lf[m - mode] + mode * lp + (m - mode) * lq);
  let r = u.nextFloat() - pm;
  if (r < 0) return mode;
  const odds = p / q;
  let xu = mode, pu = pm, xl = mode, pl = pm;
  for (;;) {
    let moved = false;
    if (xu < m) {
      pu *= ((m - xu) / (xu + 1)) * odds;
      xu++;
      r -= pu;
      if (r < 0) return xu;
      moved = true;
    }
    if (xl > 0) {
      pl *= (xl / (m - xl + 1)) / odds;
      xl--;
      r -= pl;
      if (r < 0) return xl;
      moved = true;
    }
    if (!moved) return mode;
  }
}

/** A seeded uniform source for these samplers (the engine's generator). */
export function uniforms(seed: number | string): Uniform {
  return new Rng(seed);
}
