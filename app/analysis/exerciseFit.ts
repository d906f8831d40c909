// Which exercise a take sounds like: its key, estimated from its notes and chords (key.ts), and
// how well its chords match each candidate target (matching.ts). Used when a take is filed, so a
// take sent under the wrong exercise (another key, other chords) is flagged with the exercise
// it most likely belongs to. Pure: runs on an analysis worker beside the take's own analysis.
import { estimateKey } from "./key";
import { matchProgression, type Mismatch, type PlayedIdentity } from "./matching";
import { nameChord } from "./naming";
import { parseKey, pc, ProgressionError, type Key } from "./pitch";
import { parseProgression } from "./progression";
import type { ChordReport, NoteEvent } from "./types";

/** One exercise in one of its keys, with its target written for that key. */
export type FitCandidate = { exerciseId: string; key: string; target: string };

export type CandidateFit = { exerciseId: string; key: string; accuracy: number };

export type FitReport = {
  /** The key the take sounds in, estimated from its own notes and chords, whatever key was chosen. */
  heardKey: string;
  fits: CandidateFit[];
};

/** Chords compared per candidate: enough to recognise a progression, cheap for a long take. */
export const FIT_CHORDS = 96;

function identity(c: ChordReport): PlayedIdentity {
  const name = nameChord(c.notes, c.notes[0]);
  return {
    root: name.rootPc,
    triad: name.triad,
    bass: pc(c.notes[0]),
    pcs: [...new Set(c.notes.map(pc))].sort((a, b) => a - b),
  };
}

/** The take's key, from its notes and the names of its chords, with the first and last basses (rule 23). */
export function heardKey(notes: readonly NoteEvent[], chords: readonly ChordReport[]): Key {
  const names = chords.map((c) => nameChord(c.notes, c.notes[0]));
  const bass = (c: ChordReport | undefined) => (c ? pc(c.notes[0]) : null);
  return estimateKey([...notes], names, { firstBassPc: bass(chords[0]), lastBassPc: bass(chords[chords.length - 1]) })
    .key;
}

/** The heard key and each candidate's accuracy against the take's first FIT_CHORDS chords. */
export function fitCandidates(
  notes: readonly NoteEvent[],
  chords: readonly ChordReport[],
  candidates: readonly FitCandidate[],
): FitReport {
  const played = chords
    .slice(0, FIT_CHORDS)
    .filter((c) => c.notes.length > 0)
    .map(identity);
  const fits: CandidateFit[] = [];
  for (const c of candidates) {
    try {
      const target = parseProgression(c.target, parseKey(c.key));
      fits.push({
        exerciseId: c.exerciseId,
        key: c.key,
        accuracy: played.length ? matchProgression(played, target).accuracy : 0,
      });
    } catch (e) {
      // A target that no longer parses cannot be the likely exercise.
      if (!(e instanceof ProgressionError)) throw e;
    }
  }
  return { heardKey: heardKey(notes, chords).name, fits };
}

/** The verdict shown with a take: whether it fits its exercise, and which exercise it likely is. */
export type FitWarning = {
  heardKey: string;
  /** The key the take was filed under. */
  filedKey: string | null;
  /** Share of the filed exercise's chords the take played (0..1). */
  accuracy: number;
  reason: "key" | "chords";
  likely: CandidateFit | null;
};

/** Below this share of its exercise's chords a take does not fit it. */
export const FIT_MIN_ACCURACY = 0.5;
/** A take fitting no exercise at all: under this, it is flagged even in the right key. */
export const FIT_NO_MATCH = 0.2;
/** Another exercise is offered when it matches at least this share, and clearly more. */
export const LIKELY_MIN_ACCURACY = 0.6;
export const LIKELY_MARGIN = 0.25;

/** Relative major and minor share their notes; a take heard in either fits the other (common practice). */
function sameKeyFamily(a: Key, b: Key): boolean {
  if (a.tonic === b.tonic && a.mode === b.mode) return true;
  if (a.mode === b.mode) return false;
  const major = a.mode === "major" ? a : b;
  const minor = a.mode === "major" ? b : a;
  return pc(major.tonic + 9) === minor.tonic;
}

function readKey(name: string | null): Key | null {
  if (!name) return null;
  try {
    return parseKey(name);
  } catch {
    return null;
  }
}

/**
 * Whether a take filed under `filed` (exercise and key) fits it. A take fits when it plays at
 * least half of the target's chords; below that it is flagged when it is heard in another key,
 * when another candidate matches clearly better, or when it matches hardly anything. The likely
 * exercise is the best-matching other candidate (preferring the heard key on a tie).
 */
export function fitWarning(report: FitReport, filed: { exerciseId: string; key: string | null }): FitWarning | null {
  const own = report.fits.find((f) => f.exerciseId === filed.exerciseId && (filed.key === null || f.key === filed.key));
  if (!own) return null;
  if (own.accuracy >= FIT_MIN_ACCURACY) return null;
  const heard = readKey(report.heardKey);
  const filedKey = readKey(own.key);
  const heardTonic = (f: CandidateFit) => {
    const k = readKey(f.key);
    return k && heard && sameKeyFamily(k, heard) ? 1 : 0;
  };
  let best: CandidateFit | null = null;
  for (const f of report.fits) {
    if (f === own) continue;
    if (!best || f.accuracy > best.accuracy || (f.accuracy === best.accuracy && heardTonic(f) > heardTonic(best)))
      best = f;
  }
  const likely =
    best && best.accuracy >= LIKELY_MIN_ACCURACY && best.accuracy >= own.accuracy + LIKELY_MARGIN ? best : null;
  const otherKey = !!(heard && filedKey && !sameKeyFamily(heard, filedKey));
  if (!otherKey && !likely && own.accuracy >= FIT_NO_MATCH) return null;
  return {
    heardKey: report.heardKey,
    filedKey: own.key,
    accuracy: own.accuracy,
    reason: otherKey ? "key" : "chords",
    likely,
  };
}

/** A take's chords against a progression a person names (a free-practice take has no target of its own). */
export type NamedCheck = { target: string; key: string; accuracy: number; loops: number; mismatches: Mismatch[] };

/**
 * Matches every chord of a take against `target` in `key` exactly as an exercise's target is
 * matched at analysis (DOMAIN "Matching a take to a target"; loops allowed). Throws
 * ProgressionError, naming the bad chord, for a key or target that does not parse.
 */
export function checkAgainstTarget(chords: readonly ChordReport[], target: string, key: string): NamedCheck {
  const parsedKey = parseKey(key);
  const parsed = parseProgression(target, parsedKey);
  // Every chord, as the analysis matches them, so each difference names the chord it was played at.
  const played = chords.map(identity);
  const result = played.length
    ? matchProgression(played, parsed)
    : { accuracy: 0, loops: 1, mismatches: [] as Mismatch[] };
  return {
    target: target.trim(),
    key: parsedKey.name,
    accuracy: result.accuracy,
    loops: result.loops,
    mismatches: result.mismatches,
  };
}
