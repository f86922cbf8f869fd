/**
 * A small fake Excel for ExcelHost's tests, built from office-addin-mock objects: each
 * range handed out is an OfficeMockObject over a rectangle of an in-memory grid, so the
 * host must load() and sync() before it reads (the mock returns an error string
 * otherwise), and every write it queues is recorded on the range for the test to check.
 */
import { OfficeMockObject } from "office-addin-mock";
import { parseAddress } from "../../functions/address";

export type Cell = string | number | boolean | null;

export interface FakeRange {
  sheet: string;
  top: number;
  left: number;
  rows: number;
  cols: number;
  mock: any;
}

export interface FakeChart {
  sheet: string;
  type: string;
  source: FakeRange;
  mock: any;
  xValues?: FakeRange;
  pointColours: Map<number, string>;
  position?: [FakeRange, FakeRange];
}

export interface FakeExcel {
  excel: any;
  grids: Map<string, Cell[][]>;
  ranges: FakeRange[];
  charts: FakeChart[];
  syncs: number;
  selection: { sheet: string; top: number; left: number; rows: number; cols: number };
  tables: { name: string; sheet: string; top: number; left: number; rows: number; cols: number }[];
  added: string[];
  activated: string[];
  /** Office.js members called that the API level of this fake does not have ("Worksheet.getRangeByIndexes 1.7"). */
  beyondLevel: string[];
  /** Estimated bytes queued in each request (one entry per sync). */
  requestBytes: number[];
}

const key = (r: number, c: number) => `${r},${c}`;

export function fakeExcel(sheets: Record<string, Cell[][]>, level = "1.9"): FakeExcel & { supports: (v: string) => boolean; sheet: (name: string) => any } {
  const grids = new Map<string, Cell[][]>(Object.entries(sheets).map(([k, v]) => [k, v.map((r) => r.slice())]));
  const state: FakeExcel = { excel: null, grids, ranges: [], charts: [], syncs: 0, selection: { sheet: Object.keys(sheets)[0], top: 0, left: 0, rows: 1, cols: 1 }, tables: [], added: [], activated: [], beyondLevel: [], requestBytes: [] };
  const order = ["1.1", "1.2", "1.3", "1.4", "1.5", "1.6", "1.7", "1.8", "1.9", "1.10"];
  const supports = (v: string) => order.indexOf(v) <= order.indexOf(level);
  /** Records a call from a set above this fake's level (what a real Excel of that level would refuse). */
  const needs = (v: string, what: string) => {
    if (!supports(v)) state.beyondLevel.push(`${what} ${v}`);
  };

  const created: any[] = [];
  const get = (sheet: string, r: number, c: number): Cell => grids.get(sheet)?.[r]?.[c] ?? null;
  const typeOf = (v: Cell) => (v === null || v === "" ? "Empty" : typeof v === "number" ? "Double" : typeof v === "boolean" ? "Boolean" : String(v).startsWith("#") ? "Error" : "String");

  function range(sheet: string, top: number, left: number, rows: number, cols: number): any {
    const cells = Array.from({ length: rows }, (_, i) => Array.from({ length: cols }, (_, j) => get(sheet, top + i, left + j)));
    const borders: Record<string, any> = {};
    const mock: any = new OfficeMockObject({
      formulas: cells.map((r) => r.map((v) => (v === null ? "" : v))),
      values: cells.map((r) => r.map((v) => (v === null ? "" : v))),
      valueTypes: cells.map((r) => r.map(typeOf)),
      rowIndex: top,
      columnIndex: left,
      rowCount: rows,
      columnCount: cols,
      left: left * 48,
      format: {
        font: {},
        fill: {},
        columnWidth: 48,
        rowHeight: 15,
        borders: { getItem: (name: string) => (borders[name] ??= {}) },
        autofitColumns: () => needs("1.2", "RangeFormat.autofitColumns"),
      },
      merge: function () {
        needs("1.2", "Range.merge");
        this.merged = true;
      },
      select: function () {
        state.selection = { sheet, top, left, rows, cols };
      },
      getCell: (r: number, c: number) => range(sheet, top + r, left + c, 1, 1),
      getSurroundingRegion: () => {
        needs("1.7", "Range.getSurroundingRegion");
        // The filled rectangle around the top-left cell (enough for these tests).
        let t = top, l = left, b = top, rr = left;
        const filled = (i: number, j: number) => i >= 0 && j >= 0 && get(sheet, i, j) !== null;
        let grown = true;
        while (grown) {
          grown = false;
          for (let j = l - 1; j <= rr + 1; j++) if (filled(t - 1, j)) { t--; grown = true; break; }
          for (let j = l - 1; j <= rr + 1; j++) if (filled(b + 1, j)) { b++; grown = true; break; }
          for (let i = t - 1; i <= b + 1; i++) if (filled(i, l - 1)) { l--; grown = true; break; }
          for (let i = t - 1; i <= b + 1; i++) if (filled(i, rr + 1)) { rr++; grown = true; break; }
        }
        return range(sheet, t, l, b - t + 1, rr - l + 1);
      },
    });
    // Plain object, not a mock copy: it is shared by every range of the sheet.
    mock.worksheet = sheetObj(sheet);
    const load = mock.load.bind(mock);
    mock.load = (props: string) => {
      if (/(^|[ ,])left\b/.test(props)) needs("1.10", "Range.left");
      if (/columnWidth|rowHeight/.test(props)) needs("1.2", "RangeFormat.columnWidth");
      return load(props);
    };
    // Office.js sets isNullObject on every proxy after a sync, without a load.
    mock.isNullObject = false;
    mock.borders = borders;
    created.push(mock);
    state.ranges.push({ sheet, top, left, rows, cols, mock });
    return mock;
  }

  function chart(sheet: string, type: string, src: any): any {
    const source = state.ranges.find((r) => r.mock === src)!;
    const c: FakeChart = { sheet, type, source, mock: null, pointColours: new Map() };
    const series = (i: number) => {
      const line: any = {};
      const s: any = {
        setXAxisValues: (r: any) => {
          needs("1.7", "ChartSeries.setXAxisValues");
          c.xValues = state.ranges.find((x) => x.mock === r);
        },
        points: { getItemAt: (p: number) => ({ format: { fill: { setSolidColor: (col: string) => c.pointColours.set(p, col) } } }) },
        format: { fill: { setSolidColor: () => undefined }, line },
        index: i,
      };
      // properties from later sets: recorded when set, checked against the level
      const later = (obj: any, prop: string, v: string, what: string) => {
        let value: unknown;
        Object.defineProperty(obj, prop, { get: () => value, set: (x) => (needs(v, what), (value = x)), enumerable: true });
      };
      later(s, "markerStyle", "1.7", "ChartSeries.markerStyle");
      later(s, "gapWidth", "1.7", "ChartSeries.gapWidth");
      later(line, "lineStyle", "1.7", "ChartLineFormat.lineStyle");
      return s;
    };
    const seriesList = [series(0), series(1), series(2)];
    const axis = () => ({ title: {} });
    c.mock = {
      title: {},
      legend: {},
      axes: { categoryAxis: axis(), valueAxis: axis() },
      series: { getItemAt: (i: number) => seriesList[i] },
      seriesList,
      setPosition: (a: any, b: any) => (c.position = [state.ranges.find((x) => x.mock === a)!, state.ranges.find((x) => x.mock === b)!]),
    };
    state.charts.push(c);
    return c.mock;
  }

  const sheetCache = new Map<string, any>();
  function sheetObj(name: string): any {
    if (sheetCache.has(name)) return sheetCache.get(name);
    const ws: any = {
      name,
      load: () => ws,
      getRangeByIndexes: (t: number, l: number, r: number, c: number) => {
        needs("1.7", "Worksheet.getRangeByIndexes");
        return range(name, t, l, r, c);
      },
      getRange: (address: string) => {
        const a = parseAddress(address);
        if (!a || a.sheet) throw new Error(`InvalidArgument: ${address}`);
        return range(name, a.top, a.left, a.rows, a.cols);
      },
      getUsedRange: () => {
        const g = grids.get(name) ?? [];
        let lastCol = 0, lastRow = 0;
        g.forEach((row, i) => row.forEach((v, j) => {
          if (v !== null && v !== "") { lastCol = Math.max(lastCol, j); lastRow = Math.max(lastRow, i); }
        }));
        return range(name, 0, 0, lastRow + 1, lastCol + 1);
      },
      getUsedRangeOrNullObject: () => {
        needs("1.4", "Worksheet.getUsedRangeOrNullObject");
        const g = grids.get(name) ?? [];
        let lastCol = -1, lastRow = -1;
        g.forEach((row, i) => row.forEach((v, j) => {
          if (v !== null && v !== "") { lastCol = Math.max(lastCol, j); lastRow = Math.max(lastRow, i); }
        }));
        if (lastCol < 0) return { isNullObject: true, load: () => undefined };
        const r = range(name, 0, 0, lastRow + 1, lastCol + 1);
        return r;
      },
      charts: {
        items: [] as { left: number; width: number }[],
        load: () => undefined,
        add: (type: string, src: any) => chart(name, type, src),
      },
      tables: {
        get items() {
          return state.tables.filter((t) => t.sheet === name).map((t) => ({ name: t.name, getRange: () => range(name, t.top, t.left, t.rows, t.cols) }));
        },
        load: () => undefined,
      },
      activate: () => state.activated.push(name),
    };
    sheetCache.set(name, ws);
    return ws;
  }

  const worksheets = {
    get items() {
      return [...grids.keys()].map((n) => ({ name: n }));
    },
    load: () => undefined,
    getItem: (n: string) => {
      if (!grids.has(n)) throw new Error(`ItemNotFound: ${n}`);
      return sheetObj(n);
    },
    add: (n: string) => {
      grids.set(n, []);
      state.added.push(n);
      return sheetObj(n);
    },
  };

  const context: any = {
    workbook: {
      getSelectedRange: () => range(state.selection.sheet, state.selection.top, state.selection.left, state.selection.rows, state.selection.cols),
      worksheets,
    },
    sync: async () => {
      state.syncs++;
      const fresh = created.splice(0);
      // what this request carries: the values, formulas and formats set on its ranges
      // (a property only loaded is not yet an array here: the mock fills it in m.sync())
      let bytes = 0;
      for (const m of fresh) for (const k of ["formulas", "values", "numberFormat"]) if (Array.isArray(m[k])) bytes += JSON.stringify(m[k]).length;
      state.requestBytes.push(bytes);
      for (const m of fresh) await m.sync();
    },
  };
  state.excel = {
    run: async (cb: (ctx: any) => Promise<unknown>) => cb(context),
  };
  /** The fake worksheet (e.g. to place charts on it: `sheet("Trial").charts.items.push(…)`). */
  const sheet = (name: string) => sheetObj(name);
  return Object.assign(state, { supports, sheet });
}

export { key };
