// Best motion and best voicing (RULES.md rule 8). Expected values are RULES.md's worked
// examples (derived by hand from the rules), reverse directions worked out by hand the same
// way, and a literal brute-force reading of rule 8 over a wide range of keys.
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { bestMotion, type BestMotionOptions } from "../../../app/analysis/bestMotion";
import { Budget } from "../../../app/analysis/budget";
import { AnalysisError } from "../../../app/analysis/errors";
import { detachedBass, motion } from "../../../app/analysis/voiceLeading";

const shift = (v: number[], t: number) => v.map((x) => x + t);
const pcOf = (n: number) => ((n % 12) + 12) % 12;

/** Rule 8's tie-break: top note moving least, then lower top note; then lower note by note from the top. */
function lowerOnTie(v: number[], w: number[], aTop: number): boolean {
  const dv = Math.abs(v[v.length - 1] - aTop);
  const dw = Math.abs(w[w.length - 1] - aTop);
  if (dv !== dw) return dv < dw;
  const rv = v.slice().reverse();
  const rw = w.slice().reverse();
  for (let i = 0; i < Math.min(rv.length, rw.length); i++) if (rv[i] !== rw[i]) return rv[i] < rw[i];
  return false;
}

/** RULES.md terms: a detached bass, or a span of more than 16 semitones (no hand reaches it alone). */
const twoHand = (v: number[]) => detachedBass(v) !== null || Math.max(...v) - Math.min(...v) > 16;
/** Rules 6 and 8: the bass kept, with the octave above it when that octave lies 7 or more below the next note. */
const bassKept = (b: number[]) => (b.length >= 3 && b[1] === b[0] + 12 && b[2] - b[1] >= 7 ? [b[0], b[1]] : [b[0]]);

/**
 * Rule 8 read literally: every voicing of the pitch classes between 24 and 100, B itself
 * included; between two-hand voicings (or with keepBass) B's bass as played and every other
 * note above it; with keepTop, B's top note as played.
 */
function bruteBest(
  a: number[],
  b: number[],
  opts: BestMotionOptions = {},
): { motion: number; voicing: number[] } | null {
  const keep = twoHand(a) && twoHand(b);
  const fixed = keep || opts.keepBass ? bassKept(b) : [];
  const free = b.slice(fixed.length).map(pcOf);
  const lowest = fixed.length ? fixed[fixed.length - 1] + 1 : 24;
  const aTop = Math.max(...a);
  let best: { motion: number; voicing: number[] } | null = null;
  const consider = (v: number[]) => {
    if (opts.keepTop && v[v.length - 1] !== b[b.length - 1]) return;
    if (fixed.some((f, i) => v[i] !== f)) return;
    if (opts.accept && !opts.accept(v.slice())) return;
    const m = motion(a, v);
    if (opts.below !== undefined && m >= opts.below) return;
    if (!best || m < best.motion || (m === best.motion && lowerOnTie(v, best.voicing, aTop)))
      best = { motion: m, voicing: v };
  };
  const rec = (i: number, chosen: number[]) => {
    if (i === free.length) {
      const v = [...fixed, ...chosen].sort((x, y) => x - y);
      if (new Set(v).size === v.length) consider(v);
      return;
    }
    for (let note = lowest + ((free[i] - pcOf(lowest) + 12) % 12); note <= 100; note += 12)
      rec(i + 1, [...chosen, note]);
  };
  rec(0, []);
  consider(b.slice());
  return best;
}

// RULES.md worked examples: from, to, best motion, best voicing
const WORKED: Array<[number[], number[], number, number[]]> = [
  [[53, 57, 60], [58, 62, 65], 3, [53, 58, 62]],
  [[53, 57, 60], [53, 58, 62], 3, [53, 58, 62]],
  [[60, 64, 67], [60, 65, 69], 3, [60, 65, 69]],
  [[60, 65, 69], [59, 62, 67], 6, [59, 62, 67]], // tie with D4 G4 B4: the lower one wins
  [[67, 71, 74], [72, 76, 79], 3, [67, 72, 76]],
  [[45, 60, 64, 69], [41, 60, 65, 69], 5, [41, 60, 65, 69]], // bass 4 + upper 1
  [[50, 60, 65, 69], [43, 59, 62, 65], 11, [43, 62, 65, 71]], // bass 7 as played + upper 4
  [[48, 60, 64, 67], [41, 53, 57, 60], 10, [41, 60, 65, 69]], // bass 7 + upper 3
  [[60, 64, 67], [60, 64, 67, 70], 2, [58, 60, 64, 67]], // C4 splits to Bb3 and C4
];

// The same changes backwards, worked out by hand with rule 8.
const REVERSED: Array<[number[], number[], number, number[]]> = [
  [[58, 62, 65], [53, 57, 60], 3, [57, 60, 65]], // Bb -> F: A3 C4 F4
  [[60, 65, 69], [60, 64, 67], 3, [60, 64, 67]],
  [[72, 76, 79], [67, 71, 74], 3, [71, 74, 79]], // C -> G: B4 D5 G5
  [[41, 60, 65, 69], [45, 60, 64, 69], 5, [45, 60, 64, 69]], // bass 4 + upper 1 (as played)
  [[43, 59, 62, 65], [50, 60, 65, 69], 11, [50, 57, 60, 65]], // bass 7 + B3 D4 F4 -> A3 C4 F4 = 4
  [[41, 53, 57, 60], [48, 60, 64, 67], 10, [48, 52, 55, 60]], // bass 7 + F3 A3 C4 -> E3 G3 C4 = 3
];

describe("bestMotion (rule 8) on RULES.md's worked examples", () => {
  it.each(WORKED)("%j -> %j: best %i via %j, transposed too", (a, b, best, voicing) => {
    for (const t of [0, -9, -4, 2, 7, 12]) {
      const r = bestMotion(shift(a, t), shift(b, t));
      expect(r).toEqual({ motion: best, voicing: shift(voicing, t) });
      expect(r!.motion).toBeLessThanOrEqual(motion(shift(a, t), shift(b, t)));
    }
  });

  it.each(REVERSED)("reversed %j -> %j: best %i via %j, transposed too", (a, b, best, voicing) => {
    for (const t of [0, -5, 3, 10]) {
      expect(bestMotion(shift(a, t), shift(b, t))).toEqual({ motion: best, voicing: shift(voicing, t) });
    }
  });

  it("agrees with the literal brute force on every worked example, both ways", () => {
    for (const [a, b] of [...WORKED, ...REVERSED]) {
      expect(bestMotion(a, b)).toEqual(bruteBest(a, b));
      expect(bestMotion(b, a)).toEqual(bruteBest(b, a));
    }
  });
});

describe("bestMotion tie-breaks", () => {
  it("prefers the lower top note when the top moves equally (C/F -> G: B3 D4 G4 over D4 G4 B4)", () => {
    expect(motion([60, 65, 69], [62, 67, 71])).toBe(6); // the tying alternative
    expect(bestMotion([60, 65, 69], [62, 67, 71])!.voicing).toEqual([59, 62, 67]);
  });

  it("prefers the top note that moves least (C -> C7 without 3rd: Bb3 C4 G4 over C4 G4 Bb4)", () => {
    expect(motion([60, 64, 67], [58, 60, 67])).toBe(6);
    expect(motion([60, 64, 67], [60, 67, 70])).toBe(6);
    expect(bestMotion([60, 64, 67], [60, 67, 70])).toEqual({ motion: 6, voicing: [58, 60, 67] });
    // and transposed, from either tying voicing as played
    expect(bestMotion([65, 69, 72], [63, 65, 72])).toEqual({ motion: 6, voicing: [63, 65, 72] });
  });
});

describe("bestMotion options", () => {
  it("keepTop keeps B's played top note", () => {
    // F3 A3 C4 -> Bb keeping F4 on top: D3 Bb3 F4 moves 3 + 1 + 5 = 9 (Bb3 D4 F4 as played: 15)
    const r = bestMotion([53, 57, 60], [58, 62, 65], { keepTop: true })!;
    expect(r.voicing[r.voicing.length - 1]).toBe(65);
    expect(r).toEqual(bruteBest([53, 57, 60], [58, 62, 65], { keepTop: true }));
    expect(r).toEqual({ motion: 9, voicing: [50, 58, 65] });
  });

  it("keepBass keeps B's played bass", () => {
    const r = bestMotion([53, 57, 60], [58, 62, 65], { keepBass: true })!;
    expect(r.voicing[0]).toBe(58);
    expect(r).toEqual(bruteBest([53, 57, 60], [58, 62, 65], { keepBass: true }));
    expect(bestMotion([60, 65, 69], [59, 62, 67], { keepBass: true })).toEqual({ motion: 6, voicing: [59, 62, 67] });
  });

  it("accept filters candidates and falls back to B as played", () => {
    // accept only voicings reaching F5 or above: far outside the usual search range around A
    const accept = (v: number[]) => v[v.length - 1] >= 77;
    const r = bestMotion([53, 57, 60], [58, 62, 65], { accept })!;
    expect(r.voicing[r.voicing.length - 1]).toBeGreaterThanOrEqual(77);
    expect(r).toEqual(bruteBest([53, 57, 60], [58, 62, 65], { accept }));
  });

  it("keeps B itself as a candidate even far outside the search range", () => {
    const a = [40, 44, 47];
    const b = [96, 100, 103];
    const r = bestMotion(a, b, { accept: (v) => v[0] >= 96 });
    expect(r).toEqual({ motion: motion(a, b), voicing: b });
  });

  it("returns null when no candidate is accepted", () => {
    expect(bestMotion([60, 64, 67], [60, 65, 69], { accept: () => false })).toBeNull();
  });

  it("does not grade chords of more than 8 distinct pitches", () => {
    const nine = [60, 61, 62, 63, 64, 65, 66, 67, 68];
    expect(bestMotion([60, 64, 67], nine)).toBeNull();
    expect(bestMotion(nine, [60, 64, 67])).toBeNull();
    expect(bestMotion([60, 64, 67], nine.slice(0, 8))).not.toBeNull();
  });

  it("keeps the detached bass as played and every upper note above it", () => {
    const r = bestMotion([36, 55, 60, 64], [41, 57, 60, 65])!; // C2 + C triad -> F2 + F triad
    expect(r.voicing[0]).toBe(41);
    expect(r.voicing.slice(1).every((n) => n > 41)).toBe(true);
    expect(r).toEqual(bruteBest([36, 55, 60, 64], [41, 57, 60, 65]));
  });
});

// Random small chords: the pruned search must find exactly what the literal rule finds.
const voicing = (min: number, max: number, size: number) =>
  fc.uniqueArray(fc.integer({ min, max }), { minLength: size, maxLength: size }).map((v) => v.sort((x, y) => x - y));
const chord = fc.oneof(
  fc.integer({ min: 2, max: 4 }).chain((n) => voicing(52, 80, n)),
  // left-hand bass under a right-hand triad
  fc.tuple(fc.integer({ min: 33, max: 48 }), voicing(57, 76, 3)).map(([bass, upper]) => [bass, ...upper]),
  // a left-hand octave under a right-hand voicing (rule 6)
  fc.tuple(fc.integer({ min: 36, max: 48 }), voicing(62, 79, 2)).map(([bass, upper]) => [bass, bass + 12, ...upper]),
  // wide voicings without a detached bass (two-hand by their span)
  fc.tuple(voicing(48, 55, 2), voicing(70, 84, 1)).map(([low, high]) => [...low, ...high]),
);
const options = fc.constantFrom<BestMotionOptions>(
  {},
  { keepTop: true },
  { keepBass: true },
  { keepTop: true, keepBass: true },
);

describe("bestMotion against the literal brute force (fast-check)", () => {
  it("finds the same motion and voicing, with and without options", () => {
    fc.assert(
      fc.property(chord, chord, options, (a, b, opts) => {
        expect(bestMotion(a, b, opts)).toEqual(bruteBest(a, b, opts));
      }),
      { numRuns: 150, seed: 20261201 },
    );
  });

  it("finds the same under a motion bound and a flag filter with its early test", () => {
    // the filter: no two lowest notes closer than a 4th, and no note below C3 other than the bass
    const accept = (v: number[]) => v[1] - v[0] >= 5 && v.slice(1).every((n) => n >= 48);
    const acceptPrefix = (p: readonly number[], len: number) =>
      (len < 2 || p[1] - p[0] >= 5) && (len < 2 || p[len - 1] >= 48);
    fc.assert(
      fc.property(chord, chord, options, fc.integer({ min: 1, max: 30 }), (a, b, opts, below) => {
        expect(bestMotion(a, b, { ...opts, accept, acceptPrefix, below })).toEqual(
          bruteBest(a, b, { ...opts, accept, below }),
        );
      }),
      { numRuns: 150, seed: 20261202 },
    );
  });
});

describe("rule 8 with two-hand voicings and a tune", () => {
  it("keeps B's bass between two-hand voicings even without a detached bass (span over 16)", () => {
    // C3 E3 G4 (two-hand by its span) -> F3 A3 C5 (span 19): F3 stays; A3 C5 become A3 C4 (worked by hand from RULES.md rule 8)
    for (const t of [0, 2, -5]) {
      const r = bestMotion(shift([48, 52, 67], t), shift([53, 57, 72], t))!;
      expect(r.voicing[0]).toBe(53 + t);
      expect(r).toEqual(bruteBest(shift([48, 52, 67], t), shift([53, 57, 72], t)));
    }
  });

  it("keeps a left-hand octave with the bass (rule 6)", () => {
    // C2 C3 under E4 G4 C5 -> F2 F3 under A4 C5 F5: F2 F3 stay, the right hand re-voices
    const r = bestMotion([36, 48, 64, 67, 72], [41, 53, 69, 72, 77])!;
    expect(r.voicing.slice(0, 2)).toEqual([41, 53]);
    expect(r).toEqual(bruteBest([36, 48, 64, 67, 72], [41, 53, 69, 72, 77]));
  });

  it("with the tune kept and a two-hand bass, re-voices only what lies between (RULES.md rule 8 worked example)", () => {
    // left hand C3 G3 E4 with melody G5, then F3 A3 E4 under melody F5 (worked by hand from RULES.md rule 8)
    for (const t of [0, 3, -4]) {
      const a = shift([48, 55, 64, 79], t);
      const b = shift([53, 64, 69, 77], t); // F3 E4 A4 F5: A and E re-voiced are A3 E4
      const r = bestMotion(a, b, { keepTop: true })!;
      expect(r.voicing).toEqual(shift([53, 57, 64, 77], t));
      expect(r).toEqual(bruteBest(a, b, { keepTop: true }));
    }
  });
});

describe("the budget", () => {
  it("refuses a search that outruns it as too complex, and caches nothing of it", () => {
    const a = [47, 54, 63, 66];
    const b = [49, 56, 61, 65];
    const accept = (v: number[]) => v[0] % 2 === 1 && v[1] - v[0] > 8;
    let error: unknown;
    try {
      bestMotion(a, b, { accept, budget: new Budget(5) });
    } catch (e) {
      error = e;
    }
    expect(error).toBeInstanceOf(AnalysisError);
    expect((error as AnalysisError).code).toBe("too-complex");
    // the same search with room to finish gives the literal rule's answer, not a cut-short one
    const budget = new Budget(1e9);
    expect(bestMotion(a, b, { accept, budget })).toEqual(bruteBest(a, b, { accept }));
    expect(budget.spent).toBeGreaterThan(5);
  });

  it("charges one budget across searches", () => {
    const budget = new Budget(1e9);
    bestMotion([59, 63, 66], [64, 68, 71], { budget });
    const once = budget.spent;
    bestMotion([59, 63, 66, 70], [64, 68, 71, 75], { budget });
    expect(once).toBeGreaterThan(0);
    expect(budget.spent).toBeGreaterThan(once);
  });
});

describe("bestMotion speed (hang guard only)", () => {
  it("grades a 10-minute take's worth of four-note changes, three searches each", () => {
    // ~1,250 changes of four-note chords (left-hand bass or close), as a long take would have.
    const rng = fc.sample(fc.tuple(chord, chord), { numRuns: 1250, seed: 7 });
    const accept = (v: number[]) => v.length > 0;
    const t0 = performance.now();
    for (const [a, b] of rng) {
      bestMotion(a, b, { accept });
      bestMotion(a, b, { accept, keepTop: true });
      bestMotion(a, b, { accept, keepBass: true });
    }
    const ms = performance.now() - t0;
    console.log(`bestMotion: 3 x ${rng.length} distinct random changes in ${ms.toFixed(1)} ms`);
    expect(ms).toBeLessThan(10_000); // hang guard, not a performance target
  });
});
