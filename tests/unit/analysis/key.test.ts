// RULES.md rule 23: the key is the best correlation of pitch-class durations with the
// Krumhansl–Kessler profiles (C. Krumhansl, Cognitive Foundations of Musical Pitch, 1990; the
// profile values in key.ts are from memory), plus a bonus when the tonic is the bass of the
// first and of the last harmony; on a tie, major. Examples worked by hand from RULES.md rule 23,
// each in its key and transposed into two others.
import { Key } from "tonal";
import { describe, expect, it } from "vitest";
import { BASS_BONUS, estimateKey } from "../../../app/analysis/key";
import { nameChord } from "../../../app/analysis/naming";
import { pc } from "../../../app/analysis/pitch";

/** One note a second, each held a second. */
const notesOf = (midis: number[]) => midis.map((midi, i) => ({ midi, start: i, end: i + 1 }));

// A C E then C E G: the profiles alone hear the relative major
const A_MINOR_OR_C = [57, 60, 64, 60, 64, 67];

describe("rule 23: the bass of the first and last harmony", () => {
  it.each([
    [0, "C", "Am"],
    [2, "D", "Bm"],
    [7, "G", "Em"],
  ])("shifted by %i: the profiles alone say %s; a tonic bass at both ends says %s", (t, alone, withBass) => {
    const notes = notesOf(A_MINOR_OR_C.map((m) => m + t));
    expect(estimateKey(notes).key.name).toBe(alone);
    const minorTonic = pc(9 + t);
    const read = estimateKey(notes, [], { firstBassPc: minorTonic, lastBassPc: minorTonic });
    expect(read.key.name).toBe(withBass);
    // the bonus is added to the score, not to the correlation
    expect(read.score).toBeCloseTo(read.correlation + 2 * BASS_BONUS, 9);
  });

  it("a bass on the major tonic keeps the major reading", () => {
    for (const t of [0, 2, 7]) {
      const notes = notesOf(A_MINOR_OR_C.map((m) => m + t));
      expect(estimateKey(notes, [], { firstBassPc: pc(t), lastBassPc: pc(t) }).key.name).toBe(
        ["C", "D", "G"][[0, 2, 7].indexOf(t)],
      );
    }
  });

  it("no bass given, or a bass on no candidate tonic, changes nothing", () => {
    const notes = notesOf(A_MINOR_OR_C);
    expect(estimateKey(notes, [], {})).toEqual(estimateKey(notes));
    expect(estimateKey(notes, [], { firstBassPc: null, lastBassPc: null })).toEqual(estimateKey(notes));
  });
});

describe("rule 23: on a tie, major", () => {
  it.each([
    [0, "Eb"],
    [2, "F"],
    [7, "Bb"],
  ])(
    "Fm Eb Cm over equal pitch-class durations, Eb in the first bass, shifted by %i: the minor key and its relative major tie, the major wins (%s)",
    (t, major) => {
      // Worked by hand from key.ts's chord weights: C minor 0.5 + 0.1 + 0.1 (ends on its tonic);
      // Eb major 0.5 + 0.1 (its tonic once) + 0.1 (bass bonus); the correlation is 0 for both.
      const chromatic = notesOf([60, 61, 62, 63, 64, 65, 66, 67, 68, 69, 70, 71]);
      const triads = [
        [53, 56, 60],
        [51, 55, 58],
        [48, 51, 55],
      ].map((v) => v.map((m) => m + t));
      const chords = triads.map((v) => nameChord(v, v[0]));
      expect(estimateKey(chromatic, chords).key.mode).toBe("minor");
      const read = estimateKey(chromatic, chords, { firstBassPc: pc(3 + t) });
      expect(read.key.name).toBe(major);
      expect(read.score).toBeCloseTo(0.7, 9);
    },
  );

  it.each([
    [9, "A"],
    [2, "D"],
    [6, "F#"],
  ])(
    "all twelve pitch classes equally long, bass %i at both ends: the major and minor of that tonic tie; major wins (%s)",
    (bass, key) => {
      const chromatic = notesOf([60, 61, 62, 63, 64, 65, 66, 67, 68, 69, 70, 71]);
      const read = estimateKey(chromatic, [], { firstBassPc: bass, lastBassPc: bass });
      expect(read.key.name).toBe(key);
      expect(read.key.mode).toBe("major");
    },
  );
});

// The Krumhansl–Kessler probe-tone profiles (Krumhansl 1990, table 4.1; values from memory,
// as in key.ts), C major and C minor from the tonic up.
const KK_MAJOR = [6.35, 2.23, 3.48, 2.33, 4.38, 4.09, 2.52, 5.19, 2.39, 3.66, 2.29, 2.88];
const KK_MINOR = [6.33, 2.68, 3.52, 5.38, 2.6, 3.53, 2.54, 4.75, 3.98, 2.69, 3.34, 3.17];

/** One note per pitch class from `tonic` up, each held for the profile's value in seconds. */
const shapedLike = (profile: number[], tonic: number) =>
  profile.map((d, i) => ({ midi: 60 + pc(tonic + i), start: 0, end: d }));

/** All twelve pitch classes equally long: no key correlates better than another. */
const flat = () => notesOf([60, 61, 62, 63, 64, 65, 66, 67, 68, 69, 70, 71]);

describe("the correlation (Pearson's r, as Krumhansl–Schmuckler use it)", () => {
  it.each([
    [KK_MAJOR, 0, "C"],
    [KK_MAJOR, 2, "D"],
    [KK_MINOR, 9, "Am"],
    [KK_MINOR, 6, "F#m"],
  ])("durations shaped like a key's own profile correlate with it perfectly (r = 1)", (profile, tonic, name) => {
    // A vector correlates with itself, or with any positive multiple of itself, with r = 1
    // (textbook statistics); doubling every length changes nothing.
    for (const scale of [1, 2]) {
      const notes = shapedLike(profile, tonic).map((n) => ({ ...n, end: n.end * scale }));
      const read = estimateKey(notes);
      expect(read.key.name).toBe(name);
      expect(read.correlation).toBeCloseTo(1, 12);
      expect(read.score).toBeCloseTo(1, 12);
    }
  });

  it("notes shorter than 50 ms weigh 50 ms: a staccato G B D reads as the held one does", () => {
    const held = estimateKey(notesOf([55, 59, 62]));
    const staccato = estimateKey([55, 59, 62].map((midi, i) => ({ midi, start: i, end: i })));
    expect(held.key.name).toBe("G");
    expect(staccato.key.name).toBe("G");
    expect(staccato.correlation).toBeCloseTo(held.correlation, 12);
  });
});

describe("the chord evidence over a flat distribution (worked by hand from key.ts's weights)", () => {
  // Over twelve equally long pitch classes the correlation is 0 for every key, so the score is
  // the chord evidence alone: 0.5 × the share of diatonic chords + 0.3 × the share of tonic
  // triads + 0.1 when the last chord is the tonic triad + 0.05 when the first is. Diatonic
  // triads are checked against tonal's Key tables (major; natural and harmonic minor).
  const triad = (pitches: number[]) => nameChord(pitches, pitches[0]);
  const C = [48, 52, 55];
  const Am = [45, 48, 52];

  it("the tables the cases rely on (tonal's Key)", () => {
    expect(Key.majorKey("C").triads).toEqual(["C", "Dm", "Em", "F", "G", "Am", "Bdim"]);
    expect(Key.minorKey("A").natural.triads).toEqual(["Am", "Bdim", "C", "Dm", "Em", "F", "G"]);
    expect(Key.minorKey("D").harmonic.triads).toContain("A");
    expect(Key.minorKey("D").natural.triads).toContain("Gm");
    expect(Key.minorKey("G").natural.triads).not.toContain("A");
  });

  it("repeated chords count each time: Am Am Am C is A minor, 0.5 + 0.3 × 3/4 + 0.05", () => {
    const read = estimateKey(flat(), [Am, Am, Am, C].map(triad));
    expect(read.key.name).toBe("Am");
    expect(read.correlation).toBe(0);
    expect(read.score).toBeCloseTo(0.5 + 0.3 * 0.75 + 0.05, 9);
  });

  it("a chord foreign to the key counts against it: C F# C is C major, 0.5 × 2/3 + 0.3 × 2/3 + 0.1 + 0.05", () => {
    const read = estimateKey(flat(), [C, [54, 58, 61], C].map(triad));
    expect(read.key.name).toBe("C");
    expect(read.score).toBeCloseTo((0.5 * 2) / 3 + (0.3 * 2) / 3 + 0.15, 9);
  });

  it("a sus chord on a diatonic root counts as diatonic, a major triad on ii does not: Csus4 D Gsus2 C", () => {
    // C major: Csus4, Gsus2 and C diatonic (3/4), C the tonic once and last: 0.375 + 0.075 + 0.1
    const read = estimateKey(flat(), [[48, 53, 55], [50, 54, 57], [43, 45, 50], C].map(triad));
    expect(read.key.name).toBe("C");
    expect(read.score).toBeCloseTo(0.375 + 0.075 + 0.1, 9);
  });

  it("chords naming no triad (a single note, a bare fifth) are not counted at all", () => {
    const plain = estimateKey(flat(), [C, C].map(triad));
    const mixed = estimateKey(flat(), [C, [50], [45, 52], C].map(triad));
    expect(plain.key.name).toBe("C");
    expect(plain.score).toBeCloseTo(0.5 + 0.3 + 0.1 + 0.05, 9);
    expect(mixed.score).toBeCloseTo(plain.score, 9);
  });

  it("of two minor keys tied, the first found (from C up) stays: A then Gm is D minor", () => {
    // D minor: A (V, harmonic minor) and Gm (iv) diatonic, 0.5. G minor: Gm diatonic and its
    // tonic, last: 0.25 + 0.15 + 0.1 = 0.5. No major key reaches 0.5.
    const read = estimateKey(
      flat(),
      [
        [57, 61, 64],
        [55, 58, 62],
      ].map(triad),
    );
    expect(read.key.name).toBe("Dm");
    expect(read.score).toBeCloseTo(0.5, 9);
  });

  it("of two major keys tied, the first found stays: basses C and G are C major, not G", () => {
    const read = estimateKey(flat(), [], { firstBassPc: 0, lastBassPc: 7 });
    expect(read.key.name).toBe("C");
    expect(read.score).toBeCloseTo(BASS_BONUS, 9);
  });
});
