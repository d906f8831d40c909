// Turns strikes into the chords and melody notes a take reports (names, shape, flags,
// techniques). Spelling depends on the key, so it is applied here, after the key is known.
import { chordFlags } from "./chordFlags";
import { addedTones, inversionOf, nameChord, romanOf, rootName, spelledSymbol, voicingOf } from "./naming";
import type { Key } from "./pitch";
import { noteName, pc, spellPc } from "./pitch";
import type { Strike } from "./strikes";
import { chordTechniques } from "./techniques";
import type { ChordReport, MelodyNote, NoteEvent, PedalSpan } from "./types";
import { detachedBass, upperStructure } from "./voiceLeading";

const round3 = (x: number) => Math.round(x * 1000) / 1000;

/**
 * Whether the pedal is down at some time while the chord's keys are held (players usually
 * press it just after the chord: syncopated pedalling). Spans are sorted and disjoint (the
 * reader merges them): binary search for the first span ending after the chord begins.
 */
function pedalDuring(pedal: PedalSpan[], start: number, end: number): boolean {
  let lo = 0;
  let hi = pedal.length;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (pedal[mid].end <= start) lo = mid + 1;
    else hi = mid;
  }
  return lo < pedal.length && pedal[lo].start < end;
}

/** Distinct pitches a strike sounds as a chord: struck and held notes, grace notes excluded. */
export function strikeVoicing(s: Strike): number[] {
  return [...new Set([...s.notes, ...s.held].map((n) => n.midi))].sort((a, b) => a - b);
}

/** A strike with two or more distinct struck pitches is a chord; one pitch is a melody note. */
export function isChordStrike(s: Strike): boolean {
  return new Set(s.notes.map((n) => n.midi)).size >= 2;
}

/** The parts of a chord report that depend only on its voicing (and the key). */
type Shown = Omit<ChordReport, "startSec" | "endSec" | "heldNotes" | "graceNotes" | "bassLine" | "nonChordTones" | "pedal" | "techniques">;
type VoicingFacts = { name: ReturnType<typeof nameChord>; shown: Shown; techniquesWithoutGraces: ChordReport["techniques"] };

function voicingFacts(notes: number[], key: Key | null): VoicingFacts {
  const bassMidi = notes[0];
  const name = nameChord(notes, bassMidi);
  const detached = detachedBass(notes);
  const upper = upperStructure(notes);
  const inversion = inversionOf(name, bassMidi);
  const top = notes[notes.length - 1];
  const shown: Shown = {
    notes,
    noteNames: notes.map((n) => noteName(n, key)),
    root: rootName(name, key),
    bass: spellPc(pc(bassMidi), key),
    symbol: spelledSymbol(name, pc(bassMidi), key),
    roman: key ? romanOf(name, key) : null,
    triad: name.triad,
    quality: name.quality,
    inversion,
    upperInversion: detached === null ? null : inversionOf(name, upper[0]),
    detachedBass: detached,
    voicing: voicingOf(upper, new Set(notes.map(pc))),
    addedTones: addedTones(name),
    topNote: top,
    topNoteName: noteName(top, key),
    flags: chordFlags(notes, name),
  };
  return { name, shown, techniquesWithoutGraces: techniquesOf(name, shown, []) };
}

function techniquesOf(name: VoicingFacts["name"], shown: Shown, graces: Array<{ note: number; resolvesTo: number }>) {
  return chordTechniques({
    name,
    inversion: shown.inversion,
    upperInversion: shown.upperInversion,
    detachedBass: shown.detachedBass,
    voicing: shown.voicing,
    graces,
  });
}

/**
 * The report of one chord strike. `cache` (one per take, since spelling depends on the key)
 * lets repeated voicings skip naming and spelling; reports of the same voicing then share
 * their arrays, so treat a report as read-only.
 */
export function chordReport(s: Strike, key: Key | null, pedal: PedalSpan[], cache?: Map<string, VoicingFacts>): ChordReport {
  const notes = strikeVoicing(s);
  const id = notes.join(",");
  let facts = cache?.get(id);
  if (!facts) {
    facts = voicingFacts(notes, key);
    cache?.set(id, facts);
  }
  let struckEnd = 0;
  for (const n of s.notes) if (n.end > struckEnd) struckEnd = n.end;
  let start = s.start;
  for (const g of s.graces) if (g.note.start < start) start = g.note.start;
  let heldNotes: number[] = [];
  if (s.held.length > 0) {
    const struck = new Set(s.notes.map((n) => n.midi));
    const held = new Set(s.held.map((n) => n.midi));
    heldNotes = notes.filter((n) => held.has(n) && !struck.has(n));
  }
  const graces = s.graces.map((g) => ({ note: g.note.midi, resolvesTo: g.target.midi }));
  return {
    startSec: round3(start),
    endSec: round3(struckEnd),
    ...facts.shown,
    heldNotes,
    bassLine: [],
    nonChordTones: [],
    graceNotes: s.graces.map((g) => ({
      startSec: round3(g.note.start),
      endSec: round3(g.note.end),
      note: g.note.midi,
      resolvesTo: g.target.midi,
    })),
    pedal: pedalDuring(pedal, s.start, struckEnd),
    techniques: graces.length === 0 ? facts.techniquesWithoutGraces : techniquesOf(facts.name, facts.shown, graces),
  };
}

export type { VoicingFacts };

export function melodyNote(s: Strike, key: Key | null): MelodyNote {
  const n: NoteEvent = s.notes[0];
  return { startSec: round3(n.start), endSec: round3(n.end), note: n.midi, noteName: noteName(n.midi, key) };
}
