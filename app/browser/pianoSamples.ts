// Which recorded piano note plays a MIDI note: the grand piano samples (Salamander Grand
// Piano V3 by Alexander Holm, CC BY 3.0) hold every third key from A0 to C8, so a note is
// played from the nearest one, its speed raised or lowered by the equal-tempered ratio.
// Pure; the files are served from /piano/ (scripts/copy-piano-samples.mjs).

const NAMES = ["C", "Cs", "D", "Ds", "E", "F", "Fs", "G", "Gs", "A", "As", "B"];

/** A0 = MIDI 21 … C8 = MIDI 108, every three semitones (A, C, D♯, F♯ of each octave). */
export const SAMPLED_NOTES: readonly number[] = Array.from({ length: 30 }, (_, i) => 21 + 3 * i);

export function sampleFile(midi: number): string {
  return `${NAMES[midi % 12]}${Math.floor(midi / 12) - 1}.mp3`;
}

/** The nearest sampled note and the playback rate that turns it into `midi` (2^(semitones/12)). */
export function sampleFor(midi: number): { sample: number; file: string; rate: number } {
  const clamped = Math.min(108, Math.max(21, midi));
  const sample = 21 + 3 * Math.round((clamped - 21) / 3);
  return { sample, file: sampleFile(sample), rate: 2 ** ((midi - sample) / 12) };
}

/** The distinct files a plan needs, so playback fetches only those. */
export function filesFor(midis: Iterable<number>): string[] {
  const files = new Set<string>();
  for (const m of midis) files.add(sampleFor(m).file);
  return [...files].sort();
}
