// Whole-take summary: totals, smoothness, flags and techniques by name, top line, tempo
// steadiness and the score.
import { noteName } from "./pitch";
import type { Key } from "./pitch";
import { score, scoreParts } from "./score";
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
  type TempoSteadiness,
} from "./types";

const round3 = (x: number) => Math.round(x * 1000) / 1000;

/** Smoothness is always a ratio of sums; 1.0 when nothing moved. */
export function smoothnessOf(totalMotion: number, bestTotalMotion: number): number {
  return totalMotion === 0 ? 1 : bestTotalMotion / totalMotion;
}

/** Spread of the time between chord changes (coefficient of variation of the gaps). */
export function tempoSteadiness(startTimes: number[]): TempoSteadiness {
  if (startTimes.length < 2) return { medianGapSec: null, spread: null, steadiness: 1 };
  const gaps = startTimes.slice(1).map((t, i) => t - startTimes[i]);
  const sorted = [...gaps].sort((a, b) => a - b);
  const mid = sorted.length >> 1;
  const median = sorted.length % 2 ? sorted[mid] : (sorted[mid - 1] + sorted[mid]) / 2;
  const mean = gaps.reduce((a, b) => a + b, 0) / gaps.length;
  const sd = Math.sqrt(gaps.reduce((a, g) => a + (g - mean) ** 2, 0) / gaps.length);
  const spread = mean > 0 ? sd / mean : 0;
  return { medianGapSec: round3(median), spread: round3(spread), steadiness: round3(Math.min(1, Math.max(0, 1 - spread))) };
}

export type SummaryInput = {
  chords: ChordReport[];
  melodyNotes: MelodyNote[];
  changes: ChangeReport[];
  key: Key;
  keySource: "given" | "estimated";
  durationSec: number;
  pedal: PedalSpan[];
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
  const topNotes = chords.map((c) => c.topNote);
  if (hasSmoothTopLine(topNotes)) techniques["smooth-top-line"] = 1;
  const share = smoothTopLineShare(topNotes);
  const tempo = tempoSteadiness(chords.map((c) => c.startSec));
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
