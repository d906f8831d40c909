// Reading real playing (RULES.md rules 15–22): every worked example of that section, in its
// own key and transposed into two others. The expected readings were worked by hand from
// RULES.md; chord symbols are compared by pitch class (root, quality suffix, bass), so a
// transposed example is checked against the same reading moved by the same interval.
import { Note } from "tonal";
import { describe, expect, it } from "vitest";
import { analyseNotes } from "../../../app/analysis/index";
import type { NoteEvent, PedalSpan, TakeAnalysis } from "../../../app/analysis/types";

const note = (midi: number, start: number, end: number): NoteEvent => ({ midi, start, end, velocity: 0.7 });
const KEYS = ["C", "Db", "D", "Eb", "E", "F", "F#", "G", "Ab", "A", "Bb", "B"];
const keyName = (tonicPc: number, minor = false) => KEYS[((tonicPc % 12) + 12) % 12] + (minor ? "m" : "");

/** "Em/G" → "4:m/7": root and bass as pitch classes (read by tonal, a general-purpose library). */
function bySemitones(symbol: string | null): string | null {
  if (symbol === null) return null;
  const m = /^([A-G][b#]?)(.*?)(?:\/([A-G][b#]?))?$/.exec(symbol);
  if (!m) return symbol;
  const root = Note.chroma(m[1]);
  return `${root}:${m[2]}${m[3] ? `/${Note.chroma(m[3])}` : ""}`;
}
const moved = (symbol: string, by: number) => {
  const s = bySemitones(symbol)!;
  return s
    .replace(/^(\d+):/, (_, d) => `${(Number(d) + by + 120) % 12}:`)
    .replace(/\/(\d+)$/, (_, d) => `/${(Number(d) + by + 120) % 12}`);
};

type Example = { notes: NoteEvent[]; pedal?: PedalSpan[]; key: string; target?: string };
function play(ex: Example, by: number): TakeAnalysis {
  const tonic = Note.chroma(ex.key.replace(/m$/, ""))!;
  return analyseNotes(
    { notes: ex.notes.map((n) => ({ ...n, midi: n.midi + by })), pedal: ex.pedal ?? [] },
    { key: keyName(tonic + by, ex.key.endsWith("m")), target: ex.target },
  );
}
const symbols = (a: TakeAnalysis) => a.chords.map((c) => bySemitones(c.symbol));
/** Each example in its key, a fourth up and a minor third down. */
const SHIFTS = [0, 5, -3];

describe("rule 15–16: a pedalled bass under re-struck chords is one harmony", () => {
  // Pedal down 0–3.9 s; E2 E3 struck at 0 and let go at 0.8; G♯3 B3 E4 at 0, 1, 2, 3 s, 0.8 s each.
  const ex: Example = {
    key: "E",
    pedal: [{ start: 0, end: 3.9 }],
    notes: [
      note(40, 0, 0.8),
      note(52, 0, 0.8),
      ...[0, 1, 2, 3].flatMap((t) => [note(56, t, t + 0.8), note(59, t, t + 0.8), note(64, t, t + 0.8)]),
    ],
  };
  it.each(SHIFTS)("shifted %i: E, bass E2, voicing E2 E3 G♯3 B3 E4, no change flags", (by) => {
    const a = play(ex, by);
    expect(symbols(a)).toEqual([moved("E", by)]);
    expect(a.chords[0].notes).toEqual([40, 52, 56, 59, 64].map((m) => m + by));
    expect(a.chords[0].notes[0]).toBe(40 + by);
    expect(a.changes).toEqual([]);
    expect(a.chords[0].techniques).not.toContain("slash-bass");
  });
});

describe("rule 15: one finger moves over held notes and the chord changes", () => {
  // G3 B3 D4 at 0; D4 let go and E4 struck at 1.0; all released at 2.0.
  const ex: Example = { key: "G", notes: [note(55, 0, 2), note(59, 0, 2), note(62, 0, 1), note(64, 1, 2)] };
  it.each(SHIFTS)("shifted %i: G (0–1 s) then Em/G (1–2 s), motion 2, best 2", (by) => {
    const a = play(ex, by);
    expect(symbols(a)).toEqual([moved("G", by), moved("Em/G", by)]);
    expect(a.chords.map((c) => [c.startSec, c.endSec])).toEqual([
      [0, 1],
      [1, 2],
    ]);
    expect([a.changes[0].motion, a.changes[0].bestMotion]).toEqual([2, 2]);
  });
});

describe("rules 15, 17, 18: a tune with a passing note over a held chord", () => {
  // Left hand C3 G3 E4 held 0–2 s; right hand E5 (0–0.5), D5 (0.5–0.75), C5 (0.75–2).
  const ex: Example = {
    key: "C",
    notes: [note(48, 0, 2), note(55, 0, 2), note(64, 0, 2), note(76, 0, 0.5), note(74, 0.5, 0.75), note(72, 0.75, 2)],
  };
  it.each(SHIFTS)("shifted %i: one harmony C, D5 a passing note, melody E5 D5 C5", (by) => {
    const a = play(ex, by);
    expect(symbols(a)).toEqual([moved("C", by)]);
    expect(a.chords[0].nonChordTones.map((t) => [t.note, t.kind])).toEqual([[74 + by, "passing"]]);
    expect(a.melodyNotes.map((m) => m.note)).toEqual([76, 74, 72].map((m) => m + by));
    // Melody notes after the first strike never join the voicing (rule 17).
    expect(a.chords[0].notes).toEqual([48, 55, 64, 76].map((m) => m + by));
  });
});

describe("rules 15, 16, 20: a walking bass under a held shell", () => {
  // Right hand A3 E♭4 held 0–2 s; left hand F2, G2, A2, C3, 0.5 s each.
  const ex: Example = {
    key: "F",
    notes: [note(57, 0, 2), note(63, 0, 2), note(41, 0, 0.5), note(43, 0.5, 1), note(45, 1, 1.5), note(48, 1.5, 2)],
  };
  it.each(SHIFTS)("shifted %i: one harmony F7 (root, 3rd, 7th), bass F2, bass line G2 A2 C3, no slash-bass", (by) => {
    const a = play(ex, by);
    expect(symbols(a)).toEqual([moved("F7", by)]);
    expect(a.chords[0].notes).toEqual([41, 57, 63].map((m) => m + by));
    expect(a.chords[0].bassLine.map((b) => b.note)).toEqual([43, 45, 48].map((m) => m + by));
    expect(a.chords[0].techniques).not.toContain("slash-bass");
    expect(a.summary.techniques["slash-bass"]).toBe(0);
  });
});

describe("rules 15–17: a pedalled left-hand broken chord, then the right hand", () => {
  // Pedal 0–1.9 s; D2 A2 D3 F♯3 at 0, 0.25, 0.5, 0.75 s; A3 D4 F♯4 at 1.0 s.
  const ex: Example = {
    key: "D",
    pedal: [{ start: 0, end: 1.9 }],
    notes: [
      note(38, 0, 1.9),
      note(45, 0.25, 1.9),
      note(50, 0.5, 1.9),
      note(54, 0.75, 1.9),
      note(57, 1, 1.9),
      note(62, 1, 1.9),
      note(66, 1, 1.9),
    ],
  };
  it.each(SHIFTS)("shifted %i: one harmony D with bass D2", (by) => {
    const a = play(ex, by);
    expect(symbols(a)).toEqual([moved("D", by)]);
    expect(a.chords[0].notes[0]).toBe(38 + by);
    expect(a.chords[0].bassLine).toEqual([]);
  });
});

describe("rule 20: left-hand shells", () => {
  // E2 D3 G♯3 (1-7-3), then A2 C♯3 G♯3 (1-3-7).
  const ex: Example = {
    key: "A",
    notes: [note(40, 0, 1), note(50, 0, 1), note(56, 0, 1), note(45, 1, 2), note(49, 1, 2), note(56, 1, 2)],
  };
  it.each(SHIFTS)("shifted %i: E7 then Amaj7", (by) => {
    expect(symbols(play(ex, by))).toEqual([moved("E7", by), moved("Amaj7", by)]);
  });
});

describe("rule 20: a rootless voicing", () => {
  // No bass: B3 D4 F♯4 A4.
  const ex: Example = { key: "G", notes: [note(59, 0, 1), note(62, 0, 1), note(66, 0, 1), note(69, 0, 1)] };
  it.each(SHIFTS)("shifted %i: Bm7 on its own (iii7), a rootless Gmaj9 against Imaj7 (accuracy 100%)", (by) => {
    const alone = play(ex, by);
    expect(symbols(alone)).toEqual([moved("Bm7", by)]);
    expect(alone.chords[0].roman).toBe("iii7");
    const matched = play({ ...ex, target: "Imaj7" }, by);
    expect(matched.summary.accuracy).toBe(1);
    expect(symbols(matched)).toEqual([moved("Gmaj9", by)]);
  });
});

describe("rule 9: a right hand that jumps as a block over a left hand going the other way", () => {
  // Left hand C3 → G2 (down 5), right hand C4 E4 G4 → G4 B4 D5 (up 7).
  const ex: Example = {
    key: "C",
    notes: [
      note(48, 0, 1),
      note(60, 0, 1),
      note(64, 0, 1),
      note(67, 0, 1),
      note(43, 1, 2),
      note(67, 1, 2),
      note(71, 1, 2),
      note(74, 1, 2),
    ],
  };
  it.each(SHIFTS)("shifted %i: root-position-leap", (by) => {
    expect(play(ex, by).changes[0].flags).toContain("root-position-leap");
  });
});

describe("rules 3 and 19: the pedal held through a change", () => {
  // Pedal down through C3 E4 G4 C5 (0–1 s) into D3 F4 A4 D5 (1–2 s).
  const ex: Example = {
    key: "C",
    pedal: [{ start: 0, end: 2 }],
    notes: [
      note(48, 0, 1),
      note(64, 0, 1),
      note(67, 0, 1),
      note(72, 0, 1),
      note(50, 1, 2),
      note(65, 1, 2),
      note(69, 1, 2),
      note(74, 1, 2),
    ],
  };
  it.each(SHIFTS)("shifted %i: Dm voiced D3 F4 A4 D5, the change flagged pedal-blur", (by) => {
    const a = play(ex, by);
    expect(symbols(a)).toEqual([moved("C", by), moved("Dm", by)]);
    // Notes the pedal carried in never join the next voicing (rule 3).
    expect(a.chords[1].notes).toEqual([50, 65, 69, 74].map((m) => m + by));
    expect(a.changes[0].flags).toContain("pedal-blur");
    expect(a.changes[0].blurredNotes).toEqual([48, 64, 67, 72].map((m) => m + by));
  });

  it("changing the pedal with the harmony raises no flag", () => {
    const a = play(
      {
        ...ex,
        pedal: [
          { start: 0.1, end: 0.95 },
          { start: 1.1, end: 2 },
        ],
      },
      0,
    );
    expect(a.changes[0].flags).not.toContain("pedal-blur");
    expect(a.summary.flags["pedal-blur"]).toBe(0);
  });
});

describe("rule 8 with a tune: suggestions keep the bass and the melody", () => {
  // Left hand C3 G3 E4, melody G5 E5 over it, then F3 A3 E4 under melody F5.
  const ex: Example = {
    key: "C",
    notes: [
      note(48, 0, 1),
      note(55, 0, 1),
      note(64, 0, 1),
      note(79, 0, 0.5),
      note(76, 0.5, 1),
      note(53, 1, 2),
      note(57, 1, 2),
      note(64, 1, 2),
      note(77, 1, 2),
    ],
  };
  it.each(SHIFTS)("shifted %i: every suggestion keeps F3 and F5 and re-voices only what lies between", (by) => {
    const a = play(ex, by);
    expect(a.melodyNotes.length).toBeGreaterThan(0);
    const change = a.changes[0];
    expect(change.bestVoicing![0]).toBe(53 + by);
    expect(change.bestVoicing![change.bestVoicing!.length - 1]).toBe(77 + by);
    for (const s of change.suggestions) {
      expect(s.voicing[0]).toBe(53 + by);
      expect(s.voicing[s.voicing.length - 1]).toBe(77 + by);
    }
  });
});

describe("rule 15: a fourth with the bass that falls to the 3rd is a sus chord, then a new harmony", () => {
  // A♭2 with D♭4, E♭4 and G♭4 struck at 0; D♭4 let go and C4 struck at 1.0 under the pedal.
  const ex: Example = {
    key: "Db",
    pedal: [{ start: 0, end: 2 }],
    notes: [note(44, 0, 2), note(61, 0, 0.9), note(63, 0, 2), note(66, 0, 2), note(60, 1, 2)],
  };
  it.each(SHIFTS)("shifted %i: A♭7sus4 then A♭7", (by) => {
    expect(symbols(play(ex, by))).toEqual([moved("Ab7sus4", by), moved("Ab7", by)]);
  });
});

describe("rule 15: a silence starts a harmony, even of the same chord", () => {
  const chord = (t: number) => [note(60, t, t + 0.5), note(64, t, t + 0.5), note(67, t, t + 0.5)];
  it("C, a rest of 0.5 s, C again: two harmonies; no rest: one", () => {
    expect(analyseNotes([...chord(0), ...chord(1)], { key: "C" }).chords).toHaveLength(2);
    expect(analyseNotes([...chord(0), ...chord(0.55)], { key: "C" }).chords).toHaveLength(1);
  });
});

describe("rule 15: a new bass struck with the upper notes changes the harmony even on one chord", () => {
  it("C3 C4 E4 G4, then E3 C4 E4 G4: C then C/E; a bass walking under the same notes does not", () => {
    const a = analyseNotes(
      [
        note(48, 0, 1),
        ...[60, 64, 67].map((m) => note(m, 0, 1)),
        note(52, 1, 2),
        ...[60, 64, 67].map((m) => note(m, 1, 2)),
      ],
      { key: "C" },
    );
    expect(a.chords.map((c) => c.symbol)).toEqual(["C", "C/E"]);
  });
});

describe("rule 22: steady time is measured on the beat", () => {
  it("a chord held for two bars in strict time is as steady as a chord a beat", () => {
    const chords = (beats: number[]) => {
      const out: NoteEvent[] = [];
      let t = 0;
      for (const b of beats) {
        for (const m of [60, 64, 67]) out.push(note(m, t, t + b * 0.5 - 0.05));
        t += b * 0.5;
      }
      return out;
    };
    const every = analyseNotes({ notes: chords([1, 1, 1, 1, 1, 1]), tempos: [{ time: 0, bpm: 120 }] }, { key: "C" });
    const held = analyseNotes({ notes: chords([1, 8, 1, 2, 1, 4]), tempos: [{ time: 0, bpm: 120 }] }, { key: "C" });
    expect(held.summary.tempo.steadiness).toBeGreaterThanOrEqual(0.8);
    expect(every.summary.tempo.steadiness).toBeGreaterThanOrEqual(0.8);
  });
});

describe("rule 10 with a melody: a top-line leap is measured from the tune's last note", () => {
  // C4 E4 G4 held 0–1 s with a tune G5 (0–0.5), A5 (0.5–1) on top; then F4 A4 C5 at 1 s.
  // From A5 to C5 is 9 semitones (a leap); from the chord's own top G4 it would be 5.
  const ex: Example = {
    key: "C",
    notes: [
      note(60, 0, 1),
      note(64, 0, 1),
      note(67, 0, 1),
      note(79, 0, 0.5),
      note(81, 0.5, 1),
      note(65, 1, 2),
      note(69, 1, 2),
      note(72, 1, 2),
    ],
  };
  it.each(SHIFTS)("shifted %i: flagged, from A5", (by) => {
    const a = play(ex, by);
    expect(a.melodyNotes.map((m) => m.note)).toContain(81 + by);
    expect(a.changes[0].topLineFrom).toBe(81 + by);
    expect(a.changes[0].flags).toContain("top-line-leap");
  });
});
