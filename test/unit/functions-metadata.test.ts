/**
 * The custom-functions metadata, generated from functions/functions.ts with the
 * metadata package's own generator (the one the webpack plugin runs), checked against
 * the sheet-function table of the design (/work/shared/design.md): names, parameter
 * order, optional flags, spilled results, cancelable and parameter addresses. Then the
 * entry is bundled with the plugin's own loader (which appends the associate calls) and
 * evaluated without Office.js and with a stand-in runtime.
 */
import * as esbuild from "esbuild";
import * as fs from "fs";
import * as path from "path";
import * as vm from "vm";
import { describe, expect, it } from "vitest";
import { generateCustomFunctionsMetadata } from "custom-functions-metadata";
import { FUNCTION_SPECS } from "../../functions/catalog";

const INPUT = path.resolve(__dirname, "../../functions/functions.ts");
const DESIGN = path.resolve(__dirname, "../../../shared/design.md");
const README = path.resolve(__dirname, "../../README.md");

interface DesignRow {
  name: string;
  params: { name: string; optional: boolean }[];
}

/** Rows "| `RS.NAME(a, b, [c])` | … |" of a sheet-function table (the design's by default). */
function designTable(file = DESIGN): DesignRow[] {
  const rows: DesignRow[] = [];
  for (const line of fs.readFileSync(file, "utf8").split("\n")) {
    const m = /^\|\s*`RS\.([A-Z]+)\(([^)]*)\)`/.exec(line);
    if (!m) continue;
    const params = m[2]
      .split(",")
      .map((s) => s.trim())
      .filter((s) => s !== "")
      .map((s) => (s.startsWith("[") ? { name: s.slice(1, -1), optional: true } : { name: s, optional: false }));
    rows.push({ name: m[1], params });
  }
  return rows;
}

async function generate() {
  const result = await generateCustomFunctionsMetadata(INPUT);
  return { result, metadata: JSON.parse(result.metadataJson) as { functions: any[] } };
}

describe("functions.json from functions/functions.ts", () => {
  it("the README's function table matches functions.json (names, parameter order, optional flags)", async () => {
    const { metadata } = await generate();
    const readme = designTable(README);
    expect(readme.map((r) => r.name)).toEqual(metadata.functions.map((f) => f.id));
    for (const [i, f] of metadata.functions.entries()) {
      const params = f.parameters.map((p: any) => ({ name: p.name, optional: Boolean(p.optional) }));
      expect(readme[i].params, f.id).toEqual(params);
    }
  });

  it("the design table has the 14 sheet functions", () => {
    expect(designTable().map((r) => r.name)).toEqual([
      "GROUPTEST", "STAT", "SNR", "TWOTEST", "PAIRTEST", "BLOCKTEST", "CORRTEST",
      "INTERVAL", "DIFFINTERVAL", "PAIRWISE", "LETTERS", "GROUPSUMMARY", "TRAITTEST", "NULLHIST",
    ]);
  });

  it("names, parameter order and optional flags match the design; generation has no errors", async () => {
    const { result, metadata } = await generate();
    expect(result.errors).toEqual([]);
    const design = designTable();
    expect(metadata.functions.map((f) => f.id)).toEqual(design.map((r) => r.name));
    for (const [i, f] of metadata.functions.entries()) {
      const d = design[i];
      expect(f.name).toBe(d.name);
      expect(f.parameters.map((p: any) => ({ name: p.name, optional: p.optional === true }))).toEqual(d.params);
      expect(f.description.length).toBeGreaterThan(30);
      for (const p of f.parameters) expect((p.description ?? "").length, `${f.id}.${p.name}`).toBeGreaterThan(10);
    }
  });

  it("every function is cancelable and receives its parameter addresses; ranges are matrices; tables spill", async () => {
    const { metadata } = await generate();
    for (const f of metadata.functions) {
      const spec = FUNCTION_SPECS.find((s) => s.name === f.id)!;
      expect(f.options).toEqual({ cancelable: true, requiresParameterAddresses: true });
      for (const [j, p] of f.parameters.entries()) {
        expect(p.dimensionality === "matrix", `${f.id}.${p.name}`).toBe(spec.params[j].range);
      }
      expect(f.result?.dimensionality === "matrix", f.id).toBe(spec.spills);
    }
  });

  it("the implementation catalog declares the same names and parameters", () => {
    expect(FUNCTION_SPECS.map((s) => ({ name: s.name, params: s.params.map((p) => ({ name: p.name, optional: p.optional })) }))).toEqual(designTable());
  });
});

describe("the bundled custom-functions entry", () => {
  async function bundle(): Promise<{ code: string; source: string }> {
    const { result } = await generate();
    // The plugin's loader appends one CustomFunctions.associate call per function.
    // eslint-disable-next-line @typescript-eslint/no-var-requires
    const Plugin = require("custom-functions-metadata-plugin/lib/customfunctionsplugin.js");
    Plugin.generateResults[INPUT] = result;
    // eslint-disable-next-line @typescript-eslint/no-var-requires
    const loader = require("custom-functions-metadata-plugin/lib/loader.js");
    const source: string = loader.call({ getOptions: () => ({ input: INPUT, file: INPUT }) }, fs.readFileSync(INPUT, "utf8"));
    const out = await esbuild.build({
      entryPoints: [INPUT],
      bundle: true,
      write: false,
      format: "iife",
      platform: "browser",
      logLevel: "silent",
      plugins: [
        {
          name: "associate-calls",
          setup(build) {
            build.onLoad({ filter: /functions[\\/]functions\.ts$/ }, () => ({ contents: source, loader: "ts", resolveDir: path.dirname(INPUT) }));
          },
        },
      ],
    });
    return { code: out.outputFiles[0].text, source };
  }

  const baseContext = () => ({ console, setTimeout, clearTimeout, queueMicrotask, structuredClone, TextEncoder, TextDecoder });

  it("the loader appends exactly one associate call per function", async () => {
    const { source } = await bundle();
    const calls = source.match(/CustomFunctions\.associate\("([A-Z]+)", ([A-Z]+)\);/g) ?? [];
    expect(calls.length).toBe(14);
    expect(source.split("CustomFunctions.associate(").length - 1).toBe(14);
  });

  it("loads where CustomFunctions is undefined (preview, tests): the stand-in records all 14 associations and the functions answer", async () => {
    const { code } = await bundle();
    const ctx = vm.createContext(baseContext());
    expect(() => vm.runInContext(code, ctx)).not.toThrow();
    const cf = (ctx as any).CustomFunctions;
    expect(cf.isStandIn).toBe(true);
    expect([...cf.associations.keys()]).toEqual(designTable().map((r) => r.name));
    const snr = cf.associations.get("SNR");
    // Dobson (1983) PlantGrowth, first 4 values of ctrl and trt1 — compared with the registry below.
    const d = await snr([[4.17], [5.58], [5.18], [6.11], [4.81], [4.17], [4.41], [3.59]], [["a"], ["a"], ["a"], ["a"], ["b"], ["b"], ["b"], ["b"]], {});
    expect(typeof d).toBe("number");
    const bad = await cf.associations.get("GROUPTEST")([[1], ["x"]], [["a"], ["b"]], null, null, null, {});
    expect(bad.code).toBe("#VALUE!");
    expect(bad.message).toBe("values, row 2: 'x' is not a number.");
  });

  it("inside Excel it leaves the runtime alone: 14 associate calls to it, and errors as its Error class", async () => {
    const { code } = await bundle();
    const associated = new Map<string, Function>();
    class RuntimeError {
      constructor(readonly code: string, readonly message?: string) {}
    }
    const runtime = { associate: (id: string, f: Function) => associated.set(id, f), Error: RuntimeError };
    const ctx = vm.createContext({ ...baseContext(), CustomFunctions: runtime });
    vm.runInContext(code, ctx);
    expect((ctx as any).CustomFunctions).toBe(runtime);
    expect([...associated.keys()]).toEqual(designTable().map((r) => r.name));
    const invocation: { onCanceled?: () => void } = {};
    const bad = await associated.get("TWOTEST")!([[1], [true]], [[2], [3]], "sideways", null, null, null, invocation);
    expect(bad).toBeInstanceOf(RuntimeError);
    expect(bad.code).toBe("#VALUE!");
    expect(bad.message).toBe("direction: 'sideways' is not one of \"two-sided\", \"greater\", \"less\"; leave it empty for \"two-sided\".");
    expect(typeof invocation.onCanceled).toBe("function");
    const spilled = await associated.get("INTERVAL")!([[1], [2]], null, null, null, null, null, {});
    expect(spilled[0][0]).toBeInstanceOf(RuntimeError);
    expect(spilled[0][0].code).toBe("#N/A");
  });
});
