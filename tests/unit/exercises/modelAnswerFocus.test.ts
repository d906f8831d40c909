// The model answer follows the exercise's focus techniques and explains each choice. The chords
// it voices are named back with tonal's Chord.detect (tonal, general-purpose music-theory
// library on npm); "open" is rule 6's reading (common practice: a chord tone would fit between
// two adjacent upper notes); and the engine, given the path as a take, must credit the technique.
import { Chord, Midi, Note } from "tonal";
import { describe, expect, it } from "vitest";
import { analyseNotes } from "~/analysis";
import { parseKey, pc } from "~/analysis/pitch";
import { parseProgression } from "~/analysis/progression";
import { motion } from "~/analysis/voiceLeading";
import { defaultStart, isOpen, modelPath, pathPlan } from "~/utils/modelAnswer";

const names = (voicing: number[]) => voicing.map((n) => Midi.midiToNoteName(n, { sharps: false, pitchClass: true }));
const path = (progression: string, key: string, focus: string[], start?: number[]) => {
  const k = parseKey(key);
  const chords = parseProgression(progression, k);
  return { chords, path: modelPath(chords, start ?? defaultStart(chords[0]), { focus, key: k }) };
};
/** The engine's reading of the path played as block chords, one a second. */
const techniquesHeard = (steps: Array<{ voicing: number[] }>) =>
  analyseNotes(
    steps.flatMap((s, i) => s.voicing.map((midi) => ({ midi, start: i, end: i + 0.95, velocity: 80 }))),
  ).chords.map((c) => c.techniques);

describe("model answer with focus techniques", () => {
  it("an open-voicings exercise gets an open voicing on every chord, the same chords, and says so", () => {
    const { chords, path: p } = path("vi IV I V", "Ab", ["open-voicing"]);
    expect(p.steps.every((s) => isOpen(s.voicing))).toBe(true);
    // tonal names each voicing as the target chord (Fm, Db, Ab, Eb), whatever its layout.
    p.steps.forEach((s, i) =>
      expect(Chord.detect(names(s.voicing)).map((n) => Chord.get(n).tonic)).toContain(names([chords[i].root])[0]),
    );
    expect(techniquesHeard(p.steps).every((t) => t.includes("open-voicing"))).toBe(true);
    expect(p.choices!.join(" ")).toMatch(/Every chord is voiced open/);
    // Without the focus the same start gives close voicings.
    const plain = path("vi IV I V", "Ab", []);
    expect(plain.path.steps.some((s) => !isOpen(s.voicing))).toBe(true);
  });

  it("an added-2nd exercise adds the 2nd to each plain triad (tonal reads them as add9 chords) and names the notes", () => {
    const { path: p } = path("I IV V I", "C", ["added-second"]);
    // Each voicing holds exactly the pitch classes of tonal's Chord.get("Xadd9").
    const pcs = (notes: string[]) => [...new Set(notes.map((n) => Note.chroma(n)!))].sort((a, b) => a - b);
    expect(p.steps.map((s) => pcs(names(s.voicing)))).toEqual(
      ["Cadd9", "Fadd9", "Gadd9", "Cadd9"].map((c) => pcs(Chord.get(c).notes)),
    );
    expect(p.steps.map((s) => s.symbol)).toEqual(["Cadd9", "Fadd9", "Gadd9", "Cadd9"]);
    expect(techniquesHeard(p.steps).every((t) => t.includes("added-second"))).toBe(true);
    expect(p.choices).toContain(
      "Each plain major or minor triad adds its 2nd, as the exercise practises: D in C, G in F, A in G.",
    );
  });

  it("a seventh chord gets no 2nd: it would become a 9th chord, not an added 2nd", () => {
    const { path: p } = path("iiø7 V7 i", "Gm", ["added-second"]);
    expect(p.steps.map((s) => s.symbol)).toEqual(["Am7b5", "D7", "Gmadd9"]);
  });

  it("a slash-bass exercise puts a left-hand bass an octave or more under the chord", () => {
    const { chords, path: p } = path("Eb Bb/D Cm Cm/Bb Ab", "Eb", ["slash-bass"]);
    p.steps.forEach((s, i) => {
      expect(pc(s.voicing[0])).toBe(chords[i].bass ?? chords[i].root);
      expect(s.voicing[1] - s.voicing[0]).toBeGreaterThanOrEqual(7);
    });
    expect(p.choices!.join(" ")).toMatch(/left hand plays the bass apart from the chord: E♭2 → D2 → C2 → B♭1 → A♭1/);
  });

  it("grace notes a step below each 3rd are played just before their chord", () => {
    const { path: p } = path("I IV V I", "C", ["grace-to-third"]);
    expect(p.steps.map((s) => s.grace)).toEqual([63, 68, 58, 63]); // E♭4→E4, A♭4→A4, B♭3→B3
    const plan = pathPlan(p.steps, 60);
    expect(plan.filter((n) => n.start < 2 && n.end <= 2 && n.start > 1).map((n) => n.midi)).toEqual([68]);
    expect(p.choices!.join(" ")).toMatch(/E♭ to E in C, A♭ to A in F, B♭ to B in G/);
  });

  it("a smooth top line keeps the top note within a whole step wherever it can", () => {
    const { path: p } = path("I vi IV V I", "D", ["smooth-top-line"]);
    for (let i = 1; i < p.steps.length; i++) {
      expect(Math.abs(p.steps[i].voicing.at(-1)! - p.steps[i - 1].voicing.at(-1)!)).toBeLessThanOrEqual(2);
    }
  });

  it("explains the start and the motion in every path, and the motion it states is the motion of its voicings", () => {
    const { path: p } = path("I IV V I", "D", ["inversion"], [57, 62, 66]);
    const total = p.steps.slice(1).reduce((sum, s, i) => sum + motion(p.steps[i].voicing, s.voicing), 0);
    expect(p.totalMotion).toBe(total);
    expect(p.choices![0]).toBe("It starts on D as A3 D4 F♯4.");
    expect(p.choices![1]).toContain(`${total} semitones of motion in all`);
    expect(p.choices!.some((c) => c.startsWith("Inversions keep the hand in one place"))).toBe(true);
  });
});
