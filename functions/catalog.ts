/**
 * The sheet functions: name, parameters in order (optional ones last), which
 * parameters are ranges, whether the answer spills, and the argument parser that turns
 * a call into an engine job. Names, parameter order and option words are the product's
 * interface (design.md) — functions.ts declares the same list for Excel.
 */
import { CallArgs } from "./call-args";
import { prepareBlockTest } from "./impl-blocks";
import { prepareGroupStat, prepareGroupTest, prepareNullHist, prepareSnr } from "./impl-groups";
import { prepareDiffInterval, prepareInterval } from "./impl-intervals";
import { prepareLetters, preparePairwise } from "./impl-pairwise";
import { prepareSummary } from "./impl-summary";
import { prepareTraitTest } from "./impl-traits";
import { prepareCorrTest, preparePairTest, prepareTwoTest } from "./impl-two";
import { Job } from "./job";

export interface ParamSpec {
  name: string;
  optional: boolean;
  /** A range argument (2D array), as opposed to a single option value. */
  range: boolean;
}

export interface FunctionSpec {
  name: string;
  params: ParamSpec[];
  /** True when the answer is a spilled table (a 2D array). */
  spills: boolean;
  prepare(a: CallArgs): Job;
}

const R = (name: string): ParamSpec => ({ name, optional: false, range: true });
const O = (name: string): ParamSpec => ({ name, optional: true, range: false });

export const FUNCTION_SPECS: FunctionSpec[] = [
  { name: "GROUPTEST", params: [R("values"), R("groups"), O("statistic"), O("resamples"), O("seed")], spills: false, prepare: prepareGroupTest },
  { name: "STAT", params: [R("values"), R("groups"), O("statistic")], spills: false, prepare: prepareGroupStat },
  { name: "SNR", params: [R("values"), R("groups")], spills: false, prepare: prepareSnr },
  { name: "TWOTEST", params: [R("values1"), R("values2"), O("direction"), O("statistic"), O("resamples"), O("seed")], spills: false, prepare: prepareTwoTest },
  { name: "PAIRTEST", params: [R("values1"), R("values2"), O("direction"), O("resamples"), O("seed")], spills: false, prepare: preparePairTest },
  { name: "BLOCKTEST", params: [R("values"), R("treatments"), R("blocks"), O("statistic"), O("resamples"), O("seed")], spills: false, prepare: prepareBlockTest },
  { name: "CORRTEST", params: [R("x"), R("y"), O("method"), O("direction"), O("resamples"), O("seed")], spills: false, prepare: prepareCorrTest },
  { name: "INTERVAL", params: [R("values"), O("statistic"), O("level"), O("method"), O("resamples"), O("seed")], spills: true, prepare: prepareInterval },
  {
    name: "DIFFINTERVAL",
    params: [R("values1"), R("values2"), O("statistic"), O("level"), O("method"), O("resamples"), O("seed")],
    spills: true,
    prepare: prepareDiffInterval,
  },
  { name: "PAIRWISE", params: [R("values"), R("groups"), O("adjust"), O("level"), O("resamples"), O("seed")], spills: true, prepare: preparePairwise },
  { name: "LETTERS", params: [R("values"), R("groups"), O("alpha"), O("adjust"), O("resamples"), O("seed")], spills: true, prepare: prepareLetters },
  { name: "GROUPSUMMARY", params: [R("values"), R("groups")], spills: true, prepare: prepareSummary },
  { name: "TRAITTEST", params: [R("traits"), R("groups"), O("scale"), O("resamples"), O("seed")], spills: false, prepare: prepareTraitTest },
  { name: "NULLHIST", params: [R("values"), R("groups"), O("statistic"), O("bins"), O("resamples"), O("seed")], spills: true, prepare: prepareNullHist },
];

export const FUNCTIONS: Record<string, FunctionSpec> = Object.fromEntries(FUNCTION_SPECS.map((s) => [s.name, s]));
