// `npm test` starts with scripts/ensure-browser.sh: nothing to do when the browser is there;
// otherwise it installs Debian's chromium as root, or stops at once with one line.
import { spawnSync } from "node:child_process";
import { chmodSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { describe, expect, it } from "vitest";

const SCRIPT = path.resolve("scripts/ensure-browser.sh");
const run = (script: string, env: Record<string, string>, asNobody = false) => {
  const command = asNobody
    ? ["setpriv", "--reuid=65534", "--regid=65534", "--clear-groups", "bash", script]
    : ["bash", script];
  return spawnSync(command[0], command.slice(1), {
    env: { PATH: process.env.PATH ?? "", ...env },
    encoding: "utf8",
    timeout: 10_000,
  });
};

describe("scripts/ensure-browser.sh", () => {
  it("does nothing, silently, when the browser is there", () => {
    const r = run(SCRIPT, { CHROMIUM_PATH: process.execPath });
    expect(r.status).toBe(0);
    expect(r.stdout + r.stderr).toBe("");
  });

  it("stops at once with one line when CHROMIUM_PATH names no browser", () => {
    const r = run(SCRIPT, { CHROMIUM_PATH: "/nonexistent/chromium" });
    expect(r.status).toBe(1);
    expect(r.stderr.trim().split("\n")).toHaveLength(1);
  });

  it.runIf(process.getuid?.() === 0 && spawnSync("setpriv", ["--version"]).status === 0)(
    "without root and without the browser, stops at once with one line naming the package",
    () => {
      // The same script, looking for a browser that is certainly missing.
      const dir = mkdtempSync(path.join(tmpdir(), "nearnote-browser-"));
      chmodSync(dir, 0o755);
      const copy = path.join(dir, "ensure-browser.sh");
      writeFileSync(
        copy,
        readFileSync(SCRIPT, "utf8").replace(
          '"${CHROMIUM_PATH:-/usr/bin/chromium}"',
          '"${CHROMIUM_PATH:-/nonexistent/chromium}"',
        ),
        { mode: 0o755 },
      );
      const r = run(copy, {}, true);
      expect(r.status).toBe(1);
      expect(r.stdout).toBe("");
      expect(r.stderr.trim().split("\n")).toHaveLength(1);
      expect(r.stderr).toMatch(/apt-get install chromium/);
      rmSync(dir, { recursive: true, force: true });
    },
  );
});
