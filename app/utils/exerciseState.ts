// Where a student stands with an exercise, decided in one place so the home page, the list of
// exercises and the exercise's own page always agree: done once every key of the exercise has
// an analysed take; otherwise to do, and overdue after its due day in the studio's calendar.
// Pure, so the pages and the tests share it.

export type ExerciseStateKind = "done" | "overdue" | "due" | "open";

export type ExerciseState = {
  kind: ExerciseStateKind;
  /** keys with at least one analysed take */
  keysDone: number;
  keysTotal: number;
  /** a short badge: "Done", "2 days overdue", "Due tomorrow", "To do" */
  label: string;
  /** what is left, in a sentence: "A take in E♭ still to send." */
  detail: string;
};

/** "due today", "due in 3 days", "2 days overdue" against the studio's today (YYYY-MM-DD). */
export function dueWords(dueDate: string, today: string): string {
  const days = Math.round((Date.parse(`${dueDate}T00:00:00Z`) - Date.parse(`${today}T00:00:00Z`)) / 86_400_000);
  if (days === 0) return "due today";
  if (days === 1) return "due tomorrow";
  if (days > 1) return `due in ${days} days`;
  return days === -1 ? "1 day overdue" : `${-days} days overdue`;
}

const capital = (s: string) => s.charAt(0).toUpperCase() + s.slice(1);

/**
 * The state of one exercise for one student. `progress` lists each key of the exercise with the
 * statuses of the student's takes in it; `today` is the studio's date (YYYY-MM-DD).
 */
export function exerciseState(
  exercise: { dueDate: string | null },
  progress: ReadonlyArray<{ key: string; takes: ReadonlyArray<{ status: string }> }>,
  today: string,
  keyName: (key: string) => string = (k) => k,
): ExerciseState {
  const missing = progress.filter((p) => !p.takes.some((t) => t.status === "analysed"));
  const keysTotal = progress.length;
  const keysDone = keysTotal - missing.length;
  if (keysTotal > 0 && missing.length === 0) {
    return {
      kind: "done",
      keysDone,
      keysTotal,
      label: "Done",
      detail: keysTotal === 1 ? "Your take is in." : `A take in each of the ${keysTotal} keys is in.`,
    };
  }
  const left =
    missing.length === 1
      ? `A take in ${keyName(missing[0].key)} still to send.`
      : missing.length <= 3
        ? `Takes in ${missing.map((p) => keyName(p.key)).join(", ")} still to send.`
        : `Takes in ${missing.length} of ${keysTotal} keys still to send.`;
  if (!exercise.dueDate) return { kind: "open", keysDone, keysTotal, label: "To do", detail: left };
  const words = dueWords(exercise.dueDate, today);
  return {
    kind: exercise.dueDate < today ? "overdue" : "due",
    keysDone,
    keysTotal,
    label: capital(words),
    detail: left,
  };
}

/** Exercises to do first (overdue, then by due day, then undated), done ones last. */
export function byState<T extends { dueDate: string | null; state: ExerciseState }>(list: readonly T[]): T[] {
  const rank = (k: ExerciseStateKind) => ({ overdue: 0, due: 1, open: 2, done: 3 })[k];
  return [...list].sort(
    (a, b) => rank(a.state.kind) - rank(b.state.kind) || (a.dueDate ?? "9999").localeCompare(b.dueDate ?? "9999"),
  );
}
