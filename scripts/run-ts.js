#!/usr/bin/env node
// Runs a TypeScript entry point (benchmarks, calibration): bundles it with esbuild into a
// temporary file for Node, then runs it. Usage: node scripts/run-ts.js FILE.ts [args…]
const esbuild = require("esbuild");
const path = require("path");
const os = require("os");
const fs = require("fs");

const entry = process.argv[2];
if (!entry) {
  console.error("usage: node scripts/run-ts.js FILE.ts");
  process.exit(2);
}
const out = path.join(fs.mkdtempSync(path.join(os.tmpdir(), "reshuffle-")), "run.js");
esbuild.buildSync({ entryPoints: [entry], bundle: true, platform: "node", target: "node20", outfile: out, sourcemap: "inline", logLevel: "warning" });
process.argv.splice(1, 2, out);
require(out);
