/**
 * Preview entry: the add-in in a plain browser (no Office): an in-memory workbook with
 * the demo data, drawn as a grid, and the real panel beside it. `window.reshuffle`
 * exposes the pieces for the browser tests.
 */
import { sheetFunctions } from "../functions/registry";
import { writeDemo } from "./demo";
import { GRID_CSS, injectStyle } from "./panel-style";
import { Panel } from "./panel";
import { PreviewGrid } from "./preview-grid";
import { PreviewHost } from "./preview-host";
import { PreviewWorkbook } from "./preview-workbook";
import { AnalysisRunner } from "./runner";

async function main(): Promise<void> {
  injectStyle("rs-grid-css", GRID_CSS);
  const book = new PreviewWorkbook(sheetFunctions);
  const host = new PreviewHost(book);
  const wbEl = document.getElementById("workbook")!;
  wbEl.classList.add("wb");
  const grid = new PreviewGrid(book, wbEl);
  let queued = false;
  book.onChange = () => {
    if (queued) return;
    queued = true;
    requestAnimationFrame(() => {
      queued = false;
      grid.draw();
    });
  };
  await writeDemo(host);
  grid.draw();
  const runner = new AnalysisRunner("analysis-worker.js");
  const panel = new Panel(document.getElementById("panel")!, { host, runner, loadDemo: () => writeDemo(host).then(() => undefined) });
  await panel.readData();
  (window as unknown as { reshuffle: unknown }).reshuffle = { book, host, grid, panel, runner, ready: true };
  document.body.dataset.ready = "1";
}

void main();
