// Entry of the analysis engine: pure TypeScript, no React, database or Node-only imports,
// so the server, the browser, the command line, the seed script and the tests share it.
import { Budget } from "./budget";
import { harmonyReport, melodyNote, voicingFacts, voicingPitches, type VoicingFacts } from "./chords";
import { AnalysisError } from "./errors";
import { gradeChanges } from "./grade";
import { readHarmonies, type Harmony } from "./harmonies";
import { estimateKey } from "./key";
import { matchProgression, rootlessReading, type MatchResult, type PlayedIdentity } from "./matching";
import { nameChord, romanOf, spelledSymbol } from "./naming";
import type { Key } from "./pitch";
import { parseKey, pc } from "./pitch";
import { parseProgression, type TargetChord } from "./progression";
import { readMidi } from "./readMidi";
import { MIN_HARMONY_SEC } from "./segment";
import { heardEndOf, soundings } from "./sounding";
import { findStrikes } from "./strikes";
import { summarise } from "./summary";
import { bpmAt, followsTempoGrid, GRID_TOLERANCE_SEC } from "./tempo";
import type { AnalyseOptions, ChordReport, NoteEvent, NoteList, TakeAnalysis } from "./types";

import { ANALYSIS_VERSION } from "./version";

export { ANALYSIS_VERSION };

export { AnalysisError, MAX_TAKE_NOTES, MAX_TAKE_SECONDS } from "./errors";
export type { AnalysisErrorCode } from "./errors";
export { ProgressionError } from "./pitch";
export { readMidi } from "./readMidi";
export type * from "./types";

function validNotes(notes: NoteEvent[]): NoteEvent[] {
  return notes.filter(
    (n) =>
      Number.isInteger(n.midi) &&
      n.midi >= 0 &&
      n.midi <= 127 &&
      Number.isFinite(n.start) &&
      Number.isFinite(n.end) &&
      n.end >= n.start,
  );
}

function identity(c: ChordReport): PlayedIdentity {
  const name = nameChord(c.notes, c.notes[0]);
  return {
    root: name.rootPc,
    triad: name.triad,
    bass: pc(c.notes[0]),
    pcs: [...new Set(c.notes.map(pc))].sort((a, b) => a - b),
  };
}

/** Chord names do not depend on the key (only their spelling does), so they inform the estimate (rule 23). */
function bestFittingKey(notes: NoteEvent[], harmonies: Harmony[]): Key {
  const names = harmonies.map((h) => {
    const v = voicingPitches(h);
    return nameChord(v, v[0]);
  });
  const bassOf = (h: Harmony | undefined) => (h ? pc(voicingPitches(h)[0]) : null);
  return estimateKey(notes, names, {
    firstBassPc: bassOf(harmonies[0]),
    lastBassPc: bassOf(harmonies[harmonies.length - 1]),
  }).key;
}

/** Rule 21: the next harmony's bass and root, which spell a diminished seventh. */
function spellingContexts(harmonies: Harmony[]) {
  return harmonies.map((_, i) => {
    const next = harmonies[i + 1];
    if (!next) return {};
    const v = voicingPitches(next);
    return { nextBassPc: pc(v[0]), nextRootPc: nameChord(v, v[0]).rootPc };
  });
}

/**
 * Rule 20: a rootless voicing matched against its target is named by that reading (F A C E
 * against ii7 in C is Dm9). Matching reports the first of each run of identical chords.
 */
function nameRootless(chords: ChordReport[], match: MatchResult, target: TargetChord[], key: Key): ChordReport[] {
  const out = [...chords];
  for (const r of match.rootless ?? []) {
    if (r.playedIndex === null || r.targetIndex === null) continue;
    const first = chords[r.playedIndex];
    const reading = rootlessReading([...new Set(first.notes.map(pc))], target[r.targetIndex]);
    if (!reading) continue;
    const facts = voicingFacts(first.notes, key, undefined, reading).shown;
    // Without its root, the voicing's lowest note is no bass to write under a slash.
    const symbol = spelledSymbol(reading, reading.rootPc!, key);
    const roman = romanOf(reading, key);
    for (let i = r.playedIndex; i < chords.length && chords[i].notes.join() === first.notes.join(); i++) {
      out[i] = {
        ...chords[i],
        root: facts.root,
        symbol,
        roman,
        noteNames: facts.noteNames,
        triad: facts.triad,
        quality: facts.quality,
      };
    }
  }
  return out;
}

/** Rule 19: notes the pedal carried into a harmony that are not its chord tones. */
function blurredNotes(h: Harmony): number[] {
  // chordPcs holds every pitch class of the voicing, so one test covers both.
  return [...new Set(h.carried.filter((n) => !h.chordPcs.has(pc(n.midi))).map((n) => n.midi))].sort((a, b) => a - b);
}

/**
 * Analyses an already-read note list (times in seconds), e.g. live notes from the browser.
 * Throws AnalysisError("no-notes") when there is nothing to analyse and ProgressionError for a
 * key or target the teacher mistyped.
 */
export function analyseNotes(input: NoteList | NoteEvent[], options: AnalyseOptions = {}): TakeAnalysis {
  const list: NoteList = Array.isArray(input) ? { notes: input } : input;
  const notes = validNotes(list.notes);
  if (notes.length === 0) throw new AnalysisError("no-notes");
  const tempos = list.tempos ?? [];
  const pedal = list.pedal ?? [];
  const givenKey: Key | null = options.key ? parseKey(options.key) : null;
  // One budget for the whole take (rule 8's searches, segmentation and naming spend from it).
  const budget = new Budget();
  const strikes = findStrikes(notes, tempos);
  const sorted = [...notes].sort((a, b) => a.start - b.start || a.midi - b.midi);
  const sounding = soundings(sorted, pedal);
  let endTime = 0;
  for (const n of notes) endTime = Math.max(endTime, heardEndOf(sounding, n));
  const onsets = strikes.map((s) => s.start);
  // Rule 15: in a take made to a metronome a harmony lasts about a beat at least.
  const beat = followsTempoGrid(onsets, tempos) ? 60 / bpmAt(tempos, onsets[0] ?? 0) : 0;
  const minHarmonySec = Math.max(MIN_HARMONY_SEC, beat - GRID_TOLERANCE_SEC);
  const reading = readHarmonies({ strikes, sounding, endTime, minHarmonySec, budget });
  const key = givenKey ?? bestFittingKey(notes, reading.harmonies);
  const target = options.target?.trim() ? parseProgression(options.target, key) : null;

  const voicings = new Map<string, VoicingFacts>();
  const contexts = spellingContexts(reading.harmonies);
  let chords: ChordReport[] = reading.harmonies.map((h, i) =>
    harmonyReport(h, key, pedal, voicings, budget, contexts[i]),
  );
  const melodyNotes = reading.melody.map((n) => melodyNote(n, key));
  const changes = gradeChanges(chords, key, {
    hasMelody: reading.hasMelody,
    melodyNotes,
    budget,
    blurredNotes: reading.harmonies.map((h, i) => (i === 0 ? [] : blurredNotes(h))),
  });
  let durationSec = 0;
  for (const n of notes) durationSec = Math.max(durationSec, n.end);
  const match = target
    ? { target: options.target!.trim(), ...matchProgression(chords.map(identity), target) }
    : undefined;
  if (match && target) chords = nameRootless(chords, match, target, key);
  const summary = summarise({
    chords,
    melodyNotes,
    changes,
    key,
    keySource: givenKey ? "given" : "estimated",
    durationSec,
    pedal,
    strikeOnsets: onsets,
    tempos,
    analysisVersion: ANALYSIS_VERSION,
    match: match && {
      target: match.target,
      accuracy: match.accuracy,
      loops: match.loops,
      mismatches: match.mismatches,
    },
  });
  return { chords, melodyNotes, changes, summary };
}

/** Reads a Standard MIDI File and analyses it; throws AnalysisError on a bad file. */
export function analyseMidi(bytes: Uint8Array, options: AnalyseOptions = {}): TakeAnalysis {
  // Check the options first, so a mistyped key is reported before a long read.
  if (options.key) parseKey(options.key);
  return analyseNotes(readMidi(bytes), options);
}
