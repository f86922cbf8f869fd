/**
 * Draws the preview's in-memory workbook as an HTML grid (column letters, row numbers,
 * formatted cells, sheet tabs, a formula bar) with its charts as SVG on top. Clicking
 * selects a cell, shift-click extends the selection; double-click edits a constant and
 * recalculates the formulas that read it.
 */
import { cellName, columnLetters } from "../functions/address";
import type { CellStyle } from "./block";
import { drawChart } from "./preview-charts";
import { ROW_PX, colPx } from "./preview-host";
import { formatNumber } from "./number-format";
import type { PreviewCell, PreviewWorkbook } from "./preview-workbook";

/** Rows drawn at most (the rest of a long sheet is summarised). */
export const MAX_DRAWN_ROWS = 400;

function esc(s: string): string {
  return s.replace(/&/g, "&amp;").replace(/</g, "&lt;").replace(/>/g, "&gt;").replace(/"/g, "&quot;");
}

/** The text a cell shows. */
export function shownText(cell: PreviewCell | undefined): string {
  if (!cell) return "";
  if (cell.error) return cell.error.code;
  const v = cell.value;
  if (v === null || v === undefined) return "";
  if (typeof v === "number") return formatNumber(v, cell.format);
  if (typeof v === "boolean") return v ? "TRUE" : "FALSE";
  return v;
}

function styleText(s: CellStyle | undefined, numeric: boolean): string {
  const out: string[] = [];
  if (numeric) out.push("text-align:right");
  if (!s) return out.join(";");
  if (s.bold) out.push("font-weight:600");
  if (s.italic) out.push("font-style:italic");
  if (s.size) out.push(`font-size:${Math.round((s.size * 4) / 3)}px`);
  if (s.color) out.push(`color:${s.color}`);
  if (s.fill) out.push(`background:${s.fill}`);
  if (s.align) out.push(`text-align:${s.align}`);
  if (s.wrap) out.push("white-space:normal");
  if (s.borderBottom) out.push(`border-bottom:1px solid ${s.borderBottom}`);
  if (s.borderTop) out.push(`border-top:1px solid ${s.borderTop}`);
  return out.join(";");
}

export class PreviewGrid {
  private readonly book: PreviewWorkbook;
  private readonly root: HTMLElement;
  private readonly gridEl: HTMLElement;
  private readonly tabsEl: HTMLElement;
  private readonly nameBox: HTMLElement;
  private readonly fx: HTMLElement;
  private anchor: { r: number; c: number } | null = null;

  constructor(book: PreviewWorkbook, root: HTMLElement) {
    this.book = book;
    this.root = root;
    root.innerHTML = `
      <div class="wb-bar"><span class="wb-name" id="wb-name">A1</span><span class="wb-fx">fx</span><span class="wb-formula" id="wb-formula"></span></div>
      <div class="wb-scroll" id="wb-scroll"><div class="wb-grid" id="wb-grid"></div></div>
      <div class="wb-tabs" id="wb-tabs"></div>`;
    this.gridEl = root.querySelector("#wb-grid")!;
    this.tabsEl = root.querySelector("#wb-tabs")!;
    this.nameBox = root.querySelector("#wb-name")!;
    this.fx = root.querySelector("#wb-formula")!;
    this.gridEl.addEventListener("mousedown", (e) => this.onClick(e as MouseEvent));
    this.gridEl.addEventListener("dblclick", (e) => this.onEdit(e as MouseEvent));
    this.tabsEl.addEventListener("click", (e) => {
      const t = (e.target as HTMLElement).closest("[data-sheet]") as HTMLElement | null;
      if (!t) return;
      this.book.active = t.dataset.sheet!;
      this.book.selection = { sheet: this.book.active, top: 0, left: 0, rows: 1, cols: 1 };
      this.draw();
    });
  }

  private cellAt(e: MouseEvent): { r: number; c: number } | null {
    const td = (e.target as HTMLElement).closest("td[data-r]") as HTMLElement | null;
    if (!td) return null;
    return { r: Number(td.dataset.r), c: Number(td.dataset.c) };
  }

  private onClick(e: MouseEvent): void {
    const at = this.cellAt(e);
    if (!at) return;
    const sheet = this.book.active;
    if (e.shiftKey && this.anchor) {
      const top = Math.min(this.anchor.r, at.r), left = Math.min(this.anchor.c, at.c);
      this.book.selection = { sheet, top, left, rows: Math.abs(at.r - this.anchor.r) + 1, cols: Math.abs(at.c - this.anchor.c) + 1 };
    } else {
      this.anchor = at;
      this.book.selection = { sheet, top: at.r, left: at.c, rows: 1, cols: 1 };
    }
    this.paintSelection();
  }

  /** Marks the selected cells and fills the name box and formula bar (no redraw). */
  paintSelection(): void {
    const sel = this.book.selection;
    const s = this.book.sheet(this.book.active);
    this.gridEl.querySelectorAll("td.sel").forEach((td) => td.classList.remove("sel"));
    if (!sel || sel.sheet !== s.name) return;
    for (let r = sel.top; r < sel.top + sel.rows; r++) {
      for (let c = sel.left; c < sel.left + sel.cols; c++) this.gridEl.querySelector(`td[data-r="${r}"][data-c="${c}"]`)?.classList.add("sel");
    }
    this.nameBox.textContent = sel.rows * sel.cols > 1 ? `${cellName(sel.top, sel.left)}:${cellName(sel.top + sel.rows - 1, sel.left + sel.cols - 1)}` : cellName(sel.top, sel.left);
    const c = s.get(sel.top, sel.left);
    this.fx.textContent = c?.formula ?? (c?.value === null || c?.value === undefined ? "" : String(c.value));
  }

  private onEdit(e: MouseEvent): void {
    const at = this.cellAt(e);
    if (!at) return;
    const s = this.book.sheet(this.book.active);
    const cell = s.get(at.r, at.c);
    if (cell?.formula !== undefined || cell?.spillOf !== undefined) return; // results are not edited here
    const old = cell?.value ?? "";
    const input = window.prompt(`New value for ${cellName(at.r, at.c)}`, String(old));
    if (input === null) return;
    const t = input.trim();
    const n = t !== "" && /^-?[0-9]*\.?[0-9]+([eE][-+]?[0-9]+)?$/.test(t) ? Number(t) : null;
    this.book.setValue(s.name, at.r, at.c, t === "" ? null : n !== null ? n : input);
    void this.book.recalculate();
  }

  draw(): void {
    const book = this.book;
    if (!book.active && book.sheets.length) book.active = book.sheets[0].name;
    const s = book.sheet(book.active);
    const ext = s.extent();
    const rows = Math.min(Math.max(ext.lastRow + 3, 30), MAX_DRAWN_ROWS);
    let cols = Math.max(ext.lastCol + 2, 12);
    for (const ch of s.charts) cols = Math.max(cols, ch.at.col + 9);
    const sel = book.selection && book.selection.sheet === s.name ? book.selection : null;
    const heights = s.heights;
    const parts: string[] = [];
    let tableWidth = 40;
    for (let c = 0; c < cols; c++) tableWidth += colPx(s.widths.get(c) ?? 9);
    parts.push(`<table class="wb-table" data-sheet="${esc(s.name)}" style="width:${tableWidth}px"><colgroup><col style="width:40px">`);
    for (let c = 0; c < cols; c++) parts.push(`<col style="width:${colPx(s.widths.get(c) ?? 9)}px">`);
    parts.push(`</colgroup><thead><tr><th class="wb-corner"></th>`);
    for (let c = 0; c < cols; c++) parts.push(`<th>${columnLetters(c)}</th>`);
    parts.push(`</tr></thead><tbody>`);
    for (let r = 0; r < rows; r++) {
      const h = heights.get(r);
      parts.push(`<tr${h ? ` style="height:${Math.round((h * 4) / 3)}px"` : ""}><th>${r + 1}</th>`);
      let skip = 0;
      for (let c = 0; c < cols; c++) {
        if (skip > 0) {
          skip--;
          continue;
        }
        const cell = s.get(r, c);
        const span = cell?.span && cell.span > 1 ? Math.min(cell.span, cols - c) : 1;
        if (span > 1) skip = span - 1;
        const numeric = typeof cell?.value === "number" && !cell.error;
        const selected = sel && r >= sel.top && r < sel.top + sel.rows && c >= sel.left && c < sel.left + sel.cols;
        const cls = [selected ? "sel" : "", cell?.formula !== undefined ? "fx" : "", cell?.error ? "err" : "", span > 1 ? "span" : ""].filter(Boolean).join(" ");
        const title = cell?.error?.message ? ` title="${esc(cell.error.code + " " + cell.error.message)}"` : "";
        const tag = cell?.tag ? ` data-tag="${esc(cell.tag)}"` : "";
        const raw = cell && typeof cell.value === "number" && !cell.error ? ` data-value="${cell.value}"` : "";
        parts.push(
          `<td data-r="${r}" data-c="${c}"${span > 1 ? ` colspan="${span}"` : ""}${cls ? ` class="${cls}"` : ""}${tag}${raw}${title} style="${styleText(cell?.style, numeric)}">${esc(shownText(cell))}</td>`,
        );
      }
      parts.push(`</tr>`);
    }
    parts.push(`</tbody></table>`);
    if (ext.lastRow + 1 > MAX_DRAWN_ROWS) parts.push(`<div class="wb-more">… ${(ext.lastRow + 1 - MAX_DRAWN_ROWS).toLocaleString("en-US")} more rows not drawn in the preview</div>`);
    this.gridEl.innerHTML = parts.join("");
    // charts on top, at their anchor cells
    const table = this.gridEl.querySelector("table")!;
    for (const ch of s.charts) {
      if (ch.at.row >= rows) continue;
      const td = table.querySelector(`td[data-r="${ch.at.row}"][data-c="${ch.at.col}"]`) as HTMLElement | null;
      const x = td ? td.offsetLeft : 40 + ch.at.col * colPx(9);
      const y = td ? td.offsetTop : 22 + ch.at.row * ROW_PX;
      const div = document.createElement("div");
      div.className = "wb-chart";
      div.dataset.kind = ch.kind;
      div.style.left = `${x}px`;
      div.style.top = `${y}px`;
      div.style.width = `${ch.width}px`;
      div.style.height = `${ch.height}px`;
      div.innerHTML = drawChart(ch, s);
      this.gridEl.appendChild(div);
    }
    // tabs and formula bar
    this.tabsEl.innerHTML = book.sheets
      .map((x) => `<span class="wb-tab${x.name === s.name ? " on" : ""}" data-sheet="${esc(x.name)}">${esc(x.name)}</span>`)
      .join("");
    if (sel) {
      this.nameBox.textContent = sel.rows * sel.cols > 1 ? `${cellName(sel.top, sel.left)}:${cellName(sel.top + sel.rows - 1, sel.left + sel.cols - 1)}` : cellName(sel.top, sel.left);
      const c = s.get(sel.top, sel.left);
      this.fx.textContent = c?.formula ?? (c?.value === null || c?.value === undefined ? "" : String(c.value));
    }
  }

  /** Scrolls the grid so that the cell (r, c) of the active sheet is in view. */
  reveal(r: number, c: number): void {
    const td = this.gridEl.querySelector(`td[data-r="${r}"][data-c="${c}"]`) as HTMLElement | null;
    const scroll = this.root.querySelector("#wb-scroll") as HTMLElement;
    if (td && scroll) {
      scroll.scrollTop = Math.max(0, td.offsetTop - 30);
      scroll.scrollLeft = Math.max(0, td.offsetLeft - 50);
    }
  }
}
