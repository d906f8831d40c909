// Turns strikes into the chords and melody notes a take reports (names, shape, flags,
// techniques). Spelling depends on the key, so it is applied here, after the key is known.
import { chordFlags } from "./chordFlags";
import {
  addedTones,
  chordNoteNames,
  inversionOf,
  nameChord,
  needsContext,
  romanOf,
  rootName,
  spelledSymbol,
  voicingOf,
  type SpellingContext,
} from "./naming";
import type { Key } from "./pitch";
import { noteName, pc, spellPc } from "./pitch";
import type { Budget } from "./budget";
import { NAMING_STEPS, type Harmony } from "./harmonies";
import { pedalDuring } from "./sounding";
import type { Strike } from "./strikes";
import { chordTechniques } from "./techniques";
import type { ChordName, ChordReport, MelodyNote, NoteEvent, PedalSpan } from "./types";
import { detachedBass, upperStructure } from "./voiceLeading";

const round3 = (x: number) => Math.round(x * 1000) / 1000;

/** The parts of a chord report that depend only on its voicing (and the key). */
type Shown = Omit<
  ChordReport,
  "startSec" | "endSec" | "heldNotes" | "graceNotes" | "bassLine" | "nonChordTones" | "pedal" | "techniques"
>;
type VoicingFacts = {
  name: ReturnType<typeof nameChord>;
  shown: Shown;
  techniquesWithoutGraces: ChordReport["techniques"];
};

/** Names, spelling (rule 21: from the chord's root, in the key) and shape of one voicing. */
export function voicingFacts(notes: number[], key: Key | null, ctx?: SpellingContext, named?: ChordName): VoicingFacts {
  const bassMidi = notes[0];
  const name = named ?? nameChord(notes, bassMidi);
  const detached = detachedBass(notes);
  const upper = upperStructure(notes);
  const inversion = inversionOf(name, bassMidi);
  const top = notes[notes.length - 1];
  const shown: Shown = {
    notes,
    noteNames: name.rootPc === null ? notes.map((n) => noteName(n, key)) : chordNoteNames(notes, name, key, ctx),
    root: rootName(name, key, ctx),
    bass:
      name.rootPc === null
        ? spellPc(pc(bassMidi), key)
        : chordNoteNames([bassMidi], name, key, ctx)[0].replace(/-?\d+$/, ""),
    symbol: spelledSymbol(name, pc(bassMidi), key, ctx),
    roman: key ? romanOf(name, key, pc(bassMidi), ctx) : null,
    triad: name.triad,
    quality: name.quality,
    inversion,
    upperInversion: detached === null ? null : inversionOf(name, upper[0]),
    detachedBass: detached,
    voicing: voicingOf(upper, new Set(notes.map(pc))),
    addedTones: addedTones(name),
    topNote: top,
    topNoteName: name.rootPc === null ? noteName(top, key) : chordNoteNames([top], name, key, ctx)[0],
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
 * The report of one harmony (rules 15–17). `cache` (one per take, since spelling depends on
 * the key) lets repeated voicings skip naming and spelling; reports of the same voicing then
 * share their arrays, so treat a report as read-only.
 */
export function harmonyReport(
  h: Harmony,
  key: Key | null,
  pedal: PedalSpan[],
  cache?: Map<string, VoicingFacts>,
  budget?: Budget,
  ctx?: SpellingContext,
): ChordReport {
  const notes = voicingPitches(h);
  let id = notes.join(",");
  let facts = cache?.get(id);
  if (!facts || needsContext(facts.name)) {
    // A diminished seventh is spelled by where it leads (rule 21): cache it with its context.
    const name = nameChord(notes, notes[0]);
    if (needsContext(name)) id += `|${ctx?.nextBassPc ?? ""},${ctx?.nextRootPc ?? ""}`;
    facts = cache?.get(id);
    if (!facts) {
      budget?.spend(NAMING_STEPS);
      facts = voicingFacts(notes, key, ctx, name);
      cache?.set(id, facts);
    }
  }
  let start = h.start;
  for (const g of h.graces) if (g.note.start < start) start = g.note.start;
  const heldNotes = [...new Set(h.held.map((n) => n.midi))].sort((a, b) => a - b);
  const graces = h.graces.map((g) => ({ note: g.note.midi, resolvesTo: g.target.midi }));
  const byTime = <T extends { startSec: number; note: number }>(x: T, y: T) =>
    x.startSec - y.startSec || x.note - y.note;
  return {
    startSec: round3(start),
    endSec: round3(h.end),
    ...facts.shown,
    heldNotes,
    bassLine: h.bassLine
      .map((n) => ({ note: n.midi, noteName: noteName(n.midi, key), startSec: round3(n.start) }))
      .sort(byTime),
    nonChordTones: h.nonChordTones
      .map((t) => ({
        note: t.note.midi,
        noteName: noteName(t.note.midi, key),
        startSec: round3(t.note.start),
        kind: t.kind,
      }))
      .sort(byTime),
    graceNotes: h.graces.map((g) => ({
      startSec: round3(g.note.start),
      endSec: round3(g.note.end),
      note: g.note.midi,
      resolvesTo: g.target.midi,
    })),
    pedal: pedalDuring(pedal, h.start, h.end),
    techniques: graces.length === 0 ? facts.techniquesWithoutGraces : techniquesOf(facts.name, facts.shown, graces),
  };
}

/** A harmony's voicing as reported: distinct pitches, ascending. */
export function voicingPitches(h: Harmony): number[] {
  // Insertion into a short sorted list, skipping repeats (a voicing has a handful of notes).
  const out: number[] = [];
  for (const n of h.voicing) {
    const m = n.midi;
    let k = out.length;
    while (k > 0 && out[k - 1] > m) k--;
    if (k > 0 && out[k - 1] === m) continue;
    out.splice(k, 0, m);
  }
  return out;
}

/** The report of one strike read as a harmony on its own (block chords; tools and tests). */
export function chordReport(
  s: Strike,
  key: Key | null,
  pedal: PedalSpan[],
  cache?: Map<string, VoicingFacts>,
): ChordReport {
  let end = 0;
  for (const n of s.notes) if (n.end > end) end = n.end;
  const harmony: Harmony = {
    start: s.start,
    end,
    firstStrike: 0,
    endStrike: 1,
    voicing: [...s.notes, ...s.held],
    held: s.held,
    bassLine: [],
    nonChordTones: s.graces.map((g) => ({ note: g.note, kind: "grace" as const })),
    graces: s.graces,
    topNotes: [],
    ownLine: false,
    carried: [],
    chordPcs: new Set([...s.notes, ...s.held].map((n) => pc(n.midi))),
    afterSilence: false,
    solo: false,
  };
  return harmonyReport(harmony, key, pedal, cache);
}

export type { VoicingFacts };

export function melodyNote(n: NoteEvent, key: Key | null): MelodyNote {
  return { startSec: round3(n.start), endSec: round3(n.end), note: n.midi, noteName: noteName(n.midi, key) };
}
