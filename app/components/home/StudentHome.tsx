import { Link } from "react-router";
import { ButtonLink } from "~/components/Button";
import { Card } from "~/components/Card";
import { EmptyState } from "~/components/EmptyState";
import { PracticeCare } from "~/components/PracticeCare";
import { ExerciseStateBadge } from "~/components/exercises/ExerciseStateBadge";
import { dueWords, type ExerciseState } from "~/utils/exerciseState";
import { dayLabel, pretty } from "~/utils/noteText";
import { TakesTable, type TakeRow } from "./TakesTable";
import { WeeklyChart, type WeekFigures } from "./WeeklyChart";

export type DueExercise = {
  id: string;
  title: string;
  keys: string[];
  dueDate: string | null;
  progression: string;
  tempo: number | null;
  state: ExerciseState;
  progress: Array<{ key: string; takes: Array<{ status: string }> }>;
};

export { dueWords };

function ExerciseItem({ exercise }: { exercise: DueExercise }) {
  // The first key still without an analysed take is the one to send next.
  const key = exercise.progress.find((p) => !p.takes.some((t) => t.status === "analysed"))?.key ?? exercise.keys[0];
  const done = exercise.state.kind === "done";
  return (
    <li className="flex flex-wrap items-center justify-between gap-3 py-3" data-testid="home-exercise">
      <div className="min-w-0">
        <p className="font-semibold">
          <Link to={`/exercises/${exercise.id}`} className="text-tide-dark hover:underline">
            {exercise.title}
          </Link>
        </p>
        <p className="break-words text-sm text-ink-soft">
          <span className="font-mono text-ink">{pretty(exercise.progression)}</span>
          {exercise.keys.length ? ` · in ${exercise.keys.map(pretty).join(", ")}` : ""}
          {exercise.tempo ? ` · ♩ = ${exercise.tempo}` : ""}
        </p>
        <p className="mt-1 flex flex-wrap items-center gap-2 text-sm">
          <ExerciseStateBadge state={exercise.state} />
          {exercise.dueDate ? (
            <span className="whitespace-nowrap text-ink-soft">{dayLabel(`${exercise.dueDate}T12:00:00Z`)}</span>
          ) : null}
          {done ? null : <span className="text-ink-soft">{exercise.state.detail}</span>}
        </p>
      </div>
      {done ? null : (
        <ButtonLink
          to={`/takes/new?exercise=${exercise.id}${key ? `&key=${encodeURIComponent(key)}` : ""}`}
          variant="secondary"
        >
          Send a take<span className="sr-only"> of {exercise.title}</span>
        </ButtonLink>
      )}
    </li>
  );
}

/** A student's home: what is due, the latest takes, and how the weeks are going. */
export function StudentHome({
  exercises,
  takes,
  weeks,
}: {
  exercises: DueExercise[];
  takes: TakeRow[];
  weeks: WeekFigures[];
  /** the studio's today; the exercises' states are already decided against it */
  today?: string;
}) {
  // Ordered and split by the same state as the list of exercises (exerciseState).
  const toDo = exercises.filter((e) => e.state.kind !== "done");
  const done = exercises.filter((e) => e.state.kind === "done");
  return (
    <div className="flex flex-col gap-6">
      <Card title="Due exercises" actions={<ButtonLink to="/takes/new">Upload takes</ButtonLink>}>
        {exercises.length === 0 ? (
          <p className="text-sm text-ink-soft">
            Your teacher has not set an exercise yet. Free practice takes are welcome in the meantime.
          </p>
        ) : (
          <>
            {toDo.length === 0 ? (
              <p className="text-sm text-ink-soft">Nothing to do: every exercise has a take in each of its keys.</p>
            ) : null}
            <ul className="divide-y divide-line">
              {toDo.map((e) => (
                <ExerciseItem key={e.id} exercise={e} />
              ))}
            </ul>
            {done.length ? (
              <details className="mt-2 border-t border-line pt-2">
                <summary className="cursor-pointer text-sm font-semibold text-tide-dark">Done ({done.length})</summary>
                <ul className="divide-y divide-line">
                  {done.map((e) => (
                    <ExerciseItem key={e.id} exercise={e} />
                  ))}
                </ul>
              </details>
            ) : null}
          </>
        )}
      </Card>

      <Card title="Week by week">
        {weeks.length === 0 ? (
          <p className="text-sm text-ink-soft">
            Your smoothness and score appear here by week once a take is analysed.
          </p>
        ) : (
          <WeeklyChart weeks={weeks} />
        )}
        <p className="mt-3 text-xs text-ink-soft">
          Smoothness is the motion you could have had over the motion you played, summed over the week.{" "}
          <Link to="/privacy" className="underline">
            What Nearnote keeps
          </Link>
        </p>
      </Card>

      <Card title="Latest takes">
        {takes.length === 0 ? (
          <EmptyState title="No takes yet" action={<ButtonLink to="/takes/new">Upload your first take</ButtonLink>}>
            Record a few passes of your exercise as MIDI and upload them: Nearnote goes through every chord change and
            shows what could move less.
          </EmptyState>
        ) : (
          <TakesTable takes={takes} />
        )}
      </Card>

      <PracticeCare />
    </div>
  );
}
