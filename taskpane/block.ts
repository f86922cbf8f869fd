/**
 * A results block: a rectangle of cells with values or formulas, number formats and
 * styles, plus charts. Host-independent; positions are relative to the block's top-left.
 */

export interface CellStyle {
  bold?: boolean;
  italic?: boolean;
  /** Font size in points (default 11). */
  size?: number;
  /** Font colour "#rrggbb". */
  color?: string;
  /** Fill colour "#rrggbb". */
  fill?: string;
  align?: "left" | "center" | "right";
  /** Let long text wrap within merged width (used for the reading and the caution). */
  wrap?: boolean;
  /** Thin borders, colour "#rrggbb". */
  borderTop?: string;
  borderBottom?: string;
}

export interface BlockCell {
  /** A constant. Strings are always written as text, never as formulas. */
  value?: number | string | null;
  /** A formula starting with "=" (an `=RS.…` call). */
  formula?: string;
  /** Size of the array the formula spills into (rows × cols, anchor included). */
  spill?: { rows: number; cols: number };
  /** Excel number format ("0.0000", "General", …). */
  format?: string;
  style?: CellStyle;
  /** Merge this cell with the next `span - 1` cells to its right. */
  span?: number;
  /** Short name for tests and the preview ("p.F", "reading"). */
  tag?: string;
}

export type ChartKind = "histogram" | "dots" | "range" | "scatter";

/** A chart over cells of the block (relative rectangles). */
export interface ChartSpec {
  kind: ChartKind;
  title: string;
  /** Position of the chart: the cell its top-left corner sits on, and its size in pixels. */
  at: { row: number; col: number };
  width: number;
  height: number;
  /**
   * histogram: 4 columns lower, upper, count, observed-flag rows (no header), the bars
   * flagged 1 drawn in the highlight colour (as or more extreme than observed);
   * dots: 2 columns (group position, value) with `categories` naming positions 1..k;
   * range: rows per group with columns group, min, median, max;
   * scatter: 2 columns (x, y).
   */
  source: { row: number; col: number; rows: number; cols: number };
  /** Group names for dots (position g+1 ↔ categories[g]). */
  categories?: string[];
  xTitle?: string;
  yTitle?: string;
  /** Observed statistic, marked on the histogram. */
  observed?: number;
  /** Which bars count as "as or more extreme": the upper tail (F, D, H) or both (two-sided). */
  tail?: "upper" | "both" | "lower";
  /** Histogram rows (0-based within source) drawn in the highlight colour. */
  highlight?: number[];
  /** Cells the chart covers from `at` (for hosts that anchor charts to cells). */
  cells: { rows: number; cols: number };
}

export interface Block {
  rows: number;
  cols: number;
  /** cells[r][c], null where the block leaves the cell empty (but owns it). */
  cells: (BlockCell | null)[][];
  /** Column widths in characters (Excel's unit is points; hosts convert). */
  widths: number[];
  /** Row heights in points where a row needs more than one line (wrapped text). */
  heights: (number | undefined)[];
  /** Charts float over cells of the block (their cells are left empty). */
  charts: ChartSpec[];
}

/** Builds a block row by row. */
export class BlockBuilder {
  private readonly grid: (BlockCell | null)[][] = [];
  private readonly heights: (number | undefined)[] = [];
  readonly cols: number;
  readonly charts: ChartSpec[] = [];
  widths: number[];

  constructor(cols: number, widths: number[]) {
    this.cols = cols;
    this.widths = widths.slice(0, cols);
    while (this.widths.length < cols) this.widths.push(10);
  }

  get row(): number {
    return this.grid.length;
  }

  /** Appends a row (optionally `height` points tall); cells beyond `cells.length` are empty. */
  add(cells: (BlockCell | null)[], height?: number): number {
    if (cells.length > this.cols) throw new RangeError(`row of ${cells.length} cells in a block of ${this.cols} columns`);
    const r: (BlockCell | null)[] = cells.slice();
    while (r.length < this.cols) r.push(null);
    this.grid.push(r);
    this.heights.push(height);
    return this.grid.length - 1;
  }

  blank(count = 1): void {
    for (let i = 0; i < count; i++) this.add([]);
  }

  /** Cell at (row, col) for later edits (e.g. formats over a spill). */
  at(row: number, col: number): BlockCell | null {
    return this.grid[row][col];
  }

  set(row: number, col: number, cell: BlockCell | null): void {
    this.grid[row][col] = cell;
  }

  build(): Block {
    return { rows: this.grid.length, cols: this.cols, cells: this.grid, widths: this.widths, heights: this.heights, charts: this.charts };
  }
}

/** Every tagged cell of a block, by tag. */
export function tagged(block: Block): Map<string, { row: number; col: number; cell: BlockCell }> {
  const out = new Map<string, { row: number; col: number; cell: BlockCell }>();
  block.cells.forEach((row, r) =>
    row.forEach((cell, c) => {
      if (cell?.tag) out.set(cell.tag, { row: r, col: c, cell });
    }),
  );
  return out;
}
