import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { hasChromium, Session, shot, startBrowser } from "./browser";

describe.skipIf(!hasChromium)("preview page (smoke)", () => {
  let s: Session;
  beforeAll(async () => {
    s = await startBrowser();
  });
  afterAll(async () => {
    await s?.close();
  });

  it("loads without Office: the demo workbook in the grid and the panel at its first step", async () => {
    await s.page.goto(s.base + "preview.html");
    await s.page.waitForSelector("body[data-ready='1']", { timeout: 30000 });
    expect(await s.page.evaluate(() => typeof (window as unknown as { Office?: unknown }).Office)).toBe("undefined");
    expect(await s.page.textContent(`td[data-r="0"][data-c="3"]`)).toBe("Yield (t/ha)");
    expect(await s.page.locator(".wb-tab").allTextContents()).toEqual(["Barley trial", "Grain quality", "Lab readings"]);
    expect(await s.page.getAttribute("#rs-body", "data-step")).toBe("data");
    await s.page.screenshot({ path: shot("00-smoke-preview") });
  });
});
