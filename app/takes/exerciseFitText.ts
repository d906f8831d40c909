// The words for a take filed under an exercise it does not fit. Pure, so the upload page's
// rows (in the browser) and the take page say the same thing.
import type { FitWarning } from "~/analysis/exerciseFit";
import { percent, pretty } from "~/utils/noteText";

/** The warning with the titles a person reads. */
export type FitNotice = Omit<FitWarning, "likely"> & {
  exerciseTitle: string;
  likely: (NonNullable<FitWarning["likely"]> & { title: string }) | null;
};

/** "D major", "G minor": a key name as a sentence says it. */
export function keyWords(name: string): string {
  const minor = /m$/.test(name);
  return `${pretty(minor ? name.slice(0, -1) : name)} ${minor ? "minor" : "major"}`;
}

/** The warning with the titles of the exercises it names, or nothing when the take fits. */
export function fitNotice(
  warning: FitWarning | null | undefined,
  filedTitle: string,
  titles: ReadonlyMap<string, string>,
): FitNotice | undefined {
  if (!warning) return undefined;
  const likelyTitle = warning.likely ? titles.get(warning.likely.exerciseId) : undefined;
  return {
    ...warning,
    exerciseTitle: filedTitle,
    likely: warning.likely && likelyTitle ? { ...warning.likely, title: likelyTitle } : null,
  };
}

/** One plain sentence: what the take sounds like against what the exercise asks for. */
export function fitSentence(n: FitNotice): string {
  const share = `the take plays ${percent(n.accuracy)} of its chords`;
  if (n.reason === "key" && n.filedKey)
    return `This sounds like ${keyWords(n.heardKey)}; “${n.exerciseTitle}” is in ${keyWords(n.filedKey)} (${share}).`;
  return `This does not sound like “${n.exerciseTitle}”: ${share}.`;
}

/** The offer to move it, when another exercise fits better. */
export function likelySentence(n: FitNotice): string | null {
  if (!n.likely) return null;
  return `It sounds like “${n.likely.title}” in ${keyWords(n.likely.key)} (${percent(n.likely.accuracy)} of its chords).`;
}
