/**
 * "How precise is a summary?" — bootstrap intervals (percentile, basic or BCa; Efron
 * 1987; Efron & Tibshirani 1993) for the mean, median, SD, CV % and 10 % trimmed mean
 * of one column, beside the classical t interval of the mean (Student 1908). Each
 * interval is the engine call behind RS.INTERVAL(values, statistic, level, method,
 * resamples, seed).
 */
import { jStat } from "jstat";
import { IntervalStatistic, bootstrapInterval } from "../bootstrap";
import { describe } from "../summary";
import { Stages } from "./progress";
import type { PrecisionRequest, PrecisionResult, ProgressFn } from "./types";

export const INTERVAL_STATISTICS: IntervalStatistic[] = ["mean", "median", "sd", "cv", "trimmed"];

export function analysePrecision(req: PrecisionRequest, onProgress?: ProgressFn): PrecisionResult {
  const { values, options } = req;
  const n = values.length;
  if (n < 3) throw new RangeError("an interval needs at least three values");
  const stages = new Stages(INTERVAL_STATISTICS.map(() => n), onProgress);
  const intervals = INTERVAL_STATISTICS.map((statistic) => {
    const progress = stages.next();
    try {
      const result = bootstrapInterval(values, statistic, {
        level: options.level,
        method: options.method,
        resamples: options.resamples,
        seed: options.seed,
        onProgress: progress,
      });
      return { statistic, result };
    } catch (e) {
      if (!(e instanceof RangeError)) throw e;
      return { statistic, result: null, note: e.message };
    }
  });
  const description = describe(values);
  let tInterval: PrecisionResult["tInterval"] = null;
  if (description.sd !== null && n >= 2) {
    const df = n - 1;
    const q = jStat.studentt.inv(1 - (1 - options.level) / 2, df);
    const half = (q * description.sd) / Math.sqrt(n);
    tInterval = { lower: description.mean - half, upper: description.mean + half, df };
  }
  stages.done();
  return { question: "precision", n, description, statistic: req.statistic, intervals, tInterval, options };
}
