// Best-fitting key of a take: the Krumhansl–Schmuckler key-finding algorithm, i.e. the
// correlation of the take's duration-weighted pitch-class distribution with each of the 24
// rotated key profiles.
// Source: C. L. Krumhansl, *Cognitive Foundations of Musical Pitch* (Oxford, 1990), ch. 4, using
// the probe-tone profiles of Krumhansl & Kessler (1982). The profile values below are written
// from memory of that table (they are widely reproduced) and rounded to two decimals.
import type { Key } from "./pitch";
import { parseKey, pc } from "./pitch";

const MAJOR_PROFILE = [6.35, 2.23, 3.48, 2.33, 4.38, 4.09, 2.52, 5.19, 2.39, 3.66, 2.29, 2.88];
const MINOR_PROFILE = [6.33, 2.68, 3.52, 5.38, 2.6, 3.53, 2.54, 4.75, 3.98, 2.69, 3.34, 3.17];

/** Key names as teachers write them: the usual spelling of each of the 24 keys. */
const MAJOR_NAMES = ["C", "Db", "D", "Eb", "E", "F", "F#", "G", "Ab", "A", "Bb", "B"];
const MINOR_NAMES = ["Cm", "C#m", "Dm", "Ebm", "Em", "Fm", "F#m", "Gm", "G#m", "Am", "Bbm", "Bm"];

function correlation(x: number[], y: number[]): number {
  const mx = x.reduce((a, b) => a + b, 0) / x.length;
  const my = y.reduce((a, b) => a + b, 0) / y.length;
  let num = 0;
  let dx = 0;
  let dy = 0;
  for (let i = 0; i < x.length; i++) {
    num += (x[i] - mx) * (y[i] - my);
    dx += (x[i] - mx) ** 2;
    dy += (y[i] - my) ** 2;
  }
  return dx === 0 || dy === 0 ? 0 : num / Math.sqrt(dx * dy);
}

export type KeyEstimate = { key: Key; correlation: number };

/** Weights each note by its length (at least 50 ms, so a staccato take still counts). */
export function estimateKey(notes: Array<{ midi: number; start: number; end: number }>): KeyEstimate {
  const weights = new Array<number>(12).fill(0);
  for (const n of notes) weights[pc(n.midi)] += Math.max(0.05, n.end - n.start);
  let best: KeyEstimate | null = null;
  for (let tonic = 0; tonic < 12; tonic++) {
    for (const mode of ["major", "minor"] as const) {
      const profile = mode === "major" ? MAJOR_PROFILE : MINOR_PROFILE;
      const rotated = weights.map((_, i) => profile[(i - tonic + 12) % 12]);
      const r = correlation(weights, rotated);
      // Strictly greater: on a tie the earlier candidate (major before its minor) stays.
      if (!best || r > best.correlation + 1e-12) {
        const name = mode === "major" ? MAJOR_NAMES[tonic] : MINOR_NAMES[tonic];
        best = { key: parseKey(name), correlation: r };
      }
    }
  }
  return best!;
}
