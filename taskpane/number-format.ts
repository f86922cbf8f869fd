/**
 * The number formats the results block uses, and a small renderer of exactly those
 * formats for the preview grid (Excel renders them itself).
 *
 * Supported: "General", "@", digit patterns with optional thousands separator and
 * fixed decimals ("0", "0.00", "#,##0", "#,##0.0"), a trailing "%", quoted literals,
 * and one leading condition section such as `[<0.0001]"< 0.0001";0.0000`.
 */

/** p-values: four decimals, and "< 0.0001" below that (never a bare 0). */
export const P_FORMAT = '[<0.0001]"< 0.0001";0.0000';
export const INT_FORMAT = "#,##0";
export const TEXT_FORMAT = "@";
/** Fixed decimals, with a thousands separator. */
export function decimals(d: number): string {
  return d <= 0 ? "#,##0" : `#,##0.${"0".repeat(d)}`;
}

/** Decimals that show a quantity of this typical size with about 3–4 significant digits. */
export function decimalsFor(scale: number): number {
  const a = Math.abs(scale);
  if (!Number.isFinite(a) || a === 0) return 2;
  if (a >= 1000) return 0;
  if (a >= 100) return 1;
  if (a >= 10) return 2;
  if (a >= 1) return 2;
  if (a >= 0.1) return 3;
  return 4;
}

interface Section {
  condition?: { op: string; limit: number };
  body: string;
}

function splitSections(format: string): string[] {
  const out: string[] = [];
  let cur = "";
  let quoted = false;
  for (const ch of format) {
    if (ch === '"') quoted = !quoted;
    if (ch === ";" && !quoted) {
      out.push(cur);
      cur = "";
    } else cur += ch;
  }
  out.push(cur);
  return out;
}

function parseSection(s: string): Section {
  const m = /^\[(<=|>=|<>|<|>|=)(-?[0-9.]+(?:[eE]-?[0-9]+)?)\]/.exec(s);
  if (m) return { condition: { op: m[1], limit: Number(m[2]) }, body: s.slice(m[0].length) };
  return { body: s };
}

function holds(op: string, x: number, limit: number): boolean {
  switch (op) {
    case "<": return x < limit;
    case "<=": return x <= limit;
    case ">": return x > limit;
    case ">=": return x >= limit;
    case "=": return x === limit;
    default: return x !== limit;
  }
}

/** Excel's "General" for a number: at most 11 characters (sign and point included). */
export function general(x: number): string {
  if (!Number.isFinite(x)) return x > 0 ? "∞" : x < 0 ? "-∞" : "#NUM!";
  if (x === 0) return "0";
  const a = Math.abs(x);
  if (a >= 1e11 || a < 1e-9) return x.toExponential(5).replace(/\.?0+e/, "E");
  const intDigits = Math.max(1, Math.floor(Math.log10(a)) + 1);
  const room = 11 - (x < 0 ? 1 : 0) - intDigits - 1;
  return String(Number(x.toFixed(Math.max(0, Math.min(room, 15)))));
}

function withThousands(intPart: string): string {
  return intPart.replace(/\B(?=(\d{3})+(?!\d))/g, ",");
}

/** Renders a body such as `#,##0.00`, `0.0%` or `"< 0.0001"` for x (sign included). */
function renderBody(body: string, x: number, signed: boolean): string {
  let out = "";
  let i = 0;
  let numberDone = false;
  const pct = /%/.test(body.replace(/"[^"]*"/g, ""));
  const v = pct ? x * 100 : x;
  while (i < body.length) {
    const ch = body[i];
    if (ch === '"') {
      const end = body.indexOf('"', i + 1);
      out += body.slice(i + 1, end < 0 ? body.length : end);
      i = end < 0 ? body.length : end + 1;
    } else if (ch === "\\" && i + 1 < body.length) {
      out += body[i + 1];
      i += 2;
    } else if ((ch === "0" || ch === "#") && !numberDone) {
      let j = i;
      while (j < body.length && /[0#,.]/.test(body[j])) j++;
      const pattern = body.slice(i, j);
      const dot = pattern.indexOf(".");
      const dec = dot < 0 ? 0 : pattern.length - dot - 1;
      const grouped = pattern.includes(",");
      const fixed = Math.abs(v).toFixed(dec);
      const [ip, fp] = fixed.split(".");
      let s = grouped ? withThousands(ip) : ip;
      if (fp !== undefined) s += "." + fp;
      const isZero = Number(fixed) === 0;
      if (signed && v < 0 && !isZero) s = "-" + s;
      out += s;
      numberDone = true;
      i = j;
    } else {
      out += ch;
      i++;
    }
  }
  return out;
}

/** The text Excel shows for value x under `format` (for the formats listed above). */
export function formatNumber(x: number, format: string | undefined): string {
  if (!format || format === "General" || format === "@") return general(x);
  if (!Number.isFinite(x)) return general(x);
  const sections = splitSections(format).map(parseSection);
  if (sections[0].condition) {
    const c = sections[0].condition;
    if (holds(c.op, x, c.limit)) return renderBody(sections[0].body, x, true);
    const rest = sections[1] ?? { body: "General" };
    return rest.body === "General" ? general(x) : renderBody(rest.body, x, true);
  }
  if (sections.length >= 2 && x < 0) return renderBody(sections[1].body, -x, false);
  if (sections.length >= 3 && x === 0) return renderBody(sections[2].body, x, false);
  return renderBody(sections[0].body, x, true);
}

/** A p-value as text for sentences: "0.0031", "< 0.0001". */
export function pText(p: number): string {
  return formatNumber(p, P_FORMAT);
}

/** "p = 0.0031" or "p < 0.0001" (never "p = < 0.0001"). */
export function pEquals(p: number): string {
  const t = pText(p);
  return t.startsWith("<") ? `p ${t}` : `p = ${t}`;
}

/** A count with thousands separators: 1680 → "1,680". */
export function countText(n: number): string {
  return formatNumber(n, INT_FORMAT);
}
