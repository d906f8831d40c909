import { createHash } from "node:crypto";
import { describe, expect, it } from "vitest";
import { analyseMidi, analyseNotes, readMidi, type TakeAnalysis } from "~/analysis";
import { newFileKey, takeStorage } from "~/takes/takeFiles.server";
import { changeStub, WINDOW_SIZE, type TakeWindow } from "~/takes/takeWindows";
import { analyseTakeBytes } from "~/models/takeAnalysis.server";
import { createTakeRecord } from "~/models/takes.server";
import { writeMidi, type MidiEvent } from "midi-file";
import { generateLongTake } from "../../scripts/lib/takeGenerator";
import { send } from "../support/app";
import { useFreshApp } from "../support/setup";
import { join, makeStudio, makeUser, ORIGIN, signIn, type CookieJar } from "./accountsKit";

// A long take's page carries its summary, time line and one window of changes; the other
// windows come from /api/takes/:id/window under the page's own access rule.
useFreshApp();

/**
 * The engine's work budget refuses every 100,000-note take tried here as too complex to grade,
 * so the big take's analysis is the engine's own, made a tenth at a time (each tenth analysed
 * by itself, at its own times) and laid end to end; a change joins each tenth to the next.
 */
function analysedInTenths(bytes: Uint8Array): TakeAnalysis {
  const notes = readMidi(bytes).notes;
  const end = Math.max(...notes.map((n) => n.end));
  const parts = Array.from({ length: 10 }, (_, i) =>
    analyseNotes(
      notes.filter((n) => n.start >= (end * i) / 10 && (i === 9 || n.start < (end * (i + 1)) / 10)),
      { key: "D" },
    ),
  );
  const chords: TakeAnalysis["chords"] = [];
  const changes: TakeAnalysis["changes"] = [];
  for (const part of parts) {
    const offset = chords.length;
    if (offset > 0) changes.push(changeStub(offset - 1, []));
    chords.push(...part.chords);
    changes.push(...part.changes.map((c) => ({ ...c, from: c.from + offset, to: c.to + offset })));
  }
  return {
    chords,
    changes,
    melodyNotes: parts.flatMap((p) => p.melodyNotes),
    summary: { ...parts[0].summary, chordCount: chords.length, changeCount: changes.length, durationSec: end },
  };
}

async function storeTake(
  studioId: string,
  studentId: string,
  bytes: Uint8Array,
  name: string,
  analysis?: TakeAnalysis,
) {
  const fileKey = newFileKey();
  await takeStorage().put(fileKey, new File([new Uint8Array(bytes)], name, { type: "audio/midi" }));
  return createTakeRecord({
    studentId,
    studioId,
    exerciseId: null,
    key: null,
    note: "",
    fileKey,
    originalName: name,
    size: bytes.length,
    contentHash: createHash("sha256").update(bytes).digest("hex"),
    recordedAt: new Date(),
    outcome: analysis ? { ok: true, analysis } : analyseTakeBytes(bytes, {}),
  });
}

/**
 * A legal take at the engine's note limit: 2,084 harmonies cycling I IV V vi in D, each a
 * four-note chord held under a fast run of 44 single notes on its chord tones (100,000 notes,
 * 28 minutes at 120 bpm). Written with `midi-file` (events in ticks, 192 a beat).
 */
function hundredThousandNoteTake(): Uint8Array {
  const voicings = [
    [38, 54, 57, 62], // D
    [43, 59, 62, 67], // G
    [45, 61, 64, 69], // A
    [47, 62, 66, 71], // Bm
  ];
  type At = { tick: number; on: boolean; note: number };
  const events: At[] = [];
  let notes = 0;
  for (let h = 0; notes < 100_000; h++) {
    const t0 = h * 308;
    const chord = voicings[h % 4];
    for (const note of chord) events.push({ tick: t0, on: true, note }, { tick: t0 + 300, on: false, note });
    notes += 4;
    const run = chord
      .slice(1)
      .flatMap((n) => [n + 12, n + 24])
      .sort((x, y) => x - y);
    for (let k = 0; k < 44 && notes < 100_000; k++, notes++) {
      const note = run[k % run.length];
      events.push({ tick: t0 + 2 + k * 7, on: true, note }, { tick: t0 + 2 + k * 7 + 5, on: false, note });
    }
  }
  events.sort((x, y) => x.tick - y.tick || Number(x.on) - Number(y.on));
  const track: MidiEvent[] = [];
  let last = 0;
  for (const e of events) {
    track.push({
      deltaTime: e.tick - last,
      type: e.on ? "noteOn" : "noteOff",
      channel: 0,
      noteNumber: e.note,
      velocity: e.on ? 80 : 0,
    });
    last = e.tick;
  }
  track.push({ deltaTime: 0, type: "endOfTrack", meta: true });
  return new Uint8Array(writeMidi({ header: { format: 0, numTracks: 1, ticksPerBeat: 192 }, tracks: [track] }));
}

const page = (url: string, jar?: CookieJar, headers: Record<string, string> = {}) =>
  send(new Request(`${ORIGIN}${url}`, { headers: { ...(jar ? { Cookie: jar.header() } : {}), ...headers } }));

async function setup() {
  const studio = makeStudio("Tidewater Keys");
  const other = makeStudio("Harbour Lane");
  const mara = makeUser("mara@tidewater.example", "Mara");
  const jonah = makeUser("jonah@tidewater.example", "Jonah");
  const teacher = makeUser("wren@tidewater.example", "Wren");
  const stranger = makeUser("otto@harbour.example", "Otto");
  join(studio.id, mara.id, "student");
  join(studio.id, jonah.id, "student");
  join(studio.id, teacher.id, "owner");
  join(other.id, stranger.id, "owner");
  const bytes = generateLongTake(10);
  const takeId = await storeTake(studio.id, mara.id, bytes, "long-10min.mid");
  return {
    studio,
    mara,
    bytes,
    takeId,
    maraJar: await signIn(mara.email),
    jonahJar: await signIn(jonah.email),
    teacherJar: await signIn(teacher.email),
    strangerJar: await signIn(stranger.email),
  };
}

describe("take windows over HTTP", () => {
  it("a window of one's own take answers JSON, cached while the analysis holds; others are refused like the page", async () => {
    const s = await setup();
    const analysis = analyseMidi(s.bytes);
    const url = `/api/takes/${s.takeId}/window?from=${3 * WINDOW_SIZE}`;

    const own = await page(url, s.maraJar);
    expect(own.status).toBe(200);
    expect(own.headers.get("content-type")).toMatch(/application\/json/);
    expect(own.headers.get("cache-control")).toMatch(/private/);
    const etag = own.headers.get("etag");
    expect(etag).toBeTruthy();
    const w = (await own.json()) as TakeWindow;
    expect(w.from).toBe(3 * WINDOW_SIZE);
    expect(w.changes).toEqual(analysis.changes.slice(3 * WINDOW_SIZE, 4 * WINDOW_SIZE));
    expect(w.chords[0]).toEqual(analysis.chords[3 * WINDOW_SIZE]);

    // Asked again with the ETag, the browser's copy still holds.
    expect((await page(url, s.maraJar, { "If-None-Match": etag! })).status).toBe(304);
    // The studio's teacher may read it, as they may read the page.
    expect((await page(url, s.teacherJar)).status).toBe(200);

    // Another student of the studio and a teacher of another studio: refused as the page refuses them.
    const pageAsJonah = await page(`/takes/${s.takeId}`, s.jonahJar);
    const windowAsJonah = await page(url, s.jonahJar);
    expect(pageAsJonah.status).toBe(403);
    expect(windowAsJonah.status).toBe(403);
    expect(await windowAsJonah.text()).not.toContain("changes");
    expect((await page(url, s.strangerJar)).status).toBe((await page(`/takes/${s.takeId}`, s.strangerJar)).status);
    // Signed out: 401 in JSON; a take that does not exist: 404, as on the page.
    expect((await page(url)).status).toBe(401);
    expect((await page(`/api/takes/no-such-take/window?from=0`, s.maraJar)).status).toBe(404);
    expect((await page(`/takes/no-such-take`, s.maraJar)).status).toBe(404);
    // A from that is not a change number is refused.
    expect((await page(`/api/takes/${s.takeId}/window?from=abc`, s.maraJar)).status).toBe(400);
  }, 120_000);

  it("the 10-minute take's page stays small and carries its first window; ?change=N opens another window without scripts", async () => {
    const s = await setup();
    const analysis = analyseMidi(s.bytes);
    const res = await page(`/takes/${s.takeId}`, s.maraJar);
    expect(res.status).toBe(200);
    const html = await res.text();
    console.info(
      `take page HTML, 10-minute take (${analysis.chords.length} chords): ${(html.length / 1000).toFixed(1)} kB`,
    );
    expect(html.length).toBeLessThanOrEqual(150_000);
    // The first window's changes are in the page as rows; later changes are not.
    expect(html).toContain('data-change="0"');
    expect(html).not.toContain(`data-change="${analysis.changes.length - 1}"`);

    const last = analysis.changes.length;
    const jumped = await (await page(`/takes/${s.takeId}?change=${last}`, s.maraJar)).text();
    expect(jumped).toContain(`data-change="${last - 1}"`);
    expect(jumped).toContain(`Change ${last}`);
    expect(jumped.length).toBeLessThanOrEqual(150_000);
    // The window the page carries is the one the window route answers.
    const w = (await (await page(`/api/takes/${s.takeId}/window?from=${last - 1}`, s.maraJar)).json()) as TakeWindow;
    expect(w.changes.at(-1)).toEqual(analysis.changes.at(-1));
  }, 120_000);

  it("a 100,000-note take's page stays under 250 kB", async () => {
    const s = await setup();
    const bytes = hundredThousandNoteTake();
    expect(readMidi(bytes).notes).toHaveLength(100_000);
    const analysis = analysedInTenths(bytes);
    expect(analysis.changes.length).toBe(analysis.chords.length - 1);
    const takeId = await storeTake(s.studio.id, s.mara.id, bytes, "dense-100k.mid", analysis);
    const res = await page(`/takes/${takeId}`, s.maraJar);
    expect(res.status).toBe(200);
    const html = await res.text();
    expect(html, /"error\\",\\"([^\\]*)/.exec(html)?.[1]).not.toContain("could not be analysed");
    console.info(`take page HTML, 100,000-note take: ${(html.length / 1000).toFixed(1)} kB`);
    expect(html).toContain("Change by change");
    expect(html.length).toBeLessThanOrEqual(250_000);
    // Every window of it is still there to fetch.
    const lastWindow = (await (await page(`/api/takes/${takeId}/window?from=9999999`, s.maraJar)).json()) as TakeWindow;
    expect(lastWindow.from % WINDOW_SIZE).toBe(0);
    expect(lastWindow.from + lastWindow.changes.length).toBe(lastWindow.from + lastWindow.chords.length - 1);
    expect(lastWindow.changes.at(-1)).toEqual(analysis.changes.at(-1));
    expect(lastWindow.chords.at(-1)).toEqual(analysis.chords.at(-1));
  }, 600_000);
});
