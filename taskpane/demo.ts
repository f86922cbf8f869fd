/**
 * Writes the invented demo data (demo-data.ts: the barley trial, its grain quality and
 * the lab's paired readings) onto new sheets through any host, and
 * selects the trial's first cell, so the panel can read it at once.
 */
import { BARLEY_QUALITY, BARLEY_TRIAL, LAB_PAIRED } from "./demo-data";
import type { WorkbookHost } from "./host";

export const DEMO_TRIAL_SHEET = "Barley trial";
export const DEMO_LAB_SHEET = "Lab readings";
export const DEMO_QUALITY_SHEET = "Grain quality";

export async function writeDemo(host: WorkbookHost): Promise<{ trial: string; lab: string; quality: string }> {
  const trial = await host.addSheet(DEMO_TRIAL_SHEET);
  await host.writeTable(trial, 0, 0, BARLEY_TRIAL);
  const quality = await host.addSheet(DEMO_QUALITY_SHEET);
  await host.writeTable(quality, 0, 0, BARLEY_QUALITY);
  const lab = await host.addSheet(DEMO_LAB_SHEET);
  await host.writeTable(lab, 0, 0, LAB_PAIRED);
  await host.select({ sheet: trial, top: 0, left: 0, rows: 1, cols: 1 });
  return { trial, lab, quality };
}
