// The committed migrations in drizzle/ match app/db/schema.ts: drizzle-kit, run against a
// copy of them, finds nothing to generate. A schema change without its migration fails here.
import { execFile } from "node:child_process";
import { cpSync, mkdtempSync, readdirSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { promisify } from "node:util";
import { afterEach, describe, expect, it } from "vitest";

const run = promisify(execFile);
let copy = "";

afterEach(() => {
  if (copy) rmSync(copy, { recursive: true, force: true });
});

describe("migrations", () => {
  it("drizzle-kit generate finds no schema change the committed migrations lack", { timeout: 120_000 }, async () => {
    copy = mkdtempSync(path.join(tmpdir(), "nearnote-migrations-"));
    cpSync("drizzle", copy, { recursive: true });
    const before = readdirSync(copy).sort();
    // drizzle-kit joins --out to the working folder, so it is given relative to it.
    const out = path.relative(process.cwd(), copy);
    const bin = path.resolve("node_modules/.bin/drizzle-kit");
    const { stdout } = await run(bin, [
      "generate",
      "--dialect",
      "sqlite",
      "--schema",
      "./app/db/schema.ts",
      "--out",
      out,
    ]);
    expect(readdirSync(copy).sort(), "a new migration was generated: run npm run db:generate and commit it").toEqual(
      before,
    );
    expect(stdout).toContain("No schema changes");
  });
});
