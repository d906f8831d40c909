// Public shapes of the analysis engine. The JSON printed by `npm run analyse -- --json`
// is exactly `TakeAnalysis`, so these names are part of the product's contract.
import type { Mismatch } from "./matching";
import type { Triad } from "./progression";

export type { Triad };

/** One key press as read from a take (times in seconds, key release as `end`). */
export type NoteEvent = {
  midi: number;
  start: number;
  end: number;
  /** 0..1 */
  velocity: number;
  channel?: number;
  track?: number;
};

/** Tempo from this time on (seconds), in beats per minute. */
export type TempoPoint = { time: number; bpm: number };

/** Sustain pedal held down between these times (CC64 ≥ 64). */
export type PedalSpan = { start: number; end: number };

/** What the reader hands to the analysis: everything time-based is in seconds. */
export type NoteList = {
  notes: NoteEvent[];
  tempos?: TempoPoint[];
  pedal?: PedalSpan[];
};

/** Flags a chord can carry, and flags a change between two chords can carry: each name is written only here. */
export const CHORD_FLAGS = ["doubled-bass-third", "muddy-low-interval", "too-many-notes"] as const;
export const CHANGE_FLAGS = ["root-position-leap", "top-line-leap", "pedal-blur"] as const;
export type ChordFlag = (typeof CHORD_FLAGS)[number];
export type ChangeFlag = (typeof CHANGE_FLAGS)[number];
export type FlagName = ChordFlag | ChangeFlag;
export type ChordTechnique = "added-second" | "inversion" | "open-voicing" | "slash-bass" | "grace-to-third";
export type TechniqueName = ChordTechnique | "smooth-top-line";

export const CHORD_TECHNIQUES: readonly ChordTechnique[] = [
  "added-second",
  "inversion",
  "open-voicing",
  "slash-bass",
  "grace-to-third",
];
export const TECHNIQUES: readonly TechniqueName[] = [...CHORD_TECHNIQUES, "smooth-top-line"];

/** A chord's name, independent of octave placement (cached by pitch-class set + bass). */
export type ChordName = {
  /** pitch class of the root, null when no reading fits */
  rootPc: number | null;
  triad: Triad | null;
  /** tonal's chord type name, e.g. "major seventh"; null when unnamed */
  quality: string | null;
  /** lead-sheet suffix, e.g. "m7", "add9", "" for a major triad */
  suffix: string | null;
  /** semitones above the root of every chord tone, ascending */
  intervals: number[];
  /** interval names tonal gives each tone ("1P", "3M", "9M", ...) keyed by semitones above the root */
  intervalNames: Record<number, string>;
};

/** Kinds of non-chord tone (RULES.md rule 15); null when none of them fits. */
export type NonChordToneKind = "passing" | "neighbour" | "grace" | "suspension" | "anticipation";

/** A note sounding in a harmony that is not one of its chord tones (RULES.md rules 15 and 17). */
export type NonChordTone = { note: number; noteName: string; startSec: number; kind: NonChordToneKind | null };

/** A note of a walking or passing bass struck after the harmony's first strike (RULES.md rule 16). */
export type BassLineNote = { note: number; noteName: string; startSec: number };

export type GraceNote = { startSec: number; endSec: number; note: number; resolvesTo: number };

export type ChordReport = {
  startSec: number;
  endSec: number;
  /** MIDI numbers ascending, distinct, grace notes excluded, held notes included */
  notes: number[];
  noteNames: string[];
  /** notes held over from an earlier strike (rule 3) */
  heldNotes: number[];
  graceNotes: GraceNote[];
  /** bass notes struck later in the harmony (rule 16): never its bass, never in its voicing */
  bassLine: BassLineNote[];
  /** passing, neighbour and grace notes, suspensions and anticipations (rules 15 and 17) */
  nonChordTones: NonChordTone[];
  root: string | null;
  bass: string;
  symbol: string | null;
  roman: string | null;
  triad: Triad | null;
  quality: string | null;
  inversion: number | null;
  upperInversion: number | null;
  detachedBass: number | null;
  voicing: "close" | "open";
  addedTones: string[];
  topNote: number;
  topNoteName: string;
  /** the sustain pedal was down at some time while the chord's keys were held */
  pedal: boolean;
  flags: ChordFlag[];
  techniques: ChordTechnique[];
};

export type MelodyNote = { startSec: number; endSec: number; note: number; noteName: string };

export type Suggestion = {
  kind: "smoothest" | "keep-top" | "keep-bass";
  voicing: number[];
  noteNames: string[];
  motion: number;
};

export type ChangeReport = {
  from: number;
  to: number;
  /** false when a chord has more than 8 distinct pitches (rule 8) */
  graded: boolean;
  motion: number | null;
  bestMotion: number | null;
  bestVoicing: number[] | null;
  suggestions: Suggestion[];
  /** signed semitones, lowest note to lowest note */
  bassMotion: number;
  /** signed semitones, top note to top note */
  topVoiceInterval: number;
  /** the top-voice note a top-line leap is measured from: the last melody note before the change, else the previous top note (rule 10) */
  topLineFrom: number;
  commonTones: number;
  largestVoiceMove: number | null;
  flags: ChangeFlag[];
  /** notes of the previous harmony the pedal carried into this one that are not its chord tones (rule 19) */
  blurredNotes: number[];
};

/** One difference between a take and its target progression (VL's matching.ts owns the shape). */
export type { Mismatch };

/** Steady time (rule 22): how evenly the strikes fall on the beat. */
export type TempoSteadiness = {
  /** median time between strikes, seconds (null with fewer than two strikes) */
  medianGapSec: number | null;
  /** how far the intervals between strikes lie from whole or half beats, against random timing (0 = on the grid) */
  spread: number | null;
  /** 1 − spread, clipped to 0..1 (1 when it cannot be measured) */
  steadiness: number;
  /** the beat the intervals were compared with, seconds */
  beatSec?: number | null;
  /** where the beat came from: the file's tempo map, or the commonest interval between strikes */
  beatFrom?: "tempo-map" | "strikes" | null;
};

export type Summary = {
  chordCount: number;
  melodyNoteCount: number;
  changeCount: number;
  gradedChangeCount: number;
  totalMotion: number;
  bestTotalMotion: number;
  smoothness: number;
  rootPositionLeaps: number;
  flags: Record<FlagName, number>;
  techniques: Record<TechniqueName, number>;
  topLine: string[];
  topLineSmoothShare: number | null;
  tempo: TempoSteadiness;
  key: string;
  keySource: "given" | "estimated";
  durationSec: number;
  pedalSec: number;
  score: number;
  scoreParts: ScoreParts;
  analysisVersion: number;
  target?: string;
  accuracy?: number;
  loops?: number;
  mismatches?: Mismatch[];
};

export type ScoreParts = {
  smoothness: number;
  cleanliness: number;
  techniqueVariety: number;
  steadiness: number;
  accuracy: number | null;
};

export type TakeAnalysis = {
  chords: ChordReport[];
  melodyNotes: MelodyNote[];
  changes: ChangeReport[];
  summary: Summary;
};

export type AnalyseOptions = {
  /** "D", "Ab", "Gm", "C#m"; when absent the best-fitting key is estimated */
  key?: string;
  /** an exercise's target progression: chord symbols or Roman numerals */
  target?: string;
};
