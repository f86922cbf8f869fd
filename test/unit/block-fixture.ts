/**
 * Test support: the panel's path without the DOM — an in-memory workbook with the demo
 * data, read and prepared as the panel does, analysed, and a results block written and
 * evaluated with the real sheet functions.
 */
import { sheetFunctions } from "../../functions/registry";
import { runAnalysis } from "../../src/analysis/run";
import { AnalysisOptions, AnalysisResult, DEFAULT_OPTIONS } from "../../src/analysis/types";
import type { Block } from "../../taskpane/block";
import { describeColumns, detectHeader } from "../../taskpane/columns";
import { writeDemo } from "../../taskpane/demo";
import type { Area, CellValue, RegionRead } from "../../taskpane/host";
import { Choices, Prepared, prepare } from "../../taskpane/prepare";
import { PreviewHost } from "../../taskpane/preview-host";
import { PreviewWorkbook } from "../../taskpane/preview-workbook";
import { buildResultsBlock } from "../../taskpane/results-block";

export const FIXED_DATE = new Date(Date.UTC(2025, 5, 14, 9, 0, 0));

export async function demoBook(): Promise<{ book: PreviewWorkbook; host: PreviewHost; trial: string; lab: string; quality: string }> {
  const book = new PreviewWorkbook(sheetFunctions);
  const host = new PreviewHost(book);
  const { trial, lab, quality } = await writeDemo(host);
  return { book, host, trial, lab, quality };
}

export async function readAt(host: PreviewHost, sheet: string, source: "region" | "selection" = "region"): Promise<RegionRead> {
  await host.select({ sheet, top: 0, left: 0, rows: 1, cols: 1 });
  return host.readRegion(source);
}

/** Column index by header name. */
export function col(region: RegionRead, name: string): number {
  const i = region.values[0].findIndex((v) => v === name);
  if (i < 0) throw new Error(`no column ${name}`);
  return i;
}

export interface Run {
  region: RegionRead;
  prepared: Prepared;
  result: AnalysisResult;
}

export function analyse(region: RegionRead, choices: Choices, options: Partial<AnalysisOptions> = {}): Run {
  const header = detectHeader(region);
  const columns = describeColumns(region, header);
  const prepared = prepare(region, columns, choices, { ...DEFAULT_OPTIONS, ...options });
  return { region, prepared, result: runAnalysis(prepared.request) };
}

export function block(run: Run, live: boolean): Block {
  return buildResultsBlock(run.result, { ...run.prepared.context, date: FIXED_DATE, live });
}

/** Writes a block on a new sheet and evaluates its formulas; returns the sheet's area. */
export async function place(host: PreviewHost, b: Block, name: string): Promise<Area> {
  const sheet = await host.addSheet(name);
  const report = await host.writeBlock(sheet, 0, 0, b);
  return report.area;
}

/** Value at block-relative (r, c) of a written block. */
export function cellValue(book: PreviewWorkbook, area: Area, r: number, c: number): CellValue {
  return book.sheet(area.sheet).get(area.top + r, area.left + c)?.value ?? null;
}
