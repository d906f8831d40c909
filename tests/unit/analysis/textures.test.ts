// The engine on takes played the ordinary ways students play (scripts/lib/textureTakes.ts,
// written to samples/ by `npm run samples`): what a teacher hears in each, worked out by hand
// from app/analysis/RULES.md rules 15–22, and properties of the reading (fast-check).
import { readFileSync } from "node:fs";
import { join } from "node:path";
import fc from "fast-check";
import { beforeAll, describe, expect, it } from "vitest";
import { analyseMidi, analyseNotes } from "../../../app/analysis/index";
import type { NoteEvent, TakeAnalysis } from "../../../app/analysis/types";
import { detachedBass } from "../../../app/analysis/voiceLeading";
import { readMidi } from "../../../app/analysis/readMidi";
import { TEXTURE_TAKES, writeTexture, type TextureTake } from "../../../scripts/lib/textureTakes";

const isTwoHand = (v: number[]) => detachedBass(v) !== null || v[v.length - 1] - v[0] > 16;

describe.each(TEXTURE_TAKES.map((t) => [t.file, t] as const))("%s", (file, t) => {
  let a: TakeAnalysis;
  beforeAll(() => {
    a = analyseMidi(writeTexture(t), { key: t.key, target: t.target });
  });

  it("is the file `npm run samples` wrote", () => {
    const stored = new Uint8Array(readFileSync(join(__dirname, "../../../samples", file)));
    expect(Buffer.from(stored).equals(Buffer.from(writeTexture(t)))).toBe(true);
  });

  it(`hears ${t.expect.symbols.length} harmonies: ${t.expect.symbols.join(" ")}`, () => {
    expect(a.chords.map((c) => c.symbol)).toEqual(t.expect.symbols);
    if (t.expect.basses) expect(a.chords.map((c) => c.bass)).toEqual(t.expect.basses);
  });

  it("raises the change flags expected, and no others", () => {
    const raised = new Set(a.changes.flatMap((c) => c.flags));
    expect([...raised].sort()).toEqual([...(t.expect.changeFlags ?? [])].sort());
  });

  it("reads bass line, melody, non-chord tones, techniques and accuracy as expected", () => {
    if (t.expect.bassLine !== undefined) expect(a.chords.some((c) => c.bassLine.length > 0)).toBe(t.expect.bassLine);
    if (t.expect.melody !== undefined) expect(a.melodyNotes.length > 0).toBe(t.expect.melody);
    const kinds = new Set(a.chords.flatMap((c) => c.nonChordTones.map((n) => n.kind)));
    for (const k of t.expect.nonChordTones ?? []) expect(kinds, k).toContain(k);
    for (const tech of t.expect.notTechniques ?? [])
      expect(a.summary.techniques[tech as keyof typeof a.summary.techniques], tech).toBe(0);
    for (const tech of t.expect.techniques ?? [])
      expect(a.summary.techniques[tech as keyof typeof a.summary.techniques], tech).toBeGreaterThan(0);
    if (t.expect.accuracy !== undefined) expect(a.summary.accuracy).toBe(t.expect.accuracy);
  });

  it("no suggestion changes the bass of a two-hand voicing or the tune (rule 8)", () => {
    for (const change of a.changes) {
      const to = a.chords[change.to];
      for (const s of change.suggestions) {
        if (isTwoHand(to.notes)) expect(s.voicing[0]).toBe(to.notes[0]);
        if (a.melodyNotes.length > 0) expect(s.voicing[s.voicing.length - 1]).toBe(to.topNote);
        // A suggestion is offered only when it moves less than what was played.
        expect(s.motion).toBeLessThan(change.motion!);
      }
    }
  });
});

const at = (midi: number, start: number, end: number): NoteEvent => ({ midi, start, end, velocity: 0.7 });
/** Close and open triads and sevenths in the middle of the keyboard, with a bass below. */
const voicing = fc
  .record({
    root: fc.integer({ min: 0, max: 11 }),
    quality: fc.constantFrom([0, 4, 7], [0, 3, 7], [0, 4, 7, 10], [0, 4, 7, 11], [0, 3, 7, 10]),
    spread: fc.boolean(),
  })
  .map(({ root, quality, spread }) => {
    const upper = quality.map((iv, i) => 60 + ((root + iv) % 12) + (spread && i === 1 ? -12 : 0));
    return [36 + root, ...upper].sort((x, y) => x - y);
  });

describe("properties of the reading (fast-check)", () => {
  it("each texture reads the same whoever plays it: other timing wobble and tempos from 0.85× to 1.2×", () => {
    fc.assert(
      fc.property(
        fc.constantFrom(...TEXTURE_TAKES),
        fc.integer({ min: 1, max: 100_000 }),
        fc.double({ min: 0.85, max: 1.2, noNaN: true }),
        (t, seed, factor) => {
          const played = { ...t, seed, bpm: Math.round(t.bpm * factor) };
          const a = analyseMidi(writeTexture(played), { key: t.key, target: t.target });
          expect(a.chords.map((c) => c.symbol)).toEqual(t.expect.symbols);
        },
      ),
      { numRuns: 40 },
    );
  });

  it("a broken chord and the same notes struck together give the same harmony and name", () => {
    fc.assert(
      fc.property(voicing, (v) => {
        const block = analyseNotes(
          v.map((m) => at(m, 0, 2)),
          { key: "C" },
        );
        const broken = analyseNotes(
          { notes: v.map((m, i) => at(m, i * 0.25, 2)), pedal: [{ start: 0, end: 2 }] },
          { key: "C" },
        );
        expect(broken.chords).toHaveLength(1);
        // Same name and pitch classes; the broken voicing stops once every pitch class has
        // sounded (rule 17), so an octave doubling after that is not in it.
        const pcs = (notes: number[]) => [...new Set(notes.map((m) => m % 12))].sort((x, y) => x - y);
        expect(broken.chords.map((c) => [c.symbol, pcs(c.notes)])).toEqual(
          block.chords.map((c) => [c.symbol, pcs(c.notes)]),
        );
      }),
      { numRuns: 60 },
    );
  });

  it("a short passing note between two chord tones on top changes no harmony", () => {
    fc.assert(
      fc.property(voicing, fc.nat(), (v, pick) => {
        const held = v.map((m) => at(m, 0, 2));
        // Two neighbouring chord tones an octave above the voicing, 3 or 4 semitones apart.
        const tones = [...new Set(v.map((m) => (m % 12) + 72))].sort((x, y) => x - y);
        const pairs = tones.flatMap((x, i) =>
          i + 1 < tones.length && [3, 4].includes(tones[i + 1] - x) ? [[x, tones[i + 1]]] : [],
        );
        fc.pre(pairs.length > 0);
        const [x, y] = pairs[pick % pairs.length];
        const plain = analyseNotes([...held, at(x, 0, 1), at(y, 1, 2)], { key: "C" });
        const passing = analyseNotes([...held, at(x, 0, 0.8), at(x + 2, 0.8, 1), at(y, 1, 2)], { key: "C" });
        expect(passing.chords.map((c) => [c.symbol, c.startSec])).toEqual(
          plain.chords.map((c) => [c.symbol, c.startSec]),
        );
        expect(passing.chords.flatMap((c) => c.nonChordTones.map((t) => t.note))).toContain(x + 2);
      }),
      { numRuns: 60 },
    );
  });

  it("transposing a take of textures renames its harmonies consistently", () => {
    fc.assert(
      fc.property(fc.constantFrom(...TEXTURE_TAKES), fc.integer({ min: -4, max: 4 }), (t, by) => {
        const base = analyseNotes(readNotes(t), { key: t.key });
        const moved = analyseNotes(
          { ...readNotes(t), notes: readNotes(t).notes.map((n) => ({ ...n, midi: n.midi + by })) },
          { key: t.key },
        );
        expect(moved.chords.map((c) => [c.startSec, c.endSec, c.quality, c.inversion])).toEqual(
          base.chords.map((c) => [c.startSec, c.endSec, c.quality, c.inversion]),
        );
        expect(moved.chords.map((c) => c.notes)).toEqual(base.chords.map((c) => c.notes.map((m) => m + by)));
      }),
      { numRuns: 20 },
    );
  });

  it("steadiness of a metronomic take does not depend on how often its harmony changes", () => {
    fc.assert(
      fc.property(
        fc.array(fc.integer({ min: 1, max: 8 }), { minLength: 4, maxLength: 10 }),
        fc.integer({ min: 1, max: 1000 }),
        (beats, seed) => {
          let t = 0;
          let r = seed;
          const jitter = () => {
            r = (r * 16807) % 2147483647;
            return ((r / 2147483647) * 2 - 1) * 0.02;
          };
          const notes: NoteEvent[] = [];
          beats.forEach((b, i) => {
            // Chords re-struck on every beat, changing every b beats, onsets ±20 ms.
            for (let k = 0; k < b; k++) {
              const s = t + k * 0.5 + jitter();
              for (const m of [0, 4, 7]) notes.push(at(60 + ((i * 5) % 12) + m, Math.max(0, s), s + 0.45));
            }
            t += b * 0.5;
          });
          const a = analyseNotes({ notes, tempos: [{ time: 0, bpm: 120 }] }, { key: "C" });
          expect(a.summary.tempo.steadiness).toBeGreaterThanOrEqual(0.8);
        },
      ),
      { numRuns: 30 },
    );
  });
});

/** A texture take's notes in seconds, as the engine reads them from its file. */
const cache = new Map<TextureTake, ReturnType<typeof readMidi>>();
function readNotes(t: TextureTake) {
  if (!cache.has(t)) cache.set(t, readMidi(writeTexture(t)));
  return cache.get(t)!;
}
