/**
 * Optional arguments: option words and option numbers.
 *
 * An omitted optional argument arrives as null (so TypeScript defaults never apply);
 * null, undefined and "" mean "use the default". Option words are case-insensitive and
 * may carry surrounding spaces. Defaults (design): resamples 9999, seed 1, level 0.95,
 * alpha 0.05, direction "two-sided", bins 30.
 */
import { readCell } from "./args";
import { fail, invalid } from "./errors";

export const DEFAULT_RESAMPLES = 9999;
export const MIN_RESAMPLES = 99;
export const MAX_RESAMPLES = 1_000_000;
export const DEFAULT_SEED = 1;
export const DEFAULT_LEVEL = 0.95;
export const DEFAULT_ALPHA = 0.05;
export const DEFAULT_BINS = 30;
export const MAX_BINS = 1000;

type Scalar = { kind: "absent" } | { kind: "number"; value: number } | { kind: "text"; value: string };

/** The single value of an optional argument (a 1 × 1 range counts as its value). */
function scalar(name: string, raw: unknown): Scalar {
  let v = raw;
  if (Array.isArray(v)) {
    const flat = (v as unknown[]).flat();
    if (flat.length !== 1) fail(invalid(`${name} must be a single value, not a range of ${flat.length} cells.`));
    v = flat[0];
  }
  const c = readCell(v);
  switch (c.kind) {
    case "blank":
      return { kind: "absent" };
    case "number":
      return { kind: "number", value: c.value };
    case "text":
      return c.value.trim() === "" ? { kind: "absent" } : { kind: "text", value: c.value.trim() };
    case "logical":
      fail(invalid(`${name} cannot be ${c.value ? "TRUE" : "FALSE"}; leave it empty for the default.`));
    // eslint-disable-next-line no-fallthrough
    case "error":
      fail(invalid(`${name} holds the error ${c.code}; fix that cell, or leave ${name} empty for the default.`));
    // eslint-disable-next-line no-fallthrough
    default:
      fail(invalid(`${name} holds a value that cannot be used; give a number or a word, or leave ${name} empty for the default.`));
  }
}

/** An option word from `choices` (the first is the default), matched ignoring case. */
export function optionWord<T extends string>(name: string, raw: unknown, choices: readonly T[]): T {
  const s = scalar(name, raw);
  if (s.kind === "absent") return choices[0];
  const text = s.kind === "number" ? String(s.value) : s.value;
  const key = text.toLowerCase();
  for (const c of choices) if (c.toLowerCase() === key) return c;
  const list = choices.map((c) => `"${c}"`).join(", ");
  fail(invalid(`${name}: '${text}' is not one of ${list}; leave it empty for "${choices[0]}".`));
}

function wholeNumber(name: string, raw: unknown, dflt: number, lo: number, hi: number, hint: string): number {
  const s = scalar(name, raw);
  if (s.kind === "absent") return dflt;
  if (s.kind !== "number" || !Number.isInteger(s.value) || s.value < lo || s.value > hi) {
    const got = s.kind === "text" ? `'${s.value}'` : String(s.value);
    fail(invalid(`${name} must be ${hint} (got ${got}); leave it empty for ${dflt.toLocaleString("en-US")}.`));
  }
  return s.value;
}

/** resamples: a whole number from 99 to 1,000,000 (default 9999). */
export function resamplesOption(raw: unknown): number {
  return wholeNumber("resamples", raw, DEFAULT_RESAMPLES, MIN_RESAMPLES, MAX_RESAMPLES, "a whole number from 99 to 1,000,000");
}

/** Largest seed magnitude: 15 digits, so every seed is an exact whole number. */
export const MAX_SEED = 999_999_999_999_999;

/** seed: a whole number of at most 15 digits (default 1); the same seed gives the same answer. */
export function seedOption(raw: unknown): number {
  return wholeNumber("seed", raw, DEFAULT_SEED, -MAX_SEED, MAX_SEED, "a whole number of at most 15 digits");
}

/** bins: a whole number from 2 to 1,000 (default 30). */
export function binsOption(raw: unknown): number {
  return wholeNumber("bins", raw, DEFAULT_BINS, 2, MAX_BINS, "a whole number from 2 to 1,000");
}

function proportion(name: string, raw: unknown, dflt: number, example: string): number {
  const s = scalar(name, raw);
  if (s.kind === "absent") return dflt;
  if (s.kind !== "number" || !(s.value > 0 && s.value < 1)) {
    const got = s.kind === "text" ? `'${s.value}'` : String(s.value);
    const pct = s.kind === "number" && s.value > 1 && s.value < 100 ? `; for ${s.value} % write ${s.value / 100}` : "";
    fail(invalid(`${name} must be a number between 0 and 1, e.g. ${example} (got ${got}${pct}); leave it empty for ${dflt}.`));
  }
  return s.value;
}

/** level: confidence level strictly between 0 and 1 (default 0.95). */
export function levelOption(raw: unknown): number {
  return proportion("level", raw, DEFAULT_LEVEL, "0.95");
}

/** alpha: significance level strictly between 0 and 1 (default 0.05). */
export function alphaOption(raw: unknown): number {
  return proportion("alpha", raw, DEFAULT_ALPHA, "0.05");
}

export type DirectionWord = "two-sided" | "greater" | "less";

/** direction: "two-sided" (default), "greater" or "less". */
export function directionOption(raw: unknown): DirectionWord {
  return optionWord("direction", raw, ["two-sided", "greater", "less"] as const);
}
