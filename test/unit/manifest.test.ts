import * as fs from "fs";
import * as path from "path";
import { describe, expect, it } from "vitest";
import { checkManifest } from "../../scripts/manifest-check";

// The manifest rules are the add-in platform's (shared runtime: one resource id for the
// runtime, the functions page and the function file; lifetime long); the checker must
// pass the real manifest and catch each kind of breakage.
const xml = fs.readFileSync(path.resolve(__dirname, "../../manifest.xml"), "utf8");

describe("manifest check", () => {
  it("passes the project manifest", () => {
    expect(checkManifest(xml)).toEqual([]);
  });

  const broken: [string, (s: string) => string, RegExp][] = [
    ["undefined resid", (s) => s.replace('resid="Functions.Metadata.Url"', 'resid="Functions.Meta.Url"'), /not defined/],
    ["two origins", (s) => s.replace("https://localhost:3000/functions.js", "https://example.org/functions.js"), /more than one origin/],
    ["plain http", (s) => s.replace("https://localhost:3000/functions.json", "http://localhost:3000/functions.json"), /not https/],
    ["wrong namespace", (s) => s.replace('<bt:String id="Functions.Namespace" DefaultValue="RS"/>', '<bt:String id="Functions.Namespace" DefaultValue="XX"/>'), /namespace/],
    ["short lifetime", (s) => s.replace('lifetime="long"', 'lifetime="short"'), /lifetime="long"/],
    ["split runtime", (s) => s.replace('<FunctionFile resid="Taskpane.Url"/>', '<FunctionFile resid="Functions.Script.Url"/>'), /one resource id/],
    ["no shared runtime requirement", (s) => s.replace('<Set Name="SharedRuntime" MinVersion="1.1"/>', ""), /SharedRuntime/],
    ["duplicate id", (s) => s.replace('<bt:String id="Group.Label" DefaultValue="Reshuffle"/>', '<bt:String id="Group.Label" DefaultValue="Reshuffle"/><bt:String id="Group.Label" DefaultValue="X"/>'), /defined twice/],
  ];
  for (const [name, mutate, message] of broken) {
    it(`catches a broken copy: ${name}`, () => {
      const copy = mutate(xml);
      expect(copy).not.toBe(xml);
      const errors = checkManifest(copy);
      expect(errors.join("\n")).toMatch(message);
    });
  }
});
