/**
 * Runs any of the panel's analyses from a plain request (in a Web Worker or inline).
 * Large one-way data with few distinct values go to the shared, tie-compressed
 * relabellings of ./tied-groups; everything else to the same engine calls as the
 * sheet functions.
 */
import { analyseAssociation } from "./association";
import { analyseGroups } from "./groups";
import { analysePaired } from "./paired";
import { analysePrecision } from "./precision";
import { analyseGroupsShared, useShared } from "./tied-groups";
import { analyseTraits } from "./traits";
import type { AnalysisRequest, AnalysisResult, ProgressFn } from "./types";

export function runAnalysis(req: AnalysisRequest, onProgress?: ProgressFn): AnalysisResult {
  switch (req.question) {
    case "groups":
      return useShared(req) ? analyseGroupsShared(req, onProgress) : analyseGroups(req, onProgress);
    case "paired":
      return analysePaired(req, onProgress);
    case "association":
      return analyseAssociation(req, onProgress);
    case "precision":
      return analysePrecision(req, onProgress);
    case "traits":
      return analyseTraits(req, onProgress);
  }
}
