// The tempo map and steady time (RULES.md rule 22). The bounds are the ones rule 22 pins
// (worked by hand from RULES.md rule 22): a metronomic take with onsets jittered by ±20 ms
// scores at least 0.8 whatever its harmonic rhythm; onsets at random intervals score at most
// 0.3. The 120 bpm default is from the Standard MIDI File 1.0 specification (MMA, RP-001).
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { beatAt, bpmAt, followsTempoGrid, tempoMap, tempoSteadiness } from "../../../app/analysis/tempo";
import type { TempoPoint } from "../../../app/analysis/types";

/** The lookup read literally: the last tempo point at or before the time (within a nanosecond), else 120 bpm. */
function linearBpmAt(tempos: TempoPoint[], time: number): number {
  let bpm = 120;
  for (const t of tempos) if (t.time <= time + 1e-9) bpm = t.bpm;
  return bpm;
}

/** A seeded generator, so that every run checks the same takes. */
function rng(seed: number): () => number {
  let s = seed >>> 0;
  return () => {
    s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
    return s / 2 ** 32;
  };
}

/** Onsets of a take in strict time: one strike per chord, each chord held `beats[i % n]` beats, jittered by ±jitter seconds. */
function metronomic(bpm: number, beats: number[], count: number, jitter: number, seed: number): number[] {
  const r = rng(seed);
  const out: number[] = [];
  let beat = 0;
  for (let i = 0; i < count; i++) {
    out.push(Math.max(0, (beat * 60) / bpm + (r() * 2 - 1) * jitter));
    beat += beats[i % beats.length];
  }
  return out;
}

describe("tempo lookups", () => {
  it("bpmAt finds the tempo in force by binary search, as the linear reading does", () => {
    const tempos = fc
      .uniqueArray(fc.integer({ min: 0, max: 600 }), { maxLength: 40 })
      .chain((times) =>
        fc.tuple(
          fc.constant(times.sort((a, b) => a - b).map((t) => t / 4)),
          fc.array(fc.integer({ min: 30, max: 240 }), { minLength: times.length, maxLength: times.length }),
        ),
      );
    fc.assert(
      fc.property(tempos, fc.double({ min: -1, max: 160, noNaN: true }), ([times, bpms], time) => {
        const points = times.map((t, i) => ({ time: t, bpm: bpms[i] }));
        expect(bpmAt(points, time)).toBe(linearBpmAt(points, time));
      }),
      { numRuns: 300, seed: 22 },
    );
    expect(bpmAt([], 5)).toBe(120); // SMF 1.0: 120 bpm without a tempo event
  });

  it("counts beats across tempo changes", () => {
    // 120 bpm for 2 s (4 beats), then 60 bpm: 3 s is beat 5
    const map = tempoMap([
      { time: 0, bpm: 120 },
      { time: 2, bpm: 60 },
    ]);
    expect(beatAt(map, 1).beat).toBeCloseTo(2);
    expect(beatAt(map, 3)).toEqual({ beat: 5, secPerBeat: 1 });
  });

  it("a take follows the grid when 80% of its strikes lie within 60 ms of a half beat", () => {
    const tempos = [{ time: 0, bpm: 100 }]; // half beat 0.3 s
    const on = [0, 0.3, 0.6, 0.9, 1.2].map((t) => t + 0.05);
    expect(followsTempoGrid(on, tempos)).toBe(true);
    expect(followsTempoGrid([...on.slice(0, 4), 1.35], tempos)).toBe(true); // 4 of 5 = 80%
    expect(followsTempoGrid([...on.slice(0, 3), 1.05, 1.35], tempos)).toBe(false); // 3 of 5
  });
});

describe("steady time (rule 22)", () => {
  it("a chord held two bars in strict time is perfectly steady, and harmonic rhythm does not count", () => {
    // 4/4 at 120 bpm: chords every beat, then one held for 8 beats, then every beat again
    const on = [0, 0.5, 1, 1.5, 5.5, 6, 6.5, 7];
    expect(tempoSteadiness(on, [{ time: 0, bpm: 120 }])).toMatchObject({
      steadiness: 1,
      beatFrom: "tempo-map",
      beatSec: 0.5,
    });
    // the first edition's measure (spread of the gaps between changes) would score this 0
    expect(tempoSteadiness(on).steadiness).toBe(1);
  });

  it.each([60, 96, 132])(
    "a metronomic take at %i bpm jittered by ±20 ms scores at least 0.8, chords held 1 or 8 beats",
    (bpm) => {
      for (const beats of [[1], [8], [1, 1, 2, 4], [8, 1, 1, 2, 2, 1, 1]]) {
        for (const seed of [1, 2, 3]) {
          const on = metronomic(bpm, beats, 48, 0.02, seed);
          const withMap = tempoSteadiness(on, [{ time: 0, bpm }]);
          expect(withMap.steadiness, `${bpm} bpm, ${beats}`).toBeGreaterThanOrEqual(0.8);
          // played to no tempo map of its own: the beat is read from the strikes
          const unmapped = tempoSteadiness(on, [{ time: 0, bpm: bpm * 1.37 }]);
          expect(unmapped.steadiness, `${bpm} bpm, ${beats}, unmapped`).toBeGreaterThanOrEqual(0.8);
        }
      }
    },
  );

  it("steadiness of a metronomic take is unaffected by its harmonic rhythm (fast-check)", () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 50, max: 150 }),
        fc.array(fc.constantFrom(1, 2, 4, 8), { minLength: 1, maxLength: 8 }),
        fc.integer({ min: 1, max: 1e6 }),
        fc.boolean(),
        (bpm, beats, seed, mapped) => {
          const on = metronomic(bpm, beats, 48, 0.02, seed);
          expect(tempoSteadiness(on, mapped ? [{ time: 0, bpm }] : []).steadiness).toBeGreaterThanOrEqual(0.8);
        },
      ),
      { numRuns: 150, seed: 2201 },
    );
  });

  it("onsets at random intervals score at most 0.3", () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: 1e6 }),
        fc.integer({ min: 40, max: 200 }),
        fc.double({ min: 0.1, max: 0.6, noNaN: true }),
        fc.double({ min: 0.3, max: 2.5, noNaN: true }),
        fc.integer({ min: 50, max: 160 }),
        (seed, count, shortest, range, bpm) => {
          const r = rng(seed);
          const on: number[] = [];
          let t = 0;
          for (let i = 0; i < count; i++) {
            on.push(t);
            t += shortest + r() * range;
          }
          expect(tempoSteadiness(on, [{ time: 0, bpm }]).steadiness).toBeLessThanOrEqual(0.3);
          expect(tempoSteadiness(on).steadiness).toBeLessThanOrEqual(0.3);
        },
      ),
      { numRuns: 150, seed: 2202 },
    );
  });

  it("reads a dotted rhythm's beat from the strikes (commonest interval a beat and a half)", () => {
    const on = metronomic(90, [1.5, 1.5, 1], 40, 0.015, 9);
    expect(tempoSteadiness(on).steadiness).toBeGreaterThanOrEqual(0.8);
  });

  it("cannot be measured with fewer than two strikes", () => {
    expect(tempoSteadiness([])).toEqual({
      medianGapSec: null,
      spread: null,
      steadiness: 1,
      beatSec: null,
      beatFrom: null,
    });
    expect(tempoSteadiness([3]).steadiness).toBe(1);
  });
});
