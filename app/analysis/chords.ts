// Turns strikes into the chords and melody notes a take reports (names, shape, flags,
// techniques). Spelling depends on the key, so it is applied here, after the key is known.
import { chordFlags } from "./chordFlags";
import { addedTones, inversionOf, nameChord, romanOf, spelledSymbol, voicingOf } from "./naming";
import type { Key } from "./pitch";
import { noteName, pc, spellPc } from "./pitch";
import type { Strike } from "./strikes";
import { chordTechniques } from "./techniques";
import type { ChordReport, MelodyNote, NoteEvent, PedalSpan } from "./types";
import { detachedBass, upperStructure } from "./voiceLeading";

const round3 = (x: number) => Math.round(x * 1000) / 1000;

function pedalDownAt(pedal: PedalSpan[], time: number): boolean {
  return pedal.some((p) => p.start <= time + 1e-9 && time < p.end);
}

/** Distinct pitches a strike sounds as a chord: struck and held notes, grace notes excluded. */
export function strikeVoicing(s: Strike): number[] {
  return [...new Set([...s.notes, ...s.held].map((n) => n.midi))].sort((a, b) => a - b);
}

/** A strike with two or more distinct struck pitches is a chord; one pitch is a melody note. */
export function isChordStrike(s: Strike): boolean {
  return new Set(s.notes.map((n) => n.midi)).size >= 2;
}

export function chordReport(s: Strike, key: Key | null, pedal: PedalSpan[]): ChordReport {
  const notes = strikeVoicing(s);
  const bassMidi = notes[0];
  const name = nameChord(notes, bassMidi);
  const detached = detachedBass(notes);
  const upper = upperStructure(notes);
  const chordPcs = new Set(notes.map(pc));
  const inversion = inversionOf(name, bassMidi);
  const upperInversion = detached === null ? null : inversionOf(name, upper[0]);
  const voicing = voicingOf(upper, chordPcs);
  const graces = s.graces.map((g) => ({ note: g.note.midi, resolvesTo: g.target.midi }));
  const struckEnd = Math.max(...s.notes.map((n) => n.end));
  const top = notes[notes.length - 1];
  const heldPitches = new Set(s.held.map((n) => n.midi));
  const struckPitches = new Set(s.notes.map((n) => n.midi));
  return {
    startSec: round3(Math.min(s.start, ...s.graces.map((g) => g.note.start))),
    endSec: round3(struckEnd),
    notes,
    noteNames: notes.map((n) => noteName(n, key)),
    heldNotes: notes.filter((n) => heldPitches.has(n) && !struckPitches.has(n)),
    graceNotes: s.graces.map((g) => ({
      startSec: round3(g.note.start),
      endSec: round3(g.note.end),
      note: g.note.midi,
      resolvesTo: g.target.midi,
    })),
    root: name.rootPc === null ? null : spellPc(name.rootPc, key),
    bass: spellPc(pc(bassMidi), key),
    symbol: spelledSymbol(name, pc(bassMidi), key),
    roman: key ? romanOf(name, key) : null,
    triad: name.triad,
    quality: name.quality,
    inversion,
    upperInversion,
    detachedBass: detached,
    voicing,
    addedTones: addedTones(name),
    topNote: top,
    topNoteName: noteName(top, key),
    pedal: pedalDownAt(pedal, s.start),
    flags: chordFlags(notes, name),
    techniques: chordTechniques({ name, inversion, upperInversion, detachedBass: detached, voicing, graces }),
  };
}

export function melodyNote(s: Strike, key: Key | null): MelodyNote {
  const n: NoteEvent = s.notes[0];
  return { startSec: round3(n.start), endSec: round3(n.end), note: n.midi, noteName: noteName(n.midi, key) };
}
