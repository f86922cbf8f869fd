/**
 * The panel in preview.html (Chromium via playwright-core): every question on the demo
 * workbook, the written block's numbers against the engine's (computed here in Node
 * with the same code path), never writing over filled cells, text staying text, cancel,
 * no network beyond the page's own server; screenshots of each step.
 */
import * as fs from "fs";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Page } from "playwright-core";
import type { AnalysisResult, GroupsResult } from "../../src/analysis/types";
import type { Choices } from "../../taskpane/prepare";
import { analyse, col, demoBook, readAt } from "../unit/block-fixture";
import { hasChromium, Session, SHOTS, shot, startBrowser } from "./browser";

/** Value of the block cell tagged `tag` on the active sheet (data-value holds the raw number). */
async function tagValue(page: Page, tag: string): Promise<number | string> {
  const td = page.locator(`td[data-tag="${tag}"]`).first();
  const raw = await td.getAttribute("data-value");
  return raw !== null ? Number(raw) : ((await td.textContent()) ?? "");
}

/** Raw numbers of a spilled table's row (block-relative to the tagged header cell). */
async function rowValues(page: Page, tag: string, offset: number, cols: number): Promise<(number | string)[]> {
  return page.evaluate(
    ({ tag, offset, cols }) => {
      const head = document.querySelector(`td[data-tag="${tag}"]`) as HTMLElement;
      const r = Number(head.dataset.r) + offset;
      const c0 = Number(head.dataset.c);
      const out: (number | string)[] = [];
      for (let c = c0; c < c0 + cols; c++) {
        const td = document.querySelector(`td[data-r="${r}"][data-c="${c}"]`) as HTMLElement | null;
        out.push(td?.dataset.value !== undefined ? Number(td.dataset.value) : (td?.textContent ?? ""));
      }
      return out;
    },
    { tag, offset, cols },
  );
}

async function ready(page: Page): Promise<void> {
  await page.waitForSelector("body[data-ready='1']", { timeout: 30000 });
}

async function settled(page: Page): Promise<void> {
  await page.waitForFunction(() => (window as any).reshuffle.book.pending === 0 && !(window as any).reshuffle.runner.busy, null, { timeout: 120000 });
  await page.waitForTimeout(150); // the grid redraws on the next frame
}

/** Selects the cell A1 of a sheet in the grid and reads the data in the panel. */
async function readSheet(page: Page, sheet: string): Promise<void> {
  await page.click("#rs-steps [data-step='data']").catch(() => undefined);
  if ((await page.locator("#rs-read").count()) === 0) await page.evaluate(() => (window as any).reshuffle.panel.go("data"));
  await page.click(`.wb-tab[data-sheet="${sheet}"]`);
  await page.click(`td[data-r="0"][data-c="0"]`);
  await page.click("#rs-read");
  await page.waitForSelector("#rs-columns");
}

async function pick(page: Page, id: string, header: string): Promise<void> {
  const value = await page.$eval(`#${id}`, (el, h) => {
    const o = Array.from((el as HTMLSelectElement).options).find((x) => x.textContent!.includes(` ${h} `));
    return o ? o.value : "";
  }, header);
  await page.selectOption(`#${id}`, value);
}

/** Reads the barley trial, asks "do groups differ?" and sets the resamples and where to write. */
async function groupsOptions(page: Page, resamples: string, where: "new" | "beside" | "cell"): Promise<void> {
  await readSheet(page, engine.trial);
  await page.click("#rs-next-question");
  await page.check("input[name=rs-question][value=groups]");
  await page.click("#rs-next-options");
  await page.selectOption("#rs-resamples", resamples);
  await page.selectOption("#rs-where", where);
}

async function runToResults(page: Page): Promise<void> {
  await page.click("#rs-run");
  await page.waitForSelector("#rs-written", { timeout: 120000 });
  await settled(page);
}

/** A tall screenshot of the whole block (the viewport grows for it). */
async function blockShot(page: Page, name: string): Promise<void> {
  const h = await page.evaluate(() => (document.querySelector("#wb-grid") as HTMLElement).scrollHeight);
  await page.setViewportSize({ width: 1400, height: Math.min(4000, Math.max(900, h + 120)) });
  await page.waitForTimeout(200);
  await page.screenshot({ path: shot(name) });
  await page.setViewportSize({ width: 1400, height: 900 });
}

let engine: { trial: string; lab: string; quality: string; run: (sheet: string, c: (region: any) => Choices, o?: object) => Promise<AnalysisResult> };

describe.skipIf(!hasChromium)("the side panel in preview.html", () => {
  let s: Session;
  let page: Page;
  const requests: string[] = [];

  beforeAll(async () => {
    fs.mkdirSync(SHOTS, { recursive: true });
    const { host, trial, lab, quality } = await demoBook();
    engine = {
      trial,
      lab,
      quality,
      run: async (sheet, choices, o = {}) => {
        const region = await readAt(host, sheet);
        return analyse(region, choices(region), o).result;
      },
    };
    s = await startBrowser();
    page = s.page;
    page.on("request", (r) => requests.push(r.url()));
    await page.goto(s.base + "preview.html");
    await ready(page);
  });

  afterAll(async () => {
    await s?.close();
  });

  it("walks Data → Question → Options → Run → Results for 'do the lines differ?' and writes the engine's numbers", async () => {
    await page.screenshot({ path: shot("01-data") });
    expect(await page.textContent("#rs-region")).toContain("'Barley trial'!A1:D41");
    expect(await page.locator("#rs-columns tbody tr").count()).toBe(4);
    await page.click("#rs-next-question");
    await page.waitForSelector("#rs-ready");
    await page.screenshot({ path: shot("02-question") });
    await page.click("#rs-next-options");
    await page.screenshot({ path: shot("03-options") });
    // a run long enough to see the progress bar
    await page.selectOption("#rs-resamples", "99999");
    await page.click("#rs-run");
    await page.waitForFunction(() => Number(document.querySelector("#rs-progress")?.getAttribute("aria-valuenow")) > 5, null, { timeout: 60000 });
    await page.screenshot({ path: shot("04-running") });
    await page.waitForSelector("#rs-written", { timeout: 120000 });
    await settled(page);
    await page.screenshot({ path: shot("05-results") });
    const r = (await engine.run(engine.trial, (g) => ({ question: "groups", values: col(g, "Yield (t/ha)"), groups: col(g, "Line"), blocks: null, primary: "F" }), { resamples: 99999 })) as GroupsResult;
    expect(await tagValue(page, "test.F.p")).toBe(r.f.p);
    expect(await tagValue(page, "test.SNR.p")).toBe(r.snr!.p);
    expect(await tagValue(page, "test.RANK.p")).toBe(r.rank!.p);
    expect(await tagValue(page, "test.classical.p")).toBe(r.classicalF.p);
    const pw = await rowValues(page, "pairwise", 1, 7);
    expect(pw.slice(2)).toEqual([r.pairwise[0].difference, r.pairwise[0].lower, r.pairwise[0].upper, r.pairwise[0].p, r.pairwise[0].pAdjusted]);
    const reading = await page.textContent("#rs-reading");
    expect(reading).toMatch(/evidence that yield differs between the lines/);
    // the Results step says where the block is, carries the caution and shows the block on request
    expect(await page.textContent("#rs-written")).toMatch(/starts at cell A1 on the sheet “Results”/);
    const panelCaution = await page.textContent("#rs-caution");
    expect(panelCaution).toMatch(/^Caution:.*One trial is weak evidence.*randomized.*local recommendations and qualified advice/);
    await page.click(".wb-tab[data-sheet='Barley trial']");
    await page.click("#rs-show");
    await page.waitForTimeout(100);
    const shown = await page.evaluate(() => (window as any).reshuffle.book.active);
    expect(shown).toBe("Results");
    // the caution in the block: rows of the block's width, none cut off, same words as the panel's
    const rows = await page.locator("td[data-tag^='caution']").allTextContents();
    expect(rows.length).toBeGreaterThan(1);
    expect(rows.join(" ")).toBe(panelCaution);
    await page.locator("td[data-tag^='caution']").last().scrollIntoViewIfNeeded();
    const box = await page.locator("td[data-tag='caution']").boundingBox();
    const last = await page.locator("td[data-tag^='caution']").last().boundingBox();
    await page.screenshot({ path: shot("06b-caution"), clip: { x: box!.x - 4, y: box!.y - 4, width: box!.width + 8, height: last!.y + last!.height - box!.y + 8 } });
    await blockShot(page, "06-block-groups");
    // the charts are drawn from the cells
    expect(await page.locator(".wb-chart[data-kind='histogram'] rect").count()).toBeGreaterThan(20);
    expect(await page.locator(".wb-chart[data-kind='dots'] circle").count()).toBe(40);
  });

  /** Checks that each tagged block cell holds exactly the engine's number. */
  const sameAs = (expected: Record<string, (r: any) => number>) => async (p: Page, r: any) => {
    for (const [tag, value] of Object.entries(expected)) expect(await tagValue(p, tag), tag).toBe(value(r));
  };

  /** The lab's before/after columns, for the two questions about two measurements. */
  const labBeforeAfter = (question: "paired" | "association") => ({
    sheet: () => engine.lab,
    set: async (p: Page) => {
      await p.check(`input[name=rs-question][value=${question}]`);
      await pick(p, "rs-first", "Before (mg/L)");
      await pick(p, "rs-second", "After (mg/L)");
    },
    choices: (g: any): Choices => ({ question, first: col(g, "Before (mg/L)"), second: col(g, "After (mg/L)") }),
  });

  const cases: { name: string; sheet: () => string; set: (p: Page) => Promise<void>; choices: (g: any) => Choices; check: (p: Page, r: any) => Promise<void> }[] = [
    {
      name: "07-block-blocked",
      sheet: () => engine.trial,
      set: async (p) => {
        await p.check("input[name=rs-question][value=groups]");
        await pick(p, "rs-blocks", "Farm");
      },
      choices: (g) => ({ question: "groups", values: col(g, "Yield (t/ha)"), groups: col(g, "Line"), blocks: col(g, "Farm"), primary: "F" }),
      check: sameAs({ "test.F.p": (r) => r.f.p, "test.RANK.p": (r) => r.rank.p }),
    },
    {
      name: "08-block-paired",
      ...labBeforeAfter("paired"),
      check: sameAs({ "test.flip.p": (r) => r.signFlip.p, "ci.mean.lo": (r) => r.interval.lower, "test.t.p": (r) => r.pairedT.p }),
    },
    {
      name: "09-block-association",
      ...labBeforeAfter("association"),
      check: sameAs({ "test.pearson.p": (r) => r.pearson.p, "test.spearman.p": (r) => r.spearman.p }),
    },
    {
      name: "10-block-precision",
      sheet: () => engine.trial,
      set: async (p) => {
        await p.check("input[name=rs-question][value=precision]");
        await pick(p, "rs-values", "Yield (t/ha)");
      },
      choices: (g) => ({ question: "precision", values: col(g, "Yield (t/ha)"), statistic: "mean" }),
      check: async (p, r) => {
        const mean = r.intervals.find((i: any) => i.statistic === "mean").result;
        expect(await tagValue(p, "ci.mean")).toBeCloseTo(mean.estimate, 12);
        expect(await rowValues(p, "ci.mean", 0, 3)).toEqual([expect.closeTo(mean.estimate, 12), mean.lower, mean.upper]);
      },
    },
    {
      name: "11-block-traits",
      sheet: () => engine.quality,
      set: async (p) => {
        await p.check("input[name=rs-question][value=traits]");
        for (const box of await p.locator("#rs-traits input").all()) if (!(await box.isChecked())) await box.check();
        await pick(p, "rs-groups", "Line");
      },
      choices: (g) => ({ question: "traits", traits: [col(g, "Protein (%)"), col(g, "Screenings (%)"), col(g, "Height (cm)")], groups: col(g, "Line") }),
      check: sameAs({ "test.permanova.p": (r) => r.permanova.p, "trait.1.p": (r) => r.traits[1].test.p }),
    },
  ];

  for (const c of cases) {
    it(`runs ${c.name.slice(9)} on the demo workbook with the engine's numbers`, async () => {
      await readSheet(page, c.sheet());
      await page.click("#rs-next-question");
      await c.set(page);
      await page.waitForSelector("#rs-ready");
      await page.click("#rs-next-options");
      await page.selectOption("#rs-resamples", "9999");
      await runToResults(page);
      const r = await engine.run(c.sheet(), c.choices);
      await c.check(page, r);
      await blockShot(page, c.name);
    });
  }

  it("never writes over filled cells: free space beside the data, or it asks first", async () => {
    await page.evaluate(() => {
      const { book } = (window as any).reshuffle;
      book.setValue("Barley trial", 2, 6, "my note"); // G3
      book.onChange();
    });
    await groupsOptions(page, "999", "cell");
    await page.fill("#rs-cell", "F1");
    await page.click("#rs-run");
    await page.waitForSelector("#rs-ask", { timeout: 60000 });
    expect(await page.textContent("#rs-message")).toMatch(/not empty.*Nothing has been written/);
    await page.screenshot({ path: shot("12-ask-before-writing") });
    // the offer names the cell it would use: G holds the note, H is the gap
    expect(await page.textContent("#rs-ask-beside")).toBe("Write at I1 (first free space to the right of the data)");
    expect(await page.evaluate(() => (window as any).reshuffle.book.sheet("Barley trial").get(0, 5))).toBeUndefined();
    await page.click("#rs-ask-beside");
    await page.waitForSelector("#rs-written");
    await settled(page);
    const where = await page.textContent("#rs-written");
    expect(where).toMatch(/'Barley trial'!I1:/); // G holds the note, H is the gap
    const kept = await page.evaluate(() => (window as any).reshuffle.book.sheet("Barley trial").get(2, 6).value);
    expect(kept).toBe("my note");
    // the data are untouched
    const data = await page.evaluate(() => {
      const s = (window as any).reshuffle.book.sheet("Barley trial");
      const out: unknown[] = [];
      for (let r = 0; r < 41; r++) for (let c = 0; c < 4; c++) out.push(s.get(r, c)?.value ?? null);
      return out;
    });
    const { BARLEY_TRIAL } = await import("../../taskpane/demo-data");
    expect(data).toEqual(BARLEY_TRIAL.flat());
  });

  it("keeps a label like =1+1 as text, in the data and in the block", async () => {
    await page.click(`.wb-tab[data-sheet="Barley trial"]`);
    page.once("dialog", (d) => void d.accept("=1+1"));
    await page.dblclick(`td[data-r="1"][data-c="1"]`); // B2: HB-07 → "=1+1"
    await page.waitForTimeout(200);
    expect(await page.textContent(`td[data-r="1"][data-c="1"]`)).toBe("=1+1");
    // the whole line is renamed, so it stays a group of ten plots
    await page.evaluate(() => {
      const { book } = (window as any).reshuffle;
      for (let r = 1; r <= 40; r++) if (book.sheet("Barley trial").get(r, 1).value === "HB-07") book.setValue("Barley trial", r, 1, "=1+1");
      book.onChange();
    });
    await groupsOptions(page, "999", "new");
    await runToResults(page);
    const cells = await page.evaluate(() => {
      const { book } = (window as any).reshuffle;
      const s = book.sheet(book.active);
      return [...s.cells.values()].filter((c: any) => c.value === "=1+1").map((c: any) => ({ formula: c.formula ?? null }));
    });
    expect(cells.length).toBeGreaterThanOrEqual(3); // summary, letters, pairwise
    for (const c of cells) expect(c.formula).toBeNull();
    expect(await page.locator("td", { hasText: /^=1\+1$/ }).count()).toBeGreaterThan(0);
    // restore the labels for later tests
    await page.evaluate(() => {
      const { book } = (window as any).reshuffle;
      for (let r = 1; r <= 40; r++) if (book.sheet("Barley trial").get(r, 1).value === "=1+1") book.setValue("Barley trial", r, 1, "HB-07");
      return book.recalculate();
    });
  });

  it("cancel stops a long run at once and writes nothing", async () => {
    const sheetsBefore = await page.evaluate(() => (window as any).reshuffle.book.sheets.length);
    await groupsOptions(page, "999999", "new");
    await page.click("#rs-run");
    await page.waitForFunction(() => Number(document.querySelector("#rs-progress")?.getAttribute("aria-valuenow")) >= 1, null, { timeout: 60000 });
    await page.click("#rs-cancel");
    await page.waitForSelector("#rs-message");
    expect(await page.textContent("#rs-message")).toContain("Cancelled. Nothing was written");
    expect(await page.evaluate(() => (window as any).reshuffle.runner.busy)).toBe(false);
    expect(await page.evaluate(() => (window as any).reshuffle.book.sheets.length)).toBe(sheetsBefore);
    await page.screenshot({ path: shot("13-cancelled") });
    // the panel works again straight away
    await page.click("#rs-back-options");
    await page.selectOption("#rs-resamples", "999");
    await runToResults(page);
  });

  it("runs a one-way analysis of 100,000 rows × 9,999 shuffles in the workers while the panel stays responsive", async () => {
    await page.evaluate(async () => {
      const { host } = (window as any).reshuffle;
      const rows: (string | number)[][] = [["Line", "Yield (t/ha)"]];
      let seed = 2024;
      const rnd = () => (seed = (seed * 1103515245 + 12345) % 2147483648) / 2147483648;
      const lines = ["HB-07", "HB-12", "HB-19", "HB-23"];
      for (let i = 0; i < 100000; i++) {
        const z = (rnd() + rnd() + rnd() - 1.5) * 2;
        rows.push([lines[i % 4], Math.round(100 * (3.6 + 0.1 * (i % 4) + 0.6 * Math.exp(0.45 * z))) / 100]);
      }
      const name = await host.addSheet("Large trial");
      await host.writeTable(name, 0, 0, rows);
    });
    await readSheet(page, "Large trial");
    expect(await page.textContent("#rs-region")).toContain("100,000 rows");
    await page.click("#rs-next-question");
    await page.check("input[name=rs-question][value=groups]");
    await page.waitForSelector("#rs-ready");
    await page.click("#rs-next-options");
    await page.selectOption("#rs-resamples", "9999");
    expect(await page.isChecked("#rs-live")).toBe(false); // large: values by default
    await page.selectOption("#rs-where", "new");
    // the page measures its own longest pause while the workers run
    await page.evaluate(() => {
      const w = window as any;
      w.__gap = 0;
      let last = performance.now();
      w.__timer = setInterval(() => {
        const t = performance.now();
        w.__gap = Math.max(w.__gap, t - last);
        last = t;
      }, 10);
    });
    await page.click("#rs-run");
    await page.waitForFunction(() => (window as any).reshuffle.runner.busy);
    const during: { busy: boolean; text: string }[] = [];
    while (during.length < 200) {
      const a = await page.evaluate(() => ({ busy: (window as any).reshuffle.runner.busy, text: document.querySelector("#rs-progress-text")?.textContent ?? "" }));
      during.push(a);
      if (!a.busy) break;
      await page.waitForTimeout(100);
    }
    expect(during.filter((a) => a.busy).length).toBeGreaterThan(1); // the page answered while the workers were busy
    expect(new Set(during.filter((a) => a.busy).map((a) => a.text)).size).toBeGreaterThan(1); // and its progress moved
    await page.waitForSelector("#rs-written", { timeout: 120000 });
    await settled(page);
    const figures = await page.evaluate(() => {
      const w = window as any;
      clearInterval(w.__timer);
      return { workerMs: w.reshuffle.runner.lastMs, panelSeconds: w.reshuffle.panel.lastSeconds, longestPauseMs: w.__gap };
    });
    fs.writeFileSync(SHOTS + "/../panel-large-run.json", JSON.stringify({ rows: 100000, resamples: 9999, ...figures }, null, 2));
    console.log(`100,000 rows × 9,999 shuffles through the panel's workers: ${Math.round(figures.workerMs)} ms (longest page pause ${Math.round(figures.longestPauseMs)} ms)`);
    const method = (await page.locator("td[data-tag^='method']").allTextContents()).join(" ");
    expect(method).toContain("same 9,999 shuffles");
    const formulas = await page.evaluate(() => {
      const { book } = (window as any).reshuffle;
      return [...book.sheet(book.active).cells.values()].filter((c: any) => c.formula !== undefined).length;
    });
    expect(formulas).toBe(0);
    await page.screenshot({ path: shot("14-large-data") });
  });

  it("makes no network calls beyond its own page", () => {
    expect(requests.length).toBeGreaterThan(0);
    for (const u of requests) expect(u.startsWith(s.base) || u.startsWith("data:")).toBe(true);
  });
});
