import * as fs from "fs";
import * as path from "path";
import { afterEach, describe, expect, it } from "vitest";
import { checkManifest } from "../../scripts/manifest-check";

// Team hosting: `ADDIN_URL=https://host/path/ npm run build` must point every manifest URL there.
const configFactory = require("../../webpack.config.js");
const manifest = fs.readFileSync(path.resolve(__dirname, "../../manifest.xml"), "utf8");

function manifestTransform(): (content: Buffer) => string {
  const config = configFactory({}, { mode: "production" });
  const copy = config.plugins.find((p: any) => p.constructor.name === "CopyPlugin");
  const pattern = copy.patterns.find((p: any) => p.to === "manifest.xml");
  return pattern.transform;
}

describe("webpack config: manifest URLs", () => {
  const saved = process.env.ADDIN_URL;
  afterEach(() => {
    if (saved === undefined) delete process.env.ADDIN_URL;
    else process.env.ADDIN_URL = saved;
  });

  it("keeps https://localhost:3000/ by default", () => {
    delete process.env.ADDIN_URL;
    const out = manifestTransform()(Buffer.from(manifest));
    expect(out).toBe(manifest);
  });

  it("rewrites every URL to ADDIN_URL, and the result still passes the manifest check", () => {
    process.env.ADDIN_URL = "https://stats.example.org/reshuffle"; // no trailing slash: one is added
    const out = manifestTransform()(Buffer.from(manifest));
    expect(out).not.toContain("localhost");
    expect(out).toContain("https://stats.example.org/reshuffle/functions.json");
    expect(out).toContain("https://stats.example.org/reshuffle/taskpane.html");
    expect(checkManifest(out)).toEqual([]);
  });

  it("refuses a plain-http ADDIN_URL", () => {
    process.env.ADDIN_URL = "http://stats.example.org/";
    expect(() => configFactory({}, { mode: "production" })).toThrow(/https/);
  });
});
