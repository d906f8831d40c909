// The model answer of an exercise: from a starting voicing the teacher picks, the smoothest
// voicing of each next target chord, chained with the engine's best motion (rule 8). Pure, so
// the exercise page recomputes it in the browser while the teacher picks keys.
import { bestMotion } from "~/analysis/bestMotion";
import { pc } from "~/analysis/pitch";
import { targetPcs, type TargetChord } from "~/analysis/progression";
import { motion } from "~/analysis/voiceLeading";

export type ModelStep = { symbol: string; roman: string | null; voicing: number[]; motion: number | null };
export type ModelPath = { steps: ModelStep[]; totalMotion: number };

// One accept function per bass pitch class: best motion caches its results per function.
const bassAccepts = new Map<number, (v: number[]) => boolean>();
function bassIs(bass: number) {
  let f = bassAccepts.get(bass);
  if (!f) {
    f = (v: number[]) => pc(v[0]) === bass;
    bassAccepts.set(bass, f);
  }
  return f;
}

/** The chord's tones stacked upwards from the first one at or above `floor` (the named bass first). */
export function closeVoicing(chord: TargetChord, floor: number): number[] {
  const pcs = targetPcs(chord);
  const bottom = chord.bass ?? chord.root;
  const order = [bottom, ...pcs.filter((p) => p !== bottom).sort((a, b) => pc(a - bottom) - pc(b - bottom))];
  const out: number[] = [];
  let at = floor;
  for (const p of order) {
    let n = at + pc(p - at);
    if (out.length && n <= out[out.length - 1]) n += 12;
    out.push(n);
    at = n;
  }
  return out;
}

/** The default start: the first chord in close position from the C below middle C's octave (C4 = 60). */
export function defaultStart(first: TargetChord): number[] {
  return closeVoicing(first, 57);
}

/** Whether a picked voicing holds exactly the first chord's pitch classes (and its named bass at the bottom). */
export function fitsFirstChord(voicing: readonly number[], first: TargetChord): boolean {
  if (voicing.length < 2) return false;
  const want = new Set(targetPcs(first));
  const have = new Set(voicing.map(pc));
  if (want.size !== have.size || [...want].some((p) => !have.has(p))) return false;
  return first.bass === null || pc(Math.min(...voicing)) === first.bass;
}

/** Moves a start voicing picked in one key to another by the nearest shift (−5 … +6 semitones). */
export function shiftStart(voicing: readonly number[], fromTonic: number, toTonic: number): number[] {
  let d = pc(toTonic - fromTonic);
  if (d > 6) d -= 12;
  return voicing.map((n) => n + d);
}

/**
 * The smoothest path through `chords` from `start`: each next chord is the voicing of its
 * tones (bass fixed when the target names one) with the least motion from the previous one.
 */
export function modelPath(chords: readonly TargetChord[], start: readonly number[]): ModelPath {
  if (chords.length === 0) return { steps: [], totalMotion: 0 };
  const first = [...start].sort((a, b) => a - b);
  const steps: ModelStep[] = [{ symbol: chords[0].symbol, roman: chords[0].roman, voicing: first, motion: null }];
  let total = 0;
  for (let i = 1; i < chords.length; i++) {
    const prev = steps[i - 1].voicing;
    const chord = chords[i];
    const seed = closeVoicing(chord, prev[0] - 6);
    const found = bestMotion(prev, seed, chord.bass === null ? {} : { accept: bassIs(chord.bass) });
    const voicing = found?.voicing ?? seed;
    const m = found?.motion ?? motion(prev, voicing);
    total += m;
    steps.push({ symbol: chord.symbol, roman: chord.roman, voicing, motion: m });
  }
  return { steps, totalMotion: total };
}

/** The path as notes for the synth: each chord held two beats at the exercise's tempo (72 bpm without one). */
export function pathPlan(steps: readonly ModelStep[], tempo: number | null): Array<{ midi: number; start: number; end: number; velocity: number }> {
  const beat = 60 / (tempo ?? 72);
  return steps.flatMap((s, i) => s.voicing.map((midi) => ({ midi, start: i * 2 * beat, end: (i * 2 + 1.9) * beat, velocity: 0.7 })));
}

/** The starting voicing for one key: the teacher's (picked in the first key) moved there, when it still fits. */
export function startForKey(saved: readonly number[] | null, homeTonic: number, keyTonic: number, first: TargetChord): number[] {
  if (saved && saved.length) {
    const moved = shiftStart(saved, homeTonic, keyTonic);
    if (fitsFirstChord(moved, first)) return moved;
  }
  return defaultStart(first);
}
