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

  it("loads the preview and shows a p-value from the engine", async () => {
    await s.page.goto(s.base + "preview.html");
    const p = await s.page.locator("#p").textContent();
    expect(Number(p)).toBeGreaterThan(0);
    expect(Number(p)).toBeLessThanOrEqual(1);
    await s.page.screenshot({ path: shot("smoke-preview"), fullPage: true });
  });
});
