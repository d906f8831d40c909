import { Suspense } from "react";
import { Link } from "react-router";
import { ButtonLink } from "~/components/Button";
import { Card } from "~/components/Card";
import { EmptyState } from "~/components/EmptyState";
import { lazyInPlace } from "~/components/lazyInPlace";
import { PracticeCare } from "~/components/PracticeCare";
import { ExerciseStateBadge } from "~/components/exercises/ExerciseStateBadge";
import type { TakeList } from "~/models/takeList.server";
import { dueWords, type ExerciseState } from "~/utils/exerciseState";
import type { WeekFigures } from "./WeeklyChart";

/**
 * The week-by-week card, its chart and its table: nothing in them answers a click before the
 * chart library has loaded anyway, so their code comes with it, after the page has hydrated.
 * The home page's loader preloads it on the server, so the HTML carries the figures in place.
 */
export const weeklyChart = lazyInPlace(() => import("./WeeklyChart").then((m) => m.WeekByWeek));
const WeekByWeek = weeklyChart.Component;

/**
 * The list of takes, at the foot of the page: its sorting and paging are plain links that
 * work in the server's HTML, so its code follows the page rather than holding it up.
 * Preloaded by the loader on the server like the chart.
 */
export const takesTable = lazyInPlace(() => import("./TakesTable").then((m) => m.TakesTable));
const TakesTable = takesTable.Component;

export type DueExercise = {
  id: string;
  title: string;
  keys: string[];
  dueDate: string | null;
  progression: string;
  /** the progression and the keys with typographic accidentals, and the due day, as the loader words them */
  progressionText: string;
  keysText: string;
  dueLabel: string | null;
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
          <span className="font-mono text-ink">{exercise.progressionText}</span>
          {exercise.keysText ? ` · in ${exercise.keysText}` : ""}
          {exercise.tempo ? ` · ♩ = ${exercise.tempo}` : ""}
        </p>
        <p className="mt-1 flex flex-wrap items-center gap-2 text-sm">
          <ExerciseStateBadge state={exercise.state} />
          {exercise.dueLabel ? <span className="whitespace-nowrap text-ink-soft">{exercise.dueLabel}</span> : null}
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
  takes: TakeList;
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

      <Suspense
        fallback={
          <Card title="Week by week">
            <p className="text-sm text-ink-soft">Loading the chart…</p>
          </Card>
        }
      >
        <WeekByWeek weeks={weeks} />
      </Suspense>

      <Card title="Your takes">
        {takes.total === 0 ? (
          <EmptyState title="No takes yet" action={<ButtonLink to="/takes/new">Upload your first take</ButtonLink>}>
            Record a few passes of your exercise as MIDI and upload them: Nearnote goes through every chord change and
            shows what could move less.
          </EmptyState>
        ) : (
          <Suspense fallback={<p className="text-sm text-ink-soft">Loading your takes…</p>}>
            <TakesTable list={takes} caption="Your takes" />
          </Suspense>
        )}
      </Card>

      <PracticeCare />
    </div>
  );
}
