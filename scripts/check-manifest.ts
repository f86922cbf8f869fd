/**
 * `npm run check:manifest [FILE]`: checks a manifest offline — well-formed XML
 * (xmllint), then the add-in's own rules (scripts/manifest-check.ts). Exit 1 on failure.
 * When FILE is dist/manifest.xml, also checks that the files it names were built.
 */
import { execFileSync } from "child_process";
import * as fs from "fs";
import * as path from "path";
import { checkManifest } from "./manifest-check";

const file = process.argv[2] ?? "manifest.xml";
const xml = fs.readFileSync(file, "utf8");
const errors: string[] = [];
try {
  execFileSync("xmllint", ["--noout", file], { stdio: ["ignore", "ignore", "pipe"] });
} catch (e: any) {
  if (e.code === "ENOENT") {
    const msg = "xmllint not found (Debian package libxml2-utils): well-formedness not checked";
    if (process.env.CI) errors.push(msg);
    else console.warn(`WARNING: ${msg}`);
  } else errors.push(`not well-formed XML: ${String(e.stderr ?? e.message).trim()}`);
}
errors.push(...checkManifest(xml));
if (path.basename(path.dirname(path.resolve(file))) === "dist") {
  const base = /<SourceLocation\s+DefaultValue="(https:\/\/[^"]+?)taskpane\.html"/.exec(xml)?.[1];
  for (const m of xml.matchAll(/DefaultValue="(https:\/\/[^"]+\.(?:html|js|json|png))"/g)) {
    const rel = base && m[1].startsWith(base) ? m[1].slice(base.length) : null;
    if (rel && !fs.existsSync(path.join(path.dirname(file), rel))) errors.push(`${m[1]} is named in the manifest but ${rel} is not in dist/`);
  }
}
if (errors.length) {
  console.error(`${file}: ${errors.length} problem(s)\n  - ${errors.join("\n  - ")}`);
  process.exit(1);
}
console.log(`${file}: manifest OK`);
