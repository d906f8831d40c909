// Exercises from the teacher's form to a graded take. Expected chords come from the rules of
// RULES.md ("Progressions as teachers write them", "Matching a take to a target"), worked by
// hand below each case; voicings are MIDI numbers (middle C = 60).
import { readFileSync } from "node:fs";
import path from "node:path";
import { eq } from "drizzle-orm";
import { beforeEach, describe, expect, it } from "vitest";
import { db } from "~/db/client.server";
import { exerciseAssignees, exercises, takeMetrics } from "~/db/schema";
import { ALL_MAJOR_KEYS } from "~/utils/exerciseProgression";
import { useFreshApp } from "../support/setup";
import { ask } from "../support/app";
import { CookieJar, get, join, makeStudio, makeUser, signIn } from "./accountsKit";
import { chordsMidi, formPost, uploadAnalysed, uploadTake } from "./exercisesKit";

useFreshApp();

let ines: CookieJar, dara: CookieJar, felix: CookieJar;
let ids: { dara: string; felix: string; studio: string };

beforeEach(async () => {
  const studio = makeStudio("Tidewater Keys");
  const people = {
    ines: makeUser("ines@tidewater.example", "Ines Marlowe"),
    dara: makeUser("dara@tidewater.example", "Dara Okafor"),
    felix: makeUser("felix@tidewater.example", "Felix Brandt"),
  };
  join(studio.id, people.ines.id, "owner");
  join(studio.id, people.dara.id, "student");
  join(studio.id, people.felix.id, "student");
  ines = await signIn(people.ines.email);
  dara = await signIn(people.dara.email);
  felix = await signIn(people.felix.email);
  ids = { dara: people.dara.id, felix: people.felix.id, studio: studio.id };
});

const base = {
  title: "Drill",
  keyChoice: "listed",
  keys: "D",
  progression: "I IV V I",
  tempo: "72",
  dueDate: "2026-12-10",
  instructions: "",
  assignedTo: "studio",
};

async function createExercise(fields: Record<string, string>, extra: Array<[string, string]> = []) {
  const r = await ask(formPost("/exercises/new", [...Object.entries({ ...base, ...fields }), ...extra], ines));
  expect(r.status, JSON.stringify(r.data)).toBe(302);
  return r.location!.split("/").pop()!;
}

async function expanded(id: string, jar = ines) {
  const r = await ask<{ expanded: Array<{ key: string; chords: Array<{ symbol: string; roman: string | null }> }> }>(
    get(`/exercises/${id}`, jar),
  );
  expect(r.status).toBe(200);
  return r.data.expanded;
}

const symbols = (e: Awaited<ReturnType<typeof expanded>>, key: string) =>
  e.find((k) => k.key === key)!.chords.map((c) => c.symbol);

describe("setting exercises", () => {
  it("takes chord symbols and shows them with their numerals", async () => {
    const id = await createExercise({ keys: "Eb", progression: "Eb Bb/D Cm Cm/Bb Ab", title: "Falling bass in E♭" });
    const e = await expanded(id);
    expect(symbols(e, "Eb")).toEqual(["Eb", "Bb/D", "Cm", "Cm/Bb", "Ab"]);
    // In E flat: Eb = I, Bb = V, Cm = vi, Ab = IV.
    expect(e[0].chords.map((c) => c.roman)).toEqual(["I", "V", "vi", "vi", "IV"]);
    const row = db().select().from(exercises).where(eq(exercises.id, id)).get()!;
    expect(row).toMatchObject({
      title: "Falling bass in E♭",
      keys: ["Eb"],
      tempo: 72,
      dueDate: "2026-12-10",
      assignedTo: "studio",
    });
  });

  it("reads Roman numerals in a major key (D: I IV V I = D G A D) and a minor key (G minor: iiø7 V7 i = Am7b5 D7 Gm)", async () => {
    const major = await createExercise({ keys: "D", progression: "I IV V I" });
    expect(symbols(await expanded(major), "D")).toEqual(["D", "G", "A", "D"]);
    // Minor keys use the natural minor with a major V unless written v (RULES.md): ii° of G minor
    // is A C Eb (+G = Am7b5), V7 is D F# A C, i is G Bb D.
    const minor = await createExercise({ keys: "Gm", progression: "iiø7 V7 i" }, [["focusTechniques", "added-second"]]);
    expect(symbols(await expanded(minor), "Gm")).toEqual(["Am7b5", "D7", "Gm"]);
    expect(db().select().from(exercises).where(eq(exercises.id, minor)).get()!.focusTechniques).toEqual([
      "added-second",
    ]);
  });

  it("sets an exercise in all twelve keys, transposing chord symbols from the first", async () => {
    const id = await createExercise({ keyChoice: "all-major", keys: "", progression: "C F G C" });
    const e = await expanded(id);
    expect(e.map((k) => k.key)).toEqual(ALL_MAJOR_KEYS);
    // Each key's I IV V I, worked by hand from the major scale.
    expect(symbols(e, "C")).toEqual(["C", "F", "G", "C"]);
    expect(symbols(e, "Db")).toEqual(["Db", "Gb", "Ab", "Db"]);
    expect(symbols(e, "F#")).toEqual(["F#", "B", "C#", "F#"]);
    expect(symbols(e, "Bb")).toEqual(["Bb", "Eb", "F", "Bb"]);
  });

  it("refuses a malformed progression, naming the bad token and its position", async () => {
    const r = await ask<{ fieldErrors: { progression: string } }>(
      formPost("/exercises/new", { ...base, progression: "I IV Vx7 I" }, ines),
    );
    expect(r.status).toBe(400);
    expect(r.data.fieldErrors.progression).toContain('Token 3 "Vx7"');
    expect(db().select().from(exercises).all()).toHaveLength(0);
  });

  it("refuses students, and a bad tempo, with field errors", async () => {
    const asStudent = await ask(formPost("/exercises/new", base, dara));
    expect(asStudent.status).toBe(403);
    const r = await ask<{ fieldErrors: { tempo: string } }>(
      formPost("/exercises/new", { ...base, tempo: "900" }, ines),
    );
    expect(r.status).toBe(400);
    expect(r.data.fieldErrors.tempo).toMatch(/20–300/);
  });

  it("edits and archives; archived exercises leave the students' list", async () => {
    const id = await createExercise({});
    const edit = await ask(
      formPost(`/exercises/${id}/edit`, { ...base, title: "Drill two", progression: "I vi IV V" }, ines),
    );
    expect(edit.status).toBe(302);
    expect(db().select().from(exercises).where(eq(exercises.id, id)).get()).toMatchObject({
      title: "Drill two",
      progression: "I vi IV V",
    });
    const studentList = async () =>
      (await ask<{ student: { due: Array<{ id: string }> } }>(get("/exercises", dara))).data;
    expect((await studentList()).student.due.map((e) => e.id)).toEqual([id]);
    expect((await ask(formPost(`/exercises/${id}`, { intent: "archive" }, ines))).status).toBe(302);
    expect((await studentList()).student.due).toEqual([]);
    const teacherList = (
      await ask<{
        teacher: Array<{ id: string; archived: boolean }>;
      }>(get("/exercises", ines))
    ).data;
    expect(teacherList.teacher).toEqual([expect.objectContaining({ id, archived: true })]);
  });
});

describe("assigned to chosen students", () => {
  it("only those students see it, list and page alike, and only they can send takes for it", async () => {
    const id = await createExercise({ assignedTo: "students" }, [["students", ids.dara]]);
    expect(db().select().from(exerciseAssignees).all()).toEqual([{ exerciseId: id, userId: ids.dara }]);
    const listOf = async (jar: CookieJar) =>
      (await ask<{ student: { due: Array<{ id: string }> } }>(get("/exercises", jar))).data.student.due.map(
        (e) => e.id,
      );
    expect(await listOf(dara)).toEqual([id]);
    expect(await listOf(felix)).toEqual([]);
    expect((await ask(get(`/exercises/${id}`, dara))).status).toBe(200);
    expect((await ask(get(`/exercises/${id}`, felix))).status).toBe(403);
    const refused = await uploadTake(
      felix,
      chordsMidi([
        [62, 66, 69],
        [62, 67, 71],
      ]),
      { exerciseId: id },
    );
    expect(refused.status).toBe(400);
  });

  it("refuses an empty choice", async () => {
    const r = await ask<{ fieldErrors: { students: string } }>(
      formPost("/exercises/new", { ...base, assignedTo: "students" }, ines),
    );
    expect(r.status).toBe(400);
    expect(r.data.fieldErrors.students).toMatch(/at least one/);
  });
});

// Voicings used below (right hand, close position):
const D = [62, 66, 69]; // D4 F#4 A4
const G = [62, 67, 71]; // D4 G4 B4 (G, 2nd inversion)
const A = [61, 64, 69]; // C#4 E4 A4
const Bm = [62, 66, 71]; // D4 F#4 B4: B minor over D
describe("grading takes against the exercise", () => {
  it("D G A D against I IV V I in D: every chord matched, accuracy 1, no mismatches", async () => {
    const id = await createExercise({});
    const body = await uploadAnalysed(dara, chordsMidi([D, G, A, D]), { exerciseId: id, key: "D" });
    expect(body.analysis.summary.accuracy).toBe(1);
    expect(body.analysis.summary.mismatches).toEqual([]);
  });

  it("D G Bm D: the third chord is the wrong chord (B minor for A), 3 of 4 = 0.75", async () => {
    const id = await createExercise({});
    const body = await uploadAnalysed(dara, chordsMidi([D, G, Bm, D]), { exerciseId: id, key: "D" });
    expect(body.analysis.summary.accuracy).toBe(0.75);
    expect(body.analysis.summary.mismatches).toEqual([
      { kind: "wrong-chord", targetIndex: 2, playedIndex: 2, expected: "A", pass: 0 },
    ]);
  });

  it("a take that loops the target: vi IV I V played one and a half times in A♭ is k = 2, 6 of 8 = 0.75 (RULES.md example)", async () => {
    const id = await createExercise({ keys: "Ab", progression: "vi IV I V" });
    const Fm = [65, 68, 72]; // F4 Ab4 C5
    const Db = [65, 68, 73]; // F4 Ab4 Db5
    const Ab = [63, 68, 72]; // Eb4 Ab4 C5
    const Eb = [63, 67, 70]; // Eb4 G4 Bb4
    const body = await uploadAnalysed(dara, chordsMidi([Fm, Db, Ab, Eb, Fm, Db]), { exerciseId: id, key: "Ab" });
    const s = body.analysis.summary;
    expect(s.loops).toBe(2);
    expect(s.accuracy).toBe(0.75);
    // The second time through, I and V were never played.
    expect(s.mismatches).toEqual([
      { kind: "missing", targetIndex: 2, playedIndex: null, expected: "Ab", pass: 1 },
      { kind: "missing", targetIndex: 3, playedIndex: null, expected: "Eb", pass: 1 },
    ]);
  });

  it("grades the sample take samples/sunday-ballad-ab.mid (Fm Db Ab Eb Fm Db, open voicings) sent for the A♭ exercise", async () => {
    const id = await createExercise({ keys: "Ab", progression: "vi IV I V" }, [["focusTechniques", "open-voicing"]]);
    const bytes = new Uint8Array(readFileSync(path.resolve("samples", "sunday-ballad-ab.mid")));
    const body = await uploadAnalysed(dara, bytes, { exerciseId: id, key: "Ab" });
    // RULES.md's own matching example: one and a half times through is k = 2, 6 of 8.
    expect(body.analysis.summary).toMatchObject({ loops: 2, accuracy: 0.75 });
    expect(body.analysis.summary.mismatches!.map((m) => [m.kind, m.expected, m.pass])).toEqual([
      ["missing", "Ab", 1],
      ["missing", "Eb", 1],
    ]);
    const page = (
      await ask<{
        mine: Array<{ key: string; takes: Array<{ accuracy: number | null }> }>;
      }>(get(`/exercises/${id}`, dara))
    ).data;
    expect(page.mine[0].takes.map((t) => t.accuracy)).toEqual([0.75]);
  });

  it("the target played twice through in full is k = 2 and accuracy 1", async () => {
    const id = await createExercise({});
    const body = await uploadAnalysed(dara, chordsMidi([D, G, A, D, G, A, D]), { exerciseId: id, key: "D" });
    expect(body.analysis.summary.loops).toBe(2);
    expect(body.analysis.summary.accuracy).toBe(1);
  });

  it("grades a take in another key against the chord symbols moved there, bass included", async () => {
    const id = await createExercise({ keys: "Eb F", progression: "Eb Bb/D Cm Cm/Bb Ab" });
    // In F the target is F C/E Dm Dm/C Bb (each symbol up a whole tone).
    const F = [65, 69, 72];
    const CoverE = [52, 60, 64, 67]; // E3 under C4 E4 G4
    const Dm = [62, 65, 69];
    const DmOverC = [48, 62, 65, 69]; // C3 under D4 F4 A4
    const Bb = [58, 62, 65];
    const good = await uploadAnalysed(dara, chordsMidi([F, CoverE, Dm, DmOverC, Bb]), { exerciseId: id, key: "F" });
    expect(good.analysis.summary.accuracy).toBe(1);
    const CoverC = [48, 60, 64, 67]; // the C chord with C in the bass instead of E
    const wrongBass = await uploadAnalysed(dara, chordsMidi([F, CoverC, Dm, DmOverC, Bb].map((c) => c.map((n) => n))), {
      exerciseId: id,
      key: "F",
    });
    expect(wrongBass.analysis.summary.accuracy).toBe(0.8);
    expect(wrongBass.analysis.summary.mismatches).toEqual([
      { kind: "wrong-bass", targetIndex: 1, playedIndex: 1, expected: "C/E", pass: 0 },
    ]);
  });

  it("shows the student's takes and best score per key on the exercise and the list", async () => {
    const id = await createExercise({ keys: "D G" });
    const first = await uploadAnalysed(dara, chordsMidi([D, G, Bm, D]), { exerciseId: id, key: "D" });
    const second = await uploadAnalysed(dara, chordsMidi([D, G, A, D]), { exerciseId: id, key: "D" });
    const page = (
      await ask<{
        mine: Array<{ key: string; takes: Array<{ id: string }>; best: number | null }>;
      }>(get(`/exercises/${id}`, dara))
    ).data;
    expect(page.mine.map((p) => [p.key, p.takes.length])).toEqual([
      ["D", 2],
      ["G", 0],
    ]);
    expect(page.mine[0].best).toBe(Math.max(first.analysis.summary.score, second.analysis.summary.score));
    const list = (
      await ask<{
        student: { due: Array<{ id: string }>; done: unknown[] };
      }>(get("/exercises", dara))
    ).data;
    expect(list.student.due.map((e) => e.id)).toEqual([id]); // G has no take yet: still to do
    await uploadAnalysed(
      dara,
      chordsMidi([
        [67, 71, 74],
        [67, 72, 76],
        [66, 69, 74],
        [67, 71, 74],
      ]),
      { exerciseId: id, key: "G" },
    );
    const after = (
      await ask<{
        student: { due: unknown[]; done: Array<{ id: string }> };
      }>(get("/exercises", dara))
    ).data;
    expect(after.student.done.map((e) => e.id)).toEqual([id]);
    const teacher = (
      await ask<{
        students: Array<{ name: string; done: boolean }>;
      }>(get(`/exercises/${id}`, ines))
    ).data;
    expect(teacher.students).toEqual([
      expect.objectContaining({ name: "Dara Okafor", done: true }),
      expect.objectContaining({ name: "Felix Brandt", done: false }),
    ]);
  });
});

describe("editing the target and the model answer", () => {
  it("grades the takes sent again when the progression changes", async () => {
    const id = await createExercise({});
    const body = await uploadAnalysed(dara, chordsMidi([D, G, Bm, D]), { exerciseId: id, key: "D" });
    expect(body.analysis.summary.accuracy).toBe(0.75);
    // Now the target is I IV vi I: B minor is what was asked for.
    const r = await ask(formPost(`/exercises/${id}/edit`, { ...base, progression: "I IV vi I" }, ines));
    expect(r.status).toBe(302);
    expect(db().select().from(takeMetrics).where(eq(takeMetrics.takeId, body.id)).get()!.accuracy).toBe(1);
  });

  it("saves a starting voicing only when it holds the first chord's tones", async () => {
    const id = await createExercise({});
    const save = (notes: string) => ask(formPost(`/exercises/${id}`, { intent: "model-start", notes }, ines));
    expect((await save("57,62,65")).status).toBe(400); // A3 D4 F4: F natural is not in D major
    expect((await save("57,62,66")).status).toBe(302); // A3 D4 F#4
    expect(db().select().from(exercises).where(eq(exercises.id, id)).get()!.modelStart).toEqual([57, 62, 66]);
    expect((await ask(formPost(`/exercises/${id}`, { intent: "model-start", notes: "57,62,66" }, dara))).status).toBe(
      403,
    );
  });

  it("attaches the teacher's own model take, plays it back as notes, refuses a file that is not MIDI, and removes it", async () => {
    const id = await createExercise({});
    const attach = (bytes: Uint8Array, name: string) => {
      const form = new FormData();
      form.append("file", new File([new Uint8Array(bytes)], name, { type: "audio/midi" }));
      return ask(
        new Request(`http://127.0.0.1:3000/exercises/${id}?intent=model-take`, {
          method: "POST",
          body: form,
          headers: { Cookie: ines.header(), Origin: "http://127.0.0.1:3000" },
        }),
      );
    };
    expect((await attach(new TextEncoder().encode("not a midi file at all"), "notes.txt")).status).toBe(400);
    expect((await attach(chordsMidi([D, G, A, D]), "model.mid")).status).toBe(302);
    const page = (
      await ask<{
        modelTake: { name: string; notes: Array<{ midi: number }> };
      }>(get(`/exercises/${id}`, dara))
    ).data;
    expect(page.modelTake.name).toBe("model.mid");
    expect(page.modelTake.notes.map((n) => n.midi)).toEqual([D, G, A, D].flat());
    expect((await ask(formPost(`/exercises/${id}`, { intent: "remove-model-take" }, ines))).status).toBe(302);
    expect(
      (
        await ask<{
          modelTake: unknown;
        }>(get(`/exercises/${id}`, dara))
      ).data.modelTake,
    ).toBeNull();
  });
});
