// Typed errors with one-line messages a student understands. The command line prints
// `message` alone; the server maps `code` to its own responses.
export type AnalysisErrorCode = "not-midi" | "corrupt" | "no-notes" | "too-long" | "too-many-notes" | "too-complex";

const MESSAGES: Record<AnalysisErrorCode, string> = {
  "not-midi": "This is not a MIDI file: save or export the take as a Standard MIDI File (.mid).",
  corrupt: "This MIDI file is cut short or damaged: record or export the take again.",
  "no-notes": "This MIDI file has no notes to analyse (drum-channel notes are ignored).",
  "too-long": "This take is longer than 30 minutes: split it into shorter takes.",
  "too-many-notes": "This take has more than 100,000 notes: split it into shorter takes.",
  "too-complex":
    "This take is too complex to grade (too many dense chords to compare in time): record a shorter or plainer take.",
};

export class AnalysisError extends Error {
  readonly code: AnalysisErrorCode;
  constructor(code: AnalysisErrorCode, message?: string) {
    super(message ?? MESSAGES[code]);
    this.name = "AnalysisError";
    this.code = code;
  }
}

export const MAX_TAKE_SECONDS = 30 * 60;
export const MAX_TAKE_NOTES = 100_000;
