// The whole engine: analyseMidi's JSON shape, every sample showing what it was made to show,
// properties of the pipeline, and hang guards for hostile files.
import { readFileSync } from "node:fs";
import { join } from "node:path";
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import {
  analyseMidi,
  analyseNotes,
  AnalysisError,
  ANALYSIS_VERSION,
  ProgressionError,
} from "../../../app/analysis/index";
import type { NoteEvent } from "../../../app/analysis/types";
import { SAMPLE_TAKES } from "../../../scripts/lib/sampleTakes";
import { EXERCISES, generateTake } from "../../../scripts/lib/takeGenerator";
import { chordEvents, noteOff, noteOn, smf, trackChunk } from "./helpers/smf";

const sample = (file: string) => new Uint8Array(readFileSync(join(__dirname, "../../../samples", file)));

describe("analyseMidi output shape (the JSON contract of npm run analyse -- --json)", () => {
  // Analysed inside each test, never at collection: a mutation run then knows which tests
  // reach which code, instead of treating the whole engine as run by every test.
  const analyseD = () => analyseMidi(sample("three-chord-smoothing-d.mid"), { key: "D", target: "I IV V I" });

  it("has chords[], melodyNotes[], changes[] and summary with every named field", () => {
    const a = analyseD();
    expect(Object.keys(a).sort()).toEqual(["changes", "chords", "melodyNotes", "summary"]);
    for (const c of a.chords) {
      for (const f of [
        "startSec",
        "endSec",
        "notes",
        "graceNotes",
        "root",
        "bass",
        "symbol",
        "roman",
        "inversion",
        "upperInversion",
        "voicing",
        "topNote",
        "flags",
        "techniques",
      ]) {
        expect(c, f).toHaveProperty(f);
      }
      expect(c.notes).toEqual([...c.notes].sort((x, y) => x - y));
    }
    expect(a.changes).toHaveLength(a.chords.length - 1);
    for (const ch of a.changes) {
      for (const f of ["from", "to", "motion", "bestMotion", "bestVoicing", "suggestions", "flags"])
        expect(ch, f).toHaveProperty(f);
      expect(ch.to).toBe(ch.from + 1);
      expect(ch.suggestions.length).toBeLessThanOrEqual(3);
    }
    for (const f of [
      "chordCount",
      "totalMotion",
      "bestTotalMotion",
      "smoothness",
      "rootPositionLeaps",
      "flags",
      "techniques",
      "key",
      "score",
      "analysisVersion",
      "accuracy",
      "mismatches",
    ]) {
      expect(a.summary, f).toHaveProperty(f);
    }
    expect(a.summary.analysisVersion).toBe(ANALYSIS_VERSION);
    expect(JSON.parse(JSON.stringify(a))).toEqual(a);
  });

  it("names the D exercise I IV V I twice, matching the target fully", () => {
    const a = analyseD();
    // The I that ends the first time through and the I that begins the second are one chord
    // re-struck: one harmony (RULES.md rule 15). The right hand's inversions over the left
    // hand's roots take no figures: the bass is the root.
    expect(a.chords.map((c) => c.roman)).toEqual(["I", "IV", "V", "I", "IV", "V", "I"]);
    expect(a.summary.accuracy).toBe(1);
    expect(a.summary.mismatches).toEqual([]);
    expect(a.summary.key).toBe("D");
    expect(a.summary.keySource).toBe("given");
  });

  it("reports a tune over held chords as melody notes apart from the chords (rule 18)", () => {
    // C3 G3 E4 held under E5 D5 C5, then F3 A3 C4 under F5 (RULES.md rule 15's worked example, extended).
    const lh = (keys: number[], length: number) => chordEvents(0, keys, length);
    const bytes = smf(
      480,
      trackChunk([...lh([48, 55, 64], 960)]),
      trackChunk([
        ...noteOn(0, 76),
        ...noteOff(240, 76),
        ...noteOn(0, 74),
        ...noteOff(120, 74),
        ...noteOn(0, 72),
        ...noteOff(600, 72),
      ]),
      trackChunk([
        ...noteOn(960, 53),
        ...noteOn(0, 57),
        ...noteOn(0, 60),
        ...noteOn(0, 77),
        ...noteOff(960, 53),
        ...noteOff(0, 57),
        ...noteOff(0, 60),
        ...noteOff(0, 77),
      ]),
    );
    const r = analyseMidi(bytes);
    expect(r.chords.map((c) => c.symbol)).toEqual(["C", "F"]);
    expect(r.chords[0].notes).toEqual([48, 55, 64, 76]);
    expect(r.melodyNotes.map((m) => m.note)).toEqual([76, 74, 72, 77]);
    expect(r.chords[0].nonChordTones.map((t) => [t.note, t.kind])).toEqual([[74, "passing"]]);
    expect(r.changes).toHaveLength(1);
  });

  it("a single note between chords, with nothing under it, is no chord of its own", () => {
    const bytes = smf(
      480,
      trackChunk([
        ...chordEvents(0, [60, 64, 67], 400),
        ...noteOn(80, 72),
        ...noteOff(200, 72),
        ...chordEvents(200, [60, 65, 69], 400),
      ]),
    );
    const r = analyseMidi(bytes);
    // C4 F4 A4 has C in the bass: F/C.
    expect(r.chords.map((c) => c.symbol)).toEqual(["C", "F/C"]);
    expect(r.changes).toHaveLength(1);
    expect(r.changes[0].motion).toBe(3);
  });
});

describe("sample takes show what they were made to show", () => {
  it.each(SAMPLE_TAKES.map((s) => [s.file, s] as const))("%s", (file, s) => {
    const r = analyseMidi(sample(file), { key: s.key, target: s.target });
    for (const t of s.shows.techniques ?? []) expect(r.summary.techniques[t], t).toBeGreaterThan(0);
    for (const f of s.shows.flags ?? []) expect(r.summary.flags[f], f).toBeGreaterThan(0);
    if (s.shows.heldNotes) expect(r.chords.some((c) => c.heldNotes.length > 0)).toBe(true);
    if (s.shows.graceNotes) expect(r.chords.some((c) => c.graceNotes.length > 0)).toBe(true);
    if (!s.shows.flags) expect(Object.values(r.summary.flags).every((n) => n === 0)).toBe(true);
    if (s.shows.accuracy !== undefined) expect(r.summary.accuracy).toBe(s.shows.accuracy);
  });

  it("the late left hand of the ballad merges into each chord (rule 3)", () => {
    const r = analyseMidi(sample("sunday-ballad-ab.mid"), { key: "Ab", target: "vi IV I V" });
    expect(r.melodyNotes).toEqual([]);
    expect(r.chords.map((c) => c.symbol).slice(0, 4)).toEqual(["Fm", "Db", "Ab", "Eb"]);
    // The sustain pedal is read and reported, and changes no chord's notes (rule 3).
    expect(r.summary.pedalSec).toBeGreaterThan(5);
    expect(r.chords.every((c) => c.pedal)).toBe(true);
    expect(analyseMidi(sample("three-chord-smoothing-d.mid")).chords.some((c) => c.pedal)).toBe(false);
    expect(r.chords.every((c) => c.notes.length === 4 && c.heldNotes.length === 0)).toBe(true);
    // Played one and a half times: the target loops twice, 6 of 8 (RULES.md matching example).
    expect(r.summary.loops).toBe(2);
    expect(r.summary.accuracy).toBe(0.75);
  });
});

describe("properties (fast-check)", () => {
  const chordNotes = fc.array(fc.uniqueArray(fc.integer({ min: 40, max: 84 }), { minLength: 2, maxLength: 5 }), {
    minLength: 2,
    maxLength: 6,
  });
  const toNotes = (chords: number[][]): NoteEvent[] =>
    chords.flatMap((c, i) => c.map((midi, j) => ({ midi, start: i + j * 0.01, end: i + 0.9, velocity: 0.7 })));

  it("the order of notes in the input changes nothing", () => {
    fc.assert(
      fc.property(chordNotes, fc.integer(), (chords, seed) => {
        const notes = toNotes(chords);
        const shuffled = [...notes].sort((x, y) => ((x.midi * 7919 + seed) % 101) - ((y.midi * 7919 + seed) % 101));
        expect(analyseNotes(shuffled, { key: "C" })).toEqual(analyseNotes(notes, { key: "C" }));
      }),
      { numRuns: 40 },
    );
  });

  it("transposing a take moves names with it and leaves every measurement unchanged", () => {
    // Mid-keyboard chords, so no candidate voicing of either take runs off the 88 keys.
    const midChords = fc.array(fc.uniqueArray(fc.integer({ min: 55, max: 79 }), { minLength: 2, maxLength: 5 }), {
      minLength: 2,
      maxLength: 6,
    });
    fc.assert(
      fc.property(midChords, fc.integer({ min: -5, max: 5 }), (chords, by) => {
        const a = analyseNotes(toNotes(chords), { key: "C" });
        const b = analyseNotes(toNotes(chords.map((c) => c.map((n) => n + by))), { key: "C" });
        expect(b.changes.map((c) => [c.motion, c.bestMotion, c.bassMotion, c.topVoiceInterval, c.commonTones])).toEqual(
          a.changes.map((c) => [c.motion, c.bestMotion, c.bassMotion, c.topVoiceInterval, c.commonTones]),
        );
        expect(b.chords.map((c) => [c.inversion, c.upperInversion, c.voicing, c.triad, c.quality])).toEqual(
          a.chords.map((c) => [c.inversion, c.upperInversion, c.voicing, c.triad, c.quality]),
        );
        expect(b.changes.map((c) => c.bestVoicing)).toEqual(a.changes.map((c) => c.bestVoicing!.map((n) => n + by)));
      }),
      { numRuns: 40 },
    );
  });

  it("motion ≥ best motion for every graded change; smoothness stays within 0..1", () => {
    fc.assert(
      fc.property(chordNotes, (chords) => {
        const r = analyseNotes(toNotes(chords), { key: "C" });
        for (const c of r.changes) if (c.graded) expect(c.motion!).toBeGreaterThanOrEqual(c.bestMotion!);
        expect(r.summary.smoothness).toBeGreaterThanOrEqual(0);
        expect(r.summary.smoothness).toBeLessThanOrEqual(1);
        expect(r.summary.score).toBeGreaterThanOrEqual(0);
        expect(r.summary.score).toBeLessThanOrEqual(100);
      }),
      { numRuns: 40 },
    );
  });
});

describe("typed errors and hang guards", () => {
  it("bad input gives its typed error through analyseMidi", () => {
    const code = (bytes: Uint8Array) => {
      try {
        analyseMidi(bytes);
        return null;
      } catch (e) {
        return e instanceof AnalysisError ? e.code : String(e);
      }
    };
    expect(code(new TextEncoder().encode("not a midi file"))).toBe("not-midi");
    expect(code(sample("minor-colour-g.mid").slice(0, 60))).toBe("corrupt");
    expect(code(smf(480, trackChunk([])))).toBe("no-notes");
    expect(() => analyseNotes([])).toThrow(AnalysisError);
    expect(() => analyseMidi(sample("minor-colour-g.mid"), { key: "H" })).toThrow(ProgressionError);
    expect(() => analyseMidi(sample("minor-colour-g.mid"), { target: "I Xq V" })).toThrow(/Token 2 "Xq"/);
  });

  it("a 100-note cluster finishes quickly and is flagged, not graded", () => {
    const cluster = Array.from({ length: 100 }, (_, i) => 21 + i);
    const bytes = smf(
      480,
      trackChunk([
        ...chordEvents(0, [60, 64, 67], 400),
        ...chordEvents(80, cluster, 400),
        ...chordEvents(80, [60, 65, 69], 400),
      ]),
    );
    const t = performance.now();
    const r = analyseMidi(bytes);
    expect(performance.now() - t).toBeLessThan(3000);
    expect(r.chords[1].flags).toContain("too-many-notes");
    expect(r.changes.every((c) => !c.graded)).toBe(true);
  });

  it("hostile note lists stay fast: 20,000 notes at one instant, a storm of grace-like notes", () => {
    const same = Array.from({ length: 20_000 }, (_, i) => ({
      midi: 21 + (i % 88),
      start: 0,
      end: 0.1 + (i % 7) * 0.01,
      velocity: 0.5,
    }));
    const storm = Array.from({ length: 20_000 }, (_, i) => ({
      midi: 60 + (i % 3),
      start: (i >> 1) * 0.03,
      end: (i >> 1) * 0.03 + (i % 2 ? 0.5 : 0.03),
      velocity: 0.5,
    }));
    const t = performance.now();
    expect(analyseNotes(same).chords[0].flags).toContain("too-many-notes");
    expect(analyseNotes(storm).chords.length).toBeGreaterThan(0);
    expect(performance.now() - t).toBeLessThan(5000);
  });

  it("a take of single notes only has no chords, no changes and a score of 0", () => {
    const melody = [60, 62, 64, 65, 67].map((midi, i) => ({ midi, start: i * 0.5, end: i * 0.5 + 0.4, velocity: 0.6 }));
    const r = analyseNotes(melody, { key: "C" });
    expect([r.chords.length, r.changes.length, r.melodyNotes.length, r.summary.score, r.summary.smoothness]).toEqual([
      0, 0, 5, 0, 1,
    ]);
  });

  it("a file with 16 busy channels finishes quickly (drums on channel 10 ignored)", () => {
    const tracks = Array.from({ length: 16 }, (_, ch) => {
      const events: number[] = [];
      for (let i = 0; i < 300; i++)
        events.push(
          ...noteOn(i === 0 ? 0 : 37, 36 + ((i * 5 + ch * 3) % 60), 80, ch),
          ...noteOff(60, 36 + ((i * 5 + ch * 3) % 60), ch),
        );
      return trackChunk(events);
    });
    const t = performance.now();
    const r = analyseMidi(smf(96, ...tracks));
    expect(performance.now() - t).toBeLessThan(5000);
    expect(r.chords.length).toBeGreaterThan(0);
    expect(r.chords.every((c) => c.notes.length <= 15 + 128)).toBe(true);
  });
});

describe("the take generator for seeds", () => {
  it("a polished take of each exercise scores higher than a beginner's", () => {
    for (const ex of EXERCISES) {
      const low = analyseMidi(generateTake({ exercise: ex, skill: 0, seed: 3 }), { key: ex.key, target: ex.target });
      const high = analyseMidi(generateTake({ exercise: ex, skill: 1, seed: 3 }), { key: ex.key, target: ex.target });
      expect(high.summary.score, ex.id).toBeGreaterThan(low.summary.score);
      expect(high.summary.accuracy, ex.id).toBe(1);
    }
  });
});
