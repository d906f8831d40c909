// The upload page without JavaScript: the form sends the files picked for the exercise at the
// top (field `files`) and groups of files, each with its own exercise (`file-N`, `exercise-N`);
// every file is filed where its group says. Through the app's real request handler, as a
// browser without scripts posts it. The takes are written with `midi-file` (an independent
// MIDI writer from npm); the chords are spelled from the keys' scale degrees (common practice:
// I IV V I in D is D G A D, vi IV I V in A♭ is Fm D♭ A♭ E♭).
import { readFileSync } from "node:fs";
import path from "node:path";
import { eq } from "drizzle-orm";
import { describe, expect, it } from "vitest";
import { db } from "~/db/client.server";
import { exercises, takes } from "~/db/schema";
import { send } from "../support/app";
import { useFreshApp } from "../support/setup";
import { get, join, makeStudio, makeUser, ORIGIN, signIn } from "./accountsKit";
import { chordsMidi } from "./exercisesKit";

useFreshApp();
const sample = (name: string) => new Uint8Array(readFileSync(path.resolve("samples", name)));

const D_MAJOR = [
  [50, 62, 66, 69],
  [43, 62, 67, 71],
  [45, 61, 64, 69],
  [50, 62, 66, 69],
];
const D_TAKE = chordsMidi([...D_MAJOR, ...D_MAJOR]);
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
  const add = (title: string, keys: string[], progression: string) =>
    db().insert(exercises).values({ studioId: studio.id, title, keys, progression }).returning().get();
  const smoothing = add("Three-chord smoothing", ["D"], "I IV V I");
  const ballad = add("Ballad", ["Ab", "G"], "vi IV I V");
  const minor = add("Minor colour", ["Gm"], "iiø7 V7 i");
  const jar = await signIn(dara.email);
  return { jar, smoothing, ballad, minor };
}

type Part = [string, string] | [string, { name: string; bytes: Uint8Array }];

/** A multipart post in the order a browser sends the form's fields (an empty file field included). */
function postForm(parts: Part[], cookie: string) {
  const form = new FormData();
  for (const [name, value] of parts) {
    if (typeof value === "string") form.append(name, value);
    else form.append(name, new File([new Uint8Array(value.bytes)], value.name, { type: "audio/midi" }));
  }
  return new Request(`${ORIGIN}/takes/new`, {
    method: "POST",
    body: form,
    headers: { Origin: ORIGIN, Cookie: cookie },
  });
}

/** The page as words: tags gone, React's text separators gone, spaces collapsed. */
const textOf = (html: string) =>
  html
    .replace(/<!-- -->/g, "")
    .replace(/<[^>]+>/g, " ")
    .replace(/\s+/g, " ");

const takeOf = (name: string) => db().select().from(takes).where(eq(takes.originalName, name)).get();

describe("the upload page without JavaScript", () => {
  it("offers groups of files, each with its own exercise, inside the page's noscript part", async () => {
    const s = await setup();
    const response = await send(get("/takes/new", s.jar));
    expect(response.status).toBe(200);
    const html = await response.text();
    const noscript = /<noscript>([\s\S]*?)<\/noscript>/.exec(html)?.[1] ?? "";
    expect(noscript).toContain('name="file-0"');
    expect(noscript).toContain('name="exercise-2"');
    expect(noscript).toContain(`value="${s.ballad.id}|Ab"`);
    expect(noscript).toContain(`value="${s.ballad.id}|G"`);
    expect(noscript).toContain('value="free"');
  });

  it("files each take where its group says and lists every result on the page", async () => {
    const s = await setup();
    const response = await send(
      postForm(
        [
          ["exerciseId", s.smoothing.id],
          ["key", ""],
          ["note", "Three exercises today"],
          ["files", { name: "smoothing.mid", bytes: D_TAKE }],
          ["exercise-0", `${s.ballad.id}|Ab`],
          ["file-0", { name: "ballad.mid", bytes: AB_TAKE }],
          ["exercise-1", "free"],
          ["file-1", { name: "free.mid", bytes: sample("minor-colour-g.mid") }],
          // A group left empty: its file field is sent without a file.
          ["exercise-2", s.minor.id],
          ["file-2", { name: "", bytes: new Uint8Array() }],
        ],
        s.jar.header(),
      ),
    );
    expect(response.status).toBe(200);
    const html = textOf(await response.text());
    for (const name of ["smoothing.mid", "ballad.mid", "free.mid"]) expect(html).toContain(`Open take ${name}`);
    expect(html).toContain("Analysed");
    expect(html).not.toContain("Check the exercise");

    const rows = ["smoothing.mid", "ballad.mid", "free.mid"].map(takeOf);
    expect(rows.map((t) => [t?.exerciseId, t?.key, t?.note])).toEqual([
      [s.smoothing.id, "D", "Three exercises today"],
      [s.ballad.id, "Ab", "Three exercises today"],
      [null, null, "Three exercises today"],
    ]);
    expect(db().select().from(takes).all()).toHaveLength(3);
  });

  it("a group's take that does not fit its exercise is flagged on the page with the likely one", async () => {
    const s = await setup();
    const response = await send(
      postForm(
        [
          ["exerciseId", ""],
          ["exercise-0", s.smoothing.id],
          ["file-0", { name: "ballad-filed-wrong.mid", bytes: AB_TAKE }],
        ],
        s.jar.header(),
      ),
    );
    expect(response.status).toBe(200);
    const html = textOf(await response.text());
    expect(html).toContain("Check the exercise.");
    expect(html).toContain("Move it to “Ballad” in A♭");
    expect(takeOf("ballad-filed-wrong.mid")?.exerciseId).toBe(s.smoothing.id);
  });

  it("refuses a group's exercise that is not the student's, keeping no take", async () => {
    const s = await setup();
    const response = await send(
      postForm(
        [
          ["exercise-0", "someone-elses"],
          ["file-0", { name: "a.mid", bytes: D_TAKE }],
        ],
        s.jar.header(),
      ),
    );
    expect(response.status).toBe(200);
    expect(await response.text()).toContain("That exercise is not one of yours.");
    expect(db().select().from(takes).all()).toHaveLength(0);
  });
});
