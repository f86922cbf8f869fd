/**
 * The panel's and the preview grid's styles, injected from TypeScript (the build has
 * no CSS loader). Own palette: deep teal ink, warm amber accent.
 */
export const PANEL_CSS = `
:root { --ink:#1E4D5C; --ink2:#2F6B7D; --amber:#D9822B; --soft:#EEF3F4; --line:#D3DDE0; --text:#1F2A2E; --muted:#5B6B70; --bad:#A3261B; --ok:#2E7D4F; }
.rs-panel { font: 14px/1.45 "Segoe UI", system-ui, -apple-system, "Helvetica Neue", Arial, sans-serif; color: var(--text); background:#fff; display:flex; flex-direction:column; height:100%; box-sizing:border-box; }
.rs-panel * { box-sizing: border-box; }
.rs-head { background: var(--ink); color:#fff; padding: 12px 16px 10px; }
.rs-brand { font-size: 18px; font-weight: 700; letter-spacing: .2px; }
.rs-brand small { font-weight: 400; opacity: .85; font-size: 12px; margin-left: 6px; }
.rs-steps { display:flex; gap:4px; margin-top:10px; }
.rs-step { flex:1; text-align:center; white-space:nowrap; font-size:11px; padding:4px 0; border-radius:3px; background: rgba(255,255,255,.12); color:#d6e4e8; cursor:default; user-select:none; }
.rs-step.done { background: rgba(255,255,255,.25); color:#fff; cursor:pointer; }
.rs-step.on { background:#fff; color: var(--ink); font-weight:700; }
.rs-body { padding: 14px 16px 18px; overflow:auto; flex:1; }
.rs-body h2 { font-size: 16px; margin: 2px 0 6px; color: var(--ink); }
.rs-body p.help { margin: 0 0 10px; color: var(--muted); font-size: 13px; }
.rs-card { border:1px solid var(--line); border-radius:6px; padding:10px 12px; margin: 0 0 8px; display:block; cursor:pointer; background:#fff; }
.rs-card:hover { border-color: var(--ink2); }
.rs-card.on { border-color: var(--ink); box-shadow: 0 0 0 2px rgba(30,77,92,.18); background: #F6FAFB; }
.rs-card input { margin-right: 8px; }
.rs-card b { color: var(--ink); }
.rs-card .eg { display:block; color: var(--muted); font-size: 12.5px; margin-left: 24px; }
.rs-field { margin: 10px 0; }
.rs-field label.t { display:block; font-weight:600; margin-bottom:3px; }
.rs-field .hint { display:block; color: var(--muted); font-size: 12px; margin-top:2px; }
.rs-field select, .rs-field input[type=number], .rs-field input[type=text] { width:100%; padding:6px 7px; border:1px solid #b9c7cb; border-radius:4px; font: inherit; background:#fff; }
.rs-row { display:flex; gap:10px; }
.rs-row > .rs-field { flex:1; }
.rs-btns { display:flex; gap:8px; margin-top: 14px; flex-wrap: wrap; }
.rs-btn { font: inherit; font-weight:600; padding: 8px 14px; border-radius: 4px; border: 1px solid var(--ink); background:#fff; color: var(--ink); cursor:pointer; }
.rs-btn.primary { background: var(--ink); color:#fff; }
.rs-btn.primary:disabled { background:#9bb0b6; border-color:#9bb0b6; cursor:not-allowed; }
.rs-btn.danger { border-color: var(--bad); color: var(--bad); }
.rs-box { border-radius: 6px; padding: 9px 11px; margin: 10px 0; font-size: 13.5px; }
.rs-box.info { background: var(--soft); }
.rs-box.bad { background: #FBE9E7; color: var(--bad); }
.rs-box.ok { background: #E8F3EC; color: #1F5A37; }
.rs-box.warn { background: #FFF6DC; color: #6B4A07; }
.rs-cols { width:100%; border-collapse: collapse; font-size: 12.5px; margin-top: 6px; }
.rs-cols th { text-align:left; color: var(--muted); font-weight:600; border-bottom:1px solid var(--line); padding: 3px 4px; }
.rs-cols td { border-bottom:1px solid #edf1f2; padding: 4px; }
.rs-kind { display:inline-block; padding: 0 6px; border-radius: 9px; font-size: 11.5px; background:#E3ECEF; color: var(--ink); }
.rs-kind.labels { background:#FCEBD7; color:#7A4A12; }
.rs-kind.mixed { background:#FBE9E7; color: var(--bad); }
.rs-bar { height: 14px; background: #E3ECEF; border-radius: 7px; overflow:hidden; margin: 12px 0 6px; }
.rs-bar > div { height:100%; width:0; background: linear-gradient(90deg, var(--ink2), var(--ink)); }
.rs-reading p { margin: 0 0 8px; }
.rs-reading p:first-child { font-weight: 700; }
.rs-checks label { display:block; margin: 2px 0; }
details.rs-more summary { cursor:pointer; color: var(--ink); font-weight:600; margin: 8px 0; }
`;

export const GRID_CSS = `
.wb { display:flex; flex-direction:column; height:100%; font: 13px/1.3 "Segoe UI", system-ui, Arial, sans-serif; background:#fff; }
.wb-bar { display:flex; align-items:center; gap:8px; padding: 4px 8px; border-bottom:1px solid #d4d9db; background:#F7F8F8; }
.wb-name { min-width: 90px; border:1px solid #c9d0d2; background:#fff; padding: 2px 6px; font-size:12px; }
.wb-fx { color:#888; font-style: italic; }
.wb-formula { flex:1; border:1px solid #c9d0d2; background:#fff; padding: 2px 6px; font: 12px Consolas, "DejaVu Sans Mono", monospace; min-height: 20px; white-space: nowrap; overflow:hidden; text-overflow: ellipsis; }
.wb-scroll { flex:1; overflow:auto; position:relative; }
.wb-grid { position:relative; display:inline-block; }
.wb-table { border-collapse: collapse; table-layout: fixed; }
.wb-table th { background:#F1F3F3; color:#555; font-weight:400; font-size:11.5px; border:1px solid #d9dede; height:21px; position: sticky; top:0; z-index:1; }
.wb-table tbody th { position: sticky; left:0; z-index:1; }
.wb-table td { border:1px solid #e6eaea; height:21px; padding: 1px 4px; white-space: nowrap; overflow:hidden; text-overflow: clip; font-size:13px; vertical-align: bottom; }
.wb-table td.span { overflow: visible; }
.wb-table td.sel { outline: 2px solid #1E7B4A; outline-offset:-2px; background-color: rgba(30,123,74,.06); }
.wb-table td.err { color:#A3261B; }
.wb-chart { position:absolute; box-shadow: 0 1px 4px rgba(0,0,0,.18); background:#fff; }
.wb-more { padding: 6px 44px; color:#666; font-style: italic; }
.wb-tabs { display:flex; gap:2px; padding: 0 8px; border-top:1px solid #d4d9db; background:#F1F3F3; overflow-x:auto; flex:none; }
.wb-tab { padding: 5px 14px; cursor:pointer; white-space:nowrap; color:#444; border-bottom: 3px solid transparent; }
.wb-tab.on { background:#fff; color:#1E7B4A; font-weight:600; border-bottom-color:#1E7B4A; }
`;

/** Adds a style element once. */
export function injectStyle(id: string, css: string): void {
  if (typeof document === "undefined" || document.getElementById(id)) return;
  const el = document.createElement("style");
  el.id = id;
  el.textContent = css;
  document.head.appendChild(el);
}
