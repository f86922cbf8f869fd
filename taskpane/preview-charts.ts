/**
 * The preview's charts, drawn as SVG from the cells they are built on (the same cells an
 * Excel chart would use): the histogram of shuffled statistics with the observed value
 * marked, the per-group dot plot, the min–median–max chart and the scatter plot.
 */
import { formatNumber, general } from "./number-format";
import { wrapWords } from "./text-wrap";
import type { PlacedChart, PreviewSheet } from "./preview-workbook";

const BAR = "#8FA9B3";
const HOT = "#D9822B";
const MARK = "#B3261E";
const INK = "#1E4D5C";
const GRID = "#E3E8EA";

function esc(s: string): string {
  return s.replace(/&/g, "&amp;").replace(/</g, "&lt;").replace(/>/g, "&gt;");
}

function num(sheet: PreviewSheet, r: number, c: number): number | null {
  const cell = sheet.get(r, c);
  return cell && typeof cell.value === "number" && !cell.error ? cell.value : null;
}

function str(sheet: PreviewSheet, r: number, c: number): string {
  const cell = sheet.get(r, c);
  return cell && cell.value !== null && cell.value !== undefined ? String(cell.value) : "";
}

/** About `count` round tick values covering [lo, hi]. */
export function ticks(lo: number, hi: number, count = 5): number[] {
  if (!(hi > lo)) return [lo];
  const raw = (hi - lo) / count;
  const mag = Math.pow(10, Math.floor(Math.log10(raw)));
  const step = [1, 2, 2.5, 5, 10].map((m) => m * mag).find((s) => s >= raw) ?? 10 * mag;
  const out: number[] = [];
  for (let t = Math.ceil(lo / step) * step; t <= hi + step * 1e-9; t += step) out.push(Math.abs(t) < step * 1e-9 ? 0 : t);
  return out;
}

function tickText(t: number): string {
  return Math.abs(t) >= 1000 ? formatNumber(t, "#,##0") : general(Number(t.toPrecision(6)));
}

interface Frame {
  w: number;
  h: number;
  left: number;
  top: number;
  right: number;
  bottom: number;
}

function frame(ch: PlacedChart): Frame {
  return { w: ch.width, h: ch.height, left: 56, top: ch.kind === "histogram" ? 62 : 48, right: 14, bottom: 46 };
}

function shell(ch: PlacedChart, f: Frame, body: string): string {
  const title = esc(ch.title);
  const lines = wrapWords(ch.title, Math.max(20, Math.floor((f.w - 20) / 7.2))).slice(0, 2);
  const tl = lines.map((l, i) => `<tspan x="${f.w / 2}" dy="${i === 0 ? 0 : 16}">${esc(l)}</tspan>`).join("");
  return `<svg xmlns="http://www.w3.org/2000/svg" width="${f.w}" height="${f.h}" viewBox="0 0 ${f.w} ${f.h}" role="img" aria-label="${title}">
<rect x="0.5" y="0.5" width="${f.w - 1}" height="${f.h - 1}" fill="#fff" stroke="#C9D3D6"/>
<text x="${f.w / 2}" y="${lines.length > 1 ? 17 : 21}" text-anchor="middle" font-size="13" font-weight="600" fill="${INK}">${tl}</text>
${body}
${ch.xTitle ? `<text x="${f.left + (f.w - f.left - f.right) / 2}" y="${f.h - 8}" text-anchor="middle" font-size="11" fill="#4A5A60">${esc(ch.xTitle)}</text>` : ""}
${ch.yTitle ? `<text transform="translate(14 ${f.top + (f.h - f.top - f.bottom) / 2}) rotate(-90)" text-anchor="middle" font-size="11" fill="#4A5A60">${esc(ch.yTitle)}</text>` : ""}
</svg>`;
}

function yAxis(f: Frame, lo: number, hi: number, y: (v: number) => number): string {
  return ticks(lo, hi, 4)
    .map((t) => `<line x1="${f.left}" x2="${f.w - f.right}" y1="${y(t)}" y2="${y(t)}" stroke="${GRID}"/><text x="${f.left - 6}" y="${y(t) + 4}" text-anchor="end" font-size="10" fill="#4A5A60">${tickText(t)}</text>`)
    .join("");
}

function histogram(ch: PlacedChart, s: PreviewSheet): string {
  const f = frame(ch);
  const bins: { lo: number; hi: number; n: number; obs: boolean }[] = [];
  for (let i = 0; i < ch.source.rows; i++) {
    const r = ch.source.row + i;
    const lo = num(s, r, ch.source.col);
    const hi = num(s, r, ch.source.col + 1);
    const n = num(s, r, ch.source.col + 2);
    if (lo === null || hi === null || n === null) continue;
    bins.push({ lo, hi, n, obs: str(s, r, ch.source.col + 3) !== "" });
  }
  if (bins.length === 0) return shell(ch, f, `<text x="${f.w / 2}" y="${f.h / 2}" text-anchor="middle" font-size="12" fill="#777">no data (see the cells)</text>`);
  const x0 = bins[0].lo;
  const x1 = bins[bins.length - 1].hi;
  const maxN = Math.max(...bins.map((b) => b.n), 1);
  const pw = f.w - f.left - f.right;
  const ph = f.h - f.top - f.bottom;
  const x = (v: number) => f.left + ((v - x0) / (x1 - x0 || 1)) * pw;
  const y = (v: number) => f.top + ph - (v / maxN) * ph;
  const obsIndex = bins.findIndex((b) => b.obs);
  const observed = ch.observed ?? (obsIndex >= 0 ? bins[obsIndex].lo : x1);
  let body = yAxis(f, 0, maxN, y);
  const tail = ch.tail ?? "upper";
  const width = (x1 - x0) / bins.length;
  const marked = ch.highlight ? new Set(ch.highlight) : null;
  const extreme = (b: { lo: number; hi: number }, i: number) => {
    if (marked) return marked.has(i);
    if (tail === "upper") return obsIndex >= 0 && i >= obsIndex;
    if (tail === "lower") return obsIndex >= 0 && i <= obsIndex;
    return Math.abs((b.lo + b.hi) / 2) >= Math.abs(observed) - width / 2;
  };
  bins.forEach((b, i) => {
    const hot = extreme(b, i);
    const bx = x(b.lo);
    const bw = Math.max(1, x(b.hi) - x(b.lo) - 1);
    body += `<rect x="${bx}" y="${y(b.n)}" width="${bw}" height="${f.top + ph - y(b.n)}" fill="${hot ? HOT : BAR}"/>`;
  });
  body += `<line x1="${f.left}" x2="${f.w - f.right}" y1="${f.top + ph}" y2="${f.top + ph}" stroke="#777"/>`;
  body += ticks(x0, x1, 6)
    .map((t) => `<text x="${x(t)}" y="${f.top + ph + 14}" text-anchor="middle" font-size="10" fill="#4A5A60">${tickText(t)}</text>`)
    .join("");
  const ox = Math.min(Math.max(x(observed), f.left), f.w - f.right);
  body += `<line x1="${ox}" x2="${ox}" y1="${f.top - 4}" y2="${f.top + ph}" stroke="${MARK}" stroke-width="2" stroke-dasharray="5 3"/>`;
  const anchor = ox > f.left + pw * 0.6 ? "end" : "start";
  body += `<text x="${ox + (anchor === "end" ? -5 : 5)}" y="${f.top + 8}" text-anchor="${anchor}" font-size="11" font-weight="600" fill="${MARK}">the data: ${esc(general(Number(observed.toPrecision(4))))}</text>`;
  const lx = f.left;
  const ly = f.top - 20;
  body += `<rect x="${lx}" y="${ly}" width="10" height="10" fill="${HOT}"/><text x="${lx + 14}" y="${ly + 9}" font-size="10" fill="#4A5A60">as or more extreme than the data</text>`;
  body += `<rect x="${lx + 190}" y="${ly}" width="10" height="10" fill="${BAR}"/><text x="${lx + 204}" y="${ly + 9}" font-size="10" fill="#4A5A60">less extreme</text>`;
  return shell(ch, f, body);
}

/** The (x, y) pairs of the chart's two source columns; rows with a blank or text are left out. */
function pointsOf(ch: PlacedChart, s: PreviewSheet): { x: number; y: number }[] {
  const pts: { x: number; y: number }[] = [];
  for (let i = 0; i < ch.source.rows; i++) {
    const a = num(s, ch.source.row + i, ch.source.col);
    const b = num(s, ch.source.row + i, ch.source.col + 1);
    if (a !== null && b !== null) pts.push({ x: a, y: b });
  }
  return pts;
}

function dots(ch: PlacedChart, s: PreviewSheet): string {
  const f = frame(ch);
  const pts = pointsOf(ch, s);
  const cats = ch.categories ?? [];
  const k = Math.max(cats.length, 1);
  const ys = pts.map((p) => p.y);
  const lo = Math.min(...ys);
  const hi = Math.max(...ys);
  const pad = (hi - lo) * 0.08 || 1;
  const pw = f.w - f.left - f.right;
  const ph = f.h - f.top - f.bottom;
  const x = (v: number) => f.left + ((v - 0.5) / k) * pw;
  const y = (v: number) => f.top + ph - ((v - (lo - pad)) / (hi - lo + 2 * pad)) * ph;
  let body = yAxis(f, lo - pad, hi + pad, y);
  // group means as short bars
  const sums = new Array(k).fill(0);
  const counts = new Array(k).fill(0);
  for (const p of pts) {
    const g = Math.round(p.x) - 1;
    if (g >= 0 && g < k) {
      sums[g] += p.y;
      counts[g]++;
    }
  }
  for (const p of pts) body += `<circle cx="${x(p.x)}" cy="${y(p.y)}" r="3.6" fill="${INK}" fill-opacity="0.55"/>`;
  cats.forEach((c, g) => {
    if (counts[g]) {
      const m = sums[g] / counts[g];
      body += `<line x1="${x(g + 1) - 22}" x2="${x(g + 1) + 22}" y1="${y(m)}" y2="${y(m)}" stroke="${HOT}" stroke-width="3"/>`;
    }
    body += `<text x="${x(g + 1)}" y="${f.top + ph + 15}" text-anchor="middle" font-size="11" fill="#333">${esc(c)}</text>`;
  });
  body += `<line x1="${f.left}" x2="${f.w - f.right}" y1="${f.top + ph}" y2="${f.top + ph}" stroke="#777"/>`;
  body += `<line x1="${f.left + pw - 150}" x2="${f.left + pw - 132}" y1="${f.top + 6}" y2="${f.top + 6}" stroke="${HOT}" stroke-width="3"/><text x="${f.left + pw - 128}" y="${f.top + 10}" font-size="10" fill="#4A5A60">group mean</text>`;
  return shell(ch, f, body);
}

function range(ch: PlacedChart, s: PreviewSheet): string {
  const f = frame(ch);
  const rows: { g: string; min: number; med: number; max: number }[] = [];
  for (let i = 0; i < ch.source.rows; i++) {
    const r = ch.source.row + i;
    const a = num(s, r, ch.source.col + 1), b = num(s, r, ch.source.col + 2), c = num(s, r, ch.source.col + 3);
    if (a !== null && b !== null && c !== null) rows.push({ g: str(s, r, ch.source.col), min: a, med: b, max: c });
  }
  const lo = Math.min(...rows.map((r) => r.min));
  const hi = Math.max(...rows.map((r) => r.max));
  const pad = (hi - lo) * 0.08 || 1;
  const k = Math.max(rows.length, 1);
  const pw = f.w - f.left - f.right;
  const ph = f.h - f.top - f.bottom;
  const x = (i: number) => f.left + ((i + 0.5) / k) * pw;
  const y = (v: number) => f.top + ph - ((v - (lo - pad)) / (hi - lo + 2 * pad)) * ph;
  let body = yAxis(f, lo - pad, hi + pad, y);
  rows.forEach((r, i) => {
    body += `<line x1="${x(i)}" x2="${x(i)}" y1="${y(r.min)}" y2="${y(r.max)}" stroke="${INK}" stroke-width="2"/>`;
    body += `<line x1="${x(i) - 8}" x2="${x(i) + 8}" y1="${y(r.min)}" y2="${y(r.min)}" stroke="${INK}" stroke-width="2"/><line x1="${x(i) - 8}" x2="${x(i) + 8}" y1="${y(r.max)}" y2="${y(r.max)}" stroke="${INK}" stroke-width="2"/>`;
    body += `<circle cx="${x(i)}" cy="${y(r.med)}" r="5" fill="${HOT}"/>`;
    body += `<text x="${x(i)}" y="${f.top + ph + 15}" text-anchor="middle" font-size="11" fill="#333">${esc(r.g)}</text>`;
  });
  return shell(ch, f, body);
}

function scatter(ch: PlacedChart, s: PreviewSheet): string {
  const f = frame(ch);
  const pts = pointsOf(ch, s);
  const xs = pts.map((p) => p.x), ys = pts.map((p) => p.y);
  const xl = Math.min(...xs), xh = Math.max(...xs), yl = Math.min(...ys), yh = Math.max(...ys);
  const px = (xh - xl) * 0.06 || 1, py = (yh - yl) * 0.08 || 1;
  const pw = f.w - f.left - f.right;
  const ph = f.h - f.top - f.bottom;
  const x = (v: number) => f.left + ((v - (xl - px)) / (xh - xl + 2 * px)) * pw;
  const y = (v: number) => f.top + ph - ((v - (yl - py)) / (yh - yl + 2 * py)) * ph;
  let body = yAxis(f, yl - py, yh + py, y);
  body += ticks(xl - px, xh + px, 6).map((t) => `<text x="${x(t)}" y="${f.top + ph + 14}" text-anchor="middle" font-size="10" fill="#4A5A60">${tickText(t)}</text>`).join("");
  for (const p of pts) body += `<circle cx="${x(p.x)}" cy="${y(p.y)}" r="3.6" fill="${INK}" fill-opacity="0.6"/>`;
  body += `<line x1="${f.left}" x2="${f.w - f.right}" y1="${f.top + ph}" y2="${f.top + ph}" stroke="#777"/>`;
  return shell(ch, f, body);
}

/** SVG markup for a placed chart, from the current cell values. */
export function drawChart(ch: PlacedChart, sheet: PreviewSheet): string {
  switch (ch.kind) {
    case "histogram":
      return histogram(ch, sheet);
    case "dots":
      return dots(ch, sheet);
    case "range":
      return range(ch, sheet);
    case "scatter":
      return scatter(ch, sheet);
  }
}
