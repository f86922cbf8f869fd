/**
 * Offline checks of the add-in manifest (the online validator is unreachable here):
 * resource ids resolve, every URL is https on one origin, the RS namespace, the shared
 * runtime wiring (Runtime, functions Page and FunctionFile name one resource, lifetime
 * long, SharedRuntime requirement), a Workbook host and a Home-tab button.
 */
export function checkManifest(xml: string): string[] {
  const errors: string[] = [];
  const defined = new Map<string, string>();
  for (const m of xml.matchAll(/<bt:(Image|Url|String)\s+id="([^"]+)"\s+DefaultValue="([^"]*)"/g)) {
    if (defined.has(m[2])) errors.push(`resource id "${m[2]}" is defined twice`);
    defined.set(m[2], m[3]);
  }
  for (const m of xml.matchAll(/resid="([^"]+)"/g)) {
    if (!defined.has(m[1])) errors.push(`resid "${m[1]}" is used but not defined under <Resources>`);
  }
  const urls = [...xml.matchAll(/(?:DefaultValue="|<AppDomain>)(https?:\/\/[^"<]+)/g)].map((m) => m[1]);
  if (urls.length === 0) errors.push("no URLs found");
  const origins = new Set<string>();
  for (const u of urls) {
    if (!u.startsWith("https://")) errors.push(`URL ${u} is not https`);
    try {
      origins.add(new URL(u).origin);
    } catch {
      errors.push(`URL ${u} is not a valid URL`);
    }
  }
  if (origins.size > 1) errors.push(`URLs use more than one origin: ${[...origins].join(", ")}`);

  const namespace = /<Namespace\s+resid="([^"]+)"/.exec(xml);
  if (!namespace) errors.push("custom functions <Namespace> is missing");
  else if (defined.get(namespace[1]) !== "RS") errors.push(`custom functions namespace is "${defined.get(namespace[1])}", expected "RS"`);

  const runtime = /<Runtime\s+resid="([^"]+)"(?:\s+lifetime="([^"]+)")?/.exec(xml);
  const page = /<Page>\s*<SourceLocation\s+resid="([^"]+)"/.exec(xml);
  const functionFile = /<FunctionFile\s+resid="([^"]+)"/.exec(xml);
  const taskpane = /<Action\s+xsi:type="ShowTaskpane">[\s\S]*?<SourceLocation\s+resid="([^"]+)"/.exec(xml);
  if (!runtime) errors.push("shared runtime: <Runtime> is missing");
  else if (runtime[2] !== "long") errors.push('shared runtime: <Runtime> must have lifetime="long"');
  if (!page) errors.push("custom functions <Page> is missing");
  if (!functionFile) errors.push("<FunctionFile> is missing");
  if (!taskpane) errors.push("no Home-tab button opening the task pane (ShowTaskpane action)");
  const ids = [runtime?.[1], page?.[1], functionFile?.[1], taskpane?.[1]].filter(Boolean);
  if (new Set(ids).size > 1) errors.push(`shared runtime: Runtime, functions Page, FunctionFile and task pane must name one resource id (got ${ids.join(", ")})`);
  if (!/<Set\s+Name="SharedRuntime"\s+MinVersion="1\.1"/.test(xml)) errors.push("requirement set SharedRuntime 1.1 is missing");
  if (!/<Host\s+Name="Workbook"\s*\/>/.test(xml)) errors.push('host "Workbook" is missing');
  if (!/<OfficeTab\s+id="TabHome">/.test(xml)) errors.push("the button is not on the Home tab");
  if (!/<DisplayName\s+DefaultValue="Reshuffle"/.test(xml)) errors.push('display name must be "Reshuffle"');
  const script = /<Script>\s*<SourceLocation\s+resid="([^"]+)"/.exec(xml);
  if (!script || !/functions\.js$/.test(defined.get(script[1]) ?? "")) errors.push("custom functions <Script> must point at functions.js");
  const meta = /<Metadata>\s*<SourceLocation\s+resid="([^"]+)"/.exec(xml);
  if (!meta || !/functions\.json$/.test(defined.get(meta[1]) ?? "")) errors.push("custom functions <Metadata> must point at functions.json");
  return errors;
}

/** Paths (relative to the add-in's base URL) of files the manifest points at. */
