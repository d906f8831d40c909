import { Link } from "react-router";
import { Card } from "~/components/Card";
import type { ExerciseState } from "~/utils/exerciseState";
import { dayLabel, pretty } from "~/utils/noteText";
import { ExerciseStateBadge } from "./ExerciseStateBadge";

type Props = {
  exercise: {
    id: string;
    title: string;
    keys: string[];
    dueDate: string | null;
    progression: string;
    state: ExerciseState;
    progress: Array<{ key: string; takes: Array<{ id: string }>; best: number | null }>;
  };
};

/** One exercise on the student's list: its state, its keys with takes and best score in each, and where to send one. */
export function StudentExerciseCard({ exercise: e }: Props) {
  return (
    <Card data-testid="student-exercise">
      <div className="mb-2 flex flex-wrap items-baseline justify-between gap-x-3 gap-y-1">
        <h3 className="min-w-0 text-lg font-semibold">
          <Link to={`/exercises/${e.id}`} className="text-tide-dark hover:underline">
            {e.title}
          </Link>
        </h3>
        <span className="flex flex-wrap items-center gap-2 text-sm text-ink-soft">
          <ExerciseStateBadge state={e.state} />
          {e.dueDate ? <span className="whitespace-nowrap">{dayLabel(`${e.dueDate}T12:00:00Z`)}</span> : null}
        </span>
      </div>
      <p className="mb-3 break-words font-mono text-sm text-ink-soft">{pretty(e.progression)}</p>
      <ul className="flex flex-wrap gap-2">
        {e.progress.map((p) => (
          <li
            key={p.key}
            className={`flex items-center gap-2 rounded-md border px-3 py-1.5 text-sm ${p.takes.length ? "border-moss bg-moss-pale" : "border-line bg-white"}`}
          >
            <span className="font-semibold">{pretty(p.key)}</span>
            {p.takes.length ? (
              <span>
                {p.takes.length} take{p.takes.length === 1 ? "" : "s"} · best {p.best ?? "–"}
              </span>
            ) : (
              <Link
                to={`/takes/new?exercise=${e.id}&key=${encodeURIComponent(p.key)}`}
                className="text-tide-dark underline-offset-2 hover:underline"
              >
                Send a take<span className="sr-only"> in {pretty(p.key)}</span>
              </Link>
            )}
          </li>
        ))}
      </ul>
    </Card>
  );
}
