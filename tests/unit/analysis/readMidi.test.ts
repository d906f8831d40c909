// The reader against the Standard MIDI File 1.0 specification (MMA, RP-001): every file here is
// written byte by byte, so the expected times follow from the spec, not from another parser.
import fc from "fast-check";
import { parseMidi } from "midi-file";
import { describe, expect, it } from "vitest";
import { AnalysisError } from "../../../app/analysis/errors";
import { readMidi } from "../../../app/analysis/readMidi";
import { controller, header, noteOff, noteOn, smf, tempoEvent, trackChunk, vlq } from "./helpers/smf";

function codeOf(fn: () => unknown): string | null {
  try {
    fn();
    return null;
  } catch (e) {
    if (e instanceof AnalysisError) return e.code;
    throw e;
  }
}

// Standard MIDI File 1.0 (MMA, RP-001), "Variable-Length Quantity" table.
const VLQ_TABLE: Array<[number, number[]]> = [
  [0x00000000, [0x00]],
  [0x00000040, [0x40]],
  [0x0000007f, [0x7f]],
  [0x00000080, [0x81, 0x00]],
  [0x00002000, [0xc0, 0x00]],
  [0x00003fff, [0xff, 0x7f]],
  [0x00004000, [0x81, 0x80, 0x00]],
  [0x00100000, [0xc0, 0x80, 0x00]],
  [0x001fffff, [0xff, 0xff, 0x7f]],
  [0x00200000, [0x81, 0x80, 0x80, 0x00]],
  [0x08000000, [0xc0, 0x80, 0x80, 0x00]],
  [0x0fffffff, [0xff, 0xff, 0xff, 0x7f]],
];

describe("variable-length quantities (SMF 1.0 table)", () => {
  it("our test writer produces the spec's bytes", () => {
    for (const [value, bytes] of VLQ_TABLE) expect(vlq(value)).toEqual(bytes);
  });

  it.each(VLQ_TABLE)("a delta time of %i ticks written as the spec's bytes is read back exactly", (value, bytes) => {
    // ppq 1000 and 1000 µs per quarter note make one tick one microsecond.
    const events = [...tempoEvent(0, 1000), ...noteOn(0, 60), ...bytes, 0x80, 60, 0x40];
    const read = readMidi(smf(1000, trackChunk(events)));
    expect(read.notes).toHaveLength(1);
    expect(read.notes[0].start).toBe(0);
    expect(read.notes[0].end).toBeCloseTo(value * 1e-6, 9);
  });

  it("refuses a quantity longer than four bytes", () => {
    const events = [...noteOn(0, 60), 0x81, 0x80, 0x80, 0x80, 0x00, 0x80, 60, 0x40];
    expect(codeOf(() => readMidi(smf(480, trackChunk(events))))).toBe("corrupt");
  });
});

describe("events", () => {
  it("running status: repeated channel messages may omit the status byte", () => {
    // 90 3C 64 | 00 40 64 (running note-on E4) | 83 60 3C 00 (running, velocity 0 = note-off) | 00 40 00
    const events = [0x00, 0x90, 60, 100, 0x00, 64, 100, ...vlq(480), 60, 0, 0x00, 64, 0];
    const read = readMidi(smf(480, trackChunk(events)));
    expect(read.notes.map((n) => [n.midi, n.start, n.end])).toEqual([
      [60, 0, 0.5],
      [64, 0, 0.5],
    ]);
  });

  it("a note-on with velocity 0 is a note-off", () => {
    const events = [...noteOn(0, 62, 90), ...noteOn(240, 62, 0)];
    const read = readMidi(smf(480, trackChunk(events)));
    expect(read.notes).toHaveLength(1);
    expect(read.notes[0].end).toBeCloseTo(0.25, 9);
  });

  it("after a meta or sysex event (which cancel running status) a file still relying on it is read as midi-file reads it", () => {
    // Non-conforming but seen in the wild; the second parser from the registry accepts it too.
    const afterMeta = [...noteOn(0, 60), 0x00, 0xff, 0x01, 0x01, 0x41, ...vlq(480), 60, 0];
    const afterSysex = [...noteOn(0, 60), 0x00, 0xf0, 0x01, 0xf7, ...vlq(480), 60, 0];
    for (const events of [afterMeta, afterSysex]) {
      const bytes = smf(480, trackChunk(events));
      const reference = parseMidi(bytes).tracks[0].filter((e) => e.type === "noteOff");
      expect(reference).toHaveLength(1);
      const read = readMidi(bytes);
      expect(read.notes.map((n) => [n.midi, n.start, n.end])).toEqual([[60, 0, 0.5]]);
    }
  });

  it("running status with nothing to repeat is refused", () => {
    expect(codeOf(() => readMidi(smf(480, trackChunk([0x00, 60, 100]))))).toBe("corrupt");
  });

  it("without a tempo event the tempo is 120 bpm (500,000 µs per quarter note)", () => {
    const read = readMidi(smf(480, trackChunk([...noteOn(480, 60), ...noteOff(960, 60)])));
    expect(read.notes[0].start).toBeCloseTo(0.5, 9);
    expect(read.notes[0].end).toBeCloseTo(1.5, 9);
    expect(read.tempos[0].bpm).toBe(120);
  });

  it("respects the tempo map, including a tempo in another track of a format 1 file", () => {
    const conductor = trackChunk([...tempoEvent(960, 1_000_000)]);
    const music = trackChunk([...noteOn(1440, 60), ...noteOff(480, 60)]);
    const read = readMidi(smf(480, conductor, music));
    // 960 ticks at 120 bpm = 1 s, then 480 ticks at 60 bpm = 1 s.
    expect(read.notes[0].start).toBeCloseTo(2, 9);
    expect(read.notes[0].end).toBeCloseTo(3, 9);
  });

  it("merges all tracks and skips channel 10 (drums)", () => {
    const right = trackChunk([...noteOn(0, 64), ...noteOff(480, 64)]);
    const left = trackChunk([...noteOn(0, 48, 90, 1), ...noteOff(480, 48, 1)]);
    const drums = trackChunk([...noteOn(0, 36, 90, 9), ...noteOff(120, 36, 9)]);
    const read = readMidi(smf(480, right, left, drums));
    expect(read.notes.map((n) => n.midi)).toEqual([48, 64]);
    expect(codeOf(() => readMidi(smf(480, drums)))).toBe("no-notes");
  });

  it("reads the sustain pedal: controller 64 values 0–63 are off, 64–127 on", () => {
    const events = [
      ...controller(0, 64, 64),
      ...noteOn(0, 60),
      ...controller(480, 64, 63),
      ...controller(480, 64, 127),
      ...noteOff(240, 60),
      ...controller(240, 64, 0),
    ];
    const read = readMidi(smf(480, trackChunk(events)));
    expect(read.pedal).toEqual([
      { start: 0, end: 0.5 },
      { start: 1, end: 1.5 },
    ]);
    const neverDown = [...controller(0, 64, 63), ...noteOn(0, 60), ...noteOff(480, 60)];
    expect(readMidi(smf(480, trackChunk(neverDown))).pedal).toEqual([]);
  });

  it("holds a note never released until the end of its track instead of dropping it", () => {
    const read = readMidi(smf(480, trackChunk([...noteOn(0, 60), ...controller(960, 7, 100)])));
    expect(read.notes[0].end).toBeCloseTo(1, 9);
  });

  it("skips chunks of unknown type, as the spec asks", () => {
    const alien = [0x58, 0x59, 0x5a, 0x57, 0, 0, 0, 3, 1, 2, 3];
    const bytes = new Uint8Array([
      ...header(0, 1, 480),
      ...alien,
      ...trackChunk([...noteOn(0, 60), ...noteOff(480, 60)]),
    ]);
    expect(readMidi(bytes).notes).toHaveLength(1);
  });
});

describe("bad input gives typed errors", () => {
  const good = [...header(0, 1, 480), ...trackChunk([...noteOn(0, 60), ...noteOff(480, 60)])];

  it("not-midi: no MThd header", () => {
    expect(codeOf(() => readMidi(new Uint8Array()))).toBe("not-midi");
    expect(codeOf(() => readMidi(new TextEncoder().encode("hello, this is a text file")))).toBe("not-midi");
    expect(codeOf(() => readMidi(new Uint8Array([0x52, 0x49, 0x46, 0x46, ...good.slice(4)])))).toBe("not-midi");
  });

  it("corrupt: truncated anywhere after the header", () => {
    for (let cut = 14; cut < good.length; cut++) {
      const code = codeOf(() => readMidi(new Uint8Array(good.slice(0, cut))));
      expect(code, `cut at ${cut}`).toBe("corrupt");
    }
  });

  it("corrupt: a chunk length past the end, a zero division, a status byte the file format forbids", () => {
    const longChunk = [...header(0, 1, 480), 0x4d, 0x54, 0x72, 0x6b, 0, 0, 0x10, 0, ...noteOn(0, 60)];
    expect(codeOf(() => readMidi(new Uint8Array(longChunk)))).toBe("corrupt");
    expect(codeOf(() => readMidi(smf(0, trackChunk([...noteOn(0, 60), ...noteOff(1, 60)]))))).toBe("corrupt");
    expect(codeOf(() => readMidi(smf(480, trackChunk([0x00, 0xf8, ...noteOn(0, 60)]))))).toBe("corrupt");
    expect(codeOf(() => readMidi(smf(0xe728, trackChunk([...noteOn(0, 60), ...noteOff(1, 60)]))))).toBe("corrupt");
  });

  it("no-notes: a valid file without notes", () => {
    expect(codeOf(() => readMidi(smf(480, trackChunk([...tempoEvent(0, 500000)]))))).toBe("no-notes");
  });

  it("too-long: a take longer than 30 minutes", () => {
    // 3,601 quarter notes at 120 bpm = 1,800.5 s.
    const events = [...noteOn(0, 60), ...noteOff(3601 * 480, 60)];
    expect(codeOf(() => readMidi(smf(480, trackChunk(events))))).toBe("too-long");
    const justUnder = [...noteOn(0, 60), ...noteOff(3599 * 480, 60)];
    expect(codeOf(() => readMidi(smf(480, trackChunk(justUnder))))).toBe(null);
  });

  it("too-many-notes: more than 100,000 notes, found quickly", () => {
    const events: number[] = [0x00, 0x90, 60, 64];
    // Running status: each further event is delta, key, velocity (velocity 0 closes the note).
    for (let i = 0; i < 100_000; i++) events.push(0x00, 60, 0, 0x01, 60, 64);
    const bytes = smf(480, trackChunk(events));
    const t = performance.now();
    expect(codeOf(() => readMidi(bytes))).toBe("too-many-notes");
    // A hang guard, not a benchmark: @tonejs/midi's own reader took 9.5 s for 100,000 notes here.
    expect(performance.now() - t).toBeLessThan(3000);
  });

  it("any bytes at all: a result or a typed error, never a crash (property)", () => {
    fc.assert(
      fc.property(fc.uint8Array({ maxLength: 300 }), fc.boolean(), (tail, withHeader) => {
        const bytes = withHeader ? new Uint8Array([...good.slice(0, 22), ...tail]) : tail;
        try {
          const read = readMidi(bytes);
          for (const n of read.notes) {
            expect(Number.isFinite(n.start) && Number.isFinite(n.end) && n.end >= n.start).toBe(true);
          }
        } catch (e) {
          expect(e).toBeInstanceOf(AnalysisError);
        }
      }),
      { numRuns: 500 },
    );
  });
});
