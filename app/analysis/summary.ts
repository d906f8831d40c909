// Whole-take summary: totals, smoothness, flags and techniques by name, top line, tempo
// steadiness and the score.
import { noteName } from "./pitch";
import type { Key } from "./pitch";
import { score, scoreParts } from "./score";
import { tempoSteadiness } from "./tempo";
import { hasSmoothTopLine, smoothTopLineShare } from "./techniques";
import {
  CHANGE_FLAGS,
  CHORD_FLAGS,
  TECHNIQUES,
  type ChangeReport,
  type ChordReport,
  type FlagName,
  type MelodyNote,
  type PedalSpan,
  type Summary,
  type TechniqueName,
  type TempoPoint,
} from "./types";

export { tempoSteadiness };

const round3 = (x: number) => Math.round(x * 1000) / 1000;

/** Smoothness is always a ratio of sums; 1.0 when nothing moved. */
export function smoothnessOf(totalMotion: number, bestTotalMotion: number): number {
  return totalMotion === 0 ? 1 : bestTotalMotion / totalMotion;
}

/** Rule 1: notes begun within 80 ms of each other are one strike. */
const STRIKE_GAP_SEC = 0.08;

/** Strike onsets as far as the reports show them, strikes begun within 80 ms counted once (rule 1). */
function reportedOnsets(input: Pick<SummaryInput, "chords" | "melodyNotes">): number[] {
  const times: number[] = [];
  for (const c of input.chords) {
    times.push(c.startSec);
    for (const n of c.bassLine ?? []) times.push(n.startSec);
    for (const n of c.nonChordTones ?? []) times.push(n.startSec);
  }
  for (const n of input.melodyNotes) times.push(n.startSec);
  times.sort((a, b) => a - b);
  const out: number[] = [];
  for (const t of times) if (out.length === 0 || t - out[out.length - 1] > STRIKE_GAP_SEC) out.push(t);
  return out;
}

/**
 * The top line (RULES.md terms): the melody where the take has one, else the top notes of the
 * voicings in order. Voicing tops and melody notes are merged by onset; notes begun within
 * 80 ms of each other count once, the highest (a melody note struck with its chord).
 */
export function topLineNotes(
  chords: readonly Pick<ChordReport, "startSec" | "topNote">[],
  melody: readonly Pick<MelodyNote, "startSec" | "note">[],
): number[] {
  if (melody.length === 0) return chords.map((c) => c.topNote);
  const events = [
    ...chords.map((c) => ({ t: c.startSec, note: c.topNote })),
    ...melody.map((m) => ({ t: m.startSec, note: m.note })),
  ];
  events.sort((x, y) => x.t - y.t || y.note - x.note);
  const out: number[] = [];
  let lastT = -Infinity;
  for (const e of events) {
    if (out.length > 0 && e.t - lastT <= STRIKE_GAP_SEC) {
      out[out.length - 1] = Math.max(out[out.length - 1], e.note);
      continue;
    }
    out.push(e.note);
    lastT = e.t;
  }
  return out;
}

export type SummaryInput = {
  chords: ChordReport[];
  melodyNotes: MelodyNote[];
  changes: ChangeReport[];
  key: Key;
  keySource: "given" | "estimated";
  durationSec: number;
  pedal: PedalSpan[];
  /**
   * Onsets of every strike (rule 1), seconds: steady time is judged on these (rule 22). When
   * absent, the onsets the reports still show are used (harmonies, melody, bass-line notes and
   * non-chord tones), which misses repeated strikes of one harmony.
   */
  strikeOnsets?: number[];
  /** The file's tempo map (rule 22 takes the beat from it where the strikes follow it). */
  tempos?: TempoPoint[];
  analysisVersion: number;
  match?: { target: string; accuracy: number; loops: number; mismatches: Summary["mismatches"] };
};

export function summarise(input: SummaryInput): Summary {
  const { chords, changes } = input;
  const graded = changes.filter((c) => c.graded);
  const totalMotion = graded.reduce((a, c) => a + (c.motion ?? 0), 0);
  const bestTotalMotion = graded.reduce((a, c) => a + (c.bestMotion ?? 0), 0);
  const flags = Object.fromEntries([...CHORD_FLAGS, ...CHANGE_FLAGS].map((f) => [f, 0])) as Record<FlagName, number>;
  const techniques = Object.fromEntries(TECHNIQUES.map((t) => [t, 0])) as Record<TechniqueName, number>;
  for (const c of chords) {
    for (const f of c.flags) flags[f]++;
    for (const t of c.techniques) techniques[t]++;
  }
  for (const c of changes) for (const f of c.flags) flags[f]++;
  const topNotes = topLineNotes(chords, input.melodyNotes);
  if (hasSmoothTopLine(topNotes)) techniques["smooth-top-line"] = 1;
  const share = smoothTopLineShare(topNotes);
  const tempo = tempoSteadiness(input.strikeOnsets ?? reportedOnsets(input), input.tempos ?? []);
  const smoothness = smoothnessOf(totalMotion, bestTotalMotion);
  const parts = scoreParts({
    chordCount: chords.length,
    smoothness,
    flaggedItems: chords.filter((c) => c.flags.length > 0).length + graded.filter((c) => c.flags.length > 0).length,
    items: chords.length + graded.length,
    distinctTechniques: Object.values(techniques).filter((n) => n > 0).length,
    steadiness: tempo.steadiness,
    accuracy: input.match ? input.match.accuracy : null,
  });
  const summary: Summary = {
    chordCount: chords.length,
    melodyNoteCount: input.melodyNotes.length,
    changeCount: changes.length,
    gradedChangeCount: graded.length,
    totalMotion,
    bestTotalMotion,
    smoothness: round3(smoothness),
    rootPositionLeaps: flags["root-position-leap"],
    flags,
    techniques,
    topLine: topNotes.map((n) => noteName(n, input.key)),
    topLineSmoothShare: share === null ? null : round3(share),
    tempo,
    key: input.key.name,
    keySource: input.keySource,
    durationSec: round3(input.durationSec),
    pedalSec: round3(input.pedal.reduce((a, p) => a + (p.end - p.start), 0)),
    score: score(chords.length, parts),
    scoreParts: parts,
    analysisVersion: input.analysisVersion,
  };
  if (input.match) {
    summary.target = input.match.target;
    summary.accuracy = round3(input.match.accuracy);
    summary.loops = input.match.loops;
    summary.mismatches = input.match.mismatches;
  }
  return summary;
}
