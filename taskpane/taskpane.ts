/**
 * Task pane entry inside Excel (shared runtime: this page also runs the sheet
 * functions, loaded from their own bundle — never imported here). The panel drives
 * the workbook through ExcelHost; analyses run in analysis-worker.js.
 */
import { writeDemo } from "./demo";
import { ExcelHost } from "./excel-host";
import { Panel } from "./panel";
import { AnalysisRunner } from "./runner";

function start(): void {
  const root = document.getElementById("app");
  if (!root) return;
  root.style.height = "100vh";
  const host = new ExcelHost();
  const runner = new AnalysisRunner("analysis-worker.js");
  const panel = new Panel(root, { host, runner, loadDemo: () => writeDemo(host).then(() => undefined) });
  void panel.readData(true);
}

if (typeof Office !== "undefined" && typeof Office.onReady === "function") {
  void Office.onReady((info) => {
    if (info.host === Office.HostType.Excel) start();
    else {
      const root = document.getElementById("app");
      if (root) root.textContent = "Reshuffle runs inside Excel.";
    }
  });
} else {
  const root = document.getElementById("app");
  if (root) root.innerHTML = 'Office is not available on this page. To try Reshuffle without Excel, open <a href="preview.html">the preview</a>.';
}
