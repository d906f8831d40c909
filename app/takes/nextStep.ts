// The one thing to work on next time, picked from a take's analysis: the take does not follow
// its exercise at all (another key, other chords), else the change that cost most motion
// against its best voicing, else the flag that matters most, else nothing. Pure, so the take
// page and its tests pick the same step.
import { heardKey as engineHeardKey } from "~/analysis/exerciseFit";
import { parseKey, type Key } from "~/analysis/pitch";
import type { ChangeFlag, ChangeReport, ChordFlag, ChordReport, FlagName, NoteEvent, Summary } from "~/analysis/types";
import { explainChange, explainChord } from "./explainFlags";
import { pretty, voicingLabel } from "~/utils/noteText";

/** Below this share of the exercise's chords played in order, the take is said to be of something else. */
export const OFF_EXERCISE_ACCURACY = 0.34;

/** Flags by how much they matter to a student, most first (common practice of keyboard teaching). */
export const FLAG_ORDER: readonly FlagName[] = [
  "root-position-leap",
  "too-many-notes",
  "top-line-leap",
  "muddy-low-interval",
  "pedal-blur",
  "doubled-bass-third",
];

export type NextStep =
  | { kind: "off-exercise"; heardKey: string | null; exerciseKey: string; accuracy: number; text: string }
  | {
      kind: "motion";
      change: number;
      extra: number;
      fix: { from: number[]; to: number[] } | null;
      title: string;
      text: string;
    }
  | {
      kind: "flag";
      change: number | null;
      flag: FlagName;
      fix: { from: number[]; to: number[] } | null;
      title: string;
      text: string;
    }
  | { kind: "clean"; text: string };

/** "D major", "A♭ major", "F♯ minor" from a key name the engine writes ("D", "Ab", "F#m"). */
export function keyWords(name: string): string {
  try {
    const key = parseKey(name);
    const tonic = key.name.replace(/m$/, "");
    return `${pretty(tonic)} ${key.mode}`;
  } catch {
    return pretty(name);
  }
}

/**
 * The key the notes and chords themselves suggest, whatever key the take was given (the
 * engine's own estimate, rule 23 of RULES.md), as a key name ("D", "Gm").
 */
export function heardKey(notes: readonly NoteEvent[], chords: readonly ChordReport[]): string | null {
  return notes.length === 0 ? null : engineHeardKey(notes, chords).name;
}

const sameKey = (a: string, b: string) => {
  try {
    const x = parseKey(a);
    const y = parseKey(b);
    return x.tonic === y.tonic && x.mode === y.mode;
  } catch {
    return a === b;
  }
};

const chordName = (c: ChordReport | undefined) =>
  c ? (c.symbol ? pretty(c.symbol) : c.noteNames.map(pretty).join(" ")) : "?";

function fixOf(change: ChangeReport, chords: readonly ChordReport[]): { from: number[]; to: number[] } | null {
  const from = chords[change.from]?.notes;
  const to = change.suggestions.find((s) => s.kind === "smoothest")?.voicing ?? change.bestVoicing;
  return from && to ? { from, to } : null;
}

/** Motion beyond the best voicing, 0 for an ungraded change. */
export function extraMotion(change: ChangeReport): number {
  if (!change.graded || change.motion === null || change.bestMotion === null) return 0;
  return Math.max(0, change.motion - change.bestMotion);
}

/**
 * The step to name first. `heard` is the key the notes suggest (heardKey); it is compared with
 * the exercise's key only when the take missed most of the exercise's chords.
 */
export function nextStep(
  analysis: {
    chords: readonly ChordReport[];
    changes: readonly ChangeReport[];
    summary: Pick<Summary, "key" | "target" | "accuracy">;
  },
  heard: string | null,
  key: Key | null,
  /** flags the teacher marked as intended: never named as the thing to fix */
  intended: ReadonlyArray<{ on: "chord" | "change"; idx: number; flag: string }> = [],
): NextStep {
  const isIntended = (on: "chord" | "change", idx: number, flag: string) =>
    intended.some((m) => m.on === on && m.idx === idx && m.flag === flag);
  const { chords, changes, summary } = analysis;
  if (summary.target !== undefined && summary.accuracy !== undefined && summary.accuracy < OFF_EXERCISE_ACCURACY) {
    const exerciseKey = summary.key;
    const otherKey = heard !== null && !sameKey(heard, exerciseKey);
    const text = otherKey
      ? `This sounds like ${keyWords(heard!)}; the exercise is in ${keyWords(exerciseKey)}. Play ${pretty(summary.target)} in ${keyWords(exerciseKey)} next time.`
      : `These are not the exercise's chords: it asks for ${pretty(summary.target)} in ${keyWords(exerciseKey)}, and ${Math.round(summary.accuracy * 100)}% of them came in order.`;
    return { kind: "off-exercise", heardKey: heard, exerciseKey, accuracy: summary.accuracy, text };
  }

  let worst = -1;
  let worstExtra = 0;
  changes.forEach((c, i) => {
    const extra = extraMotion(c);
    if (extra > worstExtra) {
      worst = i;
      worstExtra = extra;
    }
  });
  if (worst !== -1) {
    const c = changes[worst];
    const fix = fixOf(c, chords);
    const title = `Change ${worst + 1}: ${chordName(chords[c.from])} → ${chordName(chords[c.to])}`;
    const text =
      `Your hand moved ${c.motion} semitones here, ${worstExtra} more than needed. ` +
      (fix
        ? `Try ${voicingLabel(fix.to, key)} for ${chordName(chords[c.to])}: it moves ${c.bestMotion}.`
        : `${c.bestMotion} would do.`);
    return { kind: "motion", change: worst, extra: worstExtra, fix, title, text };
  }

  // No change moved more than it had to: the flag that matters most, at its first place.
  for (const flag of FLAG_ORDER) {
    const onChange = changes.findIndex(
      (c, i) => c.flags.includes(flag as ChangeFlag) && !isIntended("change", i, flag),
    );
    if (onChange !== -1) {
      const c = changes[onChange];
      const e = explainChange(c, [...chords], key).find((x) => x.flag === flag);
      return {
        kind: "flag",
        change: onChange,
        flag,
        fix: c.suggestions.length ? fixOf(c, chords) : null,
        title: `Change ${onChange + 1}: ${chordName(chords[c.from])} → ${chordName(chords[c.to])}`,
        text: e ? `${e.title}. ${e.text}` : "",
      };
    }
    const onChord = chords.findIndex((ch, k) => ch.flags.includes(flag as ChordFlag) && !isIntended("chord", k, flag));
    if (onChord !== -1) {
      const e = explainChord(chords[onChord], key).find((x) => x.flag === flag);
      // A chord belongs to the change that arrives at it; the first chord to the first change.
      const change = changes.length === 0 ? null : Math.max(0, Math.min(changes.length - 1, onChord - 1));
      return {
        kind: "flag",
        change,
        flag,
        fix: null,
        title: `Chord ${onChord + 1}: ${chordName(chords[onChord])}`,
        text: e ? `${e.title}. ${e.text}` : "",
      };
    }
  }
  return {
    kind: "clean",
    text: "Every change moved as little as it could and nothing was flagged. Keep the same hand shapes and try it a little faster.",
  };
}
