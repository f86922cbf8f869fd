/** Splits text into lines of at most `chars` characters at spaces (a longer word gets a line of its own). */
export function wrapWords(s: string, chars: number): string[] {
  const out: string[] = [];
  let line = "";
  for (const w of s.split(/\s+/)) {
    if (w === "") continue;
    if (line && (line + " " + w).length > chars) {
      out.push(line);
      line = w;
    } else line = line ? `${line} ${w}` : w;
  }
  if (line) out.push(line);
  return out.length ? out : [""];
}
