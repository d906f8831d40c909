// Every flag the engine raises, said in plain words with the take's own numbers, so a
// student reading the take page knows what happened and what would have been smoother.
// Pure: the take page renders these on the server and the tests read them directly.
import { MAX_GRADED_PITCHES } from "~/analysis/bestMotion";
import { TOP_LINE_LEAP_MAX } from "~/analysis/changeFlags";
import { lowIntervalLimit } from "~/analysis/lowInterval";
import { pc, type Key } from "~/analysis/pitch";
import type { ChangeFlag, ChangeReport, ChordFlag, ChordReport, FlagName } from "~/analysis/types";
import { voiceLeadingPairs } from "~/analysis/voiceLeading";
import { intervalName, noteLabel, pretty, semitones, voicingLabel } from "~/utils/noteText";

export type FlagExplanation = { flag: FlagName; title: string; text: string };

/** Short names of our own for each flag, shown as the heading of its explanation. */
export const FLAG_TITLES: Record<FlagName, string> = {
  "root-position-leap": "Whole hand jumped",
  "top-line-leap": "Top line leapt",
  "doubled-bass-third": "Third doubled over the bass",
  "muddy-low-interval": "Low notes too close",
  "too-many-notes": "Too many notes to grade",
  "pedal-blur": "Pedal held through the change",
};

const direction = (d: number) => (d > 0 ? "up" : "down");

/** "F–B♭–D would have moved 3, against 15 as played" (no final stop), or null when ungraded. */
function bestClause(change: ChangeReport, key: Key | null): string | null {
  if (!change.bestVoicing || change.bestMotion === null || change.motion === null) return null;
  if (change.bestMotion >= change.motion) return "no other voicing of this chord would have moved less";
  return `${voicingLabel(change.bestVoicing, key)} would have moved ${change.bestMotion}, against ${change.motion} as played`;
}

/** Rule 9 in words: "Both chords are in root position and every note jumped 5 semitones up; …". */
function rootPositionLeap(change: ChangeReport, from: ChordReport, to: ChordReport, key: Key | null): string {
  const moves = voiceLeadingPairs(from.notes, to.notes).map(([a, b]) => b - a);
  const sizes = moves.map(Math.abs);
  const lo = Math.min(...sizes);
  const hi = Math.max(...sizes);
  const jump =
    lo === hi ? `${semitones(lo)} ${direction(moves[0])}` : `${direction(moves[0])}, by ${lo} to ${hi} semitones`;
  const best = bestClause(change, key);
  return `Both chords are in root position and every note jumped ${jump}${best ? `; ${best}` : ""}.`;
}

/** Rule 10 in words, with where the smoothest voicing would have put the top note. */
function topLineLeap(change: ChangeReport, from: ChordReport, to: ChordReport, key: Key | null): string {
  // With a melody, the leap is measured from its last note before the change (rule 10).
  const fromTop = change.topLineFrom ?? from.topNote;
  const leap = to.topNote - fromTop;
  let text = `The top note leapt ${semitones(leap)} ${direction(leap)}, from ${noteLabel(fromTop, key)} to ${noteLabel(
    to.topNote,
    key,
  )}; more than ${TOP_LINE_LEAP_MAX} breaks the tune your top notes make.`;
  const best = change.bestVoicing;
  if (best && best.length) {
    const bestTop = best[best.length - 1];
    const move = bestTop - fromTop;
    if (Math.abs(move) < Math.abs(leap)) {
      text += ` With ${voicingLabel(best, key)} the top would move ${move === 0 ? "not at all" : `${semitones(move)} ${direction(move)}`}.`;
    }
  }
  return text;
}

function doubledBassThird(chord: ChordReport, key: Key | null): string {
  const bass = chord.notes[0];
  const top = chord.notes[chord.notes.length - 1];
  const doubles = chord.notes.filter((n, i) => i > 0 && pc(n) === pc(bass) && n !== top && n !== bass + 12);
  const name = chord.symbol ? pretty(chord.symbol) : "this chord";
  return `The 3rd of ${name}, ${pretty(chord.bass)}, is in the bass and sounds again at ${doubles
    .map((n) => noteLabel(n, key))
    .join(
      " and ",
    )}. With the 3rd in the bass, leave it out of the hand above (on top, or an octave above the bass, it is fine).`;
}

function muddyLowInterval(chord: ChordReport, key: Key | null): string {
  const [low, next] = chord.notes;
  const size = next - low;
  const limit = lowIntervalLimit(size);
  const name = intervalName(size);
  const base = `The two lowest notes, ${noteLabel(low, key)} and ${noteLabel(next, key)}, are a ${name} apart.`;
  if (limit === null) return base;
  return `${base} A ${name} sounds clear with its lower note on ${noteLabel(limit, key)} or higher; this one is ${semitones(
    limit - low,
  )} below that. Spread the low notes wider or play them higher.`;
}

function tooManyNotes(chord: ChordReport): string {
  return `This chord has ${chord.notes.length} different notes; chords of more than ${MAX_GRADED_PITCHES} are not graded, so the changes into and out of it do not count towards smoothness. Check for a resting arm or palm.`;
}

/** Rule 19 in words: which notes the pedal carried into a chord they do not belong to. */
function pedalBlur(change: ChangeReport, _from: ChordReport, to: ChordReport, key: Key | null): string {
  const carried = change.blurredNotes.map((n) => noteLabel(n, key)).join(", ");
  const name = to.symbol ? pretty(to.symbol) : "the next chord";
  return `The pedal stayed down into ${name}, so ${carried || "notes of the previous chord"} went on sounding under it and do not belong to it. Lift the pedal as the new chord sounds and press it again just after.`;
}

const CHANGE_FLAG_TEXT: Record<
  ChangeFlag,
  (change: ChangeReport, from: ChordReport, to: ChordReport, key: Key | null) => string
> = {
  "root-position-leap": rootPositionLeap,
  "top-line-leap": topLineLeap,
  "pedal-blur": pedalBlur,
};

export function explainChangeFlag(
  flag: ChangeFlag,
  change: ChangeReport,
  from: ChordReport,
  to: ChordReport,
  key: Key | null,
): FlagExplanation {
  const text = CHANGE_FLAG_TEXT[flag](change, from, to, key);
  return { flag, title: FLAG_TITLES[flag], text };
}

const CHORD_FLAG_TEXT: Record<ChordFlag, (chord: ChordReport, key: Key | null) => string> = {
  "doubled-bass-third": doubledBassThird,
  "muddy-low-interval": muddyLowInterval,
  "too-many-notes": tooManyNotes,
};

export function explainChordFlag(flag: ChordFlag, chord: ChordReport, key: Key | null): FlagExplanation {
  const text = CHORD_FLAG_TEXT[flag](chord, key);
  return { flag, title: FLAG_TITLES[flag], text };
}

/** The change's own flags, then the flags of the chord it arrives at. */
export function explainChange(change: ChangeReport, chords: ChordReport[], key: Key | null): FlagExplanation[] {
  const from = chords[change.from];
  const to = chords[change.to];
  if (!from || !to) return [];
  return [
    ...change.flags.map((f) => explainChangeFlag(f, change, from, to, key)),
    ...to.flags.map((f) => explainChordFlag(f, to, key)),
  ];
}

/** A chord's own flags (used for the opening chord, which no change arrives at). */
export function explainChord(chord: ChordReport, key: Key | null): FlagExplanation[] {
  return chord.flags.map((f) => explainChordFlag(f, chord, key));
}
