import { spawnSync } from "node:child_process";
import { existsSync, mkdirSync, readdirSync, readFileSync, statSync } from "node:fs";
import { strToU8, unzipSync, zipSync } from "fflate";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { closeDatabase, db } from "~/db/client.server";
import { takes } from "~/db/schema";
import { restoreBackup, writeBackup } from "~/server/backup.server";
import { env } from "~/server/env.server";
import { readTakeFile, takeFileNames, takeStorage } from "~/takes/takeFiles.server";
import { deleteTake } from "~/models/takes.server";
import { seedDemoStudio } from "~/models/demoStudio.server";
import { seedDemoTakes } from "../../scripts/lib/seedTakes";
import { storedTakeFiles, useFreshApp } from "../support/setup";
import { join, makeStudio, makeTakeRow, makeUser } from "./accountsKit";

const app = useFreshApp();

function snapshot() {
  const rows = db().$client.prepare("select id, file_key, content_hash, status from takes order by id").all() as {
    id: string;
    file_key: string;
    content_hash: string;
  }[];
  const metrics = db()
    .$client.prepare("select take_id, total_motion, best_total_motion, score from take_metrics order by take_id")
    .all();
  const chords = (
    db().$client.prepare("select sum(json_array_length(analysis, '$.chords')) n from take_metrics").get() as {
      n: number;
    }
  ).n;
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
    closeDatabase();
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
    closeDatabase();
    const r = run("restore", archive);
    expect(r.status, r.stderr).toBe(0);
    const bad = run("restore", path.resolve("package.json"));
    expect(bad.status).toBe(1);
  }, 60_000);

  it("copies only the files the database copy refers to, skipping with a note those deleted meanwhile", async () => {
    const keys = await takesWithFiles(6);
    await takeStorage().put("orphan", new File([new Uint8Array([1])], "orphan.mid")); // no row names it
    const archive = path.join(app.storageDir, "backups", "churn.zip");
    const notes: string[] = [];
    // Two takes are deleted right after the database copy is made, before their files are copied.
    const sqlite = db().$client;
    const racing = {
      backup: async (file: string) => {
        const r = await sqlite.backup(file);
        for (const id of keys.slice(0, 2).map((k) => k.id)) await deleteTake(id);
        return r;
      },
    } as unknown as typeof sqlite;
    const result = await writeBackup(racing, app.storageDir, archive, (n) => notes.push(n));
    expect(result.skipped).toHaveLength(2);
    expect(notes).toHaveLength(2);
    expect(notes[0]).toMatch(/vanished/);
    const entries = Object.keys(unzipSync(new Uint8Array(readFileSync(archive))));
    expect(entries.filter((e) => e.endsWith(".dat"))).toHaveLength(4);
    expect(entries).not.toContain(`takes/${takeFileNames("orphan").dat}`);
    expect(existsSync(`${archive}.partial`)).toBe(false);
  });

  it("succeeds run after run while takes are deleted during the copy", async () => {
    const keys = await takesWithFiles(120);
    for (let run = 0; run < 4; run++) {
      const archive = path.join(app.storageDir, "backups", `churn-${run}.zip`);
      const batch = keys.slice(run * 30, run * 30 + 30);
      const backup = writeBackup(db().$client, app.storageDir, archive, () => {});
      for (const k of batch) {
        await deleteTake(k.id);
        await new Promise((r) => setImmediate(r));
      }
      const result = await backup;
      expect(existsSync(archive)).toBe(true);
      expect(result.takeFiles / 2 + result.skipped.length).toBeGreaterThanOrEqual(120 - run * 30 - 30);
    }
    expect(readdirSync(path.join(app.storageDir, "backups")).filter((f) => f.endsWith(".partial"))).toEqual([]);
  }, 60_000);

  it("removes the partial archive when the copy fails", async () => {
    const [first] = await takesWithFiles(2);
    // A take file that cannot be read: a folder where the data file should be.
    const dat = path.join(app.storageDir, "takes", takeFileNames(first.fileKey).dat);
    const { rmSync } = await import("node:fs");
    rmSync(dat);
    mkdirSync(dat);
    const archive = path.join(app.storageDir, "backups", "broken.zip");
    await expect(writeBackup(db().$client, app.storageDir, archive, () => {})).rejects.toThrow();
    expect(existsSync(`${archive}.partial`)).toBe(false);
    expect(existsSync(archive)).toBe(false);
  });

  it("checks the whole archive before touching anything on restore", async () => {
    await takesWithFiles(2);
    const dbBytes = readFileSync(env().databasePath);
    const evilArchive = (name: string) => zipSync({ "nearnote.db": new Uint8Array(dbBytes), [name]: strToU8("x") });
    closeDatabase();
    const dbBefore = statSync(env().databasePath).mtimeMs;
    for (const name of [
      "takes/../../escaped",
      "takes/ab/../../../escaped",
      "takes/..\\..\\escaped",
      "other/file",
      "/etc/escaped",
    ]) {
      expect(() => restoreBackup(evilArchive(name), env().databasePath, env().storageDir), name).toThrow(
        /Nothing was changed/,
      );
    }
    // A nearnote.db that is not a database is refused too.
    expect(() =>
      restoreBackup(zipSync({ "nearnote.db": strToU8("hello") }), env().databasePath, env().storageDir),
    ).toThrow(/not a SQLite/);
    expect(statSync(env().databasePath).mtimeMs).toBe(dbBefore);
    expect(storedTakeFiles(app.storageDir)).toHaveLength(2);
    expect(existsSync(path.join(app.storageDir, "..", "escaped"))).toBe(false);
    expect(db().select().from(takes).all()).toHaveLength(2);
  });
});

/** A student's takes with real stored files (no analysis needed for a backup). */
async function takesWithFiles(n: number) {
  const studio = makeStudio("Harbour Lane");
  const dara = makeUser("dara@harbour.example", "Dara");
  join(studio.id, dara.id, "student");
  const rows = [];
  for (let i = 0; i < n; i++) {
    await takeStorage().put(`take-${i}`, new File([new Uint8Array(2048).fill(i % 256)], `take-${i}.mid`));
    rows.push(makeTakeRow(dara.id, studio.id, `take-${i}`));
  }
  return rows;
}
