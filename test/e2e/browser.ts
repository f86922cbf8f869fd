/**
 * Browser-test support: serves dist/ on a free loopback port and drives Debian's
 * Chromium with playwright-core (never a downloaded browser). When Chromium is
 * missing the tests are skipped with a loud message, unless CI is set: then they fail.
 */
import * as fs from "fs";
import * as os from "os";
import * as path from "path";
import type { Server } from "http";
import { chromium, BrowserContext, Page } from "playwright-core";
import { serveStatic } from "../../scripts/static-server";

export const CHROMIUM = process.env.CHROMIUM_PATH ?? "/usr/bin/chromium";
export const hasChromium = fs.existsSync(CHROMIUM);
export const SHOTS = path.resolve(__dirname, "../../test-results/screenshots");

if (!hasChromium) {
  const msg = `\n\n*** BROWSER TESTS SKIPPED: ${CHROMIUM} not found. Install it with: apt-get install -y chromium ***\n\n`;
  if (process.env.CI) throw new Error(msg);
  console.warn(msg);
}

export interface Session {
  page: Page;
  context: BrowserContext;
  base: string;
  close(): Promise<void>;
}

/** Starts the server and a fresh Chromium profile; returns a page at base URL. */
export async function startBrowser(): Promise<Session> {
  const dist = path.resolve(__dirname, "../../dist");
  if (!fs.existsSync(path.join(dist, "preview.html"))) throw new Error("dist/preview.html missing: run `npm run build` first");
  const server: Server = await serveStatic({ root: dist, port: 0 });
  const address = server.address();
  const port = typeof address === "object" && address ? address.port : 0;
  const profile = fs.mkdtempSync(path.join(os.tmpdir(), "reshuffle-chromium-"));
  const context = await chromium.launchPersistentContext(profile, {
    executablePath: CHROMIUM,
    headless: true,
    viewport: { width: 1400, height: 900 },
    args: [
      "--no-sandbox", "--disable-gpu", "--disable-quic", "--no-first-run",
      "--disable-background-networking", "--disable-component-update", "--disable-sync",
    ],
  });
  const page = context.pages()[0] ?? (await context.newPage());
  const errors: string[] = [];
  page.on("pageerror", (e) => errors.push(String(e)));
  fs.mkdirSync(SHOTS, { recursive: true });
  return {
    page,
    context,
    base: `http://127.0.0.1:${port}/`,
    async close() {
      await context.close();
      await new Promise<void>((r) => server.close(() => r()));
      fs.rmSync(profile, { recursive: true, force: true });
      if (errors.length) throw new Error(`page errors: ${errors.join("; ")}`);
    },
  };
}

export function shot(name: string): string {
  return path.join(SHOTS, `${name}.png`);
}
