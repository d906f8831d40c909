import { spawnSync } from "node:child_process";
import { existsSync, mkdirSync, readFileSync, rmSync, utimesSync, writeFileSync } from "node:fs";
import path from "node:path";
import { count, eq } from "drizzle-orm";
import { afterEach, describe, expect, it, onTestFinished, vi } from "vitest";
import { db } from "~/db/client.server";
import { exercises, takes } from "~/db/schema";
import { ConfigError, env, resetEnvForTests } from "~/server/env.server";
import { listStoredTakeFiles, takeFileNames, takeStorage } from "~/takes/takeFiles.server";
import { storeModelTake } from "~/models/modelTakes.server";
import { startBackgroundWork } from "~/server/startup.server";
import { sweepOrphanTakeFiles } from "~/models/orphanFiles.server";
import { deletePersonData } from "~/models/personalData.server";
import { deleteStudentData, getMembership } from "~/models/studios.server";
import { storedTakeFiles, useFreshApp } from "../support/setup";
import { ask } from "../support/app";
import { join, makeExercise, makeStudio, makeTakeRow, makeUser, ORIGIN, signIn } from "./accountsKit";

// Take files and the storage folder: deletions remove rows before files, files
// without rows are swept, a missing or read-only storage folder is never mistaken
// for an empty studio, and a malformed upload is the client's error.
const app = useFreshApp();
const storedFiles = () => storedTakeFiles(app.storageDir);
const takeRows = () => db().select({ n: count() }).from(takes).get()!.n;

async function putFile(key: string) {
  await takeStorage().put(key, new File([new Uint8Array([0x4d, 0x54, 0x68, 0x64])], "take.mid"));
}

/** Sets the modification time of both stored files of a key into the past. */
async function age(hours: number) {
  const when = new Date(Date.now() - hours * 3_600_000);
  for (const f of await listStoredTakeFiles()) utimesSync(f.file, when, when);
}

async function studentWithTakes(n: number) {
  const studio = makeStudio("Harbour Lane");
  const dara = makeUser("dara@harbour.example", "Dara");
  join(studio.id, dara.id, "student");
  for (let i = 0; i < n; i++) {
    await putFile(`take-${i}`);
    makeTakeRow(dara.id, studio.id, `take-${i}`);
  }
  return { studio, dara };
}

afterEach(() => {
  vi.restoreAllMocks();
  delete process.env.STORAGE_CREATE;
});

describe("deleting a student's data", () => {
  it("removes every row first, so a failure while removing files leaves no take without its file", async () => {
    const { studio, dara } = await studentWithTakes(4);
    const store = takeStorage();
    const remove = store.remove.bind(store);
    let calls = 0;
    // The second file cannot be removed (a crash or a read-only folder mid-way).
    vi.spyOn(store, "remove").mockImplementation(async (key: string) => {
      if (++calls === 2) throw Object.assign(new Error("EROFS: read-only file system"), { code: "EROFS" });
      return remove(key);
    });
    vi.spyOn(console, "warn").mockImplementation(() => {});
    await deleteStudentData(studio.id, dara.id);
    expect(takeRows()).toBe(0);
    expect(storedFiles()).toHaveLength(1); // left for the sweep, named by no row
    await age(2);
    expect(await sweepOrphanTakeFiles(new Date())).toBe(1);
    expect(storedFiles()).toHaveLength(0);
  });

  it("removes the membership in the same transaction as the takes, before any file", async () => {
    const { studio, dara } = await studentWithTakes(2);
    const store = takeStorage();
    // A crash at the first file: the rows must already be gone, membership included.
    vi.spyOn(store, "remove").mockImplementation(async () => {
      expect(takeRows()).toBe(0);
      expect(getMembership(studio.id, dara.id)).toBeUndefined();
      throw new Error("process killed");
    });
    vi.spyOn(console, "warn").mockImplementation(() => {});
    await deleteStudentData(studio.id, dara.id).catch(() => {});
    expect(getMembership(studio.id, dara.id)).toBeUndefined();
    expect(store.remove).toHaveBeenCalled();
  });

  it("deletes an account's takes, invitations and user row in one go, then the files", async () => {
    const { dara } = await studentWithTakes(3);
    await deletePersonData(dara.id);
    expect(takeRows()).toBe(0);
    expect(storedFiles()).toHaveLength(0);
  });
});

describe("sweeping orphan files", () => {
  it("removes old files no row refers to, keeps referenced and fresh ones, and reports the count", async () => {
    const { studio } = await studentWithTakes(2);
    const exercise = makeExercise(studio.id);
    await putFile("model-take");
    db()
      .update(exercises)
      .set({ modelFileKey: "model-take", modelOriginalName: "model.mid" })
      .where(eq(exercises.id, exercise.id))
      .run();
    await putFile("crashed-upload-1");
    await putFile("crashed-upload-2");
    // A file with no metadata beside it: a crash in the middle of writing.
    mkdirSync(path.join(app.storageDir, "takes", "ab"), { recursive: true });
    writeFileSync(path.join(app.storageDir, "takes", "ab", `ab${"0".repeat(62)}.dat`), "half");
    await age(2);
    await putFile("upload-in-progress"); // just written: its row may be on its way

    expect(await sweepOrphanTakeFiles(new Date(Date.now() - 3_600_000))).toBe(3);
    const left = storedFiles();
    expect(left).toHaveLength(4); // two takes, the model take, the upload in progress
    expect(await sweepOrphanTakeFiles(new Date(Date.now() - 3_600_000))).toBe(0);
  });

  it("runs when the server starts, for files left by an earlier process", async () => {
    await studentWithTakes(1);
    await putFile("left-by-a-crash");
    await age(2); // written before this process started
    const log = vi.spyOn(console, "log").mockImplementation(() => {});
    // The in-process app keeps background work off for the other tests; a started server runs it.
    process.env.NEARNOTE_BACKGROUND = "on";
    resetEnvForTests();
    onTestFinished(() => {
      process.env.NEARNOTE_BACKGROUND = "off";
      resetEnvForTests();
    });
    startBackgroundWork();
    await expect.poll(() => storedFiles().length, { timeout: 10_000 }).toBe(1);
    await expect
      .poll(() => log.mock.calls.flat().join("\n"), { timeout: 5_000 })
      .toContain("orphan take files removed at start-up: 1");
  });

  it("runs in npm run reanalyse, which prints the count", async () => {
    await studentWithTakes(1);
    await putFile("orphan");
    await age(2);
    const run = spawnSync(path.resolve("node_modules/.bin/tsx"), [path.resolve("scripts/reanalyse.ts")], {
      env: { ...process.env, STORAGE_DIR: app.storageDir, DATABASE_PATH: env().databasePath },
      encoding: "utf8",
    });
    expect(run.status, run.stderr).toBe(0);
    expect(run.stdout).toContain("Orphan take files removed: 1.");
    expect(storedFiles()).toHaveLength(1);
  }, 60_000);
});

describe("model takes", () => {
  it("two uploaded at once leave one model take and one file; a file that is not MIDI leaves none", async () => {
    const studio = makeStudio("Harbour Lane");
    const exercise = makeExercise(studio.id);
    const upload = (name: string, bytes: Uint8Array) => {
      const form = new FormData();
      form.append("file", new File([new Uint8Array(bytes)], name, { type: "audio/midi" }));
      return new Request(`${ORIGIN}/exercises/${exercise.id}`, { method: "POST", body: form });
    };
    const sample = (name: string) => new Uint8Array(readFileSync(path.resolve("samples", name)));
    const results = await Promise.all([
      storeModelTake(upload("one.mid", sample("held-bass-d.mid")), exercise),
      storeModelTake(upload("two.mid", sample("minor-colour-g.mid")), exercise),
    ]);
    expect(results).toEqual([null, null]);
    expect(storedFiles()).toHaveLength(1);
    const row = db().select().from(exercises).where(eq(exercises.id, exercise.id)).get()!;
    expect(storedFiles()[0]).toContain(takeFileNames(row.modelFileKey!).hash);

    const refused = await storeModelTake(upload("notes.mid", new TextEncoder().encode("not a MIDI file")), row);
    expect(refused).toMatch(/not a MIDI take/);
    expect(storedFiles()).toHaveLength(1);
  });
});

describe("the storage folder", () => {
  it("stops start-up when it is missing, unless creating it was asked for", () => {
    const missing = path.join(app.storageDir, "not-mounted");
    process.env.STORAGE_DIR = missing;
    resetEnvForTests();
    expect(() => env()).toThrow(ConfigError);
    expect(() => env()).toThrow(/does not exist.*STORAGE_CREATE=1/);
    expect(existsSync(missing)).toBe(false);
    process.env.STORAGE_CREATE = "1";
    resetEnvForTests();
    expect(env().storageDir).toBe(missing);
    expect(existsSync(missing)).toBe(true);
    process.env.STORAGE_DIR = app.storageDir;
    resetEnvForTests();
  });

  it("stops start-up of the real scripts too, naming the folder", () => {
    const missing = path.join(app.storageDir, "not-mounted");
    const run = spawnSync(path.resolve("node_modules/.bin/tsx"), [path.resolve("scripts/reanalyse.ts")], {
      env: { ...process.env, STORAGE_DIR: missing, DATABASE_PATH: path.join(missing, "x.db") },
      encoding: "utf8",
    });
    expect(run.status).toBe(1);
    expect(run.stderr).toContain(missing);
    expect(existsSync(missing)).toBe(false);
  }, 60_000);

  it("/healthz reports storage that cannot be written with 503", async () => {
    const ok = await ask(new Request(`${ORIGIN}/healthz`));
    expect(ok.status).toBe(200);
    expect(ok.data).toMatchObject({ database: "ok", storage: "ok" });
    // The takes folder replaced by a plain file: nothing can be written under it
    // (the tests run as root, so a permission change would not stop writes).
    const takesDir = path.join(app.storageDir, "takes");
    rmSync(takesDir, { recursive: true, force: true });
    writeFileSync(takesDir, "not a folder");
    const bad = await ask(new Request(`${ORIGIN}/healthz`));
    expect(bad.status).toBe(503);
    expect(bad.data).toMatchObject({ database: "ok", storage: "not-writable" });
  });
});

describe("a malformed multipart upload", () => {
  it("answers 400 for a part header that is not UTF-8, keeping nothing", async () => {
    const studio = makeStudio("Harbour Lane");
    const dara = makeUser("dara@harbour.example", "Dara");
    join(studio.id, dara.id, "student");
    const jar = await signIn(dara.email);
    const boundary = "nearnote-boundary";
    const body = Buffer.concat([
      Buffer.from(`--${boundary}\r\nContent-Disposition: form-data; name="file"; filename="`),
      Buffer.from([0xff, 0xfe, 0xc3, 0x28]), // not valid UTF-8 (RFC 3629)
      Buffer.from(`.mid"\r\nContent-Type: audio/midi\r\n\r\nMThd\r\n--${boundary}--\r\n`),
    ]);
    const request = new Request(`${ORIGIN}/api/takes`, {
      method: "POST",
      body,
      headers: { Cookie: jar.header(), Origin: ORIGIN, "Content-Type": `multipart/form-data; boundary=${boundary}` },
    });
    const r = await ask<{ error: string }>(request);
    expect(r.status).toBe(400);
    expect(r.data.error).toMatch(/could not be read/);
    expect(takeRows()).toBe(0);
    expect(storedFiles()).toHaveLength(0);
  });
});
