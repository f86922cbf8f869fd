/**
 * Messages between the panel and its analysis workers (analysis-worker.ts).
 *  - "run": a whole analysis in one worker;
 *  - "part" / "finish": the shared relabellings of large data split over two workers,
 *    then merged in one of them (so the page itself never does heavy work).
 */
import type { AnalysisRequest, AnalysisResult, GroupsRequest } from "../src/analysis/types";
import type { SharedPartial } from "../src/analysis/tied-groups";

export type PanelMessage =
  | { type: "run"; id: number; request: AnalysisRequest }
  | { type: "part"; id: number; request: GroupsRequest; part: number; parts: number }
  | { type: "finish"; id: number; request: GroupsRequest; partials: SharedPartial[] };

/** Kept for callers that only run whole analyses. */
export type RunMessage = Extract<PanelMessage, { type: "run" }>;

export type WorkerMessage =
  | { type: "progress"; id: number; fraction: number }
  | { type: "done"; id: number; result: AnalysisResult; ms: number }
  | { type: "partial"; id: number; partial: SharedPartial; ms: number }
  | { type: "error"; id: number; message: string };
