import { spawnSync } from "node:child_process";
import { readFileSync } from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { closeDatabaseForTests, db } from "~/db/client.server";
import { takes } from "~/db/schema";
import { restoreBackup, writeBackup } from "~/lib/backup.server";
import { env } from "~/lib/env.server";
import { readTakeFile } from "~/lib/takeFiles.server";
import { deleteTake } from "~/models/takes.server";
import { seedDemoStudio } from "~/models/demoStudio.server";
import { seedDemoTakes } from "../../scripts/lib/seedTakes";
import { useFreshApp } from "../support/setup";

const app = useFreshApp();

function snapshot() {
  const rows = db().$client.prepare("select id, file_key, content_hash, status from takes order by id").all() as {
    id: string;
    file_key: string;
    content_hash: string;
  }[];
  const metrics = db().$client.prepare("select take_id, total_motion, best_total_motion, score from take_metrics order by take_id").all();
  const chords = (db().$client.prepare("select count(*) n from chord_events").get() as { n: number }).n;
  return { rows, metrics, chords };
}

describe("backup and restore", () => {
  it("copies the database while it is written to, with the take files, and brings both back", async () => {
    const { studioId } = await seedDemoStudio(db());
    await seedDemoTakes(db(), studioId, new Date("2026-11-20T12:00:00Z"));
    const before = snapshot();
    const archive = path.join(app.storageDir, "backups", "test.zip");

    // Keep writing while the online backup runs: the copy must still be consistent.
    const backup = writeBackup(db().$client, app.storageDir, archive);
    db().$client.prepare("update studios set name = name").run();
    const result = await backup;
    // LocalFileStorage keeps each take as a data file and a small metadata file.
    expect(result.takeFiles).toBe(before.rows.length * 2);

    // Lose data after the backup…
    for (const t of before.rows.slice(0, 5)) await deleteTake(t.id);
    expect(snapshot().rows.length).toBe(before.rows.length - 5);

    // …then restore with the app stopped.
    closeDatabaseForTests();
    restoreBackup(new Uint8Array(readFileSync(archive)), env().databasePath, env().storageDir);
    const after = snapshot();
    expect(after).toEqual(before);
    for (const t of before.rows.slice(0, 5)) {
      const bytes = await readTakeFile(t.file_key);
      expect(bytes).not.toBeNull();
      const { createHash } = await import("node:crypto");
      expect(createHash("sha256").update(bytes!).digest("hex")).toBe(t.content_hash);
    }
    expect(db().select().from(takes).all().length).toBe(before.rows.length);
  }, 120_000);

  it("refuses a file that is not a backup", () => {
    expect(() => restoreBackup(new Uint8Array([1, 2, 3]), env().databasePath, env().storageDir)).toThrow();
  });

  it("runs as npm scripts", () => {
    const archive = path.join(app.storageDir, "cli.zip");
    const run = (script: string, ...args: string[]) =>
      spawnSync(path.resolve("node_modules/.bin/tsx"), [path.resolve(`scripts/${script}.ts`), ...args], {
        env: { ...process.env, STORAGE_DIR: app.storageDir, DATABASE_PATH: env().databasePath },
        encoding: "utf8",
      });
    const b = run("backup", archive);
    expect(b.status, b.stderr).toBe(0);
    expect(b.stdout).toContain("Backup written");
    closeDatabaseForTests();
    const r = run("restore", archive);
    expect(r.status, r.stderr).toBe(0);
    const bad = run("restore", path.resolve("package.json"));
    expect(bad.status).toBe(1);
  }, 60_000);
});
