// The command line: `--json` prints exactly one JSON document; bad input exits non-zero with
// one line on stderr and no stack trace. Runs the script through tsx as `npm run analyse` does.
import { spawnSync } from "node:child_process";
import { mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { describe, expect, it } from "vitest";

const ROOT = join(__dirname, "../../..");
const run = (...args: string[]) =>
  spawnSync(join(ROOT, "node_modules/.bin/tsx"), [join(ROOT, "scripts/analyse.ts"), ...args], {
    cwd: ROOT,
    encoding: "utf8",
    timeout: 30_000,
  });

describe("npm run analyse", () => {
  it("--json with one file prints exactly one JSON document and nothing else", () => {
    const r = run("--json", "--key", "D", "--target", "I IV V I", "samples/three-chord-smoothing-d.mid");
    expect(r.status).toBe(0);
    expect(r.stderr).toBe("");
    const doc = JSON.parse(r.stdout);
    expect(Object.keys(doc).sort()).toEqual(["changes", "chords", "melodyNotes", "summary"]);
    expect(doc.summary.accuracy).toBe(1);
    expect(doc.chords[1].roman).toBe("IV");
  });

  it("without --json prints a readable table per file", () => {
    const r = run("--key", "Eb", "samples/falling-bass-eb.mid", "samples/held-bass-d.mid");
    expect(r.status).toBe(0);
    expect(r.stdout).toContain("samples/falling-bass-eb.mid");
    expect(r.stdout).toContain("Bb/D");
    expect(r.stdout).toContain("samples/held-bass-d.mid");
    expect(r.stdout).toMatch(/score \d+\/100/);
  });

  it("a bad file exits non-zero with one line on stderr and no stack trace", () => {
    const dir = mkdtempSync(join(tmpdir(), "nearnote-cli-"));
    const bad = join(dir, "notes.mid");
    writeFileSync(bad, "these are my practice notes, not a MIDI file");
    const r = run("--json", bad);
    expect(r.status).not.toBe(0);
    expect(r.stdout).toBe("");
    const lines = r.stderr.trimEnd().split("\n");
    expect(lines).toHaveLength(1);
    expect(lines[0]).toContain("not a MIDI file");
    expect(r.stderr).not.toMatch(/\bat \S+:\d+/);
  });

  it("a bad target is refused with its position, on one line", () => {
    const r = run("--json", "--target", "I IV Vq I", "samples/three-chord-smoothing-d.mid");
    expect(r.status).not.toBe(0);
    expect(r.stderr.trimEnd().split("\n")).toHaveLength(1);
    expect(r.stderr).toContain('Token 3 "Vq"');
  });
});
