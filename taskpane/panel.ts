/**
 * The side panel: Data → Question → Options → Run → Results, in plain words. It talks
 * to the workbook only through a {@link WorkbookHost} and runs analyses through an
 * {@link AnalysisRunner} (a Web Worker), so the same panel drives Excel and the preview.
 *
 * Safety: a block is only ever written into empty cells. "A new sheet" and "beside the
 * data" find free space themselves; a chosen cell whose area is not empty makes the
 * panel ask what to do, writing nothing until the user answers.
 */
import { cellName, parseAddress } from "../functions/address";
import { CancelledError } from "../src/permutation";
import type { AnalysisOptions, AnalysisResult, GroupStatisticWord, Question } from "../src/analysis/types";
import { DEFAULT_OPTIONS } from "../src/analysis/types";
import type { Adjust } from "../src/pairwise";
import type { IntervalMethod, IntervalStatistic } from "../src/bootstrap";
import type { Block } from "./block";
import { ColumnInfo, columnSummary, describeColumns, detectHeader } from "./columns";
import { areaText } from "./formula";
import { Area, CellsNotEmptyError, DataSource, RegionRead, WorkbookHost } from "./host";
import { countText } from "./number-format";
import { PANEL_CSS, injectStyle } from "./panel-style";
import { Choices, DataProblem, Prepared, prepare } from "./prepare";
import { Names, caution, reading } from "./reading";
import { buildResultsBlock } from "./results-block";
import type { AnalysisRunner } from "./runner";

type Step = "data" | "question" | "options" | "run" | "results";
const STEPS: { id: Step; label: string }[] = [
  { id: "data", label: "1 Data" },
  { id: "question", label: "2 Question" },
  { id: "options", label: "3 Options" },
  { id: "run", label: "4 Run" },
  { id: "results", label: "5 Results" },
];

/** Above this much work (rows × resamples) the block is written as values by default. */
export const LIVE_WORK_LIMIT = 5e7;

export type Where = "new" | "beside" | "cell";

export interface PanelOptions extends AnalysisOptions {
  where: Where;
  /** Top-left cell when where is "cell" ("H2" or "Sheet!H2"). */
  cell: string;
  /** Write live =RS.… formulas; null: decide by the size of the work. */
  live: boolean | null;
}

const QUESTIONS: { id: Question; title: string; eg: string }[] = [
  { id: "groups", title: "Do groups differ?", eg: "e.g. yields of several lines or treatments; farms or fields can be blocks" },
  { id: "paired", title: "Do two paired measurements differ?", eg: "e.g. the same samples before and after a treatment" },
  { id: "association", title: "Are two columns associated?", eg: "e.g. does yield rise with rainfall or nitrogen?" },
  { id: "precision", title: "How precise is a summary?", eg: "e.g. a range of likely values for the mean yield, the median or the spread (CV %: spread as % of the mean)" },
  { id: "traits", title: "Do groups differ on several traits at once?", eg: "e.g. yield, protein and plant height together" },
];

export interface PanelDeps {
  host: WorkbookHost;
  runner: AnalysisRunner;
  /** Writes the demo data (new sheets) and selects it. */
  loadDemo?: () => Promise<void>;
  now?: () => Date;
}

/** The top-left cell of an area as the user types it: `I1`. */
function cellText(a: Area): string {
  return cellName(a.top, a.left);
}

function esc(s: string): string {
  return s.replace(/&/g, "&amp;").replace(/</g, "&lt;").replace(/>/g, "&gt;").replace(/"/g, "&quot;");
}

export class Panel {
  readonly root: HTMLElement;
  readonly deps: PanelDeps;
  step: Step = "data";
  source: DataSource = "region";
  region: RegionRead | null = null;
  header = true;
  columns: ColumnInfo[] = [];
  choices: Choices = { question: "groups" };
  options: PanelOptions = { ...DEFAULT_OPTIONS, where: "new", cell: "", live: null };
  private prepared: Prepared | null = null;
  private problem: string | null = null;
  private message: { kind: "info" | "bad" | "ok" | "warn"; html: string } | null = null;
  result: AnalysisResult | null = null;
  written: Area | null = null;
  private progress = 0;
  private started = 0;
  /** A block waiting for the user's answer; `beside` is the free space it would take beside the data. */
  private pendingBlock: { block: Block; names: Names; area: Area; beside: Area | null } | null = null;
  /** Seconds the last analysis took (shown, and read by the browser tests). */
  lastSeconds = NaN;

  constructor(root: HTMLElement, deps: PanelDeps) {
    injectStyle("rs-panel-css", PANEL_CSS);
    this.root = root;
    this.deps = deps;
    root.classList.add("rs-panel");
    root.innerHTML = `<div class="rs-head"><div class="rs-brand">Reshuffle <small>resampling tests for your trial data</small></div><div class="rs-steps" id="rs-steps"></div></div><div class="rs-body" id="rs-body"></div>`;
    root.querySelector("#rs-steps")!.addEventListener("click", (e) => {
      const t = (e.target as HTMLElement).closest("[data-step]") as HTMLElement | null;
      if (t && t.classList.contains("done") && !this.deps.runner.busy) this.go(t.dataset.step as Step);
    });
    this.render();
  }

  private get body(): HTMLElement {
    return this.root.querySelector("#rs-body") as HTMLElement;
  }

  go(step: Step): void {
    this.step = step;
    this.message = null;
    this.render();
  }

  private stepDone(s: Step): boolean {
    const order = STEPS.map((x) => x.id);
    return order.indexOf(s) < order.indexOf(this.step) && (s !== "question" || this.region !== null);
  }

  render(): void {
    const steps = this.root.querySelector("#rs-steps")!;
    steps.innerHTML = STEPS.map((s) => `<span class="rs-step${s.id === this.step ? " on" : this.stepDone(s.id) ? " done" : ""}" data-step="${s.id}">${s.label}</span>`).join("");
    const b = this.body;
    switch (this.step) {
      case "data":
        b.innerHTML = this.dataHtml();
        break;
      case "question":
        b.innerHTML = this.questionHtml();
        break;
      case "options":
        b.innerHTML = this.optionsHtml();
        break;
      case "run":
        b.innerHTML = this.runHtml();
        break;
      case "results":
        b.innerHTML = this.resultsHtml();
        break;
    }
    b.dataset.step = this.step;
    this.bind();
  }

  private box(): string {
    return this.message ? `<div class="rs-box ${this.message.kind}" id="rs-message">${this.message.html}</div>` : "";
  }

  // ---- step 1: data -------------------------------------------------------------------

  private dataHtml(): string {
    const src = (id: DataSource, label: string, hint: string) =>
      `<label class="rs-card${this.source === id ? " on" : ""}"><input type="radio" name="rs-source" value="${id}"${this.source === id ? " checked" : ""}><b>${label}</b><span class="eg">${hint}</span></label>`;
    let cols = "";
    if (this.region) {
      const r = this.region;
      const rows = r.rows - (this.header ? 1 : 0);
      cols = `<div class="rs-box info" id="rs-region">Read <b>${esc(areaText(r))}</b>: ${countText(rows)} rows of data in ${r.cols} columns.</div>
        <label class="rs-checks"><input type="checkbox" id="rs-header"${this.header ? " checked" : ""}> The first row holds the column names</label>
        <table class="rs-cols" id="rs-columns"><thead><tr><th>Col.</th><th>Name</th><th>Holds</th><th>Filled</th><th>Blank</th></tr></thead><tbody>
        ${this.columns
          .map(
            (c) =>
              `<tr><td>${c.letter}</td><td>${esc(c.name)}</td><td><span class="rs-kind ${c.kind}">${c.kind === "labels" ? `labels (${c.distinct})` : c.kind}</span></td><td>${countText(c.filled)}</td><td>${countText(c.blanks)}</td></tr>`,
          )
          .join("")}</tbody></table>`;
    }
    return `<h2>Your data</h2>
      <p class="help">Click any cell inside your table in the sheet, then read it in. Each row should be one plot or sample, each column one thing you recorded.</p>
      ${src("region", "The whole table around the selected cell", "finds the block of filled cells around it")}
      ${src("selection", "Only the cells I selected", "use this when the table has other things next to it")}
      ${src("table", "The Excel table the selection is in", "for data formatted as a table")}
      <div class="rs-btns"><button class="rs-btn primary" id="rs-read">Read the data</button>${this.deps.loadDemo ? `<button class="rs-btn" id="rs-demo">Load demo data</button>` : ""}</div>
      ${this.box()}
      ${cols}
      <div class="rs-btns"><button class="rs-btn primary" id="rs-next-question"${this.region ? "" : " disabled"}>Next: choose a question</button></div>`;
  }

  /** Reads the data from the workbook; `quiet` leaves no error message (first opening). */
  async readData(quiet = false): Promise<void> {
    try {
      const r = await this.deps.host.readRegion(this.source);
      if (r.rows * r.cols <= 1 && r.kinds[0]?.[0] === "empty") throw new Error("The selected cell is empty. Click a cell inside your table first.");
      this.region = r;
      this.header = detectHeader(r);
      this.columns = describeColumns(r, this.header);
      this.autoChoose();
      this.message = null;
    } catch (e) {
      this.region = null;
      this.columns = [];
      this.message = quiet ? null : { kind: "bad", html: esc(e instanceof Error ? e.message : String(e)) };
    }
    this.render();
  }

  /** Sensible first choices: the numeric column with most distinct values, the label column with fewest groups. */
  autoChoose(): void {
    const nums = this.columns.filter((c) => c.kind === "numbers");
    const labels = this.columns.filter((c) => c.kind === "labels" && c.distinct >= 2);
    const byDistinct = nums.slice().sort((a, b) => b.distinct - a.distinct || b.index - a.index);
    const q = this.choices.question;
    this.choices = { question: q, primary: this.choices.primary ?? "F", statistic: this.choices.statistic ?? "mean", scale: this.choices.scale ?? "standardize" };
    this.choices.values = byDistinct[0]?.index;
    const few = labels.slice().sort((a, b) => a.distinct - b.distinct || b.index - a.index);
    this.choices.groups = few[0]?.index;
    this.choices.blocks = null;
    this.choices.first = nums[0]?.index;
    this.choices.second = nums[1]?.index;
    this.choices.traits = nums.filter((c) => c.distinct > 2).map((c) => c.index);
  }

  // ---- step 2: question ----------------------------------------------------------------

  private picker(id: string, label: string, value: number | null | undefined, kinds: string[], optional = false, hint = ""): string {
    const opts = this.columns
      .filter((c) => kinds.includes(c.kind) || c.index === value)
      .map((c) => `<option value="${c.index}"${c.index === value ? " selected" : ""}>${c.letter} · ${esc(c.name)} — ${esc(columnSummary(c))}</option>`)
      .join("");
    return `<div class="rs-field"><label class="t" for="${id}">${label}</label><select id="${id}">${optional ? `<option value=""${value === null || value === undefined ? " selected" : ""}>none</option>` : value === undefined ? `<option value="" selected>choose…</option>` : ""}${opts}</select>${hint ? `<span class="hint">${hint}</span>` : ""}</div>`;
  }

  private questionHtml(): string {
    const q = this.choices.question;
    const cards = QUESTIONS.map(
      (x) => `<label class="rs-card${x.id === q ? " on" : ""}"><input type="radio" name="rs-question" value="${x.id}"${x.id === q ? " checked" : ""}><b>${x.title}</b><span class="eg">${x.eg}</span></label>`,
    ).join("");
    const c = this.choices;
    let pickers = "";
    const any = ["numbers", "labels", "mixed"];
    switch (q) {
      case "groups":
        pickers =
          this.picker("rs-values", "What was measured", c.values, ["numbers", "mixed"], false, "a column of numbers, e.g. yield") +
          this.picker("rs-groups", "The groups to compare", c.groups, any, false, "e.g. the line, variety or treatment of each row") +
          this.picker("rs-blocks", "Blocks (optional)", c.blocks, any, true, "e.g. the farm or field: groups are then compared within each block");
        break;
      case "paired":
        pickers =
          this.picker("rs-first", "First measurement (e.g. before)", c.first, ["numbers", "mixed"]) +
          this.picker("rs-second", "Second measurement (e.g. after)", c.second, ["numbers", "mixed"], false, "each row is one sample measured twice");
        break;
      case "association":
        pickers = this.picker("rs-first", "First column", c.first, ["numbers", "mixed"]) + this.picker("rs-second", "Second column", c.second, ["numbers", "mixed"]);
        break;
      case "precision":
        pickers =
          this.picker("rs-values", "Column to summarise", c.values, ["numbers", "mixed"]) +
          `<div class="rs-field"><label class="t" for="rs-statistic">Summary to report first</label><select id="rs-statistic">${(
            [["mean", "mean"], ["median", "median"], ["sd", "standard deviation"], ["cv", "CV % (spread relative to the mean)"], ["trimmed", "10 % trimmed mean"]] as const
          )
            .map(([v, l]) => `<option value="${v}"${c.statistic === v ? " selected" : ""}>${l}</option>`)
            .join("")}</select></div>`;
        break;
      case "traits": {
        const nums = this.columns.filter((x) => x.kind === "numbers" || x.kind === "mixed");
        pickers =
          `<div class="rs-field"><label class="t">Traits (tick two or more)</label><div class="rs-checks" id="rs-traits">${nums
            .map((x) => `<label><input type="checkbox" value="${x.index}"${(c.traits ?? []).includes(x.index) ? " checked" : ""}> ${x.letter} · ${esc(x.name)} <span class="hint" style="display:inline">${esc(columnSummary(x))}</span></label>`)
            .join("")}</div></div>` + this.picker("rs-groups", "The groups to compare", c.groups, any);
        break;
      }
    }
    this.check();
    const status = this.problem
      ? `<div class="rs-box bad" id="rs-problem">${esc(this.problem)}</div>`
      : this.prepared
        ? `<div class="rs-box ok" id="rs-ready">${countText(this.prepared.context.rowsUsed)} rows will be used${this.prepared.context.rowsSkipped ? `; ${countText(this.prepared.context.rowsSkipped)} rows with blank cells are left out` : ""}.</div>`
        : "";
    return `<h2>What do you want to know?</h2>${cards}${pickers}${status}
      <div class="rs-btns"><button class="rs-btn" id="rs-back-data">Back</button><button class="rs-btn primary" id="rs-next-options"${this.problem ? " disabled" : ""}>Next: options</button></div>`;
  }

  /** Validates the current choices by preparing the request. */
  check(): void {
    this.prepared = null;
    this.problem = null;
    if (!this.region) {
      this.problem = "Read the data first.";
      return;
    }
    try {
      this.prepared = prepare(this.region, this.columns, this.choices, this.analysisOptions());
    } catch (e) {
      if (e instanceof DataProblem) this.problem = e.message;
      else this.problem = e instanceof Error ? e.message : String(e);
    }
  }

  analysisOptions(): AnalysisOptions {
    const o = this.options;
    return { resamples: o.resamples, seed: o.seed, level: o.level, alpha: o.alpha, adjust: o.adjust, method: o.method, direction: o.direction };
  }

  // ---- step 3: options -----------------------------------------------------------------

  private liveChoice(): boolean {
    if (this.options.live !== null) return this.options.live;
    return (this.prepared?.work ?? 0) <= LIVE_WORK_LIMIT;
  }

  private optionsHtml(): string {
    this.check();
    const o = this.options;
    const q = this.choices.question;
    const sel = (id: string, label: string, items: [string, string][], value: string, hint = "") =>
      `<div class="rs-field"><label class="t" for="${id}">${label}</label><select id="${id}">${items.map(([v, l]) => `<option value="${v}"${v === value ? " selected" : ""}>${l}</option>`).join("")}</select>${hint ? `<span class="hint">${hint}</span>` : ""}</div>`;
    const resampleItems: [string, string][] = [["999", "999 (quick look)"], ["9999", "9,999 (recommended)"], ["99999", "99,999 (more precise p)"], ["999999", "999,999 (very precise, slow)"]];
    if (!resampleItems.some(([v]) => Number(v) === o.resamples)) resampleItems.push([String(o.resamples), countText(o.resamples)]);
    const groupsOnly = q === "groups";
    const directional = q === "paired" || q === "association";
    const live = this.liveChoice();
    const big = (this.prepared?.work ?? 0) > LIVE_WORK_LIMIT;
    return `<h2>Options</h2><p class="help">The defaults suit most trials. Each option is explained below it.</p>
      <div class="rs-row">${sel("rs-resamples", "Shuffles (resamples)", resampleItems, String(o.resamples), "more shuffles give a more precise p, and take longer")}
      <div class="rs-field"><label class="t" for="rs-seed">Seed</label><input type="number" id="rs-seed" value="${o.seed}" min="1" step="1"><span class="hint">the starting point of the random shuffles: same seed, same answer</span></div></div>
      <div class="rs-row">${sel("rs-level", "Interval level", [["0.9", "90 %"], ["0.95", "95 %"], ["0.99", "99 %"]], String(o.level), "how sure each range of likely values should be")}
      ${sel("rs-alpha", "Call a difference clear below p =", [["0.1", "0.10"], ["0.05", "0.05"], ["0.01", "0.01"]], String(o.alpha), "p is how often chance alone gives a result this large")}</div>
      ${groupsOnly ? sel("rs-adjust", "Allow for many comparisons", [["holm", "Holm (safe, recommended)"], ["maxt", "max-T from the same shuffles (less strict)"], ["bh", "Benjamini–Hochberg (false discovery rate)"], ["none", "no allowance"]], o.adjust, "comparing many pairs raises the chance of a false alarm; this corrects for it") : ""}
      ${groupsOnly ? sel("rs-primary", "Test the reading leads with", [["F", "permutation F (differences in means)"], ["SNR", "distance ratio (robust to outliers)"], ["RANK", "rank test (ignores the size of outliers)"]], this.choices.primary ?? "F", "the other tests are shown beside it in the results") : ""}
      ${directional ? sel("rs-direction", "Direction", [["two-sided", "either way"], ["greater", "second is higher"], ["less", "second is lower"]], o.direction, "choose one side only if you decided it before seeing the data") : ""}
      ${sel("rs-method", "Interval method", [["bca", "BCa bootstrap (recommended)"], ["percentile", "percentile bootstrap"], ["basic", "basic bootstrap"]], o.method, "ranges of likely values come from resampling the data (the bootstrap); BCa also corrects for skewed data")}
      ${sel("rs-where", "Where to write the results", [["new", "on a new sheet"], ["beside", "beside the data (first empty columns to the right)"], ["cell", "starting at a cell I choose"]], o.where, "existing cells are never overwritten")}
      <div class="rs-field" id="rs-cell-field"${o.where === "cell" ? "" : ' style="display:none"'}><label class="t" for="rs-cell">Top-left cell</label><input type="text" id="rs-cell" value="${esc(o.cell)}" placeholder="e.g. H2 or Results!A1"></div>
      <label class="rs-checks"><input type="checkbox" id="rs-live"${live ? " checked" : ""}> Keep results live: cells hold =RS.… formulas that update with the data</label>
      ${big ? `<div class="rs-box warn">These data are large: live formulas would recalculate for a long time after every change, so values are written unless you tick the box.</div>` : ""}
      ${this.problem ? `<div class="rs-box bad">${esc(this.problem)}</div>` : ""}
      <div class="rs-btns"><button class="rs-btn" id="rs-back-question">Back</button><button class="rs-btn primary" id="rs-run"${this.problem ? " disabled" : ""}>Run the analysis</button></div>`;
  }

  private readOptions(): void {
    const $ = (id: string) => this.root.querySelector(`#${id}`) as HTMLInputElement | HTMLSelectElement | null;
    const o = this.options;
    const num = (id: string, d: number) => {
      const el = $(id);
      const x = el ? Number(el.value) : d;
      return Number.isFinite(x) ? x : d;
    };
    o.resamples = Math.round(num("rs-resamples", o.resamples));
    o.seed = Math.max(1, Math.round(num("rs-seed", o.seed)));
    o.level = num("rs-level", o.level);
    o.alpha = num("rs-alpha", o.alpha);
    if ($("rs-adjust")) o.adjust = $("rs-adjust")!.value as Adjust;
    if ($("rs-primary")) this.choices.primary = $("rs-primary")!.value as GroupStatisticWord;
    if ($("rs-direction")) o.direction = $("rs-direction")!.value as AnalysisOptions["direction"];
    if ($("rs-method")) o.method = $("rs-method")!.value as IntervalMethod;
    if ($("rs-where")) o.where = $("rs-where")!.value as Where;
    if ($("rs-cell")) o.cell = $("rs-cell")!.value.trim();
    const live = $("rs-live") as HTMLInputElement | null;
    if (live) o.live = live.checked;
  }

  // ---- step 4: run ---------------------------------------------------------------------

  private runHtml(): string {
    const pct = Math.round(this.progress * 100);
    const busy = this.deps.runner.busy;
    return `<h2>${busy ? "Working…" : "Run"}</h2>
      <p class="help" id="rs-task">${esc(this.taskText())}</p>
      <p class="help">The shuffling runs in the background: you can keep working in the sheet.</p>
      <div class="rs-bar" role="progressbar" aria-valuemin="0" aria-valuemax="100" aria-valuenow="${pct}" id="rs-progress"><div style="width:${pct}%"></div></div>
      <div id="rs-progress-text">${busy ? `${pct} % done` : ""}</div>
      ${this.box()}
      <div class="rs-btns" id="rs-run-btns">${busy ? `<button class="rs-btn danger" id="rs-cancel">Cancel</button>` : `<button class="rs-btn" id="rs-back-options">Back to options</button>`}</div>
      ${this.pendingBlock ? this.askHtml(this.pendingBlock.beside) : ""}`;
  }

  /** The three answers when the chosen place is not free; the first names the cell it would use. */
  private askHtml(beside: Area | null): string {
    const at = beside ? `<button class="rs-btn primary" id="rs-ask-beside">Write at ${esc(cellText(beside))} (first free space to the right of the data)</button>` : "";
    return `<div class="rs-btns" id="rs-ask">${at}<button class="rs-btn${beside ? "" : " primary"}" id="rs-ask-new">Write on a new sheet</button><button class="rs-btn" id="rs-ask-cancel">Do not write</button></div>`;
  }

  /** What the run does, in one sentence. */
  taskText(): string {
    const p = this.prepared;
    if (!p) return "";
    const q = QUESTIONS.find((x) => x.id === p.request.question)!;
    const rows = countText(p.context.rowsUsed);
    const R = countText(this.options.resamples);
    return `${q.title} ${rows} rows, ${R} shuffles for each test${p.request.question === "groups" ? ", then every pair of groups" : ""}.`;
  }

  private setProgress(f: number): void {
    this.progress = f;
    const bar = this.root.querySelector("#rs-progress") as HTMLElement | null;
    if (bar) {
      const pct = Math.round(f * 100);
      (bar.firstElementChild as HTMLElement).style.width = `${pct}%`;
      bar.setAttribute("aria-valuenow", String(pct));
      const t = this.root.querySelector("#rs-progress-text");
      if (t) t.textContent = `${pct} % done`;
    }
  }

  async run(): Promise<void> {
    this.readOptions();
    this.check();
    if (!this.prepared) {
      this.render();
      return;
    }
    const prepared = this.prepared;
    this.progress = 0;
    this.message = null;
    this.pendingBlock = null;
    this.step = "run";
    this.started = performance.now();
    const runP = this.deps.runner.run(prepared.request, (f) => this.setProgress(f));
    this.render();
    let result: AnalysisResult;
    try {
      result = await runP;
    } catch (e) {
      this.message =
        e instanceof CancelledError
          ? { kind: "warn", html: "Cancelled. Nothing was written to the workbook." }
          : { kind: "bad", html: `The analysis stopped: ${esc(e instanceof Error ? e.message : String(e))}` };
      this.render();
      return;
    }
    this.lastSeconds = (performance.now() - this.started) / 1000;
    this.result = result;
    this.setProgress(1);
    const live = this.liveChoice() && !(result.question === "groups" && result.shared);
    const block = buildResultsBlock(result, { ...prepared.context, date: (this.deps.now ?? (() => new Date()))(), live });
    const names = this.names();
    await this.write(block, names);
  }

  names(): Names {
    const c = this.choices;
    const name = (i: number | null | undefined) => (i === null || i === undefined ? undefined : this.columns[i]?.name);
    if (c.question === "paired" || c.question === "association") {
      return c.question === "paired" ? { x: name(c.second), y: name(c.first) } : { x: name(c.first), y: name(c.second) };
    }
    return { value: name(c.values), group: name(c.groups), block: name(c.blocks), traits: (c.traits ?? []).map((i) => this.columns[i]?.name ?? "") };
  }

  /** The free space beside the data the block would take, or null when there is none. */
  private async besideArea(block: Block): Promise<Area | null> {
    const r = this.region;
    if (!r) return null;
    try {
      return await this.deps.host.findFreeSpace(r.sheet, block.rows, block.cols, r.top);
    } catch {
      return null;
    }
  }

  /** Finds where the block goes (asking when the chosen cell is not free) and writes it. */
  private async write(block: Block, names: Names, override?: Where | Area): Promise<void> {
    const host = this.deps.host;
    const where = override ?? this.options.where;
    try {
      let area: Area;
      if (typeof where === "object") {
        area = where;
      } else if (where === "new") {
        const sheet = await host.addSheet("Results");
        area = { sheet, top: 0, left: 0, rows: block.rows, cols: block.cols };
      } else if (where === "beside") {
        const r = this.region!;
        area = await host.findFreeSpace(r.sheet, block.rows, block.cols, r.top);
      } else {
        const p = parseAddress(this.options.cell);
        if (!p) throw new DataProblem(`“${this.options.cell}” is not a cell address; write it like H2 or Results!A1.`);
        area = { sheet: p.sheet || this.region!.sheet, top: p.top, left: p.left, rows: block.rows, cols: block.cols };
        if (!(await host.isEmpty(area))) {
          this.pendingBlock = { block, names, area, beside: await this.besideArea(block) };
          this.message = {
            kind: "warn",
            html: `The results need ${block.rows} rows × ${block.cols} columns from ${esc(areaText({ ...area, rows: 1, cols: 1 }))}, and some of those cells are not empty. Nothing has been written. Where should the results go?`,
          };
          this.render();
          return;
        }
      }
      const report = await host.writeBlock(area.sheet, area.top, area.left, block);
      this.written = report.area;
      this.pendingBlock = null;
      await host.select({ ...report.area, rows: 1, cols: 1 });
      this.step = "results";
      this.message = report.fallbacks.length ? { kind: "info", html: esc(report.fallbacks.join(" ")) } : null;
      this.render();
    } catch (e) {
      if (e instanceof CellsNotEmptyError) {
        this.pendingBlock = { block, names, area: e.area, beside: await this.besideArea(block) };
        this.message = { kind: "warn", html: `Cell ${esc(e.firstFilled)} is in the way, so nothing was written. Where should the results go?` };
      } else this.message = { kind: "bad", html: esc(e instanceof Error ? e.message : String(e)) };
      this.render();
    }
  }

  // ---- step 5: results -----------------------------------------------------------------

  private resultsHtml(): string {
    const r = this.result;
    if (!r || !this.written) return `<h2>Results</h2><p class="help">Run an analysis first.</p>`;
    const lines = reading(r, this.names());
    const secs = Number.isFinite(this.lastSeconds) ? this.lastSeconds : 0;
    const w = this.written;
    const took = secs < 1 ? "under a second" : `${secs < 10 ? secs.toFixed(1) : Math.round(secs)} s`;
    return `<h2>Results</h2>
      <div class="rs-box ok" id="rs-written">Written to <b>${esc(areaText(w))}</b> in ${took}: the results block starts at cell <b>${esc(cellText(w))}</b> on the sheet “${esc(w.sheet)}” and fills ${w.rows} rows × ${w.cols} columns, with the tables, charts, method and caution.</div>
      <div class="rs-reading" id="rs-reading">${lines.map((l) => `<p>${esc(l)}</p>`).join("")}</div>
      <div class="rs-box warn" id="rs-caution">${esc(caution(r))}</div>
      ${this.box()}
      <div class="rs-btns"><button class="rs-btn primary" id="rs-show">Show the results block (${esc(w.sheet)}, ${esc(cellText(w))})</button><button class="rs-btn" id="rs-again">Ask another question</button><button class="rs-btn" id="rs-change">Change options and run again</button></div>`;
  }

  // ---- events --------------------------------------------------------------------------

  private bind(): void {
    const on = (id: string, ev: string, f: (e: Event) => void) => this.root.querySelector(`#${id}`)?.addEventListener(ev, f);
    const int = (v: string) => (v === "" ? null : Number(v));
    switch (this.step) {
      case "data":
        this.root.querySelectorAll('input[name="rs-source"]').forEach((el) =>
          el.addEventListener("change", (e) => {
            this.source = (e.target as HTMLInputElement).value as DataSource;
            this.render();
          }),
        );
        on("rs-read", "click", () => void this.readData());
        on("rs-demo", "click", async () => {
          try {
            await this.deps.loadDemo!();
            this.source = "region";
            await this.readData();
          } catch (e) {
            this.message = { kind: "bad", html: esc(e instanceof Error ? e.message : String(e)) };
            this.render();
          }
        });
        on("rs-header", "change", (e) => {
          this.header = (e.target as HTMLInputElement).checked;
          this.columns = describeColumns(this.region!, this.header);
          this.autoChoose();
          this.render();
        });
        on("rs-next-question", "click", () => this.go("question"));
        break;
      case "question":
        this.root.querySelectorAll('input[name="rs-question"]').forEach((el) =>
          el.addEventListener("change", (e) => {
            this.choices.question = (e.target as HTMLInputElement).value as Question;
            this.render();
          }),
        );
        on("rs-values", "change", (e) => ((this.choices.values = int((e.target as HTMLSelectElement).value) ?? undefined), this.render()));
        on("rs-groups", "change", (e) => ((this.choices.groups = int((e.target as HTMLSelectElement).value) ?? undefined), this.render()));
        on("rs-blocks", "change", (e) => ((this.choices.blocks = int((e.target as HTMLSelectElement).value)), this.render()));
        on("rs-first", "change", (e) => ((this.choices.first = int((e.target as HTMLSelectElement).value) ?? undefined), this.render()));
        on("rs-second", "change", (e) => ((this.choices.second = int((e.target as HTMLSelectElement).value) ?? undefined), this.render()));
        on("rs-statistic", "change", (e) => ((this.choices.statistic = (e.target as HTMLSelectElement).value as IntervalStatistic), this.render()));
        this.root.querySelectorAll("#rs-traits input").forEach((el) =>
          el.addEventListener("change", () => {
            this.choices.traits = Array.from(this.root.querySelectorAll("#rs-traits input:checked")).map((x) => Number((x as HTMLInputElement).value));
            this.render();
          }),
        );
        on("rs-back-data", "click", () => this.go("data"));
        on("rs-next-options", "click", () => this.go("options"));
        break;
      case "options":
        on("rs-where", "change", (e) => {
          const f = this.root.querySelector("#rs-cell-field") as HTMLElement;
          f.style.display = (e.target as HTMLSelectElement).value === "cell" ? "" : "none";
        });
        on("rs-resamples", "change", () => {
          this.readOptions();
          this.options.live = null;
          this.render();
        });
        on("rs-back-question", "click", () => {
          this.readOptions();
          this.go("question");
        });
        on("rs-run", "click", () => void this.run());
        break;
      case "run":
        on("rs-cancel", "click", () => this.deps.runner.cancel());
        on("rs-back-options", "click", () => this.go("options"));
        on("rs-ask-beside", "click", () => {
          const p = this.pendingBlock!;
          this.pendingBlock = null;
          void this.write(p.block, p.names, p.beside ?? "beside");
        });
        on("rs-ask-new", "click", () => {
          const p = this.pendingBlock!;
          this.pendingBlock = null;
          void this.write(p.block, p.names, "new");
        });
        on("rs-ask-cancel", "click", () => {
          this.pendingBlock = null;
          this.message = { kind: "info", html: "Nothing was written." };
          this.render();
        });
        break;
      case "results":
        on("rs-show", "click", () => void this.deps.host.select(this.written!));
        on("rs-again", "click", () => this.go("question"));
        on("rs-change", "click", () => this.go("options"));
        break;
    }
  }
}
