// What a free-practice take (one without an exercise) is checked against: the key it is heard
// in, the student's open exercise it most likely is, and, when the page names one, a
// progression of the person's own. Nothing of it is stored; the take's score stays as it is.
import {
  checkAgainstTarget,
  FIT_CHORDS,
  fitCandidates,
  LIKELY_MIN_ACCURACY,
  type FitCandidate,
  type NamedCheck,
} from "~/analysis/exerciseFit";
import { ProgressionError } from "~/analysis/pitch";
import type { ChordReport, NoteEvent } from "~/analysis/types";
import { targetTextForKey } from "~/utils/exerciseProgression";

/** An open exercise as the check needs it: its keys and its target as the teacher wrote it. */
export type CheckExercise = { id: string; title: string; keys: readonly string[]; progression: string };

export type LikelyExercise = { exerciseId: string; key: string; title: string; accuracy: number };

export type PracticeCheck = {
  /** The key the notes and chords suggest (rule 23), as a key name ("D", "Gm"). */
  heardKey: string | null;
  /** The open exercise whose target the take plays best, when it plays enough of it. */
  likely: LikelyExercise | null;
  /** How many open exercises the take was compared with. */
  compared: number;
  /** The progression the page was asked to check, its result or why it could not be read. */
  asked: (NamedCheck & { error?: undefined }) | { target: string; key: string; error: string } | null;
};

/**
 * The check of a take without an exercise against the student's open exercises (each in each
 * of its keys) and `asked`, a progression and key a person typed, if any.
 */
export function practiceCheck(
  notes: readonly NoteEvent[],
  chords: readonly ChordReport[],
  exercises: readonly CheckExercise[],
  asked: { target: string; key: string } | null,
): PracticeCheck {
  const candidates: Array<FitCandidate & { title: string }> = exercises.flatMap((e) =>
    e.keys.map((key) => ({
      exerciseId: e.id,
      key,
      title: e.title,
      target: targetTextForKey(e.progression, e.keys, key),
    })),
  );
  // The key and the likely exercise are read from the take's first FIT_CHORDS chords, as at upload,
  // so a long take's page does not name every chord again on each visit.
  const head = chords.slice(0, FIT_CHORDS);
  const headEnd = head.length ? head[head.length - 1].endSec : 0;
  const headNotes = chords.length > FIT_CHORDS ? notes.filter((n) => n.start < headEnd) : notes;
  const report = head.length ? fitCandidates(headNotes, head, candidates) : { heardKey: null, fits: [] };
  let likely: LikelyExercise | null = null;
  for (const fit of report.fits) {
    if (fit.accuracy < LIKELY_MIN_ACCURACY) continue;
    // The best match; on a tie, the one in the key the take is heard in.
    const better =
      !likely ||
      fit.accuracy > likely.accuracy ||
      (fit.accuracy === likely.accuracy && fit.key === report.heardKey && likely.key !== report.heardKey);
    if (better) {
      const title = candidates.find((c) => c.exerciseId === fit.exerciseId)?.title ?? "";
      likely = { exerciseId: fit.exerciseId, key: fit.key, title, accuracy: fit.accuracy };
    }
  }
  let checked: PracticeCheck["asked"] = null;
  if (asked && asked.target.trim()) {
    try {
      checked = checkAgainstTarget(chords, asked.target, asked.key);
    } catch (e) {
      if (!(e instanceof ProgressionError)) throw e;
      checked = { target: asked.target.trim(), key: asked.key, error: e.message };
    }
  }
  return { heardKey: report.heardKey, likely, compared: exercises.length, asked: checked };
}
