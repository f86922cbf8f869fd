/**
 * The results block, built by a pure function from an analysis result: title (question,
 * data range, date), the plain-language reading, tables with number formats, method
 * (resamples and seed, enough to reproduce), a caution, and chart data with charts.
 *
 * Live cells: where a sheet function computes a number, the cell holds its `=RS.…`
 * formula over the data range (so the block follows the data); the rest are values.
 * Spilled tables reserve and pre-format their cells. With `live: false` every cell is
 * a value, laid out the same way (same headers as the spills).
 */
import { SUMMARY_HEADER } from "../functions/impl-summary";
import { histogramTable } from "../functions/histogram";
import { isSheetError } from "../functions/errors";
import type {
  AnalysisResult,
  AssociationResult,
  ClassicalOutcome,
  GroupsResult,
  PairedResult,
  PrecisionResult,
  TestOutcome,
  TraitsResult,
} from "../src/analysis/types";
import type { Description } from "../src/summary";
import { Block, BlockBuilder, BlockCell, CellStyle, ChartSpec } from "./block";
import { wrapWords } from "./text-wrap";
import { areaText, rsFormula } from "./formula";
import type { Area } from "./host";
import { INT_FORMAT, P_FORMAT, countText, decimals, decimalsFor, formatNumber, pEquals } from "./number-format";
import { Names, caution, groupsPhrase, leadTest, plainName, reading, unitOf, unitless } from "./reading";

/** A data column: its header text and its cells (header excluded). */
export interface DataRef {
  name: string;
  area: Area;
}

export interface BlockContext {
  /** When the analysis ran (shown in the title line). */
  date: Date;
  /** The data as read (header included). */
  data: Area;
  rowsUsed: number;
  rowsSkipped: number;
  /** Write `=RS.…` formulas where a sheet function computes the number. */
  live: boolean;
  values?: DataRef;
  groups?: DataRef;
  blocks?: DataRef;
  /** Paired: first (reference) and second measurement; association: x and y. */
  first?: DataRef;
  second?: DataRef;
  traits?: DataRef[];
  /** Group names as shown (numbers stay numbers), by code. */
  groupNames?: (string | number)[];
  /** Raw points for the per-group dot plot or the scatter plot (omitted when too many). */
  points?: { x: number; y: number; group?: number }[];
}

/** Most points drawn one by one; larger data get the min–median–max chart. */
export const MAX_DOTS = 2000;
export const HIST_BINS = 30;

// ---- styles (our own palette) --------------------------------------------------------
const INK = "#1E4D5C";
const TITLE: CellStyle = { bold: true, size: 14, color: "#FFFFFF", fill: INK };
const SUBTITLE: CellStyle = { italic: true, color: "#4A5A60" };
const SECTION: CellStyle = { bold: true, size: 12, color: INK, borderBottom: INK };
const HEAD: CellStyle = { bold: true, fill: "#E3ECEF", borderBottom: "#9FB4BB" };
const READING: CellStyle = { fill: "#FFF6DC", size: 11 };
const READING_LEAD: CellStyle = { ...READING, bold: true };
const NOTE: CellStyle = { color: "#4A5A60" };
const CAUTION: CellStyle = { fill: "#FBE9E7", color: "#8A2A1B" };
const LETTERS: CellStyle = { bold: true, color: INK, align: "center" };

const TABLE_COLS = 8;
const TABLE_WIDTHS = [34, 12, 12, 12, 12, 12, 12, 12];
/** Chart height in pixels, and the rows reserved for a row of charts (rows of 20 px). */
const CHART_H = 280;
const CHART_ROWS = 14;
/** Pixels of a column `chars` wide (Excel: 7 px per character plus 5 px padding). */
const px = (chars: number) => chars * 7 + 5;

const v = (value: number | string | null, format?: string, style?: CellStyle, tag?: string): BlockCell => ({ value, format, style, tag });
const f = (formula: string, format?: string, style?: CellStyle, tag?: string): BlockCell => ({ formula, format, style, tag });
const text = (s: string, style?: CellStyle, span?: number, tag?: string): BlockCell => ({ value: s, style, span, tag });


const TABLE_CHARS = TABLE_WIDTHS.reduce((a, b) => a + b, 0);

class Writer {
  readonly b: BlockBuilder;
  readonly ctx: BlockContext;
  constructor(ctx: BlockContext, cols = TABLE_COLS, widths = TABLE_WIDTHS) {
    this.b = new BlockBuilder(cols, widths);
    this.ctx = ctx;
  }
  get tableCols(): number {
    return this.b.cols;
  }
  /** Width in pixels of columns [c0, c1), less a margin. */
  slot(c0: number, c1: number): number {
    let w = 0;
    for (let c = c0; c < c1; c++) w += px(this.b.widths[c]);
    return w - 10;
  }
  /** A section with room for a row of charts; returns the first row of that room. */
  pictures(title: string): number {
    this.section(title);
    const top = this.b.row;
    this.b.blank(CHART_ROWS);
    return top;
  }
  title(question: string, detail: string): void {
    const cols = this.tableCols;
    const t = `${question}${detail ? ` ${detail}` : ""}`;
    wrapWords(t, Math.floor(TABLE_CHARS * 0.78)).forEach((line, j) => this.b.add([text(line, TITLE, cols, j === 0 ? "title" : `title~${j}`)]));
    const c = this.ctx;
    const when = c.date.toLocaleDateString("en-GB", { day: "numeric", month: "long", year: "numeric" });
    const skipped = c.rowsSkipped > 0 ? `, ${countText(c.rowsSkipped)} skipped (blank cells)` : "";
    this.b.add([text(`Data: ${areaText(c.data)} · ${countText(c.rowsUsed)} rows used${skipped} · run on ${when}`, SUBTITLE, cols, "subtitle")]);
  }
  /** The opening of every block: the title, then the plain-language reading. */
  opening(question: string, readingLines: string[], detail = ""): void {
    this.title(question, detail);
    this.section("What the data say");
    this.lines(readingLines, READING, "reading", READING_LEAD);
  }
  /** A numbered section with the summary header (n, mean, median, SD, …). */
  glance(title: string): void {
    this.section(title);
    this.header(["", ...SUMMARY_HEADER.slice(1).map(String)]);
  }
  /** The close of every block: how it was worked out, then the caution. */
  closing(method: string[], r: AnalysisResult): void {
    this.section("How this was worked out");
    this.lines(method, NOTE, "method");
    this.b.blank();
    this.lines([caution(r)], CAUTION, "caution");
  }
  /**
   * The histogram of the shuffled statistic, drawn from its chart-data rows (lower, upper,
   * count, observed at column 0), from `at` to the block's right edge, bars as extreme as
   * the data highlighted.
   */
  histogram(h: { title: string; at: { row: number; col: number }; source: { row: number; rows: number }; observed: number; tail: "upper" | "both" | "lower"; table: (number | string)[][]; xTitle: string; yTitle: string }): void {
    const cols = this.tableCols;
    this.b.charts.push({
      kind: "histogram",
      title: h.title,
      at: h.at,
      width: this.slot(h.at.col, cols),
      height: CHART_H,
      source: { row: h.source.row, col: 0, rows: h.source.rows, cols: 4 },
      observed: h.observed,
      tail: h.tail,
      highlight: extremeBins(h.table, h.observed, h.tail),
      cells: { rows: CHART_ROWS - 1, cols: cols - h.at.col },
      xTitle: h.xTitle,
      yTitle: h.yTitle,
    });
  }
  section(s: string): number {
    this.b.blank();
    return this.b.add([text(s, SECTION, this.tableCols)]);
  }
  /**
   * Paragraphs, each split at spaces into rows that fit the block's width (no wrapped
   * cells or row heights, so the rows beside a user's data keep their height).
   * The first row of paragraph i is tagged `tag` (i = 0) or `tag.i`; continuation rows `…~j`.
   */
  lines(items: string[], style: CellStyle, tag: string, first?: CellStyle): void {
    items.forEach((s, i) => {
      const st = i === 0 && first ? first : style;
      // characters per line: bold and 11-point text are wider than the grey notes
      const per = Math.floor(this.chars() * (st.bold ? 0.82 : st.size ? 0.93 : 1.05));
      const base = i === 0 ? tag : `${tag}.${i}`;
      wrapWords(s, per).forEach((line, j) => this.b.add([text(line, st, this.tableCols, j === 0 ? base : `${base}~${j}`)]));
    });
  }
  /** A note in grey below a table. */
  note(s: string): void {
    this.lines([s], NOTE, `note${this.b.row}`);
  }
  chars(): number {
    return this.b.widths.reduce((a, c) => a + c, 0);
  }
  /** A header row; the last label spans the rest of the table. */
  header(labels: string[]): number {
    const cells: BlockCell[] = labels.map((l) => v(l, undefined, HEAD));
    const last = cells.length - 1;
    const rest = this.tableCols - last;
    if (rest > 1) cells[last] = { ...cells[last], span: rest };
    return this.b.add(cells);
  }
  /**
   * A spilled table (header row + rows × cols) at column 0: the formula in the anchor
   * when live, else the given values. Formats by column; header styled.
   */
  spill(formula: string | null, table: (number | string)[][], formats: (string | undefined)[], tag: string, styles: (CellStyle | undefined)[] = []): { top: number; rows: number } {
    const rows = table.length;
    const cols = table[0].length;
    const top = this.b.row;
    for (let i = 0; i < rows; i++) {
      const cells: (BlockCell | null)[] = [];
      for (let j = 0; j < cols; j++) {
        const format = i === 0 ? undefined : formats[j];
        const style = i === 0 ? HEAD : styles[j];
        const cellTag = i === 0 && j === 0 ? tag : undefined;
        if (formula !== null) {
          if (i === 0 && j === 0) cells.push({ formula, spill: { rows, cols }, format, style, tag: cellTag });
          else cells.push({ format, style });
        } else cells.push({ value: table[i][j], format, style, tag: cellTag });
      }
      this.b.add(cells);
    }
    return { top, rows };
  }
  ensureRows(n: number): void {
    while (this.b.row < n) this.b.blank();
  }
}

// ---- number formatting -------------------------------------------------------------------

function capital(s: string): string {
  return s.charAt(0).toUpperCase() + s.slice(1);
}

function dataFormat(scale: number): string {
  return decimals(decimalsFor(scale));
}

function statFormat(x: number): string {
  return decimals(Math.max(2, decimalsFor(x)));
}

function tailOf(direction: string): "upper" | "both" | "lower" {
  return direction === "two-sided" ? "both" : direction === "greater" ? "upper" : "lower";
}

function how(t: TestOutcome, unit: string): string {
  return t.exact ? `exact: all ${countText(t.resamples)} ${unit}` : `${countText(t.resamples)} random ${unit} (Monte Carlo)`;
}

/** The interval method in plain words for the method notes. */
function intervalWords(method: string): string {
  return method === "bca" ? "BCa: corrected for bias and skew" : method === "percentile" ? "percentile: the middle of the resampled values" : "basic: the resampled values reflected about the estimate";
}

function levelText(level: number): string {
  return String(Math.round(level * 1e6) / 1e4);
}

/** A row of the "does it differ" table: test name, statistic, p, Monte Carlo range, how. */
function testRow(
  w: Writer,
  label: string,
  stat: number | null,
  statCell: BlockCell | null,
  pCell: BlockCell,
  t: TestOutcome | null,
  howText: string,
  tag: string,
): void {
  const statFinal = statCell ?? (stat === null || !Number.isFinite(stat) ? v(stat === null ? "" : "∞") : v(stat, statFormat(stat)));
  const lo = t && t.mcInterval ? v(t.mcInterval[0], P_FORMAT, undefined, `${tag}.lo`) : v("");
  const hi = t && t.mcInterval ? v(t.mcInterval[1], P_FORMAT, undefined, `${tag}.hi`) : v("");
  w.b.add([text(label), { ...statFinal, tag: `${tag}.stat` }, { ...pCell, tag: `${tag}.p` }, lo, hi, text(howText, { color: "#4A5A60" }, 3)]);
}

function classicalHow(c: ClassicalOutcome, dist: string, _assumes?: string): string {
  const df = c.df2 === null ? `${formatDf(c.df1)} df` : `${formatDf(c.df1)}, ${formatDf(c.df2)} df`;
  return `from the ${dist} distribution (${df})`;
}

function formatDf(d: number): string {
  if (d >= 100) return countText(Math.round(d));
  return Number.isInteger(d) ? String(d) : formatNumber(d, "0.0");
}

function describeRow(label: string, d: Description, fmt: string, tag: string): BlockCell[] {
  return [
    text(label, undefined, undefined, tag),
    v(d.n, INT_FORMAT),
    v(d.mean, fmt),
    v(d.median, fmt),
    v(d.sd ?? "", fmt),
    v(d.cv ?? "", "0.0"),
    v(d.min, fmt),
    v(d.max, fmt),
  ];
}

/** Rows of a histogram table (header excluded) as or more extreme than the observed value. */
export function extremeBins(table: (number | string)[][], observed: number, tail: "upper" | "both" | "lower"): number[] {
  const rows = table.slice(1);
  const obs = rows.findIndex((r) => r[3] !== "");
  const out: number[] = [];
  rows.forEach((r, i) => {
    const lo = Number(r[0]), hi = Number(r[1]);
    const width = hi - lo;
    const hit = tail === "upper" ? obs >= 0 && i >= obs : tail === "lower" ? obs >= 0 && i <= obs : Math.abs((lo + hi) / 2) >= Math.abs(observed) - width / 2;
    if (hit) out.push(i);
  });
  return out;
}

function histogramRows(nullDistribution: Float64Array, observed: number): (number | string)[][] | null {
  if (nullDistribution.length === 0) return null;
  const h = histogramTable(nullDistribution, observed, HIST_BINS);
  return isSheetError(h) ? null : (h as (number | string)[][]);
}

/**
 * How the main test's p was found (exact enumeration or Monte Carlo), and how to
 * reproduce the block.
 */
function methodLines(r: AnalysisResult, ctx: BlockContext, shuffled: string, main?: TestOutcome): string[] {
  const o = r.options;
  const lines = [
    main && main.exact
      ? `${shuffled} in every one of the ${countText(main.resamples)} possible ways (no more than the ${countText(o.resamples)} shuffles asked for), so p is exact: the share of them at least as extreme as the data.`
      : `${shuffled} ${countText(o.resamples)} times at random (seed ${o.seed}); p = (b + 1)/(m + 1), where b of the m shuffles gave a result at least as extreme as the data. When the distinct shuffles number no more than ${countText(o.resamples)}, every one is counted instead and p is exact.`,
  ];
  lines.push(
    ctx.live
      ? `To reproduce: the same data, resamples and seed give the same numbers. Cells with =RS.… formulas update when the data change; the reading (and any chart) is as of the run.`
      : `To reproduce: the same data, resamples and seed give the same numbers. These are values, not live formulas: run the panel again after changing the data.`,
  );
  return lines;
}

// ---- groups ---------------------------------------------------------------------------

function groupsBlock(r: GroupsResult, ctx: BlockContext): Block {
  const w = new Writer(ctx);
  const b = w.b;
  const names: Names = { value: ctx.values?.name, group: ctx.groups?.name, block: ctx.blocks?.name };
  const vName = ctx.values?.name ?? "values";
  const gName = ctx.groups?.name ?? "groups";
  const blockName = ctx.blocks?.name ?? "blocks";
  // The shared large-data path draws its own relabellings: its numbers are values only.
  const live = ctx.live && !!ctx.values && !!ctx.groups && !r.shared;
  const V = ctx.values?.area;
  const G = ctx.groups?.area;
  const B = ctx.blocks?.area;
  const o = r.options;
  const shown = ctx.groupNames ?? r.names;
  const scale = Math.max(...r.summary.map((s) => Math.abs(s.mean)));
  const fmt = dataFormat(scale);
  const unit = unitOf(vName);

  w.opening(`Do ${groupsPhrase(gName)} differ in ${plainName(vName)}?`, reading(r, names), r.blocks ? `(${plainName(blockName)}s as blocks)` : "");

  // 1. summary
  w.section(`1. ${capital(groupsPhrase(gName))} at a glance${unit ? ` (${plainName(vName)} in ${unit})` : ""}`);
  const summaryTable: (number | string)[][] = [SUMMARY_HEADER.slice() as string[]];
  r.summary.forEach((s, g) => summaryTable.push([shown[g], s.n, s.mean, s.median, s.sd ?? "", s.cv ?? "", s.min, s.max]));
  w.spill(live ? rsFormula("GROUPSUMMARY", [V!, G!]) : null, summaryTable, [undefined, INT_FORMAT, fmt, fmt, fmt, "0.0", fmt, fmt], "summary");

  // 2. does any group differ
  const testsRow = w.section("2. Does any group differ?");
  w.header(["Test", "Statistic", "p-value", "p from", "p to", "How p was found"]);
  const R = o.resamples;
  const S = o.seed;
  if (r.blocks) {
    testRow(w, `Permutation F after ${plainName(blockName)}s`, r.f.statistic, null,
      live && B ? f(rsFormula("BLOCKTEST", [V!, G!, B, "F", R, S]), P_FORMAT) : v(r.f.p, P_FORMAT), r.f, how(r.f, `shuffles within ${plainName(blockName)}s`), "test.F");
    if (r.rank)
      testRow(w, `Rank test within ${plainName(blockName)}s (Friedman)`, r.rankClassical?.statistic ?? r.rank.statistic, null,
        live && B ? f(rsFormula("BLOCKTEST", [V!, G!, B, "RANK", R, S]), P_FORMAT) : v(r.rank.p, P_FORMAT), r.rank, how(r.rank, `shuffles within ${plainName(blockName)}s`), "test.RANK");
    else b.add([text(`Rank test within ${plainName(blockName)}s`), v(""), v(""), v(""), v(""), text(`not available: ${r.rankNote ?? "incomplete blocks"}`, NOTE, 3)]);
    testRow(w, `Classical F after ${plainName(blockName)}s (normal data)`, r.classicalF.statistic, null, v(r.classicalF.p, P_FORMAT), null,
      classicalHow(r.classicalF, "F", "assumes normal data"), "test.classical");
  } else {
    testRow(w, "Permutation F (shuffled labels)", r.f.statistic,
      live ? f(rsFormula("STAT", [V!, G!, "F"]), statFormat(r.f.statistic)) : null,
      live ? f(rsFormula("GROUPTEST", [V!, G!, "F", R, S]), P_FORMAT) : v(r.f.p, P_FORMAT), r.f, how(r.f, "shuffles"), "test.F");
    if (r.snr)
      testRow(w, "Distance ratio (robust to outliers)", r.snr.statistic,
        live ? f(rsFormula("SNR", [V!, G!]), statFormat(r.snr.statistic)) : null,
        live ? f(rsFormula("GROUPTEST", [V!, G!, "SNR", R, S]), P_FORMAT) : v(r.snr.p, P_FORMAT), r.snr, how(r.snr, "shuffles"), "test.SNR");
    if (r.rank)
      testRow(w, "Rank test (Kruskal–Wallis H)", r.rank.statistic,
        live ? f(rsFormula("STAT", [V!, G!, "RANK"]), statFormat(r.rank.statistic)) : null,
        live ? f(rsFormula("GROUPTEST", [V!, G!, "RANK", R, S]), P_FORMAT) : v(r.rank.p, P_FORMAT), r.rank, how(r.rank, "shuffles"), "test.RANK");
    testRow(w, "Classical F (assumes normal data)", r.classicalF.statistic, null, v(r.classicalF.p, P_FORMAT), null,
      classicalHow(r.classicalF, "F", "assumes normal data"), "test.classical");
    if (r.welch)
      testRow(w, "Welch F (allows unequal spread)", r.welch.statistic, null, v(r.welch.p, P_FORMAT), null,
        classicalHow(r.welch, "F", "assumes normal data"), "test.welch");
  }
  if (r.rankClassical && r.rank)
    w.note(`Rank test by the classical formula instead of shuffles (χ² approximation): ${pEquals(r.rankClassical.p)} (${formatDf(r.rankClassical.df1)} df).`);
  w.note("A p found from random shuffles (Monte Carlo) is itself a little uncertain: “p from … to” is its 95 % range; more shuffles narrow it.");
  const picRow = w.pictures("The picture: every plot, and what chance alone would give");

  // 3. which groups differ
  w.section("3. Which groups differ?");
  const order = r.summary.map((_, i) => i).sort((i, j) => r.summary[j].mean - r.summary[i].mean || i - j);
  const lettersTable: (number | string)[][] = [["group", "n", "mean", "letters"]];
  for (const g of order) lettersTable.push([shown[g], r.summary[g].n, r.summary[g].mean, r.letters[g]]);
  // The pairwise sheet functions have no blocks: with blocks these tables are values.
  const livePairs = live && !r.blocks;
  w.spill(livePairs ? rsFormula("LETTERS", [V!, G!, o.alpha, o.adjust, R, S]) : null, lettersTable, [undefined, INT_FORMAT, fmt, "@"], "letters", [undefined, undefined, undefined, LETTERS]);
  w.note(`Groups that share a letter are not shown to differ (adjusted p above ${o.alpha}); groups with no letter in common differ.`);
  b.blank();
  const pct = levelText(o.level);
  const pwTable: (number | string)[][] = [["group 1", "group 2", "difference", `lower ${pct} %`, `upper ${pct} %`, "p", "adjusted p"]];
  const codeOf = new Map(r.names.map((n, i) => [n, i]));
  for (const p of r.pairwise) pwTable.push([shown[codeOf.get(p.a)!], shown[codeOf.get(p.b)!], p.difference, p.lower, p.upper, p.p, p.pAdjusted]);
  w.spill(livePairs ? rsFormula("PAIRWISE", [V!, G!, o.adjust, o.level, R, S]) : null, pwTable, [undefined, undefined, fmt, fmt, fmt, P_FORMAT, P_FORMAT], "pairwise");
  const adjustWords: Record<string, string> = { holm: "Holm's method", maxt: "the max-T step-down method", bh: "the Benjamini–Hochberg method", none: "no adjustment" };
  // Within blocks there is no max-T version: the engine answers "maxt" with Holm's method.
  const adjustUsed = r.blocks && o.adjust === "maxt" ? "holm" : o.adjust;
  const maxtNote = adjustUsed !== o.adjust ? ` (max-T has no within-${plainName(blockName)} form here, so Holm's method, which also guards against any false difference, was used)` : "";
  w.note(`difference = mean of group 1 − mean of group 2, with a ${pct} % bootstrap interval; p adjusted for ${r.pairwise.length} comparisons by ${adjustWords[adjustUsed]}${maxtNote}.`);

  // 4. effect sizes
  w.section("4. How big are the differences?");
  w.header(["Pair", "Shift", "from", "to", "Cliff's δ", "In words"]);
  for (const e of r.effects.pairs) {
    const a = shown[codeOf.get(e.a)!];
    const c = shown[codeOf.get(e.b)!];
    const beats = Math.round(((1 + e.cliffsDelta) / 2) * 100);
    b.add([
      text(`${a} vs ${c}`),
      v(e.shift.estimate, fmt),
      v(e.shift.lower, fmt),
      v(e.shift.upper, fmt),
      v(e.cliffsDelta, "0.00"),
      text(`${a} higher in ${beats} % of head-to-head pairs`, { color: "#4A5A60" }, 3),
    ]);
  }
  b.add([text("Variation explained by groups (η²)"), v(r.effects.etaSquared, "0.0%", undefined, "eta2"), text("less biased estimate (ω²)", { color: "#4A5A60" }, 2), null, v(r.effects.omegaSquared, "0.0%", undefined, "omega2")]);
  w.note(`Shift = Hodges–Lehmann median of all head-to-head differences (one row of each group), with its ${pct} % interval; Cliff's delta runs from −1 to 1 (0 = neither tends to be higher).`);

  // method and caution
  const shuffled = r.blocks ? `The ${plainName(gName)} labels were shuffled within each ${plainName(blockName)}` : `The ${plainName(gName)} labels were shuffled among the rows`;
  const m = methodLines(r, { ...ctx, live }, shuffled, leadTest(r).t);
  if (r.shared) {
    m.splice(1, 0, `For these large data every test and every pair comes from the same ${countText(o.resamples)} shuffles, drawn value by value (rows with equal values are interchangeable), in two parts with seeds ${o.seed}/0/2 and ${o.seed}/1/2. Pairwise p compare each pair within those shuffles of all groups; intervals are bootstrap (${intervalWords(o.method)}) with ${countText(o.resamples)} resamples within each group.`);
  } else {
    m.splice(1, 0, r.blocks
      ? `Pairwise comparisons are made within ${plainName(blockName)}s: for each pair, the two groups' labels are shuffled within each ${plainName(blockName)} only. Intervals are bootstrap (${intervalWords(o.method)}) with ${countText(o.resamples)} resamples within each group (not within ${plainName(blockName)}s). The pairwise tables are values, not live formulas.`
      : `Pairwise comparisons shuffle the two groups' rows only; intervals are bootstrap (${intervalWords(o.method)}) with ${countText(o.resamples)} resamples.`);
  }
  w.closing(m, r);

  // chart data
  const lead = leadTest(r);
  const statWord = r.blocks ? "F" : r.primary === "SNR" && r.snr ? "SNR" : r.primary === "RANK" && r.rank ? "RANK" : "F";
  const hist = histogramRows(r.nullDistribution, lead.t.statistic);
  w.section("Chart data (the charts above are drawn from these cells)");
  const dataTop = b.row;
  let histSource: { row: number; rows: number } | null = null;
  if (hist) {
    const liveHist = live && !r.blocks;
    const hfmt = statFormat(lead.t.statistic);
    const res = w.spill(liveHist ? rsFormula("NULLHIST", [V!, G!, statWord, HIST_BINS, R, S]) : null, hist, [hfmt, hfmt, INT_FORMAT, hfmt], "hist");
    histSource = { row: res.top + 1, rows: res.rows - 1 };
  }
  // dot plot data beside the histogram data (columns 5–7), or the min–median–max chart.
  let dots: ChartSpec | null = null;
  if (ctx.points && ctx.points.length <= MAX_DOTS) {
    b.set(dataTop, 5, v("group", undefined, HEAD));
    b.set(dataTop, 6, v("x position", undefined, HEAD));
    b.set(dataTop, 7, v(vName, undefined, HEAD));
    ctx.points.forEach((p, i) => {
      const row = dataTop + 1 + i;
      w.ensureRows(row + 1);
      const jitter = (((i * 7) % 9) - 4) * 0.035;
      b.set(row, 5, v(shown[p.group ?? 0]));
      b.set(row, 6, v(Math.round(((p.group ?? 0) + 1 + jitter) * 1000) / 1000, "0.00"));
      b.set(row, 7, v(p.y, fmt));
    });
    dots = {
      kind: "dots",
      title: `${vName} of every row, by ${plainName(gName)}`,
      at: { row: picRow, col: 0 },
      width: w.slot(0, 3),
      height: CHART_H,
      source: { row: dataTop + 1, col: 6, rows: ctx.points.length, cols: 2 },
      categories: shown.map(String),
      xTitle: gName,
      yTitle: vName,
      cells: { rows: CHART_ROWS - 1, cols: 3 },
    };
  } else {
    // min, median, max per group from the summary (the fallback for large data)
    ["group", "min", "median", "max"].forEach((h, j) => b.set(dataTop, 4 + j, v(h, undefined, HEAD)));
    r.summary.forEach((s, g) => {
      const row = dataTop + 1 + g;
      w.ensureRows(row + 1);
      b.set(row, 4, v(shown[g]));
      b.set(row, 5, v(s.min, fmt));
      b.set(row, 6, v(s.median, fmt));
      b.set(row, 7, v(s.max, fmt));
    });
    dots = {
      kind: "range",
      title: `${vName}: lowest, median and highest, by ${gName}`,
      at: { row: picRow, col: 0 },
      width: w.slot(0, 3),
      height: CHART_H,
      source: { row: dataTop + 1, col: 4, rows: r.summary.length, cols: 4 },
      categories: shown.map(String),
      xTitle: gName,
      yTitle: vName,
      cells: { rows: CHART_ROWS - 1, cols: 3 },
    };
  }
  if (histSource) {
    w.histogram({
      title: `If ${groupsPhrase(gName)} were alike: ${lead.name} in ${countText(r.nullDistribution.length)} shuffles`,
      at: { row: picRow, col: 3 },
      source: { row: histSource.row, rows: histSource.rows },
      observed: lead.t.statistic,
      tail: "upper",
      table: hist!,
      xTitle: `${lead.name} (if the groups were alike)`,
      yTitle: "number of shuffles",
    });
  }
  if (dots) b.charts.push(dots);
  return b.build();
}

// ---- paired ---------------------------------------------------------------------------

function pairedBlock(r: PairedResult, ctx: BlockContext): Block {
  const w = new Writer(ctx);
  const b = w.b;
  const first = ctx.first?.name ?? "first";
  const second = ctx.second?.name ?? "second";
  const names: Names = { x: second, y: first };
  const o = r.options;
  const scale = Math.max(Math.abs(r.x.mean), Math.abs(r.y.mean));
  const fmt = dataFormat(scale);
  const live = ctx.live && !!ctx.first && !!ctx.second;
  w.opening(`Do the two measurements differ? ${unitless(second)} compared with ${unitless(first)}`, reading(r, names));

  w.glance("1. The two measurements at a glance");
  b.add(describeRow(first, r.y, fmt, "sum.first"));
  b.add(describeRow(second, r.x, fmt, "sum.second"));
  b.add(describeRow(`Change (${unitless(second)} − ${unitless(first)})`, { ...r.d, cv: null }, fmt, "sum.change"));
  w.note(`${r.counts.down} pairs went down, ${r.counts.up} went up, ${r.counts.same} did not change.`);

  w.section("2. Is there a change?");
  w.header(["Test", "Statistic", "p-value", "p from", "p to", "How p was found"]);
  const dirWord = o.direction;
  testRow(w, "Sign-flip test (mean change)", r.signFlip.statistic, null,
    live ? f(rsFormula("PAIRTEST", [ctx.second!.area, ctx.first!.area, dirWord, o.resamples, o.seed]), P_FORMAT) : v(r.signFlip.p, P_FORMAT),
    r.signFlip, how(r.signFlip, "sign patterns"), "test.flip");
  if (r.signedRank) {
    const sr = r.signedRank;
    const t: TestOutcome = sr.outcome ?? { statistic: sr.v, p: sr.p, exact: sr.how === "exact", resamples: 0, count: 0, mcInterval: null };
    testRow(w, "Signed-rank test (Wilcoxon)", sr.v, null, v(sr.p, P_FORMAT), sr.outcome, sr.how === "exact" ? "exact distribution of the ranks" : sr.how === "permutation" ? how(t, "sign patterns") : "normal approximation", "test.rank");
  }
  if (Number.isFinite(r.pairedT.p))
    testRow(w, "Classical paired t (normal data)", r.pairedT.statistic, null, v(r.pairedT.p, P_FORMAT), null, classicalHow(r.pairedT, "t", "assumes normal differences"), "test.t");
  b.add([text(`Direction tested: ${dirWord === "two-sided" ? "either way" : dirWord === "greater" ? `${second} higher` : `${second} lower`}.`, NOTE, TABLE_COLS)]);
  const picRow = r.nullDistribution.length > 0 ? w.pictures("The picture: what chance alone would give") : -1;

  w.section("3. How big is the change?");
  const pct = levelText(o.level);
  w.header(["", "Estimate", `lower ${pct} %`, `upper ${pct} %`, "Method"]);
  b.add([text("Mean change"), v(r.interval.estimate, fmt, undefined, "ci.mean"), v(r.interval.lower, fmt, undefined, "ci.mean.lo"), v(r.interval.upper, fmt, undefined, "ci.mean.hi"), text(`${r.interval.method} bootstrap, ${countText(r.interval.resamples)} resamples`, { color: "#4A5A60" }, 4)]);
  b.add([text("Median change"), v(r.medianInterval.estimate, fmt), v(r.medianInterval.lower, fmt), v(r.medianInterval.upper, fmt), text(`${r.medianInterval.method} bootstrap`, { color: "#4A5A60" }, 4)]);
  if (Number.isFinite(r.percentChange)) b.add([text(`Mean change as % of ${first}`), v(r.percentChange / 100, "0.0%", undefined, "pct")]);

  const pm = methodLines(r, ctx, "The sign of each pair's change was flipped", r.signFlip);
  pm.splice(1, 0, `Intervals are bootstrap (${intervalWords(o.method)}), from ${countText(r.interval.resamples)} resamples of the pairs.`);
  w.closing(pm, r);

  const hist = histogramRows(r.nullDistribution, r.signFlip.statistic);
  if (hist) {
    w.section("Chart data (the chart above is drawn from these cells)");
    const hf = fmt;
    const res = w.spill(null, hist, [hf, hf, INT_FORMAT, hf], "hist");
    w.histogram({
      title: `If there were no change: mean change in ${countText(r.nullDistribution.length)} sign patterns`,
      at: { row: picRow, col: 0 },
      source: { row: res.top + 1, rows: res.rows - 1 },
      observed: r.signFlip.statistic,
      tail: tailOf(o.direction),
      table: hist,
      xTitle: "mean change (if there were no effect)",
      yTitle: "number of sign patterns",
    });
  }
  return b.build();
}

// ---- association ----------------------------------------------------------------------

function associationBlock(r: AssociationResult, ctx: BlockContext): Block {
  const w = new Writer(ctx);
  const b = w.b;
  const xName = ctx.first?.name ?? "x";
  const yName = ctx.second?.name ?? "y";
  const o = r.options;
  const live = ctx.live && !!ctx.first && !!ctx.second;
  w.opening(`Are ${unitless(xName)} and ${unitless(yName)} associated?`, reading(r, { x: xName, y: yName }));

  w.glance("1. The two columns at a glance");
  b.add(describeRow(xName, r.x, dataFormat(Math.abs(r.x.mean)), "sum.x"));
  b.add(describeRow(yName, r.y, dataFormat(Math.abs(r.y.mean)), "sum.y"));

  w.section("2. Is there an association?");
  w.header(["Test", "Coefficient", "p-value", "p from", "p to", "How p was found"]);
  const X = ctx.first?.area;
  const Y = ctx.second?.area;
  testRow(w, "Pearson r (permutation)", r.pearson.statistic, v(r.pearson.statistic, "0.000"),
    live ? f(rsFormula("CORRTEST", [X!, Y!, "pearson", o.direction, o.resamples, o.seed]), P_FORMAT) : v(r.pearson.p, P_FORMAT), r.pearson, how(r.pearson, "rearrangements"), "test.pearson");
  testRow(w, "Rank correlation (Spearman)", r.spearman.statistic, v(r.spearman.statistic, "0.000"),
    live ? f(rsFormula("CORRTEST", [X!, Y!, "spearman", o.direction, o.resamples, o.seed]), P_FORMAT) : v(r.spearman.p, P_FORMAT), r.spearman, how(r.spearman, "rearrangements"), "test.spearman");
  testRow(w, "Classical test of r (normal data)", r.classical.statistic, null, v(r.classical.p, P_FORMAT), null, classicalHow(r.classical, "t", "assumes normal data"), "test.classical");
  const picRow = w.pictures("The picture: the data, and what chance alone would give");

  w.section("3. The straight line");
  w.header(["", "Estimate"]);
  b.add([text("Slope (change in y per unit of x)"), v(r.slope, decimals(decimalsFor(r.slope) + 1), undefined, "slope")]);
  b.add([text("Intercept"), v(r.intercept, dataFormat(Math.abs(r.y.mean)), undefined, "intercept")]);
  b.add([text("Variation explained by the line (r²)"), v(r.pearson.statistic * r.pearson.statistic, "0.0%")]);

  w.closing(methodLines(r, ctx, `The ${unitless(yName)} values were rearranged against ${unitless(xName)}`, r.pearson), r);

  w.section("Chart data (the charts above are drawn from these cells)");
  const dataTop = b.row;
  const hist = histogramRows(r.nullDistribution, r.pearson.statistic);
  if (hist) {
    const res = w.spill(null, hist, ["0.000", "0.000", INT_FORMAT, "0.000"], "hist");
    w.histogram({
      title: `If unrelated: r in ${countText(r.nullDistribution.length)} rearrangements`,
      at: { row: picRow, col: 3 },
      source: { row: res.top + 1, rows: res.rows - 1 },
      observed: r.pearson.statistic,
      tail: tailOf(o.direction),
      table: hist,
      xTitle: "r (if the columns were unrelated)",
      yTitle: "number of rearrangements",
    });
  }
  if (ctx.points && ctx.points.length <= MAX_DOTS) {
    b.set(dataTop, 5, v(xName, undefined, HEAD));
    b.set(dataTop, 6, v(yName, undefined, HEAD));
    ctx.points.forEach((p, i) => {
      w.ensureRows(dataTop + 2 + i);
      b.set(dataTop + 1 + i, 5, v(p.x));
      b.set(dataTop + 1 + i, 6, v(p.y));
    });
    b.charts.push({
      kind: "scatter",
      title: `${yName} against ${xName}`,
      at: { row: picRow, col: 0 },
      width: w.slot(0, 3),
      height: CHART_H,
      source: { row: dataTop + 1, col: 5, rows: ctx.points.length, cols: 2 },
      xTitle: xName,
      yTitle: yName,
      cells: { rows: CHART_ROWS - 1, cols: 3 },
    });
  }
  return b.build();
}

// ---- precision ------------------------------------------------------------------------

const STAT_LABEL: Record<string, string> = { mean: "Mean", median: "Median", sd: "Standard deviation (SD)", cv: "CV % (SD as % of mean)", trimmed: "10 % trimmed mean" };

function precisionBlock(r: PrecisionResult, ctx: BlockContext): Block {
  const w = new Writer(ctx);
  const b = w.b;
  const name = ctx.values?.name ?? "values";
  const o = r.options;
  const fmt = dataFormat(Math.abs(r.description.mean));
  const live = ctx.live && !!ctx.values;
  w.opening(`How precise are the summaries of ${plainName(name)}?`, reading(r, { value: name }));

  w.glance("1. The data at a glance");
  b.add(describeRow(name, r.description, fmt, "sum"));

  const pct = levelText(o.level);
  w.section(`2. ${pct} % intervals`);
  w.header(["Summary", "Estimate", `lower ${pct} %`, `upper ${pct} %`, "How"]);
  const methodWord = o.method === "bca" ? "BCa" : o.method;
  for (const iv of r.intervals) {
    const cf = iv.statistic === "cv" ? "0.0" : fmt;
    const label = STAT_LABEL[iv.statistic];
    const tag = `ci.${iv.statistic}`;
    if (!iv.result) {
      b.add([text(label), v(""), v(""), v(""), text(`not available: ${iv.note ?? ""}`, NOTE, 4)]);
      continue;
    }
    const res = iv.result;
    const howText = `${res.method} bootstrap, ${countText(res.resamples)} resamples${res.note ? ` (${res.note})` : ""}`;
    if (live) {
      b.add([
        text(label, iv.statistic === r.statistic ? { bold: true } : undefined),
        { formula: rsFormula("INTERVAL", [ctx.values!.area, iv.statistic, o.level, methodWord, o.resamples, o.seed]), spill: { rows: 1, cols: 3 }, format: cf, tag },
        { format: cf },
        { format: cf },
        text(howText, { color: "#4A5A60" }, 4),
      ]);
    } else {
      b.add([text(label, iv.statistic === r.statistic ? { bold: true } : undefined), v(res.estimate, cf, undefined, tag), v(res.lower, cf), v(res.upper, cf), text(howText, { color: "#4A5A60" }, 4)]);
    }
  }
  if (r.tInterval)
    b.add([text("Mean, classical t interval"), v(r.description.mean, fmt), v(r.tInterval.lower, fmt, undefined, "t.lo"), v(r.tInterval.upper, fmt, undefined, "t.hi"), text(`t distribution, ${r.tInterval.df} df (assumes normal data)`, { color: "#4A5A60" }, 4)]);

  w.closing([
    `The ${countText(r.n)} values were resampled with replacement ${countText(o.resamples)} times (seed ${o.seed}); each interval is the bootstrap interval (${intervalWords(o.method)}) of that summary: the range of values the summary takes in most resamples.`,
    ctx.live
      ? "To reproduce: the same data, resamples and seed give the same numbers. Cells with =RS.… formulas update when the data change; the reading is as of the run."
      : "To reproduce: the same data, resamples and seed give the same numbers. These are values: run the panel again after changing the data.",
  ], r);
  return b.build();
}

// ---- traits ---------------------------------------------------------------------------

/** Traits form one rectangle when their columns are adjacent, in order, on one sheet. */
export function traitsArea(traits: DataRef[]): Area | null {
  if (traits.length === 0) return null;
  const a = traits[0].area;
  for (let i = 1; i < traits.length; i++) {
    const t = traits[i].area;
    if (t.sheet !== a.sheet || t.top !== a.top || t.rows !== a.rows || t.left !== a.left + i) return null;
  }
  return { sheet: a.sheet, top: a.top, left: a.left, rows: a.rows, cols: traits.length };
}

function traitsBlock(r: TraitsResult, ctx: BlockContext): Block {
  const k = r.names.length;
  const cols = Math.max(TABLE_COLS, 3 + k);
  const w = new Writer(ctx, cols, [...TABLE_WIDTHS, ...new Array(Math.max(0, cols - TABLE_COLS)).fill(10)]);
  const b = w.b;
  const gName = ctx.groups?.name ?? "groups";
  const traitNames = (ctx.traits ?? []).map((t) => t.name);
  const o = r.options;
  const shown = ctx.groupNames ?? r.names;
  const area = ctx.traits ? traitsArea(ctx.traits) : null;
  const live = ctx.live && !!ctx.groups;
  w.opening(`Do ${groupsPhrase(gName)} differ on several traits at once?`, reading(r, { group: gName, traits: traitNames }));

  w.section("1. All traits together");
  w.header(["Test", "Statistic", "p-value", "p from", "p to", "How p was found"]);
  testRow(w, `PERMANOVA (traits ${r.scale === "standardize" ? "standardized" : "as measured"})`, r.permanova.statistic, null,
    live && area ? f(rsFormula("TRAITTEST", [area, ctx.groups!.area, r.scale, o.resamples, o.seed]), P_FORMAT) : v(r.permanova.p, P_FORMAT), r.permanova, how(r.permanova, "shuffles"), "test.permanova");
  testRow(w, "Spread test (dispersion)", r.dispersion.statistic, null, v(r.dispersion.p, P_FORMAT), r.dispersion, how(r.dispersion, "shuffles"), "test.dispersion");
  b.add([text(`Variation explained by groups (R²)`), v(r.permanova.r2, "0.0%", undefined, "r2")]);
  w.note(`PERMANOVA compares the ${plainName(gName)}s on all traits at once, by the distances between rows${r.scale === "standardize" ? " (each trait first put on the same scale)" : ""}; the spread test asks whether the ${plainName(gName)}s differ in how scattered their rows are.`);

  w.section(`2. Each trait on its own (with the mean of each ${plainName(gName)})`);
  w.header(["Trait", "p (perm. F)", "Holm adj. p", ...shown.map((g) => String(g))]);
  r.traits.forEach((t, i) => {
    const scale = Math.max(...t.means.map(Math.abs));
    const fm = dataFormat(scale);
    const trait = ctx.traits?.[i];
    const pCell = live && trait ? f(rsFormula("GROUPTEST", [trait.area, ctx.groups!.area, "F", o.resamples, o.seed]), P_FORMAT) : v(t.test.p, P_FORMAT);
    b.add([text(traitNames[i] ?? `trait ${i + 1}`), { ...pCell, tag: `trait.${i}.p` }, v(t.pAdjusted, P_FORMAT, undefined, `trait.${i}.adj`), ...t.means.map((m) => v(m, fm))]);
  });
  w.note(`p (perm. F): each trait tested alone by shuffling; Holm adj. p: the same p raised to allow for testing ${r.traits.length} traits (Holm 1979).`);

  w.closing(methodLines(r, ctx, `The ${plainName(gName)} labels were shuffled among the rows`, r.permanova), r);
  return b.build();
}

/** The results block for an analysis result (see the file comment). */
export function buildResultsBlock(result: AnalysisResult, ctx: BlockContext): Block {
  switch (result.question) {
    case "groups":
      return groupsBlock(result, ctx);
    case "paired":
      return pairedBlock(result, ctx);
    case "association":
      return associationBlock(result, ctx);
    case "precision":
      return precisionBlock(result, ctx);
    case "traits":
      return traitsBlock(result, ctx);
  }
}
