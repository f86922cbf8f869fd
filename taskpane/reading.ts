/**
 * Plain-language readings of an analysis result, for people who have never used a
 * statistics program: how strong the evidence is, which groups stand out, how big the
 * difference is, and a caution before a costly decision.
 *
 * Evidence words follow common practice for p-values (not a rule of the method):
 * p < 0.001 "very strong", < 0.01 "strong", < 0.05 "moderate", < 0.1 "weak", otherwise
 * "no clear evidence".
 */
import type { AnalysisResult, AssociationResult, GroupsResult, PairedResult, PrecisionResult, TestOutcome, TraitsResult } from "../src/analysis/types";
import { countText, decimalsFor, formatNumber, decimals, pEquals } from "./number-format";

export type Evidence = "very strong" | "strong" | "moderate" | "weak" | "none";

/** Evidence word for a p-value (common practice thresholds, see the file comment). */
export function evidence(p: number): Evidence {
  if (p < 0.001) return "very strong";
  if (p < 0.01) return "strong";
  if (p < 0.05) return "moderate";
  if (p < 0.1) return "weak";
  return "none";
}

function cap(s: string): string {
  return s.charAt(0).toUpperCase() + s.slice(1);
}

/** "exact over all 1,680 relabellings" / "from 9,999 random relabellings". */
export function howText(t: TestOutcome, unit = "relabellings"): string {
  return t.exact ? `exact over all ${countText(t.resamples)} ${unit}` : `from ${countText(t.resamples)} random ${unit}`;
}

/** True when a Monte Carlo p sits at its floor 1/(m + 1): no shuffle was as extreme. */
export function atFloor(t: TestOutcome): boolean {
  return !t.exact && t.count === 0;
}

/**
 * The p-value told as a count of shuffles, e.g. "in only 29 of 99,999 random shuffles of
 * the line labels were the differences as large as in the data (p = 0.0003)".
 * `shuffles` names what was shuffled ("random shuffles of the line labels"); `what` says
 * what was compared ("were the differences as large").
 */
export function pPhrase(t: TestOutcome, shuffles: string, what: string, allWays?: string): string {
  const p = pEquals(t.p);
  if (t.exact) {
    const ways = allWays ?? `possible ${shuffles}`;
    return `in ${t.count / t.resamples < 0.1 ? "only " : ""}${countText(t.count)} of all ${countText(t.resamples)} ${ways} ${what} as in the data (${p}, exact)`;
  }
  if (atFloor(t)) return `in none of ${countText(t.resamples)} random ${shuffles} ${what} as in the data (${p}, the smallest ${countText(t.resamples)} shuffles can show)`;
  const only = t.count / t.resamples < 0.1 ? "only " : "";
  return `in ${only}${countText(t.count)} of ${countText(t.resamples)} random ${shuffles} ${what} as in the data (${p})`;
}

/** English plural of a one-word group name: "line" → "lines", "variety" → "varieties". */
export function plural(word: string): string {
  const w = word.trim();
  if (w === "" || /\s/.test(w) || /s$/i.test(w)) return w;
  if (/[^aeiou]y$/i.test(w)) return w.slice(0, -1) + "ies";
  if (/(x|z|ch|sh)$/i.test(w)) return w + "es";
  return w + "s";
}

/** "the lines" for a group column "Line"; "the groups of Plot no." when the name is not one word. */
export function groupsPhrase(groupName: string): string {
  const g = plainName(groupName);
  return /^[A-Za-z][A-Za-z-]*$/.test(g) ? `the ${plural(g)}` : `the groups of ${g}`;
}

/** The unit in a column name: "Yield (t/ha)" → "t/ha"; "" when there is none. */
export function unitOf(name: string): string {
  const m = /\(([^()]{1,16})\)\s*$/.exec(name);
  return m ? m[1].trim() : "";
}

/** The column name without its unit, as written ("After (mg/L)" → "After"). */
export function unitless(name: string): string {
  const s = name.replace(/\s*\([^()]{1,16}\)\s*$/, "").trim();
  return s === "" ? name : s;
}

/** The column name without its unit, lower case for use inside a sentence. */
export function plainName(name: string): string {
  const s = name.replace(/\s*\([^()]{1,16}\)\s*$/, "").trim();
  return s === "" ? name : /^[A-Z][a-z]/.test(s) ? s.charAt(0).toLowerCase() + s.slice(1) : s;
}

function num(x: number, scale: number): string {
  return formatNumber(x, decimals(decimalsFor(scale)));
}

function withUnit(text: string, unit: string): string {
  return unit ? `${text} ${unit}` : text;
}

export interface Names {
  /** Measured column ("Yield (t/ha)"). */
  value?: string;
  /** Group column ("Line"). */
  group?: string;
  block?: string;
  x?: string;
  y?: string;
  traits?: string[];
}

/** The statistic the reading leads with. */
export function leadTest(r: GroupsResult): { t: TestOutcome; name: string } {
  if (r.primary === "SNR" && r.snr) return { t: r.snr, name: "distance ratio" };
  if (r.primary === "RANK" && r.rank) return { t: r.rank, name: r.blocks ? "rank test within blocks" : "rank test" };
  return { t: r.f, name: r.blocks ? "permutation F after blocks" : "permutation F" };
}

/** Sentences for the group comparison. */
export function readGroups(r: GroupsResult, names: Names): string[] {
  const what = plainName(names.value ?? "the values");
  const groupWord = plainName(names.group ?? "group");
  const groups = groupsPhrase(names.group ?? "group");
  const unit = unitOf(names.value ?? "");
  const lead = leadTest(r);
  const ev = evidence(lead.t.p);
  const out: string[] = [];
  const within = r.blocks ? ` within each ${plainName(names.block ?? "block")}` : "";
  const phrase = pPhrase(lead.t, `shuffles of the ${groupWord} labels${within}`, "were the differences as large");
  const claim = `that ${what} differs between ${groups}`;
  out.push(ev === "none" ? `No clear evidence ${claim}: ${phrase}.` : `${cap(ev)} evidence ${claim}: ${phrase}.`);

  const scale = Math.max(...r.summary.map((s) => Math.abs(s.mean)));
  const order = r.summary.map((s, i) => i).sort((a, b) => r.summary[b].mean - r.summary[a].mean);
  const top = order[0];
  const bottom = order[order.length - 1];
  const alpha = r.options.alpha;
  const differsFrom = (g: number) =>
    r.pairwise.filter((p) => p.pAdjusted <= alpha && (p.a === r.names[g] || p.b === r.names[g])).map((p) => (p.a === r.names[g] ? p.b : p.a));
  const topName = r.names[top];
  const beaten = differsFrom(top);
  out.push(
    `${topName} has the highest mean ${what} (${withUnit(num(r.summary[top].mean, scale), unit)}) and ${r.names[bottom]} the lowest (${withUnit(num(r.summary[bottom].mean, scale), unit)}).`,
  );
  if (beaten.length > 0) {
    const pair = r.pairwise.find((p) => (p.a === topName && p.b === beaten[0]) || (p.b === topName && p.a === beaten[0]))!;
    const sign = pair.a === topName ? 1 : -1;
    const lo = sign > 0 ? pair.lower : -pair.upper;
    const hi = sign > 0 ? pair.upper : -pair.lower;
    out.push(
      `${topName} is clearly ahead of ${listText(beaten)}: for example ${withUnit(num(sign * pair.difference, scale), unit)} above ${beaten[0]} on average (${Math.round(r.options.level * 100)} % interval ${num(lo, scale)} to ${num(hi, scale)}). The letters in section 3 show which ${plural(groupWord)} can be told apart.`,
    );
  } else if (r.pairwise.some((p) => p.pAdjusted <= alpha)) {
    out.push(`Some pairs differ clearly (adjusted p ≤ ${alpha}); the letters in section 3 show which: groups sharing a letter are not shown to differ.`);
  } else {
    out.push(`No single pair differs clearly once the number of comparisons is allowed for (adjusted p above ${alpha}).`);
  }
  const disagree = [r.f, r.snr, r.rank].filter((t): t is TestOutcome => t !== null).some((t) => evidence(t.p) === "none") && ev !== "none";
  if (disagree) out.push(`The tests do not all agree: one outlying plot or a skewed spread can sway the F test; look at the distance ratio and the rank test too.`);
  return out;
}

function listText(xs: string[]): string {
  if (xs.length <= 1) return xs.join("");
  return `${xs.slice(0, -1).join(", ")} and ${xs[xs.length - 1]}`;
}

export function readPaired(r: PairedResult, names: Names): string[] {
  const first = unitless(names.y ?? "the first measurement");
  const second = unitless(names.x ?? "the second measurement");
  const unit = unitOf(names.x ?? "") || unitOf(names.y ?? "");
  const scale = Math.max(Math.abs(r.x.mean), Math.abs(r.y.mean));
  const ev = evidence(r.signFlip.p);
  const dir = r.d.mean < 0 ? "lower" : "higher";
  const out: string[] = [];
  const phrase = pPhrase(r.signFlip, "sign flips of the changes", "was the average change as large", `ways of flipping the signs of the ${r.signFlip.nonZero} changes`);
  if (ev === "none") out.push(`No clear evidence that ${second} differs from ${first}: ${phrase}.`);
  else out.push(`${cap(ev)} evidence that ${second} is ${dir} than ${first}: ${phrase}.`);
  const lvl = Math.round(r.options.level * 100);
  out.push(
    `On average ${second} is ${withUnit(num(Math.abs(r.d.mean), scale), unit)} ${dir} than ${first} (${lvl} % interval of the change ${num(r.interval.lower, scale)} to ${num(r.interval.upper, scale)}${Number.isFinite(r.percentChange) ? `; ${formatNumber(Math.abs(r.percentChange), "0.0")} % ${dir === "lower" ? "down" : "up"}` : ""}).`,
  );
  const c = r.counts;
  out.push(`${c.down} of ${r.n} pairs went down, ${c.up} went up${c.same ? ` and ${c.same} did not change` : ""}.`);
  return out;
}

export function readAssociation(r: AssociationResult, names: Names): string[] {
  const x = unitless(names.x ?? "x");
  const y = unitless(names.y ?? "y");
  const ev = evidence(r.pearson.p);
  const rv = r.pearson.statistic;
  const dir = rv >= 0 ? "rises" : "falls";
  const out: string[] = [];
  const phrase = pPhrase(r.pearson, `rearrangements of ${y} against ${x}`, "was the correlation as strong");
  if (ev === "none") out.push(`No clear evidence that ${y} is associated with ${x} (r = ${formatNumber(rv, "0.00")}): ${phrase}.`);
  else out.push(`${cap(ev)} evidence that ${y} ${dir} with ${x} (r = ${formatNumber(rv, "0.00")}): ${phrase}.`);
  out.push(`The rank correlation, which ignores the size of outlying values, is ${formatNumber(r.spearman.statistic, "0.00")} (${pEquals(r.spearman.p)}).`);
  out.push(`The straight line through the points: ${y} ≈ ${num(r.intercept, Math.abs(r.y.mean))} + ${formatNumber(r.slope, decimals(decimalsFor(r.slope) + 1))} × ${x}. An association is not proof that one causes the other.`);
  return out;
}

const STAT_WORDS: Record<string, string> = { mean: "mean", median: "median", sd: "standard deviation of", cv: "CV % of", trimmed: "10 % trimmed mean" };

export function readPrecision(r: PrecisionResult, names: Names): string[] {
  const what = plainName(names.value ?? "the values");
  const unit = unitOf(names.value ?? "");
  const chosen = r.intervals.find((i) => i.statistic === r.statistic) ?? r.intervals[0];
  const lvl = Math.round(r.options.level * 100);
  const out: string[] = [];
  if (chosen.result) {
    const s = chosen.result;
    const scale = Math.abs(s.estimate) || Math.abs(r.description.mean);
    const u = r.statistic === "cv" ? "%" : unit;
    out.push(
      `The ${STAT_WORDS[r.statistic]} ${what} is ${withUnit(num(s.estimate, scale), u)}; with ${lvl} % confidence it lies between ${num(s.lower, scale)} and ${withUnit(num(s.upper, scale), u)} (${s.method} bootstrap, ${countText(s.resamples)} resamples).`,
    );
    const width = s.upper - s.lower;
    out.push(`The interval is ${withUnit(num(width, scale), u)} wide: a repeat of this sampling could easily give any value in it. More observations would narrow it.`);
  } else out.push(`No interval for the ${STAT_WORDS[r.statistic]}: ${chosen.note ?? "the data do not allow it"}.`);
  return out;
}

export function readTraits(r: TraitsResult, names: Names): string[] {
  const groupWord = plainName(names.group ?? "group");
  const groups = groupsPhrase(names.group ?? "group");
  const ev = evidence(r.permanova.p);
  const out: string[] = [];
  const phrase = pPhrase(r.permanova, `shuffles of the ${groupWord} labels`, "were the differences as large");
  if (ev === "none") out.push(`No clear evidence that ${groups} differ on the traits taken together: ${phrase}.`);
  else out.push(`${cap(ev)} evidence that ${groups} differ on the traits taken together: ${phrase}.`);
  const disp = evidence(r.dispersion.p);
  if (disp !== "none" && disp !== "weak")
    out.push(`The groups also differ in spread (${pEquals(r.dispersion.p)}), so part of the difference may be spread rather than level.`);
  else out.push(`The groups do not clearly differ in spread (${pEquals(r.dispersion.p)}), so the difference is mainly one of level.`);
  const traitNames = (names.traits ?? r.traits.map((_, i) => `trait ${i + 1}`)).map(plainName);
  const clear = r.traits.map((t, i) => (t.pAdjusted <= r.options.alpha ? traitNames[i] : null)).filter((x): x is string => x !== null);
  out.push(clear.length > 0 ? `Taken one at a time, ${listText(clear)} differ${clear.length === 1 ? "s" : ""} clearly (Holm-adjusted p ≤ ${r.options.alpha}).` : `Taken one at a time, no single trait differs clearly after allowing for the number of traits.`);
  return out;
}

/** The reading for any result. */
export function reading(r: AnalysisResult, names: Names): string[] {
  switch (r.question) {
    case "groups":
      return readGroups(r, names);
    case "paired":
      return readPaired(r, names);
    case "association":
      return readAssociation(r, names);
    case "precision":
      return readPrecision(r, names);
    case "traits":
      return readTraits(r, names);
  }
}

/** Said with every result: the limits of one trial, and who has the last word. */
export const COMMON_CAUTION =
  "One trial is weak evidence on its own: check that plots or samples were randomized and the data have no slips, and weigh the result with local recommendations and qualified advice before a costly decision.";

/** The short caution shown with every result that can drive a costly decision. */
export function caution(r: AnalysisResult): string {
  return `Caution: ${specificCaution(r)} ${COMMON_CAUTION}`;
}

function specificCaution(r: AnalysisResult): string {
  switch (r.question) {
    case "groups":
      return "a small p-value says the differences are unlikely to be chance alone, not that they are big enough to pay; weigh the size of each difference and its interval against costs, and ask whether the trial covered your conditions (seasons, soils, sites).";
    case "paired":
      return "a change between two readings may come from the treatment or from anything else that changed in between (time, instrument, handling); weigh the size of the change, not only the p-value.";
    case "association":
      return "an association can come from a third factor that drives both columns; do not act on it as if one causes the other without other evidence.";
    case "precision":
      return "the interval covers only the chance of sampling, not measurement bias or samples that do not represent the whole.";
    case "traits":
      return "a difference on the traits taken together does not say which trait matters for your decision; look at the traits one at a time and at their sizes.";
  }
}
