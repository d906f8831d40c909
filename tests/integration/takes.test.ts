import { readFileSync } from "node:fs";
import path from "node:path";
import { count, eq } from "drizzle-orm";
import { describe, expect, it, onTestFinished } from "vitest";
import { ANALYSIS_VERSION } from "~/analysis";
import { db } from "~/db/client.server";
import { takeMetrics, takes } from "~/db/schema";
import { getSessionUser } from "~/auth/session.server";
import { replaceTakeFromForm, uploadTakesFromForm } from "~/takes/takeUpload.server";
import { resetEnvForTests } from "~/server/env.server";
import { startBackgroundWork } from "~/server/startup.server";
import { moveTake, reanalyseOutdated } from "~/models/takes.server";
import { storedTakeFiles, useFreshApp } from "../support/setup";
import { ask } from "../support/app";
import { CookieJar, get, join, makeExercise, makeStudio, makeUser, ORIGIN, signIn } from "./accountsKit";

const app = useFreshApp();
const sample = (name: string) => new Uint8Array(readFileSync(path.resolve("samples", name)));

function multipart(files: { name: string; bytes: Uint8Array }[], fields: Record<string, string> = {}, field = "file") {
  const form = new FormData();
  for (const f of files) form.append(field, new File([new Uint8Array(f.bytes)], f.name, { type: "audio/midi" }));
  for (const [k, v] of Object.entries(fields)) form.append(k, v);
  return form;
}

function upload(jar: CookieJar, form: FormData) {
  return new Request(`${ORIGIN}/api/takes`, {
    method: "POST",
    body: form,
    headers: { Cookie: jar.header(), Origin: ORIGIN },
  });
}

const storedFiles = () => storedTakeFiles(app.storageDir);
const rows = (table: typeof takes | typeof takeMetrics) => db().select({ n: count() }).from(table).get()!.n;
const storedAnalysis = (takeId: string) =>
  db().select({ analysis: takeMetrics.analysis }).from(takeMetrics).where(eq(takeMetrics.takeId, takeId)).get()
    ?.analysis;

async function setup() {
  const studio = makeStudio("Harbour Lane");
  const dara = makeUser("dara@harbour.example", "Dara");
  const felix = makeUser("felix@harbour.example", "Felix");
  const ines = makeUser("ines@harbour.example", "Ines");
  join(studio.id, dara.id, "student");
  join(studio.id, felix.id, "student");
  join(studio.id, ines.id, "owner");
  const exercise = makeExercise(studio.id);
  return {
    studio,
    exercise,
    dara: await signIn(dara.email),
    felix: await signIn(felix.email),
    ines: await signIn(ines.email),
    ids: { dara: dara.id, felix: felix.id },
  };
}

describe("uploading takes", () => {
  it("stores a good take, its file and every analysis row in one go (201)", async () => {
    const s = await setup();
    const r = await ask<{ id: string; status: string; analysis: { chords: unknown[]; changes: unknown[] } }>(
      upload(s.dara, multipart([{ name: "../three chords.mid", bytes: sample("three-chord-smoothing-d.mid") }])),
    );
    expect(r.status).toBe(201);
    const body = r.data;
    expect(body.status).toBe("analysed");
    const take = db().select().from(takes).where(eq(takes.id, body.id)).get()!;
    expect(take.originalName).toBe("three chords.mid");
    expect(take.fileKey).not.toContain("three");
    expect(take.analysisVersion).toBe(ANALYSIS_VERSION);
    expect(take.weekKey).toMatch(/^\d{4}-W\d{2}$/);
    expect(rows(takeMetrics)).toBe(1);
    const stored = storedAnalysis(body.id)!;
    expect(stored.chords).toHaveLength(body.analysis.chords.length);
    expect(stored.changes).toHaveLength(body.analysis.changes.length);
    expect(storedFiles()).toHaveLength(1);

    const file = await ask<Uint8Array>(get(`/api/takes/${body.id}/file`, s.ines));
    expect(file.status).toBe(200);
    const bytes = file.data;
    expect(bytes).toEqual(sample("three-chord-smoothing-d.mid"));
  });

  it("refuses a file that is not MIDI with 415 and keeps nothing", async () => {
    const s = await setup();
    const r = await ask<{ error: string }>(
      upload(s.dara, multipart([{ name: "notes.mid", bytes: new TextEncoder().encode("just some text") }])),
    );
    expect(r.status).toBe(415);
    expect(r.data.error).toMatch(/not a MIDI file/);
    expect(rows(takes)).toBe(0);
    expect(storedFiles()).toHaveLength(0);
  });

  it("refuses a file over 2 MiB and more than ten files with 413, leaving nothing behind", async () => {
    const s = await setup();
    const big = new Uint8Array(2 * 1024 * 1024 + 1);
    big.set(sample("three-chord-smoothing-d.mid"));
    const r1 = await ask(upload(s.dara, multipart([{ name: "big.mid", bytes: big }])));
    expect(r1.status).toBe(413);
    const eleven = Array.from({ length: 11 }, (_, i) => ({ name: `t${i}.mid`, bytes: sample("held-bass-d.mid") }));
    const r2 = await ask<{ error: string }>(upload(s.dara, multipart(eleven)));
    expect(r2.status).toBe(413);
    expect(r2.data.error).toMatch(/at most 10 files/);
    expect(rows(takes)).toBe(0);
    expect(storedFiles()).toHaveLength(0);
  });

  it("keeps a truncated MIDI file as a failed take (422) so it can be analysed again later", async () => {
    const s = await setup();
    const whole = sample("sunday-ballad-ab.mid");
    const r = await ask<{ id: string; status: string; error: string }>(
      upload(s.dara, multipart([{ name: "cut.mid", bytes: whole.slice(0, 40) }])),
    );
    expect(r.status).toBe(422);
    const body = r.data;
    expect(body.status).toBe("failed");
    expect(body.error).toMatch(/cut short or damaged/);
    const take = db().select().from(takes).where(eq(takes.id, body.id)).get()!;
    expect(take.status).toBe("failed");
    expect(rows(takeMetrics)).toBe(0);
    expect(storedFiles()).toHaveLength(1);
  });

  it("answers 409 with the existing take when the same student sends the same content again", async () => {
    const s = await setup();
    const bytes = sample("held-bass-d.mid");
    const first = await ask<{ id: string }>(upload(s.dara, multipart([{ name: "a.mid", bytes }])));
    const again = await ask<{ id: string }>(upload(s.dara, multipart([{ name: "b.mid", bytes }])));
    expect(again.status).toBe(409);
    expect(again.data.id).toBe(first.data.id);
    expect(storedFiles()).toHaveLength(1);
    // Another student may send the same file: it is their own take.
    const other = await ask(upload(s.felix, multipart([{ name: "a.mid", bytes }])));
    expect(other.status).toBe(201);
  });

  it("grades a take against its exercise and uses the file's own date", async () => {
    const s = await setup();
    const r = await ask<{ id: string; analysis: { summary: { accuracy?: number; key: string } } }>(
      upload(
        s.dara,
        multipart([{ name: "d.mid", bytes: sample("three-chord-smoothing-d.mid") }], {
          exerciseId: s.exercise.id,
          recordedAt: "2026-11-02T18:00:00.000Z",
          note: "second try",
        }),
      ),
    );
    expect(r.status).toBe(201);
    const body = r.data;
    expect(body.analysis.summary.accuracy).toBeTypeOf("number");
    expect(body.analysis.summary.key).toBe("D");
    const take = db().select().from(takes).where(eq(takes.id, body.id)).get()!;
    expect(take.recordedAt.toISOString()).toBe("2026-11-02T18:00:00.000Z");
    expect(take.weekKey).toBe("2026-W45");
    expect(take.key).toBe("D");
    expect(take.note).toBe("second try");
  });
});

describe("reading and managing takes", () => {
  async function uploaded() {
    const s = await setup();
    const r = await ask<{ id: string }>(
      upload(s.dara, multipart([{ name: "d.mid", bytes: sample("clumsy-root-position-d.mid") }])),
    );
    return { ...s, takeId: r.data.id };
  }

  it("serves the take to its student and their teacher, and 403 to another student", async () => {
    const s = await uploaded();
    const mine = await ask<{
      id: string;
      originalName: string;
      analysis: { chords: unknown[]; summary: { analysisVersion: number } };
    }>(get(`/api/takes/${s.takeId}`, s.dara));
    expect(mine.status).toBe(200);
    const body = mine.data;
    expect(body.id).toBe(s.takeId);
    expect(body.analysis.summary.analysisVersion).toBe(ANALYSIS_VERSION);
    expect((await ask(get(`/api/takes/${s.takeId}`, s.ines))).status).toBe(200);
    expect((await ask(get(`/api/takes/${s.takeId}`, s.felix))).status).toBe(403);
    expect((await ask(get(`/api/takes/${s.takeId}/file`, s.felix))).status).toBe(403);
    const list = await ask<{ takes: { id: string }[] }>(get(`/api/takes?student=${s.ids.dara}`, s.ines));
    expect(list.data.takes.map((t) => t.id)).toEqual([s.takeId]);
    expect((await ask(get(`/api/takes?student=${s.ids.dara}`, s.felix))).status).toBe(403);
    expect((await ask(get(`/api/takes`, s.felix))).data).toEqual({ takes: [] });
  });

  it("lets only the take's student delete it, with its rows and file", async () => {
    const s = await uploaded();
    const del = (jar: CookieJar) =>
      ask(
        new Request(`${ORIGIN}/api/takes/${s.takeId}`, {
          method: "DELETE",
          headers: { Cookie: jar.header(), Origin: ORIGIN },
        }),
      );
    expect((await del(s.felix)).status).toBe(403);
    expect((await del(s.ines)).status).toBe(403);
    expect((await del(s.dara)).status).toBe(204);
    expect(rows(takes)).toBe(0);
    expect(rows(takeMetrics)).toBe(0);
    expect(storedFiles()).toHaveLength(0);
  });

  it("re-analyses stored takes whose analysis version is older than the engine's", async () => {
    const s = await uploaded();
    db()
      .update(takes)
      .set({ analysisVersion: ANALYSIS_VERSION - 1 })
      .where(eq(takes.id, s.takeId))
      .run();
    db().delete(takeMetrics).where(eq(takeMetrics.takeId, s.takeId)).run();
    const result = await reanalyseOutdated();
    expect(result).toMatchObject({ total: 1, analysed: 1, failed: 0 });
    expect(db().select().from(takes).where(eq(takes.id, s.takeId)).get()!.analysisVersion).toBe(ANALYSIS_VERSION);
    expect(storedAnalysis(s.takeId)?.chords.length).toBeGreaterThan(0);
    expect((await reanalyseOutdated()).total).toBe(0);
  });

  it("re-analyses outdated takes in the background when the server starts", async () => {
    const s = await uploaded();
    db().update(takes).set({ analysisVersion: 0 }).where(eq(takes.id, s.takeId)).run();
    // The in-process app keeps background work off for the other tests; a started server runs it.
    process.env.NEARNOTE_BACKGROUND = "on";
    resetEnvForTests();
    onTestFinished(() => {
      process.env.NEARNOTE_BACKGROUND = "off";
      resetEnvForTests();
    });
    startBackgroundWork();
    await expect
      .poll(() => db().select().from(takes).where(eq(takes.id, s.takeId)).get()!.analysisVersion, { timeout: 5000 })
      .toBe(ANALYSIS_VERSION);
  });

  it("moves a take to an exercise and grades it against that target", async () => {
    const s = await uploaded();
    const metrics = () => db().select().from(takeMetrics).where(eq(takeMetrics.takeId, s.takeId)).get()!;
    expect(metrics().accuracy).toBeNull();
    await moveTake(s.takeId, s.exercise.id, "D");
    expect(metrics().accuracy).toBeTypeOf("number");
    expect(db().select().from(takes).where(eq(takes.id, s.takeId)).get()!.exerciseId).toBe(s.exercise.id);
    await moveTake(s.takeId, null, null);
    expect(metrics().accuracy).toBeNull();
  });

  it("replaces a take with a new upload and keeps its exercise", async () => {
    const s = await uploaded();
    await moveTake(s.takeId, s.exercise.id, "D");
    const user = (await getSessionUser(get("/", s.dara)))!;
    const take = db().select().from(takes).where(eq(takes.id, s.takeId)).get()!;
    const result = await replaceTakeFromForm(
      upload(s.dara, multipart([{ name: "better.mid", bytes: sample("three-chord-smoothing-d.mid") }])),
      user,
      take,
    );
    expect(result.status).toBe(201);
    const all = db().select().from(takes).all();
    expect(all.map((t) => t.id)).toEqual([result.body.id]);
    expect(all[0].exerciseId).toBe(s.exercise.id);
    expect(storedFiles()).toHaveLength(1);
  });
});

describe("the upload form without JavaScript", () => {
  it("takes several files at once and answers for each", async () => {
    const s = await setup();
    const user = (await getSessionUser(get("/", s.dara)))!;
    const form = multipart(
      [
        { name: "one.mid", bytes: sample("held-bass-d.mid") },
        { name: "two.mid", bytes: sample("minor-colour-g.mid") },
        { name: "three.txt", bytes: new TextEncoder().encode("hello") },
      ],
      {},
      "files",
    );
    const results = await uploadTakesFromForm(upload(s.dara, form), user);
    expect(results.map((r) => [r.fileName, r.status])).toEqual([
      ["one.mid", 201],
      ["two.mid", 201],
      ["three.txt", 415],
    ]);
    expect(rows(takes)).toBe(2);
    expect(storedFiles()).toHaveLength(2);
  });
});
