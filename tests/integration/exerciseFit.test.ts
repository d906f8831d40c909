// Filing takes: each file of an upload goes to its own exercise, and a take filed under an
// exercise it does not fit is flagged with the exercise it likely belongs to. The takes are
// written with `midi-file` (an independent MIDI writer from npm); the chords are spelled from
// the keys' scale degrees (common practice: I IV V I in D is D G A D, vi IV I V in A♭ is
// Fm D♭ A♭ E♭).
import { readFileSync } from "node:fs";
import path from "node:path";
import { eq } from "drizzle-orm";
import { describe, expect, it } from "vitest";
import { db } from "~/db/client.server";
import { exercises, takes } from "~/db/schema";
import { getSessionUser } from "~/auth/session.server";
import { uploadTakesFromForm } from "~/takes/takeUpload.server";
import { fitSentence, likelySentence, type FitNotice } from "~/takes/exerciseFitText";
import { useFreshApp } from "../support/setup";
import { ask } from "../support/app";
import { get, join, makeStudio, makeUser, ORIGIN, signIn } from "./accountsKit";
import { chordsMidi, formPost, uploadTake } from "./exercisesKit";

useFreshApp();
const sample = (name: string) => new Uint8Array(readFileSync(path.resolve("samples", name)));

// I IV V I in D, close position, twice round.
const D_MAJOR = [
  [50, 62, 66, 69],
  [43, 62, 67, 71],
  [45, 61, 64, 69],
  [50, 62, 66, 69],
];
const D_TAKE = chordsMidi([...D_MAJOR, ...D_MAJOR]);
// vi IV I V in A♭: Fm D♭ A♭ E♭, twice round.
const AB_BALLAD = [
  [41, 60, 65, 68],
  [49, 61, 65, 68],
  [44, 60, 63, 68],
  [51, 58, 63, 67],
];
const AB_TAKE = chordsMidi([...AB_BALLAD, ...AB_BALLAD, [44, 60, 63, 68]]);

async function setup() {
  const studio = makeStudio("Harbour Lane");
  const dara = makeUser("dara@harbour.example", "Dara");
  join(studio.id, dara.id, "student");
  const teacher = makeUser("ines@harbour.example", "Ines");
  join(studio.id, teacher.id, "owner");
  const add = (title: string, keys: string[], progression: string) =>
    db().insert(exercises).values({ studioId: studio.id, title, keys, progression }).returning().get();
  const smoothing = add("Three-chord smoothing", ["D"], "I IV V I");
  const ballad = add("Ballad", ["Ab", "G"], "vi IV I V");
  const minor = add("Minor colour", ["Gm"], "iiø7 V7 i");
  const jar = await signIn(dara.email);
  return { studio, jar, user: (await getSessionUser(get("/", jar)))!, smoothing, ballad, minor };
}

function multipart(files: Array<{ name: string; bytes: Uint8Array }>, fields: Array<[string, string]>) {
  const form = new FormData();
  for (const f of files) form.append("files", new File([new Uint8Array(f.bytes)], f.name, { type: "audio/midi" }));
  for (const [k, v] of fields) form.append(k, v);
  return new Request(`${ORIGIN}/takes/new`, { method: "POST", body: form, headers: { Origin: ORIGIN } });
}

const takeRow = (id: string) => db().select().from(takes).where(eq(takes.id, id)).get()!;

describe("each file of an upload to its own exercise", () => {
  it("files three takes under three choices: one exercise in a named key, another, and free practice", async () => {
    const s = await setup();
    const request = multipart(
      [
        { name: "d.mid", bytes: D_TAKE },
        { name: "ballad.mid", bytes: AB_TAKE },
        { name: "free.mid", bytes: sample("minor-colour-g.mid") },
      ],
      [
        ["exerciseId", s.minor.id],
        ["fileExercise", s.smoothing.id],
        ["fileExercise", `${s.ballad.id}|Ab`],
        ["fileExercise", "free"],
      ],
    );
    const results = await uploadTakesFromForm(request, s.user);
    expect(results.map((r) => r.status)).toEqual([201, 201, 201]);
    const rows = results.map((r) => takeRow(r.body.id!));
    expect(rows.map((t) => [t.originalName, t.exerciseId, t.key])).toEqual([
      ["d.mid", s.smoothing.id, "D"],
      ["ballad.mid", s.ballad.id, "Ab"],
      ["free.mid", null, null],
    ]);
    // Both filed takes play every chord of their targets, so neither is flagged.
    expect(results.map((r) => r.body.fit ?? null)).toEqual([null, null, null]);
    expect(rows.map((t) => t.exerciseFit)).toEqual([null, null, null]);
  });

  it("a file without its own choice takes the form's exercise", async () => {
    const s = await setup();
    const results = await uploadTakesFromForm(
      multipart(
        [
          { name: "a.mid", bytes: D_TAKE },
          { name: "b.mid", bytes: AB_TAKE },
        ],
        [
          ["exerciseId", s.smoothing.id],
          ["fileExercise", ""],
          ["fileExercise", s.ballad.id],
        ],
      ),
      s.user,
    );
    expect(results.map((r) => takeRow(r.body.id!).exerciseId)).toEqual([s.smoothing.id, s.ballad.id]);
    // The ballad without a key goes to the exercise's first key.
    expect(takeRow(results[1].body.id!).key).toBe("Ab");
  });

  it("refuses a choice that is not one of the student's exercises, keeping no file", async () => {
    const s = await setup();
    const results = await uploadTakesFromForm(
      multipart([{ name: "a.mid", bytes: D_TAKE }], [["fileExercise", "someone-elses"]]),
      s.user,
    );
    expect(results[0].status).toBe(400);
    expect(results[0].body.error).toMatch(/not one of yours/);
    expect(db().select().from(takes).all()).toHaveLength(0);
  });
});

describe("a take filed under the wrong exercise", () => {
  it("says the key it sounds in and offers the exercise it likely belongs to", async () => {
    const s = await setup();
    const r = await uploadTake(s.jar, AB_TAKE, { exerciseId: s.smoothing.id });
    expect(r.status).toBe(201);
    const fit = (r.body as unknown as { fit: FitNotice }).fit;
    // Fm D♭ A♭ E♭ ending on A♭: A♭ major (or its relative F minor) by any key-finding reading.
    expect(["Ab", "Fm"]).toContain(fit.heardKey);
    expect(fit).toMatchObject({ reason: "key", filedKey: "D", exerciseTitle: "Three-chord smoothing" });
    expect(fit.accuracy).toBeLessThan(0.5);
    expect(fit.likely).toMatchObject({ exerciseId: s.ballad.id, key: "Ab", title: "Ballad" });
    expect(fit.likely!.accuracy).toBe(1);
    expect(fitSentence(fit)).toMatch(/^This sounds like (A♭ major|F minor); “Three-chord smoothing” is in D major/);
    expect(likelySentence(fit)).toBe("It sounds like “Ballad” in A♭ major (100% of its chords).");
    // The verdict stays with the take, for its page.
    expect(takeRow(r.body.id).exerciseFit).toMatchObject({
      reason: "key",
      likely: { exerciseId: s.ballad.id, key: "Ab" },
    });
  });

  it("the right chords in another of the exercise's keys point to that key", async () => {
    const s = await setup();
    // The ballad played in A♭ but filed under its other key, G.
    const r = await uploadTake(s.jar, AB_TAKE, { exerciseId: s.ballad.id, key: "G" });
    const fit = (r.body as unknown as { fit: FitNotice }).fit;
    expect(fit).toMatchObject({ reason: "key", filedKey: "G", likely: { exerciseId: s.ballad.id, key: "Ab" } });
  });

  it("a take that fits its exercise carries no warning", async () => {
    const s = await setup();
    const r = await uploadTake(s.jar, D_TAKE, { exerciseId: s.smoothing.id });
    expect((r.body as unknown as { fit?: FitNotice }).fit).toBeUndefined();
    expect(takeRow(r.body.id).exerciseFit).toBeNull();
  });

  it("the take page shows the warning and one click moves the take, which clears it", async () => {
    const s = await setup();
    const { body } = await uploadTake(s.jar, AB_TAKE, { exerciseId: s.smoothing.id });
    const page = await ask<{ fit: FitNotice | null }>(get(`/takes/${body.id}`, s.jar));
    const shown = page.data.fit;
    expect(shown?.likely).toMatchObject({ exerciseId: s.ballad.id, key: "Ab", title: "Ballad" });

    const moved = await ask(
      formPost(`/takes/${body.id}`, { intent: "move", exerciseId: s.ballad.id, key: "Ab" }, s.jar),
    );
    expect(moved.status).toBe(302);
    const row = takeRow(body.id);
    expect([row.exerciseId, row.key, row.exerciseFit]).toEqual([s.ballad.id, "Ab", null]);
    const after = await ask<{ fit: FitNotice | null }>(get(`/takes/${body.id}`, s.jar));
    expect(after.data.fit).toBeNull();
  });
});
