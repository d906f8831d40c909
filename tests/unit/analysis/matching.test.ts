// Matching a take to a target (RULES.md "Matching a take to a target"), including its worked
// example: target vi IV I V played one and a half times gives k = 2 and 6 of 8 (75%).
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { type Key, parseKey } from "../../../app/analysis/pitch";
import { matchProgression, type PlayedIdentity } from "../../../app/analysis/matching";
import { parseProgression, ProgressionError, type Triad } from "../../../app/analysis/progression";

/** A played chord by hand: root pitch class, triad, bass pitch class, pitch classes sounded. */
const chord = (root: number | null, triad: Triad | null, pcs: number[], bass = pcs[0]): PlayedIdentity => ({
  root,
  triad,
  bass,
  pcs,
});
const t = (p: number) => ((p % 12) + 12) % 12;
// Triads played in root position, transposable
const maj = (r: number) => chord(t(r), "major", [t(r), t(r + 4), t(r + 7)]);
const min = (r: number) => chord(t(r), "minor", [t(r), t(r + 3), t(r + 7)]);

const KEYS = ["C", "Db", "D", "Eb", "E", "F", "F#", "G", "Ab", "A", "Bb", "B"];

describe("RULES.md's loop example", () => {
  it.each(KEYS)("vi IV I V played as vi IV I V vi IV in %s: k = 2, 6 of 8 = 75%%", (k) => {
    const key: Key = parseKey(k);
    const s = key.tonic;
    const target = parseProgression("vi IV I V", key);
    const played = [min(s + 9), maj(s + 5), maj(s), maj(s + 7), min(s + 9), maj(s + 5)];
    const r = matchProgression(played, target);
    expect(r).toMatchObject({ loops: 2, matched: 6, targetLength: 8, accuracy: 0.75 });
    expect(r.mismatches).toEqual([
      { kind: "missing", targetIndex: 2, playedIndex: null, expected: target[2].symbol, pass: 1 },
      { kind: "missing", targetIndex: 3, playedIndex: null, expected: target[3].symbol, pass: 1 },
    ]);
  });

  it("a take looping the target exactly twice scores 100% with k = 2", () => {
    const target = parseProgression("vi IV I V", parseKey("Ab"));
    const once = [min(5), maj(1), maj(8), maj(3)];
    expect(matchProgression([...once, ...once], target)).toEqual({
      accuracy: 1,
      loops: 2,
      matched: 8,
      targetLength: 8,
      mismatches: [],
    });
    expect(matchProgression(once, target)).toMatchObject({ accuracy: 1, loops: 1, matched: 4, targetLength: 4 });
  });

  it("collapses the repeat where a loop ends on its first chord (I IV V I twice = 7 chords)", () => {
    const target = parseProgression("I IV V I", parseKey("D"));
    const once = [maj(2), maj(7), maj(9), maj(2)];
    expect(matchProgression([...once, ...once], target)).toMatchObject({
      accuracy: 1,
      loops: 2,
      matched: 7,
      targetLength: 7,
      mismatches: [],
    });
  });

  it("on a tie between loop counts takes the larger k", () => {
    // target C F G Am; played C F G Am C Bb: k = 1 gives 4 - 2 extras = 2;
    // k = 2 gives 5 matched - (Bb for F, G and Am missing) = 2 -> k = 2, 5 of 8
    const target = parseProgression("C F G Am", parseKey("C"));
    const r = matchProgression([maj(0), maj(5), maj(7), min(9), maj(0), maj(10)], target);
    expect(r).toMatchObject({ loops: 2, matched: 5, targetLength: 8, accuracy: 5 / 8 });
    expect(r.mismatches.map((m) => [m.kind, m.targetIndex, m.playedIndex])).toEqual([
      ["wrong-chord", 1, 5],
      ["missing", 2, null],
      ["missing", 3, null],
    ]);
  });
});

describe("mismatches with their positions", () => {
  // Parsed inside each test, never at collection, so that a mutation run knows which tests
  // reach the parser.
  const key = () => parseKey("C");
  const target = () => parseProgression("I IV V I", key());

  it("missing chord", () => {
    const r = matchProgression([maj(0), maj(7), maj(0)], target());
    expect(r).toMatchObject({ accuracy: 0.75, loops: 1, matched: 3 });
    expect(r.mismatches).toEqual([{ kind: "missing", targetIndex: 1, playedIndex: null, expected: "F", pass: 0 }]);
  });

  it("extra chord (accuracy stays full, the extra is reported)", () => {
    const r = matchProgression([maj(0), maj(5), min(2), maj(7), maj(0)], target());
    expect(r).toMatchObject({ accuracy: 1, loops: 1, matched: 4 });
    expect(r.mismatches).toEqual([{ kind: "extra", targetIndex: null, playedIndex: 2, expected: null, pass: null }]);
  });

  it("wrong chord", () => {
    const r = matchProgression([maj(0), min(2), maj(7), maj(0)], target());
    expect(r).toMatchObject({ accuracy: 0.75, matched: 3 });
    expect(r.mismatches).toEqual([{ kind: "wrong-chord", targetIndex: 1, playedIndex: 1, expected: "F", pass: 0 }]);
  });

  it("wrong bass when the target names one; any bass otherwise", () => {
    const eb = parseKey("Eb");
    const falling = parseProgression("Eb Bb/D Cm Cm/Bb Ab", eb);
    const bbOverD = chord(10, "major", [2, 5, 10], 2);
    const bbOverBb = chord(10, "major", [2, 5, 10], 10);
    const cmOverBb = chord(0, "minor", [0, 3, 7, 10], 10);
    const right = matchProgression([maj(3), bbOverD, min(0), cmOverBb, maj(8)], falling);
    expect(right).toMatchObject({ accuracy: 1, mismatches: [] });
    const wrong = matchProgression([maj(3), bbOverBb, min(0), cmOverBb, maj(8)], falling);
    expect(wrong.accuracy).toBe(0.8);
    expect(wrong.mismatches).toEqual([
      { kind: "wrong-bass", targetIndex: 1, playedIndex: 1, expected: "Bb/D", pass: 0 },
    ]);
    // C/E for a target C without slash is fine
    expect(matchProgression([chord(0, "major", [0, 4, 7], 4), maj(5), maj(7), maj(0)], target()).accuracy).toBe(1);
  });

  it("counts a chord it cannot name as played wrongly", () => {
    const cluster = chord(null, null, [0, 1, 2]);
    const r = matchProgression([maj(0), cluster, maj(7), maj(0)], target());
    expect(r.mismatches).toEqual([{ kind: "wrong-chord", targetIndex: 1, playedIndex: 1, expected: "F", pass: 0 }]);
  });

  it("collapses repeated identical played chords and reports original positions", () => {
    const r = matchProgression([maj(0), maj(0), maj(5), maj(5), maj(5), min(4), maj(7), maj(7), maj(0)], target());
    expect(r).toMatchObject({ accuracy: 1, loops: 1, matched: 4 });
    expect(r.mismatches).toEqual([{ kind: "extra", targetIndex: null, playedIndex: 5, expected: null, pass: null }]);
  });

  it("collapses repeated target chords too (I I IV V = I IV V)", () => {
    const r = matchProgression([maj(0), maj(5), maj(7)], parseProgression("I I IV V", key()));
    expect(r).toMatchObject({ accuracy: 1, targetLength: 3 });
  });

  it("reports everything missing for an empty take and refuses an empty target", () => {
    const r = matchProgression([], target());
    expect(r).toMatchObject({ accuracy: 0, matched: 0, loops: 1, targetLength: 4 });
    expect(r.mismatches.map((m) => m.kind)).toEqual(["missing", "missing", "missing", "missing"]);
    expect(() => matchProgression([maj(0)], [])).toThrow(ProgressionError);
  });
});

describe("free extensions versus named ones", () => {
  const key = parseKey("C");
  const cmaj7 = chord(0, "major", [0, 4, 7, 11]);
  const cadd9 = chord(0, "major", [0, 2, 4, 7]);
  const c7 = chord(0, "major", [0, 4, 7, 10]);
  const c9 = chord(0, "major", [0, 2, 4, 7, 10]);
  const c = maj(0);
  const acc = (p: PlayedIdentity, text: string) => matchProgression([p], parseProgression(text, key)).accuracy;

  it("sevenths and added tones are free when the target does not name them", () => {
    expect(acc(cmaj7, "C")).toBe(1);
    expect(acc(cadd9, "C")).toBe(1);
    expect(acc(c9, "I")).toBe(1);
  });

  it("a named seventh or added tone must be played", () => {
    expect(acc(c, "C7")).toBe(0);
    expect(acc(c7, "Cmaj7")).toBe(0);
    expect(acc(c7, "C7")).toBe(1);
    expect(acc(c9, "C7")).toBe(1);
    expect(acc(c, "Cadd9")).toBe(0);
    expect(acc(cadd9, "Iadd9")).toBe(1);
  });

  it("triad quality always counts (minor for major, half-diminished)", () => {
    expect(acc(min(0), "C")).toBe(0);
    const bm7b5 = chord(11, "diminished", [11, 2, 5, 9]);
    expect(matchProgression([bm7b5], parseProgression("viiø7", key)).accuracy).toBe(1);
    expect(matchProgression([chord(11, "diminished", [11, 2, 5])], parseProgression("viiø7", key)).accuracy).toBe(0);
  });
});

/** RULES.md's matching rule read literally: every k up to well past the take's length, full table. */
function referenceMatch(played: PlayedIdentity[], target: ReturnType<typeof parseProgression>) {
  const sameP = (x: PlayedIdentity, y: PlayedIdentity) =>
    x.root === y.root &&
    x.triad === y.triad &&
    x.bass === y.bass &&
    [...x.pcs].sort().join() === [...y.pcs].sort().join();
  const sameT = (x: (typeof target)[0], y: (typeof target)[0]) =>
    x.root === y.root &&
    x.triad === y.triad &&
    x.bass === y.bass &&
    [...x.required].sort().join() === [...y.required].sort().join();
  const take = played.filter((p, i) => i === 0 || !sameP(played[i - 1], p));
  const fits = (p: PlayedIdentity, c: (typeof target)[0]) =>
    p.root === c.root &&
    p.triad === c.triad &&
    c.required.every((r) => p.pcs.includes((c.root + r) % 12)) &&
    (c.bass === null || c.bass === p.bass);
  let best: { k: number; score: number; length: number } | null = null;
  let lastLength = -1;
  for (let k = 1; k <= take.length + 3; k++) {
    const looped = Array.from({ length: k }, () => target).flat();
    const seq = looped.filter((c, i) => i === 0 || !sameT(looped[i - 1], c));
    if (seq.length === lastLength) continue;
    lastLength = seq.length;
    // best matched-minus-mismatched over all alignments of the take with this looped target
    const S = Array.from({ length: take.length + 1 }, (_, i) =>
      Array.from({ length: seq.length + 1 }, (_, j) => (i === 0 ? -j : j === 0 ? -i : 0)),
    );
    for (let i = 1; i <= take.length; i++)
      for (let j = 1; j <= seq.length; j++)
        S[i][j] = Math.max(
          S[i - 1][j - 1] + (fits(take[i - 1], seq[j - 1]) ? 1 : -1),
          S[i - 1][j] - 1,
          S[i][j - 1] - 1,
        );
    const score = S[take.length][seq.length];
    if (!best || score >= best.score) best = { k, score, length: seq.length }; // a tie goes to the larger k
  }
  return best!;
}

describe("matching against a literal reading of the rule (fast-check)", () => {
  const alphabet = [
    maj(0),
    min(9),
    maj(5),
    maj(7),
    min(2),
    chord(7, "major", [7, 11, 2, 5]),
    chord(0, "major", [0, 4, 7], 4),
  ];
  it("picks the same loop count, score and target length", () => {
    fc.assert(
      fc.property(
        fc.array(fc.constantFrom("C", "Am", "F", "G", "G7", "Dm", "C/E"), { minLength: 1, maxLength: 4 }),
        fc.array(fc.integer({ min: 0, max: alphabet.length - 1 }), { maxLength: 14 }),
        (symbols, picks) => {
          const target = parseProgression(symbols.join(" "), parseKey("C"));
          const played = picks.map((i) => alphabet[i]);
          const r = matchProgression(played, target);
          const ref = referenceMatch(played, target);
          expect(r.loops).toBe(ref.k);
          expect(r.targetLength).toBe(ref.length);
          expect(r.matched - r.mismatches.length).toBe(ref.score);
          expect(r.accuracy).toBe(r.matched / r.targetLength);
        },
      ),
      { numRuns: 300, seed: 42 },
    );
  });
});

describe("a target that ends on its first chord", () => {
  // I IV V I looped: the I at each seam counts once (D G A D G A D …), so k loops are 1 + 3k chords.
  it.each([10, 48])("I IV V I played %i times through is k = that many, every chord matched", (times) => {
    const target = parseProgression("I IV V I", parseKey("D"));
    const played = [maj(2), ...Array.from({ length: times }, () => [maj(7), maj(9), maj(2)]).flat()];
    expect(matchProgression(played, target)).toMatchObject({
      loops: times,
      matched: 1 + 3 * times,
      targetLength: 1 + 3 * times,
      accuracy: 1,
      mismatches: [],
    });
  });
});

describe("long takes", () => {
  it("matches a take of 2,000 changes quickly (hang guard only)", () => {
    const target = parseProgression("I vi IV V", parseKey("G"));
    const loop = [maj(7), min(4), maj(0), maj(2)];
    const played = Array.from({ length: 500 }, () => loop).flat();
    played[37] = min(9); // one slip
    const t0 = performance.now();
    const r = matchProgression(played, target);
    const ms = performance.now() - t0;
    console.log(`matchProgression: ${played.length} chords in ${ms.toFixed(1)} ms`);
    expect(r).toMatchObject({ loops: 500, matched: 1999, targetLength: 2000 });
    expect(r.mismatches).toEqual([{ kind: "wrong-chord", targetIndex: 1, playedIndex: 37, expected: "Em", pass: 9 }]);
    expect(ms).toBeLessThan(10_000);
  });
});
