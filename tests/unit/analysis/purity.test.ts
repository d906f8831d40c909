// The engine must run in the browser too: no Node-only, React or database imports anywhere in
// app/analysis (see DEVELOPERS.md), checked on the source text of every module.
import { readdirSync, readFileSync } from "node:fs";
import { join } from "node:path";
import { describe, expect, it } from "vitest";

const DIR = join(__dirname, "../../../app/analysis");
const modules = readdirSync(DIR).filter((f) => f.endsWith(".ts") && !f.endsWith(".test.ts"));

describe("app/analysis is pure TypeScript", () => {
  it("has modules to check", () => {
    expect(modules).toContain("index.ts");
    expect(modules).toContain("readMidi.ts");
  });

  it.each(modules)("%s imports only other engine modules, tonal and @tonejs/midi", (file) => {
    const source = readFileSync(join(DIR, file), "utf8");
    const imports = [
      ...source.matchAll(
        /\bfrom\s+["']([^"']+)["']|\bimport\s*\(\s*["']([^"']+)["']\s*\)|\brequire\s*\(\s*["']([^"']+)["']/g,
      ),
    ].map((m) => m[1] ?? m[2] ?? m[3]);
    for (const spec of imports) expect(spec, `${file} imports ${spec}`).toMatch(/^(\.\/[\w]+|tonal|@tonejs\/midi)$/);
    expect(source, `${file} uses Buffer`).not.toMatch(/\bBuffer\b/);
    expect(source, `${file} uses process`).not.toMatch(/\bprocess\./);
  });
});
