import Database from "better-sqlite3";
import { createHash } from "node:crypto";
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { db } from "~/db/client.server";
import { env } from "~/server/env.server";
import { analyseTakeBytes, storedAnalysis, writeAnalysisRows } from "~/models/takeAnalysis.server";
import { createTakeRecord, getTakeView } from "~/models/takes.server";
import { newFileKey, readTakeNotes, removeTakeFile, takeStorage } from "~/takes/takeFiles.server";
import { useFreshApp } from "../support/setup";
import { join, makeStudio, makeUser } from "./accountsKit";

// Stored analyses and take files are parsed once and shared between requests; every way the
// stored analysis can change must show on the next read.
useFreshApp();

const heldBass = new Uint8Array(readFileSync("samples/held-bass-d.mid"));
const fallingBass = new Uint8Array(readFileSync("samples/falling-bass-eb.mid"));

function analysed(bytes: Uint8Array) {
  const outcome = analyseTakeBytes(bytes, {});
  if (!outcome.ok) throw new Error(outcome.error);
  return outcome.analysis;
}

async function storedTake(bytes: Uint8Array) {
  const studio = makeStudio("Tidewater Keys");
  const student = makeUser("mara@tidewater.example", "Mara");
  join(studio.id, student.id, "student");
  const fileKey = newFileKey();
  await takeStorage().put(fileKey, new File([new Uint8Array(bytes)], "take.mid", { type: "audio/midi" }));
  const id = createTakeRecord({
    studentId: student.id,
    studioId: studio.id,
    exerciseId: null,
    key: null,
    note: "",
    fileKey,
    originalName: "take.mid",
    size: bytes.length,
    contentHash: createHash("sha256").update(bytes).digest("hex"),
    recordedAt: new Date(),
    outcome: { ok: true, analysis: analysed(bytes) },
  });
  return { id, fileKey };
}

describe("stored analyses read once", () => {
  it("answers the stored JSON, the same frozen object on the next read, and null for a take without one", async () => {
    const { id } = await storedTake(heldBass);
    const first = storedAnalysis(id);
    expect(first).toEqual(analysed(heldBass));
    expect(storedAnalysis(id)).toBe(first);
    expect(Object.isFrozen(first!.chords[0])).toBe(true);
    expect(() => (first!.chords as unknown[]).push(1)).toThrow(TypeError);
    expect(storedAnalysis("no-such-take")).toBeNull();
    const view = await getTakeView(id);
    expect(view!.analysis).toBe(first);
  });

  it("shows a re-analysis written by this process, and keeps a rolled-back one out", async () => {
    const { id } = await storedTake(heldBass);
    expect(storedAnalysis(id)!.summary).toEqual(analysed(heldBass).summary);
    db().transaction((tx) => writeAnalysisRows(tx, id, analysed(fallingBass)));
    expect(storedAnalysis(id)).toEqual(analysed(fallingBass));
    expect(() =>
      db().transaction((tx) => {
        writeAnalysisRows(tx, id, analysed(heldBass));
        // Read inside the transaction: seen there, but not kept.
        expect(storedAnalysis(id)).toEqual(analysed(heldBass));
        throw new Error("roll back");
      }),
    ).toThrow("roll back");
    expect(storedAnalysis(id)).toEqual(analysed(fallingBass));
  });

  it("shows a change another connection (a script) committed to the database", async () => {
    const { id } = await storedTake(heldBass);
    expect(storedAnalysis(id)).toEqual(analysed(heldBass));
    const other = new Database(env().databasePath);
    try {
      other
        .prepare("UPDATE take_metrics SET analysis = ? WHERE take_id = ?")
        .run(JSON.stringify(analysed(fallingBass)), id);
    } finally {
      other.close();
    }
    expect(storedAnalysis(id)).toEqual(analysed(fallingBass));
  });

  it("reads a take file's notes once, and not after the file is removed", async () => {
    const { fileKey } = await storedTake(heldBass);
    const notes = await readTakeNotes(fileKey);
    expect(notes!.notes.length).toBeGreaterThan(0);
    expect(await readTakeNotes(fileKey)).toBe(notes);
    expect(Object.isFrozen(notes!.notes[0])).toBe(true);
    await removeTakeFile(fileKey);
    expect(await readTakeNotes(fileKey)).toBeNull();
  });
});
