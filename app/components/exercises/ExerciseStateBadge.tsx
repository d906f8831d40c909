import type { ExerciseState } from "~/utils/exerciseState";

const TONE: Record<ExerciseState["kind"], string> = {
  done: "bg-moss-pale text-moss",
  overdue: "bg-brick-pale text-brick",
  due: "bg-tide-pale text-tide-dark",
  open: "bg-ochre-pale text-ink",
};

/** The student's state of an exercise, worded and coloured the same on every page. */
export function ExerciseStateBadge({ state }: { state: ExerciseState }) {
  return (
    <span
      className={`inline-block whitespace-nowrap rounded px-2 py-0.5 text-xs font-semibold ${TONE[state.kind]}`}
      data-testid="exercise-state"
      data-state={state.kind}
    >
      {state.label}
      {state.kind !== "done" && state.keysTotal > 1 ? ` · ${state.keysDone} of ${state.keysTotal} keys` : ""}
    </span>
  );
}
