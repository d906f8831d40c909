// The worst case the upload limits allow (2 MiB, 100,000 notes, 30 minutes): a file of random
// eight-note chords, the densest voicings the engine still grades (RULES.md rule 8). It must
// finish, graded or refused as too complex, within the whole-take budget. A hang guard only:
// times are measured by `npm run bench`, not asserted here.
import { describe, expect, it } from "vitest";
import { analyseMidi } from "../../../app/analysis/index";
import { AnalysisError, MAX_TAKE_NOTES, MAX_TAKE_SECONDS } from "../../../app/analysis/errors";
import { smf, tempoEvent, trackChunk, vlq } from "./helpers/smf";

const UPLOAD_BYTES = 2 * 1024 * 1024;

/** A seeded generator, so that every run checks the same file. */
function rng(seed: number): () => number {
  let s = seed >>> 0;
  return () => {
    s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
    return s / 2 ** 32;
  };
}

/**
 * `count` chords of eight distinct random keys (A0–C8), each `ticks` long at 480 ticks per
 * beat, 120 bpm, written as compactly as Standard MIDI File 1.0 allows (MMA, RP-001): one
 * note-on status byte then running status, and a note-on of velocity 0 as each note-off.
 */
function randomEightNoteChords(count: number, ticks: number, seed: number): Uint8Array {
  const r = rng(seed);
  const events: number[] = [...tempoEvent(0, 500_000), 0x00, 0x90, 0x15, 0x00]; // status, then a silent A0 release
  for (let c = 0; c < count; c++) {
    const keys = new Set<number>();
    while (keys.size < 8) keys.add(21 + Math.floor(r() * 88));
    const list = [...keys];
    list.forEach((k, i) => events.push(...vlq(i === 0 && c > 0 ? 1 : 0), k, 80));
    list.forEach((k, i) => events.push(...vlq(i === 0 ? ticks - 1 : 0), k, 0));
  }
  return smf(480, trackChunk(events));
}

describe("worst case within the upload limits", () => {
  it("random eight-note chords up to the note limit are graded or refused as too complex", { timeout: 300_000 }, () => {
    const count = MAX_TAKE_NOTES / 8;
    const ticks = 134; // 0.14 s per chord at 120 bpm: 12,500 chords in 29 minutes
    expect((count * ticks) / 480 / 2).toBeLessThan(MAX_TAKE_SECONDS);
    const bytes = randomEightNoteChords(count, ticks, 20261202);
    expect(bytes.length).toBeLessThanOrEqual(UPLOAD_BYTES);
    const t0 = performance.now();
    let outcome: string;
    try {
      const result = analyseMidi(bytes);
      outcome = `graded ${result.changes.length} changes`;
      expect(result.chords.length).toBeGreaterThan(0);
    } catch (e) {
      expect(e).toBeInstanceOf(AnalysisError);
      expect((e as AnalysisError).code).toBe("too-complex");
      outcome = "refused as too complex";
    }
    console.log(`worst case: ${bytes.length} bytes, ${outcome} in ${(performance.now() - t0).toFixed(0)} ms`);
  });

  it("forty random eight-note chords (under 2 KB) are graded", { timeout: 60_000 }, () => {
    const bytes = randomEightNoteChords(40, 480, 7);
    expect(bytes.length).toBeLessThan(2048);
    const t0 = performance.now();
    const result = analyseMidi(bytes);
    console.log(
      `forty eight-note chords: graded ${result.changes.length} changes in ${(performance.now() - t0).toFixed(0)} ms`,
    );
    expect(result.changes.filter((c) => c.graded).length).toBeGreaterThan(0);
  });
});
