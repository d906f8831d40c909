// A free-practice take (no exercise) on its page: it says there is no target, names the key it
// is heard in and the open exercise it likely is, and checks it against a progression a person
// names. Through the app's real request handler. The takes are written with `midi-file` (an
// independent MIDI writer from npm); chords spelled from the keys' scale degrees (common
// practice: vi IV I V in A♭ is Fm D♭ A♭ E♭, I IV V I in D is D G A D).
import { eq } from "drizzle-orm";
import { describe, expect, it } from "vitest";
import { db } from "~/db/client.server";
import { exercises, takes } from "~/db/schema";
import { send } from "../support/app";
import { useFreshApp } from "../support/setup";
import { get, join, makeStudio, makeUser, ORIGIN, signIn } from "./accountsKit";
import { chordsMidi, uploadTake } from "./exercisesKit";

useFreshApp();

const FM = [41, 60, 65, 68];
const DB = [49, 61, 65, 68];
const AB = [44, 60, 63, 68];
const EB = [51, 58, 63, 67];
// vi IV I V vi IV in A♭: the target played one and a half times.
const BALLAD_AND_A_HALF = chordsMidi([FM, DB, AB, EB, FM, DB]);
const D_MAJOR = chordsMidi([
  [50, 62, 66, 69],
  [43, 62, 67, 71],
  [45, 61, 64, 69],
  [50, 62, 66, 69],
]);

async function setup() {
  const studio = makeStudio("Harbour Lane");
  const dara = makeUser("dara@harbour.example", "Dara Quill");
  join(studio.id, dara.id, "student");
  const teacher = makeUser("ines@harbour.example", "Ines");
  join(studio.id, teacher.id, "owner");
  const add = (title: string, keys: string[], progression: string) =>
    db().insert(exercises).values({ studioId: studio.id, title, keys, progression }).returning().get();
  const smoothing = add("Three-chord smoothing", ["D"], "I IV V I");
  const ballad = add("Ballad", ["Ab"], "vi IV I V");
  return {
    jar: await signIn(dara.email),
    teacherJar: await signIn(teacher.email),
    smoothing,
    ballad,
  };
}

/** The page as words: tags gone, React's text separators gone, spaces collapsed. */
const textOf = (html: string) =>
  html
    .replace(/<!-- -->/g, "")
    .replace(/<[^>]+>/g, " ")
    .replace(/\s+/g, " ")
    .replace(/ ([.,;:])/g, "$1");

async function pageText(path: string, jar: { header(): string }) {
  const response = await send(get(path, jar as never));
  expect(response.status).toBe(200);
  return textOf(await response.text());
}

describe("a free-practice take's page", () => {
  it("says there is no target, names the heard key and the exercise it likely is", async () => {
    const s = await setup();
    const { body } = await uploadTake(s.jar, BALLAD_AND_A_HALF, {}, "ballad-free.mid");
    const text = await pageText(`/takes/${body.id}`, s.jar);
    expect(text).toContain("Against a progression");
    expect(text).toContain("Free practice: no exercise sets a target for this take, so it has no accuracy");
    // Fm D♭ A♭ E♭ ending on D♭: A♭ major or its relative F minor by any key-finding reading.
    expect(text).toMatch(/It sounds like (A♭ major|F minor)\./);
    // vi IV I V in A♭ played one and a half times: 6 of the 8 chords of two loops (DOMAIN's worked example).
    expect(text).toContain("It plays 75% of the chords of “Ballad” in A♭ major, one of your exercises.");
    expect(text).toContain("File it under “Ballad”");
  });

  it("checks it against a named progression: the one-and-a-half loop of the worked example is 75%", async () => {
    const s = await setup();
    const { body } = await uploadTake(s.jar, BALLAD_AND_A_HALF, {}, "ballad-free.mid");
    const query = new URLSearchParams({ against: "vi IV I V", in: "Ab" });
    const text = await pageText(`/takes/${body.id}?${query}`, s.jar);
    // DOMAIN's worked example: vi IV I V played as vi IV I V vi IV is k = 2, 6 of 8, 75%.
    expect(text).toContain("Against vi IV I V in A♭ major");
    expect(text).toContain("Accuracy 75% of the target (played through 2 times) · 2 differences");
    // Chord symbols as a teacher writes them, with bar lines, read the same way.
    const symbols = new URLSearchParams({ against: "| Fm | Db | Ab | Eb |", in: "Ab" });
    expect(await pageText(`/takes/${body.id}?${symbols}`, s.jar)).toContain("Accuracy 75% of the target");
    // The check is not stored: the take keeps no exercise and no accuracy.
    const row = db().select().from(takes).where(eq(takes.id, body.id!)).get()!;
    expect(row.exerciseId).toBeNull();
  });

  it("names a chord it cannot read instead of a result", async () => {
    const s = await setup();
    const { body } = await uploadTake(s.jar, BALLAD_AND_A_HALF, {}, "ballad-free.mid");
    const text = await pageText(`/takes/${body.id}?${new URLSearchParams({ against: "vi IV Q V", in: "Ab" })}`, s.jar);
    expect(text).toContain("“vi IV Q V” could not be read:");
    expect(text).not.toContain("Accuracy");
  });

  it("a take that follows no open exercise says so; its teacher sees the check without the button", async () => {
    const s = await setup();
    // Three chords of another key only: neither exercise is followed.
    const { body } = await uploadTake(
      s.jar,
      chordsMidi([
        [52, 64, 68, 71],
        [57, 64, 69, 73],
        [52, 64, 68, 71],
      ]),
      {},
    );
    expect(await pageText(`/takes/${body.id}`, s.jar)).toContain(
      "It does not follow the progression of any of your open exercises.",
    );
    const { body: other } = await uploadTake(s.jar, D_MAJOR, {}, "d.mid");
    const teacherText = await pageText(`/takes/${other.id}`, s.teacherJar);
    expect(teacherText).toContain(
      "It plays 100% of the chords of “Three-chord smoothing” in D major, one of Dara’s exercises.",
    );
    expect(teacherText).not.toContain("File it under");
  });

  it("is not shown for a take filed under an exercise, which has its own grading", async () => {
    const s = await setup();
    const { body } = await uploadTake(s.jar, D_MAJOR, { exerciseId: s.smoothing.id });
    const text = await pageText(`/takes/${body.id}`, s.jar);
    expect(text).not.toContain("Against a progression");
    expect(text).toContain("Against the exercise");
  });

  it("the button files the take under the likely exercise", async () => {
    const s = await setup();
    const { body } = await uploadTake(s.jar, BALLAD_AND_A_HALF, {}, "ballad-free.mid");
    const response = await send(
      new Request(`${ORIGIN}/takes/${body.id}`, {
        method: "POST",
        body: new URLSearchParams({ intent: "move", exerciseId: s.ballad.id, key: "Ab" }),
        headers: { Cookie: s.jar.header(), Origin: ORIGIN },
      }),
    );
    expect(response.status).toBe(302);
    const row = db().select().from(takes).where(eq(takes.id, body.id!)).get()!;
    expect([row.exerciseId, row.key]).toEqual([s.ballad.id, "Ab"]);
    const text = await pageText(`/takes/${body.id}`, s.jar);
    expect(text).not.toContain("Against a progression");
    expect(text).toContain("Accuracy 75% of the target");
  });
});
